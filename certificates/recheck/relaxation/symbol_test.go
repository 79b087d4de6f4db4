package relaxation

import (
	"math/big"
	"testing"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// The quadrant operator's spectral edges: inf spec about -0.15594 and sup
// spec about 1.00768 (R. F. Werner, J. Phys. A 21 (1988) 4565; digits from
// memory); the regions package doc gives 20 digits computed with mpmath (not a
// published source): min -0.15593984319124276369 at
// s = -0.35581989710050001273, max 1.0076799700700341398 at
// s = 0.87220286866793073874.
func TestQuadrantEdges(t *testing.T) {
	for _, tc := range []struct {
		edge        Edge
		at, value   string
		tol, wernr  float64
		wernerValue string
	}{
		{Lower, "-0.35581989710050001273", "-0.15593984319124276369", 1e-14, 5e-6, "-0.15594"},
		{Upper, "0.87220286866793073874", "1.0076799700700341398", 1e-14, 5e-6, "1.00768"},
	} {
		m, err := NewModel(interval.F{}, tc.edge, nil)
		if err != nil {
			t.Fatal(err)
		}
		s := rat(t, tc.at)
		r, err := m.Piece(s, s)
		if err != nil {
			t.Fatal(err)
		}
		if !closeTo(r.Mid, tc.value, tc.tol) {
			t.Errorf("%s edge at s*: %v, mpmath %s", tc.edge, r.Mid, tc.value)
		}
		if !closeTo(r.Mid, tc.wernerValue, tc.wernr) {
			t.Errorf("%s edge at s*: %v, Werner %s", tc.edge, r.Mid, tc.wernerValue)
		}
		// A cell around the extremum: the enclosure must contain the extreme
		// value and be tight (mean-value form, width of order w^2).
		w := big.NewRat(1, 1000)
		a, b := new(big.Rat).Sub(s, w), new(big.Rat).Add(s, w)
		rc, err := m.Piece(a, b)
		if err != nil {
			t.Fatal(err)
		}
		if !closeTo(rc.Eig, tc.value, 0) {
			t.Errorf("%s edge: cell enclosure %v misses %s", tc.edge, rc.Eig, tc.value)
		}
		if rc.Eig.Hi()-rc.Eig.Lo() > 2e-5 {
			t.Errorf("%s edge: cell enclosure %v of width %g is not second-order tight", tc.edge, rc.Eig, rc.Eig.Hi()-rc.Eig.Lo())
		}
	}
}

// Re J(s) = pi/(2 cosh(pi s)): the real part of sum_n (-1)^n/(n + 1/2 + is)
// is the classical partial-fraction expansion of (pi/2) sech(pi s) (common
// practice; no single source checked).
func TestQuadrantJRealPart(t *testing.T) {
	like := interval.F{}
	for _, s := range []string{"-12", "-1.5", "0", "0.4", "3"} {
		c, _ := like.Decimal(s)
		j := quadJ(c)
		want := interval.Sech(like.Pi().Mul(c)).Mul(like.Pi()).Scale(-1)
		if d := j.Re.Sub(want); d.Sign() != 0 || d.Rad() > 1e-12 {
			t.Errorf("s=%s: Re J = %v, pi/(2cosh) = %v", s, j.Re, want)
		}
	}
}

// Every piece enclosure must contain the point values inside it (checked
// on a grid), for a model with two exp terms of opposite signs.
func TestPieceContainsPoints(t *testing.T) {
	terms := []certificates.Term{
		{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal("150")}, Weight: certificates.MustDecimal("8.46")},
		{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal("3")}, Weight: certificates.MustDecimal("-0.7")},
	}
	for _, edge := range []Edge{Lower, Upper} {
		m, err := NewModel(interval.F{}, edge, terms)
		if err != nil {
			t.Fatal(err)
		}
		for _, cell := range [][2]string{{"-0.3", "-0.2"}, {"-1.5", "-0.5"}, {"0.75", "1.5"}, {"-20", "-17"}, {"5", "6"}} {
			a, b := rat(t, cell[0]), rat(t, cell[1])
			for _, p := range Pieces(a, b) {
				r, err := m.Piece(p[0], p[1])
				if err != nil {
					t.Fatal(err)
				}
				for i := 0; i <= 10; i++ {
					s := new(big.Rat).Add(p[0], new(big.Rat).Mul(new(big.Rat).Sub(p[1], p[0]), big.NewRat(int64(i), 10)))
					pt, err := m.Piece(s, s)
					if err != nil {
						t.Fatal(err)
					}
					if !overlaps(r.Eig, pt.Mid) {
						t.Errorf("%s [%s, %s]: point %s value %v outside %v", edge, p[0].RatString(), p[1].RatString(), s.RatString(), pt.Mid, r.Eig)
					}
				}
			}
		}
	}
}

// The tail enclosure must hold at sample points beyond its start.
func TestTailHoldsAtSamples(t *testing.T) {
	terms := []certificates.Term{{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal("150")}, Weight: certificates.MustDecimal("8.46")}}
	for _, edge := range []Edge{Lower, Upper} {
		m, _ := NewModel(interval.F{}, edge, terms)
		for _, side := range []int{-1, 1} {
			from := big.NewRat(int64(12*side), 1)
			enc, err := m.Tail(from, side)
			if err != nil {
				t.Fatal(err)
			}
			for _, f := range []int64{12, 13, 20, 55, 300, 5000} {
				s := big.NewRat(f*int64(side), 1)
				pt, _ := m.Piece(s, s)
				if edge == Lower && pt.Mid.Less(interval.Lower(enc)) || edge == Upper && interval.Upper(enc).Less(pt.Mid) {
					t.Errorf("%s side %d: lambda(%d) = %v beyond the tail bound %v", edge, side, f*int64(side), pt.Mid, enc)
				}
			}
		}
	}
}

func TestUnknownKind(t *testing.T) {
	_, err := NewModel(interval.F{}, Lower, []certificates.Term{{Kind: "band", Params: map[string]certificates.Decimal{"a": certificates.MustDecimal("1")}, Weight: certificates.MustDecimal("1")}})
	if err == nil {
		t.Fatal("unknown kind accepted")
	}
}
