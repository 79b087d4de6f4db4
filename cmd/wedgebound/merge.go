package main

import (
	"fmt"
	"io"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
)

func init() {
	register("merge", "join the partial certificates of a sharded run into one", runMerge)
}

func runMerge(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("merge", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	out := fs.String("out", "", helpOut+" (required): the merged certificate")
	addQuiet(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound merge --out FILE PART.json...")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound merge: %v (see --help)\n", err)
		return 2
	}
	if *out == "" || fs.NArg() == 0 {
		fmt.Fprintln(stderr, "wedgebound merge: give --out FILE and the part files")
		return 2
	}
	if err := checkOutput("--out", *out); err != nil {
		fmt.Fprintf(stderr, "wedgebound merge: %v\n", err)
		return 2
	}
	var parts []*certificates.Certificate
	for _, f := range fs.Args() {
		c, err := certificates.ReadFile(f)
		if err != nil {
			fmt.Fprintf(stderr, "wedgebound merge: %s: %v\n", f, err)
			return 2
		}
		parts = append(parts, c)
	}
	// Parts that do not fit together are bad input, not a failed claim.
	m, err := certificates.Merge(parts, fs.Args()...)
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound %v\n", err)
		return 2
	}
	if err := certificates.WriteFile(*out, m); err != nil {
		fmt.Fprintf(stderr, "wedgebound merge: %v\n", err)
		return 2
	}
	r := m.Relaxation
	fmt.Fprintf(stdout, "merged %d shards: %d cells on [%s, %s], bound %s -> %s\n", len(parts), len(r.Cover), r.Cover[0].Lo, r.Cover[len(r.Cover)-1].Hi, r.Claim.Bound, *out)
	return 0
}
