package flight

import (
	"math"
	"math/big"
	"math/cmplx"
	"math/rand"
	"path/filepath"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/dsp/fourier"

	"wedgebound/certificates"
	"wedgebound/certify/strip"
)

func reduce(t *testing.T, p Plan) *Reduction {
	t.Helper()
	r, err := Reduce(p)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

func ratOf(s string) *big.Rat { r, _ := new(big.Rat).SetString(s); return r }

// sameBracket compares the certified parts of two strip results.
func sameBracket(t *testing.T, a, b *strip.Result) {
	t.Helper()
	if a.Advantage != b.Advantage || a.Deficit != b.Deficit || a.AlphaUsed != b.AlphaUsed ||
		!reflect.DeepEqual(a.AdvantageWitness, b.AdvantageWitness) || a.Alpha.Value != b.Alpha.Value {
		t.Errorf("brackets differ:\n%+v %+v\n%+v %+v", a.Advantage, a.Deficit, b.Advantage, b.Deficit)
	}
}

// One stage reproduces strip exactly, in scaled and in physical units
// (alpha = m L^2/(hbar t), common practice).
func TestOneStageIsStrip(t *testing.T) {
	opt := strip.Options{Width: 1e-6}
	f, err := Compute(Plan{Stages: []Stage{{Mass: "2", Duration: "0.04"}}}, opt)
	if err != nil {
		t.Fatal(err)
	}
	a, _ := strip.ParseAlpha("50")
	s, err := strip.Compute(a, opt)
	if err != nil {
		t.Fatal(err)
	}
	sameBracket(t, f.Strip, s)

	f, err = Compute(Plan{Length: "1um", Stages: []Stage{{Mass: "1u", Duration: "1ms"}}}, opt)
	if err != nil {
		t.Fatal(err)
	}
	a, _ = strip.AlphaFromUnits("1u", "1um", "1ms")
	s, err = strip.Compute(a, opt)
	if err != nil {
		t.Fatal(err)
	}
	if f.Reduction.AlphaText() != a.Expr() {
		t.Errorf("alpha %s, strip has %s", f.Reduction.AlphaText(), a.Expr())
	}
	sameBracket(t, f.Strip, s)
	c, err := f.Certificate()
	if err != nil {
		t.Fatal(err)
	}
	sc, _ := s.Certificate()
	sc.Strip.Alpha.Units = nil
	if !reflect.DeepEqual(c.Flight.Strip, *sc.Strip) {
		t.Error("the flight certificate's strip section differs from strip's own")
	}
}

// Two stages of equal mass are one stage of the summed duration, and the
// reduction does not depend on how a duration is split.
func TestEqualMassesMerge(t *testing.T) {
	two := reduce(t, Plan{Stages: []Stage{{Mass: "3", Duration: "0.01"}, {Mass: "3", Duration: "0.05"}}})
	one := reduce(t, Plan{Stages: []Stage{{Mass: "3", Duration: "0.06"}}})
	if two.AlphaRat.Cmp(one.AlphaRat) != 0 || two.TimeOverMass.Cmp(one.TimeOverMass) != 0 || two.Shift.Sign() != 0 {
		t.Errorf("two stages %s, one stage %s", two.AlphaText(), one.AlphaText())
	}
	if one.AlphaText() != "50" {
		t.Errorf("alpha = m/t = 3/0.06 should be 50, got %s", one.AlphaText())
	}
	p2 := Plan{Length: "2um", Stages: []Stage{{Mass: "7u", Duration: "0.3ms"}, {Mass: "7 u", Duration: "0.2 ms"}}}
	p1 := Plan{Length: "2um", Stages: []Stage{{Mass: "7u", Duration: "0.5ms"}}}
	if a, b := reduce(t, p2), reduce(t, p1); a.AlphaText() != b.AlphaText() {
		t.Errorf("physical: %s vs %s", a.AlphaText(), b.AlphaText())
	}
	opt := strip.Options{Width: 1e-6}
	f2, err := Compute(Plan{Stages: []Stage{{Mass: "1", Duration: "0.04"}, {Mass: "1", Duration: "0.06"}}}, opt)
	if err != nil {
		t.Fatal(err)
	}
	f1, err := Compute(Plan{Stages: []Stage{{Mass: "1", Duration: "0.1"}}}, opt)
	if err != nil {
		t.Fatal(err)
	}
	sameBracket(t, f2.Strip, f1.Strip)
}

// Kicks shift the target by sum_k q_k (tau_{k+1} + ... + tau_K), computed
// here by hand: taus 0.1, 0.1, 0.3 and kicks 2, 5, 7 give
// 2 (0.1 + 0.3) + 5 (0.3) + 7 (0) = 2.3; alpha = 1/0.5 = 2 (reciprocal sum
// of the stage alphas 10, 10, 10/3). Physical: a kick of 1e-30 kg m/s
// before a stage of 1 ms at mass 2 u moves the particle by
// 1e-30 * 1e-3/(2 * 1.66053906660e-27) m.
func TestKickShift(t *testing.T) {
	r := reduce(t, Plan{Target: "4", Stages: []Stage{{Mass: "1", Duration: "0.1", Kick: "2"}, {Mass: "2", Duration: "0.2", Kick: "5"}, {Mass: "1", Duration: "0.3", Kick: "7"}}})
	if r.Shift.Cmp(ratOf("2.3")) != 0 || r.ShiftedTarget.Cmp(ratOf("1.7")) != 0 || r.AlphaRat.Cmp(ratOf("2")) != 0 {
		t.Errorf("shift %s, shifted target %s, alpha %s", r.Shift.RatString(), r.ShiftedTarget.RatString(), r.AlphaText())
	}
	r = reduce(t, Plan{Length: "1um", Stages: []Stage{{Mass: "1u", Duration: "1ms", Kick: "1e-30 kg*m/s"}, {Mass: "2u", Duration: "1ms"}}})
	want := new(big.Rat).Quo(ratOf("1e-33"), ratOf("3.32107813320e-27"))
	if r.Shift.Cmp(want) != 0 {
		t.Errorf("physical shift %s, want %s", r.Shift.RatString(), want.RatString())
	}
	// A kick in the last stage shifts nothing.
	r = reduce(t, Plan{Stages: []Stage{{Mass: "1", Duration: "0.1", Kick: "9"}}})
	if r.Shift.Sign() != 0 {
		t.Errorf("last kick shifted by %s", r.Shift.RatString())
	}
}

func TestBadInput(t *testing.T) {
	for _, p := range []Plan{
		{},
		{Stages: []Stage{{Mass: "0", Duration: "1"}}},
		{Stages: []Stage{{Mass: "1u", Duration: "1"}}},
		{Length: "1um", Stages: []Stage{{Mass: "1", Duration: "1ms"}}},
		{Length: "1um", Stages: []Stage{{Mass: "1u", Duration: "1ms", Kick: "3 furlong"}}},
		{Stages: []Stage{{Mass: "1", Duration: "-1"}}},
	} {
		if _, err := Reduce(p); err == nil {
			t.Errorf("%+v accepted", p)
		}
	}
	for _, s := range []string{"mass=1", "mass=1,duration=2,spin=3", "nonsense"} {
		if _, err := ParseStage(s); err == nil {
			t.Errorf("%q accepted", s)
		}
	}
	if _, err := ParsePlan([]byte(`{"stages": [], "extra": 1}`)); err == nil {
		t.Error("unknown field accepted")
	}
}

// Classical trajectories (own float code, stage by stage) land where the
// reduction says: x_K = x_0 + T p_0 + s.
func TestClassicalTrajectories(t *testing.T) {
	p := Plan{Stages: []Stage{{Mass: "1", Duration: "0.1", Kick: "2"}, {Mass: "0.5", Duration: "0.05", Kick: "-3"}, {Mass: "4", Duration: "1", Kick: "1"}, {Mass: "2", Duration: "0.3"}}}
	r := reduce(t, p)
	T, _ := r.TimeOverMass.Float64()
	s, _ := r.Shift.Float64()
	stages := [][3]float64{{1, 0.1, 2}, {0.5, 0.05, -3}, {4, 1, 1}, {2, 0.3, 0}}
	rng := rand.New(rand.NewSource(1))
	for i := 0; i < 1000; i++ {
		x0, p0 := rng.Float64(), rng.NormFloat64()*20
		x, pp := x0, p0
		for _, st := range stages {
			x += pp * st[1] / st[0]
			pp += st[2]
		}
		if math.Abs(x-(x0+T*p0+s)) > 1e-12*(1+math.Abs(x)) {
			t.Fatalf("trajectory ends at %g, reduction says %g", x, x0+T*p0+s)
		}
	}
}

// A direct simulation of the quantum free evolution (own split-step code
// on a periodic grid: each flight multiplies the momentum-space wave
// function by exp(-i t p^2/(2m)), each kick the position-space one by
// exp(i q x); hbar = 1) through stages with mass changes and kicks gives
// the position density that the reduction predicts: for the Gaussian
// initial state psi(x) ~ exp(-(x - a)^2/(4 sigma^2) + i k x), X + T P + s
// is normal with mean a + T k + s and variance sigma^2 + T^2/(4 sigma^2)
// (free spreading of a minimum-uncertainty packet, common practice). The
// detection probability above a target agrees to 1e-5 (midpoint rule).
func TestQuantumSimulation(t *testing.T) {
	p := Plan{Target: "0.9", Stages: []Stage{{Mass: "1", Duration: "0.02", Kick: "6"}, {Mass: "0.5", Duration: "0.01", Kick: "-4"}, {Mass: "3", Duration: "0.06"}}}
	r := reduce(t, p)
	T, _ := r.TimeOverMass.Float64()
	s, _ := r.Shift.Float64()
	c, _ := r.Target.Float64()
	stages := [][3]float64{{1, 0.02, 6}, {0.5, 0.01, -4}, {3, 0.06, 0}}

	const n = 1 << 14
	const lo, width = -20.0, 40.0
	dx := width / n
	a, sigma, k := 0.5, 0.15, 3.0
	psi := make([]complex128, n)
	for j := range psi {
		x := lo + float64(j)*dx
		psi[j] = cmplx.Exp(complex(-(x-a)*(x-a)/(4*sigma*sigma), k*x))
	}
	fft := fourier.NewCmplxFFT(n)
	mom := make([]float64, n)
	for j := range mom {
		m := j
		if j >= n/2 {
			m = j - n
		}
		mom[j] = 2 * math.Pi * float64(m) / width
	}
	for _, st := range stages {
		ph := fft.Coefficients(nil, psi)
		for j := range ph {
			ph[j] *= cmplx.Exp(complex(0, -st[1]/st[0]*mom[j]*mom[j]/2))
		}
		psi = fft.Sequence(nil, ph)
		for j := range psi {
			x := lo + float64(j)*dx
			psi[j] *= cmplx.Exp(complex(0, st[2]*x))
		}
	}
	var tot, above float64
	first := math.Inf(1)
	for j, v := range psi {
		d := real(v)*real(v) + imag(v)*imag(v)
		tot += d
		if x := lo + float64(j)*dx; x >= c {
			above += d
			first = math.Min(first, x)
		}
	}
	// The grid sum over x_j >= c is the midpoint rule for the integral from
	// the first such node less half a cell.
	c = first - dx/2
	sim := above / tot
	mean := a + T*k + s
	sd := math.Sqrt(sigma*sigma + T*T/(4*sigma*sigma))
	want := 0.5 * math.Erfc((c-mean)/(sd*math.Sqrt2))
	if math.Abs(sim-want) > 1e-5 {
		t.Errorf("simulated P(x >= %g) = %.12f, reduction predicts %.12f", c, sim, want)
	}
	if sim < 0.05 || sim > 0.95 {
		t.Errorf("test scenario too lopsided: %g", sim)
	}
}

// The certificate round-trips through the strict reader.
func TestCertificate(t *testing.T) {
	f, err := Compute(Plan{Stages: []Stage{{Mass: "1", Duration: "0.05", Kick: "1"}, {Mass: "2", Duration: "0.1"}}}, strip.Options{Width: 1e-6})
	if err != nil {
		t.Fatal(err)
	}
	c, err := f.Certificate()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "f.json")
	if err := certificates.WriteFile(path, c); err != nil {
		t.Fatal(err)
	}
	d, err := certificates.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if d.Flight.Reduction.Alpha.String() != "10" || d.Flight.Reduction.Shift.String() != "0.05" {
		t.Errorf("reduction %+v", d.Flight.Reduction)
	}
}
