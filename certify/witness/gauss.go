package witness

import (
	"fmt"
	"math"
	"sync"

	"wedgebound/interval"
)

// glRule holds enclosures of the n-point Gauss-Legendre rule on [-1, 1].
type glRule struct {
	n    int
	x, w []interval.F
}

var glCache sync.Map // int -> *glRule

const glBits = 192

// legendreB encloses P_k(x) and P_{k-1}(x) by the three-term recurrence.
func legendreB(x interval.B, k int) (pk, pk1 interval.B) {
	p0, p1 := x.Int(1), x
	for j := 2; j <= k; j++ {
		p2 := x.Mul(p1).Mul(x.Int(int64(2*j - 1))).Sub(p0.Mul(x.Int(int64(j - 1)))).Quo(x.Int(int64(j)))
		p0, p1 = p1, p2
	}
	return p1, p0
}

// rule returns the verified n-point Gauss-Legendre rule (n >= 2).
//
// Each float64 Newton root x~ is verified by a strict sign change of P_n
// between x~ - d and x~ + d (d = 2^-48), evaluated in 192-bit interval
// arithmetic; the n enclosures are checked pairwise disjoint, so each holds
// exactly one of the n roots. The weight is w = 2 (1 - x^2)/(n P_{n-1}(x))^2
// (valid at a root of P_n), with P_{n-1} at the root enclosed by its value
// at x~ plus the Markov bound |P_{n-1}'| <= (n-1)^2 on [-1, 1]
// (A. A. Markov 1889) times d.
func rule(n int) (*glRule, error) {
	if r, ok := glCache.Load(n); ok {
		return r.(*glRule), nil
	}
	if n < 2 {
		return nil, fmt.Errorf("witness: Gauss rule needs n >= 2, got %d", n)
	}
	gx, _ := glFloat(n)
	d := math.Ldexp(1, -48)
	r := &glRule{n: n, x: make([]interval.F, n), w: make([]interval.F, n)}
	for i, xt := range gx {
		lo, hi := interval.NewB(xt-d, glBits), interval.NewB(xt+d, glBits)
		pl, _ := legendreB(lo, n)
		ph, _ := legendreB(hi, n)
		if pl.Sign()*ph.Sign() != -1 {
			return nil, fmt.Errorf("witness: Gauss node %d of %d not verified", i, n)
		}
		if i > 0 && !(gx[i-1]-d > xt+d) {
			return nil, fmt.Errorf("witness: Gauss nodes %d, %d of %d not separated", i-1, i, n)
		}
		xb := interval.NewB(xt, glBits)
		_, pn1 := legendreB(xb, n)
		db := xb.Float(d)
		pn1 = pn1.Pad(db.Mul(xb.Int(int64((n - 1) * (n - 1)))))
		node := interval.NewB(xt, glBits).Pad(db)
		w := node.Int(1).Sub(node.Sqr()).Scale(1).Quo(pn1.Mul(node.Int(int64(n))).Sqr())
		r.x[i] = interval.NewF(node.Lo(), node.Hi())
		r.w[i] = interval.NewF(w.Lo(), w.Hi())
		if !r.w[i].IsFinite() {
			return nil, fmt.Errorf("witness: Gauss weight %d of %d not enclosed", i, n)
		}
	}
	glCache.Store(n, r)
	return r, nil
}

// glBound returns an upper bound on |int_{-1}^{1} f - sum_j w_j f(x_j)|
// for the exact n-point Gauss rule and every f analytic inside the
// Bernstein ellipse E_rho with |f| <= m there:
//
//	2 m (2 + 2/(4n^2 - 1)) rho^(2 - 2n) / (rho^2 - 1).
//
// Proof: the Chebyshev coefficients obey |a_k| <= 2 m rho^-k (Cauchy
// estimate on the ellipse), the rule is exact for k <= 2n - 1 and, being
// symmetric, for every odd k; for even k >= 2n,
// |int T_k| + sum w_j |T_k(x_j)| <= 2/(k^2 - 1) + 2. Summing the geometric
// series over even k >= 2n gives the bound (the aliasing argument of
// L. N. Trefethen, SIAM Review 50 (2008) 67, with constants derived here).
func glBound(n int, m, rho interval.F) interval.F {
	one := interval.PointF(1)
	c := one.Scale(1).Add(one.Scale(1).Quo(interval.PointF(float64(4*n*n - 1))))
	p := one
	for k := 0; k < 2*n-2; k++ {
		p = p.Mul(rho)
	}
	return m.Scale(1).Mul(c).Quo(p.Mul(rho.Sqr().Sub(one)))
}
