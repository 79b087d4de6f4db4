// Command wedgecheck is the independent verifier for wedgebound
// certificates. For each file it reads the certificate strictly, checks its
// hash, recomputes the normal form exactly, checks that every relaxation
// term is admissible, and recomputes in its own interval arithmetic (package
// wedgebound/certificates/recheck, which shares only the interval library
// and the certificate schema with the certifier) an enclosure of the
// extreme eigenvalue of the Mellin symbol on every cell and on both tails.
// For a strip-bracket certificate it re-derives alpha, the witnesses'
// Rayleigh quotients, the discarded part and both Galerkin eigenvalue
// bounds with its own quadrature and eigenvalue proofs.
//
// Usage:
//
//	wedgecheck [--json] [--workers N] [--max-depth D] [--no-tail-extension] FILE...
//
// It prints PASS or FAIL per file with the problem, the proved bound and,
// for a FAIL, the first claim that does not hold (which cell or tail, by
// how much, and whether the claim is shown false or only not proved).
// Exit status: 0 when every file passes, 1 when any claim fails (a stale
// hash included), 2 when a file cannot be read, is not a well-formed
// certificate, or is of a kind this version does not check.
//
// Referee workflow:
//
//	go build ./cmd/wedgecheck
//	./wedgecheck testdata/backflow.json          # PASS, exit 0
//	./wedgecheck --json testdata/*.json | less   # every failure, machine-readable
//
// A PASS means: the file is the one that was sealed, the problem's normal
// form and every term's admissibility check out exactly, and the verifier's
// own enclosures prove the claimed inequality on every cell and both tails.
package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"

	// The certificate kinds this command checks, one line each (each
	// registers itself with recheck; the names are used by the printers).
	_ "wedgebound/certificates/recheck/flight"
	_ "wedgebound/certificates/recheck/matched"
	"wedgebound/certificates/recheck/precession"
	"wedgebound/certificates/recheck/relaxation"
	"wedgebound/certificates/recheck/strip"
	"wedgebound/certificates/recheck/witness"
)

// Exit statuses.
const (
	exitPass      = 0
	exitFail      = 1
	exitMalformed = 2
)

// Status of one file.
const (
	statusPass  = "PASS"
	statusFail  = "FAIL"
	statusError = "ERROR"
)

// fileReport is the outcome for one file (also the --json record).
type fileReport struct {
	File   string `json:"file"`
	Status string `json:"status"`
	// Error is the one-line reason for ERROR, or for a FAIL that is not a
	// numerical claim (stale hash).
	Error string `json:"error,omitempty"`
	// StaleHash is set when the content does not match the recorded hash.
	StaleHash *staleHash      `json:"stale_hash,omitempty"`
	Result    *recheck.Result `json:"result,omitempty"`
	Seconds   float64         `json:"seconds"`
}

type staleHash struct {
	Recorded string `json:"recorded"`
	Content  string `json:"content"`
}

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

func run(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("wedgecheck", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	asJSON := fs.Bool("json", false, "print one JSON array with a record per file instead of text")
	workers := fs.Int("workers", 0, "goroutines over cells (0: one per CPU); the result does not depend on it")
	depth := fs.Int("max-depth", 10, "how often the verifier may bisect a recorded cell before giving up")
	noExt := fs.Bool("no-tail-extension", false, "require the verifier's tail lemma to hold at the recorded tail starts")
	fs.Bool("quiet", false, "no progress display on standard error (wedgecheck draws none; accepted like every wedgebound command)")
	version := fs.Bool("version", false, "print the version and the certificate schema and kinds this verifier reads")
	fs.Usage = func() {
		fmt.Fprintf(stderr, "usage: wedgecheck [--json] [--workers N] [--max-depth D] [--no-tail-extension] FILE...\n       wedgecheck --version\n\n"+
			"Re-checks every claim of each certificate with an independent computation.\n"+
			"Exit status: 0 all pass, 1 a claim fails (or a hash is stale), 2 unreadable or malformed input.\n\n")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, pflag.ErrHelp) {
			return exitPass
		}
		fmt.Fprintf(stderr, "wedgecheck: %v (see --help)\n", err)
		return exitMalformed
	}
	if *version {
		printVersion(stdout)
		return exitPass
	}
	if *workers < 0 || *workers > 4096 {
		fmt.Fprintf(stderr, "wedgecheck: --workers %d is outside 0..4096 (0: one per core)\n", *workers)
		return exitMalformed
	}
	if *depth < 1 || *depth > 60 {
		fmt.Fprintf(stderr, "wedgecheck: --max-depth %d is outside 1..60\n", *depth)
		return exitMalformed
	}
	files := fs.Args()
	if len(files) == 0 {
		fmt.Fprintln(stderr, "wedgecheck: no certificate files given (usage: wedgecheck [--json] FILE...)")
		return exitMalformed
	}
	opt := recheck.Options{Workers: *workers, MaxDepth: *depth, NoTailExtension: *noExt}
	code := exitPass
	var reports []fileReport
	for _, f := range files {
		r, c := checkFile(f, opt)
		if c > code {
			code = c
		}
		if *asJSON {
			reports = append(reports, r)
		} else {
			printText(stdout, r)
		}
	}
	if *asJSON {
		enc := json.NewEncoder(stdout)
		enc.SetEscapeHTML(false) // ">" stays ">" in statements
		enc.SetIndent("", " ")
		if err := enc.Encode(reports); err != nil {
			fmt.Fprintln(stderr, "wedgecheck:", err)
			return exitMalformed
		}
	}
	return code
}

// checkFile verifies one file and returns its report and exit status.
func checkFile(path string, opt recheck.Options) (fileReport, int) {
	start := time.Now()
	rep := fileReport{File: path}
	done := func(status string, code int) (fileReport, int) {
		rep.Status = status
		rep.Seconds = time.Since(start).Seconds()
		return rep, code
	}
	data, err := os.ReadFile(path)
	if err != nil {
		rep.Error = oneLine(err.Error())
		return done(statusError, exitMalformed)
	}
	c, err := certificates.Decode(data)
	if errors.Is(err, certificates.ErrStaleHash) && c != nil {
		var stale *recheck.StaleHashError
		herr := recheck.CheckHash(c)
		if !errors.As(herr, &stale) {
			if herr == nil {
				herr = err
			}
			rep.Error = oneLine(herr.Error())
			return done(statusError, exitMalformed)
		}
		rep.StaleHash = &staleHash{Recorded: stale.Recorded, Content: stale.Content}
		rep.Error = stale.Error()
		return done(statusFail, exitFail)
	}
	if err != nil {
		// An invalid document whose hash is also stale was changed after it
		// was sealed: report the tampering first.
		if rec, h, ok := staleDespiteInvalid(data); ok {
			rep.StaleHash = &staleHash{Recorded: rec, Content: h}
			rep.Error = fmt.Sprintf("stale hash: the recorded sha256 %s does not match the content, which hashes to %s; the file was changed after it was sealed (and is not valid either: %s)", rec, h, oneLine(err.Error()))
			return done(statusFail, exitFail)
		}
		rep.Error = oneLine(err.Error())
		return done(statusError, exitMalformed)
	}
	res, err := recheck.Verify(c, opt)
	if err != nil {
		rep.Error = oneLine(err.Error())
		return done(statusError, exitMalformed)
	}
	rep.Result = res
	if res.Pass {
		return done(statusPass, exitPass)
	}
	return done(statusFail, exitFail)
}

// staleDespiteInvalid parses data leniently (unknown fields ignored, no
// validation) and reports the recorded and the content hash when they
// differ.
func staleDespiteInvalid(data []byte) (recorded, content string, stale bool) {
	var c certificates.Certificate
	if err := json.Unmarshal(data, &c); err != nil || c.SHA256 == "" {
		return "", "", false
	}
	var e *recheck.StaleHashError
	if !errors.As(recheck.CheckHash(&c), &e) {
		return "", "", false
	}
	return e.Recorded, e.Content, true
}

// failureText writes a failure in one line: where, what, by how much.
func failureText(f recheck.Failure) string {
	where := f.Where
	switch {
	case f.Lo != "" && f.Hi != "":
		where += fmt.Sprintf(" (s in [%s, %s])", f.Lo, f.Hi)
	case f.Lo != "":
		where += fmt.Sprintf(" (from s = %s)", f.Lo)
	}
	by := ""
	if f.By != "" {
		by = " (by " + f.By + ")"
	}
	return where + ": " + f.Message + by
}

func oneLine(s string) string {
	return strings.Join(strings.Fields(s), " ")
}

func printText(w io.Writer, r fileReport) {
	fmt.Fprintf(w, "%s  %s\n", r.Status, r.File)
	if r.Result == nil {
		fmt.Fprintf(w, "      %s\n", r.Error)
		return
	}
	switch d := r.Result.Detail.(type) {
	case *relaxation.Detail:
		printRelaxationText(w, r, d)
	case *strip.Detail:
		printStripText(w, r, d)
	case *precession.Detail:
		printPrecessionText(w, r, d)
	case *witness.Detail:
		printWitnessText(w, r, d)
	default:
		printGenericText(w, r)
	}
}

// printRelaxationText writes the report of a halfplane-relaxation
// certificate.
func printRelaxationText(w io.Writer, r fileReport, d *relaxation.Detail) {
	res := r.Result
	fmt.Fprintf(w, "      problem: %s\n", res.Problem)
	if d.Range[0] == "" && len(res.Failures) > 0 {
		// Stopped before the claim was read (a partial certificate, a bad
		// edge or bound): say so instead of printing empty fields.
		f := res.Failures[0]
		fmt.Fprintf(w, "      not checked: %s\n", failureText(f))
		fmt.Fprintf(w, "      recorded: %d cells, bound %s; no claim is checked, in %.2f s\n", d.Cells, res.Bound, r.Seconds)
		return
	}
	if res.Pass {
		fmt.Fprintf(w, "      proved:  %s\n", res.Statement)
		fmt.Fprintf(w, "      bound:   %s", res.Bound)
		if res.Recomputed != "" {
			fmt.Fprintf(w, " (the recomputed enclosures support %s)", res.Recomputed)
		}
		fmt.Fprintln(w)
	} else {
		printFailures(w, res, "bound")
	}
	fmt.Fprintf(w, "      checked: %d cells on [%s, %s] as %d pieces", d.Cells, d.Range[0], d.Range[1], d.Pieces)
	if d.HighPrecision > 0 {
		fmt.Fprintf(w, " (%d at high precision)", d.HighPrecision)
	}
	fmt.Fprintf(w, ", and both tails, in %.2f s\n", r.Seconds)
	for _, n := range res.Notes {
		fmt.Fprintf(w, "      note: %s\n", n)
	}
}

// printGenericText writes the kind-neutral part of a result, for kinds
// without a printer of their own.
func printGenericText(w io.Writer, r fileReport) {
	res := r.Result
	fmt.Fprintf(w, "      problem: %s\n", res.Problem)
	if res.Pass {
		fmt.Fprintf(w, "      proved:  %s\n", res.Statement)
		if res.Recomputed != "" {
			fmt.Fprintf(w, "      recomputed: %s\n", res.Recomputed)
		}
	} else {
		printFailures(w, res, "bound")
	}
	fmt.Fprintf(w, "      checked in %.2f s\n", r.Seconds)
	for _, n := range res.Notes {
		fmt.Fprintf(w, "      note: %s\n", n)
	}
}

// printFailures prints the claim, the first failing claim and, when that is
// about a recorded number, the first failure of the claimed bound itself
// (what names the bound: "bound" or "bracket").
func printFailures(w io.Writer, res *recheck.Result, what string) {
	fmt.Fprintf(w, "      claim:   %s\n", res.Statement)
	f := res.Failures[0]
	fmt.Fprintf(w, "      first failing claim: %s\n", failureText(f))
	if !f.Bound {
		for _, g := range res.Failures {
			if g.Bound {
				fmt.Fprintf(w, "      the %s itself: %s\n", what, failureText(g))
				break
			}
		}
	}
	if n := len(res.Failures) - 1; n > 0 {
		fmt.Fprintf(w, "      (%d further failure(s); --json lists all)\n", n)
	}
}

// printVersion prints the program version and what it reads.
func printVersion(w io.Writer) {
	fmt.Fprintf(w, "wedgecheck %s\n", certificates.Version)
	fmt.Fprintf(w, "reads schema %s, kinds %s\n", certificates.Schema, strings.Join(recheck.Kinds(), ", "))
}
