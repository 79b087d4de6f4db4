package relaxation

import (
	"errors"
	"math/big"
	"wedgebound/certificates"

	"wedgebound/interval"
)

func init() {
	registerFamily("step", family{
		start: stepStart,
		newF: func(like interval.F, p map[string]certificates.Decimal) (termSymbol[interval.F], error) {
			from, err := stepStart(p)
			if err != nil {
				return nil, err
			}
			return newBandTerm(like, from, nil)
		},
		newB: func(like interval.B, p map[string]certificates.Decimal) (termSymbol[interval.B], error) {
			from, err := stepStart(p)
			if err != nil {
				return nil, err
			}
			return newBandTerm(like, from, nil)
		},
	})
}

// stepStart reads the one parameter of the step h(xp) = 1 for xp > from
// (the band [from, inf), see bandTerm): its support starts at from.
func stepStart(p map[string]certificates.Decimal) (*big.Rat, error) {
	params := paramText(p)
	if len(params) != 1 || params["from"] == "" {
		return nil, errors.New(`the "step" family takes exactly the parameter from`)
	}
	return bandKnot("step", "from", params["from"])
}
