package certificates

import (
	"errors"
	"fmt"
	"math/big"
)

// KindMatched brackets the matched position-and-momentum advantage.
const KindMatched = "matched-bracket"

// MaxMatchedCells and MaxMatchedBasis cap what a matched certificate may
// record.
const (
	MaxMatchedCells = 100000
	MaxMatchedBasis = 4000
)

// Matched is the matched-advantage section. With
// K_alpha(x, y) = (exp(-i alpha (x^2-y^2)/2) - 1)/(2 pi i (x - y)) on
// L^2[-1, 0] and, for a threshold v in [-1, 0], the operator
//
//	S_v = C_v - 1[x > v],  C_a(x, y) = sin(alpha ((x-a)^2 - (y-a)^2)/4)/(pi (x - y)),
//
// the matched advantage is M(alpha) = sup over v in [-1, 0] of
// lambda_max(S_v) (certify/matched/doc.go). It claims
// Lower <= M(alpha) <= Upper:
//
//	Lower <= Witness.Rayleigh <= <psi, S_V psi>/<psi, psi>
//	      for the witness state psi at V = Witness.V;
//	Upper >= Cells[i].Upper >= lambda_max(C_lo - 1[x > hi])
//	      >= lambda_max(S_v) for v in [lo, hi] (monotonicity),
//
// with the cells contiguous from -1 to 0. Basis: orthonormal Legendre
// polynomials sqrt((2j+1)/(hi-lo)) P_j((2x - lo - hi)/(hi - lo)) on each
// piece [-1, s] and [s, 0] of the split at s (the witness's V, a cell's
// Hi), Sizes[0] on the first piece and Sizes[1] on the second (0 for an
// empty piece), coefficients in that order. Threshold, cell ends and
// coefficients are floats written exactly (SciDecimal).
type Matched struct {
	Alpha     StripAlpha       `json:"alpha"`
	Lower     Decimal          `json:"lower"`
	Upper     Decimal          `json:"upper"`
	Witness   MatchedWitness   `json:"witness"`
	Cells     []MatchedCell    `json:"cells"`
	Statement string           `json:"statement"`
	Certifier MatchedCertifier `json:"certifier"`
}

// MatchedWitness is the inner-side state at threshold V.
type MatchedWitness struct {
	V            SciDecimal   `json:"v"`
	Sizes        [2]int       `json:"sizes"`
	Coefficients []SciDecimal `json:"coefficients"`
	Rayleigh     Decimal      `json:"rayleigh"`
}

// MatchedCell claims lambda_max(C_Lo - 1[x > Hi]) <= Upper; Sizes is the
// basis the certifier used (a verifier may use it).
type MatchedCell struct {
	Lo    SciDecimal `json:"lo"`
	Hi    SciDecimal `json:"hi"`
	Sizes [2]int     `json:"sizes"`
	Upper Decimal    `json:"upper"`
}

// MatchedCertifier is informational.
type MatchedCertifier struct {
	Method      string     `json:"method"`
	WidthTarget SciDecimal `json:"width_target"`
	Estimate    SciDecimal `json:"estimate"`
}

func checkSizes(s [2]int, split *big.Rat, name string) error {
	for i, n := range s {
		if n < 0 || n > MaxMatchedBasis {
			return fmt.Errorf("%s.sizes[%d] = %d is outside 0..%d", name, i, n, MaxMatchedBasis)
		}
	}
	minus1 := big.NewRat(-1, 1)
	if (split.Cmp(minus1) > 0) != (s[0] > 0) || (split.Sign() < 0) != (s[1] > 0) {
		return fmt.Errorf("%s.sizes %v: a piece is empty exactly when the split is at its end", name, s)
	}
	return nil
}

func (m *Matched) validate() error {
	if err := m.Alpha.check("matched.alpha"); err != nil {
		return err
	}
	var fs fields
	fs.add("matched.lower", m.Lower)
	fs.add("matched.upper", m.Upper)
	fs.add("matched.witness.rayleigh", m.Witness.Rayleigh)
	fs.add("matched.witness.v", m.Witness.V)
	fs.add("matched.certifier.width_target", m.Certifier.WidthTarget)
	fs.add("matched.certifier.estimate", m.Certifier.Estimate)
	if err := fs.check(); err != nil {
		return err
	}
	if m.Lower.Cmp(m.Upper.Rat()) > 0 {
		return errors.New("matched: lower exceeds upper")
	}
	v := m.Witness.V.Rat()
	if v.Cmp(big.NewRat(-1, 1)) < 0 || v.Sign() > 0 {
		return errors.New("matched.witness.v is outside [-1, 0]")
	}
	if err := checkSizes(m.Witness.Sizes, v, "matched.witness"); err != nil {
		return err
	}
	if len(m.Witness.Coefficients) != m.Witness.Sizes[0]+m.Witness.Sizes[1] {
		return errors.New("matched.witness: the number of coefficients is not the sum of the sizes")
	}
	nonzero := false
	for i, c := range m.Witness.Coefficients {
		fs.add(fmt.Sprintf("matched.witness.coefficients[%d]", i), c)
		nonzero = nonzero || c.Sign() != 0
	}
	if err := fs.check(); err != nil {
		return err
	}
	if !nonzero {
		return errors.New("matched.witness: the zero vector is not a state")
	}
	if len(m.Cells) == 0 || len(m.Cells) > MaxMatchedCells {
		return fmt.Errorf("matched.cells: %d cells is outside 1..%d", len(m.Cells), MaxMatchedCells)
	}
	prev := big.NewRat(-1, 1)
	for i, c := range m.Cells {
		name := fmt.Sprintf("matched.cells[%d]", i)
		fs.add(name+".lo", c.Lo)
		fs.add(name+".hi", c.Hi)
		fs.add(name+".upper", c.Upper)
		if err := fs.check(); err != nil {
			return err
		}
		if c.Lo.Cmp(prev) != 0 || c.Lo.Cmp(c.Hi.Rat()) >= 0 {
			return fmt.Errorf("%s: [%s, %s] does not continue the cover at %s", name, c.Lo, c.Hi, FractionText(prev))
		}
		if err := checkSizes(c.Sizes, c.Hi.Rat(), name); err != nil {
			return err
		}
		prev = c.Hi.Rat()
	}
	if prev.Sign() != 0 {
		return errors.New("matched.cells: the cover does not end at 0")
	}
	return nil
}
