package strip

import (
	"errors"
	"fmt"
	"math/big"
	"strconv"

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
	var n certificates.Parser
	eD, tD := n.Decimal(r.Errors.AlphaRounding), n.Decimal(r.Errors.DiscardedPart)
	glD, ghD := n.Decimal(r.GalerkinLowest), n.Decimal(r.GalerkinHighest)
	advR := certificates.StripBracket{Lower: n.Decimal(r.AdvantageWitness.Rayleigh.Lower), Upper: n.Decimal(r.AdvantageWitness.Rayleigh.Upper)}
	defR := certificates.StripBracket{Lower: n.Decimal(r.DeficitWitness.Rayleigh.Lower), Upper: n.Decimal(r.DeficitWitness.Rayleigh.Upper)}
	if err := n.Err(); err != nil {
		return nil, fmt.Errorf("strip: cannot certify: %v", err)
	}
	// The brackets follow from the recorded numbers by the schema's own
	// exact rule (certificates.Strip.Limits), rounded outward.
	rec := &certificates.Strip{GalerkinLowest: glD, GalerkinHighest: ghD,
		Errors:           certificates.StripErrors{AlphaRounding: eD, DiscardedPart: tD},
		AdvantageWitness: certificates.StripWitness{Rayleigh: advR}, DeficitWitness: certificates.StripWitness{Rayleigh: defR}}
	lim, err := rec.Limits()
	if err != nil {
		return nil, fmt.Errorf("strip: cannot certify: %v", err)
	}
	advLo, advHi, defLo, defHi := lim.AdvLower, lim.AdvUpper, lim.DefLower, lim.DefUpper
	if advLo.Cmp(advHi) > 0 || defLo.Cmp(defHi) > 0 {
		return nil, errors.New("strip: cannot certify: the recorded numbers give an empty bracket")
	}
	adv := certificates.StripBracket{Lower: n.Decimal(ratDown(advLo, certDigits)), Upper: n.Decimal(ratUp(advHi, certDigits))}
	def := certificates.StripBracket{Lower: n.Decimal(ratDown(defLo, certDigits)), Upper: n.Decimal(ratUp(defHi, certDigits))}

	var units *certificates.StripUnits
	if u := r.Alpha.Units; u != nil {
		units = &certificates.StripUnits{Mass: u.Mass, Length: u.Length, Time: u.Time}
	}
	s := &certificates.Strip{
		Alpha:     certificates.StripAlpha{Value: n.Alpha(r.Alpha.Value), Lower: n.Decimal(r.Alpha.Lower), Upper: n.Decimal(r.Alpha.Upper), Units: units},
		AlphaUsed: n.Decimal(r.AlphaUsed),
		Basis:     r.Basis,
		BasisSize: r.BasisSize,
		Advantage: adv,
		Deficit:   def,
		AdvantageWitness: certificates.StripWitness{
			Coefficients: exactDecimals(&n, r.AdvantageWitness.Coefficients),
			Rayleigh:     advR,
		},
		DeficitWitness: certificates.StripWitness{
			Coefficients: exactDecimals(&n, r.DeficitWitness.Coefficients),
			Rayleigh:     defR,
		},
		GalerkinLowest:  glD,
		GalerkinHighest: ghD,
		Errors: certificates.StripErrors{
			AlphaRounding: eD,
			DiscardedPart: tD,
			DiscardedEtaX: n.Decimal(r.Ellipses.TailX),
			DiscardedEtaY: n.Decimal(r.Ellipses.TailY),
		},
		Statement: fmt.Sprintf("For K_alpha(x,y) = (exp(-i alpha (x^2-y^2)/2) - 1)/(2 pi i (x-y)) on L^2[-1,0] with alpha = %s: "+
			"the advantage A(alpha) = -inf spec K_alpha lies in [%s, %s] and sup spec K_alpha lies in [%s, %s]",
			r.Alpha.Value, adv.Lower, adv.Upper, def.Lower, def.Upper),
		Certifier: certificates.StripCertifier{
			Method:                     "Gauss-Legendre Galerkin matrix with a Bernstein-ellipse remainder; float Cholesky factors with interval residuals for the Galerkin bounds; Chebyshev-coefficient bound for the discarded part",
			WidthTarget:                n.Sci(strconv.FormatFloat(r.WidthTarget, 'g', -1, 64)),
			QuadratureNodes:            r.QuadratureNodes,
			QuadratureEta:              n.Decimal(r.Ellipses.Quadrature),
			LowestEstimate:             n.Decimal(r.LowestEstimate),
			HighestEstimate:            n.Decimal(r.HighestEstimate),
			EntryRounding:              n.Decimal(r.Errors.EntryRounding),
			EntryQuadrature:            n.Decimal(r.Errors.EntryQuadrature),
			LowestShift:                n.Decimal(r.Errors.LowestShift),
			LowestResidual:             n.Decimal(r.Errors.LowestResidual),
			HighestShift:               n.Decimal(r.Errors.HighestShift),
			HighestResidual:            n.Decimal(r.Errors.HighestResidual),
			AdvantageWitnessQuadrature: n.Decimal(r.Errors.AdvantageWitnessQuadrature),
			DeficitWitnessQuadrature:   n.Decimal(r.Errors.DeficitWitnessQuadrature),
		},
	}
	if err := n.Err(); err != nil {
		return nil, fmt.Errorf("strip: cannot certify: %v", err)
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

// exactDecimals writes each float64 exactly in the scientific form
// (certificates.SciFloat, every exponent written: 5e-01, 1e+00).
func exactDecimals(n *certificates.Parser, v []float64) []certificates.SciDecimal {
	out := make([]certificates.SciDecimal, len(v))
	for i, x := range v {
		d, err := certificates.SciFloat(x, certificates.SciAlways)
		n.Note(err)
		out[i] = d
	}
	return out
}
