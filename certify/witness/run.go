package witness

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strconv"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// Options choose the basis and the effort.
type Options struct {
	// MinWidth and MaxWidth bound the Gaussian widths b; consecutive widths
	// differ by the factor Ratio (> 1).
	MinWidth, MaxWidth, Ratio float64
	// MaxPower: powers u^0 .. u^MaxPower.
	MaxPower int
	// Chirps used (default plain, cos, sin).
	Chirps []Chirp
	// GramTol is the relative cut-off for Gram eigenvalues in the float search.
	GramTol float64
	// Digits of the printed bound (rounded down).
	Digits  int
	Workers int
	// Progress, if set, is called with a stage name and counts.
	Progress func(stage string, done, total int)
}

// Preset returns the default options for the backflow constant.
func Preset() Options {
	return Options{MinWidth: 1e-14, MaxWidth: 20, Ratio: 2, MaxPower: 1, GramTol: 1e-13, Digits: 10}
}

// Result is a proved lower bound with its witness.
type Result struct {
	Basis    []Func
	Coef     []*big.Rat
	Estimate float64 // float eigenvalue of the search (not proved)
	Proof    *Proof
	Bound    string // decimal, at most the proved quotient's lower end
	Digits   int
}

// roundWidth rounds b to 3 significant decimal digits, as an exact rational
// (the shortest decimal of the nearest float64, certificates.ShortDecimal).
func roundWidth(b float64) (*big.Rat, error) {
	f, err := strconv.ParseFloat(strconv.FormatFloat(b, 'e', 2, 64), 64)
	if err != nil {
		return nil, fmt.Errorf("witness: width %v: %v", b, err)
	}
	d, err := certificates.ShortDecimal(f)
	if err != nil {
		return nil, fmt.Errorf("witness: width %v: %v", b, err)
	}
	return d.Rat(), nil
}

// MakeBasis lists the basis functions of the options: for every width,
// every power and every chirp one function.
func MakeBasis(o Options) ([]Func, error) {
	if !(o.MinWidth > 0) || !(o.MaxWidth >= o.MinWidth) || !(o.Ratio > 1) || o.MaxPower < 0 || o.MaxPower > 8 {
		return nil, errors.New("witness: need 0 < min width <= max width, ratio > 1 and powers 0..8")
	}
	ch := o.Chirps
	if len(ch) == 0 {
		ch = []Chirp{Plain, Cos, Sin}
	}
	var out []Func
	for b := o.MinWidth; b <= o.MaxWidth*(1+1e-9); b *= o.Ratio {
		w, err := roundWidth(b)
		if err != nil {
			return nil, err
		}
		for m := 0; m <= o.MaxPower; m++ {
			for _, c := range ch {
				out = append(out, Func{Chirp: c, Power: m, Width: w})
			}
		}
	}
	if len(out) > 20000 {
		return nil, fmt.Errorf("witness: basis of %d functions is too large", len(out))
	}
	return out, nil
}

func minWidth(basis []Func) float64 {
	m := math.Inf(1)
	for _, f := range basis {
		b, _ := f.Width.Float64()
		m = math.Min(m, b)
	}
	return m
}

// Run searches a witness in float64 and proves its Rayleigh quotient.
func Run(o Options) (*Result, error) {
	basis, err := MakeBasis(o)
	if err != nil {
		return nil, err
	}
	prog := o.Progress
	if prog == nil {
		prog = func(string, int, int) {}
	}
	ts := terms(basis)
	ps := makePanels(ts, minWidth(basis))
	prog("matrices", 0, 1)
	G, K := floatMatrices(basis, ps, 16, o.Workers)
	prog("matrices", 1, 1)
	tol := o.GramTol
	if tol == 0 {
		tol = 1e-13
	}
	x, est, err := topVector(G, K, tol)
	if err != nil {
		return nil, err
	}
	coef := make([]*big.Rat, len(x))
	for i, v := range x {
		d, err := certificates.ShortDecimal(v)
		if err != nil {
			return nil, fmt.Errorf("witness: coefficient %d: %v", i, err)
		}
		coef[i] = d.Rat()
	}
	return ProveWith(basis, coef, est, o)
}

// ProveWith proves the Rayleigh quotient of given exact coefficients.
func ProveWith(basis []Func, coef []*big.Rat, est float64, o Options) (*Result, error) {
	prog := o.Progress
	if prog == nil {
		prog = func(string, int, int) {}
	}
	ps := makePanels(terms(basis), minWidth(basis))
	done := 0
	var mu = make(chan struct{}, 1)
	mu <- struct{}{}
	tick := func() {
		<-mu
		done++
		prog("proving", done, len(ps))
		mu <- struct{}{}
	}
	pr, err := prove(basis, coef, ps, 1e-14, o.Workers, tick)
	if err != nil {
		return nil, err
	}
	d := o.Digits
	if d <= 0 {
		d = 8
	}
	lo, _, err := interval.Decimals(interval.Lower(pr.Quotient), d)
	if err != nil {
		return nil, err
	}
	return &Result{Basis: basis, Coef: coef, Estimate: est, Proof: pr, Bound: lo, Digits: d}, nil
}

// BasisSize returns the number of basis functions the options give (0 when
// the options are invalid).
func BasisSize(o Options) int {
	b, err := MakeBasis(o)
	if err != nil {
		return 0
	}
	return len(b)
}
