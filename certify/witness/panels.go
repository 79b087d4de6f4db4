package witness

import (
	"math"
	"math/cmplx"
	"sort"
)

// panel is a piece [Lo, Hi] of the time interval [-1, 1] (float64 ends,
// exact) with the Bernstein-ellipse parameter Rho chosen for it.
type panel struct {
	Lo, Hi float64
	Rho    float64
}

// singularities returns the branch points of the time integrand: for a
// term with c = b + i omega the right factor is singular at
// t = -omega + i b and the left one at t = -omega - i b.
func singularities(ts []term) []complex128 {
	seen := map[complex128]bool{}
	var out []complex128
	for _, t := range ts {
		b, _ := t.b.Float64()
		z := complex(-float64(t.omega), b)
		if !seen[z] {
			seen[z] = true
			out = append(out, z, cmplx.Conj(z))
		}
	}
	return out
}

// rhoThrough returns the parameter of the Bernstein ellipse of [lo, hi]
// that passes through z.
func rhoThrough(lo, hi float64, z complex128) float64 {
	mu, l := (lo+hi)/2, (hi-lo)/2
	zeta := (z - complex(mu, 0)) / complex(l, 0)
	w := zeta + cmplx.Sqrt(zeta-1)*cmplx.Sqrt(zeta+1)
	r := cmplx.Abs(w)
	if r < 1 {
		r = 1 / r
	}
	return r
}

// makePanels grades [-1, 1] geometrically (ratio 2) towards the three
// accumulation points -1, 0, 1 of the branch points, down to a quarter of
// the smallest width, and picks for each panel rho = 1 + 0.6 (rho_max - 1)
// (at most 12), where rho_max is the ellipse through the nearest branch point.
func makePanels(ts []term, bmin float64) []panel {
	pts := map[float64]bool{-1: true, 0: true, 1: true}
	for _, p := range []float64{-1, 0, 1} {
		for h := bmin / 4; h < 0.5; h *= 2 {
			for _, q := range []float64{p - h, p + h} {
				if q > -1 && q < 1 {
					pts[q] = true
				}
			}
		}
	}
	var ps []float64
	for p := range pts {
		ps = append(ps, p)
	}
	sort.Float64s(ps)
	sing := singularities(ts)
	var out []panel
	for i := 0; i+1 < len(ps); i++ {
		lo, hi := ps[i], ps[i+1]
		rmax := math.Inf(1)
		for _, z := range sing {
			rmax = math.Min(rmax, rhoThrough(lo, hi, z))
		}
		rho := math.Min(1+0.6*(rmax-1), 12)
		out = append(out, panel{lo, hi, rho})
	}
	return out
}
