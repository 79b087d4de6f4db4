package main

import (
	"fmt"
	"io"

	"wedgebound/certificates/recheck/precession"
)

// printPrecessionText writes the report of a precession-bracket certificate.
func printPrecessionText(w io.Writer, r fileReport, d *precession.Detail) {
	res := r.Result
	fmt.Fprintf(w, "      problem: %s\n", res.Problem)
	if res.Pass {
		fmt.Fprintf(w, "      proved:  %s\n", res.Statement)
	} else {
		printFailures(w, res, "bracket")
	}
	fmt.Fprintf(w, "      checked: witness of %d + %d Fock states (Rayleigh quotient in [%s, %s]); norm lemma per residue class, bounds %s, %s, %s; in %.2f s\n",
		d.WitnessSize[0], d.WitnessSize[1], d.Rayleigh[0], d.Rayleigh[1], d.SectorBounds[0], d.SectorBounds[1], d.SectorBounds[2], r.Seconds)
}
