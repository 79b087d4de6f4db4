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
	Index int     `json:"index"`
	Count int     `json:"count"`
	Lo    Decimal `json:"lo"`
	Hi    Decimal `json:"hi"`
}

// Problem is a wedge (vertex and two rays) inside {normal . z > offset}.
// Entries are exact decimals or fractions p/q.
type Problem struct {
	Vertex    [2]Fraction    `json:"vertex"`
	Rays      [2][2]Fraction `json:"rays"`
	Halfplane Halfplane      `json:"halfplane"`
	Edge      string         `json:"edge"`
}

// Halfplane is {normal . z > offset}.
type Halfplane struct {
	Normal [2]Fraction `json:"normal"`
	Offset Fraction    `json:"offset"`
}

// NormalForm is the exact normalisation: Map is the row-major 2x2 matrix
// (determinant 1), A, B, D describe the image half-plane {A x + B p > -D},
// Threshold = D^2/(4AB) is where admissible quadrant-III profiles may start.
type NormalForm struct {
	Map       [4]Fraction    `json:"map"`
	A         Fraction       `json:"a"`
	B         Fraction       `json:"b"`
	D         Fraction       `json:"d"`
	Threshold ThresholdValue `json:"threshold"`
}

// NoThreshold is the threshold recorded when no quadrant-III profile is
// admissible (d > 0 and a b = 0).
const NoThreshold = "none"

// Term is one weighted relaxation region in quadrant III, a profile h(xp).
// Kind names the family (for example "exp" for h = e^{-k xp}); Params holds
// its exact parameters by name; Weight is the exact real weight.
type Term struct {
	Kind   string             `json:"kind"`
	Params map[string]Decimal `json:"params"`
	Weight Decimal            `json:"weight"`
}

// ParamText returns the parameters as their recorded text.
func (t Term) ParamText() map[string]string {
	out := make(map[string]string, len(t.Params))
	for k, v := range t.Params {
		out[k] = v.String()
	}
	return out
}

// Claim states the proved bound. For edge "lower": lambda_min(M(s)) >= -Bound
// for every real s, hence -inf spec P Op(chi_W) P <= Bound. For edge
// "upper": lambda_max(M(s)) <= Bound, hence sup spec P Op(chi_W) P <= Bound.
type Claim struct {
	Edge      string  `json:"edge"`
	Bound     Decimal `json:"bound"`
	Statement string  `json:"statement"`
}

// Cell is one piece of the s-cover: for every s in [Lo, Hi] the relevant
// eigenvalue (lambda_min for edge lower, lambda_max for edge upper) lies in
// [EigLower, EigUpper].
type Cell struct {
	Lo       Decimal `json:"lo"`
	Hi       Decimal `json:"hi"`
	EigLower Decimal `json:"eig_lower"`
	EigUpper Decimal `json:"eig_upper"`
}

// Tail is a tail lemma's conclusion: for every s beyond From (below it for
// tail_below, above it for tail_above) the relevant eigenvalue is >= Bound
// (edge lower) or <= Bound (edge upper). Lemma names the lemma used.
type Tail struct {
	From  Decimal `json:"from"`
	Bound Decimal `json:"bound"`
	Lemma string  `json:"lemma"`
}

// Budget lists error terms by kind, as decimal upper bounds.
type Budget struct {
	Quadrature Decimal `json:"quadrature"`
	Truncation Decimal `json:"truncation"`
	Tails      Decimal `json:"tails"`
	Rounding   Decimal `json:"rounding"`
}

// ThresholdValue is normal_form.threshold: a Fraction, or NoThreshold
// when no quadrant-III profile is admissible.
type ThresholdValue struct{ number }

// NewThreshold returns the threshold u (written as FractionText writes
// it), or NoThreshold when u is nil.
func NewThreshold(u *big.Rat) ThresholdValue {
	if u == nil {
		return ThresholdValue{number{NoThreshold}}
	}
	return ThresholdValue{FractionOf(u).number}
}

// None reports whether the threshold is NoThreshold.
func (t ThresholdValue) None() bool { return t.text == NoThreshold }

// IsSet reports whether the threshold holds a value or NoThreshold.
func (t ThresholdValue) IsSet() bool { return t.text != "" }

// Rat returns the threshold, or nil when it is NoThreshold or unset.
func (t ThresholdValue) Rat() *big.Rat {
	if t.None() {
		return nil
	}
	return t.number.Rat()
}

// Cmp compares the threshold with r; NoThreshold compares as 0 (check None
// first).
func (t ThresholdValue) Cmp(r *big.Rat) int {
	if t.None() {
		return new(big.Rat).Cmp(r)
	}
	return t.number.Cmp(r)
}

// UnmarshalText reads a Fraction or NoThreshold.
func (t *ThresholdValue) UnmarshalText(b []byte) error {
	if string(b) == NoThreshold {
		*t = ThresholdValue{number{NoThreshold}}
		return nil
	}
	f, err := ParseFraction(string(b))
	if err != nil {
		return err
	}
	*t = ThresholdValue(f)
	return nil
}

// ThresholdFrom returns u0 = d^2/(4ab), where quadrant-III profiles may
// start for the image half-plane {a x + b p > -d} (a, b, d >= 0): 0 when
// d = 0, and ok false when a b = 0 < d (no profile is admissible). The
// point (-t, -u/t), t > 0, lies outside the half-plane iff
// a t + b u/t >= d; the minimum of the left side over t is 2 sqrt(a b u),
// so the whole hyperbola xp = u is free iff 4 a b u >= d^2 (the lemma is
// in the regions package doc).
func ThresholdFrom(a, b, d *big.Rat) (u0 *big.Rat, ok bool) {
	if d.Sign() == 0 {
		return new(big.Rat), true
	}
	ab := new(big.Rat).Mul(a, b)
	if ab.Sign() == 0 {
		return nil, false
	}
	u := new(big.Rat).Mul(d, d)
	return u.Quo(u, ab.Mul(ab, big.NewRat(4, 1))), true
}

// Admissible returns ThresholdFrom of the recorded a, b and d.
func (n NormalForm) Admissible() (u0 *big.Rat, ok bool) {
	return ThresholdFrom(n.A.Rat(), n.B.Rat(), n.D.Rat())
}

// CheckThreshold reports, exactly, whether the recorded threshold is
// d^2/(4ab) of the recorded a, b and d (NoThreshold when a b = 0 < d).
func (n NormalForm) CheckThreshold() error {
	if !n.A.IsSet() || !n.B.IsSet() || !n.D.IsSet() {
		return errors.New("normal_form: a, b or d is missing")
	}
	u0, ok := n.Admissible()
	switch {
	case !ok && !n.Threshold.None():
		return fmt.Errorf("the recorded threshold is %s, but a b = 0 < d leaves no admissible profile (threshold %s)", n.Threshold, NoThreshold)
	case ok && (n.Threshold.None() || n.Threshold.Cmp(u0) != 0):
		return fmt.Errorf("the recorded threshold %s is not d^2/(4ab) = %s", n.Threshold, FractionText(u0))
	}
	return nil
}

// SupportsClaim reports, exactly, whether the recorded numbers support the
// claim: for edge lower every cell's eig_lower and both tail bounds are
// >= -bound; for edge upper every cell's eig_upper and both tail bounds
// are <= bound. The error names the first cell or tail that does not.
// (The cover and the tails then prove the claim once each enclosure is
// shown true, which is the verifier's work.)
func (r *Relaxation) SupportsClaim() error {
	bound := r.Claim.Bound.Rat()
	if bound == nil {
		return errors.New("claim.bound is missing")
	}
	upper := r.Claim.Edge == "upper"
	ok := func(v Decimal) bool {
		if !v.IsSet() {
			return false
		}
		if upper {
			return v.Rat().Cmp(bound) <= 0
		}
		return v.Rat().Cmp(new(big.Rat).Neg(bound)) >= 0
	}
	for i, c := range r.Cover {
		end := c.EigLower
		if upper {
			end = c.EigUpper
		}
		if !ok(end) {
			return fmt.Errorf("cover cell %d [%s, %s] records an enclosure [%s, %s] that does not support the claimed bound %s", i+1, c.Lo, c.Hi, c.EigLower, c.EigUpper, r.Claim.Bound)
		}
	}
	for _, t := range []struct {
		name string
		t    Tail
	}{{"tail_below", r.Below}, {"tail_above", r.Above}} {
		if !ok(t.t.Bound) {
			return fmt.Errorf("%s records %s, which does not support the claimed bound %s", t.name, t.t.Bound, r.Claim.Bound)
		}
	}
	return nil
}

func (r *Relaxation) validate() error {
	var fs fields
	for i, v := range r.Problem.Vertex {
		fs.add(fmt.Sprintf("problem.vertex[%d]", i), v)
	}
	for i, ray := range r.Problem.Rays {
		for j, v := range ray {
			fs.add(fmt.Sprintf("problem.rays[%d][%d]", i, j), v)
		}
	}
	for i, v := range r.Problem.Halfplane.Normal {
		fs.add(fmt.Sprintf("problem.halfplane.normal[%d]", i), v)
	}
	fs.add("problem.halfplane.offset", r.Problem.Halfplane.Offset)
	for i, v := range r.Normal.Map {
		fs.add(fmt.Sprintf("normal_form.map[%d]", i), v)
	}
	fs.add("normal_form.a", r.Normal.A)
	fs.add("normal_form.b", r.Normal.B)
	fs.add("normal_form.d", r.Normal.D)
	fs.add("normal_form.threshold", r.Normal.Threshold)
	if err := fs.check(); err != nil {
		return err
	}
	if r.Problem.Edge != "lower" && r.Problem.Edge != "upper" {
		return fmt.Errorf("problem.edge must be \"lower\" or \"upper\", not %q", r.Problem.Edge)
	}
	if r.Claim.Edge != r.Problem.Edge {
		return fmt.Errorf("claim.edge %q differs from problem.edge %q", r.Claim.Edge, r.Problem.Edge)
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
			fs.add(name+".params."+k, t.Params[k])
		}
		fs.add(name+".weight", t.Weight)
	}
	fs.add("claim.bound", r.Claim.Bound)
	if err := fs.check(); err != nil {
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
		fs.add(name+".lo", c.Lo)
		fs.add(name+".hi", c.Hi)
		fs.add(name+".eig_lower", c.EigLower)
		fs.add(name+".eig_upper", c.EigUpper)
		if err := fs.check(); err != nil {
			return err
		}
		if c.Lo.Cmp(c.Hi.Rat()) >= 0 {
			return fmt.Errorf("%s: lo %s is not below hi %s", name, c.Lo, c.Hi)
		}
		if prev != nil && prev.Cmp(c.Lo.Rat()) != 0 {
			if prev.Cmp(c.Lo.Rat()) < 0 {
				return fmt.Errorf("%s: gap in the cover between %s and %s", name, FractionText(prev), c.Lo)
			}
			return fmt.Errorf("%s: cell overlaps the previous one at %s", name, c.Lo)
		}
		prev = c.Hi.Rat()
		if c.EigLower.Cmp(c.EigUpper.Rat()) > 0 {
			return fmt.Errorf("%s: eig_lower exceeds eig_upper", name)
		}
	}
	for _, t := range []struct {
		t    Tail
		name string
	}{{r.Below, "tail_below"}, {r.Above, "tail_above"}} {
		fs.add(t.name+".from", t.t.From)
		fs.add(t.name+".bound", t.t.Bound)
		if err := fs.check(); err != nil {
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
		fs.add("shard.lo", sh.Lo)
		fs.add("shard.hi", sh.Hi)
		if err := fs.check(); err != nil {
			return err
		}
		if first.Cmp(sh.Lo.Rat()) < 0 || last.Cmp(sh.Hi.Rat()) > 0 {
			return fmt.Errorf("shard cover [%s, %s] leaves the full range [%s, %s]", first, last, sh.Lo, sh.Hi)
		}
		first, last = sh.Lo, sh.Hi
	}
	// The tails start where the cover ends, written the same way.
	if r.Below.From.text != first.text {
		return fmt.Errorf("tail_below starts at %s but the cover starts at %s", r.Below.From, first)
	}
	if r.Above.From.text != last.text {
		return fmt.Errorf("tail_above starts at %s but the cover ends at %s", r.Above.From, last)
	}
	for _, f := range []struct {
		v Decimal
		n string
	}{{r.Budget.Quadrature, "error_budget.quadrature"}, {r.Budget.Truncation, "error_budget.truncation"}, {r.Budget.Tails, "error_budget.tails"}, {r.Budget.Rounding, "error_budget.rounding"}} {
		fs.add(f.n, f.v)
		if err := fs.check(); err != nil {
			return err
		}
		if f.v.Sign() < 0 {
			return fmt.Errorf("%s is negative", f.n)
		}
	}
	return nil
}
