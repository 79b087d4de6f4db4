// Package checknum holds the verifier's numerics that more than one
// certificate kind may use: the Clenshaw-Curtis rule with its remainder
// bound (Rule), integer powers of intervals, a parallel loop (For) and
// exact-decimal printing of rationals. Like every verifier package it
// imports only the standard library, wedgebound/interval and
// wedgebound/certificates.
package checknum
