package checknum

import (
	"fmt"
	"sync"

	"wedgebound/interval"
)

// Rule is the (n+1)-point Clenshaw-Curtis rule on [-1, 1] for an even n:
// nodes x_j = cos(j pi/n), j = 0..n, and the weights that integrate the
// polynomial interpolant of degree n through them exactly.
//
// Weights. The interpolant is p = sum~_{k=0}^{n} c_k T_k with
// c_k = (2/n) sum~_j f(x_j) cos(k j pi/n) (discrete orthogonality of the
// cosines; sum~ is a sum with its first and last terms halved), and
// int_{-1}^{1} T_k = 2/(1 - k^2) for even k, 0 for odd k. Collecting the
// coefficient of f(x_j) gives
//
//	w_j = g_j (4/n) sum~_{m=0}^{n/2} cos(2 m j pi/n) / (1 - 4 m^2),
//
// with g_j = 1/2 for j = 0, n and 1 otherwise. All of it is evaluated in
// interval arithmetic, so the nodes and weights are enclosures.
type Rule[T interval.Real[T]] struct {
	// N is the (even) number of intervals; X and W hold the N+1 nodes and
	// weights.
	N    int
	X, W []T
	// WAbs is an upper bound on sum_j |w_j|.
	WAbs T
}

// bound returns an upper bound on |int_{-1}^{1} f - sum_j w_j f(x_j)| for
// every f analytic in the open Bernstein ellipse E_rho (foci -1 and 1,
// semi-axes (rho + 1/rho)/2 and (rho - 1/rho)/2, rho > 1) with |f| <= m
// there:
//
//	2 m (W + 2/((n+2)^2 - 1)) / (rho^n (rho^2 - 1)),  W = sum_j |w_j|.
//
// Proof (the aliasing argument of L. N. Trefethen, "Is Gauss quadrature
// better than Clenshaw-Curtis?", SIAM Review 50 (2008), with constants
// derived here; page and theorem numbers from memory, not checked). The
// Chebyshev coefficients of such an f satisfy |a_k| <= 2 m rho^{-k} for
// k >= 1 (write
// a_k = (1/(pi i)) closed-integral of F(z) z^{-k-1} dz over |z| = r,
// F(z) = f((z + 1/z)/2), and let r increase to rho), so f = sum a_k T_k
// converges uniformly on [-1, 1] and the error functional E may be applied
// termwise. E(T_k) = 0 for k <= n (exactness). For k > n, T_k(x_j) =
// cos(k j pi/n) = T_{k'}(x_j) where k' in [0, n] and k = +-k' mod 2n; as n is
// even, k' has the parity of k, so for odd k the rule gives
// int T_{k'} = 0 = int T_k. For even k >= n+2, |int T_k| = 2/(k^2 - 1) and
// |sum w_j T_k(x_j)| <= W, hence
// |E(f)| <= sum_{k even >= n+2} 2 m rho^{-k} (W + 2/((n+2)^2 - 1)), a
// geometric series equal to the bound. (Trefethen's bound has the same
// form with the constant 64/15 in place of 2(W + ...) = 4 + ..., from
// memory.)
func (r *Rule[T]) Bound(m, rho T) T {
	n := r.N
	eps := m.Frac(2, int64((n+2)*(n+2)-1))
	rn := PowInt(rho, n)
	den := rn.Mul(rho.Sqr().Sub(m.Int(1)))
	return m.Scale(1).Mul(r.WAbs.Add(eps)).Quo(den)
}

// PowInt encloses x^n for n >= 0 by repeated squaring.
func PowInt[T interval.Real[T]](x T, n int) T {
	res := x.Int(1)
	b := x
	for n > 0 {
		if n&1 == 1 {
			res = res.Mul(b)
		}
		n >>= 1
		if n > 0 {
			b = b.Sqr()
		}
	}
	return res
}

type ccKey struct {
	typ  string
	prec uint
	n    int
}

var (
	ccMu    sync.Mutex
	ccCache = map[ccKey]any{}
)

// ClenshawCurtis returns the rule with n+1 nodes at the precision of like
// (cached); n must be even and at least 2.
func ClenshawCurtis[T interval.Real[T]](like T, n int) (*Rule[T], error) {
	if n < 2 || n%2 != 0 {
		return nil, fmt.Errorf("checknum: Clenshaw-Curtis needs an even n >= 2, not %d", n)
	}
	key := ccKey{fmt.Sprintf("%T", like), like.Prec(), n}
	ccMu.Lock()
	defer ccMu.Unlock()
	if r, ok := ccCache[key]; ok {
		if rr, ok := r.(*Rule[T]); ok {
			return rr, nil
		}
	}
	r := buildRule(like, n)
	for j := range r.X {
		if !r.X[j].IsFinite() || !r.W[j].IsFinite() {
			return nil, fmt.Errorf("checknum: Clenshaw-Curtis rule n=%d not enclosed", n)
		}
	}
	ccCache[key] = r
	return r, nil
}

func buildRule[T interval.Real[T]](like T, n int) *Rule[T] {
	pi := like.Pi()
	// cosPi(p) encloses cos(p pi / n) for an integer p reduced mod 2n.
	cosPi := func(p int) T {
		p %= 2 * n
		switch p {
		case 0:
			return like.Int(1)
		case n:
			return like.Int(-1)
		}
		if 2*p == n || 2*p == 3*n {
			return like.Int(0)
		}
		return interval.Cos(pi.Mul(like.Frac(int64(p), int64(n))))
	}
	r := &Rule[T]{N: n, X: make([]T, n+1), W: make([]T, n+1)}
	for j := 0; j <= n; j++ {
		r.X[j] = cosPi(j)
	}
	// Exact symmetry: x_{n-j} = -x_j.
	for j := 0; j <= n/2; j++ {
		r.X[n-j] = r.X[j].Neg()
	}
	r.X[n/2] = like.Int(0)
	half := n / 2
	wabs := like.Int(0)
	for j := 0; j <= n; j++ {
		sum := like.Int(0)
		for m := 0; m <= half; m++ {
			t := cosPi(2 * m * j).Quo(like.Int(int64(1 - 4*m*m)))
			if m == 0 || m == half {
				t = t.Scale(-1)
			}
			sum = sum.Add(t)
		}
		w := sum.Mul(like.Frac(4, int64(n)))
		if j == 0 || j == n {
			w = w.Scale(-1)
		}
		r.W[j] = w
	}
	for j := 0; j <= n/2; j++ { // symmetric weights: use the hull of both
		h := r.W[j].Hull(r.W[n-j])
		r.W[j], r.W[n-j] = h, h
	}
	for j := 0; j <= n; j++ {
		wabs = wabs.Add(r.W[j].Abs())
	}
	r.WAbs = interval.Upper(wabs)
	return r
}
