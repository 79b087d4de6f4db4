package interval

import (
	"fmt"
	"math"
	"math/big"
)

// F is an interval with float64 endpoints. Each operation computes its
// endpoints in round-to-nearest and then moves each one ulp outward, which
// encloses the exact result because IEEE 754 +, -, *, / and sqrt are
// correctly rounded. The zero value is the point 0.
type F struct {
	lo, hi float64
}

var _ Real[F] = F{}

func down(x float64) float64 { return math.Nextafter(x, math.Inf(-1)) }
func up(x float64) float64   { return math.Nextafter(x, math.Inf(1)) }

// NewF returns [lo, hi] widened by one ulp on each side, or Whole when an
// endpoint is NaN or lo > hi.
func NewF(lo, hi float64) F {
	if math.IsNaN(lo) || math.IsNaN(hi) || lo > hi {
		return wholeF
	}
	return F{down(lo), up(hi)}
}

// PointF returns the exact point interval [v, v] (Whole for NaN).
func PointF(v float64) F {
	if math.IsNaN(v) {
		return wholeF
	}
	return F{v, v}
}

var wholeF = F{math.Inf(-1), math.Inf(1)}

func mkF(lo, hi float64) F {
	if math.IsNaN(lo) || math.IsNaN(hi) {
		return wholeF
	}
	return F{down(lo), up(hi)}
}

// Add encloses x + y.
func (x F) Add(y F) F { return mkF(x.lo+y.lo, x.hi+y.hi) }

// Sub encloses x - y.
func (x F) Sub(y F) F { return mkF(x.lo-y.hi, x.hi-y.lo) }

// Mul encloses x * y; Whole when either factor is unbounded.
func (x F) Mul(y F) F {
	if !x.IsFinite() || !y.IsFinite() {
		return wholeF
	}
	a, b, c, d := x.lo*y.lo, x.lo*y.hi, x.hi*y.lo, x.hi*y.hi
	return mkF(math.Min(math.Min(a, b), math.Min(c, d)), math.Max(math.Max(a, b), math.Max(c, d)))
}

// Quo encloses x / y; Whole when y contains zero or either is unbounded.
func (x F) Quo(y F) F {
	if !x.IsFinite() || !y.IsFinite() || (y.lo <= 0 && y.hi >= 0) {
		return wholeF
	}
	a, b, c, d := x.lo/y.lo, x.lo/y.hi, x.hi/y.lo, x.hi/y.hi
	return mkF(math.Min(math.Min(a, b), math.Min(c, d)), math.Max(math.Max(a, b), math.Max(c, d)))
}

// Neg returns -x exactly.
func (x F) Neg() F { return F{-x.hi, -x.lo} }

// Abs returns {|v| : v in x} exactly.
func (x F) Abs() F {
	switch {
	case x.lo >= 0:
		return x
	case x.hi <= 0:
		return x.Neg()
	}
	return F{0, math.Max(-x.lo, x.hi)}
}

// Sqr encloses {v*v : v in x}, which is tighter than x.Mul(x).
func (x F) Sqr() F {
	a := x.Abs()
	if !a.IsFinite() {
		return F{a.lo * a.lo, math.Inf(1)}
	}
	lo := a.lo * a.lo
	if lo != 0 {
		lo = down(lo)
	}
	return F{lo, up(a.hi * a.hi)}
}

// Sqrt encloses sqrt(x); Whole when x.Hi() < 0, and sqrt of [0, hi] when
// only the lower endpoint is negative.
func (x F) Sqrt() F {
	if x.hi < 0 {
		return wholeF
	}
	lo := 0.0
	if x.lo > 0 {
		lo = math.Max(0, down(math.Sqrt(x.lo)))
	}
	return F{lo, up(math.Sqrt(x.hi))}
}

// Scale returns x * 2^k, widened by one ulp only when the result is not
// exact (it left the normal range: overflow, or underflow to a subnormal or
// to zero).
func (x F) Scale(k int) F {
	lo, hi := math.Ldexp(x.lo, k), math.Ldexp(x.hi, k)
	if math.Ldexp(lo, -k) != x.lo || math.Ldexp(hi, -k) != x.hi {
		return mkF(lo, hi)
	}
	return F{lo, hi}
}

// Hull returns the smallest interval containing x and y.
func (x F) Hull(y F) F { return F{math.Min(x.lo, y.lo), math.Max(x.hi, y.hi)} }

// Max encloses max(u, v) for u in x, v in y.
func (x F) Max(y F) F { return F{math.Max(x.lo, y.lo), math.Max(x.hi, y.hi)} }

// Min encloses min(u, v) for u in x, v in y.
func (x F) Min(y F) F { return F{math.Min(x.lo, y.lo), math.Min(x.hi, y.hi)} }

// Pad returns [lo - e.Hi(), hi + e.Hi()].
func (x F) Pad(e F) F {
	r := math.Abs(e.lo)
	r = math.Max(r, math.Abs(e.hi))
	return mkF(x.lo-r, x.hi+r)
}

// Lo returns the lower endpoint.
func (x F) Lo() float64 { return x.lo }

// Hi returns the upper endpoint.
func (x F) Hi() float64 { return x.hi }

// Endpoints returns the exact endpoints; nil, nil when x is not finite.
func (x F) Endpoints() (*big.Float, *big.Float) {
	if !x.IsFinite() {
		return nil, nil
	}
	return new(big.Float).SetFloat64(x.lo), new(big.Float).SetFloat64(x.hi)
}

// Mid returns the point interval at the rounded midpoint, which lies in x.
func (x F) Mid() F {
	if !x.IsFinite() {
		return F{}
	}
	m := x.lo/2 + x.hi/2
	m = math.Max(x.lo, math.Min(x.hi, m))
	return F{m, m}
}

// Rad returns an upper bound on (hi - lo) / 2.
func (x F) Rad() float64 {
	if !x.IsFinite() {
		return math.Inf(1)
	}
	return up((x.hi - x.lo) / 2)
}

// Prec returns 53.
func (x F) Prec() uint { return 53 }

// IsFinite reports whether both endpoints are finite.
func (x F) IsFinite() bool { return !math.IsInf(x.lo, 0) && !math.IsInf(x.hi, 0) }

// Sign returns 1 for x > 0, -1 for x < 0, otherwise 0.
func (x F) Sign() int {
	switch {
	case !x.IsFinite():
		return 0
	case x.lo > 0:
		return 1
	case x.hi < 0:
		return -1
	}
	return 0
}

// Contains reports whether y is a subset of x.
func (x F) Contains(y F) bool { return x.lo <= y.lo && y.hi <= x.hi }

// Less reports whether x.Hi() < y.Lo().
func (x F) Less(y F) bool { return x.hi < y.lo }

// Int encloses n exactly when |n| <= 2^53, else by one ulp.
func (F) Int(n int64) F {
	v := float64(n)
	if int64(v) == n && math.Abs(v) < 0x1p62 {
		return F{v, v}
	}
	return mkF(v, v)
}

// Frac encloses p / q; Whole for q == 0.
func (x F) Frac(p, q int64) F { return x.Int(p).Quo(x.Int(q)) }

// Float returns the exact point v.
func (F) Float(v float64) F { return PointF(v) }

// Decimal encloses the decimal number in s.
func (F) Decimal(s string) (F, error) {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		return wholeF, fmt.Errorf("interval: %q is not a decimal number", s)
	}
	return F{float64Down(new(big.Float).SetPrec(53).SetMode(big.ToNegativeInf).SetRat(r)),
		float64Up(new(big.Float).SetPrec(53).SetMode(big.ToPositiveInf).SetRat(r))}, nil
}

// Between returns the hull of the exact values lo and hi rounded outward.
func (F) Between(lo, hi *big.Float) F {
	if lo == nil || hi == nil || lo.IsInf() || hi.IsInf() {
		return wholeF
	}
	if lo.Cmp(hi) > 0 {
		lo, hi = hi, lo
	}
	return F{float64Down(lo), float64Up(hi)}
}

// Pi encloses pi.
func (F) Pi() F { return F{down(math.Pi), up(math.Pi)} }

// Ln2 encloses log 2.
func (F) Ln2() F { return F{down(math.Ln2), up(math.Ln2)} }

// Whole returns the whole real line.
func (F) Whole() F { return wholeF }

// String formats x as [lo, hi] with 17 significant digits (round to nearest,
// for display only; use the decimal functions for certified output).
func (x F) String() string { return fmt.Sprintf("[%.17g, %.17g]", x.lo, x.hi) }
