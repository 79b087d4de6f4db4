// Package relaxation is the verifier of halfplane-relaxation certificates
// (it registers itself with wedgebound/certificates/recheck): from the problem, the
// terms and the cover recorded in a halfplane-relaxation certificate it
// recomputes everything the certificate's claim rests on, by routes of its
// own, and reports every claim that does not hold.
//
// Trusted base. Besides the Go standard library the package uses only
// wedgebound/interval (outward-rounded interval arithmetic and elementary
// functions; not its gamma family) and wedgebound/certificates (the schema,
// strict decoding and the hash). It never imports the certifier's packages
// (wedgebound/regions, wedgebound/certify); TestTrustedBase enforces this
// with go list -deps.
//
// What is recomputed, and how:
//
//   - Normal form and admissibility, exactly in rationals (Recompute,
//     Normal.Compare): the map, a, b, d and the threshold d^2/(4ab); every
//     term's profile must vanish below the threshold.
//   - The symbol M(s) = [[A, B], [conj B, D]] of the relaxation (Model): A
//     in closed form (tanh); the quadrant part of B through
//     J(s) = sum_n (-1)^n/(n + 1/2 + is), summed by Boole's formula for
//     alternating series with an explicit remainder (Euler polynomials,
//     tangent numbers; quadj.go), J'(s) likewise, over whole cells in a
//     centred form; and each term's D and B through its family
//     (termSymbol; one file per family, registered with registerFamily:
//     start of support, symbol, tail lemma, limit of D). exp (expterm.go):
//     D in closed form, the off-diagonal integral I(s) by composite
//     Clenshaw-Curtis quadrature on a ray turned by +-pi/3, with a
//     remainder bound of its own (checknum.Rule.Bound) from integrand
//     bounds on boxes covering each panel's Bernstein ellipse, and a summed
//     geometric series with a proved remainder beyond the cut. band and
//     step (band.go, step.go): the jump integrals E(c, s) on tau-paths
//     turned up (s >= -1) or down and through the stationary point of the
//     phase (s < -1), y = e^x on the vertical legs (edge.go); the diagonal
//     entry on the real v-line, moved to Im v = -+0.6 away from s = 0
//     (diag.go); both on the generic Clenshaw-Curtis path rule of
//     pathrule.go, with the parts cut off bounded explicitly; E(0, s) =
//     -(i/2pi) J(s).
//   - On every cell, an enclosure of the extreme eigenvalue over the whole
//     cell in mean-value form (Model.Piece), bisected when it cannot decide,
//     with a big-float retry when float64 intervals cannot.
//   - On both tails, a lemma of its own (Model.Tail): |J| <= pi/(4|a|),
//     |B_exp| <= C(k)/|a| by one integration by parts, for jumps at c > 0
//     bounds from the turned paths (edgeTailB: O(1/S) for s >= S and
//     O(sqrt(c/S)) for s <= -S, with |e^{i phase}| <= 1 proved along the
//     path through the stationary point), the band diagonal by moving the
//     line (diagTail), exponential bounds of the exp D, and monotonicity of
//     the eigenvalues in A, D and |B|. Where the lemma is too weak at the
//     recorded tail start, the verifier covers up to 64 times further with
//     cells of its own.
//   - The recorded numbers themselves: each cell's recorded enclosure and
//     each tail's recorded bound must support the claim and must not be
//     contradicted by the recomputation.
//
// Checker.Check runs all of it over a decoded certificate. The test-support
// package reltest holds BuildCertificate, a small reference certifier on
// the same numerics used by the tests (outside the trusted base).
package relaxation
