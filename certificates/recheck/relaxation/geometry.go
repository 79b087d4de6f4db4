package relaxation

import (
	"errors"
	"fmt"
	"math/big"

	"wedgebound/certificates"
)

// Normal is the normal form recomputed from a problem in exact rational
// arithmetic: z -> Map (z - vertex) sends the wedge onto the quadrant
// {x > 0, p > 0} and the confining half-plane onto {A x + B p > -D}.
type Normal struct {
	// Map is row-major: [[Map[0], Map[1]], [Map[2], Map[3]]], determinant 1.
	Map     [4]*big.Rat
	A, B, D *big.Rat
	// Threshold is D^2/(4AB), the smallest xp at which a quadrant-III
	// profile may be nonzero; nil when no profile is admissible (D > 0 and
	// AB = 0).
	Threshold *big.Rat
}

// NoThreshold is the recorded threshold when no quadrant-III profile is
// admissible.
const NoThreshold = "none"

// Recompute derives the normal form of p from scratch.
//
// Let r1, r2 be the rays ordered so that det[r1 r2] = dt > 0 (the
// counter-clockwise order; the opening angle is then in (0, pi)). The map
// S = diag(dt, 1) [r1 r2]^{-1} = [[r2y, -r2x], [-r1y/dt, r1x/dt]] has
// determinant 1 and sends r1 to (dt, 0) and r2 to (0, 1), so the wedge goes
// onto the quadrant. With z = S^{-1} z' + v and S^{-1} = [r1/dt, r2], the
// half-plane n.z > offset becomes a x' + b p' > -d with a = n.r1/dt,
// b = n.r2, d = n.v - offset. The wedge lies in the half-plane exactly when
// a >= 0, b >= 0 and d >= 0 (its closure is v plus the cone of r1 and r2).
//
// Threshold: the point (-t, -u/t) of quadrant III (t > 0) is outside
// {a x + b p > -d} iff a t + b u/t >= d; the minimum over t of the left side
// is 2 sqrt(a b u), so the whole hyperbola xp = u is outside iff
// 4 a b u >= d^2. For d = 0 every u > 0 qualifies (threshold 0); for d > 0
// and ab = 0 none does.
func Recompute(p certificates.Problem) (Normal, error) {
	var v, r1, r2, n [2]*big.Rat
	var err error
	get := func(f certificates.Fraction, name string) *big.Rat {
		r := f.Rat()
		if r == nil && err == nil {
			err = fmt.Errorf("%s: missing number", name)
		}
		return r
	}
	for i := range 2 {
		v[i] = get(p.Vertex[i], fmt.Sprintf("problem.vertex[%d]", i))
		r1[i] = get(p.Rays[0][i], fmt.Sprintf("problem.rays[0][%d]", i))
		r2[i] = get(p.Rays[1][i], fmt.Sprintf("problem.rays[1][%d]", i))
		n[i] = get(p.Halfplane.Normal[i], fmt.Sprintf("problem.halfplane.normal[%d]", i))
	}
	off := get(p.Halfplane.Offset, "problem.halfplane.offset")
	if err != nil {
		return Normal{}, err
	}
	if n[0].Sign() == 0 && n[1].Sign() == 0 {
		return Normal{}, errors.New("the half-plane normal is zero")
	}
	mul := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Mul(a, b) }
	dot := func(a, b [2]*big.Rat) *big.Rat { return new(big.Rat).Add(mul(a[0], b[0]), mul(a[1], b[1])) }
	dt := new(big.Rat).Sub(mul(r1[0], r2[1]), mul(r1[1], r2[0]))
	if dt.Sign() == 0 {
		return Normal{}, errors.New("the rays are parallel or zero: the wedge has no interior")
	}
	if dt.Sign() < 0 {
		r1, r2 = r2, r1
		dt.Neg(dt)
	}
	inv := new(big.Rat).Inv(dt)
	out := Normal{
		Map: [4]*big.Rat{
			new(big.Rat).Set(r2[1]),
			new(big.Rat).Neg(r2[0]),
			mul(new(big.Rat).Neg(r1[1]), inv),
			mul(r1[0], inv),
		},
		A: mul(dot(n, r1), inv),
		B: dot(n, r2),
		D: new(big.Rat).Sub(dot(n, v), off),
	}
	if out.A.Sign() < 0 || out.B.Sign() < 0 {
		return Normal{}, errors.New("the wedge is not inside the half-plane: a ray points out of it")
	}
	if out.D.Sign() < 0 {
		return Normal{}, errors.New("the wedge vertex lies outside the half-plane")
	}
	switch ab := mul(out.A, out.B); {
	case out.D.Sign() == 0:
		out.Threshold = new(big.Rat)
	case ab.Sign() > 0:
		t := mul(out.D, out.D)
		out.Threshold = t.Quo(t, ab.Mul(ab, big.NewRat(4, 1)))
	}
	return out, nil
}

// Compare reports the first recorded normal-form entry that differs from
// the recomputed one (exact rational comparison).
func (n Normal) Compare(rec certificates.NormalForm) error {
	for i := range 4 {
		if err := sameRat(rec.Map[i], n.Map[i], fmt.Sprintf("normal_form.map[%d]", i)); err != nil {
			return err
		}
	}
	for _, f := range []struct {
		rec  certificates.Fraction
		want *big.Rat
		name string
	}{{rec.A, n.A, "normal_form.a"}, {rec.B, n.B, "normal_form.b"}, {rec.D, n.D, "normal_form.d"}} {
		if err := sameRat(f.rec, f.want, f.name); err != nil {
			return err
		}
	}
	if n.Threshold == nil {
		if rec.Threshold.None() {
			return nil
		}
		return fmt.Errorf("normal_form.threshold: no quadrant-III profile is admissible for this problem (d > 0 and ab = 0), so it must read %q, not %q", NoThreshold, rec.Threshold)
	}
	if rec.Threshold.None() {
		return fmt.Errorf("normal_form.threshold reads %q but the problem admits profiles from xp = %s on", NoThreshold, n.Threshold.RatString())
	}
	return sameRat(certificates.Fraction(rec.Threshold), n.Threshold, "normal_form.threshold")
}

func sameRat(rec certificates.Fraction, want *big.Rat, name string) error {
	r := rec.Rat()
	if r == nil {
		return fmt.Errorf("%s: missing number", name)
	}
	if r.Cmp(want) != 0 {
		return fmt.Errorf("%s is recorded as %s but the problem gives %s", name, rec, want.RatString())
	}
	return nil
}
