// Package flight reduces a multi-stage flight to the single projectile of
// package strip and certifies its advantage bracket there.
//
// # The problem
//
// A particle starts confined to [0, L]. It then goes through stages
// k = 1..K: during stage k it flies freely with mass m_k for a duration
// t_k, and at the end of the stage it may receive a momentum kick q_k (an
// instantaneous impulse, p -> p + q_k). Between stages the mass may change.
// Convention for a mass change: the momentum is continuous (the Hamiltonian
// is H(t) = P^2/(2 m(t)), piecewise constant in t; the velocity p/m jumps).
// At the end the particle is detected when its position is at least the
// target c. The classical rival has the same momentum distribution at the
// start, starts somewhere in [0, L], and goes through the same stages with
// the same kicks; the advantage is the quantum detection probability minus
// the best classical one, maximised over confined states.
//
// # The reduction (with proof)
//
// Each stage is a linear symplectic map followed by a shift on phase
// space: the flight (x, p) -> (x + (t_k/m_k) p, p) and the kick
// (x, p) -> (x, p + q_k). Composing them from stage 1 to K,
//
//	x_K = x_0 + T p_0 + s,   p_K = p_0 + q_1 + ... + q_K,
//	T = sum_k t_k/m_k,   s = sum_k q_k (t_{k+1}/m_{k+1} + ... + t_K/m_K),
//
// by induction on K: adding stage K+1 to (x_K, p_K) gives
// x_{K+1} = x_K + (t_{K+1}/m_{K+1}) p_K, and p_K = p_0 + sum_{k<=K} q_k
// contributes q_k t_{K+1}/m_{K+1} to the shift of each earlier kick, while
// the new kick q_{K+1} acts after the last flight and shifts nothing.
// Quantum mechanically the same identity holds for the Heisenberg-picture
// operators, exactly: the flight of stage k is U_k = exp(-i t_k P^2/(2 m_k
// hbar)), under which X -> X + (t_k/m_k) P and P -> P, and the kick is
// exp(i q_k X/hbar), under which P -> P + q_k; the maps are affine in
// (X, P) and so compose like their classical counterparts. (All U_k
// commute, so the free part is one flight of mass 1 and duration T.)
//
// Hence the quantum detection operator is the spectral projection
// 1[X + T P >= c - s] on the initial state, and a classical particle with
// initial (x_0, p_0) is detected iff x_0 + T p_0 >= c - s. Both are the
// single-stage projectile problem with time-over-mass T and the shifted
// target c' = c - s, and the classical rival with the same initial
// momentum distribution is the same in both descriptions (the kicks are
// deterministic and applied to both). By the single-stage analysis of
// package strip the advantage depends on T only through
//
//	alpha = L^2/(hbar T) = 1/(sum_k 1/alpha_k),  alpha_k = m_k L^2/(hbar t_k),
//
// (the target drops out: a momentum translation, which preserves
// confinement, moves it). So the flight's advantage is A(alpha) of package
// strip at the effective alpha; in particular it is at most the backflow
// constant like every projectile advantage. Stages of equal mass merge
// (t_1/m + t_2/m = (t_1 + t_2)/m), and a kick in the last stage shifts
// nothing.
//
// # Units
//
// Scaled input: lengths in units of L (so L = 1), momenta in units of
// hbar/L, masses in units of a reference mass m_0 and durations in units
// of m_0 L^2/hbar; then alpha = 1/T exactly. Physical input: mass in kg,
// g, mg or u, duration in s, ms, us or ns, kick in kg*m/s, g*m/s or u*m/s
// (u*mm/s, u*um/s), lengths in m, mm, um or nm; then
// alpha = 2 pi L^2/(h T) with the exact SI Planck constant, recorded as
// 2*pi*r with r rational, and the shift s in metres, rational. Every number
// of the reduction is an exact rational; a verifier re-derives it from the
// stages.
package flight
