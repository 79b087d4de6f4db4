package main

import (
	"strings"
	"testing"
)

// The shipped flight and matched certificates are reported in all three
// formats with their claimed ends, next to a relaxation certificate.
func TestReportBracketKinds(t *testing.T) {
	files := []string{"../../testdata/matched-alpha10.json", "../../testdata/flight.json"}
	for _, f := range []string{"text", "markdown", "latex"} {
		code, out, errs := report(append([]string{"--format", f}, files...)...)
		if code != 0 {
			t.Fatalf("%s: exit %d: %s", f, code, errs)
		}
		for _, want := range []string{"0.0206990304264", "0.0213683087809", "0.018228370639527268"} {
			if !strings.Contains(out, want) {
				t.Errorf("%s report lacks %s:\n%s", f, want, out)
			}
		}
	}
	code, out, _ := report("--format", "markdown", "../../testdata/backflow.json", files[0])
	if code != 0 || !strings.Contains(out, "0.0394391") || !strings.Contains(out, "matched advantage") {
		t.Errorf("mixed report: exit %d\n%s", code, out)
	}
}
