package relaxation

import (
	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
)

// Options and Verify let the tests call the core dispatch briefly.
type Options = recheck.Options

func Verify(c *certificates.Certificate, opt Options) (*recheck.Result, error) {
	return recheck.Verify(c, opt)
}

// backflow is the backflow problem (vertex on the boundary of {p > 0}).
func backflow(edge string) certificates.Problem {
	return certificates.Problem{
		Vertex:    [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("0")},
		Rays:      [2][2]certificates.Fraction{{certificates.MustFraction("0"), certificates.MustFraction("1")}, {certificates.MustFraction("-1"), certificates.MustFraction("1")}},
		Halfplane: certificates.Halfplane{Normal: [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("1")}, Offset: certificates.MustFraction("0")},
		Edge:      edge,
	}
}
