package main

import (
	"fmt"
	"strings"

	"wedgebound/certificates"
)

// Report of a precession-bracket certificate: Lower <= P3 <= Upper, the
// lower end from a witness state, the upper end from the norm lemma in
// each of the three residue sectors.

// precessionConsistent checks exactly, from the recorded decimals, the
// inequalities the bracket rests on (Lower <= the witness's Rayleigh lower
// end, Upper >= every sector's norm bound); it is no substitute for
// wedgecheck.
func precessionConsistent(p *certificates.Precession) error {
	if rat(p.Lower).Cmp(rat(p.Witness.Rayleigh.Lower)) > 0 {
		return fmt.Errorf("precession.lower %s exceeds the witness's Rayleigh lower end %s", p.Lower, p.Witness.Rayleigh.Lower)
	}
	if len(p.Sectors) == 0 {
		return fmt.Errorf("precession: no sector proofs")
	}
	for _, s := range p.Sectors {
		if rat(p.Upper).Cmp(rat(s.NormBound)) < 0 {
			return fmt.Errorf("precession.upper %s is below the norm bound %s of residue %d", p.Upper, s.NormBound, s.Residue)
		}
	}
	return nil
}

func precessionBasisText(p *certificates.Precession) string {
	return fmt.Sprintf("Fock witness, residue %d, %d + %d states; norm lemma in %d sectors", p.Witness.Residue, len(p.Witness.Even), len(p.Witness.Odd), len(p.Sectors))
}

func precessionBudget(p *certificates.Precession) []budgetEntry {
	return []budgetEntry{{"tail_h", p.Errors.TailH.String()}, {"margin", p.Errors.Margin.String()}, {"matvec", p.Errors.MatVecError.String()}}
}

func precessionBudgetText(p *certificates.Precession) string {
	var parts []string
	for _, e := range precessionBudget(p) {
		parts = append(parts, e.name+" "+budgetValue(e.value, func(m string, k int) string { return fmt.Sprintf("%se%d", m, k) }))
	}
	return strings.Join(parts, "; ")
}

func precessionBudgetLaTeX(p *certificates.Precession) string {
	var parts []string
	for _, e := range precessionBudget(p) {
		v := budgetValue(e.value, func(m string, k int) string { return fmt.Sprintf("%s\\cdot 10^{%d}", m, k) })
		parts = append(parts, texEscape(e.name)+" $"+v+"$")
	}
	return strings.Join(parts, "\\newline ")
}

// precessionPrecision: the certifier's interval arithmetic.
const precessionPrecision = "interval"

func precessionCells(it reportItem, latex bool) []string {
	p := it.precession
	if latex {
		rr := "\\raggedright "
		return []string{rr + "three-time precession constant $P_3$", rr + texEscape(precessionBasisText(p)),
			rr + "$P_3 \\in [" + texNumber(p.Lower.String()) + ", " + texNumber(p.Upper.String()) + "]$", rr + precessionBudgetLaTeX(p),
			precessionPrecision, "\\texttt{" + texEscape(hashPrefix(it.cert)) + "}"}
	}
	return []string{"three-time precession constant P3", precessionBasisText(p), "P3 in [" + p.Lower.String() + ", " + p.Upper.String() + "]",
		precessionBudgetText(p), precessionPrecision, hashPrefix(it.cert)}
}

func writePrecessionSummary(b *strings.Builder, it reportItem) {
	const width = 78
	p, c := it.precession, it.cert
	para := func(head, text string) {
		b.WriteString("\n")
		wrap(b, "", head+" "+text, width)
	}
	b.WriteString("== " + it.file + " ==\n")
	wrap(b, "", fmt.Sprintf("Certificate %s (kind %s), sha256 %s, written by %s %s.", hashPrefix(c), c.Kind, c.SHA256, c.Tool.Name, c.Tool.Version), width)
	para("Problem.", p.Problem+".")
	para("Claim.", fmt.Sprintf("%s <= P3 <= %s.", p.Lower, p.Upper))
	var sec []string
	for _, s := range p.Sectors {
		sec = append(sec, fmt.Sprintf("residue %d: cutoff %d, %d exact terms, norm bound %s", s.Residue, s.Cutoff, s.SumLength, s.NormBound))
	}
	para("How it is proved.", fmt.Sprintf("Lower end: a witness state in residue class %d (%d even and %d odd Fock coefficients) whose Rayleigh quotient lies in [%s, %s]. Upper end: the norm lemma in each residue class (%s). This report checked exactly from the recorded decimals that the lower end is at most the witness's quotient and the upper end at least every sector's bound.",
		p.Witness.Residue, len(p.Witness.Even), len(p.Witness.Odd), p.Witness.Rayleigh.Lower, p.Witness.Rayleigh.Upper, strings.Join(sec, "; ")))
	para("What the verifier recomputes.", "Run \"wedgecheck "+it.file+"\": it re-derives the witness's Rayleigh quotient and every sector's norm lemma by its own computation.")
	para("Caution.", "The certificate proves a statement about the stated mathematical model, not about any experiment.")
}
