package precession

import "testing"

// BenchmarkWitness measures the certified Rayleigh quotient of a witness
// with 2 x 4000 Fock states (one float matrix-vector product of size
// 4000 x 4000 with its error bound, then the interval sums).
func BenchmarkWitness(b *testing.B) {
	const n = 4000
	t := NewTable(3*n + 8)
	s := Sectors[0]
	y := make([]float64, n)
	for i := range y {
		y[i] = float64((i%7)-3) * 1e6
	}
	for b.Loop() {
		if _, err := s.Prove(t, y, n, 0); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkLemma measures one interval proof of the norm lemma in residue
// class 0 at the default cutoff and sum length.
func BenchmarkLemma(b *testing.B) {
	A, L := DefaultCutoff, DefaultLength
	t := NewTable(3*L + 8)
	s := Sectors[0]
	eps := s.epsilon(t, A, L)
	lam, _, err := s.searchLambda(t, A, L, eps)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := s.ProveUpper(t, A, L, lam*(1+1e-5), 0); err != nil {
			b.Fatal(err)
		}
	}
}
