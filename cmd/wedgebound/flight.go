package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/certify/flight"
	"wedgebound/certify/strip"
)

func init() {
	register("flight", "multi-stage flights (mass changes, kicks) reduced to one projectile and bracketed", runFlight)
}

// flightJSON is the --json output of wedgebound flight.
type flightJSON struct {
	Stages    []flight.Stage `json:"stages"`
	Reduction struct {
		TimeOverMass  string `json:"time_over_mass"`
		Alpha         string `json:"alpha"`
		Shift         string `json:"shift"`
		Target        string `json:"target"`
		ShiftedTarget string `json:"shifted_target"`
	} `json:"reduction"`
	Physical  bool          `json:"physical_units"`
	Advantage strip.Bounds  `json:"advantage"`
	Deficit   strip.Bounds  `json:"deficit"`
	Strip     *strip.Result `json:"strip"`
}

func runFlight(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("flight", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	var stages []string
	fs.StringArrayVar(&stages, "stage", nil, "a stage mass=M,duration=T[,kick=Q] (repeat in flight order; the kick acts at the end of the stage)")
	file := fs.String("stages", "", "read the flight from a JSON file {\"length\", \"target\", \"stages\": [{\"mass\", \"duration\", \"kick\"}]}")
	length := fs.String("length", "", "length L of the confining region with unit (m, mm, um, nm); without it every number is scaled (L = 1)")
	target := fs.String("target", "", "target position (default: L, the right end of the region)")
	digits := fs.Int("print-digits", 12, "significant digits of the printed brackets (1..17), each end rounded outward")
	addQuiet(fs)
	asJSON := fs.Bool("json", false, "print the reduction and the brackets as JSON")
	out := fs.String("out", "", helpOut+": a flight-reduction certificate (check it with wedgecheck)")
	var in stripInput
	in.add(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound flight (--stage mass=M,duration=T[,kick=Q] ... | --stages FILE) [--length L] [--target C] [--json] [--out FILE]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound flight: %v (see --help)\n", err)
		return 2
	}
	fail := func(format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound flight: "+format+"\n", a...)
		return 2
	}
	if fs.NArg() > 0 {
		return fail("unexpected argument %q", fs.Arg(0))
	}
	if *digits < 1 || *digits > 17 {
		return fail("--print-digits %d is outside 1..17", *digits)
	}
	if err := in.check(); err != nil {
		return fail("%v", err)
	}
	if err := checkOutput("--out", *out); err != nil {
		return fail("%v", err)
	}
	var plan flight.Plan
	switch {
	case *file != "" && len(stages) > 0:
		return fail("give either --stage flags or --stages FILE, not both")
	case *file != "":
		b, err := os.ReadFile(*file)
		if err != nil {
			return fail("%v", err)
		}
		if plan, err = flight.ParsePlan(b); err != nil {
			return fail("%v", err)
		}
		if *length != "" || *target != "" {
			return fail("--length and --target go into the flight file when --stages is used")
		}
	case len(stages) > 0:
		for _, s := range stages {
			st, err := flight.ParseStage(s)
			if err != nil {
				return fail("%v", err)
			}
			plan.Stages = append(plan.Stages, st)
		}
		plan.Length, plan.Target = *length, *target
	default:
		return fail("give at least one --stage mass=M,duration=T[,kick=Q] or --stages FILE")
	}
	res, err := flight.Compute(plan, in.options())
	if err != nil {
		if errors.Is(err, flight.ErrInput) || errors.Is(err, strip.ErrRange) {
			return fail("%v", err)
		}
		fmt.Fprintf(stderr, "wedgebound flight: %v\n", err)
		return 1
	}
	adv, err1 := boundsAt(res.Strip.AdvantageF, *digits)
	def, err2 := boundsAt(res.Strip.DeficitF, *digits)
	if err1 != nil || err2 != nil {
		fmt.Fprintln(stderr, "wedgebound flight: an enclosure is unbounded")
		return 1
	}
	if *out != "" {
		c, err := res.Certificate()
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound flight: %v\n", err)
			return 1
		}
		if err := certificates.WriteFile(*out, c); err != nil {
			return fail("%v", err)
		}
	}
	red := res.Reduction
	if *asJSON {
		var j flightJSON
		j.Stages = plan.Stages
		j.Reduction.TimeOverMass = certificates.FractionText(red.TimeOverMass)
		j.Reduction.Alpha = red.AlphaText()
		j.Reduction.Shift = certificates.FractionText(red.Shift)
		j.Reduction.Target = certificates.FractionText(red.Target)
		j.Reduction.ShiftedTarget = certificates.FractionText(red.ShiftedTarget)
		j.Physical = red.Physical
		j.Advantage, j.Deficit, j.Strip = adv, def, res.Strip
		b, err := json.MarshalIndent(j, "", "  ")
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound flight: %v\n", err)
			return 1
		}
		stdout.Write(append(b, '\n'))
		return 0
	}
	unit, tmu := "", ""
	if red.Physical {
		unit, tmu = " m", " s/kg"
	}
	fmt.Fprintf(stdout, "%d stages (kicks at stage ends; momentum continuous at mass changes)\n", len(plan.Stages))
	fmt.Fprintf(stdout, "time over mass T = sum t_k/m_k = %s%s\n", certificates.FractionText(red.TimeOverMass), tmu)
	fmt.Fprintf(stdout, "effective alpha = L^2/(hbar T) = %s in [%s, %s]\n", red.AlphaText(), res.Strip.Alpha.Lower, res.Strip.Alpha.Upper)
	fmt.Fprintf(stdout, "final position = x0 + T p0 + %s%s: target %s%s acts as the single-flight target %s%s\n",
		certificates.FractionText(red.Shift), unit, certificates.FractionText(red.Target), unit, certificates.FractionText(red.ShiftedTarget), unit)
	fmt.Fprintf(stdout, "advantage in [%s, %s] (over the best classical particle with the same initial momentum distribution)\n", adv.Lower, adv.Upper)
	fmt.Fprintf(stdout, "deficit lambda_max in [%s, %s]\n", def.Lower, def.Upper)
	fmt.Fprintf(stdout, "(strip basis size %d, %d Gauss nodes per variable)\n", res.Strip.BasisSize, res.Strip.QuadratureNodes)
	return 0
}
