package relaxation

import (
	"math"
	"math/big"
	"testing"

	"wedgebound/interval"
)

// Additivity of the band diagonal: D0[0, a) + D0[a, b) = D0[0, b) (the
// integral is linear in the profile; three separate quadratures, or tail
// bounds, on every regime tried). Common practice.
func TestBandDiagonalAdditive(t *testing.T) {
	like := interval.F{}
	r := func(s string) *big.Rat { v, _ := new(big.Rat).SetString(s); return v }
	d1, _ := newDiagInt(like, r("0"), r("0.5"))
	d2, _ := newDiagInt(like, r("0.5"), r("1.25"))
	d3, _ := newDiagInt(like, r("0"), r("1.25"))
	for _, s := range []string{"-20", "-5", "-1.5", "0", "0.75", "3", "12"} {
		sr := r(s)
		idx, _ := regimeIndex(sr, sr)
		c, err := like.Decimal(s)
		if err != nil {
			t.Fatal(err)
		}
		zero := like.Int(0)
		a, _, _, err1 := d1.eval(idx, c, zero)
		b, _, _, err2 := d2.eval(idx, c, zero)
		w, _, _, err3 := d3.eval(idx, c, zero)
		if err1 != nil || err2 != nil || err3 != nil {
			t.Fatal(err1, err2, err3)
		}
		sum := a.Add(b)
		if sum.Less(w) || w.Less(sum) || math.Abs(sum.Mid().Lo()-w.Mid().Lo()) > 1e-12 {
			t.Errorf("s = %s: D0[0,1/2) + D0[1/2,5/4) = %v, D0[0,5/4) = %v", s, sum, w)
		}
	}
}

// As c -> 0 the edge integral tends to E(0, s) = -(i/2pi) J(s) (package
// doc, "Bands"): |E(c, s) - E(0, s)| <= (1/pi) int_1^inf
// |tau^2 - 1|^{-1/2} min(2, 2c tau)/(2 tau) dtau = O(c log(1/c)). A sign or
// branch error on any of the turned paths would show as an O(1) difference.
// Common practice (the limit), closed form of J from DLMF 5.7.6.
func TestEdgeTendsToQuadrant(t *testing.T) {
	like := interval.F{}
	c := big.NewRat(1, 100000000)
	e, err := newEdgeInt(like, c)
	if err != nil {
		t.Fatal(err)
	}
	twoPi := like.Pi().Scale(1)
	for _, s := range []string{"-40", "-6", "-1.25", "-0.5", "0", "0.5", "2", "9", "100"} {
		sr, _ := new(big.Rat).SetString(s)
		idx, _ := regimeIndex(sr, sr)
		sv, _ := like.Decimal(s)
		ev, err := e.eval(idx, sv, like.Int(0))
		if err != nil {
			t.Fatalf("s = %s: %v", s, err)
		}
		J := quadJ(sv)
		want := interval.C[interval.F]{Re: J.Im.Quo(twoPi), Im: J.Re.Neg().Quo(twoPi)}
		d := ev.Vc.Sub(want)
		if !ev.Vc.IsFinite() || d.Abs().Hi() > 1e-5 || ev.Vc.Re.Rad() > 1e-12 {
			t.Errorf("s = %s: E(1e-8, s) = %v, E(0, s) = %v", s, ev.Vc, want)
		}
	}
}

// The verifier's own tail lemma for the edge integral holds where the
// integral is computed (edgeTailB against the quadrature).
func TestEdgeTailLemma(t *testing.T) {
	like := interval.F{}
	for _, cs := range []string{"0.25", "2"} {
		c, _ := new(big.Rat).SetString(cs)
		e, err := newEdgeInt(like, c)
		if err != nil {
			t.Fatal(err)
		}
		for _, s := range []string{"-60", "-12", "-3", "3", "12", "60"} {
			sr, _ := new(big.Rat).SetString(s)
			idx, _ := regimeIndex(sr, sr)
			sv, _ := like.Decimal(s)
			ev, err := e.eval(idx, sv, like.Int(0))
			if err != nil {
				t.Fatal(err)
			}
			side := 1
			if sr.Sign() < 0 {
				side = -1
			}
			b := edgeTailB(e.c, sv.Abs(), side)
			if !b.IsFinite() || b.Less(ev.Vc.Abs()) {
				t.Errorf("c = %s, s = %s: |E| = %v above the lemma's %v", cs, s, ev.Vc.Abs(), b)
			}
		}
	}
}
