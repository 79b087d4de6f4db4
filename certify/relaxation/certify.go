// Package relaxation certifies halfplane-relaxation certificates: it
// chooses the weights of the relaxation terms (Search: cutting planes on a
// float model), covers the Mellin variable s with cells (certify.Cover),
// encloses the extreme eigenvalue of the 2x2 symbol on each cell in
// interval arithmetic, refines cells whose margin is thin, closes the cover
// with tail lemmas, and assembles the certificate (Run).
package relaxation

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"runtime"
	"sort"
	"time"

	"wedgebound/certificates"
	"wedgebound/certify"
	"wedgebound/interval"
	"wedgebound/regions"
)

// Config describes one certification run.
type Config struct {
	// Problem is the wedge problem as given.
	Problem regions.Problem
	// Terms are the relaxation terms themselves: family kind (any family
	// registered in regions), exact parameters and exact decimal weight.
	// Either every weight is given (they are certified as they are) or none
	// is (Weight "": the weights are searched). Empty means the bare
	// quadrant. Each term must be admissible (regions.Admissible).
	Terms []certificates.Term
	// WeightBound bounds the searched weights (default the larger of 50
	// and max k / 10: the best weights of a large-k profile grow like k).
	WeightBound float64
	// Margin is how far above the float candidate the cover aims (default
	// 2e-4); cells are refined until they prove the candidate plus Margin.
	// The claim is rounded up to 6 significant digits, or more when Margin
	// is finer than that (claimDigits).
	Margin float64
	// Workers is the number of goroutines (0 means GOMAXPROCS); the
	// certificate does not depend on it.
	Workers int
	// Prec is the working precision of the cover in bits: 0 or 53 means
	// float64 intervals (F), anything in 54..65536 big.Float intervals (B)
	// at that precision. The weight search and the tail range stay in
	// float64 (they only propose); every enclosure of the cover, the tails
	// and the rounding budget is computed at Prec, which the certificate
	// records as precision_bits.
	Prec uint
	// Shard and Shards split the cover: the run proves only the contiguous
	// part Shard (0-based) of Shards of the initial cells and marks the
	// certificate as partial (certificates.Merge joins the parts). Shards 0
	// means a whole run.
	Shard, Shards int
	// Progress, if set, receives stage names and counts.
	Progress func(stage string, done, total int)
	// Work, if set, receives what is really done, as it happens: every
	// search round, the start of each stage, and the cover's cells proved
	// and enclosures computed (about every 64 enclosures).
	Work func(Work)
}

// Work is one progress event of Run.
type Work struct {
	// Stage is "search", "tail range", "quadrature set-up" or "cover".
	Stage string
	// Search is the round just finished (stage "search"); MaxRounds bounds
	// the rounds.
	Search    *SearchStep
	MaxRounds int
	// Cover is the cover's status (stage "cover").
	Cover *certify.CoverStatus
}

// Outcome is a finished certification.
type Outcome struct {
	// Certificate holds the proof (not yet sealed or written).
	Certificate *certificates.Certificate
	// Bound is the proved bound (the claim).
	Bound *big.Rat
	// Candidate is the float64 estimate the search reached (not proved).
	Candidate float64
	// Worst is the cell where the proved margin is smallest.
	Worst certify.ProvedCell[interval.F]
	// Elapsed is the wall time of the run.
	Elapsed time.Duration
}

// Run searches weights (unless given), proves the bound on a cover of s
// with both tails closed, and assembles the certificate. It never returns a
// bound that is not proved: the claim is the worst proved value over all
// cells and tails, rounded up.
func Run(cfg Config) (*Outcome, error) {
	switch {
	case cfg.Prec == 0 || cfg.Prec == 53:
		return run(cfg, interval.PointF(0))
	case cfg.Prec < 53 || cfg.Prec > 65536:
		return nil, fmt.Errorf("precision %d bits is outside 53..65536", cfg.Prec)
	}
	return run(cfg, interval.NewB(0, cfg.Prec))
}

// run is Run with the cover's enclosures in the interval type of like.
func run[T interval.Real[T]](cfg Config, prec T) (*Outcome, error) {
	start := time.Now()
	nf, err := regions.Normalize(cfg.Problem)
	if err != nil {
		return nil, err
	}
	edge := nf.Edge
	u0, ok := nf.Threshold()
	like := interval.PointF(0)
	var terms []regions.Term[interval.F]
	var weights []string
	for _, ct := range cfg.Terms {
		t, err := regions.NewTerm(like, ct.Kind, ct.ParamText())
		if err != nil {
			return nil, err
		}
		if ct.Weight.IsSet() {
			weights = append(weights, ct.Weight.String())
		}
		if err := regions.Admissible(t.Kind(), t.Start(), u0, ok); err != nil {
			return nil, err
		}
		terms = append(terms, t)
	}
	progress := cfg.Progress
	if progress == nil {
		progress = func(string, int, int) {}
	}
	work := cfg.Work
	if work == nil {
		work = func(Work) {}
	}
	candidate := math.NaN()
	if len(weights) == 0 && len(terms) > 0 {
		wb := cfg.WeightBound
		if wb == 0 {
			wb = 50
			for _, t := range terms {
				if k, ok := t.Params()["k"]; ok && t.Kind() == "exp" {
					kv, err := like.Decimal(k)
					if err != nil {
						return nil, err
					}
					wb = math.Max(wb, kv.Hi()/10)
				}
			}
		}
		iter := 0
		const maxRounds = 300 // Search's default MaxIter, passed explicitly
		res, err := Search(terms, edge, SearchOptions{WeightBound: wb, Workers: cfg.Workers, MaxIter: maxRounds, Progress: func(st SearchStep) {
			iter++
			progress("search", iter, 0)
			work(Work{Stage: "search", Search: &st, MaxRounds: maxRounds})
		}})
		if err != nil {
			return nil, err
		}
		weights, candidate = res.Weights, res.Bound
	}
	if len(weights) != len(terms) {
		return nil, fmt.Errorf("%d weights given for %d terms", len(weights), len(terms))
	}
	w := make([]interval.F, len(weights))
	for i, s := range weights {
		if _, err := regions.ParseRat(s); err != nil {
			return nil, fmt.Errorf("weight %d: %v", i, err)
		}
		if w[i], err = like.Decimal(s); err != nil {
			return nil, fmt.Errorf("weight %d: %v", i, err)
		}
	}
	rel := regions.NewRelaxation(terms, w)
	// The same relaxation at the cover's precision.
	relT := regions.Relaxation[T]{}
	// At 53 bits the cover uses the search's own terms, whose quadrature
	// set-up (shared layouts) is then built once for both.
	same, isF := any(terms).([]regions.Term[T])
	for i, t := range terms {
		var tt regions.Term[T]
		if isF {
			tt = same[i]
		} else if tt, err = regions.NewTerm(prec, t.Kind(), t.Params()); err != nil {
			return nil, err
		}
		wt, err := prec.Decimal(weights[i])
		if err != nil {
			return nil, fmt.Errorf("weight %d: %v", i, err)
		}
		relT.Terms = append(relT.Terms, tt)
		relT.Weights = append(relT.Weights, wt)
	}
	relT = regions.NewRelaxation(relT.Terms, relT.Weights)
	if math.IsNaN(candidate) {
		// Weights given (or no terms): estimate the candidate from a scan.
		candidate = scanCandidate(rel, edge, cfg.Workers)
	}
	if math.IsNaN(candidate) {
		return nil, errors.New("could not evaluate the candidate weights")
	}
	margin := cfg.Margin
	if margin == 0 {
		margin = 2e-4
	}
	target := candidate + margin
	work(Work{Stage: "tail range"})
	lo, hi, err := coverRange(rel, edge, target)
	if err != nil {
		return nil, err
	}
	work(Work{Stage: "quadrature set-up"})
	warmUp(relT, lo, hi, cfg.Workers)
	grid := regimeGrid(lo, hi)
	if cfg.Shards > 0 {
		if cfg.Shard < 0 || cfg.Shard >= cfg.Shards || cfg.Shards > len(grid)-1 {
			return nil, fmt.Errorf("shard %d/%d is out of range (the cover has %d initial cells)", cfg.Shard+1, cfg.Shards, len(grid)-1)
		}
		n := len(grid) - 1
		a, b := cfg.Shard*n/cfg.Shards, (cfg.Shard+1)*n/cfg.Shards
		grid = grid[a : b+1]
	}
	tgt := prec.Float(target)
	accept := func(v T) bool {
		if !v.IsFinite() {
			return false
		}
		if edge == regions.Upper {
			return !tgt.Less(interval.Upper(v))
		}
		return !interval.Lower(v).Less(tgt.Neg())
	}
	f := func(s T) T { return relT.Eig(s, edge) }
	cells, err := certify.Cover(prec, f, grid, accept, certify.CoverOptions{
		MinWidth: big.NewRat(1, 1_000_000), MaxCells: 200_000, Workers: cfg.Workers,
		Progress: func(d, t int) { progress("cover", d, t) },
		Status:   func(st certify.CoverStatus) { work(Work{Stage: "cover", Cover: &st}) },
	})
	if err != nil {
		return nil, err
	}
	// The proved value: worst over cells and tails.
	sLo := prec.Float(lo)
	sHi := prec.Float(hi)
	below := relT.Tail(sLo, -1).Eig(edge)
	above := relT.Tail(sHi, 1).Eig(edge)
	worst := cells[0]
	proved := edgeValue(below, edge)
	proved = math.Max(proved, edgeValue(above, edge))
	for _, c := range cells {
		if !c.Value.IsFinite() {
			return nil, fmt.Errorf("enclosure not finite on [%s, %s]", c.Lo.FloatString(6), c.Hi.FloatString(6))
		}
		if v := edgeValue(c.Value, edge); v >= edgeValue(worst.Value, edge) {
			worst = c
		}
		proved = math.Max(proved, edgeValue(c.Value, edge))
	}
	claim := roundUp(proved, claimDigits(proved, margin))
	out := &Outcome{Bound: claim, Candidate: candidate, Worst: certify.ProvedCell[interval.F]{
		Lo: worst.Lo, Hi: worst.Hi, Value: interval.F{}.Between(worst.Value.Endpoints())}}
	cert, err := assemble(cfg.Problem, nf, relT, weights, edge, claim, cells, lo, hi, below, above)
	if err != nil {
		return nil, err
	}
	if cfg.Shards > 0 {
		sLo, err1 := certificates.FloatDecimal(-lo)
		sHi, err2 := certificates.FloatDecimal(hi)
		if err := errors.Join(err1, err2); err != nil {
			return nil, err
		}
		cert.Relaxation.Shard = &certificates.Shard{Index: cfg.Shard, Count: cfg.Shards, Lo: sLo, Hi: sHi}
		cert.Relaxation.Below.From = cert.Relaxation.Shard.Lo
		cert.Relaxation.Above.From = cert.Relaxation.Shard.Hi
	}
	out.Certificate = cert
	out.Elapsed = time.Since(start)
	return out, nil
}

// warmUp builds the relaxation's quadrature set-up for [-lo, hi] in
// parallel, one regime of s per job (the exponential terms share one
// layout per regime, built on first use, which would otherwise serialise
// the first cells of the cover). It only affects speed.
func warmUp[T interval.Real[T]](rel regions.Relaxation[T], lo, hi float64, workers int) {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	pts := []float64{0}
	for m := 1.5; m/1.5 < math.Max(lo, hi); m *= 2 {
		if m/1.5 < hi {
			pts = append(pts, m)
		}
		if m/1.5 < lo {
			pts = append(pts, -m)
		}
	}
	if len(rel.Weights) == 0 {
		return
	}
	like := rel.Weights[0]
	certify.For(len(pts), workers, func(i int) { rel.Enclose(like.Float(pts[i])) })
}

// edgeValue turns an eigenvalue enclosure into the bound it proves: for edge
// lower -lambda_min <= -lo, for edge upper lambda_max <= hi. The float64
// endpoints of F are exact; those of B are rounded outward to float64.
func edgeValue[T interval.Real[T]](v T, e regions.Edge) float64 {
	if !v.IsFinite() {
		return math.Inf(1)
	}
	if e == regions.Upper {
		return v.Hi()
	}
	return -v.Lo()
}

// claimDigits is the number of significant digits of the claim: 6, or
// enough that rounding up costs at most a tenth of the margin aimed at.
func claimDigits(v, margin float64) int {
	d := 6
	if v > 0 && margin > 0 {
		d = max(d, int(math.Ceil(math.Log10(v/margin)))+1)
	}
	return min(d, 17)
}

// roundUp returns the smallest decimal with n significant digits >= v.
func roundUp(v float64, n int) *big.Rat {
	x := new(big.Float).SetFloat64(v)
	r, _ := new(big.Rat).SetString(interval.DecimalUp(x, n))
	return r
}

// scanCandidate estimates the bound of fixed weights with the float search's
// evaluation of the given weights (no optimisation; the weights are kept).
func scanCandidate(rel regions.Relaxation[interval.F], e regions.Edge, workers int) float64 {
	if len(rel.Terms) == 0 {
		best := math.Inf(-1)
		for i := -800; i <= 800; i++ {
			v := edgeValue(rel.Enclose(interval.PointF(float64(i)/100)).Eig(e), e)
			best = math.Max(best, v)
		}
		return best
	}
	init := make([]float64, len(rel.Weights))
	wb := 50.0
	for i, w := range rel.Weights {
		init[i] = (w.Lo() + w.Hi()) / 2
		wb = math.Max(wb, 2*math.Abs(init[i]))
	}
	// The box only has to contain the given weights (no LP round runs).
	res, err := Search(rel.Terms, e, SearchOptions{MaxIter: -1, Initial: init, Digits: 17, WeightBound: wb, Workers: workers})
	if err != nil {
		return math.NaN()
	}
	return res.Bound
}

// coverRange returns integers lo, hi > 0 such that the tail lemmas prove the
// target for s <= -lo and s >= hi (at least 8, at most 2^20).
func coverRange(rel regions.Relaxation[interval.F], e regions.Edge, target float64) (float64, float64, error) {
	find := func(side int) (float64, error) {
		for S := 8.0; S <= 1<<20; S *= 1.25 {
			S = math.Ceil(S)
			if edgeValue(rel.Tail(interval.PointF(S), side).Eig(e), e) <= target {
				return S, nil
			}
		}
		return 0, fmt.Errorf("the tail lemmas do not reach the target %.6g for |s| <= 2^20", target)
	}
	lo, err := find(-1)
	if err != nil {
		return 0, 0, err
	}
	hi, err := find(1)
	return lo, hi, err
}

// regimeGrid returns breakpoints for [-lo, hi]: the points +-2^m (where the
// exponential terms switch quadrature regimes), each piece split in 16,
// and [-1, 1] split in 64.
func regimeGrid(lo, hi float64) []*big.Rat {
	pts := map[string]*big.Rat{}
	add := func(v *big.Rat) { pts[v.RatString()] = v }
	addRange := func(a, b *big.Rat, n int64) {
		step := new(big.Rat).Quo(new(big.Rat).Sub(b, a), big.NewRat(n, 1))
		for i := int64(0); i <= n; i++ {
			add(new(big.Rat).Add(a, new(big.Rat).Mul(step, big.NewRat(i, 1))))
		}
	}
	L := new(big.Rat).SetFloat64(lo)
	H := new(big.Rat).SetFloat64(hi)
	addRange(big.NewRat(-1, 1), big.NewRat(1, 1), 64)
	for m := int64(1); ; m *= 2 {
		a, b := big.NewRat(m, 1), big.NewRat(2*m, 1)
		done := true
		if a.Cmp(H) < 0 {
			done = false
			bb := b
			if bb.Cmp(H) > 0 {
				bb = H
			}
			addRange(a, bb, 16)
		}
		if a.Cmp(L) < 0 {
			done = false
			bb := b
			if bb.Cmp(L) > 0 {
				bb = L
			}
			addRange(new(big.Rat).Neg(bb), new(big.Rat).Neg(a), 16)
		}
		if done {
			break
		}
	}
	var g []*big.Rat
	for _, v := range pts {
		g = append(g, v)
	}
	sort.Slice(g, func(i, j int) bool { return g[i].Cmp(g[j]) < 0 })
	return g
}

// assemble builds the certificate from the proved pieces.
func assemble[T interval.Real[T]](p regions.Problem, nf regions.Normal, rel regions.Relaxation[T], weights []string, edge regions.Edge,
	claim *big.Rat, cells []certify.ProvedCell[T], lo, hi float64, below, above T) (*certificates.Certificate, error) {
	like := below
	num := func(n regions.Number) certificates.Fraction { return certificates.FractionOf(n.Rat()) }
	prob := certificates.Problem{
		Vertex: [2]certificates.Fraction{num(p.Vertex[0]), num(p.Vertex[1])},
		Rays: [2][2]certificates.Fraction{{num(p.Rays[0][0]), num(p.Rays[0][1])},
			{num(p.Rays[1][0]), num(p.Rays[1][1])}},
		Halfplane: certificates.Halfplane{Normal: [2]certificates.Fraction{num(p.Halfplane.Normal[0]), num(p.Halfplane.Normal[1])},
			Offset: num(p.Halfplane.Offset)},
		Edge: string(p.Edge),
	}
	var thr *big.Rat
	if u0, ok := nf.Threshold(); ok {
		thr = u0
	}
	frac := certificates.FractionOf
	r := &certificates.Relaxation{
		Problem: prob,
		Normal: certificates.NormalForm{
			Map: [4]certificates.Fraction{frac(nf.S[0]), frac(nf.S[1]), frac(nf.S[2]), frac(nf.S[3])},
			A:   frac(nf.A), B: frac(nf.B), D: frac(nf.D), Threshold: certificates.NewThreshold(thr),
		},
		PrecisionBits: int(like.Prec()),
	}
	var n certificates.Parser
	var quad, trunc float64
	for i, t := range rel.Terms {
		r.Terms = append(r.Terms, certificates.Term{Kind: t.Kind(), Params: n.Params(t.Params()), Weight: n.Decimal(weights[i])})
		q, tr := t.Budget()
		quad, trunc = math.Max(quad, q), math.Max(trunc, tr)
	}
	claimD, err := certificates.DecimalOf(claim)
	if err != nil {
		return nil, err
	}
	r.Claim = certificates.Claim{Edge: string(edge), Bound: claimD, Statement: statement(edge, claimD.String())}
	var rounding float64
	for _, c := range cells {
		l, h, err := interval.Decimals(c.Value, 17)
		if err != nil {
			return nil, err
		}
		lo, err1 := certificates.DecimalOf(c.Lo)
		hi, err2 := certificates.DecimalOf(c.Hi)
		if err := errors.Join(err1, err2); err != nil {
			return nil, err
		}
		r.Cover = append(r.Cover, certificates.Cell{Lo: lo, Hi: hi, EigLower: n.Decimal(l), EigUpper: n.Decimal(h)})
	}
	// Rounding: the width of a point enclosure at the worst cell's midpoint.
	tailB := rel.Tail(like.Float(lo), -1).B.Re.Hi()
	tailB = math.Max(tailB, rel.Tail(like.Float(hi), 1).B.Re.Hi())
	bl, bh := tailBounds(below, above, edge)
	r.Below = certificates.Tail{From: r.Cover[0].Lo, Bound: n.Decimal(bl), Lemma: "quadrant-exp-tail-v1"}
	r.Above = certificates.Tail{From: r.Cover[len(r.Cover)-1].Hi, Bound: n.Decimal(bh), Lemma: "quadrant-exp-tail-v1"}
	mid := cells[0]
	for _, c := range cells {
		if edgeValue(c.Value, edge) > edgeValue(mid.Value, edge) {
			mid = c
		}
	}
	m := new(big.Rat).Add(mid.Lo, mid.Hi)
	m.Quo(m, big.NewRat(2, 1))
	mf, _ := m.Float64()
	rounding = rel.Enclose(like.Float(mf)).Eig(edge).Rad() * 2
	up := func(v float64) certificates.Decimal {
		return n.Decimal(interval.DecimalUp(new(big.Float).SetFloat64(v), 3))
	}
	r.Budget = certificates.Budget{Quadrature: up(quad), Truncation: up(trunc), Tails: up(tailB), Rounding: up(rounding)}
	if err := n.Err(); err != nil {
		return nil, fmt.Errorf("the certificate's numbers do not read: %v", err)
	}
	// The recorded cells and tails, as rounded, must support the claim (the
	// schema's exact check, which the report applies too).
	if err := r.SupportsClaim(); err != nil {
		return nil, fmt.Errorf("the rounded record does not support the claim: %v", err)
	}
	return &certificates.Certificate{Kind: certificates.KindRelaxation, Relaxation: r}, nil
}

// tailBounds formats the tail conclusions as decimal strings rounded to the
// safe side: lower bounds of lambda_min (edge lower) or upper bounds of
// lambda_max (edge upper).
func tailBounds[T interval.Real[T]](below, above T, e regions.Edge) (string, string) {
	f := func(v T) string {
		lo, hi := v.Endpoints()
		if e == regions.Upper {
			return interval.DecimalUp(hi, 17)
		}
		return interval.DecimalDown(lo, 17)
	}
	return f(below), f(above)
}

// statement is the claim in words.
func statement(e regions.Edge, bound string) string {
	if e == regions.Upper {
		return "sup spec(P Op(chi_W) P) <= " + bound + ", since lambda_max(M(s)) <= " + bound + " for every real s"
	}
	return "-inf spec(P Op(chi_W) P) <= " + bound + ", since lambda_min(M(s)) >= -" + bound + " for every real s"
}

// Describe returns a one-line description of a problem for summaries.
func Describe(p regions.Problem) string {
	return fmt.Sprintf("wedge at (%s, %s) with rays (%s, %s), (%s, %s) in {%s x + %s p > %s}, %s edge",
		p.Vertex[0], p.Vertex[1], p.Rays[0][0], p.Rays[0][1], p.Rays[1][0], p.Rays[1][1],
		p.Halfplane.Normal[0], p.Halfplane.Normal[1], p.Halfplane.Offset, p.Edge)
}
