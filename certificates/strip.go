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
	AlphaUsed Decimal `json:"alpha_used"`
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
	GalerkinLowest  Decimal `json:"galerkin_lowest"`
	GalerkinHighest Decimal `json:"galerkin_highest"`
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
	Value AlphaValue  `json:"value"`
	Lower Decimal     `json:"lower"`
	Upper Decimal     `json:"upper"`
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
	Lower Decimal `json:"lower"`
	Upper Decimal `json:"upper"`
}

// StripWitness is a state given by its BasisSize Legendre coefficients
// (exact decimals, written with exponents) and a recorded enclosure of its Rayleigh quotient
// <psi, k psi>/<psi, psi> at AlphaUsed.
type StripWitness struct {
	Coefficients []SciDecimal `json:"coefficients"`
	Rayleigh     StripBracket `json:"rayleigh"`
}

// StripErrors are upper bounds: AlphaRounding >= |alpha - AlphaUsed|/(2 pi),
// which bounds ||K_alpha - K_AlphaUsed|| (|d k/d alpha| <= 1/(2 pi) on
// [-1, 0]^2), and DiscardedPart >= ||k - P k P||. DiscardedEtaX and
// DiscardedEtaY are the Bernstein parameters (log rho > 0) of the ellipses
// the certifier bounded the discarded part on.
type StripErrors struct {
	AlphaRounding Decimal `json:"alpha_rounding"`
	DiscardedPart Decimal `json:"discarded_part"`
	DiscardedEtaX Decimal `json:"discarded_eta_x"`
	DiscardedEtaY Decimal `json:"discarded_eta_y"`
}

// StripCertifier is the certifier's own account (informational): its
// quadrature, the float eigenvalue estimates of its midpoint matrix, the
// shifts and residuals of its semidefiniteness proofs, its entry error
// terms and the width it aimed at. All error terms are upper bounds.
type StripCertifier struct {
	Method                     string     `json:"method"`
	WidthTarget                SciDecimal `json:"width_target"`
	QuadratureNodes            int        `json:"quadrature_nodes"`
	QuadratureEta              Decimal    `json:"quadrature_eta"`
	LowestEstimate             Decimal    `json:"lowest_estimate"`
	HighestEstimate            Decimal    `json:"highest_estimate"`
	EntryRounding              Decimal    `json:"entry_rounding"`
	EntryQuadrature            Decimal    `json:"entry_quadrature"`
	LowestShift                Decimal    `json:"lowest_shift"`
	LowestResidual             Decimal    `json:"lowest_cholesky_residual"`
	HighestShift               Decimal    `json:"highest_shift"`
	HighestResidual            Decimal    `json:"highest_cholesky_residual"`
	AdvantageWitnessQuadrature Decimal    `json:"advantage_witness_quadrature"`
	DeficitWitnessQuadrature   Decimal    `json:"deficit_witness_quadrature"`
}

// check checks an alpha section: the value, its positive enclosure
// [Lower, Upper] and, when units are given, that they name all three
// quantities and the value is of the form 2*pi*r.
func (a *StripAlpha) check(name string) error {
	var fs fields
	fs.add(name+".value", a.Value)
	fs.add(name+".lower", a.Lower)
	fs.add(name+".upper", a.Upper)
	if err := fs.check(); err != nil {
		return err
	}
	if a.Units != nil && !a.Value.TwoPi() {
		return fmt.Errorf("%s: physical units are given but the value %q is not of the form 2*pi*r", name, a.Value)
	}
	if a.Lower.Sign() <= 0 || a.Lower.Cmp(a.Upper.Rat()) > 0 {
		return fmt.Errorf("%s: [%s, %s] is not a positive interval", name, a.Lower, a.Upper)
	}
	if u := a.Units; u != nil {
		if strings.TrimSpace(u.Mass) == "" || strings.TrimSpace(u.Length) == "" || strings.TrimSpace(u.Time) == "" {
			return fmt.Errorf("%s.units: mass, length and time must all be given", name)
		}
	}
	return nil
}

func (s *Strip) validate() error {
	if err := s.Alpha.check("strip.alpha"); err != nil {
		return err
	}
	var fs fields
	fs.add("strip.alpha_used", s.AlphaUsed)
	if err := fs.check(); err != nil {
		return err
	}
	if s.AlphaUsed.Sign() <= 0 {
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
			fs.add(fmt.Sprintf("%s.coefficients[%d]", w.name, i), c)
			nonzero = nonzero || c.Sign() != 0
		}
		if err := fs.check(); err != nil {
			return err
		}
		if !nonzero {
			return fmt.Errorf("%s: the zero vector is not a state", w.name)
		}
	}
	fs.add("strip.galerkin_lowest", s.GalerkinLowest)
	fs.add("strip.galerkin_highest", s.GalerkinHighest)
	if err := fs.check(); err != nil {
		return err
	}
	if s.GalerkinLowest.Cmp(s.GalerkinHighest.Rat()) > 0 {
		return errors.New("strip: galerkin_lowest exceeds galerkin_highest")
	}
	for _, f := range []struct {
		v Decimal
		n string
	}{
		{s.Errors.AlphaRounding, "strip.errors.alpha_rounding"}, {s.Errors.DiscardedPart, "strip.errors.discarded_part"},
		{s.Certifier.EntryRounding, "strip.certifier.entry_rounding"}, {s.Certifier.EntryQuadrature, "strip.certifier.entry_quadrature"},
		{s.Certifier.LowestShift, "strip.certifier.lowest_shift"}, {s.Certifier.LowestResidual, "strip.certifier.lowest_cholesky_residual"},
		{s.Certifier.HighestShift, "strip.certifier.highest_shift"}, {s.Certifier.HighestResidual, "strip.certifier.highest_cholesky_residual"},
		{s.Certifier.AdvantageWitnessQuadrature, "strip.certifier.advantage_witness_quadrature"},
		{s.Certifier.DeficitWitnessQuadrature, "strip.certifier.deficit_witness_quadrature"},
	} {
		fs.add(f.n, f.v)
		if err := fs.check(); err != nil {
			return err
		}
		if f.v.Sign() < 0 {
			return fmt.Errorf("%s is negative", f.n)
		}
	}
	for _, f := range []struct {
		v interface {
			IsSet() bool
			Sign() int
		}
		n string
	}{
		{s.Errors.DiscardedEtaX, "strip.errors.discarded_eta_x"}, {s.Errors.DiscardedEtaY, "strip.errors.discarded_eta_y"},
		{s.Certifier.QuadratureEta, "strip.certifier.quadrature_eta"}, {s.Certifier.WidthTarget, "strip.certifier.width_target"},
	} {
		fs.add(f.n, f.v)
		if err := fs.check(); err != nil {
			return err
		}
		if f.v.Sign() <= 0 {
			return fmt.Errorf("%s must be positive", f.n)
		}
	}
	fs.add("strip.certifier.lowest_estimate", s.Certifier.LowestEstimate)
	fs.add("strip.certifier.highest_estimate", s.Certifier.HighestEstimate)
	if err := fs.check(); err != nil {
		return err
	}
	if s.Certifier.QuadratureNodes < 0 {
		return errors.New("strip.certifier.quadrature_nodes is negative")
	}
	return nil
}

func (b StripBracket) validate(name string) error {
	var fs fields
	fs.add(name+".lower", b.Lower)
	fs.add(name+".upper", b.Upper)
	if err := fs.check(); err != nil {
		return err
	}
	if b.Lower.Cmp(b.Upper.Rat()) > 0 {
		return fmt.Errorf("%s: lower %s exceeds upper %s", name, b.Lower, b.Upper)
	}
	return nil
}

// StripLimits are the right-hand sides of the four inequalities the
// brackets rest on (see Strip), computed exactly from the recorded
// numbers: Advantage.Lower <= AdvLower, Advantage.Upper >= AdvUpper,
// Deficit.Lower <= DefLower, Deficit.Upper >= DefUpper.
type StripLimits struct {
	AdvLower, AdvUpper, DefLower, DefUpper *big.Rat
}

// Limits computes the StripLimits of s from its witnesses' Rayleigh
// enclosures, Galerkin bounds and error terms (e = alpha_rounding,
// t = discarded_part):
//
//	AdvLower = max(-(AdvantageWitness.Rayleigh.Upper + e), 0)
//	AdvUpper = -(min(GalerkinLowest, 0) - t - e)
//	DefLower = max(DeficitWitness.Rayleigh.Lower - e, 0)
//	DefUpper = max(GalerkinHighest, 0) + t + e
func (s *Strip) Limits() (StripLimits, error) {
	var fs fields
	fs.add("strip.errors.alpha_rounding", s.Errors.AlphaRounding)
	fs.add("strip.errors.discarded_part", s.Errors.DiscardedPart)
	fs.add("strip.galerkin_lowest", s.GalerkinLowest)
	fs.add("strip.galerkin_highest", s.GalerkinHighest)
	fs.add("strip.advantage_witness.rayleigh.upper", s.AdvantageWitness.Rayleigh.Upper)
	fs.add("strip.deficit_witness.rayleigh.lower", s.DeficitWitness.Rayleigh.Lower)
	if err := fs.check(); err != nil {
		return StripLimits{}, err
	}
	e, t := s.Errors.AlphaRounding.Rat(), s.Errors.DiscardedPart.Rat()
	zero := new(big.Rat)
	maxR := func(a, b *big.Rat) *big.Rat {
		if a.Cmp(b) >= 0 {
			return a
		}
		return b
	}
	minR := func(a, b *big.Rat) *big.Rat {
		if a.Cmp(b) <= 0 {
			return a
		}
		return b
	}
	add := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Add(a, b) }
	sub := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Sub(a, b) }
	return StripLimits{
		AdvLower: maxR(new(big.Rat).Neg(add(s.AdvantageWitness.Rayleigh.Upper.Rat(), e)), zero),
		AdvUpper: add(sub(t, minR(s.GalerkinLowest.Rat(), zero)), e),
		DefLower: maxR(sub(s.DeficitWitness.Rayleigh.Lower.Rat(), e), zero),
		DefUpper: add(add(maxR(s.GalerkinHighest.Rat(), zero), t), e),
	}, nil
}

// CheckBrackets reports, exactly, whether the recorded brackets satisfy
// the four inequalities of Limits; the error names the first that fails.
func (s *Strip) CheckBrackets() error {
	l, err := s.Limits()
	if err != nil {
		return err
	}
	for _, c := range []struct {
		name   string
		have   Decimal
		atMost bool // have <= limit, else have >= limit
		limit  *big.Rat
		text   string
	}{
		{"advantage.lower", s.Advantage.Lower, true, l.AdvLower, "max(-(advantage witness Rayleigh upper + alpha rounding), 0)"},
		{"deficit.lower", s.Deficit.Lower, true, l.DefLower, "max(deficit witness Rayleigh lower - alpha rounding, 0)"},
		{"advantage.upper", s.Advantage.Upper, false, l.AdvUpper, "-(min(galerkin_lowest, 0) - discarded part - alpha rounding)"},
		{"deficit.upper", s.Deficit.Upper, false, l.DefUpper, "max(galerkin_highest, 0) + discarded part + alpha rounding"},
	} {
		if !c.have.IsSet() {
			return fmt.Errorf("strip.%s: missing number", c.name)
		}
		cmp := c.have.Cmp(c.limit)
		if c.atMost && cmp > 0 || !c.atMost && cmp < 0 {
			rel := ">="
			if c.atMost {
				rel = "<="
			}
			return fmt.Errorf("strip.%s = %s does not satisfy %s %s, which the recorded numbers give as %s", c.name, c.have, rel, c.text, c.limit.FloatString(20))
		}
	}
	return nil
}
