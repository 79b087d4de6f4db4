package witness

import (
	"fmt"
	"testing"
)

// BenchmarkWitness times the whole run (float search and proof) against
// the basis size (set by the smallest width): go test -bench Witness
// ./certify/witness.
func BenchmarkWitness(b *testing.B) {
	for _, bmin := range []float64{1e-3, 1e-7, 1e-11} {
		o := Preset()
		o.MinWidth = bmin
		b.Run(fmt.Sprintf("min-width=%g/basis=%d", bmin, BasisSize(o)), func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				if _, err := Run(o); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
