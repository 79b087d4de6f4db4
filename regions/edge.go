package regions

import (
	"math"
	"sort"
	"sync"

	"wedgebound/interval"
)

// An edge term is the off-diagonal contribution of one knot c >= 0 of a
// piecewise-linear profile G(u) on quadrant I (package doc, "Mellin
// diagonalisation" and "Bands and hats"). With
// r = (tau-1)/(tau+1) = e^{-t} the entry
// M_{+-}(s) = (1/pi) int_1^inf G^(2 tau) (tau-1)^{-1/2+is} (tau+1)^{-1/2-is} dtau
// becomes an integral over t in (0, inf) with tau = coth(t/2), and
//
//   - a jump of G by -1 at c (G^(w) gains -i e^{icw}/w, as at the upper end
//     of a band, whose M_{+-} is E(b, s) - E(a, s)) contributes
//     E(c, s) = (1/(2 pi i)) int_0^inf e^{-(1/2+is)t} e^{2ic coth(t/2)} / (1 + e^{-t}) dt;
//   - a kink, G(u) gaining (u - c)_+ (G^(w) gains -e^{icw}/w^2), contributes
//     K(c, s) = -(1/(4 pi)) int_0^inf e^{-(1/2+is)t} e^{2ic coth(t/2)} (1 - e^{-t})/(1 + e^{-t})^2 dt.
//
// (From 1/(2 i tau) = (1-r)/(2i(1+r)), -1/(4 tau^2) = -(1-r)^2/(4(1+r)^2) and
// dtau (tau-1)^{-1/2+is} (tau+1)^{-1/2-is} = r^{-1/2+is} dr/(1-r).) At c = 0
// the integrals are elementary in J(s) = int_0^1 r^{-1/2+is}/(1+r) dr:
// E(0, s) = -(i/(2 pi)) J(s) and K(0, s) = -(1/(4 pi)) (1 - 2is J(s)), the
// latter from int_0^1 r^{a-1} d(r/(1+r)) = 1/2 - (a-1) J by parts.
//
// For c > 0 the phase F(t) = -s t + 2c coth(t/2) decides the path. For
// s >= 0 the integrand is bounded in the quarter plane Re t >= 0,
// -pi < Im t <= 0 (there Im coth(t/2) >= 0) and the path runs from 0 down
// to -i pi/2 and then parallel to the real axis, where |e^{-ist}| =
// e^{-s pi/2}. For s = -sigma < 0 there is a real saddle point
// t* = 2 asinh(sqrt(c/sigma)) (F' = sigma - c csch^2(t/2)); the path
// leaves 0 at angle -pi/4 (where e^{2ic coth} decays), reaches t* and
// climbs at angle pi/4 to height beta = min(pi/2, max(60/sigma, t*)), then
// runs horizontally. Float exploration found Im F + Re t/2 >= -0.2 along
// these paths for c in [1e-3, 50] and sigma in [1e-2, 1e6] over the whole
// s-window each path serves, so no digits are lost for large |s|.
// The windows in sigma have width 2/max(d1, beta) (d1 = min(t*/2, pi/2)).
type edgeTerm[T interval.Real[T]] struct {
	kink bool
	c    T
	cF   float64
	zero bool

	rules *ruleSet[T]

	mu      sync.Mutex
	windows []float64 // sigma boundaries 0 = w_0 < w_1 < ... for s < 0
}

// maxEdgeSigma caps the windows for s < 0 (beyond it the tail lemmas are
// the only source).
const maxEdgeSigma = 1e7

func newEdge[T interval.Real[T]](c T, cF float64, kink bool) *edgeTerm[T] {
	e := &edgeTerm[T]{kink: kink, c: c, cF: cF, zero: cF == 0, windows: []float64{0}}
	e.rules = newRuleSet(e.indexOf, e.rangeOf, e.buildRule)
	return e
}

// edgeGeometry returns the saddle t*, the depth d1, the height beta and the
// window width for sigma > 0.
// edgeClimb is the target of sigma*beta: the final horizontal leg of the path
// for s < 0 then lies below e^{-edgeClimb} and is mostly cut off.
const edgeClimb = 60

func edgeGeometry(c, sigma float64) (ts, d1, beta, width float64) {
	ts = math.Inf(1)
	if sigma > 0 {
		ts = 2 * math.Asinh(math.Sqrt(c/sigma))
	}
	d1 = math.Min(ts/2, math.Pi/2)
	beta = math.Pi / 2
	if sigma > 0 {
		beta = math.Min(math.Pi/2, math.Max(edgeClimb/sigma, ts))
	}
	width = 2 / math.Max(d1, beta)
	return
}

func (e *edgeTerm[T]) indexOf(s float64) (int, bool) {
	if math.IsNaN(s) || math.Abs(s) > maxEdgeSigma {
		return 0, false
	}
	if s >= 0 {
		if s < 1 {
			return 0, true
		}
		m := int(math.Floor(math.Log2(s)))
		if math.Ldexp(1, m) > s {
			m--
		}
		if math.Ldexp(1, m+1) <= s {
			m++
		}
		return m + 1, true
	}
	sigma := -s
	e.mu.Lock()
	defer e.mu.Unlock()
	for e.windows[len(e.windows)-1] < sigma {
		last := e.windows[len(e.windows)-1]
		_, _, _, w := edgeGeometry(e.cF, last)
		e.windows = append(e.windows, last+w)
	}
	// smallest k with windows[k] >= sigma; window k is [w_{k-1}, w_k].
	k := sort.SearchFloat64s(e.windows, sigma)
	if k == 0 {
		k = 1
	}
	return -k, true
}

func (e *edgeTerm[T]) rangeOf(idx int) (float64, float64) {
	if idx == 0 {
		return 0, 1
	}
	if idx > 0 {
		return math.Ldexp(1, idx-1), math.Ldexp(1, idx)
	}
	e.mu.Lock()
	defer e.mu.Unlock()
	k := -idx
	return -e.windows[k], -e.windows[k-1]
}

// integrand encloses e^{-t/2} e^{2ic coth(t/2)} a(t) with a(t) = 1/(1+e^{-t})
// (jump) or (1-e^{-t})/(1+e^{-t})^2 (kink).
func (e *edgeTerm[T]) integrand(t interval.C[T]) interval.C[T] {
	return e.integrandRef(t, t.Re.Int(0))
}

// cothAmp encloses coth(t/2) and the amplitude a(t), both from e^{-t}.
func (e *edgeTerm[T]) cothAmp(t interval.C[T]) (coth, a interval.C[T]) {
	one := interval.RealC(t.Re.Int(1))
	u := t.Neg().Exp()
	coth = one.Add(u).Quo(one.Sub(u))
	den := one.Add(u)
	if e.kink {
		return coth, one.Sub(u).Quo(den.Sqr())
	}
	return coth, one.Quo(den)
}

// integrandRef encloses integrand(t) e^{-i s0 t} through the single
// exponent -t/2 + 2ic coth(t/2) - i s0 t.
func (e *edgeTerm[T]) integrandRef(t interval.C[T], s0 T) interval.C[T] {
	coth, a := e.cothAmp(t)
	ist := interval.C[T]{Re: t.Im.Mul(s0).Neg(), Im: t.Re.Mul(s0)} // i s0 t
	ph := interval.C[T]{Re: coth.Im.Mul(e.c).Scale(1).Neg(), Im: coth.Re.Mul(e.c).Scale(1)}
	return ph.Sub(t.Scale(-1)).Sub(ist).Exp().Mul(a)
}

// mag bounds |integrand(t) e^{-ist}| over the box t and all s in sr through
// the single exponent -Re t/2 - 2c Im coth(t/2) + s Im t and |a(t)|.
func (e *edgeTerm[T]) mag(t interval.C[T], sr T) T {
	coth, a := e.cothAmp(t)
	ex := t.Re.Scale(-1).Neg().Sub(coth.Im.Mul(e.c).Scale(1)).Add(sr.Mul(t.Im))
	return interval.Upper(interval.Exp(ex).Mul(a.Re.Abs().Add(a.Im.Abs())))
}

// ampBound bounds |a(t)| on the start gap and on the final horizontal line.
func (e *edgeTerm[T]) ampBound(like T) T {
	if e.kink {
		return like.Int(2)
	}
	return like.Int(1)
}

// buildRule builds the path rule for the s-range [lo, hi] of window idx.
func (e *edgeTerm[T]) buildRule(idx int, lo, hi float64) (*pathRule[T], error) {
	like := e.c
	sr := like.Float(lo).Hull(like.Float(hi))
	tol := math.Ldexp(1, -int(like.Prec())-10)
	A := e.ampBound(like)
	var verts []complex128
	var gap, gapD T
	var beta float64
	if idx >= 0 {
		// Vertical start t = -iy, y in [0, y0]: |e^{-ist}| <= 1, |e^{-t/2}| = 1,
		// |a| <= A, and |e^{2ic coth(t/2)}| = e^{-2c cot(y/2)} <= e^{-2c cot(y0/2)}.
		y0 := math.Min(0.5, 2*e.cF/50)
		for {
			Y := like.Float(y0)
			half := Y.Scale(-1)
			cot := interval.Cos(half).Quo(interval.Sin(half))
			gap = Y.Mul(A).Mul(interval.Exp(cot.Mul(e.c).Scale(1).Neg()))
			if gap.Hi() <= tol || y0 < 1e-300 {
				gapD = gap.Mul(Y)
				break
			}
			y0 /= 1.5
		}
		beta = -math.Pi / 2
		verts = []complex128{complex(0, -y0), complex(0, beta)}
	} else {
		sigma := (-lo - hi) / 2
		ts, d1, b, _ := edgeGeometry(e.cF, sigma)
		beta = b
		// Diagonal start t = r(1 - i), r in [0, p]: Im coth(t/2) =
		// sin r/(cosh r - cos r) >= (1 - p^2/6)/(p cosh p), |e^{-ist}| =
		// e^{-s r} <= e^{sigma_max p}, |e^{-t/2}| <= 1, |a| <= A; length sqrt2 p.
		p := math.Min(d1/2, 2*e.cF/50)
		smax := like.Float(-lo)
		for {
			P := like.Float(p)
			lb := like.Int(1).Sub(P.Sqr().Quo(like.Int(6))).Quo(P.Mul(interval.Cosh(P)))
			ex := smax.Mul(P).Sub(lb.Mul(e.c).Scale(1))
			gap = like.Int(2).Sqrt().Mul(P).Mul(A).Mul(interval.Exp(ex))
			if gap.Hi() <= tol || p < 1e-300 {
				gapD = gap.Mul(like.Int(2).Sqrt().Mul(P))
				break
			}
			p /= 1.5
		}
		verts = []complex128{complex(p, -p), complex(d1, -d1), complex(ts, 0), complex(ts+beta, beta)}
	}
	// Horizontal tail beyond X + i beta: |e^{-t/2}| = e^{-x/2}, |a| <= A,
	// |e^{-ist}| = e^{s beta}, |e^{2ic coth(t/2)}| <= exp(2c max(0, sin beta)/(cosh X - cos beta)).
	B := like.Float(beta)
	sb, cb := interval.SinCos(B)
	grow := interval.Upper(interval.Exp(sr.Mul(B)))
	last := real(verts[len(verts)-1])
	X := last
	var tail, tailD T
	for {
		XT := like.Float(X)
		g := like.Int(1)
		if beta > 0 {
			g = interval.Exp(sb.Mul(e.c).Scale(1).Quo(interval.Cosh(XT).Sub(cb)))
		}
		ex := interval.Exp(XT.Scale(-1).Neg())
		base := A.Mul(grow).Mul(g)
		tail = ex.Scale(1).Mul(base)
		tailD = ex.Mul(XT.Scale(1).Add(like.Int(4)).Add(B.Abs().Scale(1))).Mul(base)
		if tail.Hi() <= tol || X > 400 {
			break
		}
		X += math.Max(0.25, X/4)
	}
	if X > last {
		verts = append(verts, complex(X, beta))
	}
	// Reference point for the weights: the lower end for s >= 0 (then
	// |e^{-i(s - s0)t}| = e^{(s - s0) Im t} <= 1 on the path, which lies in
	// Im t <= 0), the centre of the narrow windows for s < 0.
	sRef := lo
	if idx < 0 {
		sRef = (lo + hi) / 2
	}
	return buildPathRule(like, pathSpec[T]{
		verts: verts, g: e.integrand, gRef: e.integrandRef, sRef: sRef, mag: e.mag, lam: 1, sr: sr,
		trunc: interval.Upper(gap.Add(tail)), truncD: interval.Upper(gapD.Add(tailD)),
		tol: tol,
	})
}

// value encloses E(c, s) or K(c, s) (deriv false) or its s-derivative
// (deriv true) for every s in the interval s; ok is false where no rule
// could be built.
func (e *edgeTerm[T]) value(s T, deriv bool) (interval.C[T], bool) {
	pi := s.Pi()
	if e.zero {
		j := quadrantJ(s)
		if !e.kink {
			if deriv {
				j = quadrantJPrime(s)
			}
			// -(i/2pi) J = (Im J - i Re J)/(2 pi)
			return interval.C[T]{Re: j.Im, Im: j.Re.Neg()}.QuoReal(pi.Scale(1)), true
		}
		is := interval.C[T]{Re: s.Int(0), Im: s}
		if !deriv {
			one := interval.RealC(s.Int(1))
			return one.Sub(is.Mul(j).Scale(1)).QuoReal(pi.Scale(2)).Neg(), true
		}
		// K'(0, s) = (1/(4 pi)) 2i (J + s J')
		jp := quadrantJPrime(s)
		w := j.Add(jp.MulReal(s))
		return interval.C[T]{Re: w.Im.Neg(), Im: w.Re}.QuoReal(pi.Scale(1)), true
	}
	I, ok := e.rules.over(s, deriv)
	if !ok {
		return I, false
	}
	if e.kink {
		return I.QuoReal(pi.Scale(2)).Neg(), true
	}
	// I/(2 pi i) = -i I/(2 pi)
	return interval.C[T]{Re: I.Im, Im: I.Re.Neg()}.QuoReal(pi.Scale(1)), true
}

// approx returns the float64 value of the edge term (not certified).
func (e *edgeTerm[T]) approx(s float64) complex128 {
	if e.zero {
		v, _ := e.value(e.c.Float(s), false)
		return midC(v)
	}
	I := e.rules.approx(s)
	if e.kink {
		return -I / complex(4*math.Pi, 0)
	}
	return I / complex(0, 2*math.Pi)
}

// tail bounds |E(c, s)| or |K(c, s)| for side*s >= S > 0.
//
// Lemma (s >= S). On the path 0 -> -i pi/2 -> -i pi/2 + inf the factor
// e^{2ic coth(t/2)} has modulus <= 1, |e^{-ist}| = e^{-sy} on the vertical
// part and e^{-s pi/2} on the horizontal one, |1/(1+e^{iy})| <= 1/sqrt2
// and |(1-e^{iy})/(1+e^{iy})^2| <= y/2 for y <= pi/2, and both amplitudes
// are at most 1 and sqrt2 on the horizontal line. Hence
// |E| <= (1/(2 pi)) (1/(sqrt2 S) + 2 e^{-pi S/2}) and
// |K| <= (1/(4 pi)) (1/(2 S^2) + 2 sqrt2 e^{-pi S/2}).
//
// Lemma (s <= -S, sigma = -s). Write 2 pi i E = int_0^inf psi e^{iF} with
// psi = 1/(2 cosh(t/2)), F = sigma t + 2c coth(t/2), and -4 pi K the same
// with psi = sinh(t/2)/(2 cosh^2(t/2)). Split at T with
// sinh^2(T/2) = q = kappa c/sigma for some kappa > 1 (the best of
// kappa = 1.5 ... 8 is used). On [0, T] the second derivative
// F_2 = c csch^2(t/2) coth(t/2) decreases, so F_2 >= lambda =
// (sigma/kappa) sqrt((1+q)/q), and van der Corput's lemma (with the
// constant 4 sqrt2 from |{|F'| < d}| <= 2d/lambda and the first-derivative
// bound 2/d on the rest) plus Abel summation give
// |int_0^T| <= 4 sqrt2 lambda^{-1/2} (|psi(T)| + V(psi; 0, T)); that factor
// is 1/2 for the jump (psi decreasing from 1/2) and min(sqrt q, 1/2) for
// the kink (psi rises to its maximum 1/4 at sinh(t/2) = 1; for q <= 1 it
// is increasing on [0, T] with psi(T) <= sqrt(q)/2). On [T, inf) the path
// is moved to T -> T + i pi/2 -> inf + i pi/2 (no singularity for Re t > 0,
// |Im t| < pi). There Im F >= mu Im t with mu = sigma (1 - 1/kappa), as
// Im F(x + iy) = sigma y - 2c sin y/(cosh x - cos y) and cosh T - 1 = 2q =
// 2 kappa c/sigma, so the vertical part is at most max|psi|/mu with
// |psi| <= 1/sqrt2 (jump) or sqrt q + y/2 (kink, giving
// sqrt(q)/mu + 1/(2 mu^2)), and on the horizontal line
// Im F >= sigma (pi/2 - 1/kappa), so that part is at most
// 2 e^{-sigma (pi/2 - 1/kappa)} (jump) or 4 e^{-sigma (pi/2 - 1/kappa)}
// (kink). Every term decreases with sigma, so the bound at S holds for all
// sigma >= S.
// For c = 0: |E| = |J|/(2 pi) <= 1/(8 S) (|J(s)| <= pi/(4|1/2+is|)), and
// 1 - 2is J = -(1/a) int r^a f_1 = (1/(a(a+1))) (1/4 + int r^{a+1} f_2)
// (by parts twice, f(1) = 0) with f = (1-r)/(1+r)^2, f_1 = f' = (r-3)/(1+r)^3,
// f_1(1) = -1/4, f_2 = (f_1)' = (10-2r)/(1+r)^4 > 0 and int_0^1 f_2 = 11/4, so
// |K| <= 3/(4 pi S^2).
func (e *edgeTerm[T]) tail(S T, side int) T {
	pi := S.Pi()
	one := S.Int(1)
	if e.zero {
		if e.kink {
			return interval.Upper(S.Int(3).Quo(pi.Scale(2).Mul(S.Sqr())))
		}
		return interval.Upper(one.Quo(S.Int(8).Mul(S)))
	}
	if side > 0 {
		ex := interval.Exp(pi.Mul(S).Scale(-1).Neg())
		if e.kink {
			v := one.Quo(S.Sqr().Scale(1)).Add(S.Int(2).Sqrt().Scale(1).Mul(ex))
			return interval.Upper(v.Quo(pi.Scale(2)))
		}
		v := one.Quo(S.Int(2).Sqrt().Mul(S)).Add(ex.Scale(1))
		return interval.Upper(v.Quo(pi.Scale(1)))
	}
	var best T
	for i, kappa := range []int64{3, 4, 6, 8, 12, 16} { // kappa/2 = 1.5 ... 8
		K := S.Frac(kappa, 2)
		q := K.Mul(e.c).Quo(S)
		lam := S.Quo(K).Mul(one.Add(q).Quo(q).Sqrt())
		vdc := S.Int(32).Sqrt().Quo(lam.Sqrt()) // 4 sqrt2 lambda^{-1/2}
		mu := S.Mul(one.Sub(one.Quo(K)))        // Im F >= mu y on the vertical
		ex := interval.Exp(S.Mul(pi.Scale(-1).Sub(one.Quo(K))).Neg())
		var v T
		if e.kink {
			aT := q.Sqrt().Min(S.Frac(1, 2))
			if q.Hi() > 1 {
				aT = S.Frac(1, 2)
			}
			v = vdc.Mul(aT).Add(q.Sqrt().Quo(mu)).Add(one.Quo(mu.Sqr().Scale(1))).Add(ex.Scale(2))
			v = v.Quo(pi.Scale(2))
		} else {
			v = vdc.Scale(-1).Add(one.Quo(S.Int(2).Sqrt().Mul(mu))).Add(ex.Scale(1))
			v = v.Quo(pi.Scale(1))
		}
		if i == 0 || v.Hi() < best.Hi() {
			best = v
		}
	}
	return interval.Upper(best)
}
