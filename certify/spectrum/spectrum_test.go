package spectrum

import (
	"math"
	"testing"

	"wedgebound/interval"
	"wedgebound/regions"
)

// Digits outside the documented ranges are refused before any work.
func TestDigitLimits(t *testing.T) {
	for _, d := range []int{0, MaxQuadrantDigits + 1} {
		if _, err := Quadrant(d); err == nil {
			t.Errorf("Quadrant(%d) accepted", d)
		}
	}
	for _, d := range []int{0, MaxCoverDigits + 1} {
		if _, err := Terms(regions.Relaxation[interval.F]{}, d, nil); err == nil {
			t.Errorf("Terms(%d) accepted", d)
		}
	}
}

// The bare quadrant at 6 digits: inf spec Op(chi_Q) and sup spec are
// -0.15594 and 1.00768 to five digits (R. F. Werner, J. Phys. A 21 (1988)
// 4565, from memory).
func TestQuadrantSixDigits(t *testing.T) {
	r, err := Quadrant(6)
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range []float64{-0.15594, 1.00768} {
		if r[i].Hi()-r[i].Lo() > 1e-6 || math.Abs(r[i].Lo()-want) > 5e-6 {
			t.Errorf("enclosure %d = %v, want one of width <= 1e-6 that rounds to %v", i, r[i], want)
		}
	}
}
