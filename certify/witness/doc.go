// Package witness proves lower bounds on the backflow constant c_bm from an
// explicit positive-momentum state (a witness) on the whole half-line.
//
// # The quadratic form
//
// Units hbar = m = 1. A state with momentum amplitude phi(k), k > 0, has
// at x = 0 the wave function psi(0, t) = (2 pi)^(-1/2) int phi(k)
// exp(-i k^2 t/2) dk and the flux j(t) = Re(conj(psi) (-i d/dx) psi). The
// probability that flows backwards (to x < 0) during [-T/2, T/2] is
// -int j dt. Inserting the Fourier integrals and doing the t-integral gives
// int j dt = (1/pi) int int conj(phi(k')) phi(k) sin((k'^2 - k^2) T/4)/(k' - k)
// dk dk'; in
// the scaled momentum u = k sqrt(T/4) (phi rescaled to stay normalised) the
// backflow is <phi, K phi> with
//
//	K(u, v) = -sin(u^2 - v^2) / (pi (u - v)),
//
// and c_bm = sup <phi, K phi>/<phi, phi> over phi in L^2(0, inf), so every
// state gives a lower bound. Check of sign and scaling: restricted to
// [0, sqrt(alpha)/2] and mapped by x = -2u/sqrt(alpha), K becomes minus the
// real strip kernel -sin(alpha (x^2 - y^2)/4)/(pi (x - y)) of package
// certify/strip, so the strip advantage A(alpha) = -lambda_min is the top of
// the spectrum of K on that interval, A(alpha) <= c_bm; and the float
// optimum of this package approaches the published estimates 0.03845...
//
// # Time representation
//
// From sin(u^2 - v^2)/(u - v) = (u + v)/2 int_{-1}^{1} exp(i t (u^2 - v^2)) dt
// and Fubini,
//
//	<phi, K phi> = -(1/2pi) int_{-1}^{1} [G_1(t) F_0(t) + G_0(t) F_1(t)] dt,
//
// F_k(t) = int_0^inf phi(v) v^k exp(-i t v^2) dv, G_k(t) = conj F_k(t) on the
// real line (continued analytically off it as
// int conj(phi(u)) u^k exp(i t u^2) du). For a complex Gaussian
// u^m exp(-c u^2), Re c > 0, the moments are closed forms,
//
//	int_0^inf u^n exp(-c u^2) du = Gamma((n+1)/2) / (2 c^((n+1)/2)),
//
// so F_k and G_k are finite sums of powers (c + i t)^(-(n+1)/2) and
// (conj c - i t)^(-(n+1)/2), analytic in t except at the branch points
// t = -omega + i b and t = -omega - i b for c = b + i omega. The norm
// <phi, phi> is a double sum of the same closed forms (no quadrature), and
// the t-integral is the only approximation.
//
// # The basis and why
//
// The optimiser is smooth at u = 0 (K(u, v) is entire in u, so the
// eigenfunction is too, with phi(0) != 0 in general): powers u^0 and u^1
// times Gaussians represent it there. For large u the kernel acts on
// non-oscillating functions like -delta(u - v) (the sinc concentrates on the
// diagonal with weight pi), so the eigen-equation with eigenvalue c_bm > 0
// forces the tail to oscillate with the kernel's own phases exp(+-i u^2);
// the coupling to small momenta is then of order 1/u, and a local Mellin
// analysis of the half-line Hilbert transform that remains gives envelopes
// u^(-1 -+ i gamma) with gamma = ln((1 + c_bm)/c_bm)/(2 pi) ~ 0.525. So
//
//	phi(u) ~ A cos(u^2 + gamma ln u + theta) / u,   u -> inf:
//
// square integrable, but only just, which is why truncating the momentum
// range (or the strip width) loses so much (the strip gives
// c_bm - A(alpha) ~ 0.067/sqrt(alpha)). Measured on the shipped witness:
// 2|A| ~ 0.715 and a phase slope d(phase)/d(ln u) of 0.536 between u = 40 and
// 320 (slightly above the local estimate). The basis therefore is
//
//	u^m exp(-b u^2) {1, cos(u^2), sin(u^2)},  m = 0..M,  b = b_min r^j <= b_max,
//
// with geometrically spread widths: a power envelope is a superposition of
// Gaussians, u^(-s) = Gamma(s/2)^(-1) int_0^inf beta^(s/2-1) exp(-beta u^2)
// dbeta (complex s included, which gives the log-phase), and on a
// logarithmic grid of beta the discretisation error is exponentially small
// in 1/ln r; the chirps supply exp(+-i u^2) exactly. What the basis cannot
// hold is the tail beyond u ~ 1/sqrt(b_min): the loss is then of order
// |A|^2 sqrt(b_min), measured as about 0.012 sqrt(b_min), which is what
// --min-width trades against time.
//
// # Proof
//
// A float64 search (closed-form Gram matrix, backflow matrix by
// Gauss-Legendre on the time panels, generalised eigenproblem restricted to
// the Gram eigendirections above 1e-13 of the largest, since Gaussians of
// neighbouring widths are nearly dependent) proposes coefficients; they are
// written as exact decimals. Interval arithmetic then encloses, for exactly
// those coefficients: the norm (160-bit intervals, since the pairwise sum
// cancels) and the time integral, split into panels graded by the ratio 2
// towards -1, 0 and 1 (where the branch points accumulate as b -> 0), each
// panel integrated by a verified Gauss-Legendre rule plus the remainder
// bound 2 M (2 + 2/(4n^2 - 1)) rho^(2-2n)/(rho^2 - 1) (times the half-length)
// with M a bound of |integrand| on the Bernstein ellipse E_rho of the panel
// (rho at 60% of the way to the nearest branch point, M from 48 interval
// boxes covering the upper half of the ellipse; the integrand is real on the
// real axis, so |h(conj z)| = |h(z)|). The claimed bound is the lower end of
// the enclosed quotient rounded down.
package witness
