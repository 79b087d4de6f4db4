package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
)

// Every flag name has one meaning across the subcommands; the help texts of
// the shared flags live here so that they cannot drift apart (the README's
// flag table repeats them).
const (
	helpOut     = "certificate file to write (atomically)"
	helpSave    = "write what would go to standard output to this file (atomically) instead"
	helpJSON    = "print a JSON summary instead of text (proved numbers are decimal strings)"
	helpQuiet   = "no progress display on standard error"
	helpWorkers = "goroutines (0: one per core); results do not depend on it"
)

// addQuiet adds --quiet.
func addQuiet(fs *pflag.FlagSet) *bool { return fs.Bool("quiet", false, helpQuiet) }

// addWorkers adds --workers.
func addWorkers(fs *pflag.FlagSet) *int { return fs.Int("workers", 0, helpWorkers) }

// checkWorkers rejects a negative --workers.
func checkWorkers(n int) error {
	if n < 0 || n > 4096 {
		return fmt.Errorf("--workers %d is outside 0..4096 (0: one per core)", n)
	}
	return nil
}

// addTolerance adds --tolerance (how loose the proved result may be) with
// old as a hidden older spelling that still works.
func addTolerance(fs *pflag.FlagSet, p *float64, def float64, help, old string) {
	fs.Float64Var(p, "tolerance", def, help)
	if old != "" {
		fs.Float64Var(p, old, def, "old spelling of --tolerance")
		fs.MarkHidden(old)
	}
}

// finite reports whether x is a finite float.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// checkOutput checks before any work that path can receive an output file
// (empty means not asked for).
func checkOutput(flag, path string) error {
	if path == "" {
		return nil
	}
	if err := certificates.CheckWritable(path); err != nil {
		return fmt.Errorf("%s: %v", flag, err)
	}
	return nil
}

// writeOut writes data to path atomically; a failure is bad input (exit 2).
func writeOut(stderr io.Writer, cmd, path string, data []byte) int {
	if err := certificates.WriteAtomic(path, data); err != nil {
		fmt.Fprintf(stderr, "wedgebound %s: %v\n", cmd, err)
		return 2
	}
	return 0
}

// marshalJSON is json.MarshalIndent with two-space indent that keeps "<",
// ">" and "&" as they are (the statements contain ">=").
func marshalJSON(v any) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return bytes.TrimRight(buf.Bytes(), "\n"), nil
}
