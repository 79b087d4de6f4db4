package interval

import "math/big"

// Constants are computed in exact integer fixed-point arithmetic with
// scale 2^(prec+guard). Each truncated division contributes at most one
// unit of the scale, and the series tail is bounded by its first omitted
// term, so the returned interval provably contains the constant.

var (
	piCache  = constCache{calc: computePi}
	ln2Cache = constCache{calc: computeLn2}
)

// Pi encloses pi at the receiver's precision.
func (x B) Pi() B { return piCache.get(x.p()) }

// Ln2 encloses log 2 at the receiver's precision.
func (x B) Ln2() B { return ln2Cache.get(x.p()) }

// arctanInv returns v and an error bound e (both scaled by 2^bits) with
// |v - 2^bits * atan(1/n)| <= e, using the alternating Taylor series.
func arctanInv(n int64, bits uint) (v *big.Int, e int64) {
	one := new(big.Int).Lsh(big.NewInt(1), bits)
	nn := big.NewInt(n * n)
	pow := new(big.Int).Quo(one, big.NewInt(n)) // 2^bits / n^(2k+1), truncated
	v = new(big.Int)
	t := new(big.Int)
	for k := int64(0); pow.Sign() > 0; k++ {
		t.Quo(pow, big.NewInt(2*k+1))
		if k%2 == 0 {
			v.Add(v, t)
		} else {
			v.Sub(v, t)
		}
		pow.Quo(pow, nn)
		e += 2 // truncation of pow (accumulates below 1 unit per step) and of t
	}
	// pow is now 0, so the exact 2^bits/n^(2K+1) is below 2 units (the
	// accumulated truncation of pow stays below 1/(1-1/n^2) < 2), and the
	// alternating tail is at most that first omitted term.
	return v, e + 2
}

func fixedToB(v *big.Int, e int64, bits uint, prec uint) B {
	lo := new(big.Int).Sub(v, big.NewInt(e))
	hi := new(big.Int).Add(v, big.NewInt(e))
	l := dn(prec).SetInt(lo)
	h := upf(prec).SetInt(hi)
	l.SetMantExp(l, -int(bits))
	h.SetMantExp(h, -int(bits))
	return B{lo: l, hi: h, prec: prec}
}

// computePi uses Machin's formula pi = 16 atan(1/5) - 4 atan(1/239).
func computePi(prec uint) B {
	bits := prec + 32
	a, ea := arctanInv(5, bits)
	b, eb := arctanInv(239, bits)
	v := new(big.Int).Sub(new(big.Int).Lsh(a, 4), new(big.Int).Lsh(b, 2))
	return fixedToB(v, 16*ea+4*eb, bits, prec)
}

// computeLn2 uses log 2 = 2 atanh(1/3) = 2 sum_k 1/((2k+1) 3^(2k+1)).
func computeLn2(prec uint) B {
	bits := prec + 32
	one := new(big.Int).Lsh(big.NewInt(1), bits)
	pow := new(big.Int).Quo(one, big.NewInt(3))
	v := new(big.Int)
	t := new(big.Int)
	var e int64
	for k := int64(0); pow.Sign() > 0; k++ {
		t.Quo(pow, big.NewInt(2*k+1))
		v.Add(v, t)
		pow.Quo(pow, big.NewInt(9))
		e += 2
	}
	// Tail: sum_{j>=K} pow_j/(2j+1) < pow_K * 9/8 < 2 units once pow_K < 1.
	e += 2
	v.Lsh(v, 1)
	return fixedToB(v, 2*e, bits, prec)
}
