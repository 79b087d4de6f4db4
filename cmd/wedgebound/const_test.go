package main

import (
	"bytes"
	"encoding/json"
	"math/big"
	"strings"
	"testing"
)

// piDigits is pi to 1000 decimals (OEIS A000796; the first 105 digits are the
// OEIS data lines, the rest as in the Go distribution file
// src/compress/testdata/pi.txt). Truncated, so pi lies in
// [piDigits, piDigits + 1e-1000].
const piDigits = "3." +
	"1415926535897932384626433832795028841971693993751058209749445923078164062862089986280348253421170679" +
	"8214808651328230664709384460955058223172535940812848111745028410270193852110555964462294895493038196" +
	"4428810975665933446128475648233786783165271201909145648566923460348610454326648213393607260249141273" +
	"7245870066063155881748815209209628292540917153643678925903600113305305488204665213841469519415116094" +
	"3305727036575959195309218611738193261179310511854807446237996274956735188575272489122793818301194912" +
	"9833673362440656643086021394946395224737190702179860943702770539217176293176752384674818467669405132" +
	"0005681271452635608277857713427577896091736371787214684409012249534301465495853710507922796892589235" +
	"4201995611212902196086403441815981362977477130996051870721134999999837297804995105973173281609631859" +
	"5024459455346908302642522308253344685035261931188171010003137838752886587533208381420617177669147303" +
	"5982534904287554687311595628638823537875937519577818577805321712268066130019278766111959092164201989"

func TestConstPiJSON(t *testing.T) {
	var out, errb bytes.Buffer
	if code := dispatch([]string{"const", "pi", "--digits", "1000", "--json"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var r struct {
		Name   string `json:"name"`
		Digits int    `json:"digits"`
		Lower  string `json:"lower"`
		Upper  string `json:"upper"`
	}
	if err := json.Unmarshal(out.Bytes(), &r); err != nil {
		t.Fatalf("bad JSON %q: %v", out.String(), err)
	}
	if r.Name != "pi" || r.Digits != 1000 {
		t.Errorf("name/digits = %q/%d", r.Name, r.Digits)
	}
	lo, ok1 := new(big.Rat).SetString(r.Lower)
	hi, ok2 := new(big.Rat).SetString(r.Upper)
	p, _ := new(big.Rat).SetString(piDigits)
	if !ok1 || !ok2 {
		t.Fatalf("bounds are not decimals: %q %q", r.Lower, r.Upper)
	}
	ulp := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(1000), nil))
	pHi := new(big.Rat).Add(p, ulp)
	// pi lies in [p, p+1e-1000], so a correct enclosure must reach into it.
	if lo.Cmp(pHi) > 0 || hi.Cmp(p) < 0 {
		t.Errorf("[%s..., %s...] misses the published digits", r.Lower[:20], r.Upper[:20])
	}
	// lower <= pi <= upper with the truncated digits: lower <= p + ulp and
	// upper >= p. Width below 1e-999 as required.
	w := new(big.Rat).Sub(hi, lo)
	lim := new(big.Rat).Mul(ulp, big.NewRat(10, 1))
	if w.Sign() < 0 || w.Cmp(lim) >= 0 {
		t.Errorf("upper - lower = %s, want < 1e-999", w.FloatString(1005)[:10])
	}
	if !strings.HasPrefix(r.Lower, piDigits[:1001]) && !strings.HasPrefix(r.Upper, piDigits[:1001]) {
		t.Errorf("neither bound starts with the published 1000 decimals")
	}
}

func TestConstHumanAndErrors(t *testing.T) {
	var out, errb bytes.Buffer
	if code := dispatch([]string{"const", "e", "--digits", "30"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	// e = 2.71828182845904523536028747135266... (OEIS A001113)
	if !strings.Contains(out.String(), "lower 2.71828182845904523536028747135") ||
		!strings.Contains(out.String(), "upper 2.71828182845904523536028747135") {
		t.Errorf("unexpected output %q", out.String())
	}
	for _, args := range [][]string{
		{"const", "pi", "--digits", "0"},
		{"const", "pi", "--digits", "100001"},
		{"const", "pi", "--digits", "x"},
		{"const", "tau"},
		{"const"},
		{"const", "pi", "e"},
	} {
		out.Reset()
		errb.Reset()
		if code := dispatch(args, &out, &errb); code != 2 {
			t.Errorf("%v: exit %d, want 2", args, code)
		}
		if n := strings.Count(strings.TrimSpace(errb.String()), "\n"); n != 0 || errb.Len() == 0 {
			t.Errorf("%v: want a one-line error, got %q", args, errb.String())
		}
	}
}

// Catalan's constant and Euler's gamma through the subcommand: the bounds
// bracket the OEIS data-line digits (A006752: 0.91596559417721901505...,
// A001620: 0.57721566490153286060...; 105 and 99 digits).
func TestConstCatalanGamma(t *testing.T) {
	for _, c := range []struct{ name, digits string }{
		{"catalan", "0.915965594177219015054603514932384110774149374281672134266498119621763019776254769479356512926115106248574"},
		{"gamma", "0.577215664901532860606512090082402431042159335939923598805767234884867726777664670936947063291746749"},
	} {
		var out, errb bytes.Buffer
		if code := dispatch([]string{"const", c.name, "--digits", "120", "--json"}, &out, &errb); code != 0 {
			t.Fatalf("%s: exit %d: %s", c.name, code, errb.String())
		}
		var r struct{ Lower, Upper string }
		if err := json.Unmarshal(out.Bytes(), &r); err != nil {
			t.Fatal(err)
		}
		lo, _ := new(big.Rat).SetString(r.Lower)
		hi, _ := new(big.Rat).SetString(r.Upper)
		v, _ := new(big.Rat).SetString(c.digits)
		u := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(len(c.digits)-2)), nil))
		if lo.Cmp(new(big.Rat).Add(v, u)) > 0 || hi.Cmp(v) < 0 {
			t.Errorf("%s: [%s, %s] misses the OEIS digits", c.name, r.Lower, r.Upper)
		}
		lim := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(119), nil))
		if w := new(big.Rat).Sub(hi, lo); w.Cmp(lim) >= 0 || len(r.Lower) < 120 {
			t.Errorf("%s: bounds too wide or too short: %s %s", c.name, r.Lower, r.Upper)
		}
	}
}
