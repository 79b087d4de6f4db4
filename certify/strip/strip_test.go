package strip

import (
	"encoding/json"
	"math"
	"math/big"
	"math/cmplx"
	"os"
	"sort"
	"strings"
	"sync"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/mat"

	"wedgebound/interval"
)

// The brackets of the tests below are computed once and shared.
var (
	cacheMu sync.Mutex
	cache   = map[string]*Result{}
)

func bracketAt(t testing.TB, alpha string) *Result {
	t.Helper()
	cacheMu.Lock()
	defer cacheMu.Unlock()
	if r, ok := cache[alpha]; ok {
		return r
	}
	a, err := ParseAlpha(alpha)
	if err != nil {
		t.Fatal(err)
	}
	r, err := Compute(a, Options{})
	if err != nil {
		t.Fatalf("alpha %s: %v", alpha, err)
	}
	cache[alpha] = r
	return r
}

func slow() bool { return os.Getenv("WEDGEBOUND_SLOW") == "1" }

// meets reports whether the closed interval x meets [v - h, v + h].
func meets(x interval.F, v, h float64) bool { return x.Lo() <= v+h && v-h <= x.Hi() }

// Double-precision Nystrom values quoted in the package doc (seen here,
// not a published source), given to 7 decimal places: each bracket must
// meet the interval of values that round to the quoted one.
func TestMathNotesFloatValues(t *testing.T) {
	cases := []struct {
		alpha string
		adv   float64
	}{{"1", 0.0060131}, {"10", 0.0206990}, {"50", 0.0294572}, {"200", 0.0337734}, {"800", 0.0360924}}
	for _, c := range cases {
		r := bracketAt(t, c.alpha)
		if !meets(r.AdvantageF, c.adv, 5e-8) {
			t.Errorf("alpha %s: advantage bracket %v does not round to %v", c.alpha, r.AdvantageF, c.adv)
		}
		if w := r.AdvantageF.Hi() - r.AdvantageF.Lo(); !(w < 1e-8) {
			t.Errorf("alpha %s: advantage width %g not below 1e-8", c.alpha, w)
		}
	}
	r := bracketAt(t, "1")
	if !meets(r.DeficitF, 0.0855621, 5e-8) {
		t.Errorf("alpha 1: deficit bracket %v does not round to 0.0855621", r.DeficitF)
	}
}

// Every certified advantage lies below the published estimate of the
// backflow constant, 0.0384517 (A. J. Bracken and G. F. Melloy, J. Phys. A
// 27 (1994) 2197), since A(alpha) <= c_bm.
func TestBelowBackflowEstimate(t *testing.T) {
	alphas := []string{"0.001", "1", "10", "50", "200", "800"}
	if slow() {
		alphas = append(alphas, "1000", "3000")
	}
	for _, a := range alphas {
		r := bracketAt(t, a)
		if !(r.AdvantageF.Hi() < 0.0384517) {
			t.Errorf("alpha %s: advantage upper end %v is not below 0.0384517", a, r.AdvantageF.Hi())
		}
		if !(r.AdvantageF.Lo() >= 0) || !(r.DeficitF.Lo() >= 0) {
			t.Errorf("alpha %s: negative lower end", a)
		}
	}
}

// A(alpha) is non-decreasing (a larger alpha is a longer strip after
// rescaling, and the strip states are nested; package doc). On a small
// sweep the certified brackets must be consistent with that; here they are
// even separated, which proves the increase at these points.
func TestAdvantageIncreasesOnSweep(t *testing.T) {
	alphas := []string{"0.5", "1", "2", "5", "10", "20", "50", "100", "200"}
	var prev *Result
	for _, a := range alphas {
		r := bracketAt(t, a)
		if prev != nil && !(r.AdvantageF.Lo() > prev.AdvantageF.Hi()) {
			t.Errorf("alpha %s: advantage %v not above the previous %v", a, r.AdvantageF, prev.AdvantageF)
		}
		prev = r
	}
}

// nystrom is an independent brute-force discretisation in float64: the
// original complex Hermitian kernel K_alpha (not the real reduction used by
// the certifier) at m Gauss-Legendre nodes from gonum, symmetrised with the
// square roots of the weights, and diagonalised through its real 2m x 2m
// embedding [[Re, -Im], [Im, Re]] (each eigenvalue twice).
func nystrom(alpha float64, m int) (lmin, lmax float64) {
	x := make([]float64, m)
	w := make([]float64, m)
	quad.Legendre{}.FixedLocations(x, w, -1, 0)
	S := mat.NewSymDense(2*m, nil)
	for i := 0; i < m; i++ {
		for j := 0; j < m; j++ {
			var k complex128
			if i == j {
				k = complex(-alpha*x[i]/(2*math.Pi), 0)
			} else {
				k = (cmplx.Exp(complex(0, -alpha*(x[i]*x[i]-x[j]*x[j])/2)) - 1) / complex(0, 2*math.Pi*(x[i]-x[j]))
			}
			k *= complex(math.Sqrt(w[i]*w[j]), 0)
			if i <= j {
				S.SetSym(i, j, real(k))
				S.SetSym(m+i, m+j, real(k))
			}
			S.SetSym(m+i, j, imag(k))
		}
	}
	var es mat.EigenSym
	es.Factorize(S, false)
	v := es.Values(nil)
	return v[0], v[2*m-1]
}

func TestNystromAgreesWithMidpoints(t *testing.T) {
	cases := []struct {
		alpha  string
		m1, m2 int
	}{{"1", 20, 30}, {"10", 40, 60}, {"50", 60, 90}, {"200", 120, 160}}
	for _, c := range cases {
		r := bracketAt(t, c.alpha)
		al, _ := new(big.Rat).SetString(c.alpha)
		af, _ := al.Float64()
		advMid := (r.AdvantageF.Lo() + r.AdvantageF.Hi()) / 2
		defMid := (r.DeficitF.Lo() + r.DeficitF.Hi()) / 2
		for _, m := range []int{c.m1, c.m2} {
			lmin, lmax := nystrom(af, m)
			if d := math.Abs(-lmin - advMid); d > 1e-8 {
				t.Errorf("alpha %s, m=%d: Nystrom advantage %.12f vs midpoint %.12f", c.alpha, m, -lmin, advMid)
			}
			if d := math.Abs(lmax - defMid); d > 1e-8 {
				t.Errorf("alpha %s, m=%d: Nystrom deficit %.12f vs midpoint %.12f", c.alpha, m, lmax, defMid)
			}
		}
	}
}

// The witness is re-evaluated independently: the state exp(-i alpha x^2/4)
// psi(x) against the original complex kernel, with gonum's Gauss rule.
func TestWitnessReevaluates(t *testing.T) {
	for _, a := range []string{"10", "50"} {
		r := bracketAt(t, a)
		al, _ := new(big.Rat).SetString(a)
		af, _ := al.Float64()
		for _, wit := range []Witness{r.AdvantageWitness, r.DeficitWitness} {
			m := 200
			x := make([]float64, m)
			w := make([]float64, m)
			quad.Legendre{}.FixedLocations(x, w, -1, 0)
			f := make([]complex128, m)
			for i := range x {
				psi := legendreSeries(wit.Coefficients, 2*x[i]+1)
				f[i] = cmplx.Exp(complex(0, -af*x[i]*x[i]/4)) * complex(psi, 0)
			}
			var num complex128
			var den float64
			for i := 0; i < m; i++ {
				den += w[i] * real(f[i]*cmplx.Conj(f[i]))
				for j := 0; j < m; j++ {
					var k complex128
					if i == j {
						k = complex(-af*x[i]/(2*math.Pi), 0)
					} else {
						k = (cmplx.Exp(complex(0, -af*(x[i]*x[i]-x[j]*x[j])/2)) - 1) / complex(0, 2*math.Pi*(x[i]-x[j]))
					}
					num += complex(w[i]*w[j], 0) * cmplx.Conj(f[i]) * k * f[j]
				}
			}
			q := real(num) / den
			lo, _ := new(big.Rat).SetString(wit.Rayleigh.Lower)
			hi, _ := new(big.Rat).SetString(wit.Rayleigh.Upper)
			l, _ := lo.Float64()
			h, _ := hi.Float64()
			if q < l-1e-11 || q > h+1e-11 || math.Abs(imag(num)) > 1e-11 {
				t.Errorf("alpha %s: re-evaluated Rayleigh quotient %.15f + %.1ei outside [%s, %s]", a, q, imag(num), wit.Rayleigh.Lower, wit.Rayleigh.Upper)
			}
		}
	}
}

// legendreSeries evaluates sum_j c_j sqrt(2j+1) P_j(s) in float64.
func legendreSeries(c []float64, s float64) float64 {
	p0, p1 := 1.0, s
	sum := c[0]
	for j := 1; j < len(c); j++ {
		if j > 1 {
			p0, p1 = p1, ((2*float64(j)-1)*s*p1-float64(j-1)*p0)/float64(j)
		}
		sum += c[j] * math.Sqrt(2*float64(j)+1) * p1
	}
	return sum
}

// The verified Gauss rule agrees with gonum's independent rule (I. Bogaert,
// SIAM J. Sci. Comput. 36 (2014) A1008), and its weights enclose a sum of 2.
func TestGaussRuleAgainstGonum(t *testing.T) {
	for _, n := range []int{5, 16, 77, 200} {
		r, err := newGaussRule(n, 0)
		if err != nil {
			t.Fatal(err)
		}
		x := make([]float64, n)
		w := make([]float64, n)
		quad.Legendre{}.FixedLocations(x, w, -1, 1)
		sort.Sort(sort.Reverse(sort.Float64Slice(x))) // ours are decreasing
		var sum interval.F
		for i := 0; i < n; i++ {
			if d := math.Abs(r.node[i].Lo() - x[i]); d > 1e-14 {
				t.Errorf("n=%d node %d: %v vs gonum %v", n, i, r.node[i].Lo(), x[i])
			}
			sum = sum.Add(r.weight[i])
		}
		if !sum.Contains(interval.PointF(2)) || sum.Rad() > 1e-12 {
			t.Errorf("n=%d: weights sum to %v", n, sum)
		}
		// Exactness for a polynomial of degree 2n-1: int_{-1}^1 s^(2n-2) = 2/(2n-1).
		var q interval.F
		for i := 0; i < n; i++ {
			s := toF(r.node[i])
			p := interval.PointF(1)
			for k := 0; k < 2*n-2; k++ {
				p = p.Mul(s)
			}
			q = q.Add(r.weight[i].Mul(p))
		}
		if !q.Pad(interval.PointF(1e-13)).Contains(interval.PointF(2).Quo(interval.PointF(float64(2*n - 1)))) {
			t.Errorf("n=%d: rule does not integrate s^(2n-2): %v", n, q)
		}
	}
}

// sincF against the standard library at a few points.
func TestSinc(t *testing.T) {
	for _, z := range []float64{0, 1e-9, 0.3, -0.7, 0.999, 1.5} {
		want := 1.0
		if z != 0 {
			want = math.Sin(z) / z
		}
		got := sincF(interval.PointF(z))
		if !got.Pad(interval.PointF(1e-15)).Contains(interval.PointF(want)) || got.Rad() > 1e-14 {
			t.Errorf("sinc(%v) = %v, want %v", z, got, want)
		}
	}
}

// The kernel bound on the ellipses really bounds |k|: sample the boundary.
func TestKernelMaxBoundsSamples(t *testing.T) {
	for _, c := range []struct{ alpha, e1, e2 float64 }{{1, 0.5, 0.2}, {50, 0.3, 0.01}, {1000, 0.6, 0.005}, {10, 1.5, 0}} {
		m := math.Exp(logKernelMax(c.alpha, c.e1, c.e2).Hi())
		var worst float64
		for i := 0; i < 200; i++ {
			for j := 0; j < 50; j++ {
				th := 2 * math.Pi * float64(i) / 200
				ph := 2 * math.Pi * float64(j) / 50
				s := complex(math.Cosh(c.e1)*math.Cos(th), math.Sinh(c.e1)*math.Sin(th))
				u := complex(math.Cosh(c.e2)*math.Cos(ph), math.Sinh(c.e2)*math.Sin(ph))
				x, y := (s-1)/2, (u-1)/2
				z := complex(c.alpha/4, 0) * (x*x - y*y)
				sinc := complex(1, 0)
				if cmplx.Abs(z) > 1e-12 {
					sinc = cmplx.Sin(z) / z
				}
				k := -complex(c.alpha/(4*math.Pi), 0) * (x + y) * sinc
				worst = math.Max(worst, cmplx.Abs(k))
			}
		}
		if !(worst <= m) {
			t.Errorf("alpha %v: sampled |k| %v exceeds the bound %v", c.alpha, worst, m)
		}
	}
}

// alpha from physical units: 2 pi m L^2/(h t) with the exact h; the float
// value is computed here independently from the CODATA 2018 constants.
func TestAlphaFromUnits(t *testing.T) {
	a, err := AlphaFromUnits("1u", "1um", "1ms")
	if err != nil {
		t.Fatal(err)
	}
	want := 2 * math.Pi * 1.66053906660e-27 * 1e-12 / (6.62607015e-34 * 1e-3)
	if e := a.Enclosure(); math.Abs(e.Lo()-want) > 1e-15*want || e.Rad() > 1e-17 {
		t.Errorf("alpha(1u, 1um, 1ms) = %v, want %v", e, want)
	}
	// hbar = h/(2 pi) = 1.054571817...e-34 J s (CODATA 2018).
	b, _ := AlphaFromUnits("1 kg", "1 m", "1 s")
	if e := b.Enclosure(); math.Abs(e.Lo()*1.054571817e-34-1) > 1e-9 {
		t.Errorf("1/hbar = %v, want about 1/1.054571817e-34", e)
	}
	if !strings.HasPrefix(a.Expr(), "2*pi*") {
		t.Errorf("Expr = %q", a.Expr())
	}
	for _, bad := range [][3]string{{"1", "1um", "1ms"}, {"1kg", "1 parsec", "1s"}, {"-1u", "1m", "1s"}, {"1u", "1m", "0s"}, {"1m", "1m", "1s"}} {
		if _, err := AlphaFromUnits(bad[0], bad[1], bad[2]); err == nil {
			t.Errorf("AlphaFromUnits(%q) accepted", bad)
		}
	}
}

func TestParseAlpha(t *testing.T) {
	for _, bad := range []string{"", "0", "-3", "abc", "1e", "2/0"} {
		if _, err := ParseAlpha(bad); err == nil {
			t.Errorf("ParseAlpha(%q) accepted", bad)
		}
	}
	a, err := ParseAlpha("1/3")
	if err != nil || a.Expr() != "1/3" {
		t.Fatalf("ParseAlpha(1/3) = %v, %v", a.Expr(), err)
	}
	if e := a.Enclosure(); !(e.Lo() < 1.0/3 || e.Hi() > 1.0/3) || e.Rad() > 1e-16 {
		t.Errorf("1/3 enclosure %v", e)
	}
	if _, err := Compute(a, Options{Width: 1e-6}); err != nil {
		t.Errorf("alpha 1/3: %v", err)
	}
}

// The JSON form carries every field a verifier needs, and every decimal
// parses exactly.
func TestResultJSON(t *testing.T) {
	r := bracketAt(t, "10")
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatal(err)
	}
	var m map[string]any
	if err := json.Unmarshal(b, &m); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"alpha", "alpha_used", "basis_size", "quadrature_nodes", "advantage", "deficit", "advantage_witness", "deficit_witness", "errors", "ellipses"} {
		if _, ok := m[k]; !ok {
			t.Errorf("JSON lacks %q", k)
		}
	}
	var back Result
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if len(back.AdvantageWitness.Coefficients) != r.BasisSize {
		t.Errorf("witness length %d, basis %d", len(back.AdvantageWitness.Coefficients), r.BasisSize)
	}
	for i, c := range back.AdvantageWitness.Coefficients {
		if c != r.AdvantageWitness.Coefficients[i] {
			t.Fatalf("witness coefficient %d does not round-trip", i)
		}
	}
	for _, s := range []string{r.Errors.DiscardedPart, r.Errors.EntryQuadrature, r.Errors.EntryRounding, r.Errors.LowestResidual, r.Errors.HighestShift, r.Advantage.Lower, r.Deficit.Upper, r.Ellipses.TailX} {
		if _, ok := new(big.Rat).SetString(s); !ok {
			t.Errorf("%q is not a decimal", s)
		}
	}
}

// Slow: the width target at alpha = 1000 and the extreme ends of the range.
func TestSlowRange(t *testing.T) {
	if !slow() {
		t.Skip("set WEDGEBOUND_SLOW=1")
	}
	for _, a := range []string{"0.001", "1000"} {
		r := bracketAt(t, a)
		if w := r.width(); !(w < 1e-8) {
			t.Errorf("alpha %s: width %g", a, w)
		}
	}
	r := bracketAt(t, "10000")
	t.Logf("alpha 1e4: N=%d advantage [%s, %s]", r.BasisSize, r.Advantage.Lower, r.Advantage.Upper)
	if !(r.AdvantageF.Hi() < 0.0384517) || !(r.AdvantageF.Lo() > 0.036) {
		t.Errorf("alpha 1e4: advantage %v", r.AdvantageF)
	}
}

func benchBracket(b *testing.B, alpha string) {
	a, _ := ParseAlpha(alpha)
	for i := 0; i < b.N; i++ {
		if _, err := Compute(a, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkBracketAlpha10(b *testing.B)   { benchBracket(b, "10") }
func BenchmarkBracketAlpha100(b *testing.B)  { benchBracket(b, "100") }
func BenchmarkBracketAlpha1000(b *testing.B) { benchBracket(b, "1000") }

// floatGalerkin computes the Galerkin matrix of the real kernel in float64
// with gonum's Gauss rule at m nodes (independent of the verified rule).
func floatGalerkin(alpha float64, N, m int) (G [][]float64, hs2 float64) {
	x := make([]float64, m)
	w := make([]float64, m)
	quad.Legendre{}.FixedLocations(x, w, -1, 0)
	k := func(a, b float64) float64 {
		z := alpha * (a - b) * (a + b) / 4
		s := 1.0
		if z != 0 {
			s = math.Sin(z) / z
		}
		return -alpha * (a + b) / (4 * math.Pi) * s
	}
	q := make([][]float64, m)
	for i := range x {
		q[i] = make([]float64, N)
		for j := 0; j < N; j++ {
			q[i][j] = legendreSeries(unit(N, j), 2*x[i]+1)
		}
	}
	G = make([][]float64, N)
	for j := range G {
		G[j] = make([]float64, N)
	}
	for a := 0; a < m; a++ {
		for b := 0; b < m; b++ {
			kab := w[a] * w[b] * k(x[a], x[b])
			hs2 += w[a] * w[b] * k(x[a], x[b]) * k(x[a], x[b])
			for j := 0; j < N; j++ {
				for l := 0; l < N; l++ {
					G[j][l] += q[a][j] * kab * q[b][l]
				}
			}
		}
	}
	return G, hs2
}

func unit(n, j int) []float64 {
	v := make([]float64, n)
	v[j] = 1
	return v
}

// The discarded-part bound really bounds ||k - P k P||_HS, which equals
// sqrt(||k||_HS^2 - ||G_N||_F^2) (Pythagoras for the orthogonal projection
// X -> P X P in the Hilbert-Schmidt space); checked in float64 where the
// tail is large enough for that difference to be meaningful.
func TestDiscardedPartBoundHolds(t *testing.T) {
	for _, c := range []struct {
		alpha float64
		N     int
	}{{50, 6}, {50, 10}, {200, 20}, {5, 3}} {
		G, hs2 := floatGalerkin(c.alpha, c.N, 120)
		var g2 float64
		for _, row := range G {
			for _, v := range row {
				g2 += v * v
			}
		}
		actual := math.Sqrt(math.Max(hs2-g2, 0))
		_, e1, e2 := bestTail(c.alpha, c.N)
		bound := tailBound(c.alpha, c.N, e1, e2).Hi()
		t.Logf("alpha %v N=%d: actual %.3g bound %.3g", c.alpha, c.N, actual, bound)
		if !(actual <= bound) || actual < 1e-6 {
			t.Errorf("alpha %v N=%d: ||k - PkP||_HS = %.3g, bound %.3g", c.alpha, c.N, actual, bound)
		}
	}
}

// The Gauss remainder bound covers the difference between a small verified
// rule and an accurate float computation of the same Galerkin entries.
func TestQuadratureBoundHolds(t *testing.T) {
	for _, c := range []struct {
		alpha float64
		N, n  int
	}{{50, 8, 12}, {200, 10, 30}, {10, 6, 7}} {
		r, err := newGaussRule(c.n, 0)
		if err != nil {
			t.Fatal(err)
		}
		H := galerkinMatrix(r, r.legendreValues(c.N, 0), kernelMatrix(r, c.alpha, 0), c.N, 0)
		G, _ := floatGalerkin(c.alpha, c.N, 150)
		_, eta := bestQuad(c.alpha, c.N, c.n)
		logC := quadLogC(c.alpha, c.n, eta)
		var seen float64
		for j := 0; j < c.N; j++ {
			for k := 0; k < c.N; k++ {
				e := math.Exp(logC.Hi()) * math.Sqrt(float64((2*j+1)*(2*k+1))) * (math.Pow(math.Exp(eta), float64(j)) + math.Pow(math.Exp(eta), float64(k)))
				d := math.Max(G[j][k]-H[j][k].Hi(), H[j][k].Lo()-G[j][k])
				seen = math.Max(seen, d)
				if d > e+1e-12 {
					t.Errorf("alpha %v n=%d entry (%d,%d): error %.3g above bound %.3g", c.alpha, c.n, j, k, d, e)
				}
			}
		}
		t.Logf("alpha %v n=%d: largest entry error %.3g", c.alpha, c.n, seen)
		if seen < 1e-9 {
			t.Errorf("alpha %v n=%d: the rule is too accurate for a meaningful check (%.3g)", c.alpha, c.n, seen)
		}
	}
}

// psdShift on a matrix with known spectrum: Q diag(d) Q^T with Q a product
// of Householder reflections (exactly orthogonal in exact arithmetic; the
// float matrix is within 1e-15 of one with spectrum d).
func TestPSDShift(t *testing.T) {
	const N = 40
	d := make([]float64, N)
	for i := range d {
		d[i] = -0.5 + float64(i)/N
	}
	A := make([]float64, N*N)
	for i := 0; i < N; i++ {
		A[i*N+i] = d[i]
	}
	for h := 0; h < 3; h++ {
		v := make([]float64, N)
		var nv float64
		for i := range v {
			v[i] = math.Sin(float64(7*i+3*h) + 1)
			nv += v[i] * v[i]
		}
		// A <- (I - 2vv^T/nv) A (I - 2vv^T/nv)
		P := make([]float64, N*N)
		for i := 0; i < N; i++ {
			for j := 0; j < N; j++ {
				P[i*N+j] = -2 * v[i] * v[j] / nv
				if i == j {
					P[i*N+j]++
				}
			}
		}
		A = mul(mul(P, A, N), P, N)
	}
	for i := 0; i < N; i++ {
		for j := 0; j < i; j++ {
			A[i*N+j] = A[j*N+i]
		}
	}
	sig, res, err := psdShift(A, N, d[0], 1, 1, 1)
	if err != nil || !(sig-res.Hi() <= d[0]+1e-13) || !(sig-res.Hi() > d[0]-1e-10) {
		t.Errorf("lower: sigma %v res %v err %v", sig, res, err)
	}
	sig, res, err = psdShift(A, N, d[N-1], -1, 1, 1)
	if err != nil || !(sig+res.Hi() >= d[N-1]-1e-13) || !(sig+res.Hi() < d[N-1]+1e-10) {
		t.Errorf("upper: sigma %v res %v err %v", sig, res, err)
	}
	// A wrong estimate (above the true minimum) cannot be certified.
	if _, _, err := psdShift(A, N, d[0]+0.1, 1, 1, 1); err == nil {
		t.Errorf("an estimate above lambda_min was certified")
	}
}

func mul(a, b []float64, n int) []float64 {
	c := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for k := 0; k < n; k++ {
			for j := 0; j < n; j++ {
				c[i*n+j] += a[i*n+k] * b[k*n+j]
			}
		}
	}
	return c
}
