// Package witness re-checks halfline-witness certificates: it recomputes
// the Rayleigh quotient of the recorded state for the backflow kernel
// K(u, v) = -sin(u^2 - v^2)/(pi (u - v)) on (0, inf) and accepts the claim
// c_bm >= bound only if the bound lies at or below the recomputed lower end.
//
// Route (deliberately different from the certifier's). With
// F_k(z) = int_0^inf phi(u) u^k exp(-i z u^2) du (k = 0, 1; for a real state
// F_k(-t) = conj F_k(t) on the real line),
//
//	<phi, K phi> = -(1/2pi) int_{-1}^{1} [F_1(-t) F_0(t) + F_0(-t) F_1(t)] dt,
//
// which follows from sin(u^2 - v^2)/(u - v) = (u + v)/2 int_{-1}^{1}
// exp(i t (u^2 - v^2)) dt and Fubini. For a basis function
// u^m exp(-b u^2) chi(u^2) the function F_k is a closed form: with
// M(n, c) = Gamma((n+1)/2)/(2 c^((n+1)/2)),
// plain: M(m+k, b + i z); cos: (M(m+k, b + i(z-1)) + M(m+k, b + i(z+1)))/2;
// sin: (M(m+k, b + i(z-1)) - M(m+k, b + i(z+1)))/(2i). Powers c^(-1/2) are
// evaluated by the half-angle formulas in plain interval arithmetic, not by
// the certifier's corner-wise complex square root. The t-integral is split into panels graded by the
// ratio 3 towards -1, 0 and 1 (where the branch points t = -omega +- i b
// of the closed forms accumulate), each panel is integrated by
// Clenshaw-Curtis with its own remainder bound on a Bernstein ellipse
// (the integrand's modulus bounded on 40 boxes covering the whole ellipse),
// and the norm <phi, phi> is summed pairwise by product-to-sum formulas
// (cos^2 = (1 + cos 2x)/2, ...), not by the certifier's term expansion.
package witness
