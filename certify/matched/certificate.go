package matched

import (
	"fmt"
	"math"
	"strconv"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// Margins added to the recorded claims so that an independent verifier,
// with its own (different) error terms, can prove them: cell bounds are
// raised and the witness bound lowered by these amounts.
const (
	cellMargin    = 2e-7
	witnessMargin = 1e-9
)

// Method describes the certifier's route (informational).
const Method = "split Legendre Galerkin matrices (Gauss-Legendre entries with Bernstein-ellipse remainders), float Cholesky factors with interval residuals, Chebyshev-coefficient bound of the discarded part, monotone cells in the threshold"

// Certificate returns an unsealed matched-bracket certificate.
func (r *Result) Certificate() (*certificates.Certificate, error) {
	av, err := r.Alpha.View(17)
	if err != nil {
		return nil, err
	}
	var units *certificates.StripUnits
	if u := av.Units; u != nil {
		units = &certificates.StripUnits{Mass: u.Mass, Length: u.Length, Time: u.Time}
	}
	var n certificates.Parser
	exactFloat := func(x float64) certificates.SciDecimal {
		d, err := certificates.SciFloat(x, certificates.SciPlainUnits)
		n.Note(err)
		return d
	}
	m := &certificates.Matched{
		Alpha: certificates.StripAlpha{Value: n.Alpha(av.Value), Lower: n.Decimal(av.Lower), Upper: n.Decimal(av.Upper), Units: units},
		Witness: certificates.MatchedWitness{
			V:            exactFloat(r.Witness.V),
			Sizes:        r.Witness.Sizes,
			Coefficients: make([]certificates.SciDecimal, len(r.Witness.Coefficients)),
		},
		Certifier: certificates.MatchedCertifier{Method: Method, WidthTarget: n.Sci(strconv.FormatFloat(r.WidthTarget, 'g', -1, 64)),
			Estimate: n.Sci(strconv.FormatFloat(r.Estimate, 'g', 12, 64))},
	}
	for i, c := range r.Witness.Coefficients {
		m.Witness.Coefficients[i] = exactFloat(c)
	}
	rw := n.Decimal(down(interval.PointF(r.Witness.Rayleigh).Sub(interval.PointF(witnessMargin))))
	m.Witness.Rayleigh = rw
	if rw.Sign() < 0 {
		m.Lower = n.Decimal("0")
	} else {
		m.Lower = rw
	}
	upper := 0.0
	for _, c := range r.Cells {
		u := interval.PointF(c.Upper).Add(interval.PointF(cellMargin))
		upper = math.Max(upper, u.Hi())
		m.Cells = append(m.Cells, certificates.MatchedCell{Lo: exactFloat(c.Lo), Hi: exactFloat(c.Hi), Sizes: c.Sizes, Upper: n.Decimal(up(u))})
	}
	m.Upper = n.Decimal(up(interval.PointF(upper)))
	if err := n.Err(); err != nil {
		return nil, fmt.Errorf("matched: cannot certify: %v", err)
	}
	m.Statement = fmt.Sprintf("For alpha = %s, the matched advantage M(alpha) (quantum detection probability minus that of the best classical particle "+
		"with the same position and momentum distributions, over states confined to the strip) lies in [%s, %s]", av.Value, m.Lower, m.Upper)
	c := &certificates.Certificate{Kind: certificates.KindMatched, Matched: m}
	if err := certificates.CheckStrict(c); err != nil {
		return nil, fmt.Errorf("matched: the certificate would not be valid: %v", err)
	}
	return c, nil
}

// up and down write the ends of x with 12 significant digits, rounded
// outward.
func up(x interval.F) string {
	_, hi := x.Endpoints()
	return interval.DecimalUp(hi, 12)
}

func down(x interval.F) string {
	lo, _ := x.Endpoints()
	return interval.DecimalDown(lo, 12)
}
