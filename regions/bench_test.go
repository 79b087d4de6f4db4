package regions

import (
	"fmt"
	"testing"

	"wedgebound/interval"
)

// Benchmarks for issue 3: enclosing M(s) (and its slope, which the
// mean-value form needs) on one cell, for the quadrant and for an
// exponential term, at 53 bits (F) and 128 bits (B). The cells are
// [-0.30, -0.29] (near the backflow minimum, regime |s| <= 1) and
// [-40.5, -40] (regime 32 <= |s| <= 64).

func cellF(lo, hi float64) interval.F { return interval.PointF(lo).Hull(interval.PointF(hi)) }

func cellB(lo, hi float64) interval.B { return interval.NewB(lo, 128).Hull(interval.NewB(hi, 128)) }

func BenchmarkQuadrantCellF(b *testing.B) {
	c := cellF(-0.30, -0.29)
	for b.Loop() {
		Quadrant(c)
	}
}

func BenchmarkQuadrantCellB128(b *testing.B) {
	c := cellB(-0.30, -0.29)
	for b.Loop() {
		Quadrant(c)
	}
}

func BenchmarkQuadrantEigCellF(b *testing.B) {
	c := cellF(-0.30, -0.29)
	for b.Loop() {
		QuadrantEig(c, Lower)
	}
}

func BenchmarkQuadrantEigCellB128(b *testing.B) {
	c := cellB(-0.30, -0.29)
	for b.Loop() {
		QuadrantEig(c, Lower)
	}
}

func benchExp[T interval.Real[T]](b *testing.B, like T, c T) {
	term, err := NewTerm(like, "exp", map[string]string{"k": "150"})
	if err != nil {
		b.Fatal(err)
	}
	term.Enclose(c) // build the quadrature regime outside the timing
	term.Slope(c)
	for b.Loop() {
		term.Enclose(c)
	}
}

func BenchmarkExpCellF(b *testing.B) { benchExp(b, interval.PointF(0), cellF(-0.30, -0.29)) }

func BenchmarkExpCellB128(b *testing.B) { benchExp(b, interval.NewB(0, 128), cellB(-0.30, -0.29)) }

func BenchmarkExpFarCellF(b *testing.B) { benchExp(b, interval.PointF(0), cellF(-40.5, -40)) }

func BenchmarkExpFarCellB128(b *testing.B) { benchExp(b, interval.NewB(0, 128), cellB(-40.5, -40)) }

// BenchmarkRelaxationEigCellF is one cell of a certification cover: the
// mean-value eigenvalue enclosure of the quadrant plus one exponential term.
func BenchmarkRelaxationEigCellF(b *testing.B) {
	term, err := NewTerm(interval.PointF(0), "exp", map[string]string{"k": "150"})
	if err != nil {
		b.Fatal(err)
	}
	w, _ := interval.PointF(0).Decimal("8.46")
	rel := Relaxation[interval.F]{Terms: []Term[interval.F]{term}, Weights: []interval.F{w}}
	c := cellF(-0.30, -0.29)
	rel.Eig(c, Lower)
	for b.Loop() {
		rel.Eig(c, Lower)
	}
}

// BenchmarkExpRegimeBuild is the one-off cost of planning and bounding the
// quadrature for one regime (|s| <= 1) of a fresh term.
func BenchmarkExpRegimeBuild(b *testing.B) {
	c := cellF(-0.30, -0.29)
	for b.Loop() {
		term, _ := NewTerm(interval.PointF(0), "exp", map[string]string{"k": "150"})
		term.Enclose(c)
	}
}

// BenchmarkQuadrantEdges proves both edges of the bare quadrant (the work
// of "spectrum --quadrant --digits N", one edge after the other). The
// package caches (Bernoulli numbers, Stirling coefficients, pi) are warm
// after the first iteration, so this is the steady cost; BENCHMARKS.md
// gives whole-process times as well.
func BenchmarkQuadrantEdges(b *testing.B) {
	for _, d := range []int{30, 100, 1000} {
		b.Run(fmt.Sprintf("digits=%d", d), func(b *testing.B) {
			for b.Loop() {
				for _, e := range []Edge{Lower, Upper} {
					if _, err := SolveQuadrantEdge(e, d, nil); err != nil {
						b.Fatal(err)
					}
				}
			}
		})
	}
}
