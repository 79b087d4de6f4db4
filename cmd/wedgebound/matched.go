package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/certify/matched"
)

func init() {
	register("matched", "certified bracket of the matched position-and-momentum advantage M(alpha)", runMatched)
}

// matchedJSON is the --json output of wedgebound matched.
type matchedJSON struct {
	Alpha     certificates.StripAlpha `json:"alpha"`
	Lower     string                  `json:"lower"`
	Upper     string                  `json:"upper"`
	WitnessV  string                  `json:"witness_threshold"`
	Cells     int                     `json:"cells"`
	Statement string                  `json:"statement"`
}

func runMatched(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("matched", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	alphaStr := fs.String("alpha", "", "the parameter alpha = m L^2/(hbar t), a positive decimal or p/q (at most 400)")
	mass := fs.String("mass", "", "particle mass with unit: kg, g, mg or u")
	length := fs.String("length", "", "length of the confining region with unit: m, mm, um or nm")
	tm := fs.String("time", "", "time allowed with unit: s, ms, us or ns")
	width := new(float64)
	addTolerance(fs, width, matched.DefaultWidth, "how wide the proved bracket may be", "width")
	asJSON := fs.Bool("json", false, "print the result as JSON (decimal-string fields lower and upper)")
	out := fs.String("out", "", helpOut+": a matched-bracket certificate (check it with wedgecheck)")
	quiet := fs.Bool("quiet", false, "no progress lines on stderr")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound matched (--alpha A | --mass M --length L --time T) [--tolerance W] [--json] [--out FILE] [--quiet]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound matched: %v (see --help)\n", err)
		return 2
	}
	fail := func(format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound matched: "+format+"\n", a...)
		return 2
	}
	if fs.NArg() > 0 {
		return fail("unexpected argument %q", fs.Arg(0))
	}
	if err := checkOutput("--out", *out); err != nil {
		return fail("%v", err)
	}
	if !(*width > 0) || *width > 1 {
		return fail("--tolerance %g is outside (0, 1]", *width)
	}
	alpha, err := alphaFromFlags(*alphaStr, *mass, *length, *tm)
	if err != nil {
		return fail("%v", err)
	}
	opt := matched.Options{Width: *width}
	if !*quiet {
		opt.Progress = func(s string) { fmt.Fprintln(stderr, "matched:", s) }
	}
	res, err := matched.Compute(alpha, opt)
	if err != nil {
		if errors.Is(err, matched.ErrRange) {
			return fail("%v", err)
		}
		fmt.Fprintf(stderr, "wedgebound matched: %v\n", err)
		return 1
	}
	c, err := res.Certificate()
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound matched: %v\n", err)
		return 1
	}
	m := c.Matched
	if *out != "" {
		if err := certificates.WriteFile(*out, c); err != nil {
			fmt.Fprintf(stderr, "wedgebound matched: %v\n", err)
			return 1
		}
	}
	if *asJSON {
		j := matchedJSON{Alpha: m.Alpha, Lower: m.Lower.String(), Upper: m.Upper.String(), WitnessV: m.Witness.V.String(), Cells: len(m.Cells), Statement: m.Statement}
		b, err := json.MarshalIndent(j, "", "  ")
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound matched: %v\n", err)
			return 1
		}
		stdout.Write(append(b, '\n'))
		return 0
	}
	fmt.Fprintf(stdout, "alpha = %s in [%s, %s]\n", m.Alpha.Value, m.Alpha.Lower, m.Alpha.Upper)
	fmt.Fprintf(stdout, "matched advantage M(alpha) in [%s, %s]\n", m.Lower, m.Upper)
	fmt.Fprintf(stdout, "(witness at threshold v = %.9g, %d cells over v in [-1, 0])\n", res.Witness.V, len(m.Cells))
	fmt.Fprintln(stdout, "Meaning: some state confined to the region reaches the target with a probability at least the lower end above every classical particle with the same position and momentum distributions (in the best coupling of the two), and no state beats the best such particle by more than the upper end.")
	return 0
}
