package matched

import (
	"math"
	"math/big"

	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// The verifier's own numerics for the operator
// T_{a,b} = C_a - 1[x > b] on L^2[-1, 0] in the split Legendre basis:
// Clenshaw-Curtis entries (the certifier uses Gauss-Legendre) with the
// remainder of checknum.Rule.Bound in each variable, Legendre values by the
// three-term recurrence in big-float intervals, its own kernel bound on
// Bernstein ellipses, its own float Cholesky factor with an enclosed
// residual.

const nodePrec = 192

type piece struct {
	lo, hi float64
	N      int
	minus  bool
}

func pieces(b float64, sz [2]int) []piece {
	var ps []piece
	if sz[0] > 0 {
		ps = append(ps, piece{-1, b, sz[0], false})
	}
	if sz[1] > 0 {
		ps = append(ps, piece{b, 0, sz[1], true})
	}
	return ps
}

func toF(b interval.B) interval.F {
	lo, hi := b.Endpoints()
	return interval.F{}.Between(lo, hi)
}

// kernelLogSup encloses an upper bound of log sup |C_a| over
// E_e1(P) x E_e2(Q). Lemma: on the ellipse E_e around [lo, hi] (centre m,
// half-length h) a point is x = m + h s with |Re s| <= cosh e and
// |Im s| <= sinh e, so |x - a| <= R := |m - a| + h cosh e and
// |Im (x - a)^2| = 2 |Re(x - a)| |Im x| <= 2 R h sinh e. With
// C_a = (alpha w/(4 pi)) sin(z)/z, w = x + y - 2a, z = alpha (x - y) w/4 =
// alpha ((x-a)^2 - (y-a)^2)/4: |w| <= R_x + R_y and |sin(z)/z| <=
// sinh(|Im z|)/|Im z| (from sin(z)/z = int_0^1 cos(z t) dt), which is at
// most cosh(B) and at most e^B/(2B) for B >= |Im z|.
func kernelLogSup(alpha interval.F, a float64, P, Q piece, e1, e2 float64) interval.F {
	pa := interval.PointF(a)
	side := func(p piece, e float64) (interval.F, interval.F) {
		m := interval.PointF(p.lo).Add(interval.PointF(p.hi)).Scale(-1)
		h := interval.PointF(p.hi).Sub(interval.PointF(p.lo)).Scale(-1)
		E := interval.PointF(e)
		R := m.Sub(pa).Abs().Add(h.Mul(interval.Cosh(E)))
		return R, R.Mul(h).Mul(interval.Sinh(E)).Scale(1)
	}
	Rx, ix := side(P, e1)
	Ry, iy := side(Q, e2)
	B := interval.PointF(alpha.Mul(ix.Add(iy)).Scale(-2).Hi())
	s := interval.Log(interval.Cosh(B))
	if B.Lo() >= 1 {
		s = s.Min(B.Sub(interval.Log(B.Scale(1))))
	}
	return interval.Log(alpha.Mul(Rx.Add(Ry)).Quo(interval.F{}.Pi().Scale(2))).Add(s)
}

func kernelLogSupFloat(alpha, a float64, P, Q piece, e1, e2 float64) float64 {
	side := func(p piece, e float64) (float64, float64) {
		m, h := (p.lo+p.hi)/2, (p.hi-p.lo)/2
		R := math.Abs(m-a) + h*math.Cosh(e)
		return R, 2 * R * h * math.Sinh(e)
	}
	Rx, ix := side(P, e1)
	Ry, iy := side(Q, e2)
	B := alpha * (ix + iy) / 4
	s := math.Log(math.Cosh(B))
	if B >= 1 {
		s = math.Min(s, B-math.Log(2*B))
	}
	return math.Log(alpha*(Rx+Ry)/(4*math.Pi)) + s
}

// system is the verifier's Galerkin matrix of T_{a,b}: entry enclosures
// (rule values), entrywise remainder bounds, the discarded-part bound.
type system struct {
	N    int
	H    [][]interval.F
	E    [][]float64
	disc float64
}

// legendreRows returns sqrt(2j+1) P_j(s_i) for j < N at the rule nodes.
func legendreRows(r *checknum.Rule[interval.B], N int) [][]interval.F {
	prec := uint(nodePrec + 2*N + 64)
	out := make([][]interval.F, len(r.X))
	checknum.For(len(r.X), 0, func(i int) {
		x := r.X[i].WithPrec(prec)
		row := make([]interval.F, N)
		for j, pj := range checknum.Legendre(x, N) {
			row[j] = toF(pj).Mul(interval.PointF(float64(2*j + 1)).Sqrt())
		}
		out[i] = row
	})
	return out
}

// build encloses the Galerkin matrix of T_{a,b} for the pieces with an
// (n+1)-point Clenshaw-Curtis rule per piece.
func build(alpha interval.B, a float64, ps []piece, n int) (*system, error) {
	aF := toF(alpha)
	al := aF.Mid().Lo()
	rule, err := checknum.ClenshawCurtis(interval.NewB(0, nodePrec), n)
	if err != nil {
		return nil, err
	}
	maxN := 0
	for _, p := range ps {
		maxN = max(maxN, p.N)
	}
	leg := legendreRows(rule, maxN)
	m := n + 1
	M := m * len(ps)
	X := make([]interval.B, M)
	XF := make([]interval.F, M)
	sn := make([]interval.F, M)
	cs := make([]interval.F, M)
	checknum.For(M, 0, func(p int) {
		pc := ps[p/m]
		z := interval.NewB(0, nodePrec)
		lo, hi := z.Float(pc.lo), z.Float(pc.hi)
		x := lo.Add(hi).Scale(-1).Add(hi.Sub(lo).Scale(-1).Mul(rule.X[p%m]))
		X[p], XF[p] = x, toF(x)
		d := x.Sub(z.Float(a))
		s, c := interval.SinCos(d.Sqr().Mul(alpha.WithPrec(nodePrec)).Scale(-2))
		sn[p], cs[p] = toF(s), toF(c)
	})
	pi := interval.F{}.Pi()
	pa2 := interval.PointF(a).Scale(1)
	kern := func(p, q int) interval.F {
		d := toF(X[p].Sub(X[q]))
		w := XF[p].Add(XF[q]).Sub(pa2)
		z := aF.Mul(d).Mul(w).Scale(-2)
		if z.Abs().Lo() >= 1 {
			return sn[p].Mul(cs[q]).Sub(cs[p].Mul(sn[q])).Quo(pi.Mul(d))
		}
		// sin(z)/z by its Taylor polynomial to z^20 and the Lagrange
		// remainder |z|^22/23! of sin (valid for every real z).
		t := z.Sqr()
		s := interval.PointF(1)
		for k := 10; k >= 1; k-- {
			s = interval.PointF(1).Sub(t.Mul(s).Quo(interval.PointF(float64(2 * k * (2*k + 1)))))
		}
		r := interval.PointF(1)
		for k := 0; k < 11; k++ {
			r = r.Mul(t)
		}
		f := interval.PointF(1)
		for k := 2; k <= 23; k++ {
			f = f.Mul(interval.PointF(float64(k)))
		}
		return aF.Mul(w).Quo(pi.Scale(2)).Mul(s.Pad(r.Quo(f)))
	}
	K := make([][]interval.F, M)
	checknum.For(M, 0, func(p int) {
		row := make([]interval.F, M)
		for q := 0; q < M; q++ {
			row[q] = kern(p, q)
		}
		K[p] = row
	})
	sys := &system{}
	var off []int
	for _, p := range ps {
		off = append(off, sys.N)
		sys.N += p.N
	}
	// Column g of the weighted basis: w_i sqrt(2j+1) P_j(s_i) sqrt(|P|)/2.
	type col struct {
		piece int
		v     []interval.F
	}
	cols := make([]col, 0, sys.N)
	for pi, p := range ps {
		sq := length(p).Sqrt().Scale(-1)
		for j := 0; j < p.N; j++ {
			v := make([]interval.F, m)
			for i := 0; i < m; i++ {
				v[i] = toF(rule.W[i]).Mul(leg[i][j]).Mul(sq)
			}
			cols = append(cols, col{pi, v})
		}
	}
	KB := make([][]interval.F, sys.N) // KB[g][p] = sum_i K[p][piece(g), i] v_g[i]
	checknum.For(sys.N, 0, func(g int) {
		base := cols[g].piece * m
		row := make([]interval.F, M)
		for p := 0; p < M; p++ {
			var s interval.F
			for i := 0; i < m; i++ {
				s = s.Add(K[p][base+i].Mul(cols[g].v[i]))
			}
			row[p] = s
		}
		KB[g] = row
	})
	sys.H = make([][]interval.F, sys.N)
	checknum.For(sys.N, 0, func(r int) {
		base := cols[r].piece * m
		row := make([]interval.F, sys.N)
		for c := 0; c < sys.N; c++ {
			var s interval.F
			for i := 0; i < m; i++ {
				s = s.Add(cols[r].v[i].Mul(KB[c][base+i]))
			}
			row[c] = s
		}
		if ps[cols[r].piece].minus {
			row[r] = row[r].Sub(interval.PointF(1))
		}
		sys.H[r] = row
	})
	// Remainders: for the entry (j, k) of the piece pair (P, Q) the tensor
	// rule misses by at most
	// (|P||Q|/4) sqrt((2j+1)(2k+1)/(|P||Q|)) (2 Bd(rho^j Mx) + W Bd(rho^k My)),
	// Bd the one-variable bound of the rule, W = sum |w_i|, Mx the kernel
	// bound on E_rho(P) x Q, My on P x E_rho(Q), and |P_j| <= rho^j on
	// E_rho.
	sys.E = make([][]float64, sys.N)
	for i := range sys.E {
		sys.E[i] = make([]float64, sys.N)
	}
	var d2 interval.F
	for pi, P := range ps {
		for qi, Q := range ps {
			eta := bestEta(al, a, P, Q, n)
			rho := interval.Exp(interval.PointF(eta))
			lx := kernelLogSup(aF, a, P, Q, eta, 0)
			ly := kernelLogSup(aF, a, P, Q, 0, eta)
			one := toF(rule.Bound(interval.NewB(1, 64), interval.NewB(0, 64).Between(bigOf(rho.Lo()), bigOf(rho.Lo()))))
			wabs := toF(rule.WAbs)
			pre := length(P).Mul(length(Q)).Sqrt().Scale(-2)
			for j := 0; j < P.N; j++ {
				for k := 0; k < Q.N; k++ {
					tx := interval.Exp(lx.Add(interval.PointF(float64(j)).Mul(interval.PointF(eta))))
					ty := interval.Exp(ly.Add(interval.PointF(float64(k)).Mul(interval.PointF(eta))))
					v := pre.Mul(interval.PointF(float64((2*j + 1) * (2*k + 1))).Sqrt()).Mul(one).Mul(tx.Scale(1).Add(wabs.Mul(ty)))
					sys.E[off[pi]+j][off[qi]+k] = v.Hi()
				}
			}
			e1, e2 := discEtas(al, a, P, Q)
			lm := kernelLogSup(aF, a, P, Q, e1, e2)
			E1, E2 := interval.PointF(e1), interval.PointF(e2)
			t := interval.Exp(lm.Sub(interval.PointF(float64(P.N)).Mul(E1))).Add(interval.Exp(lm.Sub(interval.PointF(float64(Q.N)).Mul(E2))))
			t = t.Scale(2).Quo(interval.Expm1(E1.Neg()).Neg().Mul(interval.Expm1(E2.Neg()).Neg()))
			area := length(P).Mul(length(Q))
			d2 = d2.Add(interval.PointF(t.Hi()).Sqr().Mul(area))
		}
	}
	sys.disc = d2.Sqrt().Hi()
	return sys, nil
}

func length(p piece) interval.F { return interval.PointF(p.hi).Sub(interval.PointF(p.lo)) }

func bigOf(x float64) *big.Float { return new(big.Float).SetFloat64(x) }

// bestEta chooses the ellipse for the remainders (float search; any choice
// is valid).
func bestEta(al, a float64, P, Q piece, n int) float64 {
	best, eta := math.Inf(1), 0.1
	for e := 0.01; e < 8; e *= 1.06 {
		rho := math.Exp(e)
		l := -float64(n)*e - math.Log(rho*rho-1) + math.Max(kernelLogSupFloat(al, a, P, Q, e, 0)+float64(P.N)*e, kernelLogSupFloat(al, a, P, Q, 0, e)+float64(Q.N)*e)
		if l < best {
			best, eta = l, e
		}
	}
	return eta
}

// discEtas chooses the ellipses for the discarded part.
func discEtas(al, a float64, P, Q piece) (float64, float64) {
	best, b1, b2 := math.Inf(1), 0.1, 0.1
	for e1 := 0.02; e1 < 8; e1 *= 1.1 {
		for e2 := 0.02; e2 < 8; e2 *= 1.1 {
			x, y := -float64(P.N)*e1, -float64(Q.N)*e2
			l := kernelLogSupFloat(al, a, P, Q, e1, e2) + math.Max(x, y) + math.Log1p(math.Exp(math.Min(x, y)-math.Max(x, y))) - math.Log(-math.Expm1(-e1)) - math.Log(-math.Expm1(-e2))
			if l < best {
				best, b1, b2 = l, e1, e2
			}
		}
	}
	return b1, b2
}
