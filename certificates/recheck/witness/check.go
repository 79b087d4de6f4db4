package witness

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"math/cmplx"
	"sort"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

type cx = interval.C[interval.F]

// fn is one basis function with its coefficient.
type fn struct {
	chirp string
	m     int
	b     interval.F
	bf    float64
	a     interval.F
	wi    int // index of the width
}

// Detail is the verifier's own account of a witness certificate.
type Detail struct {
	Norm      recheck.Bracket `json:"norm"`
	Backflow  recheck.Bracket `json:"backflow"`
	Quotient  recheck.Bracket `json:"quotient"`
	Remainder string          `json:"quadrature_remainder"`
	Panels    int             `json:"panels"`
	Nodes     int             `json:"nodes"`
}

func ratF(r *big.Rat) interval.F {
	f, _ := r.Float64()
	if new(big.Rat).SetFloat64(f).Cmp(r) == 0 {
		return interval.PointF(f)
	}
	return interval.NewF(math.Nextafter(f, math.Inf(-1)), math.Nextafter(f, math.Inf(1)))
}

// halfGamma encloses Gamma(k/2) for k >= 1.
func halfGamma[T interval.Real[T]](like T, k int) T {
	if k%2 == 0 {
		g := like.Int(1)
		for j := 2; j < k/2; j++ {
			g = g.Mul(like.Int(int64(j)))
		}
		return g
	}
	g := like.Pi().Sqrt()
	for j := 1; 2*j < k; j++ {
		g = g.Mul(like.Int(int64(2*j - 1)).Scale(-1))
	}
	return g
}

// invSqrt encloses c^(-1/2) (principal branch) over a rectangle by the
// half-angle formulas sqrt(c) = sqrt((|c| + x)/2) + i y/(2 sqrt((|c| + x)/2))
// when x > 0 on the whole rectangle, and with the roles of the parts
// exchanged (imaginary part sign(y) sqrt((|c| - x)/2)) when y keeps one
// sign; then c^(-1/2) = conj(sqrt c)/|c|. A rectangle meeting the branch
// cut (x <= 0 and y = 0) gives Whole parts.
func invSqrt[T interval.Real[T]](c interval.C[T]) interval.C[T] {
	x, y := c.Re, c.Im
	r := x.Sqr().Add(y.Sqr()).Sqrt()
	var re, im T
	switch {
	case x.Sign() > 0:
		re = r.Add(x).Scale(-1).Sqrt()
		im = y.Quo(re.Scale(1))
	case y.Sign() != 0:
		a := r.Sub(x).Scale(-1).Sqrt()
		re = y.Abs().Quo(a.Scale(1))
		im = a
		if y.Sign() < 0 {
			im = a.Neg()
		}
	default:
		w := x.Whole()
		return interval.C[T]{Re: w, Im: w}
	}
	return interval.C[T]{Re: re.Quo(r), Im: im.Quo(r).Neg()}
}

// powers returns c^(-(n+1)/2) for n = 0 .. top.
func powers[T interval.Real[T]](c interval.C[T], top int) []interval.C[T] {
	r := invSqrt(c)
	out := make([]interval.C[T], top+1)
	out[0] = r
	for n := 1; n <= top; n++ {
		out[n] = out[n-1].Mul(r)
	}
	return out
}

type evaluator struct {
	fs  []fn
	top int
	gam []interval.F // Gamma((n+1)/2)/2
	// widths lists the distinct widths; plain and chirp say which shifts
	// (0, or -1 and +1) each needs.
	widths       []interval.F
	plain, chirp []bool
}

// fk returns F_0(z), F_1(z) for z = x + i y. The powers of
// b + i(z + shift) are computed once per width and shift.
//
// The real part of z is a + x with an integer anchor a near it: the
// imaginary parts (a + shift) + x then keep full relative accuracy next to
// the branch points, at distance b from the integers.
func (e *evaluator) fk(a float64, x, y interval.F) (f0, f1 cx) {
	one := interval.PointF(1)
	hlf := one.Scale(-1)
	nw := len(e.widths)
	p0 := make([][]cx, nw) // shift 0
	pm := make([][]cx, nw) // shift -1
	pp := make([][]cx, nw) // shift +1
	for i, b := range e.widths {
		re := b.Sub(y)
		if e.plain[i] {
			p0[i] = powers(cx{Re: re, Im: interval.PointF(a).Add(x)}, e.top)
		}
		if e.chirp[i] {
			pm[i] = powers(cx{Re: re, Im: interval.PointF(a - 1).Add(x)}, e.top)
			pp[i] = powers(cx{Re: re, Im: interval.PointF(a + 1).Add(x)}, e.top)
		}
	}
	for _, f := range e.fs {
		var q0, q1 cx
		switch f.chirp {
		case "plain":
			q0, q1 = p0[f.wi][f.m], p0[f.wi][f.m+1]
		case "cos":
			q0 = pm[f.wi][f.m].Add(pp[f.wi][f.m]).MulReal(hlf)
			q1 = pm[f.wi][f.m+1].Add(pp[f.wi][f.m+1]).MulReal(hlf)
		case "sin": // (A - B)/(2i) = -i (A - B)/2
			d0 := pm[f.wi][f.m].Sub(pp[f.wi][f.m]).MulReal(hlf)
			d1 := pm[f.wi][f.m+1].Sub(pp[f.wi][f.m+1]).MulReal(hlf)
			q0 = cx{Re: d0.Im, Im: d0.Re.Neg()}
			q1 = cx{Re: d1.Im, Im: d1.Re.Neg()}
		}
		f0 = f0.Add(q0.MulReal(f.a.Mul(e.gam[f.m])))
		f1 = f1.Add(q1.MulReal(f.a.Mul(e.gam[f.m+1])))
	}
	return f0, f1
}

// integrand returns -(1/2pi)[F_1(-z) F_0(z) + F_0(-z) F_1(z)].
// (z = a + x + i y).
func (e *evaluator) integrand(a float64, x, y interval.F) cx {
	a0, a1 := e.fk(a, x, y)
	b0, b1 := e.fk(-a, x.Neg(), y.Neg())
	s := b1.Mul(a0).Add(b0.Mul(a1))
	d := x.Pi().Scale(1)
	return cx{Re: s.Re.Quo(d).Neg(), Im: s.Im.Quo(d).Neg()}
}

// moment encloses int_0^inf u^n exp(-c u^2) du for Re c > 0.
func moment[T interval.Real[T]](n int, c interval.C[T]) interval.C[T] {
	p := powers(c, n)
	return p[n].MulReal(halfGamma(c.Re, n+1).Scale(-1))
}

// normBits is the precision of the norm, whose pairwise sum cancels when the
// basis is nearly dependent.
const normBits = 160

// normSquared sums <phi, phi> over pairs with product-to-sum formulas, in
// normBits-bit interval arithmetic.
func normSquared(w *certificates.Witness) (interval.F, error) {
	like := interval.NewB(0, normBits)
	type fb struct {
		chirp string
		m     int
		a, b  interval.B
	}
	var fs []fb
	for i, f := range w.Basis {
		b, err := like.Decimal(f.Width.String())
		if err != nil {
			return interval.PointF(0), err
		}
		a, err := like.Decimal(w.Coefficients[i].String())
		if err != nil {
			return interval.PointF(0), err
		}
		fs = append(fs, fb{f.Chirp, f.Power, a, b})
	}
	one := like.Int(1)
	hlf := one.Scale(-1)
	zero := like.Int(0)
	sum := like.Int(0)
	type key struct {
		n  int
		b  string
		im int
	}
	cache := map[key]interval.C[interval.B]{}
	mom := func(n int, B interval.B, im int) interval.C[interval.B] {
		k := key{n, B.String(), im}
		if v, ok := cache[k]; ok {
			return v
		}
		v := moment(n, interval.C[interval.B]{Re: B, Im: like.Int(int64(im))})
		cache[k] = v
		return v
	}
	for i, f := range fs {
		for j, g := range fs {
			if j < i {
				continue
			}
			n := f.m + g.m
			B := f.b.Add(g.b)
			m0 := mom(n, B, 0).Re
			var v interval.B
			switch f.chirp + "/" + g.chirp {
			case "plain/plain":
				v = m0
			case "plain/cos", "cos/plain":
				v = mom(n, B, -1).Re
			case "plain/sin", "sin/plain":
				v = mom(n, B, -1).Im
			case "cos/cos":
				v = m0.Add(mom(n, B, -2).Re).Mul(hlf)
			case "sin/sin":
				v = m0.Sub(mom(n, B, -2).Re).Mul(hlf)
			case "cos/sin", "sin/cos":
				v = mom(n, B, -2).Im.Mul(hlf)
			default:
				v = zero.Whole()
			}
			t := f.a.Mul(g.a).Mul(v)
			if j != i {
				t = t.Scale(1)
			}
			sum = sum.Add(t)
		}
	}
	return interval.NewF(sum.Lo(), sum.Hi()), nil
}

type vpanel struct {
	lo, hi, rho float64
}

func rhoThrough(lo, hi float64, z complex128) float64 {
	mu, l := (lo+hi)/2, (hi-lo)/2
	zeta := (z - complex(mu, 0)) / complex(l, 0)
	w := zeta + cmplx.Sqrt(zeta-1)*cmplx.Sqrt(zeta+1)
	r := cmplx.Abs(w)
	if r < 1 {
		r = 1 / r
	}
	return r
}

// panels grades [-1, 1] by the ratio 3 towards -1, 0, 1 down to a third of
// the smallest width; rho = 1 + (rho_max - 1)/2, at most 8.
func panels(fs []fn) []vpanel {
	bmin := math.Inf(1)
	sing := map[complex128]bool{}
	for _, f := range fs {
		bmin = math.Min(bmin, f.bf)
		sing[complex(0, f.bf)] = true
		if f.chirp != "plain" {
			sing[complex(1, f.bf)] = true
			sing[complex(-1, f.bf)] = true
		}
	}
	pts := map[float64]bool{-1: true, 0: true, 1: true}
	for _, p := range []float64{-1, 0, 1} {
		for h := bmin / 3; h < 0.5; h *= 3 {
			for _, q := range []float64{p - h, p + h} {
				if q > -1 && q < 1 {
					pts[q] = true
				}
			}
		}
	}
	var ps []float64
	for p := range pts {
		ps = append(ps, p)
	}
	sort.Float64s(ps)
	var out []vpanel
	for i := 0; i+1 < len(ps); i++ {
		rmax := math.Inf(1)
		for z := range sing {
			rmax = math.Min(rmax, rhoThrough(ps[i], ps[i+1], z))
		}
		out = append(out, vpanel{ps[i], ps[i+1], math.Min(1+(rmax-1)/2, 8)})
	}
	return out
}

var ladder = []int{16, 24, 32, 48, 64, 96, 128}

// Check recomputes the Rayleigh quotient of a witness certificate and
// returns the verifier's record and the failed claims (none: pass).
func Check(w *certificates.Witness, workers int) (*Detail, []string, error) {
	var fs []fn
	top := 0
	e := &evaluator{}
	widx := map[string]int{}
	for i, f := range w.Basis {
		b, a := f.Width.Rat(), w.Coefficients[i].Rat()
		if b == nil || a == nil {
			return nil, nil, fmt.Errorf("basis[%d]: missing width or coefficient", i)
		}
		bf, _ := b.Float64()
		key := b.RatString()
		wi, ok := widx[key]
		if !ok {
			wi = len(e.widths)
			widx[key] = wi
			e.widths = append(e.widths, ratF(b))
			e.plain = append(e.plain, false)
			e.chirp = append(e.chirp, false)
		}
		if f.Chirp == "plain" {
			e.plain[wi] = true
		} else {
			e.chirp[wi] = true
		}
		fs = append(fs, fn{chirp: f.Chirp, m: f.Power, b: ratF(b), bf: bf, a: ratF(a), wi: wi})
		if f.Power+1 > top {
			top = f.Power + 1
		}
	}
	e.fs, e.top, e.gam = fs, top, make([]interval.F, top+1)
	for n := 0; n <= top; n++ {
		e.gam[n] = halfGamma(interval.PointF(0), n+1).Scale(-1)
	}
	var fails []string
	norm, err := normSquared(w)
	if err != nil {
		return nil, nil, err
	}
	if norm.Sign() != 1 {
		fails = append(fails, fmt.Sprintf("the norm of the state is not proved positive (%v)", norm))
	}
	ps := panels(fs)
	vals := make([]interval.F, len(ps))
	rems := make([]float64, len(ps))
	nodes := make([]int, len(ps))
	errs := make([]string, len(ps))
	checknum.For(len(ps), workers, func(i int) {
		p := ps[i]
		anchor := math.Round((p.lo + p.hi) / 2)
		an := interval.PointF(anchor)
		lo, hi := interval.PointF(p.lo), interval.PointF(p.hi)
		mu := lo.Sub(an).Add(hi.Sub(an)).Scale(-1)
		l := hi.Sub(lo).Scale(-1)
		rho := interval.PointF(p.rho)
		one := interval.PointF(1)
		a := rho.Add(one.Quo(rho)).Scale(-1)
		bb := rho.Sub(one.Quo(rho)).Scale(-1)
		pi := one.Pi()
		const arcs = 40
		mx := interval.PointF(0)
		for j := 0; j < arcs; j++ {
			th := pi.Mul(interval.PointF(float64(2 * j))).Quo(interval.PointF(arcs)).Hull(
				pi.Mul(interval.PointF(float64(2*j + 2))).Quo(interval.PointF(arcs)))
			s, c := interval.SinCos(th)
			v := e.integrand(anchor, mu.Add(l.Mul(a).Mul(c)), l.Mul(bb).Mul(s))
			mx = mx.Max(v.Abs())
		}
		if !mx.IsFinite() {
			errs[i] = fmt.Sprintf("no bound of the integrand on the ellipse of panel [%g, %g]", p.lo, p.hi)
			return
		}
		mxu := interval.PointF(mx.Hi())
		var r *ccRule
		var rem interval.F
		for _, n := range ladder {
			r = cc(n)
			rem = r.bound(mxu, rho).Mul(l)
			if rem.Hi() <= 1e-14*(p.hi-p.lo) {
				break
			}
		}
		sum := interval.PointF(0)
		zero := interval.PointF(0)
		for k := range r.x {
			v := e.integrand(anchor, mu.Add(l.Mul(r.x[k])), zero)
			sum = sum.Add(r.w[k].Mul(v.Re))
		}
		vals[i] = sum.Mul(l).Pad(interval.PointF(rem.Hi()))
		rems[i] = rem.Hi()
		nodes[i] = r.n + 1
	})
	num := interval.PointF(0)
	remTot, nodeTot := 0.0, 0
	for i := range ps {
		if errs[i] != "" {
			fails = append(fails, errs[i])
			continue
		}
		num = num.Add(vals[i])
		remTot += rems[i]
		nodeTot += nodes[i]
	}
	q := num.Quo(norm)
	d := &Detail{Panels: len(ps), Nodes: nodeTot}
	d.Norm = encl(norm)
	d.Backflow = encl(num)
	d.Quotient = encl(q)
	if _, r, err := interval.Decimals(interval.PointF(remTot), 3); err == nil {
		d.Remainder = r
	} else {
		d.Remainder = "unbounded"
	}
	if len(fails) > 0 {
		return d, fails, nil
	}
	if !q.IsFinite() {
		return d, []string{"the Rayleigh quotient is not enclosed"}, nil
	}
	bound := w.Bound.Rat()
	if bound == nil {
		return nil, nil, errors.New("bound: missing number")
	}
	qlo, _ := q.Endpoints()
	qr, _ := qlo.Rat(nil)
	if bound.Cmp(qr) > 0 {
		fails = append(fails, fmt.Sprintf("bound %s exceeds the recomputed Rayleigh quotient's lower end %s", w.Bound, d.Quotient.Lower))
	}
	for _, c := range []struct {
		rec  certificates.Interval
		got  interval.F
		name string
	}{{w.Norm, norm, "norm"}, {w.Backflow, num, "backflow"}, {w.Quotient, q, "quotient"}} {
		lo, hi := c.rec.Lower.Rat(), c.rec.Upper.Rat()
		if lo == nil || hi == nil {
			return nil, nil, fmt.Errorf("witness.%s is not a decimal interval", c.name)
		}
		gl, gh := c.got.Endpoints()
		glr, _ := gl.Rat(nil)
		ghr, _ := gh.Rat(nil)
		if lo.Cmp(ghr) > 0 || hi.Cmp(glr) < 0 {
			fails = append(fails, fmt.Sprintf("recorded %s [%s, %s] is disjoint from the recomputed [%s, %s]", c.name, c.rec.Lower, c.rec.Upper, encl(c.got).Lower, encl(c.got).Upper))
		}
	}
	return d, fails, nil
}

func encl(x interval.F) recheck.Bracket {
	lo, hi, err := interval.Decimals(x, 17)
	if err != nil {
		return recheck.Bracket{Lower: "unbounded", Upper: "unbounded"}
	}
	return recheck.Bracket{Lower: lo, Upper: hi}
}
