package flight

import (
	"fmt"

	"wedgebound/certificates"
	"wedgebound/certify/strip"
)

// Result is a certified flight: the exact reduction and the strip bracket
// at the effective alpha.
type Result struct {
	Plan      Plan
	Reduction *Reduction
	Strip     *strip.Result
}

// Compute reduces the plan and certifies the strip bracket at the
// effective alpha.
func Compute(p Plan, opt strip.Options) (*Result, error) {
	red, err := Reduce(p)
	if err != nil {
		return nil, err
	}
	a, err := red.Alpha()
	if err != nil {
		return nil, fmt.Errorf("%v: %w", err, ErrInput)
	}
	sr, err := strip.Compute(a, opt)
	if err != nil {
		return nil, err
	}
	return &Result{Plan: p, Reduction: red, Strip: sr}, nil
}

// Certificate returns an unsealed flight-reduction certificate: the input,
// the exact reduction and the strip section of the bracket.
func (r *Result) Certificate() (*certificates.Certificate, error) {
	sc, err := r.Strip.Certificate()
	if err != nil {
		return nil, err
	}
	st := *sc.Strip
	red := r.Reduction
	stages := make([]certificates.FlightStage, len(r.Plan.Stages))
	for i, s := range r.Plan.Stages {
		stages[i] = certificates.FlightStage{Mass: s.Mass, Duration: s.Duration, Kick: s.Kick}
	}
	alpha, err := certificates.AlphaOf(red.AlphaRat, red.AlphaTwoPi)
	if err != nil {
		return nil, err
	}
	f := &certificates.Flight{
		Input: certificates.FlightInput{Length: r.Plan.Length, Target: r.Plan.Target, Stages: stages},
		Reduction: certificates.FlightReduction{
			TimeOverMass:  certificates.FractionOf(red.TimeOverMass),
			Alpha:         alpha,
			Shift:         certificates.FractionOf(red.Shift),
			Target:        certificates.FractionOf(red.Target),
			ShiftedTarget: certificates.FractionOf(red.ShiftedTarget),
		},
		Strip: st,
	}
	unit := ""
	if red.Physical {
		unit = " m"
	}
	f.Statement = fmt.Sprintf("A %d-stage flight (kicks at stage ends, momentum continuous at mass changes) is the projectile with time over mass %s, "+
		"alpha = %s and target %s%s shifted by %s%s to %s%s; its advantage over the classical rival with the same initial momentum distribution lies in [%s, %s]",
		len(stages), f.Reduction.TimeOverMass, f.Reduction.Alpha, f.Reduction.Target, unit, f.Reduction.Shift, unit, f.Reduction.ShiftedTarget, unit,
		st.Advantage.Lower, st.Advantage.Upper)
	c := &certificates.Certificate{Kind: certificates.KindFlight, Flight: f}
	if err := certificates.CheckStrict(c); err != nil {
		return nil, fmt.Errorf("flight: the certificate would not be valid: %v", err)
	}
	return c, nil
}
