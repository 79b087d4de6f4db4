package precession

import (
	"math"

	"wedgebound/interval"
)

// Sector is one residue class r = n mod 3 of the Fock index. Its even states
// are |2j> with j = 3a + J0 and its odd states |2k+1> with k = 3b + K0
// (a, b = 0, 1, ...); the block B_ab = <2j|sgn x|2k+1> equals
// (Sign/3) F_a M_{a+P, b} G_b with M_{ab} = <2a|sgn x|2b+1> (see doc.go).
type Sector struct {
	R, J0, K0, P int
	// Sign is (-1)^(J0+K0+P), the constant sign between B and F M G.
	Sign int
}

// Sectors lists the three residue classes r = 0, 1, 2.
var Sectors = [3]Sector{
	{R: 0, J0: 0, K0: 1, P: 0, Sign: -1},
	{R: 1, J0: 2, K0: 0, P: 1, Sign: -1},
	{R: 2, J0: 1, K0: 2, P: 0, Sign: -1},
}

// Table holds enclosures of alpha_j^2 = binom(2j, j)/4^j for j < len, built
// by the exact ratio alpha_j^2/alpha_{j-1}^2 = (2j-1)/(2j) in interval
// arithmetic, together with float64 values of alpha_j.
type Table struct {
	A2 []interval.F // alpha_j^2
	A  []interval.F // alpha_j
	Af []float64    // alpha_j (float64, for the search)
}

// NewTable returns the table for j < n.
func NewTable(n int) *Table {
	t := &Table{A2: make([]interval.F, n), A: make([]interval.F, n), Af: make([]float64, n)}
	one := interval.PointF(1)
	t.A2[0], t.A[0], t.Af[0] = one, one, 1
	f := 1.0
	for j := 1; j < n; j++ {
		t.A2[j] = t.A2[j-1].Mul(one.Frac(int64(2*j-1), int64(2*j)))
		t.A[j] = t.A2[j].Sqrt()
		f *= float64(2*j-1) / float64(2*j)
		t.Af[j] = math.Sqrt(f)
	}
	return t
}

// Beta2 encloses beta_k^2 = (2k+1) alpha_k^2.
func (t *Table) Beta2(k int) interval.F { return t.A2[k].Mul(interval.PointF(float64(2*k + 1))) }

// M encloses M_ab = <2a|sgn x|2b+1> = (-1)^(a+b) sqrt(2/pi) alpha_a beta_b/(2b+1-2a).
func (t *Table) M(a, b int, sqrt2pi interval.F) interval.F {
	v := sqrt2pi.Mul(t.A[a]).Mul(t.Beta2(b).Sqrt()).Quo(interval.PointF(float64(2*b + 1 - 2*a)))
	if (a+b)%2 != 0 {
		v = v.Neg()
	}
	return v
}

// Mf is the float64 value of M_ab.
func (t *Table) Mf(a, b int) float64 {
	v := math.Sqrt(2/math.Pi) * t.Af[a] * t.Af[b] * math.Sqrt(float64(2*b+1)) / float64(2*b+1-2*a)
	if (a+b)%2 != 0 {
		v = -v
	}
	return v
}

// F2 encloses F_a^2 = sqrt(3) alpha_{3a+J0}^2/alpha_{a+P}^2.
func (s Sector) F2(t *Table, a int) interval.F {
	return sqrt3().Mul(t.A2[3*a+s.J0]).Quo(t.A2[a+s.P])
}

// G2 encloses G_b^2 = beta_{3b+K0}^2/(sqrt(3) beta_b^2).
func (s Sector) G2(t *Table, b int) interval.F {
	return t.Beta2(3*b + s.K0).Quo(t.Beta2(b).Mul(sqrt3()))
}

// F2f and G2f are float64 values of F_a^2 and G_b^2.
func (s Sector) F2f(t *Table, a int) float64 {
	r := t.Af[3*a+s.J0] / t.Af[a+s.P]
	return math.Sqrt(3) * r * r
}

// G2f is the float64 value of G_b^2.
func (s Sector) G2f(t *Table, b int) float64 {
	k := 3*b + s.K0
	r := t.Af[k] / t.Af[b]
	return r * r * float64(2*k+1) / (float64(2*b+1) * math.Sqrt(3))
}

func sqrt3() interval.F { return interval.PointF(3).Sqrt() }

// Sqrt2OverPi encloses sqrt(2/pi).
func Sqrt2OverPi() interval.F {
	var z interval.F
	return z.Int(2).Quo(z.Pi()).Sqrt()
}

// Entry encloses the sector block entry B_ab = <2j|sgn x|2k+1>, j = 3a+J0,
// k = 3b+K0, from the closed form (-1)^(j+k) sqrt(2/pi) alpha_j beta_k/(2k+1-2j).
func (s Sector) Entry(t *Table, a, b int) interval.F {
	j, k := 3*a+s.J0, 3*b+s.K0
	return t.M(j, k, Sqrt2OverPi())
}

// Entryf is the float64 value of B_ab.
func (s Sector) Entryf(t *Table, a, b int) float64 { return t.Mf(3*a+s.J0, 3*b+s.K0) }
