// Package matched verifies matched-bracket certificates (the matched
// position-and-momentum advantage M(alpha) = sup over v in [-1, 0] of
// lambda_max(C_v - 1[x > v]), see certificates.Matched). For every cell
// [lo, hi] it re-proves lambda_max(C_lo - 1[x > hi]) <= upper with its own
// Galerkin matrix (Clenshaw-Curtis entries, its own remainder and
// discarded-part bounds, its own Cholesky proof); for the witness it
// re-encloses the Rayleigh quotient; it re-derives alpha and checks the
// cover and the claimed ends exactly.
package matched

import (
	"fmt"
	"math"
	"math/big"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

func init() { recheck.Register(certificates.KindMatched, Checker{}) }

// Checker verifies matched-bracket certificates.
type Checker struct{}

// Detail is the verifier's record.
type Detail struct {
	Cells int `json:"cells"`
	// Highest is the largest cell bound the verifier proved (its own
	// numbers, rounded up); WitnessRayleigh its enclosure of the witness's
	// Rayleigh quotient.
	Highest         string `json:"highest_proved"`
	WitnessRayleigh string `json:"witness_rayleigh"`
}

// NewDetail returns a zero Detail.
func (Checker) NewDetail() any { return &Detail{} }

// alphaB re-derives alpha as an enclosure at 256 bits.
func alphaB(a certificates.StripAlpha) (interval.B, error) {
	r, twoPi := a.Value.Factor(), a.Value.TwoPi()
	if r == nil {
		return interval.B{}, fmt.Errorf("alpha.value: missing number")
	}
	if u := a.Units; u != nil {
		ru, err := u.AlphaFactor()
		if err != nil {
			return interval.B{}, err
		}
		if !twoPi || ru.Cmp(r) != 0 {
			return interval.B{}, fmt.Errorf("the units give alpha = 2*pi*%s, not %s", ru.RatString(), a.Value)
		}
	}
	z := interval.NewB(0, 256)
	num, den := new(big.Float).SetInt(r.Num()), new(big.Float).SetInt(r.Denom())
	v := z.Between(num, num).Quo(z.Between(den, den))
	if twoPi {
		v = v.Mul(z.Pi()).Scale(1)
	}
	return v, nil
}

// f64 returns the float64 value of an exact decimal and whether it is
// exact.
func f64(n interface{ Rat() *big.Rat }) (float64, bool) {
	r := n.Rat()
	f, exact := r.Float64()
	return f, exact
}

func ratOf(x float64) *big.Rat { r, _ := new(big.Float).SetFloat64(x).Rat(nil); return r }

// nodesFor picks the rule size: an even n comfortably above the basis.
func nodesFor(N int, al float64) int {
	n := int(1.25*float64(N)+0.25*al) + 12
	return n + n%2
}

// buildAdaptive builds the system with a rule that grows (at most three
// times) while the largest entry remainder exceeds 1e-11.
func buildAdaptive(alpha interval.B, a float64, ps []piece, N int, al float64) (*system, error) {
	n := nodesFor(N, al)
	for try := 0; ; try++ {
		sys, err := build(alpha, a, ps, n)
		if err != nil {
			return nil, err
		}
		worst := 0.0
		for _, row := range sys.E {
			for _, e := range row {
				worst = math.Max(worst, e)
			}
		}
		if worst <= 1e-11 || try == 3 {
			return sys, nil
		}
		n = int(1.4*float64(n)) + 2
		n += n % 2
	}
}

// Check verifies a matched-bracket certificate.
func (Checker) Check(c *certificates.Certificate, opt recheck.Options) (*recheck.Result, error) {
	if c.Kind != certificates.KindMatched || c.Matched == nil {
		return nil, fmt.Errorf("certificate kind %q is not %q: %w", c.Kind, certificates.KindMatched, recheck.ErrUnsupported)
	}
	m := c.Matched
	det := &Detail{Cells: len(m.Cells)}
	res := &recheck.Result{Problem: "matched advantage on the strip [-1, 0], alpha = " + m.Alpha.Value.String(), Bound: m.Lower.String(),
		Statement: fmt.Sprintf("M(alpha) in [%s, %s]", m.Lower, m.Upper), Detail: det}
	fail := func(f recheck.Failure) { res.Failures = append(res.Failures, f) }
	alpha, err := alphaB(m.Alpha)
	if err != nil {
		fail(recheck.Failure{Where: "alpha", Message: err.Error(), Refuted: true})
		return res, nil
	}
	al, ah := alpha.Endpoints()
	alR, _ := al.Rat(nil)
	ahR, _ := ah.Rat(nil)
	if m.Alpha.Lower.Rat().Cmp(alR) > 0 || m.Alpha.Upper.Rat().Cmp(ahR) < 0 {
		fail(recheck.Failure{Where: "alpha", Message: "the recorded enclosure does not contain alpha", Refuted: true})
	}
	alF := toF(alpha).Mid().Lo()
	if !(alF > 0) || alF > 1000 {
		fail(recheck.Failure{Where: "alpha", Message: "alpha is outside (0, 1000], beyond what this verifier attempts"})
		return res, nil
	}

	// Witness.
	w := m.Witness
	v, exact := f64(w.V)
	if !exact {
		fail(recheck.Failure{Where: "witness.v", Message: "the threshold is not a float64 value; this verifier needs one"})
	} else {
		ps := pieces(v, w.Sizes)
		N := w.Sizes[0] + w.Sizes[1]
		sys, err := buildAdaptive(alpha, v, ps, N, alF)
		if err != nil {
			return nil, err
		}
		coef := make([]interval.F, N)
		for i, s := range w.Coefficients {
			r := s.Rat()
			lo := new(big.Float).SetPrec(53).SetMode(big.ToNegativeInf).SetRat(r)
			hi := new(big.Float).SetPrec(53).SetMode(big.ToPositiveInf).SetRat(r)
			coef[i] = interval.F{}.Between(lo, hi)
		}
		var num, quad, den interval.F
		for r := 0; r < N; r++ {
			var s interval.F
			for k := 0; k < N; k++ {
				s = s.Add(sys.H[r][k].Mul(coef[k]))
				quad = quad.Add(coef[r].Abs().Mul(coef[k].Abs()).Mul(interval.PointF(sys.E[r][k])))
			}
			num = num.Add(s.Mul(coef[r]))
			den = den.Add(coef[r].Sqr())
		}
		rq := num.Pad(interval.PointF(quad.Hi())).Quo(den)
		lo, hi, err := interval.Decimals(rq, 17)
		if err != nil {
			lo, hi = "-inf", "inf" // not enclosed: the checks below fail
		}
		det.WitnessRayleigh = "[" + lo + ", " + hi + "]"
		claim := w.Rayleigh.Rat()
		switch {
		case claim.Cmp(ratOf(rq.Hi())) > 0:
			fail(recheck.Failure{Where: "witness.rayleigh", Message: fmt.Sprintf("the Rayleigh quotient is at most %s, below the recorded %s", hi, w.Rayleigh), Refuted: true, Bound: true})
		case claim.Cmp(ratOf(rq.Lo())) > 0:
			fail(recheck.Failure{Where: "witness.rayleigh", Message: fmt.Sprintf("cannot prove the Rayleigh quotient >= %s (enclosure %s)", w.Rayleigh, det.WitnessRayleigh), Bound: true})
		}
	}
	// lower <= max(witness, 0): the sup over v includes V, and M >= 0.
	lower := m.Lower.Rat()
	if lower.Sign() > 0 && lower.Cmp(w.Rayleigh.Rat()) > 0 {
		fail(recheck.Failure{Where: "lower", Message: "lower exceeds the witness's Rayleigh quotient", Refuted: true, Bound: true})
	}

	// Cells.
	upper := m.Upper.Rat()
	highest := 0.0
	for i, cell := range m.Cells {
		where := fmt.Sprintf("cells[%d]", i)
		lo, e1 := f64(cell.Lo)
		hi, e2 := f64(cell.Hi)
		if !e1 || !e2 {
			fail(recheck.Failure{Where: where, Message: "cell ends are not float64 values; this verifier needs them", Lo: cell.Lo.String(), Hi: cell.Hi.String()})
			continue
		}
		U := cell.Upper.Rat()
		if U.Cmp(upper) > 0 {
			fail(recheck.Failure{Where: where, Message: "the cell bound exceeds the claimed upper end", Refuted: true, Bound: true, Lo: cell.Lo.String(), Hi: cell.Hi.String()})
		}
		ps := pieces(hi, cell.Sizes)
		N := cell.Sizes[0] + cell.Sizes[1]
		sys, err := buildAdaptive(alpha, lo, ps, N, alF)
		if err != nil {
			return nil, err
		}
		uF, _ := U.Float64()
		proved, ok := proveBelow(sys, uF, opt.Workers)
		if !ok || ratOf(proved).Cmp(U) > 0 {
			fail(recheck.Failure{Where: where, Lo: cell.Lo.String(), Hi: cell.Hi.String(), Bound: true,
				Message: fmt.Sprintf("cannot prove lambda_max(C_lo - 1[x > hi]) <= %s (verifier's bound %.12g, discarded part %.3g)", cell.Upper, proved, sys.disc)})
		}
		highest = math.Max(highest, proved)
	}
	det.Highest = fmt.Sprintf("%.12g", highest)
	if len(res.Failures) == 0 {
		res.Recomputed = fmt.Sprintf("M(alpha) in [%s, %s] (witness enclosure %s, largest cell bound proved by the verifier)", m.Lower, interval.DecimalUp(bigOf(highest), 12), det.WitnessRayleigh)
	}
	return res, nil
}

// proveBelow proves lambda_max(T) <= the returned value for the operator
// whose Galerkin system is sys, aiming at target: with Hc the float
// midpoint matrix, A = sigma I - Hc = R^T R - E for a float Cholesky factor
// R gives lambda_max(Hc) <= sigma + ||E||_F; the exact Galerkin matrix is
// within ||radius||_F + ||remainders||_F of Hc (Weyl); T <= P T P +
// (C - P C P) and P T P has spectrum spec(G) and 0.
func proveBelow(sys *system, target float64, workers int) (float64, bool) {
	N := sys.N
	Hc := make([][]float64, N)
	var rad2, e2 interval.F
	for i := range Hc {
		Hc[i] = make([]float64, N)
		for j := 0; j < N; j++ {
			h := sys.H[i][j]
			mid := h.Mid().Lo()
			Hc[i][j] = mid
			r := math.Max(interval.PointF(h.Hi()).Sub(interval.PointF(mid)).Hi(), interval.PointF(mid).Sub(interval.PointF(h.Lo())).Hi())
			rad2 = rad2.Add(interval.PointF(r).Sqr())
			e2 = e2.Add(interval.PointF(sys.E[i][j]).Sqr())
		}
	}
	extra := rad2.Sqrt().Add(e2.Sqrt()).Hi()
	slack := extra + sys.disc
	for try := 0; try < 6; try++ {
		sigma := target - slack - 1e-12*float64(int(1)<<(3*try))
		if try == 5 {
			sigma = target - slack - 1e-6
		}
		R, ok := cholesky(Hc, sigma)
		if !ok {
			continue
		}
		res := residual(Hc, R, sigma, workers)
		g := interval.PointF(sigma).Add(interval.PointF(res)).Add(interval.PointF(extra))
		return g.Max(interval.PointF(0)).Add(interval.PointF(sys.disc)).Hi(), true
	}
	return math.Inf(1), false
}

// cholesky factors sigma I - Hc = R^T R in float64 (R upper triangular,
// stored by rows); false when a pivot is not positive.
func cholesky(Hc [][]float64, sigma float64) ([][]float64, bool) {
	N := len(Hc)
	R := make([][]float64, N)
	for i := range R {
		R[i] = make([]float64, N)
	}
	for j := 0; j < N; j++ {
		s := sigma - Hc[j][j]
		for k := 0; k < j; k++ {
			s -= R[k][j] * R[k][j]
		}
		if !(s > 0) {
			return nil, false
		}
		R[j][j] = math.Sqrt(s)
		for i := j + 1; i < N; i++ {
			t := -Hc[j][i]
			for k := 0; k < j; k++ {
				t -= R[k][j] * R[k][i]
			}
			R[j][i] = t / R[j][j]
		}
	}
	return R, true
}

// residual encloses (upper end) ||R^T R - (sigma I - Hc)||_F.
func residual(Hc, R [][]float64, sigma float64, workers int) float64 {
	N := len(Hc)
	rows := make([]interval.F, N)
	checknum.For(N, workers, func(i int) {
		var acc interval.F
		for j := 0; j < N; j++ {
			var s interval.F
			for k := 0; k <= min(i, j); k++ {
				s = s.Add(interval.PointF(R[k][i]).Mul(interval.PointF(R[k][j])))
			}
			a := interval.PointF(Hc[i][j]).Neg()
			if i == j {
				a = interval.PointF(sigma).Sub(interval.PointF(Hc[i][j]))
			}
			acc = acc.Add(s.Sub(a).Sqr())
		}
		rows[i] = acc
	})
	var sum interval.F
	for _, r := range rows {
		sum = sum.Add(r)
	}
	return sum.Sqrt().Hi()
}
