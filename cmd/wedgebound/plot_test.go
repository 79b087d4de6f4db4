package main

import (
	"bytes"
	"encoding/xml"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"wedgebound/certificates"
)

// Issue 17 item 7: sweep writes SVG (fonts embedded, so the layout does
// not depend on the viewer's fonts), PNG and PDF; the legend states the
// bracket widths. PNG and PDF are recognised by their signatures (PNG
// specification, ISO 32000: common practice).
func TestSweepImageFormats(t *testing.T) {
	dir := t.TempDir()
	f := func(n string) string { return filepath.Join(dir, n) }
	code, _, errs := runArgs("sweep", "--from", "2", "--to", "20", "--points", "3", "--svg", f("a.svg"), "--png", f("a.png"), "--pdf", f("a.pdf"), "--quiet")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	svg, _ := os.ReadFile(f("a.svg"))
	if !bytes.Contains(svg, []byte("@font-face")) || !bytes.Contains(svg, []byte("too narrow to see")) {
		t.Error("SVG embeds no font or does not state the bracket widths")
	}
	if err := xml.Unmarshal(svg, new(struct{})); err != nil {
		t.Errorf("SVG is not XML: %v", err)
	}
	if png, _ := os.ReadFile(f("a.png")); !bytes.HasPrefix(png, []byte("\x89PNG\r\n\x1a\n")) {
		t.Error("not a PNG file")
	}
	if pdf, _ := os.ReadFile(f("a.pdf")); !bytes.HasPrefix(pdf, []byte("%PDF-")) {
		t.Error("not a PDF file")
	}
	if code, _, _ := runArgs("sweep", "--from", "2", "--to", "20", "--points", "3", "--png", dir); code != 2 {
		t.Errorf("--png DIR: exit %d, want 2", code)
	}
}

// Issue 17 item 10: the certificate plot draws one box per recorded cell
// in view and the proved bound; strip certificates and bad ranges are
// refused with exit 2.
func TestPlotCertificate(t *testing.T) {
	dir := t.TempDir()
	svg := filepath.Join(dir, "c.svg")
	code, out, errs := runArgs("plot", "--svg", svg, "--from", "-8", "--to", "4", shippedCert)
	if code != 0 || !strings.Contains(out, "plotted") {
		t.Fatalf("exit %d: %s", code, errs)
	}
	b, _ := os.ReadFile(svg)
	c, err := certificates.ReadFile(shippedCert)
	if err != nil {
		t.Fatal(err)
	}
	m := regexp.MustCompile(`(\d+) recorded cells in view \(of (\d+)\)`).FindSubmatch(b)
	if m == nil || string(m[2]) != itoa(len(c.Relaxation.Cover)) || !bytes.Contains(b, []byte("-"+c.Relaxation.Claim.Bound.String())) {
		t.Errorf("legend does not count the cells or state the bound %s", c.Relaxation.Claim.Bound)
	}
	for _, args := range [][]string{
		{"plot", "--svg", svg, "../../testdata/strip-alpha50.json"},
		{"plot", shippedCert},
		{"plot", "--svg", svg, "--from", "5", "--to", "1", shippedCert},
		{"plot", "--svg", svg, "--from", "5000", "--to", "6000", shippedCert},
	} {
		if code, _, errs := runArgs(args...); code != 2 || strings.Count(strings.TrimSpace(errs), "\n") != 0 {
			t.Errorf("%q: exit %d, %q", args, code, errs)
		}
	}
}

// CITATION.cff names the version the tools print (Citation File Format
// 1.2.0: common practice).
func TestCitationFile(t *testing.T) {
	b, err := os.ReadFile("../../CITATION.cff")
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"cff-version: 1.2.0", "title: ", "authors:", `version: "` + certificates.Version + `"`} {
		if !bytes.Contains(b, []byte(want)) {
			t.Errorf("CITATION.cff lacks %q", want)
		}
	}
}
