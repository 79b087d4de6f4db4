package relaxation

import (
	"math/big"

	"wedgebound/certificates"
	"wedgebound/regions"
)

// DefaultExpRates are the decay rates k of the default exponential
// profiles e^{-k xp}, for geometries whose threshold is 0.
var DefaultExpRates = []string{"0.1", "0.2848", "0.8111", "2.31", "6.579", "18.74", "53.37", "152", "432.9", "1233", "3511", "10000"}

// DefaultTerms returns the default relaxation family for a geometry with
// threshold (u0, ok) (regions.Normal.Threshold), weights left to the
// search:
//
//   - u0 = 0: the exponential profiles of DefaultExpRates;
//   - u0 > 0: the bands [k0, 2 k0) and [2 k0, 4 k0) and the step
//     xp > 4 k0, k0 = u0 rounded up to 6 significant decimal digits (the
//     knots must be decimals and at least u0), or only the step xp > k0
//     when 4 k0 would exceed 64 (the verifier's range of knots);
//   - no threshold (d > 0 = a b): nothing (the bare quadrant).
//
// Every term returned is admissible for the geometry.
func DefaultTerms(u0 *big.Rat, ok bool) []certificates.Term {
	if !ok {
		return nil
	}
	if u0.Sign() == 0 {
		var t []certificates.Term
		for _, k := range DefaultExpRates {
			t = append(t, certificates.Term{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal(k)}})
		}
		return t
	}
	k0 := decimalUp(u0, 6)
	if new(big.Rat).Mul(k0, big.NewRat(4, 1)).Cmp(big.NewRat(64, 1)) > 0 {
		return []certificates.Term{{Kind: "step", Params: map[string]certificates.Decimal{"from": dec(k0)}}}
	}
	k1 := new(big.Rat).Mul(k0, big.NewRat(2, 1))
	k2 := new(big.Rat).Mul(k0, big.NewRat(4, 1))
	return []certificates.Term{
		{Kind: "band", Params: map[string]certificates.Decimal{"from": dec(k0), "to": dec(k1)}},
		{Kind: "band", Params: map[string]certificates.Decimal{"from": dec(k1), "to": dec(k2)}},
		{Kind: "step", Params: map[string]certificates.Decimal{"from": dec(k2)}},
	}
}

// dec writes a finite decimal (decimalUp's results are).
func dec(r *big.Rat) certificates.Decimal {
	return certificates.MustDecimal(regions.RatString(r))
}

// decimalUp returns the least decimal with at most digits significant
// digits that is >= r > 0.
func decimalUp(r *big.Rat, digits int) *big.Rat {
	// scale = 10^e with 10^(digits-1) <= r * scale < 10^digits.
	scale := big.NewRat(1, 1)
	lo := new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(digits-1)), nil))
	hi := new(big.Rat).Mul(lo, big.NewRat(10, 1))
	x := new(big.Rat).Set(r)
	for x.Cmp(lo) < 0 {
		x.Mul(x, big.NewRat(10, 1))
		scale.Mul(scale, big.NewRat(10, 1))
	}
	for x.Cmp(hi) >= 0 {
		x.Quo(x, big.NewRat(10, 1))
		scale.Quo(scale, big.NewRat(10, 1))
	}
	q, m := new(big.Int).QuoRem(x.Num(), x.Denom(), new(big.Int))
	if m.Sign() != 0 {
		q.Add(q, big.NewInt(1))
	}
	return new(big.Rat).Quo(new(big.Rat).SetInt(q), scale)
}
