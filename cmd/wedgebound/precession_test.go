package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"wedgebound/certificates"
)

func TestPrecessionCLI(t *testing.T) {
	dir := t.TempDir()
	small := []string{"precession", "--cutoff", "8", "--sum-length", "300", "--witness", "300", "--quiet"}
	var out, errb bytes.Buffer
	p1 := filepath.Join(dir, "a.json")
	if code := dispatch(append(small, "--json", "--out", p1, "--workers", "1"), &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var j struct{ Lower, Upper string }
	if err := json.Unmarshal(out.Bytes(), &j); err != nil {
		t.Fatal(err)
	}
	lo, err1 := strconv.ParseFloat(j.Lower, 64)
	up, err2 := strconv.ParseFloat(j.Upper, 64)
	// Classical 2/3 (common practice) below, Tsirelson's bound 1 (2006) above.
	if err1 != nil || err2 != nil || !(2.0/3 < lo && lo < up && up < 1) {
		t.Fatalf("bracket %q %q", j.Lower, j.Upper)
	}
	if _, err := certificates.ReadFile(p1); err != nil {
		t.Fatal(err)
	}
	// The certificate does not depend on the number of workers.
	p2 := filepath.Join(dir, "b.json")
	if code := dispatch(append(small, "--out", p2, "--workers", "2"), &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	a, _ := os.ReadFile(p1)
	b, _ := os.ReadFile(p2)
	if !bytes.Equal(a, b) {
		t.Error("certificates differ between 1 and 2 workers")
	}
	// Bad input: exit 2 with one line.
	for _, args := range [][]string{
		{"precession", "--cutoff", "1"},
		{"precession", "--witness", "3"},
		{"precession", "--sum-length", "10"},
		{"precession", "extra"},
		{"precession", "--nope"},
	} {
		var o, e bytes.Buffer
		if code := dispatch(args, &o, &e); code != 2 || strings.Count(strings.TrimSpace(e.String()), "\n") > 0 && !strings.Contains(e.String(), "usage") {
			t.Errorf("%v: exit %d, stderr %q", args, code, e.String())
		}
	}
	// The report reads the certificate.
	var r, e bytes.Buffer
	if code := dispatch([]string{"report", "--format", "markdown", p1}, &r, &e); code != 0 || !strings.Contains(r.String(), j.Lower) {
		t.Errorf("report: exit %d %q %q", code, r.String(), e.String())
	}
}
