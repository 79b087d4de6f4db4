package interval

import (
	"fmt"
	"testing"
)

var benchPrecs = []uint{53, 128, 512, 2048}

// benchSink keeps results alive so the compiler cannot drop the work.
var benchSink any

func BenchmarkDigammaB(b *testing.B) {
	for _, p := range benchPrecs {
		for _, c := range []struct {
			name   string
			re, im float64
		}{{"z=0.25+0.5i", 0.25, 0.5}, {"z=0.75-1500i", 0.75, -1500}} {
			b.Run(fmt.Sprintf("prec=%d/%s", p, c.name), func(b *testing.B) {
				z := NewC(NewB(c.re, p), NewB(c.im, p))
				Digamma(z) // fill the caches
				b.ResetTimer()
				for b.Loop() {
					benchSink = Digamma(z)
				}
			})
		}
	}
}

func BenchmarkDigammaF(b *testing.B) {
	for _, c := range []struct {
		name   string
		re, im float64
	}{{"z=0.25+0.5i", 0.25, 0.5}, {"z=0.75-1500i", 0.75, -1500}} {
		b.Run(c.name, func(b *testing.B) {
			z := NewC(PointF(c.re), PointF(c.im))
			Digamma(z)
			b.ResetTimer()
			for b.Loop() {
				benchSink = Digamma(z)
			}
		})
	}
}

// BenchmarkDigammaCellB measures the centred form on an s-cell of width
// 1/16: z = (3/2 + i s)/2 with s in [-17, -17 + 1/16].
func BenchmarkDigammaCellB(b *testing.B) {
	for _, p := range []uint{128, 256} {
		b.Run(fmt.Sprintf("prec=%d", p), func(b *testing.B) {
			s := NewB(-17, p).Hull(NewB(-17+1.0/16, p))
			z := NewC(NewB(0.75, p), s.Scale(-1))
			Digamma(z)
			b.ResetTimer()
			for b.Loop() {
				benchSink = Digamma(z)
			}
		})
	}
}

func BenchmarkPowB(b *testing.B) {
	for _, p := range benchPrecs {
		b.Run(fmt.Sprintf("prec=%d", p), func(b *testing.B) {
			z := NewC(NewB(1.25, p), NewB(0.5, p))
			w := NewC(NewB(-0.5, p), NewB(3.25, p))
			z.Pow(w)
			b.ResetTimer()
			for b.Loop() {
				benchSink = z.Pow(w)
			}
		})
	}
}

func BenchmarkPowF(b *testing.B) {
	z := NewC(PointF(1.25), PointF(0.5))
	w := NewC(PointF(-0.5), PointF(3.25))
	for b.Loop() {
		benchSink = z.Pow(w)
	}
}
