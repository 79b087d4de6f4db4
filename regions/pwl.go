package regions

import (
	"math"
	"math/cmplx"

	"wedgebound/interval"
)

// piece is one linear stretch of a profile: h rises linearly from h0 at
// u = x0 to h1 at u = x0 + L.
type piece[T interval.Real[T]] struct {
	x0, L, h0, h1 T
	flat          bool // h0 = h1 exactly
}

// edgeRef is an off-diagonal edge term with its coefficient.
type edgeRef[T interval.Real[T]] struct {
	coef T
	edge *edgeTerm[T]
}

// pwlTerm is a piecewise-linear profile h(xp) on quadrant III: the shared
// machinery of the band and hat families. Its unit-weight symbol is
//
//	D(s) = [withQuadrant] (1 + tanh(pi s))/2 + (1/pi) int_R G^(2 tanh v) e^{-2isv} sech v dv,
//	B(s) = conj(sum_j coef_j edge_j(s)),
//
// where G^ is the Fourier transform of the pieces (package doc, "Bands and
// hats", with
// t = tanh v; by parity the quadrant-III profile puts the quadrant-I
// M_{++} into D and conj(M_{+-}) into B) and the edges are the jump and
// kink terms of edge.go. For real s the integrand f(v) satisfies
// f(-v) = conj f(v) (h is real), so the integral is 2 Re int_0^inf, which
// is computed on [0, V] by pathRule with the tail
// |int_V^inf| <= H1 int_V^inf 2 e^{-v} dv = 2 H1 e^{-V}, H1 = int |h|.
type pwlTerm[T interval.Real[T]] struct {
	kind   string
	params map[string]string
	start  string
	pieces []piece[T]
	h1     T       // int |h| du
	umax   float64 // right end of the support
	quad   bool    // add the quadrant's A(s) to D (the band [a, inf))
	edges  []edgeRef[T]
	diag   *ruleSet[T]
	sNeg   float64 // D is left to the tail lemma for s <= -sNeg
	sPos   float64 // and for s >= sPos
	like   T
}

func newPWL[T interval.Real[T]](like T, kind string, params map[string]string, start string, pieces []piece[T], h1 T, umax float64, quad bool, edges []edgeRef[T]) *pwlTerm[T] {
	t := &pwlTerm[T]{kind: kind, params: params, start: start, pieces: pieces, h1: h1, umax: umax, quad: quad, edges: edges, like: like}
	t.diag = newRuleSet(func(s float64) (int, bool) {
		if math.IsNaN(s) || math.Abs(s) > 1e6 {
			return 0, false
		}
		return regimeIndex(s), true
	}, regimeRange, t.buildDiag)
	// The diagonal is left to the tail lemma where it is below 2^-prec.
	tol := math.Ldexp(1, -int(like.Prec()))
	t.sNeg, t.sPos = math.Inf(1), math.Inf(1)
	for S := 1.0; S <= 1<<20; S *= 1.25 {
		St := like.Float(S)
		if math.IsInf(t.sNeg, 1) {
			if d, _ := t.diagTail(St, -1); d.Hi() <= tol {
				t.sNeg = S
			}
		}
		if math.IsInf(t.sPos, 1) {
			if d, _ := t.diagTail(St, 1); d.Hi() <= tol {
				t.sPos = S
			}
		}
	}
	return t
}

// transform encloses G^(w) = int h(u) e^{iuw} du = sum over pieces of
// e^{i x0 w} L (h0 psi1(iLw) + (h1 - h0) psi2(iLw)), with
// psi1(z) = int_0^1 e^{z theta} d theta and psi2(z) = int_0^1 theta e^{z theta} d theta.
func (t *pwlTerm[T]) transform(w interval.C[T]) interval.C[T] {
	sum := interval.RealC(w.Re.Int(0))
	for _, p := range t.pieces {
		iw := interval.C[T]{Re: w.Im.Neg(), Im: w.Re} // i w
		z := iw.MulReal(p.L)
		p1, p2 := psiFunctions(z)
		v := p1.MulReal(p.h0)
		if !p.flat {
			v = v.Add(p2.MulReal(p.h1.Sub(p.h0)))
		}
		sum = sum.Add(iw.MulReal(p.x0).Exp().Mul(v).MulReal(p.L))
	}
	return sum
}

// psiFunctions encloses psi1(z) = (e^z - 1)/z and psi2(z) = (e^z (z-1) + 1)/z^2
// (entire): by their Taylor series sum z^n/(n+1)! and sum z^n/((n+2) n!)
// with the remainder bound 2 |z|^N/N! (|z| <= 4, N >= 2|z|+2) when |z| <= 4,
// else by the closed forms.
func psiFunctions[T interval.Real[T]](z interval.C[T]) (interval.C[T], interval.C[T]) {
	r := z.Abs()
	one := interval.RealC(z.Re.Int(1))
	if r.Hi() > 4 {
		ez := z.Exp()
		p1 := ez.Sub(one).Quo(z)
		p2 := ez.Mul(z.Sub(one)).Add(one).Quo(z.Sqr())
		return p1, p2
	}
	N := int(z.Re.Prec())/2 + 20
	// Horner: psi1 = 1 + (z/2)(1 + (z/3)(1 + ...)), and psi2 = (1/2)(1 + r_1 z (1 + r_2 z (...)))
	// with r_n = c_n/c_{n-1} = (n+1)/(n(n+2)) for c_n = 1/((n+2) n!).
	s1, s2 := one, one
	for k := N; k >= 2; k-- {
		s1 = one.Add(z.Mul(s1).MulReal(z.Re.Frac(1, int64(k))))
	}
	for k := N - 1; k >= 1; k-- {
		s2 = one.Add(z.Mul(s2).MulReal(z.Re.Frac(int64(k+1), int64(k*(k+2)))))
	}
	s2 = s2.Scale(-1)
	// Remainder: |sum_{n>=N} z^n/(n+1)!| <= sum |z|^n/n! <= 2|z|^N/N! for |z| <= N/2.
	rem := r.Int(2)
	rh := interval.Upper(r)
	for k := 1; k <= N; k++ {
		rem = rem.Mul(rh).Quo(rh.Int(int64(k)))
	}
	rem = interval.Upper(rem)
	pad := func(v interval.C[T]) interval.C[T] {
		return interval.C[T]{Re: v.Re.Pad(rem), Im: v.Im.Pad(rem)}
	}
	return pad(s1), pad(s2)
}

// tanhSech encloses tanh v and sech v, computed from e^{-2v} (Re v >= 0) or
// e^{2v} to avoid overflow.
func tanhSech[T interval.Real[T]](v interval.C[T]) (th, sech interval.C[T]) {
	one := interval.RealC(v.Re.Int(1))
	if v.Re.Lo()+v.Re.Hi() >= 0 {
		u := v.Scale(1).Neg().Exp()
		den := one.Add(u)
		th = one.Sub(u).Quo(den)
		sech = v.Neg().Exp().Scale(1).Quo(den)
	} else {
		u := v.Scale(1).Exp()
		den := one.Add(u)
		th = u.Sub(one).Quo(den)
		sech = v.Exp().Scale(1).Quo(den)
	}
	return th, sech
}

// diagIntegrand encloses G^(2 tanh v) sech v.
func (t *pwlTerm[T]) diagIntegrand(v interval.C[T]) interval.C[T] {
	th, sech := tanhSech(v)
	return t.transform(th.Scale(1)).Mul(sech)
}

// diagMag bounds |G^(2 tanh v) sech v e^{-2isv}| over the box v and all s
// in sr: |G^(w)| <= H1 e^{umax max(0, -Im w)} as h is supported in [0, umax].
func (t *pwlTerm[T]) diagMag(v interval.C[T], sr T) T {
	th, sech := tanhSech(v)
	zero := v.Re.Int(0)
	ex := th.Im.Scale(1).Mul(v.Re.Float(t.umax)).Neg().Max(zero).Add(sr.Scale(1).Mul(v.Im))
	m := interval.Exp(ex).Mul(t.h1).Mul(sech.Re.Abs().Add(sech.Im.Abs()))
	return interval.Upper(m)
}

// buildDiag builds the rule for int_0^V G^(2 tanh v) sech v e^{-2isv} dv,
// s in [lo, hi].
func (t *pwlTerm[T]) buildDiag(_ int, lo, hi float64) (*pathRule[T], error) {
	like := t.like
	tol := math.Ldexp(1, -int(like.Prec())-10)
	h1 := interval.Upper(t.h1)
	V := math.Max(4, math.Log(2*h1.Hi()/tol)+1)
	VT := like.Float(V)
	ev := interval.Exp(VT.Neg())
	trunc := h1.Scale(1).Mul(ev)
	truncD := h1.Scale(2).Mul(VT.Add(like.Int(1))).Mul(ev) // int_V^inf 2v H1 2e^{-v}
	return buildPathRule(like, pathSpec[T]{
		verts: []complex128{0, complex(V, 0)}, g: t.diagIntegrand, mag: t.diagMag, lam: 2,
		sr: like.Float(lo).Hull(like.Float(hi)), trunc: interval.Upper(trunc), truncD: interval.Upper(truncD), tol: tol,
	})
}

// sigmaBounds returns upper bounds on int_R dv/sqrt(sinh^2 v + cos^2 eta)
// and int_R |v| dv/sqrt(sinh^2 v + cos^2 eta): on |v| <= 1 use
// sinh^2 v >= v^2 (giving 2 asinh(1/cos eta) and 2(sqrt(1 + cos^2 eta) - cos eta)),
// on |v| > 1 use sinh v >= e^v (1 - e^{-2})/2 (giving 2 * 2e^{-1}/(1-e^{-2})
// and 2 * 4e^{-1}/(1-e^{-2})).
func sigmaBounds[T interval.Real[T]](ceta T) (T, T) {
	one := ceta.Int(1)
	x := one.Quo(ceta)
	asinh := interval.Log(x.Add(x.Sqr().Add(one).Sqrt()))
	em := interval.Exp(one.Neg())
	k := em.Quo(one.Sub(em.Sqr())) // e^{-1}/(1 - e^{-2})
	s0 := asinh.Scale(1).Add(k.Scale(2))
	s1 := one.Add(ceta.Sqr()).Sqrt().Sub(ceta).Scale(1).Add(k.Scale(3))
	return interval.Upper(s0), interval.Upper(s1)
}

// diagTail bounds |D(s)| and |D'(s)| of the profile part (without the
// quadrant's A) for side*s >= S.
//
// Lemma. The integrand of D is analytic in |Im v| < pi/2 and decays as
// |Re v| -> inf there, so the line may be moved. For s <= -S move it up by
// eta (the best of 14 pi/42 ... 20 pi/42),
// where |e^{-2isv}| = e^{2 s eta} <= e^{-2 S eta}, Im tanh(v + i eta) >= 0 so
// |G^(2 tanh)| <= H1, and |sech(v + i eta)| = (sinh^2 v + cos^2 eta)^{-1/2};
// for s >= S move it down by eta, where |e^{-2isv}| <= e^{-2 S eta} and
// |Im 2 tanh(v - i eta)| <= 2 tan eta gives |G^| <= H1 e^{2 umax tan eta}
// (eta is the best of a few values). With the integrals of sigmaBounds,
// |D| <= (H1/pi) e^{x} Sigma0 and |D'| <= (2 H1/pi) e^{x} (Sigma1 + eta Sigma0)
// with x = -2 S eta (+ 2 umax tan eta for s >= S); |v + i eta| <= |v| + eta.
func (t *pwlTerm[T]) diagTail(S T, side int) (T, T) {
	pi := S.Pi()
	h1 := t.h1
	best, bestD := S.Whole(), S.Whole()
	etas := []int64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14}
	if side < 0 {
		etas = []int64{14, 16, 18, 19, 20}
	}
	umax := S.Float(t.umax)
	for _, k := range etas {
		eta := pi.Mul(S.Frac(k, 42)) // up to 10 pi/21 < pi/2
		sn, cs := interval.SinCos(eta)
		ex := S.Mul(eta).Scale(1).Neg()
		if side > 0 {
			ex = ex.Add(umax.Scale(1).Mul(sn.Quo(cs)))
		}
		s0, s1 := sigmaBounds(cs)
		f := interval.Exp(ex).Mul(h1).Quo(pi)
		d := interval.Upper(f.Mul(s0))
		dd := interval.Upper(f.Scale(1).Mul(s1.Add(eta.Mul(s0))))
		if !best.IsFinite() || d.Hi() < best.Hi() {
			best, bestD = d, dd
		}
	}
	return best, bestD
}

// diagonal encloses D (deriv false) or D' (deriv true) of the profile part.
func (t *pwlTerm[T]) diagonal(s T, deriv bool) T {
	pi := s.Pi()
	if s.Hi() <= -t.sNeg || s.Lo() >= t.sPos {
		S := s.Abs()
		side := 1
		if s.Hi() < 0 {
			side = -1
		}
		d, dd := t.diagTail(interval.Lower(S), side)
		if deriv {
			d = dd
		}
		return d.Neg().Hull(d)
	}
	I, ok := t.diag.over(s, deriv)
	if !ok {
		return s.Whole()
	}
	return I.Re.Scale(1).Quo(pi)
}

func (t *pwlTerm[T]) Kind() string              { return t.kind }
func (t *pwlTerm[T]) Params() map[string]string { return t.params }
func (t *pwlTerm[T]) Start() string             { return t.start }

// Enclose returns D and B for every s in s.
func (t *pwlTerm[T]) Enclose(s T) Symbol[T] {
	return t.symbol(s, false)
}

// Slope returns D' and B' for every s in s.
func (t *pwlTerm[T]) Slope(s T) Symbol[T] {
	return t.symbol(s, true)
}

func (t *pwlTerm[T]) symbol(s T, deriv bool) Symbol[T] {
	d := t.diagonal(s, deriv)
	if t.quad {
		pi := s.Pi()
		if deriv {
			// A' = (pi/2) sech^2(pi s)
			d = d.Add(pi.Mul(interval.Sech(pi.Mul(s)).Sqr()).Scale(-1))
		} else {
			d = d.Add(interval.Tanh(pi.Mul(s)).Add(s.Int(1)).Scale(-1))
		}
	}
	b := interval.RealC(s.Int(0))
	for _, e := range t.edges {
		v, ok := e.edge.value(s, deriv)
		if !ok {
			w := s.Whole()
			return Symbol[T]{A: s.Int(0), D: d, B: interval.C[T]{Re: w, Im: w}}
		}
		b = b.Add(v.MulReal(e.coef))
	}
	return Symbol[T]{A: s.Int(0), D: d, B: b.Conj()}
}

// Tail bounds |D| and |B| for side*s >= S: the diagonal lemma of diagTail
// (plus 1 for the quadrant part of a band [a, inf) when side > 0, and its
// e^{-2 pi S} when side < 0, as (1 + tanh(pi s))/2 <= e^{-2 pi |s|} for s < 0)
// and the sum of |coef| times the edge lemmas of edgeTerm.tail.
func (t *pwlTerm[T]) Tail(S T, side int) (T, T) {
	d, _ := t.diagTail(S, side)
	if t.quad {
		if side > 0 {
			d = d.Add(S.Int(1))
		} else {
			d = d.Add(interval.Exp(S.Pi().Scale(1).Mul(S).Neg()))
		}
	}
	b := S.Int(0)
	for _, e := range t.edges {
		b = b.Add(e.coef.Abs().Mul(e.edge.tail(S, side)))
	}
	return interval.Upper(d), interval.Upper(b)
}

// TailD encloses D(s) for side*s >= S: the diagonal lemma's box plus, for
// the band [a, inf), the quadrant part (1 + tanh(pi s))/2, which lies in
// [(1 + tanh(pi S))/2, 1] for s >= S and in [0, e^{-2 pi S}] for s <= -S.
func (t *pwlTerm[T]) TailD(S T, side int) T {
	d, _ := t.diagTail(S, side)
	box := d.Neg().Hull(d)
	if !t.quad {
		return box
	}
	one := S.Int(1)
	if side > 0 {
		a := interval.Lower(interval.Tanh(S.Pi().Mul(S)).Add(one).Scale(-1))
		return box.Add(a.Hull(one))
	}
	return box.Add(S.Int(0).Hull(interval.Upper(interval.Exp(S.Pi().Scale(1).Mul(S).Neg()))))
}

// Budget returns the largest quadrature and truncation bounds of the rules
// built so far (for the integrals before their prefactors 1/pi, 1/(2pi),
// 1/(4pi)).
func (t *pwlTerm[T]) Budget() (float64, float64) {
	q, tr := t.diag.budget()
	for _, e := range t.edges {
		eq, et := e.edge.rules.budget()
		q, tr = math.Max(q, eq), math.Max(tr, et)
	}
	return q, tr
}

// Approx returns float64 values of D(s) and B(s) (not certified).
func (t *pwlTerm[T]) Approx(s float64) (float64, complex128) {
	var d float64
	if s > -t.sNeg && s < t.sPos {
		d = 2 * real(t.diag.approx(s)) / math.Pi
	}
	if t.quad {
		d += (1 + math.Tanh(math.Pi*s)) / 2
	}
	var b complex128
	for _, e := range t.edges {
		c := (e.coef.Lo() + e.coef.Hi()) / 2
		b += complex(c, 0) * e.edge.approx(s)
	}
	return d, cmplx.Conj(b)
}
