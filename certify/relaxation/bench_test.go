package relaxation

import (
	"fmt"
	"math"
	"strconv"
	"testing"

	"wedgebound/interval"
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

// Benchmarks for issue 13: the cost of a whole certification (search,
// cover, tails) against the number of profiles (log-spaced on
// 0.1 ... 10000, weights searched in the automatic box), and the cost of
// the cover against the margin aimed at, for the four-profile family with
// fixed weights (no search). Run with -benchtime 1x.

func logSpaced(n int) []string {
	ks := make([]string, n)
	for i := range ks {
		k := 0.1 * math.Pow(1e5, float64(i)/float64(n-1))
		ks[i] = strconv.FormatFloat(k, 'g', 4, 64)
	}
	return ks
}

func BenchmarkRunProfiles(b *testing.B) {
	for _, n := range []int{2, 4, 8} {
		b.Run(fmt.Sprintf("profiles=%d", n), func(b *testing.B) {
			cfg := Config{Problem: regions.Presets["backflow"], Terms: expSpecs(logSpaced(n), nil), Margin: 2e-5}
			var cells int
			var bound float64
			for b.Loop() {
				o, err := Run(cfg)
				if err != nil {
					b.Fatal(err)
				}
				cells = len(o.Certificate.Relaxation.Cover)
				bound, _ = o.Bound.Float64()
			}
			b.ReportMetric(float64(cells), "cells")
			b.ReportMetric(bound, "bound")
		})
	}
}

func BenchmarkRunMargin(b *testing.B) {
	ks := logSpaced(4)
	res, err := Search(expTermsB(b, ks), regions.Lower, SearchOptions{WeightBound: 1000})
	if err != nil {
		b.Fatal(err)
	}
	for _, m := range []float64{2e-4, 2e-5, 2e-6, 2e-7} {
		b.Run(fmt.Sprintf("margin=%g", m), func(b *testing.B) {
			cfg := Config{Problem: regions.Presets["backflow"], Terms: expSpecs(ks, res.Weights), Margin: m}
			var cells int
			var bound float64
			for b.Loop() {
				o, err := Run(cfg)
				if err != nil {
					b.Fatal(err)
				}
				cells = len(o.Certificate.Relaxation.Cover)
				bound, _ = o.Bound.Float64()
			}
			b.ReportMetric(float64(cells), "cells")
			b.ReportMetric(bound-res.Bound, "above-estimate")
		})
	}
}

func expTermsB(b *testing.B, ks []string) []regions.Term[interval.F] {
	var out []regions.Term[interval.F]
	for _, k := range ks {
		t, err := regions.NewTerm(interval.PointF(0), "exp", map[string]string{"k": k})
		if err != nil {
			b.Fatal(err)
		}
		out = append(out, t)
	}
	return out
}
