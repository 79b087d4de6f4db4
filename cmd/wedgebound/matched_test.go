package main

import (
	"bytes"
	"encoding/json"
	"math/big"
	"testing"
)

func matchedCmd(args []string, out, errb *bytes.Buffer) int { return runMatched(args, out, errb) }

// "wedgebound matched --alpha 1 --json": decimal-string ends, width below
// the target, the lower end at least the projectile advantage A(1) =
// 0.0060131 to the digits quoted (double-precision Nystrom value, seen
// here, not a published source) less 1e-7.
func TestMatchedJSON(t *testing.T) {
	code, out, errs := runCmd(matchedCmd, "--alpha", "1", "--json", "--quiet")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var r struct{ Lower, Upper string }
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatal(err)
	}
	lo, _ := new(big.Rat).SetString(r.Lower)
	hi, _ := new(big.Rat).SetString(r.Upper)
	if lo == nil || hi == nil || lo.Cmp(hi) > 0 || new(big.Rat).Sub(hi, lo).Cmp(big.NewRat(1, 1000)) >= 0 || lo.Cmp(big.NewRat(60130, 10000000)) < 0 {
		t.Errorf("bracket [%s, %s]", r.Lower, r.Upper)
	}
}

func TestMatchedBadInput(t *testing.T) {
	for _, args := range [][]string{{}, {"--alpha", "-1"}, {"--alpha", "1000"}, {"--alpha", "1", "--width", "0"}, {"--alpha", "1", "--mass", "1u"}} {
		if code, _, errs := runCmd(matchedCmd, args...); code != 2 || errs == "" {
			t.Errorf("%q: exit %d %q", args, code, errs)
		}
	}
}
