package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/certify/relaxation"
	"wedgebound/interval"
	"wedgebound/regions"
)

func init() {
	register("certify", "prove a spectral bound for a wedge problem and write its certificate", runCertify)
}

func runCertify(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("certify", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	preset := fs.String("preset", "", "named problem: "+strings.Join(regions.PresetNames(), ", "))
	problemFile := fs.String("problem", "", "JSON problem file {\"vertex\", \"rays\", \"halfplane\", \"edge\"}")
	out := fs.String("out", "", helpOut+" (required)")
	exps := fs.String("exp", "0.03,0.13,0.79,5.3,40,300,1000,3000", "comma-separated decay rates k of the exponential profiles e^{-k xp} (\"none\" for the bare quadrant)")
	weights := fs.String("weights", "", "comma-separated exact weights for the profiles (default: searched)")
	weightBound := fs.Float64("weight-bound", 0, "bound on the searched weights (0: max(50, k_max/15))")
	var margin float64
	addTolerance(fs, &margin, 2e-5, "how far above the float estimate the proved bound may lie (the cover aims at estimate + tolerance)", "margin")
	prec := fs.Int("prec", 53, "working precision of the cover in bits (53: float64 intervals; 54..65536: big.Float intervals, slower)")
	workers := addWorkers(fs)
	shard := fs.String("shard", "", "prove only part I of N of the cover (I/N, 1 <= I <= N) and write a partial certificate for \"wedgebound merge\"")
	asJSON := fs.Bool("json", false, helpJSON)
	quiet := addQuiet(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound certify (--preset NAME | --problem FILE) --out FILE [flags]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound certify: %v (see --help)\n", err)
		return 2
	}
	fail := func(format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound certify: "+format+"\n", a...)
		return 2
	}
	if fs.NArg() > 0 {
		return fail("unexpected argument %q", fs.Arg(0))
	}
	if (*preset == "") == (*problemFile == "") {
		return fail("give exactly one of --preset and --problem")
	}
	if *out == "" {
		return fail("--out FILE is required")
	}
	if err := checkOutput("--out", *out); err != nil {
		return fail("%v", err)
	}
	if *prec < 53 || *prec > 65536 {
		return fail("--prec %d is outside 53..65536", *prec)
	}
	if !(margin > 0) || margin > 1 {
		return fail("--tolerance %g is outside (0, 1]", margin)
	}
	if !(*weightBound >= 0) || !finite(*weightBound) {
		return fail("--weight-bound %g must be a finite number >= 0 (0: automatic)", *weightBound)
	}
	if err := checkWorkers(*workers); err != nil {
		return fail("%v", err)
	}
	var p regions.Problem
	if *preset != "" {
		var ok bool
		if p, ok = regions.Presets[*preset]; !ok {
			return fail("unknown preset %q (known: %s)", *preset, strings.Join(regions.PresetNames(), ", "))
		}
	} else {
		data, err := os.ReadFile(*problemFile)
		if err != nil {
			return fail("%v", err)
		}
		if p, err = regions.ReadProblem(data); err != nil {
			return fail("%s: %v", *problemFile, err)
		}
	}
	cfg := relaxation.Config{Problem: p, WeightBound: *weightBound, Margin: margin, Workers: *workers, Prec: uint(*prec)}
	var ks, ws []string
	if s := strings.TrimSpace(*exps); s != "" && s != "none" {
		ks = splitList(s)
	}
	if *weights != "" {
		ws = splitList(*weights)
		if len(ws) != len(ks) {
			return fail("--weights: %d weights given for %d terms", len(ws), len(ks))
		}
	}
	if err := checkCertifyInput(p, ks, ws); err != nil {
		return fail("%v", err)
	}
	for i, k := range ks {
		kd, err := certificates.ParseDecimal(k)
		if err != nil {
			return fail("--exp %s: %v", k, err)
		}
		t := certificates.Term{Kind: "exp", Params: map[string]certificates.Decimal{"k": kd}}
		if ws != nil {
			if t.Weight, err = certificates.ParseDecimal(ws[i]); err != nil {
				return fail("--weights: weight %d: %v", i+1, err)
			}
		}
		cfg.Terms = append(cfg.Terms, t)
	}
	if *shard != "" {
		var i, n int
		if _, err := fmt.Sscanf(*shard, "%d/%d", &i, &n); err != nil || n < 1 || i < 1 || i > n || fmt.Sprintf("%d/%d", i, n) != *shard {
			return fail("--shard %q: want I/N with 1 <= I <= N", *shard)
		}
		cfg.Shard, cfg.Shards = i-1, n
	}
	bar := newProgress(stderr, *quiet)
	cfg.Work = bar.work
	res, err := relaxation.Run(cfg)
	bar.done()
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound certify: %v\n", err)
		return 1
	}
	if err := certificates.WriteFile(*out, res.Certificate); err != nil {
		return fail("%v", err)
	}
	bound := res.Certificate.Relaxation.Claim.Bound.String()
	if *asJSON {
		// bound is proved (a decimal string); candidate (the float estimate
		// the search reached), cells, seconds, file and sha256 are
		// informational.
		candidate := "none"
		if !math.IsNaN(res.Candidate) {
			candidate = strconv.FormatFloat(res.Candidate, 'g', 9, 64)
		}
		b, _ := marshalJSON(struct {
			Bound     string  `json:"bound"`
			Edge      string  `json:"edge"`
			Candidate string  `json:"candidate"`
			Cells     int     `json:"cells"`
			Seconds   float64 `json:"seconds"`
			File      string  `json:"file"`
			SHA256    string  `json:"sha256"`
		}{bound, string(p.Edge), candidate, len(res.Certificate.Relaxation.Cover), math.Round(res.Elapsed.Seconds()*1000) / 1000, *out, res.Certificate.SHA256})
		fmt.Fprintln(stdout, string(b))
		return 0
	}
	if cfg.Shards > 0 {
		fmt.Fprintf(stdout, "partial certificate (shard %d/%d, %d cells, %.1f s, local bound %s) -> %s; join all shards with wedgebound merge\n",
			cfg.Shard+1, cfg.Shards, len(res.Certificate.Relaxation.Cover), res.Elapsed.Seconds(), bound, *out)
		return 0
	}
	fmt.Fprintf(stdout, "proved: %s (%d cells, %.1f s) -> %s\n", res.Certificate.Relaxation.Claim.Statement, len(res.Certificate.Relaxation.Cover), res.Elapsed.Seconds(), *out)
	return 0
}

func splitList(s string) []string {
	var out []string
	for _, f := range strings.Split(s, ",") {
		if f = strings.TrimSpace(f); f != "" {
			out = append(out, f)
		}
	}
	return out
}

// checkCertifyInput rejects, before any work, what relaxation.Run would only
// find later: a problem without a normal form, profiles the geometry does
// not admit, decay rates or weights that are not finite decimals, and a
// weight count that does not match. Such input is the user's (exit 2).
func checkCertifyInput(p regions.Problem, ks, weights []string) error {
	nf, err := regions.Normalize(p)
	if err != nil {
		return fmt.Errorf("the problem: %v", err)
	}
	if u0, ok := nf.Threshold(); len(ks) > 0 && (!ok || u0.Sign() != 0) {
		return errors.New("this geometry leaves only xp >= d^2/(4ab) > 0 of quadrant III free, but the exponential profiles reach xp = 0; certify the bare quadrant (--exp none) instead")
	}
	for _, k := range ks {
		if _, err := regions.NewTerm(interval.PointF(0), "exp", map[string]string{"k": k}); err != nil {
			return fmt.Errorf("--exp %s: %v", k, err)
		}
	}
	if len(weights) == 0 {
		return nil
	}
	if len(weights) != len(ks) {
		return fmt.Errorf("--weights: %d weights given for %d profiles", len(weights), len(ks))
	}
	for i, w := range weights {
		if _, err := regions.ParseRat(w); err != nil {
			return fmt.Errorf("--weights: weight %d: %v", i+1, err)
		}
	}
	return nil
}
