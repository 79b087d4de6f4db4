package certificates

import (
	"errors"
	"fmt"
	"math/big"
	"strings"
)

// StripBasis is the only witness basis this schema version knows: the
// orthonormal Legendre polynomials on [-1, 0] for the real kernel, and the
// unitary link to K_alpha. A strip certificate must record it verbatim.
const StripBasis = "psi(x) = sum_j c_j sqrt(2j+1) P_j(2x+1) on [-1,0] (orthonormal Legendre) is the state for the real kernel -sin(alpha(x^2-y^2)/4)/(pi(x-y)); the state for K_alpha is exp(-i alpha x^2/4) psi(x)"

// MaxStripBasis is the largest basis size a strip certificate may record.
const MaxStripBasis = 20000

// Strip is the finite-strip bracket section. It proves
//
//	Advantage.Lower <= A(alpha) = -inf spec K_alpha <= Advantage.Upper,
//	Deficit.Lower   <= sup spec K_alpha               <= Deficit.Upper,
//
// for K_alpha(x, y) = (exp(-i alpha (x^2-y^2)/2) - 1)/(2 pi i (x - y)) on
// L^2[-1, 0], which multiplication by exp(-i alpha x^2/4) makes unitarily
// equivalent to the real kernel k(x, y) = -sin(alpha (x^2-y^2)/4)/(pi (x-y)).
// Everything below refers to k at AlphaUsed (a float64 written exactly)
// and to the Legendre basis StripBasis of size BasisSize; P is the
// orthogonal projection onto polynomials of degree < BasisSize and G the
// exact BasisSize x BasisSize Galerkin matrix of k. The brackets follow from
// the other recorded numbers alone:
//
//	Advantage.Lower <= max(-(AdvantageWitness.Rayleigh.Upper + e), 0)
//	Deficit.Lower   <= max(DeficitWitness.Rayleigh.Lower - e, 0)
//	Advantage.Upper >= -(min(GalerkinLowest, 0) - t - e)
//	Deficit.Upper   >= max(GalerkinHighest, 0) + t + e
//
// with e = Errors.AlphaRounding and t = Errors.DiscardedPart; a verifier
// checks these inequalities exactly and re-derives every number on the
// right by its own computation.
type Strip struct {
	// Alpha is the parameter as the user gave it.
	Alpha StripAlpha `json:"alpha"`
	// AlphaUsed is the float64 value of alpha the kernel was evaluated at,
	// written exactly.
	AlphaUsed string `json:"alpha_used"`
	// Basis must equal StripBasis; BasisSize is N.
	Basis     string `json:"basis"`
	BasisSize int    `json:"basis_size"`
	// Advantage and Deficit are the claims.
	Advantage StripBracket `json:"advantage"`
	Deficit   StripBracket `json:"deficit"`
	// AdvantageWitness is a state whose Rayleigh quotient for k lies near
	// inf spec k; DeficitWitness one near sup spec k.
	AdvantageWitness StripWitness `json:"advantage_witness"`
	DeficitWitness   StripWitness `json:"deficit_witness"`
	// GalerkinLowest and GalerkinHighest claim
	// GalerkinLowest <= lambda_min(G) and lambda_max(G) <= GalerkinHighest.
	GalerkinLowest  string `json:"galerkin_lowest"`
	GalerkinHighest string `json:"galerkin_highest"`
	// Errors are the two error terms the brackets use.
	Errors StripErrors `json:"errors"`
	// Statement says in words what is proved.
	Statement string `json:"statement"`
	// Certifier records how the certifier reached its numbers; a verifier
	// need not trust or use any of it.
	Certifier StripCertifier `json:"certifier"`
}

// StripAlpha is alpha = m L^2/(hbar t): Value is exact, either a positive
// decimal or fraction p/q, or "2*pi*" followed by one (the form that comes
// from physical units, hbar = h/(2 pi) with the exact SI h). Lower and Upper
// are decimals enclosing it. Units, when present, are the physical input.
type StripAlpha struct {
	Value string      `json:"value"`
	Lower string      `json:"lower"`
	Upper string      `json:"upper"`
	Units *StripUnits `json:"units,omitempty"`
}

// StripUnits is the physical input: a number followed by a unit, mass in
// kg, g, mg or u (unified atomic mass unit, CODATA 2018 value
// 1.66053906660e-27 kg), length in m, mm, um or nm, time in s, ms, us or
// ns; alpha = 2 pi m L^2/(h t) with h = 6.62607015e-34 J s.
type StripUnits struct {
	Mass   string `json:"mass"`
	Length string `json:"length"`
	Time   string `json:"time"`
}

// StripBracket is the closed interval [Lower, Upper] of decimals.
type StripBracket struct {
	Lower string `json:"lower"`
	Upper string `json:"upper"`
}

// StripWitness is a state given by its BasisSize Legendre coefficients
// (exact decimals) and a recorded enclosure of its Rayleigh quotient
// <psi, k psi>/<psi, psi> at AlphaUsed.
type StripWitness struct {
	Coefficients []string     `json:"coefficients"`
	Rayleigh     StripBracket `json:"rayleigh"`
}

// StripErrors are upper bounds: AlphaRounding >= |alpha - AlphaUsed|/(2 pi),
// which bounds ||K_alpha - K_AlphaUsed|| (|d k/d alpha| <= 1/(2 pi) on
// [-1, 0]^2), and DiscardedPart >= ||k - P k P||. DiscardedEtaX and
// DiscardedEtaY are the Bernstein parameters (log rho > 0) of the ellipses
// the certifier bounded the discarded part on.
type StripErrors struct {
	AlphaRounding string `json:"alpha_rounding"`
	DiscardedPart string `json:"discarded_part"`
	DiscardedEtaX string `json:"discarded_eta_x"`
	DiscardedEtaY string `json:"discarded_eta_y"`
}

// StripCertifier is the certifier's own account (informational): its
// quadrature, the float eigenvalue estimates of its midpoint matrix, the
// shifts and residuals of its semidefiniteness proofs, its entry error
// terms and the width it aimed at. All error terms are upper bounds.
type StripCertifier struct {
	Method                     string `json:"method"`
	WidthTarget                string `json:"width_target"`
	QuadratureNodes            int    `json:"quadrature_nodes"`
	QuadratureEta              string `json:"quadrature_eta"`
	LowestEstimate             string `json:"lowest_estimate"`
	HighestEstimate            string `json:"highest_estimate"`
	EntryRounding              string `json:"entry_rounding"`
	EntryQuadrature            string `json:"entry_quadrature"`
	LowestShift                string `json:"lowest_shift"`
	LowestResidual             string `json:"lowest_cholesky_residual"`
	HighestShift               string `json:"highest_shift"`
	HighestResidual            string `json:"highest_cholesky_residual"`
	AdvantageWitnessQuadrature string `json:"advantage_witness_quadrature"`
	DeficitWitnessQuadrature   string `json:"deficit_witness_quadrature"`
}

// StripTwoPiPrefix marks an alpha value that is 2 pi times a rational.
const StripTwoPiPrefix = "2*pi*"

// ParseStripAlpha reads an alpha value: it returns the rational r and
// whether alpha = 2 pi r (otherwise alpha = r). r must be positive.
func ParseStripAlpha(s string) (r *big.Rat, twoPi bool, err error) {
	t := s
	if strings.HasPrefix(t, StripTwoPiPrefix) {
		t, twoPi = t[len(StripTwoPiPrefix):], true
	}
	r, err = Frac(t, "strip.alpha.value")
	if err != nil {
		return nil, false, err
	}
	if r.Sign() <= 0 {
		return nil, false, fmt.Errorf("strip.alpha.value %q is not positive", s)
	}
	return r, twoPi, nil
}

func (s *Strip) validate() error {
	if _, twoPi, err := ParseStripAlpha(s.Alpha.Value); err != nil {
		return err
	} else if s.Alpha.Units != nil && !twoPi {
		return fmt.Errorf("strip.alpha: physical units are given but the value %q is not of the form 2*pi*r", s.Alpha.Value)
	}
	lo, err := Dec(s.Alpha.Lower, "strip.alpha.lower")
	if err != nil {
		return err
	}
	hi, err := Dec(s.Alpha.Upper, "strip.alpha.upper")
	if err != nil {
		return err
	}
	if lo.Sign() <= 0 || lo.Cmp(hi) > 0 {
		return fmt.Errorf("strip.alpha: [%s, %s] is not a positive interval", s.Alpha.Lower, s.Alpha.Upper)
	}
	if u := s.Alpha.Units; u != nil {
		if strings.TrimSpace(u.Mass) == "" || strings.TrimSpace(u.Length) == "" || strings.TrimSpace(u.Time) == "" {
			return errors.New("strip.alpha.units: mass, length and time must all be given")
		}
	}
	au, err := Dec(s.AlphaUsed, "strip.alpha_used")
	if err != nil {
		return err
	}
	if au.Sign() <= 0 {
		return errors.New("strip.alpha_used must be positive")
	}
	if s.Basis != StripBasis {
		return fmt.Errorf("strip.basis: unknown basis %.60q (this version knows only the orthonormal Legendre basis on [-1,0])", s.Basis)
	}
	if s.BasisSize < 1 || s.BasisSize > MaxStripBasis {
		return fmt.Errorf("strip.basis_size %d is outside 1..%d", s.BasisSize, MaxStripBasis)
	}
	for _, b := range []struct {
		b    StripBracket
		name string
	}{{s.Advantage, "strip.advantage"}, {s.Deficit, "strip.deficit"},
		{s.AdvantageWitness.Rayleigh, "strip.advantage_witness.rayleigh"}, {s.DeficitWitness.Rayleigh, "strip.deficit_witness.rayleigh"}} {
		if err := b.b.validate(b.name); err != nil {
			return err
		}
	}
	for _, w := range []struct {
		w    StripWitness
		name string
	}{{s.AdvantageWitness, "strip.advantage_witness"}, {s.DeficitWitness, "strip.deficit_witness"}} {
		if len(w.w.Coefficients) != s.BasisSize {
			return fmt.Errorf("%s: %d coefficients for basis size %d", w.name, len(w.w.Coefficients), s.BasisSize)
		}
		nonzero := false
		for i, c := range w.w.Coefficients {
			v, err := Dec(c, fmt.Sprintf("%s.coefficients[%d]", w.name, i))
			if err != nil {
				return err
			}
			nonzero = nonzero || v.Sign() != 0
		}
		if !nonzero {
			return fmt.Errorf("%s: the zero vector is not a state", w.name)
		}
	}
	gl, err := Dec(s.GalerkinLowest, "strip.galerkin_lowest")
	if err != nil {
		return err
	}
	gh, err := Dec(s.GalerkinHighest, "strip.galerkin_highest")
	if err != nil {
		return err
	}
	if gl.Cmp(gh) > 0 {
		return errors.New("strip: galerkin_lowest exceeds galerkin_highest")
	}
	for _, f := range []struct{ v, n string }{
		{s.Errors.AlphaRounding, "strip.errors.alpha_rounding"}, {s.Errors.DiscardedPart, "strip.errors.discarded_part"},
		{s.Certifier.EntryRounding, "strip.certifier.entry_rounding"}, {s.Certifier.EntryQuadrature, "strip.certifier.entry_quadrature"},
		{s.Certifier.LowestShift, "strip.certifier.lowest_shift"}, {s.Certifier.LowestResidual, "strip.certifier.lowest_cholesky_residual"},
		{s.Certifier.HighestShift, "strip.certifier.highest_shift"}, {s.Certifier.HighestResidual, "strip.certifier.highest_cholesky_residual"},
		{s.Certifier.AdvantageWitnessQuadrature, "strip.certifier.advantage_witness_quadrature"},
		{s.Certifier.DeficitWitnessQuadrature, "strip.certifier.deficit_witness_quadrature"},
	} {
		v, err := Dec(f.v, f.n)
		if err != nil {
			return err
		}
		if v.Sign() < 0 {
			return fmt.Errorf("%s is negative", f.n)
		}
	}
	for _, f := range []struct{ v, n string }{
		{s.Errors.DiscardedEtaX, "strip.errors.discarded_eta_x"}, {s.Errors.DiscardedEtaY, "strip.errors.discarded_eta_y"},
		{s.Certifier.QuadratureEta, "strip.certifier.quadrature_eta"}, {s.Certifier.WidthTarget, "strip.certifier.width_target"},
	} {
		v, err := Dec(f.v, f.n)
		if err != nil {
			return err
		}
		if v.Sign() <= 0 {
			return fmt.Errorf("%s must be positive", f.n)
		}
	}
	for _, f := range []struct{ v, n string }{
		{s.Certifier.LowestEstimate, "strip.certifier.lowest_estimate"}, {s.Certifier.HighestEstimate, "strip.certifier.highest_estimate"},
	} {
		if _, err := Dec(f.v, f.n); err != nil {
			return err
		}
	}
	if s.Certifier.QuadratureNodes < 0 {
		return errors.New("strip.certifier.quadrature_nodes is negative")
	}
	return nil
}

func (b StripBracket) validate(name string) error {
	lo, err := Dec(b.Lower, name+".lower")
	if err != nil {
		return err
	}
	hi, err := Dec(b.Upper, name+".upper")
	if err != nil {
		return err
	}
	if lo.Cmp(hi) > 0 {
		return fmt.Errorf("%s: lower %s exceeds upper %s", name, b.Lower, b.Upper)
	}
	return nil
}
