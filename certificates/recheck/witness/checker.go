package witness

import (
	"fmt"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
)

func init() { recheck.Register(certificates.KindWitness, Checker{}) }

// Checker verifies halfline-witness certificates (recheck.Checker).
type Checker struct{}

// NewDetail returns an empty Detail for reading a JSON result back.
func (Checker) NewDetail() any { return &Detail{} }

// Problem is the one-line description of what a witness certificate bounds.
const Problem = "backflow constant c_bm (positive-momentum states on the half-line)"

// Check runs Check on the certificate's witness section.
func (Checker) Check(c *certificates.Certificate, opt recheck.Options) (*recheck.Result, error) {
	w := c.Witness
	if w == nil {
		return nil, fmt.Errorf("%s certificate without its %q section", c.Kind, "witness")
	}
	d, fails, err := Check(w, opt.Workers)
	if err != nil {
		return nil, err
	}
	res := &recheck.Result{Problem: Problem, Bound: w.Bound.String(), Statement: w.Statement}
	if d != nil {
		res.Recomputed = d.Quotient.Lower
		res.Notes = append(res.Notes, fmt.Sprintf("recomputed Rayleigh quotient in [%s, %s] (%d panels, %d Clenshaw-Curtis nodes, quadrature remainder %s)",
			d.Quotient.Lower, d.Quotient.Upper, d.Panels, d.Nodes, d.Remainder))
		res.Detail = d
	}
	for _, f := range fails {
		res.Failures = append(res.Failures, recheck.Failure{Where: "witness", Message: f, Bound: true})
	}
	return res, nil
}
