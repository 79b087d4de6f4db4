package main

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"math/big"
	"path/filepath"

	"github.com/spf13/pflag"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
)

func init() {
	register("plot", "plot a relaxation certificate: the cells' enclosures of the extreme eigenvalue of M(s) against s, with the proved bound", runPlot)
}

func runPlot(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("plot", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	var img plotFiles
	img.add(fs, "the plot")
	from := fs.Float64("from", -24, "smallest s shown (clipped to the cover)")
	to := fs.Float64("to", 24, "largest s shown (clipped to the cover)")
	addQuiet(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound plot [--from S] [--to S] (--svg FILE | --png FILE | --pdf FILE)... CERTIFICATE.json")
		fmt.Fprintln(stderr, "For the advantage A(alpha) with the certified bracket of the backflow constant, see \"wedgebound sweep --bound-certificate\".")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound plot: %v (see --help)\n", err)
		return 2
	}
	fail := func(code int, format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound plot: "+format+"\n", a...)
		return code
	}
	switch {
	case fs.NArg() != 1:
		return fail(2, "give exactly one certificate file")
	case !img.any():
		return fail(2, "give at least one of --svg, --png and --pdf")
	case !finite(*from) || !finite(*to) || !(*from < *to):
		return fail(2, "--from %g and --to %g: want finite numbers with from < to", *from, *to)
	}
	if err := img.check(); err != nil {
		return fail(2, "%v", err)
	}
	it, err := readReportItem(fs.Arg(0))
	if err != nil {
		return fail(2, "%s: %s", fs.Arg(0), oneLineText(err.Error()))
	}
	if it.rel == nil {
		return fail(2, "%s is a %s certificate; this command plots relaxation certificates (for the strip, see wedgebound sweep)", fs.Arg(0), it.cert.Kind)
	}
	p, leg, err := certificatePlot(it, *from, *to)
	if err != nil {
		return fail(2, "%v", err)
	}
	if err := img.write(p, leg, 8*vg.Inch, 5.5*vg.Inch); err != nil {
		return fail(2, "%v", err)
	}
	fmt.Fprintf(stdout, "plotted %s on s in [%g, %g]\n", fs.Arg(0), math.Max(*from, ratF(it.rel.Cover[0].Lo)), math.Min(*to, ratF(it.rel.Cover[len(it.rel.Cover)-1].Hi)))
	return 0
}

// ratF is a validated decimal as the nearest float64 (for drawing only).
func ratF(s exact) float64 {
	f, _ := rat(s).Float64()
	return f
}

// certificatePlot draws every recorded cell in [from, to] as a box: its s
// range by its recorded enclosure [eig_lower, eig_upper] of lambda_min(M(s))
// (edge lower) or lambda_max(M(s)) (edge upper), and the proved bound as a
// line (-bound for edge lower). The boxes are the certificate's numbers,
// drawn as recorded (nothing is recomputed; wedgecheck does that).
func certificatePlot(it reportItem, from, to float64) (*plot.Plot, plot.Legend, error) {
	r := it.rel
	upper := r.Claim.Edge == "upper"
	eig := "lambda_min(M(s))"
	if upper {
		eig = "lambda_max(M(s))"
	}
	p := plot.New()
	p.Title.Text = fmt.Sprintf("%s: recorded enclosures of %s", filepath.Base(it.file), eig)
	p.X.Label.Text = "s (Mellin variable)"
	p.Y.Label.Text = eig
	lo, hi := math.Max(from, ratF(r.Cover[0].Lo)), math.Min(to, ratF(r.Cover[len(r.Cover)-1].Hi))
	if !(lo < hi) {
		return nil, plot.Legend{}, fmt.Errorf("[%g, %g] does not meet the cover [%s, %s]", from, to, r.Cover[0].Lo, r.Cover[len(r.Cover)-1].Hi)
	}
	boxColor := color.NRGBA{R: 40, G: 90, B: 200, A: 140}
	var first *plotter.Polygon
	n := 0
	ymin, ymax := math.Inf(1), math.Inf(-1)
	for _, c := range r.Cover {
		a, b := ratF(c.Lo), ratF(c.Hi)
		if b < lo || a > hi {
			continue
		}
		y0, y1 := ratF(c.EigLower), ratF(c.EigUpper)
		ymin, ymax = math.Min(ymin, y0), math.Max(ymax, y1)
		poly, err := plotter.NewPolygon(plotter.XYs{{X: a, Y: y0}, {X: b, Y: y0}, {X: b, Y: y1}, {X: a, Y: y1}})
		if err != nil {
			return nil, plot.Legend{}, err
		}
		poly.Color = boxColor
		poly.LineStyle.Color = color.NRGBA{R: 20, G: 50, B: 140, A: 255}
		poly.LineStyle.Width = vg.Points(0.3)
		p.Add(poly)
		if first == nil {
			first = poly
		}
		n++
	}
	bound := rat(r.Claim.Bound)
	if !upper {
		bound = new(big.Rat).Neg(bound)
	}
	bf, _ := bound.Float64()
	line, err := plotter.NewLine(hrule(lo, hi, bf))
	if err != nil {
		return nil, plot.Legend{}, err
	}
	line.Color = color.RGBA{R: 200, A: 255}
	line.Width = vg.Points(1.2)
	p.Add(line, plotter.NewGrid())
	ymin, ymax = math.Min(ymin, bf), math.Max(ymax, bf)
	pad := 0.05 * (ymax - ymin)
	p.X.Min, p.X.Max = lo, hi
	p.Y.Min, p.Y.Max = ymin-pad, ymax+pad
	leg := plot.NewLegend()
	if first != nil {
		leg.Add(fmt.Sprintf("%d recorded cells in view (of %d): s range by enclosure of %s", n, len(r.Cover), eig), first)
	}
	rel := ">="
	if upper {
		rel = "<="
	}
	leg.Add(fmt.Sprintf("proved: %s %s %s for every real s (tails beyond the cover by lemma)", eig, rel, boundSigned(r)), line)
	return p, leg, nil
}
