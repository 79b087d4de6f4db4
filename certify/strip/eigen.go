package strip

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/mat"

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

// eigenEnclosure proves that every eigenvalue of the float symmetric matrix
// Hc lies within the returned radius of some float value vals[i], using the
// Bauer-Fike theorem (F. L. Bauer and C. T. Fike, Numer. Math. 2 (1960)
// 137): with R = Hc Q - Q diag(vals) and eps >= ||Q^T Q - I||_2 < 1,
// Hc = Q diag(vals) Q^-1 + R Q^-1, so each eigenvalue is within
// kappa(Q) ||R Q^-1|| <= ||R||_F sqrt(1 + eps)/(1 - eps) of some vals[i].
// resF and orthF are the enclosed ||R||_F and ||Q^T Q - I||_F.
func eigenEnclosure(Hc []float64, vals []float64, QT [][]float64, workers int) (radius, resF, orthF interval.F, err error) {
	N := len(vals)
	resRow := make([]interval.F, N)
	orthRow := make([]interval.F, N)
	parallelFor(N, workers, func(i int) {
		// column i of R: R_ki = sum_l Hc[k][l] Q_li - Q_ki vals_i
		q := QT[i]
		lam := interval.PointF(vals[i])
		var rs interval.F
		for k := 0; k < N; k++ {
			row := Hc[k*N : (k+1)*N]
			var s interval.F
			for l := 0; l < N; l++ {
				s = s.Add(interval.PointF(row[l]).Mul(interval.PointF(q[l])))
			}
			s = s.Sub(interval.PointF(q[k]).Mul(lam))
			rs = rs.Add(s.Sqr())
		}
		resRow[i] = rs
		// Gram row i, j >= i.
		var os interval.F
		for j := i; j < N; j++ {
			g := dotPoint(q, QT[j])
			if j == i {
				os = os.Add(g.Sub(interval.PointF(1)).Sqr())
			} else {
				os = os.Add(g.Sqr().Scale(1))
			}
		}
		orthRow[i] = os
	})
	var rs, os interval.F
	for i := 0; i < N; i++ {
		rs = rs.Add(resRow[i])
		os = os.Add(orthRow[i])
	}
	resF, orthF = rs.Sqrt(), os.Sqrt()
	one := interval.PointF(1)
	if !(orthF.Hi() < 1) {
		return interval.F{}.Whole(), resF, orthF, errors.New("strip: float eigenvectors are not close enough to orthonormal")
	}
	radius = resF.Mul(one.Add(orthF).Sqrt()).Quo(one.Sub(orthF))
	return radius, resF, orthF, nil
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
