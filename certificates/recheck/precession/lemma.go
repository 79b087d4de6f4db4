package precession

import (
	"errors"
	"fmt"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// lemma re-proves the norm lemma of one residue class and returns an
// enclosure of 1/2 + sqrt(lambda)/6. Its own routes: tails over b >= L by
// Moebius functions of t = 1/b on [0, 1/L] from the Wallis bounds
// 1/sqrt(pi(j+1/2)) <= alpha_j^2 <= 1/sqrt(pi(j+1/4)); the discarded part
// of H by Cauchy-Schwarz with sum_{b>=L} M_ib^2 = 1 - sum_{b<L} M_ib^2
// (the rows of M are orthonormal); positivity by an interval Cholesky
// factorisation.
func lemma(t *table, c class, s certificates.PrecessionSector, workers int) (interval.F, error) {
	var z interval.F
	A, L := s.Cutoff, s.SumLength
	if 3*L+8 > len(t.a2) || L < A+3 {
		return z, errors.New("cutoff and sum length out of range")
	}
	lam, err := z.Decimal(s.Lambda.String())
	if err != nil {
		return z, err
	}
	eps, err := z.Decimal(s.Epsilon.String())
	if err != nil {
		return z, err
	}
	one := z.Int(1)
	if eps.Sign() < 0 {
		return z, errors.New("epsilon is negative")
	}
	sq3 := z.Int(3).Sqrt()
	f2 := func(a int) interval.F { return sq3.Mul(t.a2[3*a+c.j0]).Quo(t.a2[a+c.p]) }
	g2 := func(b int) interval.F {
		k := 3*b + c.k0
		return t.a2[k].Mul(z.Int(int64(2*k + 1))).Quo(sq3.Mul(t.a2[b]).Mul(z.Int(int64(2*b + 1))))
	}
	// epsilon >= F_a^2 - 1 for a >= A.
	lim := one.Add(eps).Lo()
	for a := A; a < L; a++ {
		if !(f2(a).Hi() <= lim) {
			return z, fmt.Errorf("epsilon %s is below F_a^2 - 1 at a = %d", s.Epsilon, a)
		}
	}
	// Each factor below is a Moebius function of t = 1/b (or 1/a), hence
	// monotone on [0, 1/L]: its range there is the hull of its values at
	// t = 0 and t = 1/L.
	tL := one.Quo(z.Int(int64(L)))
	moeb := func(p0, p1, q0, q1 interval.F) interval.F {
		return p0.Quo(q0).Hull(p0.Add(p1.Mul(tL)).Quo(q0.Add(q1.Mul(tL))))
	}
	fTail := sq3.Mul(moeb(one, z.Frac(int64(2*c.p+1), 2), z.Int(3), z.Frac(int64(4*c.j0+1), 4)).Sqrt())
	if !(fTail.Hi() <= lim) {
		return z, fmt.Errorf("epsilon %s is below the bound of F_a^2 - 1 for a >= %d", s.Epsilon, L)
	}
	// G_b^2 for b >= L: (6+(2k0+1)t)/(sqrt3 (2+t)) times the Wallis ratio.
	pre := moeb(z.Int(6), z.Int(int64(2*c.k0+1)), z.Int(2), one).Quo(sq3)
	gHi := pre.Mul(moeb(one, z.Frac(1, 2), z.Int(3), z.Frac(int64(4*c.k0+1), 4)).Sqrt()).Hi()
	gLo := pre.Mul(moeb(one, z.Frac(1, 4), z.Int(3), z.Frac(int64(2*c.k0+1), 2)).Sqrt()).Lo()
	cinf := lam.Sub(one).Sub(eps)
	cTail := lam.Quo(interval.PointF(gHi)).Sub(one).Sub(eps)
	if cinf.Sign() <= 0 || cTail.Sign() <= 0 {
		return z, errors.New("lambda leaves c_b <= 0 for large b")
	}
	d := make([]interval.F, L)
	for b := 0; b < L; b++ {
		cb := lam.Quo(g2(b)).Sub(one).Sub(eps)
		if cb.Sign() <= 0 {
			return z, fmt.Errorf("lambda leaves c_b <= 0 at b = %d", b)
		}
		d[b] = one.Quo(cb).Sub(one.Quo(cinf))
	}
	// sup_{b >= L} |1/c_b - 1/c_inf| = lambda |1/G_b^2 - 1|/(c_b c_inf).
	gT := interval.NewF(gLo, gHi)
	dTail := lam.Mul(one.Quo(gT).Sub(one).Abs()).Quo(cTail.Mul(cinf)).Hi()
	sq := z.Int(2).Quo(z.Pi()).Sqrt()
	rows := make([][]interval.F, A)
	tau := make([]float64, A)
	checknum.For(A, workers, func(a int) {
		i := a + c.p
		r := make([]interval.F, L)
		norm := z.Int(0)
		for b := 0; b < L; b++ {
			v := sq.Mul(t.a[i]).Mul(t.beta(b)).Quo(z.Int(int64(2*b + 1 - 2*i)))
			if (i+b)%2 != 0 {
				v = v.Neg()
			}
			r[b] = v
			norm = norm.Add(v.Sqr())
		}
		rows[a] = r
		tau[a] = max(0, one.Sub(norm).Hi())
	})
	H := make([][]interval.F, A)
	for a := range H {
		H[a] = make([]interval.F, A)
	}
	checknum.For(A, workers, func(a int) {
		for cc := 0; cc <= a; cc++ {
			sum := z.Int(0)
			for b := 0; b < L; b++ {
				sum = sum.Add(rows[a][b].Mul(rows[cc][b]).Mul(d[b]))
			}
			if a == cc {
				sum = sum.Add(one.Quo(cinf))
			}
			tail := interval.PointF(tau[a]).Mul(interval.PointF(tau[cc])).Sqrt().Mul(interval.PointF(dTail)).Hi()
			H[a][cc] = sum.Pad(interval.PointF(tail))
		}
	})
	for a := 0; a < A; a++ {
		for cc := a + 1; cc < A; cc++ {
			H[a][cc] = H[cc][a]
		}
	}
	E := make([]interval.F, A)
	for a := range E {
		E[a] = f2(a).Sub(one).Sub(eps)
	}
	K := make([][]interval.F, A)
	for a := range K {
		K[a] = make([]interval.F, A)
		for cc := 0; cc <= a; cc++ {
			sum := z.Int(0)
			for e := 0; e < A; e++ {
				sum = sum.Add(H[a][e].Mul(E[e]).Mul(H[e][cc]))
			}
			K[a][cc] = H[a][cc].Sub(sum)
		}
	}
	if err := cholesky(K); err != nil {
		return z, err
	}
	return z.Frac(1, 2).Add(lam.Sqrt().Quo(z.Int(6))), nil
}

// cholesky runs the interval Cholesky factorisation on the lower triangle
// of K; every pivot strictly positive proves every symmetric matrix in K
// positive definite.
func cholesky(K [][]interval.F) error {
	n := len(K)
	Lm := make([][]interval.F, n)
	for i := range Lm {
		Lm[i] = make([]interval.F, i+1)
	}
	for j := 0; j < n; j++ {
		s := K[j][j]
		for k := 0; k < j; k++ {
			s = s.Sub(Lm[j][k].Sqr())
		}
		if s.Sign() <= 0 {
			return fmt.Errorf("the lemma's matrix is not proved positive definite (pivot %d encloses %v)", j, s)
		}
		Lm[j][j] = s.Sqrt()
		for i := j + 1; i < n; i++ {
			v := K[i][j]
			for k := 0; k < j; k++ {
				v = v.Sub(Lm[i][k].Mul(Lm[j][k]))
			}
			Lm[i][j] = v.Quo(Lm[j][j])
		}
	}
	return nil
}
