package certificates

import "errors"

// Strip is the finite-strip bracket section. Its fields are defined together
// with the strip certifier; until then a strip certificate is rejected.
type Strip struct {
	Alpha string `json:"alpha"`
}

func (s *Strip) validate() error {
	if _, err := Frac(s.Alpha, "strip.alpha"); err != nil {
		return err
	}
	return errors.New("strip certificates are not supported by this version")
}
