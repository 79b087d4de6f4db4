package regions

import (
	"fmt"
	"math/big"

	"wedgebound/interval"
)

// maxKnot bounds the knots of band and hat profiles (larger knots make the
// quadrature of the diagonal entry expensive).
const maxKnot = 1000

func init() { registerFamily("band", newBandTerm[interval.F], newBandTerm[interval.B]) }

// newBandTerm builds the band h(xp) = 1 for from < xp < to on quadrant III
// (to may be "inf"). Its quadrant-I profile jumps up at from and down at
// to, so M_{+-} = E(to, s) - E(from, s) with E(inf, s) = 0, and
// D = M_{++} of the piece [from, to), or A(s) - M_{++}[0, from) for to = inf.
func newBandTerm[T interval.Real[T]](like T, params map[string]string) (Term[T], error) {
	if len(params) != 2 || params["from"] == "" || params["to"] == "" {
		return nil, fmt.Errorf("band term needs exactly the parameters from and to")
	}
	a, err := knot(params["from"], "band from")
	if err != nil {
		return nil, err
	}
	inf := params["to"] == "inf"
	var b *big.Rat
	if !inf {
		if b, err = knot(params["to"], "band to"); err != nil {
			return nil, err
		}
		if b.Cmp(a) <= 0 {
			return nil, fmt.Errorf("band term needs from < to, not %s >= %s", params["from"], params["to"])
		}
	}
	if inf {
		return newUpperBand(like, "band", map[string]string{"from": RatString(a), "to": "inf"}, a), nil
	}
	aT, af := ratT(like, a)
	ea := newEdge(aT, af, false)
	norm := map[string]string{"from": RatString(a), "to": "inf"}
	bT, bf := ratT(like, b)
	norm["to"] = RatString(b)
	L := bT.Sub(aT)
	p := []piece[T]{{x0: aT, L: L, h0: like.Int(1), h1: like.Int(1), flat: true}}
	edges := []edgeRef[T]{{coef: like.Int(1), edge: newEdge(bT, bf, false)}, {coef: like.Int(-1), edge: ea}}
	return newPWL(like, "band", norm, RatString(a), p, interval.Upper(L), bf, false, edges), nil
}

// newUpperBand builds h(xp) = 1 for xp > a (the band [a, inf)) as
// 1 - [0, a): its D is A(s) - M_{++}[[0, a)] and its edge term -E(a, s).
func newUpperBand[T interval.Real[T]](like T, kind string, norm map[string]string, a *big.Rat) Term[T] {
	aT, af := ratT(like, a)
	ea := newEdge(aT, af, false)
	if a.Sign() == 0 {
		return newPWL(like, kind, norm, "0", nil, like.Int(0), 0, true, []edgeRef[T]{{coef: like.Int(-1), edge: ea}})
	}
	p := []piece[T]{{x0: like.Int(0), L: aT, h0: like.Int(-1), h1: like.Int(-1), flat: true}}
	return newPWL(like, kind, norm, RatString(a), p, aT, af, true, []edgeRef[T]{{coef: like.Int(-1), edge: ea}})
}

// knot parses a profile knot: a decimal in [0, maxKnot].
func knot(s, what string) (*big.Rat, error) {
	r, err := ParseRat(s)
	if err != nil {
		return nil, fmt.Errorf("%s: %v", what, err)
	}
	if r.Sign() < 0 || r.Cmp(big.NewRat(maxKnot, 1)) > 0 {
		return nil, fmt.Errorf("%s = %s is outside [0, %d]", what, s, maxKnot)
	}
	return r, nil
}

// ratT encloses the exact rational r at the precision of like, with its
// float64 value.
func ratT[T interval.Real[T]](like T, r *big.Rat) (T, float64) {
	num, _ := like.Decimal(r.Num().String())
	den, _ := like.Decimal(r.Denom().String())
	f, _ := r.Float64()
	return num.Quo(den), f
}
