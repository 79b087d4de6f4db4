package main

import (
	"bytes"
	"encoding/json"
	"math/big"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"wedgebound/certificates"
)

// shippedCert is the backflow certificate shipped with the repository.
const shippedCert = "../../testdata/backflow.json"

// publishedBackflow is the numerical (not rigorous) estimate of the backflow
// constant by A. J. Bracken and G. F. Melloy, J. Phys. A 27 (1994) 2197: a
// certified upper bound must lie above it.
const publishedBackflow = "0.0384517"

func report(args ...string) (int, string, string) {
	var out, errb bytes.Buffer
	code := runReport(args, &out, &errb)
	return code, out.String(), errb.String()
}

// rawClaim reads the claimed bound and the hash with encoding/json alone,
// independently of the certificates package.
func rawClaim(t *testing.T, path string) (bound, hash string) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var raw struct {
		Relaxation struct {
			Claim struct {
				Bound string `json:"bound"`
			} `json:"claim"`
		} `json:"relaxation"`
		SHA256 string `json:"sha256"`
	}
	if err := json.Unmarshal(b, &raw); err != nil {
		t.Fatal(err)
	}
	return raw.Relaxation.Claim.Bound, raw.SHA256
}

// splitRow splits a Markdown table row at unescaped pipes (GitHub-flavoured
// Markdown tables: a row starts and ends with '|', "\|" is a literal pipe).
func splitRow(line string) ([]string, bool) {
	if !strings.HasPrefix(line, "|") || !strings.HasSuffix(line, "|") || strings.HasSuffix(line, "\\|") {
		return nil, false
	}
	var cells []string
	var cur strings.Builder
	for i := 1; i < len(line); i++ {
		c := line[i]
		if c == '\\' && i+1 < len(line) {
			cur.WriteByte(c)
			cur.WriteByte(line[i+1])
			i++
			continue
		}
		if c == '|' {
			cells = append(cells, strings.TrimSpace(cur.String()))
			cur.Reset()
			continue
		}
		cur.WriteByte(c)
	}
	return cells, true
}

// parseTable returns the header and body rows of the first Markdown table in
// s, failing the test on a malformed table.
func parseTable(t *testing.T, s string) (header []string, rows [][]string) {
	t.Helper()
	var lines []string
	for _, l := range strings.Split(s, "\n") {
		if strings.HasPrefix(l, "|") {
			lines = append(lines, l)
		} else if len(lines) > 0 {
			break
		}
	}
	if len(lines) < 3 {
		t.Fatalf("want a header, a separator and rows, got %d table lines in\n%s", len(lines), s)
	}
	header, ok := splitRow(lines[0])
	if !ok {
		t.Fatalf("header %q is not a table row", lines[0])
	}
	sep, ok := splitRow(lines[1])
	if !ok || len(sep) != len(header) {
		t.Fatalf("separator %q does not match the %d header cells", lines[1], len(header))
	}
	dash := regexp.MustCompile(`^:?-{3,}:?$`)
	for _, c := range sep {
		if !dash.MatchString(c) {
			t.Fatalf("separator cell %q is not ---", c)
		}
	}
	for _, l := range lines[2:] {
		cells, ok := splitRow(l)
		if !ok || len(cells) != len(header) {
			t.Fatalf("row %q has %d cells, header %d", l, len(cells), len(header))
		}
		for _, c := range cells {
			if c == "" {
				t.Errorf("row %q has an empty cell", l)
			}
		}
		rows = append(rows, cells)
	}
	return header, rows
}

// writeVariant writes a resealed copy of the shipped certificate after edit.
func writeVariant(t *testing.T, dir, name string, edit func(*certificates.Relaxation)) string {
	t.Helper()
	c, err := certificates.ReadFile(shippedCert)
	if err != nil {
		t.Fatal(err)
	}
	edit(c.Relaxation)
	path := filepath.Join(dir, name)
	if err := certificates.WriteFile(path, c); err != nil {
		t.Fatal(err)
	}
	return path
}

// asShard marks the shipped certificate as shard 2 of 3 of its own range
// (a formatting fixture: shard certificates print as partial).
func asShard(r *certificates.Relaxation) {
	r.Shard = &certificates.Shard{Index: 1, Count: 3, Lo: r.Below.From, Hi: r.Above.From}
}

func TestReportMarkdownTableParses(t *testing.T) {
	bound, hash := rawClaim(t, shippedCert)
	code, out, errs := report("--format", "markdown", shippedCert, shippedCert)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	header, rows := parseTable(t, out)
	want := []string{"Problem", "Profiles or basis", "Proved bound", "Error budget", "Precision", "SHA-256"}
	if strings.Join(header, "|") != strings.Join(want, "|") {
		t.Errorf("header %q, want %q", header, want)
	}
	if len(rows) != 2 {
		t.Fatalf("%d rows for 2 files", len(rows))
	}
	r := rows[0]
	if r[0] != "backflow geometry; lower edge" {
		t.Errorf("problem cell %q", r[0])
	}
	if r[1] != "exp x12 (k = 0.1, 0.2848, 0.8111, 2.31, 6.579, 18.74, 53.37, 152, 432.9, 1233, 3511, 10000)" {
		t.Errorf("family cell %q", r[1])
	}
	if r[2] != "-inf spec <= "+bound {
		t.Errorf("bound cell %q, want the claim %s", r[2], bound)
	}
	// The printed bound is an upper bound on the backflow constant, so it
	// must lie above the published estimate (Bracken and Melloy 1994).
	b, ok := new(big.Rat).SetString(strings.TrimPrefix(r[2], "-inf spec <= "))
	if !ok || b.Cmp(ratOfString(publishedBackflow)) <= 0 {
		t.Errorf("bound %q does not lie above the published estimate %s", r[2], publishedBackflow)
	}
	for _, kind := range []string{"quadrature ", "truncation ", "tail \\|B\\| ", "rounding "} {
		if !strings.Contains(r[3], kind) {
			t.Errorf("budget cell %q lacks %q", r[3], kind)
		}
	}
	if r[4] != "53 bits" || r[5] != hash[:12] {
		t.Errorf("precision %q, hash %q (want %s)", r[4], r[5], hash[:12])
	}
}

func ratOfString(s string) *big.Rat {
	r, _ := new(big.Rat).SetString(s)
	return r
}

// Budget entries are upper bounds, so the compact form rounds up: checked
// by hand arithmetic (common practice).
func TestBudgetRoundsUp(t *testing.T) {
	sci := func(m string, e int) string { return m + "e" + itoa(e) }
	for in, want := range map[string]string{
		"0.000000000000283":         "2.83e-13",
		"0.00000000000000000000286": "2.86e-21",
		"0.185":                     "0.185",
		"0.00012341":                "1.24e-4",
		"0.0009999":                 "1e-3",
		"12345":                     "1.24e4",
		"0":                         "0",
	} {
		if got := budgetValue(in, sci); got != want {
			t.Errorf("budgetValue(%s) = %s, want %s", in, got, want)
		}
		if in != "0" {
			got := budgetValue(in, sci)
			r, ok := new(big.Rat).SetString(got)
			if !ok || r.Cmp(ratOfString(in)) < 0 {
				t.Errorf("%s is not an upper bound of %s", got, in)
			}
		}
	}
}

func itoa(e int) string { return big.NewInt(int64(e)).String() }

func TestReportTextSummary(t *testing.T) {
	bound, hash := rawClaim(t, shippedCert)
	code, out, errs := report("--format", "text", shippedCert)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, want := range []string{
		"-inf spec(P Op(chi_W) P) <= " + bound,
		hash,
		"S = [[1, 1], [-1, 0]]",
		"H' = {x + p > 0}",
		"d^2/(4ab) = 0",
		"P Op(chi_W) P = P Op(g) P",
		"1390 cells from s = -7700 to s = 1613",
		"k = 10000, weight 1000",
		"wedgecheck " + shippedCert,
	} {
		if !strings.Contains(strings.Join(strings.Fields(out), " "), want) {
			t.Errorf("summary lacks %q", want)
		}
	}
	for _, l := range strings.Split(out, "\n") {
		if len(l) > 78 && !strings.Contains(l, hash) && !strings.HasPrefix(l, "==") {
			t.Errorf("line longer than 78 columns: %q", l)
		}
	}
	if strings.Contains(out, "PARTIAL") {
		t.Error("a complete certificate reported as partial")
	}
}

func TestReportPartial(t *testing.T) {
	dir := t.TempDir()
	part := writeVariant(t, dir, "part.json", asShard)
	code, out, errs := report(part)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	flat := strings.Join(strings.Fields(out), " ")
	if !strings.Contains(flat, "PARTIAL CERTIFICATE. This is shard 2 of 3") || !strings.Contains(flat, "proves nothing on its own") {
		t.Errorf("partial certificate not reported as partial:\n%s", out)
	}
	if strings.Contains(out, "\nClaim.") {
		t.Error("a partial certificate is shown with a claim")
	}
	_, md, _ := report("--format", "markdown", part)
	_, rows := parseTable(t, md)
	if rows[0][2] != "partial: shard 2 of 3, no claim on its own" {
		t.Errorf("bound cell of a shard: %q", rows[0][2])
	}
}

// With a b = 0 < d no profile is admissible (regions package doc): a bare
// quadrant certificate with threshold none is reported, one with terms is
// refused. Formatting fixtures built from the shipped certificate.
func TestReportNoThreshold(t *testing.T) {
	dir := t.TempDir()
	noRoom := func(r *certificates.Relaxation) {
		r.Normal.A, r.Normal.D, r.Normal.Threshold = certificates.MustFraction("0"), certificates.MustFraction("1"), certificates.MustThreshold(certificates.NoThreshold)
	}
	bare := writeVariant(t, dir, "bare.json", func(r *certificates.Relaxation) { noRoom(r); r.Terms = nil })
	code, out, errs := report(bare)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	flat := strings.Join(strings.Fields(out), " ")
	for _, want := range []string{"No profiles: g = chi_Q", "no profile is admissible (recorded threshold none)"} {
		if !strings.Contains(flat, want) {
			t.Errorf("summary lacks %q", want)
		}
	}
	_, md, _ := report("--format", "markdown", bare)
	if _, rows := parseTable(t, md); rows[0][1] != "none (bare quadrant)" {
		t.Errorf("family cell %q", rows[0][1])
	}
	withTerms := writeVariant(t, dir, "terms.json", noRoom)
	if code, _, errs := report(withTerms); code != 1 || !strings.Contains(errs, "no room for profiles") {
		t.Errorf("terms without room: exit %d, %q", code, errs)
	}
	wrong := writeVariant(t, dir, "wrong.json", func(r *certificates.Relaxation) { r.Normal.Threshold = certificates.MustThreshold("0.5") })
	if code, _, errs := report(wrong); code != 1 || !strings.Contains(errs, "is not d^2/(4ab) = 0") {
		t.Errorf("wrong threshold: exit %d, %q", code, errs)
	}
}

func TestReportDeterministic(t *testing.T) {
	for _, f := range []string{"text", "markdown", "latex"} {
		_, a, _ := report("--format", f, shippedCert, shippedCert)
		_, b, _ := report("--format", f, shippedCert, shippedCert)
		if a != b || a == "" {
			t.Errorf("format %s: output differs between runs or is empty", f)
		}
	}
}

func TestReportSaveFile(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "r.md")
	code, stdout, errs := report("--format", "markdown", "--save", out, shippedCert)
	if code != 0 || stdout != "" {
		t.Fatalf("exit %d, stdout %q, stderr %s", code, stdout, errs)
	}
	_, want, _ := report("--format", "markdown", shippedCert)
	got, err := os.ReadFile(out)
	if err != nil || string(got) != want {
		t.Errorf("--save file differs from standard output (%v)", err)
	}
}

// compileLaTeX runs pdflatex on doc in a fresh directory and returns the log.
func compileLaTeX(t *testing.T, doc string) string {
	t.Helper()
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "t.tex"), []byte(doc), 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command("pdflatex", "-interaction=nonstopmode", "-halt-on-error", "t.tex")
	cmd.Dir = dir
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("pdflatex failed: %v\n%s\n--- document ---\n%s", err, out, doc)
	}
	if st, err := os.Stat(filepath.Join(dir, "t.pdf")); err != nil || st.Size() == 0 {
		t.Fatalf("no PDF written: %v", err)
	}
	log, _ := os.ReadFile(filepath.Join(dir, "t.log"))
	return string(log)
}

func TestReportLaTeXCompiles(t *testing.T) {
	if _, err := exec.LookPath("pdflatex"); err != nil {
		t.Skip("pdflatex is not on PATH")
	}
	code, doc, errs := report("--format", "latex", "--standalone", shippedCert)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	log := compileLaTeX(t, doc)
	if strings.Contains(log, "Overfull \\hbox") {
		t.Errorf("the standalone table is wider than the text:\n%s", log)
	}
	// The fragment pastes into a plain article, and arbitrary kind names
	// and parameter names are escaped.
	dir := t.TempDir()
	odd := writeVariant(t, dir, "odd.json", func(r *certificates.Relaxation) {
		r.Terms[0].Kind = `e_x&p%$#{}~^\<>|"`
		r.Terms[1].Params = map[string]certificates.Decimal{"k_1&": certificates.MustDecimal("0.79"), "b": certificates.MustDecimal("0.00001")}
		asShard(r)
	})
	code, frag, errs := report("--format", "latex", shippedCert, odd)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if strings.Contains(frag, "documentclass") {
		t.Error("the fragment holds a document class")
	}
	compileLaTeX(t, "\\documentclass{article}\n\\begin{document}\n"+frag+"\\end{document}\n")
}

func TestReportBadInput(t *testing.T) {
	dir := t.TempDir()
	data, err := os.ReadFile(shippedCert)
	if err != nil {
		t.Fatal(err)
	}
	stale := filepath.Join(dir, "stale.json")
	os.WriteFile(stale, bytes.Replace(data, []byte(`"bound": "0.0394391"`), []byte(`"bound": "0.0394390"`), 1), 0o644)
	garbage := filepath.Join(dir, "garbage.json")
	os.WriteFile(garbage, []byte("{not json"), 0o644)
	// A sealed certificate whose claim its own recorded cells do not support.
	overclaim := writeVariant(t, dir, "overclaim.json", func(r *certificates.Relaxation) {
		r.Claim.Bound = certificates.MustDecimal("0.03")
		r.Claim.Statement = "overclaimed"
	})
	for _, tc := range []struct {
		name string
		args []string
		code int
		msg  string
	}{
		{"missing file", []string{filepath.Join(dir, "none.json")}, 2, "no such file"},
		{"stale hash", []string{stale}, 2, "stale"},
		{"garbage", []string{"--format", "markdown", garbage}, 2, "malformed certificate"},
		{"unknown format", []string{"--format", "html", shippedCert}, 2, "--format"},
		{"standalone markdown", []string{"--format", "markdown", "--standalone", shippedCert}, 2, "--standalone"},
		{"no files", nil, 2, "no certificate files"},
		{"overclaim", []string{overclaim}, 1, "does not support the claimed bound 0.03"},
	} {
		code, out, errs := report(tc.args...)
		if code != tc.code {
			t.Errorf("%s: exit %d, want %d", tc.name, code, tc.code)
		}
		if out != "" {
			t.Errorf("%s: output %q on failure", tc.name, out)
		}
		if strings.Count(errs, "\n") != 1 || !strings.Contains(errs, tc.msg) || !strings.HasPrefix(errs, "wedgebound report: ") {
			t.Errorf("%s: want one line with %q, got %q", tc.name, tc.msg, errs)
		}
	}
}
