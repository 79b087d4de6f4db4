package regions

import (
	"wedgebound/interval"
)

// Symbol is an enclosure of the 2x2 Hermitian Mellin symbol
// M(s) = [[A, B], [conj B, D]] over a set of s: channel + (x > 0) is the
// first row, channel - (x < 0) the second.
type Symbol[T interval.Real[T]] struct {
	A, D T
	B    interval.C[T]
}

// Add returns the entrywise sum.
func (m Symbol[T]) Add(n Symbol[T]) Symbol[T] {
	return Symbol[T]{A: m.A.Add(n.A), D: m.D.Add(n.D), B: m.B.Add(n.B)}
}

// Scaled returns w * m for a real weight w.
func (m Symbol[T]) Scaled(w T) Symbol[T] {
	return Symbol[T]{A: m.A.Mul(w), D: m.D.Mul(w), B: m.B.MulReal(w)}
}

// MinEig encloses lambda_min = (A+D)/2 - sqrt(((A-D)/2)^2 + |B|^2) for every
// Hermitian matrix with entries in the enclosures.
func (m Symbol[T]) MinEig() T {
	h := m.A.Add(m.D).Scale(-1)
	return h.Sub(m.radius())
}

// MaxEig encloses lambda_max = (A+D)/2 + sqrt(((A-D)/2)^2 + |B|^2).
func (m Symbol[T]) MaxEig() T {
	h := m.A.Add(m.D).Scale(-1)
	return h.Add(m.radius())
}

func (m Symbol[T]) radius() T {
	g := m.A.Sub(m.D).Scale(-1)
	return g.Sqr().Add(m.B.Abs2()).Sqrt()
}

// EigSlope encloses d lambda/ds for lambda_min (edge Lower) or lambda_max
// (edge Upper), given enclosures m of M and dm of dM/ds over the same set:
// lambda' = (A'+D')/2 -/+ [((A-D)/2)((A'-D')/2) + Re(conj(B) B')]/R with
// R = sqrt(((A-D)/2)^2 + |B|^2). Where R may vanish the result is Whole.
func EigSlope[T interval.Real[T]](m, dm Symbol[T], e Edge) T {
	g := m.A.Sub(m.D).Scale(-1)
	gp := dm.A.Sub(dm.D).Scale(-1)
	num := g.Mul(gp).Add(m.B.Re.Mul(dm.B.Re)).Add(m.B.Im.Mul(dm.B.Im))
	rp := num.Quo(m.radius())
	h := dm.A.Add(dm.D).Scale(-1)
	if e == Upper {
		return h.Add(rp)
	}
	return h.Sub(rp)
}

// Eig encloses lambda_min (edge Lower) or lambda_max (edge Upper).
func (m Symbol[T]) Eig(e Edge) T {
	if e == Upper {
		return m.MaxEig()
	}
	return m.MinEig()
}

// Term is one relaxation region of unit weight: a real profile h(xp) on
// quadrant III. Its symbol has A = 0 and contributes to D and B. A new
// family is one new file implementing Term and registering a decoder.
type Term[T interval.Real[T]] interface {
	// Kind names the family ("exp", ...).
	Kind() string
	// Params returns the exact parameters as decimal strings, by name.
	Params() map[string]string
	// Start returns the infimum of xp over the support of the profile (for
	// the admissibility test against Normal.Threshold), as a decimal string.
	Start() string
	// Enclose returns the unit-weight symbol (A = 0) enclosed for every s in
	// the interval s.
	Enclose(s T) Symbol[T]
	// Slope returns an enclosure of dM/ds (A' = 0) for every s in s.
	Slope(s T) Symbol[T]
	// Tail returns upper bounds dmax >= |D(s)| and bmax >= |B(s)| valid for
	// every s >= S (side +1) or every s <= -S (side -1), for S >= 1.
	Tail(S T, side int) (dmax, bmax T)
	// Budget returns upper bounds on the largest quadrature remainder and
	// truncation error added to any enclosure so far (0 for closed forms).
	Budget() (quadrature, truncation float64)
	// Approx returns float64 values of D(s) and B(s) (not certified; for the
	// candidate search).
	Approx(s float64) (d float64, b complex128)
}
