package interval

import (
	"math"
	"math/rand"
	"testing"
)

// The float64 library value (correctly rounded to within a few ulps, common
// practice) must lie in the F and B enclosures of each function.
func TestElementaryContainFloat64(t *testing.T) {
	rng := rand.New(rand.NewSource(1))
	type fn struct {
		name string
		f    func(float64) float64
		ef   func(F) F
		eb   func(B) B
		dom  func(float64) bool
	}
	fns := []fn{
		{"exp", math.Exp, Exp[F], Exp[B], func(v float64) bool { return v < 700 }},
		{"expm1", math.Expm1, Expm1[F], Expm1[B], func(v float64) bool { return v < 700 }},
		{"log", math.Log, Log[F], Log[B], func(v float64) bool { return v > 0 }},
		{"sin", math.Sin, Sin[F], Sin[B], func(float64) bool { return true }},
		{"cos", math.Cos, Cos[F], Cos[B], func(float64) bool { return true }},
		{"atan", math.Atan, Atan[F], Atan[B], func(float64) bool { return true }},
	}
	for _, c := range fns {
		for i := 0; i < 300; i++ {
			v := (rng.Float64()*2 - 1) * math.Pow(10, float64(rng.Intn(8)-3))
			if !c.dom(v) {
				v = -v
			}
			if !c.dom(v) {
				continue
			}
			want := c.f(v)
			// allow the library value 2 ulps of its own error
			lo, hi := math.Nextafter(want, math.Inf(-1)), math.Nextafter(want, math.Inf(1))
			lo, hi = math.Nextafter(lo, math.Inf(-1)), math.Nextafter(hi, math.Inf(1))
			fe := c.ef(PointF(v))
			if fe.Hi() < lo || fe.Lo() > hi {
				t.Errorf("%s(%g): F %v misses %g", c.name, v, fe, want)
			}
			be := c.eb(NewB(v, 128))
			if be.Hi() < lo || be.Lo() > hi {
				t.Errorf("%s(%g): B %v misses %g", c.name, v, be, want)
			}
		}
	}
}
