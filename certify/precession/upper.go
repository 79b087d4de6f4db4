package precession

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"wedgebound/certify"
	"wedgebound/interval"
)

// UpperProof is the data of the norm lemma for one sector (doc.go): with the
// cutoff A, the sum length L, lambda and epsilon, the lemma gives
// ||B_r|| <= sqrt(lambda)/3, so sup spec Q3 on the sector is at most
// 1/2 + sqrt(lambda)/6.
type UpperProof struct {
	Sector Sector
	Cutoff int     // A
	Length int     // L
	Lambda float64 // lambda (exact float64)
	// Epsilon bounds sup_{a >= A} (F_a^2 - 1) from above (and is >= 0).
	Epsilon float64
	// TailG encloses G_b^2 for every b >= L.
	TailG interval.F
	// CMin is a lower bound of c_b = lambda/G_b^2 - 1 - epsilon over all b.
	CMin float64
	// TailH bounds the discarded part of each entry of H (the largest).
	TailH float64
	// Margin is a proved lower bound on the smallest eigenvalue of
	// K = H - H E H.
	Margin float64
	// Bound encloses 1/2 + sqrt(lambda)/6.
	Bound interval.F
}

// epsilon returns an upper bound of max(0, sup_{a>=A} F_a^2 - 1): exact
// enclosures for A <= a < L, and for a >= L the bound
// F_a^2 <= sqrt((3a+3P+3/2)/(3a+J0+1/4)), monotone in a.
func (s Sector) epsilon(t *Table, A, L int) float64 {
	e := 0.0
	for a := A; a < L; a++ {
		e = math.Max(e, s.F2(t, a).Sub(interval.PointF(1)).Hi())
	}
	var z interval.F
	num := z.Int(int64(12*L + 12*s.P + 6))
	den := z.Int(int64(12*L + 4*s.J0 + 1))
	e = math.Max(e, num.Quo(den).Sqrt().Sub(interval.PointF(1)).Hi())
	// A margin, so that a verifier with its own enclosures of F_a^2 agrees.
	return e*(1+1e-9) + 1e-14
}

// tailG encloses G_b^2 for all b >= L (doc.go, tail lemma).
func (s Sector) tailG(L int) interval.F {
	var z interval.F
	three := z.Int(3)
	rho := z.Int(int64(6*L + 2*s.K0 + 1)).Quo(z.Int(int64(2*L + 1))).Hull(three)
	third := z.Frac(1, 3)
	r1 := z.Int(int64(4*L + 1)).Quo(z.Int(int64(4*(3*L+s.K0) + 2)))
	r2 := z.Int(int64(4*L + 2)).Quo(z.Int(int64(4*(3*L+s.K0) + 1)))
	r := r1.Hull(r2).Hull(third)
	return rho.Quo(sqrt3()).Mul(r.Sqrt())
}

// floatK returns the smallest eigenvalue of the float64 matrix
// K = H - H E H at lambda (tail of H ignored) and its eigenvector; ok is
// false when some c_b <= 0.
func (s Sector) floatK(t *Table, A, L int, eps, lambda float64, g2 []float64, tailGHi float64, rows [][]float64) (float64, []float64, bool) {
	if lambda/tailGHi-1-eps <= 0 {
		return 0, nil, false
	}
	cinf := lambda - 1 - eps
	d := make([]float64, L)
	for b := 0; b < L; b++ {
		c := lambda/g2[b] - 1 - eps
		if c <= 0 {
			return 0, nil, false
		}
		d[b] = 1/c - 1/cinf
	}
	H := mat.NewSymDense(A, nil)
	for a := 0; a < A; a++ {
		for c := a; c < A; c++ {
			sum := 0.0
			ra, rc := rows[a], rows[c]
			for b := 0; b < L; b++ {
				sum += ra[b] * rc[b] * d[b]
			}
			if a == c {
				sum += 1 / cinf
			}
			H.SetSym(a, c, sum)
		}
	}
	K := mat.NewSymDense(A, nil)
	for a := 0; a < A; a++ {
		for c := a; c < A; c++ {
			sum := 0.0
			for e := 0; e < A; e++ {
				sum += H.At(a, e) * (s.F2f(t, e) - 1 - eps) * H.At(e, c)
			}
			K.SetSym(a, c, H.At(a, c)-sum)
		}
	}
	var es mat.EigenSym
	if !es.Factorize(K, true) {
		return 0, nil, false
	}
	var v mat.Dense
	es.VectorsTo(&v)
	return es.Values(nil)[0], mat.Col(nil, 0, &v), true
}

// searchLambda finds (float64) the smallest lambda for which the lemma's
// matrix K is positive definite, by bisection.
func (s Sector) searchLambda(t *Table, A, L int, eps float64) (lambda float64, v []float64, err error) {
	g2 := make([]float64, L)
	gmax := 0.0
	for b := 0; b < L; b++ {
		g2[b] = s.G2f(t, b)
		gmax = math.Max(gmax, g2[b])
	}
	tg := s.tailG(L)
	gmax = math.Max(gmax, tg.Hi())
	rows := s.mRows(t, A, L)
	lo := (1 + eps) * gmax * (1 + 1e-12)
	if m, _, ok := s.floatK(t, A, L, eps, lo, g2, tg.Hi(), rows); ok && m > 0 {
		return lo, nil, nil
	}
	hi := 2 * lo
	for {
		if m, _, ok := s.floatK(t, A, L, eps, hi, g2, tg.Hi(), rows); ok && m > 0 {
			break
		}
		hi *= 2
		if hi > 1e3 {
			return 0, nil, errors.New("no lambda makes the lemma's matrix positive")
		}
	}
	for i := 0; i < 60 && hi-lo > 1e-13*hi; i++ {
		mid := (lo + hi) / 2
		if m, _, ok := s.floatK(t, A, L, eps, mid, g2, tg.Hi(), rows); ok && m > 0 {
			hi = mid
		} else {
			lo = mid
		}
	}
	_, v, _ = s.floatK(t, A, L, eps, lo, g2, tg.Hi(), rows)
	return hi, v, nil
}

// mRows returns the float64 rows M_{a+P, b}, a < A, b < L.
func (s Sector) mRows(t *Table, A, L int) [][]float64 {
	rows := make([][]float64, A)
	for a := range rows {
		rows[a] = make([]float64, L)
		for b := 0; b < L; b++ {
			rows[a][b] = t.Mf(a+s.P, b)
		}
	}
	return rows
}

// ProveUpper proves the lemma at lambda (a float64) in interval arithmetic
// and returns the proof data, or an error saying which hypothesis failed.
func (s Sector) ProveUpper(t *Table, A, L int, lambda float64, workers int) (*UpperProof, error) {
	if L <= A+s.P+1 || 3*L+s.K0 >= len(t.A2) || 3*L+s.J0 >= len(t.A2) {
		return nil, fmt.Errorf("sum length %d too small for cutoff %d or table too short", L, A)
	}
	var z interval.F
	one := z.Int(1)
	lam := interval.PointF(lambda)
	eps := s.epsilon(t, A, L)
	epsI := interval.PointF(eps)
	tg := s.tailG(L)
	cinf := lam.Sub(one).Sub(epsI)
	cmin := lam.Quo(interval.PointF(tg.Hi())).Sub(one).Sub(epsI).Lo()
	d := make([]interval.F, L)
	for b := 0; b < L; b++ {
		c := lam.Quo(s.G2(t, b)).Sub(one).Sub(epsI)
		cmin = math.Min(cmin, c.Lo())
		d[b] = one.Quo(c).Sub(one.Quo(cinf))
	}
	if !(cmin > 0) || !(cinf.Lo() > 0) {
		return nil, fmt.Errorf("sector %d: lambda %.17g leaves some c_b <= 0", s.R, lambda)
	}
	sq := Sqrt2OverPi()
	rows := make([][]interval.F, A)
	certify.For(A, workers, func(a int) {
		rows[a] = make([]interval.F, L)
		for b := 0; b < L; b++ {
			rows[a][b] = t.M(a+s.P, b, sq)
		}
	})
	// Tail of H: lambda eta/(cmin cinf) (2/pi) alpha alpha'/(theta theta' sqrt(pi) sqrt(L-3/4)).
	gl, gh := interval.PointF(tg.Lo()), interval.PointF(tg.Hi())
	eta := one.Quo(gl).Sub(one).Abs().Max(one.Quo(gh).Sub(one).Abs())
	pi := z.Pi()
	base := lam.Mul(eta).Quo(interval.PointF(cmin).Mul(cinf)).Mul(z.Int(2).Quo(pi)).Quo(pi.Sqrt().Mul(z.Frac(4*int64(L)-3, 4).Sqrt()))
	theta := func(i int) interval.F { return one.Sub(z.Int(int64(2 * i)).Quo(z.Int(int64(2*L + 1)))) }
	H := make([][]interval.F, A)
	for a := range H {
		H[a] = make([]interval.F, A)
	}
	tailMax := 0.0
	certify.For(A, workers, func(a int) {
		for c := a; c < A; c++ {
			sum := interval.PointF(0)
			ra, rc := rows[a], rows[c]
			for b := 0; b < L; b++ {
				sum = sum.Add(ra[b].Mul(rc[b]).Mul(d[b]))
			}
			if a == c {
				sum = sum.Add(one.Quo(cinf))
			}
			tail := base.Mul(t.A[a+s.P]).Mul(t.A[c+s.P]).Quo(theta(a + s.P).Mul(theta(c + s.P)))
			H[a][c] = sum.Pad(interval.PointF(tail.Hi()))
			H[c][a] = H[a][c]
		}
	})
	for a := 0; a < A; a++ {
		tailMax = math.Max(tailMax, base.Mul(t.A[a+s.P]).Mul(t.A[a+s.P]).Quo(theta(a+s.P).Sqr()).Hi())
	}
	E := make([]interval.F, A)
	for a := range E {
		E[a] = s.F2(t, a).Sub(one).Sub(epsI)
	}
	K := make([][]interval.F, A)
	for a := range K {
		K[a] = make([]interval.F, A)
	}
	for a := 0; a < A; a++ {
		for c := a; c < A; c++ {
			sum := interval.PointF(0)
			for e := 0; e < A; e++ {
				sum = sum.Add(H[a][e].Mul(E[e]).Mul(H[e][c]))
			}
			K[a][c] = H[a][c].Sub(sum)
			K[c][a] = K[a][c]
		}
	}
	margin, err := provePositive(K)
	if err != nil {
		return nil, fmt.Errorf("sector %d at lambda %.17g: %v", s.R, lambda, err)
	}
	bound := z.Frac(1, 2).Add(lam.Sqrt().Quo(z.Int(6)))
	return &UpperProof{Sector: s, Cutoff: A, Length: L, Lambda: lambda, Epsilon: eps, TailG: tg,
		CMin: cmin, TailH: tailMax, Margin: margin, Bound: bound}, nil
}

// provePositive proves that every symmetric matrix in the interval matrix K
// is positive definite: with s half the float smallest eigenvalue of the
// midpoint and R the float Cholesky factor of mid(K) - s I, every such
// matrix is R^T R + s I + E with |E| enclosed entrywise, and
// lambda_min >= s - max_i sum_j |E_ij| > 0. It returns that lower bound.
func provePositive(K [][]interval.F) (float64, error) {
	n := len(K)
	mid := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		for j := i; j < n; j++ {
			mid.SetSym(i, j, (K[i][j].Lo()+K[i][j].Hi())/2)
		}
	}
	var es mat.EigenSym
	if !es.Factorize(mid, false) {
		return 0, errors.New("eigenvalues of the lemma's matrix did not converge")
	}
	lmin := es.Values(nil)[0]
	if !(lmin > 0) {
		return 0, fmt.Errorf("the lemma's matrix is not positive definite (smallest eigenvalue about %.3g)", lmin)
	}
	s := lmin / 2
	shifted := mat.NewSymDense(n, nil)
	shifted.CopySym(mid)
	for i := 0; i < n; i++ {
		shifted.SetSym(i, i, shifted.At(i, i)-s)
	}
	var ch mat.Cholesky
	if !ch.Factorize(shifted) {
		return 0, errors.New("float Cholesky factorisation failed")
	}
	var U mat.TriDense
	ch.UTo(&U)
	worst := 0.0
	for i := 0; i < n; i++ {
		row := 0.0
		for j := 0; j < n; j++ {
			// (U^T U)_ij = sum_k U_ki U_kj
			acc := interval.PointF(0)
			for k := 0; k <= min(i, j); k++ {
				acc = acc.Add(interval.PointF(U.At(k, i)).Mul(interval.PointF(U.At(k, j))))
			}
			e := K[i][j].Sub(acc)
			if i == j {
				e = e.Sub(interval.PointF(s))
			}
			row += e.Abs().Hi()
		}
		worst = math.Max(worst, row*(1+1e-15))
	}
	m := interval.PointF(s).Sub(interval.PointF(worst)).Lo()
	if !(m > 0) {
		return 0, fmt.Errorf("positivity not proved (margin %.3g below residual %.3g)", s, worst)
	}
	return m, nil
}
