package strip

import (
	"errors"
	"fmt"
	"math/big"
	"regexp"
	"strings"

	"wedgebound/interval"
)

// Planck constant in J s, exact in the SI since 2019 (CODATA 2018); the
// reduced constant is hbar = h/(2 pi) = 1.054571817...e-34 J s.
const planckH = "6.62607015e-34"

// atomicMassUnit is the unified atomic mass unit in kg (CODATA 2018
// recommended value).
const atomicMassUnit = "1.66053906660e-27"

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

// ParseAlpha reads a positive decimal (or p/q) number as an exact alpha.
func ParseAlpha(s string) (Alpha, error) {
	r, ok := new(big.Rat).SetString(strings.TrimSpace(s))
	if !ok {
		return Alpha{}, fmt.Errorf("alpha %q is not a number", s)
	}
	if r.Sign() <= 0 {
		return Alpha{}, fmt.Errorf("alpha must be positive, got %s", s)
	}
	return Alpha{rat: r}, nil
}

var quantityRE = regexp.MustCompile(`^\s*([+-]?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?)\s*([A-Za-zµμ]+)\s*$`)

var (
	massUnits   = map[string]string{"kg": "1", "g": "1e-3", "mg": "1e-6", "u": atomicMassUnit}
	lengthUnits = map[string]string{"m": "1", "mm": "1e-3", "um": "1e-6", "µm": "1e-6", "μm": "1e-6", "nm": "1e-9"}
	timeUnits   = map[string]string{"s": "1", "ms": "1e-3", "us": "1e-6", "µs": "1e-6", "μs": "1e-6", "ns": "1e-9"}
)

func parseQuantity(s, what string, units map[string]string) (*big.Rat, error) {
	m := quantityRE.FindStringSubmatch(s)
	if m == nil {
		return nil, fmt.Errorf("%s %q: want a number followed by a unit (%s)", what, s, unitList(units))
	}
	v, ok := new(big.Rat).SetString(m[1])
	if !ok || v.Sign() <= 0 {
		return nil, fmt.Errorf("%s %q: the number must be positive", what, s)
	}
	f, ok := units[m[2]]
	if !ok {
		return nil, fmt.Errorf("%s %q: unknown unit %q (known: %s)", what, s, m[2], unitList(units))
	}
	fr, _ := new(big.Rat).SetString(f)
	return v.Mul(v, fr), nil
}

func unitList(units map[string]string) string {
	order := []string{"kg", "g", "mg", "u", "m", "mm", "um", "nm", "s", "ms", "us", "ns"}
	var out []string
	for _, u := range order {
		if _, ok := units[u]; ok {
			out = append(out, u)
		}
	}
	return strings.Join(out, ", ")
}

// AlphaFromUnits computes alpha = m L^2/(hbar t) = 2 pi m L^2/(h t) exactly
// from a mass (kg, g, mg, u), a length (m, mm, um, nm) and a time (s, ms,
// us, ns), each written as a number followed by its unit, e.g. "1.5 u".
func AlphaFromUnits(mass, length, time string) (Alpha, error) {
	m, err := parseQuantity(mass, "mass", massUnits)
	if err != nil {
		return Alpha{}, err
	}
	l, err := parseQuantity(length, "length", lengthUnits)
	if err != nil {
		return Alpha{}, err
	}
	t, err := parseQuantity(time, "time", timeUnits)
	if err != nil {
		return Alpha{}, err
	}
	h, _ := new(big.Rat).SetString(planckH)
	r := new(big.Rat).Mul(m, new(big.Rat).Mul(l, l))
	r.Quo(r, new(big.Rat).Mul(h, t))
	return Alpha{rat: r, twoPi: true, units: &UnitInput{Mass: mass, Length: length, Time: time}}, nil
}

// IsZero reports whether a is the unset zero value.
func (a Alpha) IsZero() bool { return a.rat == nil }

// Expr returns the exact value as text: a decimal or p/q, prefixed by
// "2*pi*" when it came from physical units.
func (a Alpha) Expr() string {
	if a.rat == nil {
		return ""
	}
	s := ratText(a.rat)
	if a.twoPi {
		return "2*pi*" + s
	}
	return s
}

// ratText writes r as an exact decimal when its denominator has only the
// prime factors 2 and 5, else as p/q.
func ratText(r *big.Rat) string {
	d := new(big.Int).Set(r.Denom())
	two, five := big.NewInt(2), big.NewInt(5)
	k := 0
	zero := new(big.Int)
	for ; new(big.Int).Mod(d, two).Cmp(zero) == 0; k++ {
		d.Quo(d, two)
	}
	j := 0
	for ; new(big.Int).Mod(d, five).Cmp(zero) == 0; j++ {
		d.Quo(d, five)
	}
	if d.Cmp(big.NewInt(1)) != 0 {
		return r.RatString()
	}
	digits := k
	if j > digits {
		digits = j
	}
	s := r.FloatString(digits)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	return s
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
	if !a.twoPi && ratText(a.rat) == lo && lo == hi {
		lo, hi = ratText(a.rat), ratText(a.rat)
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
