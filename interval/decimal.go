package interval

import (
	"errors"
	"math/big"
	"strings"
)

// ErrUnbounded is returned when an unbounded interval is asked for decimal
// endpoints.
var ErrUnbounded = errors.New("interval: the enclosure is unbounded")

// Decimals returns decimal strings lo <= x.lo and hi >= x.hi with n
// significant digits each (directed rounding, so [lo, hi] still encloses
// everything x encloses). n is clamped to [1, 100000].
func Decimals[T Real[T]](x T, n int) (lo, hi string, err error) {
	l, h := x.Endpoints()
	if l == nil || h == nil {
		return "", "", ErrUnbounded
	}
	return DecimalDown(l, n), DecimalUp(h, n), nil
}

// DecimalDown formats the largest n-digit decimal that is <= v.
func DecimalDown(v *big.Float, n int) string { return formatDirected(v, n, false) }

// DecimalUp formats the smallest n-digit decimal that is >= v.
func DecimalUp(v *big.Float, n int) string { return formatDirected(v, n, true) }

var bigTen = big.NewInt(10)

func pow10(k int) *big.Int { return new(big.Int).Exp(bigTen, big.NewInt(int64(k)), nil) }

func formatDirected(v *big.Float, n int, roundUp bool) string {
	if n < 1 {
		n = 1
	}
	if n > 100000 {
		n = 100000
	}
	if v.Sign() == 0 {
		return "0"
	}
	r, _ := v.Rat(nil) // exact for finite v
	neg := r.Sign() < 0
	a := new(big.Rat).Abs(r)
	// Find E with 10^E <= a < 10^(E+1), starting from the binary exponent.
	e := int(float64(v.MantExp(nil)) * 0.30102999566398120)
	for {
		if cmpPow10(a, e) < 0 {
			e--
			continue
		}
		if cmpPow10(a, e+1) >= 0 {
			e++
			continue
		}
		break
	}
	// q = a * 10^(n-1-e), then floor or ceil (toward the requested side).
	shift := n - 1 - e
	num := new(big.Int).Set(a.Num())
	den := new(big.Int).Set(a.Denom())
	if shift >= 0 {
		num.Mul(num, pow10(shift))
	} else {
		den.Mul(den, pow10(-shift))
	}
	q, m := new(big.Int).QuoRem(num, den, new(big.Int))
	away := roundUp != neg // round the magnitude up
	if away && m.Sign() != 0 {
		q.Add(q, big.NewInt(1))
	}
	digits := q.String()
	if len(digits) > n { // carried into a new digit, e.g. 9.99 -> 10.0
		e++
		digits = digits[:n]
	}
	var b strings.Builder
	if neg {
		b.WriteByte('-')
	}
	switch {
	case e >= 0 && e < 40:
		if e+1 >= len(digits) {
			b.WriteString(digits)
			b.WriteString(strings.Repeat("0", e+1-len(digits)))
		} else {
			b.WriteString(digits[:e+1])
			b.WriteByte('.')
			b.WriteString(digits[e+1:])
		}
	case e < 0 && e > -40:
		b.WriteString("0.")
		b.WriteString(strings.Repeat("0", -e-1))
		b.WriteString(digits)
	default:
		b.WriteString(digits[:1])
		if len(digits) > 1 {
			b.WriteByte('.')
			b.WriteString(digits[1:])
		}
		b.WriteString("e")
		b.WriteString(big.NewInt(int64(e)).String())
	}
	return trimFrac(b.String())
}

// cmpPow10 compares a with 10^e.
func cmpPow10(a *big.Rat, e int) int {
	var p *big.Rat
	if e >= 0 {
		p = new(big.Rat).SetInt(pow10(e))
	} else {
		p = new(big.Rat).SetFrac(big.NewInt(1), pow10(-e))
	}
	return a.Cmp(p)
}

// trimFrac removes trailing zeros after a decimal point (not in exponents).
func trimFrac(s string) string {
	mant, exp, hasExp := strings.Cut(s, "e")
	if strings.Contains(mant, ".") {
		mant = strings.TrimRight(mant, "0")
		mant = strings.TrimSuffix(mant, ".")
	}
	if hasExp {
		return mant + "e" + exp
	}
	return mant
}
