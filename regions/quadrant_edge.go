package regions

import (
	"fmt"
	"math"
	"math/big"

	"wedgebound/interval"
)

// Edges of the bare quadrant to many digits.
//
// Let g = sgn lambda with sgn = +1 for the smallest eigenvalue (edge Lower)
// and -1 for the largest (edge Upper); the edge is sgn inf_s g(s). The proof
// has three parts.
//
//  1. Local convexity. A float64 search gives s0 near the critical point; on
//     the window W = [s0 - r, s0 + r] the interval enclosure of g'' over
//     sub-cells (float64 intervals) gives g'' >= m > 0.
//  2. The value. Newton's method on g' (g'' at half the precision suffices
//     for quadratic convergence) with the precision doubling each step gives
//     a point c in W with |g'(c)| about 2^(-P/2). Then for every s in W,
//     g(s) >= g(c) + g'(c)(s - c) + (m/2)(s - c)^2 >= g(c) - g'(c)^2/(2m),
//     while inf g <= g(c). So inf over W lies in [g(c) - g'(c)^2/(2m), g(c)],
//     an interval of width about 2^-P, and g(c) is enclosed at precision P.
//     The critical point itself is proved by one interval Newton step:
//     N = c - g'(c)/g''(X) on X = [c - rho, c + rho] inside W; N inside X
//     gives a unique zero of g' in X, lying in N.
//  3. No other point comes close. Float64 interval cells (mean-value form
//     of QuadrantEig) cover [-S, S] outside W and show g > g(c) there; the
//     tail lemma (QuadrantTail) does the same for |s| >= S.

// QuadrantEdge is a proved enclosure of one edge of the quadrant spectrum.
type QuadrantEdge struct {
	// Value encloses inf lambda_min (edge Lower) or sup lambda_max (edge
	// Upper) over all real s.
	Value interval.B
	// At encloses the unique critical point of the eigenvalue in Window;
	// the edge is attained there.
	At interval.B
	// Window is the interval on which the eigenvalue was proved convex
	// (Lower) or concave (Upper).
	Window interval.F
	// Cells is the number of float64 cells of the global cover.
	Cells int
	// Prec is the working precision in bits.
	Prec uint
}

// quadrantEdgeMaxCells bounds the cells of the global cover and of the
// convexity check.
const quadrantEdgeMaxCells = 20000

// QuadrantEdgePrec returns the working precision used for digits decimal
// digits.
func QuadrantEdgePrec(digits int) uint {
	return uint(math.Ceil(float64(digits+4)*math.Log2(10))) + 32
}

// SolveQuadrantEdge proves an enclosure of the given edge of width below
// about 10^-(digits+3) (digits >= 1). progress, if not nil, is called with
// a stage name and counters.
func SolveQuadrantEdge(e Edge, digits int, progress func(stage string, done, total int)) (QuadrantEdge, error) {
	if digits < 1 {
		return QuadrantEdge{}, fmt.Errorf("regions: digits %d < 1", digits)
	}
	if progress == nil {
		progress = func(string, int, int) {}
	}
	sgn := 1.0
	if e == Upper {
		sgn = -1
	}
	name := map[Edge]string{Lower: "inf spec", Upper: "sup spec"}[e]
	P := QuadrantEdgePrec(digits)

	// Float search: the best point of a grid on [-4, 4], then Newton on g'.
	// (Only a proposal: the window check, the interval Newton step and the
	// cover below prove everything.)
	gF := func(s float64) float64 {
		return sgn * QuadrantEigJet(interval.PointF(s), e, 0).L.Mid().Lo()
	}
	best, s0 := math.Inf(1), 0.0
	for k := -32; k <= 32; k++ {
		s := float64(k) / 8
		if v := gF(s); v < best {
			best, s0 = v, s
		}
	}
	for range 40 {
		jt := QuadrantEigJet(interval.PointF(s0), e, 2)
		d1, d2 := jt.L1.Mid().Lo(), jt.L2.Mid().Lo()
		if d2 == 0 || math.IsNaN(d1) || math.IsNaN(d2) {
			break
		}
		step := d1 / d2
		if math.Abs(step) > 1.0/64 {
			step = math.Copysign(1.0/64, step)
		}
		s0 -= step
		if math.Abs(step) < 1e-15 {
			break
		}
	}
	// Window centred on a dyadic near s0.
	sc := math.Round(s0*1024) / 1024
	var win interval.F
	var m float64
	var h2 interval.F // enclosure of g'' over the window
	ok := false
	for _, r := range []float64{1.0 / 16, 1.0 / 64, 1.0 / 256} {
		win = interval.PointF(sc - r).Hull(interval.PointF(sc + r))
		if m, h2, ok = convexOn(win, e, sgn); ok {
			break
		}
	}
	if !ok {
		return QuadrantEdge{}, fmt.Errorf("regions: could not prove convexity near the %s critical point s = %.6g", name, s0)
	}
	progress(name+": convexity", 1, 1)

	// Newton with doubling precision.
	steps := []uint{}
	for q := P/2 + 48; ; q = q/2 + 24 {
		steps = append([]uint{q}, steps...)
		if q <= 120 {
			break
		}
	}
	c := interval.NewB(s0, 53)
	for i, q := range steps {
		c = newtonStep(c, e, q)
		progress(name+": Newton", i+1, len(steps))
	}
	lo, hi := win.Lo(), win.Hi()
	if c.Lo() <= lo || c.Hi() >= hi {
		return QuadrantEdge{}, fmt.Errorf("regions: Newton left the convexity window of the %s", name)
	}
	qd := steps[len(steps)-1]
	// g'(c) at the last Newton precision; the value bound needs only its size.
	var d interval.B
	mB := interval.NewB(0, qd).Float(m) // exact: m is a float64
	var corr interval.B
	for extra := 0; ; extra++ {
		d = QuadrantEigJet(c.WithPrec(qd), e, 1).L1
		corr = d.Sqr().Quo(mB.Scale(1))
		// Stop once g'(c)^2/(2m) is below 2^-(P+8) (the values are of order 1).
		if tiny(corr, int(P)+8) || extra == 6 {
			break
		}
		c = newtonStep(c, e, qd)
	}
	if !corr.IsFinite() {
		return QuadrantEdge{}, fmt.Errorf("regions: the derivative at the %s critical point is not finite", name)
	}
	progress(name+": value", 0, 1)
	v := QuadrantEigJet(c.WithPrec(P), e, 0).L
	progress(name+": value", 1, 1)
	if !v.IsFinite() {
		return QuadrantEdge{}, fmt.Errorf("regions: the eigenvalue at the %s critical point is not finite", name)
	}
	// Interval Newton step for the critical point: rho = 2|g'(c)|/m + 2^-qd.
	gd := d
	if sgn < 0 {
		gd = d.Neg()
	}
	rho := gd.Abs().Quo(mB).Scale(1).Add(interval.NewB(1, qd).Scale(-int(qd)))
	rhoHi := interval.Upper(rho)
	X := c.WithPrec(qd).Sub(rhoHi).Hull(c.WithPrec(qd).Add(rhoHi))
	if !win.Contains(interval.F{}.Between(X.Endpoints())) {
		return QuadrantEdge{}, fmt.Errorf("regions: the Newton interval of the %s leaves the window", name)
	}
	h2B := interval.NewB(h2.Lo(), qd).Hull(interval.NewB(h2.Hi(), qd))
	N := c.WithPrec(qd).Sub(d.Quo(h2B))
	if !N.IsFinite() || !X.Contains(N) {
		return QuadrantEdge{}, fmt.Errorf("regions: the interval Newton step does not contract for the %s", name)
	}

	// The value: Lower: [v - corr, v]; Upper: [v, v + corr] (v's own
	// rounding kept).
	corrP := interval.Upper(corr.WithPrec(P))
	var val interval.B
	if e == Upper {
		val = v.Hull(interval.Upper(v).Add(corrP))
	} else {
		val = v.Hull(interval.Lower(v).Sub(corrP))
	}

	// Global cover outside the window, at float64.
	gcHi := v.Hi() // an upper bound of g(c) in float64
	if sgn < 0 {
		gcHi = -v.Lo()
	}
	cells, err := coverOutside(win, e, sgn, gcHi, func(done, total int) { progress(name+": cover", done, total) })
	if err != nil {
		return QuadrantEdge{}, fmt.Errorf("regions: %s: %v", name, err)
	}
	return QuadrantEdge{Value: val, At: N, Window: win, Cells: cells, Prec: P}, nil
}

// newtonStep returns the midpoint of c - g'(c)/g”(c), with g' evaluated at
// precision q and g” at about q/2 (enough for quadratic convergence), as a
// point of precision q.
func newtonStep(c interval.B, e Edge, q uint) interval.B {
	cq := c.WithPrec(q)
	d1 := QuadrantEigJet(cq, e, 1).L1
	q2 := max(q/2+32, 64)
	d2 := QuadrantEigJet(c.WithPrec(q2), e, 2).L2
	return cq.Sub(d1.Quo(d2.WithPrec(q))).Mid()
}

// convexOn proves sgn*lambda” >= m > 0 on the window by float64 interval
// cells (bisected as needed) and returns m and the hull of the enclosures
// of lambda” over the window.
func convexOn(win interval.F, e Edge, sgn float64) (m float64, hull interval.F, ok bool) {
	type cell struct{ lo, hi float64 }
	stack := []cell{}
	const n0 = 16
	w := (win.Hi() - win.Lo()) / n0
	for i := n0 - 1; i >= 0; i-- {
		lo := win.Lo() + float64(i)*w
		hi := lo + w
		if i == n0-1 {
			hi = win.Hi()
		}
		stack = append(stack, cell{lo, hi})
	}
	m = math.Inf(1)
	first := true
	for work := 0; len(stack) > 0; work++ {
		if work > quadrantEdgeMaxCells {
			return 0, hull, false
		}
		c := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		x := interval.PointF(c.lo).Hull(interval.PointF(c.hi))
		l2 := QuadrantEigJet(x, e, 2).L2
		g2 := l2
		if sgn < 0 {
			g2 = l2.Neg()
		}
		if !g2.IsFinite() || g2.Lo() <= 0 {
			mid := c.lo + (c.hi-c.lo)/2
			if mid <= c.lo || mid >= c.hi {
				return 0, hull, false
			}
			stack = append(stack, cell{mid, c.hi}, cell{c.lo, mid})
			continue
		}
		m = math.Min(m, g2.Lo())
		if first {
			hull, first = l2, false
		} else {
			hull = hull.Hull(l2)
		}
	}
	return m, hull, true
}

// coverOutside proves sgn*lambda(s) > gcHi for every s outside the window:
// float64 interval cells on [-S, S] minus the window, bisected as needed,
// and the tail lemma for |s| >= S. It returns the number of cells.
func coverOutside(win interval.F, e Edge, sgn, gcHi float64, progress func(done, total int)) (int, error) {
	const S = 8
	for _, side := range []int{-1, 1} {
		a, bm := QuadrantTail(interval.PointF(S), side)
		sym := Symbol[interval.F]{A: a, D: interval.PointF(0), B: interval.C[interval.F]{Re: interval.PointF(0).Hull(bm), Im: interval.PointF(0)}}
		if !above(sym.Eig(e), sgn, gcHi) {
			return 0, fmt.Errorf("the tail lemma at |s| >= %d does not separate the edge", S)
		}
	}
	type cell struct{ lo, hi float64 }
	var stack []cell
	const n0 = 16
	add := func(lo, hi float64) {
		w := (hi - lo) / n0
		for i := n0 - 1; i >= 0; i-- {
			a := lo + float64(i)*w
			b := a + w
			if i == n0-1 {
				b = hi
			}
			stack = append(stack, cell{a, b})
		}
	}
	add(win.Hi(), S)
	add(-S, win.Lo())
	total := len(stack)
	done := 0
	for len(stack) > 0 {
		if done > quadrantEdgeMaxCells {
			return done, fmt.Errorf("the cover needs more than %d cells", quadrantEdgeMaxCells)
		}
		c := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		x := interval.PointF(c.lo).Hull(interval.PointF(c.hi))
		if above(QuadrantEig(x, e), sgn, gcHi) {
			done++
			if done%256 == 0 {
				progress(done, total)
			}
			continue
		}
		mid := c.lo + (c.hi-c.lo)/2
		if mid <= c.lo || mid >= c.hi || c.hi-c.lo < 1e-9 {
			return done, fmt.Errorf("no separation on the cell [%.17g, %.17g]", c.lo, c.hi)
		}
		stack = append(stack, cell{mid, c.hi}, cell{c.lo, mid})
		total++
	}
	progress(done, total)
	return done, nil
}

// tiny reports whether x is finite and |x| < 2^-k.
func tiny(x interval.B, k int) bool {
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

// above reports whether sgn*v > gcHi for every point of the enclosure v.
func above(v interval.F, sgn, gcHi float64) bool {
	if !v.IsFinite() {
		return false
	}
	if sgn > 0 {
		return v.Lo() > gcHi
	}
	return -v.Hi() > gcHi
}
