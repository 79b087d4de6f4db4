package matched

import (
	"math"

	"wedgebound/interval"
)

// Bounds of the entire kernel
//
//	C_a(x, y) = sin(alpha ((x-a)^2 - (y-a)^2)/4)/(pi (x - y))
//	          = (alpha w/(4 pi)) sinc(z),  w = x + y - 2a,  z = alpha (x - y) w/4,
//
// on products of Bernstein ellipses around subintervals of [-1, 0], and the
// two truncation bounds built on them (see doc.go).
//
// For the interval I = [lo, hi] with centre m and half-length h, the
// ellipse E_eta(I) = {m + h s : s = cosh(eta) cos t + i sinh(eta) sin t
// scaled by r in [0, 1]} has |Re s| <= cosh eta and |Im s| <= sinh eta, so
// |x - a| <= R = |m - a| + h cosh eta and
// |Im (x - a)^2| = 2 |Re(x - a)| |Im(x - a)| <= 2 h sinh(eta) R. Then
// |w| <= R_x + R_y, |Im z| <= B = (alpha/4)(2 h_x sinh(eta_x) R_x +
// 2 h_y sinh(eta_y) R_y), and |sinc z| <= sinh(B)/B <= S(B) with
// S(B) = cosh B (B < 1) or e^B/(2B) (B >= 1), since
// sinc z = int_0^1 cos(z t) dt and |cos(z t)| <= cosh(t |Im z|).

type span struct{ lo, hi float64 }

func (s span) mid() float64  { return (s.lo + s.hi) / 2 }
func (s span) half() float64 { return (s.hi - s.lo) / 2 }

// logKernelMax encloses an upper bound of log sup |C_a| over
// E_eta1(I) x E_eta2(J) (eta = 0: the real segment).
func logKernelMax(alpha interval.F, a float64, I, J span, eta1, eta2 float64) interval.F {
	pa := interval.PointF(a)
	side := func(s span, eta float64) (R, im interval.F) {
		m := interval.PointF(s.lo).Add(interval.PointF(s.hi)).Scale(-1)
		h := interval.PointF(s.hi).Sub(interval.PointF(s.lo)).Scale(-1)
		e := interval.PointF(eta)
		R = m.Sub(pa).Abs().Add(h.Mul(interval.Cosh(e)))
		im = h.Mul(interval.Sinh(e)).Mul(R).Scale(1)
		return
	}
	Rx, ix := side(I, eta1)
	Ry, iy := side(J, eta2)
	B := alpha.Mul(ix.Add(iy)).Scale(-2)
	B = interval.PointF(B.Hi())
	var logS interval.F
	if B.Lo() >= 1 {
		logS = B.Sub(interval.Log(B.Scale(1)))
	} else {
		logS = interval.Log(interval.Cosh(B))
	}
	pre := alpha.Mul(Rx.Add(Ry)).Quo(interval.F{}.Pi().Scale(2))
	return interval.Log(pre).Add(logS)
}

func logKernelMaxFloat(alpha, a float64, I, J span, eta1, eta2 float64) float64 {
	side := func(s span, eta float64) (R, im float64) {
		R = math.Abs(s.mid()-a) + s.half()*math.Cosh(eta)
		return R, 2 * s.half() * math.Sinh(eta) * R
	}
	Rx, ix := side(I, eta1)
	Ry, iy := side(J, eta2)
	B := alpha * (ix + iy) / 4
	ls := math.Log(math.Cosh(B))
	if B >= 1 {
		ls = B - math.Log(2*B)
	}
	return math.Log(alpha*(Rx+Ry)/(4*math.Pi)) + ls
}

// discardedPair encloses (upper end) the bound on the sup of C_a minus its
// double Chebyshev truncation to degrees < NI in x and < NJ in y on I x J:
// 4 M (rho1^-NI + rho2^-NJ)/((1 - 1/rho1)(1 - 1/rho2)), with M the kernel
// bound on E_eta1(I) x E_eta2(J), rho_i = e^eta_i (Chebyshev coefficients
// of a function analytic and bounded by M on the product of ellipses obey
// |c_jk| <= 4 M rho1^-j rho2^-k; L. N. Trefethen, Approximation Theory and
// Approximation Practice (2013), Thm 8.1, in each variable; the discarded
// indices are {j >= NI} and {k >= NJ}).
func discardedPair(alpha interval.F, a float64, I, J span, NI, NJ int, eta1, eta2 float64) interval.F {
	lm := logKernelMax(alpha, a, I, J, eta1, eta2)
	e1, e2 := interval.PointF(eta1), interval.PointF(eta2)
	t1 := interval.Exp(lm.Sub(interval.PointF(float64(NI)).Mul(e1)))
	t2 := interval.Exp(lm.Sub(interval.PointF(float64(NJ)).Mul(e2)))
	d1 := interval.Expm1(e1.Neg()).Neg()
	d2 := interval.Expm1(e2.Neg()).Neg()
	return t1.Add(t2).Scale(2).Quo(d1.Mul(d2))
}

func logAdd(x, y float64) float64 {
	if x < y {
		x, y = y, x
	}
	return x + math.Log1p(math.Exp(y-x))
}

func discardedPairFloat(alpha, a float64, I, J span, NI, NJ int) (logT, eta1, eta2 float64) {
	logT = math.Inf(1)
	for e1 := 0.02; e1 < 8; e1 *= 1.12 {
		for e2 := 0.02; e2 < 8; e2 *= 1.12 {
			lm := logKernelMaxFloat(alpha, a, I, J, e1, e2)
			t := math.Log(4) + lm + logAdd(-float64(NI)*e1, -float64(NJ)*e2) - math.Log(-math.Expm1(-e1)) - math.Log(-math.Expm1(-e2))
			if t < logT {
				logT, eta1, eta2 = t, e1, e2
			}
		}
	}
	return
}

// quadPair returns logC and eta such that the n-point tensor Gauss rule
// misses the Galerkin entry (j, k) of the block pair (I, J) by at most
// C sqrt((2j+1)(2k+1)) (rho^j Mx + rho^k My)/M0, where the factors Mx and
// My are returned as logs: log Mx (kernel bound on E_eta(I) x J) and
// log My (on I x E_eta(J)). Derivation (doc.go): for f analytic in E_rho
// with |f| <= M, the n-point Gauss error on [-1, 1] is at most
// 4 M (1 + 1/(4n^2 - 1)) rho^-2n/(1 - rho^-2); the tensor error splits as
// (I - Q) x I + Q x (I - Q) with weight sums 2; |q_j| <= sqrt((2j+1)/|I|)
// rho^j on E_rho(I); dx dy = (|I|/2)(|J|/2) ds dt. Altogether
// C = 2 (1 + 1/(4n^2 - 1)) sqrt(|I| |J|) rho^-2n/(1 - rho^-2).
func quadLogC(n int, I, J span, eta float64) interval.F {
	nn := interval.PointF(float64(n))
	corr := interval.Log1p(interval.PointF(1).Quo(nn.Sqr().Scale(2).Sub(interval.PointF(1))))
	den := interval.Log(interval.Expm1(interval.PointF(-2 * eta)).Neg())
	len2 := interval.PointF(I.hi).Sub(interval.PointF(I.lo)).Mul(interval.PointF(J.hi).Sub(interval.PointF(J.lo)))
	return interval.F{}.Ln2().Add(corr).Add(interval.Log(len2).Scale(-1)).Sub(nn.Mul(interval.PointF(eta)).Scale(1)).Sub(den)
}

// bestQuadEta picks eta minimising the estimated largest remainder.
func bestQuadEta(alpha, a float64, I, J span, NI, NJ, n int) (logE, eta float64) {
	logE = math.Inf(1)
	for e := 0.01; e < 8; e *= 1.05 {
		lc := math.Log(2) + 0.5*math.Log((I.hi-I.lo)*(J.hi-J.lo)) - 2*float64(n)*e - math.Log(-math.Expm1(-2*e))
		lx := logKernelMaxFloat(alpha, a, I, J, e, 0) + float64(NI-1)*e
		ly := logKernelMaxFloat(alpha, a, I, J, 0, e) + float64(NJ-1)*e
		l := lc + 0.5*math.Log(float64((2*NI-1)*(2*NJ-1))) + math.Max(lx, ly) + math.Log(2)
		if l < logE {
			logE, eta = l, e
		}
	}
	return
}
