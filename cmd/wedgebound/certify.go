package main

import (
	"encoding/json"
	"fmt"
	"io"
	"os"
	"strings"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/certify/relaxation"
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
	out := fs.String("out", "", "certificate file to write (required)")
	exps := fs.String("exp", "0.03,0.13,0.79,5.3,40,300,1000,3000", "comma-separated decay rates k of the exponential profiles e^{-k xp} (\"none\" for the bare quadrant)")
	weights := fs.String("weights", "", "comma-separated exact weights for the profiles (default: searched)")
	weightBound := fs.Float64("weight-bound", 0, "bound on the searched weights (default max(50, k_max/15))")
	margin := fs.Float64("margin", 2e-5, "how far above the float candidate the cover aims")
	prec := fs.Int("prec", 53, "working precision of the cover in bits (53: float64 intervals; 54..65536: big.Float intervals, slower)")
	workers := fs.Int("workers", 0, "goroutines (default: all cores); the certificate does not depend on it")
	shard := fs.String("shard", "", "prove only part I of N of the cover (I/N, 1 <= I <= N) and write a partial certificate for \"wedgebound merge\"")
	asJSON := fs.Bool("json", false, "print a JSON summary with the proved bound in the field bound")
	quiet := fs.Bool("quiet", false, "no progress display")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound certify (--preset NAME | --problem FILE) --out FILE [flags]")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
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
	if *prec < 53 || *prec > 65536 {
		return fail("--prec %d is outside 53..65536", *prec)
	}
	if *margin <= 0 || *margin > 1 {
		return fail("--margin must lie in (0, 1]")
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
	cfg := relaxation.Config{Problem: p, WeightBound: *weightBound, Margin: *margin, Workers: *workers, Prec: uint(*prec)}
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
	for i, k := range ks {
		t := certificates.Term{Kind: "exp", Params: map[string]string{"k": k}}
		if ws != nil {
			t.Weight = ws[i]
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
	cfg.Progress = bar.update
	res, err := relaxation.Run(cfg)
	bar.done()
	if err != nil {
		fmt.Fprintf(stderr, "wedgebound certify: %v\n", err)
		return 1
	}
	if err := certificates.WriteFile(*out, res.Certificate); err != nil {
		fmt.Fprintf(stderr, "wedgebound certify: writing %s: %v\n", *out, err)
		return 1
	}
	bound := res.Certificate.Relaxation.Claim.Bound
	if *asJSON {
		b, _ := json.MarshalIndent(struct {
			Bound     string  `json:"bound"`
			Edge      string  `json:"edge"`
			Candidate float64 `json:"candidate"`
			Cells     int     `json:"cells"`
			Seconds   float64 `json:"seconds"`
			File      string  `json:"file"`
			SHA256    string  `json:"sha256"`
		}{bound, string(p.Edge), res.Candidate, len(res.Certificate.Relaxation.Cover), res.Elapsed.Seconds(), *out, res.Certificate.SHA256}, "", "  ")
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
