package interval

import (
	"fmt"
	"math"
	"math/big"
	"sync"
)

// MinPrec and MaxPrec bound the working precision of B in bits.
const (
	MinPrec = 53
	MaxPrec = 1 << 16
)

// B is an interval with math/big endpoints: the lower endpoint is rounded
// toward -inf and the upper toward +inf at the interval's precision. Values
// are immutable; every operation allocates its result. Unbounded results
// are represented by the whole line (Whole), never by partial infinities.
// The zero value is the point 0 at 53 bits.
type B struct {
	lo, hi *big.Float // nil for Whole
	prec   uint
	whole  bool
}

var _ Real[B] = B{}

// NewB returns the point interval enclosing v at prec bits (exact when v is
// representable). prec is clamped to [MinPrec, MaxPrec].
func NewB(v float64, prec uint) B {
	return B{prec: clampPrec(prec)}.Float(v)
}

func clampPrec(p uint) uint {
	if p < MinPrec {
		return MinPrec
	}
	if p > MaxPrec {
		return MaxPrec
	}
	return p
}

var zeroFloat = new(big.Float)

func (x B) p() uint {
	if x.prec == 0 {
		return MinPrec
	}
	return x.prec
}

func (x B) l() *big.Float {
	if x.lo == nil {
		return zeroFloat
	}
	return x.lo
}

func (x B) h() *big.Float {
	if x.hi == nil {
		return zeroFloat
	}
	return x.hi
}

func maxp(x, y B) uint {
	if x.p() > y.p() {
		return x.p()
	}
	return y.p()
}

func dn(p uint) *big.Float  { return new(big.Float).SetPrec(p).SetMode(big.ToNegativeInf) }
func upf(p uint) *big.Float { return new(big.Float).SetPrec(p).SetMode(big.ToPositiveInf) }

func wholeB(p uint) B { return B{prec: p, whole: true} }

// mk checks the endpoints and returns Whole on infinities.
func mkB(lo, hi *big.Float, p uint) B {
	if lo.IsInf() || hi.IsInf() {
		return wholeB(p)
	}
	return B{lo: lo, hi: hi, prec: p}
}

// Add encloses x + y.
func (x B) Add(y B) B {
	p := maxp(x, y)
	if x.whole || y.whole {
		return wholeB(p)
	}
	return mkB(dn(p).Add(x.l(), y.l()), upf(p).Add(x.h(), y.h()), p)
}

// Sub encloses x - y.
func (x B) Sub(y B) B {
	p := maxp(x, y)
	if x.whole || y.whole {
		return wholeB(p)
	}
	return mkB(dn(p).Sub(x.l(), y.h()), upf(p).Sub(x.h(), y.l()), p)
}

// Mul encloses x * y.
func (x B) Mul(y B) B {
	p := maxp(x, y)
	if x.whole || y.whole {
		return wholeB(p)
	}
	a, b, c, d := x.l(), x.h(), y.l(), y.h()
	switch {
	case a.Sign() >= 0 && c.Sign() >= 0:
		return mkB(dn(p).Mul(a, c), upf(p).Mul(b, d), p)
	case b.Sign() <= 0 && d.Sign() <= 0:
		return mkB(dn(p).Mul(b, d), upf(p).Mul(a, c), p)
	case a.Sign() >= 0 && d.Sign() <= 0:
		return mkB(dn(p).Mul(b, c), upf(p).Mul(a, d), p)
	case b.Sign() <= 0 && c.Sign() >= 0:
		return mkB(dn(p).Mul(a, d), upf(p).Mul(b, c), p)
	}
	// At least one operand straddles zero: take all four products.
	lo := minF(dn(p).Mul(a, c), dn(p).Mul(a, d), dn(p).Mul(b, c), dn(p).Mul(b, d))
	hi := maxF(upf(p).Mul(a, c), upf(p).Mul(a, d), upf(p).Mul(b, c), upf(p).Mul(b, d))
	return mkB(lo, hi, p)
}

func minF(v ...*big.Float) *big.Float {
	m := v[0]
	for _, w := range v[1:] {
		if w.Cmp(m) < 0 {
			m = w
		}
	}
	return m
}

func maxF(v ...*big.Float) *big.Float {
	m := v[0]
	for _, w := range v[1:] {
		if w.Cmp(m) > 0 {
			m = w
		}
	}
	return m
}

// Quo encloses x / y; Whole when y contains zero.
func (x B) Quo(y B) B {
	p := maxp(x, y)
	if x.whole || y.whole || y.l().Sign() <= 0 && y.h().Sign() >= 0 {
		return wholeB(p)
	}
	// y = [c, d] does not contain zero; the sign cases pick the two
	// quotients that are the extremes (two divisions instead of eight).
	a, b, c, d := x.l(), x.h(), y.l(), y.h()
	var ln, ld, hn, hd *big.Float // lower = ln/ld, upper = hn/hd
	if c.Sign() > 0 {
		switch {
		case a.Sign() >= 0:
			ln, ld, hn, hd = a, d, b, c
		case b.Sign() <= 0:
			ln, ld, hn, hd = a, c, b, d
		default:
			ln, ld, hn, hd = a, c, b, c
		}
	} else {
		switch {
		case a.Sign() >= 0:
			ln, ld, hn, hd = b, d, a, c
		case b.Sign() <= 0:
			ln, ld, hn, hd = b, c, a, d
		default:
			ln, ld, hn, hd = b, d, a, d
		}
	}
	return mkB(dn(p).Quo(ln, ld), upf(p).Quo(hn, hd), p)
}

// Neg returns -x exactly.
func (x B) Neg() B {
	if x.whole {
		return x
	}
	return B{lo: new(big.Float).Neg(x.h()), hi: new(big.Float).Neg(x.l()), prec: x.p()}
}

// Abs returns {|v| : v in x} exactly.
func (x B) Abs() B {
	switch {
	case x.whole:
		return x
	case x.l().Sign() >= 0:
		return x
	case x.h().Sign() <= 0:
		return x.Neg()
	}
	m := new(big.Float).Neg(x.l())
	if x.h().Cmp(m) > 0 {
		m = x.h()
	}
	return B{lo: new(big.Float), hi: m, prec: x.p()}
}

// Sqr encloses {v*v : v in x}.
func (x B) Sqr() B {
	if x.whole {
		return x
	}
	a := x.Abs()
	p := x.p()
	return mkB(dn(p).Mul(a.l(), a.l()), upf(p).Mul(a.h(), a.h()), p)
}

// Sqrt encloses sqrt(x); Whole when the upper endpoint is negative, and
// sqrt of [0, hi] when only the lower endpoint is negative.
func (x B) Sqrt() B {
	p := x.p()
	if x.whole || x.h().Sign() < 0 {
		return wholeB(p)
	}
	lo := new(big.Float)
	if x.l().Sign() > 0 {
		lo = sqrtDirected(x.l(), p, false)
	}
	return mkB(lo, sqrtDirected(x.h(), p, true), p)
}

// sqrtDirected returns sqrt(v) for v >= 0 rounded to p bits toward +inf
// (up) or -inf. big.Float.Sqrt does not promise correct rounding, and it is
// not even accurate to p bits at every precision (its Newton iteration from a
// float64 start can stop short: at 3355 bits it is off by about 2^90 ulps),
// so the root is taken at extra bits, rounded in the required direction, and
// checked by squaring it exactly (2p+2 bits hold the product); it is moved
// one ulp outward while the check fails, and the extra bits are doubled if
// that does not settle it.
func sqrtDirected(v *big.Float, p uint, up bool) *big.Float {
	if v.Sign() == 0 {
		return new(big.Float)
	}
	for extra := p/16 + 64; ; extra *= 2 {
		c := new(big.Float).SetPrec(p + extra).Sqrt(v)
		var r *big.Float
		if up {
			r = upf(p).Set(c)
		} else {
			r = dn(p).Set(c)
		}
		for i := 0; i < 4; i++ {
			sq := new(big.Float).SetPrec(2*p+2).Mul(r, r) // exact
			if c := sq.Cmp(v); up && c >= 0 || !up && c <= 0 {
				return r
			}
			ulp := new(big.Float).SetMantExp(big.NewFloat(1), r.MantExp(nil)-int(p))
			if up {
				r = upf(p).Add(r, ulp)
			} else {
				r = dn(p).Sub(r, ulp)
			}
		}
		if extra > 1<<20 {
			panic("interval: square root correction did not converge")
		}
	}
}

// Scale returns x * 2^k, exactly unless the exponent range of math/big is
// left: overflow gives Whole and an endpoint that underflows to zero is
// replaced by the smallest magnitude of its sign, so the result still
// encloses x * 2^k.
func (x B) Scale(k int) B {
	if x.whole {
		return x
	}
	lo, hi := new(big.Float).SetMantExp(x.l(), k), new(big.Float).SetMantExp(x.h(), k)
	if lo.Sign() == 0 && x.l().Sign() < 0 {
		lo.SetMantExp(big.NewFloat(-0.5), big.MinExp)
	}
	if hi.Sign() == 0 && x.h().Sign() > 0 {
		hi.SetMantExp(big.NewFloat(0.5), big.MinExp)
	}
	return mkB(lo, hi, x.p())
}

// Hull returns the smallest interval containing x and y.
func (x B) Hull(y B) B {
	p := maxp(x, y)
	if x.whole || y.whole {
		return wholeB(p)
	}
	return B{lo: minF(x.l(), y.l()), hi: maxF(x.h(), y.h()), prec: p}
}

// Max encloses max(u, v) for u in x, v in y.
func (x B) Max(y B) B {
	p := maxp(x, y)
	if x.whole || y.whole {
		return wholeB(p)
	}
	return B{lo: maxF(x.l(), y.l()), hi: maxF(x.h(), y.h()), prec: p}
}

// Min encloses min(u, v) for u in x, v in y.
func (x B) Min(y B) B {
	p := maxp(x, y)
	if x.whole || y.whole {
		return wholeB(p)
	}
	return B{lo: minF(x.l(), y.l()), hi: minF(x.h(), y.h()), prec: p}
}

// Pad returns [lo - r, hi + r] with r = max(|e.lo|, |e.hi|).
func (x B) Pad(e B) B {
	p := maxp(x, e)
	if x.whole || e.whole {
		return wholeB(p)
	}
	r := e.Abs().h()
	return mkB(dn(p).Sub(x.l(), r), upf(p).Add(x.h(), r), p)
}

// Lo returns the lower endpoint rounded down to float64 (-Inf for Whole).
func (x B) Lo() float64 {
	if x.whole {
		return math.Inf(-1)
	}
	return float64Down(x.l())
}

// Hi returns the upper endpoint rounded up to float64 (+Inf for Whole).
func (x B) Hi() float64 {
	if x.whole {
		return math.Inf(1)
	}
	return float64Up(x.h())
}

// float64Down and float64Up round v to a float64 below / above it.
// big.Float.Float64 rounds to nearest in the subnormal range, gives 0 below
// it and +-Inf above the range regardless of direction, so the result is
// checked against v and moved one step when it is on the wrong side.
func float64Down(v *big.Float) float64 {
	f, _ := dn(53).Set(v).Float64()
	if math.IsInf(f, 1) || !math.IsInf(f, -1) && new(big.Float).SetFloat64(f).Cmp(v) > 0 {
		f = math.Nextafter(f, math.Inf(-1))
	}
	return f
}

func float64Up(v *big.Float) float64 {
	f, _ := upf(53).Set(v).Float64()
	if math.IsInf(f, -1) || !math.IsInf(f, 1) && new(big.Float).SetFloat64(f).Cmp(v) < 0 {
		f = math.Nextafter(f, math.Inf(1))
	}
	return f
}

// Endpoints returns copies of the exact endpoints; nil, nil for Whole.
func (x B) Endpoints() (*big.Float, *big.Float) {
	if x.whole {
		return nil, nil
	}
	return new(big.Float).Copy(x.l()), new(big.Float).Copy(x.h())
}

// Mid returns the point interval at the midpoint rounded to the precision,
// clamped into x.
func (x B) Mid() B {
	p := x.p()
	if x.whole {
		return B{prec: p}
	}
	m := new(big.Float).SetPrec(p).Add(x.l(), x.h())
	m.SetMantExp(m, -1)
	if m.Cmp(x.l()) < 0 {
		m = x.l()
	}
	if m.Cmp(x.h()) > 0 {
		m = x.h()
	}
	return B{lo: m, hi: m, prec: p}
}

// Rad returns an upper bound on (hi - lo) / 2 as a float64.
func (x B) Rad() float64 {
	if x.whole {
		return math.Inf(1)
	}
	d := upf(64).Sub(x.h(), x.l())
	return float64Up(upf(53).SetMantExp(d, -1))
}

// Prec returns the working precision in bits.
func (x B) Prec() uint { return x.p() }

// WithPrec returns x rounded outward to prec bits (clamped to
// [MinPrec, MaxPrec]); later operations on it work at that precision.
func (x B) WithPrec(prec uint) B {
	p := clampPrec(prec)
	if x.whole {
		return wholeB(p)
	}
	return B{lo: dn(p).Set(x.l()), hi: upf(p).Set(x.h()), prec: p}
}

// IsFinite reports whether x is not Whole.
func (x B) IsFinite() bool { return !x.whole }

// Sign returns 1 for x > 0, -1 for x < 0, otherwise 0.
func (x B) Sign() int {
	switch {
	case x.whole:
		return 0
	case x.l().Sign() > 0:
		return 1
	case x.h().Sign() < 0:
		return -1
	}
	return 0
}

// Contains reports whether y is a subset of x.
func (x B) Contains(y B) bool {
	if x.whole {
		return true
	}
	if y.whole {
		return false
	}
	return x.l().Cmp(y.l()) <= 0 && y.h().Cmp(x.h()) <= 0
}

// Less reports whether x.hi < y.lo.
func (x B) Less(y B) bool {
	if x.whole || y.whole {
		return false
	}
	return x.h().Cmp(y.l()) < 0
}

// Int encloses n at the receiver's precision.
func (x B) Int(n int64) B {
	p := x.p()
	return B{lo: dn(p).SetInt64(n), hi: upf(p).SetInt64(n), prec: p}
}

// Frac encloses p / q; Whole for q == 0.
func (x B) Frac(p, q int64) B {
	if q == 0 {
		return wholeB(x.p())
	}
	r := new(big.Rat).SetFrac64(p, q)
	return x.rat(r)
}

func (x B) rat(r *big.Rat) B {
	p := x.p()
	return B{lo: dn(p).SetRat(r), hi: upf(p).SetRat(r), prec: p}
}

// Float encloses the float64 v exactly (Whole for NaN or Inf).
func (x B) Float(v float64) B {
	p := x.p()
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return wholeB(p)
	}
	return B{lo: dn(p).SetFloat64(v), hi: upf(p).SetFloat64(v), prec: p}
}

// Decimal encloses the decimal number in s.
func (x B) Decimal(s string) (B, error) {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		return wholeB(x.p()), fmt.Errorf("interval: %q is not a decimal number", s)
	}
	return x.rat(r), nil
}

// Between returns the hull of lo and hi rounded outward to the precision.
func (x B) Between(lo, hi *big.Float) B {
	p := x.p()
	if lo == nil || hi == nil || lo.IsInf() || hi.IsInf() {
		return wholeB(p)
	}
	if lo.Cmp(hi) > 0 {
		lo, hi = hi, lo
	}
	return B{lo: dn(p).Set(lo), hi: upf(p).Set(hi), prec: p}
}

// Whole returns the whole real line.
func (x B) Whole() B { return wholeB(x.p()) }

// String formats x for display with about 20 significant digits (round to
// nearest, not certified; use the decimal functions for certified output).
func (x B) String() string {
	if x.whole {
		return "[-Inf, +Inf]"
	}
	return fmt.Sprintf("[%s, %s]", x.l().Text('g', 20), x.h().Text('g', 20))
}

// constCache holds the widest computed enclosure of a constant; narrower
// requests are served by rounding it outward.
type constCache struct {
	mu   sync.Mutex
	prec uint
	val  B
	calc func(prec uint) B
}

func (c *constCache) get(prec uint) B {
	c.mu.Lock()
	defer c.mu.Unlock()
	if c.prec < prec {
		c.val = c.calc(prec)
		c.prec = prec
	}
	return c.val.WithPrec(prec)
}
