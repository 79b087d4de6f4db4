package main

import (
	"path/filepath"
	"strings"
	"testing"

	"wedgebound/certificates"
)

// Issue 17 item 3: every shipped certificate, of every kind, gets a row of
// one LaTeX tabular, of one Markdown table, and a text summary.
func TestReportEveryShippedCertificate(t *testing.T) {
	files, _ := filepath.Glob("../../testdata/*.json")
	var certs []string
	kinds := map[string]bool{}
	for _, f := range files {
		// Witness certificates have a report of their own (they cannot
		// be mixed; TestWitnessReport).
		if c, err := certificates.ReadFile(f); err == nil && c.Kind != certificates.KindWitness {
			certs = append(certs, f)
			kinds[c.Kind] = true
		}
	}
	if !kinds[certificates.KindRelaxation] || !kinds[certificates.KindStrip] || !kinds[certificates.KindFlight] || !kinds[certificates.KindPrecession] || !kinds[certificates.KindMatched] {
		t.Fatalf("testdata should ship every kind, found %v", kinds)
	}
	// Flight and matched certificates get a bracket table of their own
	// after the main one; every certificate is one row of some table.
	code, out, errs := report(append([]string{"--format", "latex"}, certs...)...)
	rows := strings.Count(out, "\\\\\n") - strings.Count(out, "\\begin{tabular}")
	if code != 0 || !strings.Contains(out, "\\begin{tabular}") || rows != len(certs) {
		t.Fatalf("latex: exit %d, %d rows for %d certificates: %s\n%s", code, rows, len(certs), errs, out)
	}
	code, out, errs = report(append([]string{"--format", "markdown"}, certs...)...)
	rows = 0
	for _, l := range strings.Split(out, "\n") {
		if strings.HasPrefix(l, "| ") && !strings.Contains(l, "---") && !strings.HasPrefix(l, "| Problem") && !strings.HasPrefix(l, "| certificate") {
			rows++
		}
	}
	if code != 0 || rows != len(certs) {
		t.Fatalf("markdown: exit %d, %d rows: %s\n%s", code, rows, errs, out)
	}
	code, out, errs = report(certs...)
	if code != 0 {
		t.Fatalf("text: exit %d: %s", code, errs)
	}
	for _, f := range certs {
		if !strings.Contains(out, f) {
			t.Errorf("text report does not name %s", f)
		}
	}
}

// The strip row restates the recorded brackets, and the text summary names
// the witnesses and the Galerkin bounds. The numbers are the shipped
// certificate's (seen here, not a published source); A(50) lies below the
// backflow constant estimate 0.0384517 (Bracken and Melloy, J. Phys. A 27
// (1994) 2197), as A(alpha) <= c_bm requires.
func TestReportStripCertificate(t *testing.T) {
	const f = "../../testdata/strip-alpha50.json"
	_, md, _ := report("--format", "markdown", f)
	for _, want := range []string{"finite strip, alpha = 50", "Legendre basis, N = 32", "0.029457188412749977", "discarded part 5.71e-9"} {
		if !strings.Contains(md, want) {
			t.Errorf("markdown lacks %q:\n%s", want, md)
		}
	}
	_, txt, _ := report(f)
	for _, want := range []string{"Claim.", "witness", "lambda_min(G) >=", "Run \"wedgecheck"} {
		if !strings.Contains(txt, want) {
			t.Errorf("summary lacks %q", want)
		}
	}
	_, tex, _ := report("--format", "latex", "--standalone", f, shippedCert)
	if !strings.Contains(tex, "$A(\\alpha) \\in [0.029457188412749977") || !strings.Contains(tex, "\\caption{") {
		t.Errorf("latex:\n%s", tex)
	}
}

// A strip certificate whose recorded bracket does not follow from its
// recorded numbers is refused (exit 1), like a relaxation whose cells do
// not support its claim.
func TestReportStripInconsistent(t *testing.T) {
	c, err := certificates.ReadFile("../../testdata/strip-alpha50.json")
	if err != nil {
		t.Fatal(err)
	}
	c.Strip.Advantage.Lower = certificates.MustDecimal("0.0294571885") // above -(witness Rayleigh upper)
	p := filepath.Join(t.TempDir(), "bad.json")
	if err := certificates.WriteFile(p, c); err != nil {
		t.Fatal(err)
	}
	if code, _, errs := report(p); code != 1 || !strings.Contains(errs, "advantage.lower") {
		t.Errorf("exit %d: %s", code, errs)
	}
}
