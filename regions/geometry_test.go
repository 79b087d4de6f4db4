package regions

import (
	"encoding/json"
	"math"
	"math/big"
	"strings"
	"testing"
)

func rat(p, q int64) *big.Rat { return big.NewRat(p, q) }

// mulVec returns m v exactly.
func mulVec(m Mat2, v [2]*big.Rat) [2]*big.Rat { return m.apply(v) }

func det2(m Mat2) *big.Rat {
	return new(big.Rat).Sub(new(big.Rat).Mul(m[0], m[3]), new(big.Rat).Mul(m[1], m[2]))
}

func ratsOf(n [2]Number) [2]*big.Rat { return [2]*big.Rat{n[0].Rat(), n[1].Rat()} }

// checkNormalForm checks the defining properties of a normal form against
// the problem, in exact rational arithmetic: det S = 1; S sends the first
// counter-clockwise ray to a positive multiple of e1 and the second to a
// positive multiple of e2; and for every z, Normal . z - Offset equals
// A x” + B p” + D with z” = S (z - Vertex), so the image half-plane is
// {A x” + B p” > -D}. (Definitions of the package doc; the last identity
// is checked at a few rational points, which determines an affine map.)
func checkNormalForm(t *testing.T, name string, p Problem, nf Normal) {
	t.Helper()
	if d := det2(nf.S); d.Cmp(rat(1, 1)) != 0 {
		t.Errorf("%s: det S = %s, want exactly 1", name, d.RatString())
	}
	r1, r2 := ratsOf(p.Rays[0]), ratsOf(p.Rays[1])
	// Counter-clockwise order: det[r1 r2] > 0, else swap.
	if new(big.Rat).Sub(new(big.Rat).Mul(r1[0], r2[1]), new(big.Rat).Mul(r1[1], r2[0])).Sign() < 0 {
		r1, r2 = r2, r1
	}
	e1 := mulVec(nf.S, r1)
	e2 := mulVec(nf.S, r2)
	if e1[0].Sign() <= 0 || e1[1].Sign() != 0 {
		t.Errorf("%s: S r1 = (%s, %s), want a positive multiple of e1", name, e1[0].RatString(), e1[1].RatString())
	}
	if e2[1].Sign() <= 0 || e2[0].Sign() != 0 {
		t.Errorf("%s: S r2 = (%s, %s), want a positive multiple of e2", name, e2[0].RatString(), e2[1].RatString())
	}
	v := ratsOf(p.Vertex)
	n := ratsOf(p.Halfplane.Normal)
	c := p.Halfplane.Offset.Rat()
	for _, z := range [][2]*big.Rat{{rat(0, 1), rat(0, 1)}, {rat(1, 1), rat(0, 1)}, {rat(0, 1), rat(1, 1)}, {rat(-7, 3), rat(5, 11)}} {
		zz := mulVec(nf.S, [2]*big.Rat{new(big.Rat).Sub(z[0], v[0]), new(big.Rat).Sub(z[1], v[1])})
		lhs := new(big.Rat).Sub(new(big.Rat).Add(new(big.Rat).Mul(n[0], z[0]), new(big.Rat).Mul(n[1], z[1])), c)
		rhs := new(big.Rat).Add(new(big.Rat).Add(new(big.Rat).Mul(nf.A, zz[0]), new(big.Rat).Mul(nf.B, zz[1])), nf.D)
		if lhs.Cmp(rhs) != 0 {
			t.Errorf("%s: at z = (%s, %s): n.z - c = %s but A x'' + B p'' + D = %s", name, z[0].RatString(), z[1].RatString(), lhs.RatString(), rhs.RatString())
		}
	}
	if nf.A.Sign() < 0 || nf.B.Sign() < 0 || nf.D.Sign() < 0 {
		t.Errorf("%s: A, B, D = %s, %s, %s must be >= 0 (the quadrant lies in the half-plane)", name, nf.A.RatString(), nf.B.RatString(), nf.D.RatString())
	}
}

// TestPresetNormalForms checks the two presets against normal forms
// computed by hand.
//
// Backflow: rays r1 = (0,1), r2 = (-1,1), det[r1 r2] = 1, so
// S = [r1 r2]^-1 = [[1, 1], [-1, 0]] (S r1 = e1, S r2 = e2), and the normal
// n = (0,1) gives a = n.r1/det = 1, b = n.r2 = 1, d = n.v - c = 0.
// Projectile: rays (-1,0), (-1,1) are clockwise, so r1 = (-1,1),
// r2 = (-1,0), det = 1, S = [[0, 1], [-1, -1]], n = (-1,0): a = b = 1, d = 0.
func TestPresetNormalForms(t *testing.T) {
	want := map[string]Mat2{
		"backflow":   {rat(1, 1), rat(1, 1), rat(-1, 1), rat(0, 1)},
		"projectile": {rat(0, 1), rat(1, 1), rat(-1, 1), rat(-1, 1)},
	}
	if got := PresetNames(); len(got) != 2 || got[0] != "backflow" || got[1] != "projectile" {
		t.Errorf("PresetNames() = %v, want [backflow projectile]", got)
	}
	for name, S := range want {
		p, ok := Presets[name]
		if !ok {
			t.Fatalf("preset %q missing", name)
		}
		nf, err := Normalize(p)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		checkNormalForm(t, name, p, nf)
		for i := range S {
			if nf.S[i].Cmp(S[i]) != 0 {
				t.Errorf("%s: S[%d] = %s, want %s (by hand)", name, i, nf.S[i].RatString(), S[i].RatString())
			}
		}
		if nf.A.Cmp(rat(1, 1)) != 0 || nf.B.Cmp(rat(1, 1)) != 0 || nf.D.Sign() != 0 {
			t.Errorf("%s: (a, b, d) = (%s, %s, %s), want (1, 1, 0)", name, nf.A.RatString(), nf.B.RatString(), nf.D.RatString())
		}
		if nf.Edge != Lower {
			t.Errorf("%s: edge %q, want lower", name, nf.Edge)
		}
		u0, ok := nf.Threshold()
		if !ok || u0.Sign() != 0 {
			t.Errorf("%s: threshold (%v, %v), want 0: the vertex lies on the boundary, all of quadrant III is free", name, u0, ok)
		}
	}
}

func num(s string) Number {
	r, err := ParseRat(s)
	if err != nil {
		panic(err)
	}
	return Number{r}
}

// transform returns the image of p under z -> M z + tr (det M = 1): vertex
// M v + tr, rays M r, normal M^-T n, offset c + n'.tr.
func transform(p Problem, M Mat2, tr [2]*big.Rat) Problem {
	v := mulVec(M, ratsOf(p.Vertex))
	v[0].Add(v[0], tr[0])
	v[1].Add(v[1], tr[1])
	r1 := mulVec(M, ratsOf(p.Rays[0]))
	r2 := mulVec(M, ratsOf(p.Rays[1]))
	// M^-T = [[m3, -m2], [-m1, m0]] for det 1.
	mit := Mat2{new(big.Rat).Set(M[3]), new(big.Rat).Neg(M[2]), new(big.Rat).Neg(M[1]), new(big.Rat).Set(M[0])}
	n := mulVec(mit, ratsOf(p.Halfplane.Normal))
	c := new(big.Rat).Add(p.Halfplane.Offset.Rat(), new(big.Rat).Add(new(big.Rat).Mul(n[0], tr[0]), new(big.Rat).Mul(n[1], tr[1])))
	N := func(r *big.Rat) Number { return Number{r} }
	return Problem{
		Vertex:    [2]Number{N(v[0]), N(v[1])},
		Rays:      [2][2]Number{{N(r1[0]), N(r1[1])}, {N(r2[0]), N(r2[1])}},
		Halfplane: Halfplane{Normal: [2]Number{N(n[0]), N(n[1])}, Offset: N(c)},
		Edge:      p.Edge,
	}
}

// TestReposedBackflow checks that re-posed versions of the backflow problem
// have the same normal form up to the squeeze freedom. Invariants (package
// doc, re-derived here): under a translation or an SL(2,R) image
// (normal transformed by M^-T) a, b, d are unchanged exactly (det[M r1 M r2]
// = det[r1 r2] and n'.(M r) = n.r); scaling the rays by l1, l2 > 0 sends
// (a, b) to (a/l2, l2 b), keeping a b and d; swapping the rays changes
// nothing after the counter-clockwise reordering; scaling the normal and
// offset by m > 0 describes the same half-plane and multiplies a, b, d by m,
// so d^2/(ab) (the threshold) is the invariant there.
func TestReposedBackflow(t *testing.T) {
	base := Presets["backflow"]
	ref, err := Normalize(base)
	if err != nil {
		t.Fatal(err)
	}
	abRef := new(big.Rat).Mul(ref.A, ref.B)
	sl2 := Mat2{rat(2, 1), rat(3, 1), rat(1, 1), rat(2, 1)}  // det 1
	sl2b := Mat2{rat(1, 3), rat(0, 1), rat(7, 5), rat(3, 1)} // det 1
	shift := [2]*big.Rat{rat(5, 2), rat(-13, 7)}
	id := Mat2{rat(1, 1), rat(0, 1), rat(0, 1), rat(1, 1)}
	zero := [2]*big.Rat{rat(0, 1), rat(0, 1)}
	scaled := base
	scaled.Rays = [2][2]Number{{num("0"), num("2.5")}, {num("-1/3"), num("1/3")}}
	swapped := base
	swapped.Rays = [2][2]Number{base.Rays[1], base.Rays[0]}
	normalScaled := base
	normalScaled.Halfplane = Halfplane{Normal: [2]Number{num("0"), num("3.5")}, Offset: num("0")}
	cases := []struct {
		name   string
		p      Problem
		factor *big.Rat // a b scales by factor^2, d by factor
	}{
		{"translated", transform(base, id, shift), rat(1, 1)},
		{"rays scaled", scaled, rat(1, 1)},
		{"rays swapped", swapped, rat(1, 1)},
		{"SL(2) image", transform(base, sl2, zero), rat(1, 1)},
		{"SL(2) image and shift", transform(base, sl2b, shift), rat(1, 1)},
		{"tilted file", mustRead(t, tiltedBackflowJSON), rat(1, 1)},
		{"normal scaled by 3.5", normalScaled, rat(7, 2)},
	}
	for _, c := range cases {
		nf, err := Normalize(c.p)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		checkNormalForm(t, c.name, c.p, nf)
		ab := new(big.Rat).Mul(nf.A, nf.B)
		wantAB := new(big.Rat).Mul(abRef, new(big.Rat).Mul(c.factor, c.factor))
		if c.name == "tilted file" {
			// The tilted file's normal is not an exact image of (0,1); only
			// the sign pattern and d = 0 are invariant.
			if ab.Sign() <= 0 || nf.D.Sign() != 0 {
				t.Errorf("%s: a b = %s, d = %s; want a b > 0, d = 0", c.name, ab.RatString(), nf.D.RatString())
			}
			continue
		}
		if ab.Cmp(wantAB) != 0 || nf.D.Sign() != 0 {
			t.Errorf("%s: a b = %s, d = %s; want %s, 0", c.name, ab.RatString(), nf.D.RatString(), wantAB.RatString())
		}
	}
	// For an SL(2) image without reordering, S' = S M^-1 exactly.
	img, _ := Normalize(transform(base, sl2, zero))
	for i, want := range []*big.Rat{
		// S M^-1 with M^-1 = [[2, -3], [-1, 2]] and S = [[1, 1], [-1, 0]].
		rat(1, 1), rat(-1, 1), rat(-2, 1), rat(3, 1),
	} {
		if img.S[i].Cmp(want) != 0 {
			t.Errorf("SL(2) image: S[%d] = %s, want %s (S M^-1)", i, img.S[i].RatString(), want.RatString())
		}
	}
}

// tiltedBackflowJSON is testdata/problems/tilted-backflow.json (kept here so
// the test does not depend on the working directory layout).
const tiltedBackflowJSON = `{
  "vertex": [1.5, -2],
  "rays": [[3, 1], [1, -1]],
  "halfplane": {"normal": [1, -2], "offset": 5.5},
  "edge": "lower"
}`

func mustRead(t *testing.T, s string) Problem {
	t.Helper()
	p, err := ReadProblem([]byte(s))
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// TestReadProblemErrors feeds bad problem files; each must give a one-line
// error naming the problem.
func TestReadProblemErrors(t *testing.T) {
	good := `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`
	if _, err := ReadProblem([]byte(good)); err != nil {
		t.Fatalf("good file rejected: %v", err)
	}
	cases := []struct{ name, json, want string }{
		{"parallel rays", `{"vertex": [0, 0], "rays": [[1, 1], [2, 2]], "halfplane": {"normal": [0, 1], "offset": -1}, "edge": "lower"}`, "parallel"},
		{"opposite rays", `{"vertex": [0, 0], "rays": [[1, 1], [-2, -2]], "halfplane": {"normal": [0, 1], "offset": -1}, "edge": "lower"}`, "parallel"},
		{"zero ray", `{"vertex": [0, 0], "rays": [[0, 0], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "zero vector"},
		{"zero normal", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 0], "offset": 0}, "edge": "lower"}`, "normal is the zero vector"},
		{"ray pointing out", `{"vertex": [0, 0], "rays": [[0, 1], [-1, -1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "points out"},
		{"vertex outside", `{"vertex": [0, -1], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "vertex lies outside"},
		{"rays along the boundary", `{"vertex": [0, 0], "rays": [[1, 0], [-1, 0]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "parallel"},
		{"missing offset", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1]}, "edge": "lower"}`, "missing field halfplane.offset"},
		{"null offset", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": null}, "edge": "lower"}`, "missing"},
		{"missing edge", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}}`, "missing field edge"},
		{"missing vertex", `{"rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "vertex must have 2 entries"},
		{"bad edge", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "middle"}`, "edge must be"},
		{"extra field", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower", "colour": "red"}`, "unknown field"},
		{"extra nested field", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0, "side": 1}, "edge": "lower"}`, "unknown field"},
		{"3-entry vertex", `{"vertex": [0, 0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "vertex must have 2 entries"},
		{"3-entry ray", `{"vertex": [0, 0], "rays": [[0, 1, 2], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "rays must be"},
		{"3 rays", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1], [1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "rays must be"},
		{"3-entry normal", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1, 0], "offset": 0}, "edge": "lower"}`, "normal must have 2 entries"},
		{"NaN string", `{"vertex": ["NaN", 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "not a finite number"},
		{"Inf string", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, "+Inf"], "offset": 0}, "edge": "lower"}`, "not a finite number"},
		{"bare NaN", `{"vertex": [NaN, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "invalid character"},
		{"huge exponent", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1e100000]], "halfplane": {"normal": [0, 1], "offset": 0}, "edge": "lower"}`, "exponent out of range"},
		{"huge exponent string", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, 1], "offset": "1e-5000"}, "edge": "lower"}`, "exponent out of range"},
		{"zero denominator", `{"vertex": [0, 0], "rays": [[0, 1], [-1, 1]], "halfplane": {"normal": [0, "1/0"], "offset": 0}, "edge": "lower"}`, "not a finite number"},
		{"trailing data", good + ` {}`, "trailing data"},
		{"not JSON", `vertex: 0`, "problem file"},
		{"empty", ``, "problem file"},
	}
	for _, c := range cases {
		_, err := ReadProblem([]byte(c.json))
		if err == nil {
			t.Errorf("%s: accepted", c.name)
			continue
		}
		msg := err.Error()
		if !strings.Contains(msg, c.want) || !strings.HasPrefix(msg, "problem file") || strings.Contains(msg, "\n") {
			t.Errorf("%s: error %q, want one line starting \"problem file\" containing %q", c.name, msg, c.want)
		}
	}
}

// TestNumberJSON checks exact decimal round trips and fraction strings.
func TestNumberJSON(t *testing.T) {
	for _, c := range []struct{ in, out string }{
		{`1.5`, `1.5`}, {`"2/3"`, `"2/3"`}, {`"-0.125"`, `-0.125`}, {`-3e2`, `-300`}, {`"1/8"`, `0.125`}, {`0.1`, `0.1`},
	} {
		var n Number
		if err := json.Unmarshal([]byte(c.in), &n); err != nil {
			t.Errorf("%s: %v", c.in, err)
			continue
		}
		b, err := json.Marshal(n)
		if err != nil || string(b) != c.out {
			t.Errorf("%s -> %s (%v), want %s", c.in, b, err, c.out)
		}
	}
	// 0.1 must be exactly 1/10, not the float64 nearest to it.
	var n Number
	_ = json.Unmarshal([]byte(`0.1`), &n)
	if n.Rat().Cmp(rat(1, 10)) != 0 {
		t.Errorf("0.1 read as %s", n.Rat().RatString())
	}
}

// TestThreshold checks u0 = d^2/(4ab) on problems with the vertex strictly
// inside the half-plane, against the direct geometric statement of
// the package doc: every point (-t, -u/t) of the hyperbola xp = u in
// quadrant III lies outside the image half-plane iff u >= u0. The points
// are mapped back to the original coordinates and tested against the
// original half-plane, so the test also exercises S.
func TestThreshold(t *testing.T) {
	// Backflow with the boundary lowered to p = -1: a = b = 1, d = 1, so
	// u0 = 1/4 (by hand: -t - u/t > -1 for some t iff 2 sqrt(u) < 1).
	inside := Presets["backflow"]
	inside.Halfplane.Offset = num("-1")
	tilted := mustRead(t, tiltedBackflowJSON)
	tilted.Halfplane.Offset = num("3.25")
	for _, c := range []struct {
		name string
		p    Problem
		want *big.Rat
	}{{"backflow lowered", inside, rat(1, 4)}, {"tilted lowered", tilted, nil}} {
		nf, err := Normalize(c.p)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		checkNormalForm(t, c.name, c.p, nf)
		u0, ok := nf.Threshold()
		if !ok || u0.Sign() <= 0 {
			t.Fatalf("%s: threshold (%v, %v), want positive", c.name, u0, ok)
		}
		if c.want != nil && u0.Cmp(c.want) != 0 {
			t.Errorf("%s: u0 = %s, want %s", c.name, u0.RatString(), c.want.RatString())
		}
		// Inverse of S (det 1): [[s3, -s1], [-s2, s0]].
		S := nf.S
		inv := Mat2{new(big.Rat).Set(S[3]), new(big.Rat).Neg(S[1]), new(big.Rat).Neg(S[2]), new(big.Rat).Set(S[0])}
		v := ratsOf(c.p.Vertex)
		n := ratsOf(c.p.Halfplane.Normal)
		off := c.p.Halfplane.Offset.Rat()
		inH := func(x, p *big.Rat) bool {
			z := mulVec(inv, [2]*big.Rat{x, p})
			z[0].Add(z[0], v[0])
			z[1].Add(z[1], v[1])
			val := new(big.Rat).Add(new(big.Rat).Mul(n[0], z[0]), new(big.Rat).Mul(n[1], z[1]))
			return val.Cmp(off) > 0
		}
		// At u = u0 no point of the hyperbola is inside (t over a wide range).
		for i := -40; i <= 40; i++ {
			tt := new(big.Rat).SetFloat64(math.Pow(1.3, float64(i)))
			if inH(new(big.Rat).Neg(tt), new(big.Rat).Neg(new(big.Rat).Quo(u0, tt))) {
				t.Errorf("%s: (-t, -u0/t) inside the half-plane at t = %s", c.name, tt.FloatString(6))
			}
		}
		// Just below u0 the point at t* = sqrt(B u / A) is inside.
		u := new(big.Rat).Mul(u0, rat(999, 1000))
		af, _ := nf.A.Float64()
		bf, _ := nf.B.Float64()
		uf, _ := u.Float64()
		tt := new(big.Rat).SetFloat64(math.Sqrt(bf * uf / af))
		if !inH(new(big.Rat).Neg(tt), new(big.Rat).Neg(new(big.Rat).Quo(u, tt))) {
			t.Errorf("%s: at u = 0.999 u0 the hyperbola point at t* is not inside the half-plane", c.name)
		}
	}
	// A ray along the boundary with the vertex inside: a b = 0, d > 0, no
	// admissible profile.
	p := Problem{
		Vertex:    [2]Number{num("0"), num("0")},
		Rays:      [2][2]Number{{num("1"), num("0")}, {num("0"), num("1")}},
		Halfplane: Halfplane{Normal: [2]Number{num("0"), num("1")}, Offset: num("-1")},
		Edge:      Upper,
	}
	nf, err := Normalize(p)
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := nf.Threshold(); ok {
		t.Errorf("a b = 0, d > 0: threshold should report no admissible profile")
	}
}

// TestParseRat checks the number reader's limits.
func TestParseRat(t *testing.T) {
	for _, s := range []string{"", "null", "NaN", "inf", "-Inf", "1e1001", "1e-1001", "1/0", strings.Repeat("1", 4001)} {
		if _, err := ParseRat(s); err == nil {
			t.Errorf("ParseRat(%q) accepted", s)
		}
	}
	for s, want := range map[string]*big.Rat{"1e1000": new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(1000), nil)), "-2/6": rat(-1, 3), " 0.25 ": rat(1, 4)} {
		r, err := ParseRat(s)
		if err != nil || r.Cmp(want) != 0 {
			t.Errorf("ParseRat(%q) = %v, %v", s, r, err)
		}
	}
}
