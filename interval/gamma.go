package interval

import (
	"math"
	"math/big"
)

// Complex log-gamma, digamma and trigamma on rectangles.
//
// Method (see gamma_series.go for the series and the proof of its remainder
// bound): upward recurrence moves the argument to z + s, where the Stirling
// series with n terms is accurate to the working precision, and the shift
// and length are chosen per call from the precision and the rectangle's
// distance to 0. The recurrences (DLMF 5.5.2 and its derivatives) are
//
//	ln Gamma(z)     = ln Gamma(z + s) - sum_{k<s} ln(z + k),
//	psi(z)          = psi(z + s)  - sum_{k<s} 1/(z + k),
//	psi'(z)         = psi'(z + s) + sum_{k<s} 1/(z + k)^2,
//	psi^(2)(z)      = psi^(2)(z + s) - 2 sum_{k<s} 1/(z + k)^3.
//
// A rectangle wider than a few units in the last place is handled in the
// centred (mean value) form f(Z) in f(z0) + f'(Z) (Z - z0), with z0 the
// centre and f'(Z) enclosed directly at low precision: the segment from z0
// to any z of the convex rectangle lies in Z, so
// f(z) - f(z0) = (z - z0) * integral_0^1 f'(z0 + t(z - z0)) dt, and the
// integral lies in the (convex) rectangle enclosing f'(Z). Very wide
// rectangles are also evaluated directly and the two results intersected.

// gammaGuard is the number of guard bits used inside the gamma family on
// types with adjustable precision.
const gammaGuard = 32

// derivBits is the accuracy asked of the derivative in the centred form;
// the derivative only multiplies the rectangle's half-width.
const derivBits = 30

// LogGamma encloses ln Gamma(z) for every z in the rectangle, the branch
// that is analytic in Re z > 0 and real on the positive axis (DLMF's
// Ln Gamma; it differs from the principal log of Gamma(z) by multiples of
// 2 pi i). Domain: Re z > 0 on the whole rectangle; otherwise both parts are
// Whole.
func LogGamma[T Real[T]](z C[T]) C[T] { return gammaFamily(z, 0) }

// Digamma encloses psi(z) = Gamma'(z)/Gamma(z) for every z in the
// rectangle. Domain: every rectangle that avoids the poles 0, -1, -2, ...;
// for Re z <= 0 the recurrence simply runs longer (cost linear in -Re z). A
// rectangle containing a pole (or too close to one to separate it at the
// working precision), one with Re z below -10^7, or one whose corners leave
// the float64 range gives Whole parts.
func Digamma[T Real[T]](z C[T]) C[T] { return gammaFamily(z, 1) }

// Trigamma encloses psi'(z) for every z in the rectangle, with the same
// domain and Whole results as Digamma.
func Trigamma[T Real[T]](z C[T]) C[T] { return gammaFamily(z, 2) }

// Tetragamma encloses the second derivative of psi for every z in the
// rectangle, with the same domain and Whole results as Digamma.
func Tetragamma[T Real[T]](z C[T]) C[T] { return gammaFamily(z, 3) }

func wholeC[T Real[T]](x T) C[T] { w := x.Whole(); return C[T]{w, w} }

// gammaFamily evaluates d^j/dz^j ln Gamma on a rectangle at the rectangle's
// precision.
func gammaFamily[T Real[T]](z C[T], j int) C[T] {
	if !z.IsFinite() || j == 0 && z.Re.Sign() <= 0 {
		return wholeC(z.Re)
	}
	p := max(z.Re.Prec(), z.Im.Prec())
	fixed := isFixed(z.Re)
	wp := work(p, gammaGuard, 0)
	bits := wp
	if fixed {
		bits = p + 4
	}
	zi := C[T]{withPrec(z.Re, wp), withPrec(z.Im, wp)}
	var r C[T]
	switch gammaWidthClass(z, p) {
	case 0:
		r = gammaCore(zi, j, bits)
	case 1, 2:
		if j >= 3 { // no fifth-order series: evaluate directly
			r = gammaCore(zi, j, bits)
			break
		}
		z0 := C[T]{zi.Re.Mid(), zi.Im.Mid()}
		dp := min(wp, 64)
		zl := C[T]{withPrec(z.Re, dp), withPrec(z.Im, dp)}
		d := gammaCore(zl, j+1, derivBits)
		r = gammaCore(z0, j, bits).Add(d.Mul(zi.Sub(z0)))
		if gammaWidthClass(z, p) == 2 {
			r = cxMeet(r, gammaCore(zi, j, bits))
		}
	}
	re, im := withPrec(r.Re, p), withPrec(r.Im, p)
	if isZero(z.Im) && re.IsFinite() {
		// On the real axis (away from the poles, and with Re z > 0 for
		// ln Gamma) every function of the family is real.
		im = re.Int(0)
	}
	return C[T]{re, im}
}

// gammaWidthClass is 0 when both sides of the rectangle are within 2^(8-p)
// of its magnitude (a point up to rounding), 2 when a side exceeds 1/16 of
// it, and 1 otherwise. It only selects the evaluation scheme.
func gammaWidthClass[T Real[T]](z C[T], p uint) int {
	w := max(widthExp(z.Re), widthExp(z.Im))
	if w == math.MinInt {
		return 0
	}
	m := max(magExp(z.Re), magExp(z.Im), 1)
	switch {
	case w <= m+8-int(p):
		return 0
	case w >= m-4:
		return 2
	}
	return 1
}

// widthExp returns e with 2^(e-1) <= hi - lo < 2^e (up to one unit for
// F), MinInt for a point and MaxInt for an unbounded x.
func widthExp[T Real[T]](x T) int {
	if f, ok := any(x).(F); ok {
		if !f.IsFinite() {
			return math.MaxInt
		}
		if f.lo == f.hi {
			return math.MinInt
		}
		d := f.hi - f.lo
		if math.IsInf(d, 0) {
			return math.MaxInt
		}
		_, e := math.Frexp(d)
		return e + 1 // the float64 difference may have rounded down
	}
	l, h := x.Endpoints()
	if l == nil {
		return math.MaxInt
	}
	d := new(big.Float).SetPrec(32).SetMode(big.ToPositiveInf).Sub(h, l)
	if d.Sign() == 0 {
		return math.MinInt
	}
	return d.MantExp(nil)
}

// magExp returns e with max(|lo|, |hi|) < 2^e (MinInt for the point 0,
// MaxInt for an unbounded x).
func magExp[T Real[T]](x T) int {
	if f, ok := any(x).(F); ok {
		if !f.IsFinite() {
			return math.MaxInt
		}
		m := math.Max(math.Abs(f.lo), math.Abs(f.hi))
		if m == 0 {
			return math.MinInt
		}
		_, e := math.Frexp(m)
		return e
	}
	l, h := x.Endpoints()
	if l == nil {
		return math.MaxInt
	}
	e := math.MinInt
	if l.Sign() != 0 {
		e = l.MantExp(nil)
	}
	if h.Sign() != 0 {
		e = max(e, h.MantExp(nil))
	}
	return e
}

// lowerPt and upperPt are Lower and Upper with a fast path for F.
func lowerPt[T Real[T]](x T) T {
	if f, ok := any(x).(F); ok && f.IsFinite() {
		return any(PointF(f.lo)).(T)
	}
	return Lower(x)
}

func upperPt[T Real[T]](x T) T {
	if f, ok := any(x).(F); ok && f.IsFinite() {
		return any(PointF(f.hi)).(T)
	}
	return Upper(x)
}

// gammaCore evaluates order j directly on the rectangle z (at z's
// precision), with the Stirling remainder below about 2^-bits.
func gammaCore[T Real[T]](z C[T], j int, bits uint) C[T] {
	s, n, ok := planStirling(z.Re.Lo(), z.Im.Abs().Lo(), j, bits)
	if !ok {
		return wholeC(z.Re)
	}
	zs := z
	if s > 0 {
		zs = z.AddReal(z.Re.Int(int64(s)))
	}
	a := stirlingAsym(zs, j, n)
	if s == 0 {
		return a
	}
	switch j {
	case 0:
		return a.Sub(logShiftSum(z, s))
	case 1:
		return a.Sub(powerSum(z, s, 1))
	case 2:
		return a.Add(powerSum(z, s, 2))
	default:
		return a.Sub(powerSum(z, s, 3).Scale(1))
	}
}

// stirlingAsym encloses the order-j Stirling approximation with n-1 terms at
// z (Re z > 0) plus the remainder bound |a_n| |z| v^(n+j/2),
// v = 2/((|z| + Re z)|z|), evaluated at the lower bounds of |z| and Re z.
func stirlingAsym[T Real[T]](z C[T], j, n int) C[T] {
	x := z.Re
	c := stirlingCoefs(x, j, n)
	r := z.Inv()
	u := r.Sqr()
	zero := x.Int(0)
	s := C[T]{zero, zero}
	if n >= 2 {
		acc := RealC(c[n-1])
		for k := n - 2; k >= 1; k-- {
			acc = acc.Mul(u).AddReal(c[k])
		}
		s = acc.Mul(u)
	}
	var f C[T]
	switch j {
	case 0: // (z - 1/2) ln z - z + ln(2 pi)/2 + z S
		l2pi := fromB(x, halfLog2PiCache.get(x.Prec()+8))
		f = z.AddReal(x.Frac(-1, 2)).Mul(z.Log()).Sub(z).AddReal(l2pi).Add(z.Mul(s))
	case 1: // ln z - 1/(2z) + S
		f = z.Log().Sub(r.Scale(-1)).Add(s)
	case 2: // 1/z + 1/(2z^2) + S/z
		f = r.Add(u.Scale(-1)).Add(r.Mul(s))
	case 3: // -1/z^2 - 1/z^3 + S/z^2
		f = u.Add(u.Mul(r)).Neg().Add(u.Mul(s))
	}
	rl := lowerPt(z.Abs())
	xl := lowerPt(x)
	if xl.Sign() <= 0 {
		return wholeC(x)
	}
	v := x.Int(2).Quo(rl.Add(xl).Mul(rl))
	e := c[n].Abs().Mul(rl).Mul(powPos(v, n+j/2))
	if j%2 == 1 {
		e = e.Mul(v.Sqrt())
	}
	return C[T]{f.Re.Pad(e), f.Im.Pad(e)}
}

// powPos encloses v^k for k >= 0 and v >= 0 by binary powering.
func powPos[T Real[T]](v T, k int) T {
	r := v.Int(1)
	for b := v; k > 0; k >>= 1 {
		if k&1 == 1 {
			r = r.Mul(b)
		}
		if k > 1 {
			b = b.Sqr()
		}
	}
	return r
}

// powerSum encloses sum_{k<s} (z + k)^-m for m = 1, 2, 3, using
// (a - iy)^m / (a^2 + y^2)^m with a = Re z + k, so that y^2 is shared and
// each term costs one real division.
func powerSum[T Real[T]](z C[T], s, m int) C[T] {
	x, y := z.Re, z.Im
	one := x.Int(1)
	y2 := y.Sqr()
	y23 := y2.Mul(x.Int(3))
	re, im := x.Int(0), x.Int(0)
	a := x
	for k := 0; k < s; k++ {
		if k > 0 {
			a = a.Add(one)
		}
		a2 := a.Sqr()
		inv := recip(a2.Add(y2))
		switch m {
		case 1: // (a - iy)/d
			re = re.Add(a.Mul(inv))
			im = im.Add(inv)
		case 2: // (a^2 - y^2 - 2aiy)/d^2
			i2 := inv.Sqr()
			re = re.Add(a2.Sub(y2).Mul(i2))
			im = im.Add(a.Mul(i2))
		default: // (a^3 - 3ay^2 - i(3a^2 y - y^3))/d^3
			i3 := inv.Sqr().Mul(inv)
			re = re.Add(a.Mul(a2.Sub(y23)).Mul(i3))
			im = im.Add(a2.Mul(x.Int(3)).Sub(y2).Mul(i3))
		}
	}
	im = y.Mul(im).Neg()
	if m == 2 {
		im = im.Scale(1)
	}
	return C[T]{re, im}
}

// logShiftSum encloses sum_{k<s} ln(z + k) (principal logarithms, Re z > 0)
// as ln P + 2 pi i m with P = prod (z + k). The integer m is fixed by an
// enclosure of sum Arg(z + k) in float64 intervals, which must single it
// out; otherwise the logarithms are summed one by one.
func logShiftSum[T Real[T]](z C[T], s int) C[T] {
	x := z.Re
	one := x.Int(1)
	p := z
	zk := z
	for k := 1; k < s; k++ {
		zk = zk.AddReal(one)
		p = p.Mul(zk)
	}
	if r, ok := logProductBranch(z, s, p); ok {
		return r
	}
	sum := z.Log()
	zk = z
	for k := 1; k < s; k++ {
		zk = zk.AddReal(one)
		sum = sum.Add(zk.Log())
	}
	return sum
}

func logProductBranch[T Real[T]](z C[T], s int, p C[T]) (C[T], bool) {
	if !p.IsFinite() || p.Abs2().Sign() <= 0 {
		return C[T]{}, false
	}
	x := z.Re
	// Arg P, or Arg(-P) + pi when P meets the negative real axis.
	var argP T
	if p.crossesCut() {
		q := p.Neg()
		if q.crossesCut() {
			return C[T]{}, false
		}
		argP = q.Arg().Add(x.Pi())
	} else {
		argP = p.Arg()
	}
	zf := C[F]{F{z.Re.Lo(), z.Re.Hi()}, F{z.Im.Lo(), z.Im.Hi()}}
	if !zf.IsFinite() || !argP.IsFinite() {
		return C[T]{}, false
	}
	sum := F{}
	for k := 0; k < s; k++ {
		if k > 0 {
			zf.Re = zf.Re.Add(PointF(1))
		}
		sum = sum.Add(Atan2(zf.Im, zf.Re))
	}
	t := sum.Sub(F{argP.Lo(), argP.Hi()}).Quo(F{}.Pi().Scale(1))
	if !t.IsFinite() {
		return C[T]{}, false
	}
	m := math.Ceil(t.Lo())
	if m != math.Floor(t.Hi()) || math.Abs(m) > 1<<50 {
		return C[T]{}, false
	}
	im := argP.Add(x.Pi().Scale(1).Mul(x.Int(int64(m))))
	re := Log(p.Abs2()).Scale(-1)
	return C[T]{re, im}, true
}

var (
	halfLog2PiCache = constCache{calc: func(p uint) B {
		return Log(NewB(0, p).Pi().Scale(1)).Scale(-1)
	}}
	catalanCache = constCache{calc: func(p uint) B {
		q := NewB(0.25, p)
		t := Trigamma(RealC(q)).Re
		return t.Sub(q.Pi().Sqr()).Scale(-3)
	}}
	eulerGammaCache = constCache{calc: func(p uint) B {
		return Digamma(RealC(NewB(1, p))).Re.Neg()
	}}
)

// Catalan encloses Catalan's constant G at like's precision (like's value
// is ignored), from the identity psi'(1/4) = pi^2 + 8G (OEIS A006752,
// formula by W. Lang, 2017). It never fails.
func Catalan[T Real[T]](like T) T { return fromB(like, catalanCache.get(like.Prec()+8)) }

// EulerGamma encloses Euler's constant gamma at like's precision (like's
// value is ignored), from psi(1) = -gamma (DLMF 5.4.12). It never fails.
func EulerGamma[T Real[T]](like T) T {
	return fromB(like, eulerGammaCache.get(like.Prec()+8))
}
