package relaxation

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"sync"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// expTerm encloses the unit-weight symbol of the profile h(xp) = e^{-k xp}
// on quadrant III, k > 0.
//
// Derivation (also in the regions package doc; re-done here). With G(u) = e^{-ku},
// G^(w) = int_0^inf G(u) e^{iuw} du = 1/(k - iw). The kernel of the
// quadrant-I symbol G(xp) is K(x, y) = [x+y > 0] G^(2(x-y)/(x+y))/(pi(x+y)),
// so with a = 1/2 + is:
//
//	M_{++}(s) = int_0^inf K(1, r) r^{a-1} dr
//	          = (1/pi) int_0^inf r^{a-1} / ((k - 2i) + (k + 2i) r) dr
//	          = e^{2 theta s} / (|k + 2i| cosh(pi s)),   theta = atan(2/k),
//
// by int_0^inf r^{a-1}/(alpha + beta r) dr = alpha^{-1} (beta/alpha)^{-a}
// pi/sin(pi a) with beta/alpha = q = e^{2i theta}, alpha^{-1} =
// e^{i theta}/|k+2i| and sin(pi a) = cosh(pi s); and
//
//	M_{+-}(s) = int_0^1 K(1, -r) r^{a-1} dr
//	          = (1/pi) int_0^1 r^{a-1} / ((k - 2i) - (k + 2i) r) dr
//	          = I(s) / (pi (k - 2i)),   I(s) = int_0^1 r^{a-1}/(1 - q r) dr.
//
// Parity moves the profile to quadrant III and swaps the channels, so the
// term contributes D = M_{++} to the (-,-) entry and B = conj(M_{+-}) =
// conj(I)/(pi (k + 2i)) to the (+,-) entry.
//
// I(s) is computed independently of the certifier's route: with t = -log r,
// I(s) = int_0^inf e^{-a t} g(t) dt, g(t) = 1/(1 - q e^{-t}), whose poles
// t = i(2 theta + 2 pi n), n in Z, all lie on the imaginary axis. For
// s >= 1 the path is turned to the ray t = y e^{-i pi/3}, for s <= -1 to
// t = y e^{i pi/3}, and for |s| <= 1 it stays on the real axis (see regime).
// No pole lies between the real axis and the ray, and on the arc |t| = R
// between them |e^{-at}| = e^{-R (cos(alpha)/2 + |s sin(alpha)|)} <=
// e^{-R cos(pi/3)/2} while |g| <= 1/(1 - e^{-R/2}), so the arc vanishes as
// R -> inf and the integral along the ray equals I(s). Along the ray
// |e^{-at}| = e^{-c y} with c = Re(a e^{i psi}) >= 1/4 + |s| sqrt(3)/2.
//
// The ray is cut at Y. The part y in [0, Y] is integrated by composite
// Clenshaw-Curtis rules with the remainder bound of checknum.Rule.Bound, the
// integrand being bounded on boxes covering each panel's Bernstein
// ellipse, for all s of the regime at once. Beyond Y, |q e^{-t}| =
// e^{-y cos psi} < 1, so g = sum_n q^n e^{-nt} converges uniformly and
//
//	int_{Y e^{i psi}}^{inf e^{i psi}} e^{-at} g dt = sum_n q^n e^{-(n+a) t_Y}/(n + a),
//
// t_Y = Y e^{i psi}; the first N terms are summed and the rest is bounded
// by sum_{n>=N} e^{-Y b_n}/b_n <= e^{-Y b_N}/(b_N (1 - e^{-Y cos psi})),
// b_n = n cos psi + c (|n + a| >= Re((n + a) e^{i psi}) = b_n). With N = 0
// this is plain truncation.
//
// The derivative I'(s) = int (-i t) e^{-at} g dt uses the same nodes (its
// integrand is bounded on the same boxes times |t|); its remainder beyond
// Y is at most sum_{n>=N} int_Y^inf y e^{-y b_n} dy <=
// e^{-Y b_N}(Y/b_N + 1/b_N^2)/(1 - e^{-Y cos psi}).
type expTerm[T interval.Real[T]] struct {
	kRat  *big.Rat
	k     T
	theta T // atan(2/k), in (0, pi/2)
	mod   T // |k + 2i|
	q     interval.C[T]
	kp    interval.C[T] // k + 2i
	tau   T             // absolute error target for I(s)

	mu      sync.Mutex
	regimes map[int]*regimeSlot[T]
}

type regimeSlot[T interval.Real[T]] struct {
	once sync.Once
	r    *expRegime[T]
	err  error
}

// expRegime holds the s-independent quadrature data for s in [lo, hi]:
// for every s there, I(s) lies in sum_j h_j e^{-i s t_j} + tail(s) padded
// by errQ + errT, and I'(s) in sum_j h_j (-i t_j) e^{-i s t_j} + tail'(s)
// padded by errQ1 + errT1.
type expRegime[T interval.Real[T]] struct {
	lo, hi   float64
	tre, tim []T // nodes t_j = y_j e^{i psi}
	tabs     []T // upper bounds of |t_j| (point intervals)
	h        []interval.C[T]
	errQ     T
	errQ1    T
	tY       interval.C[T]
	sigma    []interval.C[T] // q^n e^{-(n+1/2) t_Y}, n < N
	errT     T
	errT1    T
	panels   int
}

// termCache shares the terms (and so their quadrature regimes, which
// depend only on k and the arithmetic) between models in one process.
var termCache sync.Map

func init() {
	registerFamily("exp", family{
		start: expStart,
		newF: func(like interval.F, p map[string]certificates.Decimal) (termSymbol[interval.F], error) {
			return newExpTerm(like, p)
		},
		newB: func(like interval.B, p map[string]certificates.Decimal) (termSymbol[interval.B], error) {
			return newExpTerm(like, p)
		},
	})
}

// expStart is where the support of e^{-k u} starts: u = 0, since the
// profile is positive for every u > 0 (whatever k).
func expStart(map[string]certificates.Decimal) (*big.Rat, error) { return new(big.Rat), nil }

func newExpTerm[T interval.Real[T]](like T, params map[string]certificates.Decimal) (*expTerm[T], error) {
	if len(params) != 1 {
		return nil, errors.New(`the "exp" family takes exactly one parameter, k`)
	}
	ks, ok := params["k"]
	if !ok {
		return nil, errors.New(`the "exp" family needs the parameter k`)
	}
	k := ks.Rat()
	if k == nil {
		return nil, errors.New("exp parameter k: missing number")
	}
	if k.Sign() <= 0 {
		return nil, fmt.Errorf("exp parameter k must be positive, not %s", ks)
	}
	lo, hi := big.NewRat(1, 1000000), big.NewRat(1000000, 1)
	if k.Cmp(lo) < 0 || k.Cmp(hi) > 0 {
		return nil, fmt.Errorf("exp parameter k = %s is outside the supported range [1e-6, 1e6]", ks)
	}
	key := fmt.Sprintf("%T/%d/%s", like, like.Prec(), k.String())
	if v, ok := termCache.Load(key); ok {
		if e, ok := v.(*expTerm[T]); ok {
			return e, nil
		}
	}
	var encErr error
	rat := func(r *big.Rat) T {
		v, err := checknum.Enclose(like, r)
		if err != nil && encErr == nil {
			encErr = err
		}
		return v
	}
	k2 := new(big.Rat).Mul(k, k)
	den := new(big.Rat).Add(k2, big.NewRat(4, 1))
	qre := new(big.Rat).Quo(new(big.Rat).Sub(k2, big.NewRat(4, 1)), den)
	qim := new(big.Rat).Quo(new(big.Rat).Mul(k, big.NewRat(4, 1)), den)
	kt := rat(k)
	mod := rat(den).Sqrt()
	e := &expTerm[T]{
		kRat:    k,
		k:       kt,
		theta:   interval.Atan(rat(new(big.Rat).Quo(big.NewRat(2, 1), k))),
		mod:     mod,
		q:       interval.C[T]{Re: rat(qre), Im: rat(qim)},
		kp:      interval.C[T]{Re: kt, Im: like.Int(2)},
		regimes: map[int]*regimeSlot[T]{},
	}
	// The term enters B as conj(I)/(pi (k+2i)); an error tau in I moves B by
	// tau/(pi |k+2i|) per unit weight.
	e.tau = mod.Mul(like.Float(math.Ldexp(1, -int(like.Prec())+3)))
	if encErr != nil {
		return nil, fmt.Errorf("exp parameter k = %s: %w", ks, encErr)
	}
	if !e.theta.IsFinite() || !mod.IsFinite() {
		return nil, fmt.Errorf("exp parameter k = %s: constants not enclosed", ks)
	}
	v, _ := termCache.LoadOrStore(key, e)
	return v.(*expTerm[T]), nil
}

// regimeIndex returns the regime of the exact piece [a, b]: 0 for
// [-1, 1], m > 0 for [2^(m-1), 2^m], -m for [-2^m, -2^(m-1)]; ok is false
// when the piece crosses a regime boundary or leaves |s| <= 2^30.
func regimeIndex(a, b *big.Rat) (int, bool) {
	one := big.NewRat(1, 1)
	mone := big.NewRat(-1, 1)
	if a.Cmp(mone) >= 0 && b.Cmp(one) <= 0 {
		return 0, true
	}
	neg := false
	lo, hi := a, b
	if b.Sign() <= 0 {
		neg = true
		lo, hi = new(big.Rat).Neg(b), new(big.Rat).Neg(a)
	} else if a.Sign() < 0 {
		return 0, false
	}
	p := big.NewRat(1, 1)
	for m := 1; m <= 30; m++ {
		q := new(big.Rat).Mul(p, big.NewRat(2, 1))
		if lo.Cmp(p) >= 0 && hi.Cmp(q) <= 0 {
			if neg {
				return -m, true
			}
			return m, true
		}
		p = q
	}
	return 0, false
}

// regimeBreaks lists the regime boundaries in increasing order.
func regimeBreaks() []*big.Rat {
	var out []*big.Rat
	for m := 30; m >= 0; m-- {
		out = append(out, new(big.Rat).SetFrac(new(big.Int).Neg(new(big.Int).Lsh(big.NewInt(1), uint(m))), big.NewInt(1)))
	}
	for m := 0; m <= 30; m++ {
		out = append(out, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(m))))
	}
	return out
}

func regimeRange(idx int) (float64, float64) {
	if idx == 0 {
		return -1, 1
	}
	m := idx
	if m < 0 {
		m = -m
	}
	lo, hi := math.Ldexp(1, m-1), math.Ldexp(1, m)
	if idx < 0 {
		return -hi, -lo
	}
	return lo, hi
}

func (e *expTerm[T]) regime(idx int) (*expRegime[T], error) {
	e.mu.Lock()
	slot, ok := e.regimes[idx]
	if !ok {
		slot = &regimeSlot[T]{}
		e.regimes[idx] = slot
	}
	e.mu.Unlock()
	slot.once.Do(func() { slot.r, slot.err = e.buildRegime(idx) })
	return slot.r, slot.err
}

// Panel rule sizes tried, smallest first (even numbers of intervals).
var ccSizes = []int{6, 8, 12, 16, 20, 24, 32, 40, 48, 64, 80, 96, 128}

// Ellipse parameters tried for each panel.
var ccRhos = []float64{1.3, 1.6, 2, 2.6, 3.5, 5, 7, 10, 15, 22, 33}

func (e *expTerm[T]) buildRegime(idx int) (*expRegime[T], error) {
	like := e.k
	lo, hi := regimeRange(idx)
	// The bounds below hold on a range slightly wider than the regime, so
	// that enclosures of cell points rounded outward stay covered.
	sR := like.Float(lo - math.Abs(lo)*1e-9).Hull(like.Float(hi + math.Abs(hi)*1e-9))
	one := like.Int(1)
	rot := interval.C[T]{Re: one, Im: like.Int(0)}
	if idx != 0 {
		r3 := like.Int(3).Sqrt().Scale(-1)
		if idx > 0 {
			r3 = r3.Neg()
		}
		rot = interval.C[T]{Re: like.Frac(1, 2), Im: r3}
	}
	cosPsi := rot.Re
	// c(s) = Re((1/2 + is) e^{i psi}) = cos psi/2 - s sin psi; its minimum
	// over the range.
	cEnc := cosPsi.Scale(-1).Sub(sR.Mul(rot.Im))
	cmin := interval.Lower(cEnc)
	if cmin.Sign() <= 0 {
		return nil, fmt.Errorf("exp term: no decay on regime %d", idx)
	}
	reg := &expRegime[T]{lo: lo, hi: hi}
	tau := e.tau

	// Cut point Y and number N of series terms beyond it.
	remainder := func(Y T, n int) (T, T) {
		b := like.Int(int64(n)).Mul(cosPsi).Add(cmin)
		g := one.Sub(interval.Exp(Y.Mul(cosPsi).Neg()))
		ex := interval.Exp(Y.Mul(b).Neg())
		r0 := ex.Quo(b.Mul(g))
		r1 := ex.Mul(Y.Quo(b).Add(one.Quo(b.Sqr()))).Quo(g)
		return interval.Upper(r0), interval.Upper(r1)
	}
	quarter := tau.Scale(-2)
	cf := cmin.Lo()
	Yf := 3 / cosPsi.Hi()
	if yt := (math.Log(4/tau.Lo()) + 2) / cf; yt < Yf {
		for range 200 {
			r0, _ := remainder(like.Float(yt), 0)
			if r0.Hi() <= quarter.Lo() {
				break
			}
			yt *= 1.05
		}
		if yt < Yf {
			Yf = yt
		}
	}
	Y := like.Float(Yf)
	N := 0
	for ; N < 400; N++ {
		if r0, _ := remainder(Y, N); r0.Hi() <= quarter.Lo() {
			break
		}
	}
	reg.errT, reg.errT1 = remainder(Y, N)
	if reg.errT.Hi() > quarter.Lo() {
		return nil, fmt.Errorf("exp term: series tail not converging on regime %d", idx)
	}
	reg.tY = rot.MulReal(Y)
	for n := range N {
		nh := like.Frac(int64(2*n+1), 2)
		z := interval.C[T]{Re: reg.tY.Re.Mul(nh).Neg(), Im: reg.tY.Im.Mul(nh).Neg().Add(e.theta.Mul(like.Int(int64(2 * n))))}
		reg.sigma = append(reg.sigma, z.Exp())
	}

	// Panels on [0, Y], refined by bisection until each meets its share
	// tau/2 * length/Y of the error.
	type span struct{ a, b float64 }
	stack := []span{{0, Yf}}
	var done []span
	var sizes []int
	errQ, errQ1 := like.Int(0), like.Int(0)
	perLen := tau.Scale(-1).Quo(Y)
	for len(stack) > 0 {
		p := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		target := perLen.Mul(like.Float(p.b - p.a))
		n, b0, b1, ok := e.panelRule(like, rot, sR, p.a, p.b, target)
		if ok {
			done = append(done, p)
			sizes = append(sizes, n)
			errQ = errQ.Add(b0)
			errQ1 = errQ1.Add(b1)
			continue
		}
		mid := p.a + (p.b-p.a)/2
		if !(mid > p.a && mid < p.b) || p.b-p.a < Yf*1e-12 || len(done)+len(stack) > 4000 {
			return nil, fmt.Errorf("exp term k=%s: quadrature does not converge on regime %d", e.kRat.RatString(), idx)
		}
		stack = append(stack, span{mid, p.b}, span{p.a, mid})
	}
	reg.errQ, reg.errQ1 = interval.Upper(errQ), interval.Upper(errQ1)
	reg.panels = len(done)
	// Nodes in increasing y; a shared panel end is one node.
	var lastY float64 = -1
	for pi, p := range done {
		rule, err := checknum.ClenshawCurtis(like, sizes[pi])
		if err != nil {
			return nil, err
		}
		y0, y1 := like.Float(p.a), like.Float(p.b)
		m := y0.Add(y1).Scale(-1)
		l := y1.Sub(y0).Scale(-1)
		for j := rule.N; j >= 0; j-- {
			var y T
			var yf float64
			switch j {
			case rule.N:
				y, yf = y0, p.a
			case 0:
				y, yf = y1, p.b
			default:
				y, yf = m.Add(l.Mul(rule.X[j])), math.NaN()
			}
			t := rot.MulReal(y)
			// s-free part of the integrand times dt = e^{i psi} dy and the weight.
			f := t.Scale(-1).Neg().Exp().Quo(interval.RealC(one).Sub(e.q.Mul(t.Neg().Exp())))
			hj := f.Mul(rot).MulReal(l.Mul(rule.W[j]))
			if yf == lastY && len(reg.h) > 0 {
				reg.h[len(reg.h)-1] = reg.h[len(reg.h)-1].Add(hj)
				continue
			}
			reg.tre = append(reg.tre, t.Re)
			reg.tim = append(reg.tim, t.Im)
			reg.tabs = append(reg.tabs, interval.Upper(t.Abs()))
			reg.h = append(reg.h, hj)
			if j == 0 {
				lastY = yf
			} else {
				lastY = -1
			}
		}
	}
	for _, h := range reg.h {
		if !h.IsFinite() {
			return nil, fmt.Errorf("exp term k=%s: node weights not enclosed on regime %d", e.kRat.RatString(), idx)
		}
	}
	return reg, nil
}

// panelRule picks the smallest Clenshaw-Curtis size whose remainder bound
// on the panel [a, b] of the ray meets target for every s in sR; it
// returns the bounds for I and I' (already scaled by the half-length).
// Ellipse parameters are tried in increasing order (the ellipses are
// nested, so once one may hold a pole every larger one may too) until the
// required size stops improving.
func (e *expTerm[T]) panelRule(like T, rot interval.C[T], sR T, a, b float64, target T) (int, T, T, bool) {
	return smallestRule(like, ccRhos, a, b, target, func(m, l T, rf float64) (T, T, bool) {
		return e.ellipseMax(like, rot, sR, m, l, rf)
	})
}

// sinSqLower returns a lower bound of sin^2 over the interval u: 0 when u
// may contain a multiple of pi, else (4/pi^2) d^2 with d the distance from
// u to the nearest multiple (|sin v| >= 2 dist(v, pi Z)/pi, by concavity
// of sin on [0, pi]).
func sinSqLower[T interval.Real[T]](u T) T {
	zero := u.Int(0)
	if !u.IsFinite() || u.Hi()-u.Lo() > 3 {
		return zero
	}
	pi := u.Pi()
	m := math.Floor(u.Lo() / math.Pi)
	left := pi.Mul(u.Float(m))
	right := pi.Mul(u.Float(m + 1))
	lo, hi := interval.Lower(u), interval.Upper(u)
	if !left.Less(lo) || !hi.Less(right) {
		return zero
	}
	d := interval.Lower(lo.Sub(left)).Min(interval.Lower(right.Sub(hi)))
	return interval.Lower(d.Sqr().Scale(2).Quo(pi.Sqr()))
}

// ellipseMax bounds |e^{-at} g(t)| and |t e^{-at} g(t)| for every s in sR
// and every t = e^{i psi}(m + l z) with z in the closed Bernstein ellipse
// E_rho, by covering the ellipse with boxes (refined where a box is too
// coarse to separate it from a pole). ok is false when some box may hold a
// pole of g.
//
// On a box, |e^{-at}| = exp(s Im t - Re t/2) is bounded in interval
// arithmetic, and with w = t - 2i theta (so q e^{-t} = e^{-w})
// |1 - e^{-w}|^2 = (1 - e^{-Re w})^2 + 4 e^{-Re w} sin^2(Im w/2) is bounded
// below; both formulas hold for every complex t.
func (e *expTerm[T]) ellipseMax(like T, rot interval.C[T], sR, m, l T, rho float64) (T, T, bool) {
	one := like.Int(1)
	twoTheta := e.theta.Scale(1)
	return ellipseMax(like, m, l, rho, func(z interval.C[T]) (T, T, bool) {
		t := rot.Mul(z)
		ex := interval.Exp(sR.Mul(t.Im).Sub(t.Re.Scale(-1)))
		er := interval.Exp(t.Re.Neg())
		sn := sinSqLower(t.Im.Sub(twoTheta).Scale(-1))
		d2 := interval.Lower(one.Sub(er).Sqr().Add(interval.Lower(er).Mul(sn).Scale(2)))
		if d2.Sign() <= 0 || !ex.IsFinite() {
			return d2, d2, false
		}
		return interval.Upper(ex.Quo(d2.Sqrt())), t.Abs(), true
	})
}

// iEval holds enclosures of I at a point c and of I and I' over a cell
// around it.
type iEval[T interval.Real[T]] struct {
	Ic, IS, dIS interval.C[T]
}

// evalI encloses I(c) at the point c and I(s), I'(s) for every s in the
// cell S, where S lies within [c - delta, c + delta] and within the regime.
//
// The cell part uses e^{-i s t_j} = e^{-i c t_j} e^{-i (s-c) t_j} and
// |e^{z} - 1| <= e^{|z|} - 1 with |z| <= delta |t_j|: the rule's value at
// any s of the cell lies within sum_j |h_j e^{-i c t_j}| (e^{delta |t_j|} - 1)
// of its value at c, and likewise for the derivative rule.
func (e *expTerm[T]) evalI(reg *expRegime[T], c, S, delta T) iEval[T] {
	zero := c.Int(0)
	p0 := interval.RealC(zero)
	p1 := p0
	r0, r1 := zero, zero
	half := c.Frac(1, 2)
	for j, h := range reg.h {
		// E_j = exp(-i c t_j) = exp(c Im t_j - i c Re t_j).
		E := interval.C[T]{Re: c.Mul(reg.tim[j]), Im: c.Mul(reg.tre[j]).Neg()}.Exp()
		hE := h.Mul(E)
		p0 = p0.Add(hE)
		// (-i t_j) hE
		p1 = p1.Add(interval.C[T]{Re: reg.tim[j], Im: reg.tre[j].Neg()}.Mul(hE))
		x := delta.Mul(reg.tabs[j])
		var eps T
		if x.Hi() <= 0.5 {
			eps = x.Add(x.Sqr()) // e^x - 1 <= x + x^2 for 0 <= x <= 1/2
		} else {
			eps = interval.Expm1(x)
		}
		mag := hE.Re.Abs().Add(hE.Im.Abs())
		r0 = r0.Add(mag.Mul(eps))
		r1 = r1.Add(mag.Mul(reg.tabs[j]).Mul(eps))
	}
	_ = half
	// Series part beyond t_Y: sum_n sigma_n e^{-i s t_Y}/(n + a), a = 1/2 + is.
	tailAt := func(s T) (interval.C[T], interval.C[T]) {
		E := interval.C[T]{Re: s.Mul(reg.tY.Im), Im: s.Mul(reg.tY.Re).Neg()}.Exp()
		v, d := interval.RealC(zero), interval.RealC(zero)
		mit := interval.C[T]{Re: reg.tY.Im, Im: reg.tY.Re.Neg()} // -i t_Y
		for n, sg := range reg.sigma {
			inv := interval.C[T]{Re: s.Frac(int64(2*n+1), 2), Im: s}.Inv()
			term := sg.Mul(E).Mul(inv)
			v = v.Add(term)
			// d/ds: term * (-i t_Y - i/(n + a))
			mi := interval.C[T]{Re: inv.Im, Im: inv.Re.Neg()}
			d = d.Add(term.Mul(mit.Add(mi)))
		}
		return v, d
	}
	tc, _ := tailAt(c)
	tS, dS := tailAt(S)
	errI := reg.errQ.Add(reg.errT)
	errD := reg.errQ1.Add(reg.errT1)
	pad := func(z interval.C[T], r T) interval.C[T] {
		return interval.C[T]{Re: z.Re.Pad(r), Im: z.Im.Pad(r)}
	}
	return iEval[T]{
		Ic:  pad(p0.Add(tc), errI),
		IS:  pad(p0.Add(tS), interval.Upper(errI.Add(r0))),
		dIS: pad(p1.Add(dS), interval.Upper(errD.Add(r1))),
	}
}

// mpp encloses M_{++}(s) = e^{2 theta s}/(|k+2i| cosh(pi s)) for every s
// in S, written as 2 e^{2 theta s - pi |s|}/(|k+2i| (1 + e^{-2 pi |s|}))
// so that nothing overflows.
func (e *expTerm[T]) mpp(S T) T {
	pi := S.Pi()
	as := S.Abs()
	num := interval.Exp(e.theta.Scale(1).Mul(S).Sub(pi.Mul(as))).Scale(1)
	den := e.mod.Mul(S.Int(1).Add(interval.Exp(pi.Scale(1).Mul(as).Neg())))
	return num.Quo(den)
}

// mppDeriv encloses d/ds M_{++}(s) = M_{++}(s) (2 theta - pi tanh(pi s)).
func (e *expTerm[T]) mppDeriv(S, mppS T) T {
	return mppS.Mul(e.theta.Scale(1).Sub(S.Pi().Mul(interval.Tanh(S.Pi().Mul(S)))))
}

// bFromI returns the term's B entry conj(I)/(pi (k + 2i)).
func (e *expTerm[T]) bFromI(I interval.C[T]) interval.C[T] {
	return I.Conj().Quo(e.kp.MulReal(I.Re.Pi()))
}

// tailConst encloses C(k) = (1/4 + atan(k/2) |k+2i|/(4k))/pi, the constant
// of the tail lemma |B_term(s)| <= C(k)/|1/2 + is|.
//
// Proof. Integrating r^{a-1} by parts (r^a/a vanishes at 0 as Re a = 1/2),
// I = 1/(a(1 - q)) - (q/a) int_0^1 r^a/(1 - q r)^2 dr, and |r^a| <= 1,
// |q| = 1 give |I| <= (1/|a|)(1/|1 - q| + int_0^1 dr/|1 - qr|^2). Here
// |1 - q| = 2 sin theta = 4/|k+2i|, and |1 - qr|^2 = (r - cos 2theta)^2 +
// sin^2 2theta, so the integral is
// [atan((r - cos 2theta)/sin 2theta)]_0^1 / sin 2theta
// = (theta + pi/2 - 2 theta)/sin 2theta = atan(k/2) |k+2i|^2/(4k), using
// sin 2theta = 4k/|k+2i|^2 and pi/2 - theta = atan(k/2). Dividing by
// pi |k + 2i| gives |B_term| <= C(k)/|a|.
func (e *expTerm[T]) tailConst() T {
	like := e.k
	c := interval.Atan(e.k.Scale(-1)).Mul(e.mod).Quo(e.k.Scale(2)).Add(like.Frac(1, 4))
	return interval.Upper(c.Quo(like.Pi()))
}

// tailD bounds 0 < M_{++}(s) <= 2 e^{-(pi -+ 2 theta) S}/|k + 2i| for
// s >= S (upper sign, side +1) or s <= -S (side -1), S > 0, from
// cosh(pi s) >= e^{pi |s|}/2 and 0 < theta < pi/2.
func (e *expTerm[T]) tailDBound(S T, side int) T {
	pi := S.Pi()
	rate := pi.Sub(e.theta.Scale(1).Mul(S.Int(int64(side))))
	return interval.Upper(interval.Exp(rate.Mul(S).Neg()).Scale(1).Quo(e.mod))
}

// piece implements termSymbol: D = M_{++} in closed form, B from the
// quadrature of I(s) on the regime's ray.
func (e *expTerm[T]) piece(idx int, c, S, delta T) (pt, cell, der entries[T], err error) {
	reg, err := e.regime(idx)
	if err != nil {
		return pt, cell, der, err
	}
	ev := e.evalI(reg, c, S, delta)
	mS := e.mpp(S)
	pt = entries[T]{D: e.mpp(c), B: e.bFromI(ev.Ic)}
	cell = entries[T]{D: mS, B: e.bFromI(ev.IS)}
	der = entries[T]{D: e.mppDeriv(S, mS), B: e.bFromI(ev.dIS)}
	return pt, cell, der, nil
}

// tailB implements termSymbol: |B| <= C(k)/|1/2 + is| <= C(k)/sqrt(1/4 + S^2).
func (e *expTerm[T]) tailB(S T, side int) T {
	aMin := interval.Lower(S.Frac(1, 4).Add(S.Sqr()).Sqrt())
	return interval.Upper(e.tailConst().Quo(aMin))
}

// tailD implements termSymbol: 0 < D <= tailDBound.
func (e *expTerm[T]) tailD(S T, side int) T {
	return S.Int(0).Hull(e.tailDBound(S, side))
}

// limitD implements termSymbol: M_{++} -> 0 on both sides.
func (e *expTerm[T]) limitD(int) *big.Rat { return new(big.Rat) }

// budget implements termSymbol: the regimes' errQ and errT scaled by
// 1/(pi |k+2i|) (the factor from I to B).
func (e *expTerm[T]) budget() (T, T) {
	like := e.k
	scale := like.Int(1).Quo(e.mod.Mul(like.Pi()))
	q, t := like.Int(0), like.Int(0)
	e.mu.Lock()
	defer e.mu.Unlock()
	for _, slot := range e.regimes {
		if slot.r != nil {
			q = q.Max(interval.Upper(slot.r.errQ.Mul(scale)))
			t = t.Max(interval.Upper(slot.r.errT.Mul(scale)))
		}
	}
	return q, t
}
