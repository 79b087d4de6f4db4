package regions

import (
	"fmt"
	"math/big"
	"sort"
	"strings"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// family is a registered relaxation family: its term constructor at both
// interval types.
type family struct {
	newF func(interval.F, map[string]string) (Term[interval.F], error)
	newB func(interval.B, map[string]string) (Term[interval.B], error)
}

var families = map[string]family{}

// registerFamily makes a family available to NewTerm and TermKinds. Each
// family's file calls it from init, with its generic constructor
// instantiated at both interval types.
func registerFamily(kind string, newF func(interval.F, map[string]string) (Term[interval.F], error), newB func(interval.B, map[string]string) (Term[interval.B], error)) {
	if _, dup := families[kind]; dup {
		panic("regions: family " + kind + " registered twice")
	}
	families[kind] = family{newF, newB}
}

// NewTerm builds the term of family kind with the given exact parameters
// (decimal strings) at the precision of like.
func NewTerm[T interval.Real[T]](like T, kind string, params map[string]string) (Term[T], error) {
	f, ok := families[kind]
	if !ok {
		return nil, fmt.Errorf("unknown term kind %q (known: %s)", kind, strings.Join(TermKinds(), ", "))
	}
	var t any
	var err error
	switch l := any(like).(type) {
	case interval.F:
		t, err = f.newF(l, params)
	case interval.B:
		t, err = f.newB(l, params)
	default:
		return nil, fmt.Errorf("term kind %q: no constructor for %T", kind, like)
	}
	if err != nil {
		return nil, err
	}
	return t.(Term[T]), nil
}

// TermKinds lists the registered families in increasing order.
func TermKinds() []string {
	k := make([]string, 0, len(families))
	for kind := range families {
		k = append(k, kind)
	}
	sort.Strings(k)
	return k
}

// Admissible checks, exactly, that a profile whose support starts at
// xp = start (Term.Start) vanishes on the image half-plane of a normal form
// with threshold (u0, ok) (Normal.Threshold or Threshold): ok must hold and
// start >= u0. The error names the family and both numbers.
func Admissible(kind, start string, u0 *big.Rat, ok bool) error {
	f, err := certificates.ParseFraction(start)
	if err != nil {
		return fmt.Errorf("start of the %s profile: %v", kind, err)
	}
	st := f.Rat()
	if !ok {
		return fmt.Errorf("the %s profile is not admissible: this geometry (d > 0, a b = 0) leaves no xp >= d^2/(4ab) of quadrant III free, so no profile vanishes on the image half-plane; certify the bare quadrant (no terms) instead", kind)
	}
	if st.Cmp(u0) < 0 {
		return fmt.Errorf("the %s profile is not admissible: it is nonzero from xp = %s on, but only profiles supported on xp >= d^2/(4ab) = %s vanish on the image half-plane", kind, RatString(st), RatString(u0))
	}
	return nil
}
