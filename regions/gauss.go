package regions

import (
	"fmt"
	"math"
	"sync"

	"wedgebound/interval"
)

// gaussRule holds enclosures of the n-point Gauss-Legendre nodes and weights
// on [-1, 1]: each node interval contains exactly one root of P_n, and each
// weight interval contains the exact weight 2/((1 - x^2) P_n'(x)^2) at it.
type gaussRule[T interval.Real[T]] struct {
	x, w []T
}

var gaussCache sync.Map // key: fmt "%T/%d/%d" -> any(gaussRule[T])

// legendre encloses P_n(x) and P_{n-1}(x) by the three-term recurrence.
func legendre[T interval.Real[T]](x T, n int) (pn, pn1 T) {
	p0, p1 := x.Int(1), x
	for k := 2; k <= n; k++ {
		// k P_k = (2k-1) x P_{k-1} - (k-1) P_{k-2}
		p2 := x.Mul(p1).Mul(x.Int(int64(2*k - 1))).Sub(p0.Mul(x.Int(int64(k - 1)))).Quo(x.Int(int64(k)))
		p0, p1 = p1, p2
	}
	return p1, p0
}

// gaussLegendre returns verified enclosures of the n-point rule at the
// precision of like. The work is done in B at 64 + 2n extra bits (the interval
// three-term recurrence loses about 1.3 n bits), then rounded outward to T.
// Nodes are found by Newton's method on midpoints; each is then proved by a
// sign change of P_n across a small interval, and the n disjoint sign
// changes account for all n roots.
func gaussLegendre[T interval.Real[T]](like T, n int) (gaussRule[T], error) {
	key := fmt.Sprintf("%T/%d/%d", like, like.Prec(), n)
	if r, ok := gaussCache.Load(key); ok {
		return r.(gaussRule[T]), nil
	}
	prec := like.Prec() + 64 + uint(2*n)
	b := interval.NewB(0, prec)
	half := n / 2
	xs := make([]interval.B, n)
	ws := make([]interval.B, n)
	delta := b.Int(1).Scale(-int(like.Prec()) - 30)
	deriv := func(x, pn, pn1 interval.B) interval.B {
		// P_n'(x) = n (x P_n - P_{n-1}) / (x^2 - 1)
		return x.Mul(pn).Sub(pn1).Mul(x.Int(int64(n))).Quo(x.Sqr().Sub(x.Int(1)))
	}
	for i := 0; i < half; i++ {
		// Positive roots in decreasing order; the rule is symmetric.
		g := math.Cos(math.Pi * (float64(i) + 0.75) / (float64(n) + 0.5))
		x := b.Float(g)
		for it := 0; it < 200; it++ {
			pn, pn1 := legendre(x, n)
			nx := x.Sub(pn.Quo(deriv(x, pn, pn1)).Mid()).Mid()
			if !nx.IsFinite() {
				return gaussRule[T]{}, fmt.Errorf("gauss-legendre: Newton failed at node %d of %d", i, n)
			}
			if nx.Contains(x) && x.Contains(nx) {
				break
			}
			x = nx
		}
		lo, hi := x.Sub(delta), x.Add(delta)
		plo, _ := legendre(interval.Lower(lo), n)
		phi, _ := legendre(interval.Upper(hi), n)
		if plo.Sign() == 0 || phi.Sign() == 0 || plo.Sign() == phi.Sign() {
			return gaussRule[T]{}, fmt.Errorf("gauss-legendre: could not verify node %d of %d", i, n)
		}
		X := lo.Hull(hi)
		pn, pn1 := legendre(X, n)
		d := deriv(X, pn, pn1)
		w := X.Int(2).Quo(X.Int(1).Sub(X.Sqr()).Mul(d.Sqr()))
		xs[i], ws[i] = X, w
		xs[n-1-i], ws[n-1-i] = X.Neg(), w
	}
	if n%2 == 1 {
		z := b.Int(0)
		_, pn1 := legendre(z, n)
		// At x = 0: P_n'(0) = n P_{n-1}(0).
		d := pn1.Mul(z.Int(int64(n)))
		xs[half], ws[half] = z, z.Int(2).Quo(d.Sqr())
	}
	// Disjointness of the node intervals (so each holds its own root).
	for i := 0; i+1 < n; i++ {
		if !xs[i+1].Less(xs[i]) {
			return gaussRule[T]{}, fmt.Errorf("gauss-legendre: node intervals %d and %d overlap", i, i+1)
		}
	}
	r := gaussRule[T]{x: make([]T, n), w: make([]T, n)}
	for i := range xs {
		r.x[i] = like.Between(xs[i].Endpoints())
		r.w[i] = like.Between(ws[i].Endpoints())
		if !r.w[i].IsFinite() {
			return gaussRule[T]{}, fmt.Errorf("gauss-legendre: weight %d of %d not finite", i, n)
		}
	}
	gaussCache.Store(key, r)
	return r, nil
}

// gaussBound returns the Gauss-Legendre remainder bound
// 64 M / (15 (rho^2 - 1) rho^(2n)) on [-1, 1] for a function analytic in the
// open Bernstein ellipse E_rho with modulus at most M there (L. N. Trefethen,
// "Is Gauss quadrature better than Clenshaw-Curtis?", SIAM Review 50 (2008),
// Theorem 4.5). Multiply by half the panel length for a panel.
func gaussBound[T interval.Real[T]](M T, rho T, n int) T {
	r2 := rho.Sqr()
	p := r2
	for range n - 1 {
		p = p.Mul(r2)
	}
	return M.Mul(M.Int(64)).Quo(M.Int(15).Mul(r2.Sub(M.Int(1))).Mul(p))
}
