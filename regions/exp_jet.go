package regions

import (
	"fmt"
	"math"

	"wedgebound/interval"
)

// Jets of the exponential term to the full precision of T (the Newton route
// of the edges; package doc, "Edges to many digits").
//
// D^(n) is closed form: with tau = tanh(pi s),
//
//	D' = D (2 theta - pi tau),   D'' = D [(2 theta - pi tau)^2 - pi^2 sech^2(pi s)].
//
// B^(n) = conj(I^(n))/(pi (k + 2i)) with, t = -log r,
//
//	I^(n)(s) = int_0^inf (-i t)^n e^{-a t} / (1 - q e^{-t}) dt,   a = 1/2 + is,
//
// (differentiating r^{a-1} = e^{-(a-1) t} in s gives the factor -i t). The
// integral runs on the ray t = x (1 + i dir), x >= 0, with dir = -1 for
// windows in s >= 1, +1 for s <= -1 and 0 otherwise: the poles
// t = i (2 theta + 2 pi m) lie on the imaginary axis, so turning the real
// ray by at most pi/4 crosses none, and the arc at infinity vanishes as
// long as Re(a t) = x (1/2 - dir s) grows, which holds on the whole window
// (checked). The ray is cut at X with, for c = min over the window of
// (1/2 - dir s) > 0 and kappa = |1 + i dir|,
//
//	|int_X^inf| <= kappa^{n+1} / (1 - e^{-X}) int_X^inf x^n e^{-c x} dx,
//	int_X^inf x^n e^{-c x} dx = e^{-cX} sum_{j=0}^n n!/(n-j)! X^{n-j}/c^{j+1},
//
// using |1 - q e^{-t}| >= 1 - e^{-Re t} = 1 - e^{-x} and |t| = kappa x.
// [0, X (1 + i dir)] goes to the adaptive Gauss-Legendre path quadrature
// of pathquad.go (remainders from Bernstein ellipses, bounded here in
// float64 intervals, which is rigorous and cheap at any precision). One
// rule with integrand e^{-t/2}/(1 - q e^{-t}) gives I and I'; a second with
// the extra factor -i t gives I''.

// expJet is the jet of an exponential term on a window of s.
type expJet[T interval.Real[T]] struct {
	e      *expTerm[T]
	r0, r1 *pathRule[T] // r1 only for order 2
	order  int
}

// JetOn prepares the jet of the term up to order (1 or 2) for s in
// [lo, hi], lo <= hi. It fails when the window straddles the point where
// no ray direction works (never for windows of width below 1) or the path
// quadrature finds no admissible panels.
func (e *expTerm[T]) JetOn(lo, hi float64, order int) (TermJet[T], error) {
	if !(lo <= hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return nil, fmt.Errorf("exp jet: bad window [%g, %g]", lo, hi)
	}
	like := e.k
	sr := like.Float(lo).Hull(like.Float(hi))
	mid := (lo + hi) / 2
	dir := 0
	switch {
	case mid >= 1:
		dir = -1
	case mid <= -1:
		dir = 1
	}
	// c = min over the window of 1/2 - dir s (linear in s: an endpoint).
	half := like.Frac(1, 2)
	cw := half.Sub(sr.Mul(like.Int(int64(dir))))
	c := interval.Lower(cw)
	if c.Sign() <= 0 {
		return nil, fmt.Errorf("exp jet: the ray of direction %d does not decay on [%g, %g]", dir, lo, hi)
	}
	kappa := like.Int(1)
	if dir != 0 {
		kappa = like.Int(2).Sqrt()
	}
	prec := like.Prec()
	tol := math.Ldexp(1, -int(prec)-10)
	// Cut: the first X = ceil(j/c), j = j0, j0 + 1, ..., with the n = 2 tail
	// below tol, where e^{-j0} = 2^-(prec+10) (at most 400 tries).
	cf := c.Lo()
	j0 := math.Floor(float64(prec+10) * math.Ln2)
	var X T
	var tails [3]T
	for j := j0; ; j++ {
		X = like.Float(math.Ceil(j / cf))
		tails = rayTails(X, c, kappa)
		if tails[2].Hi() <= tol {
			break
		}
		if j > j0+400 {
			return nil, fmt.Errorf("exp jet: no cut-off point found")
		}
	}
	Xf := X.Lo()
	verts := []complex128{0, complex(Xf, float64(dir)*Xf)}
	// Float64 copies for the ellipse bounds.
	kF := interval.PointF(e.k.Lo()).Hull(interval.PointF(e.k.Hi()))
	kpF := interval.C[interval.F]{Re: kF, Im: interval.PointF(2)}
	qF := kpF.Quo(kpF.Conj())
	g0 := e.integrandNoS
	g1 := func(z interval.C[T]) interval.C[T] {
		return g0(z).Mul(interval.C[T]{Re: z.Im, Im: z.Re.Neg()})
	}
	mag := func(times bool) func(z interval.C[T], s T) T {
		return func(z interval.C[T], s T) T {
			zF := interval.C[interval.F]{Re: toF(z.Re), Im: toF(z.Im)}
			et := zF.Neg().Exp()
			one := interval.RealC(interval.PointF(1))
			den := one.Sub(qF.Mul(et)).Abs()
			num := interval.Exp(zF.Re.Scale(-1).Neg().Add(toF(s).Mul(zF.Im)))
			m := num.Quo(den)
			if times {
				m = m.Mul(zF.Abs())
			}
			if !m.IsFinite() || den.Sign() <= 0 {
				return s.Whole()
			}
			return s.Float(m.Hi())
		}
	}
	spec := pathSpec[T]{verts: verts, g: g0, lam: 1, sr: sr, trunc: tails[0], truncD: tails[1], tol: tol, mag: mag(false)}
	r0, err := buildPathRule(like, spec)
	if err != nil {
		return nil, fmt.Errorf("exp jet k=%s on [%g, %g]: %w", e.kStr, lo, hi, err)
	}
	j := &expJet[T]{e: e, r0: r0, order: order}
	if order >= 2 {
		spec1 := pathSpec[T]{verts: verts, g: g1, lam: 1, sr: sr, trunc: tails[1], truncD: tails[2], tol: tol, mag: mag(true)}
		if j.r1, err = buildPathRule(like, spec1); err != nil {
			return nil, fmt.Errorf("exp jet k=%s on [%g, %g]: %w", e.kStr, lo, hi, err)
		}
	}
	return j, nil
}

// rayTails bounds |int_X^inf (-i t)^n e^{-at}/(1 - q e^{-t}) dt| for
// n = 0, 1, 2 on the ray of modulus factor kappa (see the comment above).
func rayTails[T interval.Real[T]](X, c, kappa T) [3]T {
	one := X.Int(1)
	ex := interval.Exp(c.Mul(X).Neg())
	den := one.Sub(interval.Exp(X.Neg()))
	ic := one.Quo(c)
	// int_X^inf x^n e^{-cx} dx / e^{-cX}
	p0 := ic
	p1 := X.Mul(ic).Add(ic.Sqr())
	p2 := X.Sqr().Mul(ic).Add(X.Mul(ic.Sqr()).Scale(1)).Add(ic.Sqr().Mul(ic).Scale(1))
	var out [3]T
	kp := kappa
	for n, p := range []T{p0, p1, p2} {
		out[n] = interval.Upper(kp.Mul(ex).Mul(p).Quo(den))
		kp = kp.Mul(kappa)
	}
	return out
}

// toF encloses x in float64 endpoints (rounded outward).
func toF[T interval.Real[T]](x T) interval.F {
	return interval.PointF(x.Lo()).Hull(interval.PointF(x.Hi()))
}

// Jet encloses D^(j) and B^(j), j = 0..order, for every s in s (A = 0).
func (j *expJet[T]) Jet(s T, order int) SymbolJet[T] {
	e := j.e
	order = min(order, j.order)
	pi := s.Pi()
	zero := s.Int(0)
	var m SymbolJet[T]
	for i := range m {
		m[i] = Symbol[T]{A: zero, D: zero, B: interval.RealC(zero)}
	}
	d := e.diagonal(s)
	toB := func(I interval.C[T]) interval.C[T] { return I.Conj().Quo(e.kp.MulReal(pi)) }
	m[0].D = d
	m[0].B = toB(j.r0.eval(s, false))
	if order < 1 {
		return m
	}
	ps := pi.Mul(s)
	tau := interval.Tanh(ps)
	f := e.theta.Scale(1).Sub(pi.Mul(tau))
	m[1].D = d.Mul(f)
	m[1].B = toB(j.r0.eval(s, true))
	if order < 2 {
		return m
	}
	m[2].D = d.Mul(f.Sqr().Sub(pi.Sqr().Mul(interval.Sech(ps).Sqr())))
	m[2].B = toB(j.r1.eval(s, true))
	return m
}
