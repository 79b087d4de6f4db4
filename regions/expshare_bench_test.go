package regions

import (
	"fmt"
	"math"
	"strconv"
	"testing"

	"wedgebound/interval"
)

// Benchmarks for issue 13: the cost per profile of one cover cell
// (Relaxation.Eig: enclosure and slope over the cell plus the value at its
// midpoint) for n exponential profiles, k log-spaced on 0.1 ... 10000 with
// alternating weights, evaluated term by term (a Relaxation literal) and
// on shared nodes (NewRelaxation). Cell [-0.30, -0.29] (near the backflow
// minimum, regime |s| <= 1); the regime's set-up is built before timing.
func BenchmarkRelaxationEigCell(b *testing.B) {
	like := interval.PointF(0)
	for _, n := range []int{1, 4, 16} {
		for _, shared := range []bool{false, true} {
			name := fmt.Sprintf("profiles=%d/shared=%v", n, shared)
			b.Run(name, func(b *testing.B) {
				var terms []Term[interval.F]
				var w []interval.F
				for i := range n {
					k := 0.1
					if n > 1 {
						k = 0.1 * math.Pow(1e5, float64(i)/float64(n-1))
					}
					tm, err := NewTerm(like, "exp", map[string]string{"k": strconv.FormatFloat(k, 'g', 4, 64)})
					if err != nil {
						b.Fatal(err)
					}
					terms = append(terms, tm)
					w = append(w, like.Float(float64(1-2*(i%2))*(1+float64(i))))
				}
				rel := Relaxation[interval.F]{Terms: terms, Weights: w}
				if shared {
					rel = NewRelaxation(terms, w)
				}
				c := cellF(-0.30, -0.29)
				rel.Eig(c, Lower) // builds the regime
				for b.Loop() {
					rel.Eig(c, Lower)
				}
			})
		}
	}
}
