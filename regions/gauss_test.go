package regions

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"wedgebound/interval"
)

// TestGaussAgainstGonum compares the verified Gauss-Legendre rule with
// gonum's quad.Legendre (an independent implementation): every gonum node
// and weight must lie within a few ulps of our enclosures, and the
// enclosures must be tight.
func TestGaussAgainstGonum(t *testing.T) {
	for _, n := range []int{1, 2, 5, 12, 20, 33} {
		r, err := gaussLegendre(interval.PointF(0), n)
		if err != nil {
			t.Fatalf("n = %d: %v", n, err)
		}
		x := make([]float64, n)
		w := make([]float64, n)
		quad.Legendre{}.FixedLocations(x, w, -1, 1)
		// Both list the nodes in decreasing order.
		for i := range n {
			j := i
			if !near(r.x[i], x[j], 4e-16) {
				t.Errorf("n = %d: node %d = %v, gonum %v", n, i, r.x[i], x[j])
			}
			if !near(r.w[i], w[j], 4e-16*math.Max(1, w[j])) {
				t.Errorf("n = %d: weight %d = %v, gonum %v", n, i, r.w[i], w[j])
			}
			if r.x[i].Rad() > 1e-15 {
				t.Errorf("n = %d: node %d enclosure too wide: %v", n, i, r.x[i])
			}
		}
	}
}

// TestGaussExactness checks, at 200 bits, that the weights add up to 2 and
// that the n-point rule integrates x^m exactly for m <= 2n - 1 (the
// defining property of Gauss-Legendre quadrature, common practice): the
// enclosure of sum w_i x_i^m must contain int_{-1}^1 x^m dx = 2/(m+1) for
// even m and 0 for odd m. For m = 2n it must not be exact.
func TestGaussExactness(t *testing.T) {
	like := interval.NewB(0, 200)
	for _, n := range []int{3, 8, 20} {
		r, err := gaussLegendre(like, n)
		if err != nil {
			t.Fatal(err)
		}
		for m := 0; m <= 2*n; m++ {
			sum := like.Int(0)
			for i := range r.x {
				p := like.Int(1)
				for range m {
					p = p.Mul(r.x[i])
				}
				sum = sum.Add(r.w[i].Mul(p))
			}
			want := like.Int(0)
			if m%2 == 0 {
				want = like.Frac(2, int64(m+1))
			}
			if m < 2*n {
				if !overlaps(sum, want) {
					t.Errorf("n = %d, m = %d: sum %v, want %v", n, m, sum, want)
				}
				if sum.Rad() > 1e-50 {
					t.Errorf("n = %d, m = %d: enclosure too wide %v", n, m, sum)
				}
			} else if overlaps(sum, want) {
				t.Errorf("n = %d: x^%d integrated exactly, but Gauss-Legendre is exact only to degree %d", n, m, 2*n-1)
			}
		}
	}
	// Float rule: weights sum to 2.
	r, _ := gaussLegendre(interval.PointF(0), 20)
	sum := interval.PointF(0)
	for _, w := range r.w {
		sum = sum.Add(w)
	}
	if !sum.Contains(interval.PointF(2)) {
		t.Errorf("float weights sum to %v, want 2", sum)
	}
}

// TestGaussBound checks the Bernstein-ellipse remainder bound (Trefethen,
// SIAM Review 50 (2008), Theorem 4.5, as cited in gauss.go) on
// f(x) = 1/(a - x), a = 1.5, whose integral over [-1, 1] is
// log((a+1)/(a-1)) = log 5: f is analytic inside E_rho for
// rho < a + sqrt(a^2 - 1), with |f| <= 1/(a - (rho + 1/rho)/2) there (the
// nearest point of the ellipse to the pole is the end of its major axis).
func TestGaussBound(t *testing.T) {
	like := interval.NewB(0, 200)
	a := like.Frac(3, 2)
	exact := interval.Log(like.Int(5))
	for _, n := range []int{4, 10, 20} {
		r, err := gaussLegendre(like, n)
		if err != nil {
			t.Fatal(err)
		}
		sum := like.Int(0)
		for i := range r.x {
			sum = sum.Add(r.w[i].Quo(a.Sub(r.x[i])))
		}
		err0 := sum.Sub(exact).Abs()
		for _, rf := range []float64{1.5, 2, 2.4} {
			rho := like.Float(rf)
			semi := rho.Add(like.Int(1).Quo(rho)).Scale(-1)
			M := like.Int(1).Quo(a.Sub(semi))
			b := gaussBound(M, rho, n)
			if !err0.Less(b) {
				t.Errorf("n = %d, rho = %v: actual error %v exceeds the bound %v", n, rf, err0, b)
			}
		}
		t.Logf("n = %d: error %.3g", n, err0.Hi())
	}
}

// TestGaussPrecisions checks the cache keys by precision: the 53-bit and
// 300-bit rules differ in width but agree.
func TestGaussPrecisions(t *testing.T) {
	f, _ := gaussLegendre(interval.PointF(0), 20)
	b, _ := gaussLegendre(interval.NewB(0, 300), 20)
	for i := range f.x {
		bf := interval.PointF(0).Between(b.x[i].Endpoints())
		if !overlaps(f.x[i], bf) || b.x[i].Rad() > 1e-85 {
			t.Errorf("node %d: 53-bit %v, 300-bit %v", i, f.x[i], b.x[i])
		}
	}
}
