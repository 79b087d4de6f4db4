package softwall

import (
	"math"
	"testing"
)

// grid is the discretisation of the fast tests.
func grid(U float64) Grid { return Grid{U: U, Nodes: 8, Waves: 1, MaxPanel: 0.5} }

// With a huge wall the negative momenta decouple and the truncation is the
// strip problem on [0, U] with alpha = 4 U^2: A(50) = 0.0294572 at
// U = sqrt(50)/2 (double-precision Nystrom value of package certify/strip,
// seen here, not a published source).
func TestWallIsStrip(t *testing.T) {
	v, _, err := Float(grid(math.Sqrt(50)/2), 0, math.Inf(1))
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(v-0.0294572) > 2e-6 {
		t.Fatalf("wall limit %.8f, want the strip value 0.0294572", v)
	}
}

// Without wall and without profile the relaxation is the bare quadrant,
// whose bound is 0.155940 (R. F. Werner, J. Phys. A 21 (1988) 4565): the
// end symbol gives it exactly, the truncations approach it from below.
func TestBareQuadrant(t *testing.T) {
	if e := EssEdge(0, 0, 40, 0.01); math.Abs(e-0.1559398) > 1e-6 {
		t.Fatalf("end edge %.8f, want 0.1559398", e)
	}
	a, _, err := Float(grid(3), 0, 0)
	if err != nil {
		t.Fatal(err)
	}
	b, _, err := Float(grid(5), 0, 0)
	if err != nil {
		t.Fatal(err)
	}
	if !(a < b && b < 0.155940) {
		t.Fatalf("truncations %.6f (U=3), %.6f (U=5): want increasing and below 0.155940", a, b)
	}
}

// t (1 - P) is positive semi-definite, so the top of -Op(g) falls as t
// grows (common practice: monotonicity of eigenvalues), and stays above the
// decoupled value.
func TestWallMonotone(t *testing.T) {
	prev := math.Inf(1)
	for _, tt := range []float64{0, 0.3, 3, 30, math.Inf(1)} {
		v, _, err := Float(grid(5), 0, tt)
		if err != nil {
			t.Fatal(err)
		}
		if v > prev+1e-12 {
			t.Fatalf("t=%g: %.8f above the value %.8f of a smaller wall", tt, v, prev)
		}
		prev = v
	}
	if e1, e10 := EssEdge(0, 1, 40, 0.01), EssEdge(0, 10, 40, 0.01); !(e10 < e1 && e1 < 0.155940) {
		t.Fatalf("end edges %.6f (t=1), %.6f (t=10): want decreasing", e1, e10)
	}
}

// Extrapolate is exact on a + b/U + c/U^2 (common practice).
func TestExtrapolate(t *testing.T) {
	f := func(u float64) float64 { return 0.5 - 2/u + 3/(u*u) }
	u := [3]float64{7, 10, 14}
	if got := Extrapolate(u, [3]float64{f(7), f(10), f(14)}); math.Abs(got-0.5) > 1e-12 {
		t.Fatalf("extrapolated %v, want 0.5", got)
	}
}

// Temple's inequality with the full eigenvector as trial returns the top
// eigenvalue (zero variance).
func TestTempleExactTrial(t *testing.T) {
	g := grid(4)
	m, err := Matrix(g, 0, math.Inf(1))
	if err != nil {
		t.Fatal(err)
	}
	panels := m.SymmetricDim() / g.Nodes // one channel: t = +Inf
	r, err := Temple(g, 0, math.Inf(1), panels)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(r.Bound-r.Top) > 1e-10 || r.Eps2 > 1e-12 {
		t.Fatalf("exact trial: %+v", r)
	}
}
