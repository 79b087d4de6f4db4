package main

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"image/color"
	"io"
	"math"
	"math/big"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/spf13/pflag"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"wedgebound/certificates"
	"wedgebound/certify/matched"
	"wedgebound/certify/strip"
)

func init() {
	register("sweep", "certified strip brackets over a log-spaced alpha range, as CSV and an SVG plot", runSweep)
}

// publishedBackflowEstimate is the (not rigorous) numerical estimate of the
// backflow constant by A. J. Bracken and G. F. Melloy, J. Phys. A 27 (1994)
// 2197; the plot draws it only as a dashed reference line.
const publishedBackflowEstimate = 0.0384517

// sweepPoint is one certified row of a sweep.
type sweepPoint struct {
	alpha string
	x     float64
	res   *strip.Result
	// mLower and mUpper bracket the matched advantage M(alpha) (--matched
	// only; empty otherwise).
	mLower, mUpper string
	mLo, mHi       float64
}

func runSweep(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("sweep", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	from := fs.Float64("from", 1, "smallest alpha")
	to := fs.Float64("to", 1000, "largest alpha")
	points := fs.Int("points", 13, "number of log-spaced alpha values (each rounded to 6 significant digits)")
	csvFile := fs.String("csv", "", "write the brackets as CSV to this file")
	var img plotFiles
	img.add(fs, "a plot of the advantage bracket against alpha")
	quiet := addQuiet(fs)
	withMatched := fs.Bool("matched", false, "also bracket the matched advantage M(alpha) at each alpha (alpha <= 400; minutes per point at large alpha) and draw it")
	boundFile := fs.String("bound-certificate", "", "a halfplane-relaxation certificate for the backflow geometry (edge lower); its claimed bound on the backflow constant is drawn as the certified upper band (read, not verified: check it with wedgecheck)")
	var in stripInput
	in.add(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound sweep --from A --to B --points N [--csv FILE] [--svg FILE] [--png FILE] [--pdf FILE] [--bound-certificate FILE] [--tolerance W] [--workers N] [--quiet]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound sweep: %v (see --help)\n", err)
		return 2
	}
	fail := func(format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound sweep: "+format+"\n", a...)
		return 2
	}
	switch {
	case fs.NArg() > 0:
		return fail("unexpected argument %q", fs.Arg(0))
	case !(*from > 0) || math.IsInf(*from, 0):
		return fail("--from %g must be a positive number", *from)
	case !(*to >= *from) || math.IsInf(*to, 0):
		return fail("--to %g must be a number at least --from", *to)
	case *points < 1 || *points > 10000:
		return fail("--points %d is outside 1..10000", *points)
	case *points == 1 && *to != *from:
		return fail("--points 1 needs --to equal to --from")
	}
	if err := in.check(); err != nil {
		return fail("%v", err)
	}
	if err := checkOutput("--csv", *csvFile); err != nil {
		return fail("%v", err)
	}
	if err := img.check(); err != nil {
		return fail("%v", err)
	}
	alphas, err := sweepAlphas(*from, *to, *points)
	if err != nil {
		return fail("%v", err)
	}
	var ub *backflowBound
	if *boundFile != "" {
		if ub, err = readBoundCertificate(*boundFile); err != nil {
			return fail("--bound-certificate: %v", err)
		}
	}
	bar := newProgress(stderr, *quiet)
	var rows []sweepPoint
	for i, s := range alphas {
		bar.update("alpha="+s, i, len(alphas))
		a, err := strip.ParseAlpha(s)
		if err != nil {
			return fail("%v", err)
		}
		res, err := strip.Compute(a, in.options())
		if err != nil {
			bar.done()
			if errors.Is(err, strip.ErrRange) {
				return fail("alpha %s: %v", s, err)
			}
			fmt.Fprintf(stderr, "wedgebound sweep: alpha %s: %v\n", s, err)
			return 1
		}
		x := a.Enclosure().Mid().Lo() // the plot's abscissa (the number is exact in alpha)
		pt := sweepPoint{alpha: s, x: x, res: res}
		if *withMatched {
			mr, err := matched.Compute(a, matched.Options{})
			var mc *certificates.Certificate
			if err == nil {
				mc, err = mr.Certificate()
			}
			if err != nil {
				bar.done()
				if errors.Is(err, matched.ErrRange) {
					return fail("alpha %s: %v", s, err)
				}
				fmt.Fprintf(stderr, "wedgebound sweep: alpha %s: %v\n", s, err)
				return 1
			}
			pt.mLower, pt.mUpper = mc.Matched.Lower.String(), mc.Matched.Upper.String()
			// The plot's points: the nearest float64 of each exact end.
			pt.mLo, _ = mc.Matched.Lower.Rat().Float64()
			pt.mHi, _ = mc.Matched.Upper.Rat().Float64()
		}
		rows = append(rows, pt)
	}
	bar.update("sweep", len(alphas), len(alphas))
	bar.done()

	table := sweepCSV(rows)
	if *csvFile != "" {
		if err := certificates.WriteAtomic(*csvFile, table); err != nil {
			return fail("%v", err)
		}
	}
	if img.any() {
		p, leg, err := sweepPlot(rows, ub)
		if err == nil {
			err = img.write(p, leg, 8*vg.Inch, 5.5*vg.Inch)
		}
		if err != nil {
			return fail("%v", err)
		}
	}
	if *csvFile == "" && !img.any() {
		stdout.Write(table)
	}
	best := bestLower(rows)
	fmt.Fprintf(stdout, "best certified lower bound for the backflow constant: c_bm >= %s (advantage at alpha = %s)\n",
		best.res.Advantage.Lower, best.alpha)
	if ub != nil {
		fmt.Fprintf(stdout, "certified upper bound read from %s: c_bm <= %s (%s)\n", ub.file, ub.bound, ub.what)
		lo, err := certificates.ParseDecimal(best.res.Advantage.Lower)
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound sweep: the advantage's lower end: %v\n", err)
			return 1
		}
		if lo.Cmp(ub.rat) > 0 {
			fmt.Fprintf(stderr, "wedgebound sweep: the certified lower bound %s exceeds the bound %s read from %s, so one of the two is wrong\n", best.res.Advantage.Lower, ub.bound, ub.file)
			return 1
		}
	}
	return 0
}

// backflowBound is an upper bound on the backflow constant read from a
// halfplane-relaxation certificate.
type backflowBound struct {
	file  string
	bound string   // claim.bound as written
	rat   *big.Rat // its exact value
	value float64  // rounded up, for drawing
	what  string   // what it bounds, in words
}

// readBoundCertificate reads a halfplane-relaxation certificate strictly
// (schema and hash) and returns its claimed bound when the problem is the
// backflow geometry: edge lower, and a normal form with d = 0 and a b > 0
// (the vertex on the boundary of the half-plane, strictly inside neither
// ray's line), the class that the regions package doc shows equivalent to the
// backflow problem and to the projectile problem's limit; then -inf spec of
// the compressed wedge operator is the backflow constant c_bm, so the claim
// bounds c_bm and hence A(alpha) for every alpha. The claim itself is not
// verified here.
func readBoundCertificate(path string) (*backflowBound, error) {
	c, err := certificates.ReadFile(path)
	if err != nil {
		return nil, err
	}
	if c.Kind != certificates.KindRelaxation || c.Relaxation == nil {
		return nil, fmt.Errorf("%s is a %q certificate, not a %q one", path, c.Kind, certificates.KindRelaxation)
	}
	rel := c.Relaxation
	if rel.Shard != nil {
		return nil, fmt.Errorf("%s is a partial (shard) certificate; join the shards with wedgebound merge", path)
	}
	if rel.Claim.Edge != "lower" || rel.Problem.Edge != "lower" {
		return nil, fmt.Errorf("%s bounds the %q edge; a bound on the backflow constant needs edge lower", path, rel.Claim.Edge)
	}
	a, b, d := rel.Normal.A.Rat(), rel.Normal.B.Rat(), rel.Normal.D.Rat()
	if d.Sign() != 0 || new(big.Rat).Mul(a, b).Sign() <= 0 {
		return nil, fmt.Errorf("%s is not the backflow geometry (its normal form has d = %s, a b = %s; the backflow and projectile problems have d = 0 and a b > 0)", path, rel.Normal.D, new(big.Rat).Mul(a, b).RatString())
	}
	v := rel.Claim.Bound.Rat()
	if v.Sign() <= 0 {
		return nil, fmt.Errorf("%s claims the bound %s, which is not positive", path, rel.Claim.Bound)
	}
	f, _ := new(big.Float).SetMode(big.ToPositiveInf).SetPrec(53).SetRat(v).Float64()
	return &backflowBound{file: path, bound: rel.Claim.Bound.String(), rat: v, value: f,
		what: "the claim of a halfplane-relaxation certificate for the backflow geometry, which bounds the backflow constant and so A(alpha) for every alpha; read, not verified here: run wedgecheck on it"}, nil
}

// sweepAlphas returns points log-spaced values from lo to hi, each rounded
// to 6 significant digits so that every row is reproducible with
// "wedgebound strip --alpha".
func sweepAlphas(lo, hi float64, points int) ([]string, error) {
	out := make([]string, 0, points)
	seen := map[string]bool{}
	for i := 0; i < points; i++ {
		v := lo
		if points > 1 {
			v = lo * math.Pow(hi/lo, float64(i)/float64(points-1))
		}
		s := strconv.FormatFloat(v, 'g', 6, 64)
		if seen[s] {
			continue
		}
		seen[s] = true
		out = append(out, s)
	}
	return out, nil
}

func bestLower(rows []sweepPoint) sweepPoint {
	best := rows[0]
	for _, r := range rows[1:] {
		if r.res.AdvantageF.Lo() > best.res.AdvantageF.Lo() {
			best = r
		}
	}
	return best
}

// sweepCSV writes one row per alpha with the directed decimal brackets.
func sweepCSV(rows []sweepPoint) []byte {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	head := []string{"alpha", "basis_size", "quadrature_nodes", "advantage_lower", "advantage_upper", "deficit_lower", "deficit_upper"}
	withM := len(rows) > 0 && rows[0].mLower != ""
	if withM {
		head = append(head, "matched_lower", "matched_upper")
	}
	w.Write(head)
	for _, r := range rows {
		rec := []string{r.alpha, strconv.Itoa(r.res.BasisSize), strconv.Itoa(r.res.QuadratureNodes),
			r.res.Advantage.Lower, r.res.Advantage.Upper, r.res.Deficit.Lower, r.res.Deficit.Upper}
		if withM {
			rec = append(rec, r.mLower, r.mUpper)
		}
		w.Write(rec)
	}
	w.Flush()
	return b.Bytes()
}

// sweepPlot plots the advantage bracket against alpha on a log axis, with
// the best certified lower bound for the backflow constant as a band that
// reaches up to the published estimate (dashed; not a certified value),
// and, when ub is given, the certified upper bound as a second band that
// reaches down to the estimate. The legend is returned apart, to be drawn
// below the axes (renderPlot); it states the bracket widths, which are far
// too small to see.
func sweepPlot(rows []sweepPoint, ub *backflowBound) (*plot.Plot, plot.Legend, error) {
	p := plot.New()
	p.Title.Text = "Certified finite-strip advantage A(alpha)"
	p.X.Label.Text = "alpha = m L^2 / (hbar t)"
	p.Y.Label.Text = "A(alpha) = -lambda_min"
	lo := make(plotter.XYs, len(rows))
	hi := make(plotter.XYs, len(rows))
	for i, r := range rows {
		lo[i] = plotter.XY{X: r.x, Y: r.res.AdvantageF.Lo()}
		hi[i] = plotter.XY{X: r.x, Y: r.res.AdvantageF.Hi()}
	}
	xmin, xmax := rows[0].x, rows[len(rows)-1].x
	if xmax <= xmin {
		xmin, xmax = xmin/2, xmax*2
	}
	best := bestLower(rows)
	bl := best.res.AdvantageF.Lo()
	band, err := plotter.NewPolygon(plotter.XYs{{X: xmin, Y: bl}, {X: xmax, Y: bl}, {X: xmax, Y: publishedBackflowEstimate}, {X: xmin, Y: publishedBackflowEstimate}})
	if err != nil {
		return nil, plot.Legend{}, err
	}
	band.Color = color.NRGBA{R: 120, G: 170, B: 230, A: 110}
	band.LineStyle.Width = 0
	lower, err := plotter.NewLine(hrule(xmin, xmax, bl))
	if err != nil {
		return nil, plot.Legend{}, err
	}
	lower.Color = color.RGBA{B: 180, A: 255}
	ref, err := plotter.NewLine(hrule(xmin, xmax, publishedBackflowEstimate))
	if err != nil {
		return nil, plot.Legend{}, err
	}
	ref.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
	ref.Color = color.Gray{Y: 90}
	upLine, upPts, err := plotter.NewLinePoints(hi)
	if err != nil {
		return nil, plot.Legend{}, err
	}
	loLine, loPts, err := plotter.NewLinePoints(lo)
	if err != nil {
		return nil, plot.Legend{}, err
	}
	upLine.Color, loLine.Color = color.RGBA{R: 200, A: 255}, color.RGBA{R: 200, A: 255}
	upPts.Shape, loPts.Shape = draw.PyramidGlyph{}, draw.CircleGlyph{}
	upPts.Color, loPts.Color = color.RGBA{R: 200, A: 255}, color.RGBA{R: 200, A: 255}
	p.Add(band, lower, ref, upLine, loLine, upPts, loPts, plotter.NewGrid())
	wmin, wmax := math.Inf(1), 0.0
	for _, r := range rows {
		wd := r.res.AdvantageF.Hi() - r.res.AdvantageF.Lo()
		wmin, wmax = math.Min(wmin, wd), math.Max(wmax, wd)
	}
	p.Legend.Add(fmt.Sprintf("certified bracket of A(alpha): upper ▲, lower ● (widths %.1e to %.1e, too narrow to see)", wmin, wmax), upLine, upPts)
	p.Legend.Add(fmt.Sprintf("certified c_bm >= %s (alpha = %s); band up to the estimate", trimDigits(best.res.Advantage.Lower, 8), best.alpha), band, lower)
	ymax := 0.042
	if ub != nil {
		from := publishedBackflowEstimate
		if ub.value < from {
			from = bl
		}
		uband, err := plotter.NewPolygon(plotter.XYs{{X: xmin, Y: from}, {X: xmax, Y: from}, {X: xmax, Y: ub.value}, {X: xmin, Y: ub.value}})
		if err != nil {
			return nil, plot.Legend{}, err
		}
		uband.Color = color.NRGBA{R: 230, G: 170, B: 90, A: 110}
		uband.LineStyle.Width = 0
		uline, err := plotter.NewLine(hrule(xmin, xmax, ub.value))
		if err != nil {
			return nil, plot.Legend{}, err
		}
		uline.Color = color.RGBA{R: 170, G: 90, A: 255}
		p.Add(uband, uline)
		p.Legend.Add(fmt.Sprintf("certified c_bm <= %s (%s, read, not verified); band down to the estimate", ub.bound, filepath.Base(ub.file)), uband, uline)
		ymax = math.Max(ymax, ub.value*1.05)
	}
	if rows[0].mLower != "" {
		mlo := make(plotter.XYs, len(rows))
		mhi := make(plotter.XYs, len(rows))
		for i, r := range rows {
			mlo[i] = plotter.XY{X: r.x, Y: r.mLo}
			mhi[i] = plotter.XY{X: r.x, Y: r.mHi}
			ymax = math.Max(ymax, r.mHi*1.05)
		}
		mu, mup, err := plotter.NewLinePoints(mhi)
		if err != nil {
			return nil, plot.Legend{}, err
		}
		ml, mlp, err := plotter.NewLinePoints(mlo)
		if err != nil {
			return nil, plot.Legend{}, err
		}
		green := color.RGBA{G: 140, B: 60, A: 255}
		mu.Color, ml.Color, mup.Color, mlp.Color = green, green, green, green
		mup.Shape, mlp.Shape = draw.PyramidGlyph{}, draw.CircleGlyph{}
		p.Add(mu, ml, mup, mlp)
		p.Legend.Add("certified bracket of the matched advantage M(alpha): upper ▲, lower ●", mu, mup)
	}
	p.Legend.Add("estimate 0.0384517 (Bracken & Melloy 1994, not certified)", ref)
	p.X.Scale = plot.LogScale{}
	p.X.Tick.Marker = plot.LogTicks{Prec: -1}
	p.X.Min, p.X.Max = xmin, xmax
	p.Y.Min = 0
	p.Y.Max = ymax
	return p, p.Legend, nil
}

func hrule(x0, x1, y float64) plotter.XYs {
	return plotter.XYs{{X: x0, Y: y}, {X: x1, Y: y}}
}

// trimDigits shortens a decimal lower bound to n significant digits by
// truncation (a truncated positive lower bound is still a lower bound).
func trimDigits(s string, n int) string {
	if strings.ContainsAny(s, "e-") {
		return s
	}
	out := []byte{}
	sig := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c >= '1' && c <= '9' || c == '0' && sig > 0 {
			if sig == n {
				break
			}
			sig++
		}
		out = append(out, c)
	}
	return string(out)
}
