// Package flight verifies flight-reduction certificates: it re-derives the
// exact reduction of the recorded stages to one projectile by its own
// composition of the stage maps (a 2x2 affine map per stage, multiplied out
// in rationals), checks every recorded number of the reduction against it,
// and verifies the embedded strip section with the strip verifier.
package flight

import (
	"fmt"
	"math/big"
	"strings"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
)

// read parses a quantity of dimension d by the schema's reader; physical
// says whether a unit is required (and no unit allowed otherwise).
func read(s string, d certificates.Dimension, physical bool) (*big.Rat, error) {
	return certificates.ParseQuantity(s, d, physical)
}

// affine is the phase-space map (x, p) -> (x + b p + e, p + f) (the upper
// triangular symplectic part [[1, b], [0, 1]] plus the shift (e, f)).
type affine struct{ b, e, f *big.Rat }

// then returns the map "a, then g".
func (a affine) then(g affine) affine {
	// g(a(x, p)) = (x + a.b p + a.e + g.b (p + a.f) + g.e, p + a.f + g.f)
	b := new(big.Rat).Add(a.b, g.b)
	e := new(big.Rat).Add(a.e, g.e)
	e.Add(e, new(big.Rat).Mul(g.b, a.f))
	f := new(big.Rat).Add(a.f, g.f)
	return affine{b, e, f}
}

type derived struct {
	tm, alphaR, shift, target, shifted *big.Rat
	twoPi                              bool
}

func derive(in certificates.FlightInput) (*derived, error) {
	phys := strings.TrimSpace(in.Length) != ""
	L := big.NewRat(1, 1)
	if phys {
		l, err := read(in.Length, certificates.Length, true)
		if err != nil {
			return nil, err
		}
		L = l
	}
	if L.Sign() <= 0 {
		return nil, fmt.Errorf("length %q is not positive", in.Length)
	}
	total := affine{new(big.Rat), new(big.Rat), new(big.Rat)}
	for i, s := range in.Stages {
		m, err := read(s.Mass, certificates.Mass, phys)
		if err != nil {
			return nil, fmt.Errorf("stage %d: %v", i+1, err)
		}
		t, err := read(s.Duration, certificates.Duration, phys)
		if err != nil {
			return nil, fmt.Errorf("stage %d: %v", i+1, err)
		}
		if m.Sign() <= 0 || t.Sign() <= 0 {
			return nil, fmt.Errorf("stage %d: mass and duration must be positive", i+1)
		}
		q := new(big.Rat)
		if strings.TrimSpace(s.Kick) != "" {
			if q, err = read(s.Kick, certificates.Momentum, phys); err != nil {
				return nil, fmt.Errorf("stage %d: %v", i+1, err)
			}
		}
		fly := affine{new(big.Rat).Quo(t, m), new(big.Rat), new(big.Rat)}
		kick := affine{new(big.Rat), new(big.Rat), q}
		total = total.then(fly).then(kick)
	}
	d := &derived{tm: total.b, shift: total.e, twoPi: phys}
	d.target = new(big.Rat).Set(L)
	if strings.TrimSpace(in.Target) != "" {
		c, err := read(in.Target, certificates.Length, phys)
		if err != nil {
			return nil, fmt.Errorf("target: %v", err)
		}
		d.target = c
	}
	d.shifted = new(big.Rat).Sub(d.target, d.shift)
	// alpha = L^2/(hbar T); with hbar = h/(2 pi): alpha = 2 pi L^2/(h T).
	d.alphaR = new(big.Rat).Quo(new(big.Rat).Mul(L, L), d.tm)
	if phys {
		d.alphaR.Quo(d.alphaR, certificates.Planck())
	}
	return d, nil
}

func init() { recheck.Register(certificates.KindFlight, Checker{}) }

// Checker verifies flight-reduction certificates (registered for
// certificates.KindFlight).
type Checker struct{}

// Detail is the flight verifier's record: the reduction it derived from
// the stages (exact rationals) and the strip verifier's own detail.
type Detail struct {
	TimeOverMass  string `json:"time_over_mass"`
	Alpha         string `json:"alpha"`
	Shift         string `json:"shift"`
	ShiftedTarget string `json:"shifted_target"`
	Strip         any    `json:"strip,omitempty"`
}

// NewDetail returns a zero Detail (for reading results back from JSON).
func (Checker) NewDetail() any { return &Detail{} }

// Check verifies a flight-reduction certificate: the reduction exactly,
// then the embedded strip section through the checker registered for
// strip-bracket certificates (an error when none is registered).
func (Checker) Check(c *certificates.Certificate, opt recheck.Options) (*recheck.Result, error) {
	if c.Kind != certificates.KindFlight || c.Flight == nil {
		return nil, fmt.Errorf("certificate kind %q is not %q: %w", c.Kind, certificates.KindFlight, recheck.ErrUnsupported)
	}
	f := c.Flight
	det := &Detail{}
	var fails []recheck.Failure
	fail := func(where, msg string, refuted bool) {
		fails = append(fails, recheck.Failure{Where: where, Message: msg, Refuted: refuted})
	}
	d, err := derive(f.Input)
	if err != nil {
		fail("input", err.Error(), false)
	} else {
		det.TimeOverMass, det.Shift, det.ShiftedTarget = d.tm.RatString(), d.shift.RatString(), d.shifted.RatString()
		det.Alpha = d.alphaR.RatString()
		if d.twoPi {
			det.Alpha = "2*pi*" + det.Alpha
		}
		red := f.Reduction
		for _, x := range []struct {
			name string
			rec  certificates.Fraction
			want *big.Rat
		}{{"time_over_mass", red.TimeOverMass, d.tm}, {"shift", red.Shift, d.shift},
			{"target", red.Target, d.target}, {"shifted_target", red.ShiftedTarget, d.shifted}} {
			got := x.rec.Rat()
			if got == nil {
				fail("reduction."+x.name, "missing number", false)
			} else if got.Cmp(x.want) != 0 {
				fail("reduction."+x.name, fmt.Sprintf("recorded %s, the stages give %s", x.rec, x.want.RatString()), true)
			}
		}
		r, twoPi := red.Alpha.Factor(), red.Alpha.TwoPi()
		switch {
		case r == nil:
			fail("reduction.alpha", "missing number", false)
		case twoPi != d.twoPi || r.Cmp(d.alphaR) != 0:
			fail("reduction.alpha", fmt.Sprintf("recorded %s, the stages give %s", red.Alpha, det.Alpha), true)
		}
	}
	if f.Strip.Alpha.Value.String() != f.Reduction.Alpha.String() || f.Strip.Alpha.Units != nil {
		fail("strip.alpha", "the strip section is not at the reduced alpha", true)
	}
	st := f.Strip
	sc := &certificates.Certificate{Kind: certificates.KindStrip, Strip: &st}
	if err := certificates.Seal(sc); err != nil {
		return nil, err
	}
	res, err := recheck.Verify(sc, opt)
	if err != nil {
		return nil, fmt.Errorf("flight: the embedded strip section cannot be checked: %w", err)
	}
	for i := range res.Failures {
		res.Failures[i].Where = "strip." + res.Failures[i].Where
	}
	det.Strip = res.Detail
	res.Detail = det
	res.Failures = append(fails, res.Failures...)
	res.Problem = fmt.Sprintf("%d-stage flight reduced to %s", len(f.Input.Stages), res.Problem)
	res.Statement = "flight advantage: " + res.Statement
	return res, nil
}
