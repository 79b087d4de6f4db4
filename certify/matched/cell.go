package matched

import (
	"fmt"
	"math"

	"wedgebound/certify"
	"wedgebound/certify/strip"
	"wedgebound/interval"
)

// nodeBits is the precision of node positions and phases.
const nodeBits = 128

// block is one piece of the split basis: orthonormal Legendre polynomials
// of degree < N on [lo, hi]; minus marks the piece x > b, on which the
// multiplication operator 1[x > b] is the identity.
type block struct {
	s     span
	N     int
	minus bool
}

// layout returns the blocks for the split point b in [-1, 0] with basis
// density d (N = ceil(d (hi - lo)) + 2 on each piece; empty pieces are
// dropped).
func layout(b, d float64) []block {
	var bl []block
	if b > -1 {
		bl = append(bl, block{s: span{-1, b}, N: int(math.Ceil(d*(b+1))) + 6})
	}
	if b < 0 {
		bl = append(bl, block{s: span{b, 0}, N: int(math.Ceil(d*(-b))) + 6, minus: true})
	}
	return bl
}

// galerkin is the enclosed Galerkin matrix of T_{a,b} = C_a - 1[x > b] in
// the split basis, with the quadrature remainder bound of each entry.
type galerkin struct {
	blocks []block
	off    []int
	N      int
	H      [][]interval.F // enclosures of the rule's values (remainder not included)
	E      [][]float64    // upper bounds of the remainder of each entry
	quadF  interval.F     // Frobenius norm of E (upper end)
	disc   interval.F     // bound on ||C_a - P C_a P||
}

// buildGalerkin encloses the Galerkin matrix of T_{a,b} with n Gauss
// nodes per block.
func buildGalerkin(alpha interval.B, a float64, bl []block, n, workers int) (*galerkin, error) {
	aF := strip.ToF(alpha)
	al := aF.Mid().Lo()
	g := &galerkin{blocks: bl}
	for _, b := range bl {
		g.off = append(g.off, g.N)
		g.N += b.N
	}
	maxN := 0
	for _, b := range bl {
		if b.N > maxN {
			maxN = b.N
		}
	}
	if n < maxN {
		n = maxN
	}
	if n == maxN {
		n = chooseNodes(al, a, bl, maxN)
	}
	nodes, weights, V, err := strip.GaussRule(n, maxN, workers)
	if err != nil {
		return nil, err
	}
	// Global node list: positions (B), float enclosures, phases.
	M := n * len(bl)
	X := make([]interval.B, M)
	XF := make([]interval.F, M)
	sn := make([]interval.F, M)
	cs := make([]interval.F, M)
	owner := make([]int, M)
	pa := interval.PointF(a)
	certify.For(M, workers, func(p int) {
		bi, i := p/n, p%n
		s := bl[bi].s
		z := alpha.WithPrec(nodeBits)
		lo, hi := z.Float(s.lo), z.Float(s.hi)
		m := lo.Add(hi).Scale(-1)
		h := hi.Sub(lo).Scale(-1)
		x := m.Add(h.Mul(nodes[i].WithPrec(nodeBits)))
		X[p] = x
		XF[p] = strip.ToF(x)
		d := x.Sub(z.Float(a))
		u := d.Sqr().Mul(alpha.WithPrec(nodeBits)).Scale(-2)
		sv, cv := interval.SinCos(u)
		sn[p], cs[p] = strip.ToF(sv), strip.ToF(cv)
		owner[p] = bi
	})
	pi := interval.F{}.Pi()
	K := make([][]interval.F, M)
	for p := range K {
		K[p] = make([]interval.F, M)
	}
	certify.For(M, workers, func(p int) {
		for q := p; q < M; q++ {
			var k interval.F
			if p == q {
				k = aF.Mul(XF[p].Sub(pa)).Quo(pi.Scale(1))
			} else {
				d := strip.ToF(X[p].Sub(X[q]))
				w := XF[p].Add(XF[q]).Sub(pa.Scale(1))
				z := aF.Mul(d).Mul(w).Scale(-2)
				if z.Abs().Lo() >= 1 {
					k = sn[p].Mul(cs[q]).Sub(cs[p].Mul(sn[q])).Quo(pi.Mul(d))
				} else {
					k = aF.Mul(w).Quo(pi.Scale(2)).Mul(strip.SincF(z))
				}
			}
			K[p][q] = k
		}
	})
	for p := 0; p < M; p++ {
		for q := p + 1; q < M; q++ {
			K[q][p] = K[p][q]
		}
	}
	// BT[g][i] = w_i sqrt(2j+1) P_j(s_i) sqrt(|I|)/2 for the basis function
	// g = (block bi, degree j), on the nodes of block bi.
	BT := make([][]interval.F, g.N)
	gb := make([]int, g.N)
	for bi, b := range bl {
		sq := interval.PointF(b.s.hi).Sub(interval.PointF(b.s.lo)).Sqrt().Scale(-1)
		for j := 0; j < b.N; j++ {
			row := make([]interval.F, n)
			for i := 0; i < n; i++ {
				row[i] = weights[i].Mul(V[i][j]).Mul(sq)
			}
			BT[g.off[bi]+j] = row
			gb[g.off[bi]+j] = bi
		}
	}
	// TT[h][p] = sum over nodes q of block(h) of K[p][q] BT[h][q].
	TT := make([][]interval.F, g.N)
	certify.For(g.N, workers, func(h int) {
		row := make([]interval.F, M)
		base := gb[h] * n
		for p := 0; p < M; p++ {
			var s interval.F
			for i := 0; i < n; i++ {
				s = s.Add(K[p][base+i].Mul(BT[h][i]))
			}
			row[p] = s
		}
		TT[h] = row
	})
	g.H = make([][]interval.F, g.N)
	for i := range g.H {
		g.H[i] = make([]interval.F, g.N)
	}
	certify.For(g.N, workers, func(r int) {
		base := gb[r] * n
		for c := r; c < g.N; c++ {
			var s interval.F
			for i := 0; i < n; i++ {
				s = s.Add(BT[r][i].Mul(TT[c][base+i]))
			}
			g.H[r][c] = s
		}
	})
	for r := 0; r < g.N; r++ {
		for c := r + 1; c < g.N; c++ {
			g.H[c][r] = g.H[r][c]
		}
		if bl[gb[r]].minus {
			g.H[r][r] = g.H[r][r].Sub(interval.PointF(1))
		}
	}
	// Remainders and the discarded part, per block pair.
	g.E = make([][]float64, g.N)
	for i := range g.E {
		g.E[i] = make([]float64, g.N)
	}
	var quad2, disc2 interval.F
	for bi, I := range bl {
		for bj, J := range bl {
			_, eta := bestQuadEta(al, a, I.s, J.s, I.N, J.N, n)
			logC := quadLogC(n, I.s, J.s, eta)
			lx := logKernelMax(aF, a, I.s, J.s, eta, 0)
			ly := logKernelMax(aF, a, I.s, J.s, 0, eta)
			e := interval.PointF(eta)
			for j := 0; j < I.N; j++ {
				for k := 0; k < J.N; k++ {
					sq := interval.PointF(float64((2*j + 1) * (2*k + 1))).Sqrt()
					t := interval.Exp(lx.Add(interval.PointF(float64(j)).Mul(e))).Add(interval.Exp(ly.Add(interval.PointF(float64(k)).Mul(e))))
					v := interval.Exp(logC).Mul(sq).Mul(t)
					g.E[g.off[bi]+j][g.off[bj]+k] = v.Hi()
					quad2 = quad2.Add(interval.PointF(v.Hi()).Sqr())
				}
			}
			_, de1, de2 := discardedPairFloat(al, a, I.s, J.s, I.N, J.N)
			dp := discardedPair(aF, a, I.s, J.s, I.N, J.N, de1, de2)
			area := interval.PointF(I.s.hi).Sub(interval.PointF(I.s.lo)).Mul(interval.PointF(J.s.hi).Sub(interval.PointF(J.s.lo)))
			disc2 = disc2.Add(interval.PointF(dp.Hi()).Sqr().Mul(area))
		}
	}
	g.quadF = interval.PointF(quad2.Sqrt().Hi())
	g.disc = interval.PointF(disc2.Sqrt().Hi())
	if !g.quadF.IsFinite() || !g.disc.IsFinite() {
		return nil, fmt.Errorf("matched: an error bound is not finite (a = %g, N = %d, n = %d)", a, g.N, n)
	}
	return g, nil
}

// upperBound proves lambda_max(T_{a,b}) <= the returned value: the float
// Cholesky proof for the midpoint matrix, moved out by the entry radii, the
// remainders (Weyl) and the discarded part (T <= P T P + (C - P C P), and
// P T P has the eigenvalue 0 besides spec(G)).
func (g *galerkin) upperBound(workers int) (ub float64, est float64, vec []float64, err error) {
	Hc, radF := strip.Midpoints(g.H)
	vals, QT, err := strip.FloatEigen(Hc, g.N)
	if err != nil {
		return 0, 0, nil, err
	}
	top := len(vals) - 1
	for i, v := range vals {
		if v > vals[top] {
			top = i
		}
	}
	lam := vals[top]
	scale := math.Max(math.Abs(vals[0]), math.Abs(lam))
	sigma, res, err := strip.ProveAbove(Hc, g.N, lam, -1, scale, workers)
	if err != nil {
		return 0, 0, nil, err
	}
	gHigh := interval.PointF(sigma).Add(interval.PointF(res.Hi())).Add(interval.PointF(radF.Hi())).Add(g.quadF)
	u := gHigh.Max(interval.PointF(0)).Add(g.disc)
	return u.Hi(), lam, QT[top], nil
}

// rayleighLower returns a proved lower bound of <psi, T psi>/<psi, psi>
// for the state psi with coefficients v in the split basis.
func (g *galerkin) rayleighLower(v []float64) interval.F {
	var num, quad interval.F
	for r := 0; r < g.N; r++ {
		var s interval.F
		for c := 0; c < g.N; c++ {
			s = s.Add(g.H[r][c].Mul(interval.PointF(v[c])))
		}
		num = num.Add(s.Mul(interval.PointF(v[r])))
		for c := 0; c < g.N; c++ {
			quad = quad.Add(interval.PointF(math.Abs(v[r])).Mul(interval.PointF(math.Abs(v[c]))).Mul(interval.PointF(g.E[r][c])))
		}
	}
	var den interval.F
	for _, x := range v {
		den = den.Add(interval.PointF(x).Sqr())
	}
	return num.Pad(interval.PointF(quad.Hi())).Quo(den)
}

// quadTarget is the estimated largest remainder the automatic node count
// aims at.
const quadTarget = 1e-13

// chooseNodes returns the smallest node count (from maxN up, in steps of
// about an eighth) whose estimated remainders are below quadTarget.
func chooseNodes(al, a float64, bl []block, maxN int) int {
	lt := math.Log(quadTarget)
	n := maxN
	for ; n < 20*maxN+100; n += max(2, n/8) {
		ok := true
		for _, I := range bl {
			for _, J := range bl {
				if l, _ := bestQuadEta(al, a, I.s, J.s, I.N, J.N, n); !(l <= lt) {
					ok = false
				}
			}
		}
		if ok {
			break
		}
	}
	return n
}
