package interval

import (
	"math"
	"math/big"
	"reflect"
	"sync"
)

// This file holds the ingredients of the Stirling series: exact Bernoulli
// numbers, the series coefficients as cached intervals, and the choice of
// shift and length.
//
// Series and remainder. With the periodic Bernoulli function
// P(t) = B_{2n}(t - floor t), Olver (Asymptotics and Special Functions,
// 1974, ch. 8 §4; quoted in NIST DLMF 5.11(ii)) writes for Re z > 0
//
//	ln Gamma(z) = (z - 1/2) ln z - z + ln(2 pi)/2
//	              + sum_{k=1}^{n-1} B_{2k} / (2k (2k-1) z^{2k-1}) + R_n(z),
//	R_n(z) = integral_0^inf (B_{2n} - P(t)) / (2n (z + t)^{2n}) dt.
//
// Differentiating j times under the integral (it converges uniformly on
// compact subsets of Re z > 0) gives the series of d^j/dz^j ln Gamma, that
// is ln Gamma (j = 0), digamma (j = 1), trigamma (j = 2), tetragamma (j = 3):
//
//	term_k = a_k z^{-(2k+j-1)},  a_k = (-1)^j B_{2k} (2k+j-2)! / (2k)!,
//	R_n^{(j)}(z) = (-1)^j (2n+j-1)!/(2n)! integral_0^inf (B_{2n} - P(t)) (z+t)^{-2n-j} dt.
//
// Bound. (i) |B_{2n}(x)| <= |B_{2n}| on [0, 1] (DLMF 24.9.1), so B_{2n} - P(t)
// never changes sign. (ii) For |ph z| = theta < pi and t >= 0,
// |z + t| >= (|z| + t) cos(theta/2), because
// |z+t|^2 - (|z|+t)^2 cos^2(theta/2) = (1 - cos theta)(|z| - t)^2 / 2 >= 0.
// Hence |R_n^{(j)}(z)| <= sec^{2n+j}(theta/2) |R_n^{(j)}(|z|)|. (iii) On the
// positive axis R_n^{(j)}(x) = term_n(x) + R_{n+1}^{(j)}(x), and by (i) the two
// remainders have the constant, opposite signs of (-1)^j B_{2n} and
// (-1)^j B_{2n+2}; so |R_n^{(j)}(x)| <= |term_n(x)|. Together:
//
//	|R_n^{(j)}(z)| <= |a_n| sec^{2n+j}(theta/2) |z|^{-(2n+j-1)}
//	               = |a_n| |z| v^{n + j/2},   v = 2 / ((|z| + Re z) |z|),
//
// using sec^2(theta/2) = 2|z| / (|z| + Re z). For j = 0, 1 this is the
// statement of DLMF 5.11(ii). The right side decreases in |z| and in Re z,
// so over a rectangle it is bounded by its value at the lower bounds of |z|
// and Re z. The bound is added as a square of that half-width.

// bernoulliEven returns B_0, B_2, ..., B_{2m} (m >= n) exactly. The
// numbers come from the integer tangent numbers T_k (Brent and Harvey, "Fast
// computation of Bernoulli, tangent and secant numbers", 2011, Algorithm
// TangentNumbers) through B_{2k} = (-1)^(k-1) 2k T_k / (4^k (4^k - 1)).
//
// The algorithm starts from t_j = (j-1)! and, in pass k = 2, 3, ..., updates
// t_j <- (j-k) t_{j-1} + (j-k+2) t_j for j >= k; after pass k, t_k = T_k
// and it is not touched again. It is run here column by column, so that
// the table can grow without starting over: column j holds t_j after the
// passes 1..j, and its entry after pass k needs only column j-1 after pass
// k (entry t_{j-1} is final after pass j-1) and its own entry after pass
// k-1. Only the last column is kept.
func bernoulliEven(n int) []*big.Rat {
	bernMu.Lock()
	defer bernMu.Unlock()
	if len(bernTab) > n {
		return bernTab
	}
	if len(bernTab) == 0 {
		bernTab = []*big.Rat{big.NewRat(1, 1)}
	}
	one := big.NewInt(1)
	tmp, small := new(big.Int), new(big.Int)
	for j := len(bernTab); j <= n; j++ {
		// col[k-1] = t_j after pass k, for k = 1..j; the storage of the
		// column before the last is reused.
		col := bernSpare[:0]
		for len(col) < j {
			if len(col) < cap(col) {
				col = col[:len(col)+1]
				if col[len(col)-1] == nil {
					col[len(col)-1] = new(big.Int)
				}
			} else {
				col = append(col, new(big.Int))
			}
		}
		if j == 1 {
			col[0].SetInt64(1)
		} else {
			col[0].Mul(bernCol[0], small.SetInt64(int64(j-1))) // (j-1)!
		}
		for k := 2; k <= j; k++ {
			prev := bernCol[len(bernCol)-1] // t_{j-1} is final after pass j-1
			if k-1 < len(bernCol) {
				prev = bernCol[k-1]
			}
			v := col[k-1]
			v.Mul(prev, small.SetInt64(int64(j-k)))
			tmp.Mul(col[k-2], small.SetInt64(int64(j-k+2)))
			v.Add(v, tmp)
		}
		bernSpare, bernCol = bernCol, col
		num := new(big.Int).Mul(big.NewInt(int64(2*j)), col[j-1])
		if j%2 == 0 {
			num.Neg(num)
		}
		p4 := new(big.Int).Lsh(one, uint(2*j))
		den := new(big.Int).Mul(p4, new(big.Int).Sub(p4, one))
		bernTab = append(bernTab, new(big.Rat).SetFrac(num, den))
	}
	return bernTab
}

var (
	bernMu    sync.Mutex
	bernTab   []*big.Rat
	bernCol   []*big.Int // the last column of the tangent-number table
	bernSpare []*big.Int // storage of the column before it, for reuse
)

// stirlingRat returns the exact coefficient a_k = (-1)^j B_{2k} (2k+j-2)!/(2k)!.
func stirlingRat(k, j int) *big.Rat {
	b := bernoulliEven(k)[k]
	r := new(big.Rat).Set(b)
	switch {
	case j == 0:
		r.Quo(r, new(big.Rat).SetInt64(int64(2*k*(2*k-1))))
	case j == 1:
		r.Quo(r, new(big.Rat).SetInt64(int64(2*k)))
	case j >= 3:
		f := new(big.Int).MulRange(int64(2*k+1), int64(2*k+j-2))
		r.Mul(r, new(big.Rat).SetInt(f))
	}
	if j%2 == 1 {
		r.Neg(r)
	}
	return r
}

type coefKey struct {
	t    reflect.Type
	prec uint
	j    int
}

var (
	coefMu  sync.Mutex
	coefTab = map[coefKey]any{}
)

// stirlingCoefs returns enclosures c[k] of a_k for k = 1..n (c[0] unused)
// at like's precision; values are cached per type, precision and order.
func stirlingCoefs[T Real[T]](like T, j, n int) []T {
	key := coefKey{reflect.TypeFor[T](), like.Prec(), j}
	coefMu.Lock()
	old, _ := coefTab[key].([]T)
	coefMu.Unlock()
	if len(old) > n {
		return old
	}
	m := max(n+1, len(old)+len(old)/4, 16) // modest growth: the Bernoulli numbers behind cost O(m^3)
	c := make([]T, m)
	copy(c, old)
	p := like.Prec()
	for k := max(1, len(old)); k < m; k++ {
		r := stirlingRat(k, j)
		lo := new(big.Float).SetPrec(p).SetMode(big.ToNegativeInf).SetRat(r)
		hi := new(big.Float).SetPrec(p).SetMode(big.ToPositiveInf).SetRat(r)
		c[k] = like.Between(lo, hi)
	}
	c[0] = like.Int(0)
	coefMu.Lock()
	if cur, _ := coefTab[key].([]T); len(cur) < len(c) {
		coefTab[key] = c
	}
	coefMu.Unlock()
	return c
}

// log2Coef returns an upper estimate of log2 |a_n| for planning only (not
// used in any bound): |B_{2n}| = 2 (2n)! zeta(2n) / (2 pi)^{2n} (DLMF
// 24.8.1 at x = 0) with zeta(2n) <= 1 + 4^-n + 2 4^-n/(2n-1).
func log2Coef(n, j int) float64 {
	fn := float64(n)
	z := 1 + math.Pow(4, -fn)*(1+2/(2*fn-1))
	lg, _ := math.Lgamma(2*fn + float64(j) - 1)
	l := math.Ln2 + lg - 2*fn*math.Log(2*math.Pi) + math.Log(z)
	return l / math.Ln2
}

var (
	planMu  sync.Mutex
	planTab = map[int][]float64{} // order j -> log2Coef(n, j) for n = 0, 1, ...
)

func log2Coefs(j, n int) []float64 {
	planMu.Lock()
	defer planMu.Unlock()
	t := planTab[j]
	if len(t) > n {
		return t
	}
	m := max(n+1, 2*len(t), 64)
	u := make([]float64, m)
	copy(u, t)
	for k := max(1, len(t)); k < m; k++ {
		u[k] = log2Coef(k, j)
	}
	planTab[j] = u
	return u
}

// Relative cost of one recurrence step against one series term, by order j
// (measured on B at 160 bits: about 1.4 us for either at j = 1; the higher
// orders add two to four real operations per step).
var recurrenceCost = [...]float64{0: 1.0, 1: 1.0, 2: 1.3, 3: 1.6}

// planStirling chooses the shift s (evaluate the series at z + s) and the
// series length n (terms k < n summed, a_n bounds the remainder) so that the
// remainder bound stays below 2^-bits relative to the natural size of the
// order-j function, at least cost. xlo is a lower bound for Re z and ymin
// for |Im z| over the rectangle. This is float64 planning only: whatever it
// returns, the remainder added to the result is computed rigorously.
// ok is false when no plan exists within the search limits.
func planStirling(xlo, ymin float64, j int, bits uint) (s, n int, ok bool) {
	if math.IsNaN(xlo) || math.IsInf(xlo, 0) || math.IsNaN(ymin) || math.IsInf(ymin, 0) {
		return 0, 0, false
	}
	s0 := 0
	if xlo <= 0 {
		if -xlo > 1e7 {
			return 0, 0, false
		}
		s0 = int(math.Floor(-xlo)) + 1
	}
	nmax := int(bits) + 32
	lc := log2Coefs(j, nmax)
	cr := recurrenceCost[min(j, len(recurrenceCost)-1)]
	best := math.Inf(1)
	half := float64(j) / 2
	for sh := s0; sh <= s0+4*int(bits)+64; sh++ {
		if cr*float64(sh) > best {
			break
		}
		x := xlo + float64(sh)
		r := math.Hypot(x, ymin)
		lr := math.Log2(r)
		lv := math.Log2(2 / ((r + x) * r))
		// log2 bound = lc[k] + lr + (k + j/2) lv; the target is -bits + 3
		// guard bits, relative to |z|^(1-j) for j >= 2.
		tgt := -float64(bits) - 3 - lr
		if j >= 2 {
			tgt += float64(1-j) * lr
		}
		prev := math.Inf(1)
		for k := 1; k < nmax; k++ {
			v := lc[k] + (float64(k)+half)*lv
			if v <= tgt {
				if c := cr*float64(sh) + float64(k); c < best {
					best, s, n, ok = c, sh, k, true
				}
				break
			}
			if v > prev && k > 4 { // past the smallest term: infeasible here
				break
			}
			prev = v
		}
	}
	return s, n, ok
}
