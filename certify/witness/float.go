package witness

import (
	"errors"
	"math"
	"math/cmplx"

	"gonum.org/v1/gonum/mat"

	"wedgebound/certify"
)

// glFloat returns the n-point Gauss-Legendre nodes and weights on [-1, 1]
// in float64 (Newton on the three-term recurrence).
func glFloat(n int) (x, w []float64) {
	x, w = make([]float64, n), make([]float64, n)
	for i := 0; i < n; i++ {
		z := math.Cos(math.Pi * (float64(i) + 0.75) / (float64(n) + 0.5))
		var dp float64
		for it := 0; it < 100; it++ {
			p0, p1 := 1.0, z
			for k := 2; k <= n; k++ {
				p0, p1 = p1, ((2*float64(k)-1)*z*p1-float64(k-1)*p0)/float64(k)
			}
			dp = float64(n) * (z*p1 - p0) / (z*z - 1)
			dz := p1 / dp
			z -= dz
			if math.Abs(dz) < 1e-16 {
				break
			}
		}
		x[i] = z
		w[i] = 2 / ((1 - z*z) * dp * dp)
	}
	return x, w
}

// floatMatrices returns the Gram matrix G and the backflow matrix K of the
// basis in float64 (K by Gauss-Legendre with nq nodes per panel; no error
// control: only for proposing coefficients).
func floatMatrices(basis []Func, ps []panel, nq int, workers int) (G, K *mat.SymDense) {
	ts := terms(basis)
	N := len(basis)
	G = mat.NewSymDense(N, nil)
	type cb struct {
		w complex128
		m int
		c complex128
	}
	cs := make([]cb, len(ts))
	for i, t := range ts {
		b, _ := t.b.Float64()
		cs[i] = cb{complex(float64(t.wRe), float64(t.wIm)) / 2, t.m, complex(b, float64(t.omega))}
	}
	gm := make([]complex128, N*N)
	for i, p := range cs {
		for j, q := range cs {
			if ts[j].fn < ts[i].fn {
				continue
			}
			gm[ts[i].fn*N+ts[j].fn] += cmplx.Conj(p.w) * q.w * momentF(p.m+q.m, cmplx.Conj(p.c)+q.c)
		}
	}
	for i := 0; i < N; i++ {
		for j := i; j < N; j++ {
			G.SetSym(i, j, real(gm[i*N+j]))
		}
	}
	gx, gw := glFloat(nq)
	var tn, tw []float64
	for _, p := range ps {
		mu, l := (p.Lo+p.Hi)/2, (p.Hi-p.Lo)/2
		for k := range gx {
			tn = append(tn, mu+l*gx[k])
			tw = append(tw, l*gw[k])
		}
	}
	Q := len(tn)
	// A_k[q][i] = sqrt(w_q) F_k of function i at node q, split in re/im.
	a0r, a0i := mat.NewDense(Q, N, nil), mat.NewDense(Q, N, nil)
	a1r, a1i := mat.NewDense(Q, N, nil), mat.NewDense(Q, N, nil)
	certify.For(Q, workers, func(q int) {
		it := complex(0, tn[q])
		sw := math.Sqrt(tw[q])
		f0 := make([]complex128, N)
		f1 := make([]complex128, N)
		for _, p := range cs {
			_ = p
		}
		for i, p := range cs {
			c := p.c + it
			f0[ts[i].fn] += p.w * momentF(p.m, c)
			f1[ts[i].fn] += p.w * momentF(p.m+1, c)
		}
		for i := 0; i < N; i++ {
			a0r.Set(q, i, sw*real(f0[i]))
			a0i.Set(q, i, sw*imag(f0[i]))
			a1r.Set(q, i, sw*real(f1[i]))
			a1i.Set(q, i, sw*imag(f1[i]))
		}
	})
	// K = -(1/2pi) Re(A1^H A0 + A0^H A1).
	var s1, s2 mat.Dense
	s1.Mul(a1r.T(), a0r)
	s2.Mul(a1i.T(), a0i)
	s1.Add(&s1, &s2)
	K = mat.NewSymDense(N, nil)
	for i := 0; i < N; i++ {
		for j := i; j < N; j++ {
			K.SetSym(i, j, -(s1.At(i, j)+s1.At(j, i))/(2*math.Pi))
		}
	}
	return G, K
}

// topVector returns the float eigenvector of the largest generalised
// eigenvalue of K x = lambda G x, restricted to the eigendirections of G
// above relTol times its largest eigenvalue (the Gram matrix of Gaussians
// is numerically singular), normalised so that x^T G x = 1, and its value.
func topVector(G0, K0 *mat.SymDense, relTol float64) ([]float64, float64, error) {
	N := G0.SymmetricDim()
	// Jacobi scaling: the basis functions' norms differ by many orders of
	// magnitude (u exp(-b u^2) has norm^2 ~ b^-3/2).
	d := make([]float64, N)
	for i := range d {
		if !(G0.At(i, i) > 0) {
			return nil, 0, errors.New("witness: a basis function has no positive norm in float64")
		}
		d[i] = 1 / math.Sqrt(G0.At(i, i))
	}
	G, K := mat.NewSymDense(N, nil), mat.NewSymDense(N, nil)
	for i := 0; i < N; i++ {
		for j := i; j < N; j++ {
			G.SetSym(i, j, G0.At(i, j)*d[i]*d[j])
			K.SetSym(i, j, K0.At(i, j)*d[i]*d[j])
		}
	}
	var es mat.EigenSym
	if !es.Factorize(G, true) {
		return nil, 0, errors.New("witness: Gram eigendecomposition failed")
	}
	vals := es.Values(nil)
	var V mat.Dense
	es.VectorsTo(&V)
	var keep []int
	for i, v := range vals {
		if v > relTol*vals[N-1] {
			keep = append(keep, i)
		}
	}
	k := len(keep)
	if k == 0 {
		return nil, 0, errors.New("witness: Gram matrix is zero")
	}
	W := mat.NewDense(N, k, nil)
	for c, i := range keep {
		s := 1 / math.Sqrt(vals[i])
		for r := 0; r < N; r++ {
			W.Set(r, c, V.At(r, i)*s)
		}
	}
	var t1, t2 mat.Dense
	t1.Mul(K, W)
	t2.Mul(W.T(), &t1)
	S := mat.NewSymDense(k, nil)
	for i := 0; i < k; i++ {
		for j := i; j < k; j++ {
			S.SetSym(i, j, (t2.At(i, j)+t2.At(j, i))/2)
		}
	}
	var e2 mat.EigenSym
	if !e2.Factorize(S, true) {
		return nil, 0, errors.New("witness: reduced eigenproblem failed")
	}
	v2 := e2.Values(nil)
	var Y mat.Dense
	e2.VectorsTo(&Y)
	x := make([]float64, N)
	for r := 0; r < N; r++ {
		s := 0.0
		for c := 0; c < k; c++ {
			s += W.At(r, c) * Y.At(c, k-1)
		}
		x[r] = s * d[r]
	}
	// Fix the sign so that the first large coefficient is positive.
	big := 0
	for i := range x {
		if math.Abs(x[i]) > math.Abs(x[big]) {
			big = i
		}
	}
	if x[big] < 0 {
		for i := range x {
			x[i] = -x[i]
		}
	}
	return x, v2[k-1], nil
}
