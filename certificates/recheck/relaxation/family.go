package relaxation

import (
	"fmt"

	"math/big"
	"sort"
	"wedgebound/certificates"

	"wedgebound/interval"
)

// termSymbol is the verifier's enclosure of one unit-weight relaxation
// term: its contributions to D and B of the symbol M(s).
type termSymbol[T interval.Real[T]] interface {
	// piece encloses (D, B) at the point c, over the cell S (which lies in
	// [c - delta, c + delta] and in regime idx, see regimeIndex), and the
	// s-derivatives (D', B') over S. The A fields are left 0.
	piece(idx int, c, S, delta T) (pt, cell, der entries[T], err error)
	// tailB is an upper bound of |B(s)| for every s with side*s >= S > 0.
	tailB(S T, side int) T
	// tailD encloses D(s) for every s with side*s >= S > 0.
	tailD(S T, side int) T
	// limitD is the limit of D(s) as s -> side*inf, exactly.
	limitD(side int) *big.Rat
	// budget returns the largest quadrature and truncation terms added to
	// any enclosure of the term so far.
	budget() (quad, trunc T)
}

// family is one relaxation family as the verifier knows it: where its
// profile's support starts, exactly, from the parameters (the
// admissibility test against the threshold d^2/(4ab)), and its symbol at
// both interval types. Each family is one file that registers itself.
type family struct {
	start func(params map[string]certificates.Decimal) (*big.Rat, error)
	newF  func(like interval.F, params map[string]certificates.Decimal) (termSymbol[interval.F], error)
	newB  func(like interval.B, params map[string]certificates.Decimal) (termSymbol[interval.B], error)
}

// families is the verifier's own registry of relaxation families; a family
// the certifier knows is accepted here only once the verifier has its own
// code for it.
var families = map[string]family{}

// registerFamily adds a family; each family's file calls it from init.
func registerFamily(kind string, f family) {
	if _, dup := families[kind]; dup {
		panic("relaxation: family " + kind + " registered twice")
	}
	families[kind] = f
}

// TermKinds lists the profile families the verifier knows.
func TermKinds() []string {
	k := make([]string, 0, len(families))
	for kind := range families {
		k = append(k, kind)
	}
	sort.Strings(k)
	return k
}

// newSymbol builds the term of family f at the precision of like.
func newSymbol[T interval.Real[T]](f family, like T, params map[string]certificates.Decimal) (termSymbol[T], error) {
	var t any
	var err error
	switch l := any(like).(type) {
	case interval.F:
		t, err = f.newF(l, params)
	case interval.B:
		t, err = f.newB(l, params)
	default:
		return nil, fmt.Errorf("no term constructor for %T", like)
	}
	if err != nil {
		return nil, err
	}
	return t.(termSymbol[T]), nil
}

// paramText returns the parameters as their recorded text.
func paramText(p map[string]certificates.Decimal) map[string]string {
	out := make(map[string]string, len(p))
	for k, v := range p {
		out[k] = v.String()
	}
	return out
}
