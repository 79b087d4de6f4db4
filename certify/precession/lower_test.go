package precession

import "testing"

// TestWitnessZeros: zero coefficients are allowed, and the Rayleigh
// quotient of any state lies in [0, 1] (0 <= Q3 <= 1, common practice).
func TestWitnessZeros(t *testing.T) {
	const n = 200
	tab := NewTable(3*n + 8)
	y := make([]float64, n)
	for i := range y {
		y[i] = float64((i%5)-2) * 1000
	}
	for _, s := range Sectors {
		w, err := s.Prove(tab, y, n, 1)
		if err != nil {
			t.Fatal(err)
		}
		if w.Rayleigh.Lo() < 0 || w.Rayleigh.Hi() > 1 || w.Rayleigh.Hi()-w.Rayleigh.Lo() > 1e-9 {
			t.Errorf("residue %d: Rayleigh %v", s.R, w.Rayleigh)
		}
	}
}
