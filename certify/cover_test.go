package certify

import (
	"math/big"
	"strings"
	"sync/atomic"
	"testing"

	"wedgebound/interval"
)

// toyParabola encloses f(s) = (s - 0.3)^2 - 1 = s^2 - 0.6 s - 0.91 by plain
// interval evaluation of the expanded form, whose dependency overestimate
// (about 0.6 times the cell width) forces bisection near the minimum -1 at
// s = 0.3.
func toyParabola[T interval.Real[T]](s T) T {
	a, _ := s.Decimal("0.6")
	b, _ := s.Decimal("0.91")
	return s.Sqr().Sub(a.Mul(s)).Sub(b)
}

func rats(v ...string) []*big.Rat {
	out := make([]*big.Rat, len(v))
	for i, s := range v {
		out[i], _ = new(big.Rat).SetString(s)
	}
	return out
}

// checkContiguous checks that cells run from grid[0] to grid[last] without
// gaps or overlaps and that each enclosure contains f at the cell's ends and
// midpoint (evaluated at points).
func checkContiguous[T interval.Real[T]](t *testing.T, like T, f CellFunc[T], grid []*big.Rat, cells []ProvedCell[T]) {
	t.Helper()
	if len(cells) == 0 {
		t.Fatal("no cells")
	}
	if cells[0].Lo.Cmp(grid[0]) != 0 || cells[len(cells)-1].Hi.Cmp(grid[len(grid)-1]) != 0 {
		t.Errorf("cover runs from %s to %s, want %s to %s", cells[0].Lo.RatString(), cells[len(cells)-1].Hi.RatString(), grid[0].RatString(), grid[len(grid)-1].RatString())
	}
	for i, c := range cells {
		if c.Lo.Cmp(c.Hi) >= 0 {
			t.Errorf("cell %d: [%s, %s] is empty", i, c.Lo.RatString(), c.Hi.RatString())
		}
		if i > 0 && cells[i-1].Hi.Cmp(c.Lo) != 0 {
			t.Errorf("cell %d starts at %s, previous ends at %s", i, c.Lo.RatString(), cells[i-1].Hi.RatString())
		}
		mid := new(big.Rat).Add(c.Lo, c.Hi)
		mid.Quo(mid, big.NewRat(2, 1))
		for _, p := range []*big.Rat{c.Lo, mid, c.Hi} {
			v := f(cellInterval(like, p, p))
			if !c.Value.Contains(v) {
				t.Errorf("cell [%s, %s]: enclosure %v misses f(%s) = %v", c.Lo.RatString(), c.Hi.RatString(), c.Value, p.RatString(), v)
			}
		}
	}
	// Every grid point is a cell boundary.
	j := 0
	for _, g := range grid {
		for j < len(cells) && cells[j].Lo.Cmp(g) < 0 {
			j++
		}
		if !(j < len(cells) && cells[j].Lo.Cmp(g) == 0) && g.Cmp(cells[len(cells)-1].Hi) != 0 {
			t.Errorf("grid point %s is not a cell boundary", g.RatString())
		}
	}
}

// TestCoverToy covers [-2, 2] for the toy parabola, refining until each
// enclosure is above -1.01, with 1 and 2 workers: the cover is contiguous,
// contains the function, and is identical for both worker counts.
func TestCoverToy(t *testing.T) {
	like := interval.PointF(0)
	grid := rats("-2", "-1", "-0.5", "0", "0.25", "0.5", "1", "2")
	target := -1.01
	accept := func(v interval.F) bool { return v.IsFinite() && v.Lo() >= target }
	var results [][]ProvedCell[interval.F]
	for _, w := range []int{1, 2} {
		var calls atomic.Int64
		cells, err := Cover(like, toyParabola[interval.F], grid, accept, CoverOptions{Workers: w, Progress: func(done, total int) {
			calls.Add(1)
			if total != len(grid)-1 || done < 1 || done > total {
				t.Errorf("progress %d/%d", done, total)
			}
		}})
		if err != nil {
			t.Fatal(err)
		}
		if calls.Load() != int64(len(grid)-1) {
			t.Errorf("progress called %d times, want %d", calls.Load(), len(grid)-1)
		}
		checkContiguous(t, like, toyParabola[interval.F], grid, cells)
		for _, c := range cells {
			if !accept(c.Value) {
				t.Errorf("workers %d: cell [%s, %s] accepted with %v below the target", w, c.Lo.RatString(), c.Hi.RatString(), c.Value)
			}
		}
		// The minimum over the cover is within the target of -1.
		min := cells[0].Value
		for _, c := range cells {
			min = min.Min(c.Value)
		}
		if min.Lo() > -1 || min.Lo() < target {
			t.Errorf("workers %d: worst cell %v, want in [%v, -1]", w, min, target)
		}
		results = append(results, cells)
	}
	a, b := results[0], results[1]
	if len(a) != len(b) {
		t.Fatalf("1 worker: %d cells, 2 workers: %d cells", len(a), len(b))
	}
	for i := range a {
		if a[i].Lo.Cmp(b[i].Lo) != 0 || a[i].Hi.Cmp(b[i].Hi) != 0 || a[i].Value != b[i].Value {
			t.Errorf("cell %d differs between 1 and 2 workers: [%s, %s] %v vs [%s, %s] %v", i,
				a[i].Lo.RatString(), a[i].Hi.RatString(), a[i].Value, b[i].Lo.RatString(), b[i].Hi.RatString(), b[i].Value)
		}
	}
	if len(a) <= len(grid)-1 {
		t.Errorf("no refinement happened (%d cells)", len(a))
	}
}

// TestCoverMinWidth: with an acceptance test that never passes, bisection
// stops at MinWidth, and every cell is at most MinWidth and more than half
// of it wide.
func TestCoverMinWidth(t *testing.T) {
	like := interval.PointF(0)
	minW := big.NewRat(1, 64)
	cells, err := Cover(like, toyParabola[interval.F], rats("0", "1"), func(interval.F) bool { return false }, CoverOptions{MinWidth: minW, Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	if len(cells) != 64 {
		t.Errorf("%d cells, want 64", len(cells))
	}
	half := new(big.Rat).Quo(minW, big.NewRat(2, 1))
	for _, c := range cells {
		w := new(big.Rat).Sub(c.Hi, c.Lo)
		if w.Cmp(minW) > 0 || w.Cmp(half) <= 0 {
			t.Errorf("cell width %s outside (MinWidth/2, MinWidth]", w.RatString())
		}
	}
}

// TestCoverErrors checks the input errors and the cell cap.
func TestCoverErrors(t *testing.T) {
	like := interval.PointF(0)
	yes := func(interval.F) bool { return true }
	no := func(interval.F) bool { return false }
	third := []*big.Rat{big.NewRat(0, 1), big.NewRat(1, 3)}
	for _, c := range []struct {
		name   string
		grid   []*big.Rat
		accept func(interval.F) bool
		opt    CoverOptions
		want   string
	}{
		{"one breakpoint", rats("0"), yes, CoverOptions{}, "at least two"},
		{"decreasing", rats("0", "1", "0.5"), yes, CoverOptions{}, "must increase"},
		{"repeated", rats("0", "1", "1"), yes, CoverOptions{}, "must increase"},
		{"non-terminating", third, yes, CoverOptions{}, "terminating decimal"},
		{"cell cap", rats("0", "1"), no, CoverOptions{MinWidth: big.NewRat(1, 1<<20), MaxCells: 100}, "more than 100 cells"},
	} {
		_, err := Cover(like, toyParabola[interval.F], c.grid, c.accept, c.opt)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want one containing %q", c.name, err, c.want)
		}
	}
}

// TestCoverB runs the cover at 128 bits on exact decimal cells: cell
// intervals must contain their exact decimal endpoints.
func TestCoverB(t *testing.T) {
	like := interval.NewB(0, 128)
	grid := rats("-0.1", "0.2", "0.3", "0.7")
	cells, err := Cover(like, toyParabola[interval.B], grid, func(v interval.B) bool { return v.Rad() < 0.01 }, CoverOptions{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	checkContiguous(t, like, toyParabola[interval.B], grid, cells)
	for _, c := range cells {
		x := cellInterval(like, c.Lo, c.Hi)
		lo, hi := x.Endpoints()
		l, _ := lo.Rat(nil)
		h, _ := hi.Rat(nil)
		if l.Cmp(c.Lo) > 0 || h.Cmp(c.Hi) < 0 {
			t.Errorf("cell interval [%s, %s] does not contain the exact cell [%s, %s]", l.FloatString(40), h.FloatString(40), c.Lo.RatString(), c.Hi.RatString())
		}
	}
}
