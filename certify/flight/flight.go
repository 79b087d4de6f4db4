package flight

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math/big"
	"regexp"
	"strings"

	"wedgebound/certify/strip"
)

// Stage is one stage as the user gave it: a mass, a duration and an
// optional kick at its end, each a number (scaled input) or a number
// followed by a unit (physical input).
type Stage struct {
	Mass     string `json:"mass"`
	Duration string `json:"duration"`
	Kick     string `json:"kick,omitempty"`
}

// Plan is a whole flight: the length L of the confining region (empty for
// scaled input, where L = 1), the target position (empty: L, the right end
// of the region) and the stages in order.
type Plan struct {
	Length string  `json:"length,omitempty"`
	Target string  `json:"target,omitempty"`
	Stages []Stage `json:"stages"`
}

// MaxStages caps the number of stages.
const MaxStages = 1000

// Physical constants (exact SI h; CODATA 2018 atomic mass unit).
const (
	planckH        = "6.62607015e-34"
	atomicMassUnit = "1.66053906660e-27"
)

var (
	massUnits   = map[string]string{"kg": "1", "g": "1e-3", "mg": "1e-6", "u": atomicMassUnit}
	lengthUnits = map[string]string{"m": "1", "mm": "1e-3", "um": "1e-6", "µm": "1e-6", "μm": "1e-6", "nm": "1e-9"}
	timeUnits   = map[string]string{"s": "1", "ms": "1e-3", "us": "1e-6", "µs": "1e-6", "μs": "1e-6", "ns": "1e-9"}
	kickUnits   = map[string]string{"kg*m/s": "1", "g*m/s": "1e-3", "u*m/s": atomicMassUnit,
		"u*mm/s": atomicMassUnit + "e-3", "u*um/s": atomicMassUnit + "e-6"}
	qtyRE = regexp.MustCompile(`^\s*([+-]?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]{1,4})?)\s*([A-Za-zµμ*/]*)\s*$`)
)

// ErrInput marks bad input (the caller should exit 2).
var ErrInput = errors.New("bad flight input")

// quantity reads "number [unit]" exactly. With units nil the unit must be
// absent (scaled input); otherwise it must be one of units (SI factor).
func quantity(s, what string, units map[string]string, positive bool) (*big.Rat, error) {
	m := qtyRE.FindStringSubmatch(s)
	if m == nil {
		return nil, fmt.Errorf("%s %q is not a number (with a unit for physical input): %w", what, s, ErrInput)
	}
	v, ok := new(big.Rat).SetString(m[1])
	if !ok {
		return nil, fmt.Errorf("%s %q is not a number: %w", what, s, ErrInput)
	}
	if positive && v.Sign() <= 0 {
		return nil, fmt.Errorf("%s %q must be positive: %w", what, s, ErrInput)
	}
	switch {
	case units == nil && m[2] != "":
		return nil, fmt.Errorf("%s %q has a unit, but the flight has no --length (scaled input takes plain numbers): %w", what, s, ErrInput)
	case units == nil:
		return v, nil
	case m[2] == "":
		return nil, fmt.Errorf("%s %q needs a unit (physical input, since a length is given): %w", what, s, ErrInput)
	}
	f, ok := units[m[2]]
	if !ok {
		return nil, fmt.Errorf("%s %q: unknown unit %q (known: %s): %w", what, s, m[2], unitNames(units), ErrInput)
	}
	fr, _ := new(big.Rat).SetString(f)
	return v.Mul(v, fr), nil
}

func unitNames(u map[string]string) string {
	var out []string
	for _, k := range []string{"kg", "g", "mg", "u", "m", "mm", "um", "nm", "s", "ms", "us", "ns", "kg*m/s", "g*m/s", "u*m/s", "u*mm/s", "u*um/s"} {
		if _, ok := u[k]; ok {
			out = append(out, k)
		}
	}
	return strings.Join(out, ", ")
}

// Reduction is the exact single-projectile form of a flight (see the
// package comment): TimeOverMass T = sum t_k/m_k, alpha = L^2/(hbar T)
// (AlphaTwoPi: alpha = 2 pi AlphaRat, physical input; else alpha =
// AlphaRat), the shift s of the final position, the target c and the
// shifted target c - s. Physical input: T in s/kg, s and c in metres.
type Reduction struct {
	Physical      bool
	Length        *big.Rat
	TimeOverMass  *big.Rat
	AlphaRat      *big.Rat
	AlphaTwoPi    bool
	Shift         *big.Rat
	Target        *big.Rat
	ShiftedTarget *big.Rat
}

// Reduce computes the reduction of p exactly.
func Reduce(p Plan) (*Reduction, error) {
	if len(p.Stages) == 0 {
		return nil, fmt.Errorf("a flight needs at least one stage: %w", ErrInput)
	}
	if len(p.Stages) > MaxStages {
		return nil, fmt.Errorf("%d stages is more than %d: %w", len(p.Stages), MaxStages, ErrInput)
	}
	r := &Reduction{Physical: strings.TrimSpace(p.Length) != ""}
	mu, lu, tu, ku := massUnits, lengthUnits, timeUnits, kickUnits
	if !r.Physical {
		mu, lu, tu, ku = nil, nil, nil, nil
		r.Length = big.NewRat(1, 1)
	} else {
		l, err := quantity(p.Length, "length", lu, true)
		if err != nil {
			return nil, err
		}
		r.Length = l
	}
	taus := make([]*big.Rat, len(p.Stages))
	kicks := make([]*big.Rat, len(p.Stages))
	r.TimeOverMass = new(big.Rat)
	for i, st := range p.Stages {
		where := fmt.Sprintf("stage %d", i+1)
		m, err := quantity(st.Mass, where+" mass", mu, true)
		if err != nil {
			return nil, err
		}
		t, err := quantity(st.Duration, where+" duration", tu, true)
		if err != nil {
			return nil, err
		}
		q := new(big.Rat)
		if strings.TrimSpace(st.Kick) != "" {
			if q, err = quantity(st.Kick, where+" kick", ku, false); err != nil {
				return nil, err
			}
		}
		taus[i] = new(big.Rat).Quo(t, m)
		kicks[i] = q
		r.TimeOverMass.Add(r.TimeOverMass, taus[i])
	}
	// s = sum_k q_k (tau_{k+1} + ... + tau_K), accumulated from the end.
	r.Shift = new(big.Rat)
	rest := new(big.Rat)
	for k := len(p.Stages) - 1; k >= 0; k-- {
		r.Shift.Add(r.Shift, new(big.Rat).Mul(kicks[k], rest))
		rest.Add(rest, taus[k])
	}
	r.Target = new(big.Rat).Set(r.Length)
	if strings.TrimSpace(p.Target) != "" {
		c, err := quantity(p.Target, "target", lu, false)
		if err != nil {
			return nil, err
		}
		r.Target = c
	}
	r.ShiftedTarget = new(big.Rat).Sub(r.Target, r.Shift)
	l2 := new(big.Rat).Mul(r.Length, r.Length)
	r.AlphaRat = new(big.Rat).Quo(l2, r.TimeOverMass)
	if r.Physical {
		h, _ := new(big.Rat).SetString(planckH)
		r.AlphaRat.Quo(r.AlphaRat, h)
		r.AlphaTwoPi = true
	}
	return r, nil
}

// Alpha returns the effective alpha as a strip parameter.
func (r *Reduction) Alpha() (strip.Alpha, error) { return strip.AlphaOf(r.AlphaRat, r.AlphaTwoPi) }

// AlphaText is the exact effective alpha: a rational, or 2*pi*r.
func (r *Reduction) AlphaText() string {
	if r.AlphaTwoPi {
		return "2*pi*" + RatText(r.AlphaRat)
	}
	return RatText(r.AlphaRat)
}

// ParseStage reads "mass=M,duration=T[,kick=Q]" (duration may be written
// time=T).
func ParseStage(s string) (Stage, error) {
	var st Stage
	for _, part := range strings.Split(s, ",") {
		k, v, ok := strings.Cut(part, "=")
		if !ok {
			return st, fmt.Errorf("stage %q: %q is not NAME=VALUE: %w", s, part, ErrInput)
		}
		switch strings.TrimSpace(k) {
		case "mass":
			st.Mass = strings.TrimSpace(v)
		case "duration", "time":
			st.Duration = strings.TrimSpace(v)
		case "kick":
			st.Kick = strings.TrimSpace(v)
		default:
			return st, fmt.Errorf("stage %q: unknown name %q (mass, duration, kick): %w", s, k, ErrInput)
		}
	}
	if st.Mass == "" || st.Duration == "" {
		return st, fmt.Errorf("stage %q needs mass= and duration=: %w", s, ErrInput)
	}
	return st, nil
}

// ParsePlan reads a flight file {"length", "target", "stages": [{"mass",
// "duration", "kick"}]} strictly (unknown fields are errors).
func ParsePlan(b []byte) (Plan, error) {
	var p Plan
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&p); err != nil {
		return p, fmt.Errorf("flight file: %v: %w", err, ErrInput)
	}
	if dec.More() {
		return p, fmt.Errorf("flight file: trailing data: %w", ErrInput)
	}
	return p, nil
}

// RatText writes r exactly: a decimal when its denominator divides a power
// of ten, else p/q.
func RatText(r *big.Rat) string {
	d := new(big.Int).Set(r.Denom())
	k := 0
	for _, p := range []int64{2, 5} {
		pp := big.NewInt(p)
		j := 0
		for new(big.Int).Mod(d, pp).Sign() == 0 {
			d.Quo(d, pp)
			j++
		}
		if j > k {
			k = j
		}
	}
	if d.Cmp(big.NewInt(1)) != 0 {
		return r.RatString()
	}
	s := r.FloatString(k)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	return s
}
