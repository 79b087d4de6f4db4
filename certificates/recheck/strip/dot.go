package strip

import (
	"math"

	"wedgebound/interval"
)

// This file provides dot products of float64 vectors with a rigorous,
// nearly correctly rounded error bound, for the strip verifier's matrix
// products (plain interval accumulation would lose a factor of the vector
// length in the radius).
//
// Method (error-free transformations). With round-to-nearest and no
// overflow, s + t = a + b exactly for s = fl(a + b) and
// t = (a - (s - z)) + (b - z), z = s - a (TwoSum; D. E. Knuth, The Art of
// Computer Programming vol. 2, 1969, from memory), and p + e = a b exactly
// for p = fl(a b), e = fma(a, b, -p) whenever the exact residual a b - p is
// representable, which holds when |p| >= 2^-900 (far above the underflow
// threshold; smaller products go to an interval term instead). So
//
//	sum a_i b_i = s + sum (t_i + e_i) + (tiny products)
//
// exactly, where s is the running TwoSum of the p_i. The correction terms
// are summed in plain float64; recursive summation of m numbers has error
// at most gamma_{m-1} sum |x_i|, gamma_k = k u/(1 - k u), u = 2^-53 (N. J.
// Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., 2002,
// eq. (4.4), from memory), and each added item fl(t + e) carries one more
// rounding, so 2m terms are charged gamma_{2m} times the (upward-corrected)
// float sum of their magnitudes.

const (
	unitRoundoff = 0x1p-53
	tinyProduct  = 0x1p-900
)

// stripAcc accumulates exact float64 products and addends.
type stripAcc struct {
	s, c, cabs float64
	terms      int
	tiny       interval.F
}

func twoSum(a, b float64) (s, t float64) {
	s = a + b
	z := s - a
	t = (a - (s - z)) + (b - z)
	return
}

// addProd adds the exact product a b.
func (q *stripAcc) addProd(a, b float64) {
	p := a * b
	if p != 0 && math.Abs(p) < tinyProduct {
		q.tiny = q.tiny.Add(interval.PointF(a).Mul(interval.PointF(b)))
		return
	}
	e := math.FMA(a, b, -p)
	s, t := twoSum(q.s, p)
	q.s = s
	q.c += t + e
	q.cabs += math.Abs(t) + math.Abs(e)
	q.terms++
}

// add adds the exact float64 v.
func (q *stripAcc) add(v float64) {
	s, t := twoSum(q.s, v)
	q.s = s
	q.c += t
	q.cabs += math.Abs(t)
	q.terms++
}

// result returns v and err with |exact sum - v| <= err (err rounded up), or
// err = +Inf when the accumulation overflowed.
func (q *stripAcc) result() (v, err float64) {
	v, r := twoSum(q.s, q.c)
	if math.IsInf(v, 0) || math.IsNaN(v) || math.IsNaN(r) || math.IsInf(q.cabs, 0) {
		return 0, math.Inf(1)
	}
	m := float64(2*q.terms + 2)
	g := interval.PointF(m * unitRoundoff).Quo(interval.PointF(1).Sub(interval.PointF(m * unitRoundoff)))
	// sum |x_i| <= cabs/(1 - gamma) <= 2 cabs, as m u < 1/2 for any length
	// this program handles.
	bound := g.Mul(interval.PointF(q.cabs).Scale(1)).Add(interval.PointF(math.Abs(r))).Add(q.tiny.Abs())
	return v, bound.Hi()
}

// exactDot returns v and err with |sum x_i y_i - v| <= err.
func exactDot(x, y []float64) (v, err float64) {
	var q stripAcc
	for i := range x {
		q.addProd(x[i], y[i])
	}
	return q.result()
}

// midRad splits an enclosure into a float midpoint and a radius r with
// |v - mid| <= r for every v in x (r rounded up).
func midRad(x interval.F) (mid, rad float64) {
	mid = x.Mid().Lo()
	up := interval.PointF(x.Hi()).Sub(interval.PointF(mid)).Hi()
	dn := interval.PointF(mid).Sub(interval.PointF(x.Lo())).Hi()
	return mid, math.Max(up, dn)
}
