// Package precession verifies precession-bracket certificates by its own
// computation: it rebuilds the oscillator's matrix elements of sgn x from
// log-gamma checkpoints, re-evaluates the witness's Rayleigh quotient by
// columns with a running error bound, and re-proves the norm lemma of each
// residue class with its own tail bounds and an interval Cholesky
// factorisation. It imports only the standard library, interval and
// certificates.
package precession

import (
	"fmt"
	"math"
	"math/big"
	"runtime"
	"strconv"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// Failure is one claim that does not hold or could not be proved.
type Failure struct {
	Where   string
	Message string
	// Refuted is true when the recomputation shows the claim false (the
	// recorded number lies outside the verifier's enclosure), not merely
	// unproved.
	Refuted bool
	// Bound is true when the failure concerns Lower or Upper themselves.
	Bound bool
}

// Detail is what the verifier recomputed.
type Detail struct {
	Lower, Upper string
	// Rayleigh is the verifier's enclosure of the witness's Rayleigh quotient.
	Rayleigh [2]string
	// SectorBounds are the verifier's upper bounds of sup spec Q3 on the
	// three residue classes (empty when the lemma failed).
	SectorBounds [3]string
	WitnessSize  [2]int
}

// class gives the offsets of residue r: even states |2(3a+j0)>, odd states
// |2(3b+k0)+1>; B_ab = (-1/3) F_a M_{a+p,b} G_b.
type class struct{ j0, k0, p int }

var classes = [3]class{{0, 1, 0}, {2, 0, 1}, {1, 2, 0}}

// Check verifies p; workers <= 0 means GOMAXPROCS.
func Check(p *certificates.Precession, workers int) (*Detail, []Failure) {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	d := &Detail{Lower: p.Lower.String(), Upper: p.Upper.String(), WitnessSize: [2]int{len(p.Witness.Even), len(p.Witness.Odd)}}
	var fails []Failure
	fail := func(f Failure) { fails = append(fails, f) }
	need := 0
	for _, s := range p.Sectors {
		need = max(need, 3*s.SumLength+8)
	}
	need = max(need, 3*max(len(p.Witness.Even), len(p.Witness.Odd))+8)
	tab := newTable(need)

	// Lower bound: the witness.
	w := p.Witness
	ray, err := rayleigh(tab, classes[w.Residue], w.Even, w.Odd, workers)
	if err != nil {
		fail(Failure{Where: "witness", Message: err.Error(), Bound: true})
	} else {
		d.Rayleigh = [2]string{dec(ray.Lo(), false), dec(ray.Hi(), true)}
		lo := rat(p.Lower)
		rl, rh := rat(w.Rayleigh.Lower), rat(w.Rayleigh.Upper)
		ownLo, ownHi := ratF(ray.Lo()), ratF(ray.Hi())
		if lo.Cmp(ownLo) > 0 {
			fail(Failure{Where: "lower", Message: fmt.Sprintf("the witness's Rayleigh quotient is only proved >= %s, below the claimed lower bound %s", d.Rayleigh[0], p.Lower),
				Refuted: lo.Cmp(ownHi) > 0, Bound: true})
		}
		if rl.Cmp(ownHi) > 0 || rh.Cmp(ownLo) < 0 {
			fail(Failure{Where: "witness.rayleigh", Message: fmt.Sprintf("recorded enclosure [%s, %s] misses the recomputed [%s, %s]", w.Rayleigh.Lower, w.Rayleigh.Upper, d.Rayleigh[0], d.Rayleigh[1]), Refuted: true})
		}
	}

	// Upper bound: the norm lemma in each class.
	up := rat(p.Upper)
	for i, s := range p.Sectors {
		b, err := lemma(tab, classes[i], s, workers)
		where := "sectors[" + strconv.Itoa(i) + "]"
		if err != nil {
			fail(Failure{Where: where, Message: err.Error(), Bound: true})
			continue
		}
		d.SectorBounds[i] = dec(b.Hi(), true)
		if rat(s.NormBound).Cmp(ratF(b.Hi())) < 0 {
			fail(Failure{Where: where, Message: fmt.Sprintf("norm_bound %s is below 1/2 + sqrt(lambda)/6 <= %s", s.NormBound, d.SectorBounds[i]), Refuted: rat(s.NormBound).Cmp(ratF(b.Lo())) < 0})
		}
		if up.Cmp(ratF(b.Hi())) < 0 {
			fail(Failure{Where: "upper", Message: fmt.Sprintf("the claimed upper bound %s is below the bound %s proved for residue %d", p.Upper, d.SectorBounds[i], i), Bound: true})
		}
	}
	return d, fails
}

// rat is the exact value of a recorded number (present: Verify runs the
// schema's strict reading first).
func rat(d certificates.Decimal) *big.Rat { return d.Rat() }

func ratF(x float64) *big.Rat { r, _ := new(big.Float).SetFloat64(x).Rat(nil); return r }

func dec(x float64, upward bool) string {
	if upward {
		return interval.DecimalUp(new(big.Float).SetFloat64(x), 12)
	}
	return interval.DecimalDown(new(big.Float).SetFloat64(x), 12)
}

// table holds enclosures of alpha_j^2 = Gamma(j+1/2)/(sqrt(pi) Gamma(j+1)):
// every 256th from the log-gamma function, the others by the ratio
// (2j-1)/(2j) from the last checkpoint.
type table struct {
	a2 []interval.F
	a  []interval.F
}

func newTable(n int) *table {
	t := &table{a2: make([]interval.F, n), a: make([]interval.F, n)}
	var z interval.F
	sqrtPi := z.Pi().Sqrt()
	const step = 256
	nc := (n + step - 1) / step
	checknum.For(nc, 0, func(c int) {
		j := c * step
		half := interval.C[interval.F]{Re: z.Frac(int64(2*j+1), 2), Im: z.Int(0)}
		whole := interval.C[interval.F]{Re: z.Int(int64(j + 1)), Im: z.Int(0)}
		lg := interval.LogGamma(half).Re.Sub(interval.LogGamma(whole).Re)
		v := interval.Exp(lg).Quo(sqrtPi)
		for i := j; i < min(n, j+step); i++ {
			if i > j {
				v = v.Mul(z.Int(int64(2*i - 1))).Quo(z.Int(int64(2 * i)))
			}
			t.a2[i] = v
			t.a[i] = v.Sqrt()
		}
	})
	return t
}

// beta encloses sqrt((2k+1) alpha_k^2).
func (t *table) beta(k int) interval.F { return t.a2[k].Mul(interval.PointF(float64(2*k + 1))).Sqrt() }

const unit = 1.0 / (1 << 53)

// rayleigh encloses 1/2 + <x, B y>/(|x|^2 + |y|^2) for the witness, by
// columns: for each b, the float sum over a of xhat_a/(2(b-a-p)+1), xhat_a
// the midpoint of (-1)^a alpha_{3a+j0} x_a, with the running error bound
// u (sum |s_i| + (2+u) sum |p_i|) plus the radii of xhat.
func rayleigh(t *table, c class, evenS, oddS []certificates.Decimal, workers int) (interval.F, error) {
	x := make([]float64, len(evenS))
	y := make([]float64, len(oddS))
	for i, s := range evenS {
		v, err := strconv.ParseInt(s.String(), 10, 64)
		if err != nil || math.Abs(float64(v)) > 1<<53 {
			return interval.F{}, fmt.Errorf("witness coefficient %q is not a 53-bit integer", s)
		}
		x[i] = float64(v)
	}
	for i, s := range oddS {
		v, err := strconv.ParseInt(s.String(), 10, 64)
		if err != nil || math.Abs(float64(v)) > 1<<53 {
			return interval.F{}, fmt.Errorf("witness coefficient %q is not a 53-bit integer", s)
		}
		y[i] = float64(v)
	}
	nx, ny := len(x), len(y)
	mid := make([]float64, nx)
	rad := make([]float64, nx)
	for a, xa := range x {
		v := t.a[3*a+c.j0].Mul(interval.PointF(xa))
		if a%2 != 0 {
			v = v.Neg()
		}
		m := (v.Lo() + v.Hi()) / 2
		mid[a] = m
		rad[a] = math.Max(v.Hi()-m, m-v.Lo())
	}
	// recip[i] = 1/(2d+1) for d = i - nx - p - 1.
	off := nx + c.p + 1
	recip := make([]float64, off+ny+1)
	for i := range recip {
		recip[i] = 1 / float64(2*(i-off)+1)
	}
	col := make([]interval.F, ny)
	checknum.For(ny, workers, func(b int) {
		// d = b - a - p runs from b - p down to b - p - nx + 1.
		s, sumS, sumP, sumR := 0.0, 0.0, 0.0, 0.0
		for a := 0; a < nx; a++ {
			r := recip[b-a-c.p+off]
			p := float64(mid[a] * r)
			s = float64(s + p)
			sumS += math.Abs(s)
			sumP += math.Abs(p)
			sumR += rad[a] * math.Abs(r)
		}
		e := unit*(sumS+(2+unit)*sumP) + sumR*(1+2*unit)
		e *= 1 + float64(2*nx+4)*unit
		col[b] = interval.NewF(s, s).Pad(interval.PointF(e))
	})
	var z interval.F
	q := z.Int(2).Quo(z.Pi()).Sqrt().Quo(z.Int(3))
	num := z.Int(0)
	for b, yb := range y {
		v := q.Mul(t.beta(3*b + c.k0)).Mul(interval.PointF(yb)).Mul(col[b])
		if (b+c.j0+c.k0)%2 != 0 {
			v = v.Neg()
		}
		num = num.Add(v)
	}
	den := z.Int(0)
	for _, v := range x {
		den = den.Add(interval.PointF(v).Sqr())
	}
	for _, v := range y {
		den = den.Add(interval.PointF(v).Sqr())
	}
	r := z.Frac(1, 2).Add(num.Quo(den))
	if !r.IsFinite() {
		return r, fmt.Errorf("the Rayleigh quotient is not enclosed")
	}
	return r, nil
}
