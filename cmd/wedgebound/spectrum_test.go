package main

import (
	"bytes"
	"encoding/json"
	"math/big"
	"os"
	"strconv"
	"strings"
	"testing"
)

// TestSpectrumFlagErrors checks the one-line errors and exit code 2 for bad
// command lines.
func TestSpectrumFlagErrors(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{}, "exactly one of"},
		{[]string{"--quadrant", "--term", "band,from=0,to=1,weight=1"}, "exactly one of"},
		{[]string{"--term", "band,from=0,to=1"}, "no weight=W"},
		{[]string{"--term", "band,from=0,from=1,to=2,weight=1"}, "given twice"},
		{[]string{"--term", "band,from,to=2,weight=1"}, "not NAME=VALUE"},
		{[]string{"--term", "disc,r=1,weight=1"}, "unknown term kind"},
		{[]string{"--term", "band,from=2,to=1,weight=1"}, "from < to"},
		{[]string{"--term", "hat,left=0,peak=1,right=2,weight=NaN"}, "not a finite number"},
		{[]string{"--term", "band,from=0,to=1,weight=1", "--digits", "9"}, "at most 5 digits"},
		{[]string{"--term", "exp,k=150,weight=8.46", "--digits", "41"}, "at most 40 digits"},
		{[]string{"--quadrant", "--digits", "5001"}, "outside 1..5000"},
		{[]string{"--quadrant", "--digits", "0"}, "outside 1..5000"},
	} {
		var out, errb bytes.Buffer
		if rc := runSpectrum(c.args, &out, &errb); rc != 2 {
			t.Errorf("%v: exit %d, want 2", c.args, rc)
		}
		msg := errb.String()
		if !strings.Contains(msg, c.want) || strings.Count(strings.TrimSpace(msg), "\n") != 0 {
			t.Errorf("%v: stderr %q, want one line containing %q", c.args, msg, c.want)
		}
	}
}

// TestTermSpecsJSON checks the --term syntax against the terms-file form.
func TestTermSpecsJSON(t *testing.T) {
	got, err := termSpecsJSON([]string{"band,from=0,to=2,weight=0.3", "hat, left=0, peak=1, right=4, weight=-1/2"})
	if err != nil {
		t.Fatal(err)
	}
	var specs []termSpec
	if err := json.Unmarshal(got, &specs); err != nil {
		t.Fatal(err)
	}
	if len(specs) != 2 || specs[0].Kind != "band" || specs[0].Params["to"] != "2" || specs[0].Weight != "0.3" ||
		specs[1].Kind != "hat" || specs[1].Params["peak"] != "1" || specs[1].Weight != "-1/2" || len(specs[1].Params) != 3 {
		t.Errorf("parsed %+v", specs)
	}
}

// TestSpectrumQuadrantJSON runs the bare quadrant at 10 digits; the values
// are the 20-digit mpmath values of the regions package doc (not a
// published source; R. F. Werner, J. Phys. A 21 (1988) 4565 gives
// -0.15594 and 1.00768, from memory).
func TestSpectrumQuadrantJSON(t *testing.T) {
	var out, errb bytes.Buffer
	if rc := runSpectrum([]string{"--quadrant", "--digits", "10", "--json"}, &out, &errb); rc != 0 {
		t.Fatalf("exit %d: %s", rc, errb.String())
	}
	var r struct{ Inf, Sup bracket }
	if err := json.Unmarshal(out.Bytes(), &r); err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(r.Inf.Lower, "-0.155939843") || !strings.HasPrefix(r.Sup.Upper, "1.00767997") {
		t.Errorf("quadrant spectrum %+v", r)
	}
}

// TestSpectrumQuadrantManyDigits runs 250 digits: both brackets must agree
// in their first 250 significant digits with the 1100-digit mpmath values
// of testdata/quadrant/edges-1100.txt (from testdata/quadrant/edges_mpmath.py;
// not a published source), and the critical points are reported.
func TestSpectrumQuadrantManyDigits(t *testing.T) {
	var out, errb bytes.Buffer
	if rc := runSpectrum([]string{"--quadrant", "--digits", "250", "--json"}, &out, &errb); rc != 0 {
		t.Fatalf("exit %d: %s", rc, errb.String())
	}
	var r struct {
		Inf, Sup     bracket
		InfAt, SupAt *bracket `json:",omitempty"`
	}
	if err := json.Unmarshal(out.Bytes(), &r); err != nil {
		t.Fatal(err)
	}
	ref, err := os.ReadFile("../../testdata/quadrant/edges-1100.txt")
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]string{}
	for _, line := range strings.Split(string(ref), "\n") {
		if f := strings.Fields(line); len(f) == 6 {
			want[f[0]] = f[1]
		}
	}
	// 250 significant digits: "-0." adds three characters, "." one.
	for name, b := range map[string]bracket{"inf": r.Inf, "sup": r.Sup} {
		w := want[name]
		n := 250 + 1
		if strings.HasPrefix(w, "-0.") {
			n = 250 + 3
		}
		if len(w) < n || len(b.Lower) < n || len(b.Upper) < n || b.Lower[:n] != w[:n] && b.Upper[:n] != w[:n] {
			t.Errorf("%s: got [%.40s..., %.40s...], reference %.40s...", name, b.Lower, b.Upper, w)
		}
	}
	if !strings.Contains(out.String(), "inf_at") || !strings.Contains(out.String(), "sup_at") {
		t.Errorf("no critical points in %s", out.String())
	}
}

// TestSpectrumBandHat (slow, about a minute) runs a band plus a hat from the
// command line. A relaxation can only be compared with the bare quadrant:
// these weights were chosen by hand (seen here, not a source) and must
// give an inf spec above the quadrant's -0.15594, so a backflow bound
// below 0.15594.
func TestSpectrumBandHat(t *testing.T) {
	if os.Getenv("WEDGEBOUND_SLOW") != "1" {
		t.Skip("set WEDGEBOUND_SLOW=1")
	}
	var out, errb bytes.Buffer
	args := []string{"--term", "band,from=1,to=1.5,weight=0.1", "--term", "hat,left=0.5,peak=1,right=3,weight=-0.1", "--digits", "3", "--json"}
	if rc := runSpectrum(args, &out, &errb); rc != 0 {
		t.Fatalf("exit %d: %s", rc, errb.String())
	}
	var r struct{ Inf, Sup bracket }
	if err := json.Unmarshal(out.Bytes(), &r); err != nil {
		t.Fatal(err)
	}
	t.Logf("%+v", r)
	if lo, err := strconv.ParseFloat(r.Inf.Lower, 64); err != nil || lo <= -0.15594 {
		t.Errorf("inf spec %+v, want above -0.15594", r.Inf)
	}
}

// TestSpectrumExpTerm runs the quadrant plus 8.46 e^{-150 xp} (given by
// --term) at 12 digits with --json: both brackets must start with the
// digits of the 40-digit mpmath values in testdata/terms/exp150-edges.txt
// (floating point, not rigorous; seen here, not a published source), and
// the attained points must be printed.
func TestSpectrumExpTerm(t *testing.T) {
	var out, errb bytes.Buffer
	args := []string{"--term", "exp,k=150,weight=8.46", "--digits", "12", "--json", "--quiet"}
	if rc := runSpectrum(args, &out, &errb); rc != 0 {
		t.Fatalf("exit %d: %s", rc, errb.String())
	}
	var r struct {
		Inf, Sup bracket
		InfAt    *bracket `json:"inf_at"`
	}
	if err := json.Unmarshal(out.Bytes(), &r); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		b    bracket
		want string
	}{{r.Inf, "-0.05264984278857743677144950893905780617331"}, {r.Sup, "1.024944652479057557979940418262658686425"}} {
		lo, ok1 := new(big.Rat).SetString(c.b.Lower)
		hi, ok2 := new(big.Rat).SetString(c.b.Upper)
		want, _ := new(big.Rat).SetString(c.want)
		if !ok1 || !ok2 || lo.Cmp(want) > 0 || hi.Cmp(want) < 0 {
			t.Errorf("bracket %+v does not hold %s", c.b, c.want)
			continue
		}
		if w, _ := new(big.Rat).Sub(hi, lo).Float64(); w > 1e-13 {
			t.Errorf("bracket %+v is %.2g wide", c.b, w)
		}
	}
	if r.InfAt == nil || !strings.HasPrefix(r.InfAt.Lower, "-0.2591794") {
		t.Errorf("inf attained at %+v, want near -0.2591794", r.InfAt)
	}
}
