package strip

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// certDigits is the number of significant digits of the bracket ends in a
// certificate.
const certDigits = 17

// Certificate converts the result into an unsealed certificate of kind
// strip-bracket (certificates.WriteFile seals and writes it).
//
// The brackets in the certificate are recomputed from the recorded,
// rounded numbers in exact rational arithmetic, so that they follow from
// what the certificate says and nothing else (see certificates.Strip):
//
//	advantage = [max(-(R_min.upper + e), 0), -(min(g_low, 0) - t - e)]
//	deficit   = [max(R_max.lower - e, 0),    max(g_high, 0) + t + e]
//
// with the recorded Rayleigh enclosures R, Galerkin bounds g, discarded
// part t and alpha rounding e, each end rounded outward to 17 significant
// digits. The lower ends agree with the float64 enclosures AdvantageF and
// DeficitF to a few units of the 17th digit; the upper ends can be higher
// by the rounding of the recorded error terms (6 significant digits,
// rounded up), about 1e-5 of the discarded part. Witness coefficients are
// written as exact decimals of their float64 values.
func (r *Result) Certificate() (*certificates.Certificate, error) {
	if r == nil || r.BasisSize < 1 {
		return nil, errors.New("strip: no result to certify")
	}
	if r.Basis != certificates.StripBasis {
		return nil, errors.New("strip: the result's basis is not the one the certificate schema knows")
	}
	num := func(s, name string) (*big.Rat, error) {
		v, err := certificates.Dec(s, name)
		if err != nil {
			return nil, fmt.Errorf("strip: cannot certify: %v", err)
		}
		return v, nil
	}
	e, err := num(r.Errors.AlphaRounding, "alpha_rounding")
	if err != nil {
		return nil, err
	}
	t, err := num(r.Errors.DiscardedPart, "discarded_part")
	if err != nil {
		return nil, err
	}
	gl, err := num(r.GalerkinLowest, "galerkin_lowest")
	if err != nil {
		return nil, err
	}
	gh, err := num(r.GalerkinHighest, "galerkin_highest")
	if err != nil {
		return nil, err
	}
	rMinHi, err := num(r.AdvantageWitness.Rayleigh.Upper, "advantage_witness.rayleigh.upper")
	if err != nil {
		return nil, err
	}
	rMaxLo, err := num(r.DeficitWitness.Rayleigh.Lower, "deficit_witness.rayleigh.lower")
	if err != nil {
		return nil, err
	}
	zero := new(big.Rat)
	ratMax := func(a, b *big.Rat) *big.Rat {
		if a.Cmp(b) >= 0 {
			return a
		}
		return b
	}
	ratMin := func(a, b *big.Rat) *big.Rat {
		if a.Cmp(b) <= 0 {
			return a
		}
		return b
	}
	add := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Add(a, b) }
	sub := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Sub(a, b) }
	advLo := ratMax(new(big.Rat).Neg(add(rMinHi, e)), zero)
	advHi := add(sub(t, ratMin(gl, zero)), e)
	defLo := ratMax(sub(rMaxLo, e), zero)
	defHi := add(add(ratMax(gh, zero), t), e)
	if advLo.Cmp(advHi) > 0 || defLo.Cmp(defHi) > 0 {
		return nil, errors.New("strip: cannot certify: the recorded numbers give an empty bracket")
	}
	adv := certificates.StripBracket{Lower: ratDown(advLo, certDigits), Upper: ratUp(advHi, certDigits)}
	def := certificates.StripBracket{Lower: ratDown(defLo, certDigits), Upper: ratUp(defHi, certDigits)}

	var units *certificates.StripUnits
	if u := r.Alpha.Units; u != nil {
		units = &certificates.StripUnits{Mass: u.Mass, Length: u.Length, Time: u.Time}
	}
	s := &certificates.Strip{
		Alpha:     certificates.StripAlpha{Value: r.Alpha.Value, Lower: r.Alpha.Lower, Upper: r.Alpha.Upper, Units: units},
		AlphaUsed: r.AlphaUsed,
		Basis:     r.Basis,
		BasisSize: r.BasisSize,
		Advantage: adv,
		Deficit:   def,
		AdvantageWitness: certificates.StripWitness{
			Coefficients: exactDecimals(r.AdvantageWitness.Coefficients),
			Rayleigh:     certificates.StripBracket(r.AdvantageWitness.Rayleigh),
		},
		DeficitWitness: certificates.StripWitness{
			Coefficients: exactDecimals(r.DeficitWitness.Coefficients),
			Rayleigh:     certificates.StripBracket(r.DeficitWitness.Rayleigh),
		},
		GalerkinLowest:  r.GalerkinLowest,
		GalerkinHighest: r.GalerkinHighest,
		Errors: certificates.StripErrors{
			AlphaRounding: r.Errors.AlphaRounding,
			DiscardedPart: r.Errors.DiscardedPart,
			DiscardedEtaX: r.Ellipses.TailX,
			DiscardedEtaY: r.Ellipses.TailY,
		},
		Statement: fmt.Sprintf("For K_alpha(x,y) = (exp(-i alpha (x^2-y^2)/2) - 1)/(2 pi i (x-y)) on L^2[-1,0] with alpha = %s: "+
			"the advantage A(alpha) = -inf spec K_alpha lies in [%s, %s] and sup spec K_alpha lies in [%s, %s]",
			r.Alpha.Value, adv.Lower, adv.Upper, def.Lower, def.Upper),
		Certifier: certificates.StripCertifier{
			Method:                     "Gauss-Legendre Galerkin matrix with a Bernstein-ellipse remainder; float Cholesky factors with interval residuals for the Galerkin bounds; Chebyshev-coefficient bound for the discarded part",
			WidthTarget:                strconv.FormatFloat(r.WidthTarget, 'g', -1, 64),
			QuadratureNodes:            r.QuadratureNodes,
			QuadratureEta:              r.Ellipses.Quadrature,
			LowestEstimate:             r.LowestEstimate,
			HighestEstimate:            r.HighestEstimate,
			EntryRounding:              r.Errors.EntryRounding,
			EntryQuadrature:            r.Errors.EntryQuadrature,
			LowestShift:                r.Errors.LowestShift,
			LowestResidual:             r.Errors.LowestResidual,
			HighestShift:               r.Errors.HighestShift,
			HighestResidual:            r.Errors.HighestResidual,
			AdvantageWitnessQuadrature: r.Errors.AdvantageWitnessQuadrature,
			DeficitWitnessQuadrature:   r.Errors.DeficitWitnessQuadrature,
		},
	}
	c := &certificates.Certificate{Kind: certificates.KindStrip, Strip: s}
	// The schema's strict reading is the final check of what was written.
	if err := certificates.CheckStrict(c); err != nil {
		return nil, fmt.Errorf("strip: the certificate would not be valid: %v", err)
	}
	return c, nil
}

// ratDown writes the largest n-digit decimal <= v; ratUp the smallest >= v.
func ratDown(v *big.Rat, n int) string { return ratDirected(v, n, false) }
func ratUp(v *big.Rat, n int) string   { return ratDirected(v, n, true) }

func ratDirected(v *big.Rat, n int, up bool) string {
	if v.Sign() == 0 {
		return "0"
	}
	mode := big.ToNegativeInf
	if up {
		mode = big.ToPositiveInf
	}
	f := new(big.Float).SetPrec(512).SetMode(mode).SetRat(v)
	if up {
		return interval.DecimalUp(f, n)
	}
	return interval.DecimalDown(f, n)
}

// exactDecimals writes each float64 exactly.
func exactDecimals(v []float64) []string {
	out := make([]string, len(v))
	for i, x := range v {
		out[i] = exactFloat(x)
	}
	return out
}

// exactFloat writes the float64 x exactly as a decimal in scientific form
// (a float64 has at most 767 significant decimal digits).
func exactFloat(x float64) string {
	if x == 0 || math.IsInf(x, 0) || math.IsNaN(x) {
		if x == 0 {
			return "0"
		}
		return strconv.FormatFloat(x, 'g', -1, 64)
	}
	s := new(big.Float).SetFloat64(x).Text('e', 800)
	i := strings.IndexByte(s, 'e')
	mant, exp := s[:i], s[i:]
	mant = strings.TrimRight(mant, "0")
	mant = strings.TrimSuffix(mant, ".")
	return mant + exp
}
