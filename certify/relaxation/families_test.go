package relaxation

import (
	"math"
	"math/big"
	"testing"

	"wedgebound/certificates"
	verifier "wedgebound/certificates/recheck/relaxation"
	"wedgebound/interval"
	"wedgebound/regions"
)

// The verifier computes the band and step symbols by its own route
// (Clenshaw-Curtis on turned tau-paths and on the real v-line, tail
// lemmas of its own); the certifier by Gauss-Legendre on saddle paths in
// t = -log r and its psi-series diagonal (regions). Two independent routes
// must agree far inside their enclosures (seen here, not a published
// source: the agreement is the check).
func TestFamiliesCertifierAgreesWithVerifier(t *testing.T) {
	terms := []certificates.Term{
		{Kind: "band", Params: map[string]certificates.Decimal{"from": certificates.MustDecimal("0.25"), "to": certificates.MustDecimal("0.5")}, Weight: certificates.MustDecimal("0.7")},
		{Kind: "band", Params: map[string]certificates.Decimal{"from": certificates.MustDecimal("0"), "to": certificates.MustDecimal("1.5")}, Weight: certificates.MustDecimal("-0.3")},
		{Kind: "step", Params: map[string]certificates.Decimal{"from": certificates.MustDecimal("1")}, Weight: certificates.MustDecimal("0.2")},
		{Kind: "step", Params: map[string]certificates.Decimal{"from": certificates.MustDecimal("0")}, Weight: certificates.MustDecimal("-0.1")},
	}
	m, err := verifier.NewModel(interval.F{}, verifier.Lower, terms)
	if err != nil {
		t.Fatal(err)
	}
	like := interval.PointF(0)
	var rel regions.Relaxation[interval.F]
	for _, ct := range terms {
		rt, err := regions.NewTerm(like, ct.Kind, ct.ParamText())
		if err != nil {
			t.Fatal(err)
		}
		w, _ := like.Decimal(ct.Weight.String())
		rel.Terms = append(rel.Terms, rt)
		rel.Weights = append(rel.Weights, w)
	}
	for _, s := range []string{"-9", "-1.5", "-0.4", "0.3", "2.75"} {
		sr, _ := new(big.Rat).SetString(s)
		A, D, B, err := m.Entries(sr)
		if err != nil {
			t.Fatalf("s = %s: %v", s, err)
		}
		sv, _ := like.Decimal(s)
		want := rel.Enclose(sv)
		for _, c := range []struct {
			name string
			v, w interval.F
		}{{"A", A, want.A}, {"D", D, want.D}, {"Re B", B.Re, want.B.Re}, {"Im B", B.Im, want.B.Im}} {
			if !c.v.IsFinite() || !c.w.IsFinite() || math.Abs(c.v.Mid().Lo()-c.w.Mid().Lo()) > 1e-9 || c.v.Rad() > 1e-9 {
				t.Errorf("s = %s: %s verifier %v, certifier %v", s, c.name, c.v, c.w)
			}
			// Both are enclosures of the same number: they must meet.
			if c.v.Less(c.w) || c.w.Less(c.v) {
				t.Errorf("s = %s: %s enclosures are disjoint: verifier %v, certifier %v", s, c.name, c.v, c.w)
			}
		}
	}
}
