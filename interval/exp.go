package interval

import (
	"math"
	"math/big"
)

// expMaxArg bounds the arguments Exp evaluates: above it the result is
// Whole (overflow), below its negative the lower bound is 0. It keeps every
// intermediate (including squares of exp(-expMaxArg)) inside the exponent
// range of math/big.
const expMaxArg = 7e8

// expSteps is the number of halvings r -> r/2 before the Taylor series (and
// squarings after it). F has no guard bits, so it does none.
func expSteps(p uint, fixed bool) int {
	if fixed {
		return 0
	}
	return int(isqrt(2 * p))
}

// Exp encloses exp(x): the result contains exp(v) for every v in x. It is
// Whole when x is unbounded or reaches above 7e8, or when the result
// overflows the type's range (F: above about 709.78); for arguments below
// -7e8 the lower bound is 0.
//
// Method: x = k ln2 + r with |r| <= ln2/2 + tiny, then exp(r) =
// (exp(r/2^s))^(2^s), with the Taylor series for exp(r/2^s) whose tail after
// the term T_n is at most 2|T_n| (the term ratio is below 1/2), and the
// result is scaled by 2^k exactly.
func Exp[T Real[T]](x T) T {
	if !x.IsFinite() || x.Hi() > expMaxArg {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	r := expThin(lo)
	if !thin {
		r = r.Hull(expThin(hi))
	}
	if !r.IsFinite() {
		return x.Whole()
	}
	return withPrec(r.Max(x.Int(0)), x.Prec())
}

// expThin encloses exp(a) for a point a <= expMaxArg at a working precision
// at least a's.
func expThin[T Real[T]](a T) T {
	v := a.Lo()
	if v < -expMaxArg {
		// exp is increasing: 0 < exp(a) <= exp(-expMaxArg).
		return a.Int(0).Hull(expThin(a.Int(-expMaxArg)))
	}
	p := a.Prec()
	fixed := isFixed(a)
	s := expSteps(p, fixed)
	k := int64(math.Round(v / math.Ln2))
	w := withPrec(a, work(p, s+20, bitLen64(k)))
	var r T
	if f, ok := any(a).(F); ok {
		// F: a two-part ln 2 keeps r accurate; B if its checks fail.
		if rf, ok := cwLn2.reduceF(f.lo, k); ok {
			r = any(rf).(T)
		} else {
			r = fromB(w, reduceB(bigLo(a), big.NewInt(k), B.Ln2, 53+64+uint(bitLen64(k))))
		}
	} else if k == 0 {
		r = w
	} else {
		r = w.Sub(w.Int(k).Mul(w.Ln2()))
	}
	e := expKernel(r, s)
	e = e.Scale(int(k))
	if !e.IsFinite() {
		return a.Whole()
	}
	return e
}

// expKernel encloses exp(r) for an interval r with |r| <= 1/2, using s
// halvings and squarings.
func expKernel[T Real[T]](r T, s int) T {
	one := r.Int(1)
	if !r.Abs().Less(one) {
		return r.Whole()
	}
	h := r.Scale(-s)
	// Taylor: sum_{n>=0} h^n/n!. For |h| <= 1 and n >= 1 the ratio of
	// consecutive tail terms is |h|/(m+1) <= 1/2, so the tail from T_n on is
	// at most 2|T_n|; T_n is enclosed as an interval over all h in r.
	lr := log2Mag(h)
	n := seriesLen(r.Prec(), func(n int) float64 { return float64(n)*lr - log2Fact(n) })
	sum, term := one, one
	for k := int64(1); k < n; k++ {
		term = term.Mul(h).Quo(r.Int(k))
		sum = sum.Add(term)
	}
	term = term.Mul(h).Quo(r.Int(n)) // T_n, the first omitted term
	sum = sum.Pad(term.Scale(1))
	for i := 0; i < s; i++ {
		sum = sum.Sqr()
	}
	return sum
}

// Expm1 encloses exp(x) - 1 for every x in the argument, with small relative
// width near 0. Whole under the same conditions as Exp.
//
// Method: for |x| < 1/2 the series sum_{n>=1} h^n/n! at h = x/2^s (tail at
// most twice the first omitted term) followed by s doublings
// E(2h) = E(h) (E(h) + 2), which keep the relative error; otherwise
// exp(x) - 1.
func Expm1[T Real[T]](x T) T {
	if !x.IsFinite() || x.Hi() > expMaxArg {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	r := expm1Thin(lo)
	if !thin {
		r = r.Hull(expm1Thin(hi))
	}
	if !r.IsFinite() {
		return x.Whole()
	}
	return withPrec(r.Max(x.Int(-1)), x.Prec())
}

// expm1Thin encloses exp(a) - 1 for a point a <= expMaxArg.
func expm1Thin[T Real[T]](a T) T {
	if !a.Abs().Less(a.Frac(1, 2)) {
		e := expThin(a)
		return e.Sub(a.Int(1)).Max(a.Int(-1))
	}
	p := a.Prec()
	s := expSteps(p, isFixed(a))
	w := withPrec(a, work(p, s+20, 0))
	h := w.Scale(-s)
	// Terms T_n = h^n/n! for n >= 1; the tail from T_n (n >= 2) on is at
	// most 2|T_n| because the term ratio |h|/(m+1) is below 1/2.
	lr := log2Mag(h)
	n := seriesLen(w.Prec(), func(n int) float64 { return float64(n)*lr - log2Fact(n+1) }) + 1
	sum, term := h, h
	for k := int64(2); k < n; k++ {
		term = term.Mul(h).Quo(w.Int(k))
		sum = sum.Add(term)
	}
	term = term.Mul(h).Quo(w.Int(n))
	sum = sum.Pad(term.Scale(1))
	two := w.Int(2)
	for i := 0; i < s; i++ {
		sum = sum.Mul(sum.Add(two))
	}
	return sum.Max(w.Int(-1))
}

// E encloses Euler's number e = exp(1) at the receiver's precision (the
// receiver's value is ignored).
func E[T Real[T]](x T) T {
	return Exp(x.Int(1))
}
