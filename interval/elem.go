package interval

import (
	"math"
	"math/big"
	"sync"
)

// This file holds the machinery shared by the elementary functions: working
// precision, point endpoints, tolerances and clipping.
//
// Every elementary function follows the same plan. The argument interval is
// split into its two endpoints, each a point interval; the function is
// evaluated at each point with interval arithmetic (so every rounding error is
// enclosed automatically) and with an explicit bound on the truncated series
// added by Pad; monotone functions take the hull of the two endpoint
// enclosures, the others also add the extreme values of any critical point
// inside the argument. On B the work is done at a precision a few guard bits
// above the receiver's and the result is rounded outward back to it.

// precSetter is implemented by interval types whose precision can be raised
// (B); F has a fixed precision.
type precSetter[T any] interface{ WithPrec(uint) T }

// withPrec returns x rounded outward to p bits when T supports it, else x.
func withPrec[T Real[T]](x T, p uint) T {
	if s, ok := any(x).(precSetter[T]); ok {
		return s.WithPrec(p)
	}
	return x
}

// isFixed reports whether T has a fixed precision (F).
func isFixed[T Real[T]](x T) bool {
	_, ok := any(x).(precSetter[T])
	return !ok
}

// maxTerms caps every series loop; reaching it returns Whole (it cannot
// happen for the reduced arguments used here, it only guards the loops).
const maxTerms = 1 << 20

// pointsOf returns the endpoints of a finite x as point intervals at x's
// precision, and whether they coincide.
func pointsOf[T Real[T]](x T) (lo, hi T, thin bool) {
	if f, ok := any(x).(F); ok {
		l, h := any(PointF(f.lo)).(T), any(PointF(f.hi)).(T)
		return l, h, f.lo == f.hi
	}
	l, h := x.Endpoints()
	return x.Between(l, l), x.Between(h, h), l.Cmp(h) == 0
}

// bigLo returns the exact lower endpoint of a finite x.
func bigLo[T Real[T]](x T) *big.Float {
	if f, ok := any(x).(F); ok {
		return new(big.Float).SetFloat64(f.lo)
	}
	l, _ := x.Endpoints()
	return l
}

// isZero reports whether x is the point 0.
func isZero[T Real[T]](x T) bool {
	z := x.Int(0)
	return x.Contains(z) && z.Contains(x)
}

// seriesLen returns the index n >= 1 of the first omitted term of a series:
// the smallest n with logTerm(n) < -(bits+4), where logTerm(n) estimates
// log2 |T_n / T_0| in float64. Only the amount of work depends on this
// estimate; the bound added for the omitted tail is always computed in
// interval arithmetic from the actual term T_n, so it is rigorous whatever
// n is. At most maxTerms.
func seriesLen(bits uint, logTerm func(n int) float64) int64 {
	target := -float64(bits) - 4
	for n := 1; n < maxTerms; n++ {
		if logTerm(n) < target {
			return int64(n)
		}
	}
	return maxTerms
}

// log2Fact returns an estimate of log2(n!).
func log2Fact(n int) float64 {
	v, _ := math.Lgamma(float64(n) + 1)
	return v / math.Ln2
}

// log2Mag returns log2 of the float64 upper bound of |x| (-Inf for 0).
func log2Mag[T Real[T]](x T) float64 { return math.Log2(x.Abs().Hi()) }

// clip intersects x with [lo, hi]; valid only when the exact values are known
// to lie in [lo, hi] (for example sin in [-1, 1]).
func clip[T Real[T]](x T, lo, hi int64) T {
	return x.Max(x.Int(lo)).Min(x.Int(hi))
}

// isqrt returns floor(sqrt(n)).
func isqrt(n uint) uint { return uint(math.Sqrt(float64(n))) }

// work returns the working precision p+g+extra for a receiver of precision p,
// clamped to MaxPrec (the clamp only widens the result).
func work(p uint, g int, extra int) uint {
	w := int(p) + g + extra
	if w > MaxPrec {
		return MaxPrec
	}
	return uint(w)
}

// bitLen64 returns the number of bits of |k|.
func bitLen64(k int64) int {
	if k < 0 {
		k = -k
	}
	n := 0
	for k > 0 {
		n++
		k >>= 1
	}
	return n
}

// reduceB encloses v - k*c in B at prec bits, where c is a constant getter
// (for example pi/2). It is used when the reduction needs more bits than T
// offers (F) or carries a large multiple k.
func reduceB(v *big.Float, k *big.Int, c func(B) B, prec uint) B {
	z := B{prec: clampPrec(prec)}
	kf := new(big.Float).SetInt(k)
	return z.Between(v, v).Sub(z.Between(kf, kf).Mul(c(z)))
}

// toFB converts a B enclosure to F (outward).
func toFB(b B) F { return fromB(F{}, b) }

// fromB converts the B enclosure b to T at w's precision (outward).
func fromB[T Real[T]](w T, b B) T {
	l, h := b.Endpoints()
	if l == nil {
		return w.Whole()
	}
	return w.Between(l, h)
}

// cwConst splits a constant c = hi + lo (Cody and Waite's two-part
// constant): hi is a float64 with at most 30 significant bits, lo an F
// enclosure of c - hi. It lets F reduce v - k c with the error of one
// rounding of the small remainder instead of one ulp of k c.
type cwConst struct {
	once sync.Once
	get  func(B) B
	hi   float64
	lo   F
}

func (c *cwConst) init() {
	c.once.Do(func() {
		b := c.get(B{prec: 256})
		f, _ := b.Mid().lo.Float64()
		c.hi = math.Float64frombits(math.Float64bits(f) &^ (1<<23 - 1)) // keep 53-23 = 30 bits
		l, h := b.Sub(B{prec: 256}.Float(c.hi)).Endpoints()
		c.lo = F{}.Between(l, h)
	})
}

var (
	cwHalfPi = cwConst{get: halfPi}
	cwLn2    = cwConst{get: B.Ln2}
)

// reduceF encloses v - k c in F. k c.hi is exact (k has at most 22 bits and
// c.hi 30) and v - k c.hi is exact when the TwoSum error term vanishes; both
// facts are checked at run time, and false is returned when either fails
// (the caller then reduces in B).
func (c *cwConst) reduceF(v float64, k int64) (F, bool) {
	c.init()
	if k == 0 {
		return PointF(v), true
	}
	if k > 1<<22 || k < -(1<<22) {
		return F{}, false
	}
	kf := float64(k)
	y := kf * c.hi
	if math.FMA(kf, c.hi, -y) != 0 {
		return F{}, false
	}
	d := v - y
	bb := d - v
	if e := (v - (d - bb)) + (-y - bb); e != 0 { // TwoSum (Knuth): d is exact iff e == 0
		return F{}, false
	}
	return PointF(d).Sub(PointF(kf).Mul(c.lo)), true
}
