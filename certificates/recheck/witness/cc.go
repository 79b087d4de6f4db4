package witness

import (
	"sync"

	"wedgebound/interval"
)

// ccRule is the (n+1)-point Clenshaw-Curtis rule on [-1, 1] (n even):
// nodes cos(j pi/n) and weights
// w_j = g_j (4/n) sum~_{m=0}^{n/2} cos(2 m j pi/n)/(1 - 4 m^2)
// (g_j = 1/2 at j = 0, n, sum~ halves its first and last terms), all
// enclosed in interval arithmetic; wabs bounds sum |w_j|.
type ccRule struct {
	n    int
	x, w []interval.F
	wabs interval.F
}

var ccCache sync.Map

func cc(n int) *ccRule {
	if r, ok := ccCache.Load(n); ok {
		return r.(*ccRule)
	}
	one := interval.PointF(1)
	pi := one.Pi()
	r := &ccRule{n: n, x: make([]interval.F, n+1), w: make([]interval.F, n+1)}
	nn := interval.PointF(float64(n))
	abs := interval.PointF(0)
	for j := 0; j <= n; j++ {
		r.x[j] = interval.Cos(pi.Mul(interval.PointF(float64(j))).Quo(nn))
		s := interval.PointF(0)
		for m := 0; m <= n/2; m++ {
			t := interval.Cos(pi.Mul(interval.PointF(float64(2 * m * j))).Quo(nn)).Quo(interval.PointF(float64(1 - 4*m*m)))
			if m == 0 || m == n/2 {
				t = t.Scale(-1)
			}
			s = s.Add(t)
		}
		w := s.Mul(interval.PointF(4)).Quo(nn)
		if j == 0 || j == n {
			w = w.Scale(-1)
		}
		r.w[j] = w
		abs = abs.Add(w.Abs())
	}
	r.wabs = abs
	ccCache.Store(n, r)
	return r
}

// bound returns an upper bound on |int_{-1}^{1} f - sum_j w_j f(x_j)| for
// f analytic in the Bernstein ellipse E_rho with |f| <= m there:
// 2 m (W + 2/((n+2)^2 - 1)) / (rho^n (rho^2 - 1)), W = sum |w_j|.
// Proof: Chebyshev coefficients obey |a_k| <= 2 m rho^-k; the rule is exact
// for degree <= n and, its nodes and weights being symmetric, for odd
// degrees; for even k >= n+2 the error of T_k is at most
// 2/(k^2 - 1) + W. Summing over even k >= n+2 gives the bound (the
// aliasing argument of L. N. Trefethen, SIAM Review 50 (2008) 67, constants
// derived here).
func (r *ccRule) bound(m, rho interval.F) interval.F {
	one := interval.PointF(1)
	e := one.Scale(1).Quo(interval.PointF(float64((r.n+2)*(r.n+2) - 1)))
	p := one
	for k := 0; k < r.n; k++ {
		p = p.Mul(rho)
	}
	return m.Scale(1).Mul(r.wabs.Add(e)).Quo(p.Mul(rho.Sqr().Sub(one)))
}
