package checknum

import (
	"math"
	"testing"

	"wedgebound/interval"
)

// Simpson's rule is the 3-point Clenshaw-Curtis rule: weights 1/3, 4/3,
// 1/3 on the nodes 1, 0, -1 (classical; e.g. any numerical analysis text).
func TestClenshawCurtisSimpson(t *testing.T) {
	r, err := ClenshawCurtis(interval.F{}, 2)
	if err != nil {
		t.Fatal(err)
	}
	want := []interval.F{interval.F{}.Frac(1, 3), interval.F{}.Frac(4, 3), interval.F{}.Frac(1, 3)}
	for j := range want {
		if r.W[j].Less(want[j]) || want[j].Less(r.W[j]) || r.W[j].Rad() > 1e-14 {
			t.Errorf("w[%d] = %v, want 1/3, 4/3, 1/3", j, r.W[j])
		}
	}
	if !r.X[0].Contains(interval.F{}.Int(1)) || !r.X[2].Contains(interval.F{}.Int(-1)) || !r.X[1].Contains(interval.F{}.Int(0)) {
		t.Errorf("nodes %v", r.X)
	}
}

// Exactness for Chebyshev polynomials: int_{-1}^{1} T_k = 2/(1 - k^2) for
// even k and 0 for odd k (classical identity), for k <= n; and the rule
// must reproduce it for every n used.
func TestClenshawCurtisExact(t *testing.T) {
	// The sizes the relaxation verifier uses.
	ccSizes := []int{6, 8, 12, 16, 20, 24, 32, 40, 48, 64, 80, 96, 128}
	for _, n := range ccSizes {
		checkExact(t, interval.F{}, n)
		if n <= 24 {
			checkExact(t, interval.NewB(0, 200), n)
		}
	}
}

func checkExact[T interval.Real[T]](t *testing.T, like T, n int) {
	r, err := ClenshawCurtis(like, n)
	if err != nil {
		t.Fatal(err)
	}
	for k := 0; k <= n; k++ {
		sum := like.Int(0)
		for j := range r.X {
			// T_k(x_j) = cos(k j pi/n) (the definition of T_k on the node).
			tk := interval.Cos(like.Pi().Mul(like.Frac(int64((k*j)%(2*n)), int64(n))))
			sum = sum.Add(r.W[j].Mul(tk))
		}
		want := like.Int(0)
		if k%2 == 0 {
			want = like.Frac(2, int64(1-k*k))
		}
		if !sum.Contains(want) {
			t.Errorf("prec %d n=%d k=%d: rule gives %v, exact %v", like.Prec(), n, k, sum, want)
		}
		if sum.Rad() > 1e-8 {
			t.Errorf("prec %d n=%d k=%d: enclosure too wide %v", like.Prec(), n, k, sum)
		}
	}
	if r.WAbs.Hi() > 2+1e-9 || r.WAbs.Lo() < 2-1e-9 {
		t.Errorf("n=%d: sum |w| = %v; the weights are positive and sum to 2", n, r.WAbs)
	}
}

// The remainder bound must hold, and be of the right size, for
// f(x) = 1/(2 - x) (int = ln 3; analytic except at x = 2, so in every E_rho
// with (rho + 1/rho)/2 < 2, where |f| <= 1/(2 - (rho + 1/rho)/2)) and for
// f(x) = e^x (int = e - 1/e; |f| <= e^{(rho + 1/rho)/2} on E_rho).
func TestClenshawCurtisBound(t *testing.T) {
	like := interval.NewB(0, 300)
	for _, n := range []int{6, 12, 24, 48} {
		r, _ := ClenshawCurtis(like, n)
		for _, tc := range []struct {
			name  string
			f     func(x interval.B) interval.B
			exact interval.B
			m     func(rho float64) interval.B
			rhos  []float64
		}{
			{"1/(2-x)", func(x interval.B) interval.B { return like.Int(1).Quo(like.Int(2).Sub(x)) },
				interval.Log(like.Int(3)),
				func(rho float64) interval.B {
					a := like.Float(rho).Add(like.Int(1).Quo(like.Float(rho))).Scale(-1)
					return interval.Upper(like.Int(1).Quo(like.Int(2).Sub(a)))
				}, []float64{1.5, 2.5, 3.5}},
			{"exp", func(x interval.B) interval.B { return interval.Exp(x) },
				interval.Exp(like.Int(1)).Sub(interval.Exp(like.Int(-1))),
				func(rho float64) interval.B {
					a := like.Float(rho).Add(like.Int(1).Quo(like.Float(rho))).Scale(-1)
					return interval.Upper(interval.Exp(a))
				}, []float64{2, 5, 10}},
		} {
			sum := like.Int(0)
			for j := range r.X {
				sum = sum.Add(r.W[j].Mul(tc.f(r.X[j])))
			}
			errAbs := sum.Sub(tc.exact).Abs()
			for _, rho := range tc.rhos {
				b := r.Bound(tc.m(rho), like.Float(rho))
				if b.Less(errAbs) {
					t.Errorf("%s n=%d rho=%g: error %v exceeds the bound %v", tc.name, n, rho, errAbs, b)
				}
			}
			if errAbs.Hi() > 1e-3*math.Pow(2, -float64(n)/2) && tc.name == "exp" {
				t.Errorf("%s n=%d: error %v unexpectedly large", tc.name, n, errAbs)
			}
		}
	}
}
