package certify

import (
	"math/big"
	"strconv"
	"strings"
	"sync/atomic"
	"testing"

	"wedgebound/interval"
)

// Issue 17 item 1 (a work bound, not a timing): a cover whose cells can
// never be accepted stops after at most 2 MaxCells + pieces enclosures (+1
// in flight per worker) with an error, and its status reports the work.
func TestCoverWorkBound(t *testing.T) {
	like := interval.PointF(0)
	var calls atomic.Int64
	wide := func(s interval.F) interval.F { calls.Add(1); return s.Int(-1).Hull(s.Int(1)) }
	grid := []*big.Rat{big.NewRat(0, 1), big.NewRat(1, 1), big.NewRat(2, 1), big.NewRat(3, 1)}
	var last CoverStatus
	const maxCells, workers = 500, 2
	_, err := Cover(like, wide, grid, func(interval.F) bool { return false }, CoverOptions{
		MinWidth: big.NewRat(1, 1<<62), MaxCells: maxCells, Workers: workers,
		Status: func(st CoverStatus) { last = st },
	})
	if err == nil || !strings.Contains(err.Error(), "work bound") {
		t.Fatalf("error %v, want the work bound", err)
	}
	if n := calls.Load(); n > 2*maxCells+3+workers {
		t.Errorf("%d enclosures computed, bound %d", n, 2*maxCells+3+workers)
	}
	if last.Budget != 2*maxCells+3 || last.Evaluations == 0 || last.Pieces != 3 {
		t.Errorf("last status %+v", last)
	}
}

// Two minima of nearly equal depth (elementary, constructed here): the
// parabola (s - 0.2)^2 with minimum 0, which the scan sees, and a narrow
// dip between the scan points reaching (65/128 - 0.2)^2 - depth = -5e-6,
// below it by more than Eps. Before, every cell in the dip failed the
// target "within Eps of the scan's minimum" and was bisected down to
// MinWidth (the hang of "spectrum --digits 5"); now narrow cells are
// accepted, the inner value comes from the deepest cell, the enclosure
// meets Eps, and the work stays small.
func TestExtremeNearlyEqualMinima(t *testing.T) {
	like := interval.PointF(0)
	c := like.Frac(65, 128)
	p, _ := like.Decimal("0.2")
	depth := c.Sub(p).Sqr().Add(like.Float(5e-6))
	inner := dipFunc[interval.F](strconv.FormatFloat(depth.Mid().Lo(), 'f', 17, 64))
	var calls atomic.Int64
	f := func(s interval.F) interval.F { calls.Add(1); return inner(s) }
	dip := inner(c)
	if dip.Hi() > -4e-6 || dip.Lo() < -6e-6 {
		t.Fatalf("test setup: dip value %v", dip)
	}
	eps, _ := like.Decimal("1e-6")
	outside, _ := like.Decimal("0.04")
	x := Extreme[interval.F]{
		F: f, Lo: big.NewRat(0, 1), Hi: big.NewRat(1, 1), Outside: outside.Hull(like.Int(100)),
		Cells: 8, Eps: eps,
		Options: CoverOptions{MinWidth: big.NewRat(1, 1_000_000_000_000), Workers: 2},
	}
	r, err := x.Solve(like)
	if err != nil {
		t.Fatal(err)
	}
	if r.Value.Lo() > dip.Hi() || r.Value.Hi() < r.Value.Lo() {
		t.Errorf("enclosure %v does not reach the dip %v", r.Value, dip)
	}
	if w := r.Value.Hi() - r.Value.Lo(); w > 1.5e-6 {
		t.Errorf("width %.3g, want at most 1.5 eps", w)
	}
	if n := calls.Load(); n > 20000 {
		t.Errorf("%d enclosures computed: the cover bisected the dip far below what Eps needs", n)
	}
	t.Logf("[%v, %v] with %d cells, %d enclosures", r.Value.Lo(), r.Value.Hi(), r.Cells, calls.Load())
}
