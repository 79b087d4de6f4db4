package main

import (
	"os"
	"path/filepath"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
)

// BenchmarkVerifyShipped verifies testdata/backflow.json (all cores); the
// cells metric is the cover size, so ns/op divided by it is the cost per
// cell.
func BenchmarkVerifyShipped(b *testing.B) {
	data, err := os.ReadFile(filepath.Join("..", "..", "testdata", "backflow.json"))
	if err != nil {
		b.Skip("no testdata/backflow.json")
	}
	c, err := certificates.Decode(data)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportMetric(float64(len(c.Relaxation.Cover)), "cells")
	for b.Loop() {
		r, err := recheck.Verify(c, recheck.Options{})
		if err != nil || !r.Pass {
			b.Fatal("the shipped certificate did not pass")
		}
	}
}

// BenchmarkVerifyShippedOneCore is the same on one goroutine.
func BenchmarkVerifyShippedOneCore(b *testing.B) {
	data, err := os.ReadFile(filepath.Join("..", "..", "testdata", "backflow.json"))
	if err != nil {
		b.Skip("no testdata/backflow.json")
	}
	c, err := certificates.Decode(data)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportMetric(float64(len(c.Relaxation.Cover)), "cells")
	for b.Loop() {
		if r, err := recheck.Verify(c, recheck.Options{Workers: 1}); err != nil || !r.Pass {
			b.Fatal("the shipped certificate did not pass")
		}
	}
}
