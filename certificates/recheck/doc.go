// Package recheck is the core of the independent verifier: the options,
// the kind-neutral result and failure records, the hash check, and the
// dispatch of a certificate to the checker registered for its kind.
//
// Each certificate kind has its own package under this one
// (recheck/relaxation, recheck/strip, ...) that implements Checker and
// calls Register from its init function; a program verifies the kinds
// whose packages it imports (cmd/wedgecheck imports every kind, one line
// each). Numerics more than one kind may use live in recheck/checknum.
//
// Trusted base. The core, checknum and every kind package import only the
// Go standard library, wedgebound/interval and wedgebound/certificates
// (and each other's core), never the certifier's packages
// (wedgebound/regions, wedgebound/certify) and never another kind;
// TestTrustedBase enforces this per kind with go list -deps.
//
// # Independent routes
//
// The verifier proves each claim again without the certifier's numerical
// code. The mathematics it relies on is the same (derived in the package
// docs of wedgebound/regions and wedgebound/certify/strip); the routes it
// takes differ where a shared route could hide a shared mistake. Per kind:
//
// Relaxation (recheck/relaxation; the certifier is regions and
// certify/relaxation):
//
//   - Normal form and threshold: recomputed from the problem in exact
//     rationals by code of its own (same formulas: S = diag(m, 1)[r1 r2]^-1,
//     u0 = d^2/(4ab)), then compared entry by entry with the record.
//   - Exponential terms, off-diagonal integral I(s) = int_0^1 r^{a-1}/(1 - q r) dr:
//     Clenshaw-Curtis panels on rays turned by -+pi/3 (the certifier uses
//     Gauss-Legendre on rays turned by -+pi/4), its own Bernstein-ellipse
//     remainder for Clenshaw-Curtis (checknum.Rule.Bound, derived by
//     aliasing), and beyond the cut the geometric series of 1/(1 - q e^{-t})
//     summed with a bounded remainder (the certifier bounds the cut-off
//     piece only).
//   - Band and step terms, edge integrals E(c, s) (c > 0): Clenshaw-Curtis
//     on the tau-form, on paths turned to tau = 1 + i e^x (s >= -1) or down
//     to 1 - i L and along the diagonal through the stationary point
//     sqrt(1 + |s|/c) (s < -1) (the certifier uses Gauss-Legendre in
//     t = -log r on saddle paths chosen per window); diagonal entries on the
//     real v-line or the line moved to Im v = -+0.6, with the profile's
//     transform through (e^z - 1)/z (the certifier: psi-series per linear
//     piece on its own paths); tail lemmas of its own (path bounds and a
//     moved line; the certifier uses van der Corput's lemma).
//   - Cells: the recorded cover, split at the verifier's own regime
//     boundaries and bisected when undecided; on each piece the mean-value
//     form (the entries over the piece from their midpoint values and
//     derivative enclosures) intersected with the direct enclosure, and a
//     big-float retry when float64 intervals cannot decide.
//   - Tails: |J(s)| <= pi/(4|a|) and |B_exp| <= C(k)/|a| with
//     |a| = sqrt(1/4 + s^2) >= sqrt(1/4 + S^2), then monotonicity of
//     lambda_min,max in A, D and |B| (the certifier encloses the tail matrix
//     in interval arithmetic with 1/(8S)).
//   - Quadrant function J(s) = sum_n (-1)^n/(n + 1/2 + is) and J'(s):
//     Boole's summation formula for the alternating series (Euler
//     polynomials, exact tangent numbers, its own remainder bound), after
//     a shift by pairs of terms, in a centred form over each cell
//     (recheck/relaxation/quadj.go); the certifier uses the digamma and
//     trigamma closed forms (Stirling series with Bernoulli numbers in
//     package interval). The two share only the definition of J.
//   - Not independent, stated plainly: A(s) = (1 + tanh(pi s))/2 and the
//     closed form of the exponential term's diagonal entry
//     M_{++}(s) = e^{2 theta s}/(|k + 2i| cosh(pi s)) are the same
//     formulas typed again; they rest on the shared trusted package
//     interval (exp, tanh, atan).
//
// Strip brackets (recheck/strip; the certifier is certify/strip):
//
//   - Quadrature: the (n + 1)-point Clenshaw-Curtis rule with even
//     n >= 2N - 2 (exact for the products q_j q_k, so the basis matrix U has
//     orthonormal columns), instead of Gauss-Legendre; its own entry and
//     witness remainder bounds.
//   - Kernel maximum on products of Bernstein ellipses: a branch and bound
//     over the boundary parametrisation in interval arithmetic, instead of
//     the certifier's closed-form maximisation.
//   - Discarded part: its own Chebyshev-coefficient bound
//     ||k - P k P|| <= 4 M rho1^-N (rho2 + 1)/((1 - 1/rho1)(rho2 - 1)).
//   - Galerkin matrix and eigenvalue proofs: float matrices with exact dot
//     products (TwoSum and FMA error-free transformations) and its own
//     Cholesky residual proofs, instead of interval matrix products.
//   - alpha: re-derived from its exact value or from the physical units
//     with its own constants.
//   - Not independent: the Legendre values come from the same three-term
//     recurrence j P_j = (2j - 1) s P_{j-1} - (j - 1) P_{j-2}, typed twice
//     (the certifier in certify/strip, the verifier once for the strip and
//     matched kinds in checknum.Legendre) and evaluated in interval
//     arithmetic at the verifier's own nodes; Weyl's inequality,
//     the variational principle and 0 in the spectrum of a compact operator
//     are the same mathematics.
//
// Flight (recheck/flight; the certifier is certify/flight): the reduction
// is recomputed by composing the stage maps as affine phase-space maps in
// exact rationals (the certifier sums time-over-mass and kick shifts in
// closed form), every recorded number compared exactly; the embedded strip
// section goes through the strip checker via the registry.
//
// Matched (recheck/matched; the certifier is certify/matched):
//
//   - Galerkin entries of each cell's operator C_lo - 1[x > hi] in the split
//     basis: Clenshaw-Curtis (checknum) instead of Gauss-Legendre, with the
//     rule's own remainder bound in each variable.
//   - Eigenvalue proofs: its own float Cholesky factor and interval
//     residual (the certifier uses gonum's factorisation).
//   - Not independent: the kernel bound on Bernstein ellipses and the
//     discarded-part lemma are the same mathematics, coded anew; the
//     monotonicity of the cells and the reduction to S_v are taken from
//     certify/matched/doc.go.
//
// Precession (recheck/precession; the certifier is certify/precession): the
// matrix elements of sgn x rebuilt from log-gamma checkpoints and exact
// ratios, the witness's Rayleigh quotient by columns with a running error
// bound, and the norm lemma of each residue class re-proved with its own
// tail bounds and an interval Cholesky factorisation. Not independent: the
// closed form of the matrix elements (derived in certify/precession/doc.go).
package recheck
