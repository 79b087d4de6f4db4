package main

import (
	"fmt"
	"io"
	"math/big"
	"sort"
	"strings"

	"github.com/spf13/pflag"

	"wedgebound/certificates"
	"wedgebound/interval"
	"wedgebound/regions"
)

func init() {
	register("report", "turn certificates into a LaTeX or Markdown table or a plain-text proof summary", runReport)
}

// Report formats.
const (
	formatLaTeX    = "latex"
	formatMarkdown = "markdown"
	formatText     = "text"
)

// reportItem is one certificate to report on: exactly one of rel and
// strip is set, by kind.
type reportItem struct {
	file  string
	cert  *certificates.Certificate
	rel   *certificates.Relaxation
	strip *certificates.Strip
	// precession, for a precession-bracket certificate, is its section.
	precession *certificates.Precession
}

func runReport(args []string, stdout, stderr io.Writer) int {
	fs := pflag.NewFlagSet("report", pflag.ContinueOnError)
	fs.SetOutput(stderr)
	format := fs.String("format", formatText, "output format: latex (a tabular), markdown (a table) or text (a proof summary per certificate)")
	standalone := fs.Bool("standalone", false, "with --format latex: wrap the table in a minimal \\documentclass{article} document")
	save := fs.String("save", "", helpSave)
	addQuiet(fs)
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: wedgebound report [--format latex|markdown|text] [--standalone] [--save FILE] CERTIFICATE.json...")
		fmt.Fprintln(stderr, "Reports every certificate kind; one table can mix kinds.")
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		if err == pflag.ErrHelp {
			return 0
		}
		fmt.Fprintf(stderr, "wedgebound report: %v (see --help)\n", err)
		return 2
	}
	fail := func(code int, format string, a ...any) int {
		fmt.Fprintf(stderr, "wedgebound report: "+format+"\n", a...)
		return code
	}
	switch *format {
	case formatLaTeX, formatMarkdown, formatText:
	default:
		return fail(2, "--format %q: want latex, markdown or text", *format)
	}
	if *standalone && *format != formatLaTeX {
		return fail(2, "--standalone needs --format latex")
	}
	if fs.NArg() == 0 {
		return fail(2, "no certificate files given")
	}
	if err := checkOutput("--save", *save); err != nil {
		return fail(2, "%v", err)
	}
	// emit writes the finished report to --save (atomically) or stdout.
	emit := func(text string) int {
		if *save != "" {
			return writeOut(stderr, "report", *save, []byte(text))
		}
		io.WriteString(stdout, text)
		return 0
	}
	// Only precession certificates: their own table; mixed with other
	// kinds, they are rows of the common table below.
	if precs, ok, err := readPrecessionItems(fs.Args()); ok && err == nil {
		return emit(renderPrecessionReport(*format, *standalone, precs))
	}
	if ws, ok := readWitnessReports(fs.Args()); ok {
		return emit(renderWitnessReport(*format, *standalone, ws))
	}
	var items []reportItem
	var brackets []bracketItem
	var witnesses []witnessReport
	for _, f := range fs.Args() {
		if w, ok := readWitnessReport(f); ok {
			witnesses = append(witnesses, w)
			continue
		}
		if bi, ok, err := readBracketItem(f); ok || err != nil {
			if err != nil {
				return fail(2, "%s: %s", f, oneLineText(err.Error()))
			}
			brackets = append(brackets, bi)
			continue
		}
		it, err := readReportItem(f)
		if err != nil {
			return fail(2, "%s: %s", f, oneLineText(err.Error()))
		}
		if err := it.consistent(); err != nil {
			return fail(1, "%s: %s", f, oneLineText(err.Error()))
		}
		items = append(items, it)
	}
	text := ""
	if len(items) > 0 {
		text = renderReport(*format, *standalone, items)
	}
	if len(brackets) > 0 {
		var b strings.Builder
		if text != "" {
			b.WriteString("\n")
		}
		writeBrackets(&b, *format, brackets)
		text += b.String()
	}
	if len(witnesses) > 0 {
		if text != "" {
			text += "\n"
		}
		text += renderWitnessReport(*format, false, witnesses)
	}
	return emit(text)
}

// readReportItem reads a certificate strictly (schema, structure, hash).
func readReportItem(path string) (reportItem, error) {
	c, err := certificates.ReadFile(path)
	if err != nil {
		return reportItem{}, err
	}
	if len(c.SHA256) != 64 {
		return reportItem{}, fmt.Errorf("sha256 %q is not 64 hex digits", c.SHA256)
	}
	switch {
	case c.Kind == certificates.KindRelaxation && c.Relaxation != nil:
		return reportItem{file: path, cert: c, rel: c.Relaxation}, nil
	case c.Kind == certificates.KindStrip && c.Strip != nil:
		return reportItem{file: path, cert: c, strip: c.Strip}, nil
	case c.Kind == certificates.KindPrecession && c.Precession != nil:
		return reportItem{file: path, cert: c, precession: c.Precession}, nil
	}
	return reportItem{}, fmt.Errorf("certificate kind %q is not reported by this version", c.Kind)
}

// renderReport formats the items; the output depends only on the files'
// content and names.
func renderReport(format string, standalone bool, items []reportItem) string {
	var b strings.Builder
	switch format {
	case formatLaTeX:
		writeLaTeX(&b, items, standalone)
	case formatMarkdown:
		writeMarkdown(&b, items)
	default:
		for i, it := range items {
			if i > 0 {
				b.WriteString("\n")
			}
			if it.precession != nil {
				writePrecessionSummary(&b, it)

			} else if it.strip != nil {
				writeStripSummary(&b, it)
			} else {
				writeSummary(&b, it)
			}
		}
	}
	return b.String()
}

func oneLineText(s string) string { return strings.Join(strings.Fields(s), " ") }

// exact is a number of the schema, read and validated by ReadFile.
type exact interface {
	Rat() *big.Rat
	String() string
}

// rat is the exact value of a validated number.
func rat(n exact) *big.Rat { return n.Rat() }

// ---- checks on the recorded numbers ----

// consistent checks, exactly in rationals from the recorded decimals, that
// the normal form's threshold is d^2/(4ab), that every exp profile is
// admissible, and that every recorded cell enclosure and both tail bounds
// support the claim. A certificate failing these cannot pass verification,
// so the report refuses to restate it. It is no substitute for wedgecheck.
func (it reportItem) consistent() error {
	if it.precession != nil {
		return precessionConsistent(it.precession)
	}
	if it.strip != nil {
		return stripConsistent(it.strip)
	}
	r := it.rel
	if err := r.Normal.CheckThreshold(); err != nil {
		return err
	}
	thr, ok := r.Normal.Admissible()
	if !ok && len(r.Terms) > 0 {
		return fmt.Errorf("a b = 0 < d leaves no room for profiles, yet the certificate has %d terms", len(r.Terms))
	}
	for i, t := range r.Terms {
		term, err := regions.NewTerm(interval.F{}, t.Kind, t.ParamText())
		if err != nil {
			return fmt.Errorf("term %d: %v", i+1, err)
		}
		if err := regions.Admissible(term.Kind(), term.Start(), thr, ok); err != nil {
			return fmt.Errorf("term %d: %v: the relaxation is not admissible", i+1, err)
		}
	}
	return r.SupportsClaim()
}

// backflowEquivalent reports d = 0 < a, b: the squeeze (x, p) -> (l x, p/l)
// with l = sqrt(a/b) keeps the quadrant and maps {a x + b p > 0} onto
// {x + p > 0}, the backflow preset's normal form.
func backflowEquivalent(n certificates.NormalForm) bool {
	return rat(n.D).Sign() == 0 && rat(n.A).Sign() > 0 && rat(n.B).Sign() > 0
}

// ---- the pieces every format shows ----

// presetGeometry names the preset whose wedge and half-plane p has exactly
// (rays in either order), or "".
func presetGeometry(p certificates.Problem) string {
	eq := func(s certificates.Fraction, n regions.Number) bool { return rat(s).Cmp(n.Rat()) == 0 }
	for _, name := range regions.PresetNames() {
		q := regions.Presets[name]
		same := eq(p.Vertex[0], q.Vertex[0]) && eq(p.Vertex[1], q.Vertex[1]) &&
			eq(p.Halfplane.Normal[0], q.Halfplane.Normal[0]) && eq(p.Halfplane.Normal[1], q.Halfplane.Normal[1]) &&
			eq(p.Halfplane.Offset, q.Halfplane.Offset)
		ray := func(i, j int) bool { return eq(p.Rays[i][0], q.Rays[j][0]) && eq(p.Rays[i][1], q.Rays[j][1]) }
		if same && (ray(0, 0) && ray(1, 1) || ray(0, 1) && ray(1, 0)) {
			return name
		}
	}
	return ""
}

// num writes a validated number in canonical form (decimal or p/q).
func num(s exact) string { return certificates.FractionText(rat(s)) }

// pair writes (x, p).
func pair(a, b exact) string { return "(" + num(a) + ", " + num(b) + ")" }

// linear writes c1 x + c2 p (terms with coefficient 0 left out).
func linear(c1, c2 *big.Rat) string {
	var b strings.Builder
	for i, c := range []*big.Rat{c1, c2} {
		v := [2]string{"x", "p"}[i]
		if c.Sign() == 0 {
			continue
		}
		abs := new(big.Rat).Abs(c)
		coef := regions.RatString(abs)
		switch {
		case coef == "1":
			coef = ""
		case strings.Contains(coef, "/"):
			coef = "(" + coef + ")"
		}
		switch {
		case b.Len() == 0 && c.Sign() < 0:
			b.WriteString("-")
		case b.Len() > 0 && c.Sign() < 0:
			b.WriteString(" - ")
		case b.Len() > 0:
			b.WriteString(" + ")
		}
		b.WriteString(coef + v)
	}
	if b.Len() == 0 {
		return "0"
	}
	return b.String()
}

// halfplaneText writes the problem's half-plane as "n1 x + n2 p > c".
func halfplaneText(h certificates.Halfplane) string {
	return linear(rat(h.Normal[0]), rat(h.Normal[1])) + " > " + num(h.Offset)
}

// imageText writes the image half-plane "a x + b p > -d".
func imageText(n certificates.NormalForm) string {
	return linear(rat(n.A), rat(n.B)) + " > " + regions.RatString(new(big.Rat).Neg(rat(n.D)))
}

// problemShort is the table's problem cell in plain text.
func problemShort(r *certificates.Relaxation) string {
	p := r.Problem
	if name := presetGeometry(p); name != "" {
		return name + " geometry; " + p.Edge + " edge"
	}
	s := "W: vertex " + pair(p.Vertex[0], p.Vertex[1]) + ", rays " + pair(p.Rays[0][0], p.Rays[0][1]) + ", " +
		pair(p.Rays[1][0], p.Rays[1][1]) + "; H: " + halfplaneText(p.Halfplane) + "; " + p.Edge + " edge"
	return s
}

// problemLaTeX is the table's problem cell in LaTeX.
func problemLaTeX(r *certificates.Relaxation) string {
	p := r.Problem
	if name := presetGeometry(p); name != "" {
		return texEscape(name) + " geometry; " + texEscape(p.Edge) + " edge"
	}
	m := func(s string) string { return "$" + s + "$" }
	return "$W$: vertex " + m(pair(p.Vertex[0], p.Vertex[1])) + ", rays " + m(pair(p.Rays[0][0], p.Rays[0][1])) + ", " +
		m(pair(p.Rays[1][0], p.Rays[1][1])) + "; $H$: " + m(halfplaneText(p.Halfplane)) + "; " + texEscape(p.Edge) + " edge"
}

// termGroup is a run of terms of one kind.
type termGroup struct {
	kind  string
	terms []certificates.Term
}

// groupTerms groups the terms by kind in order of first appearance.
func groupTerms(ts []certificates.Term) []termGroup {
	var gs []termGroup
	at := map[string]int{}
	for _, t := range ts {
		i, ok := at[t.Kind]
		if !ok {
			i = len(gs)
			at[t.Kind] = i
			gs = append(gs, termGroup{kind: t.Kind})
		}
		gs[i].terms = append(gs[i].terms, t)
	}
	return gs
}

// paramKeys returns the sorted parameter names of a group (the union).
func paramKeys(g termGroup) []string {
	seen := map[string]bool{}
	var keys []string
	for _, t := range g.terms {
		for k := range t.Params {
			if !seen[k] {
				seen[k] = true
				keys = append(keys, k)
			}
		}
	}
	sort.Strings(keys)
	return keys
}

// familyParts returns, per group, the kind, count, and the parameter text:
// "k = 0.13, 0.79" for one parameter, "a = 1, b = 2; a = 3, b = 4" else.
// key and val format a parameter name and value.
func familyParts(ts []certificates.Term, kind, key, val func(string) string, times string) string {
	if len(ts) == 0 {
		return "none (bare quadrant)"
	}
	var parts []string
	for _, g := range groupTerms(ts) {
		keys := paramKeys(g)
		var vals []string
		if len(keys) == 1 {
			for _, t := range g.terms {
				vals = append(vals, val(t.Params[keys[0]].String()))
			}
			parts = append(parts, fmt.Sprintf("%s %s%d (%s = %s)", kind(g.kind), times, len(g.terms), key(keys[0]), strings.Join(vals, ", ")))
			continue
		}
		for _, t := range g.terms {
			var kv []string
			for _, k := range keys {
				if v, ok := t.Params[k]; ok {
					kv = append(kv, key(k)+" = "+val(v.String()))
				}
			}
			vals = append(vals, strings.Join(kv, ", "))
		}
		parts = append(parts, fmt.Sprintf("%s %s%d (%s)", kind(g.kind), times, len(g.terms), strings.Join(vals, "; ")))
	}
	return strings.Join(parts, "; ")
}

func familyText(ts []certificates.Term) string {
	id := func(s string) string { return s }
	return familyParts(ts, id, id, id, "x")
}

func familyLaTeX(ts []certificates.Term) string {
	key := func(s string) string {
		if len(s) == 1 && (s[0] >= 'a' && s[0] <= 'z' || s[0] >= 'A' && s[0] <= 'Z') {
			return "$" + s + "$"
		}
		return texEscape(s)
	}
	val := func(s string) string { return "$" + texNumber(s) + "$" }
	return familyParts(ts, texEscape, key, val, "$\\times$")
}

// partial describes a shard, or "" for a complete certificate.
func partial(r *certificates.Relaxation) string {
	if r.Shard == nil {
		return ""
	}
	return fmt.Sprintf("partial: shard %d of %d", r.Shard.Index+1, r.Shard.Count)
}

// boundText is the table's bound cell in plain text.
func boundText(r *certificates.Relaxation) string {
	if p := partial(r); p != "" {
		return p + ", no claim on its own"
	}
	if r.Claim.Edge == "upper" {
		return "sup spec <= " + r.Claim.Bound.String()
	}
	return "-inf spec <= " + r.Claim.Bound.String()
}

func boundLaTeX(r *certificates.Relaxation) string {
	if p := partial(r); p != "" {
		return texEscape(p + ", no claim on its own")
	}
	if r.Claim.Edge == "upper" {
		return "$\\sup\\sigma \\le " + texNumber(r.Claim.Bound.String()) + "$"
	}
	return "$-\\inf\\sigma \\le " + texNumber(r.Claim.Bound.String()) + "$"
}

// budgetEntry is one recorded error term.
type budgetEntry struct{ name, value string }

func budgetEntries(b certificates.Budget) []budgetEntry {
	return []budgetEntry{{"quadrature", b.Quadrature.String()}, {"truncation", b.Truncation.String()}, {"tail |B|", b.Tails.String()}, {"rounding", b.Rounding.String()}}
}

// upDigits rounds a non-negative rational up to n significant digits and
// returns its mantissa digits m (no trailing zeros) and exponent e with
// value m[0].m[1:] * 10^e; ok is false for zero.
func upDigits(v *big.Rat, n int) (m string, e int, ok bool) {
	if v.Sign() <= 0 {
		return "", 0, false
	}
	ten := big.NewRat(10, 1)
	pow := func(k int) *big.Rat {
		p := new(big.Rat).SetInt64(1)
		for i := 0; i < k; i++ {
			p.Mul(p, ten)
		}
		for i := 0; i > k; i-- {
			p.Quo(p, ten)
		}
		return p
	}
	// e with 10^e <= v < 10^(e+1).
	e = len(v.Num().String()) - len(v.Denom().String())
	for pow(e).Cmp(v) > 0 {
		e--
	}
	for pow(e+1).Cmp(v) <= 0 {
		e++
	}
	q := new(big.Rat).Quo(v, pow(e-n+1))
	mi := new(big.Int).Quo(q.Num(), q.Denom())
	if new(big.Rat).SetInt(mi).Cmp(q) < 0 {
		mi.Add(mi, big.NewInt(1))
	}
	m = mi.String()
	if len(m) > n { // carried to 10^n
		m = m[:n]
		e++
	}
	m = strings.TrimRight(m, "0")
	if m == "" {
		m = "0"
	}
	return m, e, true
}

// budgetValue writes an upper bound compactly, rounded up to 3 significant
// digits (so it stays an upper bound): as recorded when it is a short plain
// decimal in [0.001, 1000), else as m e k. sci formats the scientific form.
func budgetValue(s string, sci func(mant string, exp int) string) string {
	d, err := certificates.ParseDecimal(s)
	if err != nil {
		return s // not a recorded decimal: shown as it is
	}
	v := d.Rat()
	if v.Sign() == 0 {
		return "0"
	}
	if !strings.ContainsAny(s, "eE/") && len(s) <= 7 && v.Cmp(big.NewRat(1, 1000)) >= 0 && v.Cmp(big.NewRat(1000, 1)) < 0 {
		return s
	}
	m, e, _ := upDigits(v, 3)
	mant := m[:1]
	if len(m) > 1 {
		mant += "." + m[1:]
	}
	return sci(mant, e)
}

func budgetText(b certificates.Budget) string {
	var parts []string
	for _, e := range budgetEntries(b) {
		parts = append(parts, e.name+" "+budgetValue(e.value, func(m string, k int) string { return fmt.Sprintf("%se%d", m, k) }))
	}
	return strings.Join(parts, "; ")
}

func budgetLaTeX(b certificates.Budget) string {
	var parts []string
	for _, e := range budgetEntries(b) {
		v := budgetValue(e.value, func(m string, k int) string { return fmt.Sprintf("%s\\cdot 10^{%d}", m, k) })
		parts = append(parts, texEscape(e.name)+" $"+v+"$")
	}
	return strings.Join(parts, "\\newline ")
}

func precisionText(r *certificates.Relaxation) string { return fmt.Sprintf("%d bits", r.PrecisionBits) }

func hashPrefix(c *certificates.Certificate) string { return c.SHA256[:12] }

// ---- LaTeX ----

// texEscape makes arbitrary text safe in LaTeX text mode (OT1 fonts
// included, where < and > would print other glyphs).
func texEscape(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch r {
		case '\\':
			b.WriteString("\\textbackslash{}")
		case '{', '}', '$', '&', '%', '#', '_':
			b.WriteString("\\" + string(r))
		case '^':
			b.WriteString("\\^{}")
		case '~':
			b.WriteString("\\~{}")
		case '<':
			b.WriteString("\\textless{}")
		case '>':
			b.WriteString("\\textgreater{}")
		case '|':
			b.WriteString("\\textbar{}")
		case '"':
			b.WriteString("\\texttt{\\symbol{34}}") // OT1 has no text-mode straight quote
		case '\n', '\r', '\t':
			b.WriteString(" ")
		default:
			if r < 0x20 || r > 0x7e {
				b.WriteString("?") // plain pdflatex without inputenc options: keep ASCII
			} else {
				b.WriteRune(r)
			}
		}
	}
	return b.String()
}

// texNumber writes a validated decimal for math mode.
func texNumber(s string) string {
	for _, r := range s {
		if !(r >= '0' && r <= '9' || r == '.' || r == '-' || r == '+' || r == '/') {
			if m, e, ok := sciParts(s); ok {
				return m + "\\cdot 10^{" + e + "}"
			}
			return "\\mbox{" + texEscape(s) + "}"
		}
	}
	return s
}

// sciParts splits "1.5e-3" into "1.5" and "-3".
func sciParts(s string) (string, string, bool) {
	i := strings.IndexAny(s, "eE")
	if i <= 0 || i == len(s)-1 {
		return "", "", false
	}
	m, e := s[:i], strings.TrimPrefix(s[i+1:], "+")
	for _, part := range []string{strings.TrimLeft(m, "+-"), strings.TrimLeft(e, "-")} {
		if part == "" || strings.Trim(part, "0123456789.") != "" {
			return "", "", false
		}
	}
	return m, e, true
}

// reportLegend explains the table; spec names the spectrum as the cells
// write it ("spec" in text and Markdown, "sigma" in LaTeX).
func reportLegend(spec string) string {
	return spec + " is the spectrum of P Op(chi_W) P, where P projects onto the states whose Wigner function lives in the half-plane H; " +
		"for a finite strip, A(alpha) = -inf " + spec + " K_alpha and sup " + spec + " K is that of K_alpha; " +
		"P3 is the three-time precession constant; " +
		"the error budget lists the largest quadrature, truncation and rounding term recorded in the certificate (all are already included in the proved enclosures) " +
		"and, as tail |B|, the tail lemmas' bound on the off-diagonal entry |B(s)| at the ends of the cover (it enters the tail bounds, it is not added to the result); " +
		"SHA-256 gives the first 12 hex digits of the certificate hash; every bound can be re-checked with wedgecheck."
}

func writeLaTeX(b *strings.Builder, items []reportItem, standalone bool) {
	if standalone {
		b.WriteString("\\documentclass{article}\n")
		b.WriteString("\\setlength{\\textwidth}{6.5in}\n\\setlength{\\oddsidemargin}{0in}\n\\setlength{\\evensidemargin}{0in}\n")
		b.WriteString("\\begin{document}\n\\begin{table}[ht]\n\\centering\n\\footnotesize\n")
	} else {
		b.WriteString("% wedgebound report: " + reportLegend("sigma") + "\n")
	}
	b.WriteString("\\setlength{\\tabcolsep}{3pt}\n\\renewcommand{\\arraystretch}{1.15}\n")
	b.WriteString("\\begin{tabular}{p{3.4cm}p{2.9cm}p{3.2cm}p{3.1cm}ll}\n\\hline\n")
	b.WriteString("Problem & Profiles or basis & Proved bound & Error budget & Precision & SHA-256 \\\\\n\\hline\n")
	for _, it := range items {
		rr := "\\raggedright "
		var cells []string
		if it.precession != nil {
			cells = precessionCells(it, true)

		} else if s := it.strip; s != nil {
			cells = []string{rr + stripProblemLaTeX(s), rr + stripBasisLaTeX(s), rr + stripBoundLaTeX(s), rr + stripBudgetLaTeX(s),
				stripPrecision, "\\texttt{" + texEscape(hashPrefix(it.cert)) + "}"}
		} else {
			cells = []string{rr + problemLaTeX(it.rel), rr + familyLaTeX(it.rel.Terms), boundLaTeX(it.rel), rr + budgetLaTeX(it.rel.Budget),
				texEscape(precisionText(it.rel)), "\\texttt{" + texEscape(hashPrefix(it.cert)) + "}"}
		}
		b.WriteString(strings.Join(cells, " & ") + " \\\\\n\\hline\n")
	}
	b.WriteString("\\end{tabular}\n")
	if standalone {
		b.WriteString("\\caption{Certified spectral bounds. $\\sigma$ is the spectrum of $P\\,\\mathrm{Op}(\\chi_W)\\,P$, where $P$ projects onto " +
			"the states whose Wigner function lives in the half-plane $H$; for a finite strip, $\\sigma(K_\\alpha)$ is that of the strip operator " +
			"$K_\\alpha$ and $A(\\alpha) = -\\inf\\sigma(K_\\alpha)$. The error budget lists the largest quadrature, truncation and rounding " +
			"term recorded in the certificate, all already included in the proved enclosures, and, as tail $|B|$, the tail lemmas' bound on the " +
			"off-diagonal entry $|B(s)|$ at the ends of the cover, which enters the tail bounds and is not added to the result. SHA-256: the first 12 hex digits of the certificate hash; every " +
			"bound can be re-checked with \\texttt{wedgecheck}.}\n")
		b.WriteString("\\end{table}\n\\end{document}\n")
	}
}

// ---- Markdown ----

// mdEscape makes text safe inside a GitHub-flavoured Markdown table cell:
// pipes, backslashes and the characters that could start emphasis, code,
// links or HTML are escaped (an underscore inside a word and a '<' not
// followed by a letter, '/', '!' or '?' need no escape).
func mdEscape(s string) string {
	var b strings.Builder
	rs := []rune(s)
	alnum := func(i int) bool {
		if i < 0 || i >= len(rs) {
			return false
		}
		r := rs[i]
		return r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9'
	}
	for i, r := range rs {
		switch r {
		case '_':
			if alnum(i-1) && alnum(i+1) {
				b.WriteRune(r)
			} else {
				b.WriteString("\\_")
			}
		case '<':
			if i+1 < len(rs) && (alnum(i+1) || strings.ContainsRune("/!?", rs[i+1])) {
				b.WriteString("\\<")
			} else {
				b.WriteRune(r)
			}
		case '\\', '|', '*', '`', '[', ']', '&', '~':
			b.WriteString("\\" + string(r))
		case '\n', '\r', '\t':
			b.WriteString(" ")
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}

func writeMarkdown(b *strings.Builder, items []reportItem) {
	row := func(cells []string) {
		b.WriteString("| " + strings.Join(cells, " | ") + " |\n")
	}
	row([]string{"Problem", "Profiles or basis", "Proved bound", "Error budget", "Precision", "SHA-256"})
	row([]string{"---", "---", "---", "---", "---", "---"})
	for _, it := range items {
		var cells []string
		if it.precession != nil {
			cells = precessionCells(it, false)

		} else if s := it.strip; s != nil {
			cells = []string{stripProblemShort(s), stripBasisText(s), stripBoundText(s), stripBudgetText(s), stripPrecision, hashPrefix(it.cert)}
		} else {
			cells = []string{problemShort(it.rel), familyText(it.rel.Terms), boundText(it.rel), budgetText(it.rel.Budget),
				precisionText(it.rel), hashPrefix(it.cert)}
		}
		for i := range cells {
			cells[i] = mdEscape(cells[i])
		}
		row(cells)
	}
	b.WriteString("\n" + mdEscape(reportLegend("spec")) + "\n")
}

// ---- plain-text proof summary ----

// wrap fills text into lines of at most width columns after indent.
func wrap(b *strings.Builder, indent, text string, width int) {
	line := indent
	for _, w := range strings.Fields(text) {
		if len(line) > len(indent) && len(line)+1+len(w) > width {
			b.WriteString(line + "\n")
			line = indent
		}
		if len(line) > len(indent) {
			line += " "
		}
		line += w
	}
	if len(line) > len(indent) {
		b.WriteString(line + "\n")
	}
}

// weakestCell returns the cell whose recorded enclosure is closest to the
// claim: smallest eig_lower (edge lower) or largest eig_upper (edge upper).
func weakestCell(r *certificates.Relaxation) certificates.Cell {
	w := r.Cover[0]
	for _, c := range r.Cover[1:] {
		if r.Claim.Edge == "upper" {
			if rat(c.EigUpper).Cmp(rat(w.EigUpper)) > 0 {
				w = c
			}
		} else if rat(c.EigLower).Cmp(rat(w.EigLower)) < 0 {
			w = c
		}
	}
	return w
}

func writeSummary(b *strings.Builder, it reportItem) {
	const width = 78
	r, c := it.rel, it.cert
	p := r.Problem
	upper := r.Claim.Edge == "upper"
	eig, quantity := "lambda_min", "-inf spec(P Op(chi_W) P)"
	if upper {
		eig, quantity = "lambda_max", "sup spec(P Op(chi_W) P)"
	}
	para := func(head, text string) {
		b.WriteString("\n")
		wrap(b, "", head+" "+text, width)
	}
	b.WriteString("== " + it.file + " ==\n")
	wrap(b, "", fmt.Sprintf("Certificate %s (kind %s), sha256 %s, written by %s %s.", hashPrefix(c), c.Kind, c.SHA256, c.Tool.Name, c.Tool.Version), width)
	if sh := r.Shard; sh != nil {
		para("PARTIAL CERTIFICATE.", fmt.Sprintf("This is shard %d of %d of a sharded run over the s-range [%s, %s]; its cover is one part of the full cover and it proves nothing on its own. Join all %d parts with \"wedgebound merge --out FILE PART...\" and verify the merged certificate.",
			sh.Index+1, sh.Count, sh.Lo, sh.Hi, sh.Count))
	}
	name := presetGeometry(p)
	geom := ""
	if name != "" {
		geom = " (the " + name + " preset's geometry)"
	}
	para("Problem.", fmt.Sprintf("The wedge W with vertex %s spanned by the rays %s and %s, inside the half-plane H = {%s}%s. P projects onto the states whose Wigner function lives in H. Edge %s: the certificate bounds %s.",
		pair(p.Vertex[0], p.Vertex[1]), pair(p.Rays[0][0], p.Rays[0][1]), pair(p.Rays[1][0], p.Rays[1][1]), halfplaneText(p.Halfplane), geom, p.Edge, quantity))
	if r.Shard != nil {
		para("Local value (not a claim).", fmt.Sprintf("On this shard's cells and both tails, %s %s %s; the merged certificate's claim is the largest such bound over all shards.", eig, edgeCmp(r), boundSigned(r)))
	} else {
		para("Claim.", r.Claim.Statement+".")
	}
	n := r.Normal
	m := n.Map
	para("What was relaxed.", fmt.Sprintf("The exact map z -> S (z - %s) with S = [[%s, %s], [%s, %s]] (determinant 1) sends W onto the quadrant Q = {x > 0, p > 0} and H onto H' = {%s} (a = %s, b = %s, d = %s); by metaplectic covariance the spectrum does not change.",
		pair(p.Vertex[0], p.Vertex[1]), num(m[0]), num(m[1]), num(m[2]), num(m[3]), imageText(n), num(n.A), num(n.B), num(n.D)))
	if backflowEquivalent(n) && name != "backflow" {
		wrap(b, "", "Since d = 0 < a, b, the squeeze (x, p) -> (l x, p/l) with l = sqrt(a/b) keeps Q and maps H' onto {x + p > 0}, the backflow preset's normal form: this problem has the same spectrum as the backflow problem.", width)
	}
	if len(r.Terms) == 0 {
		wrap(b, "", "No profiles: g = chi_Q, the bare quadrant.", width)
	} else {
		wrap(b, "", fmt.Sprintf("The relaxed symbol is g = chi_Q + h(xp) on quadrant III {x < 0, p < 0}, with h the weighted sum of %d profile(s):", len(r.Terms)), width)
		for i, t := range r.Terms {
			var kv []string
			keys := make([]string, 0, len(t.Params))
			for k := range t.Params {
				keys = append(keys, k)
			}
			sort.Strings(keys)
			for _, k := range keys {
				kv = append(kv, k+" = "+t.Params[k].String())
			}
			form := ""
			if t.Kind == "exp" {
				form = " e^{-k xp}"
			}
			fmt.Fprintf(b, "  %2d. %s%s, %s, weight %s\n", i+1, t.Kind, form, strings.Join(kv, ", "), t.Weight)
		}
	}
	adm := "A point (-t, -u/t) of quadrant III, t > 0, lies outside H' for every t exactly when 2 sqrt(a b u) >= d, "
	if u, ok := n.Admissible(); ok {
		adm += fmt.Sprintf("so the free part of quadrant III is xp >= d^2/(4ab) = %s (the recorded threshold, recomputed here from a, b, d).", regions.RatString(u))
	} else {
		adm += "so with a b = 0 < d no hyperbola xp = u of quadrant III is free and no profile is admissible (recorded threshold none)."
	}
	switch {
	case len(r.Terms) == 0:
		adm += " There are no profiles, so g = chi_Q."
	default:
		var other []string
		for _, g := range groupTerms(r.Terms) {
			if g.kind != "exp" {
				other = append(other, g.kind)
			}
		}
		if len(other) == 0 {
			adm += " Every profile is an exponential, supported on xp > 0, and the threshold is 0, so every profile lives on xp >= threshold."
		} else {
			adm += fmt.Sprintf(" The exponential profiles live on xp > 0; the support of the profiles of kind %s is checked against the threshold by the verifier.", strings.Join(other, ", "))
		}
	}
	adm += " Hence g = chi_Q on H', that is g = chi_W on H after the map back; since the Wigner functions (and cross-Wigner functions) of states in the range of P live in H, P Op(chi_W) P = P Op(g) P, and the spectrum of P Op(chi_W) P lies in [inf spec Op(g), sup spec Op(g)] (its value 0 on the kernel of P included: the eigenvalues of M(s) below tend to 0 as s -> -infinity)."
	para("Why the relaxation is admissible.", adm)
	w := weakestCell(r)
	wv := w.EigLower
	if upper {
		wv = w.EigUpper
	}
	cmp := edgeCmp(r)
	para("How it is proved.", fmt.Sprintf("Split into the channels x > 0 and x < 0 and Mellin-transformed, Op(g) acts at each real s as a 2x2 Hermitian matrix M(s), and spec Op(g) is the closure of the union over s of the eigenvalues of M(s). The cover has %d cells from s = %s to s = %s, each with an interval enclosure of %s(M(s)) over the whole cell; the weakest recorded cell, s in [%s, %s], has %s %s %s. The tail lemma %s gives %s %s %s for s <= %s and %s %s %s for s >= %s. The interval arithmetic works at %d bits with outward rounding. Error budget (largest term of each kind; quadrature, truncation and rounding are included in the enclosures, tail |B| is the tail lemmas' bound on |B(s)| at the ends of the cover): %s. Every cell and both tails support the claim: this report checked that exactly from the recorded decimals (the verifier recomputes the enclosures themselves).",
		len(r.Cover), r.Cover[0].Lo, r.Cover[len(r.Cover)-1].Hi, eig, w.Lo, w.Hi, eig, cmp, wv,
		r.Below.Lemma, eig, cmp, r.Below.Bound, r.Below.From, eig, cmp, r.Above.Bound, r.Above.From,
		r.PrecisionBits, budgetText(r.Budget)))
	para("What the verifier recomputes.", "Run \"wedgecheck "+it.file+"\". It reads the file strictly and recomputes the SHA-256 of the canonical encoding (any edit is rejected); recomputes the normal form (the map, a, b, d and the threshold) exactly in rationals from the problem and checks every profile against the threshold; on every cell encloses the extreme eigenvalue of M(s) by its own numerics (closed forms for the quadrant entries and the diagonal, and the exponential profiles' off-diagonal integral by Clenshaw-Curtis quadrature on a differently turned path with its own remainder bound), bisecting a cell when needed; proves both tails with its own tail lemma; and checks that every recorded enclosure and tail bound supports the claim. It shares only the interval library and the certificate schema with the certifier.")
	if r.Shard != nil {
		wrap(b, "", "For this partial certificate, verify the merged one instead.", width)
	}
	para("Caution.", "The certificate proves a statement about the stated mathematical model (Weyl quantization with hbar = 1 and the given geometry), not about any experiment.")
}

// boundSigned writes the value the edge quantity is compared with: -bound
// for edge lower, bound for edge upper.
func boundSigned(r *certificates.Relaxation) string {
	if r.Claim.Edge == "upper" {
		return r.Claim.Bound.String()
	}
	return regions.RatString(new(big.Rat).Neg(rat(r.Claim.Bound)))
}

// edgeCmp is the direction of the edge's inequality.
func edgeCmp(r *certificates.Relaxation) string {
	if r.Claim.Edge == "upper" {
		return "<="
	}
	return ">="
}
