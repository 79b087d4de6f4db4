package main

import (
	"bytes"
	"context"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math/big"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/certify/relaxation"
	"wedgebound/certify/strip"
	"wedgebound/regions"
)

func init() {
	register("demo", "a short end-to-end tour written into DIR: problem, certificate, verification, report, strip bracket, sweep plot", runDemo)
}

// demoProblem is the tour's own scenario: a tilted wedge whose vertex
// (1, -3) lies on the boundary of the half-plane {2x + p > -1}, so the
// image half-plane passes through the origin (d = 0) and all of quadrant
// III is free for exponential profiles.
const demoProblem = `{
  "vertex": [1, -3],
  "rays": [[1, 1], [-1, 4]],
  "halfplane": {"normal": [2, 1], "offset": -1},
  "edge": "lower"
}
`

// demoPlan holds the sizes of one tour.
type demoPlan struct {
	k         string  // decay rate of the one exponential profile
	margin    float64 // certify margin
	alpha     string  // strip bracket parameter
	sweepFrom string
	sweepTo   string
	points    string
}

var (
	fullTour  = demoPlan{k: "150", margin: 2e-4, alpha: "20", sweepFrom: "1", sweepTo: "1000", points: "7"}
	quickTour = demoPlan{k: "150", margin: 2e-4, alpha: "5", sweepFrom: "1", sweepTo: "10", points: "3"}
)

// Files the tour writes, in the order README.txt lists them.
const (
	demoProblemFile = "problem.json"
	demoCertFile    = "certificate.json"
	demoVerifyFile  = "verify.txt"
	demoReportText  = "report.txt"
	demoReportMD    = "report.md"
	demoReportTeX   = "report.tex"
	demoSweepCSV    = "sweep.csv"
	demoSweepSVG    = "sweep.svg"
	demoReadme      = "README.txt"
)

func demoStripFile(alpha string) string { return "strip-alpha" + alpha + ".json" }

func runDemo(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("demo", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	force := fs.Bool("force", false, "write into DIR even if it is not empty (files of the same name are replaced)")
	verifier := fs.String("verifier", "", "wedgecheck binary to run (default: next to this program, then on PATH, then built with the go tool)")
	quick := fs.Bool("quick", false, "a smaller strip bracket and sweep (alpha 5; 3 points on [1, 10])")
	workers := addWorkers(fs)
	quiet := addQuiet(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound demo [--force] [--quick] [--verifier PATH] [--workers N] [--quiet] DIR")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound demo: %v (see --help)\n", err)
		return 2
	}
	fail := func(code int, format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound demo: "+format+"\n", a...)
		return code
	}
	if fs.NArg() != 1 {
		return fail(2, "give exactly one directory (usage: wedgebound demo [--force] DIR)")
	}
	if err := checkWorkers(*workers); err != nil {
		return fail(2, "%v", err)
	}
	dir := fs.Arg(0)
	if err := prepareDemoDir(dir, *force); err != nil {
		return fail(2, "%v", err)
	}
	plan := fullTour
	if *quick {
		plan = quickTour
	}
	start := time.Now()
	step := 0
	say := func(format string, a ...any) {
		step++
		fmt.Fprintf(stdout, "[%d/7] "+format+"\n", append([]any{step}, a...)...)
	}
	path := func(name string) string { return filepath.Join(dir, name) }
	write := func(name string, data []byte) error {
		if err := certificates.WriteAtomic(path(name), data); err != nil {
			return fmt.Errorf("writing %s: %v", path(name), err)
		}
		return nil
	}

	// (a) The problem.
	p, err := regions.ReadProblem([]byte(demoProblem))
	if err != nil {
		return fail(1, "the built-in problem: %v", err)
	}
	nf, err := regions.Normalize(p)
	if err != nil {
		return fail(1, "the built-in problem: %v", err)
	}
	if err := write(demoProblemFile, []byte(demoProblem)); err != nil {
		return fail(1, "%v", err)
	}
	u0, _ := nf.Threshold()
	say("problem: %s -> %s (normal form {%s}, threshold d^2/(4ab) = %s)",
		relaxation.Describe(p), path(demoProblemFile), normalText(nf), regions.RatString(u0))

	// (b) Certify with one exponential profile.
	bar := newProgress(stderr, *quiet)
	res, err := relaxation.Run(relaxation.Config{Problem: p, Terms: []certificates.Term{{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal(plan.k)}}}, Margin: plan.margin, Workers: *workers, Work: bar.work})
	bar.done()
	if err != nil {
		return fail(1, "certify: %v", err)
	}
	certPath := path(demoCertFile)
	if err := certificates.WriteFile(certPath, res.Certificate); err != nil {
		return fail(1, "writing %s: %v", certPath, err)
	}
	claim := res.Certificate.Relaxation.Claim
	say("certified with e^{-%s xp} (weight %s): %s (%d cells, %.1f s) -> %s",
		plan.k, res.Certificate.Relaxation.Terms[0].Weight, claim.Statement, len(res.Certificate.Relaxation.Cover), res.Elapsed.Seconds(), certPath)

	// (c) A finite-strip bracket certificate.
	sr, err := demoStrip(plan.alpha)
	if err != nil {
		return fail(1, "strip: %v", err)
	}
	stripCert, err := sr.Certificate()
	if err != nil {
		return fail(1, "strip: %v", err)
	}
	stripPath := path(demoStripFile(plan.alpha))
	if err := certificates.WriteFile(stripPath, stripCert); err != nil {
		return fail(1, "%v", err)
	}
	say("strip-bracket certificate at alpha = %s: A(alpha) in [%s, %s], lambda_max in [%s, %s] -> %s",
		plan.alpha, sr.Advantage.Lower, sr.Advantage.Upper, sr.Deficit.Lower, sr.Deficit.Upper, stripPath)

	// (d) Verify both certificates with the independent verifier.
	v := verifyDemo(*verifier, certPath, stripPath)
	if err := write(demoVerifyFile, []byte(v.text)); err != nil {
		return fail(1, "%v", err)
	}
	say("%s -> %s", v.summary, path(demoVerifyFile))
	if v.failed {
		return fail(1, "the verifier did not accept %s and %s (see %s)", certPath, stripPath, path(demoVerifyFile))
	}

	// (e) Reports on both certificates (one table, two kinds).
	item, err := readReportItem(certPath)
	if err == nil {
		err = item.consistent()
	}
	if err != nil {
		return fail(1, "report: %v", err)
	}
	item.file = demoCertFile // paths in the reports relative to DIR
	stripItem, err := readReportItem(stripPath)
	if err == nil {
		err = stripItem.consistent()
	}
	if err != nil {
		return fail(1, "report: %v", err)
	}
	stripItem.file = demoStripFile(plan.alpha)
	for _, r := range []struct {
		name, format string
		standalone   bool
	}{{demoReportText, formatText, false}, {demoReportMD, formatMarkdown, false}, {demoReportTeX, formatLaTeX, true}} {
		if err := write(r.name, []byte(renderReport(r.format, r.standalone, []reportItem{item, stripItem}))); err != nil {
			return fail(1, "%v", err)
		}
	}
	say("reports: %s (proof summary), %s (table), %s (LaTeX document)", path(demoReportText), path(demoReportMD), path(demoReportTeX))

	// (f) A sweep over alpha, through the sweep command itself.
	var sout, serr bytes.Buffer
	code := runSweep([]string{"--from", plan.sweepFrom, "--to", plan.sweepTo, "--points", plan.points,
		"--csv", path(demoSweepCSV), "--svg", path(demoSweepSVG), "--quiet"}, &sout, &serr)
	if code != 0 {
		return fail(1, "sweep: %s", oneLineText(serr.String()))
	}
	sweepLine := strings.TrimSpace(sout.String())
	say("sweep over alpha in [%s, %s], %s points -> %s, %s; %s", plan.sweepFrom, plan.sweepTo, plan.points, path(demoSweepCSV), path(demoSweepSVG), sweepLine)

	// (g) README.txt.
	readme := demoReadmeText(plan, p, nf, item, v, sr, sweepLine, path(demoSweepCSV))
	if err := write(demoReadme, []byte(readme)); err != nil {
		return fail(1, "%v", err)
	}
	say("guide to the files -> %s", path(demoReadme))
	fmt.Fprintf(stdout, "tour finished in %.1f s; start with %s\n", time.Since(start).Seconds(), path(demoReadme))
	return 0
}

// prepareDemoDir creates dir, or accepts an existing empty directory (any
// directory with force).
func prepareDemoDir(dir string, force bool) error {
	st, err := os.Stat(dir)
	switch {
	case errors.Is(err, os.ErrNotExist):
		if err := os.MkdirAll(dir, 0o755); err != nil {
			return err
		}
		return nil
	case err != nil:
		return err
	case !st.IsDir():
		return fmt.Errorf("%s exists and is not a directory", dir)
	}
	if force {
		return nil
	}
	entries, err := os.ReadDir(dir)
	if err != nil {
		return err
	}
	if len(entries) > 0 {
		return fmt.Errorf("%s exists and is not empty (use --force to write into it anyway)", dir)
	}
	return nil
}

// demoStrip certifies the strip bracket at alpha, as "wedgebound strip
// --alpha A --json" does.
func demoStrip(alpha string) (*strip.Result, error) {
	a, err := strip.ParseAlpha(alpha)
	if err != nil {
		return nil, err
	}
	r, err := strip.Compute(a, strip.Options{})
	if err != nil {
		return nil, err
	}
	adv, err1 := boundsAt(r.AdvantageF, 12)
	def, err2 := boundsAt(r.DeficitF, 12)
	if err1 != nil || err2 != nil {
		return nil, errors.New("an enclosure is unbounded")
	}
	r.Advantage, r.Deficit = adv, def
	return r, nil
}

// verification is the outcome of the verification step.
type verification struct {
	text    string // contents of verify.txt
	summary string // one progress line
	how     string // which verifier ran, or why none did
	passed  bool
	failed  bool // the verifier ran and did not accept (or could not run)
}

// verifyDemo runs wedgecheck on cert: the given binary, else one next to
// this executable, else one on PATH, else one built with the go tool. When
// none can be had, the step is skipped (not failed) and the text says how
// to run it.
func verifyDemo(explicit string, certs ...string) verification {
	bin, how, cleanup, err := findVerifier(explicit)
	if cleanup != nil {
		defer cleanup()
	}
	if err != nil {
		var abs []string
		for _, c := range certs {
			a, aerr := filepath.Abs(c)
			if aerr != nil {
				a = c
			}
			abs = append(abs, a)
		}
		manual := fmt.Sprintf("to verify by hand, from the wedgebound source tree run: go build ./cmd/wedgecheck && ./wedgecheck %s", strings.Join(abs, " "))
		msg := "verification SKIPPED (" + err.Error() + ")"
		return verification{text: msg + ";\n" + manual + "\n", summary: msg + "; " + manual, how: "skipped (" + err.Error() + "); " + manual, failed: explicit != ""}
	}
	ctx, cancel := context.WithTimeout(context.Background(), 10*time.Minute)
	defer cancel()
	var out bytes.Buffer
	cmd := exec.CommandContext(ctx, bin, certs...)
	cmd.Stdout, cmd.Stderr = &out, &out
	runErr := cmd.Run()
	header := fmt.Sprintf("$ wedgecheck %s   (verifier: %s)\n", strings.Join(certs, " "), how)
	text := header + out.String()
	var exit *exec.ExitError
	switch {
	case runErr == nil:
		return verification{text: text, summary: fmt.Sprintf("verified by the independent verifier: PASS (%d certificates)", len(certs)), how: how, passed: true}
	case errors.As(runErr, &exit):
		return verification{text: text, summary: fmt.Sprintf("verifier exit status %d: a certificate was NOT accepted", exit.ExitCode()), how: how, failed: true}
	default:
		return verification{text: text + runErr.Error() + "\n", summary: "the verifier could not run: " + runErr.Error(), how: how, failed: true}
	}
}

// findVerifier locates or builds wedgecheck. cleanup removes a built copy.
func findVerifier(explicit string) (bin, how string, cleanup func(), err error) {
	name := "wedgecheck"
	if runtime.GOOS == "windows" {
		name += ".exe"
	}
	if explicit != "" {
		if _, err := os.Stat(explicit); err != nil {
			return "", "", nil, fmt.Errorf("--verifier %s: %v", explicit, err)
		}
		return explicit, explicit, nil, nil
	}
	if self, err := os.Executable(); err == nil {
		cand := filepath.Join(filepath.Dir(self), name)
		if st, err := os.Stat(cand); err == nil && st.Mode().IsRegular() {
			return cand, cand + " (next to wedgebound)", nil, nil
		}
	}
	if cand, err := exec.LookPath(name); err == nil {
		return cand, cand + " (on PATH)", nil, nil
	}
	goTool, err := exec.LookPath("go")
	if err != nil {
		return "", "", nil, errors.New("no wedgecheck next to wedgebound or on PATH, and no go tool to build one")
	}
	tmp, err := os.MkdirTemp("", "wedgebound-demo-")
	if err != nil {
		return "", "", nil, err
	}
	cleanup = func() { os.RemoveAll(tmp) }
	out := filepath.Join(tmp, name)
	var msg bytes.Buffer
	cmd := exec.Command(goTool, "build", "-o", out, "wedgebound/cmd/wedgecheck")
	cmd.Stdout, cmd.Stderr = &msg, &msg
	if err := cmd.Run(); err != nil {
		cleanup()
		first, _, _ := strings.Cut(strings.TrimSpace(msg.String()), "\n")
		return "", "", nil, fmt.Errorf("no wedgecheck next to wedgebound or on PATH, and it cannot be built here, outside the wedgebound source tree: %s", first)
	}
	return out, "built with \"go build wedgebound/cmd/wedgecheck\"", cleanup, nil
}

// demoReadmeText explains the files of the tour.
func demoReadmeText(plan demoPlan, p regions.Problem, nf regions.Normal, it reportItem, v verification, sr *strip.Result, sweepLine, sweepCSVPath string) string {
	var b strings.Builder
	r := it.rel
	line := func(s string) { wrap(&b, "", s, 78) }
	entry := func(name, s string) {
		b.WriteString("\n" + name + "\n")
		wrap(&b, "    ", s, 78)
	}
	line("A tour of wedgebound, written by \"wedgebound demo\". Every bound below is proved in outward-rounded interval arithmetic; the files say how.")
	b.WriteString("\n")
	line(fmt.Sprintf("The scenario: %s. Its vertex lies on the boundary of the half-plane, so the image half-plane {%s} of the normal form passes through the origin and the exponential profiles e^{-k xp} on quadrant III are admissible.",
		relaxation.Describe(p), normalText(nf)))
	if backflowEquivalent(r.Normal) {
		b.WriteString("\n")
		line("Since d = 0 < a, b, a squeeze maps this normal form onto that of the backflow preset (report.txt gives the map), so the problem has the backflow problem's spectrum: the certified bound is also an upper bound on the backflow constant c_bm, and the strip brackets below give lower bounds on it (A(alpha) <= c_bm for every alpha).")
	}
	if backflowEquivalent(r.Normal) {
		if lo, at, ok := bestSweepLower(sweepCSVPath); ok {
			b.WriteString("\n")
			line(fmt.Sprintf("Together: %s <= c_bm <= %s, both ends certified (the lower end is the strip advantage at alpha = %s, the upper end this certificate's bound).", lo, r.Claim.Bound, at))
		}
	}
	entry(demoProblemFile, "The problem file (vertex, rays, half-plane, edge), the input of \"wedgebound certify --problem "+demoProblemFile+"\".")
	entry(demoCertFile, fmt.Sprintf("The certificate from one exponential profile, k = %s, weight %s, margin %g: %s. %d cells cover s in [%s, %s]; tail lemmas close both ends. sha256 %s.",
		plan.k, r.Terms[0].Weight, plan.margin, r.Claim.Statement, len(r.Cover), r.Cover[0].Lo, r.Cover[len(r.Cover)-1].Hi, it.cert.SHA256))
	verifyLine := "The output of the independent verifier wedgecheck on the certificate: "
	switch {
	case v.passed:
		verifyLine += "PASS for both certificates. For the relaxation it recomputed the hash, the normal form and every cell's enclosure by its own numerics; for the strip bracket the witnesses' Rayleigh quotients, the discarded part and both Galerkin eigenvalue bounds."
	default:
		verifyLine += v.how + "."
	}
	entry(demoVerifyFile, verifyLine+" Re-run it with \"wedgecheck "+demoCertFile+" "+demoStripFile(plan.alpha)+"\".")
	entry(demoReportText, "The plain-text proof summaries of both certificates a referee reads: what was relaxed, why the relaxation is admissible, what is claimed and what the verifier recomputes (\"wedgebound report "+demoCertFile+"\").")
	entry(demoReportMD, "Both certificates as rows of one Markdown table (\"wedgebound report --format markdown "+demoCertFile+" "+demoStripFile(plan.alpha)+"\").")
	entry(demoReportTeX, "The table as a minimal LaTeX document (\"wedgebound report --format latex --standalone\"; drop --standalone for the bare tabular to paste into a paper).")
	entry(demoStripFile(plan.alpha), fmt.Sprintf("The strip-bracket certificate of the finite-strip operator at alpha = %s (\"wedgebound strip --alpha %s --out FILE\"; check it with wedgecheck): advantage A(alpha) = -lambda_min in [%s, %s], lambda_max in [%s, %s], with the witness states and every error term (basis size %d).",
		plan.alpha, plan.alpha, sr.Advantage.Lower, sr.Advantage.Upper, sr.Deficit.Lower, sr.Deficit.Upper, sr.BasisSize))
	entry(demoSweepCSV, fmt.Sprintf("Certified brackets of A(alpha) and lambda_max at %s log-spaced alpha in [%s, %s], one row each (\"wedgebound sweep\"); %s.", plan.points, plan.sweepFrom, plan.sweepTo, sweepLine))
	entry(demoSweepSVG, "A plot of the advantage brackets against alpha, with the best certified lower bound and the published numerical estimate of the backflow constant (dashed, not certified).")
	entry(demoReadme, "This guide.")
	b.WriteString("\n")
	line("Caution: the certificates prove statements about the stated mathematical model (Weyl quantization with hbar = 1, the given geometry), not about any experiment.")
	return b.String()
}

// normalText writes the image half-plane a x + b p > -d of a normal form.
func normalText(nf regions.Normal) string {
	return linear(nf.A, nf.B) + " > " + regions.RatString(new(big.Rat).Neg(nf.D))
}

// bestSweepLower returns the largest advantage_lower of a sweep CSV file
// and its alpha.
func bestSweepLower(path string) (lower, alpha string, ok bool) {
	f, err := os.Open(path)
	if err != nil {
		return "", "", false
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil || len(rows) < 2 {
		return "", "", false
	}
	col := -1
	for i, h := range rows[0] {
		if h == "advantage_lower" {
			col = i
		}
	}
	if col < 0 {
		return "", "", false
	}
	var best *big.Rat
	for _, row := range rows[1:] {
		v, good := new(big.Rat).SetString(row[col])
		if !good {
			return "", "", false
		}
		if best == nil || v.Cmp(best) > 0 {
			best, lower, alpha = v, row[col], row[0]
		}
	}
	return lower, alpha, best != nil
}
