package precession

import (
	"errors"
	"math"

	"wedgebound/certify"
	"wedgebound/interval"
)

// Witness is a finite state in one sector: psi = sum_a X_a |2(3a+J0)> +
// sum_b Y_b |2(3b+K0)+1> with integer coefficients (exact in float64).
type Witness struct {
	Sector Sector
	X, Y   []float64
	// Rayleigh encloses <psi|Q3|psi>/<psi|psi>.
	Rayleigh interval.F
	// MatVecError bounds (approximately, informational) the part of the
	// Rayleigh quotient's enclosure width due to rounding in B Y and to the
	// enclosures of the matrix entries.
	MatVecError float64
}

const witnessScale = 1e9

// witnessY builds the odd half of the witness from the lemma's extremal
// vector v at lambda: y_b = (sum_a M_{a+P,b} v_a)/(c_b G_b), b < n, scaled to
// integers of at most witnessScale.
func (s Sector) witnessY(t *Table, v []float64, lambda, eps float64, n int) []float64 {
	y := make([]float64, n)
	big := 0.0
	for b := 0; b < n; b++ {
		sum := 0.0
		for a := range v {
			sum += t.Mf(a+s.P, b) * v[a]
		}
		g2 := s.G2f(t, b)
		y[b] = sum / ((lambda/g2 - 1 - eps) * math.Sqrt(g2))
		big = math.Max(big, math.Abs(y[b]))
	}
	for b := range y {
		y[b] = math.Round(y[b] / big * witnessScale)
	}
	return y
}

// signedRow returns, for the odd coefficients y, enclosures of
// (-1)^b sqrt(2/pi) beta_{3b+K0} y_b as midpoints m and the largest relative
// radius.
func (s Sector) signedRow(t *Table, y []float64) ([]float64, float64) {
	sq := Sqrt2OverPi()
	m := make([]float64, len(y))
	rel := 0.0
	for b, yb := range y {
		if yb == 0 {
			continue // m[b] = 0 exactly
		}
		v := sq.Mul(t.Beta2(3*b + s.K0).Sqrt()).Mul(interval.PointF(yb))
		if b%2 != 0 {
			v = v.Neg()
		}
		mid := (v.Lo() + v.Hi()) / 2
		m[b] = mid
		if mid != 0 {
			rel = math.Max(rel, math.Max(v.Hi()-mid, mid-v.Lo())/math.Abs(mid))
		} else if v.Lo() != 0 || v.Hi() != 0 {
			rel = math.Inf(1)
		}
	}
	return m, rel
}

// MatVec encloses (B y)_a for a < rows: (B y)_a = (-1)^(J0+K0+a)
// alpha_{3a+J0}/3 sum_b m_b/(2(b-a-P)+1), with m from signedRow. The sum is
// computed in float64 and bounded by the a priori error of a float dot
// product: |fl - exact| <= (gamma_n + 3u) S/(1 - gamma_n) + rel S (1+4u)/(1-gamma_n),
// S the float sum of |m_b/(2d+1)|, gamma_n = n u/(1 - n u), u = 2^-53.
func (s Sector) MatVec(t *Table, y []float64, rows, workers int) ([]interval.F, []float64, error) {
	m, rel := s.signedRow(t, y)
	if math.IsInf(rel, 0) {
		return nil, nil, errors.New("an entry of the witness is not enclosed")
	}
	n := len(y)
	off := rows + s.P + 1
	recip := make([]float64, off+n+1)
	for d := -off; d <= n; d++ {
		recip[d+off] = 1 / float64(2*d+1)
	}
	const u = 1.0 / (1 << 53)
	gamma := float64(n+2) * u / (1 - float64(n+2)*u)
	out := make([]interval.F, rows)
	errs := make([]float64, rows)
	third := interval.PointF(1).Quo(interval.PointF(3))
	certify.For(rows, workers, func(a int) {
		base := -a - s.P + off
		r := recip[base : base+n]
		sum, abs := 0.0, 0.0
		for b, mb := range m {
			p := mb * r[b]
			sum += p
			abs += math.Abs(p)
		}
		e := ((gamma+3*u)/(1-gamma) + rel*(1+4*u)/(1-gamma)) * abs
		e = e * (1 + 4*u)
		errs[a] = e
		v := interval.NewF(sum, sum).Pad(interval.PointF(e)).Mul(t.A[3*a+s.J0]).Mul(third)
		if (s.J0+s.K0+a)%2 != 0 {
			v = v.Neg()
		}
		out[a] = v
	})
	return out, errs, nil
}

// Prove builds the even half of the witness from B y and encloses its
// Rayleigh quotient 1/2 + <x, B y>/(|x|^2 + |y|^2).
func (s Sector) Prove(t *Table, y []float64, rows, workers int) (*Witness, error) {
	by, e, err := s.MatVec(t, y, rows, workers)
	if err != nil {
		return nil, err
	}
	ny := 0.0
	for _, v := range y {
		ny += v * v
	}
	nb := 0.0
	for _, v := range by {
		c := (v.Lo() + v.Hi()) / 2
		nb += c * c
	}
	k := math.Sqrt(ny / nb)
	x := make([]float64, rows)
	for a, v := range by {
		x[a] = math.Round((v.Lo() + v.Hi()) / 2 * k)
	}
	return s.Rayleigh(t, x, y, by, e)
}

// Rayleigh encloses 1/2 + <x, B y>/(|x|^2+|y|^2) given enclosures of B y.
func (s Sector) Rayleigh(t *Table, x, y []float64, by []interval.F, errs []float64) (*Witness, error) {
	num := interval.PointF(0)
	for a, xa := range x {
		num = num.Add(by[a].Mul(interval.PointF(xa)))
	}
	den := interval.PointF(0)
	for _, v := range x {
		den = den.Add(interval.PointF(v).Sqr())
	}
	for _, v := range y {
		den = den.Add(interval.PointF(v).Sqr())
	}
	r := interval.PointF(0.5).Add(num.Quo(den))
	e := 0.0
	for a, xa := range x {
		e += math.Abs(xa) * t.Af[3*a+s.J0] / 3 * errs[a]
	}
	e = e / den.Lo() * (1 + 1e-6)
	if !r.IsFinite() {
		return nil, errors.New("the Rayleigh quotient is not enclosed")
	}
	return &Witness{Sector: s, X: x, Y: y, Rayleigh: r, MatVecError: e}, nil
}
