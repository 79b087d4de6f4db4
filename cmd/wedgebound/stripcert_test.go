package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	_ "wedgebound/certificates/recheck/strip" // registers the kind
)

// strip --out writes a sealed strip-bracket certificate atomically, and the
// independent verifier passes it.
func TestStripOutWritesCertificate(t *testing.T) {
	dir := t.TempDir()
	f := filepath.Join(dir, "strip.json")
	code, out, errs := runCmd(stripCmd, "--alpha", "2", "--out", f)
	if code != 0 || !strings.Contains(out, "advantage A(alpha)") {
		t.Fatalf("exit %d: %s %s", code, out, errs)
	}
	c, err := certificates.ReadFile(f)
	if err != nil {
		t.Fatal(err)
	}
	if c.Kind != certificates.KindStrip || c.Strip.Alpha.Value.String() != "2" {
		t.Fatalf("kind %q alpha %q", c.Kind, c.Strip.Alpha.Value)
	}
	r, err := recheck.Verify(c, recheck.Options{})
	if err != nil || !r.Pass {
		t.Fatalf("verification: %v %+v", err, r)
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Errorf("left files behind: %v", ents)
	}
	// --json and --out together.
	code, out, _ = runCmd(stripCmd, "--alpha", "2", "--json", "--out", f)
	if code != 0 || !strings.HasPrefix(out, "{") {
		t.Errorf("--json --out: exit %d %q", code, out[:20])
	}
}

// An unwritable output path is bad input (exit 2), found before any work,
// and the message names the user's path (issue 17 item 4).
func TestStripOutBadPath(t *testing.T) {
	bad := filepath.Join(t.TempDir(), "missing", "c.json")
	code, _, errs := runCmd(stripCmd, "--alpha", "2", "--out", bad)
	if code != 2 || !strings.Contains(errs, bad) || strings.Contains(errs, ".tmp") || strings.Count(strings.TrimSpace(errs), "\n") != 0 || !strings.Contains(errs, "wedgebound strip:") {
		t.Errorf("exit %d, stderr %q", code, errs)
	}
}

const shippedBackflow = "../../testdata/backflow.json"

// sweep --bound-certificate draws the claimed bound of a backflow
// certificate as the upper band and says where it comes from.
func TestSweepBoundCertificate(t *testing.T) {
	bc, err := certificates.ReadFile(shippedBackflow)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	s := filepath.Join(dir, "s.svg")
	code, out, errs := runCmd(sweepCmd, "--from", "2", "--to", "20", "--points", "3", "--svg", s, "--bound-certificate", shippedBackflow, "--quiet")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, "certified upper bound read from "+shippedBackflow+": c_bm <= "+bc.Relaxation.Claim.Bound.String()) || !strings.Contains(out, "not verified") {
		t.Errorf("stdout: %q", out)
	}
	img, err := os.ReadFile(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"c_bm &lt;= " + bc.Relaxation.Claim.Bound.String(), "backflow.json, read, not verified", "Bracken"} {
		if !bytes.Contains(img, []byte(want)) && !bytes.Contains(img, []byte(strings.ReplaceAll(want, "&lt;", "<"))) {
			t.Errorf("SVG lacks %q", want)
		}
	}
}

func TestSweepBoundCertificateRejects(t *testing.T) {
	dir := t.TempDir()
	reseal := func(name string, f func(c *certificates.Certificate)) string {
		c, err := certificates.ReadFile(shippedBackflow)
		if err != nil {
			t.Fatal(err)
		}
		f(c)
		p := filepath.Join(dir, name)
		if err := certificates.WriteFile(p, c); err != nil {
			t.Fatal(err)
		}
		return p
	}
	data, err := os.ReadFile(shippedBackflow)
	if err != nil {
		t.Fatal(err)
	}
	stale := filepath.Join(dir, "stale.json")
	if err := os.WriteFile(stale, bytes.Replace(data, []byte(`"statement": "`), []byte(`"statement": "edited: `), 1), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name, file, want string
	}{
		{"strip certificate", "../../testdata/strip-alpha50.json", `not a "halfplane-relaxation" one`},
		{"upper edge", reseal("upper.json", func(c *certificates.Certificate) {
			c.Relaxation.Problem.Edge, c.Relaxation.Claim.Edge = "upper", "upper"
		}), "needs edge lower"},
		{"vertex inside", reseal("inside.json", func(c *certificates.Certificate) { c.Relaxation.Normal.D = certificates.MustFraction("1/2") }), "not the backflow geometry"},
		{"edge on the boundary", reseal("boundary.json", func(c *certificates.Certificate) { c.Relaxation.Normal.A = certificates.MustFraction("0") }), "not the backflow geometry"},
		{"stale hash", stale, "stale"},
		{"missing", filepath.Join(dir, "none.json"), "no such file"},
	} {
		code, _, errs := runCmd(sweepCmd, "--from", "2", "--to", "2", "--points", "1", "--quiet", "--bound-certificate", c.file)
		if code != 2 || !strings.Contains(errs, c.want) || strings.Count(strings.TrimSpace(errs), "\n") != 0 {
			t.Errorf("%s: exit %d, stderr %q", c.name, code, errs)
		}
	}
	// A claimed bound below the certified lower bound is a contradiction.
	low := reseal("low.json", func(c *certificates.Certificate) { c.Relaxation.Claim.Bound = certificates.MustDecimal("0.001") })
	code, _, errs := runCmd(sweepCmd, "--from", "2", "--to", "2", "--points", "1", "--quiet", "--bound-certificate", low)
	if code != 1 || !strings.Contains(errs, "one of the two is wrong") {
		t.Errorf("contradiction: exit %d, stderr %q", code, errs)
	}
}
