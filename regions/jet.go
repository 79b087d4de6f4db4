package regions

import (
	"fmt"

	"wedgebound/interval"
)

// Jets of a relaxation's symbol and eigenvalue: M(s), M'(s), M''(s) and
// lambda, lambda', lambda'' for the Newton route of the edges (package doc,
// "Edges to many digits").

// SymbolJet holds enclosures of M(s) (index 0), M'(s) (1) and M”(s) (2);
// entries above the order asked for are left zero.
type SymbolJet[T interval.Real[T]] [3]Symbol[T]

// TermJet encloses one term's symbol and its s-derivatives on a window of
// s prepared in advance (Jetter.JetOn).
type TermJet[T interval.Real[T]] interface {
	// Jet encloses M^(j) for j = 0..order (order at most the one the jet
	// was prepared for) for every s in the interval s, which must lie in
	// the window.
	Jet(s T, order int) SymbolJet[T]
}

// Jetter is implemented by terms whose symbol and its first two
// s-derivatives can be enclosed to the full precision of T (the
// exponential family).
type Jetter[T interval.Real[T]] interface {
	// JetOn prepares the jet up to order (1 or 2) for s in [lo, hi], with
	// remainders below about 2^-prec of T.
	JetOn(lo, hi float64, order int) (TermJet[T], error)
}

// QuadrantSymbolJet encloses the quadrant's A, B and D = 0 and their
// s-derivatives up to order for every s in s: A' = (pi/2) sech^2(pi s),
// A” = -pi^2 sech^2(pi s) tanh(pi s), B^(j) = (i/2pi) J^(j)(s) with J'
// and J” from trigamma and tetragamma (quadrant_jet.go).
func QuadrantSymbolJet[T interval.Real[T]](s T, order int) SymbolJet[T] {
	var m SymbolJet[T]
	zero := s.Int(0)
	for i := range m {
		m[i] = Symbol[T]{A: zero, D: zero, B: interval.RealC(zero)}
	}
	m[0] = Quadrant(s)
	if order < 1 {
		return m
	}
	pi := s.Pi()
	twoPi := pi.Scale(1)
	iOver2Pi := func(j interval.C[T]) interval.C[T] {
		return interval.C[T]{Re: j.Im.Neg().Quo(twoPi), Im: j.Re.Quo(twoPi)}
	}
	ps := pi.Mul(s)
	sech2 := interval.Sech(ps).Sqr()
	m[1] = Symbol[T]{A: sech2.Mul(pi).Scale(-1), D: zero, B: iOver2Pi(quadrantJPrime(s))}
	if order < 2 {
		return m
	}
	a2 := sech2.Mul(interval.Tanh(ps)).Mul(pi.Sqr()).Neg()
	m[2] = Symbol[T]{A: a2, D: zero, B: iOver2Pi(quadrantJSecond(s))}
	return m
}

// EigJetOf encloses lambda and its s-derivatives up to order (0..2) for the
// smallest (edge Lower) or largest (edge Upper) eigenvalue of the Hermitian
// symbol whose jet is m. With u = (A - D)/2, v = (A + D)/2 and
// R = sqrt(u^2 + |B|^2), lambda = v -+ R, and differentiating
// R^2 = u^2 + |B|^2 once and twice gives
//
//	R R'            = u u' + Re(conj B B'),
//	R'^2 + R R''    = u'^2 + u u'' + |B'|^2 + Re(conj B B'').
//
// Where the enclosure of R contains 0 the derivatives come out Whole.
func EigJetOf[T interval.Real[T]](m SymbolJet[T], e Edge, order int) EigJet[T] {
	sig := func(x T) T {
		if e == Upper {
			return x
		}
		return x.Neg()
	}
	u := m[0].A.Sub(m[0].D).Scale(-1)
	v := m[0].A.Add(m[0].D).Scale(-1)
	r := u.Sqr().Add(m[0].B.Abs2()).Sqrt()
	var out EigJet[T]
	out.L = v.Add(sig(r))
	if order < 1 {
		return out
	}
	reDot := func(x, y interval.C[T]) T { return x.Re.Mul(y.Re).Add(x.Im.Mul(y.Im)) }
	u1 := m[1].A.Sub(m[1].D).Scale(-1)
	v1 := m[1].A.Add(m[1].D).Scale(-1)
	r1 := u.Mul(u1).Add(reDot(m[0].B, m[1].B)).Quo(r)
	out.L1 = v1.Add(sig(r1))
	if order < 2 {
		return out
	}
	u2 := m[2].A.Sub(m[2].D).Scale(-1)
	v2 := m[2].A.Add(m[2].D).Scale(-1)
	num := u1.Sqr().Add(u.Mul(u2)).Add(m[1].B.Abs2()).Add(reDot(m[0].B, m[2].B)).Sub(r1.Sqr())
	out.L2 = v2.Add(sig(num.Quo(r)))
	return out
}

// RelaxationJet is the jet of g = chi_Q + sum_j w_j h_j on a window of s.
type RelaxationJet[T interval.Real[T]] struct {
	Jets    []TermJet[T]
	Weights []T
	// Lo and Hi are the window.
	Lo, Hi float64
}

// JetOn prepares the jet of the relaxation up to order on [lo, hi]; every
// term must implement Jetter.
func (r Relaxation[T]) JetOn(lo, hi float64, order int) (RelaxationJet[T], error) {
	out := RelaxationJet[T]{Weights: r.Weights, Lo: lo, Hi: hi}
	for i, t := range r.Terms {
		j, ok := t.(Jetter[T])
		if !ok {
			return out, fmt.Errorf("the %s term has no enclosure of its second derivative (only exp terms have)", t.Kind())
		}
		tj, err := j.JetOn(lo, hi, order)
		if err != nil {
			return out, fmt.Errorf("term %d (%s): %w", i, t.Kind(), err)
		}
		out.Jets = append(out.Jets, tj)
	}
	return out, nil
}

// HasJets reports whether every term of the relaxation implements Jetter.
func (r Relaxation[T]) HasJets() bool {
	for _, t := range r.Terms {
		if _, ok := t.(Jetter[T]); !ok {
			return false
		}
	}
	return true
}

// Symbol encloses M^(j), j = 0..order, for every s in s (inside the window).
func (r RelaxationJet[T]) Symbol(s T, order int) SymbolJet[T] {
	m := QuadrantSymbolJet(s, order)
	for i, j := range r.Jets {
		t := j.Jet(s, order)
		for k := 0; k <= order; k++ {
			m[k] = m[k].Add(t[k].Scaled(r.Weights[i]))
		}
	}
	return m
}

// Eig encloses lambda (edge Lower: smallest, Upper: largest eigenvalue)
// and its derivatives up to order for every s in s (inside the window).
func (r RelaxationJet[T]) Eig(s T, e Edge, order int) EigJet[T] {
	return EigJetOf(r.Symbol(s, order), e, order)
}
