package regions

import (
	"testing"

	"wedgebound/interval"
)

// Benchmarks for the band and hat families: enclosing M(s) and dM/ds
// (Enclose and Slope, as one cell of a mean-value cover needs) on one cell,
// at 53 bits (F) and 128 bits (B): the cell [-0.30, -0.29] near the
// backflow minimum and the far cell [-400.5, -400], where only the edge
// terms remain (the diagonal is left to its tail lemma there). The
// quadrature rules of the cell's regime are built once outside the timing;
// BenchmarkBandRuleBuildF is that one-off cost for a fresh term.

var (
	benchBandParams = map[string]string{"from": "0.5", "to": "2"}
	benchHatParams  = map[string]string{"left": "0.5", "peak": "1", "right": "1.5"}
)

func benchPWL[T interval.Real[T]](b *testing.B, like T, kind string, params map[string]string, c T) {
	term, err := NewTerm(like, kind, params)
	if err != nil {
		b.Fatal(err)
	}
	m := term.Enclose(c) // build the rules outside the timing
	term.Slope(c)
	if !m.D.IsFinite() || !m.B.IsFinite() {
		b.Fatalf("%s %v: enclosure on the cell is not finite", kind, params)
	}
	for b.Loop() {
		term.Enclose(c)
		term.Slope(c)
	}
}

func BenchmarkBandCellF(b *testing.B) {
	benchPWL(b, interval.PointF(0), "band", benchBandParams, cellF(-0.30, -0.29))
}

func BenchmarkBandCellB128(b *testing.B) {
	benchPWL(b, interval.NewB(0, 128), "band", benchBandParams, cellB(-0.30, -0.29))
}

func BenchmarkBandFarCellF(b *testing.B) {
	benchPWL(b, interval.PointF(0), "band", benchBandParams, cellF(-400.5, -400))
}

func BenchmarkBandFarCellB128(b *testing.B) {
	benchPWL(b, interval.NewB(0, 128), "band", benchBandParams, cellB(-400.5, -400))
}

func BenchmarkHatCellF(b *testing.B) {
	benchPWL(b, interval.PointF(0), "hat", benchHatParams, cellF(-0.30, -0.29))
}

func BenchmarkHatCellB128(b *testing.B) {
	benchPWL(b, interval.NewB(0, 128), "hat", benchHatParams, cellB(-0.30, -0.29))
}

func BenchmarkHatFarCellF(b *testing.B) {
	benchPWL(b, interval.PointF(0), "hat", benchHatParams, cellF(-400.5, -400))
}

func BenchmarkHatFarCellB128(b *testing.B) {
	benchPWL(b, interval.NewB(0, 128), "hat", benchHatParams, cellB(-400.5, -400))
}

// BenchmarkBandRuleBuildF is the one-off cost of a fresh band term's rules
// for the cell [-0.30, -0.29] (Enclose and Slope).
func BenchmarkBandRuleBuildF(b *testing.B) {
	c := cellF(-0.30, -0.29)
	for b.Loop() {
		term, _ := NewTerm(interval.PointF(0), "band", benchBandParams)
		term.Enclose(c)
		term.Slope(c)
	}
}
