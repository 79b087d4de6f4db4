package relaxation

import (
	"errors"
	"fmt"
	"math/big"
	"wedgebound/certificates"

	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// bandMaxKnot bounds the knots of band profiles the verifier accepts (the
// quadrature of the diagonal entry grows with the knots).
const bandMaxKnot = 64

func init() {
	registerFamily("band", family{
		start: bandStart,
		newF: func(like interval.F, p map[string]certificates.Decimal) (termSymbol[interval.F], error) {
			from, to, err := bandKnots(paramText(p))
			if err != nil {
				return nil, err
			}
			return newBandTerm(like, from, to)
		},
		newB: func(like interval.B, p map[string]certificates.Decimal) (termSymbol[interval.B], error) {
			from, to, err := bandKnots(paramText(p))
			if err != nil {
				return nil, err
			}
			return newBandTerm(like, from, to)
		},
	})
}

// bandKnot reads one knot exactly and checks the verifier's range.
func bandKnot(kind, name, value string) (*big.Rat, error) {
	r, ok := new(big.Rat).SetString(value)
	if !ok {
		return nil, fmt.Errorf("%s parameter %s = %q is not a number", kind, name, value)
	}
	if r.Sign() < 0 || r.Cmp(big.NewRat(bandMaxKnot, 1)) > 0 {
		return nil, fmt.Errorf("%s parameter %s = %s is outside the verifier's range [0, %d]", kind, name, value, bandMaxKnot)
	}
	return r, nil
}

// bandKnots reads the parameters from < to of a band exactly.
func bandKnots(params map[string]string) (from, to *big.Rat, err error) {
	if len(params) != 2 || params["from"] == "" || params["to"] == "" {
		return nil, nil, errors.New(`the "band" family takes exactly the parameters from and to (finite; the band [from, inf) is the "step" family)`)
	}
	if from, err = bandKnot("band", "from", params["from"]); err != nil {
		return nil, nil, err
	}
	if to, err = bandKnot("band", "to", params["to"]); err != nil {
		return nil, nil, err
	}
	if to.Cmp(from) <= 0 {
		return nil, nil, fmt.Errorf("band needs from < to, not %s >= %s", params["from"], params["to"])
	}
	return from, to, nil
}

// bandStart is where the band's support starts: xp = from.
func bandStart(params map[string]certificates.Decimal) (*big.Rat, error) {
	from, _, err := bandKnots(paramText(params))
	return from, err
}

// bandTerm is the band h(xp) = 1 for from < xp < to on quadrant III (to
// may be inf). Its quadrant-I profile G = 1[from < u < to] jumps up at
// from and down at to, so
//
//	M_{+-} = E(to, s) - E(from, s),   D = D0[from, to](s),
//
// and for to = inf (G = 1 - 1[0 < u < from]) M_{+-} = -E(from, s) and
// D = A(s) - D0[0, from](s), A the quadrant's diagonal entry; E(0, s) =
// -(i/2pi) J(s) in closed form (package doc, "Bands"). The term adds D to
// the (-,-) entry and conj(M_{+-}) to B.
//
// Tail lemma: |B| <= sum over the jumps of the bounds of edgeTailB (c > 0)
// or |J|/(2 pi) <= 1/(8|a|) (c = 0); D lies within diagTail of 0, or of
// A's range for to = inf.
type bandTerm[T interval.Real[T]] struct {
	like  T
	inf   bool
	jumps []bandJump[T]
	diag  *diagInt[T] // nil for the band [0, inf)
}

// bandJump is a jump of G at c with sign coef in M_{+-} = sum coef E(c, s).
type bandJump[T interval.Real[T]] struct {
	coef int
	c    T
	edge *edgeInt[T] // nil for c = 0
}

// newBandTerm builds the band [from, to), or the step [from, inf) when
// to is nil.
func newBandTerm[T interval.Real[T]](like T, from, to *big.Rat) (*bandTerm[T], error) {
	var err error
	b := &bandTerm[T]{like: like.Int(0), inf: to == nil}
	jump := func(c *big.Rat, coef int) error {
		ct, err := checknum.Enclose(like, c)
		if err != nil {
			return err
		}
		j := bandJump[T]{coef: coef, c: ct}
		if c.Sign() > 0 {
			if j.edge, err = newEdgeInt(like, c); err != nil {
				return err
			}
		}
		b.jumps = append(b.jumps, j)
		return nil
	}
	if err := jump(from, -1); err != nil {
		return nil, err
	}
	if b.inf {
		if from.Sign() > 0 {
			if b.diag, err = newDiagInt(like, new(big.Rat), from); err != nil {
				return nil, err
			}
		}
		return b, nil
	}
	if err := jump(to, 1); err != nil {
		return nil, err
	}
	if b.diag, err = newDiagInt(like, from, to); err != nil {
		return nil, err
	}
	return b, nil
}

// piece implements termSymbol.
func (b *bandTerm[T]) piece(idx int, c, S, delta T) (pt, cell, der entries[T], err error) {
	zero := b.like.Int(0)
	pt = entries[T]{A: zero, D: zero, B: interval.RealC(zero)}
	cell, der = pt, pt
	dInt := delta.Neg().Hull(delta)
	twoPi := c.Pi().Scale(1)
	for _, j := range b.jumps {
		var ec, eS, dS interval.C[T]
		if j.edge == nil {
			// E(0, s) = -(i/2pi) J(s).
			mi := func(J interval.C[T]) interval.C[T] {
				return interval.C[T]{Re: J.Im.Quo(twoPi), Im: J.Re.Neg().Quo(twoPi)}
			}
			Jc := quadJ(c)
			dJ := quadJDeriv(S)
			ec, eS, dS = mi(Jc), mi(Jc.Add(dJ.MulReal(dInt))), mi(dJ)
		} else {
			ev, err := j.edge.eval(idx, c, delta)
			if err != nil {
				return pt, cell, der, err
			}
			ec, eS, dS = ev.Vc, ev.VS, ev.dVS
		}
		k := c.Int(int64(j.coef))
		pt.B = pt.B.Add(ec.Conj().MulReal(k))
		cell.B = cell.B.Add(eS.Conj().MulReal(k))
		der.B = der.B.Add(dS.Conj().MulReal(k))
	}
	if b.diag != nil {
		dc, dS, ddS, err := b.diag.eval(idx, c, delta)
		if err != nil {
			return pt, cell, der, err
		}
		pt.D, cell.D, der.D = dc, dS, ddS
	}
	if b.inf {
		Ac, _ := quadA(c)
		AS, dAS := quadA(S)
		pt.D = Ac.Sub(pt.D)
		cell.D = AS.Sub(cell.D)
		der.D = dAS.Sub(der.D)
	}
	return pt, cell, der, nil
}

// tailB implements termSymbol.
func (b *bandTerm[T]) tailB(S T, side int) T {
	sum := S.Int(0)
	for _, j := range b.jumps {
		if j.edge == nil {
			aMin := interval.Lower(S.Frac(1, 4).Add(S.Sqr()).Sqrt())
			sum = sum.Add(S.Int(1).Quo(aMin.Scale(3)))
			continue
		}
		sum = sum.Add(edgeTailB(j.c, S, side))
	}
	return interval.Upper(sum)
}

// tailD implements termSymbol.
func (b *bandTerm[T]) tailD(S T, side int) T {
	d := S.Int(0)
	if b.diag != nil {
		bd, _ := diagTail(b.diag.width, b.diag.hi, S, side)
		d = bd.Neg().Hull(bd)
	}
	if !b.inf {
		return d
	}
	one := S.Int(1)
	th := interval.Tanh(S.Pi().Mul(S))
	var A T
	if side > 0 {
		A = interval.Lower(one.Add(th).Scale(-1)).Hull(one)
	} else {
		A = S.Int(0).Hull(interval.Upper(one.Sub(th).Scale(-1)))
	}
	return A.Sub(d)
}

// limitD implements termSymbol: D -> A -> 1 as s -> inf for to = inf,
// 0 otherwise.
func (b *bandTerm[T]) limitD(side int) *big.Rat {
	if b.inf && side > 0 {
		return big.NewRat(1, 1)
	}
	return new(big.Rat)
}

// budget implements termSymbol.
func (b *bandTerm[T]) budget() (T, T) {
	q, t := b.like.Int(0), b.like.Int(0)
	for _, j := range b.jumps {
		if j.edge != nil {
			jq, jt := j.edge.budget()
			q, t = q.Max(jq), t.Max(jt)
		}
	}
	if b.diag != nil {
		dq, dt := b.diag.budget()
		q, t = q.Max(dq), t.Max(dt)
	}
	return q, t
}
