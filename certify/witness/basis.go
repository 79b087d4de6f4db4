package witness

import (
	"fmt"
	"math"
	"math/big"
	"math/cmplx"

	"wedgebound/interval"
)

// Chirp is the oscillating factor of a basis function.
type Chirp int

// The three chirps: none, cos(u^2) and sin(u^2).
const (
	Plain Chirp = iota
	Cos
	Sin
)

// String returns the name used in certificates.
func (c Chirp) String() string {
	switch c {
	case Plain:
		return "plain"
	case Cos:
		return "cos"
	case Sin:
		return "sin"
	}
	return fmt.Sprintf("chirp(%d)", int(c))
}

// ParseChirp reads a chirp name.
func ParseChirp(s string) (Chirp, error) {
	switch s {
	case "plain":
		return Plain, nil
	case "cos":
		return Cos, nil
	case "sin":
		return Sin, nil
	}
	return 0, fmt.Errorf("unknown chirp %q (plain, cos or sin)", s)
}

// Func is one basis function of the momentum amplitude in scaled units,
//
//	f(u) = u^Power exp(-Width u^2) * {1, cos(u^2), sin(u^2)}   (u > 0),
//
// with an exact rational Width > 0.
type Func struct {
	Chirp Chirp
	Power int
	Width *big.Rat
}

// term is one complex Gaussian w u^m exp(-c u^2) with c = b + i omega; a
// Func is a sum of one or two of them. w is one of 1, 1/2, -i/2, i/2.
type term struct {
	fn    int // index of the Func
	wRe   int // w = (wRe + i wIm)/2
	wIm   int
	m     int
	b     *big.Rat
	omega int
}

// terms expands a basis into complex Gaussians:
// cos(u^2) e^{-b u^2} = (e^{-(b-i)u^2} + e^{-(b+i)u^2})/2 and
// sin(u^2) e^{-b u^2} = (-i/2) e^{-(b-i)u^2} + (i/2) e^{-(b+i)u^2}.
func terms(basis []Func) []term {
	var out []term
	for k, f := range basis {
		switch f.Chirp {
		case Plain:
			out = append(out, term{k, 2, 0, f.Power, f.Width, 0})
		case Cos:
			out = append(out, term{k, 1, 0, f.Power, f.Width, -1}, term{k, 1, 0, f.Power, f.Width, 1})
		case Sin:
			out = append(out, term{k, 0, -1, f.Power, f.Width, -1}, term{k, 0, 1, f.Power, f.Width, 1})
		}
	}
	return out
}

// momentF returns int_0^inf u^n exp(-c u^2) du = Gamma((n+1)/2) / (2 c^((n+1)/2))
// (principal power, Re c > 0) in float64.
func momentF(n int, c complex128) complex128 {
	a := float64(n+1) / 2
	return complex(math.Gamma(a)/2, 0) * cmplx.Pow(c, complex(-a, 0))
}

// halfGamma encloses Gamma(k/2)/2 for k >= 1.
func halfGamma(k int) interval.F {
	one := interval.PointF(1)
	var g interval.F
	if k%2 == 0 {
		g = one
		for j := 1; j < k/2; j++ {
			g = g.Mul(interval.PointF(float64(j)))
		}
	} else {
		g = one.Pi().Sqrt()
		for j := 1; 2*j < k; j++ { // Gamma(j + 1/2) = (j - 1/2) Gamma(j - 1/2)
			g = g.Mul(interval.PointF(float64(2*j - 1))).Scale(-1)
		}
	}
	return g.Scale(-1)
}

// momentI encloses Gamma((n+1)/2) / (2 c^((n+1)/2)) for every c in the
// rectangle (principal branch); it is the moment integral when Re c > 0 and
// its analytic continuation in c elsewhere off the cut. g is halfGamma(n+1).
func momentI(n int, g interval.F, c interval.C[interval.F]) interval.C[interval.F] {
	k := n + 1
	inv := c.Inv()
	p := interval.RealC(g)
	for j := 0; j < k/2; j++ {
		p = p.Mul(inv)
	}
	if k%2 == 1 {
		p = p.Quo(c.Sqrt())
	}
	return p
}

// ratF encloses an exact rational.
func ratF(r *big.Rat) interval.F {
	f, _ := r.Float64()
	x := interval.PointF(f)
	if new(big.Rat).SetFloat64(f).Cmp(r) == 0 {
		return x
	}
	return interval.NewF(math.Nextafter(f, math.Inf(-1)), math.Nextafter(f, math.Inf(1)))
}
