// Package softwall is a float64 EXPLORATION, not part of any certificate:
// nothing here is proved, no certifier or verifier imports it, and its
// numbers are float evidence only (see the section "Beyond squeeze
// invariance" of package regions for the mathematics and the results).
//
// It estimates the upper bound that a relaxation which is NOT squeeze
// invariant gives on the backflow constant: the two-parameter family
//
//	g = chi_Q + w chi_III + t chi_{H^c}
//
// in the normal form (quadrant Q inside H = {x + p > 0}, quadrant III
// opposite to Q, H^c the complement of H). Every such g equals chi_Q on H,
// so c_bm <= -inf spec Op(g). For t = 0 the family is the squeeze-invariant
// constant profile on quadrant III; for t > 0 it is not invariant, since H
// is not. Op(chi_{H^c}) = 1 - P is the orthogonal projection onto the
// states whose Wigner function lives in H^c, so inf spec Op(g) increases
// with t and tends to -c_bm as t -> inf (Schur complement).
//
// The operator is discretised in the momentum picture of the backflow
// problem (H = {p > 0}, wedge {p > 0, |x| < 2p}, opposite wedge
// {p < 0, |x| < 2|p|}), where -Op(g) has the kernel
//
//	-S(u, v) [u + v > 0] + w S(u, v) [u + v < 0] - t delta(u - v) [u < 0],
//	S(u, v) = sin(u^2 - v^2) / (pi (u - v)),
//
// truncated to |u| < U and sampled by Nystrom's method on Gauss-Legendre
// panels (Float); the ends of the scale axis, where the relaxation is again
// squeeze invariant, are computed from the 2x2 Mellin symbol (EssEdge).
// Two measurements for a rigorous route sit beside it: Temple's inequality
// with trials from smaller truncations (Temple), and the half-line kernel
// split at a momentum (Window, Split). The table in the regions doc is
// printed by TestExploration (WEDGEBOUND_SLOW=1).
package softwall
