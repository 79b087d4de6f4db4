package softwall

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/mat"

	"wedgebound/interval"
	"wedgebound/regions"
)

// Grid is a Nystrom discretisation of (0, U): Gauss-Legendre panels whose
// length is min(MaxPanel, Waves*pi/u) at their left end u (the kernel
// oscillates like sin(u^2 - v^2), local wavelength pi/u), each with Nodes
// nodes.
type Grid struct {
	U        float64 // truncation: momenta |u| < U
	Nodes    int     // nodes per panel
	Waves    float64 // panel length in local wavelengths pi/u
	MaxPanel float64 // longest panel
}

// points returns the nodes and weights of the grid on (0, U).
func (g Grid) points() (x, wt []float64) { return g.from(0) }

// from returns the nodes and weights of the grid on (r, U).
func (g Grid) from(r float64) (x, wt []float64) {
	n := g.Nodes
	px := make([]float64, n)
	pw := make([]float64, n)
	for a := r; a < g.U; {
		h := g.MaxPanel
		if a > 0 && g.Waves*math.Pi/a < h {
			h = g.Waves * math.Pi / a
		}
		b := math.Min(a+h, g.U)
		quad.Legendre{}.FixedLocations(px, pw, a, b)
		x = append(x, px...)
		wt = append(wt, pw...)
		a = b
	}
	return x, wt
}

// s is S(u, v) = sin(u^2 - v^2) / (pi (u - v)) = (u + v) sinc((u - v)(u + v)) / pi.
func s(u, v float64) float64 {
	d, m := u-v, u+v
	z := d * m
	if math.Abs(z) < 1e-8 {
		return m * (1 - z*z/6) / math.Pi
	}
	return math.Sin(z) / (math.Pi * d)
}

// Matrix returns the symmetric Nystrom matrix of the truncation to
// |u| < U of -Op(chi_Q + w chi_III + t chi_{H^c}) in the momentum picture
// (see the package doc): rows 0..n-1 are the nodes of the positive
// momenta, rows n..2n-1 the mirrored nodes of the negative ones, each
// scaled by the square root of its weight. For t = +Inf the negative
// momenta decouple and only the first block (the half-line kernel K) is
// returned: a huge finite t would cost digits (the eigensolver's error
// scales with the norm).
func Matrix(g Grid, w, t float64) (*mat.SymDense, error) {
	x, wt := g.points()
	n := len(x)
	if n == 0 {
		return nil, errors.New("softwall: empty grid")
	}
	sq := make([]float64, n)
	for i, v := range wt {
		sq[i] = math.Sqrt(v)
	}
	if math.IsInf(t, 1) {
		m := mat.NewSymDense(n, nil)
		for i := 0; i < n; i++ {
			for j := i; j < n; j++ {
				m.SetSym(i, j, -s(x[i], x[j])*sq[i]*sq[j])
			}
		}
		return m, nil
	}
	m := mat.NewSymDense(2*n, nil)
	for i := 0; i < n; i++ {
		for j := i; j < n; j++ {
			k := s(x[i], x[j]) * sq[i] * sq[j]
			m.SetSym(i, j, -k)       // (+,+): -S(a, a')
			m.SetSym(n+i, n+j, -w*k) // (-,-): w S(-b, -b') = -w S(b, b')
		}
		m.SetSym(n+i, n+i, m.At(n+i, n+i)-t)
		for j := 0; j < n; j++ {
			// (+,-): u = a = x[i] > 0, v = -b = -x[j] < 0, S(a, -b) = sin(a^2 - b^2)/(pi (a + b)).
			k := math.Sin(x[i]*x[i]-x[j]*x[j]) / (math.Pi * (x[i] + x[j])) * sq[i] * sq[j]
			if x[i] > x[j] { // u + v > 0: the wedge
				k = -k
			} else { // u + v < 0: the opposite wedge
				k = w * k
			}
			m.SetSym(i, n+j, k)
		}
	}
	return m, nil
}

// Top returns the k largest eigenvalues (largest first) of a symmetric
// matrix.
func Top(m *mat.SymDense, k int) ([]float64, error) {
	var es mat.EigenSym
	if !es.Factorize(m, false) {
		return nil, errors.New("softwall: eigen-decomposition failed")
	}
	v := es.Values(nil)
	out := make([]float64, 0, k)
	for i := len(v) - 1; i >= 0 && len(out) < k; i-- {
		out = append(out, v[i])
	}
	return out, nil
}

// Float returns the float64 Nystrom estimate of sup spec of the truncation
// to |u| < U of -Op(chi_Q + w chi_III + t chi_{H^c}) and the matrix order.
// It approximates the top of the spectrum of a compression, so it
// approaches the relaxation's bound from below as U grows (float evidence
// only).
func Float(g Grid, w, t float64) (float64, int, error) {
	m, err := Matrix(g, w, t)
	if err != nil {
		return 0, 0, err
	}
	top, err := Top(m, 1)
	if err != nil {
		return 0, 0, err
	}
	return top[0], m.SymmetricDim(), nil
}

// Extrapolate fits f(U) = a + b/U + c/U^2 through three points and returns
// a, the estimate of the limit U -> inf.
func Extrapolate(u, f [3]float64) float64 {
	m := mat.NewDense(3, 3, nil)
	for i := range 3 {
		m.Set(i, 0, 1)
		m.Set(i, 1, 1/u[i])
		m.Set(i, 2, 1/(u[i]*u[i]))
	}
	var x mat.VecDense
	if err := x.SolveVec(m, mat.NewVecDense(3, f[:])); err != nil {
		return math.NaN()
	}
	return x.AtVec(0)
}

// EssEdge returns the float64 value of -inf over s of lambda_min of the end
// symbol
//
//	E(s) = [[A, B + w conj B], [conj(B + w conj B), w A + t]],
//
// with A, B the quadrant symbol, sampled at s in [-smax, smax] with the
// given step and refined by golden section around the smallest sample.
// E is the Mellin symbol of chi_Q + w chi_III + t chi_{x<0}, the form the
// relaxation takes at the large-x end of the scale axis (quadrant II lies
// outside H there); the small-x end is its mirror image under the swap
// (x, p) -> (p, x) and has the same spectrum. Its negative is the part of
// the spectrum of the relaxation that the non-invariant term cannot move
// (float evidence only).
func EssEdge(w, t, smax, step float64) float64 {
	f := func(s float64) float64 { return endMinEig(w, t, s) }
	best, bs := math.Inf(1), 0.0
	for s := -smax; s <= smax; s += step {
		if v := f(s); v < best {
			best, bs = v, s
		}
	}
	// Golden section on [bs - step, bs + step].
	a, b := bs-step, bs+step
	r := (math.Sqrt(5) - 1) / 2
	c, d := b-r*(b-a), a+r*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < 80; i++ {
		if fc < fd {
			b, d, fd = d, c, fc
			c = b - r*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + r*(b-a)
			fd = f(d)
		}
	}
	return -math.Min(best, math.Min(fc, fd))
}

// endMinEig is lambda_min of the end symbol at s (midpoints of the
// quadrant enclosure).
func endMinEig(w, t, s float64) float64 {
	q := regions.Quadrant(interval.PointF(s))
	a := q.A.Mid().Lo()
	br, bi := q.B.Re.Mid().Lo(), q.B.Im.Mid().Lo()
	// B + w conj B
	cr, ci := br*(1+w), bi*(1-w)
	d := w*a + t
	h, g := (a+d)/2, (a-d)/2
	return h - math.Sqrt(g*g+cr*cr+ci*ci)
}

// TempleResult is the float64 outcome of Temple's inequality for the top
// eigenvalue of a big Nystrom matrix with a trial vector from a smaller
// truncation.
type TempleResult struct {
	Q, Eps2      float64 // Rayleigh quotient and variance ||A phi||^2 - Q^2
	Top, Second  float64 // the big matrix's two largest eigenvalues
	Bound        float64 // Q + Eps2/(Q - Second), or +Inf when Q <= Second
	Small, Large int     // orders of the trial and of the big matrix
}

// Temple takes as trial the top eigenvector of the truncation of the
// relaxation to the first `panels` panels of each channel, pads it with
// zeros on the grid of g, and evaluates Temple's inequality
// lambda_1 <= Q + eps^2/(Q - rho) with rho the big matrix's second
// eigenvalue (float evidence of how much a rigorous Temple bound would
// lose to the trial's residual; nothing here is proved).
func Temple(g Grid, w, t float64, panels int) (TempleResult, error) {
	big, err := Matrix(g, w, t)
	if err != nil {
		return TempleResult{}, err
	}
	ch := 2
	if math.IsInf(t, 1) {
		ch = 1
	}
	N := big.SymmetricDim() / ch
	n := panels * g.Nodes
	if n <= 0 || n > N {
		return TempleResult{}, errors.New("softwall: trial size out of range")
	}
	idx := make([]int, 0, ch*n)
	for c := 0; c < ch; c++ {
		for i := 0; i < n; i++ {
			idx = append(idx, c*N+i)
		}
	}
	small := mat.NewSymDense(len(idx), nil)
	for a, i := range idx {
		for b := a; b < len(idx); b++ {
			small.SetSym(a, b, big.At(i, idx[b]))
		}
	}
	var es mat.EigenSym
	if !es.Factorize(small, true) {
		return TempleResult{}, errors.New("softwall: eigen-decomposition failed")
	}
	var vec mat.Dense
	es.VectorsTo(&vec)
	phi := mat.NewVecDense(ch*N, nil)
	for a, i := range idx {
		phi.SetVec(i, vec.At(a, len(idx)-1))
	}
	var ap mat.VecDense
	ap.MulVec(big, phi)
	q := mat.Dot(phi, &ap)
	eps2 := mat.Dot(&ap, &ap) - q*q
	top, err := Top(big, 2)
	if err != nil {
		return TempleResult{}, err
	}
	r := TempleResult{Q: q, Eps2: eps2, Top: top[0], Second: top[1], Bound: math.Inf(1), Small: len(idx), Large: ch * N}
	if q > top[1] {
		r.Bound = q + eps2/(q-top[1])
	}
	return r, nil
}

// Window returns the float64 Nystrom estimate of the top of the spectrum
// of the half-line kernel K compressed to momenta in (r, U). For r = 0 it
// is the strip value; for r > 0 the cut at r makes a new wedge vertex on
// the boundary of the half-plane {p > r}, and the values show that this
// compression does not fall below the strip values (float evidence that a
// sharp momentum split cannot bound the high-momentum part below c_bm).
func Window(g Grid, r float64) (float64, error) {
	x, wt := g.from(r)
	n := len(x)
	if n == 0 {
		return 0, errors.New("softwall: empty window")
	}
	m := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		for j := i; j < n; j++ {
			m.SetSym(i, j, -s(x[i], x[j])*math.Sqrt(wt[i]*wt[j]))
		}
	}
	top, err := Top(m, 1)
	if err != nil {
		return 0, err
	}
	return top[0], nil
}

// SplitResult is the float64 outcome of the momentum split of Split.
type SplitResult struct {
	Top    float64 // top eigenvalue of the whole truncation (0, U)
	High   float64 // top eigenvalue of the high block (R, U)
	Schur  float64 // the lambda with lambda = top(K11 + K12 K21/(lambda - High))
	Orders [2]int  // orders of the low and the high block
}

// Split splits the half-line kernel K on the grid of g (t = +Inf, momenta
// in (0, U)) at the first panel boundary at or beyond R into a low block
// K11 and a high block K22, and solves the crude Schur-complement
// inequality: K <= lambda as soon as K22 <= High < lambda and
// K11 + K12 K21/(lambda - High) <= lambda, since
// (lambda - K22)^{-1} <= 1/(lambda - High). Schur is the smallest such
// lambda (bisection); its excess over Top is what replacing the resolvent
// of the high block by a constant costs (float evidence only).
func Split(g Grid, R float64) (SplitResult, error) {
	x, _ := g.points()
	k, err := Matrix(g, 0, math.Inf(1))
	if err != nil {
		return SplitResult{}, err
	}
	n := len(x)
	m := 0
	for m < n && x[m] < R {
		m += g.Nodes
	}
	if m <= 0 || m >= n {
		return SplitResult{}, errors.New("softwall: split point outside the grid")
	}
	h := n - m
	k11 := mat.NewSymDense(m, nil)
	k22 := mat.NewSymDense(h, nil)
	k12 := mat.NewDense(m, h, nil)
	for i := 0; i < n; i++ {
		for j := i; j < n; j++ {
			v := k.At(i, j)
			switch {
			case j < m:
				k11.SetSym(i, j, v)
			case i >= m:
				k22.SetSym(i-m, j-m, v)
			default:
				k12.Set(i, j-m, v)
			}
		}
	}
	top, err := Top(k, 1)
	if err != nil {
		return SplitResult{}, err
	}
	high, err := Top(k22, 1)
	if err != nil {
		return SplitResult{}, err
	}
	var cc mat.Dense
	cc.Mul(k12, k12.T())
	f := func(l float64) (float64, error) {
		s := mat.NewSymDense(m, nil)
		for i := 0; i < m; i++ {
			for j := i; j < m; j++ {
				s.SetSym(i, j, k11.At(i, j)+cc.At(i, j)/(l-high[0]))
			}
		}
		t, err := Top(s, 1)
		if err != nil {
			return 0, err
		}
		return t[0] - l, nil
	}
	lo, hi := top[0], 1.0 // f(lo) >= 0 (Schur's lambda is at least the top), f(1) < 0
	for range 50 {
		mid := (lo + hi) / 2
		v, err := f(mid)
		if err != nil {
			return SplitResult{}, err
		}
		if v > 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	return SplitResult{Top: top[0], High: high[0], Schur: hi, Orders: [2]int{m, h}}, nil
}
