package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"math/big"
	"os"
	"strings"

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
	termFlags := fs.StringArray("term", nil, "one relaxation term KIND,NAME=VALUE,...,weight=W (repeatable), e.g. band,from=0,to=2,weight=0.3 or hat,left=0,peak=1,right=4,weight=-0.5")
	digits := fs.Int("digits", 12, "significant digits wanted (1..60 for --quadrant, default 12; 1..5 with --terms, default 4)")
	asJSON := fs.Bool("json", false, "print JSON with fields inf and sup")
	quiet := fs.Bool("quiet", false, "no progress display")
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
	if !*quadrant && !fs.Changed("digits") {
		*digits = 4
	}
	if *digits < 1 || *digits > 60 {
		fmt.Fprintf(stderr, "wedgebound spectrum: --digits %d is outside 1..60\n", *digits)
		return 2
	}
	var res [2]interval.B
	if *quadrant {
		prec := uint(float64(*digits)*math.Log2(10)) + 40
		var err error
		res, err = spectrum(interval.NewB(0, prec), regions.Relaxation[interval.B]{}, *digits, true, nil)
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
			return 1
		}
	} else {
		// With terms the cells use direct float64-interval enclosures, which
		// settle a few digits within the cell budget.
		if *digits > 5 {
			fmt.Fprintf(stderr, "wedgebound spectrum: with --terms at most 5 digits are supported, not %d\n", *digits)
			return 2
		}
		data, source := termsJSON, "--term"
		if *termsFile != "" {
			var err error
			if data, err = os.ReadFile(*termsFile); err != nil {
				fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
				return 2
			}
			source = *termsFile
		}
		rel, err := decodeRelaxation(interval.F{}, data)
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound spectrum: %s: %v\n", source, err)
			return 2
		}
		bar := newProgress(stderr, *quiet)
		r, err := spectrum(interval.F{}, rel, *digits, false, bar.update)
		bar.done()
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound spectrum: %v\n", err)
			return 1
		}
		for i := range r {
			res[i] = interval.NewB(0, 53).Between(r[i].Endpoints())
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
// The bare quadrant (quadrant true) uses the mean-value form, which reaches
// any precision, with float64 cells first; with terms the cells use direct
// enclosures.
func spectrum[T interval.Real[T]](like T, rel regions.Relaxation[T], digits int, quadrant bool, progress func(stage string, done, total int)) ([2]T, error) {
	// Push the tails out until the lemmas' |B| bound is small and the tail
	// eigenvalue enclosures are narrow on both sides (a profile reaching
	// xp = c keeps the bound on D large up to s ~ 2c).
	Sv := int64(8)
	small := func(S int64) bool {
		for _, side := range []int{-1, 1} {
			m := rel.Tail(like.Int(S), side)
			if m.B.Re.Hi() > 0.002 && side < 0 {
				return false
			}
			for _, e := range []regions.Edge{regions.Lower, regions.Upper} {
				if v := m.Eig(e); !v.IsFinite() || v.Hi()-v.Lo() > 0.004 {
					return false
				}
			}
		}
		return true
	}
	for Sv < 1<<14 && !small(Sv) {
		Sv *= 2
	}
	S := like.Int(Sv)
	var out [2]T
	extra := 3
	if !quadrant {
		extra = 1
	}
	eps, _ := like.Decimal(fmt.Sprintf("1e-%d", digits+extra))
	minW := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(digits/2+8)), nil))
	for i, e := range []regions.Edge{regions.Lower, regions.Upper} {
		point := func(s T) T { return rel.Enclose(s).Eig(e) }
		f := func(s T) T { return rel.Eig(s, e) }
		var fast certify.CellFunc[T]
		if quadrant {
			f = func(s T) T { return regions.QuadrantEig(s, e) }
			fast = func(s T) T {
				v := regions.QuadrantEig(interval.F{}.Between(s.Endpoints()), e)
				return s.Between(v.Endpoints())
			}
		}
		outside := rel.Tail(S, 1).Eig(e).Hull(rel.Tail(S, -1).Eig(e))
		var scan []*big.Rat
		if !quadrant {
			// Relaxation terms move the extremum and add oscillation: scan
			// [-24, 24] in steps of 1/8 as well.
			for k := int64(-192); k <= 192; k++ {
				scan = append(scan, big.NewRat(k, 8))
			}
		}
		x := certify.Extreme[T]{
			F: f, Point: point, Fast: fast, Lo: big.NewRat(-Sv, 1), Hi: big.NewRat(Sv, 1), Outside: outside, Scan: scan,
			Cells: 64, Eps: eps, Max: e == regions.Upper,
			Options: certify.CoverOptions{MinWidth: minW, MaxCells: 200000},
		}
		if progress != nil {
			stage := []string{"inf spec", "sup spec"}[i]
			x.Options.Progress = func(done, total int) { progress(stage, done, total) }
		}
		r, err := x.Solve(like)
		if err != nil {
			return out, err
		}
		out[i] = r.Value
	}
	return out, nil
}
