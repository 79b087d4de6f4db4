package checknum

import (
	"math/big"

	"wedgebound/interval"
)

// RatText writes r as an exact decimal when it terminates, else as p/q
// (which certificates.Dec rejects, so callers use terminating values).
func RatText(r *big.Rat) string {
	for d := 0; d <= 60; d++ {
		s := r.FloatString(d)
		if t, ok := new(big.Rat).SetString(s); ok && t.Cmp(r) == 0 {
			return s
		}
	}
	return r.RatString()
}

// RatDecimal writes r as a decimal with 6 significant digits, rounded up.
func RatDecimal(r *big.Rat) string {
	f := new(big.Float).SetPrec(200).SetRat(r)
	return interval.DecimalUp(f, 6)
}

// Enclose returns an enclosure of the rational r at the precision of like,
// or the error of the interval library's exact-decimal reader.
func Enclose[T interval.Real[T]](like T, r *big.Rat) (T, error) {
	return like.Decimal(r.RatString())
}
