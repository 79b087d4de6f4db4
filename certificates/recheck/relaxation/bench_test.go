package relaxation

import (
	"math/big"
	"os"
	"path/filepath"
	"testing"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// BenchmarkPieceQuadrant is the cost of one cell enclosure of the bare
// quadrant symbol (float64 intervals).
func BenchmarkPieceQuadrant(b *testing.B) {
	m, _ := NewModel(interval.F{}, Lower, nil)
	lo, hi := rat(b, "-0.36"), rat(b, "-0.35")
	for b.Loop() {
		if _, err := m.Piece(lo, hi); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPieceExp is the cost of one cell enclosure with one exp term
// (k = 150), its quadrature regime already built.
func BenchmarkPieceExp(b *testing.B) {
	m, _ := NewModel(interval.F{}, Lower, []certificates.Term{{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal("150")}, Weight: certificates.MustDecimal("8.46")}})
	lo, hi := rat(b, "-0.3"), rat(b, "-0.29")
	m.Piece(lo, hi)
	for b.Loop() {
		if _, err := m.Piece(lo, hi); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkRegimeBuild is the one-off cost of the quadrature data for one
// regime (k = 150, s in [-8, -4]).
func BenchmarkRegimeBuild(b *testing.B) {
	for b.Loop() {
		e, _ := newExpTerm(interval.F{}, map[string]certificates.Decimal{"k": certificates.MustDecimal("150")})
		if _, err := e.buildRegime(-3); err != nil {
			b.Fatal(err)
		}
	}
}

// benchShippedCells encloses lambda_min over every step-th recorded cell of
// a shipped certificate (float64 intervals, one goroutine, the cells as
// recorded, split only at the regime boundaries; the quadrature regimes
// are built before the timer starts). It is the per-cell cost of the
// symbol, without the bisection and the record checks of Verify.
func benchShippedCells(b *testing.B, path string, step int) {
	data, err := os.ReadFile(path)
	if err != nil {
		b.Skip("no " + path)
	}
	c, err := certificates.Decode(data)
	if err != nil {
		b.Fatal(err)
	}
	m, err := NewModel(interval.F{}, Lower, c.Relaxation.Terms)
	if err != nil {
		b.Fatal(err)
	}
	var pieces [][2]*big.Rat
	for i := 0; i < len(c.Relaxation.Cover); i += step {
		cell := c.Relaxation.Cover[i]
		pieces = append(pieces, Pieces(cell.Lo.Rat(), cell.Hi.Rat())...)
	}
	run := func() {
		for _, p := range pieces {
			if _, err := m.Piece(p[0], p[1]); err != nil {
				b.Fatal(err)
			}
		}
	}
	run()
	b.ReportMetric(float64(len(pieces)), "pieces")
	b.ResetTimer()
	for b.Loop() {
		run()
	}
}

// BenchmarkShippedCells covers testdata/backflow.json (12 exp terms), every
// 4th cell.
func BenchmarkShippedCells(b *testing.B) {
	benchShippedCells(b, filepath.Join("..", "..", "..", "testdata", "backflow.json"), 4)
}

// BenchmarkShippedCellsExp20 covers testdata/backflow-exp20/backflow.json
// (20 exp terms), every 16th cell.
func BenchmarkShippedCellsExp20(b *testing.B) {
	benchShippedCells(b, filepath.Join("..", "..", "..", "testdata", "backflow-exp20", "backflow.json"), 16)
}
