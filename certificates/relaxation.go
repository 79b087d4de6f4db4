package certificates

import (
	"errors"
	"fmt"
	"math/big"
	"sort"
)

// Relaxation is the proof that a wedge problem's spectral edge is bounded:
// a symbol g that agrees with the wedge indicator on the confining
// half-plane (quadrant plus weighted terms in quadrant III) and a cover of
// every real s on which the 2x2 Mellin symbol's extreme eigenvalue stays on
// the right side of the claimed bound.
type Relaxation struct {
	// Problem is the problem as the user gave it.
	Problem Problem `json:"problem"`
	// Normal is the normal form: z -> Map (z - vertex) sends the wedge onto
	// {x > 0, p > 0} and the half-plane onto {a x + b p > -d}.
	Normal NormalForm `json:"normal_form"`
	// Terms are the relaxation regions with their exact weights.
	Terms []Term `json:"terms"`
	// Claim is what the certificate proves.
	Claim Claim `json:"claim"`
	// PrecisionBits is the working precision of the interval arithmetic.
	PrecisionBits int `json:"precision_bits"`
	// Cover lists cells [lo, hi] of s, in increasing order without gaps or
	// overlaps, with an enclosure of the relevant eigenvalue on each.
	Cover []Cell `json:"cover"`
	// Below and Above close the cover: the tail lemmas for s <= Cover[0].Lo
	// and s >= Cover[last].Hi.
	Below Tail `json:"tail_below"`
	Above Tail `json:"tail_above"`
	// Budget records the largest error term of each kind that was added to
	// any enclosure in the cover (all are already included in the cells).
	Budget Budget `json:"error_budget"`
	// Shard marks a partial certificate: its cover is one contiguous part of
	// the full cover [Shard.Lo, Shard.Hi]; Merge joins the parts. A partial
	// certificate proves nothing on its own.
	Shard *Shard `json:"shard,omitempty"`
}

// Shard identifies part Index (0-based) of Count of a sharded cover of
// [Lo, Hi].
type Shard struct {
	Index int    `json:"index"`
	Count int    `json:"count"`
	Lo    string `json:"lo"`
	Hi    string `json:"hi"`
}

// Problem is a wedge (vertex and two rays) inside {normal . z > offset}.
// Entries are exact decimals or fractions p/q.
type Problem struct {
	Vertex    [2]string    `json:"vertex"`
	Rays      [2][2]string `json:"rays"`
	Halfplane Halfplane    `json:"halfplane"`
	Edge      string       `json:"edge"`
}

// Halfplane is {normal . z > offset}.
type Halfplane struct {
	Normal [2]string `json:"normal"`
	Offset string    `json:"offset"`
}

// NormalForm is the exact normalisation: Map is the row-major 2x2 matrix
// (determinant 1), A, B, D describe the image half-plane {A x + B p > -D},
// Threshold = D^2/(4AB) is where admissible quadrant-III profiles may start.
type NormalForm struct {
	Map       [4]string `json:"map"`
	A         string    `json:"a"`
	B         string    `json:"b"`
	D         string    `json:"d"`
	Threshold string    `json:"threshold"`
}

// NoThreshold is the threshold recorded when no quadrant-III profile is
// admissible (d > 0 and a b = 0).
const NoThreshold = "none"

// Term is one weighted relaxation region in quadrant III, a profile h(xp).
// Kind names the family (for example "exp" for h = e^{-k xp}); Params holds
// its exact parameters by name; Weight is the exact real weight.
type Term struct {
	Kind   string            `json:"kind"`
	Params map[string]string `json:"params"`
	Weight string            `json:"weight"`
}

// Claim states the proved bound. For edge "lower": lambda_min(M(s)) >= -Bound
// for every real s, hence -inf spec P Op(chi_W) P <= Bound. For edge
// "upper": lambda_max(M(s)) <= Bound, hence sup spec P Op(chi_W) P <= Bound.
type Claim struct {
	Edge      string `json:"edge"`
	Bound     string `json:"bound"`
	Statement string `json:"statement"`
}

// Cell is one piece of the s-cover: for every s in [Lo, Hi] the relevant
// eigenvalue (lambda_min for edge lower, lambda_max for edge upper) lies in
// [EigLower, EigUpper].
type Cell struct {
	Lo       string `json:"lo"`
	Hi       string `json:"hi"`
	EigLower string `json:"eig_lower"`
	EigUpper string `json:"eig_upper"`
}

// Tail is a tail lemma's conclusion: for every s beyond From (below it for
// tail_below, above it for tail_above) the relevant eigenvalue is >= Bound
// (edge lower) or <= Bound (edge upper). Lemma names the lemma used.
type Tail struct {
	From  string `json:"from"`
	Bound string `json:"bound"`
	Lemma string `json:"lemma"`
}

// Budget lists error terms by kind, as decimal upper bounds.
type Budget struct {
	Quadrature string `json:"quadrature"`
	Truncation string `json:"truncation"`
	Tails      string `json:"tails"`
	Rounding   string `json:"rounding"`
}

func (r *Relaxation) validate() error {
	for i, v := range r.Problem.Vertex {
		if _, err := Frac(v, fmt.Sprintf("problem.vertex[%d]", i)); err != nil {
			return err
		}
	}
	for i, ray := range r.Problem.Rays {
		for j, v := range ray {
			if _, err := Frac(v, fmt.Sprintf("problem.rays[%d][%d]", i, j)); err != nil {
				return err
			}
		}
	}
	for i, v := range r.Problem.Halfplane.Normal {
		if _, err := Frac(v, fmt.Sprintf("problem.halfplane.normal[%d]", i)); err != nil {
			return err
		}
	}
	if _, err := Frac(r.Problem.Halfplane.Offset, "problem.halfplane.offset"); err != nil {
		return err
	}
	if r.Problem.Edge != "lower" && r.Problem.Edge != "upper" {
		return fmt.Errorf("problem.edge must be \"lower\" or \"upper\", not %q", r.Problem.Edge)
	}
	if r.Claim.Edge != r.Problem.Edge {
		return fmt.Errorf("claim.edge %q differs from problem.edge %q", r.Claim.Edge, r.Problem.Edge)
	}
	for i, v := range r.Normal.Map {
		if _, err := Frac(v, fmt.Sprintf("normal_form.map[%d]", i)); err != nil {
			return err
		}
	}
	for _, f := range []struct{ v, n string }{{r.Normal.A, "normal_form.a"}, {r.Normal.B, "normal_form.b"}, {r.Normal.D, "normal_form.d"}} {
		if _, err := Frac(f.v, f.n); err != nil {
			return err
		}
	}
	if r.Normal.Threshold != NoThreshold {
		if _, err := Frac(r.Normal.Threshold, "normal_form.threshold"); err != nil {
			return err
		}
	}
	for i, t := range r.Terms {
		name := fmt.Sprintf("terms[%d]", i)
		if t.Kind == "" {
			return fmt.Errorf("%s: missing kind", name)
		}
		if len(t.Params) == 0 {
			return fmt.Errorf("%s: missing params", name)
		}
		keys := make([]string, 0, len(t.Params))
		for k := range t.Params {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		for _, k := range keys {
			if _, err := Dec(t.Params[k], name+".params."+k); err != nil {
				return err
			}
		}
		if _, err := Dec(t.Weight, name+".weight"); err != nil {
			return err
		}
	}
	if _, err := Dec(r.Claim.Bound, "claim.bound"); err != nil {
		return err
	}
	if r.Claim.Statement == "" {
		return errors.New("claim.statement: missing")
	}
	if r.PrecisionBits < 53 || r.PrecisionBits > 65536 {
		return fmt.Errorf("precision_bits %d is outside [53, 65536]", r.PrecisionBits)
	}
	if len(r.Cover) == 0 {
		return errors.New("cover: no cells")
	}
	var prev *big.Rat
	for i, c := range r.Cover {
		name := fmt.Sprintf("cover[%d]", i)
		lo, err := Dec(c.Lo, name+".lo")
		if err != nil {
			return err
		}
		hi, err := Dec(c.Hi, name+".hi")
		if err != nil {
			return err
		}
		if lo.Cmp(hi) >= 0 {
			return fmt.Errorf("%s: lo %s is not below hi %s", name, c.Lo, c.Hi)
		}
		if prev != nil && prev.Cmp(lo) != 0 {
			if prev.Cmp(lo) < 0 {
				return fmt.Errorf("%s: gap in the cover between %s and %s", name, prev.RatString(), c.Lo)
			}
			return fmt.Errorf("%s: cell overlaps the previous one at %s", name, c.Lo)
		}
		prev = hi
		el, err := Dec(c.EigLower, name+".eig_lower")
		if err != nil {
			return err
		}
		eu, err := Dec(c.EigUpper, name+".eig_upper")
		if err != nil {
			return err
		}
		if el.Cmp(eu) > 0 {
			return fmt.Errorf("%s: eig_lower exceeds eig_upper", name)
		}
	}
	for _, t := range []struct {
		t    Tail
		name string
	}{{r.Below, "tail_below"}, {r.Above, "tail_above"}} {
		if _, err := Dec(t.t.From, t.name+".from"); err != nil {
			return err
		}
		if _, err := Dec(t.t.Bound, t.name+".bound"); err != nil {
			return err
		}
		if t.t.Lemma == "" {
			return fmt.Errorf("%s: missing lemma", t.name)
		}
	}
	first, last := r.Cover[0].Lo, r.Cover[len(r.Cover)-1].Hi
	if r.Shard != nil {
		sh := r.Shard
		if sh.Count < 1 || sh.Index < 0 || sh.Index >= sh.Count {
			return fmt.Errorf("shard %d of %d is out of range", sh.Index, sh.Count)
		}
		lo, err := Dec(sh.Lo, "shard.lo")
		if err != nil {
			return err
		}
		hi, err := Dec(sh.Hi, "shard.hi")
		if err != nil {
			return err
		}
		a, err := Dec(first, "cover[0].lo")
		if err != nil {
			return err
		}
		b, err := Dec(last, "cover[last].hi")
		if err != nil {
			return err
		}
		if a.Cmp(lo) < 0 || b.Cmp(hi) > 0 {
			return fmt.Errorf("shard cover [%s, %s] leaves the full range [%s, %s]", first, last, sh.Lo, sh.Hi)
		}
		first, last = sh.Lo, sh.Hi
	}
	if r.Below.From != first {
		return fmt.Errorf("tail_below starts at %s but the cover starts at %s", r.Below.From, first)
	}
	if r.Above.From != last {
		return fmt.Errorf("tail_above starts at %s but the cover ends at %s", r.Above.From, last)
	}
	for _, f := range []struct{ v, n string }{{r.Budget.Quadrature, "error_budget.quadrature"}, {r.Budget.Truncation, "error_budget.truncation"}, {r.Budget.Tails, "error_budget.tails"}, {r.Budget.Rounding, "error_budget.rounding"}} {
		v, err := Dec(f.v, f.n)
		if err != nil {
			return err
		}
		if v.Sign() < 0 {
			return fmt.Errorf("%s is negative", f.n)
		}
	}
	return nil
}

// Frac parses an exact decimal or a fraction "p/q" with q != 0.
func Frac(s, name string) (*big.Rat, error) {
	if p, q, ok := cutSlash(s); ok {
		a, err := Dec(p, name)
		if err != nil {
			return nil, err
		}
		b, err := Dec(q, name)
		if err != nil {
			return nil, err
		}
		if b.Sign() == 0 {
			return nil, fmt.Errorf("%s: division by zero in %q", name, s)
		}
		return a.Quo(a, b), nil
	}
	return Dec(s, name)
}

func cutSlash(s string) (string, string, bool) {
	for i := 0; i < len(s); i++ {
		if s[i] == '/' {
			return s[:i], s[i+1:], true
		}
	}
	return "", "", false
}
