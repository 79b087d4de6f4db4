//go:build tools

// This file pins module dependencies that later code uses.
package main

import (
	_ "github.com/ALTree/bigfloat"
	_ "github.com/spf13/pflag"
	_ "gonum.org/v1/gonum/mat"
	_ "gonum.org/v1/gonum/optimize/convex/lp"
	_ "gonum.org/v1/plot"
)
