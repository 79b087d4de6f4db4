package interval

// Sinh encloses sinh(v) for every v in x. Whole when x is unbounded or the
// result overflows (|v| above 7e8, or above about 710 for F).
//
// sinh is odd and increasing. For |v| < 1 it is evaluated as
// E(E+2)/(2(E+1)) with E = expm1(|v|), which has no cancellation; otherwise
// as (e - 1/e)/2 with e = exp(|v|).
func Sinh[T Real[T]](x T) T {
	if !x.IsFinite() || x.Abs().Hi() > expMaxArg {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	r := sinhThin(lo)
	if !thin {
		r = r.Hull(sinhThin(hi))
	}
	if !r.IsFinite() {
		return x.Whole()
	}
	return withPrec(r, x.Prec())
}

func sinhThin[T Real[T]](a T) T {
	neg := a.Sign() < 0
	av := a.Abs()
	one, two := a.Int(1), a.Int(2)
	var r T
	if av.Less(one) {
		e := expm1Thin(av)
		r = e.Mul(e.Add(two)).Quo(e.Add(one).Scale(1))
	} else {
		e := expThin(av)
		r = e.Sub(e.Int(1).Quo(e)).Scale(-1)
	}
	r = r.Max(a.Int(0)) // sinh |v| >= 0
	if neg {
		return r.Neg()
	}
	return r
}

// Cosh encloses cosh(v) for every v in x, as (e + 1/e)/2 with e = exp(|v|)
// at the endpoints; when x contains 0 the minimum 1 is included. Whole when
// x is unbounded or the result overflows.
func Cosh[T Real[T]](x T) T {
	if !x.IsFinite() || x.Abs().Hi() > expMaxArg {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	r := coshThin(lo)
	if !thin {
		r = r.Hull(coshThin(hi))
		if x.Sign() == 0 {
			r = r.Hull(x.Int(1))
		}
	}
	if !r.IsFinite() {
		return x.Whole()
	}
	return withPrec(r, x.Prec())
}

func coshThin[T Real[T]](a T) T {
	e := expThin(a.Abs())
	return e.Add(e.Int(1).Quo(e)).Scale(-1).Max(a.Int(1))
}

// Tanh encloses tanh(v) for every v in x; the result always lies in
// [-1, 1] and is tight for large |v| (tanh(1e6) is [1 - tiny, 1]). Whole
// only when x is unbounded.
//
// tanh is odd and increasing; tanh|v| = -m/(2+m) with m = expm1(-2|v|) in
// (-1, 0], which neither overflows nor cancels.
func Tanh[T Real[T]](x T) T {
	if !x.IsFinite() {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	r := tanhThin(lo)
	if !thin {
		r = r.Hull(tanhThin(hi))
	}
	return withPrec(r, x.Prec())
}

func tanhThin[T Real[T]](a T) T {
	neg := a.Sign() < 0
	av := a.Abs()
	if av.Hi() > expMaxArg/2 {
		av = a.Int(expMaxArg / 2) // tanh is increasing: tanh|v| >= tanh(3.5e8)
		r := tanhThin(av).Hull(a.Int(1))
		if neg {
			return r.Neg()
		}
		return r
	}
	m := expm1Thin(av.Scale(1).Neg())
	r := clip(m.Neg().Quo(m.Add(a.Int(2))), 0, 1)
	if neg {
		return r.Neg()
	}
	return r
}

// Sech encloses sech(v) = 1/cosh(v) for every v in x, without overflow: the
// result lies in [0, 1] for every finite x. Whole only when x is unbounded.
//
// sech is even and decreasing in |v|: sech|v| = 2u/(1+u^2) with
// u = exp(-|v|) in (0, 1]; when x contains 0 the maximum 1 is included.
func Sech[T Real[T]](x T) T {
	if !x.IsFinite() {
		return x.Whole()
	}
	lo, hi, thin := pointsOf(x)
	r := sechThin(lo)
	if !thin {
		r = r.Hull(sechThin(hi))
		if x.Sign() == 0 {
			r = r.Hull(x.Int(1))
		}
	}
	return withPrec(r, x.Prec())
}

func sechThin[T Real[T]](a T) T {
	u := expThin(a.Abs().Neg())
	return clip(u.Scale(1).Quo(a.Int(1).Add(u.Sqr())), 0, 1)
}
