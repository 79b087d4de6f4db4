package interval

import (
	"math"
	"math/big"
)

// trigSteps is the number of halvings r -> r/2 before the Taylor series of
// sin and cos (undone by the double-angle formulas afterwards).
func trigSteps(p uint, fixed bool) int {
	if fixed {
		return 2
	}
	s := int(0.65 * math.Sqrt(float64(p)))
	if s < 2 {
		s = 2
	}
	return s
}

func unitInterval[T Real[T]](x T) T { return x.Int(-1).Hull(x.Int(1)) }

func halfPi(z B) B { return z.Pi().Scale(-1) }

// halfPiMultiple returns an integer k near v/(pi/2) (so that |v - k pi/2| is
// at most about pi/4), or false when |v| is too large to reduce within
// MaxPrec bits. Any integer is a valid choice for the enclosure; k only
// decides how small the reduced argument is.
func halfPiMultiple(v *big.Float) (*big.Int, bool) {
	e := v.MantExp(nil)
	if e < 52 {
		f, _ := v.Float64()
		return big.NewInt(int64(math.Round(f / (math.Pi / 2)))), true
	}
	if e > MaxPrec-256 {
		return nil, false
	}
	prec := uint(e) + 64
	pi := B{prec: prec}.Pi().Mid().lo
	q := new(big.Float).SetPrec(prec).Quo(v, pi)
	q.SetMantExp(q, 1)
	if q.Sign() < 0 {
		q.Sub(q, big.NewFloat(0.5))
	} else {
		q.Add(q, big.NewFloat(0.5))
	}
	k, _ := q.Int(nil)
	return k, true
}

// sinCosThin encloses sin(a) and cos(a) for a point a, at a working precision
// at least a's.
//
// Reduction: a = k pi/2 + r with an integer k and r enclosed in interval
// arithmetic (at p + bits(k) + guard bits, so the error of the enclosure of
// pi is not magnified by k beyond the guard); sin and cos of a are then
// +-sin r or +-cos r by k mod 4. When the reduced enclosure is not inside
// (-2, 2) (the argument is too large for the precision) the result is
// [-1, 1], which is correct but wide.
func sinCosThin[T Real[T]](a T) (T, T) {
	p := a.Prec()
	fixed := isFixed(a)
	s := trigSteps(p, fixed)
	var w, r T
	q := 0
	if av := math.Abs(a.Lo()); av < 0.78 {
		w = withPrec(a, work(p, s+20, 0))
		r = w
	} else if f, isF := any(a).(F); isF && av < 1e6 {
		// F with a moderate argument: k from float64 and the two-part
		// pi/2, without big-number work (B only if the checks fail).
		k := int64(math.Round(f.lo / (math.Pi / 2)))
		rf, ok := cwHalfPi.reduceF(f.lo, k)
		if !ok {
			rf = toFB(reduceB(bigLo(a), big.NewInt(k), halfPi, 53+64+22))
		}
		w, r, q = a, any(rf).(T), int(k&3)
	} else {
		v := bigLo(a)
		k, ok := halfPiMultiple(v)
		if !ok {
			return unitInterval(a), unitInterval(a)
		}
		kb := k.BitLen()
		w = withPrec(a, work(p, s+20, kb))
		var rf F
		ok = false
		if f, isF := any(a).(F); isF && kb <= 22 {
			rf, ok = cwHalfPi.reduceF(f.lo, k.Int64())
		}
		if ok {
			r = any(rf).(T)
		} else {
			rp := w.Prec()
			if fixed {
				rp = 53 + 64 + uint(kb)
			}
			r = fromB(w, reduceB(v, k, halfPi, rp))
		}
		q = int(new(big.Int).And(k, big.NewInt(3)).Int64())
	}
	if !r.Abs().Less(w.Int(2)) {
		return unitInterval(a), unitInterval(a)
	}
	sn, cs := sinCosKernel(r, s)
	switch q {
	case 1:
		sn, cs = cs, sn.Neg()
	case 2:
		sn, cs = sn.Neg(), cs.Neg()
	case 3:
		sn, cs = cs.Neg(), sn
	}
	return sn, cs
}

// sinCosKernel encloses sin(r) and cos(r) for an interval r with |r| < 2 and
// s >= 1 (or |r| < 1 and s = 0).
//
// With h = r/2^s (|h| < 1) the Taylor series of sin h and cos h have term
// ratios h^2/((2m)(2m+1)) and h^2/((2m-1)(2m)), both below 1/2 for m >= 1,
// so each tail after its first omitted term T_n is at most 2|T_n|. The s
// double-angle steps sin 2h = 2 sin h cos h, cos 2h = 1 - 2 sin^2 h are
// evaluated in interval arithmetic.
func sinCosKernel[T Real[T]](r T, s int) (T, T) {
	one := r.Int(1)
	h := r.Scale(-s)
	if !h.Abs().Less(one) {
		return unitInterval(r), unitInterval(r)
	}
	h2 := h.Sqr()
	bits := r.Prec()

	lr := log2Mag(h)
	// sin: T_n = (-1)^n h^(2n+1)/(2n+1)!, relative size h^(2n)/(2n+1)!.
	n := seriesLen(bits, func(n int) float64 { return 2*float64(n)*lr - log2Fact(2*n+1) })
	sn, term := h, h
	for k := int64(1); k < n; k++ {
		term = term.Mul(h2).Quo(r.Int((2 * k) * (2*k + 1))).Neg()
		sn = sn.Add(term)
	}
	term = term.Mul(h2).Quo(r.Int((2 * n) * (2*n + 1)))
	sn = sn.Pad(term.Scale(1))

	// cos: T_n = (-1)^n h^(2n)/(2n)!.
	n = seriesLen(bits, func(n int) float64 { return 2*float64(n)*lr - log2Fact(2*n) })
	cs := one
	term = one
	for k := int64(1); k < n; k++ {
		term = term.Mul(h2).Quo(r.Int((2*k - 1) * (2 * k))).Neg()
		cs = cs.Add(term)
	}
	term = term.Mul(h2).Quo(r.Int((2*n - 1) * (2 * n)))
	cs = cs.Pad(term.Scale(1))

	for i := 0; i < s; i++ {
		sn, cs = sn.Mul(cs).Scale(1), one.Sub(sn.Sqr().Scale(1))
	}
	return clip(sn, -1, 1), clip(cs, -1, 1)
}

// floorBig and ceilBig round a finite big.Float to an integer.
func floorBig(f *big.Float) *big.Int {
	i, acc := f.Int(nil)
	if acc == big.Above { // negative non-integer: truncation went up
		i.Sub(i, big.NewInt(1))
	}
	return i
}

func ceilBig(f *big.Float) *big.Int {
	i, acc := f.Int(nil)
	if acc == big.Below { // positive non-integer: truncation went down
		i.Add(i, big.NewInt(1))
	}
	return i
}

// hitsGrid reports whether [a, b] (points a <= b) may contain a point
// off*pi/2 + m*period*pi/2 for an integer m. It is conservative: it answers
// true whenever the enclosures computed cannot exclude such a point, which
// only widens the callers' results.
func hitsGrid[T Real[T]](a, b T, off, period int64) bool {
	if fa, ok := any(a).(F); ok {
		fb := any(b).(F)
		if math.Abs(fa.lo) < 1e6 && math.Abs(fb.hi) < 1e6 {
			// Float fast path: the float error of (v - off pi/2)/(period pi/2)
			// is below 1e-9 for |v| < 1e6, so widening by 1e-9 can only add
			// false hits (which merely widen the result).
			o := float64(off) * math.Pi / 2
			per := float64(period) * math.Pi / 2
			ta := (fa.lo-o)/per - 1e-9
			tb := (fb.hi-o)/per + 1e-9
			return math.Ceil(ta) <= math.Floor(tb)
		}
	}
	va, vb := bigLo(a), bigLo(b)
	e := va.MantExp(nil)
	if eb := vb.MantExp(nil); eb > e {
		e = eb
	}
	if e < 0 {
		e = 0
	}
	if e > MaxPrec-256 {
		return true
	}
	z := B{prec: clampPrec(uint(e) + 64)}
	hp := halfPi(z)
	o := z.Int(off).Mul(hp)
	per := z.Int(period).Mul(hp)
	ta := z.Between(va, va).Sub(o).Quo(per)
	tb := z.Between(vb, vb).Sub(o).Quo(per)
	if !ta.IsFinite() || !tb.IsFinite() {
		return true
	}
	return ceilBig(ta.l()).Cmp(floorBig(tb.h())) <= 0
}

// Sin encloses sin(v) for every v in x. Whole when x is unbounded; [-1, 1]
// when x is wider than 2 pi or too large to reduce at the precision.
// Extrema inside x are found by locating the points pi/2 + 2 pi m and
// -pi/2 + 2 pi m; the endpoint values are enclosed as in sinCosThin.
func Sin[T Real[T]](x T) T {
	s, _ := sinCos(x, true, false)
	return s
}

// Cos encloses cos(v) for every v in x. Whole when x is unbounded; [-1, 1]
// when x is wider than 2 pi or too large to reduce at the precision.
// Extrema inside x are found by locating the points 2 pi m and pi + 2 pi m.
func Cos[T Real[T]](x T) T {
	_, c := sinCos(x, false, true)
	return c
}

// SinCos returns Sin(x) and Cos(x), sharing the argument reduction.
func SinCos[T Real[T]](x T) (sin, cos T) {
	return sinCos(x, true, true)
}

func sinCos[T Real[T]](x T, wantSin, wantCos bool) (T, T) {
	if !x.IsFinite() {
		return x.Whole(), x.Whole()
	}
	p := x.Prec()
	lo, hi, thin := pointsOf(x)
	sa, ca := sinCosThin(lo)
	if thin {
		return withPrec(sa, p), withPrec(ca, p)
	}
	if x.Rad() >= 3.2 { // wider than 2 pi: both extremes are attained
		return unitInterval(x), unitInterval(x)
	}
	sb, cb := sinCosThin(hi)
	sn, cs := sa.Hull(sb), ca.Hull(cb)
	if wantSin {
		if hitsGrid(lo, hi, 1, 4) {
			sn = sn.Hull(x.Int(1))
		}
		if hitsGrid(lo, hi, -1, 4) {
			sn = sn.Hull(x.Int(-1))
		}
	}
	if wantCos {
		if hitsGrid(lo, hi, 0, 4) {
			cs = cs.Hull(x.Int(1))
		}
		if hitsGrid(lo, hi, 2, 4) {
			cs = cs.Hull(x.Int(-1))
		}
	}
	return withPrec(clip(sn, -1, 1), p), withPrec(clip(cs, -1, 1), p)
}

// Tan encloses tan(v) for every v in x. Whole when x is unbounded, when x
// may contain a pole pi/2 + m pi, or when a cosine enclosure contains 0.
// Between poles tan is increasing, so the hull of the endpoint values is the
// range.
func Tan[T Real[T]](x T) T {
	if !x.IsFinite() {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	if !thin && (x.Rad() >= 1.6 || hitsGrid(lo, hi, 1, 2)) {
		return x.Whole()
	}
	sa, ca := sinCosThin(lo)
	r := sa.Quo(ca)
	if !thin {
		sb, cb := sinCosThin(hi)
		r = r.Hull(sb.Quo(cb))
	}
	return withPrec(r, x.Prec())
}
