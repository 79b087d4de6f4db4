package relaxation_test

import (
	"math/big"
	"strings"
	"sync"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck/relaxation"
	"wedgebound/certificates/recheck/relaxation/reltest"
)

func backflowProblem(edge string) certificates.Problem {
	return certificates.Problem{
		Vertex:    [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("0")},
		Rays:      [2][2]certificates.Fraction{{certificates.MustFraction("0"), certificates.MustFraction("1")}, {certificates.MustFraction("-1"), certificates.MustFraction("1")}},
		Halfplane: certificates.Halfplane{Normal: [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("1")}, Offset: certificates.MustFraction("0")},
		Edge:      edge,
	}
}

var (
	expOnce sync.Once
	expCert *certificates.Certificate
	expErr  error
)

// expBackflow: one exp term k = 150, weight 8.46 (min lambda_min about
// -0.05265 by a float scan), claiming 0.06.
func expBackflow(t *testing.T) *certificates.Certificate {
	expOnce.Do(func() {
		expCert, expErr = reltest.BuildCertificate(reltest.BuildOptions{Problem: backflowProblem("lower"),
			Terms: []certificates.Term{{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal("150")}, Weight: certificates.MustDecimal("8.46")}},
			Bound: "0.06", Lo: "-40", Hi: "16"})
	})
	if expErr != nil {
		t.Fatal(expErr)
	}
	b, _ := certificates.Encode(expCert)
	c, err := certificates.Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

func TestVerifyPasses(t *testing.T) {
	for _, o := range []reltest.BuildOptions{
		{Problem: backflowProblem("lower"), Bound: "0.1560", Lo: "-8", Hi: "8"},
		{Problem: backflowProblem("upper"), Bound: "1.0077", Lo: "-8", Hi: "8"},
	} {
		c, err := reltest.BuildCertificate(o)
		if err != nil {
			t.Fatal(err)
		}
		r, err := relaxation.Verify(c, relaxation.Options{})
		if err != nil || !r.Pass {
			t.Fatalf("%s %s: %v %+v", o.Problem.Edge, o.Bound, err, r)
		}
	}
	r, err := relaxation.Verify(expBackflow(t), relaxation.Options{})
	if err != nil || !r.Pass {
		t.Fatalf("exp: %v %+v", err, r)
	}
	if got, ok := new(big.Rat).SetString(r.Recomputed); !ok || got.Cmp(ratOf(t, "0.06")) > 0 || got.Cmp(ratOf(t, "0.05264")) < 0 {
		t.Errorf("recomputed bound %q: should lie in [0.05265, 0.06]", r.Recomputed)
	}
}

// Claims beyond the true edge values (Werner 1988, see TestQuadrantEdges)
// cannot be built.
func TestBuildRefusesFalseClaims(t *testing.T) {
	for _, o := range []reltest.BuildOptions{
		{Problem: backflowProblem("lower"), Bound: "0.1559", Lo: "-8", Hi: "8", MaxCells: 3000},
		{Problem: backflowProblem("upper"), Bound: "1.00767", Lo: "-8", Hi: "8", MaxCells: 3000},
	} {
		if _, err := reltest.BuildCertificate(o); err == nil {
			t.Errorf("%s %s: built a false claim", o.Problem.Edge, o.Bound)
		}
	}
}

// When the recorded tail starts where the verifier's lemma is too weak, the
// verifier covers more of s itself (or fails when told not to).
func TestTailExtension(t *testing.T) {
	c := expBackflow(t)
	rel := c.Relaxation
	var kept []certificates.Cell
	for _, cell := range rel.Cover {
		lo := ratOf(t, cell.Lo.String())
		if lo.Cmp(ratOf(t, "-20")) >= 0 {
			kept = append(kept, cell)
		}
	}
	rel.Cover = kept
	rel.Below.From = kept[0].Lo
	if err := certificates.Seal(c); err != nil {
		t.Fatal(err)
	}
	r, err := relaxation.Verify(c, relaxation.Options{})
	if err != nil || !r.Pass {
		t.Fatalf("extension: %v %+v", err, r.Failures)
	}
	if len(r.Notes) == 0 || !strings.Contains(r.Notes[0], "tail_below") {
		t.Errorf("no note about the extension: %v", r.Notes)
	}
	r, _ = relaxation.Verify(c, relaxation.Options{NoTailExtension: true})
	if r.Pass || r.Failures[0].Where != "tail_below" {
		t.Errorf("without extension: %+v", r.Failures)
	}
}

// An exp profile is nonzero on all of quadrant III, so it is inadmissible
// when the vertex lies inside the half-plane (threshold > 0).
func TestInadmissibleTerm(t *testing.T) {
	c := expBackflow(t)
	rel := c.Relaxation
	rel.Problem.Vertex = [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("1")}
	nf, err := relaxation.Recompute(rel.Problem)
	if err != nil {
		t.Fatal(err)
	}
	rel.Normal.D = certificates.MustFraction(nf.D.RatString())
	rel.Normal.Threshold = certificates.MustThreshold(nf.Threshold.RatString())
	certificates.Seal(c)
	r, _ := relaxation.Verify(c, relaxation.Options{})
	if r.Pass || r.Failures[0].Where != "terms[0]" || !strings.Contains(r.Failures[0].Message, "xp >= 1/4") {
		t.Fatalf("inadmissible term accepted: %+v", r.Failures)
	}
}

// A problem whose vertex lies inside the half-plane with a ray parallel to
// its boundary admits no quadrant-III profile: its normal form records the
// threshold "none", the bare quadrant is still a valid relaxation, and any
// term is inadmissible. (certificates.Decode does not yet accept "none";
// this checks the verifier directly.)
func TestNoAdmissibleProfile(t *testing.T) {
	p := certificates.Problem{Vertex: [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("0")}, Rays: [2][2]certificates.Fraction{{certificates.MustFraction("1"), certificates.MustFraction("0")}, {certificates.MustFraction("0"), certificates.MustFraction("1")}},
		Halfplane: certificates.Halfplane{Normal: [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("1")}, Offset: certificates.MustFraction("-1")}, Edge: "lower"}
	c, err := reltest.BuildCertificate(reltest.BuildOptions{Problem: p, Bound: "0.1560", Lo: "-8", Hi: "8"})
	if err != nil {
		t.Fatal(err)
	}
	if !c.Relaxation.Normal.Threshold.None() {
		t.Fatalf("threshold %q", c.Relaxation.Normal.Threshold)
	}
	r, _ := relaxation.Verify(c, relaxation.Options{})
	if !r.Pass {
		t.Fatalf("bare quadrant rejected: %+v", r.Failures)
	}
	c.Relaxation.Terms = []certificates.Term{{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal("150")}, Weight: certificates.MustDecimal("1")}}
	r, _ = relaxation.Verify(c, relaxation.Options{})
	if r.Pass || r.Failures[0].Where != "terms[0]" {
		t.Fatalf("inadmissible term accepted: %+v", r.Failures)
	}
	c.Relaxation.Terms = nil
	c.Relaxation.Normal.Threshold = certificates.MustThreshold("0")
	r, _ = relaxation.Verify(c, relaxation.Options{})
	if r.Pass || r.Failures[0].Where != "normal_form" {
		t.Fatalf("wrong threshold accepted: %+v", r.Failures)
	}
}

func ratOf(t testing.TB, s string) *big.Rat {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		t.Fatalf("bad number %q", s)
	}
	return r
}

// BenchmarkVerifyExp verifies a 75-cell certificate with one exp term on
// one goroutine; the quadrature regimes are built in the first iteration
// and shared afterwards (see BenchmarkRegimeBuild for their cost).
func BenchmarkVerifyExp(b *testing.B) {
	c, err := reltest.BuildCertificate(reltest.BuildOptions{Problem: backflowProblem("lower"),
		Terms: []certificates.Term{{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal("150")}, Weight: certificates.MustDecimal("8.46")}},
		Bound: "0.06", Lo: "-40", Hi: "16"})
	if err != nil {
		b.Fatal(err)
	}
	b.ReportMetric(float64(len(c.Relaxation.Cover)), "cells")
	for b.Loop() {
		r, err := relaxation.Verify(c, relaxation.Options{Workers: 1})
		if err != nil || !r.Pass {
			b.Fatal("verification failed")
		}
	}
}
