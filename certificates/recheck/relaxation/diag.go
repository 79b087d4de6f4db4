package relaxation

import (
	"fmt"
	"math"
	"math/big"
	"sync"

	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// diagInt encloses the diagonal entry of the quadrant-I profile
// 1[lo < u < hi] (0 <= lo < hi),
//
//	D0(s) = M_{++}(s) = (1/pi) int_R G^(2 tanh v) e^{-2isv} sech v dv,
//	G^(w) = int_lo^hi e^{iuw} du = (hi - lo) e^{i lo w} phi1(i (hi - lo) w),
//	phi1(z) = (e^z - 1)/z,
//
// (package doc, "Bands"). The verifier's route: for each regime of s,
// either the integral on [-V, V] by composite Clenshaw-Curtis rules
// (pathRule with t = 2v) plus the cut |Re v| > V, on the real line for
// |s| <= 1 and on the line Im v = -sign(s) eta0 beyond (moved as in
// diagTail, where the integrand is smaller by e^{-2|s| eta0}); the cut is
// bounded in build. When even the tail bound of diagTail is below the
// tolerance on the whole regime, that bound is used instead.
type diagInt[T interval.Real[T]] struct {
	lo, hi   T
	hif      float64
	width    T
	tol      T
	mu       sync.Mutex
	regimes  map[int]*diagSlot[T]
	lastName string
	inv      []T // 1/n!, n <= 70
}

type diagSlot[T interval.Real[T]] struct {
	once  sync.Once
	r     *pathRule[T]
	bound [2]T // used instead of r when r is nil: |D0| and |D0'| on the regime
	err   error
}

var diagCache sync.Map

func newDiagInt[T interval.Real[T]](like T, lo, hi *big.Rat) (*diagInt[T], error) {
	key := fmt.Sprintf("%T/%d/%s/%s", like, like.Prec(), lo.String(), hi.String())
	if v, ok := diagCache.Load(key); ok {
		if d, ok := v.(*diagInt[T]); ok {
			return d, nil
		}
	}
	l, err := checknum.Enclose(like, lo)
	if err != nil {
		return nil, err
	}
	h, err := checknum.Enclose(like, hi)
	if err != nil {
		return nil, err
	}
	hf, _ := hi.Float64()
	d := &diagInt[T]{lo: l, hi: h, hif: hf, width: h.Sub(l), regimes: map[int]*diagSlot[T]{}}
	d.tol = like.Float(math.Ldexp(1, -int(like.Prec())+5))
	d.inv = invFactorials(like, 70)
	d.lastName = lo.RatString() + ".." + hi.RatString()
	v, _ := diagCache.LoadOrStore(key, d)
	return v.(*diagInt[T]), nil
}

// phi1 encloses (e^z - 1)/z: by its series sum z^n/(n+1)! when |z| <= 4,
// cut after the first N terms with 2|z|^N/(N+1)! below 2^-120 (the rest is
// at most that since |z| <= (N+2)/2), otherwise by the quotient.
func phi1[T interval.Real[T]](z interval.C[T], inv []T) interval.C[T] {
	like := z.Re
	az := interval.Upper(z.Abs())
	if !az.IsFinite() {
		return interval.C[T]{Re: like.Whole(), Im: like.Whole()}
	}
	if az.Hi() <= 4 {
		// inv[n] = 1/n!; find N.
		N := 2
		var r T
		for ; N+1 < len(inv); N++ {
			r = checknum.PowInt(az, N).Scale(1).Mul(inv[N+1])
			if r.Hi() <= 0x1p-120 || N+2 == len(inv) {
				break
			}
		}
		// Horner: 1/1! + z (1/2! + z (... + z/N!)).
		p := interval.RealC(inv[N])
		for n := N - 2; n >= 0; n-- {
			p = p.Mul(z).AddReal(inv[n+1])
		}
		r = interval.Upper(r)
		return interval.C[T]{Re: p.Re.Pad(r), Im: p.Im.Pad(r)}
	}
	return z.Exp().Sub(interval.RealC(like.Int(1))).Quo(z)
}

// invFactorials encloses 1/n! for n = 0..n.
func invFactorials[T interval.Real[T]](like T, n int) []T {
	out := make([]T, n+1)
	f := like.Int(1)
	out[0] = f
	for k := 1; k <= n; k++ {
		f = f.Mul(like.Int(int64(k)))
		out[k] = like.Int(1).Quo(f)
	}
	return out
}

// at encloses the s-free integrand f(v) = (1/pi) G^(2 tanh v) sech v and
// t = 2v at a box v.
func (d *diagInt[T]) at(v interval.C[T]) (interval.C[T], interval.C[T]) {
	like := d.lo
	one := interval.RealC(like.Int(1))
	var tanh, sech interval.C[T]
	if v.Re.Mid().Lo() >= 0 {
		q := v.Scale(1).Neg().Exp()
		den := one.Add(q)
		tanh = one.Sub(q).Quo(den)
		sech = v.Neg().Exp().Scale(1).Quo(den)
	} else {
		q := v.Scale(1).Exp()
		den := one.Add(q)
		tanh = q.Sub(one).Quo(den)
		sech = v.Exp().Scale(1).Quo(den)
	}
	w := tanh.Scale(1)
	iw := interval.C[T]{Re: w.Im.Neg(), Im: w.Re}
	G := iw.MulReal(d.lo).Exp().Mul(phi1(iw.MulReal(d.width), d.inv)).MulReal(d.width)
	f := G.Mul(sech).QuoReal(like.Pi())
	return f, v.Scale(1)
}

// eval encloses D0 at c0 and D0, D0' over the cell (real parts; D0 is
// real for real s).
func (d *diagInt[T]) eval(idx int, c0, delta T) (T, T, T, error) {
	d.mu.Lock()
	slot, ok := d.regimes[idx]
	if !ok {
		slot = &diagSlot[T]{}
		d.regimes[idx] = slot
	}
	d.mu.Unlock()
	slot.once.Do(func() { slot.r, slot.bound, slot.err = d.build(idx) })
	if slot.err != nil {
		return c0, c0, c0, slot.err
	}
	if slot.r == nil {
		b, b1 := slot.bound[0], slot.bound[1]
		box := b.Neg().Hull(b)
		return box, box, b1.Neg().Hull(b1), nil
	}
	ev := slot.r.eval(c0, delta)
	return ev.Vc.Re, ev.VS.Re, ev.dVS.Re, nil
}

func (d *diagInt[T]) build(idx int) (*pathRule[T], [2]T, error) {
	like := d.lo
	lo, hi := regimeRange(idx)
	if idx != 0 {
		side := 1
		S := lo
		if idx < 0 {
			side, S = -1, -hi
		}
		b, b1 := diagTail(d.width, d.hi, like.Float(S), side)
		if b.Hi() <= d.tol.Lo()/4 && b1.Hi() <= 1e-6 {
			return nil, [2]T{b, b1}, nil
		}
	}
	sR := like.Float(lo - math.Abs(lo)*1e-9).Hull(like.Float(hi + math.Abs(hi)*1e-9))
	// Away from s = 0 the line is moved to Im v = -side eta0 (see
	// diagTail: the integrand is analytic in |Im v| < pi/2 and decays at
	// both ends), where the integrand carries the factor e^{-2|s| eta0}.
	eta0, S, side := 0.0, 0.0, 0
	if idx != 0 {
		side, S = 1, lo
		if idx < 0 {
			side, S = -1, -hi
		}
		eta0 = 0.6
		if side > 0 && d.hif*math.Tan(eta0) > S*eta0 {
			eta0 = 0
		}
	}
	y0 := like.Float(-float64(side) * eta0)
	at := func(x interval.C[T]) (interval.C[T], interval.C[T]) {
		return d.at(interval.C[T]{Re: x.Re, Im: x.Im.Add(y0)})
	}
	wf := d.width.Hi()
	Vf := math.Log(32*wf/(math.Pi*d.tol.Lo())) + 1
	V := like.Float(Vf)
	pi := like.Pi()
	// |f| <= (W/pi) e^{2 hi tan eta0 (side +1)} |sech(x + i y0)| on the line,
	// |sech| <= 1/sinh|x| <= 2 e^{-|x|}/(1 - e^{-2V}) for |x| >= V, and
	// |e^{-2isv}| = e^{-2|s| eta0} <= e^{-2 S eta0}; |t| = 2|v| <= 2(|x| + eta0).
	g := like.Float(-2 * S * eta0)
	if side > 0 {
		g = g.Add(d.hi.Mul(interval.Tan(like.Float(eta0))).Scale(1))
	}
	ev := interval.Exp(V.Neg().Add(g)).Quo(like.Int(1).Sub(interval.Exp(V.Scale(1).Neg())))
	cut := interval.Upper(d.width.Mul(ev).Scale(2).Quo(pi))
	cut1 := interval.Upper(d.width.Mul(V.Add(like.Int(1)).Add(like.Float(eta0))).Mul(ev).Scale(3).Quo(pi))
	pr, err := buildPathRule(like, []pathLeg[T]{{x0: -Vf, x1: Vf, at: at}}, sR, d.tol.Scale(-1))
	if err != nil {
		return nil, [2]T{}, fmt.Errorf("band diagonal %s, regime %d: %v", d.lastName, idx, err)
	}
	pr.errT, pr.errT1 = cut, cut1
	return pr, [2]T{}, nil
}

// budget returns the largest quadrature and truncation bounds so far.
func (d *diagInt[T]) budget() (T, T) {
	q, t := d.lo.Int(0), d.lo.Int(0)
	d.mu.Lock()
	defer d.mu.Unlock()
	for _, slot := range d.regimes {
		if slot.r != nil {
			q = q.Max(slot.r.errQ)
			t = t.Max(slot.r.errT)
		} else if slot.err == nil {
			t = t.Max(slot.bound[0])
		}
	}
	return q, t
}

// diagTail bounds |D0(s)| and |D0'(s)| for side*s >= S > 0, for the
// profile 1[lo < u < hi] of width W = hi - lo (the verifier's own lemma).
//
// The integrand of D0 is analytic in |Im v| < pi/2 and decays at both
// ends, so the line may be moved to v = x - i side eta, 0 < eta < pi/2.
// There |e^{-2isv}| = e^{-2|s| eta} <= e^{-2S eta}; Im tanh(x + iy) =
// sin 2y/(cosh 2x + cos 2y) lies in [-tan eta, 0] for y = -eta and in
// [0, tan eta] for y = eta, so |e^{iuw}| = e^{-u Im w} (w = 2 tanh v) is at
// most e^{2 hi tan eta} for side +1 and at most 1 for side -1, and
// |G^| <= W times that; |sech(x -+ i eta)| = (sinh^2 x + cos^2 eta)^{-1/2}.
// Bounding the last by 1/cos eta on |x| <= 1 and by 1/sinh|x| beyond:
//
//	int_R |sech| dx <= 2 (1/cos eta + log coth(1/2)),
//	int_R |v| |sech| dx <= 2 ((1/2 + eta)/cos eta + 2/sinh 1 + eta log coth(1/2))
//
// (|v| <= |x| + eta; int_1^inf x csch x dx <= 2/(1 - e^{-2}) int_1^inf x e^{-x} dx
// = 2/sinh 1). So |D0| <= (W/pi) e^{g} Sigma0 and |D0'| <= (2W/pi) e^{g} Sigma1
// with g = -2 S eta (+ 2 hi tan eta for side +1). A few eta are tried.
func diagTail[T interval.Real[T]](W, hi, S T, side int) (T, T) {
	pi := S.Pi()
	em := interval.Exp(S.Int(-1))
	lc := interval.Log(S.Int(1).Add(em).Quo(S.Int(1).Sub(em))) // log coth(1/2)
	best, best1 := S.Whole(), S.Whole()
	for _, ef := range []float64{0.05, 0.1, 0.2, 0.35, 0.5, 0.7, 0.9, 1.1, 1.3, 1.45} {
		eta := S.Float(ef)
		g := S.Mul(eta).Scale(1).Neg()
		if side > 0 {
			g = g.Add(hi.Mul(interval.Tan(eta)).Scale(1))
		}
		cos := interval.Cos(eta)
		e := interval.Exp(g).Mul(W).Quo(pi)
		s0 := S.Int(1).Quo(cos).Add(lc).Scale(1)
		s1 := S.Frac(1, 2).Add(eta).Quo(cos).Add(S.Int(2).Quo(interval.Sinh(S.Int(1)))).Add(eta.Mul(lc)).Scale(1)
		b := interval.Upper(e.Mul(s0))
		b1 := interval.Upper(e.Mul(s1).Scale(1))
		if b.IsFinite() && (!best.IsFinite() || b.Hi() < best.Hi()) {
			best = b
		}
		if b1.IsFinite() && (!best1.IsFinite() || b1.Hi() < best1.Hi()) {
			best1 = b1
		}
	}
	return best, best1
}
