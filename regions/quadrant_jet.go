package regions

import "wedgebound/interval"

// Jets of the quadrant eigenvalue.
//
// With sigma = -1 for the smallest eigenvalue (edge Lower) and +1 for the
// largest (edge Upper),
//
//	lambda = A/2 + sigma R,   R = sqrt(A^2/4 + beta),   beta = |J|^2/(4 pi^2),
//
// because the symbol has D = 0 and |B| = |J|/(2 pi). Differentiating
// R^2 = A^2/4 + beta once and twice:
//
//	2 R R'            = A A'/2 + beta',
//	2 R'^2 + 2 R R''  = A'^2/2 + A A''/2 + beta'',
//
// with A' = (pi/2) sech^2(pi s), A'' = -pi^2 sech^2(pi s) tanh(pi s),
// beta' = (Re J Re J' + Im J Im J')/(2 pi^2) and
// beta'' = (|J'|^2 + Re J Re J'' + Im J Im J'')/(2 pi^2). J comes from
// digamma (see quadrantJ); with z = c + is/2, dz/ds = i/2, so
// J' = (i/4) [psi'(3/4 + is/2) - psi'(1/4 + is/2)] and
// J'' = -(1/8) [psi''(3/4 + is/2) - psi''(1/4 + is/2)].
// R >= |A|/2 > 0 everywhere (A > 0), so no division is singular.

// quadrantJSecond encloses J”(s) = -(1/8) [psi”(3/4 + is/2) - psi”(1/4 + is/2)].
func quadrantJSecond[T interval.Real[T]](s T) interval.C[T] {
	half := s.Scale(-1)
	z1 := interval.C[T]{Re: s.Frac(3, 4), Im: half}
	z2 := interval.C[T]{Re: s.Frac(1, 4), Im: half}
	return interval.Tetragamma(z1).Sub(interval.Tetragamma(z2)).Scale(-3).Neg()
}

// EigJet holds enclosures of lambda, lambda' and lambda” (the latter two
// only when asked for).
type EigJet[T interval.Real[T]] struct {
	L, L1, L2 T
}

// QuadrantEigJet encloses lambda(s) and, for order >= 1 and 2, lambda'(s)
// and lambda”(s) of the quadrant symbol's smallest (edge Lower) or largest
// (edge Upper) eigenvalue, for every s in the interval s, by the direct
// formulas above (no mean-value form: meant for points and narrow cells).
// Entries of orders above order are left zero.
func QuadrantEigJet[T interval.Real[T]](s T, e Edge, order int) EigJet[T] {
	pi := s.Pi()
	ps := pi.Mul(s)
	th := interval.Tanh(ps)
	a := th.Add(s.Int(1)).Scale(-1)
	j := quadrantJ(s)
	fourPi2 := pi.Sqr().Scale(2)
	twoPi2 := pi.Sqr().Scale(1)
	r := a.Sqr().Scale(-2).Add(j.Abs2().Quo(fourPi2)).Sqrt()
	sig := func(x T) T {
		if e == Upper {
			return x
		}
		return x.Neg()
	}
	var out EigJet[T]
	out.L = a.Scale(-1).Add(sig(r))
	if order < 1 {
		return out
	}
	sech2 := interval.Sech(ps).Sqr()
	a1 := sech2.Mul(pi).Scale(-1)
	j1 := quadrantJPrime(s)
	b1 := j.Re.Mul(j1.Re).Add(j.Im.Mul(j1.Im)).Quo(twoPi2)
	twoR := r.Scale(1)
	r1 := a.Mul(a1).Scale(-1).Add(b1).Quo(twoR)
	out.L1 = a1.Scale(-1).Add(sig(r1))
	if order < 2 {
		return out
	}
	a2 := sech2.Mul(th).Mul(pi.Sqr()).Neg()
	j2 := quadrantJSecond(s)
	b2 := j1.Abs2().Add(j.Re.Mul(j2.Re)).Add(j.Im.Mul(j2.Im)).Quo(twoPi2)
	num := a1.Sqr().Scale(-1).Add(a.Mul(a2).Scale(-1)).Add(b2).Sub(r1.Sqr().Scale(1))
	r2 := num.Quo(twoR)
	out.L2 = a2.Scale(-1).Add(sig(r2))
	return out
}
