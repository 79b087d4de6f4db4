package regions

import (
	"math"
	"math/cmplx"
	"math/rand"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"wedgebound/interval"
)

// glPanels integrates f over [a, b] split into panels at edges (which must
// start at a and end at b) with n-point Gauss-Legendre on each panel, nodes
// and weights from gonum's quad.Legendre (independent of this package's
// verified rule). Plain float64; for reference values only.
func glPanels(f func(float64) complex128, edges []float64, n int) complex128 {
	x := make([]float64, n)
	w := make([]float64, n)
	var sum complex128
	for i := 0; i+1 < len(edges); i++ {
		quad.Legendre{}.FixedLocations(x, w, edges[i], edges[i+1])
		for j := range x {
			sum += complex(w[j], 0) * f(x[j])
		}
	}
	return sum
}

// uniformEdges returns edges from a to b with panels no wider than h.
func uniformEdges(a, b, h float64) []float64 {
	n := int(math.Ceil((b - a) / h))
	if n < 1 {
		n = 1
	}
	e := make([]float64, n+1)
	for i := range e {
		e[i] = a + (b-a)*float64(i)/float64(n)
	}
	e[n] = b
	return e
}

// near reports whether the float v lies in the enclosure x widened by tol.
func near(x interval.F, v, tol float64) bool {
	return v >= x.Lo()-tol && v <= x.Hi()+tol
}

func nearC(z interval.C[interval.F], v complex128, tol float64) bool {
	return near(z.Re, real(v), tol) && near(z.Im, imag(v), tol)
}

func bigPoint(v float64, prec uint) interval.B { return interval.NewB(v, prec) }

// TestQuadrantJZero checks J(0) = sum_n (-1)^n/(n + 1/2) = 2 (1 - 1/3 + 1/5
// - ...) = pi/2 (Leibniz series; package doc, "The quadrant"), hence A(0) = 1/2 and
// B(0) = (i/2pi)(pi/2) = i/4, at 256 bits.
func TestQuadrantJZero(t *testing.T) {
	z := bigPoint(0, 256)
	j := quadrantJ(z)
	halfPi := z.Pi().Scale(-1)
	if !j.Re.Pad(z.Int(1).Scale(-240)).Contains(halfPi) || j.Re.Rad() > 1e-70 {
		t.Errorf("Re J(0) = %v, want pi/2 to 70 digits", j.Re)
	}
	if !j.Im.Contains(z.Int(0)) || j.Im.Rad() > 1e-70 {
		t.Errorf("Im J(0) = %v, want 0", j.Im)
	}
	q := Quadrant(z)
	if !q.A.Contains(z.Frac(1, 2)) || q.A.Rad() > 1e-70 {
		t.Errorf("A(0) = %v, want 1/2", q.A)
	}
	if !q.B.Im.Contains(z.Frac(1, 4)) || q.B.Im.Rad() > 1e-70 || !q.B.Re.Contains(z.Int(0)) {
		t.Errorf("B(0) = %v + i %v, want i/4", q.B.Re, q.B.Im)
	}
	if !q.D.Contains(z.Int(0)) || q.D.Rad() != 0 {
		t.Errorf("D(0) = %v, want exactly 0 (the kernel [x+y>0] vanishes for x, y < 0)", q.D)
	}
}

// TestQuadrantFromKernel derives every entry of the quadrant symbol from the
// position-space kernel K = (1/2)[x>0] delta(x-y) + (i/2pi) PV [x+y>0]/(x-y)
// (the Weyl kernel of the package doc for f = [x>0][p>0], since
// int_0^inf e^{ipu} dp = pi delta(u) + i PV 1/u) and
// M_{sigma sigma'}(s) = int_0^inf K(sigma, sigma' r) r^{-1/2+is} dr, by
// float quadrature (gonum Gauss-Legendre) in r = e^{-t} or r = e^t:
//   - M_{+-} = (i/2pi) int_0^inf e^{-t/2} e^{-ist}/(1 + e^{-t}) dt must be B;
//   - M_{-+} = -(i/2pi) int_0^inf e^{t/2} e^{ist}/(1 + e^t) dt must be
//     conj(B) (M is Hermitian);
//   - M_{++} = 1/2 + (i/2pi) PV int_R e^{t/2} e^{ist}/(1 - e^t) dt; pairing t
//     with -t the integrand becomes -i sin(st)/sinh(t/2), so
//     M_{++} = 1/2 + (1/2pi) int_0^inf sin(st)/sinh(t/2) dt is real and
//     must be A (and equals (1 + tanh pi s)/2 by G&R 3.981.1, from memory).
func TestQuadrantFromKernel(t *testing.T) {
	for _, s := range []float64{-6, -2.5, -0.3558, 0, 0.4, 0.8722, 3, 9} {
		edges := uniformEdges(0, 90, math.Min(0.5, 2/math.Max(math.Abs(s), 1)))
		pm := glPanels(func(t float64) complex128 {
			return cmplx.Exp(complex(-t/2, -s*t)) / complex(1+math.Exp(-t), 0)
		}, edges, 20) * complex(0, 1/(2*math.Pi))
		mp := glPanels(func(t float64) complex128 {
			return cmplx.Exp(complex(-t/2, s*t)) / complex(1+math.Exp(-t), 0)
		}, edges, 20) * complex(0, -1/(2*math.Pi))
		app := 0.5 + real(glPanels(func(t float64) complex128 {
			if t == 0 {
				return complex(2*s, 0)
			}
			return complex(math.Sin(s*t)/math.Sinh(t/2), 0)
		}, edges, 20))/(2*math.Pi)
		q := Quadrant(interval.PointF(s))
		if !nearC(q.B, pm, 1e-13) {
			t.Errorf("s = %v: B = %v + i %v, kernel quadrature M_{+-} = %v", s, q.B.Re, q.B.Im, pm)
		}
		if !nearC(q.B, cmplx.Conj(mp), 1e-13) {
			t.Errorf("s = %v: conj B = %v - i %v, kernel quadrature M_{-+} = %v (M not Hermitian)", s, q.B.Re, q.B.Im, mp)
		}
		if !near(q.A, app, 1e-13) {
			t.Errorf("s = %v: A = %v, kernel quadrature M_{++} = %v", s, q.A, app)
		}
		if want := (1 + math.Tanh(math.Pi*s)) / 2; !near(q.A, want, 1e-15) {
			t.Errorf("s = %v: A = %v, (1 + tanh pi s)/2 = %v", s, q.A, want)
		}
	}
}

// TestQuadrantSymmetries checks A(s) + A(-s) = 1 (tanh is odd) and
// J(-s) = conj J(s) (J is the Mellin integral of a real function; the
// conjugation rule M(-s) ~ conj M(s)), at 128 bits.
func TestQuadrantSymmetries(t *testing.T) {
	for _, s := range []float64{0.125, 0.3558, 1, 2.75, 17, 400} {
		p, m := bigPoint(s, 128), bigPoint(-s, 128)
		qp, qm := Quadrant(p), Quadrant(m)
		if sum := qp.A.Add(qm.A); !sum.Contains(p.Int(1)) || sum.Rad() > 1e-35 {
			t.Errorf("A(%v) + A(-%v) = %v, want 1", s, s, sum)
		}
		jp, jm := quadrantJ(p), quadrantJ(m)
		if d := jp.Re.Sub(jm.Re); !d.Contains(p.Int(0)) || d.Rad() > 1e-35 {
			t.Errorf("Re J(%v) - Re J(-%v) = %v, want 0", s, s, d)
		}
		if d := jp.Im.Add(jm.Im); !d.Contains(p.Int(0)) || d.Rad() > 1e-35 {
			t.Errorf("Im J(%v) + Im J(-%v) = %v, want 0", s, s, d)
		}
	}
}

// dqSymbol encloses the difference quotient (M(s2) - M(s1))/(s2 - s1) of
// a symbol function at two points.
func dqSymbol[T interval.Real[T]](f func(T) Symbol[T], s1, s2 T) Symbol[T] {
	a, b := f(s1), f(s2)
	h := s2.Sub(s1)
	return Symbol[T]{A: b.A.Sub(a.A).Quo(h), D: b.D.Sub(a.D).Quo(h), B: b.B.Sub(a.B).QuoReal(h)}
}

// overlaps reports whether two enclosures intersect.
func overlaps[T interval.Real[T]](x, y T) bool { return !x.Less(y) && !y.Less(x) }

// checkSlope checks the slope enclosure against difference quotients: by
// the mean value theorem, for each real component the exact quotient over
// [s1, s2] equals the derivative at some point of [s1, s2], so the
// enclosure of the quotient must meet the slope enclosure over [s1, s2].
// It also checks that the quotient is close to the slope at the midpoint.
func checkSlope[T interval.Real[T]](t *testing.T, name string, f, df func(T) Symbol[T], s1, s2 T, tol float64) {
	t.Helper()
	dq := dqSymbol(f, s1, s2)
	sl := df(s1.Hull(s2))
	mid := df(s1.Add(s2).Scale(-1))
	for _, c := range []struct {
		n         string
		q, sl, md T
	}{{"A'", dq.A, sl.A, mid.A}, {"D'", dq.D, sl.D, mid.D}, {"Re B'", dq.B.Re, sl.B.Re, mid.B.Re}, {"Im B'", dq.B.Im, sl.B.Im, mid.B.Im}} {
		if !overlaps(c.q, c.sl) {
			t.Errorf("%s at [%v, %v]: %s difference quotient %v misses the slope enclosure %v", name, s1, s2, c.n, c.q, c.sl)
		}
		if d := math.Abs(c.q.Mid().Lo() - c.md.Mid().Lo()); d > tol {
			t.Errorf("%s at [%v, %v]: %s difference quotient %v, slope at the midpoint %v (differ by %.3g)", name, s1, s2, c.n, c.q, c.md, d)
		}
	}
}

// TestQuadrantSlope checks QuadrantSlope against central differences of
// Quadrant at 128 bits (h = 1e-12, so the O(h^2) gap is ~1e-24).
func TestQuadrantSlope(t *testing.T) {
	for _, s := range []float64{-40, -3.3, -0.3558, 0, 0.25, 0.8722, 5, 123} {
		h := 1e-12
		checkSlope(t, "quadrant", Quadrant[interval.B], QuadrantSlope[interval.B], bigPoint(s-h, 128), bigPoint(s+h, 128), 1e-20)
		// and at float64, wider spacing
		checkSlope(t, "quadrant F", Quadrant[interval.F], QuadrantSlope[interval.F], interval.PointF(s-1e-4), interval.PointF(s+1e-4), 1e-7)
	}
}

// TestQuadrantTail checks the tail lemma at sample points: for |s| >= S,
// |B(s)| <= 1/(8S) and A(s) lies in the stated range. The lemma's constant
// is attained at s = 0, where |J(0)| |1/2| = pi/4 (J(0) = pi/2), so the
// bound |B| <= 1/(8 |1/2 + is|) is sharp there; it must not be violated
// anywhere.
func TestQuadrantTail(t *testing.T) {
	for _, S := range []float64{0.25, 1, 3, 8, 64, 1000} {
		for _, side := range []int{1, -1} {
			a, bm := QuadrantTail(interval.PointF(S), side)
			if bm.Hi() < 1/(8*S) {
				t.Errorf("S = %v: bmax %v below 1/(8S)", S, bm)
			}
			for _, f := range []float64{1, 1.0001, 1.5, 3, 10, 100} {
				s := float64(side) * S * f
				q := Quadrant(interval.PointF(s))
				if absB := q.B.Abs(); absB.Hi() > bm.Hi() {
					t.Errorf("|B(%v)| = %v exceeds the tail bound %v for S = %v", s, absB, bm, S)
				}
				// The point enclosure may poke past 1 (or 0) by rounding; the
				// exact value lies in both, so they must meet.
				if !overlaps(a, q.A) {
					t.Errorf("A(%v) = %v outside the tail range %v for S = %v", s, q.A, a, S)
				}
				// and the sharp form with |1/2 + is|
				if got := q.B.Abs().Hi() * math.Hypot(0.5, s); got > 0.125*(1+1e-12) {
					t.Errorf("|B(%v)| |1/2 + is| = %v > 1/8", s, got)
				}
			}
		}
	}
	if got := Quadrant(interval.PointF(0)).B.Abs().Hi() * 0.5; math.Abs(got-0.125) > 1e-14 {
		t.Errorf("|B(0)|/2 = %v, want 1/8 (equality case)", got)
	}
}

// TestQuadrantEigCell checks the mean-value enclosure: for random cells of
// several widths, QuadrantEig over the cell contains the point eigenvalue
// at random points of the cell, for both edges, at 53 and 128 bits.
func TestQuadrantEigCell(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	for _, w := range []float64{1e-6, 1e-3, 0.1, 1} {
		for range 12 {
			c := rng.Float64()*8 - 4
			lo, hi := c-w/2, c+w/2
			for _, e := range []Edge{Lower, Upper} {
				cellF := interval.PointF(lo).Hull(interval.PointF(hi))
				cellB := bigPoint(lo, 128).Hull(bigPoint(hi, 128))
				vF := QuadrantEig(cellF, e)
				vB := QuadrantEig(cellB, e)
				if !vF.IsFinite() || !vB.IsFinite() {
					t.Fatalf("cell [%v, %v] %s: enclosure not finite", lo, hi, e)
				}
				for range 6 {
					s := lo + rng.Float64()*w
					pF := Quadrant(interval.PointF(s)).Eig(e)
					pB := Quadrant(bigPoint(s, 128)).Eig(e)
					if !vF.Contains(pF) {
						t.Errorf("F cell [%v, %v] %s: %v does not contain lambda(%v) = %v", lo, hi, e, vF, s, pF)
					}
					if !vB.Contains(pB) {
						t.Errorf("B cell [%v, %v] %s: %v does not contain lambda(%v) = %v", lo, hi, e, vB, s, pB)
					}
				}
				// The direct enclosure contains the mean-value one's points too.
				if d := Quadrant(cellF).Eig(e); !overlaps(d, vF) {
					t.Errorf("cell [%v, %v] %s: direct %v and mean-value %v enclosures disjoint", lo, hi, e, d, vF)
				}
			}
		}
	}
	// Tight near the minimum: a cell of width 1e-6 at s* = -0.35582 (the
	// minimiser, package doc, not a published source) has width far
	// below the cell width.
	c := interval.PointF(-0.35582 - 5e-7).Hull(interval.PointF(-0.35582 + 5e-7))
	if r := QuadrantEig(c, Lower).Rad(); r > 1e-10 {
		t.Errorf("mean-value enclosure at the minimum has radius %v, want < 1e-10", r)
	}
}

// TestTailSymbolContains checks that the tail symbol's eigenvalue enclosure
// contains the eigenvalue at sample points beyond S, for the bare quadrant
// and with an exponential term.
func TestTailSymbolContains(t *testing.T) {
	term, err := NewTerm(interval.PointF(0), "exp", map[string]string{"k": "2"})
	if err != nil {
		t.Fatal(err)
	}
	for _, rel := range []Relaxation[interval.F]{{}, {Terms: []Term[interval.F]{term}, Weights: []interval.F{interval.PointF(1.5)}}} {
		for _, S := range []float64{1, 8, 40} {
			for _, side := range []int{1, -1} {
				ts := rel.Tail(interval.PointF(S), side)
				for _, f := range []float64{1, 1.3, 2, 7} {
					s := float64(side) * S * f
					m := rel.Enclose(interval.PointF(s))
					for _, e := range []Edge{Lower, Upper} {
						if !ts.Eig(e).Contains(m.Eig(e)) {
							t.Errorf("%d terms, S = %v, s = %v, %s: tail enclosure %v misses %v", len(rel.Terms), S, s, e, ts.Eig(e), m.Eig(e))
						}
					}
				}
			}
		}
	}
}

// TestSymbolEig checks the 2x2 eigenvalue formulas on exact matrices:
// [[2, 1+i], [1-i, 0]] has eigenvalues 1 +- sqrt(3) (common practice: the
// characteristic polynomial l^2 - 2l - 2), and EigSlope against the
// derivative of the eigenvalue of M + t dM at t = 0.
func TestSymbolEig(t *testing.T) {
	z := bigPoint(0, 128)
	m := Symbol[interval.B]{A: z.Int(2), D: z.Int(0), B: interval.C[interval.B]{Re: z.Int(1), Im: z.Int(1)}}
	r3 := z.Int(3).Sqrt()
	if v := m.MinEig(); !v.Contains(z.Int(1).Sub(r3)) || v.Rad() > 1e-35 {
		t.Errorf("min eig %v, want 1 - sqrt 3", v)
	}
	if v := m.MaxEig(); !v.Contains(z.Int(1).Add(r3)) || v.Rad() > 1e-35 {
		t.Errorf("max eig %v, want 1 + sqrt 3", v)
	}
	dm := Symbol[interval.B]{A: z.Frac(1, 3), D: z.Frac(-1, 5), B: interval.C[interval.B]{Re: z.Frac(1, 7), Im: z.Frac(-2, 9)}}
	for _, e := range []Edge{Lower, Upper} {
		h := z.Int(1).Scale(-60)
		plus := m.Add(dm.Scaled(h)).Eig(e)
		minus := m.Add(dm.Scaled(h.Neg())).Eig(e)
		dq := plus.Sub(minus).Quo(h.Scale(1))
		if d := EigSlope(m, dm, e).Sub(dq); math.Max(math.Abs(d.Lo()), math.Abs(d.Hi())) > 1e-15 {
			t.Errorf("%s: EigSlope %v, difference quotient %v", e, EigSlope(m, dm, e), dq)
		}
	}
}
