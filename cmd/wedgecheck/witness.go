package main

import (
	"fmt"
	"io"

	"wedgebound/certificates/recheck/witness"
)

// printWitnessText writes the report of a halfline-witness certificate.
func printWitnessText(w io.Writer, r fileReport, d *witness.Detail) {
	res := r.Result
	fmt.Fprintf(w, "      problem: %s\n", res.Problem)
	if res.Pass {
		fmt.Fprintf(w, "      proved:  %s\n", res.Statement)
		fmt.Fprintf(w, "      bound:   c_bm >= %s (the recomputed quotient supports %s)\n", res.Bound, res.Recomputed)
	} else {
		printFailures(w, res, "bound")
	}
	fmt.Fprintf(w, "      checked: norm and time integral (%d panels, %d nodes) in %.2f s\n", d.Panels, d.Nodes, r.Seconds)
}
