package certificates

import (
	"fmt"
	"math/big"
	"regexp"
	"strings"
)

// Physical input. A certificate that comes from physical quantities
// records them as the user wrote them ("87 u", "0.2 ms", "1e-28 kg*m/s")
// and every reader converts them by the one function ParseQuantity, with
// the exact factors below.

// PlanckH is the Planck constant in J s, exact in the SI since 2019
// (CODATA 2018); hbar = h/(2 pi).
const PlanckH = "6.62607015e-34"

// AtomicMassUnit is the unified atomic mass unit in kg (CODATA 2018
// recommended value).
const AtomicMassUnit = "1.66053906660e-27"

// Dimension is the kind of a physical quantity.
type Dimension string

// The dimensions of the schema's physical input.
const (
	Mass     Dimension = "mass"     // kg, g, mg, u
	Length   Dimension = "length"   // m, mm, um (µm, μm), nm
	Duration Dimension = "duration" // s, ms, us (µs, μs), ns
	Momentum Dimension = "kick"     // kg*m/s, g*m/s, u*m/s, u*mm/s, u*um/s
)

// unitFactors holds each unit's SI factor as (mantissa, power of ten):
// factor = mantissa 10^power.
var unitFactors = map[Dimension]map[string]struct {
	mant  string
	power int
}{
	Mass:     {"kg": {"1", 0}, "g": {"1", -3}, "mg": {"1", -6}, "u": {AtomicMassUnit, 0}},
	Length:   {"m": {"1", 0}, "mm": {"1", -3}, "um": {"1", -6}, "µm": {"1", -6}, "μm": {"1", -6}, "nm": {"1", -9}},
	Duration: {"s": {"1", 0}, "ms": {"1", -3}, "us": {"1", -6}, "µs": {"1", -6}, "μs": {"1", -6}, "ns": {"1", -9}},
	Momentum: {"kg*m/s": {"1", 0}, "g*m/s": {"1", -3}, "u*m/s": {AtomicMassUnit, 0}, "u*mm/s": {AtomicMassUnit, -3}, "u*um/s": {AtomicMassUnit, -6}},
}

// unitOrder lists the units of each dimension for messages.
var unitOrder = map[Dimension]string{
	Mass: "kg, g, mg, u", Length: "m, mm, um, nm", Duration: "s, ms, us, ns",
	Momentum: "kg*m/s, g*m/s, u*m/s, u*mm/s, u*um/s",
}

// quantityRE is a quantity: a decimal number (sign, point and an exponent
// of at most four digits allowed, as people write them), then an optional
// unit, with optional spaces around and between.
var quantityRE = regexp.MustCompile(`^\s*([+-]?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]{1,4})?)\s*([A-Za-zµμ*/]*)\s*$`)

// unitFactor returns the exact SI factor of unit u of dimension d.
func unitFactor(d Dimension, u string) (*big.Rat, bool) {
	f, ok := unitFactors[d][u]
	if !ok {
		return nil, false
	}
	r, ok := new(big.Rat).SetString(f.mant)
	if !ok {
		return nil, false
	}
	p := new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(-f.power)), nil))
	return r.Quo(r, p), true
}

// ParseQuantity reads a quantity of dimension d exactly. With physical set
// it must be "number unit" and is returned in SI base units (kg, m, s,
// kg m/s); otherwise it must be a plain number without a unit (scaled
// input). The error names d and the text.
func ParseQuantity(s string, d Dimension, physical bool) (*big.Rat, error) {
	m := quantityRE.FindStringSubmatch(s)
	if m == nil {
		if physical {
			return nil, fmt.Errorf("%s %q is not a number followed by a unit (%s)", d, s, unitOrder[d])
		}
		return nil, fmt.Errorf("%s %q is not a number", d, s)
	}
	v, ok := new(big.Rat).SetString(m[1])
	if !ok {
		return nil, fmt.Errorf("%s %q is not a number", d, s)
	}
	switch {
	case !physical && m[2] != "":
		return nil, fmt.Errorf("%s %q has a unit, but the input is scaled (plain numbers)", d, s)
	case !physical:
		return v, nil
	case m[2] == "":
		return nil, fmt.Errorf("%s %q needs a unit (%s)", d, s, unitOrder[d])
	}
	f, ok := unitFactor(d, m[2])
	if !ok {
		return nil, fmt.Errorf("%s %q: unknown unit %q (known: %s)", d, s, m[2], unitOrder[d])
	}
	return v.Mul(v, f), nil
}

// Planck returns the Planck constant h in J s as an exact rational.
func Planck() *big.Rat {
	h, ok := new(big.Rat).SetString(PlanckH)
	if !ok {
		panic("certificates: PlanckH does not read") // a constant of this file
	}
	return h
}

// AlphaFactor returns r with alpha = 2 pi r = m L^2/(hbar t)
// = 2 pi m L^2/(h t), exactly, from the recorded physical input; each
// quantity must be positive.
func (u *StripUnits) AlphaFactor() (*big.Rat, error) {
	var q [3]*big.Rat
	for i, x := range []struct {
		s string
		d Dimension
	}{{u.Mass, Mass}, {u.Length, Length}, {u.Time, Duration}} {
		v, err := ParseQuantity(x.s, x.d, true)
		if err != nil {
			return nil, err
		}
		if v.Sign() <= 0 {
			return nil, fmt.Errorf("%s %q: the number must be positive", x.d, strings.TrimSpace(x.s))
		}
		q[i] = v
	}
	r := new(big.Rat).Mul(q[0], new(big.Rat).Mul(q[1], q[1]))
	return r.Quo(r, new(big.Rat).Mul(Planck(), q[2])), nil
}
