package strip

import (
	"math"
	"math/big"
	"math/cmplx"
	"math/rand"
	"testing"

	"gonum.org/v1/gonum/mat"

	"wedgebound/interval"
)

// exactDot against exact rational arithmetic, with cancellation and
// underflowing products.
func TestExactDot(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	cases := [][2][]float64{
		{{1e16, 1, -1e16}, {1, 1, 1}},
		{{1e300, 1e-300, -1e300}, {1e-300, 1e-300, 1e-300}},
		{{3, 0.1, -0.3}, {0.1, 3, 1}},
	}
	for k := 0; k < 50; k++ {
		n := 1 + rng.Intn(300)
		x, y := make([]float64, n), make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64() * math.Pow(10, float64(rng.Intn(20)-10))
			y[i] = rng.NormFloat64()
		}
		cases = append(cases, [2][]float64{x, y})
	}
	for ci, c := range cases {
		v, e := exactDot(c[0], c[1])
		ex := new(big.Rat)
		for i := range c[0] {
			p := new(big.Rat).Mul(ratOfFloat(c[0][i]), ratOfFloat(c[1][i]))
			ex.Add(ex, p)
		}
		d := new(big.Rat).Sub(ex, ratOfFloat(v))
		if d.Abs(d).Cmp(ratOfFloat(e)) > 0 {
			t.Errorf("case %d: |exact - %v| exceeds the bound %v", ci, v, e)
		}
		// As accurate as a dot product in twice the working precision:
		// err <= 2u |x.y| + (4 n u)^2 sum |x_i y_i| (Dot2 of T. Ogita, S. M.
		// Rump and S. Oishi, SIAM J. Sci. Comput. 26 (2005) 1955, has this
		// form with smaller constants; from memory).
		exf, _ := ex.Float64()
		var sabs float64
		for i := range c[0] {
			sabs += math.Abs(c[0][i] * c[1][i])
		}
		g := 4 * float64(len(c[0])+1) * 0x1p-53
		if e > 2*math.Abs(exf)*0x1p-53+g*g*sabs+1e-290 {
			t.Errorf("case %d: bound %v is not of double-working-precision size (value %v)", ci, e, exf)
		}
	}
}

// The (n+1)-point Clenshaw-Curtis rule: n = 2 is Simpson's rule (weights
// 1/3, 4/3, 1/3; common practice), and the rule integrates s^k exactly,
// int_{-1}^{1} s^k = 2/(k+1) for even k, 0 for odd k, up to k = n.
func TestStripRuleExactness(t *testing.T) {
	r, err := newStripRule(2, 1)
	if err != nil {
		t.Fatal(err)
	}
	for a, want := range []string{"1/3", "4/3", "1/3"} {
		w := r.sqw[a].Sqr().Scale(1)
		wr, _ := new(big.Rat).SetString(want)
		if d := w.Sub(ratB(wr, stripWeightPrec)).Abs().Hi(); d > 1e-30 {
			t.Errorf("weight %d = %v, want %s", a, w, want)
		}
	}
	for _, n := range []int{16, 40, 120} {
		r, err := newStripRule(n, 2)
		if err != nil {
			t.Fatal(err)
		}
		if r.wsum.Hi() < 2 || r.wsum.Hi() > 2+1e-12 {
			t.Errorf("n=%d: weight sum %v", n, r.wsum)
		}
		for k := 0; k <= n; k++ {
			sum := interval.NewB(0, stripWeightPrec)
			for a := 0; a <= n; a++ {
				w := r.sqw[a].Sqr().Scale(1)
				p := r.node[a].WithPrec(stripWeightPrec)
				pk := w.Int(1)
				for i := 0; i < k; i++ {
					pk = pk.Mul(p)
				}
				sum = sum.Add(w.Mul(pk))
			}
			want := new(big.Rat)
			if k%2 == 0 {
				want = big.NewRat(2, int64(k+1))
			}
			if d := sum.Sub(ratB(want, stripWeightPrec)).Abs().Hi(); d > 1e-30 {
				t.Errorf("n=%d: sum w s^%d = %v, want %s (off by %g)", n, k, sum, want.RatString(), d)
			}
		}
	}
	if _, err := newStripRule(3, 1); err == nil {
		t.Error("odd n accepted")
	}
}

// U has orthonormal columns (int_{-1}^0 q_j q_k = delta_jk for the
// orthonormal Legendre basis), and q_j(0) = sqrt(2j+1) (P_j(1) = 1).
func TestStripRowsOrthonormal(t *testing.T) {
	N, n := 12, 26
	r, err := newStripRule(n, 2)
	if err != nil {
		t.Fatal(err)
	}
	one := interval.NewB(1, stripNodePrec)
	coef := [2][]interval.B{make([]interval.B, N), make([]interval.B, N)}
	for j := range coef[0] {
		coef[0][j], coef[1][j] = one.Int(0), one.Int(0)
	}
	coef[0][0], coef[1][3] = one, one
	rows := r.rows(N, coef, 2)
	for j := 0; j < N; j++ {
		for k := 0; k < N; k++ {
			v, _ := exactDot(rows.UT[j], rows.UT[k])
			want := 0.0
			if j == k {
				want = 1
			}
			if math.Abs(v-want) > 1e-14 {
				t.Errorf("(U^T U)_%d%d = %v", j, k, v)
			}
		}
		// node 0 is s = 1, x = 0
		q := rows.UT[j][0] / r.sqw[0].Mid().Lo()
		if math.Abs(q-math.Sqrt(float64(2*j+1))) > 1e-12 {
			t.Errorf("q_%d(0) = %v", j, q)
		}
	}
	if rows.uRad2.Hi() > 1e-28 {
		t.Errorf("U radii too large: %v", rows.uRad2)
	}
	// witness 0 is q_0 = 1: psi_hat = sqrt(w/2)
	for a := 0; a <= n; a++ {
		if math.Abs(rows.psi[0][a].Mid().Lo()-r.sqw[a].Mid().Lo()) > 1e-15 {
			t.Errorf("psi_hat at node %d: %v", a, rows.psi[0][a])
		}
	}
}

// The kernel enclosures contain a 256-bit evaluation of
// -sin(alpha (x^2 - y^2)/4)/(pi (x - y)) by direct formula (a second
// route), the diagonal is -alpha x/(2 pi) (certify/strip package doc), and the
// enclosures are tight.
func TestStripKernelEnclosures(t *testing.T) {
	for _, alpha := range []float64{0.01, 50, 1000} {
		r, err := newStripRule(60, 2)
		if err != nil {
			t.Fatal(err)
		}
		aB := interval.NewB(alpha, stripNodePrec)
		nd := r.nodeData(aB, 2)
		aF := interval.PointF(alpha)
		z := interval.NewB(0, 256)
		for _, p := range [][2]int{{0, 1}, {3, 4}, {10, 50}, {30, 31}, {59, 60}, {0, 60}, {7, 7}, {29, 31}} {
			k := nd.kernel(aF, p[0], p[1])
			if k2 := nd.kernel(aF, p[1], p[0]); k2 != k {
				t.Errorf("alpha %g: kernel not symmetric at %v", alpha, p)
			}
			x := r.node[p[0]].WithPrec(256).Sub(z.Int(1)).Scale(-1)
			y := r.node[p[1]].WithPrec(256).Sub(z.Int(1)).Scale(-1)
			var ref interval.B
			if p[0] == p[1] {
				ref = z.Float(alpha).Mul(x).Quo(z.Pi().Scale(1)).Neg()
			} else {
				ref = interval.Sin(z.Float(alpha).Mul(x.Sqr().Sub(y.Sqr())).Scale(-2)).Quo(z.Pi().Mul(x.Sub(y))).Neg()
			}
			m := ref.Mid()
			if !k.Contains(stripToF(m)) && !(k.Lo() <= m.Lo() && m.Hi() <= k.Hi()) {
				t.Errorf("alpha %g, %v: %v does not contain %v", alpha, p, k, m)
			}
			if k.Rad() > 1e-15*math.Max(1, alpha) {
				t.Errorf("alpha %g, %v: radius %g", alpha, p, k.Rad())
			}
		}
	}
}

func TestStripSincAndPhi(t *testing.T) {
	for _, z := range []float64{0, 1e-9, 0.3, -0.7, 1} {
		want := 1.0
		if z != 0 {
			want = math.Sin(z) / z
		}
		s := stripSinc(interval.PointF(z))
		if s.Lo() > want+1e-16 || s.Hi() < want-1e-16 || s.Rad() > 1e-15 {
			t.Errorf("sinc(%v) = %v, want %v", z, s, want)
		}
	}
	for _, b := range []float64{0, 1e-6, 0.5, 1, 3, 40, 700} {
		want := 0.0
		if b > 0 && b < 30 {
			want = math.Log(math.Sinh(b) / b)
		} else if b >= 30 {
			want = b - math.Log(2*b)
		}
		p := phiF(interval.PointF(b))
		if p.Lo() > want+1e-12 || p.Hi() < want-1e-12 {
			t.Errorf("phi(%v) = %v, want %v", b, p, want)
		}
		if logS(b) < want-1e-12 {
			t.Errorf("logS(%v) = %v is below log(sinh(B)/B) = %v", b, logS(b), want)
		}
		if b > 0 {
			d := 1/math.Tanh(b) - 1/b
			if b < 1e-3 {
				d = b / 3
			}
			pp := phiPrime(interval.PointF(b))
			if pp.Lo() > d+1e-12 || pp.Hi() < d-1e-12 {
				t.Errorf("phi'(%v) = %v, want %v", b, pp, d)
			}
		}
	}
}

// The bound on sup |k| over a product of ellipses is above |k| at dense
// samples of both boundaries (complex128 evaluation), and close to them.
func TestKernelSupBoundsSamples(t *testing.T) {
	for _, c := range []struct{ alpha, e1, e2 float64 }{
		{0.001, 2, 1}, {1, 0.8, 0}, {50, 1.34, 0.117}, {50, 1.43, 0}, {1000, 0.61, 0.0062}, {1000, 0.3, 0.3},
	} {
		k := newKernelSup(interval.PointF(c.alpha), c.e1, c.e2)
		b := k.bound(1e-5)
		best := math.Inf(-1)
		a1, b1 := math.Cosh(c.e1), math.Sinh(c.e1)
		a2, b2 := math.Cosh(c.e2), math.Sinh(c.e2)
		const m = 300
		for i := 0; i <= m; i++ {
			t1 := 2 * math.Pi * float64(i) / m
			x := complex((a1*math.Cos(t1)-1)/2, b1*math.Sin(t1)/2)
			for j := 0; j <= m; j++ {
				t2 := 2 * math.Pi * float64(j) / m
				y := complex((a2*math.Cos(t2)-1)/2, b2*math.Sin(t2)/2)
				var v complex128
				if x == y {
					v = -complex(c.alpha, 0) * x / (2 * math.Pi)
				} else {
					v = -cmplx.Sin(complex(c.alpha/4, 0)*(x*x-y*y)) / (complex(math.Pi, 0) * (x - y))
				}
				best = math.Max(best, math.Log(cmplx.Abs(v)))
			}
		}
		if best > b+1e-9 {
			t.Errorf("%+v: sample log|k| = %v above the bound %v", c, best, b)
		}
		if b > best+1.5 {
			t.Errorf("%+v: bound %v is far above the samples %v", c, b, best)
		}
	}
}

// galerkinAt builds the verifier's float Galerkin matrix at alpha for basis
// size N, with its distance bound.
func galerkinAt(t *testing.T, alpha float64, N int) *galerkin {
	t.Helper()
	zero := interval.NewB(0, stripNodePrec)
	coef := [2][]interval.B{make([]interval.B, N), make([]interval.B, N)}
	cf := [2][]interval.F{make([]interval.F, N), make([]interval.F, N)}
	for j := 0; j < N; j++ {
		coef[0][j], coef[1][j] = zero, zero
	}
	coef[0][0], coef[1][0] = zero.Int(1), zero.Int(1)
	cf[0][0], cf[1][0] = interval.PointF(1), interval.PointF(1)
	n, eta, ok := planStripRule(alpha, N, cf)
	if !ok || n < 2*N || n%2 != 0 {
		t.Fatalf("plan: n=%d ok=%v", n, ok)
	}
	r, err := newStripRule(n, 2)
	if err != nil {
		t.Fatal(err)
	}
	nd := r.nodeData(interval.NewB(alpha, stripNodePrec), 2)
	rows := r.rows(N, coef, 2)
	M := n + 1
	At := make([][]float64, M)
	radA2, normA2 := interval.PointF(0), interval.PointF(0)
	for a := 0; a < M; a++ {
		At[a] = make([]float64, M)
		for b := 0; b < M; b++ {
			x := stripToF(r.sqw[a]).Mul(stripToF(r.sqw[b])).Mul(nd.kernel(interval.PointF(alpha), a, b))
			if a > b {
				x = stripToF(r.sqw[b]).Mul(stripToF(r.sqw[a])).Mul(nd.kernel(interval.PointF(alpha), a, b))
			}
			mid, rad := midRad(x)
			At[a][b] = mid
			radA2 = radA2.Add(interval.PointF(rad).Sqr())
			normA2 = normA2.Add(interval.PointF(mid).Sqr())
		}
	}
	lm := newKernelSup(interval.PointF(alpha), eta, 0).bound(1e-3)
	quad := galerkinQuadF(stripLogC(n, r.wsum, eta, lm), N, eta, r.wsum)
	return stripGalerkin(At, rows, quad, interval.PointF(radA2.Sqrt().Hi()), interval.PointF(normA2.Sqrt().Hi()), 2)
}

func extremeEigen(t *testing.T, G [][]float64) (float64, float64) {
	N := len(G)
	S := mat.NewSymDense(N, nil)
	for i := 0; i < N; i++ {
		for j := i; j < N; j++ {
			S.SetSym(i, j, G[i][j])
		}
	}
	var es mat.EigenSym
	if !es.Factorize(S, false) {
		t.Fatal("eigen")
	}
	v := es.Values(nil)
	return v[0], v[N-1]
}

// The discarded-part bound holds: by Weyl, min(lambda_min(G_N), 0) is
// within tail(N) of inf spec k, so it is within tail(N) + tail(M) of the
// value at a larger basis size M (plus both matrix distances); gonum's
// eigenvalues of the verifier's float Galerkin matrices serve as the
// (independent, float64) eigen-solver. Also the Galerkin matrix agrees
// with the semidefiniteness proofs.
func TestStripTailBoundHolds(t *testing.T) {
	alpha := 50.0
	ref := galerkinAt(t, alpha, 48)
	refLo, refHi := extremeEigen(t, ref.Gh)
	tailRef := tailF(newKernelSup(interval.PointF(alpha), 1.3, 0.12).bound(1e-5), 48, 1.3, 0.12).Hi()
	for _, N := range []int{8, 12, 16, 20, 24} {
		g := galerkinAt(t, alpha, N)
		lo, hi := extremeEigen(t, g.Gh)
		tl := math.Inf(1)
		for _, e := range [][2]float64{{1.3, 0.12}, {1.6, 0.3}, {1, 0.05}, {2, 0.5}} {
			tl = math.Min(tl, tailF(newKernelSup(interval.PointF(alpha), e[0], e[1]).bound(1e-5), N, e[0], e[1]).Hi())
		}
		allow := tl + tailRef + g.delta.Hi() + ref.delta.Hi() + 1e-14
		if d := math.Abs(math.Min(lo, 0) - math.Min(refLo, 0)); d > allow {
			t.Errorf("N=%d: lambda_min moves by %g, more than the bounds %g", N, d, allow)
		}
		if d := math.Abs(math.Max(hi, 0) - math.Max(refHi, 0)); d > allow {
			t.Errorf("N=%d: lambda_max moves by %g, more than the bounds %g", N, d, allow)
		}
		// the proofs reach just below / above the float eigenvalues
		p, ok := g.proveEdge(lo-1e-10, lo, 1, 2)
		if !ok || p > lo {
			t.Errorf("N=%d: lower proof %v ok=%v (eigenvalue %v)", N, p, ok, lo)
		}
		p, ok = g.proveEdge(hi+1e-10, hi, -1, 2)
		if !ok || p < hi {
			t.Errorf("N=%d: upper proof %v ok=%v (eigenvalue %v)", N, p, ok, hi)
		}
		// and cannot prove a bound beyond the eigenvalue
		if _, ok := g.proveEdge(lo+1e-9, lo+2e-9, 1, 2); ok {
			t.Errorf("N=%d: proved lambda_min >= %v above the eigenvalue %v", N, lo+1e-9, lo)
		}
	}
}
