package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestCertifyPrecFlag: precisions outside 53..65536 are bad input (exit 2,
// one line) and are refused before any work.
func TestCertifyPrecFlag(t *testing.T) {
	for _, p := range []string{"52", "65537", "-1"} {
		var out, errb bytes.Buffer
		rc := runCertify([]string{"--preset", "backflow", "--out", t.TempDir() + "/c.json", "--prec", p}, &out, &errb)
		msg := strings.TrimSpace(errb.String())
		if rc != 2 || !strings.Contains(msg, "outside 53..65536") || strings.Contains(msg, "\n") {
			t.Errorf("--prec %s: exit %d, stderr %q", p, rc, msg)
		}
	}
}
