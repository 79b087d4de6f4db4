package relaxation_test

import (
	"strings"
	"sync"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck/relaxation"
	"wedgebound/certificates/recheck/relaxation/reltest"
)

// vertexInside is testdata/problems/vertex-inside.json: the backflow wedge
// in {p > -1}; normal form a = b = d = 1, threshold 1/4.
func vertexInside() certificates.Problem {
	return certificates.Problem{
		Vertex:    [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("0")},
		Rays:      [2][2]certificates.Fraction{{certificates.MustFraction("0"), certificates.MustFraction("1")}, {certificates.MustFraction("-1"), certificates.MustFraction("1")}},
		Halfplane: certificates.Halfplane{Normal: [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("1")}, Offset: certificates.MustFraction("-1")},
		Edge:      "lower",
	}
}

var (
	stepOnce sync.Once
	stepCert *certificates.Certificate
	stepErr  error
)

// stepCertificate: the step xp > 1/4 with weight -0.110085 (float minimum
// of lambda_min about -0.143427 by the certifier's search), claiming 0.1440.
func stepCertificate(t *testing.T) *certificates.Certificate {
	stepOnce.Do(func() {
		stepCert, stepErr = reltest.BuildCertificate(reltest.BuildOptions{Problem: vertexInside(),
			Terms: []certificates.Term{{Kind: "step", Params: map[string]certificates.Decimal{"from": certificates.MustDecimal("0.25")}, Weight: certificates.MustDecimal("-0.110085")}},
			Bound: "0.1440", Lo: "-8", Hi: "8"})
	})
	if stepErr != nil {
		t.Fatal(stepErr)
	}
	b, _ := certificates.Encode(stepCert)
	c, err := certificates.Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// A step certificate for a vertex-inside geometry passes; re-sealed with a
// false claim it fails: the bound lowered below the true minimum (about
// 0.14343, seen here by the certifier's float search), the step's support
// moved inside the half-plane (from 0.2 < 1/4), the weight changed so that
// lambda_min tends to -0.2 as s -> inf.
func TestStepCertificateAndFalseClaims(t *testing.T) {
	c := stepCertificate(t)
	opt := relaxation.Options{MaxDepth: 3, NoHighPrecision: true}
	r, err := relaxation.Verify(c, opt)
	if err != nil || !r.Pass {
		t.Fatalf("step certificate: %v %+v", err, r)
	}
	for _, tc := range []struct {
		name  string
		edit  func(*certificates.Certificate)
		where string
		msg   string
	}{
		{"bound lowered", func(c *certificates.Certificate) {
			c.Relaxation.Claim.Bound = certificates.MustDecimal("0.1420")
			c.Relaxation.Claim.Statement = strings.ReplaceAll(c.Relaxation.Claim.Statement, "0.1440", "0.1420")
		}, "", ""},
		{"support inside H", func(c *certificates.Certificate) {
			c.Relaxation.Terms[0].Params["from"] = certificates.MustDecimal("0.2")
		}, "terms[0]", "xp >= 1/4"},
		{"weight changed", func(c *certificates.Certificate) { c.Relaxation.Terms[0].Weight = certificates.MustDecimal("-0.2") }, "", ""},
	} {
		d := stepCertificate(t)
		tc.edit(d)
		if err := certificates.Seal(d); err != nil {
			t.Fatal(err)
		}
		r, err := relaxation.Verify(d, opt)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if r.Pass || len(r.Failures) == 0 {
			t.Errorf("%s: the false certificate passed", tc.name)
			continue
		}
		if tc.where != "" && (r.Failures[0].Where != tc.where || !strings.Contains(r.Failures[0].Message, tc.msg)) {
			t.Errorf("%s: first failure %+v", tc.name, r.Failures[0])
		}
	}
}
