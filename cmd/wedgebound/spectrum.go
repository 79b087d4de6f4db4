package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"math/big"
	"os"

	"github.com/spf13/pflag"

	"wedgebound/certify"
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
	digits := fs.Int("digits", 12, "significant digits wanted (1..60)")
	asJSON := fs.Bool("json", false, "print JSON with fields inf and sup")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound spectrum (--quadrant | --terms FILE) [--digits N] [--json]")
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
	if *quadrant == (*termsFile != "") {
		fmt.Fprintln(stderr, "wedgebound spectrum: give exactly one of --quadrant and --terms FILE")
		return 2
	}
	if *digits < 1 || *digits > 60 {
		fmt.Fprintf(stderr, "wedgebound spectrum: --digits %d is outside 1..60\n", *digits)
		return 2
	}
	prec := uint(float64(*digits)*math.Log2(10)) + 40
	like := interval.NewB(0, prec)
	var rel regions.Relaxation[interval.B]
	if *termsFile != "" {
		data, err := os.ReadFile(*termsFile)
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
			return 2
		}
		rel, err = decodeRelaxation(like, data)
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound spectrum: %s: %v\n", *termsFile, err)
			return 2
		}
	}
	res, err := spectrum(like, rel, *digits)
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
		return 1
	}
	inf, err1 := toBracket(res[0], *digits+2)
	sup, err2 := toBracket(res[1], *digits+2)
	if err1 != nil || err2 != nil {
		fmt.Fprintln(stderr, "wedgebound spectrum: an enclosure is unbounded")
		return 1
	}
	if *asJSON {
		out := struct {
			Inf bracket `json:"inf"`
			Sup bracket `json:"sup"`
		}{inf, sup}
		b, _ := json.MarshalIndent(out, "", "  ")
		fmt.Fprintln(stdout, string(b))
		return 0
	}
	fmt.Fprintf(stdout, "inf spec in [%s, %s]\nsup spec in [%s, %s]\n", inf.Lower, inf.Upper, sup.Lower, sup.Upper)
	return 0
}

// spectrum encloses inf spec and sup spec of Op(g) for g = chi_Q + terms.
// The bare quadrant uses the mean-value form, which reaches any precision;
// with terms the cells use direct enclosures, and the result is as narrow as
// the cell budget allows (still proved).
func spectrum(like interval.B, rel regions.Relaxation[interval.B], digits int) ([2]interval.B, error) {
	S := like.Int(8)
	var out [2]interval.B
	eps, _ := like.Decimal(fmt.Sprintf("1e-%d", digits+3))
	for i, e := range []regions.Edge{regions.Lower, regions.Upper} {
		f := func(s interval.B) interval.B { return rel.Enclose(s).Eig(e) }
		var fast certify.CellFunc[interval.B]
		if len(rel.Terms) == 0 {
			f = func(s interval.B) interval.B { return regions.QuadrantEig(s, e) }
			// A float64 evaluation settles the cells away from the extremum.
			fast = func(s interval.B) interval.B {
				v := regions.QuadrantEig(interval.F{}.Between(s.Endpoints()), e)
				return s.Between(v.Endpoints())
			}
		}
		point := func(s interval.B) interval.B { return rel.Enclose(s).Eig(e) }
		outside := rel.Tail(S, 1).Eig(e).Hull(rel.Tail(S, -1).Eig(e))
		x := certify.Extreme[interval.B]{
			F: f, Point: point, Fast: fast, Lo: big.NewRat(-8, 1), Hi: big.NewRat(8, 1), Outside: outside,
			Cells: 64, Eps: eps, Max: e == regions.Upper,
			Options: certify.CoverOptions{MinWidth: new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(digits/2+8)), nil)), MaxCells: 200000},
		}
		r, err := x.Solve(like)
		if err != nil {
			return out, err
		}
		out[i] = r.Value
	}
	return out, nil
}
