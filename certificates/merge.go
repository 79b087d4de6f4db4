package certificates

import (
	"encoding/json"
	"errors"
	"fmt"
	"sort"
)

// Merge joins the partial certificates of a sharded run into one
// certificate. It requires exactly the shards 0..Count-1, each once, with the
// same problem, normal form, terms, precision, tails and full range, and
// covers that join without gap or overlap into [Lo, Hi]. The merged claim is
// the largest shard claim (each shard's claim is the worst proved value over
// its cells and both tails); the budget takes the largest term of each kind.
// The result is not sealed.
func Merge(parts []*Certificate) (*Certificate, error) {
	if len(parts) == 0 {
		return nil, errors.New("merge: no certificates given")
	}
	rs := make([]*Relaxation, len(parts))
	for i, c := range parts {
		if c.Kind != KindRelaxation || c.Relaxation == nil {
			return nil, fmt.Errorf("merge: part %d is not a relaxation certificate", i+1)
		}
		if c.Relaxation.Shard == nil {
			return nil, fmt.Errorf("merge: part %d is a complete certificate, not a shard", i+1)
		}
		rs[i] = c.Relaxation
	}
	sort.SliceStable(rs, func(i, j int) bool { return rs[i].Shard.Index < rs[j].Shard.Index })
	n := rs[0].Shard.Count
	if len(rs) != n {
		return nil, fmt.Errorf("merge: %d parts given, but the shards say there are %d", len(rs), n)
	}
	same := func(a, b any) bool {
		x, _ := json.Marshal(a)
		y, _ := json.Marshal(b)
		return string(x) == string(y)
	}
	out := *rs[0]
	out.Shard = nil
	out.Cover = nil
	claim, err := Dec(rs[0].Claim.Bound, "shard 0 claim.bound")
	if err != nil {
		return nil, err
	}
	budget := rs[0].Budget
	for i, r := range rs {
		sh := r.Shard
		if sh.Index != i || sh.Count != n {
			return nil, fmt.Errorf("merge: shard %d of %d is missing or given twice", i, n)
		}
		if sh.Lo != rs[0].Shard.Lo || sh.Hi != rs[0].Shard.Hi {
			return nil, fmt.Errorf("merge: shard %d covers the range [%s, %s], shard 0 [%s, %s]", i, sh.Lo, sh.Hi, rs[0].Shard.Lo, rs[0].Shard.Hi)
		}
		for _, f := range []struct {
			name string
			a, b any
		}{{"problem", r.Problem, out.Problem}, {"normal form", r.Normal, out.Normal}, {"terms", r.Terms, out.Terms},
			{"precision", r.PrecisionBits, out.PrecisionBits}, {"tail_below", r.Below, out.Below}, {"tail_above", r.Above, out.Above},
			{"claim edge", r.Claim.Edge, out.Claim.Edge}} {
			if !same(f.a, f.b) {
				return nil, fmt.Errorf("merge: shard %d has a different %s from shard 0", i, f.name)
			}
		}
		if len(out.Cover) > 0 && out.Cover[len(out.Cover)-1].Hi != r.Cover[0].Lo {
			a, err1 := Dec(out.Cover[len(out.Cover)-1].Hi, fmt.Sprintf("shard %d last hi", i-1))
			b, err2 := Dec(r.Cover[0].Lo, fmt.Sprintf("shard %d first lo", i))
			if err := errors.Join(err1, err2); err != nil {
				return nil, err
			}
			if a.Cmp(b) < 0 {
				return nil, fmt.Errorf("merge: gap between shard %d and shard %d: (%s, %s) is not covered", i-1, i, out.Cover[len(out.Cover)-1].Hi, r.Cover[0].Lo)
			}
			return nil, fmt.Errorf("merge: shards %d and %d overlap at %s", i-1, i, r.Cover[0].Lo)
		}
		out.Cover = append(out.Cover, r.Cover...)
		c, err := Dec(r.Claim.Bound, fmt.Sprintf("shard %d claim.bound", i))
		if err != nil {
			return nil, err
		}
		if c.Cmp(claim) > 0 {
			claim = c
			out.Claim = r.Claim
		}
		budget = maxBudget(budget, r.Budget)
	}
	if out.Cover[0].Lo != rs[0].Shard.Lo || out.Cover[len(out.Cover)-1].Hi != rs[0].Shard.Hi {
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
	pick := func(x, y string) string {
		u, err1 := Dec(x, "budget")
		v, err2 := Dec(y, "budget")
		if err1 != nil || err2 != nil || v.Cmp(u) > 0 {
			return y
		}
		return x
	}
	return Budget{Quadrature: pick(a.Quadrature, b.Quadrature), Truncation: pick(a.Truncation, b.Truncation),
		Tails: pick(a.Tails, b.Tails), Rounding: pick(a.Rounding, b.Rounding)}
}
