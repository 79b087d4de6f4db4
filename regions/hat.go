package regions

import (
	"fmt"

	"wedgebound/interval"
)

func init() { registerFamily("hat", newHatTerm[interval.F], newHatTerm[interval.B]) }

// newHatTerm builds the hat profile on quadrant III: h(xp) rises linearly
// from 0 at left to 1 at peak and falls back to 0 at right. As
// h(u) = sum_j sigma_j (u - c_j)_+ with slopes sigma = (1/(m-l),
// -1/(m-l) - 1/(r-m), 1/(r-m)) at (l, m, r), G^(w) = -sum_j sigma_j e^{i c_j w}/w^2
// and M_{+-} = sum_j sigma_j K(c_j, s) with the kink terms of edge.go; the
// profile has no jumps, so its edge terms decay like |s|^{-5/4} instead of
// the |s|^{-3/4} of band edges.
func newHatTerm[T interval.Real[T]](like T, params map[string]string) (Term[T], error) {
	if len(params) != 3 || params["left"] == "" || params["peak"] == "" || params["right"] == "" {
		return nil, fmt.Errorf("hat term needs exactly the parameters left, peak and right")
	}
	l, err := knot(params["left"], "hat left")
	if err != nil {
		return nil, err
	}
	m, err := knot(params["peak"], "hat peak")
	if err != nil {
		return nil, err
	}
	r, err := knot(params["right"], "hat right")
	if err != nil {
		return nil, err
	}
	if l.Cmp(m) >= 0 || m.Cmp(r) >= 0 {
		return nil, fmt.Errorf("hat term needs left < peak < right, not %s, %s, %s", params["left"], params["peak"], params["right"])
	}
	lT, lf := ratT(like, l)
	mT, mf := ratT(like, m)
	rT, rf := ratT(like, r)
	one := like.Int(1)
	L1, L2 := mT.Sub(lT), rT.Sub(mT)
	s1, s3 := one.Quo(L1), one.Quo(L2)
	pieces := []piece[T]{
		{x0: lT, L: L1, h0: like.Int(0), h1: one},
		{x0: mT, L: L2, h0: one, h1: like.Int(0)},
	}
	edges := []edgeRef[T]{
		{coef: s1, edge: newEdge(lT, lf, true)},
		{coef: s1.Add(s3).Neg(), edge: newEdge(mT, mf, true)},
		{coef: s3, edge: newEdge(rT, rf, true)},
	}
	norm := map[string]string{"left": RatString(l), "peak": RatString(m), "right": RatString(r)}
	h1 := interval.Upper(rT.Sub(lT).Scale(-1))
	return newPWL(like, "hat", norm, RatString(l), pieces, h1, rf, false, edges), nil
}
