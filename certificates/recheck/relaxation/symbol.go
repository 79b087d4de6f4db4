package relaxation

import (
	"errors"
	"fmt"
	"math/big"
	"strings"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// Edge names the spectral edge a claim is about.
type Edge string

// The two edges.
const (
	Lower Edge = "lower"
	Upper Edge = "upper"
)

// Model is the verifier's own description of the symbol of the relaxation
// g = chi_Q + sum_j w_j h_j: the 2x2 Hermitian matrix
//
//	M(s) = [[A, B], [conj B, D]],  A = (1 + tanh(pi s))/2,
//	B = (i/2pi) J(s) + sum_j w_j conj(M_{+-,j}(s)),  D = sum_j w_j M_{++,j}(s),
//	J(s) = sum_{n>=0} (-1)^n/(n + 1/2 + is) = int_0^1 r^{-1/2+is}/(1+r) dr
//
// (derived in the regions package doc, "The quadrant"); the verifier sums
// the alternating series for J by Boole's formula with its own remainder
// bound (quadj.go), not through the digamma closed form the certifier uses.
type Model[T interval.Real[T]] struct {
	Edge    Edge
	like    T
	terms   []termSymbol[T]
	starts  []*big.Rat
	weights []T
	wRat    []*big.Rat
}

// ErrUnknownKind is wrapped by the error for a term of an unknown family.
var ErrUnknownKind = errors.New("unknown term kind")

// NewModel builds the model at the precision of like. It rejects unknown
// term kinds and parameters outside the supported ranges.
func NewModel[T interval.Real[T]](like T, edge Edge, terms []certificates.Term) (*Model[T], error) {
	if edge != Lower && edge != Upper {
		return nil, fmt.Errorf("edge must be %q or %q, not %q", Lower, Upper, edge)
	}
	m := &Model[T]{Edge: edge, like: like.Int(0)}
	for i, t := range terms {
		f, ok := families[t.Kind]
		if !ok {
			return nil, fmt.Errorf("terms[%d]: %w %q (this verifier knows: %s)", i, ErrUnknownKind, t.Kind, strings.Join(TermKinds(), ", "))
		}
		st, err := f.start(t.Params)
		if err != nil {
			return nil, fmt.Errorf("terms[%d]: %v", i, err)
		}
		e, err := newSymbol(f, like, t.Params)
		if err != nil {
			return nil, fmt.Errorf("terms[%d]: %v", i, err)
		}
		m.terms = append(m.terms, e)
		m.starts = append(m.starts, st)
		w := t.Weight.Rat()
		if w == nil {
			return nil, fmt.Errorf("terms[%d].weight: missing number", i)
		}
		wt, err := like.Decimal(t.Weight.String())
		if err != nil {
			return nil, err
		}
		m.weights = append(m.weights, wt)
		m.wRat = append(m.wRat, w)
	}
	return m, nil
}

// TermStart returns the infimum of xp over the support of term i's
// profile (its family's start).
func (m *Model[T]) TermStart(i int) *big.Rat { return new(big.Rat).Set(m.starts[i]) }

// entries is an enclosure of (A, D, B) over a set of s.
type entries[T interval.Real[T]] struct {
	A, D T
	B    interval.C[T]
}

// eig encloses lambda_min = (A+D)/2 - sqrt(((A-D)/2)^2 + |B|^2) (edge
// lower) or lambda_max (+) for every Hermitian matrix with entries in e.
func (e entries[T]) eig(edge Edge) T {
	h := e.A.Add(e.D).Scale(-1)
	g := e.A.Sub(e.D).Scale(-1)
	r := g.Sqr().Add(e.B.Abs2()).Sqrt()
	if edge == Upper {
		return h.Add(r)
	}
	return h.Sub(r)
}

// eigDeriv encloses d lambda/ds = h' -+ (g g' + Re(conj(B) B'))/R with
// h = (A+D)/2, g = (A-D)/2, R = sqrt(g^2 + |B|^2), given enclosures of the
// entries (v) and their derivatives (d) over a cell; Whole when R may
// vanish there (lambda need not be differentiable then).
func eigDeriv[T interval.Real[T]](v, d entries[T], edge Edge) T {
	g := v.A.Sub(v.D).Scale(-1)
	r := g.Sqr().Add(v.B.Abs2()).Sqrt()
	if r.Sign() <= 0 {
		return r.Whole()
	}
	hp := d.A.Add(d.D).Scale(-1)
	gp := d.A.Sub(d.D).Scale(-1)
	num := g.Mul(gp).Add(v.B.Re.Mul(d.B.Re)).Add(v.B.Im.Mul(d.B.Im))
	if edge == Upper {
		return hp.Add(num.Quo(r))
	}
	return hp.Sub(num.Quo(r))
}

// quadJ encloses J(s) = sum_n (-1)^n/(n + 1/2 + is) for every s in S, by
// Boole's summation formula (quadj.go).
func quadJ[T interval.Real[T]](S T) interval.C[T] { return booleSum(S, 0) }

// quadJDeriv encloses J'(s) = -i K(s), K(s) = sum_n (-1)^n/(n + 1/2 + is)^2,
// for every s in S (quadj.go).
func quadJDeriv[T interval.Real[T]](S T) interval.C[T] {
	k := booleSum(S, 1)
	return interval.C[T]{Re: k.Im, Im: k.Re.Neg()}
}

// quadB returns (i/2pi) J.
func quadB[T interval.Real[T]](J interval.C[T]) interval.C[T] {
	tp := J.Re.Pi().Scale(1)
	return interval.C[T]{Re: J.Im.Neg().Quo(tp), Im: J.Re.Quo(tp)}
}

// quadA encloses A(s) = (1 + tanh(pi s))/2 and A'(s) = (pi/2) sech^2(pi s).
func quadA[T interval.Real[T]](S T) (T, T) {
	ps := S.Pi().Mul(S)
	a := interval.Tanh(ps).Add(S.Int(1)).Scale(-1)
	ap := interval.Sech(ps).Sqr().Mul(S.Pi()).Scale(-1)
	return a, ap
}

// meet intersects two enclosures of the same quantity; if they are
// disjoint (which only a defect can cause) it returns their hull.
func meet[T interval.Real[T]](x, y T) T {
	if !x.IsFinite() {
		return y
	}
	if !y.IsFinite() {
		return x
	}
	lo := interval.Lower(x.Max(y))
	hi := interval.Upper(x.Min(y))
	if hi.Less(lo) {
		return x.Hull(y)
	}
	return lo.Hull(hi)
}

// PieceResult is the verifier's enclosure on one piece of a cell.
type PieceResult[T interval.Real[T]] struct {
	// Eig encloses the edge eigenvalue for every s of the piece.
	Eig T
	// Mid encloses it at the point Mid of the piece (a point of the piece).
	Mid   T
	MidAt T
}

// Piece encloses the edge eigenvalue over the exact piece [a, b], which
// must lie within one regime (see Pieces).
//
// Method: with c a point of the piece and delta >= |s - c| on it,
// lambda(s) in lambda(c) + lambda'(S) [-delta, delta] (mean value theorem;
// lambda is differentiable wherever R > 0, which eigDeriv checks), and
// this is intersected with the direct evaluation of lambda from the
// entries over the piece. The entries over the piece come from their
// values at c and enclosures of their derivatives (integral form of the
// mean value theorem, valid for complex values because the enclosures are
// convex rectangles) or, for A and D, from their closed forms.
func (m *Model[T]) Piece(a, b *big.Rat) (PieceResult[T], error) {
	like := m.like
	idx, ok := regimeIndex(a, b)
	if !ok {
		return PieceResult[T]{}, fmt.Errorf("piece [%s, %s] crosses a regime boundary or lies beyond |s| = 2^30", a.RatString(), b.RatString())
	}
	lo, err := checknum.Enclose(like, a)
	if err != nil {
		return PieceResult[T]{}, err
	}
	hi, err := checknum.Enclose(like, b)
	if err != nil {
		return PieceResult[T]{}, err
	}
	S := lo.Hull(hi)
	c := S.Mid()
	delta := interval.Upper(S.Sub(c).Abs())
	dInt := delta.Neg().Hull(delta)

	// Quadrant entries.
	Ac, _ := quadA(c)
	AS, dAS := quadA(S)
	Jc := quadJ(c)
	dJS := quadJDeriv(S)
	JS := Jc.Add(dJS.MulReal(dInt))
	pt := entries[T]{A: Ac, D: like.Int(0), B: quadB(Jc)}
	cell := entries[T]{A: AS, D: like.Int(0), B: quadB(JS)}
	der := entries[T]{A: dAS, D: like.Int(0), B: quadB(dJS)}
	for i, t := range m.terms {
		tp, tc, td, err := t.piece(idx, c, S, delta)
		if err != nil {
			return PieceResult[T]{}, err
		}
		w := m.weights[i]
		pt.D = pt.D.Add(w.Mul(tp.D))
		pt.B = pt.B.Add(tp.B.MulReal(w))
		cell.D = cell.D.Add(w.Mul(tc.D))
		cell.B = cell.B.Add(tc.B.MulReal(w))
		der.D = der.D.Add(w.Mul(td.D))
		der.B = der.B.Add(td.B.MulReal(w))
	}
	lc := pt.eig(m.Edge)
	direct := cell.eig(m.Edge)
	mv := lc.Add(eigDeriv(cell, der, m.Edge).Mul(dInt))
	return PieceResult[T]{Eig: meet(direct, mv), Mid: lc, MidAt: c}, nil
}

// Pieces splits the exact cell [a, b] at the regime boundaries (+-1, +-2,
// +-4, ..., +-2^30) it contains in its interior.
func Pieces(a, b *big.Rat) [][2]*big.Rat {
	var out [][2]*big.Rat
	cur := a
	for _, r := range regimeBreaks() {
		if r.Cmp(cur) > 0 && r.Cmp(b) < 0 {
			out = append(out, [2]*big.Rat{cur, r})
			cur = r
		}
	}
	return append(out, [2]*big.Rat{cur, b})
}

// Budget returns the largest quadrature and truncation terms added to any
// entry so far (each term's own largest, scaled by |w|); the tail lemmas
// and rounding add no separate term (interval arithmetic carries the
// rounding).
func (m *Model[T]) Budget() (certificates.Budget, error) {
	q, t := m.like.Int(0), m.like.Int(0)
	for i, e := range m.terms {
		bq, bt := e.budget()
		w := m.weights[i].Abs()
		q = q.Max(interval.Upper(bq.Mul(w)))
		t = t.Max(interval.Upper(bt.Mul(w)))
	}
	// An unbounded term records a huge one, 10^300.
	huge := "1" + strings.Repeat("0", 300)
	_, qs, err := interval.Decimals(q, 3)
	if err != nil {
		qs = huge
	}
	_, ts, err := interval.Decimals(t, 3)
	if err != nil {
		ts = huge
	}
	var b certificates.Budget
	var errs [4]error
	b.Quadrature, errs[0] = certificates.ParseDecimal(qs)
	b.Truncation, errs[1] = certificates.ParseDecimal(ts)
	b.Tails, errs[2] = certificates.ParseDecimal("0")
	b.Rounding, errs[3] = certificates.ParseDecimal("0")
	return b, errors.Join(errs[:]...)
}

// Entries encloses the entries A, D and B of M(s) at the exact point s
// (for cross-checks against other routes).
func (m *Model[T]) Entries(s *big.Rat) (A, D T, B interval.C[T], err error) {
	like := m.like
	idx, ok := regimeIndex(s, s)
	if !ok {
		return like, like, B, fmt.Errorf("s = %s lies beyond |s| = 2^30", s.RatString())
	}
	c, err := checknum.Enclose(like, s)
	if err != nil {
		return like, like, B, err
	}
	zero := like.Int(0)
	A, _ = quadA(c)
	D = zero
	B = quadB(quadJ(c))
	for i, t := range m.terms {
		pt, _, _, err := t.piece(idx, c, c, zero)
		if err != nil {
			return like, like, B, err
		}
		D = D.Add(m.weights[i].Mul(pt.D))
		B = B.Add(pt.B.MulReal(m.weights[i]))
	}
	return A, D, B, nil
}
