package spectrum

import (
	"fmt"
	"math"
	"math/big"
	"math/cmplx"
	"sort"
	"sync"

	"wedgebound/certify"
	"wedgebound/interval"
	"wedgebound/regions"
)

// The Newton route for relaxations whose terms all have jets (regions.Jetter:
// the exponential family). The lemma is the one of the quadrant edges
// (regions package doc, "Edges to many digits"), applied per window:
//
//  1. Candidates. A float64 scan of g = sgn lambda (sgn = +1 for inf spec,
//     -1 for sup spec) on [-24, 24], step 1/16, and a golden-section search
//     around every local minimum of the scan; every candidate whose value
//     is within termWindowGap of the best gets a window (a relaxation may
//     have several local minima of nearly equal depth).
//  2. Per window W: g'' >= m > 0 on W (float64 interval cells of the jet);
//     Newton's method at precision P from a float64 start; then
//     inf_W g lies in [g(c) - g'(c)^2/(2m), g(c)], and an interval Newton
//     step proves the unique critical point in W.
//  3. Elsewhere: float64 interval cells (mean-value form) cover [-S, S]
//     outside the windows and the tail lemmas cover |s| >= S; each must lie
//     above the lower end L of the best window, so the edge is in
//     [min_W (g(c_W) - g'(c_W)^2/(2 m_W)), min_W g(c_W)].

// TermSpec is one relaxation term by its exact parameters (decimal
// strings), so that the relaxation can be built at any precision.
type TermSpec struct {
	Kind   string
	Params map[string]string
	Weight string
}

// BuildRelaxation builds the relaxation of specs at the precision of like.
func BuildRelaxation[T interval.Real[T]](like T, specs []TermSpec) (regions.Relaxation[T], error) {
	var rel regions.Relaxation[T]
	for i, s := range specs {
		t, err := regions.NewTerm(like, s.Kind, s.Params)
		if err != nil {
			return rel, fmt.Errorf("term %d: %v", i, err)
		}
		if _, err := regions.ParseRat(s.Weight); err != nil {
			return rel, fmt.Errorf("term %d weight: %v", i, err)
		}
		w, err := like.Decimal(s.Weight)
		if err != nil {
			return rel, fmt.Errorf("term %d weight: %v", i, err)
		}
		rel.Terms = append(rel.Terms, t)
		rel.Weights = append(rel.Weights, w)
	}
	return rel, nil
}

// TermEdge is a proved enclosure of one edge of a relaxation (Newton route).
type TermEdge struct {
	// Value encloses inf lambda_min (edge Lower) or sup lambda_max (Upper)
	// over all real s.
	Value interval.B
	// At encloses the critical point of the window with the most extreme
	// value (the edge is attained there, or within the width of Value at
	// another window).
	At interval.B
	// Windows is the number of Newton windows, Cells the number of float64
	// cells of the cover outside them.
	Windows, Cells int
	// Prec is the working precision in bits.
	Prec uint
}

const (
	// termWindowGap: candidates within this of the best float value get
	// their own Newton window.
	termWindowGap = 1e-4
	// termMaxWindows bounds the windows per edge.
	termMaxWindows = 6
	// termConvexCells bounds the cell enclosures of one convexity proof
	// (per window radius tried).
	termConvexCells = 128
	// termCoverCells bounds the cells of the cover outside the windows.
	termCoverCells = 20000
)

// TermEdges proves both edges of the relaxation given by specs (every term
// must have jets: regions.Relaxation.HasJets) with width below about
// 10^-(digits+2), by the Newton route above. The two edges run
// concurrently; progress may be nil.
func TermEdges(specs []TermSpec, digits int, progress Progress) ([2]TermEdge, error) {
	var out [2]TermEdge
	if digits < 1 || digits > MaxTermDigits {
		return out, fmt.Errorf("with terms at most %d digits are supported, not %d", MaxTermDigits, digits)
	}
	if progress == nil {
		progress = func(string, int, int) {}
	}
	relF, err := BuildRelaxation(interval.F{}, specs)
	if err != nil {
		return out, err
	}
	if !relF.HasJets() {
		return out, fmt.Errorf("the Newton route needs exp terms only")
	}
	P := regions.QuadrantEdgePrec(digits)
	relB, err := BuildRelaxation(interval.NewB(0, P), specs)
	if err != nil {
		return out, err
	}
	// S: the push-out of the tail lemmas (as in Enclose).
	S := tailStart(interval.F{}, relF)
	var errs [2]error
	var wg sync.WaitGroup
	for i, e := range []regions.Edge{regions.Lower, regions.Upper} {
		wg.Add(1)
		go func() {
			defer wg.Done()
			out[i], errs[i] = solveTermEdge(relF, relB, e, S, P, progress)
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return out, err
		}
	}
	return out, nil
}

// tailStart doubles S from 8 (up to 2^14) until the tail lemmas give
// |B| below 0.002 for s < 0 and both tail eigenvalue enclosures narrower
// than 0.004.
func tailStart[T interval.Real[T]](like T, rel regions.Relaxation[T]) int64 {
	small := func(S int64) bool {
		for _, side := range []int{-1, 1} {
			m := rel.Tail(like.Int(S), side)
			if m.B.Re.Hi() > 0.002 && side < 0 {
				return false
			}
			for _, e := range []regions.Edge{regions.Lower, regions.Upper} {
				if v := m.Eig(e); !v.IsFinite() || v.Hi()-v.Lo() > 0.004 {
					return false
				}
			}
		}
		return true
	}
	S := int64(8)
	for S < 1<<14 && !small(S) {
		S *= 2
	}
	return S
}

// approxEig returns a float64 value of lambda (not certified; for the
// candidate search) from the terms' Approx and the quadrant's closed form.
func approxEig(rel regions.Relaxation[interval.F], s float64, e regions.Edge) float64 {
	q := regions.Quadrant(interval.PointF(s))
	a := q.A.Mid().Lo()
	b := complex(q.B.Re.Mid().Lo(), q.B.Im.Mid().Lo())
	d := 0.0
	for i, t := range rel.Terms {
		w := rel.Weights[i].Mid().Lo()
		td, tb := t.Approx(s)
		d += w * td
		b += complex(w, 0) * tb
	}
	r := math.Hypot((a-d)/2, cmplx.Abs(b))
	if e == regions.Upper {
		return (a+d)/2 + r
	}
	return (a+d)/2 - r
}

// window is one Newton window's result, in g = sgn lambda.
type window struct {
	lo, hi float64
	g      interval.B // g(c)
	corr   interval.B // g'(c)^2/(2m)
	at     interval.B
}

func solveTermEdge(relF regions.Relaxation[interval.F], relB regions.Relaxation[interval.B], e regions.Edge, S int64, P uint, progress Progress) (TermEdge, error) {
	sgn := 1.0
	if e == regions.Upper {
		sgn = -1
	}
	name := map[regions.Edge]string{regions.Lower: "inf spec", regions.Upper: "sup spec"}[e]
	gF := func(s float64) float64 { return sgn * approxEig(relF, s, e) }

	// 1. Candidates.
	const n0 = 384
	vals := make([]float64, 2*n0+1)
	for i := range vals {
		vals[i] = gF(float64(i-n0) / 16)
		if i%64 == 0 {
			progress(name+": scan", i, len(vals))
		}
	}
	progress(name+": scan", len(vals), len(vals))
	type cand struct{ s, v float64 }
	var cands []cand
	for i := 1; i+1 < len(vals); i++ {
		if vals[i] <= vals[i-1] && vals[i] <= vals[i+1] && !math.IsNaN(vals[i]) {
			a, b := float64(i-n0-1)/16, float64(i-n0+1)/16
			s := goldenFloat(gF, a, b)
			cands = append(cands, cand{s, gF(s)})
		}
	}
	if len(cands) == 0 {
		return TermEdge{}, fmt.Errorf("%s: the scan on [-24, 24] found no local extremum", name)
	}
	sort.Slice(cands, func(i, j int) bool { return cands[i].v < cands[j].v })
	keep := cands[:1]
	for _, c := range cands[1:] {
		if c.v <= cands[0].v+termWindowGap {
			keep = append(keep, c)
		}
	}
	if len(keep) > termMaxWindows {
		return TermEdge{}, fmt.Errorf("%s: %d local extrema lie within %.0e of each other (more than %d Newton windows)", name, len(keep), termWindowGap, termMaxWindows)
	}

	// 2. Newton windows.
	var wins []window
	for k, c := range keep {
		stage := fmt.Sprintf("%s: window %d/%d", name, k+1, len(keep))
		w, err := newtonWindow(relF, relB, e, sgn, c.s, P, func(step string, done, total int) { progress(stage+" "+step, done, total) })
		if err != nil {
			return TermEdge{}, fmt.Errorf("%s: near s = %.6g: %v", name, c.s, err)
		}
		wins = append(wins, w)
	}
	L := wins[0].g.Sub(wins[0].corr)
	U := wins[0].g
	bestAt := wins[0].at
	for _, w := range wins[1:] {
		L = L.Min(w.g.Sub(w.corr))
		if interval.Upper(w.g).Less(interval.Upper(U)) {
			bestAt = w.at
		}
		U = U.Min(w.g)
	}
	// Every other part of the line must lie above lower = L.
	Lhi := L.Hi() // float64, >= L

	// 3a. Tails |s| >= S (S doubled while they do not separate).
	sep := func(v interval.F) bool {
		if !v.IsFinite() {
			return false
		}
		if sgn > 0 {
			return v.Lo() > Lhi
		}
		return -v.Hi() > Lhi
	}
	for {
		ok := true
		for _, side := range []int{-1, 1} {
			if !sep(relF.Tail(interval.F{}.Int(S), side).Eig(e)) {
				ok = false
			}
		}
		if ok {
			break
		}
		if S >= 1<<16 {
			return TermEdge{}, fmt.Errorf("%s: the tail lemmas do not separate the edge for |s| >= %d", name, S)
		}
		S *= 2
	}

	// 3b. Cover of [-S, S] outside the windows.
	type seg struct{ lo, hi float64 }
	sort.Slice(wins, func(i, j int) bool { return wins[i].lo < wins[j].lo })
	var segs []seg
	x := float64(-S)
	for _, w := range wins {
		if w.lo > x {
			segs = append(segs, seg{x, w.lo})
		}
		x = math.Max(x, w.hi)
	}
	if x < float64(S) {
		segs = append(segs, seg{x, float64(S)})
	}
	like := interval.F{}
	f := func(s interval.F) interval.F { return relF.Eig(s, e) }
	cells := 0
	minW := big.NewRat(1, 1<<30)
	grids := make([][]*big.Rat, len(segs))
	pieces := 0
	for i, sg := range segs {
		grids[i] = coverGrid(sg.lo, sg.hi)
		pieces += len(grids[i]) - 1
	}
	before := 0
	for _, grid := range grids {
		if termCoverCells-cells <= 0 {
			return TermEdge{}, fmt.Errorf("%s: the cover outside the Newton windows needs more than %d cells", name, termCoverCells)
		}
		got, err := certify.Cover(like, f, grid, sep, certify.CoverOptions{
			MinWidth: minW, MaxCells: termCoverCells - cells,
			Status: func(st certify.CoverStatus) { progress(name+": cover", before+st.PiecesDone, pieces) },
		})
		if err != nil {
			return TermEdge{}, fmt.Errorf("%s: cover outside the Newton windows: %v", name, err)
		}
		for _, c := range got {
			if !sep(c.Value) {
				lo, _ := c.Lo.Float64()
				return TermEdge{}, fmt.Errorf("%s: on s in [%.9g, %.9g] the eigenvalue was not separated from the edge (another local extremum within the target, missed by the scan?)", name, lo, lo+1e-9)
			}
		}
		cells += len(got)
		before += len(grid) - 1
		progress(name+": cover", before, pieces)
	}

	var val interval.B
	if sgn > 0 {
		val = interval.Lower(L).Hull(interval.Upper(U))
	} else {
		val = interval.Lower(U).Neg().Hull(interval.Upper(L).Neg())
	}
	return TermEdge{Value: val, At: bestAt, Windows: len(wins), Cells: cells, Prec: P}, nil
}

// coverGrid returns breakpoints lo, then the points strictly between of
// the grid of integers on [-16, 16] and +-2^j beyond, then hi (lo and hi
// dyadic, so terminating decimals).
func coverGrid(lo, hi float64) []*big.Rat {
	var pts []float64
	for k := -16.0; k <= 16; k++ {
		pts = append(pts, k)
	}
	for p := 32.0; p <= 1<<20; p *= 2 {
		pts = append(pts, p, -p)
	}
	sort.Float64s(pts)
	g := []*big.Rat{new(big.Rat).SetFloat64(lo)}
	for _, k := range pts {
		if k > lo && k < hi {
			g = append(g, new(big.Rat).SetFloat64(k))
		}
	}
	return append(g, new(big.Rat).SetFloat64(hi))
}

// goldenFloat locates a local minimiser of f on [a, b] to about 1e-9.
func goldenFloat(f func(float64) float64, a, b float64) float64 {
	r := (math.Sqrt(5) - 1) / 2
	x1, x2 := b-r*(b-a), a+r*(b-a)
	f1, f2 := f(x1), f(x2)
	for b-a > 1e-9 {
		if f1 <= f2 {
			b, x2, f2 = x2, x1, f1
			x1 = b - r*(b-a)
			f1 = f(x1)
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = a + r*(b-a)
			f2 = f(x2)
		}
	}
	return (a + b) / 2
}

// newtonWindow proves the minimum of g = sgn lambda over a window around
// the float candidate s0.
func newtonWindow(relF regions.Relaxation[interval.F], relB regions.Relaxation[interval.B], e regions.Edge, sgn float64, s0 float64, P uint, progress func(step string, done, total int)) (window, error) {
	gj := func(j regions.EigJet[interval.F]) regions.EigJet[interval.F] {
		if sgn < 0 {
			return regions.EigJet[interval.F]{L: j.L.Neg(), L1: j.L1.Neg(), L2: j.L2.Neg()}
		}
		return j
	}
	sc := math.Round(s0*1024) / 1024
	var jetF regions.RelaxationJet[interval.F]
	var m float64
	var h2 interval.F
	var lo, hi float64
	ok := false
	var lastErr error
	for _, r := range []float64{1.0 / 16, 1.0 / 64, 1.0 / 256} {
		lo, hi = sc-r, sc+r
		j, err := relF.JetOn(lo, hi, 2)
		if err != nil {
			lastErr = err
			continue
		}
		jetF = j
		if m, h2, ok = convexF(jetF, e, sgn, lo, hi, func(done int) { progress("convexity", done, termConvexCells) }); ok {
			break
		}
	}
	if !ok {
		if lastErr != nil {
			return window{}, lastErr
		}
		return window{}, fmt.Errorf("could not prove convexity of the eigenvalue on [%g, %g] within %d cells per window (the float64 jet enclosures are too wide, as with large weights)", sc-1.0/256, sc+1.0/256, termConvexCells)
	}
	progress("Newton", 1, 4)
	// Float Newton from s0 (a proposal only).
	c := s0
	for range 30 {
		j := gj(jetF.Eig(interval.PointF(c), e, 2))
		d1, d2 := j.L1.Mid().Lo(), j.L2.Mid().Lo()
		if !(d2 > 0) {
			break
		}
		step := d1 / d2
		nc := c - step
		if nc <= lo || nc >= hi || math.IsNaN(nc) {
			break
		}
		c = nc
		if math.Abs(step) < 1e-16*(1+math.Abs(c)) {
			break
		}
	}
	progress("Newton", 2, 4)
	jetB, err := relB.JetOn(lo, hi, 1)
	if err != nil {
		return window{}, err
	}
	like := interval.NewB(0, P)
	sB := like.Float(c)
	mB := like.Float(m)
	g1 := func(s interval.B) interval.B {
		d := jetB.Eig(s, e, 1).L1
		if sgn < 0 {
			return d.Neg()
		}
		return d
	}
	// Newton at precision P with g'' from float64 (about 13 digits gained
	// per step); stop once g'(c)^2/(2m) < 2^-(P+8).
	maxSteps := 4 + int(P)/40
	var d, corr interval.B
	for step := 0; ; step++ {
		d = g1(sB)
		corr = d.Sqr().Quo(mB.Scale(1))
		if !corr.IsFinite() {
			return window{}, fmt.Errorf("the derivative at the critical point is not finite")
		}
		if tinyB(corr, int(P)+8) {
			break
		}
		if step >= maxSteps {
			return window{}, fmt.Errorf("the Newton iteration did not settle within %d steps at %d bits", maxSteps, P)
		}
		cf := sB.Mid().Lo()
		j := gj(jetF.Eig(interval.PointF(cf), e, 2))
		d2 := like.Float(j.L2.Mid().Lo())
		sB = sB.Sub(d.Quo(d2)).Mid()
		if sB.Lo() <= lo || sB.Hi() >= hi {
			return window{}, fmt.Errorf("the Newton iteration left the window [%g, %g]", lo, hi)
		}
	}
	progress("Newton", 3, 4)
	v := jetB.Eig(sB, e, 0).L
	if sgn < 0 {
		v = v.Neg()
	}
	if !v.IsFinite() {
		return window{}, fmt.Errorf("the eigenvalue at the critical point is not finite")
	}
	// Interval Newton step: X = c +- rho, rho = 2|g'(c)|/m + 2^-P.
	rho := interval.Upper(d.Abs().Quo(mB).Scale(1).Add(like.Int(1).Scale(-int(P))))
	X := sB.Sub(rho).Hull(sB.Add(rho))
	if X.Lo() <= lo || X.Hi() >= hi {
		return window{}, fmt.Errorf("the interval Newton step leaves the window")
	}
	h2B := like.Float(h2.Lo()).Hull(like.Float(h2.Hi()))
	N := sB.Sub(d.Quo(h2B))
	if !N.IsFinite() || !X.Contains(N) {
		return window{}, fmt.Errorf("the interval Newton step does not contract")
	}
	progress("Newton", 4, 4)
	return window{lo: lo, hi: hi, g: v, corr: interval.Upper(corr), at: N}, nil
}

// convexF proves sgn lambda” >= m > 0 on [lo, hi] by float64 interval
// cells of the jet (bisected as needed, at most termConvexCells
// enclosures, each reported to progress) and returns m and the hull of sgn lambda” over the window.
func convexF(j regions.RelaxationJet[interval.F], e regions.Edge, sgn float64, lo, hi float64, progress func(done int)) (float64, interval.F, bool) {
	type cell struct{ lo, hi float64 }
	const n0 = 16
	var stack []cell
	w := (hi - lo) / n0
	for i := n0 - 1; i >= 0; i-- {
		a := lo + float64(i)*w
		b := a + w
		if i == n0-1 {
			b = hi
		}
		stack = append(stack, cell{a, b})
	}
	m := math.Inf(1)
	var hull interval.F
	first := true
	for work := 0; len(stack) > 0; work++ {
		if work >= termConvexCells {
			return 0, hull, false
		}
		c := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		x := interval.PointF(c.lo).Hull(interval.PointF(c.hi))
		g2 := j.Eig(x, e, 2).L2
		progress(work + 1)
		if sgn < 0 {
			g2 = g2.Neg()
		}
		if !g2.IsFinite() || g2.Lo() <= 0 {
			mid := c.lo + (c.hi-c.lo)/2
			if mid <= c.lo || mid >= c.hi || c.hi-c.lo < 1e-7 {
				return 0, hull, false
			}
			stack = append(stack, cell{mid, c.hi}, cell{c.lo, mid})
			continue
		}
		m = math.Min(m, g2.Lo())
		if first {
			hull, first = g2, false
		} else {
			hull = hull.Hull(g2)
		}
	}
	return m, hull, true
}

// tinyB reports whether x is finite and |x| < 2^-k.
func tinyB(x interval.B, k int) bool {
	lo, hi := x.Endpoints()
	if lo == nil {
		return false
	}
	for _, v := range []*big.Float{lo, hi} {
		if v.Sign() != 0 && v.MantExp(nil) > -k {
			return false
		}
	}
	return true
}
