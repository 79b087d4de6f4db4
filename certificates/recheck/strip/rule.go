package strip

import (
	"fmt"
	"math"
	"math/big"

	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// The strip verifier's quadrature: the (n+1)-point Clenshaw-Curtis rule on
// [-1, 1] (n even), nodes s_a = cos(a pi/n) enclosed at stripNodePrec bits
// and weights at stripWeightPrec bits, mapped to [-1, 0] by x = (s - 1)/2
// (weights w_a/2). It is exact for polynomials of degree <= n (see
// ccRule), and its weights are checked positive, so for n >= 2N - 2 the
// M x N matrix U_aj = sqrt(w_a/2) q_j(x_a) of the orthonormal Legendre
// basis q_j(x) = sqrt(2j+1) P_j(2x+1) has orthonormal columns:
// U^T U = [integral of q_j q_k over [-1, 0]] = I, so ||U||_2 = 1.
const (
	stripNodePrec   = 192
	stripWeightPrec = 128
)

// stripRule holds the rule and everything the verifier evaluates at its
// nodes.
type stripRule struct {
	n    int
	node []interval.B // s_a, decreasing from 1 to -1
	sqw  []interval.B // sqrt(w_a/2)
	wsum interval.F   // upper bound on sum_a w_a (= sum |w_a|)
}

// newStripRule builds the rule with n+1 nodes, n even >= 2.
//
// Weights: w_a = g_a (4/n) sum~_{m=0}^{n/2} cos(2 m a pi/n)/(1 - 4 m^2),
// g_a = 1/2 at a = 0, n and 1 otherwise, sum~ halving its first and last
// terms (the derivation is in the checknum.Rule comment); cos(p pi/n) is read off
// the node table (cos(p pi/n) = s_p for p <= n and s_{2n-p} for p < 2n),
// and w_{n-a} = w_a exactly because the terms are the same.
func newStripRule(n, workers int) (*stripRule, error) {
	if n < 2 || n%2 != 0 {
		return nil, fmt.Errorf("strip rule needs an even n >= 2, not %d", n)
	}
	half := n / 2
	z := interval.NewB(0, stripNodePrec)
	r := &stripRule{n: n, node: make([]interval.B, n+1), sqw: make([]interval.B, n+1)}
	checknum.For(half+1, workers, func(a int) {
		var s interval.B
		switch {
		case a == 0:
			s = z.Int(1)
		case 2*a == n:
			s = z.Int(0)
		default:
			s = interval.Cos(z.Pi().Mul(z.Frac(int64(a), int64(n))))
		}
		r.node[a] = s
		r.node[n-a] = s.Neg()
	})
	cosTab := func(p int) interval.B {
		p %= 2 * n
		if p > n {
			p = 2*n - p
		}
		return r.node[p].WithPrec(stripWeightPrec)
	}
	zw := interval.NewB(0, stripWeightPrec)
	inv := make([]interval.B, half+1)
	for m := 0; m <= half; m++ {
		inv[m] = zw.Int(1).Quo(zw.Int(int64(1 - 4*m*m)))
	}
	w := make([]interval.B, half+1)
	checknum.For(half+1, workers, func(a int) {
		sum := zw.Int(0)
		for m := 0; m <= half; m++ {
			t := cosTab(2 * m * a).Mul(inv[m])
			if m == 0 || m == half {
				t = t.Scale(-1)
			}
			sum = sum.Add(t)
		}
		v := sum.Mul(zw.Frac(4, int64(n)))
		if a == 0 {
			v = v.Scale(-1)
		}
		w[a] = v
	})
	wsum := interval.PointF(0)
	for a := 0; a <= half; a++ {
		if w[a].Sign() <= 0 {
			return nil, fmt.Errorf("Clenshaw-Curtis weight %d of %d is not proved positive", a, n)
		}
		q := w[a].Scale(-1).Sqrt()
		r.sqw[a], r.sqw[n-a] = q, q
		wf := stripToF(w[a])
		wsum = wsum.Add(wf)
		if a != n-a {
			wsum = wsum.Add(wf)
		}
	}
	r.wsum = interval.PointF(wsum.Hi())
	return r, nil
}

// stripToF rounds a B enclosure outward to float64 endpoints.
func stripToF(b interval.B) interval.F {
	lo, hi := b.Endpoints()
	return interval.F{}.Between(lo, hi)
}

// stripNodes holds, for every node, x_a = (s_a - 1)/2 as a float64 head
// plus an enclosed remainder, and sin, cos of the phase u_a = alpha x_a^2/4.
type stripNodes struct {
	head     []float64
	tail     []interval.F
	sin, cos []interval.F
}

// nodeData evaluates the node quantities for the kernel at alpha.
func (r *stripRule) nodeData(alpha interval.B, workers int) *stripNodes {
	m := r.n + 1
	nd := &stripNodes{head: make([]float64, m), tail: make([]interval.F, m), sin: make([]interval.F, m), cos: make([]interval.F, m)}
	checknum.For(m, workers, func(a int) {
		x := r.node[a].Sub(r.node[a].Int(1)).Scale(-1)
		h := x.Mid().Lo()
		hb := new(big.Float).SetFloat64(h)
		nd.head[a] = h
		nd.tail[a] = stripToF(x.Sub(x.Between(hb, hb)))
		u := x.Sqr().Mul(alpha.WithPrec(stripNodePrec)).Scale(-2)
		s, c := interval.SinCos(u.WithPrec(stripWeightPrec))
		nd.sin[a], nd.cos[a] = stripToF(s), stripToF(c)
	})
	return nd
}

// stripSincTerms is the number of Taylor terms of sinc for |z| < 1.
const stripSincTerms = 10

// stripSinc encloses sin(z)/z for real z with |z| <= 1: the Taylor sum
// sum_{k<m} (-z^2)^k/(2k+1)! plus the Lagrange remainder bound
// |z|^{2m}/(2m+1)! of sin(z)/z (from the remainder |z|^{2m+1}/(2m+1)! of
// sin).
func stripSinc(z interval.F) interval.F {
	one := interval.PointF(1)
	t := z.Sqr()
	m := stripSincTerms
	s := one
	for k := m - 1; k >= 1; k-- {
		s = one.Sub(t.Mul(s).Quo(interval.PointF(float64((2 * k) * (2*k + 1)))))
	}
	rem := one
	for k := 0; k < m; k++ {
		rem = rem.Mul(t)
	}
	f := one
	for k := 2; k <= 2*m+1; k++ {
		f = f.Mul(interval.PointF(float64(k)))
	}
	return s.Pad(rem.Quo(f))
}

// kernel encloses k(x_a, x_b) = -sin(alpha (x_a^2 - x_b^2)/4)/(pi (x_a - x_b))
// (diagonal -alpha x_a/(2 pi)). Differences and sums of nodes are formed
// from the heads plus the enclosed tails, so they keep full relative
// accuracy. With z = alpha (x_a - x_b)(x_a + x_b)/4 = u_a - u_b: for
// |z| < 1 the form -(alpha (x_a + x_b)/(4 pi)) sinc z is used, otherwise
// -(sin u_a cos u_b - cos u_a sin u_b)/(pi (x_a - x_b)), whose numerator is
// accurate to a few ulps absolutely because the phases were reduced at high
// precision. It is symmetric bit for bit (computed for a <= b).
func (nd *stripNodes) kernel(alpha interval.F, a, b int) interval.F {
	if a > b {
		a, b = b, a
	}
	pi := interval.F{}.Pi()
	if a == b {
		x := interval.PointF(nd.head[a]).Add(nd.tail[a])
		return alpha.Mul(x).Quo(pi.Scale(1)).Neg()
	}
	d := interval.PointF(nd.head[a]).Sub(interval.PointF(nd.head[b])).Add(nd.tail[a].Sub(nd.tail[b]))
	e := interval.PointF(nd.head[a]).Add(interval.PointF(nd.head[b])).Add(nd.tail[a].Add(nd.tail[b]))
	z := alpha.Mul(d).Mul(e).Scale(-2)
	if z.Abs().Hi() < 1 {
		return alpha.Mul(e).Quo(pi.Scale(2)).Mul(stripSinc(z)).Neg()
	}
	s := nd.sin[a].Mul(nd.cos[b]).Sub(nd.cos[a].Mul(nd.sin[b]))
	return s.Quo(pi.Mul(d)).Neg()
}

// stripGrowthBits bounds the bits an interval three-term Legendre
// recurrence loses over k steps at a point x in [-1, 1]: the endpoint
// widths obey w_{j+1} <= 2|x| w_j + w_{j-1}, growth rate at most 1 + sqrt 2.
func stripGrowthBits(k int) uint {
	return uint(math.Ceil(float64(k)*math.Log2(1+math.Sqrt2))) + 8
}

// stripRows evaluates, for every node, the row U_a. = sqrt(w_a/2) q_j(x_a),
// j < N, and the two witnesses psi_hat_a = sqrt(w_a/2) psi(x_a). Legendre
// values come from the recurrence j P_j = (2j-1) s P_{j-1} - (j-1) P_{j-2}
// at a point c inside the node enclosure, with guard bits for the
// recurrence, padded by the Markov bound |P_j'| <= j^2 on [-1, 1]
// (A. A. Markov, 1889; |P_j| <= 1 there) times the node's width. Mirror
// nodes use P_j(-s) = (-1)^j P_j(s) and w_{n-a} = w_a.
type stripRows struct {
	// UT[j][a] is the float midpoint of U_aj; uRad2 bounds sum of squared
	// radii (the Frobenius norm squared of U - UT^T).
	UT    [][]float64
	uRad2 interval.F
	// psi[w][a] encloses psi_hat_a for witness w.
	psi [2][]interval.F
}

func (r *stripRule) rows(N int, coef [2][]interval.B, workers int) *stripRows {
	n := r.n
	M := n + 1
	half := n / 2
	prec := uint(stripNodePrec) + stripGrowthBits(N)
	out := &stripRows{UT: make([][]float64, N)}
	for j := range out.UT {
		out.UT[j] = make([]float64, M)
	}
	for w := range out.psi {
		out.psi[w] = make([]interval.F, M)
	}
	zb := interval.NewB(0, prec)
	sq := make([]interval.B, N)
	for j := range sq {
		sq[j] = zb.Int(int64(2*j + 1)).Sqrt()
	}
	rad2 := make([]interval.F, half+1)
	checknum.For(half+1, workers, func(a int) {
		s := r.node[a]
		c := s.Mid().WithPrec(prec)
		lo, hi := s.Endpoints()
		width := new(big.Float).Sub(hi, lo)
		wB := zb.Between(width, width)
		sqw := r.sqw[a].WithPrec(prec)
		mirror := n - a
		var even, odd [2]interval.B
		for w := range even {
			even[w], odd[w] = zb.Int(0), zb.Int(0)
		}
		acc := interval.PointF(0)
		leg := checknum.Legendre(c, N)
		for j := 0; j < N; j++ {
			pj := leg[j]
			if j > 0 {
				pj = pj.Pad(wB.Mul(zb.Int(int64(j) * int64(j))))
			}
			q := pj.Mul(sq[j])
			u := stripToF(q.Mul(sqw))
			mid, rad := midRad(u)
			out.UT[j][a] = mid
			acc = acc.Add(interval.PointF(rad).Sqr())
			if mirror != a {
				if j%2 == 0 {
					out.UT[j][mirror] = mid
				} else {
					out.UT[j][mirror] = -mid
				}
				acc = acc.Add(interval.PointF(rad).Sqr())
			}
			for w := range coef {
				t := q.Mul(coef[w][j])
				if j%2 == 0 {
					even[w] = even[w].Add(t)
				} else {
					odd[w] = odd[w].Add(t)
				}
			}
		}
		rad2[a] = acc
		for w := range coef {
			out.psi[w][a] = stripToF(even[w].Add(odd[w]).Mul(sqw))
			out.psi[w][mirror] = stripToF(even[w].Sub(odd[w]).Mul(sqw))
		}
	})
	out.uRad2 = interval.PointF(0)
	for _, v := range rad2 {
		out.uRad2 = out.uRad2.Add(v)
	}
	return out
}
