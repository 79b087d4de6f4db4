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
	out := fs.String("out", "", "merged certificate to write (required)")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound merge --out FILE PART.json...")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		return 2
	}
	if *out == "" || fs.NArg() == 0 {
		fmt.Fprintln(stderr, "wedgebound merge: give --out FILE and the part files")
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
	m, err := certificates.Merge(parts)
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound %v\n", err)
		return 1
	}
	if err := certificates.WriteFile(*out, m); err != nil {
		fmt.Fprintf(stderr, "wedgebound merge: writing %s: %v\n", *out, err)
		return 1
	}
	r := m.Relaxation
	fmt.Fprintf(stdout, "merged %d shards: %d cells on [%s, %s], bound %s -> %s\n", len(parts), len(r.Cover), r.Cover[0].Lo, r.Cover[len(r.Cover)-1].Hi, r.Claim.Bound, *out)
	return 0
}
