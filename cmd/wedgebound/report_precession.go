package main

import (
	"fmt"
	"io"
	"math"
	"math/big"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"wedgebound/certificates"
	"wedgebound/certify/precession"
	"wedgebound/interval"
)

func upDec(v float64) string   { return interval.DecimalUp(new(big.Float).SetFloat64(v), 10) }
func downDec(v float64) string { return interval.DecimalDown(new(big.Float).SetFloat64(v), 10) }

func printPrecession(w io.Writer, r *precession.Result) {
	fmt.Fprintf(w, "P3 = sup spec Q3, Q3 = (1/3) sum_k Theta(x cos(2 pi k/3) + p sin(2 pi k/3)) (hbar = m = omega = 1)\n")
	fmt.Fprintf(w, "P3 in [%s, %s]\n", r.Lower, r.Upper)
	for _, p := range r.Proofs {
		fmt.Fprintf(w, "  residue %d: sup spec <= %s (lambda %.12g, epsilon %.3g, cutoff %d, %d exact terms)\n",
			p.Sector.R, upDec(p.Bound.Hi()), p.Lambda, p.Epsilon, p.Cutoff, p.Length)
	}
	wt := r.Witness
	fmt.Fprintf(w, "  witness: %d Fock states of residue %d, <Q3> in [%s, %s]\n", len(wt.X)+len(wt.Y), wt.Sector.R, downDec(wt.Rayleigh.Lo()), upDec(wt.Rayleigh.Hi()))
	fmt.Fprintf(w, "(%.1f s) Meaning: measuring the oscillator's position at one of three times a third of a period apart, chosen at random, some state finds it at x > 0 with probability at least %s (classically at most 2/3), and no state exceeds %s.\n", r.Seconds, r.Lower, r.Upper)
}

// wignerGrid is the Wigner function of the witness on a square grid.
type wignerGrid struct {
	xs []float64
	w  [][]float64 // w[i][j] at (x = xs[i], p = xs[j])
}

func (g *wignerGrid) Dims() (int, int)   { return len(g.xs), len(g.xs) }
func (g *wignerGrid) Z(c, r int) float64 { return g.w[c][r] }
func (g *wignerGrid) X(c int) float64    { return g.xs[c] }
func (g *wignerGrid) Y(r int) float64    { return g.xs[r] }

// plotFock is the largest Fock index the picture uses.
const plotFock = 600

// witnessWave samples psi(x) = sum c_n h_n(x) (n <= plotFock, normalised
// over the kept part) at x = x0 + i h.
func witnessWave(wt *precession.Witness, x0, h float64, n int) []float64 {
	c := make([]float64, plotFock+1)
	s := wt.Sector
	for a, v := range wt.X {
		if m := 2 * (3*a + s.J0); m <= plotFock {
			c[m] = v
		}
	}
	for b, v := range wt.Y {
		if m := 2*(3*b+s.K0) + 1; m <= plotFock {
			c[m] = v
		}
	}
	norm := 0.0
	for _, v := range c {
		norm += v * v
	}
	norm = math.Sqrt(norm)
	psi := make([]float64, n)
	for i := range psi {
		x := x0 + float64(i)*h
		h0 := math.Pow(math.Pi, -0.25) * math.Exp(-x*x/2)
		h1 := math.Sqrt2 * x * h0
		sum := c[0]*h0 + c[1]*h1
		for k := 2; k <= plotFock; k++ {
			h0, h1 = h1, math.Sqrt(2/float64(k))*x*h1-math.Sqrt(float64(k-1)/float64(k))*h0
			sum += c[k] * h1
		}
		psi[i] = sum / norm
	}
	return psi
}

// plotWigner draws W(x, p) = (1/pi) int psi(x+y) psi(x-y) cos(2 p y) dy of
// the witness (its Fock components up to plotFock) as a heat map.
func plotWigner(path string, wt *precession.Witness) error {
	const (
		half = 5.0  // window [-half, half]^2
		ext  = 40.0 // psi sampled on [-ext, ext]
		h    = 0.01
		pts  = 101
	)
	n := int(2*ext/h) + 1
	psi := witnessWave(wt, -ext, h, n)
	g := &wignerGrid{xs: make([]float64, pts), w: make([][]float64, pts)}
	for i := range g.xs {
		g.xs[i] = -half + 2*half*float64(i)/float64(pts-1)
	}
	for i, x := range g.xs {
		g.w[i] = make([]float64, pts)
		ix := int(math.Round((x + ext) / h))
		for j, p := range g.xs {
			sum := 0.0
			for k := -min(ix, n-1-ix); k <= min(ix, n-1-ix); k++ {
				y := float64(k) * h
				sum += psi[ix+k] * psi[ix-k] * math.Cos(2*p*y)
			}
			g.w[i][j] = sum * h / math.Pi
		}
	}
	lim := 0.0
	for _, row := range g.w {
		for _, v := range row {
			lim = math.Max(lim, math.Abs(v))
		}
	}
	pal := moreland.SmoothBlueRed()
	pal.SetMin(-lim)
	pal.SetMax(lim)
	pl := plot.New()
	pl.Title.Text = fmt.Sprintf("Wigner function of the witness (residue %d, Fock n <= %d)", wt.Sector.R, plotFock)
	pl.X.Label.Text = "x"
	pl.Y.Label.Text = "p"
	hm := plotter.NewHeatMap(g, pal.Palette(255))
	hm.Min, hm.Max = -lim, lim // zero is the middle colour
	pl.Add(hm)
	for k := 0; k < 3; k++ {
		th := 2 * math.Pi * float64(k) / 3
		// the line x cos th + p sin th = 0
		line, _ := plotter.NewLine(plotter.XYs{{X: -half * math.Sin(th), Y: half * math.Cos(th)}, {X: half * math.Sin(th), Y: -half * math.Cos(th)}})
		pl.Add(line)
	}
	pl.X.Min, pl.X.Max, pl.Y.Min, pl.Y.Max = -half, half, -half, half
	return pl.Save(6*vg.Inch, 6*vg.Inch, path)
}

// precessionItem is one precession-bracket certificate to report on.
type precessionItem struct {
	file string
	cert *certificates.Certificate
}

// readPrecessionItems reads the files when the first is a precession-bracket
// certificate (ok true); then all must be.
func readPrecessionItems(paths []string) ([]precessionItem, bool, error) {
	first, err := certificates.ReadFile(paths[0])
	if err != nil || first.Kind != certificates.KindPrecession {
		return nil, false, nil
	}
	items := []precessionItem{{paths[0], first}}
	for _, p := range paths[1:] {
		c, err := certificates.ReadFile(p)
		if err != nil {
			return nil, true, fmt.Errorf("%s: %v", p, err)
		}
		if c.Kind != certificates.KindPrecession {
			return nil, true, fmt.Errorf("%s: kind %q cannot be reported together with %q certificates", p, c.Kind, certificates.KindPrecession)
		}
		items = append(items, precessionItem{p, c})
	}
	return items, true, nil
}

// renderPrecessionReport formats precession certificates as text, a
// Markdown table or a LaTeX tabular.
func renderPrecessionReport(format string, standalone bool, items []precessionItem) string {
	var b strings.Builder
	switch format {
	case formatMarkdown:
		b.WriteString("| Certificate | P3 lower | P3 upper | Width | Witness states | Lemma (cutoff, terms) | SHA-256 |\n")
		b.WriteString("|---|---|---|---|---|---|---|\n")
		for _, it := range items {
			p := it.cert.Precession
			fmt.Fprintf(&b, "| %s | %s | %s | %s | %d | %d, %d | `%s` |\n", mdEscape(it.file), p.Lower, p.Upper, precessionWidth(p),
				len(p.Witness.Even)+len(p.Witness.Odd), p.Sectors[0].Cutoff, p.Sectors[0].SumLength, it.cert.SHA256[:12])
		}
	case formatLaTeX:
		if standalone {
			b.WriteString("\\documentclass{article}\n\\begin{document}\n\\begin{table}[ht]\n\\centering\n")
		}
		b.WriteString("\\begin{tabular}{llllll}\n\\hline\n")
		b.WriteString("$P_3 \\ge$ & $P_3 \\le$ & Width & Witness states & Lemma (cutoff, terms) & SHA-256 \\\\\n\\hline\n")
		for _, it := range items {
			p := it.cert.Precession
			fmt.Fprintf(&b, "%s & %s & %s & %d & %d, %d & \\texttt{%s} \\\\\n\\hline\n", p.Lower, p.Upper, precessionWidth(p),
				len(p.Witness.Even)+len(p.Witness.Odd), p.Sectors[0].Cutoff, p.Sectors[0].SumLength, it.cert.SHA256[:12])
		}
		b.WriteString("\\end{tabular}\n")
		if standalone {
			b.WriteString("\\caption{Certified brackets of $P_3 = \\sup\\sigma(Q_3)$, $Q_3 = \\frac13\\sum_{k=0}^{2}\\Theta(x\\cos\\frac{2\\pi k}{3} + p\\sin\\frac{2\\pi k}{3})$ " +
				"($\\hbar = m = \\omega = 1$). Lower bounds are Rayleigh quotients of witness states; upper bounds come from a norm lemma in each residue class of the Fock index mod 3. " +
				"Every bracket can be re-checked with \\texttt{wedgecheck}.}\n\\end{table}\n\\end{document}\n")
		}
	default:
		for i, it := range items {
			if i > 0 {
				b.WriteString("\n")
			}
			p := it.cert.Precession
			fmt.Fprintf(&b, "%s (sha256 %s...)\n", it.file, it.cert.SHA256[:12])
			fmt.Fprintf(&b, "  problem: %s\n", p.Problem)
			fmt.Fprintf(&b, "  proved:  %s <= P3 <= %s (width %s)\n", p.Lower, p.Upper, precessionWidth(p))
			fmt.Fprintf(&b, "  lower:   witness of %d Fock states in residue %d, <Q3> in [%s, %s]\n",
				len(p.Witness.Even)+len(p.Witness.Odd), p.Witness.Residue, p.Witness.Rayleigh.Lower, p.Witness.Rayleigh.Upper)
			for _, s := range p.Sectors {
				fmt.Fprintf(&b, "  upper:   residue %d: sup spec <= %s (cutoff %d, %d exact terms, lambda %s, epsilon %s)\n",
					s.Residue, s.NormBound, s.Cutoff, s.SumLength, s.Lambda, s.Epsilon)
			}
			fmt.Fprintf(&b, "  errors:  tail of H <= %s, lemma margin >= %s, matrix-vector rounding <= %s\n", p.Errors.TailH, p.Errors.Margin, p.Errors.MatVecError)
		}
	}
	return b.String()
}

// precessionWidth is Upper - Lower, rounded up to 3 significant digits.
func precessionWidth(p *certificates.Precession) string {
	w := new(big.Rat).Sub(rat(p.Upper), rat(p.Lower))
	f, _ := new(big.Float).SetPrec(200).SetRat(w).Float64()
	return interval.DecimalUp(new(big.Float).SetFloat64(f*(1+1e-15)), 3)
}
