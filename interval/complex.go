package interval

import (
	"math"
	"math/big"
)

// C is a complex interval: the rectangle {a + ib : a in Re, b in Im}. Every
// operation returns a rectangle containing f(z) for every z in the operand
// rectangles. A part that cannot be bounded is Whole; IsFinite reports it.
type C[T Real[T]] struct{ Re, Im T }

// NewC returns the rectangle re × im.
func NewC[T Real[T]](re, im T) C[T] { return C[T]{Re: re, Im: im} }

// RealC returns the rectangle x × {0}; the imaginary part is the exact zero
// at x's precision.
func RealC[T Real[T]](x T) C[T] { return C[T]{Re: x, Im: x.Int(0)} }

// IsFinite reports whether both parts are bounded.
func (z C[T]) IsFinite() bool { return z.Re.IsFinite() && z.Im.IsFinite() }

// Contains reports whether the rectangle w lies inside z.
func (z C[T]) Contains(w C[T]) bool { return z.Re.Contains(w.Re) && z.Im.Contains(w.Im) }

// Hull returns the smallest rectangle containing z and w.
func (z C[T]) Hull(w C[T]) C[T] { return C[T]{z.Re.Hull(w.Re), z.Im.Hull(w.Im)} }

// CPoint returns the point re + i im at like's precision (like's value is
// ignored); exact for every float64 pair, Whole parts for NaN or Inf.
func CPoint[T Real[T]](like T, re, im float64) C[T] {
	return C[T]{Re: like.Float(re), Im: like.Float(im)}
}

// Add encloses z + w.
func (z C[T]) Add(w C[T]) C[T] { return C[T]{z.Re.Add(w.Re), z.Im.Add(w.Im)} }

// Sub encloses z - w.
func (z C[T]) Sub(w C[T]) C[T] { return C[T]{z.Re.Sub(w.Re), z.Im.Sub(w.Im)} }

// Neg returns -z exactly.
func (z C[T]) Neg() C[T] { return C[T]{z.Re.Neg(), z.Im.Neg()} }

// Conj returns the complex conjugate exactly.
func (z C[T]) Conj() C[T] { return C[T]{z.Re, z.Im.Neg()} }

// Scale returns z * 2^k exactly (up to the real type's range).
func (z C[T]) Scale(k int) C[T] { return C[T]{z.Re.Scale(k), z.Im.Scale(k)} }

// MulReal encloses z * x for real x; each part is a product of independent
// intervals, so the result is the tightest rectangle up to rounding.
func (z C[T]) MulReal(x T) C[T] { return C[T]{z.Re.Mul(x), z.Im.Mul(x)} }

// AddReal encloses z + x for real x.
func (z C[T]) AddReal(x T) C[T] { return C[T]{z.Re.Add(x), z.Im} }

// Mul encloses z * w by (ac - bd) + i(ad + bc) in interval arithmetic; an
// unbounded part of an operand makes both result parts Whole.
func (z C[T]) Mul(w C[T]) C[T] {
	a, b, c, d := z.Re, z.Im, w.Re, w.Im
	return C[T]{a.Mul(c).Sub(b.Mul(d)), a.Mul(d).Add(b.Mul(c))}
}

// Sqr encloses z^2 as (a^2 - b^2) + 2ab i, which is tighter than z.Mul(z).
func (z C[T]) Sqr() C[T] {
	a, b := z.Re, z.Im
	return C[T]{a.Sqr().Sub(b.Sqr()), a.Mul(b).Scale(1)}
}

// Abs2 encloses |z|^2 = a^2 + b^2; the two squares are exact ranges, so the
// result is the tightest interval up to rounding.
func (z C[T]) Abs2() T { return z.Re.Sqr().Add(z.Im.Sqr()) }

// Abs encloses |z| over the rectangle as sqrt(a^2 + b^2), tight up to
// rounding (the minimum is at the point nearest 0, the maximum at the
// farthest corner, and the interval formula reproduces both).
func (z C[T]) Abs() T { return z.Abs2().Sqrt() }

// Inv encloses 1/z as conj(z)/|z|^2; both parts are Whole when the
// rectangle contains 0 (or comes so close that |z|^2 rounds to 0).
func (z C[T]) Inv() C[T] {
	r := recip(z.Abs2())
	return C[T]{z.Re.Mul(r), z.Im.Neg().Mul(r)}
}

// recip encloses 1/d; Whole when d contains 0. On B a positive d takes two
// directed divisions instead of the general quotient's eight.
func recip[T Real[T]](d T) T {
	if b, ok := any(d).(B); ok && !b.whole && b.l().Sign() > 0 {
		p := b.p()
		one := big.NewFloat(1)
		return any(mkB(dn(p).Quo(one, b.h()), upf(p).Quo(one, b.l()), p)).(T)
	}
	return d.Int(1).Quo(d)
}

// Quo encloses z / w as z * conj(w) / |w|^2; both parts are Whole when the
// divisor rectangle contains 0.
func (z C[T]) Quo(w C[T]) C[T] {
	r := recip(w.Abs2())
	n := z.Mul(w.Conj())
	return C[T]{n.Re.Mul(r), n.Im.Mul(r)}
}

// QuoReal encloses z / x for real x; Whole parts when x contains 0.
func (z C[T]) QuoReal(x T) C[T] { return C[T]{z.Re.Quo(x), z.Im.Quo(x)} }

// crossesCut reports whether the rectangle meets the closed half-line
// (-inf, 0], where the principal argument and logarithm are discontinuous
// or undefined. It errs on the side of true.
func (z C[T]) crossesCut() bool {
	return !z.IsFinite() || z.Re.Lo() <= 0 && z.Im.Sign() == 0
}

// Arg encloses the principal argument in (-pi, pi] over the rectangle via
// Atan2; it returns Whole (not an error) when the rectangle contains 0 or
// meets the negative real axis, where the argument jumps by 2pi. A
// rectangle that is narrow relative to |z| is evaluated as atan of a
// quotient at its midpoint plus a mean-value bound (one atan instead of
// four corner evaluations).
func (z C[T]) Arg() T {
	if z.crossesCut() {
		return z.Re.Whole()
	}
	if z.narrow() {
		x, y := z.Re, z.Im
		hp := x.Pi().Scale(-1)
		switch {
		case x.Sign() > 0: // atan(y/x)
			return atanNarrow(y.Quo(x))
		case y.Sign() > 0: // pi/2 - atan(x/y)
			return hp.Sub(atanNarrow(x.Quo(y)))
		case y.Sign() < 0: // -pi/2 - atan(x/y)
			return hp.Neg().Sub(atanNarrow(x.Quo(y)))
		}
	}
	return Atan2(z.Im, z.Re)
}

// narrow reports whether both sides of the rectangle are below 2^-20 of
// its magnitude; it only selects an evaluation scheme.
func (z C[T]) narrow() bool {
	w := max(widthExp(z.Re), widthExp(z.Im))
	return w == math.MinInt || w <= max(magExp(z.Re), magExp(z.Im))-20
}

// atanNarrow encloses atan over the interval q as atan(m) at the midpoint m
// padded by |q - m| / (1 + min q^2), the mean-value bound (atan' = 1/(1+t^2)).
func atanNarrow[T Real[T]](q T) T {
	if !q.IsFinite() {
		return q.Whole()
	}
	m := q.Mid()
	e := q.Sub(m).Abs().Quo(q.Int(1).Add(lowerPt(q.Sqr())))
	return Atan(m).Pad(e)
}

// logNarrow encloses log over the positive interval x as log(m) at the
// midpoint padded by |x - m| / min x (mean-value bound); for a wide x it
// is Log(x).
func logNarrow[T Real[T]](x T) T {
	if x.Sign() <= 0 || widthExp(x) > magExp(x)-20 {
		return Log(x)
	}
	m := x.Mid()
	return Log(m).Pad(x.Sub(m).Abs().Quo(lowerPt(x)))
}

// log1pNarrow is logNarrow for log1p on an interval t > -1.
func log1pNarrow[T Real[T]](t T) T {
	one := t.Int(1)
	if !t.IsFinite() || one.Add(t).Sign() <= 0 || widthExp(t) > magExp(one.Add(t))-20 {
		return Log1p(t)
	}
	m := t.Mid()
	return Log1p(m).Pad(t.Sub(m).Abs().Quo(one.Add(lowerPt(t))))
}

// Exp encloses e^z = e^a (cos b + i sin b) over the rectangle; a part is
// Whole only when e^a overflows the real type. A part narrower than 2^-20
// is evaluated at its midpoint with a mean-value bound (one exp and one
// sin/cos evaluation instead of one per endpoint).
func (z C[T]) Exp() C[T] {
	ea := expNarrow(z.Re)
	s, c := sinCosNarrow(z.Im)
	return C[T]{ea.Mul(c), ea.Mul(s)}
}

// expNarrow encloses exp over x; for 0 < rad x = r <= 2^-20 it uses
// e^v = e^m e^(v-m) with e^(v-m) in [e^-r, e^r], inside [1-r, 1+r+r^2].
func expNarrow[T Real[T]](x T) T {
	w := widthExp(x)
	if !x.IsFinite() || w == math.MinInt || w > -20 {
		return Exp(x)
	}
	m := x.Mid()
	r := upperPt(x.Sub(m).Abs())
	one := x.Int(1)
	f := one.Sub(r).Hull(one.Add(r).Add(r.Sqr()))
	return Exp(m).Mul(f)
}

// sinCosNarrow encloses sin and cos over x; for 0 < rad x = r <= 2^-20 it
// pads sin m and cos m by r min(1, |cos m| + r) and r min(1, |sin m| + r)
// (the derivative of sin on the interval is at most |cos m| + r).
func sinCosNarrow[T Real[T]](x T) (sin, cos T) {
	w := widthExp(x)
	if !x.IsFinite() || w == math.MinInt || w > -20 {
		return SinCos(x)
	}
	m := x.Mid()
	r := upperPt(x.Sub(m).Abs())
	one := x.Int(1)
	s, c := SinCos(m)
	es := r.Mul(c.Abs().Add(r).Min(one))
	ec := r.Mul(s.Abs().Add(r).Min(one))
	return s.Pad(es), c.Pad(ec)
}

// Log encloses the principal logarithm ln|z| + i Arg z. When the rectangle
// contains 0 both parts are Whole; when it only meets the negative real
// axis (the branch cut) the real part is still enclosed and the imaginary
// part is Whole.
func (z C[T]) Log() C[T] {
	a2 := z.Abs2()
	if a2.Sign() <= 0 {
		return C[T]{z.Re.Whole(), z.Re.Whole()}
	}
	var re T
	if a2.Lo() > 0.5 && a2.Hi() < 2 {
		// ln|z| = log1p((x-1)(x+1) + y^2)/2 keeps its relative accuracy
		// near |z| = 1, where log(x^2 + y^2) would cancel.
		one := z.Re.Int(1)
		re = log1pNarrow(z.Re.Sub(one).Mul(z.Re.Add(one)).Add(z.Im.Sqr())).Scale(-1)
	} else {
		re = logNarrow(a2).Scale(-1)
	}
	return C[T]{re, z.Arg()}
}

// Sqrt encloses the principal square root (Re >= 0, and Im >= 0 on the
// negative real axis) over the rectangle. It is defined everywhere: across
// the branch cut the enclosure is the hull of the values on both sides, so
// it never returns Whole for a bounded rectangle.
//
// Bounds come from monotonicity: Re sqrt(x+iy) is nondecreasing in x and in
// |y|; Im sqrt(x+iy) is nondecreasing in y (including the jump at the cut),
// nonincreasing in x for y >= 0 and nondecreasing in x for y < 0. Each
// extreme is therefore attained at a corner (or at y = 0), where it is
// evaluated in interval arithmetic with cancellation-free formulas.
func (z C[T]) Sqrt() C[T] {
	if !z.IsFinite() {
		return C[T]{z.Re.Whole(), z.Re.Whole()}
	}
	xl, xh := lowerPt(z.Re), upperPt(z.Re)
	yl, yh := lowerPt(z.Im), upperPt(z.Im)
	// Real part: min at (x.lo, y nearest 0), max at (x.hi, y farthest from 0).
	ay := z.Im.Abs()
	reLo, _ := cxSqrtPoint(xl, lowerPt(ay))
	reHi, _ := cxSqrtPoint(xh, upperPt(ay))
	// Imaginary part: max at y.hi (x.lo if y.hi >= 0 else x.hi), min at
	// y.lo (x.hi if y.lo >= 0 else x.lo).
	var imHi, imLo T
	if yh.Sign() >= 0 {
		_, imHi = cxSqrtPoint(xl, yh)
	} else {
		_, imHi = cxSqrtPoint(xh, yh)
	}
	if yl.Sign() >= 0 {
		_, imLo = cxSqrtPoint(xh, yl)
	} else {
		_, imLo = cxSqrtPoint(xl, yl)
	}
	return C[T]{reLo.Hull(reHi), imLo.Hull(imHi)}
}

// cxSqrtPoint encloses the principal sqrt(x + iy) for (near-)point x, y,
// using sqrt((|z|+x)/2) for the part that has no cancellation and y/(2t)
// for the other. At y = 0 with x < 0 it gives Im = +sqrt(-x).
func cxSqrtPoint[T Real[T]](x, y T) (re, im T) {
	r := C[T]{x, y}.Abs()
	zero := x.Int(0)
	if x.Sign() >= 0 { // x is a point, so Sign 0 means x == 0
		t := r.Add(x).Scale(-1).Sqrt()
		if t.Sign() <= 0 { // x = y = 0
			return zero, zero
		}
		return t, y.Quo(t).Scale(-1)
	}
	u := r.Sub(x).Scale(-1).Sqrt()
	re = y.Abs().Quo(u).Scale(-1)
	if y.Sign() < 0 {
		return re, u.Neg()
	}
	return re, u
}

// Pow encloses the principal power z^w = exp(w log z) over both
// rectangles. Where log z is not enclosed (z touching 0 or the branch cut)
// both parts are Whole; use Sqrt for w = 1/2 across the cut.
func (z C[T]) Pow(w C[T]) C[T] {
	l := z.Log()
	if !l.IsFinite() {
		return C[T]{z.Re.Whole(), z.Re.Whole()}
	}
	return w.Mul(l).Exp()
}

// cxMeet returns the intersection of two enclosures of the same value
// (each part the intersection of the parts); if the parts are disjoint,
// which only a bug can cause, the hull is returned instead.
func cxMeet[T Real[T]](a, b C[T]) C[T] {
	return C[T]{cxMeetR(a.Re, b.Re), cxMeetR(a.Im, b.Im)}
}

func cxMeetR[T Real[T]](a, b T) T {
	if !a.IsFinite() {
		return b
	}
	if !b.IsFinite() {
		return a
	}
	al, ah := a.Endpoints()
	bl, bh := b.Endpoints()
	lo, hi := al, ah
	if bl.Cmp(lo) > 0 {
		lo = bl
	}
	if bh.Cmp(hi) < 0 {
		hi = bh
	}
	if lo.Cmp(hi) > 0 {
		return a.Hull(b)
	}
	// Between rounds outward at the receiver's precision; use the finer one.
	like := a
	if b.Prec() > a.Prec() {
		like = b
	}
	return like.Between(new(big.Float).Copy(lo), new(big.Float).Copy(hi))
}
