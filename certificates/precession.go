package certificates

import (
	"errors"
	"fmt"
	"math/big"
)

// KindPrecession brackets the three-time precession constant P3.
const KindPrecession = "precession-bracket"

// PrecessionProblem is the statement a precession certificate must record
// verbatim.
const PrecessionProblem = "P3 = sup spec Q3, Q3 = (1/3) sum_{k=0,1,2} Theta(x cos(2 pi k/3) + p sin(2 pi k/3)), hbar = m = omega = 1, on L^2(R)"

// PrecessionBasis names the witness basis: the Fock states |n> of the
// oscillator (normalised Hermite functions), restricted to one residue class
// r = n mod 3. Residue r has even states |2(3a+J0)> and odd states
// |2(3b+K0)+1> with (J0, K0) = (0, 1), (2, 0), (1, 2) for r = 0, 1, 2.
const PrecessionBasis = "Fock states |n>, n = 2(3a+J0) (even part) and n = 2(3b+K0)+1 (odd part), (J0,K0) = (0,1), (2,0), (1,2) for residue r = n mod 3 = 0, 1, 2"

// MaxPrecessionWitness is the largest length of each witness half.
const MaxPrecessionWitness = 400000

// MaxPrecessionLength is the largest cutoff or sum length of a sector proof.
const MaxPrecessionLength = 1000000

// Precession is the precession-bracket section. It proves
//
//	Lower <= P3 <= Upper.
//
// Lower rests on the witness: Lower <= Witness.Rayleigh.Lower, and the
// witness's Rayleigh quotient <psi|Q3|psi>/<psi|psi> lies in
// Witness.Rayleigh. Upper rests on the three sector proofs:
// Upper >= NormBound of each sector, where NormBound >= 1/2 + sqrt(Lambda)/6
// and the norm lemma (certify/precession/doc.go) holds with the recorded
// Cutoff, SumLength, Lambda and Epsilon. A verifier re-derives every
// inequality and every enclosure.
type Precession struct {
	Problem string              `json:"problem"`
	Basis   string              `json:"basis"`
	Lower   Decimal             `json:"lower"`
	Upper   Decimal             `json:"upper"`
	Witness PrecessionWitness   `json:"witness"`
	Sectors []PrecessionSector  `json:"sectors"`
	Errors  PrecessionErrors    `json:"errors"`
	Work    PrecessionCertifier `json:"certifier"`
}

// PrecessionWitness is a state in one residue class with integer
// coefficients (plain decimal integers): Even[a] multiplies |2(3a+J0)>, Odd[b]
// multiplies |2(3b+K0)+1>. Rayleigh encloses <psi|Q3|psi>/<psi|psi>.
type PrecessionWitness struct {
	Residue  int               `json:"residue"`
	Even     []Decimal         `json:"even"`
	Odd      []Decimal         `json:"odd"`
	Rayleigh PrecessionBracket `json:"rayleigh"`
}

// PrecessionBracket is a closed interval of decimals.
type PrecessionBracket struct {
	Lower Decimal `json:"lower"`
	Upper Decimal `json:"upper"`
}

// PrecessionSector records the norm lemma for one residue class: the
// cutoff A, the length L of the exactly summed part, lambda and epsilon,
// with NormBound >= 1/2 + sqrt(lambda)/6 the resulting bound on
// sup spec Q3 restricted to the class.
type PrecessionSector struct {
	Residue   int     `json:"residue"`
	Cutoff    int     `json:"cutoff"`
	SumLength int     `json:"sum_length"`
	Lambda    Decimal `json:"lambda"`
	Epsilon   Decimal `json:"epsilon"`
	NormBound Decimal `json:"norm_bound"`
}

// PrecessionErrors are the certifier's error terms (upper bounds,
// informational): the largest tail bound added to an entry of the lemma's
// matrix H, the smallest proved eigenvalue margin of the lemma's matrix, and
// the largest rounding bound of an entry of the witness's matrix-vector
// product.
type PrecessionErrors struct {
	TailH       Decimal `json:"tail_h"`
	Margin      Decimal `json:"margin"`
	MatVecError Decimal `json:"matvec_error"`
}

// PrecessionCertifier is the certifier's account of its work
// (informational).
type PrecessionCertifier struct {
	Method string `json:"method"`
}

func (p *Precession) validate() error {
	if p.Problem != PrecessionProblem {
		return errors.New("precession: problem statement differs from the one this schema knows")
	}
	if p.Basis != PrecessionBasis {
		return errors.New("precession: basis differs from the one this schema knows")
	}
	var fs fields
	fs.add("lower", p.Lower)
	fs.add("upper", p.Upper)
	if err := fs.check(); err != nil {
		return err
	}
	if p.Lower.Cmp(p.Upper.Rat()) > 0 {
		return errors.New("precession: lower above upper")
	}
	w := p.Witness
	if w.Residue < 0 || w.Residue > 2 {
		return fmt.Errorf("precession: witness residue %d outside 0..2", w.Residue)
	}
	if len(w.Even) == 0 || len(w.Odd) == 0 || len(w.Even) > MaxPrecessionWitness || len(w.Odd) > MaxPrecessionWitness {
		return fmt.Errorf("precession: witness lengths %d, %d outside 1..%d", len(w.Even), len(w.Odd), MaxPrecessionWitness)
	}
	lim := new(big.Int).Lsh(big.NewInt(1), 53)
	for i, list := range [2][]Decimal{w.Even, w.Odd} {
		for j, d := range list {
			v := d.Rat()
			if v == nil || !v.IsInt() || v.Num().CmpAbs(lim) > 0 || v.Num().String() != d.text {
				return fmt.Errorf("precession: witness coefficient %d of part %d (%.30q) is not an integer of at most 2^53 in plain form", j, i, d.text)
			}
		}
	}
	fs.add("witness rayleigh lower", w.Rayleigh.Lower)
	fs.add("witness rayleigh upper", w.Rayleigh.Upper)
	if err := fs.check(); err != nil {
		return err
	}
	if w.Rayleigh.Lower.Cmp(w.Rayleigh.Upper.Rat()) > 0 || p.Lower.Cmp(w.Rayleigh.Lower.Rat()) > 0 {
		return errors.New("precession: lower is not at most the witness's Rayleigh enclosure")
	}
	if len(p.Sectors) != 3 {
		return fmt.Errorf("precession: %d sector proofs, need 3", len(p.Sectors))
	}
	for i, s := range p.Sectors {
		if s.Residue != i {
			return fmt.Errorf("precession: sector %d has residue %d", i, s.Residue)
		}
		if s.Cutoff < 1 || s.SumLength < s.Cutoff+3 || s.SumLength > MaxPrecessionLength {
			return fmt.Errorf("precession: sector %d: cutoff %d and sum length %d out of range", i, s.Cutoff, s.SumLength)
		}
		fs.add(fmt.Sprintf("sector %d lambda", i), s.Lambda)
		fs.add(fmt.Sprintf("sector %d epsilon", i), s.Epsilon)
		fs.add(fmt.Sprintf("sector %d norm_bound", i), s.NormBound)
		if err := fs.check(); err != nil {
			return err
		}
		if s.NormBound.Cmp(p.Upper.Rat()) > 0 {
			return fmt.Errorf("precession: upper is below the bound of sector %d", i)
		}
	}
	fs.add("tail_h", p.Errors.TailH)
	fs.add("margin", p.Errors.Margin)
	fs.add("matvec_error", p.Errors.MatVecError)
	return fs.check()
}
