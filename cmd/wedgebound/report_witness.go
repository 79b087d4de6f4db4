package main

import (
	"fmt"
	"io"
	"strings"

	"wedgebound/certificates"
)

// witnessReport is one halfline-witness certificate given to report.
type witnessReport struct {
	file string
	cert *certificates.Certificate
}

// readWitnessReports reads the files when every one is a witness
// certificate; ok is false otherwise (a mix of kinds goes through the
// common loop of runReport, where witnesses get their own section).
func readWitnessReports(paths []string) (ws []witnessReport, ok bool) {
	for _, p := range paths {
		w, isW := readWitnessReport(p)
		if !isW {
			return nil, false // reported by the common loop
		}
		ws = append(ws, w)
	}
	return ws, true
}

// readWitnessReport reads one file; ok is false when it is not a
// halfline-witness certificate (or cannot be read: the common reader
// reports why).
func readWitnessReport(path string) (witnessReport, bool) {
	c, err := certificates.ReadFile(path)
	if err != nil || c.Kind != certificates.KindWitness || c.Witness == nil {
		return witnessReport{}, false
	}
	return witnessReport{path, c}, true
}

// widthRange returns the smallest and largest width of the basis.
func widthRange(w *certificates.Witness) (string, string) {
	lo, hi := w.Basis[0].Width, w.Basis[0].Width
	for _, f := range w.Basis {
		if rat(f.Width).Cmp(rat(lo)) < 0 {
			lo = f.Width
		}
		if rat(f.Width).Cmp(rat(hi)) > 0 {
			hi = f.Width
		}
	}
	return lo.String(), hi.String()
}

func maxPower(w *certificates.Witness) int {
	m := 0
	for _, f := range w.Basis {
		m = max(m, f.Power)
	}
	return m
}

// renderWitnessReport formats witness certificates as text, a markdown
// table or a LaTeX tabular.
func renderWitnessReport(format string, standalone bool, ws []witnessReport) string {
	var b strings.Builder
	switch format {
	case formatMarkdown:
		b.WriteString("| file | c_bm >= | Rayleigh quotient | basis | widths | quadrature remainder | sha256 |\n|---|---|---|---|---|---|---|\n")
		for _, it := range ws {
			w := it.cert.Witness
			lo, hi := widthRange(w)
			fmt.Fprintf(&b, "| %s | %s | [%s, %s] | %d (powers 0..%d) | %s .. %s | %s | %.12s |\n", it.file, w.Bound, w.Quotient.Lower, w.Quotient.Upper,
				len(w.Basis), maxPower(w), lo, hi, w.Errors.Quadrature, it.cert.SHA256)
		}
	case formatLaTeX:
		if standalone {
			b.WriteString("\\documentclass{article}\n\\begin{document}\n")
		}
		b.WriteString("\\begin{tabular}{lrrl}\n\\hline\nbasis size & widths & proved $c_{\\mathrm{bm}} \\ge$ & SHA-256 \\\\\n\\hline\n")
		for _, it := range ws {
			w := it.cert.Witness
			lo, hi := widthRange(w)
			fmt.Fprintf(&b, "%d & $%s \\ldots %s$ & $%s$ & \\texttt{%.12s} \\\\\n", len(w.Basis), lo, hi, w.Bound, it.cert.SHA256)
		}
		b.WriteString("\\hline\n\\end{tabular}\n")
		if standalone {
			b.WriteString("\\end{document}\n")
		}
	default:
		for i, it := range ws {
			if i > 0 {
				b.WriteString("\n")
			}
			writeWitnessSummary(&b, it)
		}
	}
	return b.String()
}

// writeWitnessSummary is the plain-text proof summary of one certificate.
func writeWitnessSummary(b io.Writer, it witnessReport) {
	w := it.cert.Witness
	lo, hi := widthRange(w)
	fmt.Fprintf(b, "%s (sha256 %.12s...)\n", it.file, it.cert.SHA256)
	fmt.Fprintf(b, "  claim: c_bm >= %s\n", w.Bound)
	fmt.Fprintf(b, "  kernel: %s\n", w.Kernel)
	fmt.Fprintf(b, "  witness: %d basis functions, powers 0..%d, widths %s .. %s, exact decimal coefficients\n", len(w.Basis), maxPower(w), lo, hi)
	fmt.Fprintf(b, "  <phi, phi> in [%s, %s] (closed form)\n", w.Norm.Lower, w.Norm.Upper)
	fmt.Fprintf(b, "  <phi, K phi> in [%s, %s] (time integral; quadrature remainders %s included)\n", w.Backflow.Lower, w.Backflow.Upper, w.Errors.Quadrature)
	fmt.Fprintf(b, "  Rayleigh quotient in [%s, %s] >= claim\n", w.Quotient.Lower, w.Quotient.Upper)
	fmt.Fprintf(b, "  certifier: %d panels, %d nodes, float estimate %s\n", w.Certifier.Panels, w.Certifier.Nodes, w.Certifier.Estimate)
	fmt.Fprintf(b, "  check independently with: wedgecheck %s\n", it.file)
}
