package witness

import (
	"fmt"
	"math"
	"math/big"

	"wedgebound/certify"
	"wedgebound/interval"
)

type cF = interval.C[interval.F]

// weighted is a term with its coefficient folded in: v u^m exp(-c u^2).
type weighted struct {
	v     cF // a_fn * w
	m     int
	b     interval.F
	omega interval.F
	g0    interval.F // Gamma((m+1)/2)/2
	g1    interval.F // Gamma((m+2)/2)/2
}

func weigh(basis []Func, coef []*big.Rat) []weighted {
	ts := terms(basis)
	out := make([]weighted, len(ts))
	for i, t := range ts {
		a := ratF(coef[t.fn])
		w := cF{Re: interval.PointF(float64(t.wRe)).Scale(-1), Im: interval.PointF(float64(t.wIm)).Scale(-1)}
		out[i] = weighted{v: w.MulReal(a), m: t.m, b: ratF(t.b), omega: interval.PointF(float64(t.omega)),
			g0: halfGamma(t.m + 1), g1: halfGamma(t.m + 2)}
	}
	return out
}

// normBits is the precision of the norm: the pairwise sum cancels heavily
// when the Gram matrix is nearly singular.
const normBits = 160

// normSquared encloses <phi, phi> = sum_{p,q} conj(v_p) v_q
// Gamma((m_p+m_q+1)/2) / (2 (conj(c_p) + c_q)^((m_p+m_q+1)/2)) over the
// complex terms, in normBits-bit interval arithmetic.
func normSquared(basis []Func, coef []*big.Rat) interval.F {
	like := interval.NewB(0, normBits)
	type tb struct {
		v     interval.C[interval.B]
		m     int
		b, om interval.B
	}
	var ts []tb
	for _, t := range terms(basis) {
		a, _ := like.Decimal(coef[t.fn].RatString())
		b, _ := like.Decimal(t.b.RatString())
		v := interval.C[interval.B]{Re: like.Int(int64(t.wRe)).Scale(-1).Mul(a), Im: like.Int(int64(t.wIm)).Scale(-1).Mul(a)}
		ts = append(ts, tb{v, t.m, b, like.Int(int64(t.omega))})
	}
	sum := interval.C[interval.B]{Re: like.Int(0), Im: like.Int(0)}
	for _, p := range ts {
		for _, q := range ts {
			c := interval.C[interval.B]{Re: p.b.Add(q.b), Im: q.om.Sub(p.om)}
			sum = sum.Add(p.v.Conj().Mul(q.v).Mul(momentT(p.m+q.m, c)))
		}
	}
	return interval.NewF(sum.Re.Lo(), sum.Re.Hi())
}

// momentT encloses Gamma((n+1)/2)/(2 c^((n+1)/2)) (principal branch).
func momentT[T interval.Real[T]](n int, c interval.C[T]) interval.C[T] {
	k := n + 1
	one := c.Re.Int(1)
	var g T
	if k%2 == 0 {
		g = one
		for j := 1; j < k/2; j++ {
			g = g.Mul(one.Int(int64(j)))
		}
	} else {
		g = one.Pi().Sqrt()
		for j := 1; 2*j < k; j++ {
			g = g.Mul(one.Int(int64(2*j - 1))).Scale(-1)
		}
	}
	inv := c.Inv()
	p := interval.RealC(g.Scale(-1))
	for j := 0; j < k/2; j++ {
		p = p.Mul(inv)
	}
	if k%2 == 1 {
		p = p.Quo(c.Sqrt())
	}
	return p
}

// group collects the terms sharing one exponent c = b + i omega: their
// contributions to F_0 and F_1 are sum_n A0[n] c^-(n+1)/2 and
// sum_n A1[n] c^-(n+1)/2 with the Gamma factors folded into A0, A1 (and
// the conjugate coefficients into B0, B1 for the left factors).
type group struct {
	b, omega       interval.F
	a0, a1, b0, b1 []cF // indexed by n = 0 .. maxPower+1
}

func makeGroups(ws []weighted) []group {
	idx := map[[2]float64]int{}
	var gs []group
	maxN := 0
	for _, p := range ws {
		if p.m+1 > maxN {
			maxN = p.m + 1
		}
	}
	for _, p := range ws {
		key := [2]float64{p.b.Lo(), p.omega.Lo()}
		k, ok := idx[key]
		if !ok {
			k = len(gs)
			idx[key] = k
			gs = append(gs, group{b: p.b, omega: p.omega, a0: make([]cF, maxN+1), a1: make([]cF, maxN+1),
				b0: make([]cF, maxN+1), b1: make([]cF, maxN+1)})
		}
		g := &gs[k]
		g.a0[p.m] = g.a0[p.m].Add(p.v.MulReal(p.g0))
		g.a1[p.m+1] = g.a1[p.m+1].Add(p.v.MulReal(p.g1))
		g.b0[p.m] = g.b0[p.m].Add(p.v.Conj().MulReal(p.g0))
		g.b1[p.m+1] = g.b1[p.m+1].Add(p.v.Conj().MulReal(p.g1))
	}
	return gs
}

// sums returns sum_n x[n] c^-(n+1)/2 and sum_n y[n] c^-(n+1)/2.
func sums(c cF, x, y []cF) (sx, sy cF) {
	r := c.Sqrt().Inv() // c^-1/2
	p := r
	for n := range x {
		if n > 0 {
			p = p.Mul(r)
		}
		sx = sx.Add(x[n].Mul(p))
		sy = sy.Add(y[n].Mul(p))
	}
	return sx, sy
}

// hReal encloses the time integrand h(t) = -(1/pi) Re(conj(F_1(t)) F_0(t))
// for real t in the interval tt, where F_k(t) = sum v M(m+k, c + i t).
//
// The point is t = anchor + tt with an integer anchor (-1, 0 or 1) near t,
// so that omega + t = (omega + anchor) + tt keeps full relative accuracy
// next to the branch points, which sit at distance b from the anchors.
func hReal(gs []group, anchor float64, tt interval.F) interval.F {
	var f0, f1 cF
	an := interval.PointF(anchor)
	for i := range gs {
		g := &gs[i]
		c := cF{Re: g.b, Im: g.omega.Add(an).Add(tt)}
		x, y := sums(c, g.a0, g.a1)
		f0, f1 = f0.Add(x), f1.Add(y)
	}
	re := f1.Re.Mul(f0.Re).Add(f1.Im.Mul(f0.Im))
	return re.Quo(re.Pi()).Neg()
}

// hComplexAbs encloses |h(z)| for complex z = x + i y in a rectangle, where
// h(z) = -(1/2pi)(G_1 F_0 + G_0 F_1) is the analytic continuation,
// F_k(z) = sum v M(m+k, c + i z), G_k(z) = sum conj(v) M(m+k, conj(c) - i z).
// (z = anchor + x + i y as in hReal).
func hComplexAbs(gs []group, anchor float64, x, y interval.F) interval.F {
	var f0, f1, g0, g1 cF
	an := interval.PointF(anchor)
	for i := range gs {
		g := &gs[i]
		w := g.omega.Add(an).Add(x)
		cr := cF{Re: g.b.Sub(y), Im: w}
		cl := cF{Re: g.b.Add(y), Im: w.Neg()}
		a, b := sums(cr, g.a0, g.a1)
		c, d := sums(cl, g.b0, g.b1)
		f0, f1, g0, g1 = f0.Add(a), f1.Add(b), g0.Add(c), g1.Add(d)
	}
	s := g1.Mul(f0).Add(g0.Mul(f1))
	return s.Abs().Quo(s.Re.Pi().Scale(1))
}

// ellipseMax bounds |h| on the Bernstein ellipse E_rho of [lo, hi] by
// covering its upper half (h is real on the real axis, so |h(conj z)| =
// |h(z)|) with arcs boxes.
func ellipseMax(ws []group, lo, hi, anchor float64, rho interval.F, arcs int) interval.F {
	one := interval.PointF(1)
	a := rho.Add(one.Quo(rho)).Scale(-1)
	b := rho.Sub(one.Quo(rho)).Scale(-1)
	an := interval.PointF(anchor)
	mu := interval.PointF(lo).Sub(an).Add(interval.PointF(hi).Sub(an)).Scale(-1)
	l := interval.PointF(hi).Sub(interval.PointF(lo)).Scale(-1)
	pi := one.Pi()
	m := interval.PointF(0)
	for j := 0; j < arcs; j++ {
		th := pi.Mul(interval.PointF(float64(j))).Quo(interval.PointF(float64(arcs))).Hull(
			pi.Mul(interval.PointF(float64(j + 1))).Quo(interval.PointF(float64(arcs))))
		s, c := interval.SinCos(th)
		x := mu.Add(l.Mul(a).Mul(c))
		y := l.Mul(b).Mul(s)
		m = m.Max(hComplexAbs(ws, anchor, x, y))
	}
	return m
}

// PanelProof records the proof on one time panel.
type PanelProof struct {
	Lo, Hi    float64
	Rho       float64
	Nodes     int
	Max       float64 // bound on |h| on the ellipse
	Remainder float64 // quadrature remainder bound (scaled to the panel)
	Value     interval.F
}

// Proof is the rigorous evaluation of a witness's Rayleigh quotient.
type Proof struct {
	Norm      interval.F // <phi, phi>
	Backflow  interval.F // <phi, K phi>, remainders included
	Quotient  interval.F
	Remainder float64 // sum of the panel remainders
	Panels    []PanelProof
}

// nodeLadder lists the Gauss orders tried on a panel.
var nodeLadder = []int{8, 12, 16, 20, 24, 32, 40, 48}

// prove encloses the Rayleigh quotient of phi = sum coef_j f_j.
func prove(basis []Func, coef []*big.Rat, ps []panel, tol float64, workers int, tick func()) (*Proof, error) {
	ws := makeGroups(weigh(basis, coef))
	pr := &Proof{Norm: normSquared(basis, coef), Panels: make([]PanelProof, len(ps))}
	if pr.Norm.Sign() != 1 {
		return nil, fmt.Errorf("witness: the norm of the witness is not proved positive (%v)", pr.Norm)
	}
	errs := make([]error, len(ps))
	certify.For(len(ps), workers, func(i int) {
		defer tick()
		p := ps[i]
		rho := interval.PointF(p.Rho)
		anchor := math.Round((p.Lo + p.Hi) / 2)
		mx := ellipseMax(ws, p.Lo, p.Hi, anchor, rho, 48)
		if !mx.IsFinite() {
			errs[i] = fmt.Errorf("witness: no bound on the ellipse of panel [%g, %g]", p.Lo, p.Hi)
			return
		}
		half := interval.PointF(p.Hi).Sub(interval.PointF(p.Lo)).Scale(-1)
		mxu := interval.PointF(mx.Hi())
		n := nodeLadder[len(nodeLadder)-1]
		var rem interval.F
		for _, k := range nodeLadder {
			rem = glBound(k, mxu, rho).Mul(half)
			n = k
			if rem.Hi() <= tol*(p.Hi-p.Lo) {
				break
			}
		}
		r, err := rule(n)
		if err != nil {
			errs[i] = err
			return
		}
		an := interval.PointF(anchor)
		mu := interval.PointF(p.Lo).Sub(an).Add(interval.PointF(p.Hi).Sub(an)).Scale(-1)
		sum := interval.PointF(0)
		for k := range r.x {
			t := mu.Add(half.Mul(r.x[k]))
			sum = sum.Add(r.w[k].Mul(hReal(ws, anchor, t)))
		}
		v := sum.Mul(half).Pad(interval.PointF(rem.Hi()))
		pr.Panels[i] = PanelProof{Lo: p.Lo, Hi: p.Hi, Rho: p.Rho, Nodes: n, Max: mx.Hi(), Remainder: rem.Hi(), Value: v}
	})
	for _, e := range errs {
		if e != nil {
			return nil, e
		}
	}
	tot := interval.PointF(0)
	rs := 0.0
	for _, pp := range pr.Panels {
		tot = tot.Add(pp.Value)
		rs += pp.Remainder
	}
	pr.Backflow = tot
	pr.Remainder = rs
	pr.Quotient = tot.Quo(pr.Norm)
	if !pr.Quotient.IsFinite() {
		return nil, fmt.Errorf("witness: Rayleigh quotient not enclosed")
	}
	_ = math.Inf
	return pr, nil
}
