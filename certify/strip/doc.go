// Package strip certifies two-sided enclosures of both spectral edges of the
// finite-strip operator K_alpha on L^2[-1, 0],
//
//	K_alpha(x, y) = (exp(-i alpha (x^2 - y^2)/2) - 1) / (2 pi i (x - y)),
//
// whose lowest spectral point gives the projectile advantage
// A(alpha) = -lambda_min and whose highest gives the deficit lambda_max.
//
// Method. Multiplication by exp(-i alpha x^2/4) is unitary and conjugates
// K_alpha to the real symmetric kernel
//
//	k(x, y) = -sin(alpha (x^2 - y^2)/4) / (pi (x - y))
//	        = -(alpha (x + y)/(4 pi)) sinc(alpha (x^2 - y^2)/4),
//
// an entire function, so both operators have the same spectrum. The
// Galerkin matrix G of k in the orthonormal Legendre basis
// q_j(x) = sqrt(2j+1) P_j(2x+1), j < N, is enclosed by a verified
// Gauss-Legendre rule plus a Bernstein-ellipse bound on its remainder. The
// float eigenvectors of the midpoint matrix give the witnesses: their
// Rayleigh quotients, evaluated in interval arithmetic, are the inner side
// of each bracket (variational principle, no truncation term). The outer
// side proves Hc - sigma I (and sigma' I - Hc) positive semidefinite up to
// the interval-enclosed residual of a float Cholesky factorisation of the
// midpoint matrix Hc, then applies Weyl for the entry enclosure and Weyl
// again for the discarded part ||k - P k P|| <= ||k - k_N||_HS,
// where k_N is the truncated double Chebyshev series whose coefficients are
// bounded from the maximum of |k| on a product of Bernstein ellipses.
package strip
