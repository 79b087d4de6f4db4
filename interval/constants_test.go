package interval

import (
	"math/big"
	"strings"
	"testing"
)

// piPublished is pi to 1000 decimals, truncated: the digits of OEIS A000796.
// The first 105 digits are the OEIS data lines (checked against
// oeisA000796 below); the full string is the first 1000 decimals of the
// file src/compress/testdata/pi.txt of the Go distribution.
const piPublished = "3." +
	"1415926535897932384626433832795028841971693993751058209749445923078164062862089986280348253421170679" +
	"8214808651328230664709384460955058223172535940812848111745028410270193852110555964462294895493038196" +
	"4428810975665933446128475648233786783165271201909145648566923460348610454326648213393607260249141273" +
	"7245870066063155881748815209209628292540917153643678925903600113305305488204665213841469519415116094" +
	"3305727036575959195309218611738193261179310511854807446237996274956735188575272489122793818301194912" +
	"9833673362440656643086021394946395224737190702179860943702770539217176293176752384674818467669405132" +
	"0005681271452635608277857713427577896091736371787214684409012249534301465495853710507922796892589235" +
	"4201995611212902196086403441815981362977477130996051870721134999999837297804995105973173281609631859" +
	"5024459455346908302642522308253344685035261931188171010003137838752886587533208381420617177669147303" +
	"5982534904287554687311595628638823537875937519577818577805321712268066130019278766111959092164201989"

// ePublished is e to 1000 decimals (OEIS A001113). The first 105 digits
// are the OEIS data lines (checked against oeisA001113 below); the string is
// the first 1000 decimals of src/compress/testdata/e.txt of the Go
// distribution, which agrees digit for digit with Wolfram Alpha's
// N[E, 1000] as quoted in public test suites.
const ePublished = "2." +
	"7182818284590452353602874713526624977572470936999595749669676277240766303535475945713821785251664274" +
	"2746639193200305992181741359662904357290033429526059563073813232862794349076323382988075319525101901" +
	"1573834187930702154089149934884167509244761460668082264800168477411853742345442437107539077744992069" +
	"5517027618386062613313845830007520449338265602976067371132007093287091274437470472306969772093101416" +
	"9283681902551510865746377211125238978442505695369677078544996996794686445490598793163688923009879312" +
	"7736178215424999229576351482208269895193668033182528869398496465105820939239829488793320362509443117" +
	"3012381970684161403970198376793206832823764648042953118023287825098194558153017567173613320698112509" +
	"9618188159304169035159888851934580727386673858942287922849989208680582574927961048419844436346324496" +
	"8487560233624827041978623209002160990235304369941849146314093431738143640546253152096183690888707016" +
	"7683964243781405927145635490613031072085103837505101157477041718986106873969655212671546889570350354"

// ln2Published is log 2 to 1000 significant digits (OEIS A002162). The
// first 105 digits are the OEIS data lines (checked against oeisA002162
// below); the rest is Wolfram Alpha's N[Log[2], 1000] as quoted in two
// independent public test suites (a GMP C++ wrapper's test of const_log2
// and a JavaScript big-number library's test of ln2(1000)), which agree.
const ln2Published = "0." +
	"6931471805599453094172321214581765680755001343602552541206800094933936219696947156058633269964186875" +
	"4200148102057068573368552023575813055703267075163507596193072757082837143519030703862389167347112335" +
	"0115364497955239120475172681574932065155524734139525882950453007095326366642654104239157814952043740" +
	"4303855008019441706416715186447128399681717845469570262716310645461502572074024816377733896385506952" +
	"6066834113727387372292895649354702576265209885969320196505855476470330679365443254763274495125040606" +
	"9438147104689946506220167720424524529612687946546193165174681392672504103802546259656869144192871608" +
	"2938031727143677826548775664850856740776484514644399404614226031930967354025744460703080960850474866" +
	"3852313818167675143866747664789088143714198549423151997354880375165861275352916610007105355824987941" +
	"4729509293113897155998205654392871700072180857610252368892132449713893203784393530887748259701715591" +
	"0708823683627589842589185353024363421436706118923678919237231467232172053401649256872747782344535348"

// OEIS data lines (%S, %T, %U) of the three sequences, as digit strings.
const (
	oeisA000796 = "314159265358979323846264338327950288419716939937510582097494459230781640628620899862803482534211706798214"
	oeisA001113 = "271828182845904523536028747135266249775724709369995957496696762772407663035354759457138217852516642742746"
	oeisA002162 = "693147180559945309417232121458176568075500134360255254120680009493393621969694715605863326996418687"
)

func digitsOnly(s string) string {
	return strings.TrimLeft(strings.ReplaceAll(s, ".", ""), "0")
}

func TestPublishedDigitsMatchOEIS(t *testing.T) {
	for _, c := range []struct{ long, oeis, name string }{
		{piPublished, oeisA000796, "A000796"},
		{ePublished, oeisA001113, "A001113"},
		{ln2Published, oeisA002162, "A002162"},
	} {
		if !strings.HasPrefix(digitsOnly(c.long), c.oeis) {
			t.Errorf("pasted digits disagree with the OEIS %s data lines", c.name)
		}
	}
}

// decimalUnit returns the value of a decimal string and one unit of its last
// digit; a published value (truncated or rounded) is within one unit of the
// true value.
func decimalUnit(t *testing.T, s string) (v, u *big.Rat) {
	t.Helper()
	v, ok := new(big.Rat).SetString(s)
	if !ok {
		t.Fatalf("bad decimal %q", s)
	}
	n := 0
	if i := strings.IndexByte(s, '.'); i >= 0 {
		n = len(s) - i - 1
	}
	u = new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(n)), nil))
	return v, u
}

// checkPublished asserts that the enclosure x meets [v-u, v+u] (so the
// published value, known to one unit of its last digit, is consistent with
// x) and, when the enclosure is wider than that unit, that v itself lies in
// x padded by u; and that the relative width of x is at most 2^-(prec-10).
func checkPublished[T Real[T]](t *testing.T, what string, x T, pub string, prec uint) {
	t.Helper()
	lo, hi := x.Endpoints()
	if lo == nil {
		t.Errorf("%s at %d bits: unbounded enclosure", what, prec)
		return
	}
	l, _ := lo.Rat(nil)
	h, _ := hi.Rat(nil)
	v, u := decimalUnit(t, pub)
	vlo, vhi := new(big.Rat).Sub(v, u), new(big.Rat).Add(v, u)
	if l.Cmp(vhi) > 0 || h.Cmp(vlo) < 0 {
		t.Errorf("%s at %d bits: enclosure [%s, %s] excludes the published value", what, prec,
			lo.Text('g', 25), hi.Text('g', 25))
	}
	w := new(big.Rat).Sub(h, l)
	m := new(big.Rat).Abs(l)
	if a := new(big.Rat).Abs(h); a.Cmp(m) < 0 {
		m = a
	}
	lim := new(big.Rat).Mul(m, new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), prec-10)))
	if w.Cmp(lim) > 0 {
		wf, _ := new(big.Float).SetRat(new(big.Rat).Quo(w, m)).Float64()
		t.Errorf("%s at %d bits: relative width %.3g exceeds 2^-(prec-10)", what, prec, wf)
	}
}

// constPrecs are the precisions at which every constant is checked; the
// largest ones need all 1000 published digits.
var constPrecs = []uint{53, 64, 100, 128, 256, 512, 1000, 2048, 3000, 3320, 3400}

func TestConstantsPublished(t *testing.T) {
	checkPublished(t, "F pi", F{}.Pi(), piPublished, 53)
	checkPublished(t, "F ln2", F{}.Ln2(), ln2Published, 53)
	checkPublished(t, "F e", E(F{}), ePublished, 53)
	for _, p := range constPrecs {
		z := NewB(0, p)
		checkPublished(t, "pi", z.Pi(), piPublished, p)
		checkPublished(t, "ln2", z.Ln2(), ln2Published, p)
		checkPublished(t, "e", E(z), ePublished, p)
		if z.Pi().Prec() != p || E(z).Prec() != p {
			t.Errorf("precision %d not kept", p)
		}
	}
}

// The cache serves lower precisions from a higher one: asking in
// decreasing and increasing order must give equally valid enclosures.
func TestConstantCacheOrder(t *testing.T) {
	for _, p := range []uint{3000, 200, 64, 1200, 53} {
		checkPublished(t, "pi (cache)", NewB(0, p).Pi(), piPublished, p)
		checkPublished(t, "ln2 (cache)", NewB(0, p).Ln2(), ln2Published, p)
	}
}

// Machin's formula and the atanh series are checked against identities with
// other formulas too (common practice): pi = 4 atan 1 and ln 2 = log 2
// evaluated by the generic functions.
func TestConstantsIdentities(t *testing.T) {
	for _, p := range []uint{53, 300, 2000} {
		z := NewB(0, p)
		q := Atan(z.Int(1)).Scale(2)
		if !overlaps(q, z.Pi()) {
			t.Errorf("4 atan(1) = %v misses pi = %v at %d bits", q, z.Pi(), p)
		}
		// atan(1/2) + atan(1/3) = pi/4 (Euler), a reduction-free check.
		s := Atan(z.Frac(1, 2)).Add(Atan(z.Frac(1, 3))).Scale(2)
		if !overlaps(s, z.Pi()) {
			t.Errorf("4(atan 1/2 + atan 1/3) misses pi at %d bits", p)
		}
		// 2 log1p(1/3)... log(2) = log1p(1) computed through Log1p's
		// non-kernel branch; log(2) = log(3/2) + log(4/3).
		l := Log(z.Frac(3, 2)).Add(Log(z.Frac(4, 3)))
		if !overlaps(l, z.Ln2()) {
			t.Errorf("log 3/2 + log 4/3 misses ln2 at %d bits", p)
		}
	}
}

func overlaps[T Real[T]](x, y T) bool { return !x.Less(y) && !y.Less(x) }
