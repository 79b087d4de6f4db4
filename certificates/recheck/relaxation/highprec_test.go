package relaxation

import (
	"math/big"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	"wedgebound/interval"
)

// The big-float model agrees with the float64 one and is much tighter.
func TestHighPrecisionModel(t *testing.T) {
	terms := []certificates.Term{{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal("150")}, Weight: certificates.MustDecimal("8.46")}}
	mf, err := NewModel(interval.F{}, Lower, terms)
	if err != nil {
		t.Fatal(err)
	}
	mb, err := NewModel(interval.NewB(0, 128), Lower, terms)
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []string{"-0.26", "-3.3", "2.5"} {
		x := rat(t, s)
		pf, err := mf.Piece(x, x)
		if err != nil {
			t.Fatal(err)
		}
		pb, err := mb.Piece(x, x)
		if err != nil {
			t.Fatal(err)
		}
		bl, bh := pb.Mid.Endpoints()
		fb := interval.F{}.Between(bl, bh)
		if !overlaps(fb, pf.Mid) {
			t.Errorf("s=%s: B %v and F %v disagree", s, pb.Mid, pf.Mid)
		}
		if pb.Mid.Rad() > 1e-30 {
			t.Errorf("s=%s: B enclosure %v too wide for 128 bits", s, pb.Mid)
		}
	}
}

// A piece whose margin is below what float64 intervals resolve is decided
// by the high-precision retry. The quadrant's minimum is
// -0.15593984319124276369 (mpmath, regions package doc; not a published source), so a claim 0.1559398431912428
// holds with a margin of about 4e-17.
func TestHighPrecisionRetry(t *testing.T) {
	s := rat(t, "-0.35581989710050001273")
	w := big.NewRat(1, 1000000000)
	a, b := new(big.Rat).Sub(s, w), new(big.Rat).Add(s, w)
	c := &certificates.Certificate{Kind: certificates.KindRelaxation, Relaxation: &certificates.Relaxation{
		Problem:       backflow("lower"),
		Claim:         certificates.Claim{Edge: "lower", Bound: certificates.MustDecimal("0.1559398431912428")},
		PrecisionBits: 128,
		Cover:         []certificates.Cell{{Lo: certificates.MustDecimal(a.FloatString(30)), Hi: certificates.MustDecimal(b.FloatString(30)), EigLower: certificates.MustDecimal("-0.156"), EigUpper: certificates.MustDecimal("-0.155")}},
	}}
	v := &verifier{rel: c.Relaxation, opt: Options{MaxDepth: 1}, res: &recheck.Result{}, det: &Detail{}, edge: Lower, thr: rat(t, "-0.1559398431912428")}
	m, _ := NewModel(interval.F{}, Lower, nil)
	v.mF = m
	r := v.cell(a, b)
	if r.failure != nil || r.high == 0 {
		t.Fatalf("high-precision retry did not decide: %+v", r.failure)
	}
	// Without the retry float64 cannot decide it.
	v.opt.NoHighPrecision = true
	if r := v.cell(a, b); r.failure == nil {
		t.Fatal("float64 decided a margin of 4e-17; the test no longer exercises the retry")
	}
}
