package relaxation

import (
	"fmt"
	"math/big"
	"runtime"
	"sort"
	"strings"
	"sync"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

func init() { recheck.Register(certificates.KindRelaxation, Checker{}) }

// Checker verifies halfplane-relaxation certificates; the package
// registers it with recheck for certificates.KindRelaxation.
type Checker struct{}

// NewDetail returns an empty *Detail (recheck.DetailDecoder).
func (Checker) NewDetail() any { return new(Detail) }

// Detail is what the relaxation verifier records besides the kind-neutral
// fields of recheck.Result.
type Detail struct {
	// Edge is the claimed edge.
	Edge Edge `json:"edge"`
	// Cells is the number of recorded cells, Pieces the number of pieces the
	// verifier evaluated (after its own subdivision), HighPrecision how many
	// of them needed big-float intervals.
	Cells         int `json:"cells"`
	Pieces        int `json:"pieces"`
	HighPrecision int `json:"high_precision_pieces"`
	// Range is the recorded cover [lo, hi] of s.
	Range [2]string `json:"range"`
}

// failure is a recheck.Failure with its sort key (part of the
// certificate, then s increasing).
type failure struct {
	Where, Lo, Hi, Message, By string
	Refuted, Bound             bool

	order int
	s     *big.Rat
}

// Check recomputes everything the claim of a halfplane-relaxation
// certificate rests on (see the package comment). Result.Statement is the
// claim in words (lower: lambda_min >= -Bound); Result.Recomputed is the
// verifier's own proved bound on the edge quantity over the checked range
// (for edge lower the largest number x with lambda_min >= -x shown; for
// edge upper the smallest x with lambda_max <= x), rounded outward.
func (Checker) Check(c *certificates.Certificate, opt recheck.Options) (*recheck.Result, error) {
	if c.Relaxation == nil {
		return nil, fmt.Errorf("%s certificate without its %q section", c.Kind, "relaxation")
	}
	if opt.Workers <= 0 {
		opt.Workers = runtime.GOMAXPROCS(0)
	}
	if opt.MaxDepth <= 0 {
		opt.MaxDepth = 10
	}
	rel := c.Relaxation
	v := &verifier{rel: rel, opt: opt, res: &recheck.Result{Bound: rel.Claim.Bound.String()},
		det: &Detail{Edge: Edge(rel.Claim.Edge), Cells: len(rel.Cover)}}
	v.res.Problem = describe(rel.Problem)
	v.run()
	sort.SliceStable(v.fails, func(i, j int) bool {
		a, b := v.fails[i], v.fails[j]
		if a.order != b.order {
			return a.order < b.order
		}
		if a.s != nil && b.s != nil {
			return a.s.Cmp(b.s) < 0
		}
		return false
	})
	for _, f := range v.fails {
		v.res.Failures = append(v.res.Failures, recheck.Failure{Where: f.Where, Lo: f.Lo, Hi: f.Hi, Message: f.Message, By: f.By, Refuted: f.Refuted, Bound: f.Bound})
	}
	v.res.Detail = v.det
	return v.res, nil
}

type verifier struct {
	rel   *certificates.Relaxation
	opt   recheck.Options
	res   *recheck.Result
	det   *Detail
	fails []failure
	nums  numbers
	edge  Edge
	bound *big.Rat
	thr   *big.Rat // the edge eigenvalue must stay >= thr (lower) or <= thr (upper)
	mF    *Model[interval.F]

	bOnce sync.Once
	mB    *Model[interval.B]
	bErr  error

	mu    sync.Mutex
	worst *big.Float // lowest proved lower end (lower) / highest upper end (upper)
}

const (
	orderStructure = iota
	orderTailBelow
	orderCover
	orderTailAbove
)

func (v *verifier) fail(f failure) {
	v.mu.Lock()
	v.fails = append(v.fails, f)
	v.mu.Unlock()
}

func (v *verifier) note(s string) {
	v.mu.Lock()
	v.res.Notes = append(v.res.Notes, s)
	v.mu.Unlock()
}

func (v *verifier) run() {
	rel := v.rel
	if sh := rel.Shard; sh != nil {
		v.fail(failure{Where: "shard", Message: fmt.Sprintf("partial certificate (shard %d of %d): its cells cover only part of [%s, %s], so it proves nothing on its own; join all shards with wedgebound merge", sh.Index+1, sh.Count, sh.Lo, sh.Hi)})
		return
	}
	if !v.readNumbers() {
		return
	}
	v.edge = Edge(rel.Claim.Edge)
	if v.edge != Lower && v.edge != Upper {
		v.fail(failure{Where: "claim", Message: fmt.Sprintf("claim.edge must be %q or %q, not %q", Lower, Upper, rel.Claim.Edge)})
		return
	}
	b := rel.Claim.Bound.Rat()
	if b == nil {
		v.fail(failure{Where: "claim", Message: "claim.bound: missing number"})
		return
	}
	v.bound = b
	if v.edge == Lower {
		v.thr = new(big.Rat).Neg(b)
		v.res.Statement = fmt.Sprintf("lambda_min(M(s)) >= -%s for every real s, so inf spec P Op(chi_W) P >= -%s", rel.Claim.Bound, rel.Claim.Bound)
	} else {
		v.thr = new(big.Rat).Set(b)
		v.res.Statement = fmt.Sprintf("lambda_max(M(s)) <= %s for every real s, so sup spec P Op(chi_W) P <= %s", rel.Claim.Bound, rel.Claim.Bound)
	}
	if rel.Problem.Edge != rel.Claim.Edge {
		v.fail(failure{Where: "claim", Message: fmt.Sprintf("claim.edge %q differs from problem.edge %q", rel.Claim.Edge, rel.Problem.Edge)})
	}
	v.det.Range = [2]string{rel.Cover[0].Lo.String(), rel.Cover[len(rel.Cover)-1].Hi.String()}

	// Geometry and admissibility, exactly.
	nf, err := Recompute(rel.Problem)
	if err != nil {
		v.fail(failure{Where: "problem", Message: err.Error()})
		return
	}
	if err := nf.Compare(rel.Normal); err != nil {
		v.fail(failure{Where: "normal_form", Message: err.Error()})
	}
	m, err := NewModel(interval.F{}, v.edge, rel.Terms)
	if err != nil {
		where := "terms"
		if i := strings.Index(err.Error(), ":"); i > 0 && strings.HasPrefix(err.Error(), "terms[") {
			where = err.Error()[:i]
		}
		v.fail(failure{Where: where, Message: err.Error()})
		return
	}
	v.mF = m
	for i := range rel.Terms {
		st := m.TermStart(i)
		switch {
		case nf.Threshold == nil:
			v.fail(failure{Where: fmt.Sprintf("terms[%d]", i), Message: "no quadrant-III profile is admissible for this problem (the vertex is inside the half-plane and a ray runs parallel to its boundary), so the relaxation does not agree with the wedge indicator on the half-plane"})
		case st.Cmp(nf.Threshold) < 0:
			v.fail(failure{Where: fmt.Sprintf("terms[%d]", i), Message: fmt.Sprintf("the %q profile is nonzero from xp = %s on, but only profiles supported on xp >= %s vanish on the image half-plane; the relaxation would change the operator", rel.Terms[i].Kind, st.RatString(), nf.Threshold.RatString())})
		}
	}
	if len(v.fails) > 0 {
		return
	}
	v.checkRecorded()
	v.checkCells()
	v.checkTail(-1)
	v.checkTail(1)
	if w := v.worst; w != nil && len(v.fails) == 0 {
		if v.edge == Lower {
			v.res.Recomputed = interval.DecimalUp(new(big.Float).Neg(w), 8)
		} else {
			v.res.Recomputed = interval.DecimalUp(w, 8)
		}
	}
}

// cellNumbers are the exact values of one recorded cell.
type cellNumbers struct{ lo, hi, el, eu *big.Rat }

// tailNumbers are the exact values of one recorded tail.
type tailNumbers struct{ from, bound *big.Rat }

// numbers holds every recorded number of the cover and the tails, read
// once; tails is indexed by side (-1 below, 1 above).
type numbers struct {
	cells []cellNumbers
	tails map[int]tailNumbers
}

// readNumbers reads the cover and the tails exactly. A number that does not
// read is a failure of the structure (and ends the check).
func (v *verifier) readNumbers() bool {
	rel := v.rel
	ok := true
	read := func(d certificates.Decimal, name string) *big.Rat {
		r := d.Rat()
		if r == nil {
			v.fail(failure{Where: "structure", Message: name + ": missing number"})
			ok = false
		}
		return r
	}
	v.nums.cells = make([]cellNumbers, len(rel.Cover))
	for i, c := range rel.Cover {
		name := fmt.Sprintf("cover[%d]", i)
		v.nums.cells[i] = cellNumbers{read(c.Lo, name+".lo"), read(c.Hi, name+".hi"), read(c.EigLower, name+".eig_lower"), read(c.EigUpper, name+".eig_upper")}
	}
	v.nums.tails = map[int]tailNumbers{
		-1: {read(rel.Below.From, "tail_below.from"), read(rel.Below.Bound, "tail_below.bound")},
		1:  {read(rel.Above.From, "tail_above.from"), read(rel.Above.Bound, "tail_above.bound")},
	}
	return ok
}

// checkRecorded tests the recorded numbers against the claim they are
// supposed to support.
func (v *verifier) checkRecorded() {
	rel := v.rel
	for i, c := range rel.Cover {
		el, eu, lo := v.nums.cells[i].el, v.nums.cells[i].eu, v.nums.cells[i].lo
		if v.edge == Lower && el.Cmp(v.thr) < 0 {
			v.fail(failure{Where: fmt.Sprintf("cover[%d]", i), Lo: c.Lo.String(), Hi: c.Hi.String(), order: orderCover, s: lo,
				Message: fmt.Sprintf("the recorded enclosure [%s, %s] does not support the claim: its lower end is below -%s", c.EigLower, c.EigUpper, rel.Claim.Bound),
				By:      checknum.RatDecimal(new(big.Rat).Sub(v.thr, el))})
		}
		if v.edge == Upper && eu.Cmp(v.thr) > 0 {
			v.fail(failure{Where: fmt.Sprintf("cover[%d]", i), Lo: c.Lo.String(), Hi: c.Hi.String(), order: orderCover, s: lo,
				Message: fmt.Sprintf("the recorded enclosure [%s, %s] does not support the claim: its upper end is above %s", c.EigLower, c.EigUpper, rel.Claim.Bound),
				By:      checknum.RatDecimal(new(big.Rat).Sub(eu, v.thr))})
		}
	}
	for _, t := range []struct {
		tail  certificates.Tail
		name  string
		side  int
		order int
	}{{rel.Below, "tail_below", -1, orderTailBelow}, {rel.Above, "tail_above", 1, orderTailAbove}} {
		tb, from := v.nums.tails[t.side].bound, v.nums.tails[t.side].from
		lim := v.mF.TailLimit(t.side)
		f := failure{Where: t.name, Lo: t.tail.From.String(), order: t.order, s: from}
		if v.edge == Lower {
			switch {
			case tb.Cmp(v.thr) < 0:
				f.Message = fmt.Sprintf("the recorded tail bound %s does not support the claim (it is below -%s)", t.tail.Bound, rel.Claim.Bound)
				f.By = checknum.RatDecimal(new(big.Rat).Sub(v.thr, tb))
				v.fail(f)
			case tb.Cmp(lim) > 0:
				f.Message = fmt.Sprintf("the recorded tail bound %s is false: lambda_min tends to %s as |s| grows, so it cannot stay above %s", t.tail.Bound, lim.RatString(), t.tail.Bound)
				f.By = checknum.RatDecimal(new(big.Rat).Sub(tb, lim))
				f.Refuted = true
				v.fail(f)
			}
		} else {
			switch {
			case tb.Cmp(v.thr) > 0:
				f.Message = fmt.Sprintf("the recorded tail bound %s does not support the claim (it is above %s)", t.tail.Bound, rel.Claim.Bound)
				f.By = checknum.RatDecimal(new(big.Rat).Sub(tb, v.thr))
				v.fail(f)
			case tb.Cmp(lim) < 0:
				f.Message = fmt.Sprintf("the recorded tail bound %s is false: lambda_max tends to %s there, so it cannot stay below %s", t.tail.Bound, lim.RatString(), t.tail.Bound)
				f.By = checknum.RatDecimal(new(big.Rat).Sub(lim, tb))
				f.Refuted = true
				v.fail(f)
			}
		}
	}
}

// modelB returns the high-precision model, built on first use, at the
// certificate's recorded precision_bits or higher (at least 106 bits):
// pieces that float64 cannot decide are re-checked there.
func (v *verifier) modelB() (*Model[interval.B], error) {
	v.bOnce.Do(func() {
		prec := uint(max(v.rel.PrecisionBits, 106))
		v.mB, v.bErr = NewModel(interval.NewB(0, prec), v.edge, v.rel.Terms)
	})
	return v.mB, v.bErr
}

// decide reports whether the enclosure [eLo, eHi] of the eigenvalue over a
// piece proves the claim (ok), or the point enclosure [pLo, pHi] shows it
// false (refuted). nil endpoints mean unbounded.
func (v *verifier) decide(eLo, eHi, pLo, pHi *big.Float) (ok, refuted bool) {
	thr := new(big.Float).SetPrec(200).SetRat(v.thr)
	if v.edge == Lower {
		return eLo != nil && eLo.Cmp(thr) >= 0, pHi != nil && pHi.Cmp(thr) < 0
	}
	return eHi != nil && eHi.Cmp(thr) <= 0, pLo != nil && pLo.Cmp(thr) > 0
}

// piece evaluates one piece on the float64 model, retrying on the
// high-precision model when asked to and float64 cannot decide.
func (v *verifier) piece(a, b *big.Rat, retry bool) (eLo, eHi, pLo, pHi, at *big.Float, high bool, err error) {
	r, err := v.mF.Piece(a, b)
	if err != nil {
		return
	}
	eLo, eHi = r.Eig.Endpoints()
	pLo, pHi = r.Mid.Endpoints()
	at, _ = r.MidAt.Endpoints()
	if ok, ref := v.decide(eLo, eHi, pLo, pHi); ok || ref || !retry || v.opt.NoHighPrecision {
		return
	}
	mb, berr := v.modelB()
	if berr != nil {
		return
	}
	rb, berr := mb.Piece(a, b)
	if berr != nil {
		return
	}
	eLo, eHi = rb.Eig.Endpoints()
	pLo, pHi = rb.Mid.Endpoints()
	at, _ = rb.MidAt.Endpoints()
	return eLo, eHi, pLo, pHi, at, true, nil
}

// cellResult collects the verifier's findings on one recorded cell.
type cellResult struct {
	lo, hi  *big.Float // hull of the piece enclosures
	failure *failure
	pieces  int
	high    int
	worst   *big.Float
	mids    [][2]*big.Float // point enclosures (lo, hi) at piece midpoints
	midAt   []*big.Float
	encs    [][2]*big.Float // piece enclosures and their pieces
	encAt   [][2]*big.Rat
	// recorded is a contradiction of the cell's recorded enclosure.
	recorded *failure
}

func (v *verifier) checkCells() {
	rel := v.rel
	results := make([]cellResult, len(rel.Cover))
	checknum.For(len(rel.Cover), v.opt.Workers, func(i int) {
		lo, hi := v.nums.cells[i].lo, v.nums.cells[i].hi
		results[i] = v.cell(lo, hi)
		if results[i].failure == nil {
			results[i].recorded = v.checkRecordedCell(rel.Cover[i], v.nums.cells[i], &results[i])
		}
	})
	for i, r := range results {
		c := rel.Cover[i]
		v.det.Pieces += r.pieces
		v.det.HighPrecision += r.high
		v.addWorst(r.worst)
		lo := v.nums.cells[i].lo
		if r.failure != nil {
			f := *r.failure
			f.Where = fmt.Sprintf("cover[%d]", i)
			f.Lo, f.Hi = c.Lo.String(), c.Hi.String()
			f.order, f.s = orderCover, lo
			v.fail(f)
			continue
		}
		if r.recorded != nil {
			f := *r.recorded
			f.Where = fmt.Sprintf("cover[%d]", i)
			f.Lo, f.Hi = c.Lo.String(), c.Hi.String()
			f.order, f.s = orderCover, lo
			v.fail(f)
		}
	}
}

// checkRecordedCell looks for evidence that the recorded enclosure
// [EigLower, EigUpper] of a cell is false: a piece whose enclosure misses
// it, a point value that misses it, and, when the verifier's hull reaches
// well beyond the recorded enclosure, point values on a grid of the cell.
// It returns nil when nothing contradicts the record.
func (v *verifier) checkRecordedCell(c certificates.Cell, n cellNumbers, r *cellResult) *failure {
	lo, hi, el, eu := n.lo, n.hi, n.el, n.eu
	elF := new(big.Float).SetPrec(200).SetRat(el)
	euF := new(big.Float).SetPrec(200).SetRat(eu)
	miss := func(l, h *big.Float) bool { return h.Cmp(elF) < 0 || l.Cmp(euF) > 0 }
	report := func(l, h *big.Float, what string) *failure {
		var by *big.Float
		if h.Cmp(elF) < 0 {
			by = new(big.Float).Sub(elF, h)
		} else {
			by = new(big.Float).Sub(l, euF)
		}
		return &failure{Refuted: true, By: interval.DecimalDown(by, 4),
			Message: fmt.Sprintf("the recorded enclosure [%s, %s] is false: %s the eigenvalue lies in [%s, %s]",
				c.EigLower, c.EigUpper, what, interval.DecimalDown(l, 10), interval.DecimalUp(h, 10))}
	}
	for j, e := range r.encs {
		if miss(e[0], e[1]) {
			return report(e[0], e[1], fmt.Sprintf("for every s in [%s, %s]", certificates.FractionText(r.encAt[j][0]), certificates.FractionText(r.encAt[j][1])))
		}
	}
	for j, m := range r.mids {
		if miss(m[0], m[1]) {
			return report(m[0], m[1], "at s = "+fmtF(r.midAt[j], 12))
		}
	}
	if r.lo == nil || r.hi == nil {
		return nil
	}
	slack := new(big.Float).Sub(r.hi, r.lo)
	slack.Quo(slack, big.NewFloat(10))
	below := new(big.Float).Sub(elF, r.lo)
	above := new(big.Float).Sub(r.hi, euF)
	if below.Cmp(slack) <= 0 && above.Cmp(slack) <= 0 {
		return nil
	}
	const grid = 16
	w := new(big.Rat).Sub(hi, lo)
	for i := 0; i <= grid; i++ {
		s := new(big.Rat).Add(lo, new(big.Rat).Mul(w, big.NewRat(int64(i), grid)))
		p, err := v.mF.Piece(s, s)
		if err != nil {
			return nil
		}
		l, h := p.Mid.Endpoints()
		if l != nil && h != nil && miss(l, h) {
			return report(l, h, "at s = "+checknum.RatDecimal(s))
		}
	}
	return nil
}

func (v *verifier) addWorst(w *big.Float) {
	if w == nil {
		return
	}
	v.mu.Lock()
	defer v.mu.Unlock()
	if v.worst == nil || (v.edge == Lower && w.Cmp(v.worst) < 0) || (v.edge == Upper && w.Cmp(v.worst) > 0) {
		v.worst = w
	}
}

// cell checks the claim on the exact cell [lo, hi], subdividing as needed.
func (v *verifier) cell(lo, hi *big.Rat) cellResult {
	var out cellResult
	type span struct {
		a, b  *big.Rat
		depth int
	}
	var stack []span
	ps := Pieces(lo, hi)
	for i := len(ps) - 1; i >= 0; i-- {
		stack = append(stack, span{ps[i][0], ps[i][1], 0})
	}
	half := big.NewRat(1, 2)
	for len(stack) > 0 {
		p := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		out.pieces++
		eLo, eHi, mLo, mHi, at, high, err := v.piece(p.a, p.b, p.depth >= v.opt.MaxDepth)
		if err != nil {
			out.failure = &failure{Message: err.Error()}
			return out
		}
		if high {
			out.high++
		}
		ok, refuted := v.decide(eLo, eHi, mLo, mHi)
		if mLo != nil && mHi != nil {
			out.mids = append(out.mids, [2]*big.Float{mLo, mHi})
			out.midAt = append(out.midAt, at)
		}
		if refuted {
			by := new(big.Float).SetPrec(200).SetRat(v.thr)
			var val string
			if v.edge == Lower {
				by.Sub(by, mHi)
				val = "lambda_min <= " + interval.DecimalUp(mHi, 10)
			} else {
				by.Sub(mLo, by)
				val = "lambda_max >= " + interval.DecimalDown(mLo, 10)
			}
			out.failure = &failure{Refuted: true, Bound: true, By: interval.DecimalDown(by, 4),
				Message: fmt.Sprintf("the claim is false: at s = %s the verifier finds %s, beyond the claimed %s%s", fmtF(at, 12), val, sgn(v.edge), v.rel.Claim.Bound)}
			return out
		}
		if !ok {
			// Bisection cannot repair an enclosure that overflowed.
			if p.depth < v.opt.MaxDepth && eLo != nil && eHi != nil {
				mid := new(big.Rat).Add(p.a, p.b)
				mid.Mul(mid, half)
				stack = append(stack, span{mid, p.b, p.depth + 1}, span{p.a, mid, p.depth + 1})
				continue
			}
			by := new(big.Float).SetPrec(200).SetRat(v.thr)
			var msg string
			if eLo == nil || eHi == nil {
				msg = "the verifier's enclosure is unbounded"
			} else if v.edge == Lower {
				by.Sub(by, eLo)
				msg = fmt.Sprintf("not proved: on s in [%s, %s] the verifier's enclosure of lambda_min reaches down to %s, below -%s", certificates.FractionText(p.a), certificates.FractionText(p.b), interval.DecimalDown(eLo, 10), v.rel.Claim.Bound)
			} else {
				by.Sub(eHi, by)
				msg = fmt.Sprintf("not proved: on s in [%s, %s] the verifier's enclosure of lambda_max reaches up to %s, above %s", certificates.FractionText(p.a), certificates.FractionText(p.b), interval.DecimalUp(eHi, 10), v.rel.Claim.Bound)
			}
			f := &failure{Message: msg, Bound: true}
			if eLo != nil && eHi != nil {
				f.By = interval.DecimalUp(by, 4)
			}
			out.failure = f
			return out
		}
		out.encs = append(out.encs, [2]*big.Float{eLo, eHi})
		out.encAt = append(out.encAt, [2]*big.Rat{p.a, p.b})
		if out.lo == nil || eLo.Cmp(out.lo) < 0 {
			out.lo = eLo
		}
		if out.hi == nil || eHi.Cmp(out.hi) > 0 {
			out.hi = eHi
		}
	}
	if v.edge == Lower {
		out.worst = out.lo
	} else {
		out.worst = out.hi
	}
	return out
}

func sgn(e Edge) string {
	if e == Lower {
		return "-"
	}
	return ""
}

// checkTail proves the claim for s beyond the recorded tail start, with
// the verifier's own lemma (Model.Tail); when the lemma is too weak there
// it covers [from, from * 2^j] with its own cells and applies the lemma
// further out, up to 64 |from|.
func (v *verifier) checkTail(side int) {
	rel := v.rel
	t, name, order := rel.Below, "tail_below", orderTailBelow
	if side > 0 {
		t, name, order = rel.Above, "tail_above", orderTailAbove
	}
	from := v.nums.tails[side].from
	if from.Sign() != side {
		v.fail(failure{Where: name, Lo: t.From.String(), order: order, s: from, Message: fmt.Sprintf("%s starts at %s, on the wrong side of 0 (the cover must contain s = 0 in its interior)", name, t.From)})
		return
	}
	// The recorded tail bound must hold at the tail's first point.
	if pt, err := v.mF.Piece(from, from); err == nil {
		tb := v.nums.tails[side].bound
		tbF := new(big.Float).SetPrec(200).SetRat(tb)
		pl, ph := pt.Mid.Endpoints()
		if v.edge == Lower && ph != nil && ph.Cmp(tbF) < 0 || v.edge == Upper && pl != nil && pl.Cmp(tbF) > 0 {
			v.fail(failure{Where: name, Lo: t.From.String(), order: order, s: from, Refuted: true,
				Message: fmt.Sprintf("the recorded tail bound %s is false: at s = %s the eigenvalue lies in [%s, %s]", t.Bound, t.From, interval.DecimalDown(pl, 10), interval.DecimalUp(ph, 10))})
			return
		}
	}
	cur := new(big.Rat).Set(from)
	limit := new(big.Rat).Mul(from, big.NewRat(64, 1))
	for {
		enc, err := v.mF.Tail(cur, side)
		if err != nil {
			v.fail(failure{Where: name, Lo: t.From.String(), order: order, s: from, Message: err.Error()})
			return
		}
		lo, hi := enc.Endpoints()
		var ok bool
		var end *big.Float
		if v.edge == Lower {
			end = lo
		} else {
			end = hi
		}
		ok, _ = v.decide(lo, hi, nil, nil)
		if ok {
			v.addWorst(end)
			if cur.Cmp(from) != 0 {
				v.note(fmt.Sprintf("%s: the verifier's tail lemma holds from s = %s; it covered [%s, %s] with its own cells", name, certificates.FractionText(cur), certificates.FractionText(minRat(from, cur)), certificates.FractionText(maxRat(from, cur))))
			}
			return
		}
		next := new(big.Rat).Mul(cur, big.NewRat(2, 1))
		if v.opt.NoTailExtension || new(big.Rat).Abs(next).Cmp(new(big.Rat).Abs(limit)) > 0 {
			thr := new(big.Float).SetPrec(200).SetRat(v.thr)
			var by *big.Float
			if end != nil {
				if v.edge == Lower {
					by = new(big.Float).Sub(thr, end)
				} else {
					by = new(big.Float).Sub(end, thr)
				}
			}
			f := failure{Where: name, Lo: t.From.String(), order: order, s: from, Bound: true,
				Message: fmt.Sprintf("not proved: the verifier's tail lemma at s = %s gives only %s %s, short of the claim", certificates.FractionText(cur), map[Edge]string{Lower: "lambda_min >=", Upper: "lambda_max <="}[v.edge], fmtF(end, 10))}
			if by != nil {
				f.By = interval.DecimalUp(by, 4)
			}
			v.fail(f)
			return
		}
		// Cover [cur, next] (or [next, cur]) with the verifier's own cells.
		a, b := minRat(cur, next), maxRat(cur, next)
		const parts = 16
		w := new(big.Rat).Quo(new(big.Rat).Sub(b, a), big.NewRat(parts, 1))
		results := make([]cellResult, parts)
		checknum.For(parts, v.opt.Workers, func(i int) {
			lo := new(big.Rat).Add(a, new(big.Rat).Mul(w, big.NewRat(int64(i), 1)))
			hi := new(big.Rat).Add(a, new(big.Rat).Mul(w, big.NewRat(int64(i+1), 1)))
			if i == parts-1 {
				hi = b
			}
			results[i] = v.cell(lo, hi)
		})
		for i, r := range results {
			v.det.Pieces += r.pieces
			v.det.HighPrecision += r.high
			if r.failure != nil {
				f := *r.failure
				lo := new(big.Rat).Add(a, new(big.Rat).Mul(w, big.NewRat(int64(i), 1)))
				f.Where, f.Lo, f.order, f.s = name, t.From.String(), order, lo
				f.Message = fmt.Sprintf("beyond the recorded tail start %s (the verifier's lemma needs a larger |s|): %s", t.From, f.Message)
				v.fail(f)
				return
			}
			v.addWorst(r.worst)
		}
		cur = next
	}
}

func minRat(a, b *big.Rat) *big.Rat {
	if a.Cmp(b) < 0 {
		return a
	}
	return b
}

func maxRat(a, b *big.Rat) *big.Rat {
	if a.Cmp(b) > 0 {
		return a
	}
	return b
}

func fmtF(x *big.Float, digits int) string {
	if x == nil {
		return "(unbounded)"
	}
	return x.Text('g', digits)
}

// describe writes the problem in one line.
func describe(p certificates.Problem) string {
	n := p.Halfplane.Normal
	return fmt.Sprintf("edge %s; wedge at (%s, %s) spanned by (%s, %s) and (%s, %s), in the half-plane %s x + %s p > %s",
		p.Edge, p.Vertex[0], p.Vertex[1], p.Rays[0][0], p.Rays[0][1], p.Rays[1][0], p.Rays[1][1], n[0], n[1], p.Halfplane.Offset)
}
