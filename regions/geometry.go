package regions

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math/big"
	"sort"
	"strings"

	"wedgebound/certificates"
)

// Edge names which end of the spectrum a problem asks for.
type Edge string

// The two spectral edges.
const (
	// Lower asks for inf spec P Op(chi_W) P; the certified number is an upper
	// bound on its negative (for backflow, on the backflow constant).
	Lower Edge = "lower"
	// Upper asks for sup spec P Op(chi_W) P and certifies an upper bound on it.
	Upper Edge = "upper"
)

// Problem is a wedge with vertex Vertex spanned by the rays Rays, confined to
// the open half-plane {Normal . z > Offset}. Numbers are exact decimals.
type Problem struct {
	Vertex    [2]Number    `json:"vertex"`
	Rays      [2][2]Number `json:"rays"`
	Halfplane Halfplane    `json:"halfplane"`
	Edge      Edge         `json:"edge"`
}

// Halfplane is {Normal . z > Offset}.
type Halfplane struct {
	Normal [2]Number `json:"normal"`
	Offset Number    `json:"offset"`
}

// Number is an exact rational read from and written to JSON as a decimal
// number (or a quoted decimal or fraction string such as "1/3").
type Number struct{ r *big.Rat }

// Num returns the Number for the exact rational p/q.
func Num(p, q int64) Number { return Number{new(big.Rat).SetFrac64(p, q)} }

// Rat returns a copy of the value (0 for the zero Number).
func (n Number) Rat() *big.Rat {
	if n.r == nil {
		return new(big.Rat)
	}
	return new(big.Rat).Set(n.r)
}

// String writes n as an exact decimal when it has one, else as p/q.
func (n Number) String() string { return RatString(n.Rat()) }

// DecimalPlaces returns the number of decimal places of r when r is a
// terminating decimal (its denominator is 2^i 5^j), and ok false otherwise.
func DecimalPlaces(r *big.Rat) (places int, ok bool) {
	t, ok := certificates.DecimalText(r)
	if !ok {
		return 0, false
	}
	if i := strings.IndexByte(t, '.'); i >= 0 {
		return len(t) - i - 1, true
	}
	return 0, true
}

// RatString writes r as an exact finite decimal when possible, else "p/q"
// (the certificates' printer, certificates.FractionText).
func RatString(r *big.Rat) string { return certificates.FractionText(r) }

// MarshalJSON writes the number as a JSON number when it is a finite
// decimal, otherwise as a string "p/q".
func (n Number) MarshalJSON() ([]byte, error) {
	s := n.String()
	if strings.Contains(s, "/") {
		return json.Marshal(s)
	}
	return []byte(s), nil
}

// UnmarshalJSON reads a JSON number or a string holding a decimal or p/q.
func (n *Number) UnmarshalJSON(b []byte) error {
	b = bytes.TrimSpace(b)
	s := string(b)
	if len(b) > 0 && b[0] == '"' {
		if err := json.Unmarshal(b, &s); err != nil {
			return err
		}
	}
	r, err := ParseRat(s)
	if err != nil {
		return err
	}
	n.r = r
	return nil
}

// ParseRat reads a finite decimal ("-1.5e-3") or fraction ("2/3"), rejecting
// NaN, infinities, empty strings and absurdly long exponents.
func ParseRat(s string) (*big.Rat, error) {
	t := strings.TrimSpace(s)
	if t == "" || t == "null" {
		return nil, errors.New("missing number")
	}
	if len(t) > 4000 {
		return nil, fmt.Errorf("number %.20q... is too long", t)
	}
	if i := strings.IndexAny(t, "eE"); i >= 0 {
		var e int
		if _, err := fmt.Sscan(t[i+1:], &e); err != nil || e > 1000 || e < -1000 {
			return nil, fmt.Errorf("number %q has an exponent out of range [-1000, 1000]", t)
		}
	}
	if strings.Trim(t, "0123456789.eE+-/") != "" {
		return nil, fmt.Errorf("%q is not a finite number (a decimal or a fraction p/q)", t)
	}
	num, den, isFrac := strings.Cut(t, "/")
	r, ok := new(big.Rat).SetString(num)
	if !ok || strings.ContainsAny(den, ".eE+-") {
		return nil, fmt.Errorf("%q is not a finite number", t)
	}
	if isFrac {
		d, ok := new(big.Int).SetString(den, 10)
		if !ok || d.Sign() == 0 {
			return nil, fmt.Errorf("%q is not a finite number (bad or zero denominator)", t)
		}
		r.Quo(r, new(big.Rat).SetInt(d))
	}
	return r, nil
}

// Mat2 is an exact rational 2x2 matrix [[M[0], M[1]], [M[2], M[3]]].
type Mat2 [4]*big.Rat

func (m Mat2) apply(v [2]*big.Rat) [2]*big.Rat {
	return [2]*big.Rat{
		new(big.Rat).Add(new(big.Rat).Mul(m[0], v[0]), new(big.Rat).Mul(m[1], v[1])),
		new(big.Rat).Add(new(big.Rat).Mul(m[2], v[0]), new(big.Rat).Mul(m[3], v[1])),
	}
}

// Normal is the result of normalising a problem: z -> S (z - Vertex) sends the
// wedge onto Q = {x > 0, p > 0} and the confining half-plane onto
// {A x + B p > -D}, with det S = 1.
type Normal struct {
	S       Mat2
	A, B, D *big.Rat
	Edge    Edge
}

// Normalize validates p and computes its normal form. The rays are
// reordered counter-clockwise; the error explains any inconsistency
// (degenerate rays, an opening angle of pi or more, a wedge not inside the
// half-plane, a zero normal).
func Normalize(p Problem) (Normal, error) {
	if p.Edge != Lower && p.Edge != Upper {
		return Normal{}, fmt.Errorf("edge must be %q or %q, not %q", Lower, Upper, p.Edge)
	}
	v := [2]*big.Rat{p.Vertex[0].Rat(), p.Vertex[1].Rat()}
	r1 := [2]*big.Rat{p.Rays[0][0].Rat(), p.Rays[0][1].Rat()}
	r2 := [2]*big.Rat{p.Rays[1][0].Rat(), p.Rays[1][1].Rat()}
	n := [2]*big.Rat{p.Halfplane.Normal[0].Rat(), p.Halfplane.Normal[1].Rat()}
	c := p.Halfplane.Offset.Rat()
	if r1[0].Sign() == 0 && r1[1].Sign() == 0 || r2[0].Sign() == 0 && r2[1].Sign() == 0 {
		return Normal{}, errors.New("a ray direction is the zero vector")
	}
	if n[0].Sign() == 0 && n[1].Sign() == 0 {
		return Normal{}, errors.New("the half-plane normal is the zero vector")
	}
	det := new(big.Rat).Sub(new(big.Rat).Mul(r1[0], r2[1]), new(big.Rat).Mul(r1[1], r2[0]))
	if det.Sign() == 0 {
		return Normal{}, errors.New("the two rays are parallel: the opening angle must lie strictly between 0 and pi")
	}
	if det.Sign() < 0 {
		r1, r2 = r2, r1
		det.Neg(det)
	}
	// The wedge lies in the closed half-plane iff both rays point into it and
	// the vertex is in it.
	dot := func(a, b [2]*big.Rat) *big.Rat {
		return new(big.Rat).Add(new(big.Rat).Mul(a[0], b[0]), new(big.Rat).Mul(a[1], b[1]))
	}
	a, b := dot(n, r1), dot(n, r2)
	if a.Sign() < 0 || b.Sign() < 0 {
		return Normal{}, errors.New("the wedge is not inside the half-plane: a ray points out of it")
	}
	if a.Sign() == 0 && b.Sign() == 0 {
		return Normal{}, errors.New("both rays run along the half-plane boundary")
	}
	d := new(big.Rat).Sub(dot(n, v), c)
	if d.Sign() < 0 {
		return Normal{}, errors.New("the wedge vertex lies outside the half-plane")
	}
	// S = diag(det, 1) [r1 r2]^-1 has det 1 and sends r1 to e1, r2 to e2.
	inv := new(big.Rat).Inv(det)
	S := Mat2{
		new(big.Rat).Set(r2[1]),                        // det * ( r2y/det)
		new(big.Rat).Neg(r2[0]),                        // det * (-r2x/det)
		new(big.Rat).Mul(new(big.Rat).Neg(r1[1]), inv), // -r1y/det
		new(big.Rat).Mul(r1[0], inv),                   // r1x/det
	}
	// n . z = n . S^-1 z'' with S^-1 = [r1/det r2]: coefficients (n.r1/det, n.r2).
	return Normal{S: S, A: new(big.Rat).Mul(a, inv), B: b, D: d, Edge: p.Edge}, nil
}

// Threshold returns u0 = D^2/(4 A B): a profile h(xp) in quadrant III is
// admissible (vanishes on the image half-plane) exactly when it is supported
// on xp >= u0. ok is false when no profile is admissible (D > 0 and A B = 0).
//
// Proof: the point (-t, -u/t), t > 0, lies outside {A x + B p > -D} iff
// A t + B u/t >= D; the minimum over t of the left side is 2 sqrt(A B u), so
// every point of the hyperbola xp = u is free iff 4 A B u >= D^2.
func (n Normal) Threshold() (u0 *big.Rat, ok bool) {
	return Threshold(n.A, n.B, n.D)
}

// Threshold returns d^2/(4ab) for the image half-plane {a x + b p > -d}
// (0 when d = 0); ok is false when a b = 0 < d (see Normal.Threshold).
// The computation is the schema's (certificates.ThresholdFrom), so that
// the certifier, the report and the schema's own checks share it.
func Threshold(a, b, d *big.Rat) (u0 *big.Rat, ok bool) {
	return certificates.ThresholdFrom(a, b, d)
}

// Presets are named problems shipped with the tool.
var Presets = map[string]Problem{
	// Probability flowing backwards: states with positive momentum (p > 0),
	// wedge {p > 0, -p < x < 0} (time over mass set to 1, which the squeeze
	// symmetry makes irrelevant). Lower edge: the bound is on the backflow
	// constant.
	"backflow": {
		Vertex:    [2]Number{Num(0, 1), Num(0, 1)},
		Rays:      [2][2]Number{{Num(0, 1), Num(1, 1)}, {Num(-1, 1), Num(1, 1)}},
		Halfplane: Halfplane{Normal: [2]Number{Num(0, 1), Num(1, 1)}, Offset: Num(0, 1)},
		Edge:      Lower,
	},
	// A particle confined to x < 0 (the finite strip [-1, 0] lies inside) with
	// wedge {x < 0, 0 < p < -x}: the half-plane relaxation of the finite-size
	// projectile problem; its bound caps the advantage for every alpha.
	"projectile": {
		Vertex:    [2]Number{Num(0, 1), Num(0, 1)},
		Rays:      [2][2]Number{{Num(-1, 1), Num(0, 1)}, {Num(-1, 1), Num(1, 1)}},
		Halfplane: Halfplane{Normal: [2]Number{Num(-1, 1), Num(0, 1)}, Offset: Num(0, 1)},
		Edge:      Lower,
	},
}

// PresetNames lists the preset names in order.
func PresetNames() []string {
	var s []string
	for k := range Presets {
		s = append(s, k)
	}
	sort.Strings(s)
	return s
}

// ReadProblem decodes a problem from JSON strictly: unknown fields, missing
// fields, vectors of the wrong length and inconsistent geometry are errors.
func ReadProblem(data []byte) (Problem, error) {
	var raw struct {
		Vertex    []Number   `json:"vertex"`
		Rays      [][]Number `json:"rays"`
		Halfplane struct {
			Normal []Number `json:"normal"`
			Offset Number   `json:"offset"`
		} `json:"halfplane"`
		Edge Edge `json:"edge"`
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&raw); err != nil {
		return Problem{}, fmt.Errorf("problem file: %v", err)
	}
	if dec.More() {
		return Problem{}, errors.New("problem file: trailing data after the JSON object")
	}
	bad := func(what string) error { return fmt.Errorf("problem file: %s must have 2 entries", what) }
	if len(raw.Vertex) != 2 {
		return Problem{}, bad("vertex")
	}
	if len(raw.Rays) != 2 || len(raw.Rays[0]) != 2 || len(raw.Rays[1]) != 2 {
		return Problem{}, errors.New("problem file: rays must be two vectors of 2 entries")
	}
	if len(raw.Halfplane.Normal) != 2 {
		return Problem{}, bad("halfplane.normal")
	}
	p := Problem{
		Vertex:    [2]Number{raw.Vertex[0], raw.Vertex[1]},
		Rays:      [2][2]Number{{raw.Rays[0][0], raw.Rays[0][1]}, {raw.Rays[1][0], raw.Rays[1][1]}},
		Halfplane: Halfplane{Normal: [2]Number{raw.Halfplane.Normal[0], raw.Halfplane.Normal[1]}, Offset: raw.Halfplane.Offset},
		Edge:      raw.Edge,
	}
	if err := p.complete(); err != nil {
		return Problem{}, fmt.Errorf("problem file: %v", err)
	}
	if _, err := Normalize(p); err != nil {
		return Problem{}, fmt.Errorf("problem file: %v", err)
	}
	return p, nil
}

// complete reports the first number that was never set.
func (p Problem) complete() error {
	check := func(n Number, name string) error {
		if n.r == nil {
			return fmt.Errorf("missing field %s", name)
		}
		return nil
	}
	for i, name := range []string{"vertex[0]", "vertex[1]"} {
		if err := check(p.Vertex[i], name); err != nil {
			return err
		}
	}
	for i := range 2 {
		for j := range 2 {
			if err := check(p.Rays[i][j], fmt.Sprintf("rays[%d][%d]", i, j)); err != nil {
				return err
			}
		}
		if err := check(p.Halfplane.Normal[i], fmt.Sprintf("halfplane.normal[%d]", i)); err != nil {
			return err
		}
	}
	if err := check(p.Halfplane.Offset, "halfplane.offset"); err != nil {
		return err
	}
	if p.Edge == "" {
		return errors.New("missing field edge")
	}
	return nil
}
