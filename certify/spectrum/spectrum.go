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
// enclosure at a located near-extremal s (or at the most extreme cell of
// the cover, when the located s is a local extremum only). The work is
// bounded: at most MaxCells cells and 2 MaxCells + 64 cell enclosures per
// edge. When the requested digits are not reached within that bound (the
// cover runs out of budget, or cells at the narrowest width MinWidth still
// have enclosures wider than the target), Enclose returns an error that
// says so and gives the proved, wider enclosure; it never returns an
// interval narrower than what was proved.
//
// The bare quadrant (QuadrantEdges) and relaxations of exp terms
// (TermEdges) have a Newton route: the value comes from a Newton-located
// critical point and a convexity bound on a window (several windows when
// the eigenvalue has several local extrema of nearly equal depth), so its
// precision grows with the digits asked for without a fine cover. The
// same guarantee holds: every returned interval contains the true edge,
// because inf over a window lies in [g(c) - g'(c)^2/(2m), g(c)] when
// g” >= m > 0 there (regions package doc, "Edges to many digits"), and
// float64 cells and the tail lemmas prove that g stays above the lower
// end everywhere else. Its work is bounded too (windows, convexity cells,
// Newton steps, cover cells, quadrature panels); a bound exceeded is an
// error, never a silently wider or narrower result.
//
// Policy (how much work is spent, not what is proved): with band or hat
// terms, float64 intervals and at most MaxCoverDigits digits; with exp
// terms only, the Newton route at the precision of
// regions.QuadrantEdgePrec(digits) and at most MaxTermDigits digits. The
// tails are pushed out (S doubles from 8 up to 2^14) until the lemmas'
// bound on |B| is below 0.002 for s < 0 and both tail eigenvalue
// enclosures are narrower than 0.004 (a profile reaching xp = c keeps the
// bound on D large up to s ~ 2c); the Newton route doubles S further (up to
// 2^16) until the tails lie above the edge.
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
	// MaxTermDigits is the most digits TermEdges accepts (relaxations of
	// exp terms, Newton route; 179 bits, seconds to tens of seconds).
	MaxTermDigits = 40
	// MaxCoverDigits is the most digits Terms accepts (any family, direct
	// float64-interval enclosures on cells, which settle a few digits
	// within the cell budget).
	MaxCoverDigits = 5
)

// Progress receives the stage and a count done of total (QuadrantEdges).
type Progress func(stage string, done, total int)

// CoverProgress receives the stage ("inf spec" or "sup spec") and the work
// done so far in it (pieces, cells proved, enclosures computed, the
// budget) (Terms and Enclose).
type CoverProgress func(stage string, st certify.CoverStatus)

// MaxCells bounds the cells of one edge's cover (and so its work).
const MaxCells = 100000

// NotSettledError reports an enclosure that is proved but wider than the
// requested digits allow.
type NotSettledError struct {
	Stage  string // "inf spec" or "sup spec"
	Digits int
	// Lower and Upper are the proved enclosure (float64 endpoints, outward).
	Lower, Upper float64
	// Reason says what stopped the refinement.
	Reason string
}

func (e *NotSettledError) Error() string {
	return fmt.Sprintf("%s: %d digits cannot be reached (%s); proved only [%.9g, %.9g], width %.2g; ask for fewer digits",
		e.Stage, e.Digits, e.Reason, e.Lower, e.Upper, e.Upper-e.Lower)
}

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
// digits significant digits (1..MaxCoverDigits) in float64 intervals, by a
// cover of cells (any family; relaxations of exp terms have the Newton
// route TermEdges).
func Terms(rel regions.Relaxation[interval.F], digits int, progress CoverProgress) ([2]interval.F, error) {
	if digits < 1 || digits > MaxCoverDigits {
		return [2]interval.F{}, fmt.Errorf("with band or hat terms at most %d digits are supported, not %d", MaxCoverDigits, digits)
	}
	return Enclose(interval.F{}, rel, digits, progress)
}

// Enclose encloses inf spec and sup spec of Op(g) for g = chi_Q + terms,
// with direct enclosures on the cells (the bare quadrant has its own route,
// QuadrantEdges). progress may be nil.
func Enclose[T interval.Real[T]](like T, rel regions.Relaxation[T], digits int, progress CoverProgress) ([2]T, error) {
	Sv := tailStart(like, rel)
	S := like.Int(Sv)
	var out [2]T
	eps, err := like.Decimal(fmt.Sprintf("1e-%d", digits+1))
	if err != nil {
		return out, fmt.Errorf("spectrum: target width: %w", err)
	}
	minW := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(digits/2+8)), nil))
	for i, e := range []regions.Edge{regions.Lower, regions.Upper} {
		point := func(s T) T { return rel.Enclose(s).Eig(e) }
		f := func(s T) T { return rel.Eig(s, e) }
		outside := rel.Tail(S, 1).Eig(e).Hull(rel.Tail(S, -1).Eig(e))
		// Relaxation terms move the extremum and add oscillation: scan
		// [-24, 24] in steps of 1/8 as well.
		var scan []*big.Rat
		for k := int64(-192); k <= 192; k++ {
			scan = append(scan, big.NewRat(k, 8))
		}
		x := certify.Extreme[T]{
			F: f, Point: point, Lo: big.NewRat(-Sv, 1), Hi: big.NewRat(Sv, 1), Outside: outside, Scan: scan,
			Cells: 64, Eps: eps, Max: e == regions.Upper,
			Options: certify.CoverOptions{MinWidth: minW, MaxCells: MaxCells},
		}
		stage := []string{"inf spec", "sup spec"}[i]
		if progress != nil {
			x.Options.Status = func(st certify.CoverStatus) { progress(stage, st) }
		}
		r, err := x.Solve(like)
		if err != nil {
			return out, fmt.Errorf("%s: %d digits cannot be reached within the work bound of %d cells: %w; ask for fewer digits", stage, digits, MaxCells, err)
		}
		// The target: inner value within eps of every cell, so the width is
		// at most eps plus the point enclosure's own width.
		if w := r.Value.Hi() - r.Value.Lo(); !(w <= 1.5*eps.Hi()) {
			return out, &NotSettledError{Stage: stage, Digits: digits, Lower: r.Value.Lo(), Upper: r.Value.Hi(),
				Reason: fmt.Sprintf("cells %s wide still have enclosures wider than the target %.0e", minW.FloatString(digits/2+8), eps.Hi())}
		}
		out[i] = r.Value
	}
	return out, nil
}
