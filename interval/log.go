package interval

import (
	"math"
	"math/big"
)

// logSteps is the number of square-root halvings x -> x/(1+sqrt(1+x)) before
// the atanh series.
func logSteps(p uint, fixed bool) int {
	if fixed {
		return 2
	}
	// A halving costs about six series terms (it needs a square root and a
	// division), which puts the balance near 0.3 sqrt(p) - 2.
	s := int(0.3*math.Sqrt(float64(p))) - 2
	if s < 1 {
		s = 1
	}
	return s
}

// Log encloses the natural logarithm: the result contains log(v) for every v
// in x. It is Whole when x is unbounded or its lower endpoint is <= 0 (the
// logarithm is then undefined or unbounded below).
//
// Method: v = m 2^e with m in [1/sqrt2, sqrt2), log v = e ln2 + log1p(m-1);
// see Log1p for the kernel.
func Log[T Real[T]](x T) T {
	if !x.IsFinite() || x.Sign() != 1 {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	r := logThin(lo)
	if !thin {
		r = r.Hull(logThin(hi))
	}
	return withPrec(r, x.Prec())
}

var sqrtHalf = big.NewFloat(math.Sqrt2 / 2)

// logThin encloses log(a) for a positive point a.
func logThin[T Real[T]](a T) T {
	p := a.Prec()
	fixed := isFixed(a)
	s := logSteps(p, fixed)
	w := withPrec(a, work(p, s+20, 0))
	var m T
	var e int
	if f, ok := any(a).(F); ok {
		fr, ex := math.Frexp(f.lo)
		if fr < math.Sqrt2/2 {
			fr, ex = fr*2, ex-1
		}
		m, e = any(PointF(fr)).(T), ex
	} else {
		mant := new(big.Float)
		e = bigLo(a).MantExp(mant)
		if mant.Cmp(sqrtHalf) < 0 {
			mant.SetMantExp(mant, 1)
			e--
		}
		m = w.Between(mant, mant)
	}
	// m in [0.707, 1.415): the threshold only needs to be near 1/sqrt2.
	r := log1pKernel(withPrec(m, w.Prec()).Sub(w.Int(1)), s)
	if e != 0 {
		r = r.Add(w.Int(int64(e)).Mul(w.Ln2()))
	}
	return r
}

// Log1p encloses log(1 + x) for every x in the argument, with small relative
// width near 0. It is Whole when x is unbounded or its lower endpoint is
// <= -1.
//
// Method: for |x| <= 1/2, s halvings x -> x/(1+sqrt(1+x)) (each halves
// log1p exactly: log1p(x) = 2 log1p(x/(1+sqrt(1+x)))), then
// log1p(x) = 2 atanh(t), t = x/(2+x), by the series 2 sum t^(2n+1)/(2n+1)
// whose tail after the term T_n is at most |T_n|/(1-t^2) <= 2|T_n|.
// Otherwise Log(1 + x).
func Log1p[T Real[T]](x T) T {
	if !x.IsFinite() || !x.Int(-1).Less(x) {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	r := log1pThin(lo)
	if !thin {
		r = r.Hull(log1pThin(hi))
	}
	return withPrec(r, x.Prec())
}

func log1pThin[T Real[T]](a T) T {
	if !a.Abs().Less(a.Frac(1, 2)) {
		p := a.Prec()
		w := withPrec(a, work(p, 8, 0))
		return Log(w.Add(w.Int(1))) // 1 + a may be rounded: use the interval Log

	}
	p := a.Prec()
	s := logSteps(p, isFixed(a))
	return log1pKernel(withPrec(a, work(p, s+20, 0)), s)
}

// log1pKernel encloses log(1+x) for an interval x with |x| <= 1/2.
func log1pKernel[T Real[T]](x T, s int) T {
	one, two := x.Int(1), x.Int(2)
	if !x.Abs().Less(x.Frac(1, 2).Add(x.Frac(1, 64))) {
		return x.Whole()
	}
	for i := 0; i < s; i++ {
		x = x.Quo(one.Add(one.Add(x).Sqrt()))
	}
	t := x.Quo(two.Add(x))
	t2 := t.Sqr()
	if !t2.Less(x.Frac(1, 2)) {
		return x.Whole()
	}
	lr := log2Mag(t)
	n := seriesLen(x.Prec(), func(n int) float64 { return 2*float64(n)*lr - math.Log2(float64(2*n+1)) })
	sum, pw := t, t
	for k := int64(1); k < n; k++ {
		pw = pw.Mul(t2)
		sum = sum.Add(pw.Quo(x.Int(2*k + 1)))
	}
	term := pw.Mul(t2).Quo(x.Int(2*n + 1)) // T_n, the first omitted term
	sum = sum.Pad(term.Scale(1))
	return sum.Scale(s + 1)
}
