package certify

import (
	"fmt"
	"math"
	"math/big"
	"slices"
	"sort"

	"wedgebound/interval"
)

// Extreme describes a search for inf_s f(s) (Max false) or sup_s f(s) (Max
// true) of a function of the real variable s, given as an enclosure on cells.
type Extreme[T interval.Real[T]] struct {
	// F encloses f over a cell.
	F CellFunc[T]
	// Point, if set, encloses f at point intervals (used to locate the
	// extremum; it may be cheaper than F). Defaults to F.
	Point CellFunc[T]
	// Fast, if set, is tried first on each cell; its enclosure is kept when it
	// already meets the acceptance test (for example a float64 evaluation
	// converted to T), otherwise F is evaluated.
	Fast CellFunc[T]
	// Lo and Hi bound the covered range [Lo, Hi] (terminating decimals).
	Lo, Hi *big.Rat
	// Scan lists extra candidate points (terminating decimals) for the
	// location search, for functions whose extremum hides between the
	// uniform scan points.
	Scan []*big.Rat
	// Outside encloses f(s) for every s outside [Lo, Hi] (from tail lemmas);
	// for a minimum only its lower end matters, for a maximum its upper end.
	Outside T
	// Cells is the number of equal initial cells of [Lo, Hi].
	Cells int
	// Eps is the target width: cells are accepted once their enclosure is
	// within Eps of the best point value.
	Eps T
	// Max selects the supremum.
	Max bool
	// Options for the cover (MinWidth bounds the work where the target
	// cannot be met; the enclosure is then wider but still proved).
	Options CoverOptions
}

// ExtremeResult is a proved enclosure of the extremum with the point where a
// near-extremal value was found.
type ExtremeResult[T interval.Real[T]] struct {
	Value T
	At    T
	Cells int
}

// Solve encloses the extremum. The inner side comes from a point value
// f(s*) at a located near-extremal s*; the outer side is the worst
// enclosure over a cover of [Lo, Hi] together with Outside.
//
// The located s* may be a local extremum only (f can have several of
// nearly equal depth). Cells whose enclosure lies beyond the inner value
// by more than Eps can then never meet the target; instead of bisecting
// them down to MinWidth, a cell is also accepted once its enclosure is
// narrower than Eps/4, and after the cover the inner value is taken from
// the midpoint of the most extreme cell when that is better than f(s*).
func (x Extreme[T]) Solve(like T) (ExtremeResult[T], error) {
	sign := 1.0
	if x.Max {
		sign = -1
	}
	point := x.Point
	if point == nil {
		point = x.F
	}
	// g is the value to minimise, from the midpoint of a point enclosure.
	g := func(s T) float64 {
		v := point(s)
		return sign * v.Mid().Lo()
	}
	pt := func(v *big.Rat) T { return cellInterval(like, v, v) }
	// Coarse scan on a grid (merged with the caller's Scan points), then
	// golden-section refinement between the best point's neighbours.
	n := x.Cells * 2
	if n < 64 {
		n = 64
	}
	width := new(big.Rat).Sub(x.Hi, x.Lo)
	step := new(big.Rat).Quo(width, big.NewRat(int64(n), 1))
	pts := make([]*big.Rat, 0, n+1+len(x.Scan))
	for i := 0; i <= n; i++ {
		pts = append(pts, new(big.Rat).Add(x.Lo, new(big.Rat).Mul(step, big.NewRat(int64(i), 1))))
	}
	for _, v := range x.Scan {
		if v.Cmp(x.Lo) > 0 && v.Cmp(x.Hi) < 0 {
			pts = append(pts, v)
		}
	}
	sort.Slice(pts, func(i, j int) bool { return pts[i].Cmp(pts[j]) < 0 })
	pts = slices.CompactFunc(pts, func(a, b *big.Rat) bool { return a.Cmp(b) == 0 })
	best, bestI := math.Inf(1), 0
	for i, s := range pts {
		if v := g(pt(s)); v < best {
			best, bestI = v, i
		}
	}
	a, b := pts[max(bestI-1, 0)], pts[min(bestI+1, len(pts)-1)]
	sStar := goldenMin(func(s *big.Rat) T { return point(pt(s)) }, a, b, sign, like.Prec())
	inner := point(pt(sStar))
	if !inner.IsFinite() {
		return ExtremeResult[T]{}, fmt.Errorf("certify: the point value at the extremum is not finite")
	}
	grid := uniformGrid(x.Lo, x.Hi, x.Cells)
	// narrow: an enclosure tight enough to stand for the values on its
	// cell (a policy test in float64; the proof is the enclosure itself).
	quarter := x.Eps.Lo() / 4
	narrow := func(v T) bool { return v.IsFinite() && v.Hi()-v.Lo() <= quarter }
	var accept func(T) bool
	if x.Max {
		target := inner.Add(x.Eps)
		accept = func(v T) bool { return v.IsFinite() && !target.Less(interval.Upper(v)) || narrow(v) }
	} else {
		target := inner.Sub(x.Eps)
		accept = func(v T) bool { return v.IsFinite() && !interval.Lower(v).Less(target) || narrow(v) }
	}
	f := x.F
	if x.Fast != nil {
		f = func(s T) T {
			if v := x.Fast(s); accept(v) {
				return v
			}
			return x.F(s)
		}
	}
	cells, err := Cover(like, f, grid, accept, x.Options)
	if err != nil {
		return ExtremeResult[T]{}, err
	}
	outer := x.Outside
	var most ProvedCell[T] // the cell with the most extreme enclosure
	for i, c := range cells {
		if !c.Value.IsFinite() {
			return ExtremeResult[T]{}, fmt.Errorf("certify: enclosure not finite on cell [%s, %s]", c.Lo.FloatString(6), c.Hi.FloatString(6))
		}
		if x.Max {
			outer = outer.Max(c.Value)
			if i == 0 || most.Value.Hi() < c.Value.Hi() {
				most = c
			}
		} else {
			outer = outer.Min(c.Value)
			if i == 0 || c.Value.Lo() < most.Value.Lo() {
				most = c
			}
		}
	}
	// A better inner value from the most extreme cell (s* was a local
	// extremum only, or not located closely enough).
	if len(cells) > 0 {
		mid := new(big.Rat).Add(most.Lo, most.Hi)
		mid.Mul(mid, big.NewRat(1, 2))
		if v := point(pt(mid)); v.IsFinite() && (x.Max && interval.Lower(inner).Less(interval.Lower(v)) || !x.Max && interval.Upper(v).Less(interval.Upper(inner))) {
			inner, sStar = v, mid
		}
	}
	// The extremum lies between the inner point value and the outer bound.
	var val T
	if x.Max {
		val = interval.Lower(inner).Hull(interval.Upper(outer))
	} else {
		val = interval.Lower(outer).Hull(interval.Upper(inner))
	}
	return ExtremeResult[T]{Value: val, At: pt(sStar), Cells: len(cells)}, nil
}

// goldenMin locates a local minimiser of sign*f on [a, b] by golden-section
// search on exact rational points, to about 2^(-prec/2) relative width.
func goldenMin[T interval.Real[T]](f func(*big.Rat) T, a, b *big.Rat, sign float64, prec uint) *big.Rat {
	val := func(s *big.Rat) *big.Float {
		v := f(s).Mid()
		lo, _ := v.Endpoints()
		if lo == nil {
			return new(big.Float).SetInf(false)
		}
		if sign < 0 {
			lo.Neg(lo)
		}
		return lo
	}
	// Both interior points are recomputed each step (a rational stand-in
	// for 1/phi cannot reuse points without drifting), so each step costs two
	// evaluations and shrinks the bracket by 0.618.
	r := big.NewRat(618034, 1000000)
	iters := int(prec)*3/4 + 10
	lo, hi := new(big.Rat).Set(a), new(big.Rat).Set(b)
	round := func(v *big.Rat) *big.Rat { return roundDecimal(v, int(prec)/3+8) }
	for range iters {
		w := new(big.Rat).Sub(hi, lo)
		c := round(new(big.Rat).Sub(hi, new(big.Rat).Mul(r, w)))
		d := round(new(big.Rat).Add(lo, new(big.Rat).Mul(r, w)))
		if c.Cmp(d) >= 0 {
			break
		}
		if val(c).Cmp(val(d)) < 0 {
			hi = d
		} else {
			lo = c
		}
	}
	return round(new(big.Rat).Add(lo, hi).Mul(new(big.Rat).Add(lo, hi), big.NewRat(1, 2)))
}

// roundDecimal rounds v to n decimal places (a terminating decimal).
func roundDecimal(v *big.Rat, n int) *big.Rat {
	r, _ := new(big.Rat).SetString(v.FloatString(n))
	return r
}

// uniformGrid returns n+1 equally spaced terminating-decimal breakpoints.
func uniformGrid(lo, hi *big.Rat, n int) []*big.Rat {
	if n < 1 {
		n = 1
	}
	g := make([]*big.Rat, n+1)
	step := new(big.Rat).Quo(new(big.Rat).Sub(hi, lo), big.NewRat(int64(n), 1))
	for i := range g {
		g[i] = roundDecimal(new(big.Rat).Add(lo, new(big.Rat).Mul(step, big.NewRat(int64(i), 1))), 12)
	}
	g[0], g[n] = new(big.Rat).Set(lo), new(big.Rat).Set(hi)
	return g
}
