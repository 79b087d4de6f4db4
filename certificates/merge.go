package certificates

import (
	"encoding/json"
	"errors"
	"fmt"
	"sort"
)

// Merge joins the partial certificates of a sharded run into one
// certificate. It requires exactly the shards 1..Count, each once, with the
// same problem, normal form, terms, precision, tails and full range, and
// covers that join without gap or overlap into [Lo, Hi]. The merged claim is
// the largest shard claim (each shard's claim is the worst proved value over
// its cells and both tails); the budget takes the largest term of each kind.
// The result is not sealed. names, if given, name the parts in errors (one
// per part, e.g. file names); otherwise parts are numbered from 1 in the
// order given. Shards are numbered from 1 in errors, as on the command line.
func Merge(parts []*Certificate, names ...string) (*Certificate, error) {
	if len(parts) == 0 {
		return nil, errors.New("merge: no certificates given")
	}
	name := func(i int) string {
		if i < len(names) {
			return names[i]
		}
		return fmt.Sprintf("part %d", i+1)
	}
	type part struct {
		r    *Relaxation
		name string
	}
	ps := make([]part, len(parts))
	for i, c := range parts {
		if c.Kind != KindRelaxation || c.Relaxation == nil {
			return nil, fmt.Errorf("merge: %s is not a relaxation certificate", name(i))
		}
		if c.Relaxation.Shard == nil {
			return nil, fmt.Errorf("merge: %s is a complete certificate, not a shard", name(i))
		}
		ps[i] = part{c.Relaxation, name(i)}
	}
	same := func(a, b any) bool {
		x, err1 := json.Marshal(a)
		y, err2 := json.Marshal(b)
		return err1 == nil && err2 == nil && string(x) == string(y)
	}
	// The run's inputs first: parts of different runs differ there, and
	// everything else (range, count) follows from them.
	first := ps[0]
	for _, p := range ps[1:] {
		r, o := p.r, first.r
		for _, f := range []struct {
			name string
			a, b any
		}{{"problem", r.Problem, o.Problem}, {"normal form", r.Normal, o.Normal}, {"terms (profiles or weights)", r.Terms, o.Terms},
			{"precision", r.PrecisionBits, o.PrecisionBits}, {"claim edge", r.Claim.Edge, o.Claim.Edge},
			{"shard count", r.Shard.Count, o.Shard.Count},
			{"full range", [2]Decimal{r.Shard.Lo, r.Shard.Hi}, [2]Decimal{o.Shard.Lo, o.Shard.Hi}},
			{"tail_below", r.Below, o.Below}, {"tail_above", r.Above, o.Above}} {
			if !same(f.a, f.b) {
				return nil, fmt.Errorf("merge: %s (shard %d/%d) and %s (shard %d/%d) have different %s: they come from different runs",
					p.name, r.Shard.Index+1, r.Shard.Count, first.name, o.Shard.Index+1, o.Shard.Count, f.name)
			}
		}
	}
	sort.SliceStable(ps, func(i, j int) bool { return ps[i].r.Shard.Index < ps[j].r.Shard.Index })
	n := first.r.Shard.Count
	seen := map[int]string{}
	for _, p := range ps {
		if prev, dup := seen[p.r.Shard.Index]; dup {
			return nil, fmt.Errorf("merge: %s and %s are both shard %d/%d", prev, p.name, p.r.Shard.Index+1, n)
		}
		seen[p.r.Shard.Index] = p.name
	}
	for i := range n {
		if _, ok := seen[i]; !ok {
			return nil, fmt.Errorf("merge: shard %d/%d is missing (%d parts given)", i+1, n, len(ps))
		}
	}
	if len(ps) != n {
		return nil, fmt.Errorf("merge: %d parts given, but the shards say there are %d", len(ps), n)
	}
	rs := make([]*Relaxation, len(ps))
	for i, p := range ps {
		rs[i] = p.r
	}
	out := *rs[0]
	out.Shard = nil
	out.Cover = nil
	claim := rs[0].Claim.Bound
	budget := rs[0].Budget
	for i, r := range rs {
		if len(out.Cover) > 0 && out.Cover[len(out.Cover)-1].Hi.String() != r.Cover[0].Lo.String() {
			if out.Cover[len(out.Cover)-1].Hi.Cmp(r.Cover[0].Lo.Rat()) < 0 {
				return nil, fmt.Errorf("merge: gap between shard %d/%d and shard %d/%d: (%s, %s) is not covered", i, n, i+1, n, out.Cover[len(out.Cover)-1].Hi, r.Cover[0].Lo)
			}
			return nil, fmt.Errorf("merge: shards %d/%d and %d/%d overlap at %s", i, n, i+1, n, r.Cover[0].Lo)
		}
		out.Cover = append(out.Cover, r.Cover...)
		if r.Claim.Bound.Cmp(claim.Rat()) > 0 {
			claim = r.Claim.Bound
			out.Claim = r.Claim
		}
		budget = maxBudget(budget, r.Budget)
	}
	if out.Cover[0].Lo.String() != rs[0].Shard.Lo.String() || out.Cover[len(out.Cover)-1].Hi.String() != rs[0].Shard.Hi.String() {
		return nil, fmt.Errorf("merge: the shards cover [%s, %s], not the full range [%s, %s]", out.Cover[0].Lo, out.Cover[len(out.Cover)-1].Hi, rs[0].Shard.Lo, rs[0].Shard.Hi)
	}
	out.Budget = budget
	m := &Certificate{Kind: KindRelaxation, Relaxation: &out}
	if err := out.validate(); err != nil {
		return nil, fmt.Errorf("merge: %v", err)
	}
	return m, nil
}

func maxBudget(a, b Budget) Budget {
	pick := func(x, y Decimal) Decimal {
		if y.Cmp(x.Rat()) > 0 {
			return y
		}
		return x
	}
	return Budget{Quadrature: pick(a.Quadrature, b.Quadrature), Truncation: pick(a.Truncation, b.Truncation),
		Tails: pick(a.Tails, b.Tails), Rounding: pick(a.Rounding, b.Rounding)}
}
