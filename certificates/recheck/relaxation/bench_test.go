package relaxation

import (
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
	m, _ := NewModel(interval.F{}, Lower, []certificates.Term{{Kind: "exp", Params: map[string]string{"k": "150"}, Weight: "8.46"}})
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
		e, _ := newExpTerm(interval.F{}, map[string]string{"k": "150"})
		if _, err := e.buildRegime(-3); err != nil {
			b.Fatal(err)
		}
	}
}
