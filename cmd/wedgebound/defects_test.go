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

func runArgs(args ...string) (int, string, string) {
	var out, errb bytes.Buffer
	code := dispatch(args, &out, &errb)
	return code, out.String(), errb.String()
}

// Issue 17 item 4: bad flag values and unwritable outputs are bad input:
// one line, exit 2, before any work, naming the user's path.
func TestCertifyBadInputExitsTwo(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "c.json")
	far := filepath.Join(dir, "far.json")
	// Vertex far inside the half-plane: d > 0, so no exponential profile
	// is admissible.
	os.WriteFile(far, []byte(`{"vertex": [0, 1e400], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`), 0o644)
	for _, args := range [][]string{
		{"--exp", "NaN"}, {"--exp", "-1"}, {"--exp", "150", "--weights", "NaN"}, {"--exp", "150", "--weights", "1,2"},
		{"--margin", "NaN"}, {"--tolerance", "NaN"}, {"--tolerance", "-1"}, {"--workers", "-3"}, {"--weight-bound", "NaN"},
		{"--out", dir}, {"--out", filepath.Join(dir, "no", "such", "dir.json")},
		{"--term", "hat,left=0.5,peak=1,right=2"}, // the verifier has no route for hats yet
	} {
		a := append([]string{"certify", "--preset", "backflow", "--out", out, "--quiet"}, args...)
		code, _, errs := runArgs(a...)
		if code != 2 || strings.Count(strings.TrimSpace(errs), "\n") != 0 || strings.Contains(errs, ".tmp") {
			t.Errorf("%q: exit %d, stderr %q", args, code, errs)
		}
	}
	code, _, errs := runArgs("certify", "--problem", far, "--exp", "150", "--out", out)
	if code != 2 || !strings.Contains(errs, "--exp none") {
		t.Errorf("far vertex: exit %d, stderr %q", code, errs)
	}
	if code, _, errs := runArgs("certify", "--preset", "backflow", "--out", dir); !strings.Contains(errs, dir+": it is a directory") || code != 2 {
		t.Errorf("--out DIR: exit %d, stderr %q", code, errs)
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Errorf("files left behind: %v", ents)
	}
}

// Issue 17 items 5 and 12: a part of another run is named by its file and
// the difference (terms), not by a range and a "shard 0"; merge mismatches
// exit 2. The --json summary of certify keeps numbers as decimal strings
// and ">" unescaped.
func TestMergeOtherRunAndCertifyJSON(t *testing.T) {
	dir := t.TempDir()
	p1, p2, whole := filepath.Join(dir, "p1.json"), filepath.Join(dir, "p2.json"), filepath.Join(dir, "w.json")
	code, out, errs := runArgs("certify", "--preset", "backflow", "--exp", "150", "--weights", "8.46", "--shard", "1/2", "--out", p1, "--quiet", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var sum map[string]any
	if err := json.Unmarshal([]byte(out), &sum); err != nil {
		t.Fatal(err)
	}
	for _, f := range []string{"bound", "candidate"} {
		if _, ok := sum[f].(string); !ok {
			t.Errorf("--json field %s is %T, want a decimal string", f, sum[f])
		}
	}
	if code, _, errs := runArgs("certify", "--preset", "backflow", "--exp", "150", "--weights", "8", "--shard", "2/2", "--out", p2, "--quiet"); code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	code, _, errs = runArgs("merge", "--out", whole, p1, p2)
	if code != 2 || !strings.Contains(errs, "different terms") || !strings.Contains(errs, p2) || strings.Contains(errs, "shard 0") {
		t.Errorf("exit %d, stderr %q", code, errs)
	}
	code, _, errs = runArgs("merge", "--out", whole, p1)
	if code != 2 || !strings.Contains(errs, "shard 2/2 is missing") {
		t.Errorf("exit %d, stderr %q", code, errs)
	}
	if _, err := os.Stat(whole); err == nil {
		t.Error("a refused merge wrote its output")
	}
}

// Issue 17 item 6: wedgebound prints its version and the schema it writes.
func TestWedgeboundVersion(t *testing.T) {
	for _, arg := range []string{"--version", "version"} {
		code, out, _ := runArgs(arg)
		if code != 0 || !strings.Contains(out, certificates.Version) || !strings.Contains(out, certificates.Schema) {
			t.Errorf("%s: exit %d, %q", arg, code, out)
		}
	}
}

// Issue 17 item 8: the spectrum help states each default once, and the
// shared flags exist on every command that computes.
func TestFlagsOneMeaning(t *testing.T) {
	_, _, help := runArgs("spectrum", "--help")
	if strings.Contains(help, "(default 12)") {
		t.Errorf("spectrum help repeats defaults:\n%s", help)
	}
	for _, cmd := range []string{"certify", "spectrum", "strip", "sweep", "demo", "const", "report", "merge", "flight", "plot", "precession", "matched"} {
		_, _, h := runArgs(cmd, "--help")
		if !strings.Contains(h, "--quiet") {
			t.Errorf("%s has no --quiet", cmd)
		}
		if strings.Contains(h, "--width") || strings.Contains(h, "--margin") {
			t.Errorf("%s still shows --width/--margin (now --tolerance)", cmd)
		}
	}
	for _, cmd := range []string{"certify", "strip", "sweep", "demo"} {
		_, _, h := runArgs(cmd, "--help")
		if !strings.Contains(h, "--workers") {
			t.Errorf("%s has no --workers", cmd)
		}
	}
	for _, cmd := range []string{"certify", "strip", "merge", "flight", "precession", "matched"} {
		_, _, h := runArgs(cmd, "--help")
		if !strings.Contains(h, "--out") || !strings.Contains(h, helpOut) {
			t.Errorf("%s: --out is not the certificate", cmd)
		}
	}
	_, _, h := runArgs("report", "--help")
	if strings.Contains(h, "--out") || !strings.Contains(h, "--save") {
		t.Errorf("report writes files with --save, not --out:\n%s", h)
	}
}
