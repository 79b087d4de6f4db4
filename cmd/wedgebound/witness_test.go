package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"wedgebound/certificates"
)

func witnessCmd(args []string, out, errb *bytes.Buffer) int { return runWitness(args, out, errb) }

// Bad input: one line on stderr and exit 2.
func TestWitnessBadInput(t *testing.T) {
	for _, args := range [][]string{
		{"--preset", "other"},
		{"--min-width", "0"},
		{"--min-width", "2", "--max-width", "1"},
		{"--ratio", "1"},
		{"--powers", "9"},
		{"--digits", "40"},
		{"--wigner", "w.txt"},
		{"--min-width", "1e-13", "--ratio", "1.1"},
		{"extra"},
	} {
		code, _, errs := runCmd(witnessCmd, args...)
		if code != 2 || strings.Count(strings.TrimSpace(errs), "\n") != 0 {
			t.Errorf("%v: exit %d, stderr %q", args, code, errs)
		}
	}
}

// A small basis end to end: --json has the decimal string bound, the
// certificate decodes, and the exports are written.
func TestWitnessSmallRun(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "w.json")
	csv := filepath.Join(dir, "w.csv")
	png := filepath.Join(dir, "w.png")
	code, stdout, errs := runCmd(witnessCmd, "--min-width", "0.05", "--max-width", "10", "--out", out, "--json", "--quiet", "--csv", csv, "--wigner", png)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var s struct{ Bound string }
	if err := json.Unmarshal([]byte(stdout), &s); err != nil {
		t.Fatal(err)
	}
	b := ratOf(t, s.Bound)
	// below the estimate 0.0384517 (Bracken and Melloy 1994; Penz et al. 2006)
	if b.Cmp(ratOf(t, "0.0384517")) > 0 || b.Cmp(ratOf(t, "0.03")) < 0 {
		t.Errorf("bound %s", s.Bound)
	}
	c, err := certificates.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if c.Kind != certificates.KindWitness || c.Witness.Bound.String() != s.Bound {
		t.Errorf("certificate kind %q bound %q", c.Kind, c.Witness.Bound)
	}
	data, err := os.ReadFile(csv)
	if err != nil || !strings.Contains(string(data), "amplitude,0.00,") || !strings.Contains(string(data), "density,") {
		t.Errorf("csv: %v", err)
	}
	if st, err := os.Stat(png); err != nil || st.Size() < 1000 {
		t.Errorf("wigner plot: %v", err)
	}
}

// report: the witness certificate's summary and table, alone and mixed
// with other kinds.
func TestWitnessReport(t *testing.T) {
	rep := func(args []string, out, errb *bytes.Buffer) int { return runReport(args, out, errb) }
	code, out, errs := runCmd(rep, "../../testdata/witness-small.json")
	if code != 0 || !strings.Contains(out, "claim: c_bm >= 0.037219145") {
		t.Fatalf("exit %d: %s %s", code, out, errs)
	}
	code, out, _ = runCmd(rep, "--format", "markdown", "../../testdata/witness-small.json")
	if code != 0 || !strings.Contains(out, "| 0.037219145 |") {
		t.Errorf("markdown: %s", out)
	}
	code, out, _ = runCmd(rep, "--format", "latex", "--standalone", "../../testdata/witness-small.json")
	if code != 0 || !strings.Contains(out, "\\begin{tabular}") {
		t.Errorf("latex: %s", out)
	}
	code, out, errs = runCmd(rep, "../../testdata/witness-small.json", "../../testdata/backflow.json")
	if code != 0 || !strings.Contains(out, "0.037219145") || !strings.Contains(out, "0.0394391") {
		t.Errorf("mixed kinds: exit %d: %s %s", code, out, errs)
	}
}
