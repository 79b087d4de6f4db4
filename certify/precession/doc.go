// Package precession certifies a two-sided bracket on the three-time
// precession constant
//
//	P3 = sup spec Q3,  Q3 = (1/3) sum_{k=0,1,2} Theta(x_k),
//	x_k = x cos(2 pi k/3) + p sin(2 pi k/3)   (hbar = m = omega = 1):
//
// the best probability of finding a harmonic oscillator at x > 0 when its
// position is read at one of three times a third of a period apart, chosen
// uniformly. Classically it is 2/3 (x_0 + x_1 + x_2 = 0, so at most two of
// the three are positive).
//
// # Reduction to one matrix
//
// x_k = U_k^* x U_k with U_k = exp(i theta_k N), theta_k = 2 pi k/3, N the
// number operator, so <m|Theta(x_k)|n> = exp(i (n-m) theta_k) <m|Theta(x)|n>
// and the average over k keeps exactly the entries with m - n divisible by
// 3. With Theta = (1 + sgn)/2 and sgn x odd (its entries vanish unless
// m + n is odd), Q3 = 1/2 + S/2 where S has the entries <m|sgn x|n> with
// m - n = 3 mod 6. S commutes with N mod 3: it splits into three residue
// classes r, and in each class it maps even states to odd ones. So
// sup spec S on class r is ||B_r||, B_r the block from odd to even states,
// and P3 = 1/2 + max_r ||B_r||/2.
//
// # Matrix elements
//
// The Hermite functions obey h_n” = (x^2 - 2n - 1) h_n, so the Wronskian
// W = h_m h_n' - h_n h_m' has W' = 2(m-n) h_m h_n, and for m = 2j even,
// n = 2k+1 odd (h_n(0) = 0, h_m'(0) = 0, W(inf) = 0)
//
//	<2j|sgn x|2k+1> = 2 int_0^inf h_m h_n = h_m(0) h_n'(0)/(n - m).
//
// With h_{2j}(0) = pi^{-1/4} (-1)^j alpha_j, alpha_j^2 = binom(2j,j)/4^j,
// and h_{2k+1}'(0) = sqrt(2(2k+1)) h_{2k}(0) (from the ladder relations at
// x = 0):
//
//	<2j|sgn x|2k+1> = (-1)^(j+k) sqrt(2/pi) alpha_j beta_k/(2k+1-2j),
//	beta_k = sqrt(2k+1) alpha_k.
//
// alpha_j^2 is enclosed by the exact ratio (2j-1)/(2j). Wallis bounds
// (used for tails): alpha_j^2 sqrt(j+1/2) decreases and alpha_j^2 sqrt(j+1/4)
// increases in j (the squared ratios of consecutive terms are
// (4j^2-1)/(4j^2) < 1 and (16j^3-12j^2+1)/(16j^3-12j^2) > 1), both tending
// to 1/sqrt(pi), so 1/sqrt(pi(j+1/2)) <= alpha_j^2 <= 1/sqrt(pi(j+1/4)).
//
// # The factorisation
//
// Residue r has even states |2j>, j = 3a+J0, and odd states |2k+1>,
// k = 3b+K0, with (J0, K0, P) = (0,1,0), (2,0,1), (1,2,0) for r = 0, 1, 2.
// Then 2k+1-2j = 3(2b+1-2(a+P)), and so, exactly,
//
//	B_ab = -(1/3) F_a M_{a+P,b} G_b,
//	M_ab = <2a|sgn x|2b+1>,  F_a = 3^{1/4} alpha_j/alpha_{a+P},
//	G_b = 3^{-1/4} beta_k/beta_b.
//
// M is the matrix of sgn x from odd to even functions, a unitary map (sgn x
// is a unitary involution exchanging parities): its rows and columns are
// orthonormal. F_a, G_b -> 1 like 1 + O(1/a): at large Fock numbers B_r is a
// third of a unitary, which is why the top of the spectrum is approached
// only by states spread over all Fock numbers.
//
// # Norm lemma (upper bound)
//
// Let A >= 1, eps >= max(0, sup_{a>=A} (F_a^2 - 1)), lambda > 0 with
// c_b = lambda/G_b^2 - 1 - eps > 0 for all b, let
// H_{aa'} = sum_b M_{a+P,b} M_{a'+P,b}/c_b (a, a' < A) and
// E = diag(F_a^2 - 1 - eps)_{a<A}. If H - H E H is positive semidefinite,
// then ||B_r|| <= sqrt(lambda)/3.
//
// Proof. For y in l^2 put z = G y and w_a = (M' z)_a, M' the rows a+P of M
// (so ||M' z|| <= ||z||). With e_a = F_a^2 - 1,
//
//	9 ||B y||^2 = sum_a (1 + e_a) (M'z)_a^2
//	            <= (1 + eps) ||M'z||^2 + sum_{a<A} (e_a - eps) w_a^2
//	            <= (1 + eps) ||z||^2 + <w, E w>,
//
// using e_a <= eps for a >= A and sum_{a>=A} (M'z)_a^2 = ||M'z||^2 -
// sum_{a<A} w_a^2. We need this <= lambda ||y||^2 = lambda sum z_b^2/G_b^2,
// i.e. <w, E w> <= <z, C z>, C = diag(c_b). H = P M' C^{-1} M'^T P^T is
// positive definite (H >= I/sup c_b as the rows of M' are orthonormal),
// and for P M' z = w Cauchy-Schwarz gives <w, H^{-1} w> <= <z, C z>. So it
// suffices that E <= H^{-1}, which (w = H v) is H - H E H >= 0. QED.
//
// In computation H = I/c_inf + sum_b M M (1/c_b - 1/c_inf), c_inf =
// lambda - 1 - eps (orthonormal rows), summed exactly for b < L; the rest
// is bounded by lambda eta/(c_min c_inf) sum_{b>=L} |M_{ib} M_{i'b}| with
// eta >= sup_{b>=L} |1/G_b^2 - 1|, c_min <= inf c_b, and
// |M_{ib} M_{i'b}| <= (2/pi) alpha_i alpha_i'/(theta theta' 2 sqrt(pi)
// (b+1/4)^{3/2}), theta = 1 - 2i/(2L+1), whose sum over b >= L is at most
// (2/pi) alpha_i alpha_i'/(theta theta' sqrt(pi) sqrt(L-3/4)). For b >= L,
// G_b^2 lies in (rho/sqrt3) sqrt(hull(r1, r2)) with rho = (6b+2K0+1)/(2b+1)
// and r1 = (b+1/4)/(3b+K0+1/2), r2 = (b+1/2)/(3b+K0+1/4) from the Wallis
// bounds, each monotone in b, so their ranges over b >= L are the hulls of
// the values at L and the limits 3 and 1/3; likewise
// F_a^2 <= sqrt((3a+3P+3/2)/(3a+J0+1/4)) for a >= L. Positivity of the
// interval matrix H - H E H is proved by a float Cholesky factor R of its
// midpoint minus s I and the bound lambda_min >= s - ||K - s I - R^T R||_inf.
// lambda is found by bisection in float64 and then proved.
//
// # Witness (lower bound)
//
// At the bisection's lambda, the eigenvector v of the smallest eigenvalue
// of H - H E H gives the extremal vector of the lemma's relaxation:
// y_b = (sum_a M_{a+P,b} v_a)/(c_b G_b). Truncated to b < n and rounded to
// integers, it is the odd half of the witness; the even half is B y
// rounded. Its Rayleigh quotient 1/2 + <x, B y>/(|x|^2 + |y|^2) is enclosed
// with B y computed in float64 by the Toeplitz form
// (B y)_a = -(-1)^(J0+K0+a) alpha_j/3 sum_b m_b/(2(b-a-P)+1) and the a
// priori dot-product error bound (gamma_n + 3u) sum |m_b/(2d+1)|. The
// truncation costs about n^{-1/2} (the extremal vector decays like
// b^{-3/4}), so the lower bound converges more slowly than the upper one.
package precession
