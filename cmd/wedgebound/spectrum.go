package main

import (
	"fmt"
	"io"
	"os"
	"strings"

	"github.com/spf13/pflag"

	"wedgebound/certify/spectrum"
	"wedgebound/interval"
	"wedgebound/regions"
)

func init() {
	register("spectrum", "certified inf and sup of the spectrum of a squeeze-invariant symbol", runSpectrum)
}

// bracket is the JSON form of an enclosure.
type bracket struct {
	Lower string `json:"lower"`
	Upper string `json:"upper"`
}

func toBracket[T interval.Real[T]](x T, digits int) (bracket, error) {
	lo, hi, err := interval.Decimals(x, digits)
	return bracket{Lower: lo, Upper: hi}, err
}

func runSpectrum(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("spectrum", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	quadrant := fs.Bool("quadrant", false, "the bare quadrant {x > 0, p > 0}")
	termsFile := fs.String("terms", "", "JSON file with relaxation terms [{\"kind\":..., \"params\":{...}, \"weight\":...}] added in quadrant III")
	termFlags := fs.StringArray("term", nil, "one relaxation term KIND,NAME=VALUE,...,weight=W (repeatable), e.g. band,from=0,to=2,weight=0.3 or hat,left=0,peak=1,right=4,weight=-0.5")
	digits := fs.Int("digits", 0, fmt.Sprintf("correct significant digits wanted, 1..%d with --quadrant (12 if not given), 1..%d with exp terms only, 1..%d with band or hat terms (4 if not given with terms); the bounds are printed with two more", spectrum.MaxQuadrantDigits, spectrum.MaxTermDigits, spectrum.MaxCoverDigits))
	asJSON := fs.Bool("json", false, helpJSON+": inf and sup, each {lower, upper}, and where they are attained")
	quiet := addQuiet(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound spectrum (--quadrant | --terms FILE | --term SPEC ...) [--digits N] [--json]")
		fmt.Fprintf(stderr, "term kinds: %s\n", strings.Join(regions.TermKinds(), ", "))
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		return 2
	}
	if fs.NArg() > 0 {
		fmt.Fprintf(stderr, "wedgebound spectrum: unexpected argument %q\n", fs.Arg(0))
		return 2
	}
	given := 0
	for _, b := range []bool{*quadrant, *termsFile != "", len(*termFlags) > 0} {
		if b {
			given++
		}
	}
	if given != 1 {
		fmt.Fprintln(stderr, "wedgebound spectrum: give exactly one of --quadrant, --terms FILE and --term SPEC")
		return 2
	}
	var termsJSON []byte
	if len(*termFlags) > 0 {
		var err error
		if termsJSON, err = termSpecsJSON(*termFlags); err != nil {
			fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
			return 2
		}
	}
	if !fs.Changed("digits") {
		*digits = 12
		if !*quadrant {
			*digits = 4
		}
	}
	if *digits < 1 || *digits > spectrum.MaxQuadrantDigits {
		fmt.Fprintf(stderr, "wedgebound spectrum: --digits %d is outside 1..%d\n", *digits, spectrum.MaxQuadrantDigits)
		return 2
	}
	var res [2]interval.B
	var at [2]*bracket
	if *quadrant {
		bar := newProgress(stderr, *quiet)
		rs, err := spectrum.QuadrantEdges(*digits, bar.update)
		bar.done()
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
			return 1
		}
		for i, r := range rs {
			res[i] = r.Value
			if b, err := toBracket(r.At, *digits/2+2); err == nil {
				at[i] = &b
			}
		}
	} else {
		data, source := termsJSON, "--term"
		if *termsFile != "" {
			var err error
			if data, err = os.ReadFile(*termsFile); err != nil {
				fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
				return 2
			}
			source = *termsFile
		}
		rel, specs, err := decodeRelaxation(interval.F{}, data)
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound spectrum: %s: %v\n", source, err)
			return 2
		}
		if rel.HasJets() {
			// Exp terms only: the Newton route, any digits up to MaxTermDigits.
			if *digits > spectrum.MaxTermDigits {
				fmt.Fprintf(stderr, "wedgebound spectrum: with exp terms at most %d digits are supported, not %d\n", spectrum.MaxTermDigits, *digits)
				return 2
			}
			bar := newProgress(stderr, *quiet)
			rs, err := spectrum.TermEdges(specs, *digits, bar.update)
			bar.done()
			if err != nil {
				fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
				return 1
			}
			for i, r := range rs {
				res[i] = r.Value
				if b, err := toBracket(r.At, *digits/2+2); err == nil {
					at[i] = &b
				}
			}
		} else {
			if *digits > spectrum.MaxCoverDigits {
				fmt.Fprintf(stderr, "wedgebound spectrum: with band or hat terms at most %d digits are supported, not %d\n", spectrum.MaxCoverDigits, *digits)
				return 2
			}
			bar := newProgress(stderr, *quiet)
			r, err := spectrum.Terms(rel, *digits, bar.cover)
			bar.done()
			if err != nil {
				fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
				return 1
			}
			for i := range r {
				res[i] = interval.NewB(0, 53).Between(r[i].Endpoints())
			}
		}
	}
	inf, err1 := toBracket(res[0], *digits+2)
	sup, err2 := toBracket(res[1], *digits+2)
	if err1 != nil || err2 != nil {
		fmt.Fprintln(stderr, "wedgebound spectrum: an enclosure is unbounded")
		return 1
	}
	if *asJSON {
		out := struct {
			Inf   bracket  `json:"inf"`
			Sup   bracket  `json:"sup"`
			InfAt *bracket `json:"inf_at,omitempty"`
			SupAt *bracket `json:"sup_at,omitempty"`
		}{inf, sup, at[0], at[1]}
		b, _ := marshalJSON(out)
		fmt.Fprintln(stdout, string(b))
		return 0
	}
	fmt.Fprintf(stdout, "inf spec in [%s, %s]\nsup spec in [%s, %s]\n", inf.Lower, inf.Upper, sup.Lower, sup.Upper)
	if at[0] != nil && at[1] != nil {
		fmt.Fprintf(stdout, "attained at s in [%s, %s] and s in [%s, %s]\n", at[0].Lower, at[0].Upper, at[1].Lower, at[1].Upper)
	}
	return 0
}
