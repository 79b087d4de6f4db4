package regions

import (
	"math"
	"math/cmplx"
	"strings"
	"sync"
	"testing"

	"wedgebound/interval"
)

var (
	expCacheMu sync.Mutex
	expCache   = map[string]Term[interval.F]{}
)

// expF returns the exponential term for k at float64 precision, cached so
// each builds its quadrature regimes once per test binary.
func expF(t testing.TB, k string) Term[interval.F] {
	expCacheMu.Lock()
	defer expCacheMu.Unlock()
	if tm := expCache[k]; tm != nil {
		return tm
	}
	tm, err := NewTerm(interval.PointF(0), "exp", map[string]string{"k": k})
	if err != nil {
		t.Fatal(err)
	}
	expCache[k] = tm
	return tm
}

// refExpD is an independent float quadrature of the quadrant-I diagonal
// entry for G(u) = e^{-ku}, G^(w) = 1/(k - iw) (package doc):
// M_{++}(s) = (1/pi) int_R G^(2 tanh v) e^{-2isv} sech v dv.
func refExpD(k, s float64) float64 {
	var edges []float64
	edges = append(edges, uniformEdges(-40, -1, 0.1)...)
	edges = append(edges, uniformEdges(-1, 1, math.Min(0.05, k/4))[1:]...)
	edges = append(edges, uniformEdges(1, 40, 0.1)[1:]...)
	v := glPanels(func(v float64) complex128 {
		return cmplx.Exp(complex(0, -2*s*v)) / complex(math.Cosh(v), 0) / complex(k, -2*math.Tanh(v))
	}, edges, 20)
	return real(v) / math.Pi
}

// refExpMpm is an independent float quadrature of the quadrant-I
// off-diagonal entry (package doc)
// M_{+-}(s) = (1/pi) int_1^inf G^(2 tau) (tau-1)^{-1/2+is} (tau+1)^{-1/2-is} dtau,
// substituting tau = 1 + e^w: the integrand becomes
// e^{w/2} e^{isw} (2 + e^w)^{-1/2-is} / (k - 2i(1 + e^w)), which decays like
// e^{w/2} as w -> -inf and like e^{-w} as w -> +inf, oscillating at most at
// frequency |s|.
func refExpMpm(k, s float64) complex128 {
	h := math.Min(0.25, 4/math.Max(math.Abs(s), 1))
	v := glPanels(func(w float64) complex128 {
		ew := math.Exp(w)
		l := math.Log(2 + ew)
		return cmplx.Exp(complex(w/2-l/2, s*w-s*l)) / complex(k, -2*(1+ew))
	}, uniformEdges(-78, 40, h), 20)
	return v / math.Pi
}

// TestExpAgainstQuadrature checks the exponential term's D and B
// enclosures against the two independent quadratures: by the parity rule
// (package doc) the quadrant-III profile has D = M^I_{++} and
// B = conj(M^I_{+-}).
func TestExpAgainstQuadrature(t *testing.T) {
	for _, k := range []string{"0.1", "1", "5", "150"} {
		term := expF(t, k)
		kf := mustFloat(k)
		for _, s := range []float64{-20, -3.5, -1, -0.26, 0, 0.8, 1, 4, 20} {
			m := term.Enclose(interval.PointF(s))
			d := refExpD(kf, s)
			b := cmplx.Conj(refExpMpm(kf, s))
			if !near(m.D, d, 1e-13) {
				t.Errorf("k = %s, s = %v: D = %v, quadrature %v", k, s, m.D, d)
			}
			if !nearC(m.B, b, 1e-12) {
				t.Errorf("k = %s, s = %v: B = %v + i %v, quadrature %v", k, s, m.B.Re, m.B.Im, b)
			}
			// The remainder bound of the |s| <= 1 regime is ~2e-12 (seen
			// here); elsewhere the point enclosures are much tighter.
			if m.D.Rad() > 1e-13 || m.B.Re.Rad() > 1e-11 || m.B.Im.Rad() > 1e-11 {
				t.Errorf("k = %s, s = %v: point enclosure too wide (D %v, B %v + i %v)", k, s, m.D, m.B.Re, m.B.Im)
			}
		}
	}
}

// TestExpLargeS checks the enclosures at large |s| (where a fixed real-axis
// quadrature loses digits) against the quadrature of
// refExpMpm with panels resolving the oscillation, and cells around those
// points against the point value.
func TestExpLargeS(t *testing.T) {
	for _, k := range []string{"1", "150"} {
		term := expF(t, k)
		kf := mustFloat(k)
		for _, s := range []float64{500, -500, -3000} {
			b := cmplx.Conj(refExpMpm(kf, s))
			m := term.Enclose(interval.PointF(s))
			// |B| ~ 1/(4 pi |s|) here; ask for 1e-10 relative.
			if tol := 1e-10 * cmplx.Abs(b); !nearC(m.B, b, tol) {
				t.Errorf("k = %s, s = %v: B = %v + i %v, quadrature %v", k, s, m.B.Re, m.B.Im, b)
			}
			cell := interval.PointF(s - 0.5).Hull(interval.PointF(s + 0.5))
			mc := term.Enclose(cell)
			if !mc.B.Contains(m.B) || !mc.D.Contains(m.D) {
				t.Errorf("k = %s: the enclosure on [%v, %v] does not contain the point enclosure at %v", k, s-0.5, s+0.5, s)
			}
			// Leading term (REPORT of the float exploration, seen here, and a
			// one-step integration by parts): B ~ -i/(4 pi conj(a)), a = 1/2 + is.
			lead := complex(0, -1) / (4 * math.Pi * cmplx.Conj(complex(0.5, s)))
			if cmplx.Abs(b-lead) > 2*cmplx.Abs(lead)*(1+kf/4)/math.Abs(s) {
				t.Errorf("k = %s, s = %v: B = %v far from the leading term %v", k, s, b, lead)
			}
		}
	}
}

func mustFloat(s string) float64 {
	r, err := ParseRat(s)
	if err != nil {
		panic(err)
	}
	f, _ := r.Float64()
	return f
}

// TestExpSmallKLimit: as k -> 0, G(u) = e^{-ku} -> 1, the quadrant-I profile
// becomes the quadrant itself, so D -> A_quadrant = (1 + tanh pi s)/2 and
// conj(B) -> B_quadrant = (i/2pi) J(s) (package doc, "The quadrant"). The deviation
// must shrink with k (at least like k log(1/k)).
func TestExpSmallKLimit(t *testing.T) {
	for _, s := range []float64{-2, -0.3558, 0, 0.5, 1.5} {
		q := Quadrant(interval.PointF(s))
		prev := math.Inf(1)
		for _, k := range []string{"0.01", "0.001", "0.0001"} {
			m := expF(t, k).Enclose(interval.PointF(s))
			kf := mustFloat(k)
			dd := math.Abs(m.D.Mid().Lo() - q.A.Mid().Lo())
			db := cmplx.Abs(complex(m.B.Re.Mid().Lo()-q.B.Re.Mid().Lo(), -m.B.Im.Mid().Lo()-q.B.Im.Mid().Lo()))
			dev := math.Max(dd, db)
			if bound := 4 * kf * (1 + math.Abs(s)) * (1 + math.Log(1/kf)); dev > bound {
				t.Errorf("s = %v, k = %s: deviation from the quadrant entries %.3g > %.3g", s, k, dev, bound)
			}
			if dev > prev/3 {
				t.Errorf("s = %v, k = %s: deviation %.3g does not shrink (previous %.3g)", s, k, dev, prev)
			}
			prev = dev
		}
	}
}

// TestExpSlope checks Slope against difference quotients of Enclose (mean
// value theorem; see checkSlope), including cells that straddle the
// quadrature regime boundaries at |s| = 1, 2.
func TestExpSlope(t *testing.T) {
	for _, k := range []string{"0.1", "150"} {
		term := expF(t, k)
		for _, s := range []float64{-700, -40.3, -3, -1, -0.26, 0, 0.5, 1, 2, 64.2} {
			h := 1e-5
			checkSlope(t, "exp k="+k, term.Enclose, term.Slope, interval.PointF(s-h), interval.PointF(s+h), 1e-6)
		}
		for _, s := range []float64{-0.26, 3} {
			if sl := term.Slope(interval.PointF(s)); sl.A.Lo() != 0 || sl.A.Hi() != 0 {
				t.Errorf("k = %s: A' = %v, want exactly 0", k, sl.A)
			}
		}
	}
}

// TestExpTail checks the tail lemma at sample points: for side*s >= S,
// |D(s)| <= dmax and |B(s)| <= bmax; and the |B| constant C(k) is no smaller
// than the exact asymptote |B| |s| -> 1/(4 pi) (leading term above).
func TestExpTail(t *testing.T) {
	for _, k := range []string{"0.1", "1", "150"} {
		term := expF(t, k)
		for _, S := range []float64{1, 4, 32, 300} {
			for _, side := range []int{1, -1} {
				dmax, bmax := term.Tail(interval.PointF(S), side)
				if bmax.Hi()*S < 1/(4*math.Pi) {
					t.Errorf("k = %s: tail constant %v below the asymptote 1/(4 pi)", k, bmax.Hi()*S)
				}
				for _, f := range []float64{1, 1.001, 1.5, 3, 10} {
					s := float64(side) * S * f
					m := term.Enclose(interval.PointF(s))
					if a := m.D.Abs(); a.Lo() > dmax.Hi() {
						t.Errorf("k = %s, S = %v: |D(%v)| = %v > dmax %v", k, S, s, a, dmax)
					}
					if a := m.B.Abs(); a.Lo() > bmax.Hi() {
						t.Errorf("k = %s, S = %v: |B(%v)| = %v > bmax %v", k, S, s, a, bmax)
					}
				}
			}
		}
	}
}

// TestExpCellContainsPoints checks that enclosures over cells (widths
// 1e-3 to 0.5, several regimes) contain the point enclosures of random
// interior points and the float values of the independent quadrature.
func TestExpCellContainsPoints(t *testing.T) {
	term := expF(t, "5")
	for _, c := range []struct{ lo, hi float64 }{{-0.3, -0.2}, {-1.2, -0.9}, {0.999, 1.001}, {2.5, 3}, {-33, -32.5}, {100, 100.5}} {
		cell := interval.PointF(c.lo).Hull(interval.PointF(c.hi))
		mc := term.Enclose(cell)
		for i := 0; i <= 4; i++ {
			s := c.lo + (c.hi-c.lo)*float64(i)/4
			m := term.Enclose(interval.PointF(s))
			if !mc.D.Contains(m.D) || !mc.B.Contains(m.B) {
				t.Errorf("cell [%v, %v] misses the point enclosure at %v", c.lo, c.hi, s)
			}
			// (D is below 1e-40 on the far cells, under the quadrature's
			// rounding noise, hence the absolute 1e-15.)
			if !nearC(mc.B, cmplx.Conj(refExpMpm(5, s)), 1e-15) || !near(mc.D, refExpD(5, s), 1e-15) {
				t.Errorf("cell [%v, %v] misses the quadrature value at %v", c.lo, c.hi, s)
			}
		}
	}
}

// TestExpLinearAndParity: weights add linearly (two copies of the same
// term with weights w1, w2 give the symbol of one copy with w1 + w2; the
// symbol is linear in g), and a quadrant-III term leaves A
// unchanged (the kernel [x+y<0] vanishes for x, y > 0, so M_{++} = 0 for it).
func TestExpLinearAndParity(t *testing.T) {
	term := expF(t, "1")
	dec := func(s string) interval.F { v, _ := interval.PointF(0).Decimal(s); return v }
	two := Relaxation[interval.F]{Terms: []Term[interval.F]{term, term}, Weights: []interval.F{dec("0.375"), dec("-1.25")}}
	one := Relaxation[interval.F]{Terms: []Term[interval.F]{term}, Weights: []interval.F{dec("-0.875")}}
	for _, s := range []float64{-5, -0.5, 0, 0.7, 12} {
		x := interval.PointF(s)
		a, b := two.Enclose(x), one.Enclose(x)
		if !overlaps(a.D, b.D) || !overlaps(a.B.Re, b.B.Re) || !overlaps(a.B.Im, b.B.Im) || !overlaps(a.A, b.A) {
			t.Errorf("s = %v: weights 0.375 + (-1.25) give %v, weight -0.875 gives %v", s, a, b)
		}
		for _, e := range []Edge{Lower, Upper} {
			if !overlaps(two.Eig(x, e), one.Eig(x, e)) {
				t.Errorf("s = %v %s: eigenvalues %v and %v disjoint", s, e, two.Eig(x, e), one.Eig(x, e))
			}
		}
		m := term.Enclose(x)
		if m.A.Lo() != 0 || m.A.Hi() != 0 {
			t.Errorf("s = %v: quadrant-III term has A = %v, want exactly 0", s, m.A)
		}
		if q := Quadrant(x); !overlaps(a.A, q.A) || a.A.Rad() > 2*q.A.Rad()+1e-15 {
			t.Errorf("s = %v: relaxation A = %v differs from the quadrant's %v", s, a.A, q.A)
		}
	}
}

// TestExpApprox checks the float64 values used by the search against the
// certified enclosures.
func TestExpApprox(t *testing.T) {
	for _, k := range []string{"0.1", "150"} {
		term := expF(t, k)
		for _, s := range []float64{-300, -7, -0.26, 0, 0.9, 3, 80} {
			d, b := term.Approx(s)
			m := term.Enclose(interval.PointF(s))
			if !near(m.D, d, 1e-14) || !nearC(m.B, b, 1e-13) {
				t.Errorf("k = %s, s = %v: Approx (%v, %v) outside the enclosure (%v, %v + i %v)", k, s, d, b, m.D, m.B.Re, m.B.Im)
			}
		}
	}
}

// TestExp128Bits checks the 128-bit enclosure against the float one. The
// quadrature (20 nodes, panels planned in float64) has a remainder bound
// that does not shrink with the precision, so the 128-bit enclosure is only
// required to be no wider than the 53-bit one; its radius is logged.
func TestExp128Bits(t *testing.T) {
	like := interval.NewB(0, 128)
	term, err := NewTerm(like, "exp", map[string]string{"k": "150"})
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []float64{-2.2, -0.26, 3} {
		mb := term.Enclose(interval.NewB(s, 128))
		mf := expF(t, "150").Enclose(interval.PointF(s))
		if !overlaps(interval.PointF(0).Between(mb.D.Endpoints()), mf.D) ||
			!overlaps(interval.PointF(0).Between(mb.B.Re.Endpoints()), mf.B.Re) ||
			!overlaps(interval.PointF(0).Between(mb.B.Im.Endpoints()), mf.B.Im) {
			t.Errorf("s = %v: 128-bit and 53-bit enclosures disjoint", s)
		}
		if w, wf := math.Max(mb.B.Re.Rad(), mb.B.Im.Rad()), math.Max(mf.B.Re.Rad(), mf.B.Im.Rad()); w > wf {
			t.Errorf("s = %v: 128-bit B radius %.3g wider than the 53-bit %.3g", s, w, wf)
		}
		t.Logf("s = %v: 128-bit radii D %.2g, B %.2g", s, mb.D.Rad(), math.Max(mb.B.Re.Rad(), mb.B.Im.Rad()))
	}
}

// TestNewTermErrors checks the term constructor's input errors.
func TestNewTermErrors(t *testing.T) {
	like := interval.PointF(0)
	for _, c := range []struct {
		kind   string
		params map[string]string
		want   string
	}{
		{"exp", map[string]string{}, "exactly the parameter k"},
		{"exp", map[string]string{"k": "1", "c": "2"}, "exactly the parameter k"},
		{"exp", map[string]string{"kk": "1"}, "exactly the parameter k"},
		{"exp", map[string]string{"k": "0"}, "positive"},
		{"exp", map[string]string{"k": "-2"}, "positive"},
		{"exp", map[string]string{"k": "NaN"}, "not a finite number"},
		{"exp", map[string]string{"k": "1e-9"}, "outside"},
		{"exp", map[string]string{"k": "2e6"}, "outside"},
		{"disc", map[string]string{"a": "0"}, "unknown term kind"},
		{"band", map[string]string{"a": "0"}, "exactly the parameters from and to"},
		{"band", map[string]string{"from": "2", "to": "1"}, "from < to"},
		{"band", map[string]string{"from": "-1", "to": "1"}, "outside"},
		{"band", map[string]string{"from": "0", "to": "5000"}, "outside"},
		{"band", map[string]string{"from": "0", "to": "NaN"}, "not a finite number"},
		{"hat", map[string]string{"left": "0", "peak": "1"}, "exactly the parameters left, peak and right"},
		{"hat", map[string]string{"left": "0", "peak": "2", "right": "1"}, "left < peak < right"},
	} {
		_, err := NewTerm(like, c.kind, c.params)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s %v: error %v, want one containing %q", c.kind, c.params, err, c.want)
		}
	}
	tm := expF(t, "150")
	if tm.Kind() != "exp" || tm.Params()["k"] != "150" || tm.Start() != "0" {
		t.Errorf("exp term reports kind %q params %v start %q", tm.Kind(), tm.Params(), tm.Start())
	}
	if k := TermKinds(); strings.Join(k, ",") != "band,exp,hat,step" {
		t.Errorf("TermKinds() = %v", k)
	}
}
