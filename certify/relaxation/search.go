package relaxation

// Candidate search in float64: choose the weights c of a relaxation so that
// the extreme eigenvalue of the 2x2 Mellin symbol
//
//	M(s; c) = [[A(s), B(s)], [conj B(s), D(s)]],
//	A = (1 + tanh(pi s))/2,  B = B0 + sum_j c_j b_j,  D = sum_j c_j d_j,
//
// is as good as possible over all real s. Write
//
//	phi(s; c) = lambda_min(M)  (edge lower),   phi(s; c) = -lambda_max(M)  (edge upper),
//
// so that in both cases the bound is -inf_s phi(s; c) and the search
// maximises t(c) = inf_s phi(s; c). With h = (A - D)/2 and
// R = sqrt(h^2 + |B|^2), phi = sigma (A + D)/2 - R (sigma = +1 lower, -1
// upper). Each phi(s; .) is concave in c (R is the norm of a vector affine
// in c), so t(c) is concave and
//
//	phi(s; c') <= phi(s; c) + g(s; c) . (c' - c),
//	g_j = sigma d_j/2 + h d_j/(2R) - Re(conj(B) b_j)/R,
//
// for every c' (for the lower edge g_j = v* (dM/dc_j) v = d_j |v_2|^2 +
// 2 Re(conj(v_1) b_j v_2) with v the unit eigenvector of lambda_min). The
// search is Kelley's cutting-plane method: maximise the model
// min_cuts [phi + g . (c' - c)] over the weight box by an LP, evaluate the
// true inf_s phi at the LP solution on a fine s-grid over a wide range with
// golden-section refinement of every low local minimum, add cuts at the
// violated local minima, and stop when the LP value (an upper limit on
// max_c t(c) within the box, because every cut is valid for all c) and the
// best true value agree.
//
// Nothing here is proved: the result is a candidate for the certifier.

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"runtime"
	"sort"
	"strconv"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/optimize/convex/lp"

	"wedgebound/certify"
	"wedgebound/interval"
	"wedgebound/regions"
)

// SearchOptions controls Search. Zero fields take the documented defaults.
type SearchOptions struct {
	// WeightBound bounds every weight: |c_j| <= WeightBound (default 50).
	WeightBound float64
	// SampleLo, SampleHi span the s-samples that seed the cutting-plane
	// model (default -60, 60). Their spacing is SampleStep for |s| <= 5 and
	// 0.4 SampleStep (1 + |s|) beyond.
	SampleLo, SampleHi float64
	// SampleStep is the seed spacing near s = 0 (default 0.05).
	SampleStep float64
	// CheckLo, CheckHi span the s-range of the true-minimum check (default
	// -2000, 2000). It must contain [SampleLo, SampleHi].
	CheckLo, CheckHi float64
	// CheckStep and CheckRelStep set the check-grid spacing
	// CheckStep + CheckRelStep |s| (defaults 0.01 and 0.002).
	CheckStep, CheckRelStep float64
	// RefineMargin: every grid local minimum within RefineMargin of the grid
	// minimum is refined by golden section (default 2e-3).
	RefineMargin float64
	// NearMargin defines the near-extremal range reported in
	// SearchResult.NearLo/NearHi and Minima (default 0.01).
	NearMargin float64
	// Tol stops the search once the LP value exceeds the best true value by
	// at most Tol (default 1e-6).
	Tol float64
	// MaxIter bounds the number of LP rounds (default 300); a negative value
	// skips them, so that the result only evaluates (and rounds) Initial.
	MaxIter int
	// MaxCuts bounds the cuts added per round (default 24).
	MaxCuts int
	// Digits is the least number of significant decimal digits of the
	// returned weights (default 6); more are kept while rounding would
	// worsen the bound by more than RoundTol (default 1e-6).
	Digits   int
	RoundTol float64
	// Initial holds starting weights (default all zero).
	Initial []float64
	// SampledOnly restricts the cuts to the seed samples, so that the LP
	// solves the sampled problem only (to study grid optima); the final
	// true-minimum check over [CheckLo, CheckHi] is still done and decides
	// the reported bound.
	SampledOnly bool
	// TailMargin sets the claim Bound + TailMargin for which CoverLo and
	// CoverHi are computed (default 1e-4).
	TailMargin float64
	// Workers is the number of goroutines (default GOMAXPROCS); the result
	// does not depend on it.
	Workers int
	// Progress, if set, is called after every round.
	Progress func(SearchStep)
}

// SearchStep records one LP round.
type SearchStep struct {
	// Iter counts rounds from 1.
	Iter int
	// Cuts is the number of cuts in the model.
	Cuts int
	// Model is the LP value: no weights in the box reach a larger inf_s phi
	// (phi as in the package notes), up to float errors.
	Model float64
	// ModelAt is the model at Weights (below Model only when the weights
	// recovered from the LP solution are not exactly optimal).
	ModelAt float64
	// True is inf_s phi at this round's weights (check grid plus refinement);
	// in SampledOnly mode the minimum over the seed samples.
	True float64
	// Best is the best True so far.
	Best float64
	// WorstS is where True is attained.
	WorstS float64
	// Weights are this round's LP weights.
	Weights []float64
}

// LocalMin is a local minimum of phi(., c) over s (refined by golden
// section): the bound is -Value there.
type LocalMin struct {
	S, Value float64
}

// SearchResult is the outcome of Search. Bounds are float64 estimates of
// -inf_s lambda_min (edge lower) or sup_s lambda_max (edge upper) over
// [CheckLo, CheckHi]; they are not proved.
type SearchResult struct {
	// Weights are the rounded weights as decimal strings (the candidate).
	Weights []string
	// Values are the float64 values of Weights.
	Values []float64
	// Bound is the float bound with the rounded weights.
	Bound float64
	// RawWeights and RawBound are the unrounded best weights and their bound.
	RawWeights []float64
	RawBound   float64
	// ModelBound is -(final LP value): within the weight box no weights give
	// a float bound below it. Bound - ModelBound is the remaining gap. It is
	// -Inf when no LP round ran.
	ModelBound float64
	// WorstS is where the rounded weights attain Bound.
	WorstS float64
	// Minima lists the local minima within NearMargin of the extreme, by s.
	Minima []LocalMin
	// NearLo, NearHi span the check-grid points where the bound is within
	// NearMargin of Bound (where the certifier's cells must be finest).
	NearLo, NearHi float64
	// CoverLo, CoverHi: the tail lemmas of package regions (TailSymbol,
	// evaluated in float interval arithmetic) already give the claim
	// Bound + TailMargin for s <= CoverLo and for s >= CoverHi, so a cover of
	// [CoverLo, CoverHi] suffices for that claim (NaN if no S <= 1e7 works).
	CoverLo, CoverHi float64
	// Stopped, if not empty, says why the rounds ended early (an LP failure).
	Stopped string
	// TailsChecked reports CheckLo <= CoverLo and CoverHi <= CheckHi: the
	// float check looked at every s that the tail lemmas leave open.
	TailsChecked bool
	// Converged reports RawBound - ModelBound <= Tol: within the weight box
	// the raw weights are optimal to Tol (in float arithmetic).
	Converged bool
	// Log holds every round.
	Log []SearchStep
}

// Search looks for weights of terms that minimise the float bound of edge
// and returns them rounded to short decimals (opt.Digits) together with
// the bound they reach. It is deterministic.
func Search(terms []regions.Term[interval.F], edge regions.Edge, opt SearchOptions) (SearchResult, error) {
	opt, err := opt.withDefaults(len(terms))
	if err != nil {
		return SearchResult{}, err
	}
	sm := &symbolModel{terms: terms, group: regions.NewGroup(terms), sigma: 1}
	switch edge {
	case regions.Lower:
	case regions.Upper:
		sm.sigma = -1
	default:
		return SearchResult{}, fmt.Errorf("search: edge must be %q or %q, not %q", regions.Lower, regions.Upper, edge)
	}
	s := &searcher{m: sm, opt: opt, n: len(terms)}
	s.grid = sm.table(searchGrid(opt), opt.Workers)
	for _, e := range s.grid {
		if !e.finite() {
			return SearchResult{}, fmt.Errorf("search: the symbol entries are not finite at s = %g", e.s)
		}
	}
	s.seeds = searchSeeds(s.grid, opt)
	return s.run()
}

func (o SearchOptions) withDefaults(n int) (SearchOptions, error) {
	def := func(v *float64, d float64) {
		if *v == 0 {
			*v = d
		}
	}
	def(&o.WeightBound, 50)
	if o.SampleLo == 0 && o.SampleHi == 0 {
		o.SampleLo, o.SampleHi = -60, 60
	}
	if o.CheckLo == 0 && o.CheckHi == 0 {
		o.CheckLo, o.CheckHi = -2000, 2000
	}
	def(&o.SampleStep, 0.05)
	def(&o.CheckStep, 0.01)
	def(&o.CheckRelStep, 0.002)
	def(&o.RefineMargin, 2e-3)
	def(&o.NearMargin, 0.01)
	def(&o.Tol, 1e-6)
	def(&o.TailMargin, 1e-4)
	def(&o.RoundTol, 1e-6)
	if o.MaxIter == 0 {
		o.MaxIter = 300
	}
	if o.MaxCuts == 0 {
		o.MaxCuts = 24
	}
	if o.Digits == 0 {
		o.Digits = 6
	}
	if o.Workers <= 0 {
		o.Workers = runtime.GOMAXPROCS(0)
	}
	for _, v := range []float64{o.WeightBound, o.SampleStep, o.CheckStep, o.RefineMargin, o.NearMargin, o.Tol, o.TailMargin, o.RoundTol} {
		if !(v > 0) || math.IsInf(v, 0) {
			return o, errors.New("search: weight bound, steps, margins and tolerance must be positive and finite")
		}
	}
	if !(o.CheckRelStep >= 0) || math.IsInf(o.CheckRelStep, 0) {
		return o, errors.New("search: CheckRelStep must be non-negative")
	}
	if !(o.SampleLo < o.SampleHi) || !(o.CheckLo <= o.SampleLo) || !(o.SampleHi <= o.CheckHi) ||
		math.IsInf(o.CheckLo, 0) || math.IsInf(o.CheckHi, 0) {
		return o, fmt.Errorf("search: need CheckLo <= SampleLo < SampleHi <= CheckHi (finite), got [%g, %g] in [%g, %g]",
			o.SampleLo, o.SampleHi, o.CheckLo, o.CheckHi)
	}
	if o.Digits < 1 || o.Digits > 17 {
		return o, fmt.Errorf("search: Digits must be in 1..17, not %d", o.Digits)
	}
	if o.Initial != nil && len(o.Initial) != n {
		return o, fmt.Errorf("search: %d initial weights for %d terms", len(o.Initial), n)
	}
	for _, v := range o.Initial {
		if math.Abs(v) > o.WeightBound || math.IsNaN(v) {
			return o, fmt.Errorf("search: initial weight %g outside [-%g, %g]", v, o.WeightBound, o.WeightBound)
		}
	}
	return o, nil
}

// symbolEntries holds the float entries of the symbol at one s: A, B0 and
// the unit-weight d_j, b_j of every term.
type symbolEntries struct {
	s  float64
	a  float64
	b0 complex128
	d  []float64
	b  []complex128
}

// finite reports whether every entry is a finite number.
func (e *symbolEntries) finite() bool {
	ok := func(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
	if !ok(e.a) || !ok(real(e.b0)) || !ok(imag(e.b0)) {
		return false
	}
	for j := range e.d {
		if !ok(e.d[j]) || !ok(real(e.b[j])) || !ok(imag(e.b[j])) {
			return false
		}
	}
	return true
}

// symbolModel evaluates phi(s; c) in float64.
type symbolModel struct {
	terms []regions.Term[interval.F]
	group *regions.Group[interval.F] // the terms, exponentials on shared nodes
	sigma float64                    // +1 for the lower edge, -1 for the upper edge
}

// edge returns the spectral edge of the model.
func (m *symbolModel) edge() regions.Edge {
	if m.sigma < 0 {
		return regions.Upper
	}
	return regions.Lower
}

// entries computes the float entries at s.
func (m *symbolModel) entries(s float64) symbolEntries {
	e := symbolEntries{s: s, a: quadrantAFloat(s), b0: quadrantB0Float(s),
		d: make([]float64, len(m.terms)), b: make([]complex128, len(m.terms))}
	m.group.Approx(s, e.d, e.b)
	return e
}

// table computes the entries at every s, in parallel.
func (m *symbolModel) table(ss []float64, workers int) []symbolEntries {
	out := make([]symbolEntries, len(ss))
	certify.For(len(ss), workers, func(i int) { out[i] = m.entries(ss[i]) })
	return out
}

// phi returns phi(s; c) at the entries e and, if grad is not nil, stores
// its gradient in c there.
func (m *symbolModel) phi(e *symbolEntries, c, grad []float64) float64 {
	d := 0.0
	b := e.b0
	for j, cj := range c {
		d += cj * e.d[j]
		b += complex(cj, 0) * e.b[j]
	}
	h := (e.a - d) / 2
	r := math.Sqrt(h*h + real(b)*real(b) + imag(b)*imag(b))
	v := m.sigma*(e.a+d)/2 - r
	if grad != nil {
		rr := math.Max(r, 1e-300)
		for j := range c {
			grad[j] = m.sigma*e.d[j]/2 + (h*e.d[j]/2-(real(b)*real(e.b[j])+imag(b)*imag(e.b[j])))/rr
		}
	}
	return v
}

// quadrantAFloat is A(s) = (1 + tanh(pi s))/2.
func quadrantAFloat(s float64) float64 { return (1 + math.Tanh(math.Pi*s)) / 2 }

// quadrantB0Float is B0(s) = (i/2pi) J(s) with
// J(s) = (1/2)[digamma(3/4 + is/2) - digamma(1/4 + is/2)].
func quadrantB0Float(s float64) complex128 {
	j := (digammaFloat(complex(0.75, s/2)) - digammaFloat(complex(0.25, s/2))) / 2
	return complex(0, 1/(2*math.Pi)) * j
}

// digammaFloat is the float64 digamma function for Re z > 0: the recurrence
// digamma(z) = digamma(z+1) - 1/z up to |z| >= 10, then the Stirling series
// ln z - 1/(2z) - sum_{n=1}^{7} B_{2n}/(2n z^{2n}) (remainder below
// |B_16|/(16 |z|^16) < 5e-17 there).
func digammaFloat(z complex128) complex128 {
	var acc complex128
	for cmplx.Abs(z) < 10 {
		acc -= 1 / z
		z++
	}
	w := 1 / (z * z)
	ser := w * (1.0/12 - w*(1.0/120-w*(1.0/252-w*(1.0/240-w*(1.0/132-w*(691.0/32760-w/12))))))
	return acc + cmplx.Log(z) - 1/(2*z) - ser
}

// searchGrid returns the increasing s-grid of the true-minimum check: from
// 0 outwards with spacing CheckStep + CheckRelStep |s|, ending exactly at
// CheckLo and CheckHi.
func searchGrid(o SearchOptions) []float64 {
	side := func(end float64) []float64 {
		var g []float64
		a := math.Abs(end)
		for x := 0.0; x < a; x += o.CheckStep + o.CheckRelStep*x {
			if x > 0 {
				g = append(g, x)
			}
		}
		if a > 0 {
			g = append(g, a)
		}
		return g
	}
	var out []float64
	if o.CheckLo < 0 {
		neg := side(o.CheckLo)
		for i := len(neg) - 1; i >= 0; i-- {
			out = append(out, -neg[i])
		}
	}
	if o.CheckLo <= 0 && o.CheckHi >= 0 {
		out = append(out, 0)
	}
	if o.CheckHi > 0 {
		out = append(out, side(o.CheckHi)...)
	}
	// Clip to [CheckLo, CheckHi] (the range need not contain 0).
	var g []float64
	for _, x := range out {
		if x >= o.CheckLo && x <= o.CheckHi {
			g = append(g, x)
		}
	}
	if len(g) == 0 || g[0] > o.CheckLo {
		g = append([]float64{o.CheckLo}, g...)
	}
	if g[len(g)-1] < o.CheckHi {
		g = append(g, o.CheckHi)
	}
	return g
}

// searchSeeds picks the check-grid points that seed the model: those in
// [SampleLo, SampleHi] at spacing at least SampleStep (|s| <= 5) or
// 0.4 SampleStep (1 + |s|) (|s| > 5).
func searchSeeds(grid []symbolEntries, o SearchOptions) []int {
	step := func(s float64) float64 {
		if math.Abs(s) <= 5 {
			return o.SampleStep
		}
		return 0.4 * o.SampleStep * (1 + math.Abs(s))
	}
	var idx []int
	last := math.Inf(-1)
	for i, e := range grid {
		if e.s < o.SampleLo || e.s > o.SampleHi {
			continue
		}
		if e.s-last >= step(e.s)*0.999 {
			idx = append(idx, i)
			last = e.s
		}
	}
	return idx
}

// searchCut is the linear majorant t <= h + g . c of phi(s; .) for one s.
type searchCut struct {
	h float64
	g []float64
	s float64
}

type searcher struct {
	m     *symbolModel
	opt   SearchOptions
	n     int
	grid  []symbolEntries
	seeds []int
	cuts  []searchCut
}

// addCut adds the tangent of phi(e.s; .) at c.
func (s *searcher) addCut(e *symbolEntries, c []float64) {
	g := make([]float64, s.n)
	v := s.m.phi(e, c, g)
	h := v
	for j := range c {
		h -= g[j] * c[j]
	}
	s.cuts = append(s.cuts, searchCut{h: h, g: g, s: e.s})
}

// searchCandidate is a local minimum of phi(.; c) (refined or a grid point).
type searchCandidate struct {
	e     symbolEntries
	value float64
}

// searchEval is the true-minimum check of one weight vector.
type searchEval struct {
	min    float64
	worst  float64
	minima []searchCandidate // local minima, lowest first
	vals   []float64         // phi on the grid
}

// evaluate computes inf_s phi(s; c) over the check grid, refining by golden
// section every local minimum within margin of the grid minimum (at most
// maxRefine of them, lowest first).
func (s *searcher) evaluate(c []float64, margin float64, maxRefine int) searchEval {
	g := s.grid
	vals := make([]float64, len(g))
	gmin := math.Inf(1)
	for i := range g {
		vals[i] = s.m.phi(&g[i], c, nil)
		gmin = math.Min(gmin, vals[i])
	}
	var loc []int
	for i := range g {
		if (i == 0 || vals[i] <= vals[i-1]) && (i == len(g)-1 || vals[i] <= vals[i+1]) {
			loc = append(loc, i)
		}
	}
	sort.SliceStable(loc, func(a, b int) bool { return vals[loc[a]] < vals[loc[b]] })
	cands := make([]searchCandidate, len(loc))
	for k, i := range loc {
		cands[k] = searchCandidate{e: g[i], value: vals[i]}
	}
	var ref []int
	for k, i := range loc {
		if len(ref) < maxRefine && vals[i] <= gmin+margin && i > 0 && i < len(g)-1 {
			ref = append(ref, k)
		}
	}
	certify.For(len(ref), s.opt.Workers, func(r int) {
		k := ref[r]
		i := loc[k]
		if e, v := s.golden(g[i-1].s, g[i+1].s, c); v < cands[k].value {
			cands[k] = searchCandidate{e: e, value: v}
		}
	})
	sort.SliceStable(cands, func(a, b int) bool { return cands[a].value < cands[b].value })
	ev := searchEval{min: gmin, vals: vals, minima: cands}
	if len(cands) > 0 {
		ev.min, ev.worst = cands[0].value, cands[0].e.s
	}
	return ev
}

// golden minimises phi(.; c) on [a, b] by golden-section search and returns
// the entries and value at the best point found.
func (s *searcher) golden(a, b float64, c []float64) (symbolEntries, float64) {
	const r = 0.6180339887498949
	f := func(x float64) (symbolEntries, float64) {
		e := s.m.entries(x)
		return e, s.m.phi(&e, c, nil)
	}
	x1, x2 := b-r*(b-a), a+r*(b-a)
	e1, f1 := f(x1)
	e2, f2 := f(x2)
	tol := 1e-7 * (1 + math.Abs(a))
	for b-a > tol {
		if f1 <= f2 {
			b, x2, e2, f2 = x2, x1, e1, f1
			x1 = b - r*(b-a)
			e1, f1 = f(x1)
		} else {
			a, x1, e1, f1 = x1, x2, e2, f2
			x2 = a + r*(b-a)
			e2, f2 = f(x2)
		}
	}
	if f1 <= f2 {
		return e1, f1
	}
	return e2, f2
}

// sampledMin returns the minimum of phi over the seed samples with the
// violated seeds (value below level) lowest first.
func (s *searcher) sampledMin(c []float64, level float64) (float64, float64, []searchCandidate) {
	mn, at := math.Inf(1), 0.0
	var viol []searchCandidate
	for _, i := range s.seeds {
		v := s.m.phi(&s.grid[i], c, nil)
		if v < mn {
			mn, at = v, s.grid[i].s
		}
		if v < level {
			viol = append(viol, searchCandidate{e: s.grid[i], value: v})
		}
	}
	sort.SliceStable(viol, func(a, b int) bool { return viol[a].value < viol[b].value })
	return mn, at, viol
}

func (s *searcher) run() (SearchResult, error) {
	o := s.opt
	c := make([]float64, s.n)
	copy(c, o.Initial)
	for _, i := range s.seeds {
		s.addCut(&s.grid[i], c)
	}
	best := append([]float64(nil), c...)
	var bestVal float64
	if o.SampledOnly {
		bestVal, _, _ = s.sampledMin(c, math.Inf(-1))
	} else {
		bestVal = s.evaluate(c, o.RefineMargin, 16).min
	}
	var res SearchResult
	model := math.Inf(1)
	for it := 1; it <= o.MaxIter && s.n > 0; it++ {
		ub, x, err := s.solveLP(best)
		if err != nil {
			res.Stopped = fmt.Sprintf("round %d: %v", it, err)
			break
		}
		model = math.Min(model, ub)
		var val, worst float64
		var viol []searchCandidate
		if o.SampledOnly {
			val, worst, viol = s.sampledMin(x, ub-1e-12)
		} else {
			ev := s.evaluate(x, o.RefineMargin, 16)
			val, worst = ev.min, ev.worst
			for _, cd := range ev.minima {
				if cd.value < ub-1e-12 {
					viol = append(viol, cd)
				}
			}
		}
		if len(viol) > o.MaxCuts {
			viol = viol[:o.MaxCuts]
		}
		at := s.modelAt(x)
		for k := range viol {
			s.addCut(&viol[k].e, x)
		}
		if val > bestVal {
			bestVal = val
			copy(best, x)
		}
		step := SearchStep{Iter: it, Cuts: len(s.cuts), Model: model, ModelAt: at, True: val, Best: bestVal,
			WorstS: worst, Weights: append([]float64(nil), x...)}
		res.Log = append(res.Log, step)
		if o.Progress != nil {
			o.Progress(step)
		}
		if model-bestVal <= o.Tol {
			break
		}
		if len(viol) == 0 {
			// No local minimum lies below the LP value: what is left of the
			// gap is LP round-off, and no cut can close it.
			break
		}
	}
	// Final true-minimum check, with the raw and the rounded weights.
	raw := s.evaluate(best, o.RefineMargin, 32)
	res.RawWeights = best
	res.RawBound = -raw.min
	var fin searchEval
	for digits := o.Digits; ; digits++ {
		res.Weights = make([]string, s.n)
		res.Values = make([]float64, s.n)
		for j, v := range best {
			res.Weights[j] = weightDecimal(v, digits)
			res.Values[j], _ = strconv.ParseFloat(res.Weights[j], 64)
		}
		fin = s.evaluate(res.Values, o.NearMargin, 64)
		if -fin.min <= res.RawBound+o.RoundTol || digits >= 17 {
			break
		}
	}
	res.Bound = -fin.min
	res.WorstS = fin.worst
	if s.n == 0 {
		model = fin.min
	}
	res.ModelBound = -model
	res.Converged = model-raw.min <= o.Tol && res.Stopped == ""
	claim := res.Bound + o.TailMargin
	lo, errLo := TailStart(s.m.terms, res.Weights, s.m.edge(), claim, -1)
	hi, errHi := TailStart(s.m.terms, res.Weights, s.m.edge(), claim, 1)
	res.CoverLo, res.CoverHi = -lo, hi
	if errLo != nil {
		res.CoverLo = math.NaN()
	}
	if errHi != nil {
		res.CoverHi = math.NaN()
	}
	res.TailsChecked = o.CheckLo <= res.CoverLo && res.CoverHi <= o.CheckHi
	for _, cd := range fin.minima {
		if cd.value <= fin.min+o.NearMargin {
			res.Minima = append(res.Minima, LocalMin{S: cd.e.s, Value: cd.value})
		}
	}
	sort.Slice(res.Minima, func(a, b int) bool { return res.Minima[a].S < res.Minima[b].S })
	res.NearLo, res.NearHi = math.Inf(1), math.Inf(-1)
	for i, v := range fin.vals {
		if v <= fin.min+o.NearMargin {
			res.NearLo = math.Min(res.NearLo, s.grid[i].s)
			res.NearHi = math.Max(res.NearHi, s.grid[i].s)
		}
	}
	for _, m := range res.Minima {
		res.NearLo = math.Min(res.NearLo, m.S)
		res.NearHi = math.Max(res.NearHi, m.S)
	}
	return res, nil
}

// TailStart returns the smallest S >= 1 (to a relative 1e-6) such that the
// tail enclosure regions.TailSymbol(S, side, ...) of the relaxation with the
// decimal weights, in float interval arithmetic, already proves the claim
// for every s with side*s >= S: lambda_min >= -claim (edge lower) or
// lambda_max <= claim (edge upper). It is a planning aid for the cover
// (the certifier re-proves the tails itself); it fails if no S <= 1e7 works.
func TailStart(terms []regions.Term[interval.F], weights []string, edge regions.Edge, claim float64, side int) (float64, error) {
	if len(weights) != len(terms) {
		return 0, fmt.Errorf("tail start: %d weights for %d terms", len(weights), len(terms))
	}
	if side != 1 && side != -1 {
		return 0, fmt.Errorf("tail start: side must be +1 or -1, not %d", side)
	}
	like := interval.PointF(0)
	w := make([]interval.F, len(weights))
	for j, d := range weights {
		v, err := like.Decimal(d)
		if err != nil {
			return 0, fmt.Errorf("tail start: weight %q: %v", d, err)
		}
		w[j] = v
	}
	ok := func(S float64) bool {
		m := regions.TailSymbol(interval.PointF(S), side, terms, w)
		if edge == regions.Upper {
			return m.MaxEig().Hi() <= claim
		}
		return m.MinEig().Lo() >= -claim
	}
	lo := 1.0
	if ok(lo) {
		return lo, nil
	}
	hi := lo
	for !ok(hi) {
		lo = hi
		hi *= 1.25
		if hi > 1e7 {
			return 0, fmt.Errorf("tail start: the tail lemmas do not give %g below |s| = 1e7", claim)
		}
	}
	for hi-lo > 1e-6*hi {
		if mid := (lo + hi) / 2; ok(mid) {
			hi = mid
		} else {
			lo = mid
		}
	}
	return hi, nil
}

// solveLP maximises t subject to t <= h_i + g_i . c for every cut and
// |c_j| <= WeightBound, through its dual in standard form
//
//	minimise sum_i h_i l_i + W sum_j (u_j + v_j)
//	subject to sum_i l_i = 1,  -sum_i l_i g_ij + u_j - v_j = 0,  l, u, v >= 0,
//
// which has only n+1 rows. The LP value is the optimal value of either
// problem. The primal weights are recovered from complementary slackness:
// every cut with l_i > 0 is tight, c_j = W where u_j > 0, c_j = -W where
// v_j > 0; the (regularised) least-squares solution closest to ref is taken,
// clipped to the box.
func (s *searcher) solveLP(ref []float64) (float64, []float64, error) {
	n, W := s.n, s.opt.WeightBound
	m := len(s.cuts)
	cols := m + 2*n
	A := mat.NewDense(n+1, cols, nil)
	cost := make([]float64, cols)
	b := make([]float64, n+1)
	b[0] = 1
	for i, ct := range s.cuts {
		A.Set(0, i, 1)
		for j, g := range ct.g {
			A.Set(j+1, i, -g)
		}
		cost[i] = ct.h
	}
	for j := 0; j < n; j++ {
		A.Set(j+1, m+j, 1)
		A.Set(j+1, m+n+j, -1)
		cost[m+j], cost[m+n+j] = W, W
	}
	// Feasible start: the lowest cut at ref with the box columns that balance it.
	first, lowest := 0, math.Inf(1)
	for i, ct := range s.cuts {
		if v := ct.value(ref); v < lowest {
			first, lowest = i, v
		}
	}
	basis := []int{first}
	for j, g := range s.cuts[first].g {
		if g >= 0 {
			basis = append(basis, m+j)
		} else {
			basis = append(basis, m+n+j)
		}
	}
	val, x, err := lp.Simplex(cost, A, b, 1e-12, basis)
	if err != nil {
		return 0, nil, fmt.Errorf("LP: %v", err)
	}
	// Recover the weights.
	const eps = 1e-9
	var rows [][]float64
	var rhs []float64
	for i := 0; i < m; i++ {
		if x[i] > 1e-13 {
			r := make([]float64, n+1)
			r[0] = 1
			for j, g := range s.cuts[i].g {
				r[j+1] = -g
			}
			rows = append(rows, r)
			rhs = append(rhs, s.cuts[i].h)
		}
	}
	for j := 0; j < n; j++ {
		for k, sign := range []float64{1, -1} {
			if x[m+k*n+j] > 1e-13 {
				r := make([]float64, n+1)
				r[j+1] = sign
				rows = append(rows, r)
				rhs = append(rhs, W)
			}
		}
	}
	for j := 0; j < n; j++ {
		r := make([]float64, n+1)
		r[j+1] = eps
		rows = append(rows, r)
		rhs = append(rhs, eps*ref[j])
	}
	M := mat.NewDense(len(rows), n+1, nil)
	for i, r := range rows {
		M.SetRow(i, r)
	}
	var y mat.VecDense
	if err := y.SolveVec(M, mat.NewVecDense(len(rhs), rhs)); err != nil {
		var ce mat.Condition
		if !errors.As(err, &ce) {
			return 0, nil, fmt.Errorf("weight recovery: %v", err)
		}
	}
	c := make([]float64, n)
	for j := range c {
		c[j] = math.Max(-W, math.Min(W, y.AtVec(j+1)))
	}
	return val, c, nil
}

// modelAt is the cutting-plane model min_i (h_i + g_i . c).
func (s *searcher) modelAt(c []float64) float64 {
	v := math.Inf(1)
	for _, ct := range s.cuts {
		v = math.Min(v, ct.value(c))
	}
	return v
}

// value is h + g . c.
func (ct searchCut) value(c []float64) float64 {
	v := ct.h
	for j, g := range ct.g {
		v += g * c[j]
	}
	return v
}

// weightDecimal rounds v to digits significant decimal digits and returns it
// as a plain decimal string (no exponent).
func weightDecimal(v float64, digits int) string {
	if v == 0 {
		return "0"
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'e', digits-1, 64), 64)
	if r == 0 {
		return "0"
	}
	return strconv.FormatFloat(r, 'f', -1, 64)
}
