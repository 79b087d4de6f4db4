package regions

import (
	"fmt"

	"wedgebound/interval"
)

func init() { registerFamily("step", newStepTerm[interval.F], newStepTerm[interval.B]) }

// newStepTerm builds the step h(xp) = 1 for xp > from on quadrant III: the
// band [from, inf) with a parameter list of finite numbers only (the form
// certificates use). Its support starts at from, so it is admissible for
// every geometry with threshold u0 <= from; the symbol is that of
// newUpperBand: D = A(s) - M_{++}[[0, from)], M_{+-} = -E(from, s).
func newStepTerm[T interval.Real[T]](like T, params map[string]string) (Term[T], error) {
	if len(params) != 1 || params["from"] == "" {
		return nil, fmt.Errorf("step term needs exactly the parameter from")
	}
	a, err := knot(params["from"], "step from")
	if err != nil {
		return nil, err
	}
	return newUpperBand(like, "step", map[string]string{"from": RatString(a)}, a), nil
}
