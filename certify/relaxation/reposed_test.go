package relaxation

import (
	"os"
	"testing"

	"wedgebound/certificates"
)

// vertexInsideJSON is testdata/problems/vertex-inside.json; reposedJSON is
// its image under z -> S z + (3, -1), S = diag(2, 1/2) [[1, 1], [0, 1]] =
// [[2, 2], [0, 1/2]] (det 1): rays S (0, 1) = (2, 1/2) and S (-1, 1) =
// (0, 1/2), normal S^-T (0, 1) = (0, 2), offset -1 + (0, 2).(3, -1) = -3.
const vertexInsideJSON = `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": -1}, "edge": "lower"}`
const reposedJSON = `{"vertex": [3, -1], "rays": [[2, 0.5], [0, 0.5]], "halfplane": {"normal": [0, 2], "offset": -3}, "edge": "lower"}`

// Metaplectically equivalent vertex-inside geometries give byte-identical
// claims with a step from the threshold (weights given, so only the cover
// runs). Slow: WEDGEBOUND_SLOW=1.
func TestRunReposedVertexInside(t *testing.T) {
	if os.Getenv("WEDGEBOUND_SLOW") == "" {
		t.Skip("slow (two covers): set WEDGEBOUND_SLOW=1")
	}
	terms := []certificates.Term{{Kind: "step", Params: map[string]certificates.Decimal{"from": certificates.MustDecimal("0.25")}, Weight: certificates.MustDecimal("-0.110085")}}
	a := runOnce(t, "step-vertex-inside", Config{Problem: mustProblem(t, vertexInsideJSON), Terms: terms, Margin: 1e-3, Workers: 2})
	b := runOnce(t, "step-reposed", Config{Problem: mustProblem(t, reposedJSON), Terms: terms, Margin: 1e-3, Workers: 2})
	if a.Certificate.Relaxation.Claim.Bound != b.Certificate.Relaxation.Claim.Bound {
		t.Errorf("claims differ: %s and %s", a.Certificate.Relaxation.Claim.Bound, b.Certificate.Relaxation.Claim.Bound)
	}
	if a.Certificate.Relaxation.Normal.Threshold.String() != "0.25" || b.Certificate.Relaxation.Normal.Threshold.String() != "0.25" {
		t.Errorf("thresholds %s and %s, want 0.25", a.Certificate.Relaxation.Normal.Threshold, b.Certificate.Relaxation.Normal.Threshold)
	}
}
