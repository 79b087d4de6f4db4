package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"sort"
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
	exps := fs.String("exp", strings.Join(relaxation.DefaultExpRates, ","), "comma-separated decay rates k of the exponential profiles e^{-k xp} (\"none\" for the bare quadrant); the default is used only when the geometry admits profiles from xp = 0, other geometries get the default bands and step of their threshold")
	weights := fs.String("weights", "", "comma-separated exact weights for the --exp profiles (default: searched)")
	termFlags := fs.StringArray("term", nil, "one relaxation term KIND,NAME=VALUE,...[,weight=W] (repeatable; kinds: "+strings.Join(regions.TermKinds(), ", ")+"), e.g. band,from=0.25,to=0.5 or step,from=1; give a weight for every term or for none (searched)")
	termsFile := fs.String("terms", "", "JSON file with relaxation terms [{\"kind\":..., \"params\":{...}, \"weight\":...}] (weights optional: all or none)")
	weightBound := fs.Float64("weight-bound", 0, "bound on the searched weights (0: max(50, k_max/10))")
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
	given := 0
	for _, b := range []bool{fs.Changed("exp"), len(*termFlags) > 0, *termsFile != ""} {
		if b {
			given++
		}
	}
	if given > 1 {
		return fail("give at most one of --exp, --term and --terms")
	}
	if *weights != "" && (len(*termFlags) > 0 || *termsFile != "") {
		return fail("--weights goes with --exp; give the weights of --term and --terms terms as weight=W or \"weight\"")
	}
	var specs []termSpec
	var err error
	switch {
	case len(*termFlags) > 0:
		if specs, err = certifyTermFlags(*termFlags); err != nil {
			return fail("%v", err)
		}
	case *termsFile != "":
		data, err := os.ReadFile(*termsFile)
		if err != nil {
			return fail("%v", err)
		}
		if specs, err = certifyTermsFile(data); err != nil {
			return fail("%s: %v", *termsFile, err)
		}
	default:
		nf, err := regions.Normalize(p)
		if err != nil {
			return fail("the problem: %v", err)
		}
		u0, ok := nf.Threshold()
		if !fs.Changed("exp") && !(ok && u0.Sign() == 0) {
			for _, t := range relaxation.DefaultTerms(u0, ok) {
				specs = append(specs, termSpec{Kind: t.Kind, Params: t.ParamText()})
			}
			if *weights != "" {
				return fail("--weights goes with --exp; this geometry's default terms are %s", describeTerms(specs))
			}
			break
		}
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
			t := termSpec{Kind: "exp", Params: map[string]string{"k": k}}
			if ws != nil {
				t.Weight = ws[i]
			}
			specs = append(specs, t)
		}
	}
	if err := checkCertifyInput(p, specs); err != nil {
		return fail("%v", err)
	}
	if cfg.Terms, err = certifyTerms(specs); err != nil {
		return fail("%v", err)
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
// find later: a problem without a normal form, unknown families or bad
// parameters, profiles the geometry does not admit, weights that are not
// finite decimals, weights given for some terms but not all, and hat
// profiles (the verifier has no route for them yet). Such
// input is the user's (exit 2).
func checkCertifyInput(p regions.Problem, terms []termSpec) error {
	nf, err := regions.Normalize(p)
	if err != nil {
		return fmt.Errorf("the problem: %v", err)
	}
	u0, ok := nf.Threshold()
	weighted := 0
	for i, t := range terms {
		rt, err := regions.NewTerm(interval.PointF(0), t.Kind, t.Params)
		if err != nil {
			return fmt.Errorf("term %d (%s): %v", i+1, t.Kind, err)
		}
		if t.Kind == "hat" {
			return fmt.Errorf("term %d: hat profiles are not yet known to wedgecheck, so a certificate holding them could not be re-checked; use bands and steps (wedgebound spectrum takes hats)", i+1)
		}
		if err := regions.Admissible(rt.Kind(), rt.Start(), u0, ok); err != nil {
			if t.Kind == "exp" {
				return fmt.Errorf("this geometry leaves only xp >= d^2/(4ab) > 0 of quadrant III free, but the exponential profiles reach xp = 0; use bands and steps (--term band,from=...,to=... or --term step,from=...; the default does so) or the bare quadrant (--exp none)")
			}
			return fmt.Errorf("term %d: %v", i+1, err)
		}
		for name, v := range t.Params {
			if _, err := certificates.ParseDecimal(v); err != nil {
				return fmt.Errorf("term %d (%s): parameter %s: %v (certificates take finite decimals; the band [a, inf) is step,from=a)", i+1, t.Kind, name, err)
			}
		}
		if t.Weight != "" {
			weighted++
			if _, err := regions.ParseRat(t.Weight); err != nil {
				return fmt.Errorf("term %d weight: %v", i+1, err)
			}
		}
	}
	if weighted != 0 && weighted != len(terms) {
		return fmt.Errorf("weights given for %d of %d terms: give all of them or none (searched)", weighted, len(terms))
	}
	return nil
}

// certifyTermFlags reads --term flags KIND,NAME=VALUE,...[,weight=W]
// (certify and spectrum share this grammar).
func certifyTermFlags(flags []string) ([]termSpec, error) {
	var out []termSpec
	for _, f := range flags {
		parts := strings.Split(f, ",")
		t := termSpec{Kind: strings.TrimSpace(parts[0]), Params: map[string]string{}}
		for _, p := range parts[1:] {
			name, value, ok := strings.Cut(p, "=")
			name, value = strings.TrimSpace(name), strings.TrimSpace(value)
			if !ok || name == "" || value == "" {
				return nil, fmt.Errorf("--term %q: %q is not NAME=VALUE", f, p)
			}
			if name == "weight" {
				t.Weight = value
				continue
			}
			if _, dup := t.Params[name]; dup {
				return nil, fmt.Errorf("--term %q: %s given twice", f, name)
			}
			t.Params[name] = value
		}
		out = append(out, t)
	}
	return out, nil
}

// certifyTermsFile reads a JSON array of terms strictly (weights optional).
func certifyTermsFile(data []byte) ([]termSpec, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var specs []termSpec
	if err := dec.Decode(&specs); err != nil {
		return nil, fmt.Errorf("malformed terms: %v", err)
	}
	if len(specs) == 0 {
		return nil, errors.New("no terms given")
	}
	return specs, nil
}

// certifyTerms turns checked term specs into certificate terms (exact
// decimals; an empty weight stays unset, to be searched).
func certifyTerms(specs []termSpec) ([]certificates.Term, error) {
	out := make([]certificates.Term, len(specs))
	for i, s := range specs {
		t := certificates.Term{Kind: s.Kind, Params: map[string]certificates.Decimal{}}
		for name, v := range s.Params {
			d, err := certificates.ParseDecimal(v)
			if err != nil {
				return nil, fmt.Errorf("term %d (%s): parameter %s: %v", i+1, s.Kind, name, err)
			}
			t.Params[name] = d
		}
		if s.Weight != "" {
			w, err := certificates.ParseDecimal(s.Weight)
			if err != nil {
				return nil, fmt.Errorf("term %d weight: %v", i+1, err)
			}
			t.Weight = w
		}
		out[i] = t
	}
	return out, nil
}

// describeTerms writes terms as --term flags.
func describeTerms(terms []termSpec) string {
	var parts []string
	for _, t := range terms {
		names := make([]string, 0, len(t.Params))
		for n := range t.Params {
			names = append(names, n)
		}
		sort.Strings(names)
		s := t.Kind
		for _, n := range names {
			s += "," + n + "=" + t.Params[n]
		}
		parts = append(parts, s)
	}
	if len(parts) == 0 {
		return "none (the bare quadrant)"
	}
	return strings.Join(parts, " ")
}
