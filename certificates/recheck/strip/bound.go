package strip

import (
	"container/heap"
	"math"

	"wedgebound/interval"
)

// Bounds of the strip kernel on products of Bernstein ellipses, by the
// verifier's own route: a branch and bound over the boundary
// parametrisation in interval arithmetic.
//
// Ellipse E_eta (eta >= 0): s(theta) = cosh(eta) cos(theta) +
// i sinh(eta) sin(theta), theta in [0, 2 pi], is its boundary (eta = 0: the
// segment [-1, 1], covered by theta in [0, pi]); x = (s - 1)/2 maps it
// onto the ellipse around [-1, 0]. For an entire f, the maximum of |f| over
// the product of two closed ellipses is attained with each variable on its
// ellipse's boundary (maximum modulus principle in each variable).
//
// Bound on a box of (theta1, theta2): with z = alpha (x^2 - y^2)/4,
// k = -(alpha (x + y)/(4 pi)) sinc z, and sinc z = int_0^1 cos(z t) dt with
// |cos w| <= cosh(Im w) gives |sinc z| <= S(|Im z|), S(B) = sinh(B)/B,
// which increases with B and satisfies log S(B) <= min(B^2/6, B - log(2B))
// (termwise sinh(B)/B = sum B^{2k}/(2k+1)! <= sum (B^2/6)^k/k!, since
// (2k+1)! >= 6^k k!; and sinh B <= e^B/2). Im z = (alpha/4)(g(theta1) -
// g(theta2)) with g = Im x^2 = (b/2) sin(theta)(a cos(theta) - 1),
// g' = (b/2)(a cos 2 theta - cos theta), enclosed on a box by the mean-value
// form intersected with the direct evaluation; |x + y| is enclosed
// directly. Symmetry: conjugating both variables conjugates k, so theta1
// may be restricted to [0, pi].

// stripEllipse is a Bernstein ellipse with a = cosh eta, b = sinh eta.
type stripEllipse struct {
	eta  float64
	a, b interval.F
}

func newStripEllipse(eta float64) stripEllipse {
	if eta == 0 {
		return stripEllipse{a: interval.PointF(1), b: interval.PointF(0)}
	}
	e := interval.PointF(eta)
	return stripEllipse{eta: eta, a: interval.Cosh(e), b: interval.Sinh(e)}
}

type stripBox struct {
	l1, h1, l2, h2 float64
	ub             float64
}

type stripHeap []stripBox

func (h stripHeap) Len() int           { return len(h) }
func (h stripHeap) Less(i, j int) bool { return h[i].ub > h[j].ub }
func (h stripHeap) Swap(i, j int)      { h[i], h[j] = h[j], h[i] }
func (h *stripHeap) Push(x any)        { *h = append(*h, x.(stripBox)) }
func (h *stripHeap) Pop() any {
	old := *h
	x := old[len(old)-1]
	*h = old[:len(old)-1]
	return x
}

// kernelSup bounds log sup |k| over E_1 x E_2 for the kernel at alpha.
type kernelSup struct {
	alpha  interval.F
	e1, e2 stripEllipse
	logPre float64 // upper bound of log(alpha/(4 pi))
	af     float64 // float alpha for the (unverified) point values
}

func newKernelSup(alpha interval.F, eta1, eta2 float64) *kernelSup {
	pre := interval.Log(alpha.Quo(interval.F{}.Pi().Scale(2)))
	return &kernelSup{alpha: alpha, e1: newStripEllipse(eta1), e2: newStripEllipse(eta2), logPre: pre.Hi(), af: alpha.Mid().Lo()}
}

// gRange encloses g = (b/2) sin t (a cos t - 1) over t in T.
func gRange(T interval.F, e stripEllipse) interval.F {
	s, c := interval.SinCos(T)
	hb := e.b.Scale(-1)
	direct := hb.Mul(s).Mul(e.a.Mul(c).Sub(interval.PointF(1)))
	m := T.Mid()
	sm, cm := interval.SinCos(m)
	gm := hb.Mul(sm).Mul(e.a.Mul(cm).Sub(interval.PointF(1)))
	gp := hb.Mul(e.a.Mul(interval.Cos(T.Scale(1))).Sub(c))
	mv := gm.Add(gp.Mul(T.Sub(m)))
	lo, hi := math.Max(direct.Lo(), mv.Lo()), math.Min(direct.Hi(), mv.Hi())
	if lo > hi { // cannot happen for true enclosures; keep the direct one
		return direct
	}
	return interval.PointF(lo).Hull(interval.PointF(hi))
}

// logS returns an upper bound of log(sinh(B)/B) for B >= 0.
func logS(B float64) float64 {
	if B == 0 {
		return 0
	}
	b := interval.PointF(B)
	u := b.Sqr().Quo(interval.PointF(6)).Hi()
	if B > 1 {
		v := b.Sub(interval.Log(b.Scale(1))).Hi()
		u = math.Min(u, v)
	}
	return u
}

// phiF encloses phi(B) = log(sinh(B)/B) for B >= 0 (0 at B = 0):
// B + log1p(-e^{-2B}) - log(2B) for B >= 1, log(sinh(B)/B) below.
func phiF(B interval.F) interval.F {
	if B.Hi() <= 0 {
		return interval.PointF(0)
	}
	if B.Lo() >= 1 {
		return B.Add(interval.Log1p(interval.Exp(B.Scale(1).Neg()).Neg())).Sub(interval.Log(B.Scale(1)))
	}
	if B.Lo() <= 0 {
		// phi is increasing with phi(0) = 0: [0, phi(B.Hi())]
		return interval.PointF(0).Hull(phiF(interval.PointF(B.Hi())))
	}
	return interval.Log(interval.Sinh(B).Quo(B))
}

// phiPrime encloses phi'(B) = coth(B) - 1/B on B >= 0, which increases from
// 0 towards 1. For B <= 1 it is at most B/3: its series
// B/3 - B^3/45 + 2 B^5/945 - ... (coefficients 2^{2n} |B_{2n}|/(2n)!, B_{2n}
// Bernoulli numbers with alternating signs) alternates with terms
// decreasing in size for B < pi. Above 1 the closed form is enclosed
// directly.
func phiPrime(B interval.F) interval.F {
	at := func(x float64) interval.F {
		p := interval.PointF(x)
		return interval.PointF(1).Quo(interval.Tanh(p)).Sub(interval.PointF(1).Quo(p))
	}
	lo := 0.0
	if l := B.Lo(); l >= 1 {
		lo = math.Max(0, at(l).Lo())
	}
	hi := 1.0
	if h := B.Hi(); h <= 1 {
		hi = interval.PointF(h).Quo(interval.PointF(3)).Hi()
	} else {
		hi = math.Min(hi, at(h).Hi())
	}
	return interval.PointF(lo).Hull(interval.PointF(math.Max(lo, hi)))
}

// logBoundAt encloses the bounding function
// F(theta) = log(alpha/(4 pi)) + log |x + y| + phi(B) at a box or point,
// with B = (alpha/4) |g(theta1) - g(theta2)|, in direct evaluation.
func (k *kernelSup) parts(T1, T2 interval.F) (re, im, g1, g2 interval.F, s1, c1, s2, c2 interval.F) {
	s1, c1 = interval.SinCos(T1)
	s2, c2 = interval.SinCos(T2)
	one := interval.PointF(1)
	re = k.e1.a.Mul(c1).Sub(one).Add(k.e2.a.Mul(c2).Sub(one)).Scale(-1)
	im = k.e1.b.Mul(s1).Add(k.e2.b.Mul(s2)).Scale(-1)
	g1 = k.e1.b.Scale(-1).Mul(s1).Mul(k.e1.a.Mul(c1).Sub(one))
	g2 = k.e2.b.Scale(-1).Mul(s2).Mul(k.e2.a.Mul(c2).Sub(one))
	return
}

// boxBound is a rigorous upper bound of log |k| over the box: the smaller
// of the direct bound (log |x+y| and phi(B) bounded separately, with the
// mean-value form of g) and the mean-value form of the whole bounding
// function F = log(alpha/(4 pi)) + (1/2) log |x+y|^2 + phi(B), which is
// second order in the box size where g(theta1) - g(theta2) keeps its sign:
//
//	dF/dtheta_i = (d|x+y|^2/dtheta_i)/(2 |x+y|^2) + phi'(B) dB/dtheta_i,
//	d|x+y|^2/dtheta1 = -re a1 sin(theta1) + im b1 cos(theta1),
//	dB/dtheta1 = (alpha/4) sgn g1'(theta1), dB/dtheta2 = -(alpha/4) sgn g2'(theta2),
//
// with re, im the real and imaginary parts of x + y, sgn the sign of
// g(theta1) - g(theta2), and g' = (b/2)(a cos 2 theta - cos theta).
func (k *kernelSup) boxBound(l1, h1, l2, h2 float64) float64 {
	T1 := interval.PointF(l1).Hull(interval.PointF(h1))
	T2 := interval.PointF(l2).Hull(interval.PointF(h2))
	re, im, _, _, s1, c1, s2, c2 := k.parts(T1, T2)
	mod2 := re.Sqr().Add(im.Sqr())
	mod := mod2.Sqrt().Hi()
	if mod == 0 {
		return math.Inf(-1)
	}
	g := gRange(T1, k.e1).Sub(gRange(T2, k.e2))
	Bbox := k.alpha.Mul(g).Scale(-2).Abs()
	B := Bbox.Hi()
	lm := interval.Log(interval.PointF(mod)).Hi()
	direct := interval.PointF(k.logPre).Add(interval.PointF(lm)).Add(interval.PointF(logS(B))).Hi()
	if g.Sign() == 0 || mod2.Lo() <= 1e-300 {
		return direct
	}
	sgn := float64(g.Sign())
	// value at the midpoint
	m1, m2 := T1.Mid(), T2.Mid()
	rem, imm, g1m, g2m, _, _, _, _ := k.parts(m1, m2)
	Fm := interval.PointF(k.logPre).Add(interval.Log(rem.Sqr().Add(imm.Sqr())).Scale(-1)).
		Add(phiF(k.alpha.Mul(g1m.Sub(g2m)).Scale(-2).Abs()))
	// gradient over the box
	half := interval.PointF(0.5)
	d1 := re.Neg().Mul(k.e1.a).Mul(s1).Add(im.Mul(k.e1.b).Mul(c1)).Quo(mod2.Scale(1))
	d2 := re.Neg().Mul(k.e2.a).Mul(s2).Add(im.Mul(k.e2.b).Mul(c2)).Quo(mod2.Scale(1))
	gp1 := k.e1.b.Mul(half).Mul(k.e1.a.Mul(interval.Cos(T1.Scale(1))).Sub(c1))
	gp2 := k.e2.b.Mul(half).Mul(k.e2.a.Mul(interval.Cos(T2.Scale(1))).Sub(c2))
	pp := phiPrime(Bbox)
	qa := k.alpha.Scale(-2).Mul(interval.PointF(sgn))
	d1 = d1.Add(pp.Mul(qa).Mul(gp1))
	d2 = d2.Sub(pp.Mul(qa).Mul(gp2))
	mv := Fm.Add(d1.Mul(T1.Sub(m1))).Add(d2.Mul(T2.Sub(m2)))
	if !mv.IsFinite() {
		return direct
	}
	return math.Min(direct, mv.Hi())
}

// pointValue is the bounding function F (see boxBound) at one point, in
// float64: the search stops when no box bound exceeds these values by more
// than the tolerance, so the result approaches sup F (the quantity bounded).
func (k *kernelSup) pointValue(t1, t2 float64) float64 {
	a1, b1 := k.e1.a.Mid().Lo(), k.e1.b.Mid().Lo()
	a2, b2 := k.e2.a.Mid().Lo(), k.e2.b.Mid().Lo()
	re := (a1*math.Cos(t1) - 1 + a2*math.Cos(t2) - 1) / 2
	im := (b1*math.Sin(t1) + b2*math.Sin(t2)) / 2
	g := b1/2*math.Sin(t1)*(a1*math.Cos(t1)-1) - b2/2*math.Sin(t2)*(a2*math.Cos(t2)-1)
	B := math.Abs(k.af / 4 * g)
	phi := 0.0
	switch {
	case B > 20:
		phi = B - math.Log(2*B) + math.Log1p(-math.Exp(-2*B))
	case B > 1e-8:
		phi = math.Log(math.Sinh(B) / B)
	}
	return math.Log(k.af/(4*math.Pi)) + 0.5*math.Log(re*re+im*im) + phi
}

// stripSupBoxes bounds the search: it stops when the best box bound is
// within tol (in log) of a point value, or after stripSupBoxes box
// evaluations; the bound returned is rigorous either way.
const stripSupBoxes = 200000

// bound returns an upper bound of log sup |k| over E_1 x E_2 (both
// boundaries; when e2 has eta 0 the second variable runs over the segment),
// aiming at tol in log.
func (k *kernelSup) bound(tol float64) float64 {
	piUp := math.Nextafter(math.Pi, 4)
	h2 := math.Nextafter(2*math.Pi, 7)
	if k.e2.eta == 0 {
		h2 = piUp
	}
	const n1, n2 = 16, 32
	h := &stripHeap{}
	best := math.Inf(-1)
	for i := 0; i < n1; i++ {
		l1, u1 := piUp*float64(i)/n1, piUp*float64(i+1)/n1
		for j := 0; j < n2; j++ {
			l2, u2 := h2*float64(j)/n2, h2*float64(j+1)/n2
			b := stripBox{l1, u1, l2, u2, k.boxBound(l1, u1, l2, u2)}
			heap.Push(h, b)
			best = math.Max(best, k.pointValue((l1+u1)/2, (l2+u2)/2))
		}
	}
	for evals := 0; ; evals += 2 {
		top := (*h)[0]
		if math.IsInf(top.ub, -1) {
			return top.ub
		}
		if top.ub <= best+tol || evals >= stripSupBoxes || math.IsNaN(top.ub) {
			if math.IsNaN(top.ub) {
				return math.Inf(1)
			}
			return top.ub
		}
		heap.Pop(h)
		var c [2]stripBox
		if top.h1-top.l1 >= top.h2-top.l2 {
			m := (top.l1 + top.h1) / 2
			c[0] = stripBox{top.l1, m, top.l2, top.h2, 0}
			c[1] = stripBox{m, top.h1, top.l2, top.h2, 0}
		} else {
			m := (top.l2 + top.h2) / 2
			c[0] = stripBox{top.l1, top.h1, top.l2, m, 0}
			c[1] = stripBox{top.l1, top.h1, m, top.h2, 0}
		}
		for _, b := range c {
			b.ub = k.boxBound(b.l1, b.h1, b.l2, b.h2)
			heap.Push(h, b)
			best = math.Max(best, k.pointValue((b.l1+b.h1)/2, (b.l2+b.h2)/2))
		}
	}
}

// logKernelEstimate is a float64 estimate (not a bound) of log sup |k| on
// E_eta1 x E_eta2, for choosing the rule and the ellipses: the product of
// the separate maxima of |x + y| and of the sinc factor.
func logKernelEstimate(alpha, eta1, eta2 float64) float64 {
	gmax := func(eta float64) float64 {
		a, b := math.Cosh(eta), math.Sinh(eta)
		m := 0.0
		for i := 0; i <= 256; i++ {
			t := math.Pi * float64(i) / 256
			m = math.Max(m, math.Abs(b/2*math.Sin(t)*(a*math.Cos(t)-1)))
		}
		return m
	}
	B := alpha / 4 * (gmax(eta1) + gmax(eta2))
	ls := B * B / 6
	if B > 1 {
		ls = math.Min(ls, B-math.Log(2*B))
	}
	return math.Log(alpha/(4*math.Pi)*((math.Cosh(eta1)+1)/2+(math.Cosh(eta2)+1)/2)) + ls
}

// logSumWeighted returns log sum_{j<N} (2j+1) e^{p eta j} in float64.
func logSumWeighted(N int, eta float64, p float64) float64 {
	top := p * eta * float64(N-1)
	var s float64
	for j := 0; j < N; j++ {
		s += float64(2*j+1) * math.Exp(p*eta*float64(j)-top)
	}
	return top + math.Log(s)
}

// Remainder of the tensor Clenshaw-Curtis rule (verifier's own bound). For
// G_jk = int int q_j(x) k(x, y) q_k(y) over [-1, 0]^2 = (1/4) int int f
// over [-1, 1]^2 and the rule (1/4)(Q x Q) f:
//
//	I I - Q Q = (I - Q)_s I_t + Q_s (I - Q)_t.
//
// The first term is the one-variable error of g(s) = int f(s, t) dt, with
// |g| <= 2 sup_{E_rho x [-1,1]} |f|; the second is Q applied to the
// one-variable errors in t, so at most W = sum |w_a| times the largest of
// them. With the one-variable bound 2 m (W + eps_n)/(rho^n (rho^2 - 1)),
// eps_n = 2/((n+2)^2 - 1) (ccRule.bound), |q_j| <= sqrt(2j+1) rho^j on E_rho
// (|P_j| <= rho^j there, from Laplace's integral
// P_j(z) = (1/pi) int_0^pi (z + sqrt(z^2 - 1) cos phi)^j dphi, whose
// integrand has modulus at most rho^j for z = (u + 1/u)/2, |u| = rho),
// |q_j| <= sqrt(2j+1) on [-1, 1], and Mk = sup_{E_rho x [-1,1]} |k|
// (= sup over [-1,1] x E_rho by the symmetry of k):
//
//	|E_jk| <= (C/4) sqrt((2j+1)(2k+1)) (2 rho^j + W rho^k),
//	C = 2 (W + eps_n) Mk / (rho^n (rho^2 - 1)).
//
// For a witness psi = sum c_j q_j the same argument with
// Psi_rho = sum |c_j| sqrt(2j+1) rho^j bounding |psi| on E_rho gives
// |E| <= (C/4)(2 + W) Psi_rho Psi_0.

// logC returns (as an F enclosure) log C for the rule, eta and log Mk.
func stripLogC(n int, wsum interval.F, eta float64, logMk float64) interval.F {
	nn := float64(n + 2)
	eps := interval.PointF(2).Quo(interval.PointF(nn).Sqr().Sub(interval.PointF(1)))
	e := interval.PointF(eta)
	den := interval.Log(interval.Expm1(e.Scale(1))) // log(rho^2 - 1)
	return interval.F{}.Ln2().Add(interval.Log(wsum.Add(eps))).Add(interval.PointF(logMk)).
		Sub(interval.PointF(float64(n)).Mul(e)).Sub(den)
}

// stripLogSumF encloses log sum_{j<N} (2j+1) e^{p eta j}.
func stripLogSumF(N int, eta float64, p int) interval.F {
	e := interval.PointF(eta).Mul(interval.PointF(float64(p)))
	top := e.Mul(interval.PointF(float64(N - 1)))
	s := interval.PointF(0)
	for j := 0; j < N; j++ {
		s = s.Add(interval.PointF(float64(2*j + 1)).Mul(interval.Exp(e.Mul(interval.PointF(float64(j))).Sub(top))))
	}
	return top.Add(interval.Log(s))
}

// galerkinQuadF bounds ||E||_F for the Galerkin matrix: the sum over j, k
// of (2j+1)(2k+1)(2 rho^j + W rho^k)^2 is 4 S2 S0 + 4 W S1^2 + W^2 S0 S2
// with S0 = N^2, S1 = sum (2j+1) rho^j, S2 = sum (2j+1) rho^{2j}.
func galerkinQuadF(logC interval.F, N int, eta float64, W interval.F) interval.F {
	l1 := stripLogSumF(N, eta, 1)
	l2 := stripLogSumF(N, eta, 2)
	l0 := interval.Log(interval.PointF(float64(N)).Sqr())
	four := interval.PointF(4)
	// factor out e^{l2 + l0} (the largest part) to avoid overflow
	t1 := four
	t2 := four.Mul(W).Mul(interval.Exp(l1.Scale(1).Sub(l2).Sub(l0)))
	t3 := W.Sqr()
	lsum := l2.Add(l0).Add(interval.Log(t1.Add(t2).Add(t3)))
	return interval.Exp(logC.Add(lsum.Scale(-1))).Scale(-2)
}

// witnessQuadF bounds the witness remainder (C/4)(2 + W) Psi_rho Psi_0.
func witnessQuadF(logC interval.F, coef []interval.F, eta float64, W interval.F) interval.F {
	e := interval.PointF(eta)
	N := len(coef)
	lt := make([]interval.F, N)
	top := math.Inf(-1)
	psi0 := interval.PointF(0)
	for j, c := range coef {
		ac := c.Abs()
		sq := interval.PointF(float64(2*j + 1)).Sqrt()
		psi0 = psi0.Add(ac.Mul(sq))
		if ac.Hi() == 0 {
			lt[j] = interval.F{}.Whole()
			continue
		}
		lt[j] = interval.Log(interval.PointF(ac.Hi())).Add(interval.Log(sq)).Add(e.Mul(interval.PointF(float64(j))))
		top = math.Max(top, lt[j].Hi())
	}
	s := interval.PointF(0)
	for _, l := range lt {
		if !l.IsFinite() {
			continue
		}
		s = s.Add(interval.Exp(l.Sub(interval.PointF(top))))
	}
	lpsi := interval.PointF(top).Add(interval.Log(s))
	pre := W.Add(interval.PointF(2)).Mul(psi0).Scale(-2)
	return interval.Exp(logC.Add(lpsi)).Mul(pre)
}

// tailF bounds the discarded part,
//
//	||k - P k P|| <= 4 Mk rho1^-N (rho2 + 1)/((1 - 1/rho1)(rho2 - 1)),
//
// Mk = sup |k| on E_rho1 x E_rho2, rho_i = e^{eta_i}. Proof. Let k_N be the
// double Chebyshev series of k(x(s), y(t)) truncated to degrees < N in each
// variable. k_N has degree < N in x and in y, so P k_N P = k_N, and with
// E = k - k_N, k - P k P = E - P E P, whose Hilbert-Schmidt norm is at most
// ||E||_HS (the blocks P E P, P E Q, Q E P, Q E Q, Q = 1 - P, are
// orthogonal in the Hilbert-Schmidt inner product, and k - P k P is the sum
// of the last three). The square [-1, 0]^2 has area 1, so
// ||E||_HS <= sup |E| <= sum of |a_jk| over the pairs with j >= N or
// k >= N, and by the symmetry a_jk = a_kj that is at most twice the sum
// over j >= N, k >= 0. The one-variable bound |c_j| <= 2 M rho^-j (j >= 1)
// for Chebyshev coefficients of a function analytic in E_rho and bounded by
// M there (L. N. Trefethen, Approximation Theory and Approximation
// Practice, SIAM 2013, Thm 8.1) applied in s for every t in E_rho2 gives
// functions c_j(t) analytic in E_rho2 and bounded by 2 Mk rho1^-j, whose
// coefficients obey |a_j0| <= 2 Mk rho1^-j and |a_jk| <= 4 Mk rho1^-j
// rho2^-k (k >= 1); summing, sum_k |a_jk| <= 2 Mk rho1^-j (rho2+1)/(rho2-1)
// and sum_{j >= N} rho1^-j = rho1^-N/(1 - 1/rho1).
func tailF(logMk float64, N int, eta1, eta2 float64) interval.F {
	e1, e2 := interval.PointF(eta1), interval.PointF(eta2)
	l := interval.PointF(logMk).Sub(interval.PointF(float64(N)).Mul(e1))
	d1 := interval.Expm1(e1.Neg()).Neg()
	r2m1 := interval.Expm1(e2)
	r2p1 := r2m1.Add(interval.PointF(2))
	return interval.Exp(l).Mul(interval.PointF(4)).Mul(r2p1).Quo(d1.Mul(r2m1))
}
