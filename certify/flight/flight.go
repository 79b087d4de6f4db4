package flight

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math/big"
	"strings"

	"wedgebound/certificates"
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

// ErrInput marks bad input (the caller should exit 2).
var ErrInput = errors.New("bad flight input")

// quantity reads "number [unit]" exactly by the schema's reader
// (certificates.ParseQuantity): a unit of dimension d for physical input, no
// unit for scaled input. what names the quantity in errors.
func quantity(s, what string, d certificates.Dimension, physical, positive bool) (*big.Rat, error) {
	v, err := certificates.ParseQuantity(s, d, physical)
	if err != nil {
		return nil, fmt.Errorf("%s: %v: %w", what, err, ErrInput)
	}
	if positive && v.Sign() <= 0 {
		return nil, fmt.Errorf("%s %q must be positive: %w", what, s, ErrInput)
	}
	return v, nil
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
	phys := r.Physical
	if !r.Physical {
		r.Length = big.NewRat(1, 1)
	} else {
		l, err := quantity(p.Length, "length", certificates.Length, true, true)
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
		m, err := quantity(st.Mass, where+" mass", certificates.Mass, phys, true)
		if err != nil {
			return nil, err
		}
		t, err := quantity(st.Duration, where+" duration", certificates.Duration, phys, true)
		if err != nil {
			return nil, err
		}
		q := new(big.Rat)
		if strings.TrimSpace(st.Kick) != "" {
			if q, err = quantity(st.Kick, where+" kick", certificates.Momentum, phys, false); err != nil {
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
		c, err := quantity(p.Target, "target", certificates.Length, phys, false)
		if err != nil {
			return nil, err
		}
		r.Target = c
	}
	r.ShiftedTarget = new(big.Rat).Sub(r.Target, r.Shift)
	l2 := new(big.Rat).Mul(r.Length, r.Length)
	r.AlphaRat = new(big.Rat).Quo(l2, r.TimeOverMass)
	if r.Physical {
		r.AlphaRat.Quo(r.AlphaRat, certificates.Planck())
		r.AlphaTwoPi = true
	}
	return r, nil
}

// Alpha returns the effective alpha as a strip parameter.
func (r *Reduction) Alpha() (strip.Alpha, error) { return strip.AlphaOf(r.AlphaRat, r.AlphaTwoPi) }

// AlphaText is the exact effective alpha: a rational, or 2*pi*r (as
// certificates.AlphaOf writes it).
func (r *Reduction) AlphaText() string {
	a, err := certificates.AlphaOf(r.AlphaRat, r.AlphaTwoPi)
	if err != nil {
		return ""
	}
	return a.String()
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
