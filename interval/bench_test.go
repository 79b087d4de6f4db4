package interval

import (
	"fmt"
	"math"
	"testing"
)

// Benchmarks of the elementary functions on B at several precisions and on
// F next to plain float64 math (compare the ratios; absolute times depend on
// the machine). Run with: go test ./interval -run '^$' -bench .

var elemBenchPrecs = []uint{53, 128, 512, 2048}

var sinkB B
var sinkF F
var sinkFloat float64

func benchB(b *testing.B, f func(B) B, v float64) {
	for _, p := range elemBenchPrecs {
		x := NewB(v, p)
		f(x) // fill the constant caches outside the timing
		b.Run(fmt.Sprintf("B%d", p), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				sinkB = f(x)
			}
		})
	}
}

func benchF(b *testing.B, f func(F) F, g func(float64) float64, v float64) {
	x := PointF(v)
	b.Run("F", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			sinkF = f(x)
		}
	})
	b.Run("float64", func(b *testing.B) {
		for i := 0; i < b.N; i++ {
			sinkFloat = g(v)
		}
	})
}

func BenchmarkExp(b *testing.B) {
	benchB(b, Exp[B], 2.75)
	benchF(b, Exp[F], math.Exp, 2.75)
}

func BenchmarkLog(b *testing.B) {
	benchB(b, Log[B], 2.75)
	benchF(b, Log[F], math.Log, 2.75)
}

func BenchmarkSin(b *testing.B) {
	benchB(b, Sin[B], 2.75)
	benchF(b, Sin[F], math.Sin, 2.75)
}

func BenchmarkAtan(b *testing.B) {
	benchB(b, Atan[B], 2.75)
	benchF(b, Atan[F], math.Atan, 2.75)
}

func BenchmarkSinWide(b *testing.B) {
	x := PointF(1).Hull(PointF(2))
	for i := 0; i < b.N; i++ {
		sinkF = Sin(x)
	}
}
