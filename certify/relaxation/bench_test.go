package relaxation

import (
	"testing"

	"wedgebound/regions"
)

// Benchmarks for issue 4: a whole certification (candidate search, cover,
// tails, certificate assembly) of a one-term relaxation e^{-150 xp} for the
// backflow preset, and of the bare quadrant. Run with -benchtime 1x; one
// one-term iteration takes several seconds.

func BenchmarkRunOneExp(b *testing.B) {
	cfg := Config{Problem: regions.Presets["backflow"], Terms: expSpecs([]string{"150"}, nil), Margin: 2e-4}
	var cells int
	for b.Loop() {
		o, err := Run(cfg)
		if err != nil {
			b.Fatal(err)
		}
		cells = len(o.Certificate.Relaxation.Cover)
	}
	b.ReportMetric(float64(cells), "cells")
}

func BenchmarkRunQuadrant(b *testing.B) {
	cfg := Config{Problem: regions.Presets["backflow"], Margin: quadrantMargin}
	var cells int
	for b.Loop() {
		o, err := Run(cfg)
		if err != nil {
			b.Fatal(err)
		}
		cells = len(o.Certificate.Relaxation.Cover)
	}
	b.ReportMetric(float64(cells), "cells")
}
