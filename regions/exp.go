package regions

import (
	"fmt"
	"math"
	"math/cmplx"
	"sync"

	"wedgebound/interval"
)

// expTerm is the exponential profile h(xp) = e^{-k xp} on quadrant III,
// k > 0. With G(u) = e^{-ku}, G^(w) = 1/(k - i w), and the quadrant-I
// entries of the package doc ("Mellin diagonalisation") evaluate to
//
//	M_{++}(s) = e^{2 theta s} / (|k + 2i| cosh(pi s)),  theta = atan(2/k),
//	M_{+-}(s) = I(s) / (pi (k - 2i)),  I(s) = int_0^1 r^{a-1}/(1 - q r) dr,
//
// a = 1/2 + is, q = (k + 2i)/(k - 2i) = e^{2 i theta}. The first is the
// Mellin integral int_0^inf r^{a-1}/(alpha + beta r) dr =
// alpha^{-1} (beta/alpha)^{-a} pi / sin(pi a) with alpha = k - 2i,
// beta = k + 2i. By parity the quadrant-III profile contributes
// D = M_{++} and B = conj(M_{+-}).
//
// I(s) is computed as int_0^inf e^{-a t}/(1 - q e^{-t}) dt (t = -log r),
// whose poles t = i(2 theta + 2 pi n) lie on the imaginary axis. For
// s >= 1 the path is turned to t = y e^{-i pi/4}, for s <= -1 to
// t = y e^{i pi/4} (no pole is crossed and the arc at infinity vanishes
// because Re(a t) -> +inf inside the sector), so the integrand decays like
// e^{-c y} with c = (1/2 + |s|)/sqrt 2 and no digits are lost for large |s|.
// The path is cut at Y with the tail bound e^{-cY}/(c (1 - e^{-Y cos phi}))
// and split into panels; each panel uses Gauss-Legendre with the
// Bernstein-ellipse remainder of gaussBound, M being a rigorous bound of the
// integrand (over the whole s-range of the regime) on boxes covering the
// ellipse.
type expTerm[T interval.Real[T]] struct {
	kStr  string
	k     T
	theta T
	mod   T // |k + 2i|
	q     interval.C[T]
	kp    interval.C[T] // k + 2i

	mu      sync.Mutex
	regimes map[int]*expRegime[T]
}

// expRegime is the quadrature for s in [lo, hi]: I(s) lies in
// sum_j h_j e^{-i s t_j} padded by err for every s there.
type expRegime[T interval.Real[T]] struct {
	lo, hi T
	t, h   []interval.C[T]
	err    T       // bound for I(s)
	d      float64 // the pole scale the layout was graded to
	quad   float64
	trunc  float64
	errD   T // bound for I'(s)
	ft, fh []complex128
}

const expNodes = 20

func init() { registerFamily("exp", newExpTerm[interval.F], newExpTerm[interval.B]) }

func newExpTerm[T interval.Real[T]](like T, params map[string]string) (Term[T], error) {
	if len(params) != 1 || params["k"] == "" {
		return nil, fmt.Errorf("exp term needs exactly the parameter k")
	}
	r, err := ParseRat(params["k"])
	if err != nil {
		return nil, fmt.Errorf("exp term k: %v", err)
	}
	if r.Sign() <= 0 {
		return nil, fmt.Errorf("exp term k must be positive, not %s", params["k"])
	}
	kf, _ := r.Float64()
	if kf < 1e-6 || kf > 1e6 {
		return nil, fmt.Errorf("exp term k = %s is outside [1e-6, 1e6]", params["k"])
	}
	k, err := like.Decimal(params["k"])
	if err != nil {
		return nil, err
	}
	return NewExp(k, RatString(r)), nil
}

// NewExp returns the exponential term e^{-k xp} for the exact k enclosed by
// k (kStr is its decimal form, recorded in certificates).
func NewExp[T interval.Real[T]](k T, kStr string) Term[T] {
	two := k.Int(2)
	kp := interval.C[T]{Re: k, Im: two}
	km := kp.Conj()
	return &expTerm[T]{
		kStr: kStr, k: k,
		theta:   interval.Atan(two.Quo(k)),
		mod:     kp.Abs(),
		q:       kp.Quo(km),
		kp:      kp,
		regimes: map[int]*expRegime[T]{},
	}
}

func (e *expTerm[T]) Kind() string              { return "exp" }
func (e *expTerm[T]) Params() map[string]string { return map[string]string{"k": e.kStr} }
func (e *expTerm[T]) Start() string             { return "0" }

// regimeIndex maps s to its regime: 0 for |s| <= 1, +-(m+1) for
// 2^m <= |s| <= 2^(m+1).
func regimeIndex(s float64) int {
	a := math.Abs(s)
	if a <= 1 {
		return 0
	}
	m := int(math.Floor(math.Log2(a)))
	if math.Ldexp(1, m) > a {
		m--
	}
	if m > 60 {
		m = 60
	}
	if s < 0 {
		return -(m + 1)
	}
	return m + 1
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
	defer e.mu.Unlock()
	if r, ok := e.regimes[idx]; ok {
		return r, nil
	}
	r, err := e.buildRegime(idx)
	if err != nil {
		return nil, err
	}
	e.regimes[idx] = r
	return r, nil
}

// buildRegime sets up the turned path, panels, nodes and error bound for
// the regime idx, graded to this term's own pole scale.
func (e *expTerm[T]) buildRegime(idx int) (*expRegime[T], error) {
	lay, err := newExpLayout(e.k, idx, e.poleScale())
	if err != nil {
		return nil, err
	}
	regs, err := regimesOn(lay, []*expTerm[T]{e})
	if err != nil {
		return nil, err
	}
	return regs[0], nil
}

// poleScale is the distance scale 2 theta/sqrt 2 of the nearest pole of
// the integrand from the turned path; the first panels are graded down to
// it.
func (e *expTerm[T]) poleScale() float64 {
	return math.Max(2*e.theta.Lo()/math.Sqrt2, 1e-12)
}

// expLayout is the integration path of one regime: the direction, the
// panel edges and the tail beyond the last panel. Nothing in it depends
// on k except through the grading scale d, so every exponential term
// whose pole scale is at least d can use the same layout (and then the
// same nodes).
type expLayout[T interval.Real[T]] struct {
	idx         int
	d           float64
	sr          T
	rot         interval.C[T]
	Y           T
	edges       []float64
	tail, tailD T
}

// newExpLayout lays out the path of regime idx with the first panels
// graded down to the pole scale d.
func newExpLayout[T interval.Real[T]](like T, idx int, d float64) (*expLayout[T], error) {
	slo, shi := regimeRange(idx)
	sr := like.Float(slo).Hull(like.Float(shi))
	dir := 0 // path t = y e^{i dir pi/4}
	switch {
	case idx > 0:
		dir = -1
	case idx < 0:
		dir = 1
	}
	one := like.Int(1)
	rot := interval.C[T]{Re: one, Im: like.Int(0)}
	cosphi := one
	var c float64 // decay rate along the path, lower bound over the regime
	if dir != 0 {
		r2 := like.Int(2).Sqrt().Quo(like.Int(2))
		rot = interval.C[T]{Re: r2, Im: r2.Mul(like.Int(int64(dir)))}
		cosphi = r2
		c = (0.5 + math.Min(math.Abs(slo), math.Abs(shi))) / math.Sqrt2 * 0.999
	} else {
		c = 0.5 * 0.999
	}
	omega := math.Max(math.Abs(slo), math.Abs(shi)) + 1
	if dir != 0 {
		omega /= math.Sqrt2
	}
	Yf := 48 / c
	Y := like.Float(Yf)
	// Tail beyond Y: |e^{-at}| <= e^{-c y}, |1 - q e^{-t}| >= 1 - e^{-y cos phi}
	// (|q| = 1 for every k).
	cT := like.Float(c)
	cCheck := decayLower(sr, dir)
	if cCheck.Less(cT) {
		return nil, fmt.Errorf("exp term: decay rate check failed in regime %d", idx)
	}
	// and for the derivative (integrand times |t| = y):
	// int_Y^inf y e^{-c y} dy = e^{-cY} (Y/c + 1/c^2).
	tailDen := one.Sub(interval.Exp(Y.Mul(cosphi).Neg()))
	tail := interval.Exp(cT.Mul(Y).Neg()).Quo(cT.Mul(tailDen))
	tailD := interval.Exp(cT.Mul(Y).Neg()).Mul(Y.Quo(cT).Add(one.Quo(cT.Sqr()))).Quo(tailDen)
	// Panels: geometric from the pole scale up to length L, uniform of length
	// L to 8/c, then doubling to Y (the integrand is below e^{-8} there).
	L := 6 / math.Max(c, omega)
	if dir == 0 {
		L = math.Min(8, 6/omega)
	}
	edges := []float64{0, math.Min(d/2, L)}
	for edges[len(edges)-1] < Yf {
		last := edges[len(edges)-1]
		step := math.Min(last, L)
		if last > 8/c {
			step = last
		}
		next := math.Min(last+step, Yf)
		edges = append(edges, next)
	}
	return &expLayout[T]{idx: idx, d: d, sr: sr, rot: rot, Y: Y, edges: edges, tail: tail, tailD: tailD}, nil
}

// regimesOn builds the quadrature of every term on the shared layout: the
// same nodes t_j for all, each term with its own weights h_j and its own
// remainder bounds (the panel bounds share the s-free factors of the
// integrand across terms, see panelBounds).
func regimesOn[T interval.Real[T]](lay *expLayout[T], terms []*expTerm[T]) ([]*expRegime[T], error) {
	like := lay.sr
	rule, err := gaussLegendre(like, expNodes)
	if err != nil {
		return nil, err
	}
	n := len(terms)
	regs := make([]*expRegime[T], n)
	total := make([]T, n)
	totalD := make([]T, n)
	for i := range terms {
		regs[i] = &expRegime[T]{lo: lay.sr, hi: lay.sr, d: lay.d}
		total[i], totalD[i] = lay.tail, lay.tailD
	}
	edges := lay.edges
	for p := 0; p+1 < len(edges); p++ {
		y0, y1 := like.Float(edges[p]), like.Float(edges[p+1])
		if p+1 == len(edges)-1 {
			y1 = lay.Y
		}
		mid := y0.Add(y1).Scale(-1)
		hh := y1.Sub(y0).Scale(-1)
		b, bd, ok := panelBounds(terms, lay.sr, lay.rot, mid, hh)
		if !ok {
			return nil, fmt.Errorf("exp term k=%s: no analytic ellipse for panel %d of regime %d", terms[0].kStr, p, lay.idx)
		}
		for j := range rule.x {
			y := mid.Add(hh.Mul(rule.x[j]))
			t := lay.rot.MulReal(y)
			ft := complex((t.Re.Lo()+t.Re.Hi())/2, (t.Im.Lo()+t.Im.Hi())/2)
			for i, e := range terms {
				g := e.integrandNoS(t)
				h := g.Mul(lay.rot).MulReal(hh.Mul(rule.w[j]))
				r := regs[i]
				r.t = append(r.t, t)
				r.h = append(r.h, h)
				r.ft = append(r.ft, ft)
				r.fh = append(r.fh, complex((h.Re.Lo()+h.Re.Hi())/2, (h.Im.Lo()+h.Im.Hi())/2))
			}
		}
		for i := range terms {
			if !b[i].IsFinite() || !bd[i].IsFinite() {
				return nil, fmt.Errorf("exp term k=%s: no analytic ellipse for panel %d of regime %d", terms[i].kStr, p, lay.idx)
			}
			total[i] = total[i].Add(b[i])
			totalD[i] = totalD[i].Add(bd[i])
		}
	}
	for i, e := range terms {
		if !total[i].IsFinite() || !totalD[i].IsFinite() {
			return nil, fmt.Errorf("exp term k=%s: error bound not finite in regime %d", e.kStr, lay.idx)
		}
		regs[i].err, regs[i].errD = total[i], totalD[i]
		regs[i].quad = total[i].Sub(lay.tail).Hi()
		regs[i].trunc = lay.tail.Hi()
	}
	return regs, nil
}

// decayLower encloses min over s in sr of Re(a t)/y = cos phi/2 - s sin phi.
func decayLower[T interval.Real[T]](sr T, dir int) T {
	if dir == 0 {
		return sr.Frac(1, 2)
	}
	r2 := sr.Int(2).Sqrt().Quo(sr.Int(2))
	// cos phi = r2, sin phi = dir r2: r2 (1/2 - dir s).
	v := sr.Frac(1, 2).Sub(sr.Mul(sr.Int(int64(dir)))).Mul(r2)
	return interval.Lower(v)
}

// integrandNoS encloses e^{-t/2} / (1 - q e^{-t}), the s-free part of the
// integrand (the full integrand is this times e^{-i s t}).
func (e *expTerm[T]) integrandNoS(t interval.C[T]) interval.C[T] {
	one := interval.RealC(t.Re.Int(1))
	et := t.Neg().Exp()
	den := one.Sub(e.q.Mul(et))
	return t.Scale(-1).Neg().Exp().Quo(den)
}

// panelBounds returns, for each term, the Gauss remainder bounds for I
// and I' on the panel with centre mid and half-length hh, each minimised
// over a few ellipse parameters rho. The integrand modulus
// |e^{-a t}|/|1 - q e^{-t}| (times |t| for I') is bounded for all s in sr
// on a grid of boxes covering the ellipse's bounding box; the factors
// that do not depend on k (e^{-a t} and e^{-t} on each box) are enclosed
// once for all terms. A term for which no ellipse works gets a
// non-finite bound; ok is false if no term has a finite one.
func panelBounds[T interval.Real[T]](terms []*expTerm[T], sr T, rot interval.C[T], mid, hh T) ([]T, []T, bool) {
	n := len(terms)
	best := make([]T, n)
	bestD := make([]T, n)
	found := make([]bool, n)
	for _, rf := range []float64{8, 5, 3.5, 2.5, 1.8, 1.4, 1.2} {
		rho := mid.Float(rf)
		inv := mid.Int(1).Quo(rho)
		ax := hh.Mul(rho.Add(inv)).Scale(-1) // semi-major
		bx := hh.Mul(rho.Sub(inv)).Scale(-1) // semi-minor
		M, MD := boxMax(terms, sr, rot, mid.Sub(ax), mid.Add(ax), bx)
		for i := range terms {
			if !M[i].IsFinite() || !MD[i].IsFinite() {
				continue
			}
			b := gaussBound(M[i], rho, expNodes).Mul(hh)
			bd := gaussBound(MD[i], rho, expNodes).Mul(hh)
			if !found[i] || b.Add(bd).Hi() < best[i].Add(bestD[i]).Hi() {
				best[i], bestD[i], found[i] = b, bd, true
			}
		}
	}
	any := false
	for i := range terms {
		if !found[i] {
			best[i], bestD[i] = sr.Whole(), sr.Whole()
		} else {
			any = true
		}
	}
	return best, bestD, any
}

// boxMax bounds, for each term, M = |e^{-a t}/(1 - q e^{-t})| and
// MD = |t| M for t = rot*(x + i y), x in [x0, x1], |y| <= by, s in sr, by
// a 8 x 4 grid of boxes. A term whose denominator may vanish on some box
// gets non-finite bounds.
func boxMax[T interval.Real[T]](terms []*expTerm[T], sr T, rot interval.C[T], x0, x1, by T) ([]T, []T) {
	const nx, ny = 8, 4
	x0l, x1h := interval.Lower(x0), interval.Upper(x1)
	w := x1h.Sub(x0l)
	M := make([]T, len(terms))
	MD := make([]T, len(terms))
	for i := range terms {
		M[i], MD[i] = sr.Int(0), sr.Int(0)
	}
	one := interval.RealC(sr.Int(1))
	for i := range nx {
		xa := x0l.Add(w.Mul(sr.Frac(int64(i), nx)))
		xb := x0l.Add(w.Mul(sr.Frac(int64(i+1), nx)))
		for j := range ny {
			ya := by.Mul(sr.Frac(int64(2*j-ny), ny))
			yb := by.Mul(sr.Frac(int64(2*j+2-ny), ny))
			z := interval.C[T]{Re: xa.Hull(xb), Im: ya.Hull(yb)}
			t := rot.Mul(z)
			// Re(a t) = Re t/2 - s Im t.
			re := t.Re.Scale(-1).Sub(sr.Mul(t.Im))
			num := interval.Exp(re.Neg())
			et := t.Neg().Exp()
			ta := t.Abs()
			for k, e := range terms {
				den := one.Sub(e.q.Mul(et)).Abs()
				if den.Sign() <= 0 || !num.IsFinite() {
					M[k], MD[k] = sr.Whole(), sr.Whole()
					continue
				}
				// Upper ends only: num/den and |t| num/den are positive, so
				// the upper end of each quotient and product is the bound.
				m := num.Quo(den)
				M[k] = M[k].Max(m)
				MD[k] = MD[k].Max(m.Mul(ta))
			}
		}
	}
	for k := range terms {
		M[k], MD[k] = interval.Upper(M[k]), interval.Upper(MD[k])
	}
	return M, MD
}

// integralI encloses I(s) (deriv false) or I'(s) (deriv true) for every s
// in the interval s, which must lie within one regime. I'(s) is the same
// path integral with the extra factor -i t.
func (e *expTerm[T]) integralI(s T, idx int, deriv bool) (interval.C[T], error) {
	r, err := e.regime(idx)
	if err != nil {
		return interval.C[T]{}, err
	}
	sum := interval.RealC(s.Int(0))
	for j, t := range r.t {
		// e^{-i s t} = e^{s Im t} (cos(s Re t) - i sin(s Re t))
		mag := interval.Exp(s.Mul(t.Im))
		sn, cs := interval.SinCos(s.Mul(t.Re))
		f := interval.C[T]{Re: cs.Mul(mag), Im: sn.Mul(mag).Neg()}
		if deriv {
			f = f.Mul(interval.C[T]{Re: t.Im, Im: t.Re.Neg()})
		}
		sum = sum.Add(r.h[j].Mul(f))
	}
	pad := r.err
	if deriv {
		pad = r.errD
	}
	return interval.C[T]{Re: sum.Re.Pad(pad), Im: sum.Im.Pad(pad)}, nil
}

// overRegimes encloses I or I' over s by splitting it at regime boundaries.
func (e *expTerm[T]) overRegimes(s T, deriv bool) (interval.C[T], bool) {
	var I interval.C[T]
	first := true
	for idx := regimeIndex(s.Lo()); idx <= regimeIndex(s.Hi()); idx++ {
		rlo, rhi := regimeRange(idx)
		part := intersectReal(s, s.Float(rlo).Hull(s.Float(rhi)))
		v, err := e.integralI(part, idx, deriv)
		if err != nil {
			return I, false
		}
		if first {
			I, first = v, false
		} else {
			I = I.Hull(v)
		}
	}
	return I, true
}

// diagonal encloses D(s) = 2 e^{2 theta s - pi |s|} / (|k+2i| (1 + e^{-2 pi |s|})),
// which is e^{2 theta s}/(|k+2i| cosh(pi s)) without overflow.
func (e *expTerm[T]) diagonal(s T) T {
	pi := s.Pi()
	as := s.Abs()
	num := interval.Exp(e.theta.Scale(1).Mul(s).Sub(pi.Mul(as))).Scale(1)
	den := e.mod.Mul(s.Int(1).Add(interval.Exp(pi.Scale(1).Mul(as).Neg())))
	return num.Quo(den)
}

// Enclose returns D = M_{++} and B = conj(M_{+-}) for every s in s.
func (e *expTerm[T]) Enclose(s T) Symbol[T] {
	pi := s.Pi()
	d := e.diagonal(s)
	I, ok := e.overRegimes(s, false)
	if !ok {
		w := s.Whole()
		return Symbol[T]{A: s.Int(0), D: d, B: interval.C[T]{Re: w, Im: w}}
	}
	// B = conj(I/(pi (k - 2i))) = conj(I) / (pi (k + 2i)).
	b := I.Conj().Quo(e.kp.MulReal(pi))
	return Symbol[T]{A: s.Int(0), D: d, B: b}
}

// Slope returns D' = D (2 theta - pi tanh(pi s)) and B' = conj(I')/(pi (k + 2i))
// for every s in s.
func (e *expTerm[T]) Slope(s T) Symbol[T] {
	pi := s.Pi()
	dp := e.diagonal(s).Mul(e.theta.Scale(1).Sub(pi.Mul(interval.Tanh(pi.Mul(s)))))
	I, ok := e.overRegimes(s, true)
	if !ok {
		w := s.Whole()
		return Symbol[T]{A: s.Int(0), D: dp, B: interval.C[T]{Re: w, Im: w}}
	}
	return Symbol[T]{A: s.Int(0), D: dp, B: I.Conj().Quo(e.kp.MulReal(pi))}
}

// intersectReal returns the intersection of x and y (assumed to overlap).
func intersectReal[T interval.Real[T]](x, y T) T {
	lo := x.Max(y)
	hi := x.Min(y)
	return interval.Lower(lo).Hull(interval.Upper(hi))
}

// Tail bounds |D| and |B| for side*s >= S.
//
// Lemma. For |s| >= S > 0:
// |D(s)| <= 2 e^{-(pi - 2 side theta) S}/|k + 2i| (from cosh(pi s) >=
// e^{pi |s|}/2 and 0 < theta < pi/2), and
// |B(s)| <= C(k)/S with C(k) = (1/4 + atan(k/2) |k + 2i|/(4k))/pi.
// Proof of the second: integrating r^{a-1} by parts,
// I = 1/(a(1-q)) - (q/a) int_0^1 r^a (1 - q r)^{-2} dr, so
// |I| <= (1/|a|) [1/|1-q| + int_0^1 dr/|1-qr|^2] (as |r^a| = r^{1/2} <= 1).
// Here |1 - q| = 2 sin theta = 4/|k+2i|, and since
// |1 - q r|^2 = r^2 - 2 r cos 2theta + 1, the integral is exactly
// [atan((r - cos 2theta)/sin 2theta)/sin 2theta]_0^1 = (pi/2 - theta)/sin 2theta
// with sin 2theta = 4k/|k+2i|^2 and pi/2 - theta = atan(k/2). Then
// |B| = |I|/(pi |k+2i|) and |a| >= |s| >= S give the bound.
func (e *expTerm[T]) Tail(S T, side int) (T, T) {
	pi := S.Pi()
	ex := pi.Sub(e.theta.Scale(1).Mul(S.Int(int64(side)))).Mul(S).Neg()
	dmax := interval.Exp(ex).Scale(1).Quo(e.mod)
	c := interval.Atan(e.k.Scale(-1)).Mul(e.mod).Quo(e.k.Scale(2)).Add(S.Frac(1, 4))
	bmax := c.Quo(pi.Mul(S))
	return interval.Upper(dmax), interval.Upper(bmax)
}

// Budget returns the largest quadrature and truncation bounds over the
// regimes built so far (bounds on I; B is I/(pi |k+2i|), smaller still).
func (e *expTerm[T]) Budget() (float64, float64) {
	e.mu.Lock()
	defer e.mu.Unlock()
	q, t := 0.0, 0.0
	for _, r := range e.regimes {
		q, t = math.Max(q, r.quad), math.Max(t, r.trunc)
	}
	return q, t
}

// Approx returns float64 values of D(s) and B(s) from the same quadrature
// (midpoint nodes; not certified).
func (e *expTerm[T]) Approx(s float64) (float64, complex128) {
	theta := math.Atan(2 / e.k.Lo())
	kf := (e.k.Lo() + e.k.Hi()) / 2
	mod := math.Hypot(kf, 2)
	as := math.Abs(s)
	d := 2 * math.Exp(2*theta*s-math.Pi*as) / (mod * (1 + math.Exp(-2*math.Pi*as)))
	r, err := e.regime(regimeIndex(s))
	if err != nil {
		return d, cmplx.NaN()
	}
	var sum complex128
	for j, t := range r.ft {
		sum += r.fh[j] * cmplx.Exp(complex(0, -s)*t)
	}
	b := cmplx.Conj(sum) / (complex(math.Pi, 0) * complex(kf, 2))
	return d, b
}
