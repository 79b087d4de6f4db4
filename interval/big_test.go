package interval

import (
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// Exact rational arithmetic (math/big.Rat) is the reference for every check
// here: an operation's result must contain the exact result for every
// combination of endpoints (and sampled interior points), and must not be
// wider than the exact range by more than one rounding on each side.

func ratOf(f *big.Float) *big.Rat {
	r, _ := f.Rat(nil)
	return r
}

// randBig returns a random big.Float with prec bits, of either sign,
// sometimes zero or an integer, with a random exponent in about +-2^40.
func randBig(r *rand.Rand, prec uint) *big.Float {
	switch r.Intn(10) {
	case 0:
		return new(big.Float).SetPrec(prec)
	case 1:
		return new(big.Float).SetPrec(prec).SetInt64(int64(r.Intn(21) - 10))
	}
	m := new(big.Int).Rand(r, new(big.Int).Lsh(big.NewInt(1), prec))
	f := new(big.Float).SetPrec(prec).SetInt(m)
	f.SetMantExp(f, r.Intn(80)-40-int(prec))
	if r.Intn(2) == 0 {
		f.Neg(f)
	}
	return f
}

func randB(r *rand.Rand, prec uint) B {
	a, b := randBig(r, prec), randBig(r, prec)
	if r.Intn(4) == 0 {
		b = a
	}
	if a.Cmp(b) > 0 {
		a, b = b, a
	}
	return B{lo: a, hi: b, prec: prec}
}

// ulpRat returns 2^(exp(v)-p), one unit in the last place of a p-bit v.
func ulpRat(v *big.Rat, p uint) *big.Rat {
	if v.Sign() == 0 {
		return new(big.Rat)
	}
	f, _ := new(big.Float).SetPrec(64).SetRat(v).Float64()
	_, e := math.Frexp(math.Abs(f))
	u := new(big.Rat).SetInt64(1)
	if sh := e - int(p) + 1; sh >= 0 {
		u.SetInt(new(big.Int).Lsh(big.NewInt(1), uint(sh)))
	} else {
		u.SetFrac(big.NewInt(1), new(big.Int).Lsh(big.NewInt(1), uint(-sh)))
	}
	return u
}

// checkRange asserts lo <= min(vals), max(vals) <= hi, and that each bound
// is within one ulp (at prec bits) of the exact extreme.
func checkRange(t *testing.T, what string, res B, vals []*big.Rat, prec uint) {
	t.Helper()
	if !res.IsFinite() {
		t.Errorf("%s: unexpectedly Whole", what)
		return
	}
	mn, mx := vals[0], vals[0]
	for _, v := range vals[1:] {
		if v.Cmp(mn) < 0 {
			mn = v
		}
		if v.Cmp(mx) > 0 {
			mx = v
		}
	}
	lo, hi := ratOf(res.lo), ratOf(res.hi)
	if lo.Cmp(mn) > 0 || hi.Cmp(mx) < 0 {
		t.Errorf("%s: [%s, %s] misses the exact range [%s, %s]", what,
			res.lo.Text('g', 20), res.hi.Text('g', 20), mn.FloatString(20), mx.FloatString(20))
		return
	}
	if new(big.Rat).Sub(mn, lo).Cmp(ulpRat(mn, prec)) > 0 || new(big.Rat).Sub(hi, mx).Cmp(ulpRat(mx, prec)) > 0 {
		t.Errorf("%s: [%s, %s] is more than one ulp wider than [%s, %s]", what,
			res.lo.Text('g', 20), res.hi.Text('g', 20), mn.FloatString(20), mx.FloatString(20))
	}
}

func TestBArithmeticExact(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	for i := 0; i < 3000; i++ {
		p := uint(53 + rng.Intn(250))
		x, y := randB(rng, p), randB(rng, p)
		xl, xh, yl, yh := ratOf(x.lo), ratOf(x.hi), ratOf(y.lo), ratOf(y.hi)
		op := func(f func(a, b *big.Rat) *big.Rat) []*big.Rat {
			return []*big.Rat{f(xl, yl), f(xl, yh), f(xh, yl), f(xh, yh)}
		}
		checkRange(t, "add", x.Add(y), op(func(a, b *big.Rat) *big.Rat { return new(big.Rat).Add(a, b) }), p)
		checkRange(t, "sub", x.Sub(y), op(func(a, b *big.Rat) *big.Rat { return new(big.Rat).Sub(a, b) }), p)
		checkRange(t, "mul", x.Mul(y), op(func(a, b *big.Rat) *big.Rat { return new(big.Rat).Mul(a, b) }), p)
		if y.Sign() != 0 {
			checkRange(t, "quo", x.Quo(y), op(func(a, b *big.Rat) *big.Rat { return new(big.Rat).Quo(a, b) }), p)
		} else if x.Quo(y).IsFinite() {
			t.Errorf("quo by %v containing 0 is finite", y)
		}
		sq := []*big.Rat{new(big.Rat).Mul(xl, xl), new(big.Rat).Mul(xh, xh)}
		if x.Sign() == 0 {
			sq = append(sq, new(big.Rat))
		}
		checkRange(t, "sqr", x.Sqr(), sq, p)
		ab := []*big.Rat{new(big.Rat).Abs(xl), new(big.Rat).Abs(xh)}
		if x.Sign() == 0 {
			ab = append(ab, new(big.Rat))
		}
		checkRange(t, "abs", x.Abs(), ab, p)
		checkRange(t, "neg", x.Neg(), []*big.Rat{new(big.Rat).Neg(xl), new(big.Rat).Neg(xh)}, p)
		k := rng.Intn(200) - 100
		sc := new(big.Rat).SetFloat64(math.Ldexp(1, k))
		checkRange(t, "scale", x.Scale(k), []*big.Rat{new(big.Rat).Mul(xl, sc), new(big.Rat).Mul(xh, sc)}, p)
		checkRange(t, "hull", x.Hull(y), []*big.Rat{xl, xh, yl, yh}, p)
		// Pad by |e| for e in y: [lo - r, hi + r], r = max |y|.
		r := new(big.Rat).Abs(yl)
		if a := new(big.Rat).Abs(yh); a.Cmp(r) > 0 {
			r = a
		}
		checkRange(t, "pad", x.Pad(y), []*big.Rat{new(big.Rat).Sub(xl, r), new(big.Rat).Add(xh, r)}, p)
		// Mid lies inside; Rad bounds the half-width.
		if m := x.Mid(); !x.Contains(m) {
			t.Errorf("mid %v outside %v", m, x)
		}
		hw := new(big.Rat).Quo(new(big.Rat).Sub(xh, xl), big.NewRat(2, 1))
		if new(big.Rat).SetFloat64(x.Rad()).Cmp(hw) < 0 {
			t.Errorf("rad %g below the half-width of %v", x.Rad(), x)
		}
		// Lo and Hi are float64 bounds.
		if new(big.Rat).SetFloat64(x.Lo()).Cmp(xl) > 0 || new(big.Rat).SetFloat64(x.Hi()).Cmp(xh) < 0 {
			t.Errorf("Lo/Hi %g %g do not bound %v", x.Lo(), x.Hi(), x)
		}
	}
}

func TestBSqrtDirected(t *testing.T) {
	rng := rand.New(rand.NewSource(12))
	check := func(v *big.Float, p uint) {
		x := B{lo: v, hi: v, prec: p}
		s := x.Sqrt()
		vr := ratOf(v)
		lo, hi := ratOf(s.lo), ratOf(s.hi)
		if new(big.Rat).Mul(lo, lo).Cmp(vr) > 0 || new(big.Rat).Mul(hi, hi).Cmp(vr) < 0 {
			t.Errorf("sqrt(%s) at %d bits = %v does not enclose", v.Text('g', 30), p, s)
		}
		// At most two ulps wide.
		if new(big.Rat).Sub(hi, lo).Cmp(new(big.Rat).Mul(ulpRat(hi, p), big.NewRat(2, 1))) > 0 {
			t.Errorf("sqrt(%s) at %d bits = %v is too wide", v.Text('g', 30), p, s)
		}
	}
	for i := 0; i < 2000; i++ {
		p := uint(53 + rng.Intn(500))
		v := randBig(rng, p)
		v.Abs(v)
		check(v, p)
		// Perfect squares and their neighbours, where a misrounded
		// approximation would show.
		k := new(big.Float).SetPrec(p / 2).SetInt64(rng.Int63n(1 << 40))
		sq := new(big.Float).SetPrec(p).Mul(k, k)
		check(sq, p)
		ulp := new(big.Float).SetMantExp(big.NewFloat(1), sq.MantExp(nil)-int(p))
		if sq.Sign() > 0 {
			check(new(big.Float).SetPrec(p).Add(sq, ulp), p)
			check(new(big.Float).SetPrec(p).Sub(sq, ulp), p)
		}
	}
	// Precisions where big.Float.Sqrt falls short of p correct bits (its
	// Newton iteration stops early), found while testing Log at 3355 bits.
	for _, p := range []uint{3355, 3360, 6700, 13500, 27000} {
		for i := 0; i < 5; i++ {
			v := randBig(rng, p)
			v.Abs(v)
			check(v, p)
		}
		check(new(big.Float).SetPrec(p).Quo(big.NewFloat(4), big.NewFloat(3)), p)
	}
	// Exact squares come out as points.
	if s := NewB(4, 200).Sqrt(); ratOf(s.lo).Cmp(big.NewRat(2, 1)) != 0 || ratOf(s.hi).Cmp(big.NewRat(2, 1)) != 0 {
		t.Errorf("sqrt 4 = %v", s)
	}
}

func TestBScaleRange(t *testing.T) {
	x := NewB(1, 64)
	if s := x.Scale(math.MaxInt32); s.IsFinite() {
		t.Errorf("2^(2^31) = %v, want Whole", s)
	}
	tiny := x.Scale(-math.MaxInt32)
	if !tiny.IsFinite() || tiny.h().Sign() <= 0 || tiny.l().Sign() < 0 {
		t.Errorf("2^-(2^31) = %v, want a positive upper bound", tiny)
	}
	neg := NewB(-1, 64).Scale(-math.MaxInt32)
	if neg.l().Sign() >= 0 {
		t.Errorf("-2^-(2^31) = %v, want a negative lower bound", neg)
	}
}

func TestBFloat64Bounds(t *testing.T) {
	for _, s := range []string{"1e-320", "3e-324", "1e-400", "-1e-400", "-2.5e-310", "1e400", "-1e400", "0.1"} {
		x, err := NewB(0, 100).Decimal(s)
		if err != nil {
			t.Fatal(err)
		}
		r, _ := new(big.Rat).SetString(s)
		lo, hi := x.Lo(), x.Hi()
		if !math.IsInf(lo, -1) && new(big.Rat).SetFloat64(lo).Cmp(r) > 0 {
			t.Errorf("Lo(%s) = %g is above it", s, lo)
		}
		if !math.IsInf(hi, 1) && new(big.Rat).SetFloat64(hi).Cmp(r) < 0 {
			t.Errorf("Hi(%s) = %g is below it", s, hi)
		}
		if math.IsInf(lo, 1) || math.IsInf(hi, -1) {
			t.Errorf("%s: Lo %g Hi %g", s, lo, hi)
		}
	}
}

func TestBConstructors(t *testing.T) {
	for _, p := range []uint{53, 64, 200} {
		z := NewB(0, p)
		third := z.Frac(1, 3)
		r := big.NewRat(1, 3)
		if ratOf(third.lo).Cmp(r) > 0 || ratOf(third.hi).Cmp(r) < 0 || third.lo.Cmp(third.hi) == 0 {
			t.Errorf("1/3 at %d bits = %v", p, third)
		}
		d, err := z.Decimal("-1.25e-3")
		if err != nil || ratOf(d.lo).Cmp(big.NewRat(-1, 800)) > 0 || ratOf(d.hi).Cmp(big.NewRat(-1, 800)) < 0 {
			t.Errorf("-1.25e-3 = %v (%v)", d, err)
		}
		if q, _ := z.Decimal("-1.25"); q.Lo() != -1.25 || q.Hi() != -1.25 {
			t.Errorf("-1.25 = %v, want the exact point", q)
		}
		tenth, _ := z.Decimal("0.1")
		if ratOf(tenth.lo).Cmp(big.NewRat(1, 10)) >= 0 || ratOf(tenth.hi).Cmp(big.NewRat(1, 10)) <= 0 {
			t.Errorf("0.1 = %v is not a strict enclosure", tenth)
		}
		if _, err := z.Decimal("1.2.3"); err == nil {
			t.Errorf("bad decimal accepted")
		}
		n := z.Int(1<<62 + 1)
		if ratOf(n.lo).Cmp(new(big.Rat).SetInt64(1<<62+1)) > 0 || ratOf(n.hi).Cmp(new(big.Rat).SetInt64(1<<62+1)) < 0 {
			t.Errorf("Int(2^62+1) at %d bits = %v", p, n)
		}
		if z.Float(math.NaN()).IsFinite() || z.Float(math.Inf(1)).IsFinite() || z.Frac(1, 0).IsFinite() {
			t.Errorf("NaN, Inf or 1/0 gave a finite interval")
		}
		b := z.Between(big.NewFloat(2), big.NewFloat(1))
		if b.Lo() != 1 || b.Hi() != 2 {
			t.Errorf("Between(2,1) = %v", b)
		}
		if z.Prec() != p || third.Prec() != p {
			t.Errorf("precision not kept")
		}
	}
	if NewB(1, 10).Prec() != MinPrec || NewB(1, 1<<20).Prec() != MaxPrec {
		t.Errorf("precision not clamped")
	}
}

func TestBWithPrec(t *testing.T) {
	x := NewB(0, 300).Frac(1, 3)
	y := x.WithPrec(60)
	if !y.Contains(x) || y.Prec() != 60 {
		t.Errorf("WithPrec(60) of %v = %v", x, y)
	}
	z := y.WithPrec(300)
	if !z.Contains(y) || !y.Contains(z) {
		t.Errorf("raising the precision changed the value")
	}
}

func TestBPredicates(t *testing.T) {
	z := NewB(0, 64)
	a := z.Int(1).Hull(z.Int(2))
	b := z.Int(3).Hull(z.Int(4))
	if !a.Less(b) || b.Less(a) || a.Less(a) {
		t.Errorf("Less is wrong")
	}
	if a.Sign() != 1 || a.Neg().Sign() != -1 || a.Hull(a.Neg()).Sign() != 0 || z.Whole().Sign() != 0 {
		t.Errorf("Sign is wrong")
	}
	if !z.Whole().Contains(a) || a.Contains(z.Whole()) || !a.Contains(z.Frac(3, 2)) || a.Contains(b) {
		t.Errorf("Contains is wrong")
	}
	if m := a.Max(b.Neg()); m.Lo() != 1 || m.Hi() != 2 {
		t.Errorf("Max = %v", m)
	}
	if m := a.Min(b.Neg()); m.Lo() != -4 || m.Hi() != -3 {
		t.Errorf("Min = %v", m)
	}
	if lo, hi := z.Whole().Endpoints(); lo != nil || hi != nil {
		t.Errorf("Endpoints of Whole are not nil")
	}
}
