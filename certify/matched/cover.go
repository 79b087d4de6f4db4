package matched

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"wedgebound/certify/strip"
	"wedgebound/interval"
)

// DefaultWidth is the default target width of the bracket.
const DefaultWidth = 9e-4

// ErrRange marks requests outside what the method supports.
var ErrRange = errors.New("out of the supported range")

// Options controls Compute; the zero value asks for the defaults.
type Options struct {
	// Width is the target width of the bracket (default DefaultWidth).
	Width float64
	// Workers is the number of goroutines (0: GOMAXPROCS).
	Workers int
	// Progress, when set, receives one line per finished step.
	Progress func(string)
}

// Cell is one proved cell of the cover: for every threshold v in
// [Lo, Hi], lambda_max(S_v) <= Upper. Sizes are the basis sizes on
// [-1, Hi] and [Hi, 0] (0 for an empty piece).
type Cell struct {
	Lo, Hi float64
	Sizes  [2]int
	Upper  float64
}

// Witness is the inner side: the state with coefficients Coefficients in
// the split basis at V (sizes on [-1, V] and [V, 0]) has Rayleigh
// quotient for S_V at least Rayleigh.
type Witness struct {
	V            float64
	Sizes        [2]int
	Coefficients []float64
	Rayleigh     float64
}

// Result is a certified bracket Lower <= M(alpha) <= Upper.
type Result struct {
	Alpha       strip.Alpha
	Lower       float64
	Upper       float64
	Witness     Witness
	Cells       []Cell
	Width       float64 // Upper - Lower
	WidthTarget float64
	Estimate    float64 // float estimate of the largest lambda_max(S_v) seen
}

// sizes returns the basis sizes of a layout as a pair.
func sizes(bl []block) [2]int {
	var s [2]int
	for _, b := range bl {
		if b.minus {
			s[1] = b.N
		} else {
			s[0] = b.N
		}
	}
	return s
}

type cellOut struct {
	ub, est float64
	vec     []float64
	g       *galerkin
	sz      [2]int
}

// proveCell bounds lambda_max(T_{a,b}), raising the basis density until
// the discarded part is below budget (at most a few times).
func proveCell(alpha interval.B, a, b, d, budget float64, workers int) (*cellOut, error) {
	var last *cellOut
	for try := 0; try < 5; try++ {
		bl := layout(b, d)
		g, err := buildGalerkin(alpha, a, bl, 0, workers)
		if err != nil {
			return nil, err
		}
		ub, est, vec, err := g.upperBound(workers)
		if err != nil {
			return nil, err
		}
		last = &cellOut{ub: ub, est: est, vec: vec, g: g, sz: sizes(bl)}
		if g.disc.Hi() <= budget {
			break
		}
		d *= 1.3
	}
	return last, nil
}

// Compute certifies a bracket of the matched advantage M(alpha).
func Compute(alpha strip.Alpha, opt Options) (*Result, error) {
	if alpha.IsZero() {
		return nil, errors.New("matched: alpha is not set")
	}
	if opt.Width == 0 {
		opt.Width = DefaultWidth
	}
	if !(opt.Width > 0) || opt.Width > 1 {
		return nil, fmt.Errorf("matched: width %g is outside (0, 1]: %w", opt.Width, ErrRange)
	}
	aB := alpha.EnclosureB(256)
	al := strip.ToF(aB).Mid().Lo()
	if !(al > 0) || al > 400 {
		return nil, fmt.Errorf("matched: alpha %s is outside (0, 400]: %w", alpha.Expr(), ErrRange)
	}
	prog := func(format string, a ...any) {
		if opt.Progress != nil {
			opt.Progress(fmt.Sprintf(format, a...))
		}
	}
	d0 := math.Max(24, 0.7*al)
	budget := opt.Width / 16
	w := opt.Workers

	// Float scan of v -> lambda_max(S_v), then golden-section refinement.
	f := map[float64]*cellOut{}
	eval := func(v float64) (*cellOut, error) {
		if c, ok := f[v]; ok {
			return c, nil
		}
		c, err := proveCell(aB, v, v, d0, budget, w)
		if err != nil {
			return nil, err
		}
		f[v] = c
		return c, nil
	}
	best := -1.0
	for i := 0; i <= 16; i++ {
		v := -1 + float64(i)/16
		c, err := eval(v)
		if err != nil {
			return nil, err
		}
		if c.est > f[best].est {
			best = v
		}
	}
	lo, hi := math.Max(-1, best-1.0/16), math.Min(0, best+1.0/16)
	for it := 0; it < 14 && hi-lo > 1e-6; it++ {
		m1, m2 := lo+(hi-lo)*0.382, lo+(hi-lo)*0.618
		m1, m2 = roundDyadic(m1), roundDyadic(m2)
		c1, err := eval(m1)
		if err != nil {
			return nil, err
		}
		c2, err := eval(m2)
		if err != nil {
			return nil, err
		}
		if c1.est >= c2.est {
			hi = m2
		} else {
			lo = m1
		}
	}
	for v, c := range f {
		if c.est > f[best].est {
			best = v
		}
	}
	wc := f[best]
	rq := wc.g.rayleighLower(wc.vec)
	lower := math.Max(rq.Lo(), 0)
	prog("witness at v = %.6g: Rayleigh quotient >= %.9f (float %.9f)", best, rq.Lo(), wc.est)
	res := &Result{Alpha: alpha, Lower: lower, Estimate: wc.est, WidthTarget: opt.Width,
		Witness: Witness{V: best, Sizes: wc.sz, Coefficients: normalised(wc.vec), Rayleigh: rq.Lo()}}
	// The witness's Rayleigh quotient is recomputed for the normalised
	// coefficients that are recorded.
	rq = wc.g.rayleighLower(res.Witness.Coefficients)
	res.Witness.Rayleigh = rq.Lo()
	res.Lower = math.Max(rq.Lo(), 0)

	// Cover of [-1, 0] by cells, bisected until each is below the target.
	target := res.Lower + 0.9*opt.Width
	type iv struct{ lo, hi float64 }
	stack := []iv{}
	for i := 15; i >= 0; i-- {
		stack = append(stack, iv{-1 + float64(i)/16, -1 + float64(i+1)/16})
	}
	for len(stack) > 0 {
		c := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		out, err := proveCell(aB, c.lo, c.hi, d0, budget, w)
		if err != nil {
			return nil, err
		}
		if out.ub <= target || c.hi-c.lo < 1e-9 {
			if out.ub > target {
				return nil, fmt.Errorf("matched: the cell [%g, %g] does not get below %.9f (bound %.9f)", c.lo, c.hi, target, out.ub)
			}
			res.Cells = append(res.Cells, Cell{Lo: c.lo, Hi: c.hi, Sizes: out.sz, Upper: out.ub})
			prog("cell [%.9g, %.9g]: lambda_max <= %.9f (%d cells)", c.lo, c.hi, out.ub, len(res.Cells))
			continue
		}
		m := (c.lo + c.hi) / 2
		stack = append(stack, iv{m, c.hi}, iv{c.lo, m})
	}
	sort.Slice(res.Cells, func(i, j int) bool { return res.Cells[i].Lo < res.Cells[j].Lo })
	for _, c := range res.Cells {
		res.Upper = math.Max(res.Upper, c.Upper)
	}
	res.Width = res.Upper - res.Lower
	return res, nil
}

// roundDyadic rounds v to a multiple of 2^-30 (so that cell ends and
// thresholds are short exact decimals).
func roundDyadic(v float64) float64 { return math.Round(v*(1<<30)) / (1 << 30) }

func normalised(v []float64) []float64 {
	var s float64
	for _, x := range v {
		s += x * x
	}
	s = math.Sqrt(s)
	out := make([]float64, len(v))
	for i, x := range v {
		out[i] = x / s
	}
	return out
}
