package certify

import (
	"math/big"
	"testing"

	"wedgebound/interval"
)

// TestExtremeToy encloses min_s of the toy parabola (s - 0.3)^2 - 1 (exact
// minimum -1 at s = 0.3, elementary) over [-2, 2], with the outside
// enclosed by [1.89, inf) ((s - 0.3)^2 >= 1.7^2 for |s| > 2), at 53 and
// 128 bits, and the maximum of its negative.
func TestExtremeToy(t *testing.T) {
	t.Run("F", func(t *testing.T) { extremeToy(t, interval.PointF(0), "1e-6") })
	// The expanded form overestimates by about 0.6 times the cell width, so
	// the cover near the minimum needs about 0.6 pi / sqrt(eps) cells.
	t.Run("B128", func(t *testing.T) { extremeToy(t, interval.NewB(0, 128), "1e-7") })
}

func extremeToy[T interval.Real[T]](t *testing.T, like T, epsStr string) {
	eps, _ := like.Decimal(epsStr)
	outside, _ := like.Decimal("1.89")
	big1 := like.Int(1000)
	for _, max := range []bool{false, true} {
		f := toyParabola[T]
		out := outside.Hull(big1)
		want := like.Int(-1)
		if max {
			f = func(s T) T { return toyParabola(s).Neg() }
			out = out.Neg()
			want = like.Int(1)
		}
		x := Extreme[T]{
			F: f, Lo: big.NewRat(-2, 1), Hi: big.NewRat(2, 1), Outside: out,
			Cells: 16, Eps: eps, Max: max,
			Options: CoverOptions{MinWidth: big.NewRat(1, 1<<40), Workers: 2},
		}
		r, err := x.Solve(like)
		if err != nil {
			t.Fatal(err)
		}
		if !r.Value.Contains(want) {
			t.Errorf("max=%v: enclosure %v misses the extremum %v", max, r.Value, want)
		}
		if r.Value.Rad()*2 > 2*eps.Hi() {
			t.Errorf("max=%v: width %.3g, want <= 2 eps = %.3g", max, r.Value.Rad()*2, 2*eps.Hi())
		}
		if at := r.At.Mid().Lo(); at < 0.29 || at > 0.31 {
			t.Errorf("max=%v: located at %v, want near 0.3", max, at)
		}
	}
}

// dipFunc is (s - 0.2)^2 - depth * max(0, 1 - ((s - c)/w)^2): a parabola
// with minimum 0 at 0.2 and a narrow dip of half-width w at c, enclosed by
// interval evaluation. With c = 0.5 + 1/128 and w = 1e-3 the dip lies
// strictly between the scan points i/64 that Extreme.Solve samples on
// [0, 1], so every sampled value is the parabola's.
func dipFunc[T interval.Real[T]](depth string) CellFunc[T] {
	return func(s T) T {
		c := s.Frac(65, 128)
		w, _ := s.Decimal("0.001")
		d, _ := s.Decimal(depth)
		p, _ := s.Decimal("0.2")
		u := s.Sub(c).Quo(w)
		bump := s.Int(0).Max(s.Int(1).Sub(u.Sqr()))
		return s.Sub(p).Sqr().Sub(d.Mul(bump))
	}
}

// TestExtremeRefusesGridOptimum: the sampled grid sees minimum 0 (at 0.2),
// so the candidate claim would be min >= 0 - eps; the true minimum is about
// (65/128 - 0.2)^2 - 1 = -0.90525 inside the dip. The solver must not
// certify the candidate: its proved enclosure must reach down to the dip
// value, whatever the refinement limit (even with no refinement at all).
func TestExtremeRefusesGridOptimum(t *testing.T) {
	like := interval.PointF(0)
	f := dipFunc[interval.F]("1")
	// f at the dip centre is an upper bound for the true minimum.
	dip := f(like.Frac(65, 128))
	if dip.Hi() > -0.905 {
		t.Fatalf("test setup: dip value %v", dip)
	}
	for i := 0; i <= 64; i++ {
		if v := f(like.Frac(int64(i), 64)); v.Lo() < -1e-12 {
			t.Fatalf("test setup: the scan point %d/64 sees the dip (%v)", i, v)
		}
	}
	eps, _ := like.Decimal("1e-4")
	outside, _ := like.Decimal("0.04")
	for _, minW := range []*big.Rat{big.NewRat(1, 1_000_000), big.NewRat(1, 8)} {
		x := Extreme[interval.F]{
			F: f, Lo: big.NewRat(0, 1), Hi: big.NewRat(1, 1), Outside: outside.Hull(like.Int(100)),
			Cells: 8, Eps: eps,
			Options: CoverOptions{MinWidth: minW, Workers: 2},
		}
		r, err := x.Solve(like)
		if err != nil {
			t.Fatal(err)
		}
		if r.Value.Lo() > dip.Hi() {
			t.Errorf("MinWidth %s: proved lower end %v is above the dip value %v: an unproved bound", minW.RatString(), r.Value.Lo(), dip.Hi())
		}
		if r.Value.Lo() > -eps.Lo() {
			t.Errorf("MinWidth %s: the grid candidate 0 - eps was certified (%v)", minW.RatString(), r.Value)
		}
		if minW.Cmp(big.NewRat(1, 1000)) < 0 && r.Value.Lo() < dip.Lo()-0.01 {
			t.Errorf("MinWidth %s: lower end %v is needlessly far below the dip %v", minW.RatString(), r.Value.Lo(), dip)
		}
		t.Logf("MinWidth %s: proved [%v, %v] with %d cells (grid minimum 0, dip %v)", minW.RatString(), r.Value.Lo(), r.Value.Hi(), r.Cells, dip.Lo())
	}
}

// TestExtremeOutsideWins: when the outside enclosure is below everything in
// [Lo, Hi], the result's lower end is the outside's.
func TestExtremeOutsideWins(t *testing.T) {
	like := interval.PointF(0)
	eps, _ := like.Decimal("1e-6")
	x := Extreme[interval.F]{
		F: toyParabola[interval.F], Lo: big.NewRat(-2, 1), Hi: big.NewRat(2, 1),
		Outside: like.Int(-3).Hull(like.Int(5)), Cells: 8, Eps: eps,
	}
	r, err := x.Solve(like)
	if err != nil {
		t.Fatal(err)
	}
	if r.Value.Lo() != -3 {
		t.Errorf("lower end %v, want the outside bound -3", r.Value.Lo())
	}
}

// TestExtremeFast: a Fast evaluation (53-bit enclosure converted to 128
// bits) that meets the acceptance test is used, and the result still
// encloses the extremum; with an unusable Fast (Whole) the result is the
// same as without it.
func TestExtremeFast(t *testing.T) {
	like := interval.NewB(0, 128)
	eps, _ := like.Decimal("1e-6")
	base := Extreme[interval.B]{
		F: toyParabola[interval.B], Lo: big.NewRat(-2, 1), Hi: big.NewRat(2, 1),
		Outside: like.Int(1).Hull(like.Int(100)), Cells: 16, Eps: eps,
		Options: CoverOptions{MinWidth: big.NewRat(1, 1<<40)},
	}
	plain, err := base.Solve(like)
	if err != nil {
		t.Fatal(err)
	}
	for name, fast := range map[string]CellFunc[interval.B]{
		"float": func(s interval.B) interval.B {
			v := toyParabola(interval.PointF(0).Between(s.Endpoints()))
			return s.Between(v.Endpoints())
		},
		"whole": func(s interval.B) interval.B { return s.Whole() },
	} {
		x := base
		x.Fast = fast
		r, err := x.Solve(like)
		if err != nil {
			t.Fatal(err)
		}
		if !r.Value.Contains(like.Int(-1)) {
			t.Errorf("%s: %v misses -1", name, r.Value)
		}
		if name == "whole" && (r.Value.Lo() != plain.Value.Lo() || r.Value.Hi() != plain.Value.Hi()) {
			t.Errorf("whole Fast changed the result: %v vs %v", r.Value, plain.Value)
		}
	}
}

// TestExtremeNonFinite: a function whose enclosure is unbounded on part of
// the range is reported as an error, never as a bound.
func TestExtremeNonFinite(t *testing.T) {
	like := interval.PointF(0)
	eps, _ := like.Decimal("1e-3")
	x := Extreme[interval.F]{
		// 1/(s - 0.5) has a pole at 0.5; its point values elsewhere are finite.
		F:     func(s interval.F) interval.F { return s.Int(1).Quo(s.Sub(s.Frac(1, 2))) },
		Point: func(s interval.F) interval.F { return s.Sqr() },
		Lo:    big.NewRat(0, 1), Hi: big.NewRat(1, 1), Outside: like.Int(0), Cells: 4, Eps: eps,
		Options: CoverOptions{MinWidth: big.NewRat(1, 1024)},
	}
	if r, err := x.Solve(like); err == nil {
		t.Errorf("pole inside the range: got %v, want an error", r.Value)
	}
}
