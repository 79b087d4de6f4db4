package regions

import (
	"math"
	"math/cmplx"
	"testing"

	"wedgebound/interval"
)

// shareFamily builds a fresh four-profile family with alternating weights
// (fresh terms: a shared relaxation installs its layouts in its terms).
func shareFamily(t *testing.T) ([]Term[interval.F], []interval.F) {
	like := interval.PointF(0)
	var terms []Term[interval.F]
	var w []interval.F
	for i, k := range []string{"0.3", "7", "150", "3000"} {
		tm, err := NewTerm(like, "exp", map[string]string{"k": k})
		if err != nil {
			t.Fatal(err)
		}
		terms = append(terms, tm)
		w = append(w, like.Float([]float64{0.2, -1.5, 4, -30}[i]))
	}
	return terms, w
}

// The shared evaluation (one layout per regime, combined node weights) and
// the term-by-term one are two quadratures of the same symbol: their
// enclosures must overlap on every cell, point and slope, and at a point
// both must contain an independent float quadrature (refExpD, refExpMpm,
// common practice). Sharing must not widen the enclosures by much (it
// pays the rounding of the weighted sum once per node).
func TestSharedRelaxationAgrees(t *testing.T) {
	termsA, w := shareFamily(t)
	termsB, _ := shareFamily(t)
	shared := NewRelaxation(termsA, w)
	apart := Relaxation[interval.F]{Terms: termsB, Weights: w}
	if shared.sum == nil {
		t.Fatal("NewRelaxation did not share the exponential terms")
	}
	like := interval.PointF(0)
	cells := [][2]float64{{-0.3, -0.29}, {0.5, 0.5}, {0.9, 1.1}, {3, 3.02}, {-40, -39.5}, {700, 700.5}, {1.75, 2}}
	overlap := func(a, b interval.F) bool { return !(a.Hi() < b.Lo() || b.Hi() < a.Lo()) }
	for _, c := range cells {
		s := like.Float(c[0]).Hull(like.Float(c[1]))
		for _, pair := range [][2]Symbol[interval.F]{{shared.Enclose(s), apart.Enclose(s)}, {shared.Slope(s), apart.Slope(s)}} {
			x, y := pair[0], pair[1]
			if !overlap(x.D, y.D) || !overlap(x.B.Re, y.B.Re) || !overlap(x.B.Im, y.B.Im) {
				t.Errorf("s in %v: shared %v and term-by-term %v do not overlap", c, x, y)
			}
			if x.B.Re.Rad() > 2*y.B.Re.Rad()+1e-15 || x.B.Im.Rad() > 2*y.B.Im.Rad()+1e-15 {
				t.Errorf("s in %v: shared B %v much wider than term-by-term %v", c, x.B, y.B)
			}
		}
		es, ea := shared.Eig(s, Lower), apart.Eig(s, Lower)
		if !overlap(es, ea) {
			t.Errorf("s in %v: lambda_min shared %v, term-by-term %v", c, es, ea)
		}
		// The independent reference at the cell's left end (its real-axis
		// quadrature is meant for moderate |s|).
		if math.Abs(c[0]) > 50 {
			continue
		}
		m := shared.Enclose(like.Float(c[0]))
		q := Quadrant(like.Float(c[0]))
		var d float64
		var b complex128
		for i, k := range []float64{0.3, 7, 150, 3000} {
			wi := w[i].Lo()
			d += wi * refExpD(k, c[0])
			b += complex(wi, 0) * cmplx.Conj(refExpMpm(k, c[0]))
		}
		tol := 1e-9
		if math.Abs(d-(m.D.Lo()+m.D.Hi())/2) > tol+m.D.Rad() {
			t.Errorf("s = %g: D %v, reference %g", c[0], m.D, d)
		}
		bb := complex((m.B.Re.Lo()+m.B.Re.Hi())/2-(q.B.Re.Lo()+q.B.Re.Hi())/2, (m.B.Im.Lo()+m.B.Im.Hi())/2-(q.B.Im.Lo()+q.B.Im.Hi())/2)
		if cmplx.Abs(bb-b) > tol+m.B.Re.Rad()+m.B.Im.Rad()+q.B.Re.Rad()+q.B.Im.Rad() {
			t.Errorf("s = %g: B - B_quadrant %v, reference %v", c[0], bb, b)
		}
	}
	// The float model of the search on the shared layout agrees with each
	// term's own float quadrature.
	g := NewGroup(termsA)
	d := make([]float64, 4)
	b := make([]complex128, 4)
	for _, s := range []float64{-5, 0.2, 30} {
		g.Approx(s, d, b)
		for i, tm := range termsB {
			di, bi := tm.Approx(s)
			if math.Abs(di-d[i]) > 1e-12*(1+math.Abs(di)) || cmplx.Abs(bi-b[i]) > 1e-9*(1+cmplx.Abs(bi)) {
				t.Errorf("s = %g, term %d: group approx (%g, %v), own (%g, %v)", s, i, d[i], b[i], di, bi)
			}
		}
	}
}
