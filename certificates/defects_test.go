package certificates

import "testing"

// Defects found while writing the tests (see the helper report): each test
// is skipped with a note naming the defect; delete the Skip line to check a
// fix (the test fails on the unfixed code).

// TestMissingStatement: the claim's statement is part of the schema; a
// certificate without it is missing a field and must be rejected like the
// others.
func TestMissingStatement(t *testing.T) {
	c := sample()
	c.Relaxation.Claim.Statement = ""
	if _, err := Decode(sealed(t, c)); err == nil {
		t.Errorf("certificate without claim.statement accepted")
	}
}

// TestDecBasePrefixes: Dec documents "a finite decimal number" and rejects
// "0x..", but math/big also reads the prefixes 0b and 0o ("0b101" = 5,
// "0o17" = 15), so a certificate field "0b1" is read as 1. Remedy: reject
// the letters b, B, o, O as well (no plain decimal contains them).
func TestDecBasePrefixes(t *testing.T) {
	for _, s := range []string{"0b1", "0B101", "0o17", "0O7", "-0b1"} {
		if r, err := Dec(s, "d"); err == nil {
			t.Errorf("Dec(%q) accepted as %s", s, r.RatString())
		}
	}
}
