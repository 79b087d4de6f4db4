package main

import (
	"encoding/json"
	"fmt"
	"io"
	"time"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/certify/witness"
)

func init() {
	register("witness", "certified lower bound on the backflow constant from an explicit state", runWitness)
}

// witnessSummary is the --json output.
type witnessSummary struct {
	Problem   string                `json:"problem"`
	Bound     string                `json:"bound"`
	Quotient  certificates.Interval `json:"quotient"`
	Estimate  string                `json:"estimate"`
	BasisSize int                   `json:"basis_size"`
	MinWidth  float64               `json:"min_width"`
	MaxWidth  float64               `json:"max_width"`
	Ratio     float64               `json:"ratio"`
	MaxPower  int                   `json:"max_power"`
	Panels    int                   `json:"panels"`
	Remainder string                `json:"quadrature_remainder"`
	Seconds   float64               `json:"seconds"`
	Statement string                `json:"statement"`
}

func runWitness(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("witness", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	def := witness.Preset()
	preset := fs.String("preset", "backflow", "the constant to bound (only backflow)")
	out := fs.String("out", "", "write a halfline-witness certificate to this file (check it with wedgecheck)")
	asJSON := fs.Bool("json", false, "print a JSON summary (the proved bound is the decimal string field bound)")
	minW := fs.Float64("min-width", def.MinWidth, "smallest Gaussian width b (sets how far the momentum tail reaches, about 1/sqrt(b))")
	maxW := fs.Float64("max-width", def.MaxWidth, "largest Gaussian width b")
	ratio := fs.Float64("ratio", def.Ratio, "ratio of consecutive widths (> 1)")
	powers := fs.Int("powers", def.MaxPower, "largest power m of the factor u^m (0..4)")
	digits := fs.Int("digits", def.Digits, "significant digits of the bound (rounded down, 2..15)")
	workers := fs.Int("workers", 0, "goroutines (0: all cores)")
	quiet := fs.Bool("quiet", false, "no progress display")
	csv := fs.String("csv", "", "write the witness as CSV: momentum amplitude and position density (float evaluation)")
	wigner := fs.String("wigner", "", "write a heat map of the witness's Wigner function (.png, .svg or .pdf)")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound witness --preset backflow [--out FILE] [--json] [--min-width B] [--max-width B] [--ratio R] [--powers M] [--csv FILE] [--wigner FILE]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound witness: %v (see --help)\n", err)
		return 2
	}
	fail := func(format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound witness: "+format+"\n", a...)
		return 2
	}
	if fs.NArg() > 0 {
		return fail("unexpected argument %q", fs.Arg(0))
	}
	if *preset != "backflow" {
		return fail("unknown preset %q (only backflow)", *preset)
	}
	if !(*minW >= 1e-14) || !(*maxW >= *minW) || *maxW > 1e4 {
		return fail("need 1e-14 <= --min-width <= --max-width <= 1e4")
	}
	if !(*ratio >= 1.1) || *ratio > 100 {
		return fail("--ratio %g is outside [1.1, 100]", *ratio)
	}
	if *powers < 0 || *powers > 4 {
		return fail("--powers %d is outside 0..4", *powers)
	}
	if *digits < 2 || *digits > 15 {
		return fail("--digits %d is outside 2..15", *digits)
	}
	if *wigner != "" {
		if err := witness.CheckPlotName(*wigner); err != nil {
			return fail("%v", err)
		}
	}
	o := def
	o.MinWidth, o.MaxWidth, o.Ratio, o.MaxPower, o.Digits, o.Workers = *minW, *maxW, *ratio, *powers, *digits, *workers
	if n := witness.BasisSize(o); n > 1500 {
		return fail("the basis would have %d functions (at most 1500): raise --min-width or --ratio", n)
	}
	prog := newProgress(stderr, *quiet)
	o.Progress = prog.update
	start := time.Now()
	r, err := witness.Run(o)
	prog.done()
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound witness: %v\n", err)
		return 1
	}
	elapsed := time.Since(start)
	c, err := r.Certificate(o.GramTol)
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound witness: %v\n", err)
		return 1
	}
	if *out != "" {
		if err := certificates.WriteFile(*out, c); err != nil {
			fmt.Fprintf(stderr, "wedgebound witness: %v\n", err)
			return 1
		}
	}
	if *csv != "" {
		if err := certificates.WriteAtomic(*csv, witness.CSV(r.Basis, r.Coef)); err != nil {
			fmt.Fprintf(stderr, "wedgebound witness: %v\n", err)
			return 1
		}
	}
	if *wigner != "" {
		if err := witness.WignerPlot(*wigner, r.Basis, r.Coef); err != nil {
			fmt.Fprintf(stderr, "wedgebound witness: %v\n", err)
			return 1
		}
	}
	w := c.Witness
	if *asJSON {
		s := witnessSummary{Problem: "backflow", Bound: r.Bound, Quotient: w.Quotient, Estimate: w.Certifier.Estimate.String(),
			BasisSize: len(r.Basis), MinWidth: o.MinWidth, MaxWidth: o.MaxWidth, Ratio: o.Ratio, MaxPower: o.MaxPower,
			Panels: len(r.Proof.Panels), Remainder: w.Errors.Quadrature.String(), Seconds: elapsed.Seconds(), Statement: w.Statement}
		js, _ := json.MarshalIndent(s, "", "  ")
		fmt.Fprintf(stdout, "%s\n", js)
		return 0
	}
	fmt.Fprintf(stdout, "c_bm >= %s (proved)\n", r.Bound)
	fmt.Fprintf(stdout, "Rayleigh quotient of the witness in [%s, %s]; float estimate %s\n", w.Quotient.Lower, w.Quotient.Upper, w.Certifier.Estimate)
	fmt.Fprintf(stdout, "(basis of %d functions, widths %g..%g, ratio %g, powers 0..%d; %d time panels, quadrature remainder %s; %.1f s)\n",
		len(r.Basis), o.MinWidth, o.MaxWidth, o.Ratio, o.MaxPower, len(r.Proof.Panels), w.Errors.Quadrature, elapsed.Seconds())
	return 0
}
