package relaxation

import (
	"errors"
	"math"

	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// pathLeg is one leg of an integration path for an integral of the form
//
//	V(s) = int f(x) e^{-i s t(x)} dx,   x real in [x0, x1],
//
// where f (the s-free part, path derivative included) and t are analytic
// near the leg. at encloses f and t over a complex box of x (or a point).
type pathLeg[T interval.Real[T]] struct {
	x0, x1 float64
	at     func(x interval.C[T]) (f, t interval.C[T])
}

// pathRule is a quadrature of V(s) and V'(s) = int (-i t) f e^{-i s t} dx
// valid for every s of a range sR: for s there,
//
//	V(s)  in sum_j h_j e^{-i s t_j}           padded by errI,
//	V'(s) in sum_j h_j (-i t_j) e^{-i s t_j}  padded by errD,
//
// errI (errD) being the Clenshaw-Curtis remainder bounds of the panels
// (checknum.Rule.Bound, with integrand bounds on boxes covering each
// panel's Bernstein ellipse, for all s in sR at once) plus the explicit
// truncation bounds the caller adds for the parts of the path left out.
type pathRule[T interval.Real[T]] struct {
	t           []interval.C[T]
	tabs        []T // upper bounds of |t_j|
	h           []interval.C[T]
	errQ, errQ1 T // quadrature remainders (value, derivative)
	errT, errT1 T // truncation (value, derivative), added by the caller
}

// errPathRule reports a leg whose quadrature cannot be bounded.
var errPathRule = errors.New("path quadrature does not converge")

// buildPathRule integrates the legs for every s in sR with total
// quadrature error at most tol (shared among the legs in proportion to
// their length).
func buildPathRule[T interval.Real[T]](like T, legs []pathLeg[T], sR, tol T) (*pathRule[T], error) {
	pr := &pathRule[T]{errQ: like.Int(0), errQ1: like.Int(0), errT: like.Int(0), errT1: like.Int(0)}
	total := 0.0
	for _, l := range legs {
		total += l.x1 - l.x0
	}
	perLen := tol.Quo(like.Float(total))
	for _, leg := range legs {
		type span struct{ a, b float64 }
		stack := []span{{leg.x0, leg.x1}}
		panels := 0
		for len(stack) > 0 {
			p := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			target := perLen.Mul(like.Float(p.b - p.a))
			n, b0, b1, ok := legPanelRule(like, leg, sR, p.a, p.b, target)
			if ok {
				if err := pr.addPanel(like, leg, p.a, p.b, n); err != nil {
					return nil, err
				}
				pr.errQ = pr.errQ.Add(b0)
				pr.errQ1 = pr.errQ1.Add(b1)
				panels++
				continue
			}
			mid := p.a + (p.b-p.a)/2
			if !(mid > p.a && mid < p.b) || p.b-p.a < (leg.x1-leg.x0)*1e-10 || panels+len(stack) > 3000 {
				return nil, errPathRule
			}
			stack = append(stack, span{mid, p.b}, span{p.a, mid})
		}
	}
	pr.errQ, pr.errQ1 = interval.Upper(pr.errQ), interval.Upper(pr.errQ1)
	return pr, nil
}

// addPanel appends the Clenshaw-Curtis nodes of the panel [a, b] of leg.
func (pr *pathRule[T]) addPanel(like T, leg pathLeg[T], a, b float64, n int) error {
	rule, err := checknum.ClenshawCurtis(like, n)
	if err != nil {
		return err
	}
	y0, y1 := like.Float(a), like.Float(b)
	m := y0.Add(y1).Scale(-1)
	l := y1.Sub(y0).Scale(-1)
	zero := like.Int(0)
	for j := 0; j <= rule.N; j++ {
		x := m.Add(l.Mul(rule.X[j]))
		f, t := leg.at(interval.C[T]{Re: x, Im: zero})
		h := f.MulReal(l.Mul(rule.W[j]))
		if !h.IsFinite() || !t.IsFinite() {
			return errPathRule
		}
		pr.t = append(pr.t, t)
		pr.tabs = append(pr.tabs, interval.Upper(t.Abs()))
		pr.h = append(pr.h, h)
	}
	return nil
}

// Ellipse parameters tried for each panel of a leg.
var legRhos = []float64{1.4, 2, 3, 5, 8, 14}

// legPanelRule picks the smallest Clenshaw-Curtis size whose remainder
// bound on the panel [a, b] meets target for every s in sR, trying
// ellipse parameters in increasing order; it returns the bounds for V and
// V' (scaled by the half-length).
func legPanelRule[T interval.Real[T]](like T, leg pathLeg[T], sR T, a, b float64, target T) (int, T, T, bool) {
	return smallestRule(like, legRhos, a, b, target, func(m, l T, rf float64) (T, T, bool) {
		return legEllipseMax(like, leg, sR, m, l, rf)
	})
}

// legEllipseMax bounds |f e^{-i s t}| and |t f e^{-i s t}| for every s in
// sR and every x = m + l z with z in the closed Bernstein ellipse E_rho,
// by covering the ellipse with boxes (refined where a box gives no finite
// bound, for instance when it comes close to a singularity); ok is false
// when some box stays unbounded. |e^{-i s t}| = e^{s Im t} for real s.
func legEllipseMax[T interval.Real[T]](like T, leg pathLeg[T], sR, m, l T, rho float64) (T, T, bool) {
	return ellipseMax(like, m, l, rho, func(z interval.C[T]) (T, T, bool) {
		f, t := leg.at(z)
		mag := interval.Upper(f.Abs().Mul(interval.Exp(sR.Mul(t.Im))))
		return mag, t.Abs(), mag.IsFinite()
	})
}

// pathEval holds V at a point c and V, V' over a cell around it.
type pathEval[T interval.Real[T]] struct {
	Vc, VS, dVS interval.C[T]
}

// eval encloses V(c) and V(s), V'(s) for every s of a cell S within
// [c - delta, c + delta] (and within the rule's range): as in
// expTerm.evalI, e^{-i s t_j} = e^{-i c t_j} e^{-i (s - c) t_j} and
// |e^{z} - 1| <= e^{|z|} - 1 with |z| <= delta |t_j|.
func (pr *pathRule[T]) eval(c, delta T) pathEval[T] {
	zero := c.Int(0)
	p0 := interval.RealC(zero)
	p1 := p0
	r0, r1 := zero, zero
	for j, h := range pr.h {
		t := pr.t[j]
		E := interval.C[T]{Re: c.Mul(t.Im), Im: c.Mul(t.Re).Neg()}.Exp()
		hE := h.Mul(E)
		p0 = p0.Add(hE)
		p1 = p1.Add(interval.C[T]{Re: t.Im, Im: t.Re.Neg()}.Mul(hE))
		x := delta.Mul(pr.tabs[j])
		var eps T
		if x.Hi() <= 0.5 {
			eps = x.Add(x.Sqr())
		} else {
			eps = interval.Expm1(x)
		}
		mag := hE.Re.Abs().Add(hE.Im.Abs())
		r0 = r0.Add(mag.Mul(eps))
		r1 = r1.Add(mag.Mul(pr.tabs[j]).Mul(eps))
	}
	errI := pr.errQ.Add(pr.errT)
	errD := pr.errQ1.Add(pr.errT1)
	pad := func(z interval.C[T], r T) interval.C[T] {
		return interval.C[T]{Re: z.Re.Pad(r), Im: z.Im.Pad(r)}
	}
	return pathEval[T]{
		Vc:  pad(p0, interval.Upper(errI)),
		VS:  pad(p0, interval.Upper(errI.Add(r0))),
		dVS: pad(p1, interval.Upper(errD.Add(r1))),
	}
}

// smallestRule picks the smallest Clenshaw-Curtis size whose remainder
// bound on the panel [a, b] meets target, trying the ellipse parameters
// rhos in increasing order (the ellipses are nested, so once one may hold
// a singularity every larger one may too) until the size stops improving.
// ellipseMax bounds the integrand and its s-derivative companion on the
// Bernstein ellipse of parameter rf of the panel with centre m and
// half-length l; the returned bounds are scaled by l.
func smallestRule[T interval.Real[T]](like T, rhos []float64, a, b float64, target T, ellipseMax func(m, l T, rf float64) (T, T, bool)) (int, T, T, bool) {
	y0, y1 := like.Float(a), like.Float(b)
	m := y0.Add(y1).Scale(-1)
	l := y1.Sub(y0).Scale(-1)
	maxN := 64
	if like.Prec() > 53 {
		maxN = ccSizes[len(ccSizes)-1]
	}
	bestN, found := 0, false
	var best0, best1 T
	for _, rf := range rhos {
		if found && bestN <= ccSizes[0] {
			break
		}
		m0, m1, ok := ellipseMax(m, l, rf)
		if !ok {
			break
		}
		rho := like.Float(rf)
		n := 0
		for _, cand := range ccSizes {
			if cand > maxN || found && cand >= bestN {
				break
			}
			rule, err := checknum.ClenshawCurtis(like, cand)
			if err != nil {
				return 0, target, target, false
			}
			b0 := rule.Bound(m0, rho).Mul(l)
			if b0.IsFinite() && b0.Hi() <= target.Lo() {
				n = cand
				best0, best1 = interval.Upper(b0), interval.Upper(rule.Bound(m1, rho).Mul(l))
				break
			}
		}
		if n == 0 {
			if found {
				break
			}
			continue
		}
		bestN, found = n, true
	}
	return bestN, best0, best1, found
}

// ellipseMax bounds |g| and |t g| over the points x = m + l z, z in the
// closed Bernstein ellipse E_rho, by covering the ellipse with an 8 x 4
// grid of boxes (boxes missing the ellipse, tested with slack, are
// skipped) and halving a box up to three times where at gives no finite
// bound, for instance near a singularity. at returns, for the complex box
// x, an upper bound of |g| on it, |t| on it, and whether the bound holds;
// ok is false when some box stays unbounded.
func ellipseMax[T interval.Real[T]](like T, m, l T, rho float64, at func(x interval.C[T]) (T, T, bool)) (T, T, bool) {
	A := (rho + 1/rho) / 2 * (1 + 1e-12)
	B := (rho - 1/rho) / 2 * (1 + 1e-12)
	const nx, ny = 8, 4
	m0, m1 := like.Int(0), like.Int(0)
	var box func(xa, xb, ya, yb float64, depth int) bool
	box = func(xa, xb, ya, yb float64, depth int) bool {
		dx := math.Max(0, math.Max(xa, -xb))
		dy := math.Max(0, math.Max(ya, -yb))
		if (dx/A)*(dx/A)+(dy/B)*(dy/B) > 1+1e-9 {
			return true
		}
		zr := m.Add(l.Mul(like.Float(xa).Hull(like.Float(xb))))
		zi := l.Mul(like.Float(ya).Hull(like.Float(yb)))
		mag, tAbs, ok := at(interval.C[T]{Re: zr, Im: zi})
		if !ok {
			if depth >= 3 {
				return false
			}
			xm, ym := xa+(xb-xa)/2, ya+(yb-ya)/2
			return box(xa, xm, ya, ym, depth+1) && box(xm, xb, ya, ym, depth+1) &&
				box(xa, xm, ym, yb, depth+1) && box(xm, xb, ym, yb, depth+1)
		}
		m0 = m0.Max(mag)
		m1 = m1.Max(interval.Upper(mag.Mul(tAbs)))
		return true
	}
	for i := range nx {
		xa := -A + 2*A*float64(i)/nx
		xb := -A + 2*A*float64(i+1)/nx
		if i == nx-1 {
			xb = A
		}
		for j := range ny {
			ya := -B + 2*B*float64(j)/ny
			yb := -B + 2*B*float64(j+1)/ny
			if j == ny-1 {
				yb = B
			}
			if !box(xa, xb, ya, yb, 0) {
				return m0, m1, false
			}
		}
	}
	return m0, m1, m0.IsFinite() && m1.IsFinite()
}
