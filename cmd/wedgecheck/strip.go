package main

import (
	"fmt"
	"io"
	"sort"

	"wedgebound/certificates/recheck/strip"
)

// printStripText writes the report of a strip-bracket certificate.
func printStripText(w io.Writer, r fileReport, s *strip.Detail) {
	res := r.Result
	fmt.Fprintf(w, "      problem: %s\n", res.Problem)
	if res.Pass {
		fmt.Fprintf(w, "      proved:  %s\n", res.Statement)
		fmt.Fprintf(w, "      recomputed: %s\n", res.Recomputed)
	} else {
		printFailures(w, res, "bracket")
	}
	if s.RuleNodes > 0 {
		fmt.Fprintf(w, "      checked: basis size %d with a %d-node Clenshaw-Curtis rule; Galerkin matrix within %s, discarded part <= %s; in %.2f s",
			s.BasisSize, s.RuleNodes, orDash(s.GalerkinDistance), orDash(s.Discarded), r.Seconds)
		if len(s.Seconds) > 0 {
			names := make([]string, 0, len(s.Seconds))
			for k := range s.Seconds {
				names = append(names, k)
			}
			sort.Slice(names, func(i, j int) bool { return s.Seconds[names[i]] > s.Seconds[names[j]] })
			fmt.Fprintf(w, " (most in %s: %.2f s)", names[0], s.Seconds[names[0]])
		}
		fmt.Fprintln(w)
	}
	for _, n := range res.Notes {
		fmt.Fprintf(w, "      note: %s\n", n)
	}
}

func orDash(s string) string {
	if s == "" {
		return "-"
	}
	return s
}
