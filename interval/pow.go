package interval

import (
	"math"
	"math/big"
)

// Pow encloses x^y = exp(y log x) for every x in the first and y in the
// second argument. It is Whole when an argument is unbounded, when x is not
// strictly positive (x.Lo() <= 0), or when the result overflows.
//
// The product y log x is enclosed by interval multiplication (its exact
// range over the box, up to rounding) and Exp is increasing, so the result
// is the range of x^y over the box up to rounding. On B the logarithm and
// product are formed with extra bits for the magnitude of y log x, which
// turns an absolute error of the exponent into a relative error of the
// result.
func Pow[T Real[T]](x, y T) T {
	if !x.IsFinite() || !y.IsFinite() || x.Sign() != 1 {
		return x.Whole()
	}
	p := x.Prec()
	if y.Prec() > p {
		p = y.Prec()
	}
	extra := 8
	if !isFixed(x) {
		// An estimate of log2 |y log x| chooses the extra bits; it affects
		// only the width of the result.
		lx := math.Max(math.Abs(float64(bigLo(x).MantExp(nil))), math.Abs(float64(bigHi(x).MantExp(nil)))) + 1
		m := math.Max(math.Abs(y.Lo()), math.Abs(y.Hi())) * lx
		if m > 1 {
			extra += int(math.Ceil(math.Log2(m)))
		}
		if extra > 64 {
			extra = 64 // beyond this exp overflows anyway
		}
	}
	w := work(p, extra, 0)
	xw, yw := withPrec(x, w), withPrec(y, w)
	r := Exp(yw.Mul(Log(xw)))
	return withPrec(r, p)
}

// bigHi returns the exact upper endpoint of a finite x.
func bigHi[T Real[T]](x T) *big.Float {
	_, h := x.Endpoints()
	return h
}
