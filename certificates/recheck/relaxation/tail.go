package relaxation

import (
	"fmt"
	"math/big"

	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// Tail encloses the edge eigenvalue for every s beyond from: s <= from < 0
// (side -1) or s >= from > 0 (side +1). For edge lower the result's lower
// endpoint is a proved lower bound of lambda_min over the whole tail; for
// edge upper its upper endpoint is a proved upper bound of lambda_max.
//
// Lemma. Let S = |from| and |s| >= S.
//
//  1. A(s) = (1 + tanh(pi s))/2 is increasing, so A lies in
//     [(1 + tanh(pi S))/2, 1] for s >= S and in [0, (1 - tanh(pi S))/2]
//     for s <= -S.
//  2. |J(s)| <= pi/(4|a|), a = 1/2 + is: integrating r^{a-1} by parts,
//     J = int_0^1 r^{a-1}/(1+r) dr = 1/(2a) + (1/a) int_0^1 r^a/(1+r)^2 dr,
//     and |r^a| = r^{1/2} with int_0^1 r^{1/2}/(1+r)^2 dr = pi/4 - 1/2
//     (substitute r = u^2). So the quadrant part of B is at most
//     |J|/(2 pi) <= 1/(8|a|).
//  3. Each term adds at most |w_j| times its family's bound of |B_j| to |B|
//     and w_j D_j(s) with D_j in its family's box to D (termSymbol.tailB,
//     tailD; for exp terms |B_j| <= C(k_j)/|a| by expTerm.tailConst and
//     0 < D_j <= 2 e^{-(pi -+ 2 theta_j) S}/|k_j + 2i| by
//     expTerm.tailDBound; for bands see bandTerm).
//  4. |a| = sqrt(1/4 + s^2) >= sqrt(1/4 + S^2).
//  5. lambda_min = (A+D)/2 - sqrt(((A-D)/2)^2 + b^2), b = |B|, is
//     nondecreasing in A and in D (its partial derivatives are
//     1/2 -+ (A-D)/(4R) >= 0 since |A-D|/2 <= R) and nonincreasing in b;
//     lambda_max = (A+D)/2 + R is nondecreasing in A, D and b. So over the
//     box of steps 1-4, lambda_min is smallest at (A_lo, D_lo, b_max) and
//     lambda_max largest at (A_hi, D_hi, b_max), where they are evaluated
//     in interval arithmetic.
func (m *Model[T]) Tail(from *big.Rat, side int) (T, error) {
	like := m.like
	if side != 1 && side != -1 || from.Sign() != side {
		return like.Whole(), fmt.Errorf("tail from %s on side %d: the tail must start on its own side of 0", from.RatString(), side)
	}
	abs := new(big.Rat).Abs(from)
	sEnc, err := checknum.Enclose(like, abs)
	if err != nil {
		return like.Whole(), err
	}
	S := interval.Lower(sEnc)
	one := like.Int(1)
	aMin := interval.Lower(like.Frac(1, 4).Add(S.Sqr()).Sqrt())
	beta := one.Quo(aMin.Scale(3))
	dSum := like.Int(0)
	for i, t := range m.terms {
		w := m.weights[i]
		beta = beta.Add(w.Abs().Mul(t.tailB(S, side)))
		dSum = dSum.Add(w.Mul(t.tailD(S, side)))
	}
	dLo, dHi := interval.Lower(dSum), interval.Upper(dSum)
	beta = interval.Upper(beta)
	th := interval.Tanh(S.Pi().Mul(S))
	var aLo, aHi T
	if side > 0 {
		aLo, aHi = interval.Lower(one.Add(th).Scale(-1)), one
	} else {
		aLo, aHi = like.Int(0), interval.Upper(one.Sub(th).Scale(-1))
	}
	bC := interval.C[T]{Re: beta, Im: like.Int(0)}
	if m.Edge == Upper {
		return entries[T]{A: aHi, D: interval.Upper(dHi), B: bC}.eig(Upper), nil
	}
	return entries[T]{A: aLo, D: interval.Lower(dLo), B: bC}.eig(Lower), nil
}

// TailLimit is the limit of the edge eigenvalue as s -> side*inf: A tends
// to 0 (s -> -inf) or 1 (s -> +inf), B to 0 and D to the sum of the
// weighted limits of the terms (Dinf; 0 except for terms such as the band
// [a, inf), whose D tends to 1 as s -> +inf), so lambda_min tends to
// min(A, Dinf) and lambda_max to max(A, Dinf). A recorded tail bound on
// the wrong side of it is false.
func (m *Model[T]) TailLimit(side int) *big.Rat {
	dinf := new(big.Rat)
	for i, t := range m.terms {
		dinf.Add(dinf, new(big.Rat).Mul(m.wRat[i], t.limitD(side)))
	}
	a := new(big.Rat)
	if side > 0 {
		a.SetInt64(1)
	}
	if (m.Edge == Upper) == (dinf.Cmp(a) > 0) {
		return dinf
	}
	return a
}
