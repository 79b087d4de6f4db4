package main

import (
	"encoding/json"
	"fmt"
	"io"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/certify/precession"
)

func init() {
	register("precession", "certified bracket of the three-time precession constant P3 of the harmonic oscillator", runPrecession)
}

// precessionJSON is the --json output.
type precessionJSON struct {
	Lower   string   `json:"lower"`
	Upper   string   `json:"upper"`
	Sectors []string `json:"sector_bounds"`
	Witness struct {
		Residue  int       `json:"residue"`
		Size     int       `json:"size"`
		Rayleigh [2]string `json:"rayleigh"`
	} `json:"witness"`
	Cutoff  int    `json:"cutoff"`
	Length  int    `json:"length"`
	Seconds string `json:"seconds"`
}

func runPrecession(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("precession", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	out := fs.String("out", "", helpOut+": a precession-bracket certificate (check it with wedgecheck)")
	asJSON := fs.Bool("json", false, "print the result as JSON (decimal strings lower, upper, ...)")
	cutoff := fs.Int("cutoff", precession.DefaultCutoff, "rows kept exactly in the norm lemma of each residue class (upper bound)")
	length := fs.Int("sum-length", precession.DefaultLength, "terms of the lemma's sums added exactly before the proved tail bound (upper bound)")
	witness := fs.Int("witness", precession.DefaultWitness, "length of each half of the witness state (lower bound; its largest Fock index is about 6x this)")
	workers := fs.Int("workers", 0, "goroutines (0: all cores); the result does not depend on it")
	plot := fs.String("png", "", "also draw the witness's Wigner function as a heat map to this PNG file")
	quiet := fs.Bool("quiet", false, "no progress display")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound precession [--out FILE] [--json] [--cutoff A] [--sum-length L] [--witness N] [--png FILE] [--quiet]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound precession: %v (see --help)\n", err)
		return 2
	}
	if fs.NArg() > 0 {
		fmt.Fprintf(stderr, "wedgebound precession: unexpected argument %q\n", fs.Arg(0))
		return 2
	}
	opt := precession.Options{Cutoff: *cutoff, Length: *length, Witness: *witness, Workers: *workers}
	if err := opt.Check(); err != nil {
		fmt.Fprintf(stderr, "wedgebound precession: %v\n", err)
		return 2
	}
	if *workers < 0 {
		fmt.Fprintf(stderr, "wedgebound precession: --workers %d is negative\n", *workers)
		return 2
	}
	for _, o := range [][2]string{{"--out", *out}, {"--png", *plot}} {
		if err := checkOutput(o[0], o[1]); err != nil {
			fmt.Fprintf(stderr, "wedgebound precession: %v\n", err)
			return 2
		}
	}
	bar := newProgress(stderr, *quiet)
	opt.Progress = bar.update
	res, err := precession.Run(opt)
	bar.done()
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound precession: %v\n", err)
		return 1
	}
	if *out != "" {
		c, err := res.Certificate()
		if err == nil {
			err = certificates.WriteFile(*out, c)
		}
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound precession: %v\n", err)
			return 2
		}
	}
	if *plot != "" {
		if err := plotWigner(*plot, res.Witness); err != nil {
			fmt.Fprintf(stderr, "wedgebound precession: %v\n", err)
			return 1
		}
	}
	if *asJSON {
		var j precessionJSON
		j.Lower, j.Upper = res.Lower, res.Upper
		for _, p := range res.Proofs {
			j.Sectors = append(j.Sectors, upDec(p.Bound.Hi()))
		}
		j.Witness.Residue = res.Witness.Sector.R
		j.Witness.Size = len(res.Witness.X) + len(res.Witness.Y)
		j.Witness.Rayleigh = [2]string{downDec(res.Witness.Rayleigh.Lo()), upDec(res.Witness.Rayleigh.Hi())}
		j.Cutoff, j.Length = opt.Cutoff, opt.Length
		j.Seconds = fmt.Sprintf("%.1f", res.Seconds)
		b, _ := json.MarshalIndent(j, "", "  ")
		stdout.Write(append(b, '\n'))
		return 0
	}
	printPrecession(stdout, res)
	return 0
}
