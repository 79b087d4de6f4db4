package matched_test

// End-to-end tests of the matched verifier on certificates written by the
// certifier (package certify/matched; the tests may use it, the verifier
// itself may not).

import (
	"math/big"
	"os"
	"strings"
	"sync"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	_ "wedgebound/certificates/recheck/matched"
	"wedgebound/certify/matched"
	"wedgebound/certify/strip"
)

var (
	once sync.Once
	base *certificates.Certificate
)

func cert(t *testing.T) *certificates.Certificate {
	t.Helper()
	once.Do(func() {
		a, _ := strip.ParseAlpha("1.5")
		r, err := matched.Compute(a, matched.Options{})
		if err != nil {
			t.Fatal(err)
		}
		base, err = r.Certificate()
		if err == nil {
			err = certificates.Seal(base)
		}
		if err != nil {
			t.Fatal(err)
		}
	})
	b, _ := certificates.Encode(base)
	d, err := certificates.Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	return d
}

func verify(t *testing.T, c *certificates.Certificate) *recheck.Result {
	t.Helper()
	r, err := recheck.Verify(c, recheck.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

func TestMatchedPasses(t *testing.T) {
	if r := verify(t, cert(t)); !r.Pass {
		t.Errorf("%+v", r.Failures)
	}
}

func bump(s, by string) string {
	r, _ := new(big.Rat).SetString(s)
	d, _ := new(big.Rat).SetString(by)
	return r.Add(r, d).FloatString(20)
}

// Re-sealed false claims are rejected: a lower end above the witness, a
// changed witness (its Rayleigh quotient drops below the record), a cell
// bound below the cell's top eigenvalue, another alpha.
func TestMatchedTampering(t *testing.T) {
	cases := []struct {
		name  string
		edit  func(m *certificates.Matched)
		where string
	}{
		{"lower above the witness", func(m *certificates.Matched) {
			m.Lower = certificates.MustDecimal(bump(m.Witness.Rayleigh.String(), "1e-6"))
		}, "lower"},
		{"witness coefficient", func(m *certificates.Matched) {
			m.Witness.Coefficients[0] = certificates.MustSci(bump(m.Witness.Coefficients[0].String(), "0.3"))
		}, "witness.rayleigh"},
		{"cell bound lowered", func(m *certificates.Matched) { m.Cells[len(m.Cells)-1].Upper = certificates.MustDecimal("0.01") }, "cells["},
		{"alpha changed", func(m *certificates.Matched) {
			m.Alpha = certificates.StripAlpha{Value: certificates.MustAlpha("4"), Lower: certificates.MustDecimal("4"), Upper: certificates.MustDecimal("4")}
		}, "cells["},
	}
	for _, c := range cases {
		ct := cert(t)
		c.edit(ct.Matched)
		if err := certificates.Seal(ct); err != nil {
			t.Fatal(err)
		}
		if _, err := certificates.Decode(mustEncode(t, ct)); err != nil {
			continue // the schema already refuses it
		}
		r := verify(t, ct)
		if r.Pass {
			t.Errorf("%s: passed", c.name)
			continue
		}
		found := false
		for _, f := range r.Failures {
			found = found || strings.HasPrefix(f.Where, c.where)
		}
		if !found {
			t.Errorf("%s: no failure at %s: %+v", c.name, c.where, r.Failures)
		}
	}
	// A gap in the cover is refused by the schema.
	ct := cert(t)
	ct.Matched.Cells = append(ct.Matched.Cells[:1], ct.Matched.Cells[2:]...)
	certificates.Seal(ct)
	if _, err := certificates.Decode(mustEncode(t, ct)); err == nil {
		t.Error("a cover with a gap was accepted")
	}
}

func mustEncode(t *testing.T, c *certificates.Certificate) []byte {
	b, err := certificates.Encode(c)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// With WEDGEBOUND_SLOW=1: the shipped alpha = 100 certificate passes, and
// its lower end is above the shipped backflow upper bound 0.0394391 (the
// alpha = 10 one is checked with every shipped certificate by
// cmd/wedgecheck).
func TestShippedMatched(t *testing.T) {
	if os.Getenv("WEDGEBOUND_SLOW") == "" {
		t.Skip("slow: set WEDGEBOUND_SLOW=1")
	}
	const f = "../../../testdata/matched/alpha100.json"
	c, err := certificates.ReadFile(f)
	if err != nil {
		t.Fatal(err)
	}
	if r := verify(t, c); !r.Pass {
		t.Errorf("%s: %+v", f, r.Failures)
	}
	if lo, _ := new(big.Rat).SetString(c.Matched.Lower.String()); lo.Cmp(big.NewRat(394391, 10000000)) <= 0 {
		t.Errorf("%s: lower end %s is not above 0.0394391", f, c.Matched.Lower)
	}
}
