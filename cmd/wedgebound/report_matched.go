package main

import (
	"fmt"
	"strings"

	"wedgebound/certificates"
)

// Reports of the bracket kinds without a relaxation table: flight
// (report_flight.go) and matched. Each becomes a line of its own table
// (markdown, LaTeX) or a paragraph (text), after the relaxation report.

// bracketItem is one flight or matched certificate to report on.
type bracketItem struct {
	file  string
	cert  *certificates.Certificate
	what  string // the quantity bracketed, in words
	alpha certificates.StripAlpha
	lower string
	upper string
	notes string // the kind's own account in one paragraph
}

// readBracketItem reads a flight or matched certificate; ok is false for
// other kinds (the caller then reads it as a relaxation certificate).
func readBracketItem(path string) (bracketItem, bool, error) {
	c, err := certificates.ReadFile(path)
	if err != nil {
		return bracketItem{}, false, nil // the relaxation reader reports it
	}
	switch {
	case c.Kind == certificates.KindMatched && c.Matched != nil:
		return matchedItem(path, c), true, nil
	case c.Kind == certificates.KindFlight && c.Flight != nil:
		return flightItem(path, c), true, nil
	}
	return bracketItem{}, false, nil
}

func matchedItem(path string, c *certificates.Certificate) bracketItem {
	m := c.Matched
	return bracketItem{file: path, cert: c, what: "matched advantage M(alpha)", alpha: m.Alpha, lower: m.Lower.String(), upper: m.Upper.String(),
		notes: fmt.Sprintf("The lower end is the Rayleigh quotient (at least %s) of a witness state with %d coefficients at the threshold v = %s; "+
			"the upper end bounds the top eigenvalue of C_lo - 1[x > hi] on each of %d cells covering v in [-1, 0] "+
			"(the rival matches position and momentum distributions in its best coupling).",
			m.Witness.Rayleigh, len(m.Witness.Coefficients), m.Witness.V, len(m.Cells))}
}

// writeBrackets renders the bracket items in the given format.
func writeBrackets(b *strings.Builder, format string, items []bracketItem) {
	if len(items) == 0 {
		return
	}
	switch format {
	case formatMarkdown:
		b.WriteString("| certificate | quantity | alpha | lower | upper |\n|---|---|---|---|---|\n")
		for _, it := range items {
			fmt.Fprintf(b, "| %s (%s) | %s | %s | %s | %s |\n", mdEscape(it.file), hashPrefix(it.cert), mdEscape(it.what),
				mdEscape(it.alpha.Value.String()), it.lower, it.upper)
		}
	case formatLaTeX:
		b.WriteString("\\begin{tabular}{llll}\n\\hline\nquantity & $\\alpha$ & lower & upper \\\\\n\\hline\n")
		for _, it := range items {
			fmt.Fprintf(b, "%s & %s & %s & %s \\\\\n", texEscape(it.what), texEscape(it.alpha.Value.String()), texNumber(it.lower), texNumber(it.upper))
		}
		b.WriteString("\\hline\n\\end{tabular}\n")
	default:
		for i, it := range items {
			if i > 0 {
				b.WriteString("\n")
			}
			fmt.Fprintf(b, "%s: certificate %s (kind %s), sha256 %s.\n", it.file, hashPrefix(it.cert), it.cert.Kind, it.cert.SHA256)
			a := it.alpha.Value.String()
			if it.alpha.Lower.String() != it.alpha.Upper.String() {
				a += fmt.Sprintf(" (in [%s, %s])", it.alpha.Lower, it.alpha.Upper)
			}
			wrap(b, "  ", fmt.Sprintf("Claim: the %s at alpha = %s lies in [%s, %s].", it.what, a, it.lower, it.upper), 78)
			wrap(b, "  ", it.notes, 78)
			wrap(b, "  ", "Check it with wedgecheck, which re-derives every number by its own route.", 78)
		}
	}
}
