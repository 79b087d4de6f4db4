package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/certify/strip"
	"wedgebound/interval"
)

func init() {
	register("strip", "certified brackets of the finite-strip advantage A(alpha) and deficit", runStrip)
}

// stripInput holds the flags shared by strip and sweep: the tolerance (the
// width each bracket aims at), the basis cap and the workers.
type stripInput struct {
	width    float64
	maxBasis int
	workers  int
}

func (s *stripInput) add(fs *pflag.FlagSet) {
	addTolerance(fs, &s.width, strip.DefaultWidth, "how wide each proved bracket may be (the basis grows until it is narrower)", "width")
	fs.IntVar(&s.maxBasis, "max-basis", strip.DefaultMaxBasis, "largest basis size the automatic choice may use")
	fs.IntVar(&s.workers, "workers", 0, helpWorkers)
}

func (s *stripInput) check() error {
	if !(s.width > 0) || s.width > 1 {
		return fmt.Errorf("--tolerance %g is outside (0, 1]", s.width)
	}
	if s.maxBasis < 4 || s.maxBasis > 20000 {
		return fmt.Errorf("--max-basis %d is outside 4..20000", s.maxBasis)
	}
	return checkWorkers(s.workers)
}

func (s *stripInput) options() strip.Options {
	return strip.Options{Width: s.width, MaxBasis: s.maxBasis, Workers: s.workers}
}

// boundsAt writes x with digits significant digits, rounded outward.
func boundsAt(x interval.F, digits int) (strip.Bounds, error) {
	lo, hi, err := interval.Decimals(x, digits)
	return strip.Bounds{Lower: lo, Upper: hi}, err
}

func runStrip(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("strip", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	alphaStr := fs.String("alpha", "", "the parameter alpha = m L^2/(hbar t), a positive decimal or p/q")
	mass := fs.String("mass", "", "particle mass with unit: kg, g, mg or u (e.g. 1u)")
	length := fs.String("length", "", "length of the confining region with unit: m, mm, um or nm (e.g. 1um)")
	tm := fs.String("time", "", "time allowed with unit: s, ms, us or ns (e.g. 1ms)")
	digits := fs.Int("print-digits", 12, "significant digits of the printed brackets (1..17), each end rounded outward")
	asJSON := fs.Bool("json", false, helpJSON+": alpha, advantage, deficit, witnesses, errors")
	save := fs.String("save", "", helpSave)
	out := fs.String("out", "", helpOut+": a strip-bracket certificate (check it with wedgecheck)")
	addQuiet(fs)
	var in stripInput
	in.add(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound strip (--alpha A | --mass M --length L --time T) [--tolerance W] [--print-digits D] [--json] [--save FILE] [--out FILE]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound strip: %v (see --help)\n", err)
		return 2
	}
	fail := func(format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound strip: "+format+"\n", a...)
		return 2
	}
	if fs.NArg() > 0 {
		return fail("unexpected argument %q", fs.Arg(0))
	}
	if *digits < 1 || *digits > 17 {
		return fail("--print-digits %d is outside 1..17", *digits)
	}
	for _, o := range [][2]string{{"--save", *save}, {"--out", *out}} {
		if err := checkOutput(o[0], o[1]); err != nil {
			return fail("%v", err)
		}
	}
	if err := in.check(); err != nil {
		return fail("%v", err)
	}
	alpha, err := alphaFromFlags(*alphaStr, *mass, *length, *tm)
	if err != nil {
		return fail("%v", err)
	}
	res, err := strip.Compute(alpha, in.options())
	if err != nil {
		if errors.Is(err, strip.ErrRange) {
			return fail("%v", err)
		}
		fmt.Fprintf(stderr, "wedgebound strip: %v\n", err)
		return 1
	}
	adv, err1 := boundsAt(res.AdvantageF, *digits)
	def, err2 := boundsAt(res.DeficitF, *digits)
	if err1 != nil || err2 != nil {
		fmt.Fprintln(stderr, "wedgebound strip: an enclosure is unbounded")
		return 1
	}
	res.Advantage, res.Deficit = adv, def
	if *out != "" {
		c, err := res.Certificate()
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound strip: %v\n", err)
			return 1
		}
		if err := certificates.WriteFile(*out, c); err != nil {
			return fail("%v", err)
		}
	}
	var text bytes.Buffer
	if *asJSON {
		js, err := marshalJSON(res)
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound strip: %v\n", err)
			return 1
		}
		text.Write(append(js, '\n'))
	} else {
		printStrip(&text, res)
	}
	if *save != "" {
		return writeOut(stderr, "strip", *save, text.Bytes())
	}
	stdout.Write(text.Bytes())
	return 0
}

// alphaFromFlags builds alpha from --alpha or from the three unit flags.
func alphaFromFlags(alphaStr, mass, length, tm string) (strip.Alpha, error) {
	units := mass != "" || length != "" || tm != ""
	switch {
	case alphaStr != "" && units:
		return strip.Alpha{}, errors.New("give either --alpha or --mass/--length/--time, not both")
	case alphaStr != "":
		return strip.ParseAlpha(alphaStr)
	case units:
		if mass == "" || length == "" || tm == "" {
			return strip.Alpha{}, errors.New("--mass, --length and --time must be given together")
		}
		return strip.AlphaFromUnits(mass, length, tm)
	}
	return strip.Alpha{}, errors.New("give --alpha A or --mass M --length L --time T")
}

func printStrip(w io.Writer, r *strip.Result) {
	a := r.Alpha
	if a.Units != nil {
		fmt.Fprintf(w, "alpha = m L^2/(hbar t) with m = %s, L = %s, t = %s (hbar = h/(2 pi), h = 6.62607015e-34 J s)\n", a.Units.Mass, a.Units.Length, a.Units.Time)
		fmt.Fprintf(w, "alpha in [%s, %s]\n", a.Lower, a.Upper)
	} else {
		fmt.Fprintf(w, "alpha = %s\n", a.Value)
	}
	fmt.Fprintf(w, "advantage A(alpha) = -lambda_min in [%s, %s]\n", r.Advantage.Lower, r.Advantage.Upper)
	fmt.Fprintf(w, "deficit lambda_max in [%s, %s]\n", r.Deficit.Lower, r.Deficit.Upper)
	fmt.Fprintf(w, "(basis size %d, %d Gauss nodes per variable)\n", r.BasisSize, r.QuadratureNodes)
	fmt.Fprintf(w, "Meaning: some state of a quantum particle confined to a region of length L reaches the target within time t with a probability at least %s above that of the best classical particle with the same momentum distribution, no state beats it by more than %s, and no state falls short of it by more than %s (some by at least %s).\n",
		r.Advantage.Lower, r.Advantage.Upper, r.Deficit.Upper, r.Deficit.Lower)
}
