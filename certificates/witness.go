package certificates

import (
	"errors"
	"fmt"
	"math/big"
)

// KindWitness proves a lower bound on the backflow constant by one explicit
// positive-momentum state (a witness) on the whole half-line.
const KindWitness = "halfline-witness"

// WitnessKernel is the only form this schema version knows; a witness
// certificate records it verbatim. In scaled momentum u >= 0 the backflow
// over the time window is the quadratic form of this kernel, and the
// backflow constant is the supremum of the Rayleigh quotient.
const WitnessKernel = "c_bm = sup <phi, K phi>/<phi, phi> over phi in L^2(0, inf), K(u, v) = -sin(u^2 - v^2)/(pi (u - v)); phi(u) = sum_j c_j u^p_j exp(-b_j u^2) chi_j(u^2), chi_j in {1, cos, sin}"

// MaxWitnessBasis is the largest basis a witness certificate may record.
const MaxWitnessBasis = 2000

// Witness is the witness section. It proves c_bm >= Bound because
// Bound <= Quotient.Lower and the Rayleigh quotient of the stated state lies
// in Quotient; the verifier recomputes the quotient from Basis and
// Coefficients alone.
type Witness struct {
	// Problem names the constant bounded ("backflow").
	Problem string `json:"problem"`
	// Kernel must equal WitnessKernel.
	Kernel string `json:"kernel"`
	// Basis lists the basis functions; Coefficients (exact decimals) the
	// state phi = sum_j Coefficients[j] Basis[j].
	Basis        []WitnessFunc `json:"basis"`
	Coefficients []Decimal     `json:"coefficients"`
	// Norm encloses <phi, phi>, Backflow encloses <phi, K phi> and Quotient
	// their ratio.
	Norm     Interval `json:"norm"`
	Backflow Interval `json:"backflow"`
	Quotient Interval `json:"quotient"`
	// Bound is the claim: c_bm >= Bound.
	Bound Decimal `json:"bound"`
	// Errors are the error terms included in Backflow.
	Errors WitnessErrors `json:"errors"`
	// Statement says in words what is proved.
	Statement string `json:"statement"`
	// Certifier records how the certifier reached its numbers
	// (informational).
	Certifier WitnessCertifier `json:"certifier"`
}

// Interval is a closed interval [Lower, Upper] of decimals.
type Interval struct {
	Lower Decimal `json:"lower"`
	Upper Decimal `json:"upper"`
}

// WitnessFunc is u^Power exp(-Width u^2) times 1 (Chirp "plain"),
// cos(u^2) ("cos") or sin(u^2) ("sin"); Width is a positive decimal.
type WitnessFunc struct {
	Chirp string  `json:"chirp"`
	Power int     `json:"power"`
	Width Decimal `json:"width"`
}

// WitnessErrors: Quadrature is the sum of the quadrature remainder bounds of
// the time integral (the only approximation; the norm is a closed form).
type WitnessErrors struct {
	Quadrature Decimal `json:"quadrature"`
}

// WitnessCertifier is informational: the number of time panels and
// quadrature nodes used, the float estimate of the search and the Gram
// cut-off it used.
type WitnessCertifier struct {
	Panels   int     `json:"panels"`
	Nodes    int     `json:"nodes"`
	Estimate Decimal `json:"estimate"`
	GramTol  Decimal `json:"gram_cutoff"`
	Method   string  `json:"method"`
}

func (iv Interval) validate(name string) error {
	var fs fields
	fs.add(name+".lower", iv.Lower)
	fs.add(name+".upper", iv.Upper)
	if err := fs.check(); err != nil {
		return err
	}
	if iv.Lower.Cmp(iv.Upper.Rat()) > 0 {
		return fmt.Errorf("%s: lower %s exceeds upper %s", name, iv.Lower, iv.Upper)
	}
	return nil
}

func (w *Witness) validate() error {
	if w.Problem != "backflow" {
		return fmt.Errorf("witness.problem %q is unknown (this version knows \"backflow\")", w.Problem)
	}
	if w.Kernel != WitnessKernel {
		return fmt.Errorf("witness.kernel: unknown form %.60q", w.Kernel)
	}
	n := len(w.Basis)
	if n < 1 || n > MaxWitnessBasis {
		return fmt.Errorf("witness.basis has %d functions, outside 1..%d", n, MaxWitnessBasis)
	}
	if len(w.Coefficients) != n {
		return fmt.Errorf("witness: %d coefficients for %d basis functions", len(w.Coefficients), n)
	}
	var fs fields
	nonzero := false
	for i, f := range w.Basis {
		if f.Chirp != "plain" && f.Chirp != "cos" && f.Chirp != "sin" {
			return fmt.Errorf("witness.basis[%d].chirp %q is not plain, cos or sin", i, f.Chirp)
		}
		if f.Power < 0 || f.Power > 8 {
			return fmt.Errorf("witness.basis[%d].power %d is outside 0..8", i, f.Power)
		}
		fs.add(fmt.Sprintf("witness.basis[%d].width", i), f.Width)
		fs.add(fmt.Sprintf("witness.coefficients[%d]", i), w.Coefficients[i])
		if err := fs.check(); err != nil {
			return err
		}
		if f.Width.Sign() <= 0 || f.Width.Cmp(big.NewRat(1000000, 1)) > 0 {
			return fmt.Errorf("witness.basis[%d].width %s is outside (0, 1e6]", i, f.Width)
		}
		nonzero = nonzero || w.Coefficients[i].Sign() != 0
	}
	if !nonzero {
		return errors.New("witness: the zero vector is not a state")
	}
	for _, iv := range []struct {
		v    Interval
		name string
	}{{w.Norm, "witness.norm"}, {w.Backflow, "witness.backflow"}, {w.Quotient, "witness.quotient"}} {
		if err := iv.v.validate(iv.name); err != nil {
			return err
		}
	}
	fs.add("witness.bound", w.Bound)
	fs.add("witness.errors.quadrature", w.Errors.Quadrature)
	fs.add("witness.certifier.estimate", w.Certifier.Estimate)
	fs.add("witness.certifier.gram_cutoff", w.Certifier.GramTol)
	if err := fs.check(); err != nil {
		return err
	}
	if w.Bound.Cmp(w.Quotient.Lower.Rat()) > 0 {
		return fmt.Errorf("witness.bound %s exceeds the recorded quotient's lower end %s", w.Bound, w.Quotient.Lower)
	}
	if w.Errors.Quadrature.Sign() < 0 {
		return errors.New("witness.errors.quadrature is negative")
	}
	if w.Certifier.Panels < 0 || w.Certifier.Nodes < 0 {
		return errors.New("witness.certifier: negative counts")
	}
	return nil
}
