package softwall

import (
	"fmt"
	"math"
	"os"
	"strings"
	"testing"
)

// TestExploration prints the float tables quoted in the section "Beyond
// squeeze invariance" of package regions (a few minutes on one core; run
// with WEDGEBOUND_SLOW=1 go test -run Exploration -v ./regions/internal/softwall).
func TestExploration(t *testing.T) {
	if os.Getenv("WEDGEBOUND_SLOW") != "1" {
		t.Skip("set WEDGEBOUND_SLOW=1")
	}
	us := [3]float64{10, 14.142136, 20}
	ts := []float64{0.3, 1, 3, 10, 30, 100, math.Inf(1)}
	var b strings.Builder
	fmt.Fprintf(&b, "\nsoft wall, w = 0: top of spectrum of the truncation to |u| < U\n%8s %10s %10s %10s %10s %10s\n", "t", "U=10", "U=14.14", "U=20", "extrap.", "end edge")
	for _, tt := range ts {
		var f [3]float64
		for i, U := range us {
			v, _, err := Float(grid(U), 0, tt)
			if err != nil {
				t.Fatal(err)
			}
			f[i] = v
		}
		fmt.Fprintf(&b, "%8g %10.7f %10.7f %10.7f %10.7f %10.7f\n", tt, f[0], f[1], f[2], Extrapolate(us, f), EssEdge(0, tt, 40, 0.01))
	}
	fmt.Fprintf(&b, "\nprofile weight w on quadrant III, U = 14.14: truncation / end edge\n")
	for _, tt := range []float64{0, 10} {
		for _, w := range []float64{-0.5, -0.2, 0, 0.2} {
			v, _, err := Float(grid(14.142136), w, tt)
			if err != nil {
				t.Fatal(err)
			}
			fmt.Fprintf(&b, "t=%g w=%4g: %.7f / %.7f\n", tt, w, v, EssEdge(w, tt, 40, 0.01))
		}
	}
	fmt.Fprintf(&b, "\nsecond eigenvalue of the truncation\n")
	for _, U := range us {
		for _, tt := range []float64{10, math.Inf(1)} {
			m, err := Matrix(grid(U), 0, tt)
			if err != nil {
				t.Fatal(err)
			}
			top, err := Top(m, 3)
			if err != nil {
				t.Fatal(err)
			}
			fmt.Fprintf(&b, "U=%g t=%g: %.7f %.7f %.7f\n", U, tt, top[0], top[1], top[2])
		}
	}
	fmt.Fprintf(&b, "\nTemple's inequality on the U = 20 grid (t = +Inf), trial from the first p panels\n")
	for _, p := range []int{40, 50, 60, 65} {
		r, err := Temple(grid(20), 0, math.Inf(1), p)
		if err != nil {
			t.Fatal(err)
		}
		fmt.Fprintf(&b, "p=%d (order %d of %d): Q=%.7f eps2=%.3g top=%.7f second=%.7f Temple=%.7f deficit=%.2g loss=%.2g\n",
			p, r.Small, r.Large, r.Q, r.Eps2, r.Top, r.Second, r.Bound, r.Top-r.Q, r.Bound-r.Top)
	}
	fmt.Fprintf(&b, "\nhalf-line kernel compressed to momenta in (r, r + 10): top eigenvalue\n")
	for _, r := range []float64{0, 0.5, 1, 1.5, 2, 3, 5} {
		v, err := Window(Grid{U: r + 10, Nodes: 8, Waves: 1, MaxPanel: 0.5}, r)
		if err != nil {
			t.Fatal(err)
		}
		fmt.Fprintf(&b, "r=%g: %.3g\n", r, v)
	}
	fmt.Fprintf(&b, "\ncrude Schur complement at a momentum split R, U = 14.14\n")
	for _, R := range []float64{3, 5, 8} {
		r, err := Split(grid(14.142136), R)
		if err != nil {
			t.Fatal(err)
		}
		fmt.Fprintf(&b, "R=%g: top %.7f, high block %.2g, Schur lambda %.4f (orders %v)\n", R, r.Top, r.High, r.Schur, r.Orders)
	}
	t.Log(b.String())
}
