package relaxation

import (
	"math/big"
	"testing"

	"wedgebound/certificates"
	"wedgebound/interval"
)

func rat(t testing.TB, s string) *big.Rat {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		t.Fatalf("bad number %q", s)
	}
	return r
}

// lerchValues are I(s) = Phi(q, 1, 1/2 + is) with q = (k+2i)/(k-2i),
// computed with mpmath 1.3.0 lerchphi at 30 digits (an independent
// implementation of the Lerch transcendent; not a published table).
var lerchValues = []struct{ k, s, re, im string }{
	{"150", "0.3", "4.4940180036075979181", "0.35756991384813324908"},
	{"150", "-0.7", "3.4691521424953998", "3.0000488803845688"},
	{"150", "1.5", "2.8118117485540966", "-0.037226950216194582"},
	{"150", "-1.5", "2.5590176280578657", "2.9843206676533961"},
	{"150", "-2.5", "1.9754817783980685256", "2.9129145133936281179"},
	{"150", "-10", "0.38397176434594119", "2.4013671195703843"},
	{"150", "-37", "-0.677323289603722", "1.1804438022179486"},
	{"150", "7", "1.5430276015144606822", "-0.02057370135352614213"},
	{"150", "100", "0.28828542732245452", "-0.003843805697632727"},
	{"150", "-700", "-0.056813277538612306", "0.00075753496170981246"},
	{"2", "0.3", "1.3199120662185538382", "-0.38169152317606748807"},
	{"2", "-2.5", "-0.23075406576875443574", "0.31829161080163770643"},
	{"2", "7", "0.067207878050384269219", "-0.067207878050363293678"},
	{"0.5", "0.3", "1.1105462973088361754", "-0.65919578479231444639"},
	{"0.5", "-2.5", "-0.052210207857650305395", "0.22595665461062343227"},
	{"0.5", "7", "0.017634799306450341107", "-0.070539197107704187964"},
}

// closeTo reports whether x lies within tol of the decimal v.
func closeTo(x interval.F, v string, tol float64) bool {
	w, _ := interval.F{}.Decimal(v)
	return !x.Pad(interval.F{}.Float(tol)).Less(w) && !w.Less(x.Pad(interval.F{}.Float(tol)))
}

func TestExpIAgainstLerch(t *testing.T) {
	like := interval.F{}
	for _, v := range lerchValues {
		e, err := newExpTerm(like, map[string]certificates.Decimal{"k": certificates.MustDecimal(v.k)})
		if err != nil {
			t.Fatal(err)
		}
		s := rat(t, v.s)
		idx, _ := regimeIndex(s, s)
		reg, err := e.regime(idx)
		if err != nil {
			t.Fatal(err)
		}
		c, _ := like.Decimal(v.s)
		ev := e.evalI(reg, c, c, like.Int(0))
		// The reference has 17+ digits; our enclosure must contain it up to
		// the reference's own rounding (1e-16 relative).
		if !closeTo(ev.Ic.Re, v.re, 1e-15) || !closeTo(ev.Ic.Im, v.im, 1e-15) {
			t.Errorf("k=%s s=%s: I = %v + i %v, mpmath %s + i %s", v.k, v.s, ev.Ic.Re, ev.Ic.Im, v.re, v.im)
		}
		if ev.Ic.Re.Rad() > 1e-10 || ev.Ic.Im.Rad() > 1e-10 {
			t.Errorf("k=%s s=%s: enclosure too wide: %v, %v", v.k, v.s, ev.Ic.Re, ev.Ic.Im)
		}
	}
}

// Identity (derived here): int_0^inf r^{a-1}/(1 - q r) dr =
// pi (-q)^{-a}/sin(pi a), and the part over [1, inf) equals
// -conj(q) conj(I(s)) (substitute r -> 1/r), so
// I - conj(q) conj(I) = pi e^{i(pi - 2 theta) a}/cosh(pi s), which reads
// Im(e^{i theta} I(s)) = (pi/2) e^{-(pi - 2 theta) s}/cosh(pi s).
func TestExpIReflectionIdentity(t *testing.T) {
	for _, k := range []string{"0.01", "0.5", "3", "150", "2000"} {
		for _, s := range []string{"-300", "-20", "-3.5", "-1", "-0.4", "0", "0.75", "1.25", "6", "45"} {
			checkReflection(t, interval.F{}, k, s, 1e-9)
		}
	}
	// And at high precision.
	checkReflection(t, interval.NewB(0, 160), "150", "-2.75", 1e-35)
}

func checkReflection[T interval.Real[T]](t *testing.T, like T, k, s string, tol float64) {
	e, err := newExpTerm(like, map[string]certificates.Decimal{"k": certificates.MustDecimal(k)})
	if err != nil {
		t.Fatal(err)
	}
	sr := rat(t, s)
	idx, _ := regimeIndex(sr, sr)
	reg, err := e.regime(idx)
	if err != nil {
		t.Fatalf("k=%s s=%s: %v", k, s, err)
	}
	c, _ := like.Decimal(s)
	I := e.evalI(reg, c, c, like.Int(0)).Ic
	sn, cs := interval.SinCos(e.theta)
	lhs := cs.Mul(I.Im).Add(sn.Mul(I.Re))
	pi := like.Pi()
	rhs := interval.Exp(pi.Sub(e.theta.Scale(1)).Mul(c).Neg()).Mul(interval.Sech(pi.Mul(c))).Mul(pi).Scale(-1)
	d := lhs.Sub(rhs)
	if d.Sign() != 0 {
		t.Errorf("prec %d k=%s s=%s: identity violated: lhs %v rhs %v", like.Prec(), k, s, lhs, rhs)
	}
	if d.Rad() > tol*(1+rhs.Abs().Hi()) {
		t.Errorf("prec %d k=%s s=%s: identity only to %g", like.Prec(), k, s, d.Rad())
	}
}

// M_{++} closed form against the Mellin integral
// (1/pi) int_0^inf r^{a-1}/((k - 2i) + (k + 2i) r) dr evaluated with
// mpmath quad at 30 digits (independent numerical integration; agreement
// to 1e-18, the quadrature's accuracy).
func TestExpMppClosedForm(t *testing.T) {
	like := interval.F{}
	for _, v := range []struct{ k, s, want string }{
		{"150", "0.3", "0.0045464331172076017924"},
		{"2", "-2.5", "5.4084598470806888647e-6"},
		{"0.5", "7", "0.031429334743579294186"},
		{"20", "-1.25", "0.0015275183796171390274"},
	} {
		e, err := newExpTerm(like, map[string]certificates.Decimal{"k": certificates.MustDecimal(v.k)})
		if err != nil {
			t.Fatal(err)
		}
		c, _ := like.Decimal(v.s)
		if m := e.mpp(c); !closeTo(m, v.want, 1e-18) || m.Rad() > 1e-13*m.Hi() {
			t.Errorf("k=%s s=%s: M++ = %v, Mellin integral %s", v.k, v.s, m, v.want)
		}
	}
}

// The cell enclosures must contain the point values inside the cell, and
// the derivative enclosure must contain every difference quotient (mean
// value theorem in the convex rectangle).
func TestExpCellEnclosure(t *testing.T) {
	like := interval.F{}
	e, _ := newExpTerm(like, map[string]certificates.Decimal{"k": certificates.MustDecimal("20")})
	for _, cell := range [][2]string{{"-0.5", "-0.25"}, {"-3", "-2.9"}, {"1.5", "1.75"}, {"-64", "-63"}} {
		a, b := rat(t, cell[0]), rat(t, cell[1])
		idx, ok := regimeIndex(a, b)
		if !ok {
			t.Fatal(cell)
		}
		reg, err := e.regime(idx)
		if err != nil {
			t.Fatal(err)
		}
		lo, _ := like.Decimal(cell[0])
		hi, _ := like.Decimal(cell[1])
		S := lo.Hull(hi)
		c := S.Mid()
		delta := interval.Upper(S.Sub(c).Abs())
		ev := e.evalI(reg, c, S, delta)
		var prev interval.C[interval.F]
		var prevS interval.F
		for i := 0; i <= 8; i++ {
			s := lo.Add(hi.Sub(lo).Mul(like.Frac(int64(i), 8)))
			s = s.Mid()
			v := e.evalI(reg, s, s, like.Int(0)).Ic
			if !overlaps(ev.IS.Re, v.Re) || !overlaps(ev.IS.Im, v.Im) {
				t.Errorf("cell %v: I(%v) = %v not in the cell enclosure %v", cell, s, v, ev.IS)
			}
			if i > 0 {
				q := v.Sub(prev).QuoReal(s.Sub(prevS))
				if !overlaps(ev.dIS.Re, q.Re) || !overlaps(ev.dIS.Im, q.Im) {
					t.Errorf("cell %v: difference quotient %v outside I'(S) = %v", cell, q, ev.dIS)
				}
			}
			prev, prevS = v, s
		}
	}
}

func overlaps(a, b interval.F) bool { return !a.Less(b) && !b.Less(a) }

// The tail lemma |B_term(s)| <= C(k)/|1/2 + is| must hold at sample points,
// and so must 0 < M_{++} <= the tail bound of D.
func TestExpTailLemmaSamples(t *testing.T) {
	like := interval.F{}
	for _, k := range []string{"0.5", "7", "150"} {
		e, _ := newExpTerm(like, map[string]certificates.Decimal{"k": certificates.MustDecimal(k)})
		C := e.tailConst()
		for _, s := range []string{"-50", "-9", "-2", "1.5", "4", "33"} {
			sr := rat(t, s)
			idx, _ := regimeIndex(sr, sr)
			reg, _ := e.regime(idx)
			c, _ := like.Decimal(s)
			b := e.bFromI(e.evalI(reg, c, c, like.Int(0)).Ic)
			a := like.Frac(1, 4).Add(c.Sqr()).Sqrt()
			if C.Quo(a).Less(b.Abs()) {
				t.Errorf("k=%s s=%s: |B| = %v above C(k)/|a| = %v", k, s, b.Abs(), C.Quo(a))
			}
			side := 1
			if sr.Sign() < 0 {
				side = -1
			}
			S := c.Abs()
			if d := e.mpp(c); e.tailDBound(S, side).Less(d) || d.Sign() <= 0 {
				t.Errorf("k=%s s=%s: M++ = %v, tail bound %v", k, s, d, e.tailDBound(S, side))
			}
		}
	}
}
