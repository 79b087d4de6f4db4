package strip

import (
	"math"

	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// The Galerkin matrix and its extreme eigenvalues, by the verifier's own
// route.
//
// Let A be the exact M x M matrix sqrt(w_a/2) k(x_a, x_b) sqrt(w_b/2) of the
// rule and U its exact M x N Legendre matrix (strip_rule.go). The rule gives
// G^Q = U^T A U, and the exact Galerkin matrix is G = G^Q + E with the
// entrywise remainder bounds of galerkinQuadF. The verifier holds float
// matrices At (the midpoint of the enclosure of A, exactly symmetric) and Ut
// (midpoints of U), with ||A - At||_F and ||U - Ut||_F bounded from the
// enclosure radii, and computes
//
//	T = At Ut (each entry a dot product with a rigorous error, strip_dot.go),
//	Gh_jk = Ut_j . T_k for j <= k, mirrored.
//
// With S = Ut^T At Ut (symmetric) and ||U||_2 = 1, ||Ut||_2 <= 1 + ||dU||_F:
//
//	||G - Gh|| <= ||E||_F + ||A - At||_F + ||dU||_F ||At||_F (2 + ||dU||_F)
//	            + ||Gh - S||_F,
//
// since U^T (A - At) U has norm at most ||A - At||, U^T At U - Ut^T At Ut =
// dU^T At U + Ut^T At dU, and |Gh_jk - S_jk| <= ||Ut_j|| ||T_k - (At Ut)_k||
// + (error of the final dot product). Weyl's inequality then moves the
// eigenvalues of Gh by at most this delta.
//
// Semidefiniteness: for a float sigma, a float Cholesky factor L of
// s (Gh - sigma I), s = +1 or -1, is only a candidate; the residual
// R = L L^T - s (Gh - sigma I) is evaluated entry by entry with rigorous
// dot products, and s (Gh - sigma I) = L L^T - R >= -||R||_F I. Hence
// lambda_min(G) >= sigma - ||R||_F - delta (s = +1), lambda_max(G) <=
// sigma + ||R||_F + delta (s = -1).

// galerkin holds the float Galerkin matrix and the bound on its distance
// to G.
type galerkin struct {
	Gh    [][]float64
	delta interval.F
}

// stripGalerkin computes Gh and delta; quad bounds ||E||_F, radA
// ||A - At||_F, normA ||At||_F, and rows.uRad2 ||U - Ut||_F^2.
func stripGalerkin(At [][]float64, rows *stripRows, quad, radA, normA interval.F, workers int) *galerkin {
	UT := rows.UT
	N := len(UT)
	M := len(At)
	TT := make([][]float64, N)
	eT := make([]interval.F, N) // ||error of T_k||
	checknum.For(N, workers, func(k int) {
		row := make([]float64, M)
		s := interval.PointF(0)
		for a := 0; a < M; a++ {
			v, e := exactDot(At[a], UT[k])
			row[a] = v
			s = s.Add(interval.PointF(e).Sqr())
		}
		TT[k] = row
		eT[k] = s.Sqrt()
	})
	uNorm := make([]interval.F, N)
	for j := 0; j < N; j++ {
		s := interval.PointF(0)
		for _, x := range UT[j] {
			s = s.Add(interval.PointF(x).Sqr())
		}
		uNorm[j] = s.Sqrt()
	}
	Gh := make([][]float64, N)
	for j := range Gh {
		Gh[j] = make([]float64, N)
	}
	beta2 := make([]interval.F, N)
	checknum.For(N, workers, func(j int) {
		s := interval.PointF(0)
		for k := j; k < N; k++ {
			v, e := exactDot(UT[j], TT[k])
			Gh[j][k] = v
			b := uNorm[j].Mul(eT[k]).Add(interval.PointF(e))
			b2 := b.Sqr()
			if k != j {
				b2 = b2.Scale(1)
			}
			s = s.Add(b2)
		}
		beta2[j] = s
	})
	for j := 0; j < N; j++ {
		for k := 0; k < j; k++ {
			Gh[j][k] = Gh[k][j]
		}
	}
	bs := interval.PointF(0)
	for _, b := range beta2 {
		bs = bs.Add(b)
	}
	dU := rows.uRad2.Sqrt()
	delta := quad.Add(radA).Add(dU.Mul(normA).Mul(dU.Add(interval.PointF(2)))).Add(bs.Sqrt())
	return &galerkin{Gh: Gh, delta: interval.PointF(delta.Hi())}
}

// stripCholesky returns the lower factor L with L L^T ~ A, or false when the
// float factorisation breaks down.
func stripCholesky(A [][]float64) ([][]float64, bool) {
	N := len(A)
	L := make([][]float64, N)
	for i := 0; i < N; i++ {
		L[i] = make([]float64, i+1)
		li := L[i]
		for j := 0; j <= i; j++ {
			s := A[i][j]
			lj := L[j]
			for k := 0; k < j; k++ {
				s -= li[k] * lj[k]
			}
			if i == j {
				if !(s > 0) {
					return nil, false
				}
				li[i] = math.Sqrt(s)
			} else {
				li[j] = s / lj[j]
			}
		}
	}
	return L, true
}

// psdResidual tries to prove sign (Gh - sigma I) >= -res I; it returns res
// (an upper bound of ||L L^T - sign (Gh - sigma I)||_F) or false when the
// float factorisation fails.
func psdResidual(Gh [][]float64, sigma, sign float64, workers int) (interval.F, bool) {
	N := len(Gh)
	A := make([][]float64, N)
	for i := range A {
		A[i] = make([]float64, N)
		for j := range A[i] {
			v := sign * Gh[i][j]
			if i == j {
				v -= sign * sigma
			}
			A[i][j] = v
		}
	}
	L, ok := stripCholesky(A)
	if !ok {
		return interval.F{}, false
	}
	rows := make([]interval.F, N)
	checknum.For(N, workers, func(i int) {
		s := interval.PointF(0)
		for j := 0; j <= i; j++ {
			var q stripAcc
			li, lj := L[i], L[j]
			for k := 0; k <= j; k++ {
				q.addProd(li[k], lj[k])
			}
			q.add(-sign * Gh[i][j])
			if i == j {
				q.add(sign * sigma)
			}
			v, e := q.result()
			t := interval.PointF(math.Abs(v)).Add(interval.PointF(e)).Sqr()
			if i != j {
				t = t.Scale(1)
			}
			s = s.Add(t)
		}
		rows[i] = s
	})
	s := interval.PointF(0)
	for _, r := range rows {
		s = s.Add(r)
	}
	return interval.PointF(s.Sqrt().Hi()), true
}

// proveEdge tries to prove lambda_min(G) >= g (sign +1) or lambda_max(G)
// <= g (sign -1), where hint is a point known to lie beyond the edge on the
// other side (a witness Rayleigh quotient: lambda_min(G) <= hint, or
// lambda_max(G) >= hint). It returns the proved bound on the edge (sigma -
// res - delta, or sigma + res + delta) and whether it reaches g.
func (gk *galerkin) proveEdge(g, hint, sign float64, workers int) (proved float64, ok bool) {
	d := gk.delta
	// start: the shift that would exactly reach g if the residual were 0
	var start float64
	if sign > 0 {
		start = interval.PointF(g).Add(d).Hi()
		if !(hint > start) {
			return math.Inf(-1), false
		}
	} else {
		start = interval.PointF(g).Sub(d).Lo()
		if !(hint < start) {
			return math.Inf(1), false
		}
	}
	best := math.Inf(-1)
	if sign < 0 {
		best = math.Inf(1)
	}
	for _, theta := range []float64{1.0 / 2, 1.0 / 8, 1.0 / 32, 1.0 / 128} {
		sigma := start + theta*(hint-start)
		res, ok := psdResidual(gk.Gh, sigma, sign, workers)
		if !ok {
			continue
		}
		if sign > 0 {
			p := interval.PointF(sigma).Sub(res).Sub(d).Lo()
			best = math.Max(best, p)
			if p >= g {
				return p, true
			}
		} else {
			p := interval.PointF(sigma).Add(res).Add(d).Hi()
			best = math.Min(best, p)
			if p <= g {
				return p, true
			}
		}
	}
	return best, false
}
