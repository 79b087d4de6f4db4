package interval

import (
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// elemFn describes one elementary function for the property tests: its
// float64 library counterpart, its enclosures on F and B, and a sampler of
// arguments inside its domain.
type elemFn struct {
	name   string
	lib    func(float64) float64
	ulps   float64 // error allowed to the library value (common practice: Go's math is within ~1 ulp)
	onF    func(F) F
	onB    func(B) B
	sample func(*rand.Rand) float64
	// relative is true when the enclosure width should be small relative to
	// the value; otherwise it is checked in absolute terms (sin, cos).
	relative bool
	// libOK reports where the library value is trusted to about ulps ulps;
	// nil means everywhere. Go's math.Sin and math.Cos lose several ulps
	// beyond |x| ~ 1e5 (checked during development against an independent
	// decimal evaluation), and math.Tan returns x itself for |x| <= 1e-7.
	libOK func(float64) bool
}

// toF rounds a B enclosure outward to F.
func toF(b B) F {
	l, h := b.Endpoints()
	return F{}.Between(l, h)
}

func logUniform(r *rand.Rand, lo, hi float64) float64 {
	return math.Pow(10, lo+(hi-lo)*r.Float64())
}

func signed(r *rand.Rand, v float64) float64 {
	if r.Intn(2) == 0 {
		return -v
	}
	return v
}

func trigLibOK(v float64) bool { return math.Abs(v) < 1e5 }

var elemFns = []elemFn{
	{"exp", math.Exp, 1, Exp[F], Exp[B], func(r *rand.Rand) float64 {
		if r.Intn(5) == 0 {
			return (2*r.Float64() - 1) * 700
		}
		return signed(r, logUniform(r, -20, 1.5))
	}, true, nil},
	{"expm1", math.Expm1, 1, Expm1[F], Expm1[B], func(r *rand.Rand) float64 {
		return signed(r, logUniform(r, -30, 1.3))
	}, true, nil},
	{"log", math.Log, 1, Log[F], Log[B], func(r *rand.Rand) float64 {
		if r.Intn(4) == 0 {
			return 1 + signed(r, logUniform(r, -12, -1))
		}
		return logUniform(r, -300, 300)
	}, true, nil},
	{"log1p", math.Log1p, 1, Log1p[F], Log1p[B], func(r *rand.Rand) float64 {
		if r.Intn(3) == 0 {
			return -0.999 * r.Float64()
		}
		return signed(r, logUniform(r, -30, -0.1))
	}, true, nil},
	{"sin", math.Sin, 1, Sin[F], Sin[B], func(r *rand.Rand) float64 {
		if r.Intn(5) == 0 {
			return signed(r, logUniform(r, 2, 15))
		}
		return signed(r, logUniform(r, -20, 2))
	}, false, trigLibOK},
	{"cos", math.Cos, 1, Cos[F], Cos[B], func(r *rand.Rand) float64 {
		if r.Intn(5) == 0 {
			return signed(r, logUniform(r, 2, 15))
		}
		return signed(r, logUniform(r, -20, 2))
	}, false, trigLibOK},
	{"tan", math.Tan, 2, Tan[F], Tan[B], func(r *rand.Rand) float64 {
		return signed(r, logUniform(r, -20, 0.15))
	}, true, func(v float64) bool { return math.Abs(v) > 1e-6 }},
	{"atan", math.Atan, 1, Atan[F], Atan[B], func(r *rand.Rand) float64 {
		return signed(r, logUniform(r, -20, 20))
	}, true, nil},
	{"sinh", math.Sinh, 2, Sinh[F], Sinh[B], func(r *rand.Rand) float64 {
		return signed(r, logUniform(r, -20, 2.5))
	}, true, nil},
	{"cosh", math.Cosh, 2, Cosh[F], Cosh[B], func(r *rand.Rand) float64 {
		return signed(r, logUniform(r, -20, 2.5))
	}, true, nil},
	{"tanh", math.Tanh, 2, Tanh[F], Tanh[B], func(r *rand.Rand) float64 {
		return signed(r, logUniform(r, -20, 1.5))
	}, true, nil},
	{"sech", func(v float64) float64 { return 1 / math.Cosh(v) }, 3, Sech[F], Sech[B], func(r *rand.Rand) float64 {
		return signed(r, logUniform(r, -20, 2.5))
	}, true, nil},
}

// The float64 library value, allowed its documented error of about one ulp
// (a few for compositions such as 1/cosh), meets the F and the B enclosure.
func TestElementaryContainFloat64(t *testing.T) {
	rng := rand.New(rand.NewSource(1))
	for _, c := range elemFns {
		for i := 0; i < 300; i++ {
			v := c.sample(rng)
			want := c.lib(v)
			if c.libOK != nil && !c.libOK(v) || math.IsInf(want, 0) || math.IsNaN(want) {
				continue
			}
			slack := c.ulps * math.Abs(want) * 0x1p-52
			lo, hi := want-slack, want+slack
			if fe := c.onF(PointF(v)); fe.Hi() < lo || fe.Lo() > hi {
				t.Errorf("%s(%g): F %v misses %g", c.name, v, fe, want)
			}
			if be := c.onB(NewB(v, 128)); be.Hi() < lo || be.Lo() > hi {
				t.Errorf("%s(%g): B %v misses %g", c.name, v, be, want)
			}
		}
	}
}

// relWidth returns (hi - lo) / min(|lo|, |hi|) for a finite enclosure, or the
// absolute width when abs is set.
func relWidth[T Real[T]](x T, abs bool) float64 {
	lo, hi := x.Endpoints()
	w := new(big.Float).SetPrec(64).Sub(hi, lo)
	if !abs {
		m := new(big.Float).Abs(lo)
		if a := new(big.Float).Abs(hi); a.Cmp(m) < 0 {
			m = a
		}
		if m.Sign() == 0 {
			return math.Inf(1)
		}
		w.Quo(w, m)
	}
	f, _ := w.Float64()
	return f
}

// A 3x-precision evaluation of the same function lies in (overlaps) the
// enclosure, the enclosure is at most 2^-(p-10) wide (relative, or absolute
// for sin and cos), and the width shrinks as the precision grows.
func TestElementaryThreeTimesPrecision(t *testing.T) {
	rng := rand.New(rand.NewSource(2))
	for _, c := range elemFns {
		for _, p := range []uint{53, 128, 512} {
			for i := 0; i < 40; i++ {
				v := c.sample(rng)
				x := NewB(v, p)
				e := c.onB(x)
				e3 := c.onB(NewB(v, 3*p))
				if !e.IsFinite() || !e3.IsFinite() {
					t.Errorf("%s(%g) at %d bits: unbounded", c.name, v, p)
					continue
				}
				if !overlaps(e, e3) {
					t.Errorf("%s(%g): %d-bit %v and %d-bit %v are disjoint", c.name, v, p, e, 3*p, e3)
				}
				if e.Prec() != p {
					t.Errorf("%s(%g): result has %d bits, want %d", c.name, v, e.Prec(), p)
				}
				lim := math.Ldexp(1, -int(p)+10)
				if w := relWidth(e, !c.relative); w > lim {
					t.Errorf("%s(%g) at %d bits: width %.3g > 2^-(p-10) = %.3g", c.name, v, p, w, lim)
				}
				if w, w3 := relWidth(e, true), relWidth(e3, true); w3 > w && w > 0 {
					t.Errorf("%s(%g): width grew from %.3g to %.3g with precision", c.name, v, w, w3)
				}
				f := c.onF(PointF(v))
				if !overlaps(f, toF(e3)) {
					t.Errorf("%s(%g): F %v misses the %d-bit value %v", c.name, v, f, 3*p, e3)
				}
			}
		}
	}
}

// For wide argument intervals every point inside (including the endpoints
// and critical points such as pi/2 for sin) has its accurate value inside
// the enclosure of the interval.
func TestElementaryWideArguments(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	for _, c := range elemFns {
		for i := 0; i < 60; i++ {
			a := c.sample(rng)
			b := c.sample(rng)
			if a > b {
				a, b = b, a
			}
			if b-a > 50 {
				b = a + 50*rng.Float64()
			}
			xb := NewB(a, 80).Hull(NewB(b, 80))
			xf := PointF(a).Hull(PointF(b))
			eb, ef := c.onB(xb), c.onF(xf)
			pts := []float64{a, b}
			for k := 0; k < 20; k++ {
				pts = append(pts, a+(b-a)*rng.Float64())
			}
			for m := math.Ceil(a / (math.Pi / 2)); m*math.Pi/2 <= b && len(pts) < 60; m++ {
				pts = append(pts, m*math.Pi/2)
			}
			for _, v := range pts {
				if v < a || v > b {
					continue
				}
				ref := c.onB(NewB(v, 200))
				if !ref.IsFinite() {
					continue
				}
				if !overlaps(eb, ref) {
					t.Errorf("%s([%g, %g]) = %v misses %s(%g) = %v", c.name, a, b, eb, c.name, v, ref)
				}
				if ef.IsFinite() && !overlaps(ef, toF(ref)) {
					t.Errorf("F %s([%g, %g]) = %v misses %s(%g) = %v", c.name, a, b, ef, c.name, v, ref)
				}
			}
		}
	}
}

// Sin and Cos over intervals containing extrema reach exactly +-1.
func TestSinCosExtrema(t *testing.T) {
	x := NewB(1, 64).Hull(NewB(2, 64)) // contains pi/2
	if s := Sin(x); s.Hi() != 1 || s.Lo() > math.Sin(1) {
		t.Errorf("sin[1,2] = %v, want [<=sin 1, 1]", s)
	}
	x = NewB(3, 64).Hull(NewB(3.3, 64)) // contains pi
	if c := Cos(x); c.Lo() != -1 {
		t.Errorf("cos[3,3.3] = %v, want lower end -1", c)
	}
	x = NewB(-0.5, 64).Hull(NewB(0.25, 64)) // contains 0
	if c := Cos(x); c.Hi() != 1 || c.Lo() > math.Cos(0.5) {
		t.Errorf("cos[-0.5,0.25] = %v", c)
	}
	if s := Sin(PointF(-10).Hull(PointF(10))); s.Lo() != -1 || s.Hi() != 1 {
		t.Errorf("sin[-10,10] = %v, want [-1,1]", s)
	}
	// No extremum in [0.1, 1.5]: the result stays below 1.
	if s := Sin(NewB(0.1, 64).Hull(NewB(1.5, 64))); !(s.Hi() < 1) {
		t.Errorf("sin[0.1,1.5] = %v reaches 1", s)
	}
}

// Identities (common practice) hold as inclusions of interval results.
func TestElementaryIdentities(t *testing.T) {
	rng := rand.New(rand.NewSource(4))
	for _, p := range []uint{53, 200, 1000} {
		one := NewB(1, p)
		for i := 0; i < 40; i++ {
			v := signed(rng, logUniform(rng, -8, 2))
			x := NewB(v, p)
			s, c := SinCos(x)
			if !s.Sqr().Add(c.Sqr()).Contains(one) {
				t.Errorf("sin^2+cos^2 of %g at %d bits misses 1", v, p)
			}
			if !Exp(Log(x.Abs())).Contains(x.Abs()) {
				t.Errorf("exp(log %g) misses it at %d bits", math.Abs(v), p)
			}
			if math.Abs(v) < 300 && !Log(Exp(x)).Contains(x) {
				t.Errorf("log(exp %g) misses it at %d bits", v, p)
			}
			if !overlaps(Sin(x.Scale(1)), s.Mul(c).Scale(1)) {
				t.Errorf("sin 2x vs 2 sin x cos x disjoint at %g", v)
			}
			if math.Abs(v) < 40 {
				if !overlaps(Tanh(x), Sinh(x).Quo(Cosh(x))) {
					t.Errorf("tanh %g vs sinh/cosh disjoint at %d bits", v, p)
				}
				if !Sech(x).Mul(Cosh(x)).Contains(one) {
					t.Errorf("sech*cosh of %g misses 1", v)
				}
				if !Cosh(x).Sqr().Sub(Sinh(x).Sqr()).Contains(one) {
					t.Errorf("cosh^2-sinh^2 of %g misses 1", v)
				}
				if !overlaps(Expm1(x), Exp(x).Sub(one)) {
					t.Errorf("expm1 %g vs exp-1 disjoint", v)
				}
			}
			if w := math.Mod(v, math.Pi/2); math.Abs(w) < 1.5 {
				y := NewB(w, p)
				if !Atan(Tan(y)).Contains(y) {
					t.Errorf("atan(tan %g) misses it at %d bits", w, p)
				}
			}
			if v > -1 && !overlaps(Log1p(x), Log(x.Add(one))) {
				t.Errorf("log1p %g vs log(1+x) disjoint", v)
			}
			// atan2(sin t, cos t) = t for t in (-pi, pi).
			if tt := math.Mod(v, math.Pi); math.Abs(tt) < 3.1 {
				y := NewB(tt, p)
				sy, cy := SinCos(y)
				if !Atan2(sy, cy).Contains(y) {
					t.Errorf("atan2(sin %g, cos %g) misses it at %d bits", tt, tt, p)
				}
			}
			// x^y x^-y = 1, x^y = exp(y log x).
			xa := x.Abs().Add(NewB(0.01, p))
			yv := NewB(rng.Float64()*20-10, p)
			if !Pow(xa, yv).Mul(Pow(xa, yv.Neg())).Contains(one) {
				t.Errorf("x^y x^-y misses 1 at %v, %v", xa, yv)
			}
			if !overlaps(Pow(xa, yv), Exp(yv.Mul(Log(xa)))) {
				t.Errorf("pow vs exp(y log x) disjoint")
			}
		}
	}
}

// wa1000 holds values to 1000 significant digits from Wolfram Alpha's N[...,
// 1000], as quoted in a public GMP C++ wrapper test suite (the
// test_log_mpf_class and test_exp_mpf_class tests); each value is within one
// unit of its last digit.
var wa1000 = map[string]string{
	"log10":    "2.302585092994045684017991454684364207601101488628772976033327900967572609677352480235997205089598298341967784042286248633409525465082806756666287369098781689482907208325554680843799894826233198528393505308965377732628846163366222287698219886746543667474404243274365155048934314939391479619404400222105101714174800368808401264708068556774321622835522011480466371565912137345074785694768346361679210180644507064800027750268491674655058685693567342067058113642922455440575892572420824131469568901675894025677631135691929203337658714166023010570308963457207544037084746994016826928280848118428931484852494864487192780967627127577539702766860595249671667418348570442250719796500471495105049221477656763693866297697952211071826454973477266242570942932258279850258550978526538320760672631716430950599508780752371033310119785754733154142180842754386359177811705430982748238504564801909561029929182431823752535770975053956518769751037497088869218020518933950723853920514463419726528728696511086257149219884998",
	"log25":    "3.218875824868200749201518666452375279051202708537035443825295782948357975415315529260267756186359221599932606043431125799448010458649352399267233234927411455104359274994366491306985712404683050114540310387201759554779451376387081425532309462443619055897042585642716119445135344570574480923178896356729342657347996849275519186378847687868706902101950108908389481002731974175734766426261145944081318970767677447325507753091125436323023319861830486414729823355727801351745171557532783167673647900850975912478968062003965394234981987482996961915242033822028757724806708643025446251469176923119574583961773141368040133199688945399946435362373035202440405956816218039295053399530137841317957826763143432414455549119541068640775574993658750722267601893528096660570004349549759416014286931232719794082517802675283048034011777197469896975575942108628356640402906124181231577581343196250334998082868344244073889400185371187519570984237923572865751753696644116711923993582633393018646777063170797964741970862926",
	"exp3":     "20.08553692318766774092852965458171789698790783855415014437893422969884587809197373120449716025301770215360761585194900288181101247935350669023262178447725050394567710006607785181222904788438394025815253470935262298146553842455569773351510815011840475493383849784317767607091377286249178734939603782279371768713125406059755342664082603094866392021625866739118181021434425976486101447439682078592116814196837482236890943228820747794712380717751234795948355631291870717723980325570722406961326764308869756183595072231928690478084267326369088420142099426054055699851968620917767803763057071354303572712275059443501409536833666992145341488550268350504225115314225042524859653457692308488860569844450156316355139644793086595358952932153985658505063860564112464635460516266458066482742220056950190662889962457088076988990086516557075290361202314960209103836201522591300399393702712132993144270679882569941465256511446682047285382500173314712582742713173225842241594992766868376755311110926298901918538329586",
	"expm1":    "0.3678794411714423215955237701614608674458111310317678345078368016974614957448998033571472743459196437466273252768439952082469757927901290086266535894940987830921943673773381150486389911251456163449877199786844759579397473025498924954532393662079648105146475206122942230891649265666003650745772837055328537383881068047876119568298934544973507393185992166174330035699372082071022775180215849942337816907156676717623366082303761229156237572094700070405097334256775762525280303768861651570936537995427406370717878445419467490931306980560163702111389774228214017380232832465287291389004660986659512444097699851459164287803720202510224578732111059537776807437112206240005167965280975444780286486006838564200433684662484349386918262062518994821970992423425207510492093445285124486022451380986417421061219536368310078209224804653079806562854154786061793155705987170215999699188228265397927803747127438635156296714511943986702682452679716814389772141359579690542529103548859731078233269414118579235695949376986",
	"expm10":   "0.00004539992976248485153559151556055061023791808886656496925907130565099942161430228165252500454594778232170805508968602849294519911724452038883718334770941456756099090921700736397018105950178390076296851778703090882436517154844872229365233241602050116826436030560494157010772997535440807940399423293213827078052004271049896035448616606683700920170757320883634467939051402688860388083294497677616203039090150324548764511431630330952049312537765766774006756454876738125287505690572275377628382171284143663732182087248552216443007813115036461879368959426358019462505567865040585338993403653413058286641193648376178025649554278964463839952664381022973460413385495914470289894669705903833618297934791927412492682326345369660009565588000880953721966615544120170188073150289699206773793774210280614727384360102801589161076119101602167880922506360875805338654984867101289668710215872879988148535546912033731423698940549209573536597828837940706553848348004339425871326393731931520087753512200072317764471807908310",
	"exp00625": "1.064494458917859429563390594642889673100725443649353301519307510635563936828166006334293435506876624375512982981261182073854356653897081255324575720943188390436516579202185434714440715132134605396058232067474793692958474821644936262673767848624063665456593887338700003015937389434206746843838616729064804088140299138749563088405906808770147979046656295077073574492365000978579685541941489690710617221139026348319104842132460253485358389734336660735291996276846584629530491420132035638022087055027220463016877512711521121230033485908289316183341433102014289269967049384216123733832289887197843025246799940899616117487513172985585131891545139987789162442335985449484239383601174909282335195436596482265804349407914785506864767507425055656406514213521603195374631462677119357592947359181457683956108174516473099004585754702479858852312018451907594104169398486875390930489570809549535442756179020982349645237795972932402795811776050608660066794023407524846811142261227354534066720530710136456909806707047",
}

// Elementary values against published 1000-digit values and the published
// constants (pi/4 = atan 1, ln 2 = log1p 1, e^3 = e^3 by Pow).
func TestElementaryPublished(t *testing.T) {
	for _, p := range append([]uint{0}, constPrecs...) {
		check := func(what string, b B, f F, pub string) {
			if p == 0 {
				checkPublished(t, "F "+what, f, pub, 53)
				return
			}
			checkPublished(t, what, b, pub, p)
		}
		z := NewB(0, max(p, 53))
		check("log 10", Log(z.Int(10)), Log(PointF(10)), wa1000["log10"])
		check("log 25", Log(z.Int(25)), Log(PointF(25)), wa1000["log25"])
		check("log 2", Log(z.Int(2)), Log(PointF(2)), ln2Published)
		check("log1p 1", Log1p(z.Int(1)), Log1p(PointF(1)), ln2Published)
		check("-log1p(-1/2)", Log1p(z.Frac(-1, 2)).Neg(), Log1p(PointF(-0.5)).Neg(), ln2Published)
		check("exp 3", Exp(z.Int(3)), Exp(PointF(3)), wa1000["exp3"])
		check("exp -1", Exp(z.Int(-1)), Exp(PointF(-1)), wa1000["expm1"])
		check("exp -10", Exp(z.Int(-10)), Exp(PointF(-10)), wa1000["expm10"])
		check("exp 1/16", Exp(z.Frac(1, 16)), Exp(PointF(0.0625)), wa1000["exp00625"])
		check("e^3 by Pow", Pow(E(z), z.Int(3)), Pow(E(F{}), PointF(3)), wa1000["exp3"])
		check("10^(1/2) squared is 10; log(10^(1/2))*2", Log(Pow(z.Int(10), z.Frac(1, 2))).Scale(1),
			Log(Pow(PointF(10), PointF(0.5))).Scale(1), wa1000["log10"])
		check("4 atan 1", Atan(z.Int(1)).Scale(2), Atan(PointF(1)).Scale(2), piPublished)
		check("atan2(1,-1)*4/3", Atan2(z.Int(1), z.Int(-1)).Scale(2).Quo(z.Int(3)),
			Atan2(PointF(1), PointF(-1)).Scale(2).Quo(PointF(3)), piPublished)
		check("-atan2(-0,-1)... atan2(0,-1)", Atan2(z.Int(0), z.Int(-1)), Atan2(PointF(0), PointF(-1)), piPublished)
		check("cosh 1 + sinh 1", Cosh(z.Int(1)).Add(Sinh(z.Int(1))), Cosh(PointF(1)).Add(Sinh(PointF(1))), ePublished)
		check("1/(cosh 1 - sinh 1)", z.Int(1).Quo(Cosh(z.Int(1)).Sub(Sinh(z.Int(1)))),
			PointF(1).Quo(Cosh(PointF(1)).Sub(Sinh(PointF(1)))), ePublished)
	}
}

// Values at special points.
func TestElementaryExact(t *testing.T) {
	for _, z := range []B{NewB(0, 53), NewB(0, 300)} {
		zero, one := z.Int(0), z.Int(1)
		for name, v := range map[string]B{
			"exp 0": Exp(zero), "cos 0": Cos(zero), "cosh 0": Cosh(zero), "sech 0": Sech(zero),
			"pow(1, 7)": Pow(one, z.Int(7)), "pow(7, 0)": Pow(z.Int(7), zero),
		} {
			if !v.Contains(one) || relWidth(v, true) > math.Ldexp(1, -int(z.Prec())+4) {
				t.Errorf("%s = %v, want about 1", name, v)
			}
		}
		for name, v := range map[string]B{
			"log 1": Log(one), "sin 0": Sin(zero), "atan 0": Atan(zero), "tanh 0": Tanh(zero),
			"sinh 0": Sinh(zero), "expm1 0": Expm1(zero), "log1p 0": Log1p(zero), "tan 0": Tan(zero),
		} {
			if !v.Contains(zero) || relWidth(v, true) > math.Ldexp(1, -int(z.Prec())) {
				t.Errorf("%s = %v, want about 0", name, v)
			}
		}
		if p := Pow(z.Int(2), z.Int(10)); !p.Contains(z.Int(1024)) {
			t.Errorf("2^10 = %v", p)
		}
		if p := Pow(z.Int(25), z.Frac(1, 2)); !p.Contains(z.Int(5)) {
			t.Errorf("25^(1/2) = %v", p)
		}
		// sin(pi/6) = 1/2, cos(pi/3) = 1/2, tan(pi/4) = 1 (on enclosures of pi).
		pi := z.Pi()
		if !Sin(pi.Quo(z.Int(6))).Contains(z.Frac(1, 2)) || !Cos(pi.Quo(z.Int(3))).Contains(z.Frac(1, 2)) ||
			!Tan(pi.Scale(-2)).Contains(one) || !Sin(pi).Contains(zero) || !Cos(pi).Contains(z.Int(-1)) {
			t.Errorf("trigonometric values at multiples of pi are off")
		}
	}
}

// Large arguments: tanh stays tight and finite, sech does not overflow,
// exp overflows to Whole, and the reduction of sin/cos is correct for huge
// arguments.
func TestElementaryLargeArguments(t *testing.T) {
	for _, p := range []uint{53, 256} {
		x := NewB(1e6, p)
		// tanh(1e6) = 1 - 2e^-2e6 + ...: the enclosure is [1 - 2^-p, 1].
		one := NewB(1, p)
		gap := NewB(1, p).Scale(-int(p) + 1)
		if th := Tanh(x); th.Hi() != 1 || !one.Sub(gap).Less(th) || th.Contains(one.Sub(gap)) {
			t.Errorf("tanh(1e6) at %d bits = %v", p, th)
		}
		if th := Tanh(x.Neg()); th.Lo() != -1 || !th.Less(gap.Sub(one)) {
			t.Errorf("tanh(-1e6) at %d bits = %v", p, th)
		}
		if s := Sech(x); !s.IsFinite() || s.Sign() != 1 || !(s.Hi() < 1e-300) {
			t.Errorf("sech(1e6) at %d bits = %v", p, s)
		}
		if c := Cosh(x); !c.IsFinite() || c.Sign() != 1 {
			t.Errorf("cosh(1e6) at %d bits = %v", p, c)
		}
		if e := Exp(NewB(1e10, p)); e.IsFinite() {
			t.Errorf("exp(1e10) at %d bits = %v, want Whole", p, e)
		}
		if e := Exp(NewB(-1e10, p)); !e.IsFinite() || e.Lo() != 0 || e.Hi() > 1e-300 {
			t.Errorf("exp(-1e10) at %d bits = %v, want [0, tiny]", p, e)
		}
		if th := Tanh(NewB(1e300, p)); th.Hi() != 1 || th.Lo() < 0.5 {
			t.Errorf("tanh(1e300) = %v", th)
		}
	}
	if th := Tanh(PointF(1e6)); th.Hi() != 1 || !(th.Lo() > 1-1e-15) {
		t.Errorf("F tanh(1e6) = %v", th)
	}
	if s := Sech(PointF(1e6)); !s.IsFinite() || s.Lo() < 0 || s.Hi() > 1e-300 {
		t.Errorf("F sech(1e6) = %v", s)
	}
	if s := Sech(PointF(700)); !s.IsFinite() || s.Sign() != 1 {
		t.Errorf("F sech(700) = %v", s)
	}
	if e := Exp(PointF(710)); e.IsFinite() {
		t.Errorf("F exp(710) = %v, want Whole", e)
	}
	if c := Cosh(PointF(711)); c.IsFinite() {
		t.Errorf("F cosh(711) = %v, want Whole", c)
	}
	if e := Exp(PointF(-800)); !e.IsFinite() || e.Lo() != 0 || e.Hi() <= 0 {
		t.Errorf("F exp(-800) = %v, want [0, tiny]", e)
	}
	// sin(1e22) = -0.8522008497671888017727... (from memory; it is the
	// standard test value of huge-argument reduction, K. C. Ng 1992). The
	// 300-bit and F enclosures must contain it, and agree with 1200 bits.
	ref, _ := NewB(0, 300).Decimal("-0.8522008497671888017727")
	refU := NewB(1e-22, 300)
	for _, s := range []B{Sin(NewB(1e22, 300)), Sin(NewB(1e22, 53))} {
		if !overlaps(s, ref.Pad(refU)) {
			t.Errorf("sin(1e22) = %v", s)
		}
	}
	if s := Sin(PointF(1e22)); !overlaps(withPrec(ref.Pad(refU), 53), NewB(s.Lo(), 53).Hull(NewB(s.Hi(), 53))) {
		t.Errorf("F sin(1e22) = %v", s)
	}
	for _, v := range []float64{1e300, -3e200, math.MaxFloat64, 0x1p1000} {
		sF, cF := SinCos(PointF(v))
		sB, cB := SinCos(NewB(v, 1200))
		if !overlaps(NewB(sF.Lo(), 53).Hull(NewB(sF.Hi(), 53)), withPrec(sB, 53)) ||
			!overlaps(NewB(cF.Lo(), 53).Hull(NewB(cF.Hi(), 53)), withPrec(cB, 53)) {
			t.Errorf("sincos(%g): F (%v, %v) vs 1200 bits (%v, %v)", v, sF, cF, sB, cB)
		}
		if relWidth(sF, true) > 1e-14 {
			t.Errorf("F sin(%g) = %v is wide", v, sF)
		}
	}
	// A huge B argument beyond the reduction limit gives [-1, 1], correctly.
	huge := NewB(1, 64).Scale(MaxPrec)
	if s := Sin(huge); s.Lo() != -1 || s.Hi() != 1 {
		t.Errorf("sin(2^65536) = %v, want [-1, 1]", s)
	}
}

// Domain errors return Whole (see the package documentation).
func TestDomainErrors(t *testing.T) {
	for _, z := range []B{NewB(0, 53), NewB(0, 200)} {
		iv := func(a, b float64) B { return z.Float(a).Hull(z.Float(b)) }
		cases := map[string]B{
			"1/[-1,1]":            z.Int(1).Quo(iv(-1, 1)),
			"1/[0,1]":             z.Int(1).Quo(iv(0, 1)),
			"1/0":                 z.Int(1).Quo(z.Int(0)),
			"log[-1,2]":           Log(iv(-1, 2)),
			"log[0,1]":            Log(iv(0, 1)),
			"log[-2,-1]":          Log(iv(-2, -1)),
			"log 0":               Log(z.Int(0)),
			"log1p[-1,0]":         Log1p(iv(-1, 0)),
			"log1p -2":            Log1p(z.Int(-2)),
			"sqrt[-2,-1]":         iv(-2, -1).Sqrt(),
			"pow(0,2)":            Pow(z.Int(0), z.Int(2)),
			"pow([-1,2],2)":       Pow(iv(-1, 2), z.Int(2)),
			"tan[1,2]":            Tan(iv(1, 2)),
			"tan[-2,-1]":          Tan(iv(-2, -1)),
			"atan2 origin":        Atan2(iv(-1, 1), iv(-1, 1)),
			"atan2(0,0)":          Atan2(z.Int(0), z.Int(0)),
			"exp 1e9":             Exp(z.Float(1e9)),
			"sinh 1e9":            Sinh(z.Float(1e9)),
			"cosh -1e9":           Cosh(z.Float(-1e9)),
			"pow overflow":        Pow(z.Int(10), z.Float(1e9)),
			"exp of Whole":        Exp(z.Whole()),
			"log of Whole":        Log(z.Whole()),
			"sin of Whole":        Sin(z.Whole()),
			"cos of Whole":        Cos(z.Whole()),
			"atan of Whole":       Atan(z.Whole()),
			"tanh of Whole":       Tanh(z.Whole()),
			"sech of Whole":       Sech(z.Whole()),
			"atan2 of Whole":      Atan2(z.Whole(), z.Int(1)),
			"pow of Whole":        Pow(z.Int(2), z.Whole()),
			"sqrt of Whole":       z.Whole().Sqrt(),
			"expm1 of Whole":      Expm1(z.Whole()),
			"log1p of Whole":      Log1p(z.Whole()),
			"sinh of Whole":       Sinh(z.Whole()),
			"cosh of Whole":       Cosh(z.Whole()),
			"1/(Whole)":           z.Int(1).Quo(z.Whole()),
			"sin(x)/x at x∋0":     Sin(iv(-1, 1)).Quo(iv(-1, 1)),
			"log of [-1e-30, 1]":  Log(iv(-1e-30, 1)),
			"tan across -pi/2":    Tan(iv(-1.6, -1.5)),
			"exp[0, 1e9] (upper)": Exp(iv(0, 1e9)),
		}
		for name, v := range cases {
			if v.IsFinite() {
				t.Errorf("%s at %d bits = %v, want Whole", name, z.Prec(), v)
			}
		}
		// Sqrt of an interval reaching below zero only slightly is clipped:
		// the result encloses sqrt of the non-negative part.
		if s := iv(-1e-20, 4).Sqrt(); !s.IsFinite() || s.Lo() != 0 || !s.Contains(z.Int(2)) {
			t.Errorf("sqrt[-1e-20,4] = %v", s)
		}
		// The negative real axis: the argument jumps, so the box gets [-pi, pi].
		if a := Atan2(iv(-1, 1), iv(-3, -2)); !a.Contains(z.Pi()) || !a.Contains(z.Pi().Neg()) {
			t.Errorf("atan2 across the negative axis = %v", a)
		}
		// Touching the axis from above stays tight: [3pi/4, pi].
		if a := Atan2(iv(0, 1), iv(-2, -1)); !a.Contains(z.Pi()) || a.Lo() < 2.3 {
			t.Errorf("atan2 on the upper side of the axis = %v", a)
		}
	}
	f := map[string]F{
		"F 1/[-1,1]":    PointF(1).Quo(NewF(-1, 1)),
		"F log[-1,2]":   Log(NewF(-1, 2)),
		"F log 0":       Log(PointF(0)),
		"F sqrt[-2,-1]": NewF(-2, -1).Sqrt(),
		"F pow(0,2)":    Pow(PointF(0), PointF(2)),
		"F exp 710":     Exp(PointF(710)),
		"F sin(Inf)":    Sin(PointF(math.Inf(1))),
		"F atan(NaN)":   Atan(PointF(math.NaN())),
	}
	for name, v := range f {
		if v.IsFinite() {
			t.Errorf("%s = %v, want Whole", name, v)
		}
	}
}

// Widths shrink steadily as the precision grows.
func TestWidthShrinks(t *testing.T) {
	funcs := map[string]func(B) B{"exp": Exp[B], "log": Log[B], "sin": Sin[B], "cos": Cos[B], "atan": Atan[B],
		"tanh": Tanh[B], "sech": Sech[B], "expm1": Expm1[B], "tan": Tan[B]}
	for name, f := range funcs {
		prev := math.Inf(1)
		for _, p := range []uint{53, 100, 200, 400, 800, 1600} {
			w := relWidth(f(NewB(0.7, p)), true)
			if !(w < prev/2) {
				t.Errorf("%s(0.7): width %.3g at %d bits does not shrink (was %.3g)", name, w, p, prev)
			}
			prev = w
		}
	}
}

// The two-part constants used by F's argument reduction: the high part has
// at most 30 significant bits, high + low encloses the constant, and the
// reduction encloses the exact v - k c (checked at 400 bits).
func TestCodyWaiteReduction(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	for name, c := range map[string]*cwConst{"pi/2": &cwHalfPi, "ln2": &cwLn2} {
		c.init()
		if math.Float64bits(c.hi)&(1<<23-1) != 0 {
			t.Errorf("%s: high part %v has more than 30 bits", name, c.hi)
		}
		z := NewB(0, 400)
		l, h := c.lo.Endpoints()
		sum := z.Float(c.hi).Add(z.Between(l, h))
		if !sum.Contains(c.get(z)) {
			t.Errorf("%s: %v + %v misses the constant", name, c.hi, c.lo)
		}
		for i := 0; i < 500; i++ {
			k := int64(rng.Intn(1<<22)) - 1<<21
			if i < 100 {
				k = int64(rng.Intn(2000) - 1000)
			}
			v := float64(k)*c.hi + (rng.Float64()-0.5)*1.6
			r, ok := c.reduceF(v, k)
			if !ok {
				continue
			}
			exact := z.Float(v).Sub(z.Int(k).Mul(c.get(z)))
			if rl, rh := r.Endpoints(); !z.Between(rl, rh).Contains(exact) {
				t.Errorf("%s: reduce(%g, %d) = %v misses %v", name, v, k, r, exact)
			}
			if rb := toF(exact); !overlaps(r, rb) || r.Rad() > 8*math.Abs(rb.Hi())*0x1p-52+1e-300 {
				t.Errorf("%s: reduce(%g, %d) = %v, exact %v", name, v, k, r, exact)
			}
		}
	}
}
