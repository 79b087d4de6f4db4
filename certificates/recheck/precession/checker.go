package precession

import (
	"fmt"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
)

func init() { recheck.Register(certificates.KindPrecession, Checker{}) }

// Checker verifies precession-bracket certificates (recheck.Checker).
type Checker struct{}

// NewDetail returns an empty Detail for reading a JSON result back.
func (Checker) NewDetail() any { return &Detail{} }

// Check runs Check on the certificate's precession section.
func (Checker) Check(c *certificates.Certificate, opt recheck.Options) (*recheck.Result, error) {
	p := c.Precession
	if p == nil {
		return nil, fmt.Errorf("%s certificate without its %q section", c.Kind, "precession")
	}
	res := &recheck.Result{Problem: certificates.PrecessionProblem, Bound: p.Lower.String(),
		Statement: fmt.Sprintf("P3 = sup spec Q3 in [%s, %s]", p.Lower, p.Upper)}
	d, fails := Check(p, opt.Workers)
	for _, f := range fails {
		res.Failures = append(res.Failures, recheck.Failure{Where: f.Where, Message: f.Message, Refuted: f.Refuted, Bound: f.Bound})
	}
	res.Detail = d
	return res, nil
}
