package strip

import (
	"wedgebound/certify"
	"wedgebound/interval"
)

// sincTerms is the number of Taylor terms of sinc used for |z| < 1.
const sincTerms = 10

// sincF encloses sin(z)/z for real z (1 at z = 0) by the Taylor polynomial
// sum_{k<=m} (-z^2)^k/(2k+1)! in Horner form plus the Lagrange remainder of
// sin, |z|^(2m+2)/(2m+3)!, which holds for every real z.
func sincF(z interval.F) interval.F {
	one := interval.PointF(1)
	t := z.Sqr()
	s := one
	for k := sincTerms; k >= 1; k-- {
		s = one.Sub(t.Mul(s).Quo(interval.PointF(float64((2 * k) * (2*k + 1)))))
	}
	// remainder |z|^(2m+2)/(2m+3)!
	r := one
	for k := 0; k < sincTerms+1; k++ {
		r = r.Mul(t)
	}
	f := one
	for k := 2; k <= 2*sincTerms+3; k++ {
		f = f.Mul(interval.PointF(float64(k)))
	}
	return s.Pad(r.Quo(f))
}

// kernelMatrix encloses k(x_a, x_b) at the exact nodes x_a = (s_a - 1)/2 of
// the rule, for the float alpha. The phases u_a = alpha x_a^2/4 and their
// sines and cosines are computed from the high-precision nodes, so that
// k = -(sin u_a cos u_b - cos u_a sin u_b)/(pi (x_a - x_b)) keeps full
// accuracy when |alpha (x_a^2 - x_b^2)/4| >= 1; otherwise the form
// -(alpha (x_a + x_b)/(4 pi)) sinc(alpha (x_a - x_b)(x_a + x_b)/4) is used.
// Node differences are formed from float64 heads plus enclosed remainders.
func kernelMatrix(r *gaussRule, alpha float64, workers int) [][]interval.F {
	n := r.n
	head := make([]float64, n)
	tail := make([]interval.F, n)
	sn := make([]interval.F, n)
	cs := make([]interval.F, n)
	al := interval.PointF(alpha)
	certify.For(n, workers, func(a int) {
		head[a], tail[a] = splitNode(r.node[a])
		x := r.node[a].Sub(r.node[a].Int(1)).Scale(-1)
		u := x.Sqr().Mul(x.Float(alpha)).Scale(-2)
		s, c := interval.SinCos(u)
		sn[a], cs[a] = toF(s), toF(c)
	})
	pi := interval.F{}.Pi()
	fourPi := pi.Scale(2)
	K := make([][]interval.F, n)
	for a := range K {
		K[a] = make([]interval.F, n)
	}
	certify.For(n, workers, func(a int) {
		for b := a; b < n; b++ {
			var k interval.F
			if a == b {
				x := interval.PointF(head[a]).Add(tail[a])
				k = al.Mul(x).Quo(pi.Scale(1)).Neg()
			} else {
				d := interval.PointF(head[a]).Sub(interval.PointF(head[b])).Add(tail[a].Sub(tail[b]))
				e := interval.PointF(head[a]).Add(interval.PointF(head[b])).Add(tail[a].Add(tail[b]))
				z := al.Mul(d).Mul(e).Scale(-2)
				if z.Abs().Lo() >= 1 {
					s := sn[a].Mul(cs[b]).Sub(cs[a].Mul(sn[b]))
					k = s.Quo(pi.Mul(d)).Neg()
				} else {
					k = al.Mul(e).Quo(fourPi).Mul(sincF(z)).Neg()
				}
			}
			K[a][b] = k
		}
	})
	for a := 0; a < n; a++ {
		for b := a + 1; b < n; b++ {
			K[b][a] = K[a][b]
		}
	}
	return K
}

// dotF encloses sum_i x_i y_i.
func dotF(x, y []interval.F) interval.F {
	var s interval.F
	for i := range x {
		s = s.Add(x[i].Mul(y[i]))
	}
	return s
}

// galerkinMatrix encloses Q[q_j k q_k], the tensor Gauss rule applied to
// q_j(x) k(x, y) q_k(y) on [-1, 0]^2 (weights w_a/2 per variable), for
// j, k < N, as B^T K B with B_aj = w_a q_j(x_a)/2. The matrix is symmetric
// by construction (entry (j, k) is computed once).
func galerkinMatrix(r *gaussRule, V [][]interval.F, K [][]interval.F, N int, workers int) [][]interval.F {
	n := r.n
	BT := make([][]interval.F, N)
	for j := 0; j < N; j++ {
		row := make([]interval.F, n)
		for a := 0; a < n; a++ {
			row[a] = r.weight[a].Mul(V[a][j]).Scale(-1)
		}
		BT[j] = row
	}
	// TT[k][a] = sum_b K[a][b] BT[k][b]
	TT := make([][]interval.F, N)
	certify.For(N, workers, func(k int) {
		row := make([]interval.F, n)
		for a := 0; a < n; a++ {
			row[a] = dotF(K[a], BT[k])
		}
		TT[k] = row
	})
	H := make([][]interval.F, N)
	for j := range H {
		H[j] = make([]interval.F, N)
	}
	certify.For(N, workers, func(j int) {
		for k := j; k < N; k++ {
			H[j][k] = dotF(BT[j], TT[k])
		}
	})
	for j := 0; j < N; j++ {
		for k := j + 1; k < N; k++ {
			H[k][j] = H[j][k]
		}
	}
	return H
}
