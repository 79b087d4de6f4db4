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
// empty piece), coefficients in that order. Threshold and cell ends are
// exact decimals.
type Matched struct {
	Alpha     StripAlpha       `json:"alpha"`
	Lower     string           `json:"lower"`
	Upper     string           `json:"upper"`
	Witness   MatchedWitness   `json:"witness"`
	Cells     []MatchedCell    `json:"cells"`
	Statement string           `json:"statement"`
	Certifier MatchedCertifier `json:"certifier"`
}

// MatchedWitness is the inner-side state at threshold V.
type MatchedWitness struct {
	V            string   `json:"v"`
	Sizes        [2]int   `json:"sizes"`
	Coefficients []string `json:"coefficients"`
	Rayleigh     string   `json:"rayleigh"`
}

// MatchedCell claims lambda_max(C_Lo - 1[x > Hi]) <= Upper; Sizes is the
// basis the certifier used (a verifier may use it).
type MatchedCell struct {
	Lo    string `json:"lo"`
	Hi    string `json:"hi"`
	Sizes [2]int `json:"sizes"`
	Upper string `json:"upper"`
}

// MatchedCertifier is informational.
type MatchedCertifier struct {
	Method      string `json:"method"`
	WidthTarget string `json:"width_target"`
	Estimate    string `json:"estimate"`
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
	if _, twoPi, err := ParseStripAlpha(m.Alpha.Value); err != nil {
		return fmt.Errorf("matched.alpha: %v", err)
	} else if m.Alpha.Units != nil && !twoPi {
		return errors.New("matched.alpha: physical units are given but the value is not of the form 2*pi*r")
	}
	lo, err := Dec(m.Lower, "matched.lower")
	if err != nil {
		return err
	}
	hi, err := Dec(m.Upper, "matched.upper")
	if err != nil {
		return err
	}
	if lo.Cmp(hi) > 0 {
		return errors.New("matched: lower exceeds upper")
	}
	for _, f := range []struct{ v, n string }{{m.Alpha.Lower, "matched.alpha.lower"}, {m.Alpha.Upper, "matched.alpha.upper"}, {m.Witness.Rayleigh, "matched.witness.rayleigh"}} {
		if _, err := Dec(f.v, f.n); err != nil {
			return err
		}
	}
	v, err := Dec(m.Witness.V, "matched.witness.v")
	if err != nil {
		return err
	}
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
		r, err := Dec(c, fmt.Sprintf("matched.witness.coefficients[%d]", i))
		if err != nil {
			return err
		}
		nonzero = nonzero || r.Sign() != 0
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
		a, err := Dec(c.Lo, name+".lo")
		if err != nil {
			return err
		}
		b, err := Dec(c.Hi, name+".hi")
		if err != nil {
			return err
		}
		if a.Cmp(prev) != 0 || a.Cmp(b) >= 0 {
			return fmt.Errorf("%s: [%s, %s] does not continue the cover at %s", name, c.Lo, c.Hi, prev.RatString())
		}
		if _, err := Dec(c.Upper, name+".upper"); err != nil {
			return err
		}
		if err := checkSizes(c.Sizes, b, name); err != nil {
			return err
		}
		prev = b
	}
	if prev.Sign() != 0 {
		return errors.New("matched.cells: the cover does not end at 0")
	}
	return nil
}
