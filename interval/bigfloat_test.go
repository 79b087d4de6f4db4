package interval

import (
	"math/big"
	"math/rand"
	"testing"

	"github.com/ALTree/bigfloat"
)

// TestAgainstBigfloat cross-checks Exp, Log and Pow at 300 bits against the
// independent arbitrary-precision library github.com/ALTree/bigfloat. That
// library gives no error bound, so its value only has to lie within a few
// ulps of our enclosure (a cross-check of two implementations, not a proof).
func TestAgainstBigfloat(t *testing.T) {
	const prec = 300
	rng := rand.New(rand.NewSource(7))
	near := func(name string, enc B, ref *big.Float) {
		t.Helper()
		slack := new(big.Float).SetMantExp(new(big.Float).Abs(ref), -prec+8)
		s := enc.Prec()
		e := enc.Pad(B{prec: s}.Between(slack, slack))
		if !e.Contains(B{prec: s}.Between(ref, ref)) {
			t.Errorf("%s: bigfloat value %s outside %v", name, ref.Text('g', 30), enc)
		}
	}
	for range 40 {
		v := (rng.Float64() - 0.5) * 40
		x := NewB(v, prec)
		xf := new(big.Float).SetPrec(prec).SetFloat64(v)
		near("exp", Exp(x), bigfloat.Exp(xf))
		a := rng.Float64()*100 + 1e-3
		y := NewB(a, prec)
		yf := new(big.Float).SetPrec(prec).SetFloat64(a)
		near("log", Log(y), bigfloat.Log(yf))
		p := (rng.Float64() - 0.5) * 6
		pf := new(big.Float).SetPrec(prec).SetFloat64(p)
		near("pow", Pow(y, NewB(p, prec)), bigfloat.Pow(yf, pf))
	}
}
