package witness

import (
	"bytes"
	"fmt"
	"math"
	"math/big"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"wedgebound/certificates"
)

// The exports below are float64 evaluations for display, not proved
// numbers. Units: hbar = m = 1 and a time window [-2, 2], for which the
// scaled momentum u equals the momentum k; the position density is taken at
// the middle of the window, t = 0.

// Amplitude evaluates phi(k) = sum_j c_j f_j(k) in float64.
func Amplitude(basis []Func, coef []*big.Rat, k float64) float64 {
	s := 0.0
	for j, f := range basis {
		c, _ := coef[j].Float64()
		b, _ := f.Width.Float64()
		v := c * math.Pow(k, float64(f.Power)) * math.Exp(-b*k*k)
		switch f.Chirp {
		case Cos:
			v *= math.Cos(k * k)
		case Sin:
			v *= math.Sin(k * k)
		}
		s += v
	}
	return s
}

// Position evaluates psi(x) = (2 pi)^(-1/2) int_0^K phi(k) e^{i k x} dk in
// float64 for each x, with K = 60 (the tail beyond carries a small part of
// the norm; display only) by Simpson's rule with step 0.002, which resolves
// the chirp e^{i k^2} there.
func Position(basis []Func, coef []*big.Rat, xs []float64) []complex128 {
	const K, h = 60.0, 0.002
	n := int(K / h)
	phi := make([]float64, n+1)
	for i := range phi {
		w := 2.0
		if i%2 == 1 {
			w = 4
		}
		if i == 0 || i == n {
			w = 1
		}
		phi[i] = w * h / 3 * Amplitude(basis, coef, h*float64(i))
	}
	out := make([]complex128, len(xs))
	for j, x := range xs {
		var s complex128
		for i, v := range phi {
			sn, cs := math.Sincos(h * float64(i) * x)
			s += complex(v*cs, v*sn)
		}
		out[j] = s / complex(math.Sqrt(2*math.Pi), 0)
	}
	return out
}

// CSV returns two tables in one file: the momentum amplitude phi(k) for k in
// [0, 20] and the position density |psi(x)|^2 at t = 0 for x in [-10, 10]
// (momenta above 60 left out).
func CSV(basis []Func, coef []*big.Rat) []byte {
	var b bytes.Buffer
	fmt.Fprintln(&b, "# witness state (float64 evaluation, not proved); hbar = m = 1, time window [-2, 2]")
	fmt.Fprintln(&b, "table,k_or_x,value")
	for i := 0; i <= 2000; i++ {
		k := float64(i) / 100
		fmt.Fprintf(&b, "amplitude,%.2f,%.10g\n", k, Amplitude(basis, coef, k))
	}
	var xs []float64
	for i := 0; i <= 400; i++ {
		xs = append(xs, -10+0.05*float64(i))
	}
	for i, p := range Position(basis, coef, xs) {
		fmt.Fprintf(&b, "density,%.2f,%.10g\n", xs[i], real(p)*real(p)+imag(p)*imag(p))
	}
	return b.Bytes()
}

type wgrid struct {
	xs, ps []float64
	z      [][]float64 // z[row p][col x]
}

func (g *wgrid) Dims() (int, int)   { return len(g.xs), len(g.ps) }
func (g *wgrid) Z(c, r int) float64 { return g.z[r][c] }
func (g *wgrid) X(c int) float64    { return g.xs[c] }
func (g *wgrid) Y(r int) float64    { return g.ps[r] }

// Wigner samples W(x, p) = (1/2pi) int phi(p + q/2) phi(p - q/2) e^{-i q x} dq
// (phi real, zero for negative momenta) on x in [-6, 6], p in (0, 4] by the
// trapezoid rule on a momentum grid of step 0.01.
func Wigner(basis []Func, coef []*big.Rat) ([]float64, []float64, [][]float64) {
	const h = 0.01
	n := 800 // phi on [0, 8]
	phi := make([]float64, n+1)
	for i := range phi {
		phi[i] = Amplitude(basis, coef, h*float64(i))
	}
	var xs, ps []float64
	for i := 0; i <= 240; i++ {
		xs = append(xs, -6+0.05*float64(i))
	}
	for i := 2; i <= 400; i += 2 {
		ps = append(ps, h*float64(i))
	}
	z := make([][]float64, len(ps))
	for r, p := range ps {
		i := int(math.Round(p / h))
		z[r] = make([]float64, len(xs))
		for c, x := range xs {
			s := 0.0
			for j := -i; j <= i && i+j <= n; j++ {
				s += phi[i+j] * phi[i-j] * math.Cos(2*float64(j)*h*x)
			}
			z[r][c] = s * 2 * h / (2 * math.Pi)
		}
	}
	return xs, ps, z
}

// CheckPlotName rejects file names whose format the plot cannot be written in.
func CheckPlotName(name string) error {
	switch strings.ToLower(filepath.Ext(name)) {
	case ".png", ".svg", ".pdf":
		return nil
	}
	return fmt.Errorf("%q: the Wigner plot is written as .png, .svg or .pdf", name)
}

// WignerPlot writes a heat map of the witness's Wigner function.
func WignerPlot(name string, basis []Func, coef []*big.Rat) error {
	if err := CheckPlotName(name); err != nil {
		return err
	}
	xs, ps, z := Wigner(basis, coef)
	g := &wgrid{xs, ps, z}
	mx := 0.0
	for _, row := range z {
		for _, v := range row {
			mx = math.Max(mx, math.Abs(v))
		}
	}
	pal := moreland.SmoothBlueRed()
	pal.SetMin(-mx)
	pal.SetMax(mx)
	hm := plotter.NewHeatMap(g, pal.Palette(255))
	hm.Min, hm.Max = -mx, mx
	p := plot.New()
	p.Title.Text = "Wigner function of the witness state (t = 0; float64, not proved)"
	p.X.Label.Text = "position x"
	p.Y.Label.Text = "momentum p"
	p.Add(hm)
	wt, err := p.WriterTo(7*vg.Inch, 5*vg.Inch, strings.TrimPrefix(strings.ToLower(filepath.Ext(name)), "."))
	if err != nil {
		return err
	}
	var b bytes.Buffer
	if _, err := wt.WriteTo(&b); err != nil {
		return err
	}
	return certificates.WriteAtomic(name, b.Bytes())
}
