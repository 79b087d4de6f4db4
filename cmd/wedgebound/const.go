package main

import (
	"fmt"
	"io"
	"math"
	"sort"
	"strings"

	"github.com/spf13/pflag"

	"wedgebound/interval"
)

func init() {
	register("const", "certified enclosure of a mathematical constant", runConst)
}

// constants maps each name accepted by "wedgebound const" to the function
// that encloses it at a given precision in bits.
var constants = map[string]func(prec uint) interval.B{
	"pi":  func(p uint) interval.B { return interval.NewB(0, p).Pi() },
	"e":   func(p uint) interval.B { return interval.E(interval.NewB(0, p)) },
	"ln2": func(p uint) interval.B { return interval.NewB(0, p).Ln2() },
	// Catalan's constant G and Euler's constant gamma (package interval, from
	// the trigamma and digamma functions).
	"catalan": func(p uint) interval.B { return interval.Catalan(interval.NewB(0, p)) },
	"gamma":   func(p uint) interval.B { return interval.EulerGamma(interval.NewB(0, p)) },
}

// constDigitsMax bounds --digits (the decimal output is capped there too).
const constDigitsMax = 100000

// constResult is the JSON form of a constant's enclosure: lower <= value <=
// upper, both decimal strings rounded outward.
type constResult struct {
	Name   string `json:"name"`
	Digits int    `json:"digits"`
	Lower  string `json:"lower"`
	Upper  string `json:"upper"`
}

func constNames() string {
	names := make([]string, 0, len(constants))
	for n := range constants {
		names = append(names, n)
	}
	sort.Strings(names)
	return strings.Join(names, ", ")
}

func runConst(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("const", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	digits := fs.Int("digits", 50, "correct significant digits wanted (1..100000, at most about 19723 fit the precision cap); the bounds are printed with two more")
	asJSON := fs.Bool("json", false, helpJSON+": name, digits, lower, upper")
	addQuiet(fs)
	fs.Usage = func() {
		fmt.Fprintf(stderr, "usage: wedgebound const NAME [--digits N] [--json]   (NAME: %s)\n", constNames())
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound const: %v (see --help)\n", err)
		return 2
	}
	fail := func(format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound const: "+format+"\n", a...)
		return 2
	}
	if fs.NArg() != 1 {
		return fail("expected one constant name (%s), got %d arguments", constNames(), fs.NArg())
	}
	name := fs.Arg(0)
	calc, ok := constants[name]
	if !ok {
		return fail("unknown constant %q (known: %s)", name, constNames())
	}
	if *digits < 1 || *digits > constDigitsMax {
		return fail("--digits %d is outside 1..%d", *digits, constDigitsMax)
	}
	// Enough bits for digits+2 significant digits plus a margin, so the two
	// printed bounds differ by well under one unit in the digits-th place.
	prec := uint(math.Ceil(float64(*digits)*math.Log2(10))) + 16
	if prec > interval.MaxPrec {
		return fail("--digits %d needs %d bits, more than the largest working precision %d bits (about %d digits)",
			*digits, prec, interval.MaxPrec, int(float64(interval.MaxPrec-16)/math.Log2(10)))
	}
	x := calc(prec)
	out := *digits + 2
	if out > constDigitsMax {
		out = constDigitsMax
	}
	lo, hi, err := interval.Decimals(x, out)
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound const: %s: %v\n", name, err)
		return 1
	}
	if *asJSON {
		b, err := marshalJSON(constResult{Name: name, Digits: *digits, Lower: lo, Upper: hi})
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound const: %v\n", err)
			return 1
		}
		fmt.Fprintln(stdout, string(b))
		return 0
	}
	fmt.Fprintf(stdout, "%s lies in [lower, upper] (%d bits, outward rounding)\n", name, prec)
	fmt.Fprintf(stdout, "lower %s\n", lo)
	fmt.Fprintf(stdout, "upper %s\n", hi)
	return 0
}
