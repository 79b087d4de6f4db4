package flight_test

// End-to-end tests of the flight verifier on certificates written by the
// certifier (package certify/flight; the tests may use it, the verifier
// itself may not).

import (
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	_ "wedgebound/certificates/recheck/flight"
	_ "wedgebound/certificates/recheck/strip"
	"wedgebound/certify/flight"
	"wedgebound/certify/strip"
)

func cert(t *testing.T, p flight.Plan) *certificates.Certificate {
	t.Helper()
	r, err := flight.Compute(p, strip.Options{Width: 1e-6})
	if err != nil {
		t.Fatal(err)
	}
	c, err := r.Certificate()
	if err == nil {
		err = certificates.Seal(c)
	}
	if err != nil {
		t.Fatal(err)
	}
	b, _ := certificates.Encode(c)
	d, err := certificates.Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	return d
}

func verify(t *testing.T, c *certificates.Certificate) *recheck.Result {
	t.Helper()
	r, err := recheck.Verify(c, recheck.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

var scaled = flight.Plan{Target: "2", Stages: []flight.Stage{{Mass: "1", Duration: "0.02", Kick: "3"}, {Mass: "2", Duration: "0.04", Kick: "-1"}, {Mass: "0.5", Duration: "0.01"}}}
var physical = flight.Plan{Length: "1um", Stages: []flight.Stage{{Mass: "1u", Duration: "1ms", Kick: "1e-30kg*m/s"}, {Mass: "2 u", Duration: "0.5ms"}}}

func TestFlightPasses(t *testing.T) {
	for _, p := range []flight.Plan{scaled, physical} {
		r := verify(t, cert(t, p))
		if !r.Pass {
			t.Errorf("%+v: %+v", p, r.Failures)
		}
	}
}

// Re-sealed false claims are rejected: the reduction's numbers, the input
// behind them, and the embedded strip bracket.
func TestFlightTampering(t *testing.T) {
	cases := []struct {
		name  string
		plan  flight.Plan
		edit  func(f *certificates.Flight)
		where string
	}{
		{"shift", scaled, func(f *certificates.Flight) { f.Reduction.Shift = certificates.MustFraction("0.2") }, "reduction.shift"},
		{"shifted target", scaled, func(f *certificates.Flight) { f.Reduction.ShiftedTarget = certificates.MustFraction("1") }, "reduction.shifted_target"},
		{"time over mass", scaled, func(f *certificates.Flight) { f.Reduction.TimeOverMass = certificates.MustFraction("0.05") }, "reduction.time_over_mass"},
		{"stage mass", scaled, func(f *certificates.Flight) { f.Input.Stages[1].Mass = "3" }, "reduction.alpha"},
		{"kick", scaled, func(f *certificates.Flight) { f.Input.Stages[0].Kick = "4" }, "reduction.shift"},
		{"alpha everywhere", scaled, func(f *certificates.Flight) {
			f.Reduction.Alpha, f.Strip.Alpha.Value = certificates.MustAlpha("20"), certificates.MustAlpha("20")
		}, "reduction.alpha"},
		{"physical mass unit", physical, func(f *certificates.Flight) { f.Input.Stages[0].Mass = "1g" }, "reduction.alpha"},
		{"advantage", scaled, func(f *certificates.Flight) {
			f.Strip.Advantage.Lower, f.Strip.Advantage.Upper = certificates.MustDecimal("0.03"), certificates.MustDecimal("0.04")
		}, "strip.advantage"},
	}
	for _, c := range cases {
		ct := cert(t, c.plan)
		c.edit(ct.Flight)
		if err := certificates.Seal(ct); err != nil {
			t.Fatal(err)
		}
		r := verify(t, ct)
		if r.Pass {
			t.Errorf("%s: passed", c.name)
			continue
		}
		found := false
		for _, f := range r.Failures {
			found = found || f.Where == c.where
		}
		if !found {
			t.Errorf("%s: no failure at %s: %+v", c.name, c.where, r.Failures)
		}
	}
}

// The shipped flight certificate (testdata/flight.json, from
// testdata/flights/four-stages.json) passes.
func TestShippedFlight(t *testing.T) {
	c, err := certificates.ReadFile("../../../testdata/flight.json")
	if err != nil {
		t.Fatal(err)
	}
	if r := verify(t, c); !r.Pass {
		t.Errorf("shipped flight certificate fails: %+v", r.Failures)
	}
}
