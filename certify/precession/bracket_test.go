package precession

import (
	"math"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/mat"

	"wedgebound/certificates"
)

func num(t *testing.T, s string) float64 {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// TestBracket runs two work levels and checks the bracket against outside
// values.
func TestBracket(t *testing.T) {
	small, err := Run(Options{Cutoff: 8, Length: 300, Witness: 300})
	if err != nil {
		t.Fatal(err)
	}
	big, err := Run(Options{Cutoff: 16, Length: 1000, Witness: 1500})
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range []*Result{small, big} {
		lo, up := num(t, r.Lower), num(t, r.Upper)
		t.Logf("cutoff %d length %d witness %d: [%s, %s]", r.Options.Cutoff, r.Options.Length, r.Options.Witness, r.Lower, r.Upper)
		// Classical bound 2/3 (common practice: x_0+x_1+x_2 = 0, so at most
		// two of the three are positive) is strictly exceeded.
		if !(lo > 2.0/3) {
			t.Errorf("lower %s does not exceed 2/3", r.Lower)
		}
		// Upper bound below 1 (Tsirelson 2006, quant-ph/0611147).
		if !(up < 1) {
			t.Errorf("upper %s is not below 1", r.Upper)
		}
		// Float value about 0.709364 (Zaw and Scarani, from memory).
		if !(lo <= 0.709364 && 0.709364 <= up) {
			t.Errorf("0.709364 outside [%s, %s]", r.Lower, r.Upper)
		}
		c, err := r.Certificate()
		if err != nil {
			t.Fatal(err)
		}
		if err := certificates.Seal(c); err != nil {
			t.Fatal(err)
		}
		b, _ := certificates.Encode(c)
		if _, err := certificates.Decode(b); err != nil {
			t.Fatal(err)
		}
	}
	if !(num(t, big.Lower) > num(t, small.Lower) && num(t, big.Upper) < num(t, small.Upper)) {
		t.Errorf("bracket did not shrink: [%s, %s] then [%s, %s]", small.Lower, small.Upper, big.Lower, big.Upper)
	}
	// Independent float check: top eigenvalue of the plain Fock finite
	// section of Q3 (size N, built from the closed form, diagonalised by
	// gonum) grows with N and stays below the upper bound. Calibration
	// (seen here, not a published source): 0.70029 at N = 60, 0.70372 at
	// N = 150.
	prev := 0.0
	up := num(t, big.Upper)
	for _, N := range []int{60, 150, 300} {
		q := finiteSection(N)
		t.Logf("finite section N=%d: %.6f", N, q)
		if q <= prev || q >= up || q < 2.0/3 {
			t.Errorf("finite section N=%d: %.6f (previous %.6f, upper %.6f)", N, q, prev, up)
		}
		prev = q
	}
	if math.Abs(finiteSection(60)-0.70029) > 1e-5 || math.Abs(finiteSection(150)-0.70372) > 1e-5 {
		t.Errorf("finite sections differ from the calibration: %.6f %.6f", finiteSection(60), finiteSection(150))
	}
}

// finiteSection is the top eigenvalue of Q3 on span{|0>, ..., |N-1>}:
// entries delta_mn/2 + <m|sgn x|n>/2 for m - n = 3 mod 6 (both signs),
// from the closed form evaluated with lgamma (independent of Table).
func finiteSection(N int) float64 {
	la := func(j int) float64 {
		a, _ := math.Lgamma(float64(2*j + 1))
		b, _ := math.Lgamma(float64(j + 1))
		return 0.5 * (a - 2*b - float64(2*j)*math.Ln2)
	}
	q := mat.NewSymDense(N, nil)
	for m := 0; m < N; m++ {
		q.SetSym(m, m, 0.5)
		for n := m + 1; n < N; n++ {
			if (n-m)%6 != 3 {
				continue
			}
			e, o := m, n
			if e%2 != 0 {
				e, o = n, m
			}
			j, k := e/2, (o-1)/2
			v := math.Sqrt(2/math.Pi) * math.Exp(la(j)+la(k)) * math.Sqrt(float64(2*k+1)) / float64(2*k+1-2*j)
			if (j+k)%2 != 0 {
				v = -v
			}
			q.SetSym(m, n, v/2)
		}
	}
	var es mat.EigenSym
	es.Factorize(q, false)
	vals := es.Values(nil)
	return vals[len(vals)-1]
}
