package interval

import "math/big"

// Real is the arithmetic an interval type provides. Every method returns an
// enclosure: the result contains op(x, y) for every x in the receiver and y
// in the argument. Binary operations work at the larger of the two
// precisions. Constructors (Int, Frac, Float, Decimal, Pi, Ln2, Whole) build
// values at the receiver's precision; the receiver's value is ignored.
type Real[T any] interface {
	Add(T) T
	Sub(T) T
	Mul(T) T
	// Quo returns Whole when the divisor contains zero.
	Quo(T) T
	Neg() T
	Abs() T
	Sqr() T
	// Sqrt returns Whole when the argument has a negative part below zero;
	// a lower endpoint that is negative only through rounding is clipped at 0
	// only when the upper endpoint is non-negative (sqrt of [-a, b] encloses
	// sqrt of [0, b], the real part of the domain).
	Sqrt() T
	// Scale returns x * 2^k.
	Scale(k int) T
	// Hull returns the smallest interval containing both operands.
	Hull(T) T
	Max(T) T
	Min(T) T
	// Pad returns [lo - e, hi + e] for a bound e >= 0; it is how quadrature
	// remainders and tail bounds are added to a result.
	Pad(e T) T

	// Lo and Hi are the endpoints rounded outward to float64.
	Lo() float64
	Hi() float64
	// Endpoints returns the exact endpoints (new values the caller owns);
	// nil, nil for Whole.
	Endpoints() (lo, hi *big.Float)
	// Mid returns a point interval at (approximately) the midpoint; it lies
	// inside the receiver.
	Mid() T
	// Rad returns an upper bound on the half-width, rounded up to float64.
	Rad() float64
	// Prec is the working precision in bits (53 for F).
	Prec() uint
	IsFinite() bool
	// Sign is 1 when the interval is strictly positive, -1 when strictly
	// negative and 0 otherwise (it contains zero or is not finite).
	Sign() int
	// Contains reports whether y lies inside the receiver.
	Contains(y T) bool
	// Less reports whether every point of the receiver is strictly below every
	// point of y.
	Less(y T) bool

	Int(n int64) T
	Frac(p, q int64) T
	// Float encloses the float64 v exactly.
	Float(v float64) T
	// Decimal encloses the decimal number in s (for example "-1.25e-3").
	Decimal(s string) (T, error)
	// Between returns the hull of the two exact values lo and hi.
	Between(lo, hi *big.Float) T
	Pi() T
	Ln2() T
	Whole() T
}

// Lower returns the point interval at x's lower endpoint (Whole for Whole).
func Lower[T Real[T]](x T) T {
	lo, _ := x.Endpoints()
	return x.Between(lo, lo)
}

// Upper returns the point interval at x's upper endpoint (Whole for Whole).
func Upper[T Real[T]](x T) T {
	_, hi := x.Endpoints()
	return x.Between(hi, hi)
}
