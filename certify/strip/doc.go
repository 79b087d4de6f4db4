// Package strip certifies two-sided enclosures of both spectral edges of the
// finite-strip operator K_alpha on L^2[-1, 0],
//
//	K_alpha(x, y) = (exp(-i alpha (x^2 - y^2)/2) - 1) / (2 pi i (x - y)),
//
// whose lowest spectral point gives the projectile advantage
// A(alpha) = -lambda_min and whose highest gives the deficit lambda_max.
//
// Method. Multiplication by exp(i alpha x^2/4) is unitary and conjugates
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
//
// The sections below derive each step (conventions as in the package doc
// of wedgebound/regions: hbar = 1, Weyl quantization, Wigner function).
//
// # The operator
//
// After translating the apex to the origin and the symplectic scaling
// x -> x/L, p -> p L, a particle confined to a segment of length L becomes a
// state psi supported in [-1, 0], and the region counted by the advantage is
// the wedge W = {x < 0, 0 < p < -alpha x}, alpha = m L^2/(hbar t). For such
// psi, <psi, Op(chi_W) psi> = int int conj psi(x) K(x, y) psi(y) dx dy with
// the Weyl kernel at X = (x + y)/2 < 0:
//
//	K(x, y) = (1/2pi) int_0^{-alpha X} e^{ip(x - y)} dp
//	        = (e^{-i alpha X (x - y)} - 1) / (2 pi i (x - y)),
//
// and X (x - y) = (x^2 - y^2)/2 gives K_alpha. Its diagonal is the limit
// y -> x, K_alpha(x, x) = -alpha x/(2 pi) >= 0 on [-1, 0].
//
// Real symmetric form. With z = alpha (x^2 - y^2)/4,
// e^{iz} (e^{-2iz} - 1) = -2i sin z, so
//
//	e^{i alpha x^2/4} K_alpha(x, y) e^{-i alpha y^2/4} = -sin(z)/(pi (x - y)) = k(x, y),
//
// the kernel of U K_alpha U^-1 with U the unitary multiplication by
// e^{i alpha x^2/4}. k is real, symmetric, entire in (x, y), hence
// Hilbert-Schmidt on L^2[-1, 0]: compact, with 0 in its spectrum (the space
// is infinite-dimensional), so lambda_min <= 0 <= lambda_max.
//
// Scaling and the half-plane. The squeeze x -> l x, p -> p/l maps the
// strip [-1, 0] to [-l, 0] and W to {x < 0, 0 < p < -(alpha/l^2) x}. With
// l = sqrt(alpha/beta), K_alpha is unitarily equivalent to the wedge of
// fixed slope beta on the strip [-sqrt(alpha/beta), 0]: a larger alpha is a
// longer strip for one fixed wedge. The strip states are nested, so
// A(alpha) = -inf <psi, Op(chi_W) psi> is non-decreasing in alpha. Every strip state has its Wigner function in the
// half-plane {x < 0}, and that half-plane problem with the wedge W is
// equivalent to the backflow problem (normal form {x + p > 0}, see
// regions), so A(alpha) <= c_bm for every alpha: a certified lower bound of
// A(alpha) is a certified lower bound of the backflow constant c_bm.
//
// # The Galerkin bracket
//
// P is the orthogonal projection onto polynomials of degree < N on [-1, 0]
// (orthonormal basis q_j) and G_jk = <q_j, k q_k> its Galerkin matrix. P k P
// has spectrum spec(G) together with 0.
//
// Inner sides. For a unit vector c, v = sum c_j q_j lies in ran P and
// <v, k v> = c^T G c, so lambda_min(k) <= c^T G c <= lambda_max(k) for the
// float eigenvectors c of the midpoint matrix (variational principle; no
// truncation term). The Rayleigh quotient is enclosed with the entry
// enclosures and the entry quadrature remainders. Because
// lambda_min <= 0 <= lambda_max, the inner sides are clipped at 0.
//
// Outer sides. Weyl's inequality: for bounded self-adjoint X and Y,
// |inf spec X - inf spec Y| <= ||X - Y|| and likewise for sup spec
// (both are extremes of the numerical range; from memory, common practice).
// It is applied three times:
//
//   - G against the float midpoint Hc of its enclosure: ||G - Hc||_2 <=
//     ||G - Hc||_F <= (Frobenius norm of the entry radii) + (Frobenius norm
//     of the Gauss remainders).
//   - P k P against k: ||k - P k P|| <= ||k - k_N||_HS (below).
//   - k at alpha against k at the float alpha_used: |dk/dalpha| =
//     |cos(z) (x + y)|/(4 pi) <= 1/(2 pi) on [-1, 0]^2, whose area is 1, so
//     ||k_alpha - k_alpha_used|| <= |alpha - alpha_used|/(2 pi).
//
// lambda_min(Hc) >= sigma - r is proved by a float Cholesky factor R of
// Hc - sigma I: the residual E = R^T R - (Hc - sigma I) is enclosed in
// interval arithmetic, and Hc - sigma I = R^T R - E >= -||E||_2 I >=
// -||E||_F I; sigma' I - Hc likewise for lambda_max (psdShift). So
//
//	lambda_min(k) >= min(sigma - r - e_G, 0) - ||k - P k P|| - e_alpha,
//
// and symmetrically for lambda_max.
//
// # Discarded part
//
// Let k_N be the double Chebyshev series of k(x(s), y(t)), x = (s - 1)/2,
// y = (t - 1)/2, truncated to degrees < N in s and in t. It has degree < N
// in x and in y, so P k_N P = k_N, and with E = k - k_N,
// k - P k P = E - P E P. The map X -> P X P is an orthogonal projection in
// the Hilbert-Schmidt inner product, so ||E - P E P||_HS <= ||E||_HS, and
// ||E||_HS <= sup |E| on the unit-area square. If |k| <= M on
// E_rho1 x E_rho2 (Bernstein ellipses, foci -1 and 1, rho = e^eta, semi-axes
// cosh eta and sinh eta), the one-variable coefficient bound |c_j| <= 2 M
// rho^-j (L. N. Trefethen, Approximation Theory and Approximation Practice,
// 2013, Thm 8.1) in each variable gives |c_jk| <= 4 M rho1^-j rho2^-k, and
// summing over {j >= N} and (by the symmetry k(x, y) = k(y, x)) over
// {k >= N}:
//
//	||k - P k P|| <= 8 M rho1^-N / ((1 - 1/rho1)(1 - 1/rho2))   (tailBound).
//
// Bound on |k| on ellipses (bounds.go): sinc z = int_0^1 cos(zt) dt and
// |cos w| <= cosh(Im w) give |sinc z| <= sinh(|Im z|)/|Im z|; on the
// boundary point s = a cos t + i b sin t, |x| <= (a + 1)/2 and
// |Im x^2| = (b/2)|a cos t - 1||sin t|, maximised in closed form; by the
// maximum principle in each variable the bound on the product of boundaries
// holds on the product of ellipses.
//
// # Entry quadrature
//
// The n-point Gauss-Legendre error for f analytic in E_rho with |f| <= M is
// at most 4 M (1 + 1/(4n^2 - 1)) rho^-2n/(1 - rho^-2): expand f in Chebyshev
// polynomials (|c_m| <= 2 M rho^-m), the rule is exact to degree 2n - 1, odd
// T_m integrate to 0 under both integral and symmetric rule, and for even m
// the error on T_m is at most 2 + 2/(m^2 - 1) (weights positive, summing
// to 2). For the double integral, II - QQ = (I - Q) I + Q (I - Q) with
// |q_j| <= sqrt(2j+1) rho^j on E_rho (|P_j| <= rho^j by Laplace's integral
// P_j(z) = (1/pi) int_0^pi (z + sqrt(z^2 - 1) cos phi)^j dphi) and
// |q_j| <= sqrt(2j+1) on the segment; with the Jacobian 1/4 the entry error
// is at most C sqrt((2j+1)(2k+1)) (rho^j + rho^k),
// C = 2 (1 + 1/(4n^2 - 1)) rho^-2n M/(1 - rho^-2) (quadLogC). The nodes are
// proved by sign changes of P_n and the weights enclosed from
// w = 2 (1 - x^2)/(n P_{n-1}(x))^2 (gauss.go).
//
// # Check values
//
// Double-precision Nystrom values (Gauss-Legendre with 200 to 900 nodes on
// the real kernel, eigenvalues by a dense symmetric solver; seen here, not a
// published source), to 7 decimals:
//
//	A(1) = 0.0060131,  A(10) = 0.0206990,  A(50) = 0.0294572 (0.02945719),
//	A(200) = 0.0337734,  A(800) = 0.0360924,  lambda_max(K_1) = 0.0855621.
//
// A(50) is a 7-decimal rounding: the certified bracket
// [0.0294571884, 0.0294571941] lies below the decimal 0.0294572, so tests
// check that the bracket rounds to it rather than contains it.
package strip
