package certificates

import "errors"

// KindMatched brackets the matched position-and-momentum advantage.
const KindMatched = "matched-bracket"

// Matched is the matched-advantage section (filled in by its schema file).
type Matched struct {
	Statement string `json:"statement"`
}

func (m *Matched) validate() error {
	return errors.New("matched: this version cannot read matched certificates yet")
}
