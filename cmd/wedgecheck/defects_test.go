package main

import (
	"strings"
	"testing"

	"wedgebound/certificates"
)

// Issue 17 item 6: a partial certificate is reported without empty fields.
func TestPartialCertificateText(t *testing.T) {
	c := quadrantLower(t)
	r := c.Relaxation
	r.Shard = &certificates.Shard{Index: 0, Count: 2, Lo: r.Cover[0].Lo, Hi: certificates.MustDecimal("16")}
	r.Above.From = certificates.MustDecimal("16")
	if err := certificates.Seal(c); err != nil {
		t.Fatal(err)
	}
	p := writeCert(t, t.TempDir(), "part.json", c)
	code, out := runCheck(t, p)
	if code != exitFail {
		t.Fatalf("exit %d, want %d\n%s", code, exitFail, out)
	}
	for _, bad := range []string{"claim:   \n", "[, ]", "0 pieces"} {
		if strings.Contains(out, bad) {
			t.Errorf("output contains %q:\n%s", bad, out)
		}
	}
	if !strings.Contains(out, "partial certificate (shard 1 of 2)") || !strings.Contains(out, "no claim is checked") {
		t.Errorf("output does not say that the shard is not checked:\n%s", out)
	}
}

// Issue 17 item 6: --version prints the version and the schema it reads.
func TestVersion(t *testing.T) {
	code, out := runCheck(t, "--version")
	if code != exitPass || !strings.Contains(out, certificates.Version) || !strings.Contains(out, certificates.Schema) ||
		!strings.Contains(out, certificates.KindStrip) {
		t.Errorf("exit %d:\n%s", code, out)
	}
}

// Issue 17 items 4 and 12: bad option values are refused with one line and
// exit 2, and the JSON output keeps ">" as it is.
func TestOptionValuesAndJSONEscaping(t *testing.T) {
	p := writeCert(t, t.TempDir(), "q.json", quadrantLower(t))
	for _, args := range [][]string{{"--max-depth", "-1", p}, {"--max-depth", "0", p}, {"--workers", "-3", p}, {"--bogus", p}} {
		code, out := runCheck(t, args...)
		if code != exitMalformed || strings.Count(strings.TrimSpace(out), "\n") != 0 {
			t.Errorf("%q: exit %d, want one line and exit 2:\n%s", args, code, out)
		}
	}
	code, out := runCheck(t, "--json", p)
	if code != exitPass || strings.Contains(out, `\u003e`) || !strings.Contains(out, ">= -0.1560") {
		t.Errorf("exit %d, JSON escapes or loses \">\":\n%s", code, out)
	}
}
