package spectrum

import "testing"

// Both edges of testdata/terms/exp150.json by the Newton route (whole
// computation: scan, windows, cover, tails).
func benchmarkTermEdges(b *testing.B, digits int) {
	for b.Loop() {
		if _, err := TermEdges(exp150Specs, digits, nil); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkTermEdges10(b *testing.B) { benchmarkTermEdges(b, 10) }
func BenchmarkTermEdges20(b *testing.B) { benchmarkTermEdges(b, 20) }
func BenchmarkTermEdges40(b *testing.B) { benchmarkTermEdges(b, 40) }
