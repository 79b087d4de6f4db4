package witness

import (
	"fmt"
	"math/big"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// Statement returns the sentence a witness certificate proves.
func Statement(bound string) string {
	return fmt.Sprintf("The backflow constant c_bm (the supremum of the backflow quadratic form over normalised positive-momentum states) is at least %s: the recorded state has Rayleigh quotient at least this value.", bound)
}

// Certificate builds the (unsealed) certificate of a result.
func (r *Result) Certificate(gramTol float64) (*certificates.Certificate, error) {
	var n certificates.Parser
	enclose := func(x interval.F) certificates.Interval {
		lo, hi, err := interval.Decimals(x, 17)
		n.Note(err)
		return certificates.Interval{Lower: n.Decimal(lo), Upper: n.Decimal(hi)}
	}
	exact := func(x *big.Rat) certificates.Decimal {
		d, err := certificates.DecimalOf(x)
		n.Note(err)
		return d
	}
	short := func(x float64) certificates.Decimal {
		d, err := certificates.ShortDecimal(x)
		n.Note(err)
		return d
	}
	w := &certificates.Witness{
		Problem: "backflow",
		Kernel:  certificates.WitnessKernel,
		Bound:   n.Decimal(r.Bound),
	}
	for i, f := range r.Basis {
		w.Basis = append(w.Basis, certificates.WitnessFunc{Chirp: f.Chirp.String(), Power: f.Power, Width: exact(f.Width)})
		w.Coefficients = append(w.Coefficients, exact(r.Coef[i]))
	}
	w.Norm = enclose(r.Proof.Norm)
	w.Backflow = enclose(r.Proof.Backflow)
	w.Quotient = enclose(r.Proof.Quotient)
	_, q, err := interval.Decimals(interval.PointF(r.Proof.Remainder), 3)
	n.Note(err)
	w.Errors.Quadrature = n.Decimal(q)
	nodes := 0
	for _, p := range r.Proof.Panels {
		nodes += p.Nodes
	}
	w.Statement = Statement(r.Bound)
	w.Certifier = certificates.WitnessCertifier{
		Panels:   len(r.Proof.Panels),
		Nodes:    nodes,
		Estimate: short(r.Estimate),
		GramTol:  short(gramTol),
		Method:   "time integral over [-1, 1] of closed-form Gaussian moments; verified Gauss-Legendre on geometrically graded panels with Bernstein-ellipse remainders; norm in closed form",
	}
	if err := n.Err(); err != nil {
		return nil, fmt.Errorf("witness certificate: %v", err)
	}
	return &certificates.Certificate{Kind: certificates.KindWitness, Witness: w}, nil
}

// FromCertificate reads basis and coefficients back from a witness section.
func FromCertificate(w *certificates.Witness) ([]Func, []*big.Rat, error) {
	var basis []Func
	var coef []*big.Rat
	for i, f := range w.Basis {
		ch, err := ParseChirp(f.Chirp)
		if err != nil {
			return nil, nil, err
		}
		b, c := f.Width.Rat(), w.Coefficients[i].Rat()
		if b == nil || c == nil {
			return nil, nil, fmt.Errorf("basis[%d]: missing width or coefficient", i)
		}
		basis = append(basis, Func{Chirp: ch, Power: f.Power, Width: b})
		coef = append(coef, c)
	}
	return basis, coef, nil
}
