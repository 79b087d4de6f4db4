package interval

import (
	"math/big"
	"math/rand"
	"strings"
	"testing"
)

func TestDecimalKnown(t *testing.T) {
	third := new(big.Float).SetPrec(200).Quo(big.NewFloat(1), big.NewFloat(3))
	nthird := new(big.Float).Neg(third)
	nines := new(big.Float).SetPrec(200).SetFloat64(9.99996)
	cases := []struct {
		v        *big.Float
		n        int
		down, up string
	}{
		{third, 5, "0.33333", "0.33334"},
		{nthird, 5, "-0.33334", "-0.33333"},
		{nines, 3, "9.99", "10"},
		{big.NewFloat(0.5), 10, "0.5", "0.5"},
		{big.NewFloat(0), 4, "0", "0"},
		{big.NewFloat(1234567), 3, "1230000", "1240000"},
		{big.NewFloat(-1e-50), 2, "-1.1e-50", "-1e-50"},                           // float64 -1e-50 = -1.0000000000000000076e-50
		{big.NewFloat(2.5e60), 2, "2.4e60", "2.5e60"},                             // float64 2.5e60 = 2.4999999999999998735e60
		{new(big.Float).SetMantExp(big.NewFloat(1), 200), 3, "1.6e60", "1.61e60"}, // 2^200 = 1.606938...e60
		{big.NewFloat(100), 1, "100", "100"},
	}
	for _, c := range cases {
		if d := DecimalDown(c.v, c.n); d != c.down {
			t.Errorf("DecimalDown(%s, %d) = %q, want %q", c.v.Text('g', 20), c.n, d, c.down)
		}
		if u := DecimalUp(c.v, c.n); u != c.up {
			t.Errorf("DecimalUp(%s, %d) = %q, want %q", c.v.Text('g', 20), c.n, u, c.up)
		}
	}
}

// Random values: down <= v <= up, both have at most n significant digits,
// and they are the nearest such decimals (one unit in the n-th digit apart
// at most).
func TestDecimalDirected(t *testing.T) {
	rng := rand.New(rand.NewSource(31))
	for i := 0; i < 3000; i++ {
		v := randBig(rng, uint(53+rng.Intn(300)))
		if rng.Intn(3) == 0 {
			v.SetMantExp(v, rng.Intn(400)-200)
		}
		n := 1 + rng.Intn(40)
		d, u := DecimalDown(v, n), DecimalUp(v, n)
		dr, ok1 := new(big.Rat).SetString(d)
		ur, ok2 := new(big.Rat).SetString(u)
		if !ok1 || !ok2 {
			t.Fatalf("unparsable %q %q", d, u)
		}
		vr := ratOf(v)
		if dr.Cmp(vr) > 0 || ur.Cmp(vr) < 0 {
			t.Errorf("%s at %d digits: %s, %s do not bracket it", v.Text('g', 30), n, d, u)
		}
		for _, s := range []string{d, u} {
			mant := strings.TrimLeft(strings.SplitN(strings.TrimPrefix(s, "-"), "e", 2)[0], "0.")
			mant = strings.TrimRight(strings.ReplaceAll(mant, ".", ""), "0")
			if len(mant) > n {
				t.Errorf("%q has more than %d significant digits", s, n)
			}
		}
		if vr.Sign() != 0 {
			// up - down is at most one unit of the n-th significant digit of v
			// (two when rounding crosses a power of ten).
			gap := new(big.Rat).Sub(ur, dr)
			lim := new(big.Rat).Mul(new(big.Rat).Abs(vr), new(big.Rat).SetFrac(big.NewInt(2), pow10(n-1)))
			if gap.Cmp(lim) > 0 {
				t.Errorf("%s at %d digits: %s, %s are too far apart", v.Text('g', 30), n, d, u)
			}
		}
	}
}

func TestDecimalsOfIntervals(t *testing.T) {
	x := NewB(0, 300).Pi()
	lo, hi, err := Decimals(x, 30)
	if err != nil || lo != "3.14159265358979323846264338327" || hi != "3.14159265358979323846264338328" {
		// pi = 3.14159265358979323846264338327950... (OEIS A000796)
		t.Errorf("Decimals(pi, 30) = %q, %q, %v", lo, hi, err)
	}
	if _, _, err := Decimals(NewB(0, 64).Whole(), 5); err != ErrUnbounded {
		t.Errorf("Decimals(Whole) err = %v", err)
	}
	if _, _, err := Decimals(F{}.Whole(), 5); err != ErrUnbounded {
		t.Errorf("Decimals(F Whole) err = %v", err)
	}
	lo, hi, _ = Decimals(F{}.Frac(1, 3), 17)
	l, _ := new(big.Rat).SetString(lo)
	h, _ := new(big.Rat).SetString(hi)
	if l.Cmp(big.NewRat(1, 3)) >= 0 || h.Cmp(big.NewRat(1, 3)) <= 0 || !strings.HasPrefix(lo, "0.333333333333333") {
		t.Errorf("Decimals(F 1/3, 17) = %q, %q", lo, hi)
	}
}
