package matched

import (
	"os"
	"testing"

	"wedgebound/certify/strip"
)

func TestExploreCompute(t *testing.T) {
	if os.Getenv("EXPLORE") == "" {
		t.Skip()
	}
	for _, s := range []string{"10", "100"} {
		a, _ := strip.ParseAlpha(s)
		r, err := Compute(a, Options{Progress: func(l string) {}})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("alpha %s: [%.9f, %.9f] width %.3g cells %d witness v %g", s, r.Lower, r.Upper, r.Width, len(r.Cells), r.Witness.V)
	}
}
