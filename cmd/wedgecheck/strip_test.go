package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck/strip"
)

const shippedStrip = "../../testdata/strip-alpha50.json"

func readShippedStrip(t *testing.T) *certificates.Certificate {
	t.Helper()
	c, err := certificates.ReadFile(shippedStrip)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// The shipped strip certificate passes, with the problem, the claim and the
// verifier's own numbers in the report.
func TestStripShippedPasses(t *testing.T) {
	code, out := runCheck(t, shippedStrip)
	if code != exitPass {
		t.Fatalf("exit %d:\n%s", code, out)
	}
	for _, want := range []string{"PASS  " + shippedStrip, "finite strip [-1, 0], alpha = 50", "A(alpha) = -inf spec K_alpha in [0.0294571884", "recomputed: A(alpha) in [", "Clenshaw-Curtis rule"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
	code, js := runCheck(t, "--json", shippedStrip)
	var reps []fileReport
	if err := json.Unmarshal([]byte(js), &reps); err != nil || code != exitPass || len(reps) != 1 {
		t.Fatalf("--json: exit %d, %v:\n%s", code, err, js)
	}
	if s, _ := reps[0].Result.Detail.(*strip.Detail); s == nil || s.BasisSize < 1 || s.AdvantageProved.Lower == "" {
		t.Errorf("--json lacks the strip details: %s", js)
	}
}

// "wedgecheck testdata/*.json" passes every shipped certificate (the one
// test that verifies them all; each run costs about 40 s of CPU).
func TestAllShippedCertificatesPass(t *testing.T) {
	all, err := filepath.Glob("../../testdata/*.json")
	if err != nil || len(all) < 2 {
		t.Fatalf("shipped certificates: %v %v", all, err)
	}
	// The slow ones (slowShipped) are verified only with WEDGEBOUND_SLOW=1;
	// the default run reads them strictly (schema, structure, numbers,
	// hash).
	var files []string
	for _, f := range all {
		if !slowShipped[filepath.Base(f)] || os.Getenv("WEDGEBOUND_SLOW") != "" {
			files = append(files, f)
		} else if _, err := certificates.ReadFile(f); err != nil {
			t.Errorf("%s: %v", f, err)
		}
	}
	code, out := runCheck(t, files...)
	if code != exitPass || strings.Count(out, "PASS  ") != len(files) {
		t.Fatalf("exit %d:\n%s", code, out)
	}
}

// A re-sealed false claim fails with the place and the refutation; an edit
// after sealing fails with the stale hash; a malformed strip section is an
// input error.
func TestStripTamperedFiles(t *testing.T) {
	dir := t.TempDir()
	c := readShippedStrip(t)
	c.Strip.Advantage.Lower, c.Strip.Advantage.Upper = certificates.MustDecimal("0.0295"), certificates.MustDecimal("0.03")
	if err := certificates.Seal(c); err != nil {
		t.Fatal(err)
	}
	p := writeCert(t, dir, "false.json", c)
	code, out := runCheck(t, p)
	if code != exitFail || !strings.Contains(out, "FAIL  ") || !strings.Contains(out, "first failing claim: advantage: the lower end 0.0295 is false") {
		t.Errorf("re-sealed false claim: exit %d:\n%s", code, out)
	}

	data, err := os.ReadFile(shippedStrip)
	if err != nil {
		t.Fatal(err)
	}
	lo := readShippedStrip(t).Strip.Advantage.Lower
	edited := bytes.Replace(data, []byte(`"`+lo.String()+`"`), []byte(`"0.0295"`), 1)
	if bytes.Equal(edited, data) {
		t.Fatal("edit did not apply")
	}
	p = writeRaw(t, dir, "edited.json", edited)
	code, out = runCheck(t, p)
	if code != exitFail || !strings.Contains(out, "stale hash") {
		t.Errorf("unsealed edit: exit %d:\n%s", code, out)
	}

	c = readShippedStrip(t)
	c.Strip.DeficitWitness.Coefficients = c.Strip.DeficitWitness.Coefficients[:2]
	if err := certificates.Seal(c); err != nil {
		t.Fatal(err)
	}
	p = writeCert(t, dir, "short.json", c)
	code, out = runCheck(t, p)
	if code != exitMalformed || !strings.Contains(out, "2 coefficients for basis size") {
		t.Errorf("malformed strip section: exit %d:\n%s", code, out)
	}

	c = readShippedStrip(t)
	c.Strip.Errors.DiscardedPart = certificates.MustDecimal("0.000000000001")
	if err := certificates.Seal(c); err != nil {
		t.Fatal(err)
	}
	p = writeCert(t, dir, "tail.json", c)
	code, out = runCheck(t, p)
	if code != exitFail || !strings.Contains(out, "errors.discarded_part: cannot prove discarded_part 0.000000000001") {
		t.Errorf("discarded part: exit %d:\n%s", code, out)
	}
}
