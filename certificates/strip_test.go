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
	br := func(lo, hi string) StripBracket { return StripBracket{Lower: MustDecimal(lo), Upper: MustDecimal(hi)} }
	return &Certificate{Kind: KindStrip, Strip: &Strip{
		Alpha:            StripAlpha{Value: MustAlpha("50"), Lower: MustDecimal("50"), Upper: MustDecimal("50")},
		AlphaUsed:        MustDecimal("50"),
		Basis:            StripBasis,
		BasisSize:        2,
		Advantage:        br("0.029", "0.030"),
		Deficit:          br("0.99", "1"),
		AdvantageWitness: StripWitness{Coefficients: []SciDecimal{MustSci("0.6"), MustSci("-8e-1")}, Rayleigh: br("-0.0295", "-0.0294")},
		DeficitWitness:   StripWitness{Coefficients: []SciDecimal{MustSci("1"), MustSci("0")}, Rayleigh: br("0.98", "0.99")},
		GalerkinLowest:   MustDecimal("-0.0296"),
		GalerkinHighest:  MustDecimal("0.9999"),
		Errors:           StripErrors{AlphaRounding: MustDecimal("0"), DiscardedPart: MustDecimal("0.000000001"), DiscardedEtaX: MustDecimal("1.3"), DiscardedEtaY: MustDecimal("0.1")},
		Statement:        "sample",
		Certifier: StripCertifier{Method: "sample", WidthTarget: MustSci("1e-8"), QuadratureNodes: 34, QuadratureEta: MustDecimal("1.4"),
			LowestEstimate: MustDecimal("-0.02945"), HighestEstimate: MustDecimal("0.99998"), EntryRounding: MustDecimal("0"), EntryQuadrature: MustDecimal("0"),
			LowestShift: MustDecimal("0"), LowestResidual: MustDecimal("0"), HighestShift: MustDecimal("0"), HighestResidual: MustDecimal("0"),
			AdvantageWitnessQuadrature: MustDecimal("0"), DeficitWitnessQuadrature: MustDecimal("0")},
	}}
}

func TestStripRoundTrip(t *testing.T) {
	c := stripSample()
	c.Strip.Alpha = StripAlpha{Value: MustAlpha("2*pi*2767565111/1104345025000"), Lower: MustDecimal("0.0157"), Upper: MustDecimal("0.0158"),
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
	if c.Kind != KindStrip || c.Strip.Alpha.Value.String() != "50" || c.Strip.BasisSize < 1 {
		t.Errorf("unexpected content: kind %q alpha %q", c.Kind, c.Strip.Alpha.Value)
	}
}

func TestParseAlpha(t *testing.T) {
	for _, c := range []struct {
		in    string
		want  string
		twoPi bool
	}{{"50", "50", false}, {"1/3", "1/3", false}, {"2*pi*7/2", "7/2", true}, {"2*pi*0.5", "1/2", true}} {
		a, err := ParseAlpha(c.in)
		w, _ := new(big.Rat).SetString(c.want)
		if err != nil || a.Factor().Cmp(w) != 0 || a.TwoPi() != c.twoPi || a.String() != c.in {
			t.Errorf("%q: %v %v %v", c.in, a.Factor(), a.TwoPi(), err)
		}
	}
	for _, in := range []string{"", "0", "-1", "pi", "2*pi*", "2*pi*-3", "1/0", "NaN", "2pi*3", " 5", "2.5e1", "+5"} {
		if _, err := ParseAlpha(in); err == nil {
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
	// text replaces a number's text in the sealed sample (the reader
	// rejects it before the hash check).
	text := func(old, new string) []byte {
		b := sealed(t, stripSample())
		if !bytes.Contains(b, []byte(old)) {
			t.Fatalf("pattern %q not in the sample", old)
		}
		return bytes.Replace(b, []byte(old), []byte(new), 1)
	}
	cases := []struct {
		name string
		data []byte
		want string
	}{
		{"alpha value", text(`"value": "50"`, `"value": "fifty"`), "strip.alpha.value"},
		{"alpha non-positive", text(`"value": "50"`, `"value": "-5"`), "not positive"},
		{"alpha exponent", text(`"value": "50"`, `"value": "5e1"`), "strip.alpha.value"},
		{"units without 2 pi", mut(func(s *Strip) { s.Alpha.Units = &StripUnits{Mass: "1u", Length: "1um", Time: "1ms"} }), "not of the form 2*pi*r"},
		{"units incomplete", mut(func(s *Strip) {
			s.Alpha.Value = MustAlpha("2*pi*3")
			s.Alpha.Units = &StripUnits{Mass: "1u", Length: "", Time: "1ms"}
		}), "must all be given"},
		{"alpha enclosure reversed", mut(func(s *Strip) { s.Alpha.Lower = MustDecimal("51") }), "is not a positive interval"},
		{"alpha lower missing", mut(func(s *Strip) { s.Alpha.Lower = Decimal{} }), "strip.alpha.lower"},
		{"alpha lower empty", text(`"lower": "50"`, `"lower": ""`), "strip.alpha.lower: missing number"},
		{"alpha_used", mut(func(s *Strip) { s.AlphaUsed = MustDecimal("0") }), "alpha_used must be positive"},
		{"basis", mut(func(s *Strip) { s.Basis = "Chebyshev" }), "unknown basis"},
		{"basis size 0", mut(func(s *Strip) { s.BasisSize = 0 }), "basis_size 0"},
		{"basis size huge", mut(func(s *Strip) { s.BasisSize = MaxStripBasis + 1 }), "basis_size"},
		{"coefficient count", mut(func(s *Strip) { s.DeficitWitness.Coefficients = []SciDecimal{MustSci("1")} }), "1 coefficients for basis size 2"},
		{"coefficient NaN", text(`"-8e-1"`, `"NaN"`), "advantage_witness.coefficients[1]"},
		{"coefficient exponent range", text(`"-8e-1"`, `"-8e-1001"`), "exponent out of range"},
		{"coefficient exponent without sign", text(`"-8e-1"`, `"-8e1"`), "advantage_witness.coefficients[1]"},
		{"zero witness", mut(func(s *Strip) { s.DeficitWitness.Coefficients = []SciDecimal{MustSci("0"), MustSci("0.0")} }), "zero vector"},
		{"advantage reversed", mut(func(s *Strip) { s.Advantage = StripBracket{Lower: MustDecimal("0.03"), Upper: MustDecimal("0.029")} }), "strip.advantage: lower"},
		{"deficit inf", text(`"upper": "1"`, `"upper": "Inf"`), "strip.deficit.upper"},
		{"rayleigh reversed", mut(func(s *Strip) { s.DeficitWitness.Rayleigh.Lower = MustDecimal("1") }), "deficit_witness.rayleigh"},
		{"galerkin order", mut(func(s *Strip) { s.GalerkinLowest = MustDecimal("2") }), "galerkin_lowest exceeds"},
		{"negative error", mut(func(s *Strip) { s.Errors.DiscardedPart = MustDecimal("-0.000000001") }), "discarded_part is negative"},
		{"eta zero", mut(func(s *Strip) { s.Errors.DiscardedEtaY = MustDecimal("0") }), "discarded_eta_y must be positive"},
		{"certifier term", text(`"lowest_cholesky_residual": "0"`, `"lowest_cholesky_residual": "x"`), "lowest_cholesky_residual"},
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
