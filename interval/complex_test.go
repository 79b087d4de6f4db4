package interval

import (
	"math"
	"math/cmplx"
	"math/rand"
	"testing"
)

// cOps are the complex operations under test, as functions of one or two
// rectangles.
var cOps = []struct {
	name string
	f    func(z, w C[B]) C[B]
	ref  func(z, w complex128) complex128 // math/cmplx reference, float64 only
	cut  bool                             // undefined or discontinuous on (-inf, 0]
}{
	{"Add", func(z, w C[B]) C[B] { return z.Add(w) }, func(z, w complex128) complex128 { return z + w }, false},
	{"Sub", func(z, w C[B]) C[B] { return z.Sub(w) }, func(z, w complex128) complex128 { return z - w }, false},
	{"Mul", func(z, w C[B]) C[B] { return z.Mul(w) }, func(z, w complex128) complex128 { return z * w }, false},
	{"Quo", func(z, w C[B]) C[B] { return z.Quo(w) }, func(z, w complex128) complex128 { return z / w }, false},
	{"Inv", func(z, w C[B]) C[B] { return z.Inv() }, func(z, w complex128) complex128 { return 1 / z }, false},
	{"Sqr", func(z, w C[B]) C[B] { return z.Sqr() }, func(z, w complex128) complex128 { return z * z }, false},
	{"Abs", func(z, w C[B]) C[B] { return RealC(z.Abs()) }, func(z, w complex128) complex128 { return complex(cmplx.Abs(z), 0) }, false},
	{"Exp", func(z, w C[B]) C[B] { return z.Exp() }, func(z, w complex128) complex128 { return cmplx.Exp(z) }, false},
	{"Sqrt", func(z, w C[B]) C[B] { return z.Sqrt() }, func(z, w complex128) complex128 { return cmplx.Sqrt(z) }, false},
	{"Arg", func(z, w C[B]) C[B] { return RealC(z.Arg()) }, func(z, w complex128) complex128 { return complex(cmplx.Phase(z), 0) }, true},
	{"Log", func(z, w C[B]) C[B] { return z.Log() }, func(z, w complex128) complex128 { return cmplx.Log(z) }, true},
	{"Pow", func(z, w C[B]) C[B] { return z.Pow(w) }, func(z, w complex128) complex128 { return cmplx.Pow(z, w) }, true},
}

func TestComplexRectangleInclusion(t *testing.T) {
	// Every value at a point of the rectangles (evaluated at 3x the
	// precision) must lie in the rectangle result.
	rng := rand.New(rand.NewSource(11))
	for _, op := range cOps {
		for i := 0; i < 60; i++ {
			p := []uint{53, 113, 200}[i%3]
			wz := []float64{0, 1e-9, 0.05, 0.7}[i%4]
			z, pz := randRect(rng, -3, 3, 3, wz, p)
			w, pw := randRect(rng, -2, 2, 2, []float64{0, 0.01, 0.3}[i%3], p)
			if op.name == "Pow" { // keep exp(w log z) in range
				w, pw = randRect(rng, -1.5, 1.5, 1.5, 0.1, p)
			}
			r := op.f(z, w)
			if !r.IsFinite() {
				continue // Whole parts are checked in TestComplexDomain
			}
			for k := 0; k < 10; k++ {
				a, b := pz(), pw()
				a3 := C[B]{a.Re.WithPrec(3 * p), a.Im.WithPrec(3 * p)}
				b3 := C[B]{b.Re.WithPrec(3 * p), b.Im.WithPrec(3 * p)}
				v := op.f(a3, b3)
				if !v.IsFinite() {
					continue
				}
				if !r.Contains(v) {
					t.Errorf("%s(%v, %v) = %v misses %v at %v, %v", op.name, z, w, r, v, a, b)
					break
				}
			}
		}
	}
}

func TestComplexAgainstCmplx(t *testing.T) {
	// Point values against Go's math/cmplx (an independent float64
	// implementation): the enclosure must come within 4e-15 relative.
	rng := rand.New(rand.NewSource(12))
	for _, op := range cOps {
		for i := 0; i < 200; i++ {
			z := complex(rng.Float64()*8-4, rng.Float64()*8-4)
			w := complex(rng.Float64()*3-1.5, rng.Float64()*3-1.5)
			want := op.ref(z, w)
			for _, p := range []uint{53, 128} {
				got := op.f(cB(real(z), imag(z), p), cB(real(w), imag(w), p))
				if !got.IsFinite() {
					t.Errorf("%s(%v, %v) at %d bits unbounded", op.name, z, w, p)
					continue
				}
				if d := distToRect(want, got); d > 4e-15*(1+cmplx.Abs(want)) {
					t.Errorf("%s(%v, %v) at %d bits = %v, math/cmplx %v (distance %g)", op.name, z, w, p, got, want, d)
				}
			}
			// Same on F.
			zf, wf := NewC(PointF(real(z)), PointF(imag(z))), NewC(PointF(real(w)), PointF(imag(w)))
			var got C[F]
			switch op.name {
			case "Add":
				got = zf.Add(wf)
			case "Mul":
				got = zf.Mul(wf)
			case "Quo":
				got = zf.Quo(wf)
			case "Exp":
				got = zf.Exp()
			case "Log":
				got = zf.Log()
			case "Sqrt":
				got = zf.Sqrt()
			case "Pow":
				got = zf.Pow(wf)
			default:
				continue
			}
			g := C[B]{toB(got.Re), toB(got.Im)}
			if d := distToRect(want, g); d > 4e-15*(1+cmplx.Abs(want)) {
				t.Errorf("F %s(%v, %v) = %v, math/cmplx %v", op.name, z, w, got, want)
			}
		}
	}
}

func TestComplexIdentities(t *testing.T) {
	rng := rand.New(rand.NewSource(13))
	for i := 0; i < 100; i++ {
		p := []uint{53, 128, 512}[i%3]
		z := cB(rng.Float64()*10-5, rng.Float64()*10-5, p)
		w := cB(rng.Float64()*4-2, rng.Float64()*4-2, p)
		if z.crossesCut() {
			continue
		}
		// exp(log z) contains z.
		if e := z.Log().Exp(); !e.Contains(z) {
			t.Errorf("exp(log %v) = %v", z, e)
		}
		// sqrt(z)^2 contains z.
		if s := z.Sqrt().Sqr(); !s.Contains(z) {
			t.Errorf("sqrt(%v)^2 = %v", z, s)
		}
		// |z| e^{i arg z} contains z.
		a := RealC(z.Abs()).Mul(C[B]{NewB(0, p), z.Arg()}.Exp())
		if !a.Contains(z) {
			t.Errorf("|z| e^{i arg z} = %v, z = %v", a, z)
		}
		// (z / w) w contains z.
		if q := z.Quo(w).Mul(w); !q.Contains(z) {
			t.Errorf("(z/w)w = %v, z = %v", q, z)
		}
		// z^2 via Pow contains z*z, and z^(1/2) meets sqrt z.
		two := cB(2, 0, p)
		if pw, sq := z.Pow(two), z.Sqr(); pw.Re.Less(sq.Re) || sq.Re.Less(pw.Re) || pw.Im.Less(sq.Im) || sq.Im.Less(pw.Im) {
			t.Errorf("z^2 = %v vs z*z = %v", pw, sq)
		}
		// Width shrinks with precision: exp and log at p and 4p.
		z4 := C[B]{z.Re.WithPrec(4 * p), z.Im.WithPrec(4 * p)}
		for name, f := range map[string]func(C[B]) C[B]{"Exp": C[B].Exp, "Log": C[B].Log} {
			lo, hi := f(z), f(z4)
			if !lo.Contains(hi) || hi.Re.Rad() > lo.Re.Rad()*math.Ldexp(1, -int(p)) && hi.Re.Rad() > 0 {
				t.Errorf("%s(%v): %v at %d bits, %v at %d bits", name, z, lo, p, hi, 4*p)
			}
		}
	}
}

func TestComplexAbsTight(t *testing.T) {
	// Over [1, 2] x [1, 2] the modulus ranges over [sqrt 2, sqrt 8]; over
	// [-1, 2] x [3, 4] over [3, sqrt 20].
	p := uint(128)
	z := NewC(NewB(1, p).Hull(NewB(2, p)), NewB(1, p).Hull(NewB(2, p)))
	a := z.Abs()
	want := NewB(2, p).Sqrt().Hull(NewB(8, p).Sqrt())
	if !a.Contains(want) || a.Rad()-want.Rad() > 1e-35 {
		t.Errorf("|[1,2]x[1,2]| = %v, want %v", a, want)
	}
	z = NewC(NewB(-1, p).Hull(NewB(2, p)), NewB(3, p).Hull(NewB(4, p)))
	want = NewB(3, p).Hull(NewB(20, p).Sqrt())
	if a := z.Abs(); !a.Contains(want) || a.Rad()-want.Rad() > 1e-35 {
		t.Errorf("|[-1,2]x[3,4]| = %v, want %v", a, want)
	}
}

func TestComplexDomain(t *testing.T) {
	p := uint(128)
	hull := func(a, b float64) B { return NewB(a, p).Hull(NewB(b, p)) }
	zero := NewC(hull(-1, 1), hull(-1, 1))
	cut := NewC(hull(-5, -3), hull(-0.5, 0.5))
	touch := NewC(hull(-3, -2), hull(0, 0.5))
	one := cB(1, 0, p)
	if q := one.Quo(zero); q.Re.IsFinite() || q.Im.IsFinite() {
		t.Errorf("1 / rectangle around 0 = %v, want Whole parts", q)
	}
	if l := zero.Log(); l.Re.IsFinite() || l.Im.IsFinite() {
		t.Errorf("log of rectangle around 0 = %v, want Whole parts", l)
	}
	for _, z := range []C[B]{cut, touch, cB(-2, 0, p)} {
		if z.Arg().IsFinite() {
			t.Errorf("Arg on the cut %v = %v, want Whole", z, z.Arg())
		}
		l := z.Log()
		if !l.Re.IsFinite() || l.Im.IsFinite() {
			t.Errorf("log on the cut %v = %v, want finite Re, Whole Im", z, l)
		}
		if pw := z.Pow(cB(0.5, 0, p)); pw.IsFinite() {
			t.Errorf("pow on the cut %v = %v, want Whole", z, pw)
		}
	}
	// Sqrt is continuous in Re across the cut and its Im covers both sides:
	// sqrt(-4 +- i0) = +-2i, principal value +2i on the axis.
	s := cut.Sqrt()
	for _, v := range []C[B]{cB(0, 2, p), cB(0, -2, p), cB(0, math.Sqrt(3), p)} {
		if !s.Contains(v) {
			t.Errorf("sqrt(%v) = %v misses %v", cut, s, v)
		}
	}
	if s := cB(-4, 0, p).Sqrt(); !s.Contains(cB(0, 2, p)) || s.Im.Sign() != 1 {
		t.Errorf("sqrt(-4) = %v, want 2i", s)
	}
	if s := cB(0, 0, p).Sqrt(); !s.Contains(cB(0, 0, p)) || !s.IsFinite() {
		t.Errorf("sqrt(0) = %v", s)
	}
	w := wholeB(p)
	if e := NewC(w, NewB(0, p)).Exp(); e.IsFinite() {
		t.Errorf("exp of unbounded = %v", e)
	}
}
