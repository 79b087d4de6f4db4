package regions

import (
	"fmt"
	"sort"
	"strings"

	"wedgebound/interval"
)

// NewTerm builds the term of family kind with the given exact parameters
// (decimal strings) at the precision of like.
func NewTerm[T interval.Real[T]](like T, kind string, params map[string]string) (Term[T], error) {
	switch kind {
	case "exp":
		return newExpTerm(like, params)
	case "band":
		return newBandTerm(like, params)
	case "hat":
		return newHatTerm(like, params)
	}
	return nil, fmt.Errorf("unknown term kind %q (known: %s)", kind, strings.Join(TermKinds(), ", "))
}

// TermKinds lists the known families.
func TermKinds() []string {
	k := []string{"exp", "band", "hat"}
	sort.Strings(k)
	return k
}
