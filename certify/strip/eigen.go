package strip

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/mat"

	"wedgebound/certify"
	"wedgebound/interval"
)

// midpoints returns the float midpoint matrix Hc of the symmetric interval
// matrix H and an enclosure of a bound on ||H' - Hc||_F valid for every
// symmetric H' inside H: each |H'_jk - Hc_jk| is at most the larger of
// hi - mid and mid - lo, both rounded up by interval subtraction.
func midpoints(H [][]interval.F) (Hc []float64, radF interval.F) {
	N := len(H)
	Hc = make([]float64, N*N)
	var sum interval.F
	for j := 0; j < N; j++ {
		for k := 0; k < N; k++ {
			h := H[j][k]
			m := h.Mid().Lo()
			Hc[j*N+k] = m
			up := interval.PointF(h.Hi()).Sub(interval.PointF(m)).Hi()
			dn := interval.PointF(m).Sub(interval.PointF(h.Lo())).Hi()
			sum = sum.Add(interval.PointF(math.Max(up, dn)).Sqr())
		}
	}
	return Hc, sum.Sqrt()
}

// floatEigen returns the eigenvalues (ascending) and the eigenvector matrix
// as columns, transposed: QT[i] is the i-th eigenvector. Float only; the
// result is a candidate that eigenEnclosure certifies.
func floatEigen(Hc []float64, N int) ([]float64, [][]float64, error) {
	S := mat.NewSymDense(N, nil)
	for j := 0; j < N; j++ {
		for k := j; k < N; k++ {
			S.SetSym(j, k, Hc[j*N+k])
		}
	}
	var es mat.EigenSym
	if !es.Factorize(S, true) {
		return nil, nil, errors.New("strip: float eigen-decomposition did not converge")
	}
	vals := es.Values(nil)
	var Q mat.Dense
	es.VectorsTo(&Q)
	QT := make([][]float64, N)
	for i := 0; i < N; i++ {
		col := make([]float64, N)
		for k := 0; k < N; k++ {
			col[k] = Q.At(k, i)
		}
		QT[i] = col
	}
	return vals, QT, nil
}

// psdShift proves lambda_min(sign (Hc - sigma I)) >= -resF, that is
// lambda_min(Hc) >= sigma - resF for sign = +1 and lambda_max(Hc) <=
// sigma + resF for sign = -1. Method: a float Cholesky factor R of
// A = sign (Hc - sigma I) is only a candidate; the residual
// E = R^T R - A is enclosed in interval arithmetic, and since R^T R is
// positive semidefinite, A = R^T R - E >= -||E||_2 I >= -||E||_F I.
// sigma is moved away from the float estimate est by a growing margin until
// the float factorization succeeds.
func psdShift(Hc []float64, N int, est float64, sign float64, scale float64, workers int) (sigma float64, resF interval.F, err error) {
	margin := 1e-12 * math.Max(1, scale)
	for try := 0; try < 8; try, margin = try+1, margin*8 {
		sigma = est - sign*margin
		S := mat.NewSymDense(N, nil)
		for j := 0; j < N; j++ {
			for k := j; k < N; k++ {
				v := sign * Hc[j*N+k]
				if j == k {
					v -= sign * sigma
				}
				S.SetSym(j, k, v)
			}
		}
		var ch mat.Cholesky
		if !ch.Factorize(S) {
			continue
		}
		var U mat.TriDense
		ch.UTo(&U)
		// RT[k] = column k of R (rows 0..k), contiguous.
		RT := make([][]float64, N)
		for k := 0; k < N; k++ {
			col := make([]float64, k+1)
			for i := 0; i <= k; i++ {
				col[i] = U.At(i, k)
			}
			RT[k] = col
		}
		sg := interval.PointF(sign)
		sig := interval.PointF(sigma)
		rows := make([]interval.F, N)
		certify.For(N, workers, func(j int) {
			var acc interval.F
			for k := j; k < N; k++ {
				// (R^T R)_jk = sum_{i <= j} R_ij R_ik
				g := dotPoint(RT[j], RT[k][:j+1])
				a := sg.Mul(interval.PointF(Hc[j*N+k]))
				if j == k {
					a = sg.Mul(interval.PointF(Hc[j*N+k]).Sub(sig))
				}
				e := g.Sub(a).Sqr()
				if k != j {
					e = e.Scale(1)
				}
				acc = acc.Add(e)
			}
			rows[j] = acc
		})
		var sum interval.F
		for _, r := range rows {
			sum = sum.Add(r)
		}
		return sigma, sum.Sqrt(), nil
	}
	return 0, interval.F{}.Whole(), errors.New("strip: float Cholesky factorization failed; cannot certify an eigenvalue bound")
}

// dotPoint encloses sum_i x_i y_i for float vectors.
func dotPoint(x, y []float64) interval.F {
	var s interval.F
	for i := range x {
		s = s.Add(interval.PointF(x[i]).Mul(interval.PointF(y[i])))
	}
	return s
}

// rayleigh encloses v^T G v / v^T v for every symmetric G with
// G_jk in H_jk padded by C sqrt((2j+1)(2k+1))(rho^j + rho^k) (the Gauss
// remainder), where logC encloses log C and rho = e^eta.
// It also returns the enclosed quadrature contribution
// sum_jk |v_j||v_k| C sqrt((2j+1)(2k+1))(rho^j + rho^k).
func rayleigh(H [][]interval.F, v []float64, logC interval.F, eta float64) (rq, quad interval.F) {
	N := len(v)
	var num interval.F
	for j := 0; j < N; j++ {
		var s interval.F
		for k := 0; k < N; k++ {
			s = s.Add(H[j][k].Mul(interval.PointF(v[k])))
		}
		num = num.Add(s.Mul(interval.PointF(v[j])))
	}
	// quadrature: 2 C (sum_j |v_j| sqrt(2j+1) rho^j)(sum_k |v_k| sqrt(2k+1))
	var s1, s0 interval.F
	for j := 0; j < N; j++ {
		sq := interval.PointF(float64(2*j + 1)).Sqrt()
		av := interval.PointF(math.Abs(v[j]))
		s0 = s0.Add(av.Mul(sq))
		g := interval.Exp(logC.Add(interval.PointF(float64(j)).Mul(interval.PointF(eta))))
		s1 = s1.Add(av.Mul(sq).Mul(g))
	}
	quad = s1.Mul(s0).Scale(1)
	den := dotPoint(v, v)
	rq = num.Pad(quad).Quo(den)
	return rq, quad
}
