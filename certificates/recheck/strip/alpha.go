package strip

import (
	"fmt"
	"math/big"
	"regexp"
	"strings"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// The strip verifier's own reading of alpha. From physical units,
// alpha = m L^2/(hbar t) = 2 pi m L^2/(h t) with the exact SI value
// h = 6.62607015e-34 J s (CODATA 2018; exact since the 2019 SI) and the
// unified atomic mass unit 1.66053906660e-27 kg (CODATA 2018 recommended
// value).
const (
	stripPlanck = "6.62607015e-34"
	stripDalton = "1.66053906660e-27"
)

var (
	stripMass   = map[string]string{"kg": "1", "g": "1e-3", "mg": "1e-6", "u": stripDalton}
	stripLength = map[string]string{"m": "1", "mm": "1e-3", "um": "1e-6", "µm": "1e-6", "μm": "1e-6", "nm": "1e-9"}
	stripTime   = map[string]string{"s": "1", "ms": "1e-3", "us": "1e-6", "µs": "1e-6", "μs": "1e-6", "ns": "1e-9"}
	stripQty    = regexp.MustCompile(`^\s*([+-]?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]{1,4})?)\s*([A-Za-zµμ]+)\s*$`)
)

// stripQuantity reads "number unit" exactly, in SI base units.
func stripQuantity(s, what string, units map[string]string) (*big.Rat, error) {
	m := stripQty.FindStringSubmatch(s)
	if m == nil {
		return nil, fmt.Errorf("%s %q is not a number followed by a unit", what, s)
	}
	v, ok := new(big.Rat).SetString(m[1])
	if !ok || v.Sign() <= 0 {
		return nil, fmt.Errorf("%s %q: the number must be positive", what, s)
	}
	f, ok := units[m[2]]
	if !ok {
		return nil, fmt.Errorf("%s %q: unknown unit %q", what, s, m[2])
	}
	fr, ok := new(big.Rat).SetString(f)
	if !ok {
		return nil, fmt.Errorf("%s %q: the factor %q of unit %q does not read", what, s, f, m[2])
	}
	return v.Mul(v, fr), nil
}

// stripAlphaFromUnits returns r with alpha = 2 pi r = 2 pi m L^2/(h t).
func stripAlphaFromUnits(u *certificates.StripUnits) (*big.Rat, error) {
	m, err := stripQuantity(u.Mass, "mass", stripMass)
	if err != nil {
		return nil, err
	}
	l, err := stripQuantity(u.Length, "length", stripLength)
	if err != nil {
		return nil, err
	}
	t, err := stripQuantity(u.Time, "time", stripTime)
	if err != nil {
		return nil, err
	}
	h, ok := new(big.Rat).SetString(stripPlanck)
	if !ok {
		return nil, fmt.Errorf("the Planck constant %q does not read", stripPlanck)
	}
	r := new(big.Rat).Mul(m, new(big.Rat).Mul(l, l))
	return r.Quo(r, new(big.Rat).Mul(h, t)), nil
}

// stripAlphaPrec is the precision of the alpha enclosure.
const stripAlphaPrec = 256

// ratB encloses the rational r at prec bits.
func ratB(r *big.Rat, prec uint) interval.B {
	z := interval.NewB(0, prec)
	// SetInt at precision 0 is exact; Between rounds outward to prec bits.
	num, den := new(big.Float).SetInt(r.Num()), new(big.Float).SetInt(r.Denom())
	return z.Between(num, num).Quo(z.Between(den, den))
}

// checkAlpha re-derives alpha and tests the recorded alpha enclosure and
// the alpha rounding term. It returns an enclosure of
// |alpha - alpha_used|/(2 pi).
func (v *stripVerifier) checkAlpha() (interval.B, bool) {
	s := v.s
	r, twoPi, err := certificates.ParseStripAlpha(s.Alpha.Value)
	if err != nil {
		v.fail(recheck.Failure{Where: "alpha", Message: err.Error()})
		return interval.B{}, false
	}
	if u := s.Alpha.Units; u != nil {
		ru, err := stripAlphaFromUnits(u)
		switch {
		case err != nil:
			v.fail(recheck.Failure{Where: "alpha.units", Message: err.Error()})
			return interval.B{}, false
		case !twoPi || ru.Cmp(r) != 0:
			v.fail(recheck.Failure{Where: "alpha.units", Refuted: true,
				Message: fmt.Sprintf("the units give alpha = 2*pi*%s, not %s", checknum.RatText(ru), s.Alpha.Value)})
			return interval.B{}, false
		}
	}
	a := ratB(r, stripAlphaPrec)
	if twoPi {
		a = a.Mul(a.Pi()).Scale(1)
	}
	v.alpha = a
	lo, hi := v.rat(s.Alpha.Lower), v.rat(s.Alpha.Upper)
	al, ah := a.Endpoints()
	alR, _ := al.Rat(nil) // exact
	ahR, _ := ah.Rat(nil)
	switch {
	case lo.Cmp(ahR) > 0 || hi.Cmp(alR) < 0:
		v.fail(recheck.Failure{Where: "alpha", Refuted: true,
			Message: fmt.Sprintf("the recorded enclosure [%s, %s] does not contain alpha = %s (which lies in [%s, %s])",
				s.Alpha.Lower, s.Alpha.Upper, s.Alpha.Value, interval.DecimalDown(al, 20), interval.DecimalUp(ah, 20))})
	case lo.Cmp(alR) > 0 || hi.Cmp(ahR) < 0:
		v.fail(recheck.Failure{Where: "alpha",
			Message: fmt.Sprintf("cannot prove that [%s, %s] contains alpha = %s", s.Alpha.Lower, s.Alpha.Upper, s.Alpha.Value)})
	}

	au := v.rat(s.AlphaUsed)
	d := a.Sub(ratB(au, stripAlphaPrec)).Abs()
	twoPiB := a.Pi().Scale(1)
	q := d.Quo(twoPiB)
	e := v.rat(s.Errors.AlphaRounding)
	ql, qh := q.Endpoints()
	qlR, _ := ql.Rat(nil)
	qhR, _ := qh.Rat(nil)
	switch {
	case e.Cmp(qlR) < 0:
		v.fail(recheck.Failure{Where: "errors.alpha_rounding", Refuted: true,
			Message: fmt.Sprintf("alpha_rounding %s is below |alpha - alpha_used|/(2 pi), which is at least %s", s.Errors.AlphaRounding, interval.DecimalDown(ql, 8)),
			By:      checknum.RatDecimal(new(big.Rat).Sub(qlR, e))})
	case e.Cmp(qhR) < 0:
		v.fail(recheck.Failure{Where: "errors.alpha_rounding",
			Message: fmt.Sprintf("cannot prove alpha_rounding %s >= |alpha - alpha_used|/(2 pi) (at most %s)", s.Errors.AlphaRounding, interval.DecimalUp(qh, 8))})
	}
	return q, true
}

// stripDescribe names the problem in one line.
func stripDescribe(s *certificates.Strip) string {
	a := s.Alpha.Value
	if strings.HasPrefix(a, certificates.StripTwoPiPrefix) {
		a = fmt.Sprintf("%s (in [%s, %s])", a, s.Alpha.Lower, s.Alpha.Upper)
	}
	if u := s.Alpha.Units; u != nil {
		a += fmt.Sprintf(" from m = %s, L = %s, t = %s", u.Mass, u.Length, u.Time)
	}
	return "finite strip [-1, 0], alpha = " + a
}
