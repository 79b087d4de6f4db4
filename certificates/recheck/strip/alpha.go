package strip

import (
	"fmt"
	"math/big"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

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
	r, twoPi := s.Alpha.Value.Factor(), s.Alpha.Value.TwoPi()
	if r == nil {
		v.fail(recheck.Failure{Where: "alpha", Message: "alpha.value: missing number"})
		return interval.B{}, false
	}
	if u := s.Alpha.Units; u != nil {
		ru, err := u.AlphaFactor()
		switch {
		case err != nil:
			v.fail(recheck.Failure{Where: "alpha.units", Message: err.Error()})
			return interval.B{}, false
		case !twoPi || ru.Cmp(r) != 0:
			v.fail(recheck.Failure{Where: "alpha.units", Refuted: true,
				Message: fmt.Sprintf("the units give alpha = 2*pi*%s, not %s", certificates.FractionText(ru), s.Alpha.Value)})
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
	a := s.Alpha.Value.String()
	if s.Alpha.Value.TwoPi() {
		a = fmt.Sprintf("%s (in [%s, %s])", a, s.Alpha.Lower, s.Alpha.Upper)
	}
	if u := s.Alpha.Units; u != nil {
		a += fmt.Sprintf(" from m = %s, L = %s, t = %s", u.Mass, u.Length, u.Time)
	}
	return "finite strip [-1, 0], alpha = " + a
}
