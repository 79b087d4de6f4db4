package relaxation

import (
	"math"
	"math/cmplx"
	"os"
	"strconv"
	"strings"
	"sync"
	"testing"

	"wedgebound/interval"
	"wedgebound/regions"
)

// Reference values (external sources):
//   - wernerQuadrant: -inf spec of Op(chi_Q) for the quadrant, 0.155940
//     (R. F. Werner, J. Phys. A 21 (1988) 4565; value from memory).
//   - backflowEstimate: the backflow constant 0.0384517 (A. J. Bracken and
//     G. F. Melloy, J. Phys. A 27 (1994) 2197). Every relaxation bound lies
//     above it, so a search result below it is a bug.
const (
	wernerQuadrant   = 0.155940
	backflowEstimate = 0.0384517
)

var (
	termCacheMu sync.Mutex
	termCache   = map[string]regions.Term[interval.F]{}
)

// expTerms returns exponential terms with the given k, cached so that each
// term builds its quadrature regimes once per test binary.
func expTerms(t testing.TB, ks ...string) []regions.Term[interval.F] {
	termCacheMu.Lock()
	defer termCacheMu.Unlock()
	var out []regions.Term[interval.F]
	for _, k := range ks {
		tm := termCache[k]
		if tm == nil {
			var err error
			tm, err = regions.NewTerm(interval.PointF(0), "exp", map[string]string{"k": k})
			if err != nil {
				t.Fatal(err)
			}
			termCache[k] = tm
		}
		out = append(out, tm)
	}
	return out
}

// TestDigammaFloat checks the float digamma against the interval library's
// enclosure and against digamma(1) = -gamma (Euler's constant, Abramowitz
// and Stegun 6.3.2) and J(0) = sum_n (-1)^n/(n + 1/2) = pi/2 (Leibniz
// series), i.e. B0(0) = i/4.
func TestDigammaFloat(t *testing.T) {
	const euler = 0.57721566490153286
	if d := digammaFloat(1); math.Abs(real(d)+euler) > 1e-15 || imag(d) != 0 {
		t.Errorf("digamma(1) = %v, want -%v", d, euler)
	}
	if b := quadrantB0Float(0); cmplx.Abs(b-0.25i) > 1e-15 {
		t.Errorf("B0(0) = %v, want i/4", b)
	}
	for _, z := range []complex128{0.25 + 0.5i, 0.75 - 3i, 0.25 + 17.5i, 0.75 - 1000i, 0.25 + 1e5i, 2.5} {
		w := interval.Digamma(interval.C[interval.F]{Re: interval.PointF(real(z)), Im: interval.PointF(imag(z))})
		got := digammaFloat(z)
		tol := 1e-14 * cmplx.Abs(got)
		if real(got) < w.Re.Lo()-tol || real(got) > w.Re.Hi()+tol || imag(got) < w.Im.Lo()-tol || imag(got) > w.Im.Hi()+tol {
			t.Errorf("digamma(%v) = %v outside the enclosure %v + i %v", z, got, w.Re, w.Im)
		}
	}
}

// TestQuadrantEntriesFloat checks A and B0 against the certified quadrant
// symbol of package regions.
func TestQuadrantEntriesFloat(t *testing.T) {
	for _, s := range []float64{-1500, -30, -2.5, -0.3558, 0, 0.7, 12, 800} {
		q := regions.Quadrant(interval.PointF(s))
		a, b := quadrantAFloat(s), quadrantB0Float(s)
		in := func(x float64, e interval.F) bool {
			tol := 1e-13 * (math.Abs(x) + 1e-300)
			return x >= e.Lo()-tol && x <= e.Hi()+tol
		}
		if !in(a, q.A) || !in(real(b), q.B.Re) || !in(imag(b), q.B.Im) {
			t.Errorf("s = %g: A = %v, B0 = %v, enclosures A %v, B %v + i %v", s, a, b, q.A, q.B.Re, q.B.Im)
		}
	}
}

// TestPhiGradient checks phi against the eigenvalues of the 2x2 matrix
// (trace and determinant) and its gradient against central differences and
// against the eigenvector formula v* (dM/dc_j) v.
func TestPhiGradient(t *testing.T) {
	e := symbolEntries{s: -0.7, a: 0.13, b0: complex(0.05, 0.11),
		d: []float64{0.02, 0.31}, b: []complex128{complex(-0.04, 0.01), complex(0.012, -0.2)}}
	c := []float64{0.7, -1.3}
	for _, edge := range []float64{1, -1} {
		m := &symbolModel{sigma: edge}
		g := make([]float64, 2)
		v := m.phi(&e, c, g)
		A := e.a
		D := c[0]*e.d[0] + c[1]*e.d[1]
		B := e.b0 + complex(c[0], 0)*e.b[0] + complex(c[1], 0)*e.b[1]
		// Eigenvalues from trace and determinant.
		tr, det := A+D, A*D-real(B*cmplx.Conj(B))
		disc := math.Sqrt(tr*tr/4 - det)
		want := tr/2 - disc
		if edge < 0 {
			want = -(tr/2 + disc)
		}
		if math.Abs(v-want) > 1e-15 {
			t.Errorf("sigma %v: phi = %v, want %v", edge, v, want)
		}
		// Unit eigenvector of the eigenvalue lam = sigma*want for [[A, B], [conj B, D]]:
		// (B, lam - A) up to normalisation.
		lam := edge * want
		v1, v2 := B, complex(lam-A, 0)
		nrm := math.Sqrt(real(v1*cmplx.Conj(v1)) + real(v2*cmplx.Conj(v2)))
		v1, v2 = v1/complex(nrm, 0), v2/complex(nrm, 0)
		for j := range c {
			h := 1e-6
			cp := append([]float64(nil), c...)
			cm := append([]float64(nil), c...)
			cp[j] += h
			cm[j] -= h
			fd := (m.phi(&e, cp, nil) - m.phi(&e, cm, nil)) / (2 * h)
			if math.Abs(fd-g[j]) > 1e-8 {
				t.Errorf("sigma %v: gradient %d = %v, central difference %v", edge, j, g[j], fd)
			}
			ev := e.d[j]*real(v2*cmplx.Conj(v2)) + 2*real(cmplx.Conj(v1)*e.b[j]*v2)
			if math.Abs(edge*ev-g[j]) > 1e-13 {
				t.Errorf("sigma %v: gradient %d = %v, eigenvector formula %v", edge, j, g[j], edge*ev)
			}
		}
	}
}

// TestSearchQuadrant: with no terms the bound is the quadrant's.
func TestSearchQuadrant(t *testing.T) {
	r, err := Search(nil, regions.Lower, SearchOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(r.Bound-wernerQuadrant) > 1e-6 {
		t.Errorf("quadrant bound %.7f, want %.6f (Werner 1988)", r.Bound, wernerQuadrant)
	}
	if math.Abs(r.WorstS+0.3558) > 1e-3 || !r.Converged || len(r.Weights) != 0 {
		t.Errorf("quadrant: worst s %v, converged %v, weights %v", r.WorstS, r.Converged, r.Weights)
	}
}

// enclosedBound returns the certified enclosure of the bound -lambda_min
// (lower) at the single point s for the decimal weights, from package
// regions (independent of the float code here).
func enclosedBound(t *testing.T, terms []regions.Term[interval.F], weights []string, s float64) interval.F {
	rel := regions.Relaxation[interval.F]{Terms: terms}
	for _, w := range weights {
		v, err := interval.PointF(0).Decimal(w)
		if err != nil {
			t.Fatal(err)
		}
		rel.Weights = append(rel.Weights, v)
	}
	return rel.Enclose(interval.PointF(s)).MinEig().Neg()
}

// checkResult checks the invariants of a lower-edge result: the bound lies
// above the backflow estimate and above the model bound, the tails start
// inside the checked range, and the certified enclosure at the worst point
// contains the bound.
func checkResult(t *testing.T, name string, terms []regions.Term[interval.F], r SearchResult) {
	t.Helper()
	if r.Bound < backflowEstimate || r.RawBound < backflowEstimate {
		t.Errorf("%s: bound %v (raw %v) below the backflow constant estimate %v (Bracken-Melloy 1994): a bug", name, r.Bound, r.RawBound, backflowEstimate)
	}
	if r.ModelBound > r.RawBound+1e-9 {
		t.Errorf("%s: model bound %v above the bound %v reached", name, r.ModelBound, r.RawBound)
	}
	// With the default check range, the float check must reach the points
	// from which the tail lemmas take over (so every s was looked at).
	if !(r.CoverLo >= -2000 && r.CoverHi <= 2000) || !r.TailsChecked {
		t.Errorf("%s: tail lemmas start at [%v, %v], beyond the checked range", name, r.CoverLo, r.CoverHi)
	}
	enc := enclosedBound(t, terms, r.Weights, r.WorstS)
	if r.Bound < enc.Lo()-1e-9 || r.Bound > enc.Hi()+1e-9 {
		t.Errorf("%s: float bound %v at s = %v, certified enclosure there %v", name, r.Bound, r.WorstS, enc)
	}
}

// TestSearchOneExp: one exponential e^{-150 xp} beats the quadrant by a
// factor of three and stays above the backflow constant.
func TestSearchOneExp(t *testing.T) {
	terms := expTerms(t, "150")
	r, err := Search(terms, regions.Lower, SearchOptions{})
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, "k=150", terms, r)
	if r.Bound > 0.0528 || !r.Converged {
		t.Errorf("k=150: bound %v (model %v, converged %v), want <= 0.0528", r.Bound, r.ModelBound, r.Converged)
	}
	if len(r.Minima) < 2 || !(r.NearLo < r.WorstS && r.WorstS < r.NearHi) {
		t.Errorf("k=150: minima %v, near range [%v, %v]", r.Minima, r.NearLo, r.NearHi)
	}
	// The result does not depend on the number of goroutines.
	r2, err := Search(terms, regions.Lower, SearchOptions{Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	if r2.Bound != r.Bound || r2.Weights[0] != r.Weights[0] || len(r2.Log) != len(r.Log) {
		t.Errorf("k=150: one worker gives %v %v, %d rounds; default %v %v, %d rounds", r2.Weights, r2.Bound, len(r2.Log), r.Weights, r.Bound, len(r.Log))
	}
	// No weight in the box beats the model bound.
	for _, c := range []float64{0, 4, 8, 8.7, 12, 50} {
		e, err := Search(terms, regions.Lower, SearchOptions{MaxIter: -1, Initial: []float64{c}})
		if err != nil {
			t.Fatal(err)
		}
		if e.Bound < r.ModelBound-1e-9 {
			t.Errorf("k=150: weight %v gives %v, below the model bound %v", c, e.Bound, r.ModelBound)
		}
	}
	// One significant digit ("8") would cost 5e-3; the rounding keeps more.
	r1, err := Search(terms, regions.Lower, SearchOptions{Digits: 1})
	if err != nil {
		t.Fatal(err)
	}
	if r1.Bound > r1.RawBound+1e-6 || len(r1.Weights[0]) < 3 {
		t.Errorf("k=150, Digits 1: weight %s gives %v, raw %v", r1.Weights[0], r1.Bound, r1.RawBound)
	}
}

// TestSearchCatchesGridOptimum: optimising on a coarse s-grid only gives
// weights whose sampled value promises far more than they deliver between
// the samples; the final check over all of [CheckLo, CheckHi] reports the
// true value, and the full search (cuts from the true check) from the same
// coarse seeds still finds the real optimum.
func TestSearchCatchesGridOptimum(t *testing.T) {
	terms := expTerms(t, "0.03", "2", "1000")
	coarse := SearchOptions{SampleLo: -4, SampleHi: 4, SampleStep: 1, SampledOnly: true}
	r, err := Search(terms, regions.Lower, coarse)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, "grid optimum", terms, r)
	if r.ModelBound > backflowEstimate || r.Bound < r.ModelBound+0.005 || r.Converged {
		t.Errorf("grid optimum: sampled model %v, true bound %v, converged %v: the coarse grid was expected to promise a bound below %v",
			r.ModelBound, r.Bound, r.Converged, backflowEstimate)
	}
	o, _ := coarse.withDefaults(len(terms))
	grid := searchGrid(o)
	ents := make([]symbolEntries, len(grid))
	for i, x := range grid {
		ents[i].s = x
	}
	for _, i := range searchSeeds(ents, o) {
		if math.Abs(grid[i]-r.WorstS) < 0.05 {
			t.Errorf("grid optimum: the worst point %v is next to the sample %v", r.WorstS, grid[i])
		}
	}
	coarse.SampledOnly = false
	r, err = Search(terms, regions.Lower, coarse)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, "coarse seeds", terms, r)
	if r.Bound > 0.04628 || !r.Converged {
		t.Errorf("coarse seeds: bound %v, converged %v, want <= 0.04628", r.Bound, r.Converged)
	}
}

// TestSearchUpper: for the upper edge with no terms the search returns
// sup_s lambda_max, which exceeds sup A = 1 (lambda_max >= A for a 2x2
// Hermitian matrix) and agrees with the certified enclosure at its point.
func TestSearchUpper(t *testing.T) {
	r, err := Search(nil, regions.Upper, SearchOptions{})
	if err != nil {
		t.Fatal(err)
	}
	enc := regions.Quadrant(interval.PointF(r.WorstS)).MaxEig()
	if r.Bound <= 1 || r.Bound < enc.Lo()-1e-9 || r.Bound > enc.Hi()+1e-9 {
		t.Errorf("upper: bound %v at %v, enclosure %v", r.Bound, r.WorstS, enc)
	}
}

func TestWeightDecimal(t *testing.T) {
	for _, c := range []struct {
		v    float64
		d    int
		want string
	}{{8.4601754401290439, 6, "8.46018"}, {-0.043436841020474869, 6, "-0.0434368"},
		{40.306283311437888, 6, "40.3063"}, {1.23456789e-9, 3, "0.00000000123"}, {0, 6, "0"}, {-50, 6, "-50"}, {123456789, 4, "123500000"}} {
		if got := weightDecimal(c.v, c.d); got != c.want {
			t.Errorf("weightDecimal(%v, %d) = %q, want %q", c.v, c.d, got, c.want)
		}
		if _, err := regions.ParseRat(weightDecimal(c.v, c.d)); err != nil {
			t.Errorf("weightDecimal(%v): %v", c.v, err)
		}
	}
}

func TestSearchOptionErrors(t *testing.T) {
	terms := []regions.Term[interval.F]{nil}
	for _, o := range []SearchOptions{
		{WeightBound: -1}, {SampleLo: 5, SampleHi: -5}, {CheckLo: -10, CheckHi: 10},
		{Digits: 30}, {Initial: []float64{1, 2}}, {Initial: []float64{99}}, {Tol: math.Inf(1)},
	} {
		if _, err := Search(terms, regions.Lower, o); err == nil {
			t.Errorf("options %+v: no error", o)
		}
	}
	if _, err := Search(nil, "middle", SearchOptions{}); err == nil {
		t.Error("bad edge: no error")
	}
}

// BenchmarkSearch times one search (quadrature regimes built beforehand).
func BenchmarkSearch(b *testing.B) {
	for _, ks := range [][]string{{"150"}, {"0.03", "2", "1000"}} {
		terms := expTerms(b, ks...)
		if _, err := Search(terms, regions.Lower, SearchOptions{MaxIter: 1}); err != nil {
			b.Fatal(err)
		}
		b.Run("exp"+strconv.Itoa(len(ks)), func(b *testing.B) {
			for b.Loop() {
				if _, err := Search(terms, regions.Lower, SearchOptions{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// TestSearchDenseRecheck (slow) re-evaluates optimised weights on a check
// grid five times denser over a ten times wider s-range: the default check
// must already have found the true minimum.
func TestSearchDenseRecheck(t *testing.T) {
	if os.Getenv("WEDGEBOUND_SLOW") != "1" {
		t.Skip("set WEDGEBOUND_SLOW=1")
	}
	for _, ks := range [][]string{{"150"}, {"4.9", "1000"}, {"0.13", "0.79", "5.3", "1000"}} {
		terms := expTerms(t, ks...)
		r, err := Search(terms, regions.Lower, SearchOptions{})
		if err != nil {
			t.Fatal(err)
		}
		d, err := Search(terms, regions.Lower, SearchOptions{MaxIter: -1, Initial: r.Values,
			CheckStep: 0.002, CheckRelStep: 0.0004, CheckLo: -20000, CheckHi: 20000})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(d.Bound-r.Bound) > 1e-9 || d.Weights[0] != r.Weights[0] {
			t.Errorf("k = %v: bound %v with the default check, %v with the dense one", ks, r.Bound, d.Bound)
		}
		checkResult(t, strings.Join(ks, ","), terms, r)
	}
}

// BenchmarkSearchEntries times the float entries at one s (the quadrant
// part and one exp term's Approx), the unit cost of the check grid.
func BenchmarkSearchEntries(b *testing.B) {
	m := &symbolModel{terms: expTerms(b, "150"), sigma: 1}
	m.entries(-300)
	m.entries(3)
	b.Run("quadrant", func(b *testing.B) {
		for b.Loop() {
			quadrantB0Float(-3.7)
		}
	})
	for _, s := range []float64{-300, 3} {
		b.Run("exp150/s="+strconv.FormatFloat(s, 'g', -1, 64), func(b *testing.B) {
			for b.Loop() {
				m.entries(s)
			}
		})
	}
}
