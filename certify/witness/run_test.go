package witness

import (
	"fmt"
	"os"
	"testing"
	"time"
)

func TestExplore(t *testing.T) {
	if os.Getenv("WITNESS_EXPLORE") == "" {
		t.Skip()
	}
	o := Preset()
	if s := os.Getenv("WITNESS_BMIN"); s != "" {
		fmt.Sscan(s, &o.MinWidth)
	}
	t0 := time.Now()
	o.Progress = func(st string, d, n int) {
		if d == 0 || d == n {
			t.Logf("%s %d/%d %v", st, d, n, time.Since(t0))
		}
	}
	r, err := Run(o)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("N=%d est=%.10f proved=%v bound=%s rem=%g norm=%v time=%v", len(r.Basis), r.Estimate, r.Proof.Quotient, r.Bound, r.Proof.Remainder, r.Proof.Norm, time.Since(t0))
}
