package strip

import (
	"errors"
	"fmt"
	"math/big"
	"strings"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// Alpha is the dimensionless strip parameter alpha = m L^2/(hbar t), kept
// exactly: either a positive rational given directly, or 2 pi times a
// positive rational when it comes from physical units (hbar = h/(2 pi) with
// the exact h).
type Alpha struct {
	rat   *big.Rat
	twoPi bool
	units *UnitInput
}

// UnitInput records the physical quantities an Alpha was derived from.
type UnitInput struct {
	Mass   string `json:"mass"`
	Length string `json:"length"`
	Time   string `json:"time"`
}

// ParseAlpha reads a positive alpha in the schema's grammar
// (certificates.ParseAlpha: a plain decimal, p/q, or 2*pi* followed by
// one); surrounding spaces are ignored.
func ParseAlpha(s string) (Alpha, error) {
	v, err := certificates.ParseAlpha(strings.TrimSpace(s))
	if err != nil {
		return Alpha{}, fmt.Errorf("alpha: %v", err)
	}
	return Alpha{rat: v.Factor(), twoPi: v.TwoPi()}, nil
}

// AlphaFromUnits computes alpha = m L^2/(hbar t) = 2 pi m L^2/(h t) exactly
// from a mass (kg, g, mg, u), a length (m, mm, um, nm) and a time (s, ms,
// us, ns), each written as a number followed by its unit, e.g. "1.5 u"
// (read by certificates.ParseQuantity).
func AlphaFromUnits(mass, length, time string) (Alpha, error) {
	u := &certificates.StripUnits{Mass: mass, Length: length, Time: time}
	r, err := u.AlphaFactor()
	if err != nil {
		return Alpha{}, err
	}
	return Alpha{rat: r, twoPi: true, units: &UnitInput{Mass: mass, Length: length, Time: time}}, nil
}

// IsZero reports whether a is the unset zero value.
func (a Alpha) IsZero() bool { return a.rat == nil }

// Expr returns the exact value as text: a decimal or p/q, prefixed by
// "2*pi*" when it came from physical units (certificates.AlphaOf).
func (a Alpha) Expr() string {
	if a.rat == nil {
		return ""
	}
	v, err := certificates.AlphaOf(a.rat, a.twoPi)
	if err != nil {
		return ""
	}
	return v.String()
}

// Units returns the physical input, or nil when alpha was given directly.
func (a Alpha) Units() *UnitInput { return a.units }

// EnclosureB encloses alpha at prec bits.
func (a Alpha) EnclosureB(prec uint) interval.B {
	z := interval.NewB(0, prec)
	num := new(big.Float).SetPrec(prec).SetInt(a.rat.Num())
	den := new(big.Float).SetPrec(prec).SetInt(a.rat.Denom())
	// Exact integers may exceed prec bits; Between rounds them outward.
	v := z.Between(num, num).Quo(z.Between(den, den))
	if a.twoPi {
		v = v.Mul(z.Pi()).Scale(1)
	}
	return v
}

// Enclosure encloses alpha with float64 endpoints.
func (a Alpha) Enclosure() interval.F {
	return toF(a.EnclosureB(256))
}

// AlphaValue is the JSON form of an Alpha: the exact expression, a directed
// decimal enclosure, and the physical input if any.
type AlphaValue struct {
	Value string     `json:"value"`
	Lower string     `json:"lower"`
	Upper string     `json:"upper"`
	Units *UnitInput `json:"units,omitempty"`
}

// View returns the JSON form with digits significant digits.
func (a Alpha) View(digits int) (AlphaValue, error) {
	if a.rat == nil {
		return AlphaValue{}, errors.New("alpha is not set")
	}
	lo, hi, err := interval.Decimals(a.EnclosureB(256), digits)
	if err != nil {
		return AlphaValue{}, err
	}
	if t := certificates.FractionText(a.rat); !a.twoPi && t == lo && lo == hi {
		lo, hi = t, t
	}
	return AlphaValue{Value: a.Expr(), Lower: lo, Upper: hi, Units: a.units}, nil
}

// AlphaOf returns alpha = r, or alpha = 2 pi r when twoPi is set, for a
// positive rational r (exact, no physical units recorded). Reductions that
// arrive at alpha by exact arithmetic, such as multi-stage flights, use it.
func AlphaOf(r *big.Rat, twoPi bool) (Alpha, error) {
	if r == nil || r.Sign() <= 0 {
		return Alpha{}, errors.New("alpha must be a positive rational")
	}
	return Alpha{rat: new(big.Rat).Set(r), twoPi: twoPi}, nil
}
