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
