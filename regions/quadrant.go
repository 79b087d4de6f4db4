package regions

import "wedgebound/interval"

// Quadrant encloses the Mellin symbol of the quadrant Q = {x > 0, p > 0}
// for every s in the interval s:
//
//	A(s) = (1 + tanh(pi s))/2,  D(s) = 0,  B(s) = (i/2pi) J(s),
//	J(s) = (1/2) [digamma(3/4 + is/2) - digamma(1/4 + is/2)],
//
// the last being the closed form of J(s) = sum_n (-1)^n/(n + 1/2 + is) =
// int_0^1 r^{-1/2+is}/(1+r) dr (split the alternating sum into even and odd
// n and use digamma(z) = -gamma + sum_n [1/(n+1) - 1/(n+z)]).
func Quadrant[T interval.Real[T]](s T) Symbol[T] {
	pi := s.Pi()
	a := interval.Tanh(pi.Mul(s)).Add(s.Int(1)).Scale(-1)
	j := quadrantJ(s)
	// B = (i/2pi) J = (-Im J + i Re J)/(2 pi).
	twoPi := pi.Scale(1)
	b := interval.C[T]{Re: j.Im.Neg().Quo(twoPi), Im: j.Re.Quo(twoPi)}
	return Symbol[T]{A: a, D: s.Int(0), B: b}
}

// quadrantJ encloses J(s) for every s in the interval.
func quadrantJ[T interval.Real[T]](s T) interval.C[T] {
	half := s.Scale(-1)
	z1 := interval.C[T]{Re: s.Frac(3, 4), Im: half}
	z2 := interval.C[T]{Re: s.Frac(1, 4), Im: half}
	return interval.Digamma(z1).Sub(interval.Digamma(z2)).Scale(-1)
}

// quadrantJPrime encloses J'(s) = (i/4) [trigamma(3/4 + is/2) - trigamma(1/4 + is/2)].
func quadrantJPrime[T interval.Real[T]](s T) interval.C[T] {
	half := s.Scale(-1)
	z1 := interval.C[T]{Re: s.Frac(3, 4), Im: half}
	z2 := interval.C[T]{Re: s.Frac(1, 4), Im: half}
	d := interval.Trigamma(z1).Sub(interval.Trigamma(z2)).Scale(-2)
	return interval.C[T]{Re: d.Im.Neg(), Im: d.Re}
}

// QuadrantEig encloses lambda(s) for every s in the interval, with lambda the
// smallest (edge Lower) or largest (edge Upper) eigenvalue of the quadrant
// symbol, by the mean-value form lambda(X) in lambda(c) + lambda'(X)(X - c)
// with c the midpoint of X. Its width is of order |lambda'| w + lambda” w^2
// for a cell of width w, so it is tight near an extremum; it falls back to
// the direct enclosure when the mean-value form is not finite.
func QuadrantEig[T interval.Real[T]](s T, e Edge) T {
	c := s.Mid()
	v := Quadrant(c).Eig(e)
	d := quadrantEigPrime(s, e)
	mv := v.Add(d.Mul(s.Sub(c)))
	if !mv.IsFinite() {
		return Quadrant(s).Eig(e)
	}
	return mv
}

// quadrantEigPrime encloses lambda'(s) over the interval s, where
// lambda = A/2 -/+ R, R = sqrt(A^2/4 + beta), beta = |J|^2/(4 pi^2):
// lambda' = A'/2 -/+ (A A'/2 + beta')/(2R), A' = (pi/2) sech^2(pi s),
// beta' = 2 Re(conj(J) J')/(4 pi^2).
func quadrantEigPrime[T interval.Real[T]](s T, e Edge) T {
	pi := s.Pi()
	a := interval.Tanh(pi.Mul(s)).Add(s.Int(1)).Scale(-1)
	ap := interval.Sech(pi.Mul(s)).Sqr().Mul(pi).Scale(-1)
	j := quadrantJ(s)
	jp := quadrantJPrime(s)
	fourPi2 := pi.Sqr().Scale(2)
	beta := j.Abs2().Quo(fourPi2)
	betap := j.Re.Mul(jp.Re).Add(j.Im.Mul(jp.Im)).Scale(1).Quo(fourPi2)
	r := a.Sqr().Scale(-2).Add(beta).Sqrt()
	rp := a.Mul(ap).Scale(-1).Add(betap).Quo(r.Scale(1))
	if e == Upper {
		return ap.Scale(-1).Add(rp)
	}
	return ap.Scale(-1).Sub(rp)
}

// QuadrantTail bounds the quadrant symbol for |s| >= S, S > 0:
// |B(s)| <= 1/(8 |1/2 + i s|) <= 1/(8 S), and A(s) lies in
// [(1 + tanh(pi S))/2, 1] for s >= S and in [0, (1 - tanh(pi S))/2] for
// s <= -S.
//
// Lemma (|J(s)| <= pi/(4 |1/2 + is|)). With a = 1/2 + is,
// J = int_0^1 r^{a-1}/(1+r) dr; integrating r^{a-1} by parts gives
// J = 1/(2a) + (1/a) int_0^1 r^a/(1+r)^2 dr, and |r^a| = r^{1/2}, while
// int_0^1 r^{1/2}/(1+r)^2 dr = pi/4 - 1/2 (substitute r = t^2). Hence
// |J| <= (1/2 + pi/4 - 1/2)/|a| = pi/(4|a|), and |B| = |J|/(2 pi) <= 1/(8|a|).
func QuadrantTail[T interval.Real[T]](S T, side int) (a T, bmax T) {
	bmax = S.Int(1).Quo(S.Scale(3))
	t := interval.Tanh(S.Pi().Mul(S))
	one := S.Int(1)
	if side > 0 {
		return one.Add(t).Scale(-1).Hull(one), bmax
	}
	return one.Sub(t).Scale(-1).Hull(S.Int(0)), bmax
}

// tailRanger is implemented by terms whose D does not tend to 0 at both
// ends (the band [a, inf) tends to 1 as s -> +inf): TailD encloses D(s)
// for every side*s >= S, sharper than the box [-dmax, dmax].
type tailRanger[T interval.Real[T]] interface {
	TailD(S T, side int) T
}

// TailSymbol returns, for every s with side*s >= S (S >= 1), an enclosure
// of a matrix with the same eigenvalues as M(s): A from QuadrantTail, D in
// sum_j w_j [-dmax_j, dmax_j] (or w_j TailD_j where a term provides it),
// and B replaced by |B| in [0, bm] (the eigenvalues depend on B only
// through |B|), where bm = 1/(8S) + sum |w_j| bmax_j from the terms' tail
// lemmas.
func TailSymbol[T interval.Real[T]](S T, side int, terms []Term[T], weights []T) Symbol[T] {
	a, bm := QuadrantTail(S, side)
	box := S.Int(0)
	for i, t := range terms {
		d, b := t.Tail(S, side)
		w := weights[i].Abs()
		bm = bm.Add(w.Mul(b))
		if r, ok := t.(tailRanger[T]); ok {
			box = box.Add(r.TailD(S, side).Mul(weights[i]))
		} else {
			dm := w.Mul(d)
			box = box.Add(dm.Neg().Hull(dm))
		}
	}
	return Symbol[T]{A: a, D: box, B: interval.C[T]{Re: S.Int(0).Hull(bm), Im: S.Int(0)}}
}

// QuadrantSlope encloses dM/ds of the quadrant for every s in s:
// A' = (pi/2) sech^2(pi s), D' = 0, B' = (i/2pi) J'(s).
func QuadrantSlope[T interval.Real[T]](s T) Symbol[T] {
	pi := s.Pi()
	ap := interval.Sech(pi.Mul(s)).Sqr().Mul(pi).Scale(-1)
	jp := quadrantJPrime(s)
	twoPi := pi.Scale(1)
	b := interval.C[T]{Re: jp.Im.Neg().Quo(twoPi), Im: jp.Re.Quo(twoPi)}
	return Symbol[T]{A: ap, D: s.Int(0), B: b}
}

// Relaxation is the symbol of g = chi_Q + sum_j w_j h_j. A Relaxation
// built by NewRelaxation evaluates its exponential terms together on
// shared path nodes (expshare.go); one given as a literal evaluates each
// term on its own. Both enclose the same symbol.
type Relaxation[T interval.Real[T]] struct {
	Terms   []Term[T]
	Weights []T

	sum    *expSum[T] // the exponential terms, if shared
	others []int      // the terms not in sum
}

// NewRelaxation returns the relaxation with these terms and weights, its
// exponential terms sharing their quadrature nodes (see NewGroup; the
// terms take the shared layouts from now on).
func NewRelaxation[T interval.Real[T]](terms []Term[T], weights []T) Relaxation[T] {
	r := Relaxation[T]{Terms: terms, Weights: weights}
	g := NewGroup(terms)
	if g.exp == nil || len(weights) != len(terms) {
		return r
	}
	sum := &expSum[T]{g: g.exp, regimes: map[int]*sumRegime[T]{}}
	in := map[int]bool{}
	for _, at := range g.expAt {
		sum.w = append(sum.w, weights[at])
		in[at] = true
	}
	for i := range terms {
		if !in[i] {
			r.others = append(r.others, i)
		}
	}
	r.sum = sum
	return r
}

// Enclose encloses M(s) for every s in the interval s.
func (r Relaxation[T]) Enclose(s T) Symbol[T] {
	if r.sum != nil {
		m, _ := r.encloseShared(s, false)
		return m
	}
	m := Quadrant(s)
	for i, t := range r.Terms {
		m = m.Add(t.Enclose(s).Scaled(r.Weights[i]))
	}
	return m
}

// encloseShared is Enclose and, if slope, Slope of a shared relaxation,
// from one set of exponentials.
func (r Relaxation[T]) encloseShared(s T, slope bool) (Symbol[T], Symbol[T]) {
	v, d := r.sum.enclose(s, slope)
	m := Quadrant(s).Add(v)
	for _, i := range r.others {
		m = m.Add(r.Terms[i].Enclose(s).Scaled(r.Weights[i]))
	}
	if !slope {
		return m, Symbol[T]{}
	}
	dm := QuadrantSlope(s).Add(d)
	for _, i := range r.others {
		dm = dm.Add(r.Terms[i].Slope(s).Scaled(r.Weights[i]))
	}
	return m, dm
}

// Slope encloses dM/ds for every s in s.
func (r Relaxation[T]) Slope(s T) Symbol[T] {
	if r.sum != nil {
		_, dm := r.encloseShared(s, true)
		return dm
	}
	m := QuadrantSlope(s)
	for i, t := range r.Terms {
		m = m.Add(t.Slope(s).Scaled(r.Weights[i]))
	}
	return m
}

// Eig encloses lambda(s) (lambda_min for edge Lower, lambda_max for edge
// Upper) for every s in the interval s by the mean-value form
// lambda(c) + lambda'(s)(s - c), c the midpoint, falling back to the direct
// enclosure when that is narrower or the slope is unbounded.
func (r Relaxation[T]) Eig(s T, e Edge) T {
	var m, dm Symbol[T]
	if r.sum != nil {
		m, dm = r.encloseShared(s, true)
	} else {
		m, dm = r.Enclose(s), r.Slope(s)
	}
	direct := m.Eig(e)
	c := s.Mid()
	v := r.Enclose(c).Eig(e)
	d := EigSlope(m, dm, e)
	mv := v.Add(d.Mul(s.Sub(c)))
	if !mv.IsFinite() || mv.Rad() >= direct.Rad() {
		return direct
	}
	return mv
}

// Tail encloses M(s) for every s with side*s >= S.
func (r Relaxation[T]) Tail(S T, side int) Symbol[T] {
	return TailSymbol(S, side, r.Terms, r.Weights)
}
