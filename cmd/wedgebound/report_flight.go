package main

import (
	"fmt"

	"wedgebound/certificates"
)

func flightItem(path string, c *certificates.Certificate) bracketItem {
	f := c.Flight
	return bracketItem{file: path, cert: c, what: fmt.Sprintf("advantage of a %d-stage flight", len(f.Input.Stages)),
		alpha: f.Strip.Alpha, lower: f.Strip.Advantage.Lower.String(), upper: f.Strip.Advantage.Upper.String(),
		notes: fmt.Sprintf("The flight reduces exactly to one projectile with time over mass %s and alpha = %s; the target %s moves by %s to %s. "+
			"The bracket is the strip bracket at that alpha (basis size %d).",
			f.Reduction.TimeOverMass, f.Reduction.Alpha, f.Reduction.Target, f.Reduction.Shift, f.Reduction.ShiftedTarget, f.Strip.BasisSize)}
}
