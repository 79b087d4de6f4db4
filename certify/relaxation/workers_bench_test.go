package relaxation

import (
	"fmt"
	"testing"

	"wedgebound/regions"
)

// BenchmarkCertifyWorkers certifies a two-profile relaxation of the backflow
// preset with fixed weights (cover and tails only, no search) on 1 and 2
// goroutines; the ratio of the two is the parallel speed-up.
func BenchmarkCertifyWorkers(b *testing.B) {
	for _, w := range []int{1, 2} {
		b.Run(fmt.Sprintf("workers=%d", w), func(b *testing.B) {
			for range b.N {
				_, err := Run(Config{Problem: regions.Presets["backflow"], Terms: expSpecs([]string{"4.9", "1000"}, []string{"0.152944", "39.1613"}), Margin: 2e-5, Workers: w})
				if err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
