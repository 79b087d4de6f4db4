package matched

import (
	"math"
	"math/cmplx"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/mat"
)

// nystromTop returns the largest eigenvalue of the symmetrised Nystrom
// matrix of S_v written with the complex kernel
// -K_alpha(x - v, y - v) = (1 - e^{-i alpha ((x-v)^2 - (y-v)^2)/2})/(2 pi i (x - y))
// (diagonal alpha (x - v)/(2 pi)) minus 1[x > v], with m Gauss-Legendre
// nodes on each side of v. The Hermitian matrix is embedded as a real
// symmetric one of twice the size (eigenvalues doubled in multiplicity).
func nystromTop(alpha, v float64, m int) float64 {
	var xs, ws []float64
	for _, iv := range [][2]float64{{-1, v}, {v, 0}} {
		x, w := make([]float64, m), make([]float64, m)
		quad.Legendre{}.FixedLocations(x, w, iv[0], iv[1])
		xs, ws = append(xs, x...), append(ws, w...)
	}
	n := len(xs)
	S := mat.NewSymDense(2*n, nil)
	for i := 0; i < n; i++ {
		for k := i; k < n; k++ {
			var K complex128
			a, b := xs[i]-v, xs[k]-v
			if i == k {
				K = complex(alpha*a/(2*math.Pi), 0)
				if xs[i] > v {
					K -= 1 / complex(ws[i], 0)
				}
			} else {
				K = (1 - cmplx.Exp(complex(0, -alpha*(a*a-b*b)/2))) / complex(0, 2*math.Pi*(xs[i]-xs[k]))
			}
			h := K * complex(math.Sqrt(ws[i]*ws[k]), 0)
			S.SetSym(i, k, real(h))
			S.SetSym(n+i, n+k, real(h))
			S.SetSym(i, n+k, -imag(h))
			if i != k {
				S.SetSym(k, n+i, imag(h))
			}
		}
	}
	var es mat.EigenSym
	es.Factorize(S, false)
	vals := es.Values(nil)
	return vals[len(vals)-1]
}
