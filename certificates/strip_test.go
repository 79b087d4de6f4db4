package certificates

import (
	"bytes"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// stripSample is a structurally valid strip section (the numbers are not a
// true bracket; the schema checks form, not mathematics).
func stripSample() *Certificate {
	br := func(lo, hi string) StripBracket { return StripBracket{Lower: lo, Upper: hi} }
	return &Certificate{Kind: KindStrip, Strip: &Strip{
		Alpha:            StripAlpha{Value: "50", Lower: "50", Upper: "50"},
		AlphaUsed:        "50",
		Basis:            StripBasis,
		BasisSize:        2,
		Advantage:        br("0.029", "0.030"),
		Deficit:          br("0.99", "1"),
		AdvantageWitness: StripWitness{Coefficients: []string{"0.6", "-8e-1"}, Rayleigh: br("-0.0295", "-0.0294")},
		DeficitWitness:   StripWitness{Coefficients: []string{"1", "0"}, Rayleigh: br("0.98", "0.99")},
		GalerkinLowest:   "-0.0296",
		GalerkinHighest:  "0.9999",
		Errors:           StripErrors{AlphaRounding: "0", DiscardedPart: "1e-9", DiscardedEtaX: "1.3", DiscardedEtaY: "0.1"},
		Statement:        "sample",
		Certifier: StripCertifier{Method: "sample", WidthTarget: "1e-8", QuadratureNodes: 34, QuadratureEta: "1.4",
			LowestEstimate: "-0.02945", HighestEstimate: "0.99998", EntryRounding: "0", EntryQuadrature: "0",
			LowestShift: "0", LowestResidual: "0", HighestShift: "0", HighestResidual: "0",
			AdvantageWitnessQuadrature: "0", DeficitWitnessQuadrature: "0"},
	}}
}

func TestStripRoundTrip(t *testing.T) {
	c := stripSample()
	c.Strip.Alpha = StripAlpha{Value: "2*pi*2767565111/1104345025000", Lower: "0.0157", Upper: "0.0158",
		Units: &StripUnits{Mass: "1u", Length: "1um", Time: "1ms"}}
	b := sealed(t, c)
	d, err := Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	if d.Strip.Alpha.Units == nil || d.Strip.Alpha.Units.Mass != "1u" || len(d.Strip.AdvantageWitness.Coefficients) != 2 {
		t.Errorf("round trip lost data: %+v", d.Strip)
	}
	// Written with WriteFile and read back.
	p := filepath.Join(t.TempDir(), "s.json")
	if err := WriteFile(p, stripSample()); err != nil {
		t.Fatal(err)
	}
	if _, err := ReadFile(p); err != nil {
		t.Fatal(err)
	}
}

// The shipped certificate decodes (its hash and every field check out).
func TestShippedStripDecodes(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", "testdata", "strip-alpha50.json"))
	if err != nil {
		t.Skipf("no shipped strip certificate: %v", err)
	}
	c, err := Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	if c.Kind != KindStrip || c.Strip.Alpha.Value != "50" || c.Strip.BasisSize < 1 {
		t.Errorf("unexpected content: kind %q alpha %q", c.Kind, c.Strip.Alpha.Value)
	}
}

func TestParseStripAlpha(t *testing.T) {
	for _, c := range []struct {
		in    string
		want  string
		twoPi bool
	}{{"50", "50", false}, {"1/3", "1/3", false}, {"2*pi*7/2", "7/2", true}, {"2.5e1", "25", false}} {
		r, tp, err := ParseStripAlpha(c.in)
		w, _ := new(big.Rat).SetString(c.want)
		if err != nil || r.Cmp(w) != 0 || tp != c.twoPi {
			t.Errorf("%q: %v %v %v", c.in, r, tp, err)
		}
	}
	for _, in := range []string{"", "0", "-1", "pi", "2*pi*", "2*pi*-3", "1/0", "NaN", "2pi*3", " 5"} {
		if _, _, err := ParseStripAlpha(in); err == nil {
			t.Errorf("%q accepted", in)
		}
	}
}

// Every malformed strip section is rejected with a one-line error naming
// the field.
func TestStripStrictValidation(t *testing.T) {
	mut := func(f func(s *Strip)) []byte {
		c := stripSample()
		f(c.Strip)
		return sealed(t, c)
	}
	cases := []struct {
		name string
		data []byte
		want string
	}{
		{"alpha value", mut(func(s *Strip) { s.Alpha.Value = "fifty" }), "strip.alpha.value"},
		{"alpha non-positive", mut(func(s *Strip) { s.Alpha.Value = "-5" }), "not positive"},
		{"units without 2 pi", mut(func(s *Strip) { s.Alpha.Units = &StripUnits{Mass: "1u", Length: "1um", Time: "1ms"} }), "not of the form 2*pi*r"},
		{"units incomplete", mut(func(s *Strip) {
			s.Alpha.Value = "2*pi*3"
			s.Alpha.Units = &StripUnits{Mass: "1u", Length: "", Time: "1ms"}
		}), "must all be given"},
		{"alpha enclosure reversed", mut(func(s *Strip) { s.Alpha.Lower = "51" }), "is not a positive interval"},
		{"alpha lower missing", mut(func(s *Strip) { s.Alpha.Lower = "" }), "strip.alpha.lower"},
		{"alpha_used", mut(func(s *Strip) { s.AlphaUsed = "0" }), "alpha_used must be positive"},
		{"basis", mut(func(s *Strip) { s.Basis = "Chebyshev" }), "unknown basis"},
		{"basis size 0", mut(func(s *Strip) { s.BasisSize = 0 }), "basis_size 0"},
		{"basis size huge", mut(func(s *Strip) { s.BasisSize = MaxStripBasis + 1 }), "basis_size"},
		{"coefficient count", mut(func(s *Strip) { s.DeficitWitness.Coefficients = []string{"1"} }), "1 coefficients for basis size 2"},
		{"coefficient NaN", mut(func(s *Strip) { s.AdvantageWitness.Coefficients[1] = "NaN" }), "advantage_witness.coefficients[1]"},
		{"zero witness", mut(func(s *Strip) { s.DeficitWitness.Coefficients = []string{"0", "0.0"} }), "zero vector"},
		{"advantage reversed", mut(func(s *Strip) { s.Advantage = StripBracket{Lower: "0.03", Upper: "0.029"} }), "strip.advantage: lower"},
		{"deficit inf", mut(func(s *Strip) { s.Deficit.Upper = "Inf" }), "strip.deficit.upper"},
		{"rayleigh reversed", mut(func(s *Strip) { s.DeficitWitness.Rayleigh.Lower = "1" }), "deficit_witness.rayleigh"},
		{"galerkin order", mut(func(s *Strip) { s.GalerkinLowest = "2" }), "galerkin_lowest exceeds"},
		{"negative error", mut(func(s *Strip) { s.Errors.DiscardedPart = "-1e-9" }), "discarded_part is negative"},
		{"eta zero", mut(func(s *Strip) { s.Errors.DiscardedEtaY = "0" }), "discarded_eta_y must be positive"},
		{"certifier term", mut(func(s *Strip) { s.Certifier.LowestResidual = "x" }), "lowest_cholesky_residual"},
		{"nodes", mut(func(s *Strip) { s.Certifier.QuadratureNodes = -1 }), "quadrature_nodes"},
		{"unknown field", bytes.Replace(sealed(t, stripSample()), []byte(`"basis_size"`), []byte(`"extra": 1, "basis_size"`), 1), "unknown field"},
		{"missing section", func() []byte { c := stripSample(); c.Strip = nil; return sealed(t, c) }(), "exactly the strip section"},
	}
	for _, c := range cases {
		_, err := Decode(c.data)
		if err == nil {
			t.Errorf("%s: accepted", c.name)
			continue
		}
		if msg := err.Error(); !strings.Contains(msg, c.want) || strings.Contains(msg, "\n") {
			t.Errorf("%s: error %q, want one line containing %q", c.name, msg, c.want)
		}
	}
	// An edit after sealing is reported as a stale hash.
	b := bytes.Replace(sealed(t, stripSample()), []byte(`"0.029"`), []byte(`"0.0291"`), 1)
	if _, err := Decode(b); err == nil || !strings.Contains(err.Error(), "stale") {
		t.Errorf("unsealed edit: %v", err)
	}
}
