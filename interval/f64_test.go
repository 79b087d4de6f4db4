package interval

import (
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// F is checked against exact rational arithmetic: each result must contain
// the exact range over the operand box and be at most a few ulps wider.

func randFloat(r *rand.Rand) float64 {
	switch r.Intn(12) {
	case 0:
		return 0
	case 1:
		return float64(r.Intn(21) - 10)
	case 2:
		return math.Ldexp(r.Float64(), -1070) // subnormal
	case 3:
		return signed(r, math.Ldexp(1+r.Float64(), 1000+r.Intn(23)))
	}
	return signed(r, math.Ldexp(1+r.Float64(), r.Intn(120)-60))
}

func randF(r *rand.Rand) F {
	a, b := randFloat(r), randFloat(r)
	if r.Intn(4) == 0 {
		b = a
	}
	if a > b {
		a, b = b, a
	}
	return F{a, b}
}

func rat(v float64) *big.Rat { return new(big.Rat).SetFloat64(v) }

// checkRangeF asserts lo <= min(vals), max(vals) <= hi (for a finite
// result), and that each bound is within 2 ulps of the exact extreme.
func checkRangeF(t *testing.T, what string, res F, vals []*big.Rat) {
	t.Helper()
	mn, mx := vals[0], vals[0]
	for _, v := range vals[1:] {
		if v.Cmp(mn) < 0 {
			mn = v
		}
		if v.Cmp(mx) > 0 {
			mx = v
		}
	}
	if !math.IsInf(res.lo, -1) && rat(res.lo).Cmp(mn) > 0 || !math.IsInf(res.hi, 1) && rat(res.hi).Cmp(mx) < 0 {
		t.Errorf("%s: %v misses the exact range [%s, %s]", what, res, mn.FloatString(20), mx.FloatString(20))
		return
	}
	if !res.IsFinite() {
		return // overflow: the half-line or Whole is a valid enclosure
	}
	mnf, _ := mn.Float64()
	mxf, _ := mx.Float64()
	if res.lo < math.Nextafter(math.Nextafter(mnf, math.Inf(-1)), math.Inf(-1)) ||
		res.hi > math.Nextafter(math.Nextafter(mxf, math.Inf(1)), math.Inf(1)) {
		t.Errorf("%s: %v is more than 2 ulps wider than [%g, %g]", what, res, mnf, mxf)
	}
}

func TestFArithmeticExact(t *testing.T) {
	rng := rand.New(rand.NewSource(21))
	for i := 0; i < 20000; i++ {
		x, y := randF(rng), randF(rng)
		xl, xh, yl, yh := rat(x.lo), rat(x.hi), rat(y.lo), rat(y.hi)
		op := func(f func(a, b *big.Rat) *big.Rat) []*big.Rat {
			return []*big.Rat{f(xl, yl), f(xl, yh), f(xh, yl), f(xh, yh)}
		}
		checkRangeF(t, "add", x.Add(y), op(func(a, b *big.Rat) *big.Rat { return new(big.Rat).Add(a, b) }))
		checkRangeF(t, "sub", x.Sub(y), op(func(a, b *big.Rat) *big.Rat { return new(big.Rat).Sub(a, b) }))
		checkRangeF(t, "mul", x.Mul(y), op(func(a, b *big.Rat) *big.Rat { return new(big.Rat).Mul(a, b) }))
		if y.lo > 0 || y.hi < 0 {
			checkRangeF(t, "quo", x.Quo(y), op(func(a, b *big.Rat) *big.Rat { return new(big.Rat).Quo(a, b) }))
		} else if x.Quo(y).IsFinite() {
			t.Errorf("%v / %v (contains 0) is finite", x, y)
		}
		sq := []*big.Rat{new(big.Rat).Mul(xl, xl), new(big.Rat).Mul(xh, xh)}
		if x.lo <= 0 && x.hi >= 0 {
			sq = append(sq, new(big.Rat))
		}
		checkRangeF(t, "sqr", x.Sqr(), sq)
		k := rng.Intn(2200) - 1100
		s := x.Scale(k)
		sc := new(big.Rat).SetFrac(big.NewInt(1), big.NewInt(1))
		if k >= 0 {
			sc.SetInt(new(big.Int).Lsh(big.NewInt(1), uint(k)))
		} else {
			sc.SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), uint(-k)))
		}
		checkRangeF(t, "scale", s, []*big.Rat{new(big.Rat).Mul(xl, sc), new(big.Rat).Mul(xh, sc)})
		if x.hi >= 0 {
			sr := x.Sqrt()
			v := xh
			if !math.IsInf(sr.hi, 1) && new(big.Rat).Mul(rat(sr.hi), rat(sr.hi)).Cmp(v) < 0 {
				t.Errorf("sqrt %v = %v: upper end too small", x, sr)
			}
			if x.lo > 0 && new(big.Rat).Mul(rat(sr.lo), rat(sr.lo)).Cmp(xl) > 0 {
				t.Errorf("sqrt %v = %v: lower end too large", x, sr)
			}
			if x.lo <= 0 && sr.lo != 0 {
				t.Errorf("sqrt %v = %v: lower end should be 0", x, sr)
			}
		} else if x.Sqrt().IsFinite() {
			t.Errorf("sqrt %v (negative) is finite", x)
		}
		if m := x.Mid(); !x.Contains(m) {
			t.Errorf("mid %v outside %v", m, x)
		}
		if r := x.Rad(); rat(r).Cmp(new(big.Rat).Quo(new(big.Rat).Sub(xh, xl), big.NewRat(2, 1))) < 0 {
			t.Errorf("rad %g too small for %v", r, x)
		}
	}
}

// The former Scale bug: both endpoints underflowing to zero gave [0, 0].
func TestFScaleUnderflow(t *testing.T) {
	for _, v := range []float64{1, 3, 0x1p-1000, math.SmallestNonzeroFloat64} {
		s := PointF(v).Scale(-1100)
		if !(s.hi > 0) || s.lo > 0 {
			t.Errorf("%g * 2^-1100 = %v, want [<=0, >0]", v, s)
		}
		if s := PointF(-v).Scale(-1100); !(s.lo < 0) {
			t.Errorf("-%g * 2^-1100 = %v", v, s)
		}
	}
	if s := PointF(1).Scale(2000); s.IsFinite() {
		t.Errorf("2^2000 = %v, want unbounded", s)
	}
	if s := PointF(3).Scale(-2); s.lo != 0.75 || s.hi != 0.75 {
		t.Errorf("3/4 = %v, want exact", s)
	}
}

func TestFConstructors(t *testing.T) {
	var z F
	if n := z.Int(1<<62 + 1); rat(n.lo).Cmp(new(big.Rat).SetInt64(1<<62+1)) > 0 || rat(n.hi).Cmp(new(big.Rat).SetInt64(1<<62+1)) < 0 {
		t.Errorf("Int(2^62+1) = %v", n)
	}
	if n := z.Int(12345); n.lo != 12345 || n.hi != 12345 {
		t.Errorf("Int(12345) = %v", n)
	}
	third := z.Frac(1, 3)
	if rat(third.lo).Cmp(big.NewRat(1, 3)) > 0 || rat(third.hi).Cmp(big.NewRat(1, 3)) < 0 {
		t.Errorf("1/3 = %v", third)
	}
	d, err := z.Decimal("0.1")
	if err != nil || rat(d.lo).Cmp(big.NewRat(1, 10)) >= 0 || rat(d.hi).Cmp(big.NewRat(1, 10)) <= 0 {
		t.Errorf("0.1 = %v", d)
	}
	if d, _ := z.Decimal("1e400"); rat(d.lo).Cmp(new(big.Rat).SetFloat64(math.MaxFloat64)) < 0 || !math.IsInf(d.hi, 1) {
		t.Errorf("1e400 = %v", d)
	}
	if _, err := z.Decimal("x"); err == nil {
		t.Errorf("bad decimal accepted")
	}
	if NewF(2, 1).IsFinite() || NewF(math.NaN(), 1).IsFinite() || PointF(math.NaN()).IsFinite() || z.Frac(1, 0).IsFinite() {
		t.Errorf("invalid input gave a finite interval")
	}
	if f := NewF(1, 2); !(f.lo < 1) || !(f.hi > 2) {
		t.Errorf("NewF(1,2) = %v, want widened", f)
	}
	b := z.Between(big.NewFloat(0).SetPrec(200).Quo(big.NewFloat(1), big.NewFloat(3)), big.NewFloat(0.5))
	if rat(b.lo).Cmp(big.NewRat(1, 3)) > 0 || b.hi != 0.5 {
		t.Errorf("Between(1/3, 1/2) = %v", b)
	}
	if z.Pi().Lo() >= math.Pi || z.Pi().Hi() <= math.Pi || z.Ln2().Lo() >= math.Ln2 {
		t.Errorf("Pi or Ln2 is not a strict enclosure of the nearest float64")
	}
	if p := z.Pad(PointF(-2)); p.lo > -2 || p.hi < 2 {
		t.Errorf("Pad by -2 = %v", p)
	}
}

// Between rounds outward also when its arguments come in the wrong order
// and in the subnormal range (big.Float.Float64 rounds to nearest there).
func TestFBetweenOutward(t *testing.T) {
	third := new(big.Float).SetPrec(200).Quo(big.NewFloat(1), big.NewFloat(3))
	twoThirds := new(big.Float).SetPrec(200).Quo(big.NewFloat(2), big.NewFloat(3))
	b := F{}.Between(twoThirds, third)
	if rat(b.lo).Cmp(big.NewRat(1, 3)) > 0 || rat(b.hi).Cmp(big.NewRat(2, 3)) < 0 {
		t.Errorf("Between(2/3, 1/3) = %v", b)
	}
	for _, s := range []string{"1e-320", "-1e-320", "1e-330", "-1e-330", "2.5e-308"} {
		v, _ := new(big.Float).SetPrec(200).SetString(s)
		f := F{}.Between(v, v)
		r, _ := new(big.Rat).SetString(s)
		if rat(f.lo).Cmp(r) > 0 || rat(f.hi).Cmp(r) < 0 {
			t.Errorf("Between(%s) = %v", s, f)
		}
		d, _ := F{}.Decimal(s)
		if rat(d.lo).Cmp(r) > 0 || rat(d.hi).Cmp(r) < 0 {
			t.Errorf("Decimal(%s) = %v", s, d)
		}
	}
}
