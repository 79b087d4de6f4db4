package relaxation

import (
	"fmt"
	"math"
	"math/big"
	"sync"

	"wedgebound/interval"
)

// The quadrant's off-diagonal function J(s) = sum_{n>=0} (-1)^n/(n + a),
// a = 1/2 + is, and K(s) = sum_{n>=0} (-1)^n/(n + a)^2 (so that
// J'(s) = -i K(s)), by Boole's summation formula for alternating series
// (the Euler-polynomial analogue of Euler-Maclaurin summation; see e.g.
// J. M. Borwein, N. J. Calkin and D. Manna, Amer. Math. Monthly 116 (2009)
// 387-412). The certifier uses the digamma closed form and its Stirling
// series (Bernoulli numbers); this route shares no formula with it beyond
// the series itself. Derivation, re-done here:
//
// Boole's formula. Let E_k be the Euler polynomials (2 e^{xt}/(e^t + 1) =
// sum_k E_k(x) t^k/k!), so E_k' = k E_{k-1} and E_k(x + 1) + E_k(x) =
// 2 x^k, hence E_k(1) = -E_k(0) for k >= 1. Let Et_k(x) = (-1)^floor(x)
// E_k(x - floor(x)); then Et_k is continuous for k >= 1, Et_k' = k Et_{k-1}
// off the integers, and Et_0 is the square wave. For f smooth on
// [0, inf) with f^(k) -> 0 at infinity and S = sum_n (-1)^n f(n) convergent:
//
//  1. int_0^inf f' Et_0 = sum_n (-1)^n (f(n+1) - f(n)) = f(0) - 2S, so
//     S = f(0)/2 - (1/2) int_0^inf f' Et_0.
//  2. Integrating by parts with Et_k = (Et_{k+1})'/(k+1) (the boundary term
//     at infinity vanishes, Et_{k+1} being bounded), the integrals
//     I_k = int_0^inf f^(k) Et_{k-1}/(k-1)! obey
//     I_k = -f^(k)(0) E_k(0)/k! - I_{k+1}.
//  3. Hence, for m >= 2,
//     S = f(0)/2 - (1/2) sum_{k=1}^{m-1} (-1)^k E_k(0) f^(k)(0)/k! + R,
//     R = ((-1)^m/2) I_m, |R| <= sup|Et_{m-1}| int_0^inf |f^(m)| /(2 (m-1)!).
//
// The constants (the Fourier series of the Euler polynomials, DLMF 24.8).
// Et_0 = (4/pi) sum_{j>=0} sin((2j+1) pi x)/(2j+1), and
// Et_k is antiperiodic (Et_k(x+1) = -Et_k(x)), so it has no constant term
// and integrating the series k times gives
// Et_k(x) = (4 k!/pi^{k+1}) sum_j sin((2j+1) pi x - k pi/2)/(2j+1)^{k+1}.
// So E_k(0) = 0 for even k >= 2, and for k >= 1
// sup|Et_k| <= 4 k! lambda(k+1)/pi^{k+1} with
// lambda(r) = sum_j (2j+1)^{-r} <= lambda(2) = pi^2/8. Since
// 2/(e^t + 1) = 1 - tanh(t/2) and tanh x = sum_{j>=1} (-1)^{j-1} T_j
// x^{2j-1}/(2j-1)! with the tangent numbers T_j = 1, 2, 16, 272, ...,
// E_{2j-1}(0) = (-1)^j T_j/2^{2j-1}.
//
// For f(x) = (x + z)^{-1-d}, d = 0, 1 or 2, Re z >= 0: f^(k)(0) =
// (-1)^k (k+d)!/(d! z^{k+d+1}), so with m = 2M + 1 and the sums
// J = sum_n (-1)^n/(n+z), K = sum_n (-1)^n/(n+z)^2, L = sum_n (-1)^n/(n+z)^3,
//
//	J(z) = 1/(2z)   + sum_{j=1}^M (-1)^{j+1} T_j/(4^j z^{2j}) + R,
//	K(z) = 1/(2z^2) + sum_{j=1}^M (-1)^{j+1} 2j T_j/(4^j z^{2j+1}) + R',
//	L(z) = 1/(2z^3) + sum_{j=1}^M (-1)^{j+1} j(2j+1) T_j/(4^j z^{2j+2}) + R'',
//
// and since |x + z|^2 >= x^2 + |z|^2 for x >= 0, Re z >= 0, the integral
// int_0^inf |f^(m)| <= (m+d)!/d! |z|^{-m-d} int_0^inf (1 + v^2)^{-(m+d+1)/2} dv
// <= (pi/2)(m+d)!/|z|^{m+d} (dropping 1/d! <= 1). With the bound on
// sup|Et_{m-1}| (m - 1 = 2M >= 2),
//
//	|R^(d)| <= (pi^2/8) (2M+1+d)!/(pi^{2M} |z|^{2M+1+d}).
//
// J'(s) = -i K(s) and K'(s) = -2i L(s) (d/ds = i d/da). L is used only to
// bound K' over a cell (booleCentred).
//
// The series converges only asymptotically (the bound is smallest near
// 2M = pi|z|), so small arguments are first moved out by the shift
// J(z) = sum_{n<N} (-1)^n/(n + z) + (-1)^N J(z + N) (and the same for K
// with squares), N chosen so that |z + N| >= A0 = max(20, prec/2). There
// the bound reaches 2^-(prec+4) |z|^-(1+d) with M of about prec/4 or
// fewer (at 53 bits: N <= 22 and M about 12). M is picked by a float64
// estimate; the remainder padded onto the result is computed in interval
// arithmetic from a lower bound of |z + N|, so a poor pick can only widen
// the enclosure, never make it false.
//
// Why this route: it costs about as much as the digamma route (a few
// dozen complex operations), it is exact up to an explicit remainder, and
// it evaluates on whole s-cells. Quadrature of int_0^inf e^{-at}/(1 + e^{-t})
// dt on the verifier's turned rays (as for the exp terms) would cost as
// much as an exp term per cell.

// tangent holds T_1, T_2, ... computed so far (exact integers).
var tangent struct {
	mu sync.Mutex
	t  []*big.Int
}

// tangentNumbers returns at least n tangent numbers T_1..T_n by the
// in-place recurrence T_j <- (j - k) T_{j-1} + (j - k + 2) T_j (Brent and
// Zimmermann, Modern Computer Arithmetic, 2010, Algorithm TangentNumbers).
func tangentNumbers(n int) []*big.Int {
	tangent.mu.Lock()
	defer tangent.mu.Unlock()
	if len(tangent.t) >= n {
		return tangent.t
	}
	n = max(n, 2*len(tangent.t), 16)
	t := make([]*big.Int, n+1) // t[1..n]
	t[1] = big.NewInt(1)
	for k := 2; k <= n; k++ {
		t[k] = new(big.Int).Mul(t[k-1], big.NewInt(int64(k-1)))
	}
	tmp := new(big.Int)
	for k := 2; k <= n; k++ {
		for j := k; j <= n; j++ {
			tmp.Mul(t[j-1], big.NewInt(int64(j-k)))
			t[j].Mul(t[j], big.NewInt(int64(j-k+2)))
			t[j].Add(t[j], tmp)
		}
	}
	tangent.t = t[1:]
	return tangent.t
}

// booleTable holds, at one arithmetic and precision, for d = 0, 1, 2 and
// j = 1..M (index j-1): the signed coefficients
// e[d][j-1] = (-1)^{j+1} b_j T_j/4^j (b_j = 1, 2j, j(2j+1)) and the
// remainder constants rc[d][j-1] = (pi^2/8)(2j+1+d)!/pi^{2j}.
type booleTable[T interval.Real[T]] struct {
	e, rc [3][]T
}

var booleTables sync.Map

// booleTab returns a table with at least m rows for the precision of like.
func booleTab[T interval.Real[T]](like T, m int) *booleTable[T] {
	key := fmt.Sprintf("%T/%d", like, like.Prec())
	if v, ok := booleTables.Load(key); ok {
		if t := v.(*booleTable[T]); len(t.e[0]) >= m {
			return t
		}
	}
	tn := tangentNumbers(m)
	t := &booleTable[T]{}
	pi := like.Pi()
	pi2 := pi.Sqr()
	for d := range 3 {
		// (pi^2/8) (1+d)!, then times (2j)(2j+1)/pi^2 per row... built
		// from the exact factorial ratio at each step.
		r := pi2.Scale(-3)
		for i := 2; i <= 1+d; i++ {
			r = r.Mul(like.Int(int64(i)))
		}
		for j := 1; j <= len(tn); j++ {
			// (2j+1+d)!/(2j-1+d)! = (2j+d)(2j+1+d).
			r = r.Mul(like.Int(int64((2*j + d) * (2*j + 1 + d)))).Quo(pi2)
			t.rc[d] = append(t.rc[d], r)
			v, err := like.Decimal(tn[j-1].String())
			if err != nil {
				v = like.Whole()
			}
			v = v.Scale(-2 * j)
			switch d {
			case 1:
				v = v.Mul(like.Int(int64(2 * j)))
			case 2:
				v = v.Mul(like.Int(int64(j * (2*j + 1))))
			}
			if j%2 == 0 {
				v = v.Neg()
			}
			t.e[d] = append(t.e[d], v)
		}
	}
	booleTables.Store(key, t)
	return t
}

// ipow encloses x^k, k >= 1, by repeated squaring.
func ipow[T interval.Real[T]](x T, k int) T {
	r := x.Int(1)
	for ; k > 0; k >>= 1 {
		if k&1 == 1 {
			r = r.Mul(x)
		}
		x = x.Sqr()
	}
	return r
}

// booleShift returns A0: the shift moves |z| to at least A0, where the
// Boole remainder can be pushed below 2^-prec with about prec/4 terms.
func booleShift(prec uint) float64 {
	return max(20, float64(prec)/2)
}

// booleTerms picks the number M of terms for |z| >= A so that the
// remainder bound is below 2^-(prec+4) |z|^-(1+d), estimated in float64
// (the bound actually used is recomputed in interval arithmetic).
func booleTerms(A float64, prec uint, d int) int {
	target := -float64(prec+4)*math.Ln2 - float64(1+d)*math.Log(A)
	lpa := math.Log(math.Pi * A)
	lg := math.Log(math.Pi*math.Pi/8) - math.Log(A) // (pi^2/8) 1!/A
	for M := 1; ; M++ {
		// (2M+1)!/(pi^{2M} A^{2M+1}) from the value at M-1.
		lg += math.Log(float64(2*M)) + math.Log(float64(2*M+1)) - 2*lpa
		ld := lg
		for i := 1; i <= d; i++ {
			ld += math.Log(float64(2*M+1+i)) - math.Log(A)
		}
		if ld <= target || float64(2*M) > math.Pi*A || M >= 100000 {
			return M
		}
	}
}

// booleGuard is the number of extra bits big-float evaluations carry.
const booleGuard = 24

// booleSum encloses J (d = 0) or K (d = 1) at a = 1/2 + is for every s in
// S. Big-float arguments are evaluated booleGuard bits above their
// precision and rounded back outward.
func booleSum[T interval.Real[T]](S T, d int) interval.C[T] {
	if !S.IsFinite() {
		w := S.Whole()
		return interval.C[T]{Re: w, Im: w}
	}
	if _, ok := any(S).(interval.B); !ok {
		return booleCentred(S, d)
	}
	lo, hi := S.Endpoints()
	r := booleCentred(interval.NewB(0, S.Prec()+booleGuard).Between(lo, hi), d)
	back := func(x interval.B) T {
		if !x.IsFinite() {
			return S.Whole()
		}
		l, h := x.Endpoints()
		return S.Between(l, h)
	}
	return interval.C[T]{Re: back(r.Re), Im: back(r.Im)}
}

// booleCentred encloses J or K over S in the centred form
// F(S) in F(c) + F'(S)[-delta, delta] (c the midpoint, delta >= |s - c|;
// mean value theorem for each of the real and imaginary parts, whose
// derivatives lie in the rectangle enclosing F'(S)), intersected with the
// direct evaluation; F' is dJ/ds = -i K or dK/ds = -2i L with
// L = sum (-1)^n/(n + a)^3, enclosed directly. Over a cell this is much
// tighter than the direct evaluation alone, in which a occurs many times.
func booleCentred[T interval.Real[T]](S T, d int) interval.C[T] {
	if S.Rad() == 0 {
		return booleCore(S, d)
	}
	// Interval products of a over a cell whose width is not small
	// against |a| turn through a wide angle and their rectangles grow
	// (up to containing 0): such cells are cut into k parts of width at
	// most |a|_min/8 and the parts' enclosures joined.
	lo, hi := S.Lo(), S.Hi()
	aMin := math.Hypot(0.5, interval.Lower(S.Abs()).Lo())
	k := int(math.Ceil(8 * (hi - lo) / aMin))
	if k <= 1 || !(hi > lo) {
		return booleCell(S, d)
	}
	k = min(k, 64)
	var out interval.C[T]
	for i := range k {
		a := lo + (hi-lo)*float64(i)/float64(k)
		b := hi
		if i < k-1 {
			b = lo + (hi-lo)*float64(i+1)/float64(k)
		}
		// Consecutive parts share their float64 end points, and the first
		// and last reach S's outward-rounded ends, so they cover S.
		part := booleCell(S.Float(a).Hull(S.Float(b)), d)
		if i == 0 {
			out = part
		} else {
			out = out.Hull(part)
		}
	}
	return out
}

// booleCell is the centred form on one part.
func booleCell[T interval.Real[T]](S T, d int) interval.C[T] {
	direct := booleCore(S, d)
	c := S.Mid()
	delta := interval.Upper(S.Sub(c).Abs())
	dInt := delta.Neg().Hull(delta)
	dv := booleCore(S, d+1).MulReal(dInt.Scale(d)) // (d+1) [-delta, delta], d = 0 or 1
	// -i (x + iy) = y - ix.
	mv := booleCore(c, d).Add(interval.C[T]{Re: dv.Im, Im: dv.Re.Neg()})
	return interval.C[T]{Re: meet(direct.Re, mv.Re), Im: meet(direct.Im, mv.Im)}
}

// booleCore encloses J (d = 0), K (d = 1) or L (d = 2) directly at the
// precision of S.
//
// The shift runs over pairs of terms, N even:
// 1/(n+a) - 1/(n+1+a) = 1/((n+a)(n+1+a)) and
// 1/(n+a)^2 - 1/(n+1+a)^2 = (2(n+a) + 1)/((n+a)(n+1+a))^2 (and likewise
// for cubes),
// which are small and, over a cell, vary little (no cancellation between
// wide terms).
func booleCore[T interval.Real[T]](S T, d int) interval.C[T] {
	like := S.Int(0)
	prec := S.Prec()
	A0 := booleShift(prec)
	sLo := interval.Lower(S.Abs()).Lo()
	N := 0
	if sLo < A0 {
		N = int(math.Ceil(math.Sqrt(A0*A0-sLo*sLo))) + 1
		N += N % 2
	}
	z := interval.C[T]{Re: like.Float(float64(N) + 0.5), Im: S}
	A := interval.Lower(interval.Lower(z.Abs2()).Sqrt())
	M := booleTerms(A.Lo(), prec, d)
	p, r := booleSeries(z, A, M, d)
	p = interval.C[T]{Re: p.Re.Pad(r), Im: p.Im.Pad(r)}
	// The pairs are added from the smallest up, to the tail, so that the
	// outward rounding of each addition is at the scale of the partial sum.
	sum := p
	for n := N - 2; n >= 0; n -= 2 {
		z0 := interval.C[T]{Re: like.Float(float64(n) + 0.5), Im: S}
		z1 := z0.AddReal(like.Int(1))
		switch d {
		case 0:
			// (x+is)(x+1+is) = x(x+1) - s^2 + is(2x+1), of squared modulus
			// (x^2 + s^2)((x+1)^2 + s^2), x = n + 1/2: fewer roundings
			// than the complex product and inverse.
			x := float64(n) + 0.5
			s2 := S.Sqr()
			den := like.Float(x * x).Add(s2).Mul(like.Float((x + 1) * (x + 1)).Add(s2))
			re := like.Float(x * (x + 1)).Sub(s2).Quo(den)
			im := S.Mul(like.Float(2*x + 1)).Quo(den).Neg()
			sum = sum.Add(interval.C[T]{Re: re, Im: im})
		case 1:
			pr := z0.Mul(z1)
			sum = sum.Add(z0.Add(z1).Quo(pr.Sqr()))
		default:
			// 1/z0^3 - 1/z1^3 = (z0^2 + z0 z1 + z1^2)/(z0 z1)^3.
			pr := z0.Mul(z1)
			sum = sum.Add(z0.Sqr().Add(pr).Add(z1.Sqr()).Quo(pr.Sqr().Mul(pr)))
		}
	}
	// N is even, so (-1)^N = 1.
	return sum
}

// booleSeries returns the first M + 1 terms of Boole's series for J, K or L
// (d = 0, 1, 2) at z and the bound on the rest, for |z| >= A > 0 and
// Re z >= 0.
func booleSeries[T interval.Real[T]](z interval.C[T], A T, M, d int) (interval.C[T], T) {
	tab := booleTab(z.Re, M)
	u := z.Inv()
	u2 := u.Sqr()
	// Q = sum_{j=1}^M e_j u2^j by Horner; then J = u/2 + Q, K = u2/2 + u Q
	// and L = u^3/2 + u2 Q.
	q := interval.RealC(z.Re.Int(0))
	for j := M; j >= 1; j-- {
		q = q.AddReal(tab.e[d][j-1]).Mul(u2)
	}
	var p interval.C[T]
	switch d {
	case 0:
		p = u.Scale(-1).Add(q)
	case 1:
		p = u2.Scale(-1).Add(u.Mul(q))
	default:
		p = u2.Mul(u).Scale(-1).Add(u2.Mul(q))
	}
	// Remainder (pi^2/8) (2M+1+d)!/(pi^{2M} A^{2M+1+d}); A is a lower
	// bound of |z|, so this is an upper bound.
	return p, interval.Upper(tab.rc[d][M-1].Quo(ipow(A, 2*M+1+d)))
}
