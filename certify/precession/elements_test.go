package precession

import (
	"math"
	"testing"
)

// hermite returns the normalised Hermite functions h_0..h_n at x by the
// three-term recurrence (common practice).
func hermite(n int, x float64) []float64 {
	h := make([]float64, n+1)
	h[0] = math.Pow(math.Pi, -0.25) * math.Exp(-x*x/2)
	if n > 0 {
		h[1] = math.Sqrt2 * x * h[0]
	}
	for k := 2; k <= n; k++ {
		h[k] = math.Sqrt(2/float64(k))*x*h[k-1] - math.Sqrt(float64(k-1)/float64(k))*h[k-2]
	}
	return h
}

// TestSignElements compares the closed form of <m|sgn x|n> with a direct
// midpoint quadrature of 2 int_0^inf h_m h_n dx.
func TestSignElements(t *testing.T) {
	const n = 40
	tab := NewTable(64)
	dx := 1e-4
	sum := make([][]float64, n+1)
	for i := range sum {
		sum[i] = make([]float64, n+1)
	}
	for x := dx / 2; x < 14; x += dx {
		h := hermite(n, x)
		for m := 0; m <= n; m++ {
			for k := 0; k <= n; k++ {
				sum[m][k] += 2 * h[m] * h[k] * dx
			}
		}
	}
	for m := 0; m <= n; m += 2 {
		for k := 1; k <= n; k += 2 {
			want := sum[m][k]
			got := tab.M(m/2, (k-1)/2, Sqrt2OverPi())
			if math.Abs(got.Lo()-want) > 1e-6 {
				t.Fatalf("<%d|sgn|%d> = %v, quadrature %v", m, k, got, want)
			}
		}
	}
}

// TestFactorisation checks B_ab = (Sign/3) F_a M_{a+P,b} G_b in each sector.
func TestFactorisation(t *testing.T) {
	tab := NewTable(400)
	for _, s := range Sectors {
		for a := 0; a < 30; a++ {
			for b := 0; b < 30; b++ {
				lhs := s.Entryf(tab, a, b)
				rhs := float64(s.Sign) / 3 * math.Sqrt(s.F2f(tab, a)*s.G2f(tab, b)) * tab.Mf(a+s.P, b)
				if math.Abs(lhs-rhs) > 1e-13 {
					t.Fatalf("sector %d (%d,%d): %v vs %v", s.R, a, b, lhs, rhs)
				}
				if e := s.Entry(tab, a, b); e.Lo() > lhs+1e-15 || e.Hi() < lhs-1e-15 {
					t.Fatalf("enclosure %v misses float value %v", e, lhs)
				}
			}
		}
	}
}
