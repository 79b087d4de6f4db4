// Package reltest is test support for the relaxation verifier: a small
// reference certifier on the verifier's own numerics (BuildCertificate),
// kept out of the verifier's trusted base (nothing but tests imports it).
package reltest

import (
	"errors"
	"fmt"
	"math/big"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck/relaxation"
	"wedgebound/interval"
)

// BuildOptions describes a certificate for BuildCertificate.
type BuildOptions struct {
	Problem certificates.Problem
	Terms   []certificates.Term
	// Bound is the claimed bound (decimal).
	Bound string
	// Lo and Hi are the ends of the cover (Lo < 0 < Hi, decimals).
	Lo, Hi string
	// Cells is the number of equal initial cells (default 32); each is
	// bisected until its enclosure supports the claim.
	Cells int
	// MaxCells stops the construction (default 20000).
	MaxCells int
}

// BuildCertificate is a small reference certifier on the verifier's own
// numerics, for tests and worked examples (the project's certifier is a
// separate program): it covers [Lo, Hi] with cells whose enclosures
// support the claim, closes the cover with the tail lemma of Model.Tail and
// seals the result. It fails when the claim cannot be supported that way.
func BuildCertificate(o BuildOptions) (*certificates.Certificate, error) {
	nf, err := relaxation.Recompute(o.Problem)
	if err != nil {
		return nil, err
	}
	edge := relaxation.Edge(o.Problem.Edge)
	m, err := relaxation.NewModel(interval.F{}, edge, o.Terms)
	if err != nil {
		return nil, err
	}
	boundD, err := certificates.ParseDecimal(o.Bound)
	if err != nil {
		return nil, fmt.Errorf("bound: %v", err)
	}
	loD, err := certificates.ParseDecimal(o.Lo)
	if err != nil {
		return nil, fmt.Errorf("lo: %v", err)
	}
	hiD, err := certificates.ParseDecimal(o.Hi)
	if err != nil {
		return nil, fmt.Errorf("hi: %v", err)
	}
	bound, lo, hi := boundD.Rat(), loD.Rat(), hiD.Rat()
	if lo.Sign() >= 0 || hi.Sign() <= 0 {
		return nil, errors.New("the cover must contain 0 in its interior")
	}
	thr := new(big.Float).SetPrec(200).SetRat(bound)
	if edge == relaxation.Lower {
		thr.Neg(thr)
	}
	okEnc := func(x interval.F) bool {
		l, h := x.Endpoints()
		if l == nil {
			return false
		}
		if edge == relaxation.Lower {
			return l.Cmp(thr) >= 0
		}
		return h.Cmp(thr) <= 0
	}
	n0 := o.Cells
	if n0 <= 0 {
		n0 = 32
	}
	maxCells := o.MaxCells
	if maxCells <= 0 {
		maxCells = 20000
	}
	width := new(big.Rat).Sub(hi, lo)
	var grid []*big.Rat
	for i := 0; i <= n0; i++ {
		g := new(big.Rat).Add(lo, new(big.Rat).Mul(width, big.NewRat(int64(i), int64(n0))))
		grid = append(grid, g)
	}
	var cells []certificates.Cell
	half := big.NewRat(1, 2)
	for i := range n0 {
		for _, pc := range relaxation.Pieces(grid[i], grid[i+1]) {
			stack := [][2]*big.Rat{pc}
			for len(stack) > 0 {
				p := stack[len(stack)-1]
				stack = stack[:len(stack)-1]
				r, err := m.Piece(p[0], p[1])
				if err != nil {
					return nil, err
				}
				if !okEnc(r.Eig) {
					if len(cells)+len(stack) > maxCells {
						return nil, fmt.Errorf("the claim %s needs more than %d cells (last tried [%s, %s], enclosure %v)", o.Bound, maxCells, p[0].RatString(), p[1].RatString(), r.Eig)
					}
					mid := new(big.Rat).Add(p[0], p[1])
					mid.Mul(mid, half)
					stack = append(stack, [2]*big.Rat{mid, p[1]}, [2]*big.Rat{p[0], mid})
					continue
				}
				el, eu, err := interval.Decimals(r.Eig, 12)
				if err != nil {
					return nil, err
				}
				var c certificates.Cell
				var errs [4]error
				c.Lo, errs[0] = certificates.DecimalOf(p[0])
				c.Hi, errs[1] = certificates.DecimalOf(p[1])
				c.EigLower, errs[2] = certificates.ParseDecimal(el)
				c.EigUpper, errs[3] = certificates.ParseDecimal(eu)
				if err := errors.Join(errs[:]...); err != nil {
					return nil, err
				}
				cells = append(cells, c)
			}
		}
	}
	tails := make([]certificates.Tail, 2)
	for i, side := range []int{-1, 1} {
		from := lo
		if side > 0 {
			from = hi
		}
		enc, err := m.Tail(from, side)
		if err != nil {
			return nil, err
		}
		if !okEnc(enc) {
			return nil, fmt.Errorf("the tail lemma at s = %s does not support the claim (%v)", from.RatString(), enc)
		}
		l, h, err := interval.Decimals(enc, 12)
		if err != nil {
			return nil, err
		}
		b := l
		if edge == relaxation.Upper {
			b = h
		}
		fromD, err1 := certificates.DecimalOf(from)
		bD, err2 := certificates.ParseDecimal(b)
		if err := errors.Join(err1, err2); err != nil {
			return nil, err
		}
		tails[i] = certificates.Tail{From: fromD, Bound: bD, Lemma: "recheck tail lemma (quadrant |J| <= pi/(4|a|), exp terms C(k)/|a|, monotone corner)"}
	}
	normal := certificates.NormalForm{A: certificates.FractionOf(nf.A), B: certificates.FractionOf(nf.B), D: certificates.FractionOf(nf.D),
		Threshold: certificates.NewThreshold(nf.Threshold)}
	for i := range 4 {
		normal.Map[i] = certificates.FractionOf(nf.Map[i])
	}
	budget, err := m.Budget()
	if err != nil {
		return nil, err
	}
	stmt := fmt.Sprintf("lambda_min(M(s)) >= -%s for every real s", o.Bound)
	if edge == relaxation.Upper {
		stmt = fmt.Sprintf("lambda_max(M(s)) <= %s for every real s", o.Bound)
	}
	c := &certificates.Certificate{
		Kind: certificates.KindRelaxation,
		Relaxation: &certificates.Relaxation{
			Problem:       o.Problem,
			Normal:        normal,
			Terms:         o.Terms,
			Claim:         certificates.Claim{Edge: o.Problem.Edge, Bound: boundD, Statement: stmt},
			PrecisionBits: 53,
			Cover:         cells,
			Below:         tails[0],
			Above:         tails[1],
			Budget:        budget,
		},
	}
	if err := certificates.Seal(c); err != nil {
		return nil, err
	}
	return c, nil
}
