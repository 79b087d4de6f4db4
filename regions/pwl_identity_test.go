package regions

import (
	"math"
	"math/big"
	"math/cmplx"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"wedgebound/interval"
)

// Identity tests for the band and hat families: each check is an exact
// consequence of the definitions (the source is named beside it), tested
// on the enclosures.

func pwlSlow() bool { return os.Getenv("WEDGEBOUND_SLOW") == "1" }

// pwlCell is the interval [lo, hi] at float64.
func pwlCell(lo, hi float64) interval.F { return interval.PointF(lo).Hull(interval.PointF(hi)) }

// symOverlaps reports whether the D and B enclosures of m and n intersect.
func symOverlaps(m, n Symbol[interval.F]) bool {
	return overlaps(m.D, n.D) && overlaps(m.B.Re, n.B.Re) && overlaps(m.B.Im, n.B.Im)
}

// TestBandAdditivity: chi(a,b) + chi(b,c) = chi(a,c) away from the measure
// zero set xp = b, and the symbol is linear in the profile (package doc,
// "Mellin diagonalisation": M(s) is an integral of the kernel, which is linear in h), so the sum
// of the enclosures for [a, b) and [b, c) must meet the enclosure for
// [a, c), at points and on cells (both contain the true values at every s
// of the cell). Also with c = inf (the quadrant-type term [a, inf)).
func TestBandAdditivity(t *testing.T) {
	t.Parallel()
	type triple struct{ a, b, c string }
	cases := []triple{{"0.5", "1.25", "2"}}
	pts := []float64{-60, -4.2, -0.3, 0, 0.6, 30}
	if pwlSlow() {
		cases = append(cases, triple{"0", "0.75", "inf"}, triple{"0.1", "3", "7.5"})
		pts = append(pts, -400, -17.3, -1.5, 2.5, 9)
	}
	for _, c := range cases {
		ab, bc, ac := bandF(t, c.a, c.b), bandF(t, c.b, c.c), bandF(t, c.a, c.c)
		for _, s := range pts {
			for _, w := range []float64{0, 1e-3, 0.05} {
				x := pwlCell(s, s+w)
				sum := ab.Enclose(x).Add(bc.Enclose(x))
				whole := ac.Enclose(x)
				if !symOverlaps(sum, whole) {
					t.Errorf("[%s, %s) + [%s, %s) on [%v, %v]: D %v, B %v + i %v; [%s, %s): D %v, B %v + i %v",
						c.a, c.b, c.b, c.c, s, s+w, sum.D, sum.B.Re, sum.B.Im, c.a, c.c, whole.D, whole.B.Re, whole.B.Im)
				}
			}
		}
	}
}

// TestBandToQuadrant: the band [a, inf) is the whole quadrant III minus
// the band [0, a).
//
// The whole quadrant III is the parity image of Q = quadrant I, so by
// the parity rule of the package doc (M^III_{sigma sigma'} = M^I_{-sigma,-sigma'}) its D is
// M^I_{++} = A_Q(s) and its B = M^III_{+-} = M^I_{-+} = conj(B_Q(s)), with
// A_Q, B_Q the entries of Quadrant(s). (Note the conjugate: the band's B
// is conj of the quadrant's B, not B itself; at s = 0 they differ by
// |B_Q(0) - conj B_Q(0)| = 1/2.)
//
// Lemma (our own). For the band [0, a), 0 < a <= 1, and every real s:
// |D| <= a and |B| <= (a/pi)(log(2/a) + pi/2).
// Proof: G^(w) = (e^{iaw} - 1)/(iw) has |G^| <= min(a, 2/|w|). In the
// formulas of the package doc, |M_{++}| <= (1/pi) int a sech v dv = a, and
// since |(tau-1)^{-1/2+is}(tau+1)^{-1/2-is}| = (tau^2-1)^{-1/2},
// |M_{+-}| <= (1/pi)[a int_1^{1/a} (tau^2-1)^{-1/2} dtau
// + int_{1/a}^inf tau^{-1}(tau^2-1)^{-1/2} dtau]
// = (1/pi)[a arccosh(1/a) + arcsin(a)], and arccosh X <= log 2X,
// arcsin a <= a pi/2 on [0, 1]. Parity does not change the moduli.
//
// So for a = 0 the entries must overlap exactly, and for small a they must
// lie within these bounds of the quadrant's.
func TestBandToQuadrant(t *testing.T) {
	t.Parallel()
	pts := []float64{-2, -0.3558, 0, 0.5, 1.5}
	froms := []string{"0", "0.000001", "0.001"}
	if pwlSlow() {
		pts = append(pts, -40, -9, 0.9, 4, 25)
		froms = append(froms, "0.0001", "0.05")
	}
	for _, from := range froms {
		a := pf(from)
		term := bandF(t, from, "inf")
		bd := a
		bb := 0.0
		if a > 0 {
			bb = a / math.Pi * (math.Log(2/a) + math.Pi/2)
		}
		worst := 0.0
		for _, s := range pts {
			x := interval.PointF(s)
			m, q := term.Enclose(x), Quadrant(x)
			qb := q.B.Conj()
			dd := m.D.Sub(q.A).Abs()
			db := m.B.Sub(qb).Abs()
			if dd.Lo() > bd || db.Lo() > bb {
				t.Errorf("band [%s, inf), s = %v: |D - A_Q| = %v (bound %.3g), |B - conj B_Q| = %v (bound %.3g)", from, s, dd, bd, db, bb)
			}
			worst = math.Max(worst, db.Mid().Lo()/math.Max(bb, 1e-300))
			if s == 0 {
				if wrong := m.B.Sub(q.B).Abs(); wrong.Hi() < 0.4 {
					t.Errorf("band [%s, inf): B(0) = %v + i %v is close to B_Q(0) = %v + i %v, not to its conjugate", from, m.B.Re, m.B.Im, q.B.Re, q.B.Im)
				}
			}
		}
		if a > 0 {
			t.Logf("band [%s, inf): largest |B - conj B_Q| is %.2f of the lemma's bound %.3g", from, worst, bb)
		}
	}
}

// TestHatAverageOfBands: for the symmetric hat (l, l+L, l+2L),
// h(u) = (1/L) int_0^L chi[l+x, l+x+L)(u) dx (for l <= u <= l+L the set of
// x with l+x <= u < l+x+L is [0, u-l], of length u-l; symmetrically on the
// falling side), so by linearity of the symbol in h (package doc)
// M_hat(s) = (1/L) int_0^L M_band[l+x, l+x+L)(s) dx. The x-integral is done
// by n-point Gauss-Legendre (gonum) over Approx values of the bands (each
// band built at the exact decimal l + x_j); the integrand is analytic in x
// for l > 0 (the edge terms are analytic in the knot for knot > 0), so the
// rule error is negligible at these s. The hat's Approx and enclosure must
// agree with the average to 1e-12.
func TestHatAverageOfBands(t *testing.T) {
	t.Parallel()
	type hat struct{ l, L string }
	hats := []hat{{"0.5", "0.5"}}
	pts := []float64{-0.3, 0, 0.6}
	if pwlSlow() {
		hats = append(hats, hat{"1", "1"})
		pts = append(pts, -3, -12, 2.5)
	}
	const n = 14
	for _, h := range hats {
		l, _ := ParseRat(h.l)
		L, _ := ParseRat(h.L)
		lf, Lf := pf(h.l), pf(h.L)
		m := new(big.Rat).Add(l, L)
		r := new(big.Rat).Add(m, L)
		term := hatF(t, h.l, RatString(m), RatString(r))
		xs := make([]float64, n)
		ws := make([]float64, n)
		quad.Legendre{}.FixedLocations(xs, ws, 0, Lf)
		bands := make([]Term[interval.F], n)
		for j, x := range xs {
			xr, err := ParseRat(strconv.FormatFloat(x, 'f', -1, 64))
			if err != nil {
				t.Fatal(err)
			}
			from := new(big.Rat).Add(l, xr)
			to := new(big.Rat).Add(from, L)
			bands[j] = bandF(t, RatString(from), RatString(to))
		}
		for _, s := range pts {
			var d float64
			var b complex128
			for j := range xs {
				dj, bj := bands[j].Approx(s)
				d += ws[j] * dj / Lf
				b += complex(ws[j]/Lf, 0) * bj
			}
			hd, hb := term.Approx(s)
			enc := term.Enclose(interval.PointF(s))
			t.Logf("hat (%v, %v, %v), s = %v: average of bands D %.15g B %.15g; hat D %.15g B %.15g", lf, lf+Lf, lf+2*Lf, s, d, b, hd, hb)
			if math.Abs(hd-d) > 1e-12 || cmplx.Abs(hb-b) > 1e-12 {
				t.Errorf("hat (%v, %v, %v), s = %v: Approx (%v, %v), average of bands (%v, %v)", lf, lf+Lf, lf+2*Lf, s, hd, hb, d, b)
			}
			if !near(enc.D, d, 1e-12) || !nearC(enc.B, b, 1e-12) {
				t.Errorf("hat (%v, %v, %v), s = %v: enclosure (%v, %v + i %v) misses the average of bands (%v, %v)", lf, lf+Lf, lf+2*Lf, s, enc.D, enc.B.Re, enc.B.Im, d, b)
			}
		}
	}
}

// pwlSoundnessTerms are the terms of the soundness, slope and tail tests.
func pwlSoundnessTerms(t testing.TB) map[string]Term[interval.F] {
	m := map[string]Term[interval.F]{
		"band [0.5, 2)":     bandF(t, "0.5", "2"),
		"band [1, inf)":     bandF(t, "1", "inf"),
		"hat (0.5, 1, 1.5)": hatF(t, "0.5", "1", "1.5"),
	}
	if pwlSlow() {
		m["band [0, 3)"] = bandF(t, "0", "3")
		m["hat (0, 1, 4)"] = hatF(t, "0", "1", "4")
	}
	return m
}

// TestPWLCellContainsPoints: an enclosure over a cell contains the value
// at every point of the cell (the defining property of Term.Enclose), so it
// must contain the point enclosures (and the Approx values, up to their
// float error) at points across the cell; cells in several quadrature
// regimes, two of them straddling regime boundaries (|s| = 1, 2^k).
func TestPWLCellContainsPoints(t *testing.T) {
	t.Parallel()
	cells := [][2]float64{{-0.30, -0.29}, {-1.2, -0.9}, {0.999, 1.001}, {-33, -32.5}, {-400.5, -400}}
	if pwlSlow() {
		cells = append(cells, [2]float64{2.5, 3}, [2]float64{-64.2, -63.9}, [2]float64{-9, -7}, [2]float64{100, 100.5})
	}
	for name, term := range pwlSoundnessTerms(t) {
		for _, c := range cells {
			mc := term.Enclose(pwlCell(c[0], c[1]))
			if !mc.D.IsFinite() || !mc.B.IsFinite() {
				t.Errorf("%s: enclosure on [%v, %v] not finite", name, c[0], c[1])
				continue
			}
			for i := 0; i <= 8; i++ {
				s := c[0] + (c[1]-c[0])*float64(i)/8
				m := term.Enclose(interval.PointF(s))
				if !mc.D.Contains(m.D) || !mc.B.Contains(m.B) {
					t.Errorf("%s: cell [%v, %v] (D %v, B %v + i %v) misses the point enclosure at %v (D %v, B %v + i %v)",
						name, c[0], c[1], mc.D, mc.B.Re, mc.B.Im, s, m.D, m.B.Re, m.B.Im)
				}
				d, b := term.Approx(s)
				if !near(mc.D, d, 1e-15) || !nearC(mc.B, b, 1e-15) {
					t.Errorf("%s: cell [%v, %v] misses Approx(%v) = (%v, %v)", name, c[0], c[1], s, d, b)
				}
				if !near(m.D, d, 1e-14) || !nearC(m.B, b, 1e-14) {
					t.Errorf("%s: Approx(%v) = (%v, %v) outside the point enclosure (%v, %v + i %v)", name, s, d, b, m.D, m.B.Re, m.B.Im)
				}
			}
		}
	}
}

// TestPWLSlope: by the mean value theorem the difference quotient of each
// real component over [s1, s2] equals its derivative somewhere in
// [s1, s2], so the quotient of the enclosures must meet Slope([s1, s2])
// (checkSlope of quadrant_test.go); and the central difference of the
// Approx values, (f(s+h) - f(s-h))/(2h) = f'(s) + O(h^2 f”'), must match
// the midpoint of Slope(s).
func TestPWLSlope(t *testing.T) {
	t.Parallel()
	pts := []float64{-400.2, -40.3, -3, -1, -0.3, 0, 0.5, 3}
	if pwlSlow() {
		pts = append(pts, -3000.7, -64, -2, 1, 2, 12, 64.2)
	}
	for name, term := range pwlSoundnessTerms(t) {
		for _, s := range pts {
			h := 1e-5
			checkSlope(t, name, term.Enclose, term.Slope, interval.PointF(s-h), interval.PointF(s+h), 1e-6)
			h = 1e-4
			d1, b1 := term.Approx(s - h)
			d2, b2 := term.Approx(s + h)
			sl := term.Slope(interval.PointF(s))
			fd, fb := (d2-d1)/(2*h), (b2-b1)/complex(2*h, 0)
			if math.Abs(fd-sl.D.Mid().Lo()) > 1e-7 || cmplx.Abs(fb-complex(sl.B.Re.Mid().Lo(), sl.B.Im.Mid().Lo())) > 1e-7 {
				t.Errorf("%s, s = %v: central differences of Approx (%v, %v), Slope (%v, %v + i %v)", name, s, fd, fb, sl.D, sl.B.Re, sl.B.Im)
			}
			if sl.A.Lo() != 0 || sl.A.Hi() != 0 {
				t.Errorf("%s, s = %v: A' = %v, want exactly 0 (quadrant-III term)", name, s, sl.A)
			}
		}
	}
}

// TestPWLTail checks the tail lemma against samples: for side*s >= S,
// |D(s)| <= dmax and |B(s)| <= bmax (Term.Tail's contract). Samples: a few
// multiples of S with enclosures (the lower end of |.| must not exceed the
// bound), and one oscillation period of B beyond S densely with Approx
// (period about pi sqrt(|s|/c) in s for an edge at c: stationary phase at
// tau ~ sqrt(|s|/c), where d(phase)/ds = log((tau-1)/(tau+1)) ~ -2/tau).
func TestPWLTail(t *testing.T) {
	t.Parallel()
	Ss := []float64{1, 4, 32, 300}
	fs := []float64{1, 1.001, 1.3, 2}
	if pwlSlow() {
		Ss = append(Ss, 2, 10, 100, 1000, 5000)
		fs = append(fs, 5, 10)
	}
	terms := pwlSoundnessTerms(t)
	if !pwlSlow() {
		// (the default run keeps the two terms whose |s| <= 14 rules the
		// cross-check has built)
		delete(terms, "band [1, inf)")
	}
	for name, term := range terms {
		for _, S := range Ss {
			for _, side := range []int{1, -1} {
				dmax, bmax := term.Tail(interval.PointF(S), side)
				if !dmax.IsFinite() || !bmax.IsFinite() {
					t.Errorf("%s: Tail(%v, %d) not finite: %v, %v", name, S, side, dmax, bmax)
					continue
				}
				maxB := 0.0
				for _, f := range fs {
					s := float64(side) * S * f
					m := term.Enclose(interval.PointF(s))
					if a := m.D.Abs(); a.Lo() > dmax.Hi() {
						t.Errorf("%s, S = %v: |D(%v)| = %v > dmax %v", name, S, s, a, dmax)
					}
					if a := m.B.Abs(); a.Lo() > bmax.Hi() {
						t.Errorf("%s, S = %v: |B(%v)| = %v > bmax %v", name, S, s, a, bmax)
					}
					maxB = math.Max(maxB, m.B.Abs().Mid().Lo())
				}
				P := math.Pi * math.Sqrt(S/0.5)
				for k := 0; k <= 64; k++ {
					s := float64(side) * (S + P*float64(k)/64)
					d, b := term.Approx(s)
					if math.Abs(d) > dmax.Hi()*(1+1e-12)+1e-16 || cmplx.Abs(b) > bmax.Hi()*(1+1e-12)+1e-16 {
						t.Errorf("%s, S = %v: Approx(%v) = (%v, %v) above the tail bounds (%v, %v)", name, S, s, d, b, dmax.Hi(), bmax.Hi())
					}
					maxB = math.Max(maxB, cmplx.Abs(b))
				}
				t.Logf("%s, S = %v, side %+d: dmax %.3g, bmax %.3g, largest sampled |B| %.3g (ratio %.1f)", name, S, side, dmax.Hi(), bmax.Hi(), maxB, bmax.Hi()/maxB)
			}
		}
	}
}

// TestPWLDecayExponent: as s -> -inf each jump of the quadrant-I profile
// at knot c > 0 contributes to M_{+-} a stationary-phase term of size
// ~ |s|^{-3/4} (package doc, "Bands and hats"; stationary point tau^2 = 1 + |s|/c of
// the phase 2c tau + s log((tau-1)/(tau+1)), where the amplitude is
// ~ c/(2|s|) and phi” ~ 4 c^{3/2} |s|^{-1/2}), and each kink (h” has a
// delta there, so h^ carries e^{icw}/w^2) one of size ~ |s|^{-5/4}
// (amplitude smaller by 1/tau^2 ~ c/|s|, times the same sqrt(2 pi/phi”)).
// The phase at the stationary point is 4 sqrt(c|s|) + O(|s|^{-1/2}), linear
// in sigma = sqrt(-s); with knots whose square roots are integers
// (multiples of a common sqrt) the sum of the edge terms is, up to the
// slowly varying amplitudes, periodic in sigma with period pi/2 (band
// [1, inf): one frequency 4; [1, 4) and the hat (1, 4, 9): 4, 8, 12). So
// the maximum of |B| over one such period of sigma measures the common
// envelope, and the exponent from s = -200 to s = -3200 must be within 0.1
// of -3/4 (bands) or -5/4 (hats). (A knot at 0 contributes no
// stationary point; the band [0, 1) has the quadrant-like O(1/|s|) term,
// subdominant.) Reference values of our own (independent quadrature,
// seen here): -0.772 for [1, inf), -0.765 for [1, 4), -1.235 for the hat.
func TestPWLDecayExponent(t *testing.T) {
	t.Parallel()
	type dcase struct {
		name   string
		term   Term[interval.F]
		period float64 // in sigma
		want   float64
	}
	cases := []dcase{
		{"band [1, inf)", bandF(t, "1", "inf"), math.Pi / 2, -0.75},
		{"band [1, 4)", bandF(t, "1", "4"), math.Pi / 2, -0.75},
		{"hat (1, 4, 9)", hatF(t, "1", "4", "9"), math.Pi / 2, -1.25},
	}
	if pwlSlow() {
		cases = append(cases,
			dcase{"band [0.25, 1)", bandF(t, "0.25", "1"), math.Pi, -0.75},
			dcase{"band [0, 1)", bandF(t, "0", "1"), math.Pi / 2, -0.75},
			dcase{"hat (0.25, 1, 2.25)", hatF(t, "0.25", "1", "2.25"), math.Pi, -1.25},
			dcase{"hat (0, 1, 4)", hatF(t, "0", "1", "4"), math.Pi / 2, -1.25})
	}
	envelope := func(term Term[interval.F], s0, period float64) float64 {
		sg := math.Sqrt(-s0)
		m := 0.0
		for i := 0; i <= 120; i++ {
			x := sg - period/2 + period*float64(i)/120
			_, b := term.Approx(-x * x)
			m = math.Max(m, cmplx.Abs(b))
		}
		return m
	}
	for _, c := range cases {
		e1, e2 := envelope(c.term, -200, c.period), envelope(c.term, -3200, c.period)
		p := math.Log(e2/e1) / math.Log(16)
		t.Logf("%s: envelope of |B| %.4g near s = -200, %.4g near s = -3200: exponent %.3f (stationary phase %v)", c.name, e1, e2, p, c.want)
		if math.Abs(p-c.want) > 0.1 {
			t.Errorf("%s: measured decay exponent %.3f, stationary phase predicts %v", c.name, p, c.want)
		}
	}
}

// TestPWL128Bits checks the 128-bit enclosures against the 53-bit ones:
// finite, overlapping, and no wider (the rules at 128 bits aim at a
// tolerance of 2^-138, so they should be much narrower).
// It takes about a minute, so it runs with WEDGEBOUND_SLOW=1 only.
func TestPWL128Bits(t *testing.T) {
	if os.Getenv("WEDGEBOUND_SLOW") != "1" {
		t.Skip("set WEDGEBOUND_SLOW=1 for the 128-bit band and hat check")
	}
	like := interval.NewB(0, 128)
	for _, c := range []struct {
		kind   string
		params map[string]string
		f      Term[interval.F]
	}{
		{"band", map[string]string{"from": "0.5", "to": "2"}, bandF(t, "0.5", "2")},
		{"hat", map[string]string{"left": "0.5", "peak": "1", "right": "1.5"}, hatF(t, "0.5", "1", "1.5")},
	} {
		term, err := NewTerm(like, c.kind, c.params)
		if err != nil {
			t.Fatal(err)
		}
		for _, s := range []float64{-0.3, -40} {
			mb := term.Enclose(interval.NewB(s, 128))
			mf := c.f.Enclose(interval.PointF(s))
			f := func(x interval.B) interval.F { return interval.PointF(0).Between(x.Endpoints()) }
			t.Logf("%s %v, s = %v: 128-bit D %v, B %v + i %v", c.kind, c.params, s, mb.D, mb.B.Re, mb.B.Im)
			if !mb.D.IsFinite() || !mb.B.IsFinite() {
				t.Errorf("%s %v, s = %v: 128-bit enclosure not finite (D %v, B %v + i %v)", c.kind, c.params, s, mb.D, mb.B.Re, mb.B.Im)
				continue
			}
			if !overlaps(f(mb.D), mf.D) || !overlaps(f(mb.B.Re), mf.B.Re) || !overlaps(f(mb.B.Im), mf.B.Im) {
				t.Errorf("%s %v, s = %v: 128-bit and 53-bit enclosures disjoint", c.kind, c.params, s)
			}
			if w, wf := math.Max(mb.B.Re.Rad(), mb.B.Im.Rad()), math.Max(mf.B.Re.Rad(), mf.B.Im.Rad()); w > wf {
				t.Errorf("%s %v, s = %v: 128-bit B radius %.3g wider than the 53-bit %.3g", c.kind, c.params, s, w, wf)
			}
			if w := math.Max(mb.D.Rad(), math.Max(mb.B.Re.Rad(), mb.B.Im.Rad())); w > 1e-30 {
				t.Errorf("%s %v, s = %v: 128-bit radius %.3g, want below 1e-30", c.kind, c.params, s, w)
			}
		}
	}
}
