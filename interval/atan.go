package interval

import "math"

// atanSteps is the number of halvings x -> x/(1+sqrt(1+x^2)) (each halves
// atan exactly) before the Taylor series.
func atanSteps(p uint, fixed bool) int {
	if fixed {
		return 2
	}
	// A halving costs about six series terms (square root and division).
	s := int(0.3*math.Sqrt(float64(p))) - 2
	if s < 2 {
		s = 2
	}
	return s
}

// Atan encloses atan(v) for every v in x (values in [-pi/2, pi/2]). Whole
// when x is unbounded. atan is increasing, so the hull of the endpoint
// enclosures is the range.
//
// Method: for |v| > 1, atan v = sign(v) pi/2 - atan(1/v); then s halvings
// and the alternating Taylor series sum (-1)^n x^(2n+1)/(2n+1), whose tail
// after the first omitted term T_n is at most |T_n|/(1-x^2) <= 2|T_n|.
func Atan[T Real[T]](x T) T {
	if !x.IsFinite() {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	r := atanThin(lo)
	if !thin {
		r = r.Hull(atanThin(hi))
	}
	return withPrec(r, x.Prec())
}

// atanThin encloses atan(a) for a thin interval a (a point, or a quotient of
// points); a wide a is passed to Atan.
func atanThin[T Real[T]](a T) T {
	p := a.Prec()
	s := atanSteps(p, isFixed(a))
	w := withPrec(a, work(p, s+20, 0))
	one, two := w.Int(1), w.Int(2)
	m := w.Abs()
	switch {
	case !one.Less(m): // |a| <= 1 somewhere: the whole enclosure is below 2?
		if m.Less(two) {
			return atanKernel(w, s)
		}
		return Atan(w)
	case w.Sign() > 0:
		return w.Pi().Scale(-1).Sub(atanKernel(one.Quo(w), s))
	default:
		return w.Pi().Scale(-1).Neg().Sub(atanKernel(one.Quo(w), s))
	}
}

// atanKernel encloses atan(x) for an interval x with |x| < 2, using s >= 2
// halvings (after them |x| < 0.3, so x^2 < 1/2).
func atanKernel[T Real[T]](x T, s int) T {
	one := x.Int(1)
	if !x.Abs().Less(x.Int(2)) {
		return x.Whole()
	}
	for i := 0; i < s; i++ {
		x = x.Quo(one.Add(one.Add(x.Sqr()).Sqrt()))
	}
	x2 := x.Sqr()
	if !x2.Less(x.Frac(1, 2)) {
		return x.Whole()
	}
	lr := log2Mag(x)
	n := seriesLen(x.Prec(), func(n int) float64 { return 2*float64(n)*lr - math.Log2(float64(2*n+1)) })
	sum, pw := x, x
	for k := int64(1); k < n; k++ {
		pw = pw.Mul(x2)
		if k%2 == 1 {
			sum = sum.Sub(pw.Quo(x.Int(2*k + 1)))
		} else {
			sum = sum.Add(pw.Quo(x.Int(2*k + 1)))
		}
	}
	term := pw.Mul(x2).Quo(x.Int(2*n + 1)) // |T_n|, the first omitted term
	sum = sum.Pad(term.Scale(1))
	return sum.Scale(s)
}

// Atan2 encloses the principal argument atan2(y, x) in (-pi, pi] of every
// point (x, y) of the box x × y. It is Whole when an input is unbounded or
// the box contains the origin; [-pi, pi] when the box meets the negative real
// axis and also has points below it (the argument jumps there).
//
// Off the branch cut the argument is continuous on the box and, because the
// box is convex and does not contain the origin, its extremes are attained at
// the corners; each corner is evaluated with atan of a quotient of magnitude
// at most 1 plus a multiple of pi/2.
func Atan2[T Real[T]](y, x T) T {
	if !x.IsFinite() || !y.IsFinite() {
		return x.Whole()
	}
	zero := x.Int(0)
	p := x.Prec()
	if y.Prec() > p {
		p = y.Prec()
	}
	if x.Contains(zero) && y.Contains(zero) {
		return x.Whole()
	}
	xl, xh, _ := pointsOf(x)
	yl, yh, _ := pointsOf(y)
	if xl.Sign() < 0 && yl.Sign() < 0 && yh.Sign() >= 0 {
		pi := withPrec(x, p).Pi()
		return pi.Neg().Hull(pi)
	}
	r := atan2Point(yl, xl).Hull(atan2Point(yl, xh)).Hull(atan2Point(yh, xl)).Hull(atan2Point(yh, xh))
	return withPrec(r, p)
}

// atan2Point encloses atan2(y, x) for points (x, y) != (0, 0) with y >= 0
// when x < 0 and y = 0.
func atan2Point[T Real[T]](y, x T) T {
	p := x.Prec()
	if y.Prec() > p {
		p = y.Prec()
	}
	w := work(p, 8, 0)
	x, y = withPrec(x, w), withPrec(y, w)
	if isZero(x) && isZero(y) {
		return x.Whole()
	}
	hp := x.Pi().Scale(-1)
	if !x.Abs().Less(y.Abs()) { // |y| <= |x|, so x != 0
		t := atanThin(y.Quo(x))
		switch {
		case x.Sign() > 0:
			return t
		case y.Sign() < 0:
			return t.Sub(hp.Scale(1))
		case y.Sign() > 0 || isZero(y):
			return t.Add(hp.Scale(1))
		}
		return x.Whole() // a non-point y straddling 0 (not reached for points)
	}
	// |y| > |x|, so y != 0.
	t := atanThin(x.Quo(y))
	if y.Sign() > 0 {
		return hp.Sub(t)
	}
	return hp.Neg().Sub(t)
}
