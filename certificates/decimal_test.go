package certificates

import (
	"bytes"
	"encoding/json"
	"io/fs"
	"math"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestShippedCertificatesRoundTrip: every certificate shipped in testdata
// reads strictly and encodes back to the very same bytes (so its hash is
// unchanged): the typed numbers keep the text they were read from, in all
// its spellings (plain decimals, p/q, 2*pi*r, exponent forms such as
// 5e-01 and 1e+00).
func TestShippedCertificatesRoundTrip(t *testing.T) {
	root := filepath.Join("..", "testdata")
	n := 0
	err := filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() || !strings.HasSuffix(path, ".json") {
			return err
		}
		b, err := os.ReadFile(path)
		if err != nil {
			return err
		}
		var probe map[string]json.RawMessage
		if json.Unmarshal(b, &probe) != nil || probe["schema"] == nil {
			return nil // an input file (problem, flight plan, terms), not a certificate
		}
		n++
		c, err := Decode(b)
		if err != nil {
			t.Errorf("%s: %v", path, err)
			return nil
		}
		out, err := Encode(c)
		if err != nil {
			t.Errorf("%s: encode: %v", path, err)
			return nil
		}
		if !bytes.Equal(out, b) {
			t.Errorf("%s: re-encoding changed the bytes", path)
		}
		h, err := Hash(c)
		if err != nil || h != c.SHA256 {
			t.Errorf("%s: hash %s, recorded %s (%v)", path, h, c.SHA256, err)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if n < 8 {
		t.Errorf("found %d shipped certificates, expected at least 8", n)
	}
}

// TestGrammars: each number type accepts its own grammar and nothing else
// (the grammars are in the package doc).
func TestGrammars(t *testing.T) {
	plainOK := []string{"0", "-0", "12", "-3.25", "0.000125", "007", "1.50"}
	plainBad := []string{"", " 1", "1 ", "+1", ".5", "5.", "1e5", "1e-05", "1E5", "0x1", "0b1", "0o7", "1_0", "NaN", "Inf", "-Infinity", "1/2", "--1", "1.2.3", "١"}
	for _, s := range plainOK {
		d, err := ParseDecimal(s)
		if err != nil || d.String() != s {
			t.Errorf("ParseDecimal(%q) = %v, %v", s, d, err)
		}
	}
	for _, s := range plainBad {
		if d, err := ParseDecimal(s); err == nil {
			t.Errorf("ParseDecimal(%q) accepted as %v", s, d)
		}
	}
	sciOK := map[string]*big.Rat{"5e-01": big.NewRat(1, 2), "1e+00": big.NewRat(1, 1), "-2.5e+02": big.NewRat(-250, 1), "0": new(big.Rat), "-1": big.NewRat(-1, 1), "7e-1000": new(big.Rat).SetFrac(big.NewInt(7), new(big.Int).Exp(big.NewInt(10), big.NewInt(1000), nil))}
	for s, want := range sciOK {
		d, err := ParseSci(s)
		if err != nil || d.Rat().Cmp(want) != 0 || d.String() != s {
			t.Errorf("ParseSci(%q) = %v, %v", s, d, err)
		}
	}
	for _, s := range []string{"", "1e5", "1E-5", "1e+", "1e-1001", "1e+1001", "e-5", ".5e-1", "1e-5 ", "NaN", "1/2", "0x1p-2"} {
		if d, err := ParseSci(s); err == nil {
			t.Errorf("ParseSci(%q) accepted as %v", s, d)
		}
	}
	if _, err := ParseSci("1e-1001"); err == nil || !strings.Contains(err.Error(), "exponent out of range") {
		t.Errorf("ParseSci(1e-1001): %v, want an exponent range error", err)
	}
	if _, err := ParseDecimal(strings.Repeat("1", maxNumberLen+1)); err == nil {
		t.Errorf("a %d-digit number was accepted", maxNumberLen+1)
	}
	for _, s := range []string{"none", "1/4", "0"} {
		var th ThresholdValue
		if err := th.UnmarshalText([]byte(s)); err != nil || th.String() != s || th.None() != (s == "none") {
			t.Errorf("threshold %q: %v %v", s, th, err)
		}
	}
	var th ThresholdValue
	if err := th.UnmarshalText([]byte("None")); err == nil {
		t.Errorf("threshold None accepted")
	}
}

// TestPrinters checks the printers against values worked by hand (common
// practice: the exact decimal expansion of a binary fraction).
func TestPrinters(t *testing.T) {
	for _, c := range []struct {
		r    *big.Rat
		want string
	}{{big.NewRat(1, 2), "0.5"}, {big.NewRat(-3, 1), "-3"}, {big.NewRat(1, 8000), "0.000125"}, {big.NewRat(1, 3), "1/3"}, {big.NewRat(-7, 6), "-7/6"}, {new(big.Rat), "0"}} {
		if got := FractionText(c.r); got != c.want {
			t.Errorf("FractionText(%s) = %q, want %q", c.r.RatString(), got, c.want)
		}
		d, err := DecimalOf(c.r)
		if strings.Contains(c.want, "/") != (err != nil) || err == nil && d.String() != c.want {
			t.Errorf("DecimalOf(%s) = %v, %v", c.r.RatString(), d, err)
		}
	}
	for _, c := range []struct {
		x             float64
		always, units string
	}{{0.5, "5e-01", "5e-01"}, {1, "1e+00", "1"}, {-2.5, "-2.5e+00", "-2.5"}, {0, "0", "0"}, {100, "1e+02", "1e+02"},
		{0.1, "1.000000000000000055511151231257827021181583404541015625e-01", "1.000000000000000055511151231257827021181583404541015625e-01"}} {
		a, err1 := SciFloat(c.x, SciAlways)
		u, err2 := SciFloat(c.x, SciPlainUnits)
		if err1 != nil || err2 != nil || a.String() != c.always || u.String() != c.units {
			t.Errorf("SciFloat(%v) = %q, %q; want %q, %q", c.x, a, u, c.always, c.units)
		}
		if a.Rat().Cmp(new(big.Rat).SetFloat64(c.x)) != 0 {
			t.Errorf("SciFloat(%v) is not exact", c.x)
		}
		if _, err := ParseSci(a.String()); err != nil {
			t.Errorf("SciFloat(%v) = %q does not read back: %v", c.x, a, err)
		}
	}
	if _, err := SciFloat(math.NaN(), SciAlways); err == nil {
		t.Errorf("SciFloat(NaN) accepted")
	}
	if d, err := FloatDecimal(0.1); err != nil || d.String() != "0.1000000000000000055511151231257827021181583404541015625" {
		t.Errorf("FloatDecimal(0.1) = %v, %v", d, err)
	}
	if d, err := ShortDecimal(0.1); err != nil || d.String() != "0.1" {
		t.Errorf("ShortDecimal(0.1) = %v, %v", d, err)
	}
	a, err := AlphaOf(big.NewRat(7, 2), true)
	if err != nil || a.String() != "2*pi*3.5" || !a.TwoPi() {
		t.Errorf("AlphaOf(7/2, 2 pi) = %v, %v", a, err)
	}
}

// TestQuantity checks the one reader of physical input against the SI
// factors (exact h = 6.62607015e-34 J s since 2019; CODATA 2018 atomic mass
// unit 1.66053906660e-27 kg).
func TestQuantity(t *testing.T) {
	rat := func(s string) *big.Rat { r, _ := new(big.Rat).SetString(s); return r }
	for _, c := range []struct {
		s    string
		d    Dimension
		phys bool
		want string
	}{{"87 u", Mass, true, "1.44466898794200e-25"}, {"0.2 ms", Duration, true, "0.0002"}, {"2 um", Length, true, "0.000002"},
		{"1e-28 kg*m/s", Momentum, true, "1e-28"}, {"3 u*mm/s", Momentum, true, "4.9816171998e-30"}, {"1.5", Mass, false, "1.5"}, {"-2", Length, false, "-2"}} {
		got, err := ParseQuantity(c.s, c.d, c.phys)
		if err != nil || got.Cmp(rat(c.want)) != 0 {
			t.Errorf("ParseQuantity(%q) = %v, %v; want %s", c.s, got, err, c.want)
		}
	}
	for _, c := range []struct {
		s    string
		d    Dimension
		phys bool
	}{{"87", Mass, true}, {"87 u", Mass, false}, {"1 parsec", Length, true}, {"1 kg", Length, true}, {"x u", Mass, true}, {"", Mass, true}} {
		if v, err := ParseQuantity(c.s, c.d, c.phys); err == nil {
			t.Errorf("ParseQuantity(%q, %s, %v) accepted as %v", c.s, c.d, c.phys, v)
		}
	}
	r, err := (&StripUnits{Mass: "1 kg", Length: "1 m", Time: "1 s"}).AlphaFactor()
	if err != nil || r.Cmp(new(big.Rat).Inv(Planck())) != 0 {
		t.Errorf("alpha factor of 1 kg, 1 m, 1 s: %v, %v; want 1/h", r, err)
	}
}

// TestSupportsClaim: the exact check that the recorded numbers support the
// claim (seen here, not a published source: a cell below -bound fails).
func TestSupportsClaim(t *testing.T) {
	c := sample()
	if err := c.Relaxation.SupportsClaim(); err != nil {
		t.Fatalf("sample: %v", err)
	}
	c.Relaxation.Cover[1].EigLower = MustDecimal("-0.061")
	if err := c.Relaxation.SupportsClaim(); err == nil || !strings.Contains(err.Error(), "cover cell 2") {
		t.Errorf("cell below -bound: %v", err)
	}
	c = sample()
	c.Relaxation.Above.Bound = MustDecimal("-0.07")
	if err := c.Relaxation.SupportsClaim(); err == nil || !strings.Contains(err.Error(), "tail_above") {
		t.Errorf("tail below -bound: %v", err)
	}
	n := NormalForm{A: MustFraction("1"), B: MustFraction("2"), D: MustFraction("1"), Threshold: MustThreshold("1/8")}
	if err := n.CheckThreshold(); err != nil {
		t.Errorf("1/(4*2) = 1/8: %v", err)
	}
	n.Threshold = MustThreshold("0.125")
	if err := n.CheckThreshold(); err != nil {
		t.Errorf("0.125 = 1/8: %v", err)
	}
	n.Threshold = MustThreshold("0.12")
	if err := n.CheckThreshold(); err == nil {
		t.Errorf("0.12 accepted as 1/8")
	}
	n = NormalForm{A: MustFraction("0"), B: MustFraction("2"), D: MustFraction("1"), Threshold: MustThreshold(NoThreshold)}
	if err := n.CheckThreshold(); err != nil {
		t.Errorf("a b = 0 < d, none: %v", err)
	}
}
