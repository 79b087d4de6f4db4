package relaxation

import (
	"math"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"wedgebound/interval"
	"wedgebound/regions"
)

// The tangent numbers 1, 2, 16, 272, 7936, 353792, 22368256, 1903757312
// (coefficients of tan x = sum T_j x^{2j-1}/(2j-1)!; from memory, common
// practice), also after the table has grown.
func TestTangentNumbers(t *testing.T) {
	want := []int64{1, 2, 16, 272, 7936, 353792, 22368256, 1903757312}
	for _, n := range []int{8, 40} {
		got := tangentNumbers(n)
		for j, w := range want {
			if got[j].Cmp(big.NewInt(w)) != 0 {
				t.Errorf("n=%d: T_%d = %v, want %d", n, j+1, got[j], w)
			}
		}
	}
	// The growth T_j ~ 2 (2j-1)! (2/pi)^{2j} (the nearest poles of
	// tan are at +-pi/2; common practice) at j = 40.
	t40 := new(big.Float).SetInt(tangentNumbers(40)[39])
	f, _ := t40.Float64()
	lf, _ := math.Lgamma(80)
	ratio := math.Log(f) - (math.Log(2) + lf + 80*math.Log(2/math.Pi))
	if math.Abs(ratio) > 1e-6 {
		t.Errorf("T_40 deviates from its asymptotics by e^%g", ratio)
	}
}

// near reports whether x meets the decimal v padded by tol.
func near[T interval.Real[T]](x T, v string, tol float64) bool {
	w, err := x.Decimal(v)
	if err != nil {
		return false
	}
	w = w.Pad(x.Float(tol))
	return !x.Less(w) && !w.Less(x)
}

// J(0) = 1 - 1/3 + 1/5 - ... = pi/4 times 2 (Leibniz): with a = 1/2 the
// series is 2 sum (-1)^n/(2n + 1) = pi/2, and J'(0) = -i K(0) with K(0)
// = 4 sum (-1)^n/(2n+1)^2 = 4 G (Catalan's constant G = 0.91596559417...,
// from memory; the 40 digits of 4G are mpmath 1.3.0's, not a published
// source).
func TestQuadJLeibniz(t *testing.T) {
	check := func(name string, j, dj interval.C[interval.B], tol float64) {
		t.Helper()
		pi := j.Re.Pi().Scale(-1)
		if !pi.Pad(pi.Float(tol)).Contains(j.Re) && !j.Re.Contains(pi) {
			t.Errorf("%s: Re J(0) = %v, want pi/2", name, j.Re)
		}
		if !near(j.Re, "1.570796326794896619231321691639751442099", tol) || !near(j.Im, "0", tol) {
			t.Errorf("%s: J(0) = %v + i %v", name, j.Re, j.Im)
		}
		if !near(dj.Im, "-3.663862376708876060218414059729536443097", tol) || !near(dj.Re, "0", tol) {
			t.Errorf("%s: J'(0) = %v + i %v, want -4G i", name, dj.Re, dj.Im)
		}
		if j.Re.Rad() > tol || dj.Im.Rad() > tol {
			t.Errorf("%s: widths %g, %g above %g", name, j.Re.Rad(), dj.Im.Rad(), tol)
		}
	}
	for _, p := range []uint{53, 256} {
		s := interval.NewB(0, p)
		tol := 1e-14
		if p > 100 {
			tol = 1e-39
		}
		check("B", quadJ(s), quadJDeriv(s), tol)
	}
	f := quadJ(interval.F{})
	if !near(f.Re, "1.5707963267948966192", 4e-16) || f.Re.Rad() > 4e-15 {
		t.Errorf("F: J(0) = %v", f.Re)
	}
}

// quadJValues are J(s) and K(s) = sum (-1)^n/(n + 1/2 + is)^2 (so that
// J'(s) = Im K - i Re K) as Lerch transcendents Phi(-1, 1, a) and
// Phi(-1, 2, a), a = 1/2 + is, computed with mpmath 1.3.0 lerchphi at 80
// digits and rounded to 40 (an independent implementation; not a published
// table). Re J(s) is checked against pi/(2 cosh(pi s)) instead.
var quadJValues = []struct{ s, imJ, reK, imK string }{
	{"0.3", "-0.78609120598619194967256558022434482835", "1.092483318979875506181920176928765243991", "-2.458587271743997301610693094391955886092"},
	{"-0.35581989710050001273", "0.8327127933518505601487454402147243228652", "0.5947920871180146898316250108798321323594", "2.352266200995964791726501109657692854573"},
	{"1", "-0.5830878835989493394480590104420461735022", "-0.5372893229589843959365433507016854310864", "-0.4241222783788511069728439827609802555119"},
	{"-2.5", "0.2103852650319656045276826655144566358384", "-0.09392996282035512149327411935399983000774", "0.003831410317791792470668756653912094156351"},
	{"7", "-0.07180296388503094279083227729729858684635", "-0.01036760379532043890464223187039011364486", "-0.000000002777571635384637166578978332905471024579"},
	{"19.75", "-0.02533273400353049315945980598295146319518", "-0.001284323862110011540098147299256978603973", "-1.116520642989061410937835103099375949431e-26"},
	{"100", "-0.005000125015629768332548276075661549918026", "-0.00005000375078158383747881409804833610921881", "0"},
	{"-1290", "0.0003875969574540578047261495030304141203882", "-0.000000300462847994301154982224950880957746255", "0"},
	{"3942", "-0.0001268391699756691801883542135727415563942", "-0.00000003217635059789223156461115619178179739615", "0"},
	{"-18800", "0.00002659574469966312866038888387125545700102", "-0.000000001414667273259960556098736561900185188844", "0"},
}

func checkQuadJValues[T interval.Real[T]](t *testing.T, like T, rel float64) {
	t.Helper()
	for _, v := range quadJValues {
		s, err := like.Decimal(v.s)
		if err != nil {
			t.Fatal(err)
		}
		j, dj := quadJ(s), quadJDeriv(s)
		reJ := like.Pi().Scale(-1).Quo(interval.Cosh(like.Pi().Mul(s)))
		imJ, _ := like.Decimal(v.imJ)
		tol := rel*math.Abs(imJ.Lo()) + 1e-300
		if !near(j.Im, v.imJ, tol) || !overlapsT(j.Re, reJ.Pad(like.Float(tol))) {
			t.Errorf("%T/%d s=%s: J = %v + i %v, want %v + i %s", like, like.Prec(), v.s, j.Re, j.Im, reJ, v.imJ)
		}
		reK, _ := like.Decimal(v.reK)
		ktol := rel*math.Abs(reK.Lo()) + 1e-300
		// J' = Im K - i Re K; where mpmath's Im K is below its 80 digits
		// (|s| >= 100) "0" stands for it.
		if !near(dj.Im.Neg(), v.reK, ktol) || !near(dj.Re, v.imK, ktol) {
			t.Errorf("%T/%d s=%s: J' = %v + i %v, want %s - i %s", like, like.Prec(), v.s, dj.Re, dj.Im, v.imK, v.reK)
		}
		// Width: a few ulps (float64 intervals round every operation
		// outward) or rel at big floats.
		if j.Im.Rad() > 4*tol || dj.Im.Rad() > 4*ktol {
			t.Errorf("%T/%d s=%s: enclosures too wide: %g (J), %g (J')", like, like.Prec(), v.s, j.Im.Rad(), dj.Im.Rad())
		}
	}
}

func overlapsT[T interval.Real[T]](a, b T) bool { return !a.Less(b) && !b.Less(a) }

func TestQuadJAgainstLerch(t *testing.T) {
	checkQuadJValues(t, interval.F{}, 1e-14)
	checkQuadJValues(t, interval.NewB(0, 200), 1e-38)
}

// jFromRegions recovers J and J' from the certifier's quadrant symbol
// (digamma and trigamma closed forms): B = (i/2pi) J.
func jFromRegions[T interval.Real[T]](S T) (interval.C[T], interval.C[T]) {
	tp := S.Pi().Scale(1)
	b := regions.Quadrant(S).B
	db := regions.QuadrantSlope(S).B
	return interval.C[T]{Re: b.Im.Mul(tp), Im: b.Re.Neg().Mul(tp)},
		interval.C[T]{Re: db.Im.Mul(tp), Im: db.Re.Neg().Mul(tp)}
}

// The two routes to J and J' (Boole's formula here, the digamma closed
// form in regions) enclose the same values, at points and over cells, and
// have comparable widths at points.
func TestQuadJAgainstDigamma(t *testing.T) {
	cells := [][2]string{
		{"0", "0"}, {"-0.36", "-0.35"}, {"0.87", "0.88"}, {"-3.1", "-2.9"},
		{"5.5", "6"}, {"-20.25", "-19.5"}, {"30", "30"}, {"-1290", "-1273.375"},
		{"268.1875", "269"}, {"3823.625", "3942"}, {"-18800", "-18649"},
	}
	run := func(t *testing.T, like interval.B, rel float64) {
		for _, c := range cells {
			lo, _ := like.Decimal(c[0])
			hi, _ := like.Decimal(c[1])
			S := lo.Hull(hi)
			j, dj := quadJ(S), quadJDeriv(S)
			rj, rdj := jFromRegions(S)
			for i, p := range [][2]interval.B{{j.Re, rj.Re}, {j.Im, rj.Im}, {dj.Re, rdj.Re}, {dj.Im, rdj.Im}} {
				if !overlapsT(p[0], p[1]) {
					t.Errorf("prec %d, cell %v, part %d: Boole %v, digamma %v disjoint", like.Prec(), c, i, p[0], p[1])
				}
			}
			if c[0] == c[1] {
				floor := rel * math.Sqrt(rj.Abs2().Hi())
				if j.Im.Rad() > 4*(rj.Im.Rad()+floor) || j.Re.Rad() > 4*(rj.Re.Rad()+floor) {
					t.Errorf("prec %d, s=%s: widths %g, %g vs digamma %g, %g", like.Prec(), c[0], j.Re.Rad(), j.Im.Rad(), rj.Re.Rad(), rj.Im.Rad())
				}
			}
		}
	}
	run(t, interval.NewB(0, 53), 1e-15)
	run(t, interval.NewB(0, 256), 1e-75)
	// Float64 intervals: overlap at the cells.
	for _, c := range cells {
		lo, _ := interval.F{}.Decimal(c[0])
		hi, _ := interval.F{}.Decimal(c[1])
		S := lo.Hull(hi)
		j, dj := quadJ(S), quadJDeriv(S)
		rj, rdj := jFromRegions(S)
		if !overlapsT(j.Re, rj.Re) || !overlapsT(j.Im, rj.Im) || !overlapsT(dj.Re, rdj.Re) || !overlapsT(dj.Im, rdj.Im) {
			t.Errorf("F cell %v: Boole (%v, %v) and digamma (%v, %v) disjoint", c, j, dj, rj, rdj)
		}
	}
}

// At 1100 bits (about 330 digits) the two routes still agree and both are
// narrow.
func TestQuadJHighPrecision(t *testing.T) {
	like := interval.NewB(0, 1100)
	for _, v := range []string{"0.3", "-7.25", "1290"} {
		s, _ := like.Decimal(v)
		j := quadJ(s)
		rj, _ := jFromRegions(s)
		if !overlapsT(j.Im, rj.Im) || !overlapsT(j.Re, rj.Re) {
			t.Errorf("s=%s: Boole and digamma disagree at 1100 bits", v)
		}
		if j.Im.Rad() > 1e-320 {
			t.Errorf("s=%s: width %g at 1100 bits", v, j.Im.Rad())
		}
	}
}

// Over a cell, the enclosure is finite and contains the point enclosures
// inside it, also for the widest pieces the verifier forms (its regimes
// [-1, 1] and [2^(m-1), 2^m]).
func TestQuadJCellContainsPoints(t *testing.T) {
	like := interval.F{}
	for _, c := range [][2]float64{{-0.4, -0.3}, {-1290, -1273.375}, {3823.625, 3942}, {-2, 2}, {15, 25},
		{-1, 1}, {1, 2}, {-16, -8}, {16, 32}, {1024, 2048}, {-(1 << 30), -(1 << 29)}} {
		S := like.Float(c[0]).Hull(like.Float(c[1]))
		j, dj := quadJ(S), quadJDeriv(S)
		if !j.IsFinite() || !dj.IsFinite() || j.Im.Rad() > 1 || dj.Im.Rad() > 3 {
			t.Errorf("cell %v: J %v, J' %v", c, j, dj)
		}
		for i := 0; i <= 16; i++ {
			s := like.Float(c[0] + (c[1]-c[0])*float64(i)/16)
			jp, djp := quadJ(s), quadJDeriv(s)
			if !j.Contains(jp) || !dj.Contains(djp) {
				t.Errorf("cell %v: point %v not contained", c, s)
			}
		}
	}
}

// BenchmarkQuadJ is the cost of J at a point and J' over a cell near the
// quadrant's minimum (float64 intervals), as Model.Piece uses them.
func BenchmarkQuadJ(b *testing.B) {
	like := interval.F{}
	c := like.Float(-0.355)
	S := like.Float(-0.36).Hull(like.Float(-0.35))
	for b.Loop() {
		quadJ(c)
		quadJDeriv(S)
	}
}

// BenchmarkQuadJFar is the same at |s| about 1280 (no shift).
func BenchmarkQuadJFar(b *testing.B) {
	like := interval.F{}
	c := like.Float(-1281)
	S := like.Float(-1290).Hull(like.Float(-1273.375))
	for b.Loop() {
		quadJ(c)
		quadJDeriv(S)
	}
}

// BenchmarkQuadJDigamma is the digamma route at the same point and cell
// (for comparison only).
func BenchmarkQuadJDigamma(b *testing.B) {
	like := interval.F{}
	c := like.Float(-0.355)
	S := like.Float(-0.36).Hull(like.Float(-0.35))
	for b.Loop() {
		jFromRegions(c)
		jFromRegions(S)
	}
}

// The remainder bound of Boole's series holds, and is not loose by more
// than a modest factor, against the digamma closed forms
// J(z) = (psi((z+1)/2) - psi(z/2))/2 and K(z) = -J'(z) =
// (psi'(z/2) - psi'((z+1)/2))/4 at 300 bits (the splitting of the
// alternating sum into even and odd n; common practice).
func TestBooleRemainderBound(t *testing.T) {
	like := interval.NewB(0, 300)
	for _, zc := range [][2]float64{{5.5, 2}, {10.5, -7}, {0.5, 20}, {20.5, 0}, {3.5, -4}} {
		z := interval.C[interval.B]{Re: like.Float(zc[0]), Im: like.Float(zc[1])}
		A := interval.Lower(interval.Lower(z.Abs2()).Sqrt())
		h1 := z.AddReal(like.Int(1)).Scale(-1)
		h0 := z.Scale(-1)
		exact := [2]interval.C[interval.B]{
			interval.Digamma(h1).Sub(interval.Digamma(h0)).Scale(-1),
			interval.Trigamma(h0).Sub(interval.Trigamma(h1)).Scale(-2),
		}
		for d := range 2 {
			for _, M := range []int{1, 2, 4, 8} {
				p, r := booleSeries(z, A, M, d)
				err := math.Sqrt(p.Sub(exact[d]).Abs2().Hi())
				if err > r.Hi() {
					t.Errorf("z=%v d=%d M=%d: error %g above the bound %g", zc, d, M, err, r.Hi())
				}
				if err < 1e-60 || r.Hi() > 1e4*err {
					t.Errorf("z=%v d=%d M=%d: bound %g, error %g", zc, d, M, r.Hi(), err)
				}
			}
		}
	}
}

// The claim that the verifier's J(s) does not go through the certifier's
// digamma route holds for the code: no non-test file of this package calls
// the interval package's gamma family.
func TestNoGammaFamily(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil || len(files) == 0 {
		t.Fatalf("no sources: %v", err)
	}
	for _, f := range files {
		if strings.HasSuffix(f, "_test.go") {
			continue
		}
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		for _, name := range []string{"interval.Digamma", "interval.Trigamma", "interval.Tetragamma", "interval.LogGamma"} {
			if strings.Contains(string(b), name) {
				t.Errorf("%s calls %s", f, name)
			}
		}
	}
}
