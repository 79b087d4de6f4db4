package precession

import (
	"os"
	"path/filepath"
	"testing"

	"wedgebound/certificates"
)

func shipped(t *testing.T) *certificates.Certificate {
	t.Helper()
	c, err := certificates.ReadFile(filepath.Join("..", "..", "..", "testdata", "precession.json"))
	if err != nil {
		if os.IsNotExist(err) {
			t.Skip("no shipped certificate")
		}
		t.Fatal(err)
	}
	return c
}

func TestShippedPasses(t *testing.T) {
	c := shipped(t)
	d, f := Check(c.Precession, 0)
	if len(f) > 0 {
		t.Fatalf("failures: %+v", f)
	}
	t.Logf("%+v", d)
}

// TestFalseClaimsRejected re-seals false claims: a lower bound above the
// truth (with a matching recorded Rayleigh enclosure) and an upper bound
// below it (about 0.709364, Zaw and Scarani, from memory).
func TestFalseClaimsRejected(t *testing.T) {
	c := shipped(t)
	p := *c.Precession
	p.Lower, p.Witness.Rayleigh.Lower, p.Witness.Rayleigh.Upper = certificates.MustDecimal("0.7095"), certificates.MustDecimal("0.7095"), certificates.MustDecimal("0.7096")
	p.Upper = certificates.MustDecimal("0.71")
	if _, f := Check(&p, 0); len(f) == 0 || !f[0].Bound {
		t.Fatalf("a lower bound above the truth passed: %+v", f)
	}
	q := *c.Precession
	q.Sectors = append([]certificates.PrecessionSector(nil), q.Sectors...)
	q.Upper = certificates.MustDecimal("0.7092")
	q.Sectors[0].Lambda = certificates.MustDecimal("1.576")
	q.Sectors[0].NormBound = certificates.MustDecimal("0.7092")
	_, f := Check(&q, 0)
	found := false
	for _, x := range f {
		found = found || x.Where == "sectors[0]"
	}
	if !found {
		t.Fatalf("an upper bound below the truth passed: %+v", f)
	}
	// Re-sealed through the schema as well.
	c2 := *c
	c2.Precession = &q
	if err := certificates.Seal(&c2); err != nil {
		t.Fatal(err)
	}
	b, _ := certificates.Encode(&c2)
	if _, err := certificates.Decode(b); err != nil {
		t.Fatal(err)
	}
}
