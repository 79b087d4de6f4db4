package regions

import (
	"fmt"
	"math"
	"math/cmplx"
	"sync"
	"sync/atomic"

	"wedgebound/interval"
)

// pathRule is a precomputed quadrature for the path integral
//
//	I(s) = int_path g(z) e^{-i lam s z} dz
//
// valid for every s in a fixed range: I(s) lies in sum_j h_j e^{-i lam s z_j}
// padded by err, and I'(s) in sum_j h_j (-i lam z_j) e^{-i lam s z_j} padded by
// errD. The path is a polygon; each edge is split adaptively into panels
// carrying the n-point Gauss-Legendre rule, and a panel is kept once the
// Bernstein-ellipse remainder (gaussBound, M a rigorous bound of the
// integrand over the ellipse and the whole s-range, from interval
// evaluations on boxes covering it) is below its share of the tolerance.
// Pieces of the integral cut off before the polygon (near a singular start
// or beyond its end) are bounded by the caller and passed in as trunc and
// truncD.
type pathRule[T interval.Real[T]] struct {
	lam         T
	panels      []pathPanel[T]
	offsets     [][]interval.C[T] // per distinct half-length hv: hv x_j
	err, errD   T
	quad, trunc float64
	fz, fh      []complex128
	lamF        float64
	// The weights h_j carry the factor e^{-i lam sRef z_j} for a reference
	// point sRef of the s-range (when the spec gives gRef), and eval multiplies by
	// e^{-i lam (s - sRef) z_j}: the integrand may overflow where its
	// product with the s-factor does not.
	sRef  T
	sRefF float64
}

// pathPanel is one panel: nodes z_j = mid + offsets[kind][j] with weights h_j.
type pathPanel[T interval.Real[T]] struct {
	mid  interval.C[T]
	kind int
	z, h []interval.C[T]
}

// pathSpec describes a path integral to be discretised.
type pathSpec[T interval.Real[T]] struct {
	verts []complex128                        // polygon vertices (exact float64 points)
	g     func(z interval.C[T]) interval.C[T] // the s-free integrand, for points and boxes
	// gRef, if set, encloses g(z) e^{-i lam s0 z} at nodes in one exponent,
	// with s0 = sRef (a point of the s-range chosen by the caller so that
	// |e^{-i lam (s - s0) z}| stays moderate over the range and the path).
	gRef   func(z interval.C[T], s0 T) interval.C[T]
	sRef   float64
	lam    int64   // the frequency factor in e^{-i lam s z}
	sr     T       // the s-range the rule must serve
	trunc  T       // bound on the cut-off pieces of I
	truncD T       // bound on the cut-off pieces of I'
	tol    float64 // remainder allowed per unit of path length
	// mag, if set, bounds |g(z) e^{-i lam s z}| over a box z and all s in sr
	// (combining the exponents avoids underflow against overflow).
	mag func(z interval.C[T], sr T) T
}

const (
	pathMaxPanels = 60000
)

// pathNodes is the Gauss-Legendre order for precision prec: the remainder
// factor rho^{-2n} must reach 2^-(prec+10) at moderate rho (20 nodes give
// 2^-120 at rho = 8, enough for 53 bits; the order grows with prec).
func pathNodes(prec uint) int {
	return max(20, (int(prec)+40)/5)
}

var pathRhos = []float64{4, 8, 2.2, 1.5, 1.25}

// buildPathRule discretises spec. It fails when some panel admits no
// finite ellipse bound down to a tiny length or the panel budget runs out.
func buildPathRule[T interval.Real[T]](like T, spec pathSpec[T]) (*pathRule[T], error) {
	rule, err := gaussLegendre(like, pathNodes(like.Prec()))
	if err != nil {
		return nil, err
	}
	lam := like.Int(spec.lam)
	r := &pathRule[T]{lam: lam, lamF: float64(spec.lam), sRef: like.Int(0)}
	if spec.gRef != nil {
		r.sRefF = spec.sRef
		r.sRef = like.Float(r.sRefF)
	}
	total, totalD := like.Int(0), like.Int(0)
	type seg struct{ a, b complex128 }
	panels := 0
	kinds := map[complex128]int{}
	for k := 0; k+1 < len(spec.verts); k++ {
		stack := []seg{{spec.verts[k], spec.verts[k+1]}}
		for len(stack) > 0 {
			p := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			length := cmplx.Abs(p.b - p.a)
			a := interval.CPoint(like, real(p.a), imag(p.a))
			b := interval.CPoint(like, real(p.b), imag(p.b))
			mid := a.Add(b).Scale(-1)
			hv := b.Sub(a).Scale(-1)
			want, wantD := spec.tol*length, spec.tol*length*math.Max(1, cmplx.Abs(p.b))
			e, ed, ok := panelRemainder(spec, mid, hv, want, wantD)
			if !ok || e.Hi() > want || ed.Hi() > wantD {
				if length < 1e-13*math.Max(1, cmplx.Abs(p.a)) || panels+len(stack) > pathMaxPanels {
					return nil, fmt.Errorf("path quadrature: no usable panel near %v (length %.3g)", p.a, length)
				}
				c := (p.a + p.b) / 2
				// Push the second half first so panels come out in path order.
				stack = append(stack, seg{c, p.b}, seg{p.a, c})
				continue
			}
			panels++
			total = total.Add(e)
			totalD = totalD.Add(ed)
			// Panels parallel to the real axis share offset factors of modulus
			// 1; on others |e^{-i lam s hv x_j}| may overflow where the node
			// factor does not, so their nodes are evaluated directly (kind -1).
			key := (p.b - p.a) / 2
			kind, ok := kinds[key]
			if imag(key) != 0 {
				kind, ok = -1, true
			}
			if !ok {
				kind = len(r.offsets)
				kinds[key] = kind
				off := make([]interval.C[T], len(rule.x))
				for j := range rule.x {
					off[j] = hv.MulReal(rule.x[j])
				}
				r.offsets = append(r.offsets, off)
			}
			pn := pathPanel[T]{mid: mid, kind: kind}
			for j := range rule.x {
				z := mid.Add(hv.MulReal(rule.x[j]))
				var gz interval.C[T]
				if spec.gRef != nil {
					gz = spec.gRef(z, r.sRef)
				} else {
					gz = spec.g(z)
				}
				h := gz.Mul(hv).MulReal(rule.w[j])
				pn.z = append(pn.z, z)
				pn.h = append(pn.h, h)
				r.fz = append(r.fz, midC(z))
				r.fh = append(r.fh, midC(h))
			}
			r.panels = append(r.panels, pn)
		}
	}
	r.quad = total.Hi()
	r.trunc = spec.trunc.Hi()
	r.err = interval.Upper(total.Add(spec.trunc))
	r.errD = interval.Upper(totalD.Add(spec.truncD))
	if !r.err.IsFinite() || !r.errD.IsFinite() {
		return nil, fmt.Errorf("path quadrature: remainder not finite")
	}
	return r, nil
}

// midC returns the float64 midpoint of a complex enclosure.
func midC[T interval.Real[T]](z interval.C[T]) complex128 {
	return complex((z.Re.Lo()+z.Re.Hi())/2, (z.Im.Lo()+z.Im.Hi())/2)
}

// panelRemainder bounds the Gauss-Legendre remainder of the panel
// z = mid + hv u, u in [-1, 1], for I and I', trying the ellipse parameters
// of pathRhos in turn until both bounds meet want and wantD (else the best
// pair found is returned).
func panelRemainder[T interval.Real[T]](spec pathSpec[T], mid, hv interval.C[T], want, wantD float64) (T, T, bool) {
	like := spec.sr
	var best, bestD T
	found := false
	habs := interval.Upper(hv.Abs())
	for _, rf := range pathRhos {
		rho := like.Float(rf)
		inv := like.Int(1).Quo(rho)
		ax := interval.Upper(rho.Add(inv).Scale(-1))
		by := interval.Upper(rho.Sub(inv).Scale(-1))
		M, MD, ok := ellipseMax(spec, mid, hv, ax, by)
		if !ok {
			continue
		}
		n := pathNodes(like.Prec())
		b := gaussBound(M, rho, n).Mul(habs)
		bd := gaussBound(MD, rho, n).Mul(habs)
		if !found || b.Add(bd).Hi() < best.Add(bestD).Hi() {
			best, bestD, found = b, bd, true
		}
		if found && best.Hi() <= want && bestD.Hi() <= wantD {
			break
		}
	}
	return best, bestD, found
}

// ellipseMax bounds |g(z) e^{-i lam s z}| (and that times lam |z|) over the
// image z = mid + hv u of the box |Re u| <= ax, |Im u| <= by, for every s in
// spec.sr, by an 8 x 4 grid of boxes.
func ellipseMax[T interval.Real[T]](spec pathSpec[T], mid, hv interval.C[T], ax, by T) (T, T, bool) {
	const nx, ny = 8, 4
	sr := spec.sr
	M, MD := sr.Int(0), sr.Int(0)
	lam := sr.Int(spec.lam)
	for i := range nx {
		xa := ax.Mul(sr.Frac(int64(2*i-nx), nx))
		xb := ax.Mul(sr.Frac(int64(2*i+2-nx), nx))
		for j := range ny {
			ya := by.Mul(sr.Frac(int64(2*j-ny), ny))
			yb := by.Mul(sr.Frac(int64(2*j+2-ny), ny))
			u := interval.C[T]{Re: xa.Hull(xb), Im: ya.Hull(yb)}
			z := mid.Add(hv.Mul(u))
			var m T
			if spec.mag != nil {
				m = spec.mag(z, sr)
			} else {
				// |g| <= |Re g| + |Im g| (no underflow in a square root);
				// |e^{-i lam s z}| = e^{lam s Im z}.
				g := spec.g(z)
				gz := g.Re.Abs().Add(g.Im.Abs())
				grow := interval.Exp(lam.Mul(sr).Mul(z.Im))
				m = interval.Upper(gz.Mul(grow))
			}
			if !m.IsFinite() {
				return M, MD, false
			}
			M = M.Max(m)
			MD = MD.Max(interval.Upper(m.Mul(lam).Mul(z.Abs())))
		}
	}
	return M, MD, M.IsFinite() && MD.IsFinite()
}

// eval encloses I(s) (deriv false) or I'(s) (deriv true) for every s in the
// interval s, which must lie in the rule's s-range. Each node factor
// e^{-i lam s z_j} is the product of the panel factor e^{-i lam s mid} and
// the offset factor e^{-i lam s hv x_j}, shared by all panels of one length
// and direction.
func (r *pathRule[T]) eval(s T, deriv bool) interval.C[T] {
	ls := r.lam.Mul(s.Sub(r.sRef))
	factors := make([][]interval.C[T], len(r.offsets))
	for k, off := range r.offsets {
		f := make([]interval.C[T], len(off))
		for j, w := range off {
			f[j] = expMinusI(ls, w)
		}
		factors[k] = f
	}
	sum := interval.RealC(s.Int(0))
	for _, p := range r.panels {
		inner := interval.RealC(s.Int(0))
		for j, h := range p.h {
			var t interval.C[T]
			if p.kind < 0 {
				t = h.Mul(expMinusI(ls, p.z[j]))
			} else {
				t = h.Mul(factors[p.kind][j])
			}
			if deriv {
				z := p.z[j]
				// times -i lam z
				t = t.Mul(interval.C[T]{Re: z.Im.Mul(r.lam), Im: z.Re.Mul(r.lam).Neg()})
			}
			inner = inner.Add(t)
		}
		if p.kind < 0 {
			sum = sum.Add(inner)
		} else {
			sum = sum.Add(inner.Mul(expMinusI(ls, p.mid)))
		}
	}
	pad := r.err
	if deriv {
		pad = r.errD
	}
	return interval.C[T]{Re: sum.Re.Pad(pad), Im: sum.Im.Pad(pad)}
}

// expMinusI encloses e^{-i ls z} = e^{ls Im z} (cos(ls Re z) - i sin(ls Re z)).
func expMinusI[T interval.Real[T]](ls T, z interval.C[T]) interval.C[T] {
	sn, cs := interval.SinCos(ls.Mul(z.Re))
	if z.Im.Lo() == 0 && z.Im.Hi() == 0 {
		return interval.C[T]{Re: cs, Im: sn.Neg()}
	}
	mag := interval.Exp(ls.Mul(z.Im))
	return interval.C[T]{Re: cs.Mul(mag), Im: sn.Mul(mag).Neg()}
}

// approx returns the float64 value of I(s) from the midpoint nodes (not
// certified).
func (r *pathRule[T]) approx(s float64) complex128 {
	var sum complex128
	for j, z := range r.fz {
		sum += r.fh[j] * cmplx.Exp(complex(0, -r.lamF*(s-r.sRefF))*z)
	}
	return sum
}

// ruleSet caches path rules over consecutive s-ranges, indexed by integers
// increasing with s. Rules for different ranges are built concurrently.
type ruleSet[T interval.Real[T]] struct {
	mu      sync.Mutex
	entries map[int]*ruleEntry[T]
	indexOf func(s float64) (int, bool)
	rangeOf func(idx int) (lo, hi float64)
	build   func(idx int, lo, hi float64) (*pathRule[T], error)
}

// ruleEntry is one range's rule, built once.
type ruleEntry[T interval.Real[T]] struct {
	once sync.Once
	done atomic.Bool
	rule *pathRule[T]
	err  error
}

func newRuleSet[T interval.Real[T]](indexOf func(float64) (int, bool), rangeOf func(int) (float64, float64), build func(int, float64, float64) (*pathRule[T], error)) *ruleSet[T] {
	return &ruleSet[T]{entries: map[int]*ruleEntry[T]{}, indexOf: indexOf, rangeOf: rangeOf, build: build}
}

// get returns the rule for range idx, building it on first use.
func (rs *ruleSet[T]) get(idx int) (*pathRule[T], error) {
	rs.mu.Lock()
	e, ok := rs.entries[idx]
	if !ok {
		e = &ruleEntry[T]{}
		rs.entries[idx] = e
	}
	rs.mu.Unlock()
	e.once.Do(func() {
		lo, hi := rs.rangeOf(idx)
		e.rule, e.err = rs.build(idx, lo, hi)
		e.done.Store(true)
	})
	return e.rule, e.err
}

// over encloses I(s) or I'(s) for every s in the interval s, splitting it
// at range boundaries; ok is false when a range has no rule.
func (rs *ruleSet[T]) over(s T, deriv bool) (v interval.C[T], ok bool) {
	i0, ok0 := rs.indexOf(s.Lo())
	i1, ok1 := rs.indexOf(s.Hi())
	if !ok0 || !ok1 {
		return v, false
	}
	first := true
	for idx := i0; idx <= i1; idx++ {
		r, err := rs.get(idx)
		if err != nil {
			return v, false
		}
		lo, hi := rs.rangeOf(idx)
		part := intersectReal(s, s.Float(lo).Hull(s.Float(hi)))
		w := r.eval(part, deriv)
		if first {
			v, first = w, false
		} else {
			v = v.Hull(w)
		}
	}
	return v, true
}

// approx returns the float64 value of I(s) (not certified).
func (rs *ruleSet[T]) approx(s float64) complex128 {
	idx, ok := rs.indexOf(s)
	if !ok {
		return cmplx.NaN()
	}
	r, err := rs.get(idx)
	if err != nil {
		return cmplx.NaN()
	}
	return r.approx(s)
}

// budget returns the largest quadrature and truncation bounds of the rules
// built so far.
func (rs *ruleSet[T]) budget() (float64, float64) {
	rs.mu.Lock()
	entries := make([]*ruleEntry[T], 0, len(rs.entries))
	for _, e := range rs.entries {
		entries = append(entries, e)
	}
	rs.mu.Unlock()
	q, t := 0.0, 0.0
	for _, e := range entries {
		if e.done.Load() && e.rule != nil {
			q, t = math.Max(q, e.rule.quad), math.Max(t, e.rule.trunc)
		}
	}
	return q, t
}
