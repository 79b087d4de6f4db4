package checknum

import (
	"math/big"

	"wedgebound/interval"
)

// RatDecimal writes r as a decimal with 6 significant digits, rounded up
// (r is first rounded up to 512 bits, so the result is >= r).
func RatDecimal(r *big.Rat) string {
	f := new(big.Float).SetPrec(512).SetMode(big.ToPositiveInf).SetRat(r)
	return interval.DecimalUp(f, 6)
}

// Enclose returns an enclosure of the rational r at the precision of like,
// or the error of the interval library's exact-decimal reader.
func Enclose[T interval.Real[T]](like T, r *big.Rat) (T, error) {
	return like.Decimal(r.RatString())
}
