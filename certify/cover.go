// Package certify holds what the certifiers of every kind share: the
// adaptive cover of a real variable by cells whose enclosures a predicate
// accepts (Cover), the extremum solver built on it (Extreme) and the
// parallel loop (For). Each certificate kind has its own package under
// this one (certify/relaxation, certify/strip, ...).
package certify

import (
	"fmt"
	"math/big"
	"runtime"
	"sync"
	"sync/atomic"

	"wedgebound/interval"
	"wedgebound/regions"
)

// CellFunc encloses a real function over the closed cell s (an interval):
// the result must contain f(t) for every t in s.
type CellFunc[T interval.Real[T]] func(s T) T

// ProvedCell is a cell [Lo, Hi] of the cover with an enclosure of the
// function over it. Lo and Hi are exact terminating decimals.
type ProvedCell[T interval.Real[T]] struct {
	Lo, Hi *big.Rat
	Value  T
}

// CoverOptions controls the adaptive refinement.
type CoverOptions struct {
	// MinWidth stops bisection: a cell narrower than this is accepted with
	// whatever enclosure it has (which is then the proved value there).
	MinWidth *big.Rat
	// MaxCells caps the number of cells produced; 0 means 1e6.
	MaxCells int
	// Workers is the number of goroutines; 0 means GOMAXPROCS. The result does
	// not depend on it.
	Workers int
	// Progress, if set, is called with the number of initial pieces done and
	// their total.
	Progress func(done, total int)
	// Status, if set, is called about every 64 cell evaluations and after
	// every piece with what is really done so far (for progress displays
	// that should not stand still during a long piece).
	Status func(CoverStatus)
}

// CoverStatus is the work done so far by a running Cover.
type CoverStatus struct {
	// Pieces is the number of initial pieces, PiecesDone how many are
	// finished.
	Pieces, PiecesDone int
	// Cells is the number of cells proved (accepted) so far, Evaluations
	// the number of cell enclosures computed (accepted or bisected), Budget
	// the most evaluations Cover will spend before it gives up.
	Cells, Evaluations, Budget int
}

// cellInterval encloses the exact decimal cell [lo, hi] in T.
func cellInterval[T interval.Real[T]](like T, lo, hi *big.Rat) T {
	a, _ := like.Decimal(lo.FloatString(decimals(lo)))
	b, _ := like.Decimal(hi.FloatString(decimals(hi)))
	return a.Hull(b)
}

// decimals returns the number of decimal places of a terminating decimal,
// or 40 if it does not terminate (Cover rejects such breakpoints).
func decimals(r *big.Rat) int {
	if places, ok := regions.DecimalPlaces(r); ok {
		return places
	}
	return 40
}

// Cover encloses f on every cell of the partition given by the increasing
// exact breakpoints grid (terminating decimals), bisecting a cell while
// accept rejects its enclosure and it is wider than MinWidth. Cells come
// back in increasing order, contiguous from grid[0] to grid[last]. The
// result is the same for any number of workers.
//
// The work is bounded: at most 2 MaxCells + len(grid) enclosures are
// computed in all (a bisection tree with MaxCells leaves has fewer than
// that many nodes), counted as they happen, so a piece that would bisect
// without end stops at the budget instead of running on; Cover then
// returns an error saying so.
func Cover[T interval.Real[T]](like T, f CellFunc[T], grid []*big.Rat, accept func(T) bool, opt CoverOptions) ([]ProvedCell[T], error) {
	if len(grid) < 2 {
		return nil, fmt.Errorf("certify: a cover needs at least two breakpoints")
	}
	for i := range grid {
		if decimals(grid[i]) >= 40 {
			return nil, fmt.Errorf("certify: breakpoint %s is not a short terminating decimal", grid[i].RatString())
		}
		if i > 0 && grid[i-1].Cmp(grid[i]) >= 0 {
			return nil, fmt.Errorf("certify: breakpoints must increase (at %d)", i)
		}
	}
	maxCells := opt.MaxCells
	if maxCells == 0 {
		maxCells = 1_000_000
	}
	minW := opt.MinWidth
	if minW == nil {
		minW = big.NewRat(1, 1_000_000_000)
	}
	workers := opt.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	n := len(grid) - 1
	parts := make([][]ProvedCell[T], n)
	budget := int64(2*maxCells + n)
	var (
		mu    sync.Mutex
		total int
		done  int
		over  bool
		evals atomic.Int64
		cells atomic.Int64
	)
	status := func() {
		if opt.Status != nil {
			opt.Status(CoverStatus{Pieces: n, PiecesDone: done, Cells: int(cells.Load()), Evaluations: int(evals.Load()), Budget: int(budget)})
		}
	}
	// count is called after every evaluation; it returns false once the
	// budget is spent.
	count := func(accepted bool) bool {
		e := evals.Add(1)
		if accepted {
			cells.Add(1)
		}
		if e%64 == 0 && opt.Status != nil {
			mu.Lock()
			status()
			mu.Unlock()
		}
		return e < budget
	}
	For(n, workers, func(i int) {
		mu.Lock()
		stop := over
		mu.Unlock()
		if stop {
			return
		}
		piece, ok := refine(like, f, grid[i], grid[i+1], accept, minW, maxCells, count)
		mu.Lock()
		parts[i] = piece
		total += len(piece)
		if total > maxCells || !ok {
			over = true
		}
		done++
		if opt.Progress != nil {
			opt.Progress(done, n)
		}
		status()
		mu.Unlock()
	})
	if over {
		return nil, fmt.Errorf("certify: the cover needs more than %d cells (%d enclosures computed, the work bound)", maxCells, evals.Load())
	}
	var out []ProvedCell[T]
	for _, p := range parts {
		out = append(out, p...)
	}
	return out, nil
}

// refine bisects [lo, hi] depth-first, left to right. count is called
// after each evaluation (with whether the cell was accepted); when it
// returns false the work budget is spent and refine stops with ok false.
func refine[T interval.Real[T]](like T, f CellFunc[T], lo, hi *big.Rat, accept func(T) bool, minW *big.Rat, maxCells int, count func(accepted bool) bool) (out []ProvedCell[T], ok bool) {
	type span struct{ lo, hi *big.Rat }
	stack := []span{{lo, hi}}
	half := big.NewRat(1, 2)
	// Stopping at maxCells+1 cells leaves the piece incomplete, but then the
	// caller's total exceeds maxCells and Cover returns an error.
	for len(stack) > 0 && len(out) <= maxCells {
		c := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		v := f(cellInterval(like, c.lo, c.hi))
		w := new(big.Rat).Sub(c.hi, c.lo)
		done := accept(v) || w.Cmp(minW) <= 0
		if !count(done) {
			return out, false
		}
		if done {
			out = append(out, ProvedCell[T]{Lo: c.lo, Hi: c.hi, Value: v})
			continue
		}
		mid := new(big.Rat).Add(c.lo, c.hi)
		mid.Mul(mid, half)
		stack = append(stack, span{mid, c.hi}, span{c.lo, mid})
	}
	return out, true
}
