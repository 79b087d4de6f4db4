package relaxation

import (
	"fmt"
	"math"
	"math/big"
	"sync"

	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// edgeInt encloses the edge integral of a jump of the quadrant-I profile
// at u = c > 0,
//
//	E(c, s) = (1/pi) int_1^inf (tau - 1)^{a-1} (tau + 1)^{-a} e^{2ic tau}/(2i tau) dtau,   a = 1/2 + is,
//
// the (+,-) entry of the profile 1[u > c] minus that of the quadrant
// (derivation in the package doc, "Bands"). The verifier's route: the
// integrand is analytic off (-inf, 1] and 0, and the path [1, inf) is
// turned, per regime of s (regimeIndex),
//
//   - for s >= -1 to the vertical ray tau = 1 + i y, y > 0, where
//     e^{2ic tau} = e^{2ic} e^{-2c y} decays and |(tau-1)^{is} (tau+1)^{-is}| =
//     e^{-s atan(2/y)} <= e^{pi/2};
//   - for s <= -1 (sigma = -s in [sigma_lo, sigma_hi]) to the path down from
//     1 to 1 - i L and on along the diagonal 1 - i L + (1 + i) v, v >= 0,
//     which crosses the real axis at the stationary point
//     tau* = sqrt(1 + sigma_ref/c) = 1 + L of the phase
//     2c tau + s log((tau-1)/(tau+1)), sigma_ref the geometric mean of
//     the regime.
//
// (Cauchy's theorem: no singularity lies between [1, inf) and either path,
// the arcs at infinity vanish as the integrand is O(|tau|^-2) and bounded
// in phase there, and the small arc at tau = 1 is O(eps^{1/2}).) With
// y = e^x on the vertical legs the logarithmic oscillation of
// (tau - 1)^{is} at tau = 1 becomes plain e^{-isx}; the legs are integrated
// by composite Clenshaw-Curtis rules (pathRule) and the parts left out
// are bounded in edgeRegime.truncation.
type edgeInt[T interval.Real[T]] struct {
	cRat *big.Rat
	c    T
	cf   float64
	tol  T

	mu      sync.Mutex
	regimes map[int]*edgeSlot[T]
}

type edgeSlot[T interval.Real[T]] struct {
	once sync.Once
	r    *pathRule[T]
	err  error
}

// edgeCache shares edge integrals between terms and models in one process.
var edgeCache sync.Map

func newEdgeInt[T interval.Real[T]](like T, c *big.Rat) (*edgeInt[T], error) {
	key := fmt.Sprintf("%T/%d/%s", like, like.Prec(), c.String())
	if v, ok := edgeCache.Load(key); ok {
		if e, ok := v.(*edgeInt[T]); ok {
			return e, nil
		}
	}
	ct, err := checknum.Enclose(like, c)
	if err != nil {
		return nil, err
	}
	cf, _ := c.Float64()
	e := &edgeInt[T]{cRat: c, c: ct, cf: cf, regimes: map[int]*edgeSlot[T]{}}
	e.tol = like.Float(math.Ldexp(1, -int(like.Prec())+5))
	v, _ := edgeCache.LoadOrStore(key, e)
	return v.(*edgeInt[T]), nil
}

// eval encloses E(c, .) at c0 and over the cell S with its derivative.
func (e *edgeInt[T]) eval(idx int, c0, delta T) (pathEval[T], error) {
	e.mu.Lock()
	slot, ok := e.regimes[idx]
	if !ok {
		slot = &edgeSlot[T]{}
		e.regimes[idx] = slot
	}
	e.mu.Unlock()
	slot.once.Do(func() { slot.r, slot.err = e.build(idx) })
	if slot.err != nil {
		return pathEval[T]{}, slot.err
	}
	return slot.r.eval(c0, delta), nil
}

// budget returns the largest quadrature and truncation bounds so far.
func (e *edgeInt[T]) budget() (T, T) {
	q, t := e.c.Int(0), e.c.Int(0)
	e.mu.Lock()
	defer e.mu.Unlock()
	for _, slot := range e.regimes {
		if slot.r != nil {
			q = q.Max(slot.r.errQ)
			t = t.Max(slot.r.errT)
		}
	}
	return q, t
}

// integrand returns the s-free factor of the integrand at tau (given
// with tau - 1 and the logarithm of tau - 1, which the legs know more
// accurately than a subtraction would give), and t = log(tau+1) - log(tau-1),
// so that the integrand is g(tau) e^{-i s t}:
// (tau-1)^{a-1} (tau+1)^{-a} = e^{-(log(tau-1) + log(tau+1))/2} e^{-i s t}.
func (e *edgeInt[T]) integrand(tau interval.C[T], logm interval.C[T]) (g, t interval.C[T]) {
	like := e.c
	tp := tau.AddReal(like.Int(1))
	logp := tp.Log()
	ex := interval.C[T]{
		Re: logm.Re.Add(logp.Re).Scale(-1).Neg().Sub(e.c.Scale(1).Mul(tau.Im)),
		Im: logm.Im.Add(logp.Im).Scale(-1).Neg().Add(e.c.Scale(1).Mul(tau.Re)),
	}
	den := interval.C[T]{Re: tau.Im.Neg(), Im: tau.Re}.MulReal(like.Pi().Scale(1)) // 2 pi i tau
	return ex.Exp().Quo(den), logp.Sub(logm)
}

// build makes the rule of regime idx with its truncation bounds.
//
// Truncations (the integrand is g e^{-i s t}; |g| <= |tau-1|^{-1/2}
// |tau+1|^{-1/2} |e^{2ic tau}|/(2 pi |tau|), and |t| <= log|tau+1|/|tau-1| + |arg|):
//
//   - the vertical legs near tau = 1, y in (0, y0]: |tau + 1| >= 2, |tau| >= 1,
//     |e^{-ist}| <= e^{pi/2} going up (s >= -1) and <= 1 going down (s < 0),
//     |e^{2ic tau}| <= 1 up and <= e^{2c y0} down, so the piece is at most
//     (1/pi) sqrt(y0/2) times e^{pi/2} (up) or e^{2c y0} (down), and with
//     |t| <= log(3/y) + pi/2 and int_0^{y0} y^{-1/2} log(1/y) dy =
//     2 sqrt(y0) (log(1/y0) + 2) its derivative is at most that times
//     log(3/y0) + 2 + pi/2;
//   - the vertical ray beyond y = Y >= 2: |tau - 1| = y, |tau + 1|, |tau| >= y,
//     so the piece is at most (1/(2pi)) e^{pi/2} int_Y^inf y^{-2} e^{-2cy} dy
//     <= e^{pi/2} e^{-2cY}/(4 pi c Y^2), and |t| <= 2/Y + pi/2 <= pi there;
//   - the diagonal beyond u = U (tau = tau* + (1+i) u, tau* = 1 + L):
//     the phase phi = 2c tau + s log((tau-1)/(tau+1)) has
//     Im phi = 2c u - sigma theta with 0 < theta = atan(2u/X) <= 2u/X,
//     X = |tau|^2 - 1 >= sigma_ref/c + 2 tau* u + 2u^2; once
//     X_U >= 2 sigma_hi/c this gives Im phi >= c u for u >= U and every
//     sigma of the regime; |tau - 1|, |tau + 1|, |tau| >= L + u, so with
//     |dtau| = sqrt2 du the piece is at most
//     (sqrt2/(2 pi)) int_U^inf e^{-cu}/(L + u)^2 du <= e^{-cU}/(sqrt2 pi c (L+U)^2),
//     and |t| <= pi + log 2 < 4 there (|tau| >= 3).
func (e *edgeInt[T]) build(idx int) (*pathRule[T], error) {
	like := e.c
	lo, hi := regimeRange(idx)
	sR := like.Float(lo - math.Abs(lo)*1e-9).Hull(like.Float(hi + math.Abs(hi)*1e-9))
	one := like.Int(1)
	pi := like.Pi()
	tol := e.tol
	c := e.c
	cf := e.cf
	// Near end: y0 with the bound below tol/8.
	xlo := 2*math.Log(tol.Lo()/8*math.Pi/5) - 1
	y0 := interval.Upper(interval.Exp(like.Float(xlo)))
	near := func(fac T) (T, T) {
		b := y0.Scale(-1).Sqrt().Mul(fac).Quo(pi)
		d := b.Mul(interval.Log(like.Int(3).Quo(y0)).Add(like.Int(2)).Add(pi.Scale(-1)))
		return interval.Upper(b), interval.Upper(d)
	}
	up := func(x interval.C[T]) (interval.C[T], interval.C[T]) {
		ex := x.Exp()
		tm1 := interval.C[T]{Re: ex.Im.Neg(), Im: ex.Re} // i e^x
		tau := tm1.AddReal(one)
		logm := interval.C[T]{Re: x.Re, Im: x.Im.Add(pi.Scale(-1))}
		g, t := e.integrand(tau, logm)
		return g.Mul(tm1), t
	}
	down := func(x interval.C[T]) (interval.C[T], interval.C[T]) {
		ex := x.Exp()
		tm1 := interval.C[T]{Re: ex.Im, Im: ex.Re.Neg()} // -i e^x
		tau := tm1.AddReal(one)
		logm := interval.C[T]{Re: x.Re, Im: x.Im.Sub(pi.Scale(-1))}
		g, t := e.integrand(tau, logm)
		return g.Mul(tm1), t
	}
	if idx >= 0 {
		// Vertical ray up to Y.
		Yf := math.Max(2, (math.Log(1/tol.Lo())+2)/(2*cf))
		var far T
		for range 200 {
			Y := like.Float(Yf)
			far = interval.Upper(interval.Exp(pi.Scale(-1).Sub(c.Scale(1).Mul(Y))).Quo(c.Scale(2).Mul(pi).Mul(Y.Sqr())))
			if far.Hi() <= tol.Lo()/8 {
				break
			}
			Yf *= 1.2
		}
		if far.Hi() > tol.Lo()/8 {
			return nil, fmt.Errorf("edge term c=%s: no cut-off found on regime %d", e.cRat.RatString(), idx)
		}
		xhi := math.Log(Yf)
		Ylo := interval.Lower(interval.Exp(like.Float(xhi)))
		far = interval.Upper(interval.Exp(pi.Scale(-1).Sub(c.Scale(1).Mul(Ylo))).Quo(c.Scale(2).Mul(pi).Mul(Ylo.Sqr())))
		pr, err := buildPathRule(like, []pathLeg[T]{{x0: xlo, x1: xhi, at: up}}, sR, tol.Scale(-1))
		if err != nil {
			return nil, fmt.Errorf("edge term c=%s, regime %d: %v", e.cRat.RatString(), idx, err)
		}
		nb, nd := near(interval.Exp(pi.Scale(-1)))
		pr.errT = interval.Upper(nb.Add(far))
		pr.errT1 = interval.Upper(nd.Add(far.Mul(pi)))
		return pr, nil
	}
	// Down and along the diagonal through the stationary point.
	sigLo, sigHi := -hi, -lo
	sigRef := math.Sqrt(sigLo * sigHi)
	Lf := math.Sqrt(1+sigRef/cf) - 1
	xL := math.Log(Lf)
	L := interval.Exp(like.Float(xL)) // the exact corner depth e^{xL}
	corner := interval.C[T]{Re: one, Im: L.Neg()}
	sq2 := like.Int(2).Sqrt()
	diag := func(x interval.C[T]) (interval.C[T], interval.C[T]) {
		// tau = 1 - i L + (1 + i) x
		tau := corner.Add(interval.C[T]{Re: x.Re.Sub(x.Im), Im: x.Re.Add(x.Im)})
		tm1 := tau.Sub(interval.RealC(one))
		g, t := e.integrand(tau, tm1.Log())
		return g.Mul(interval.C[T]{Re: one, Im: one}), t
	}
	tauS := L.Add(one)
	sigHiT := like.Float(sigHi * (1 + 1e-9))
	Vf := math.Max(2+Lf, 2*Lf)
	var far T
	ok := false
	for range 400 {
		V := like.Float(Vf)
		U := interval.Lower(V.Sub(L))
		X := tauS.Sqr().Sub(one).Add(tauS.Mul(U).Scale(1)).Add(U.Sqr().Scale(1))
		if U.Lo() >= 2 && X.Sub(sigHiT.Quo(c).Scale(1)).Lo() >= 0 {
			far = interval.Upper(interval.Exp(c.Mul(U).Neg()).Quo(sq2.Mul(pi).Mul(c).Mul(L.Add(U).Sqr())))
			if far.Hi() <= tol.Lo()/8 {
				ok = true
				break
			}
		}
		Vf *= 1.1
	}
	if !ok {
		return nil, fmt.Errorf("edge term c=%s: no cut-off found on regime %d", e.cRat.RatString(), idx)
	}
	pr, err := buildPathRule(like, []pathLeg[T]{{x0: xlo, x1: xL, at: down}, {x0: 0, x1: Vf, at: diag}}, sR, tol.Scale(-1))
	if err != nil {
		return nil, fmt.Errorf("edge term c=%s, regime %d: %v", e.cRat.RatString(), idx, err)
	}
	nb, nd := near(interval.Exp(c.Scale(1).Mul(y0)))
	pr.errT = interval.Upper(nb.Add(far))
	pr.errT1 = interval.Upper(nd.Add(far.Scale(2)))
	return pr, nil
}

// edgeTailB bounds |E(c, s)| for side*s >= S > 0, c > 0 (the verifier's own
// lemma, from the paths above with |e^{i phi}| bounded pointwise).
//
// s >= S: on tau = 1 + i y, |e^{-ist}| = e^{-s atan(2/y)} <= e^{-2S/(y+2)}
// (atan z >= z/(1+z)) and |e^{2ic tau}| <= 1, while
// |tau-1|^{-1/2} |tau+1|^{-1/2}/(2|tau|) <= 2^{-1/4} y^{-1/2} (2+y)^{-1/2} (1+y)^{-1} =: f.
// On [0, 2], f <= 2^{-3/4} y^{-1/2} and e^{-2S/(y+2)} <= e^{-S/2}: at most
// 2^{3/4} e^{-S/2}. On [2, inf), with z = y + 2 <= 2y, f <= 2^{5/4} z^{-2}
// and int_4^inf 2^{5/4} z^{-2} e^{-2S/z} dz <= 2^{1/4}/S. So
// |E| <= (2^{3/4} e^{-S/2} + 2^{1/4}/S)/pi.
//
// s = -sigma <= -S: take the path of s itself, L = tau* - 1 with
// tau*^2 - 1 = sigma/c. There Im phi >= 0 everywhere: on 1 - i y (y <= L),
// Im phi = sigma atan(2/y) - 2cy decreases in y and at y = L equals
// cL ((L+2) atan(2/L) - 2) >= 0 (atan z >= z/(1+z)); on the diagonal below
// the real axis, with v = -u in [0, L], x = tau* - v >= 1 and
// X = |tau|^2 - 1 = sigma/c - 2 v x > 0, Im phi = sigma (atan z - z/(1 + z x))
// with z = 2v/X, which is >= 0 since x >= 1; above it theta <= 2u/X and
// X >= sigma/c. Moreover on y in [0, L/2], Im phi >= sigma atan(4/L) - cL
// >= cL. The amplitude |tau-1|^{-1/2} |tau+1|^{-1/2}/(2|tau|) integrates to
// at most (1 + sqrt2)/2 over the whole vertical ray, to at most 1/(2L) over
// y in [L/2, L] (it is <= y^{-2}/2 there), to at most sqrt2/L over the
// lower diagonal (|tau - 1| >= L/sqrt2, |tau + 1| >= |tau| >= tau*/sqrt2,
// length sqrt2 L) and to 1/(sqrt2 L) over the upper one (all three moduli
// >= L + u). So
//
//	|E| <= ((1 + sqrt2)/2 e^{-cL} + (1/2 + sqrt2 + 1/sqrt2)/L)/pi,
//
// decreasing in sigma, so its value at S bounds the whole tail.
func edgeTailB[T interval.Real[T]](c, S T, side int) T {
	pi := S.Pi()
	one := S.Int(1)
	sq2 := S.Int(2).Sqrt()
	if side > 0 {
		a := interval.Exp(S.Scale(-1).Neg()).Mul(pow2(S, 3, 4))
		b := pow2(S, 1, 4).Quo(S)
		return interval.Upper(a.Add(b).Quo(pi))
	}
	L := interval.Lower(one.Add(S.Quo(c)).Sqrt().Sub(one))
	if L.Sign() <= 0 {
		return S.Whole()
	}
	a := one.Add(sq2).Scale(-1).Mul(interval.Exp(c.Mul(L).Neg()))
	b := S.Frac(1, 2).Add(sq2).Add(one.Quo(sq2)).Quo(L)
	return interval.Upper(a.Add(b).Quo(pi))
}

// pow2 encloses 2^{p/q} (the argument only fixes the precision).
func pow2[T interval.Real[T]](like T, p, q int64) T {
	return interval.Exp(interval.Log(like.Int(2)).Mul(like.Frac(p, q)))
}
