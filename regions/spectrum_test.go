package regions_test

import (
	"math/big"
	"testing"

	"wedgebound/certify"
	"wedgebound/interval"
	"wedgebound/regions"
)

// Reference values for the bare quadrant operator Op(chi_Q):
// inf spec about -0.15594 and sup spec about 1.00768 (R. F. Werner,
// J. Phys. A 21 (1988) 4565; digits from memory); the 20-digit values are
// from the package doc ("The quadrant"), computed with mpmath (not a
// published source).
const (
	quadrantInf20 = "-0.15593984319124276369"
	quadrantSup20 = "1.0076799700700341398"
	wernerInf     = -0.15594
	wernerSup     = 1.00768
)

// TestQuadrantSpectrum30Digits encloses inf and sup of the quadrant
// spectrum to width below 1e-30 at 140 bits with certify.Extreme on the
// mean-value enclosure QuadrantEig, with both tails |s| >= 64 closed by
// QuadrantTail (|B| <= 1/512, A within 1e-87 of 0 or 1), and checks that the
// enclosures contain the reference values. This is what
// `wedgebound spectrum --quadrant --digits 30` computes.
func TestQuadrantSpectrum30Digits(t *testing.T) {
	like := interval.NewB(0, 140)
	S := like.Int(64)
	rel := regions.Relaxation[interval.B]{}
	eps, _ := like.Decimal("1e-33")
	minW := new(big.Rat).SetFrac64(1, 1_000_000_000_000_000_000)
	for _, c := range []struct {
		e      regions.Edge
		ref    string
		ulp    string // half a unit in the reference's last (20th) digit
		werner float64
	}{{regions.Lower, quadrantInf20, "5e-21", wernerInf}, {regions.Upper, quadrantSup20, "5e-20", wernerSup}} {
		e := c.e
		x := certify.Extreme[interval.B]{
			F:     func(s interval.B) interval.B { return regions.QuadrantEig(s, e) },
			Point: func(s interval.B) interval.B { return regions.Quadrant(s).Eig(e) },
			Fast: func(s interval.B) interval.B {
				v := regions.QuadrantEig(interval.F{}.Between(s.Endpoints()), e)
				return s.Between(v.Endpoints())
			},
			Lo: big.NewRat(-64, 1), Hi: big.NewRat(64, 1),
			Outside: rel.Tail(S, 1).Eig(e).Hull(rel.Tail(S, -1).Eig(e)),
			Cells:   64, Eps: eps, Max: e == regions.Upper,
			Options: certify.CoverOptions{MinWidth: minW, MaxCells: 200000},
		}
		r, err := x.Solve(like)
		if err != nil {
			t.Fatalf("%s: %v", e, err)
		}
		ref, _ := like.Decimal(c.ref)
		// The reference has 20 digits: pad it by half a unit in the last place.
		half, _ := like.Decimal(c.ulp)
		if !overlapsB(r.Value, ref.Pad(half)) {
			t.Errorf("%s: enclosure %v misses the 20-digit value %s", e, r.Value, c.ref)
		}
		if w := r.Value.Rad() * 2; w >= 1e-30 {
			t.Errorf("%s: width %.3g, want < 1e-30", e, w)
		}
		if m := r.Value.Mid().Lo(); m < c.werner-5e-6 || m > c.werner+5e-6 {
			t.Errorf("%s: %v is not %v to the 5 digits quoted by Werner (1988)", e, m, c.werner)
		}
		lo, hi, _ := interval.Decimals(r.Value, 34)
		t.Logf("%s: [%s, %s] at s = %v, %d cells", e, lo, hi, r.At.Mid().Lo(), r.Cells)
	}
}

func overlapsB(x, y interval.B) bool { return !x.Less(y) && !y.Less(x) }
