package main

import (
	"fmt"
	"strings"

	"wedgebound/certificates"
)

// Report of a strip-bracket certificate: one row of the index table (the
// same columns as a relaxation row) and a plain-text proof summary.

// stripConsistent checks, exactly in rationals from the recorded decimals,
// the four inequalities the brackets rest on (see certificates.Strip):
// a certificate failing them cannot pass verification, so the report
// refuses to restate it. It is no substitute for wedgecheck.
func stripConsistent(s *certificates.Strip) error { return s.CheckBrackets() }

// stripAlphaText writes alpha as recorded: its exact value and, for a value
// from physical units, the units and the enclosure.
func stripAlphaText(s *certificates.Strip) string {
	a := s.Alpha
	if a.Units != nil {
		return fmt.Sprintf("%s in [%s, %s] (m = %s, L = %s, t = %s)", a.Value, a.Lower, a.Upper, a.Units.Mass, a.Units.Length, a.Units.Time)
	}
	return a.Value.String()
}

// stripProblemShort is the index table's problem cell.
func stripProblemShort(s *certificates.Strip) string {
	return "finite strip, alpha = " + stripAlphaText(s)
}

func stripProblemLaTeX(s *certificates.Strip) string {
	a := s.Alpha
	if a.Units != nil {
		return "finite strip, $\\alpha \\in [" + texNumber(a.Lower.String()) + ", " + texNumber(a.Upper.String()) + "]$ (" + texEscape(a.Units.Mass+", "+a.Units.Length+", "+a.Units.Time) + ")"
	}
	v := a.Value
	if strings.HasPrefix(v.String(), certificates.StripTwoPiPrefix) {
		return "finite strip, $\\alpha = 2\\pi\\cdot " + texNumber(strings.TrimPrefix(v.String(), certificates.StripTwoPiPrefix)) + "$"
	}
	return "finite strip, $\\alpha = " + texNumber(v.String()) + "$"
}

// stripBasisText is the table's "profiles" cell: the witness basis.
func stripBasisText(s *certificates.Strip) string {
	return fmt.Sprintf("Legendre basis, N = %d", s.BasisSize)
}

func stripBasisLaTeX(s *certificates.Strip) string {
	return fmt.Sprintf("Legendre basis, $N = %d$", s.BasisSize)
}

func stripBoundText(s *certificates.Strip) string {
	return fmt.Sprintf("A(alpha) in [%s, %s]; sup spec K in [%s, %s]", s.Advantage.Lower, s.Advantage.Upper, s.Deficit.Lower, s.Deficit.Upper)
}

func stripBoundLaTeX(s *certificates.Strip) string {
	return fmt.Sprintf("$A(\\alpha) \\in [%s, %s]$\\newline $\\sup\\sigma(K_\\alpha) \\in [%s, %s]$",
		texNumber(s.Advantage.Lower.String()), texNumber(s.Advantage.Upper.String()), texNumber(s.Deficit.Lower.String()), texNumber(s.Deficit.Upper.String()))
}

// stripBudget lists the two error terms the brackets use.
func stripBudget(s *certificates.Strip) []budgetEntry {
	return []budgetEntry{{"alpha rounding", s.Errors.AlphaRounding.String()}, {"discarded part", s.Errors.DiscardedPart.String()}}
}

func stripBudgetText(s *certificates.Strip) string {
	var parts []string
	for _, e := range stripBudget(s) {
		parts = append(parts, e.name+" "+budgetValue(e.value, func(m string, k int) string { return fmt.Sprintf("%se%d", m, k) }))
	}
	return strings.Join(parts, "; ")
}

func stripBudgetLaTeX(s *certificates.Strip) string {
	var parts []string
	for _, e := range stripBudget(s) {
		v := budgetValue(e.value, func(m string, k int) string { return fmt.Sprintf("%s\\cdot 10^{%d}", m, k) })
		parts = append(parts, e.name+" $"+v+"$")
	}
	return strings.Join(parts, "\\newline ")
}

// stripPrecision: the strip certifier works in float64 intervals.
const stripPrecision = "53 bits"

func writeStripSummary(b *strings.Builder, it reportItem) {
	const width = 78
	s, c := it.strip, it.cert
	para := func(head, text string) {
		b.WriteString("\n")
		wrap(b, "", head+" "+text, width)
	}
	b.WriteString("== " + it.file + " ==\n")
	wrap(b, "", fmt.Sprintf("Certificate %s (kind %s), sha256 %s, written by %s %s.", hashPrefix(c), c.Kind, c.SHA256, c.Tool.Name, c.Tool.Version), width)
	para("Problem.", fmt.Sprintf("The finite-strip operator K_alpha with kernel (exp(-i alpha (x^2-y^2)/2) - 1)/(2 pi i (x - y)) on L^2[-1, 0], alpha = %s. Multiplication by exp(-i alpha x^2/4) makes it unitarily equivalent to the real kernel k(x, y) = -sin(alpha (x^2-y^2)/4)/(pi (x-y)). A(alpha) = -inf spec K_alpha is the advantage; sup spec K_alpha is the deficit side.", stripAlphaText(s)))
	para("Claim.", s.Statement+".")
	para("How it is proved.", fmt.Sprintf("Inner ends: two witness states, each given by %d orthonormal Legendre coefficients on [-1, 0], with recorded enclosures of their Rayleigh quotients (advantage witness in [%s, %s], deficit witness in [%s, %s]). Outer ends: the Galerkin matrix G of k in that basis has lambda_min(G) >= %s and lambda_max(G) <= %s, and the discarded part ||k - P k P|| is at most %s. Evaluating k at alpha_used = %s instead of alpha moves the spectrum by at most %s. The brackets follow from these numbers alone; this report checked the four inequalities exactly from the recorded decimals.",
		s.BasisSize, s.AdvantageWitness.Rayleigh.Lower, s.AdvantageWitness.Rayleigh.Upper, s.DeficitWitness.Rayleigh.Lower, s.DeficitWitness.Rayleigh.Upper,
		s.GalerkinLowest, s.GalerkinHighest, s.Errors.DiscardedPart, s.AlphaUsed, s.Errors.AlphaRounding))
	para("What the verifier recomputes.", "Run \"wedgecheck "+it.file+"\". It reads the file strictly and recomputes the SHA-256; re-derives alpha exactly; encloses both witnesses' Rayleigh quotients with its own Clenshaw-Curtis Galerkin quadrature and remainder; bounds the discarded part by its own kernel bound on Bernstein ellipses; proves both Galerkin eigenvalue bounds with its own Cholesky factors and rigorously evaluated residuals; and checks the four inequalities.")
	para("Caution.", "The certificate proves a statement about the stated mathematical model, not about any experiment.")
}
