package certificates

import (
	"bytes"
	"encoding/json"
	"errors"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// sample returns a small valid, unsealed relaxation certificate (the
// backflow normal form with one term; the numbers are illustrative, not a
// proof).
func sample() *Certificate {
	return &Certificate{
		Kind: KindRelaxation,
		Relaxation: &Relaxation{
			Problem: Problem{
				Vertex: [2]Fraction{MustFraction("0"), MustFraction("0")}, Rays: [2][2]Fraction{{MustFraction("0"), MustFraction("1")}, {MustFraction("-1"), MustFraction("1")}},
				Halfplane: Halfplane{Normal: [2]Fraction{MustFraction("0"), MustFraction("1")}, Offset: MustFraction("0")}, Edge: "lower",
			},
			Normal:        NormalForm{Map: [4]Fraction{MustFraction("1"), MustFraction("1"), MustFraction("-1"), MustFraction("0")}, A: MustFraction("1"), B: MustFraction("1"), D: MustFraction("0"), Threshold: NewThreshold(new(big.Rat))},
			Terms:         []Term{{Kind: "exp", Params: map[string]Decimal{"k": MustDecimal("150")}, Weight: MustDecimal("8.46")}},
			Claim:         Claim{Edge: "lower", Bound: MustDecimal("0.06"), Statement: "-inf spec(P Op(chi_W) P) <= 0.06"},
			PrecisionBits: 53,
			Cover: []Cell{
				{Lo: MustDecimal("-8"), Hi: MustDecimal("-1"), EigLower: MustDecimal("-0.05"), EigUpper: MustDecimal("-0.01")},
				{Lo: MustDecimal("-1"), Hi: MustDecimal("0.5"), EigLower: MustDecimal("-0.059"), EigUpper: MustDecimal("0.2")},
				{Lo: MustDecimal("0.5"), Hi: MustDecimal("8"), EigLower: MustDecimal("-0.04"), EigUpper: MustDecimal("0.9")},
			},
			Below:  Tail{From: MustDecimal("-8"), Bound: MustDecimal("-0.055"), Lemma: "quadrant-exp-tail-v1"},
			Above:  Tail{From: MustDecimal("8"), Bound: MustDecimal("-0.055"), Lemma: "quadrant-exp-tail-v1"},
			Budget: Budget{Quadrature: MustDecimal("0.000000000000001"), Truncation: MustDecimal("0.000000000000000000001"), Tails: MustDecimal("0.05"), Rounding: MustDecimal("0.0000000000000002")},
		},
	}
}

func sealed(t *testing.T, c *Certificate) []byte {
	t.Helper()
	if err := Seal(c); err != nil {
		t.Fatal(err)
	}
	b, err := Encode(c)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// TestRoundTrip: a sealed certificate decodes with its hash, in indented and
// compact form (the hash is over the canonical content, not the bytes).
func TestRoundTrip(t *testing.T) {
	c := sample()
	b := sealed(t, c)
	if c.Schema != Schema || c.Tool.Name == "" || c.Tool.Version != Version || len(c.SHA256) != 64 {
		t.Errorf("Seal left schema %q tool %v hash %q", c.Schema, c.Tool, c.SHA256)
	}
	d, err := Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	if d.SHA256 != c.SHA256 || d.Relaxation.Claim.Bound.String() != c.Relaxation.Claim.Bound.String() || d.Relaxation.Claim.Statement != c.Relaxation.Claim.Statement || d.Relaxation.Terms[0].Params["k"].String() != "150" {
		t.Errorf("round trip changed the content")
	}
	var compact bytes.Buffer
	if err := json.Compact(&compact, b); err != nil {
		t.Fatal(err)
	}
	if _, err := Decode(compact.Bytes()); err != nil {
		t.Errorf("compact form: %v", err)
	}
	// Hash does not depend on the stored hash field.
	h1, _ := Hash(c)
	c.SHA256 = "deadbeef"
	h2, _ := Hash(c)
	if h1 != h2 {
		t.Errorf("Hash depends on the sha256 field")
	}
}

// TestStaleHash: any change to the content after sealing is reported as
// ErrStaleHash.
func TestStaleHash(t *testing.T) {
	b := sealed(t, sample())
	for _, c := range []struct{ old, new string }{
		{`"bound": "0.06"`, `"bound": "0.05"`},
		{`"eig_lower": "-0.059"`, `"eig_lower": "-0.058"`},
		{`"weight": "8.46"`, `"weight": "8.47"`},
		{`"version": "` + Version + `"`, `"version": "9.9.9"`},
	} {
		bad := bytes.Replace(b, []byte(c.old), []byte(c.new), 1)
		if bytes.Equal(bad, b) {
			t.Fatalf("pattern %s not found", c.old)
		}
		_, err := Decode(bad)
		if !errors.Is(err, ErrStaleHash) {
			t.Errorf("%s -> %s: error %v, want ErrStaleHash", c.old, c.new, err)
		}
	}
}

// TestDecodeErrors checks the strict reader: each defect gives one clear
// one-line error.
func TestDecodeErrors(t *testing.T) {
	good := sealed(t, sample())
	replace := func(old, new string) []byte {
		if !bytes.Contains(good, []byte(old)) {
			t.Fatalf("pattern %q not in the sample", old)
		}
		return bytes.Replace(good, []byte(old), []byte(new), 1)
	}
	// Struct-level mutations, resealed so that only the defect is wrong.
	mut := func(f func(c *Certificate)) []byte {
		c := sample()
		f(c)
		return sealed(t, c)
	}
	cases := []struct {
		name string
		data []byte
		want string
	}{
		{"unknown top-level field", replace(`"kind":`, `"colour": "red", "kind":`), "unknown field"},
		{"unknown nested field", replace(`"lemma": "quadrant-exp-tail-v1"`, `"lemma": "quadrant-exp-tail-v1", "note": 1`), "unknown field"},
		{"trailing data", append(append([]byte{}, good...), []byte(`{"x": 1}`)...), "trailing data"},
		{"not JSON", []byte(`certificate`), "malformed certificate"},
		{"number not string", replace(`"bound": "0.06"`, `"bound": 0.06`), "malformed certificate"},
		{"wrong schema", replace(`"schema": "`+Schema+`"`, `"schema": "other/v1"`), "unknown schema"},
		{"missing schema", mut(func(c *Certificate) {}), ""}, // placeholder, replaced below
		{"missing tool", mut(func(c *Certificate) {}), ""},
		// Numbers that do not read fail in the reader, before the hash
		// check, with the field named.
		{"NaN", replace(`"eig_lower": "-0.059"`, `"eig_lower": "NaN"`), "relaxation.cover[1].eig_lower: \"NaN\" is not a finite decimal"},
		{"Inf", replace(`"bound": "-0.055"`, `"bound": "-Inf"`), "not a finite decimal"},
		{"Infinity", replace(`"bound": "0.06"`, `"bound": "Infinity"`), "not a finite decimal"},
		{"exponent in a plain field", replace(`"lo": "-8"`, `"lo": "-8e1"`), "relaxation.cover[0].lo: \"-8e1\" is not a plain decimal"},
		{"hex", replace(`"weight": "8.46"`, `"weight": "0x10"`), "not a plain decimal"},
		{"fraction where a decimal is required", replace(`"bound": "0.06"`, `"bound": "3/50"`), "not a plain decimal"},
		{"padded number", replace(`"bound": "0.06"`, `"bound": " 0.06"`), "not a plain decimal"},
		{"missing bound", replace(`"bound": "0.06"`, `"bound": ""`), "claim.bound: missing number"},
		{"null bound", replace(`"bound": "0.06"`, `"bound": null`), "claim.bound: missing number"},
		{"missing weight", replace(`"weight": "8.46"`, `"weight": ""`), "terms[0].weight: missing number"},
		{"unset weight", mut(func(c *Certificate) { c.Relaxation.Terms[0].Weight = Decimal{} }), "terms[0].weight: missing number"},
		{"missing term kind", mut(func(c *Certificate) { c.Relaxation.Terms[0].Kind = "" }), "missing kind"},
		{"missing params", mut(func(c *Certificate) { c.Relaxation.Terms[0].Params = nil }), "missing params"},
		{"missing lemma", mut(func(c *Certificate) { c.Relaxation.Above.Lemma = "" }), "missing lemma"},
		{"missing budget", replace(`"tails": "0.05"`, `"tails": ""`), "error_budget.tails: missing number"},
		{"negative budget", mut(func(c *Certificate) { c.Relaxation.Budget.Rounding = MustDecimal("-0.0000000000000001") }), "negative"},
		{"missing threshold", mut(func(c *Certificate) { c.Relaxation.Normal.Threshold = ThresholdValue{} }), "normal_form.threshold"},
		{"missing precision", mut(func(c *Certificate) { c.Relaxation.PrecisionBits = 0 }), "precision_bits"},
		{"no cells", mut(func(c *Certificate) { c.Relaxation.Cover = nil }), "no cells"},
		{"gap", mut(func(c *Certificate) { c.Relaxation.Cover[1].Lo = MustDecimal("-0.9") }), "gap in the cover"},
		{"overlap", mut(func(c *Certificate) { c.Relaxation.Cover[1].Lo = MustDecimal("-1.5") }), "overlaps"},
		{"lo = hi", mut(func(c *Certificate) {
			c.Relaxation.Cover[1].Hi = MustDecimal("-1")
			c.Relaxation.Cover[2].Lo = MustDecimal("-1")
		}), "is not below hi"},
		{"lo > hi", mut(func(c *Certificate) {
			c.Relaxation.Cover[1].Hi = MustDecimal("-2")
			c.Relaxation.Cover[2].Lo = MustDecimal("-2")
		}), "is not below hi"},
		{"eig order", mut(func(c *Certificate) { c.Relaxation.Cover[0].EigUpper = MustDecimal("-0.06") }), "eig_lower exceeds eig_upper"},
		{"bad edge", mut(func(c *Certificate) { c.Relaxation.Problem.Edge = "middle" }), "problem.edge must be"},
		{"claim edge differs", mut(func(c *Certificate) { c.Relaxation.Claim.Edge = "upper" }), "differs from problem.edge"},
		{"tail detached below", mut(func(c *Certificate) { c.Relaxation.Below.From = MustDecimal("-9") }), "tail_below starts at -9"},
		{"tail detached above", mut(func(c *Certificate) { c.Relaxation.Above.From = MustDecimal("8.0") }), "tail_above starts at 8.0"},
		{"bad problem fraction", replace(`"vertex": [`+"\n"+`    "0"`, `"vertex": [`+"\n"+`    "1/0"`), "relaxation.problem.vertex[0]: division by zero"},
		{"unknown kind", mut(func(c *Certificate) { c.Kind = "other" }), "unknown certificate kind"},
		{"kind mismatch", mut(func(c *Certificate) { c.Kind = KindStrip }), "exactly the strip section"},
		{"strip incomplete", mut(func(c *Certificate) {
			c.Kind = KindStrip
			c.Relaxation = nil
			c.Strip = &Strip{Alpha: StripAlpha{Value: MustAlpha("10")}}
		}), "strip."},
		{"both sections", mut(func(c *Certificate) { c.Strip = stripSample().Strip }), "exactly the relaxation section"},
		{"missing hash", replace(`"sha256": "`, `"sha256": "0`), "hash is stale"},
	}
	// Missing schema or tool: Seal always fills them in, so remove them from
	// the bytes (the hash check comes after these checks).
	cases[6].data, cases[6].want = replace(`"schema": "`+Schema+`",`, ``), "unknown schema"
	cases[7].data, cases[7].want = replace(`"name": "wedgebound"`, `"name": ""`), "missing tool name"
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
}

// TestParseFraction checks exact parsing of decimals and fractions.
func TestParseFraction(t *testing.T) {
	for s, want := range map[string]*big.Rat{
		"1/3": big.NewRat(1, 3), "-2/4": big.NewRat(-1, 2), "0.5": big.NewRat(1, 2), "1500": big.NewRat(1500, 1),
		"2.5/0.5": big.NewRat(5, 1), "-0": big.NewRat(0, 1), "0.001/0.001": big.NewRat(1, 1),
	} {
		got, err := ParseFraction(s)
		if err != nil || got.Rat().Cmp(want) != 0 || got.String() != s {
			t.Errorf("ParseFraction(%q) = %v, %v; want %s", s, got, err, want.RatString())
		}
	}
	for _, s := range []string{"", "1/0", "1/", "/2", "1/2/3", "a/b", "1/ 2", " 1/2", "NaN", "Inf/1", "1e1001", "0x1/2", "1_0/3", "1/0.0", "1.5e3", "1e-3/1e-3"} {
		if r, err := ParseFraction(s); err == nil {
			t.Errorf("ParseFraction(%q) accepted as %s", s, r.Rat().RatString())
		} else if strings.Contains(err.Error(), "\n") {
			t.Errorf("ParseFraction(%q) error %q is not one line", s, err)
		}
	}
	for _, s := range []string{"1/2", "+", "-", ".", "e5", "1e", "1p3", "+1", ".5", "5.", "1e5", "1E-5"} {
		if _, err := ParseDecimal(s); err == nil {
			t.Errorf("ParseDecimal(%q) accepted", s)
		}
	}
}

// TestWriteAtomic: the file appears complete with mode 0644, no temporary
// file remains, an existing file is replaced, and a write into a missing
// directory fails without leaving anything.
func TestWriteAtomic(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "cert.json")
	if err := os.WriteFile(path, []byte("old"), 0o600); err != nil {
		t.Fatal(err)
	}
	data := []byte(`{"x": 1}` + "\n")
	if err := WriteAtomic(path, data); err != nil {
		t.Fatal(err)
	}
	got, err := os.ReadFile(path)
	if err != nil || !bytes.Equal(got, data) {
		t.Errorf("read back %q, %v", got, err)
	}
	st, err := os.Stat(path)
	if err != nil {
		t.Fatal(err)
	}
	if m := st.Mode().Perm(); m != 0o644 {
		t.Errorf("mode %v, want 0644", m)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		var names []string
		for _, e := range entries {
			names = append(names, e.Name())
		}
		t.Errorf("directory holds %v, want only cert.json", names)
	}
	missing := filepath.Join(dir, "no", "such", "dir", "c.json")
	if err := WriteAtomic(missing, data); err == nil {
		t.Errorf("write into a missing directory succeeded")
	}
	entries, _ = os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("failed write left %d entries", len(entries))
	}
}

// TestWriteFileReadFile: WriteFile seals and writes; ReadFile verifies; a
// file edited on disk is reported stale.
func TestWriteFileReadFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "c.json")
	c := sample()
	if err := WriteFile(path, c); err != nil {
		t.Fatal(err)
	}
	back, err := ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if back.SHA256 != c.SHA256 {
		t.Errorf("hash %s, written %s", back.SHA256, c.SHA256)
	}
	b, _ := os.ReadFile(path)
	b = bytes.Replace(b, []byte(`"bound": "0.06"`), []byte(`"bound": "0.04"`), 1)
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := ReadFile(path); !errors.Is(err, ErrStaleHash) {
		t.Errorf("edited file: %v, want ErrStaleHash", err)
	}
	if _, err := ReadFile(filepath.Join(dir, "absent.json")); err == nil {
		t.Errorf("missing file read without error")
	}
}
