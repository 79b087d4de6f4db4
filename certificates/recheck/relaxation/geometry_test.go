package relaxation

import (
	"math/big"
	"math/rand"
	"testing"

	"wedgebound/certificates"
)

func prob(v [2]string, r [2][2]string, n [2]string, off string) certificates.Problem {
	f := certificates.MustFraction
	return certificates.Problem{Vertex: [2]certificates.Fraction{f(v[0]), f(v[1])},
		Rays:      [2][2]certificates.Fraction{{f(r[0][0]), f(r[0][1])}, {f(r[1][0]), f(r[1][1])}},
		Halfplane: certificates.Halfplane{Normal: [2]certificates.Fraction{f(n[0]), f(n[1])}, Offset: f(off)}, Edge: "lower"}
}

func TestNormalFormExamples(t *testing.T) {
	for _, tc := range []struct {
		name      string
		p         certificates.Problem
		m         [4]string
		a, b, d   string
		threshold string // "" for none
	}{
		// Backflow: H = {p > 0}, W = {p > 0, -p < x < 0} (regions package doc).
		{"backflow", prob([2]string{"0", "0"}, [2][2]string{{"0", "1"}, {"-1", "1"}}, [2]string{"0", "1"}, "0"),
			[4]string{"1", "1", "-1", "0"}, "1", "1", "0", "0"},
		// Rays given clockwise are reordered.
		{"reordered", prob([2]string{"0", "0"}, [2][2]string{{"-1", "1"}, {"0", "1"}}, [2]string{"0", "1"}, "0"),
			[4]string{"1", "1", "-1", "0"}, "1", "1", "0", "0"},
		// Vertex inside: (0, 1) with the backflow rays in {p > 0}: d = 1,
		// threshold 1/4.
		{"inside", prob([2]string{"0", "1"}, [2][2]string{{"0", "1"}, {"-1", "1"}}, [2]string{"0", "1"}, "0"),
			[4]string{"1", "1", "-1", "0"}, "1", "1", "1", "1/4"},
		// Quadrant in {p > -1}: a = 0, d = 1, no admissible profile.
		{"none", prob([2]string{"0", "0"}, [2][2]string{{"1", "0"}, {"0", "1"}}, [2]string{"0", "1"}, "-1"),
			[4]string{"1", "0", "0", "1"}, "0", "1", "1", ""},
	} {
		n, err := Recompute(tc.p)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		for i := range 4 {
			if n.Map[i].Cmp(rat(t, tc.m[i])) != 0 {
				t.Errorf("%s: map[%d] = %s, want %s", tc.name, i, n.Map[i].RatString(), tc.m[i])
			}
		}
		if n.A.Cmp(rat(t, tc.a)) != 0 || n.B.Cmp(rat(t, tc.b)) != 0 || n.D.Cmp(rat(t, tc.d)) != 0 {
			t.Errorf("%s: a, b, d = %s, %s, %s", tc.name, n.A.RatString(), n.B.RatString(), n.D.RatString())
		}
		if tc.threshold == "" {
			if n.Threshold != nil {
				t.Errorf("%s: threshold %s, want none", tc.name, n.Threshold.RatString())
			}
		} else if n.Threshold == nil || n.Threshold.Cmp(rat(t, tc.threshold)) != 0 {
			t.Errorf("%s: threshold %v, want %s", tc.name, n.Threshold, tc.threshold)
		}
	}
	for _, bad := range []certificates.Problem{
		prob([2]string{"0", "0"}, [2][2]string{{"1", "1"}, {"2", "2"}}, [2]string{"0", "1"}, "0"),  // parallel
		prob([2]string{"0", "0"}, [2][2]string{{"0", "-1"}, {"1", "0"}}, [2]string{"0", "1"}, "0"), // ray out
		prob([2]string{"0", "-1"}, [2][2]string{{"0", "1"}, {"1", "1"}}, [2]string{"0", "1"}, "0"), // vertex out
		prob([2]string{"0", "0"}, [2][2]string{{"0", "1"}, {"1", "1"}}, [2]string{"0", "0"}, "0"),  // zero normal
	} {
		if _, err := Recompute(bad); err == nil {
			t.Errorf("accepted %+v", bad)
		}
	}
}

// For random rational problems the map has determinant 1, sends the rays to
// positive multiples of e1 and e2, and the half-plane's image has the
// recorded coefficients: n.z - offset = a x' + b p' + d for z = S^-1 z' + v.
func TestNormalFormProperties(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	r := func() *big.Rat { return big.NewRat(rng.Int63n(21)-10, rng.Int63n(5)+1) }
	tried := 0
	for tried < 200 {
		v := [2]*big.Rat{r(), r()}
		r1 := [2]*big.Rat{r(), r()}
		r2 := [2]*big.Rat{r(), r()}
		nn := [2]*big.Rat{r(), r()}
		off := r()
		s := func(x *big.Rat) string { return x.RatString() }
		p := prob([2]string{s(v[0]), s(v[1])}, [2][2]string{{s(r1[0]), s(r1[1])}, {s(r2[0]), s(r2[1])}}, [2]string{s(nn[0]), s(nn[1])}, s(off))
		n, err := Recompute(p)
		if err != nil {
			continue
		}
		tried++
		m := n.Map
		det := new(big.Rat).Sub(new(big.Rat).Mul(m[0], m[3]), new(big.Rat).Mul(m[1], m[2]))
		if det.Cmp(big.NewRat(1, 1)) != 0 {
			t.Fatalf("det %s", det.RatString())
		}
		apply := func(x [2]*big.Rat) [2]*big.Rat {
			return [2]*big.Rat{
				new(big.Rat).Add(new(big.Rat).Mul(m[0], x[0]), new(big.Rat).Mul(m[1], x[1])),
				new(big.Rat).Add(new(big.Rat).Mul(m[2], x[0]), new(big.Rat).Mul(m[3], x[1])),
			}
		}
		i1, i2 := apply(r1), apply(r2)
		// One ray goes to the positive x axis, the other to the positive p axis.
		onX := func(w [2]*big.Rat) bool { return w[1].Sign() == 0 && w[0].Sign() > 0 }
		onP := func(w [2]*big.Rat) bool { return w[0].Sign() == 0 && w[1].Sign() > 0 }
		if !(onX(i1) && onP(i2) || onX(i2) && onP(i1)) {
			t.Fatalf("rays map to %v %v", i1, i2)
		}
		// n.z - off at z = v + r1 and v + r2 equals a*|x'| + d and b*|p'| + d.
		dot := func(a, b [2]*big.Rat) *big.Rat {
			return new(big.Rat).Add(new(big.Rat).Mul(a[0], b[0]), new(big.Rat).Mul(a[1], b[1]))
		}
		for _, pair := range []struct{ ray, img [2]*big.Rat }{{r1, i1}, {r2, i2}} {
			z := [2]*big.Rat{new(big.Rat).Add(v[0], pair.ray[0]), new(big.Rat).Add(v[1], pair.ray[1])}
			lhs := new(big.Rat).Sub(dot(nn, z), off)
			rhs := new(big.Rat).Add(new(big.Rat).Add(new(big.Rat).Mul(n.A, pair.img[0]), new(big.Rat).Mul(n.B, pair.img[1])), n.D)
			if lhs.Cmp(rhs) != 0 {
				t.Fatalf("half-plane image wrong: %s vs %s", lhs.RatString(), rhs.RatString())
			}
		}
	}
}
