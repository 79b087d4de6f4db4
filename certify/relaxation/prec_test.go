package relaxation

import (
	"os"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	_ "wedgebound/certificates/recheck/relaxation" // registers the kind
	"wedgebound/regions"
)

// TestRunHighPrecision (slow: several minutes on 2 cores) certifies the
// one-profile backflow relaxation (k = 150, weights of the 53-bit run) at
// 128 and 256 bits: the certificate records the precision, the verifier
// passes it, and the claim equals the 53-bit claim to the six digits shown
// (the claim is rounded up to six significant digits; the higher precision
// only narrows the enclosures far below that). Reference: the 53-bit run
// of this package (TestRunOneExp), checked against published estimates
// there.
func TestRunHighPrecision(t *testing.T) {
	if os.Getenv("WEDGEBOUND_SLOW") != "1" {
		t.Skip("set WEDGEBOUND_SLOW=1")
	}
	ref := runOnce(t, "exp150", Config{Problem: regions.Presets["backflow"], Terms: expSpecs([]string{"150"}, nil), Margin: 2e-4, Workers: 2})
	w := []string{ref.Certificate.Relaxation.Terms[0].Weight.String()}
	for _, p := range []uint{128, 256} {
		o, err := Run(Config{Problem: regions.Presets["backflow"], Terms: expSpecs([]string{"150"}, w), Margin: 2e-4, Workers: 2, Prec: p})
		if err != nil {
			t.Fatalf("%d bits: %v", p, err)
		}
		r := o.Certificate.Relaxation
		if r.PrecisionBits != int(p) {
			t.Errorf("%d bits: precision_bits %d recorded", p, r.PrecisionBits)
		}
		if o.Bound.Cmp(ref.Bound) != 0 {
			t.Errorf("%d bits: claim %s, 53 bits: %s", p, o.Bound.FloatString(8), ref.Bound.FloatString(8))
		}
		c := *o.Certificate
		if err := certificates.Seal(&c); err != nil {
			t.Fatal(err)
		}
		res, err := recheck.Verify(&c, recheck.Options{})
		if err != nil || !res.Pass {
			t.Errorf("%d bits: the verifier does not pass the certificate: %v %+v", p, err, res)
		}
		t.Logf("%d bits: claim %s, %d cells, %v", p, o.Bound.FloatString(7), len(r.Cover), o.Elapsed.Round(1e6))
	}
}

// TestRunPrecisionRange: precisions outside 53..65536 are refused.
func TestRunPrecisionRange(t *testing.T) {
	for _, p := range []uint{52, 65537} {
		if _, err := Run(Config{Problem: regions.Presets["backflow"], Prec: p}); err == nil {
			t.Errorf("precision %d accepted", p)
		}
	}
}
