package spectrum

import (
	"bufio"
	"os"
	"strings"
	"testing"
)

// exp150Specs is testdata/terms/exp150.json: the quadrant plus
// 8.46 e^{-150 xp}.
var exp150Specs = []TermSpec{{Kind: "exp", Params: map[string]string{"k": "150"}, Weight: "8.46"}}

// readEdgeRefs reads the "inf V at s = S" and "sup V at s = S" lines of
// testdata/terms/exp150-edges.txt, the output of
// testdata/terms/edges_mpmath.py 40 (mpmath 1.3.0: the (+,-) entry of the
// profile by quadrature of its defining tau-integral, findroot on the
// closed-form derivative; floating point, not rigorous; seen here, not a
// published source).
func readEdgeRefs(t *testing.T) (vals, at [2]string) {
	t.Helper()
	f, err := os.Open("../../testdata/terms/exp150-edges.txt")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	found := 0
	for sc.Scan() {
		fields := strings.Fields(sc.Text())
		if len(fields) != 6 || fields[2] != "at" || fields[0] != "inf" && fields[0] != "sup" {
			continue
		}
		i := map[string]int{"inf": 0, "sup": 1}[fields[0]]
		vals[i], at[i] = fields[1], fields[5]
		found++
	}
	if found != 2 {
		t.Fatalf("exp150-edges.txt: %d edge lines, want 2", found)
	}
	return vals, at
}

// Both edges of the quadrant plus 8.46 e^{-150 xp} at 20 digits by the
// Newton route: each enclosure must hold the 40-digit mpmath value and be
// narrower than 1e-21, and the critical point must agree with mpmath's to
// 1e-18. The inf-spec edge has two local minima 2.9e-6 apart in depth
// (s = -2.218 and s = -0.259), so it needs two windows.
func TestTermEdgesAgainstMpmath(t *testing.T) {
	vals, at := readEdgeRefs(t)
	r, err := TermEdges(exp150Specs, 20, nil)
	if err != nil {
		t.Fatal(err)
	}
	for i, e := range r {
		like := e.Value
		want, _ := like.Decimal(vals[i])
		if !e.Value.Pad(like.Float(1e-39)).Contains(want) {
			t.Errorf("edge %d: %v does not hold the reference %s", i, e.Value, vals[i])
		}
		if w := 2 * e.Value.Rad(); !(w <= 1e-21) {
			t.Errorf("edge %d: width %.2g, want below 1e-21", i, w)
		}
		s, _ := e.At.Decimal(at[i])
		if !e.At.Pad(e.At.Float(1e-18)).Contains(s) {
			t.Errorf("edge %d: critical point %v, reference %s", i, e.At, at[i])
		}
	}
	if r[0].Windows != 2 {
		t.Errorf("inf spec used %d windows, want 2 (two minima of nearly equal depth)", r[0].Windows)
	}
}

// Digits beyond MaxTermDigits and band terms are refused before any work.
func TestTermEdgesRefuses(t *testing.T) {
	if _, err := TermEdges(exp150Specs, MaxTermDigits+1, nil); err == nil {
		t.Error("TermEdges accepted too many digits")
	}
	band := []TermSpec{{Kind: "band", Params: map[string]string{"from": "0", "to": "1"}, Weight: "0.5"}}
	if _, err := TermEdges(band, 10, nil); err == nil || !strings.Contains(err.Error(), "exp terms only") {
		t.Errorf("band term: got %v", err)
	}
}
