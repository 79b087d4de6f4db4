// Package spectrum encloses inf spec and sup spec of Op(g) for a
// squeeze-invariant symbol g = chi_Q + h(xp) (the quadrant plus relaxation
// terms in quadrant III), for the command `wedgebound spectrum`.
//
// Guarantee. Every interval returned contains the true inf spec (index 0)
// or sup spec (index 1) of Op(g): in the Mellin picture Op(g) is the direct
// integral over real s of the 2x2 symbol M(s), so inf spec Op(g) =
// inf_s lambda_min(M(s)) and sup spec Op(g) = sup_s lambda_max(M(s)). The
// solver (certify.Extreme) covers [-S, S] with cells, each enclosed in
// outward-rounded interval arithmetic, takes the tails |s| > S from the
// tail lemmas of package regions, and gets the inner side from a point
// enclosure at a located near-extremal s. The width is a target, not a
// promise: when the cell budget (MaxCells) or the narrowest cell
// (MinWidth) stops the refinement, the interval is wider but still proved.
//
// The bare quadrant has its own route (QuadrantEdges): the value comes
// from a Newton-located critical point and a convexity bound, so its
// precision grows with the digits asked for without a fine cover.
//
// Policy (how much work is spent, not what is proved): with terms, float64 intervals and at most MaxTermDigits digits. The tails are
// pushed out (S doubles from 8 up to 2^14) until the lemmas' bound on |B|
// is below 0.002 for s < 0 and both tail eigenvalue enclosures are
// narrower than 0.004 (a profile reaching xp = c keeps the bound on D
// large up to s ~ 2c).
package spectrum

import (
	"fmt"
	"math/big"
	"sync"

	"wedgebound/certify"
	"wedgebound/interval"
	"wedgebound/regions"
)

// Limits of the digits a caller may ask for.
const (
	// MaxQuadrantDigits is the most digits Quadrant accepts (about 17000
	// bits of working precision, a few minutes).
	MaxQuadrantDigits = 5000
	// MaxTermDigits is the most digits Terms accepts: with terms the cells
	// use direct float64-interval enclosures, which settle a few digits
	// within the cell budget.
	MaxTermDigits = 5
)

// Progress receives the stage ("inf spec" or "sup spec") and the cells
// done so far out of an estimated total.
type Progress func(stage string, done, total int)

// Quadrant encloses inf spec and sup spec of Op(chi_Q) to about digits
// significant digits (1..MaxQuadrantDigits); see QuadrantEdges.
func Quadrant(digits int) ([2]interval.B, error) {
	r, err := QuadrantEdges(digits, nil)
	return [2]interval.B{r[0].Value, r[1].Value}, err
}

// QuadrantEdges proves both edges of the bare quadrant (index 0: inf spec,
// 1: sup spec) with width below 10^-(digits+2) or so, together with the
// critical points where they are attained, by regions.SolveQuadrantEdge
// (convexity window, Newton's method with doubling precision, Taylor
// bound of the value, float64 cover elsewhere). The two edges run
// concurrently. progress may be nil.
func QuadrantEdges(digits int, progress Progress) ([2]regions.QuadrantEdge, error) {
	var out [2]regions.QuadrantEdge
	if digits < 1 || digits > MaxQuadrantDigits {
		return out, fmt.Errorf("digits %d is outside 1..%d", digits, MaxQuadrantDigits)
	}
	var errs [2]error
	var wg sync.WaitGroup
	for i, e := range []regions.Edge{regions.Lower, regions.Upper} {
		wg.Add(1)
		go func() {
			defer wg.Done()
			out[i], errs[i] = regions.SolveQuadrantEdge(e, digits, progress)
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

// Terms encloses inf spec and sup spec of Op(chi_Q + terms of rel) to about
// digits significant digits (1..MaxTermDigits) in float64 intervals.
func Terms(rel regions.Relaxation[interval.F], digits int, progress Progress) ([2]interval.F, error) {
	if digits < 1 || digits > MaxTermDigits {
		return [2]interval.F{}, fmt.Errorf("with terms at most %d digits are supported, not %d", MaxTermDigits, digits)
	}
	return Enclose(interval.F{}, rel, digits, false, progress)
}

// Enclose encloses inf spec and sup spec of Op(g) for g = chi_Q + terms.
// The bare quadrant (quadrant true; rel must then have no terms) uses the
// mean-value form, which reaches any precision, with float64 cells first;
// with terms the cells use direct enclosures. progress may be nil.
func Enclose[T interval.Real[T]](like T, rel regions.Relaxation[T], digits int, quadrant bool, progress Progress) ([2]T, error) {
	Sv := int64(8)
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
	for Sv < 1<<14 && !small(Sv) {
		Sv *= 2
	}
	S := like.Int(Sv)
	var out [2]T
	extra := 3
	if !quadrant {
		extra = 1
	}
	eps, err := like.Decimal(fmt.Sprintf("1e-%d", digits+extra))
	if err != nil {
		return out, fmt.Errorf("spectrum: target width: %w", err)
	}
	minW := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(digits/2+8)), nil))
	for i, e := range []regions.Edge{regions.Lower, regions.Upper} {
		point := func(s T) T { return rel.Enclose(s).Eig(e) }
		f := func(s T) T { return rel.Eig(s, e) }
		var fast certify.CellFunc[T]
		if quadrant {
			f = func(s T) T { return regions.QuadrantEig(s, e) }
			fast = func(s T) T {
				v := regions.QuadrantEig(interval.F{}.Between(s.Endpoints()), e)
				return s.Between(v.Endpoints())
			}
		}
		outside := rel.Tail(S, 1).Eig(e).Hull(rel.Tail(S, -1).Eig(e))
		var scan []*big.Rat
		if !quadrant {
			// Relaxation terms move the extremum and add oscillation: scan
			// [-24, 24] in steps of 1/8 as well.
			for k := int64(-192); k <= 192; k++ {
				scan = append(scan, big.NewRat(k, 8))
			}
		}
		x := certify.Extreme[T]{
			F: f, Point: point, Fast: fast, Lo: big.NewRat(-Sv, 1), Hi: big.NewRat(Sv, 1), Outside: outside, Scan: scan,
			Cells: 64, Eps: eps, Max: e == regions.Upper,
			Options: certify.CoverOptions{MinWidth: minW, MaxCells: 200000},
		}
		if progress != nil {
			stage := []string{"inf spec", "sup spec"}[i]
			x.Options.Progress = func(done, total int) { progress(stage, done, total) }
		}
		r, err := x.Solve(like)
		if err != nil {
			return out, err
		}
		out[i] = r.Value
	}
	return out, nil
}
