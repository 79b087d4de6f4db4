package strip

import (
	"math"
	"math/big"
	"path/filepath"
	"strings"
	"testing"

	"wedgebound/certificates"
)

func rat(t *testing.T, s string) *big.Rat {
	t.Helper()
	r, err := certificates.ParseSci(s)
	if err != nil {
		t.Fatal(err)
	}
	return r.Rat()
}

// certificateFor converts and round-trips a result through the strict
// reader.
func certificateFor(t *testing.T, r *Result) *certificates.Certificate {
	t.Helper()
	c, err := r.Certificate()
	if err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(t.TempDir(), "c.json")
	if err := certificates.WriteFile(p, c); err != nil {
		t.Fatal(err)
	}
	d, err := certificates.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// The certificate at alpha = 50: kind, exact witnesses, and a bracket that
// is what the recorded numbers give: the lower end within a few units of
// the 17th digit of the float64 bracket, the upper end above it by at most
// the rounding of the recorded error terms (6 digits, rounded up), width
// below 1e-8, meeting the values that
// round to 0.0294572 (the double-precision Nystrom value of the package doc,
// seen here, not a published source) and below the published backflow
// estimate 0.0384517 (A. J. Bracken and G. F. Melloy, J. Phys. A 27 (1994)
// 2197).
func TestCertificateAlpha50(t *testing.T) {
	r := bracketAt(t, "50")
	c := certificateFor(t, r)
	if c.Kind != certificates.KindStrip || c.Strip == nil || c.Relaxation != nil {
		t.Fatalf("kind %q", c.Kind)
	}
	s := c.Strip
	if s.BasisSize != r.BasisSize || s.AlphaUsed.String() != r.AlphaUsed || s.Alpha.Value.String() != "50" || s.Basis != BasisDescription {
		t.Errorf("header differs: %+v", s.Alpha)
	}
	for w, pair := range []struct {
		rec []certificates.SciDecimal
		f   []float64
	}{{s.AdvantageWitness.Coefficients, r.AdvantageWitness.Coefficients}, {s.DeficitWitness.Coefficients, r.DeficitWitness.Coefficients}} {
		for j, str := range pair.rec {
			want, _ := new(big.Float).SetFloat64(pair.f[j]).Rat(nil)
			if rat(t, str.String()).Cmp(want) != 0 {
				t.Fatalf("witness %d coefficient %d: %s is not the float64 %v exactly", w, j, str, pair.f[j])
			}
		}
	}
	lo, hi := rat(t, s.Advantage.Lower.String()), rat(t, s.Advantage.Upper.String())
	flo, _ := new(big.Float).SetFloat64(r.AdvantageF.Lo()).Rat(nil)
	fhi, _ := new(big.Float).SetFloat64(r.AdvantageF.Hi()).Rat(nil)
	slack := big.NewRat(1, 1e15)
	if d := new(big.Rat).Sub(flo, lo); d.Abs(d).Cmp(slack) > 0 {
		t.Errorf("lower end %s far from the float bound %v", s.Advantage.Lower, r.AdvantageF.Lo())
	}
	upSlack := new(big.Rat).Add(slack, new(big.Rat).Mul(rat(t, s.Errors.DiscardedPart.String()), big.NewRat(1, 1e5)))
	if d := new(big.Rat).Sub(hi, fhi); d.Cmp(upSlack) > 0 || d.Cmp(new(big.Rat).Neg(slack)) < 0 {
		t.Errorf("upper end %s far from the float bound %v", s.Advantage.Upper, r.AdvantageF.Hi())
	}
	if w := new(big.Rat).Sub(hi, lo); w.Cmp(big.NewRat(1, 1e8)) >= 0 {
		t.Errorf("width %s", w.FloatString(12))
	}
	if lo.Cmp(rat(t, "0.02945725")) > 0 || hi.Cmp(rat(t, "0.02945715")) < 0 {
		t.Errorf("[%s, %s] does not meet the values rounding to 0.0294572", s.Advantage.Lower, s.Advantage.Upper)
	}
	if hi.Cmp(rat(t, "0.0384517")) >= 0 {
		t.Errorf("upper end %s is not below the backflow estimate", s.Advantage.Upper)
	}
	// The recorded numbers give exactly the recorded brackets (checked
	// again here in rationals, independently of Certificate's code path).
	e, tl := rat(t, s.Errors.AlphaRounding.String()), rat(t, s.Errors.DiscardedPart.String())
	need := new(big.Rat).Neg(new(big.Rat).Add(rat(t, s.AdvantageWitness.Rayleigh.Upper.String()), e))
	if lo.Cmp(need) > 0 {
		t.Errorf("lower end %s exceeds what the witness gives, %s", s.Advantage.Lower, need.FloatString(20))
	}
	gl := rat(t, s.GalerkinLowest.String())
	if gl.Sign() > 0 {
		gl = new(big.Rat)
	}
	up := new(big.Rat).Add(new(big.Rat).Sub(tl, gl), e)
	if hi.Cmp(up) < 0 {
		t.Errorf("upper end %s below what the Galerkin bound gives, %s", s.Advantage.Upper, up.FloatString(20))
	}
	if !strings.Contains(s.Statement, "alpha = 50") || !strings.Contains(s.Statement, s.Advantage.Lower.String()) {
		t.Errorf("statement %q", s.Statement)
	}
	if s.Errors.DiscardedEtaX.String() != r.Ellipses.TailX || s.Certifier.QuadratureNodes != r.QuadratureNodes {
		t.Errorf("ellipses or quadrature not recorded")
	}
}

// Physical units are recorded with the exact 2*pi*r value; hbar from the
// exact h = 6.62607015e-34 J s (CODATA 2018).
func TestCertificateUnits(t *testing.T) {
	a, err := AlphaFromUnits("1u", "1um", "1ms")
	if err != nil {
		t.Fatal(err)
	}
	r, err := Compute(a, Options{Width: 1e-6})
	if err != nil {
		t.Fatal(err)
	}
	c := certificateFor(t, r)
	s := c.Strip
	if !strings.HasPrefix(s.Alpha.Value.String(), "2*pi*") || s.Alpha.Units == nil || s.Alpha.Units.Length != "1um" {
		t.Errorf("alpha %+v", s.Alpha)
	}
	if rat(t, s.Errors.AlphaRounding.String()).Sign() <= 0 {
		t.Errorf("alpha rounding %s should be positive for an irrational alpha", s.Errors.AlphaRounding)
	}
}

func TestCertificateRejectsBadResults(t *testing.T) {
	if _, err := (*Result)(nil).Certificate(); err == nil {
		t.Error("nil result accepted")
	}
	r := *bracketAt(t, "50")
	r.Basis = "other"
	if _, err := r.Certificate(); err == nil {
		t.Error("unknown basis accepted")
	}
	r = *bracketAt(t, "50")
	r.Errors.DiscardedPart = "inf"
	if _, err := r.Certificate(); err == nil {
		t.Error("infinite error term accepted")
	}
	r = *bracketAt(t, "50")
	r.DeficitWitness.Rayleigh.Lower = "5" // the witness would put sup spec above the Galerkin bound
	if _, err := r.Certificate(); err == nil {
		t.Error("empty deficit bracket accepted")
	}
}

// The schema's basis text is the certifier's.
func TestBasisDescriptionMatchesSchema(t *testing.T) {
	if BasisDescription != certificates.StripBasis {
		t.Errorf("BasisDescription and certificates.StripBasis differ")
	}
}

// exactDecimals writes float64 values exactly, including subnormals, in
// the exponent form the strip schema uses (every exponent written).
func TestExactFloat(t *testing.T) {
	exactFloat := func(x float64) string {
		var n certificates.Parser
		d := exactDecimals(&n, []float64{x})
		if err := n.Err(); err != nil {
			t.Fatalf("%v: %v", x, err)
		}
		return d[0].String()
	}
	for _, x := range []float64{1, -1, 0.1, 1.0 / 3, 2.7614625649615566e-32, -5e-324, math.MaxFloat64, 0x1p-1022, 123456789.125} {
		s := exactFloat(x)
		want, _ := new(big.Float).SetFloat64(x).Rat(nil)
		got, err := certificates.ParseSci(s)
		if err != nil || got.Rat().Cmp(want) != 0 {
			t.Errorf("%v: %q (%v)", x, s, err)
		}
	}
	if exactFloat(0) != "0" || exactFloat(0.5) != "5e-01" || exactFloat(1) != "1e+00" {
		t.Errorf("0 -> %q, 0.5 -> %q, 1 -> %q", exactFloat(0), exactFloat(0.5), exactFloat(1))
	}
}
