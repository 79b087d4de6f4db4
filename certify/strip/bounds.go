package strip

import (
	"math"

	"wedgebound/interval"
)

// This file bounds |k| on products of Bernstein ellipses and turns that into
// the two truncation bounds: the discarded part of the operator and the
// Gauss-Legendre remainder of the Galerkin entries.
//
// Coordinates: x = (s - 1)/2 maps s in [-1, 1] onto [-1, 0]. E_rho is the
// closed Bernstein ellipse {(w + 1/w)/2 : |w| <= rho} with rho = e^eta,
// semi-axes a = cosh eta and b = sinh eta; eta = 0 is the segment itself.
//
// Bound on |k|: with z = alpha (x^2 - y^2)/4, k = -(alpha (x + y)/(4 pi))
// sinc z, and sinc z = int_0^1 cos(z t) dt with |cos w| <= cosh(Im w) gives
// |sinc z| <= sinh(|Im z|)/|Im z| <= S(|Im z|), where S(B) = cosh B for
// B < 1 and e^B/(2B) otherwise (both upper bounds for all B >= 0). On the
// boundary point s = a cos t + i b sin t of E_rho, |x| <= (a + 1)/2 and
// |Im x^2| = (b/2) |a cos t - 1| |sin t| <= (b/2) sqrt(h(a)), where
// h(a) = max over c in [-1, 1] of (1 - c^2)(a c - 1)^2, attained at c = +-1
// (h = 0) or at a root of h'(c) = 2 (a c - 1)(a + c - 2 a c^2), that is
// c = 1/a (h = 0) or c = (1 +- sqrt(1 + 8 a^2))/(4 a). By the maximum
// principle the bound on the distinguished boundary holds on the whole
// product of ellipses.

// ellipseAxes encloses a = cosh eta and b = sinh eta for eta >= 0.
func ellipseAxes(eta float64) (a, b interval.F) {
	e := interval.PointF(eta)
	r := interval.Exp(e)
	ri := interval.Exp(e.Neg())
	return r.Add(ri).Scale(-1), r.Sub(ri).Scale(-1)
}

// hMax encloses max over c in [-1, 1] of (1 - c^2)(a c - 1)^2 for a >= 1
// (it returns an interval whose upper end bounds the maximum).
func hMax(a interval.F) interval.F {
	one := interval.PointF(1)
	root := one.Add(a.Sqr().Mul(interval.PointF(8))).Sqrt()
	h := func(c interval.F) interval.F {
		return one.Sub(c.Sqr()).Mul(a.Mul(c).Sub(one).Sqr())
	}
	fourA := a.Scale(2)
	cm := one.Sub(root).Quo(fourA)
	cp := one.Add(root).Quo(fourA)
	return h(cm).Max(h(cp)).Max(interval.PointF(0))
}

// logKernelMax encloses an upper bound for log sup |k| over E_rho1 x E_rho2
// with rho_i = e^{eta_i} (eta_i >= 0; eta = 0 is the real segment).
func logKernelMax(alpha, eta1, eta2 float64) interval.F {
	one := interval.PointF(1)
	al := interval.PointF(alpha)
	a1, b1 := ellipseAxes(eta1)
	a2, b2 := ellipseAxes(eta2)
	ext := a1.Add(one).Scale(-1).Add(a2.Add(one).Scale(-1)) // bounds |x| + |y|
	im := interval.PointF(0)
	if eta1 > 0 {
		im = im.Add(b1.Mul(hMax(a1).Sqrt()))
	}
	if eta2 > 0 {
		im = im.Add(b2.Mul(hMax(a2).Sqrt()))
	}
	B := al.Mul(im).Scale(-3) // alpha (b1 sqrt h1 + b2 sqrt h2) / 8 >= |Im z|
	var logS interval.F
	if B.Lo() >= 1 {
		logS = B.Sub(interval.Log(B.Scale(1)))
	} else {
		logS = interval.Log(interval.Exp(B).Add(interval.Exp(B.Neg())).Scale(-1))
	}
	pre := al.Mul(ext).Quo(interval.F{}.Pi().Scale(2))
	return interval.Log(pre).Add(logS)
}

// tailBound encloses (upper end) the bound
//
//	||k - k_N||_HS <= sup |k - k_N| <= 8 M rho1^-N / ((1 - 1/rho1)(1 - 1/rho2))
//
// on the discarded part, where k_N is the double Chebyshev series of
// k(x(s), y(t)) truncated to degrees < N in each variable and M bounds |k|
// on E_rho1 x E_rho2. Coefficient bound |c_jk| <= 4 M rho1^-j rho2^-k
// (apply the one-variable bound |c_j| <= 2 M rho^-j, L. N. Trefethen,
// Approximation Theory and Approximation Practice (2013), Thm 8.1, in each
// variable); the sum over {j >= N} is 4 M rho1^-N / ((1-1/rho1)(1-1/rho2)),
// and the set {k >= N} gives the same by the symmetry k(x, y) = k(y, x).
// The domain [-1, 0]^2 has area 1, so the HS norm is at most the sup norm.
func tailBound(alpha float64, N int, eta1, eta2 float64) interval.F {
	lm := logKernelMax(alpha, eta1, eta2)
	e := lm.Sub(interval.PointF(float64(N)).Mul(interval.PointF(eta1)))
	d1 := interval.Expm1(interval.PointF(-eta1)).Neg()
	d2 := interval.Expm1(interval.PointF(-eta2)).Neg()
	return interval.Exp(e).Mul(interval.PointF(8)).Quo(d1.Mul(d2))
}

// quadLogC encloses log C where the Gauss-Legendre remainder of the
// Galerkin entry (j, k) with n nodes per variable is at most
// C sqrt((2j+1)(2k+1)) (rho^j + rho^k).
//
// Derivation: the one-variable n-point Gauss error for f analytic in E_rho
// with |f| <= M is at most 4 M (1 + 1/(4n^2-1)) rho^-2n / (1 - rho^-2):
// expand f in Chebyshev polynomials (|c_m| <= 2 M rho^-m), the rule is exact
// up to degree 2n-1, odd T_m integrate to 0 under both the integral and the
// symmetric rule, and for even m the error of T_m is at most
// 2 + 2/(m^2-1). For the double integral, I I - Q Q = (I - Q) I + Q (I - Q)
// with the outer rule applied to functions analytic in one variable only,
// so M is needed on E_rho x [-1, 1] and [-1, 1] x E_rho (equal by symmetry),
// where |q_j| <= sqrt(2j+1) rho^j (|P_j| <= rho^j on E_rho by the Laplace
// integral) and |q_j| <= sqrt(2j+1) on the segment. The Jacobian of
// (s, t) -> (x, y) is 1/4. Altogether
// C = 2 (1 + 1/(4n^2-1)) rho^-2n M / (1 - rho^-2).
func quadLogC(alpha float64, n int, eta float64) interval.F {
	lm := logKernelMax(alpha, eta, 0)
	nn := interval.PointF(float64(n))
	fourN2m1 := nn.Sqr().Scale(2).Sub(interval.PointF(1)) // 4n^2 - 1
	corr := interval.Log1p(interval.PointF(1).Quo(fourN2m1))
	den := interval.Log(interval.Expm1(interval.PointF(-2 * eta)).Neg())
	twoNEta := nn.Mul(interval.PointF(eta)).Scale(1)
	return interval.F{}.Ln2().Add(corr).Sub(twoNEta).Sub(den).Add(lm)
}

// quadFrobenius encloses (upper end) the Frobenius norm of the matrix of
// Gauss remainders: sum_jk C^2 (2j+1)(2k+1)(rho^j + rho^k)^2
// <= 4 C^2 (sum_j (2j+1)) (sum_k (2k+1) rho^2k) and
// sum_{k<N} (2k+1) rho^2k <= (2N - 1)(rho^2N - 1)/(rho^2 - 1).
func quadFrobenius(logC interval.F, N int, eta float64) interval.F {
	nf := interval.PointF(float64(N))
	x := nf.Mul(interval.PointF(eta)).Scale(1) // 2 N eta
	var l2 interval.F
	if x.Lo() > 40 {
		l2 = x // log(e^x - 1) < x
	} else {
		l2 = interval.Log(interval.Expm1(x))
	}
	ls := interval.Log(nf.Scale(1).Sub(interval.PointF(1))).Add(l2).Sub(interval.Log(interval.Expm1(interval.PointF(2 * eta))))
	return interval.Exp(interval.F{}.Ln2().Add(logC).Add(interval.Log(nf)).Add(ls.Scale(-1)))
}

// Float64 estimates of the same bounds, used only to choose N, n and the
// ellipses; the rigorous values are recomputed with the functions above.

func hMaxFloat(a float64) float64 {
	h := func(c float64) float64 { return (1 - c*c) * (a*c - 1) * (a*c - 1) }
	r := math.Sqrt(1 + 8*a*a)
	return math.Max(h((1-r)/(4*a)), h((1+r)/(4*a)))
}

func logKernelMaxFloat(alpha, e1, e2 float64) float64 {
	a1, b1 := math.Cosh(e1), math.Sinh(e1)
	a2, b2 := math.Cosh(e2), math.Sinh(e2)
	B := alpha * (b1*math.Sqrt(hMaxFloat(a1)) + b2*math.Sqrt(hMaxFloat(a2))) / 8
	var ls float64
	if B >= 1 {
		ls = B - math.Log(2*B)
	} else {
		ls = math.Log(math.Cosh(B))
	}
	return math.Log(alpha*((a1+1)/2+(a2+1)/2)/(4*math.Pi)) + ls
}

// bestTail returns log(tail bound) minimised over a grid of ellipses.
func bestTail(alpha float64, N int) (logT, eta1, eta2 float64) {
	logT = math.Inf(1)
	for e1 := 0.002; e1 < 8; e1 *= 1.04 {
		for e2 := 1e-7; e2 < 4; e2 *= 1.15 {
			lt := logKernelMaxFloat(alpha, e1, e2) + math.Log(8) - float64(N)*e1 -
				math.Log(-math.Expm1(-e1)) - math.Log(-math.Expm1(-e2))
			if lt < logT {
				logT, eta1, eta2 = lt, e1, e2
			}
		}
	}
	return
}

// bestQuad returns log(Frobenius quadrature bound) minimised over eta.
func bestQuad(alpha float64, N, n int) (logQ, eta float64) {
	logQ = math.Inf(1)
	for e := 0.002; e < 8; e *= 1.02 {
		lc := math.Log(2*(1+1/(4*float64(n)*float64(n)-1))) - 2*float64(n)*e -
			math.Log(-math.Expm1(-2*e)) + logKernelMaxFloat(alpha, e, 0)
		x := 2 * float64(N) * e
		l2 := x
		if x < 40 {
			l2 = math.Log(math.Expm1(x))
		}
		lf := math.Log(2) + lc + math.Log(float64(N)) +
			0.5*(math.Log(float64(2*N-1))+l2-math.Log(math.Expm1(2*e)))
		if lf < logQ {
			logQ, eta = lf, e
		}
	}
	return
}
