package precession

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strconv"
	"time"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// Defaults of the work options.
const (
	DefaultCutoff  = 24
	DefaultLength  = 12000
	DefaultWitness = 60000
)

// Options set the work spent.
type Options struct {
	// Cutoff is A, the number of even rows kept exactly in the norm lemma.
	Cutoff int
	// Length is L, the number of terms of the lemma's sums added exactly.
	Length int
	// Witness is the length of each half of the witness state (its largest
	// Fock index is about 6 Witness).
	Witness int
	// Workers is the number of goroutines (GOMAXPROCS when <= 0); the
	// result does not depend on it.
	Workers int
	// Progress, if set, receives stage names and counts.
	Progress func(stage string, done, total int)
}

// Check reports options outside the supported range.
func (o Options) Check() error {
	switch {
	case o.Cutoff < 2 || o.Cutoff > 400:
		return fmt.Errorf("cutoff %d is outside 2..400", o.Cutoff)
	case o.Length < 4*o.Cutoff || o.Length > 200000:
		return fmt.Errorf("length %d is outside 4*cutoff..200000", o.Length)
	case o.Witness < 8 || o.Witness > certificates.MaxPrecessionWitness:
		return fmt.Errorf("witness length %d is outside 8..%d", o.Witness, certificates.MaxPrecessionWitness)
	}
	return nil
}

// Result is a proved bracket with its proofs.
type Result struct {
	Lower, Upper string
	Proofs       [3]*UpperProof
	Witness      *Witness
	Options      Options
	Seconds      float64
}

// Run proves the bracket: the norm lemma in each residue class (upper
// bound) and the Rayleigh quotient of a witness built from the extremal
// vector of the largest class (lower bound).
func Run(o Options) (*Result, error) {
	if err := o.Check(); err != nil {
		return nil, err
	}
	start := time.Now()
	progress := o.Progress
	if progress == nil {
		progress = func(string, int, int) {}
	}
	t := NewTable(3*max(o.Length, o.Witness) + 8)
	res := &Result{Options: o}
	var best float64
	var bestV []float64
	var bestEps float64
	bestSector := 0
	for i, s := range Sectors {
		progress("sector lemma", i, 3)
		eps := s.epsilon(t, o.Cutoff, o.Length)
		lam, v, err := s.searchLambda(t, o.Cutoff, o.Length, eps)
		if err != nil {
			return nil, fmt.Errorf("residue %d: %v", s.R, err)
		}
		// The float lambda is raised by a relative margin until the proof
		// goes through (the enclosures' widths and the tails need some room),
		// then the margin is narrowed by bisection.
		var p *UpperProof
		failed, rel := 0.0, 1e-9
		for ; ; rel *= 2 {
			p, err = s.ProveUpper(t, o.Cutoff, o.Length, lam*(1+rel), o.Workers)
			if err == nil {
				break
			}
			if rel > 0.25 {
				return nil, fmt.Errorf("residue %d: %v", s.R, err)
			}
			failed = rel
		}
		for k := 0; k < 5 && failed > 0; k++ {
			mid := (failed + rel) / 2
			if q, err := s.ProveUpper(t, o.Cutoff, o.Length, lam*(1+mid), o.Workers); err == nil {
				p, rel = q, mid
			} else {
				failed = mid
			}
		}
		res.Proofs[i] = p
		if i == 0 || lam > best {
			best, bestV, bestEps, bestSector = lam, v, eps, i
		}
	}
	progress("sector lemma", 3, 3)
	s := Sectors[bestSector]
	if bestV == nil {
		return nil, fmt.Errorf("residue %d: no extremal vector for the witness", s.R)
	}
	progress("witness", 0, 1)
	y := s.witnessY(t, bestV, best, bestEps, o.Witness)
	w, err := s.Prove(t, y, o.Witness, o.Workers)
	if err != nil {
		return nil, err
	}
	progress("witness", 1, 1)
	res.Witness = w
	up := 0.0
	for _, p := range res.Proofs {
		up = math.Max(up, p.Bound.Hi())
	}
	res.Lower = interval.DecimalDown(new(big.Float).SetFloat64(w.Rayleigh.Lo()), 10)
	res.Upper = interval.DecimalUp(new(big.Float).SetFloat64(up), 10)
	res.Seconds = time.Since(start).Seconds()
	return res, nil
}

func up(v float64) string { return interval.DecimalUp(new(big.Float).SetFloat64(v), 12) }

func ints(v []float64) []string {
	out := make([]string, len(v))
	for i, x := range v {
		out[i] = strconv.FormatInt(int64(x), 10)
	}
	return out
}

// Certificate returns the precession-bracket certificate (unsealed); the
// error reports a number that would not read back.
func (r *Result) Certificate() (*certificates.Certificate, error) {
	w := r.Witness
	var n certificates.Parser
	p := &certificates.Precession{
		Problem: certificates.PrecessionProblem,
		Basis:   certificates.PrecessionBasis,
		Lower:   n.Decimal(r.Lower),
		Upper:   n.Decimal(r.Upper),
		Witness: certificates.PrecessionWitness{
			Residue: w.Sector.R,
			Even:    n.Decimals(ints(w.X)),
			Odd:     n.Decimals(ints(w.Y)),
			Rayleigh: certificates.PrecessionBracket{
				Lower: n.Decimal(interval.DecimalDown(new(big.Float).SetFloat64(w.Rayleigh.Lo()), 16)),
				Upper: n.Decimal(interval.DecimalUp(new(big.Float).SetFloat64(w.Rayleigh.Hi()), 16)),
			},
		},
		Work: certificates.PrecessionCertifier{
			Method: fmt.Sprintf("norm lemma with cutoff %d and %d exact terms per sum; witness of 2 x %d Fock states from the lemma's extremal vector", r.Options.Cutoff, r.Options.Length, r.Options.Witness),
		},
	}
	tail, margin := 0.0, math.Inf(1)
	for _, q := range r.Proofs {
		lam, err1 := certificates.ShortDecimal(q.Lambda)
		eps, err2 := certificates.ShortDecimal(q.Epsilon)
		if err := errors.Join(err1, err2); err != nil {
			return nil, err
		}
		p.Sectors = append(p.Sectors, certificates.PrecessionSector{
			Residue:   q.Sector.R,
			Cutoff:    q.Cutoff,
			SumLength: q.Length,
			Lambda:    lam,
			Epsilon:   eps,
			NormBound: n.Decimal(up(q.Bound.Hi())),
		})
		tail = math.Max(tail, q.TailH)
		margin = math.Min(margin, q.Margin)
	}
	p.Errors = certificates.PrecessionErrors{TailH: n.Decimal(up(tail)), Margin: n.Decimal(interval.DecimalDown(new(big.Float).SetFloat64(margin), 6)),
		MatVecError: n.Decimal(up(w.MatVecError))}
	if err := n.Err(); err != nil {
		return nil, fmt.Errorf("precession certificate: %v", err)
	}
	return &certificates.Certificate{Kind: certificates.KindPrecession, Precession: p}, nil
}
