package certificates

import (
	"errors"
	"fmt"
	"strings"
)

// KindFlight reduces a multi-stage flight exactly to one projectile and
// brackets its advantage through an embedded strip section.
const KindFlight = "flight-reduction"

// MaxFlightStages is the largest number of stages a flight may record.
const MaxFlightStages = 1000

// Flight is the multi-stage flight section. Input is the flight as given;
// Reduction its exact single-projectile form: with T = sum_k t_k/m_k and
// the kick q_k applied at the end of stage k (momentum continuous at a mass
// change),
//
//	time_over_mass = T,  alpha = L^2/(hbar T),
//	shift = sum_k q_k (t_{k+1}/m_{k+1} + ... + t_K/m_K),
//	shifted_target = target - shift,
//
// all exact (rationals written as decimals or p/q; alpha as in
// StripAlpha.Value). Strip is a complete strip-bracket section at
// Strip.Alpha.Value == Reduction.Alpha (without units): its advantage
// bracket is the flight's advantage bracket.
type Flight struct {
	Input     FlightInput     `json:"input"`
	Reduction FlightReduction `json:"reduction"`
	Strip     Strip           `json:"strip"`
	Statement string          `json:"statement"`
}

// FlightInput is the flight as given: Length empty means scaled input
// (L = 1, plain numbers); otherwise every quantity carries a unit (mass kg,
// g, mg, u; duration s, ms, us, ns; kick kg*m/s, g*m/s, u*m/s, u*mm/s,
// u*um/s; length and target m, mm, um, nm). Target empty means L.
type FlightInput struct {
	Length string        `json:"length,omitempty"`
	Target string        `json:"target,omitempty"`
	Stages []FlightStage `json:"stages"`
}

// FlightStage is one stage: mass, duration, optional kick at its end.
type FlightStage struct {
	Mass     string `json:"mass"`
	Duration string `json:"duration"`
	Kick     string `json:"kick,omitempty"`
}

// FlightReduction is the exact reduction (see Flight). Physical input:
// time_over_mass in s/kg, shift and targets in metres; scaled input in the
// scaled units.
type FlightReduction struct {
	TimeOverMass  Fraction   `json:"time_over_mass"`
	Alpha         AlphaValue `json:"alpha"`
	Shift         Fraction   `json:"shift"`
	Target        Fraction   `json:"target"`
	ShiftedTarget Fraction   `json:"shifted_target"`
}

func (f *Flight) validate() error {
	n := len(f.Input.Stages)
	if n == 0 || n > MaxFlightStages {
		return fmt.Errorf("flight.input.stages: %d stages is outside 1..%d", n, MaxFlightStages)
	}
	for i, s := range f.Input.Stages {
		if strings.TrimSpace(s.Mass) == "" || strings.TrimSpace(s.Duration) == "" {
			return fmt.Errorf("flight.input.stages[%d]: mass and duration must be given", i)
		}
	}
	r := f.Reduction
	var fs fields
	fs.add("flight.reduction.time_over_mass", r.TimeOverMass)
	fs.add("flight.reduction.alpha", r.Alpha)
	fs.add("flight.reduction.shift", r.Shift)
	fs.add("flight.reduction.target", r.Target)
	fs.add("flight.reduction.shifted_target", r.ShiftedTarget)
	if err := fs.check(); err != nil {
		return err
	}
	if r.TimeOverMass.Sign() <= 0 {
		return errors.New("flight.reduction.time_over_mass must be positive")
	}
	if err := f.Strip.validate(); err != nil {
		return fmt.Errorf("flight.%v", err)
	}
	if f.Strip.Alpha.Value.String() != r.Alpha.String() || f.Strip.Alpha.Units != nil {
		return fmt.Errorf("flight.strip.alpha %q is not the reduced alpha %q (without units)", f.Strip.Alpha.Value, r.Alpha)
	}
	return nil
}
