package regions

import (
	"math"
	"math/cmplx"
	"testing"

	"wedgebound/interval"
)

// tauEdge computes the edge terms from the tau form of the package doc,
//
//	E(c, s) = (1/pi) int_1^inf e^{2ic tau} (2i tau)^{-1} (tau-1)^{-1/2+is} (tau+1)^{-1/2-is} dtau,
//
// (and K(c, s) with (2i tau)^{-1} replaced by -1/(4 tau^2), the hat's
// G^ = -sum sigma_j e^{ic_j w}/w^2 at w = 2 tau) on the turned path
// tau = 1 + e^{i theta} y, y = e^w, theta = min(1/2, 1/(2|s|)). This is a
// different integral and path from the package's t = -log r form, in
// float64.
func tauEdge(c, s float64, kink bool) complex128 {
	th := 0.5
	if math.Abs(s) > 1 {
		th = 0.5 / math.Abs(s)
	}
	rot := cmplx.Exp(complex(0, th))
	f := func(w float64) complex128 {
		y := math.Exp(w)
		tau := 1 + rot*complex(y, 0)
		amp := 1 / (2i * tau)
		if kink {
			amp = -1 / (4 * tau * tau)
		}
		p1 := cmplx.Exp(complex(-0.5, s) * complex(w, th))
		p2 := cmplx.Exp(complex(-0.5, -s) * cmplx.Log(tau+1))
		return cmplx.Exp(complex(0, 2*c)*tau) * amp * p1 * p2 * rot * complex(y, 0)
	}
	wmax := math.Log(40 / (c * math.Sin(th)))
	return glPanels(f, uniformEdges(-70, wmax, 0.125), 20) / math.Pi
}

// TestEdgeAgainstTauForm compares the certified edge enclosures with the
// independent tau-form quadrature; the enclosures must be narrow and agree
// to the reference's accuracy.
func TestEdgeAgainstTauForm(t *testing.T) {
	like := interval.PointF(0)
	for _, kink := range []bool{false, true} {
		for _, c := range []float64{0.05, 0.5, 2} {
			e := newEdge(like.Float(c), c, kink)
			for _, s := range []float64{-12, -3, -0.7, 0, 0.4, 2.5, 9} {
				v, ok := e.value(like.Float(s), false)
				want := tauEdge(c, s, kink)
				if !ok || v.Re.Rad() > 1e-13 || v.Im.Rad() > 1e-13 {
					t.Errorf("kink=%v c=%v s=%v: enclosure %v (ok %v) too wide", kink, c, s, v, ok)
					continue
				}
				if d := cmplx.Abs(midC(v) - want); d > 1e-10 {
					t.Errorf("kink=%v c=%v s=%v: %v, tau form %v (difference %.2g)", kink, c, s, midC(v), want, d)
				}
			}
		}
	}
}

// TestEdgeZeroLimit checks continuity at c = 0, where the package uses the
// closed forms E(0, s) = -(i/2pi) J(s) and K(0, s) = -(1/4pi)(1 - 2is J(s)):
// |E(c) - E(0)| = O(c log(1/c)) as e^{2ic coth(t/2)} - 1 is at most
// min(2, 4c/t) for small t.
func TestEdgeZeroLimit(t *testing.T) {
	like := interval.PointF(0)
	c := 1e-6
	for _, kink := range []bool{false, true} {
		e0 := newEdge(like.Int(0), 0, kink)
		ec := newEdge(like.Float(c), c, kink)
		for _, s := range []float64{-20, -1, 0, 0.5, 7} {
			v0, ok0 := e0.value(like.Float(s), false)
			vc, okc := ec.value(like.Float(s), false)
			if !ok0 || !okc {
				t.Fatalf("no value at s = %v", s)
			}
			if d := cmplx.Abs(midC(v0) - midC(vc)); d > 1e-4 {
				t.Errorf("kink=%v s=%v: E(0) = %v, E(1e-6) = %v", kink, s, midC(v0), midC(vc))
			}
		}
	}
}

// kummerM sums Kummer's series M(a, 1, z) = sum (a)_n z^n / (n!)^2
// (DLMF 13.2.2, from memory).
func kummerM(a, z complex128) complex128 {
	sum, term := complex(1, 0), complex(1, 0)
	for n := 0; n < 200; n++ {
		term *= (a + complex(float64(n), 0)) * z / complex(float64((n+1)*(n+1)), 0)
		sum += term
	}
	return sum
}

// TestStepDiagonalKummer checks the diagonal entry of the band [0, c)
// against an independent closed form: with t = tanh v,
// D(s) = (1/pi) int_{-1}^{1} G^(2t) (1-t)^{-1/2+is} (1+t)^{-1/2-is} dt and
// G^(2t) = int_0^c e^{2iut} du; Euler's integral for Kummer's function
// (DLMF 13.4.1, from memory) gives int_{-1}^{1} e^{zt} (1-t)^{a-1} (1+t)^{b-1} dt
// = 2^{a+b-1} e^{-z} B(a, b) M(b, a+b, 2z), and with a + b = 1,
// B = pi/cosh(pi s):
// D(s) = (1/cosh(pi s)) int_0^c e^{-2iu} M(1/2 - is, 1, 4iu) du.
func TestStepDiagonalKummer(t *testing.T) {
	like := interval.PointF(0)
	for _, c := range []string{"0.5", "2"} {
		cf := mustFloat(c)
		b, err := NewTerm(like, "band", map[string]string{"from": "0", "to": c})
		if err != nil {
			t.Fatal(err)
		}
		for _, s := range []float64{-2, -0.3, 0, 0.5, 1.7, 3} {
			a := complex(0.5, -s)
			ref := glPanels(func(u float64) complex128 {
				return cmplx.Exp(complex(0, -2*u)) * kummerM(a, complex(0, 4*u))
			}, uniformEdges(0, cf, 0.05), 16) / complex(math.Cosh(math.Pi*s), 0)
			m := b.Enclose(like.Float(s))
			if math.Abs(imag(ref)) > 1e-12 {
				t.Errorf("c=%s s=%v: Kummer form not real (%v)", c, s, ref)
			}
			if d := math.Abs((m.D.Lo()+m.D.Hi())/2 - real(ref)); d > 1e-11 || m.D.Rad() > 1e-12 {
				t.Errorf("c=%s s=%v: D = [%v, %v], Kummer form %v", c, s, m.D.Lo(), m.D.Hi(), real(ref))
			}
		}
	}
}

// TestPsiFunctions checks the series branch of psi1, psi2 against the
// closed forms (e^z - 1)/z and (e^z (z - 1) + 1)/z^2 where both are
// accurate, and containment of the closed forms.
func TestPsiFunctions(t *testing.T) {
	like := interval.PointF(0)
	for _, z := range []complex128{0.3 + 0.1i, -1 + 2i, 3i, -3.5, 0.001i} {
		p1, p2 := psiFunctions(interval.CPoint(like, real(z), imag(z)))
		w1 := (cmplx.Exp(z) - 1) / z
		w2 := (cmplx.Exp(z)*(z-1) + 1) / (z * z)
		tol := 1e-14 / math.Min(1, cmplx.Abs(z)*cmplx.Abs(z))
		if cmplx.Abs(midC(p1)-w1) > tol || cmplx.Abs(midC(p2)-w2) > tol {
			t.Errorf("z=%v: psi1 %v want %v, psi2 %v want %v", z, midC(p1), w1, midC(p2), w2)
		}
		if p1.Re.Rad() > 1e-14 || p2.Re.Rad() > 1e-14 {
			t.Errorf("z=%v: enclosures too wide: %v %v", z, p1, p2)
		}
	}
}

// TestEdgeTails samples the edge terms beyond S against the tail lemmas of
// edgeTerm.tail on both sides.
func TestEdgeTails(t *testing.T) {
	like := interval.PointF(0)
	for _, kink := range []bool{false, true} {
		for _, c := range []float64{0, 0.1, 3} {
			e := newEdge(like.Float(c), c, kink)
			for _, S := range []float64{5, 40, 300} {
				for side := -1; side <= 1; side += 2 {
					bound := e.tail(like.Float(S), side).Hi()
					worst := 0.0
					for k := 0; k < 60; k++ {
						s := float64(side) * (S + float64(k)*S/40)
						v, ok := e.value(like.Float(s), false)
						if !ok {
							t.Fatalf("no value at %v", s)
						}
						worst = math.Max(worst, cmplx.Abs(midC(v))+v.Re.Rad()+v.Im.Rad())
					}
					if worst > bound {
						t.Errorf("kink=%v c=%v S=%v side %d: sampled %.3g above the lemma %.3g", kink, c, S, side, worst, bound)
					}
				}
			}
		}
	}
}

// TestBandToInfTail checks that the tail enclosure of a band [a, inf)
// keeps D near 1 for s -> +inf (D = A - D[0, a) there) and contains sampled
// values (they overlap), so the sup spec of a weighted quadrant-III half-band is not
// inflated by a symmetric box [-1, 1].
func TestBandToInfTail(t *testing.T) {
	like := interval.PointF(0)
	for _, from := range []string{"0", "0.5"} {
		b, err := NewTerm(like, "band", map[string]string{"from": from, "to": "inf"})
		if err != nil {
			t.Fatal(err)
		}
		for side := -1; side <= 1; side += 2 {
			S := like.Int(60)
			box := b.(*pwlTerm[interval.F]).TailD(S, side)
			for _, k := range []float64{60, 61.3, 90, 400} {
				m := b.Enclose(like.Float(float64(side) * k))
				// Both enclose the true D(s), so they must meet.
				if m.D.Hi() < box.Lo() || box.Hi() < m.D.Lo() {
					t.Errorf("from %s, s = %v: D %v disjoint from the tail enclosure %v", from, float64(side)*k, m.D, box)
				}
			}
			if side > 0 && box.Lo() < 0.999 {
				t.Errorf("from %s: tail enclosure %v of D for s >= 60 does not stay near 1", from, box)
			}
		}
		w := like.Frac(-1, 5)
		ts := TailSymbol(like.Int(60), 1, []Term[interval.F]{b}, []interval.F{w})
		if up := ts.MaxEig().Hi(); up > 1.01 {
			t.Errorf("from %s: tail sup eigenvalue bound %v, want near 1", from, up)
		}
	}
}

// TestEdgeLargeKnot checks a knot at c = 300, where the integrand alone
// reaches e^{1000} on the path while its product with e^{-ist} stays below
// 1: the enclosures must stay finite and narrow, and the |s|^{-3/4} lemma
// must hold at the sampled points.
func TestEdgeLargeKnot(t *testing.T) {
	like := interval.PointF(0)
	for _, kink := range []bool{false, true} {
		e := newEdge(like.Float(300), 300, kink)
		for _, s := range []float64{-3000, -250, 3, 2238.7} {
			v, ok := e.value(like.Float(s), false)
			if !ok || !v.IsFinite() || v.Re.Rad() > 1e-12 || v.Im.Rad() > 1e-12 {
				t.Errorf("kink=%v s=%v: enclosure %v (ok %v)", kink, s, v, ok)
			}
			if s < -1000 {
				if b := e.tail(like.Float(-s), -1).Hi(); cmplx.Abs(midC(v)) > b {
					t.Errorf("kink=%v s=%v: |value| %.3g above the tail lemma %.3g", kink, s, cmplx.Abs(midC(v)), b)
				}
			}
		}
	}
}
