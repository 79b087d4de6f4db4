package witness

import (
	"fmt"
	"math/big"
	"strconv"
	"strings"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// Statement returns the sentence a witness certificate proves.
func Statement(bound string) string {
	return fmt.Sprintf("The backflow constant c_bm (the supremum of the backflow quadratic form over normalised positive-momentum states) is at least %s: the recorded state has Rayleigh quotient at least this value.", bound)
}

func enclose(x interval.F) (certificates.Interval, error) {
	lo, hi, err := interval.Decimals(x, 17)
	return certificates.Interval{Lower: lo, Upper: hi}, err
}

// Certificate builds the (unsealed) certificate of a result.
func (r *Result) Certificate(gramTol float64) (*certificates.Certificate, error) {
	w := &certificates.Witness{
		Problem: "backflow",
		Kernel:  certificates.WitnessKernel,
		Bound:   r.Bound,
	}
	for i, f := range r.Basis {
		w.Basis = append(w.Basis, certificates.WitnessFunc{Chirp: f.Chirp.String(), Power: f.Power, Width: ratText(f.Width)})
		w.Coefficients = append(w.Coefficients, ratText(r.Coef[i]))
	}
	var err error
	if w.Norm, err = enclose(r.Proof.Norm); err != nil {
		return nil, err
	}
	if w.Backflow, err = enclose(r.Proof.Backflow); err != nil {
		return nil, err
	}
	if w.Quotient, err = enclose(r.Proof.Quotient); err != nil {
		return nil, err
	}
	_, q, err := interval.Decimals(interval.PointF(r.Proof.Remainder), 3)
	if err != nil {
		return nil, err
	}
	w.Errors.Quadrature = q
	nodes := 0
	for _, p := range r.Proof.Panels {
		nodes += p.Nodes
	}
	w.Statement = Statement(r.Bound)
	w.Certifier = certificates.WitnessCertifier{
		Panels:   len(r.Proof.Panels),
		Nodes:    nodes,
		Estimate: strconv.FormatFloat(r.Estimate, 'f', -1, 64),
		GramTol:  strconv.FormatFloat(gramTol, 'f', -1, 64),
		Method:   "time integral over [-1, 1] of closed-form Gaussian moments; verified Gauss-Legendre on geometrically graded panels with Bernstein-ellipse remainders; norm in closed form",
	}
	return &certificates.Certificate{Kind: certificates.KindWitness, Witness: w}, nil
}

// ratText writes a rational with a terminating decimal expansion exactly.
func ratText(r *big.Rat) string {
	d := new(big.Int).Set(r.Denom())
	k := 0
	two, five := big.NewInt(2), big.NewInt(5)
	for z := new(big.Int); ; k++ {
		if d.Cmp(big.NewInt(1)) == 0 {
			break
		}
		if z.Mod(d, two).Sign() == 0 {
			d.Quo(d, two)
		} else if z.Mod(d, five).Sign() == 0 {
			d.Quo(d, five)
		} else {
			return r.FloatString(40)
		}
	}
	s := r.FloatString(k)
	if k > 0 {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	return s
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
		b, err := certificates.Dec(f.Width, fmt.Sprintf("basis[%d].width", i))
		if err != nil {
			return nil, nil, err
		}
		c, err := certificates.Dec(w.Coefficients[i], fmt.Sprintf("coefficients[%d]", i))
		if err != nil {
			return nil, nil, err
		}
		basis = append(basis, Func{Chirp: ch, Power: f.Power, Width: b})
		coef = append(coef, c)
	}
	return basis, coef, nil
}
