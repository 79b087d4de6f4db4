package witness

import (
	"math"
	"math/big"
	"math/cmplx"
	"testing"
)

// The verified Gauss rule integrates polynomials of degree 2n-1 exactly
// (common practice): sum of weights 2, int x^(2n-2) = 2/(2n-1).
func TestGaussRule(t *testing.T) {
	for _, n := range []int{8, 16, 32, 48} {
		r, err := rule(n)
		if err != nil {
			t.Fatal(err)
		}
		var s, m float64
		for i := range r.x {
			x := (r.x[i].Lo() + r.x[i].Hi()) / 2
			w := (r.w[i].Lo() + r.w[i].Hi()) / 2
			s += w
			m += w * math.Pow(x, float64(2*n-2))
		}
		if math.Abs(s-2) > 1e-13 || math.Abs(m-2/float64(2*n-1)) > 1e-13 {
			t.Errorf("n=%d: weights sum %v, moment %v", n, s, m)
		}
	}
}

// The closed form of the Gaussian moments against a plain trapezoid
// quadrature of int_0^inf u^n exp(-c u^2) du (common practice).
func TestMomentClosedForm(t *testing.T) {
	for _, c := range []complex128{1, complex(0.3, 1), complex(0.05, -1), complex(2, 0.5)} {
		for n := 0; n <= 3; n++ {
			var s complex128
			h := 1e-3
			for u := h / 2; u < 60; u += h {
				s += complex(math.Pow(u, float64(n))*h, 0) * cmplx.Exp(-c*complex(u*u, 0))
			}
			if d := cmplx.Abs(s - momentF(n, c)); d > 1e-6*cmplx.Abs(s) {
				t.Errorf("n=%d c=%v: closed form %v, quadrature %v", n, c, momentF(n, c), s)
			}
			// the interval version encloses the float one
			iv := momentI(n, halfGamma(n+1), cF{Re: ratF(new(big.Rat).SetFloat64(real(c))), Im: ratF(new(big.Rat).SetFloat64(imag(c)))})
			if real(s) < iv.Re.Lo()-1e-7 || real(s) > iv.Re.Hi()+1e-7 {
				t.Errorf("n=%d c=%v: interval %v misses %v", n, c, iv.Re, real(s))
			}
		}
	}
}

// floatQuotient evaluates <phi, K phi>/<phi, phi> by a plain double
// quadrature of the kernel K(u, v) = -(u + v)/pi sinc((u - v)(u + v)) on
// [0, U]^2 (own code, independent of the time-integral route).
func floatQuotient(basis []Func, coef []*big.Rat, U float64) float64 {
	gx, gw := glFloat(10)
	var us, ws []float64
	const h = 0.04
	for a := 0.0; a < U; a += h {
		for i := range gx {
			us = append(us, a+h/2*(1+gx[i]))
			ws = append(ws, h/2*gw[i])
		}
	}
	phi := make([]float64, len(us))
	den := 0.0
	for i, u := range us {
		phi[i] = Amplitude(basis, coef, u) * ws[i]
		den += phi[i] * phi[i] / ws[i]
	}
	num := 0.0
	for i, u := range us {
		s := 0.0
		for j, v := range us {
			z := (u - v) * (u + v)
			k := 1.0
			if z != 0 {
				k = math.Sin(z) / z
			}
			s += (u + v) * k * phi[j]
		}
		num -= phi[i] * s / math.Pi
	}
	return num / den
}

// A small witness: the proved quotient encloses an independent float
// quadrature of the same coefficients (to float accuracy), and it lies below
// the published estimates of c_bm.
func TestSmallWitnessIndependentFloat(t *testing.T) {
	o := Options{MinWidth: 0.05, MaxWidth: 10, Ratio: 2, MaxPower: 1, GramTol: 1e-13, Digits: 8}
	r, err := Run(o)
	if err != nil {
		t.Fatal(err)
	}
	q := floatQuotient(r.Basis, r.Coef, 28)
	lo, hi := r.Proof.Quotient.Lo(), r.Proof.Quotient.Hi()
	if q < lo-1e-9 || q > hi+1e-9 {
		t.Errorf("float quadrature %.12f outside the proved [%.12f, %.12f]", q, lo, hi)
	}
	// 0.0384517: Bracken and Melloy (1994), Penz et al. (2006).
	if hi > 0.0384517 || lo < 0.030 {
		t.Errorf("proved quotient [%v, %v] is implausible", lo, hi)
	}
	t.Logf("proved [%.12f, %.12f], float %.12f, %d functions", lo, hi, q, len(r.Basis))
}
