package main

import (
	"bytes"
	"strings"
	"testing"
)

// A witness certificate is checked and printed by wedgecheck.
func TestWedgecheckWitness(t *testing.T) {
	var out, errb bytes.Buffer
	code := run([]string{"../../testdata/witness-small.json"}, &out, &errb)
	if code != 0 || !strings.Contains(out.String(), "PASS") || !strings.Contains(out.String(), "c_bm >=") {
		t.Fatalf("exit %d: %s %s", code, out.String(), errb.String())
	}
	out.Reset()
	code = run([]string{"--json", "../../testdata/witness-small.json"}, &out, &errb)
	if code != 0 || !strings.Contains(out.String(), `"halfline-witness"`) {
		t.Fatalf("json: exit %d: %s", code, out.String())
	}
}
