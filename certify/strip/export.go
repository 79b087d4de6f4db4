package strip

import "wedgebound/interval"

// This file exposes the strip machinery that other certifiers reuse (the
// matched advantage builds piecewise Galerkin matrices from the same
// verified Gauss-Legendre rules and eigenvalue proofs).

// GaussRule returns the verified n-point Gauss-Legendre rule on [-1, 1]:
// node enclosures (B intervals of width 2^-99, each holding exactly one
// root of P_n, decreasing), weight enclosures, and V[a][j], enclosures of
// sqrt(2j+1) P_j(s_a) at the exact nodes for j < N.
func GaussRule(n, N, workers int) (nodes []interval.B, weights []interval.F, V [][]interval.F, err error) {
	r, err := getRule(n, workers)
	if err != nil {
		return nil, nil, nil, err
	}
	return r.node, r.weight, r.legendreValues(N, workers), nil
}

// Midpoints returns the float midpoint matrix (row-major) of the
// symmetric interval matrix H and an enclosure of a bound on the Frobenius
// distance of every matrix inside H to it.
func Midpoints(H [][]interval.F) ([]float64, interval.F) { return midpoints(H) }

// FloatEigen returns the eigenvalues (ascending) and eigenvectors (QT[i]
// is the i-th) of the symmetric row-major float matrix Hc: a candidate
// only.
func FloatEigen(Hc []float64, N int) ([]float64, [][]float64, error) { return floatEigen(Hc, N) }

// ProveAbove proves lambda_max(Hc) <= sigma + res (sign -1) or
// lambda_min(Hc) >= sigma - res (sign +1) by a float Cholesky factor of
// sign (Hc - sigma I) with an interval-enclosed residual; est is the float
// estimate of that eigenvalue and scale the matrix's size.
func ProveAbove(Hc []float64, N int, est, sign, scale float64, workers int) (sigma float64, res interval.F, err error) {
	return psdShift(Hc, N, est, sign, scale, workers)
}

// SincF encloses sin(z)/z for a real interval z (Taylor polynomial plus
// Lagrange remainder; accurate for |z| < 1).
func SincF(z interval.F) interval.F { return sincF(z) }

// ToF rounds a B enclosure outward to float64 endpoints.
func ToF(b interval.B) interval.F { return toF(b) }
