package main

import (
	"os"
	"strings"
	"testing"

	"wedgebound/certificates"
)

const shippedVertexInside = "../../testdata/vertex-inside/vertex-inside.json"

// The shipped vertex-inside certificate (bands and a step from the
// threshold 1/4, testdata/vertex-inside) passes, and its bound lies
// strictly between the vertex-on-boundary bound of the same wedge and the
// bare quadrant's 0.155940 (R. F. Werner, J. Phys. A 21 (1988) 4565).
// Slow (about a minute of CPU): WEDGEBOUND_SLOW=1; the verifier's own tests
// check a smaller vertex-inside certificate by default.
func TestVertexInsideCertificate(t *testing.T) {
	if os.Getenv("WEDGEBOUND_SLOW") == "" {
		t.Skip("slow: set WEDGEBOUND_SLOW=1")
	}
	code, out := runCheck(t, shippedVertexInside)
	if code != exitPass || !strings.Contains(out, ">= -0.112578") {
		t.Fatalf("exit %d:\n%s", code, out)
	}
}

// Re-sealed with a band moved inside the half-plane (from 0.2 < 1/4), the
// shipped vertex-inside certificate fails before any cell is computed.
func TestVertexInsideSupportInsideH(t *testing.T) {
	c, err := certificates.ReadFile(shippedVertexInside)
	if err != nil {
		t.Fatal(err)
	}
	if b := c.Relaxation.Claim.Bound.String(); b != "0.112578" {
		t.Fatalf("shipped bound %s", b)
	}
	c.Relaxation.Terms[0].Params["from"] = certificates.MustDecimal("0.2")
	if err := certificates.Seal(c); err != nil {
		t.Fatal(err)
	}
	p := writeCert(t, t.TempDir(), "inside.json", c)
	code, out := runCheck(t, p)
	if code != exitFail || !strings.Contains(out, "terms[0]") || !strings.Contains(out, "xp >= 1/4") {
		t.Fatalf("exit %d:\n%s", code, out)
	}
}
