package strip

import (
	"errors"
	"fmt"
	"math"

	"wedgebound/certificates"
	"wedgebound/interval"
)

// DefaultWidth is the target width of each bracket when none is given.
const DefaultWidth = 1e-8

// DefaultMaxBasis caps the automatic basis size (memory grows like its
// square, time like its cube).
const DefaultMaxBasis = 4000

// BasisDescription names the witness basis and the unitary link to K_alpha.
const BasisDescription = "psi(x) = sum_j c_j sqrt(2j+1) P_j(2x+1) on [-1,0] (orthonormal Legendre) is the state for the real kernel -sin(alpha(x^2-y^2)/4)/(pi(x-y)); the state for K_alpha is exp(-i alpha x^2/4) psi(x)"

// ErrRange marks requests outside what the method supports (alpha too
// large for the basis cap, a non-positive width); callers may treat it as
// bad input.
var ErrRange = errors.New("out of the supported range")

// Options controls a bracket computation. The zero value asks for the
// defaults.
type Options struct {
	// Width is the target width of each bracket (default DefaultWidth).
	Width float64
	// MaxBasis caps the automatic basis size (default DefaultMaxBasis).
	MaxBasis int
	// Basis and Nodes force the basis size N and the number of Gauss nodes
	// per variable n (0: automatic). Nodes below Basis is raised to Basis.
	Basis, Nodes int
	// Workers is the number of goroutines (0: GOMAXPROCS).
	Workers int
}

// Bounds is a closed interval written as directed decimal strings: the true
// value v satisfies Lower <= v <= Upper.
type Bounds struct {
	Lower string `json:"lower"`
	Upper string `json:"upper"`
}

// Witness is the inner-side state of a bracket: orthonormal Legendre
// coefficients (exact float64 values) and the enclosure of its Rayleigh
// quotient for the real kernel at AlphaUsed.
type Witness struct {
	Coefficients []float64 `json:"coefficients"`
	Rayleigh     Bounds    `json:"rayleigh"`
}

// ErrorTerms lists every bound that enters the brackets, each an upper
// bound written as a decimal rounded up.
type ErrorTerms struct {
	// AlphaRounding bounds ||K_alpha - K_alphaUsed|| <= |alpha - alphaUsed|/(2 pi)
	// (|d k/d alpha| = |x + y| |cos|/(4 pi) <= 1/(2 pi) on [-1, 0]^2).
	AlphaRounding string `json:"alpha_rounding"`
	// EntryRounding bounds the Frobenius norm of the entry enclosure radii of
	// the Gauss-rule Galerkin matrix around its float midpoint.
	EntryRounding string `json:"entry_rounding"`
	// EntryQuadrature bounds the Frobenius norm of the Gauss remainders.
	EntryQuadrature string `json:"entry_quadrature"`
	// DiscardedPart bounds ||k - P k P|| (P: polynomials of degree < N).
	DiscardedPart string `json:"discarded_part"`
	// LowestShift and HighestShift are the gaps between the float extreme
	// eigenvalues of the midpoint matrix Hc and the shifts sigma used for the
	// semidefiniteness proofs; LowestResidual and HighestResidual bound
	// ||R^T R - (+-(Hc - sigma I))||_F for the float Cholesky factors R.
	LowestShift     string `json:"lowest_shift"`
	LowestResidual  string `json:"lowest_cholesky_residual"`
	HighestShift    string `json:"highest_shift"`
	HighestResidual string `json:"highest_cholesky_residual"`
	// AdvantageWitnessQuadrature and DeficitWitnessQuadrature are the Gauss
	// remainders inside the two Rayleigh quotients.
	AdvantageWitnessQuadrature string `json:"advantage_witness_quadrature"`
	DeficitWitnessQuadrature   string `json:"deficit_witness_quadrature"`
}

// Ellipses records the Bernstein parameters eta = log rho used by the
// bounds (exact decimal values of the float64 numbers used).
type Ellipses struct {
	TailX      string `json:"tail_eta_x"`
	TailY      string `json:"tail_eta_y"`
	Quadrature string `json:"quadrature_eta"`
}

// Result is a certified strip bracket with everything needed to re-check
// it. Advantage encloses A(alpha) = -lambda_min(K_alpha) and Deficit
// encloses lambda_max(K_alpha).
type Result struct {
	Alpha           AlphaValue `json:"alpha"`
	AlphaUsed       string     `json:"alpha_used"`
	WidthTarget     float64    `json:"width_target"`
	BasisSize       int        `json:"basis_size"`
	QuadratureNodes int        `json:"quadrature_nodes"`
	Advantage       Bounds     `json:"advantage"`
	Deficit         Bounds     `json:"deficit"`
	Basis           string     `json:"basis"`
	// AdvantageWitness has Rayleigh quotient near lambda_min, DeficitWitness
	// near lambda_max.
	AdvantageWitness Witness    `json:"advantage_witness"`
	DeficitWitness   Witness    `json:"deficit_witness"`
	Errors           ErrorTerms `json:"errors"`
	Ellipses         Ellipses   `json:"ellipses"`
	// LowestEstimate and HighestEstimate are the float eigenvalues of the
	// midpoint matrix that the outer bounds are built around.
	LowestEstimate  string `json:"lowest_estimate"`
	HighestEstimate string `json:"highest_estimate"`
	// GalerkinLowest and GalerkinHighest are proved bounds
	// lambda_min(G) >= GalerkinLowest and lambda_max(G) <= GalerkinHighest
	// for the exact Galerkin matrix G of the real kernel at AlphaUsed (basis
	// size BasisSize): the float estimates moved out by the eigen radius and
	// both entry terms. A verifier can re-prove them independently (for
	// example G - GalerkinLowest I positive semidefinite).
	GalerkinLowest  string `json:"galerkin_lowest"`
	GalerkinHighest string `json:"galerkin_highest"`

	// Enclosures with float64 endpoints (not serialised).
	AdvantageF interval.F `json:"-"`
	DeficitF   interval.F `json:"-"`
}

// Compute certifies the brackets of both spectral edges of K_alpha.
func Compute(alpha Alpha, opt Options) (*Result, error) {
	if alpha.IsZero() {
		return nil, fmt.Errorf("strip: alpha is not set")
	}
	if opt.Width == 0 {
		opt.Width = DefaultWidth
	}
	if !(opt.Width > 0) || math.IsInf(opt.Width, 0) {
		return nil, fmt.Errorf("strip: width must be positive, got %g: %w", opt.Width, ErrRange)
	}
	if opt.MaxBasis <= 0 {
		opt.MaxBasis = DefaultMaxBasis
	}
	enc := alpha.Enclosure()
	if !enc.IsFinite() || !(enc.Lo() > 0) {
		return nil, fmt.Errorf("strip: alpha %s: %w", alpha.Expr(), ErrRange)
	}
	al := enc.Mid().Lo()
	if al > 1e6 {
		return nil, fmt.Errorf("strip: alpha %s is above 1e6: %w", alpha.Expr(), ErrRange)
	}
	N, n := opt.Basis, opt.Nodes
	auto := N == 0
	if auto {
		var err error
		N, err = chooseBasis(al, 0.6*opt.Width, opt.MaxBasis)
		if err != nil {
			return nil, err
		}
	}
	for attempt := 0; ; attempt++ {
		nn := n
		if nn == 0 {
			nn = chooseNodes(al, N, 0.02*opt.Width)
		}
		if nn < N {
			nn = N
		}
		res, err := computeAt(alpha, enc, al, N, nn, opt)
		if err != nil {
			return nil, err
		}
		if !auto || attempt >= 3 || res.width() <= opt.Width || N >= opt.MaxBasis {
			return res, nil
		}
		N = int(math.Min(float64(opt.MaxBasis), math.Ceil(float64(N)*1.1)+2))
	}
}

func (r *Result) width() float64 {
	return math.Max(r.AdvantageF.Hi()-r.AdvantageF.Lo(), r.DeficitF.Hi()-r.DeficitF.Lo())
}

// chooseBasis returns the smallest N whose estimated discarded-part bound
// is below budget.
func chooseBasis(alpha, budget float64, maxN int) (int, error) {
	lb := math.Log(budget)
	ok := func(N int) bool { t, _, _ := bestTail(alpha, N); return t <= lb }
	hi := 4
	for !ok(hi) {
		if hi >= maxN {
			return 0, fmt.Errorf("strip: the width target needs a basis above %d at alpha %g (raise the basis cap or the width): %w", maxN, alpha, ErrRange)
		}
		hi = int(math.Min(float64(maxN), float64(hi)*1.5+1))
	}
	lo := 2
	for lo < hi {
		m := (lo + hi) / 2
		if ok(m) {
			hi = m
		} else {
			lo = m + 1
		}
	}
	return hi, nil
}

// nodeLadder rounds n up to the form m 2^e with 16 <= m < 32 (steps of at
// most 1/16), so that sweeps reuse cached Gauss rules.
func nodeLadder(n int) int {
	if n <= 16 {
		return n
	}
	e := 0
	for (n-1)>>e >= 32 {
		e++
	}
	m := (n + (1 << e) - 1) >> e
	return m << e
}

// chooseNodes returns the smallest ladder n >= N whose estimated Gauss
// remainder (Frobenius) is below budget.
func chooseNodes(alpha float64, N int, budget float64) int {
	lb := math.Log(budget)
	n := N
	for {
		l := nodeLadder(n)
		if q, _ := bestQuad(alpha, N, l); q <= lb {
			return l
		}
		n = l + 1
	}
}

// computeAt runs the certified pipeline for basis size N and n nodes.
func computeAt(alpha Alpha, enc interval.F, al float64, N, n int, opt Options) (*Result, error) {
	w := opt.Workers
	twoPi := interval.F{}.Pi().Scale(1)
	// Alpha rounding: |alpha - al| <= max(al - lo, hi - al).
	pal := interval.PointF(al)
	dA := pal.Sub(interval.PointF(enc.Lo())).Max(interval.PointF(enc.Hi()).Sub(pal))
	eAlpha := interval.PointF(dA.Hi()).Quo(twoPi)
	eAlpha = interval.PointF(0).Hull(interval.PointF(eAlpha.Hi()))
	if enc.Lo() == enc.Hi() {
		eAlpha = interval.PointF(0) // alpha is the float al itself
	}

	rule, err := getRule(n, w)
	if err != nil {
		return nil, err
	}
	V := rule.legendreValues(N, w)
	K := kernelMatrix(rule, al, w)
	H := galerkinMatrix(rule, V, K, N, w)
	V, K = nil, nil

	Hc, radF := midpoints(H)
	vals, QT, err := floatEigen(Hc, N)
	if err != nil {
		return nil, err
	}
	lam1, lamN := vals[0], vals[N-1]
	for _, v := range vals {
		lam1 = math.Min(lam1, v)
		lamN = math.Max(lamN, v)
	}
	scale := math.Max(math.Abs(lam1), math.Abs(lamN))
	sigLo, resLo, err := psdShift(Hc, N, lam1, 1, scale, w)
	if err != nil {
		return nil, err
	}
	sigHi, resHi, err := psdShift(Hc, N, lamN, -1, scale, w)
	if err != nil {
		return nil, err
	}

	_, qEta := bestQuad(al, N, n)
	logC := quadLogC(al, n, qEta)
	quadF := quadFrobenius(logC, N, qEta)
	_, e1, e2 := bestTail(al, N)
	tail := tailBound(al, N, e1, e2)
	for _, t := range []interval.F{radF, quadF, tail, resLo, resHi, logC} {
		if !t.IsFinite() {
			return nil, fmt.Errorf("strip: an error bound is not finite at alpha %g (N=%d, n=%d)", al, N, n)
		}
	}
	eMat := upper(radF).Add(upper(quadF))

	// Outer sides (Weyl): spec(G) lies within eMat of spec(Hc), which is
	// bounded by the semidefiniteness proofs; P k P has the extra eigenvalue
	// 0; k is within tail of P k P; K_alpha within eAlpha of k at al.
	gLow := lower(interval.PointF(sigLo).Sub(upper(resLo)).Sub(eMat))  // lambda_min(G) >= gLow
	gHigh := upper(interval.PointF(sigHi).Add(upper(resHi)).Add(eMat)) // lambda_max(G) <= gHigh
	outerMin := gLow.Min(interval.PointF(0)).Sub(upper(tail)).Sub(upper(eAlpha))
	outerMax := gHigh.Max(interval.PointF(0)).Add(upper(tail)).Add(upper(eAlpha))

	// Inner sides: Rayleigh quotients of the normalised float eigenvectors.
	vMin := normalised(QT[indexOf(vals, lam1)])
	vMax := normalised(QT[indexOf(vals, lamN)])
	rqMin, qMin := rayleigh(H, vMin, logC, qEta)
	rqMax, qMax := rayleigh(H, vMax, logC, qEta)
	if !rqMin.IsFinite() || !rqMax.IsFinite() {
		return nil, fmt.Errorf("strip: Rayleigh quotient enclosure failed at alpha %g", al)
	}
	innerMin := upper(rqMin).Add(upper(eAlpha)) // lambda_min <= innerMin.Hi()
	innerMax := lower(rqMax).Sub(upper(eAlpha)) // lambda_max >= innerMax.Lo()

	// lambda_min <= 0 <= lambda_max for a compact operator on an
	// infinite-dimensional space, so the inner sides may be clipped at 0.
	advLo := math.Max(-innerMin.Hi(), 0)
	advHi := -outerMin.Lo()
	defLo := math.Max(innerMax.Lo(), 0)
	defHi := outerMax.Hi()
	if !(advLo <= advHi) || !(defLo <= defHi) {
		return nil, fmt.Errorf("strip: inconsistent bracket at alpha %g (inner side beyond outer side)", al)
	}
	adv := interval.PointF(advLo).Hull(interval.PointF(advHi))
	def := interval.PointF(defLo).Hull(interval.PointF(defHi))

	av, err := alpha.View(17)
	if err != nil {
		return nil, err
	}
	res := &Result{
		Alpha:           av,
		AlphaUsed:       exactDecimal(al),
		WidthTarget:     opt.Width,
		BasisSize:       N,
		QuadratureNodes: n,
		Advantage:       bounds(adv),
		Deficit:         bounds(def),
		Basis:           BasisDescription,
		AdvantageWitness: Witness{
			Coefficients: vMin,
			Rayleigh:     bounds(rqMin),
		},
		DeficitWitness: Witness{
			Coefficients: vMax,
			Rayleigh:     bounds(rqMax),
		},
		Errors: ErrorTerms{
			AlphaRounding:              upStr(eAlpha),
			EntryRounding:              upStr(radF),
			EntryQuadrature:            upStr(quadF),
			DiscardedPart:              upStr(tail),
			LowestShift:                upStr(interval.PointF(lam1).Sub(interval.PointF(sigLo))),
			LowestResidual:             upStr(resLo),
			HighestShift:               upStr(interval.PointF(sigHi).Sub(interval.PointF(lamN))),
			HighestResidual:            upStr(resHi),
			AdvantageWitnessQuadrature: upStr(qMin),
			DeficitWitnessQuadrature:   upStr(qMax),
		},
		Ellipses: Ellipses{
			TailX:      exactDecimal(e1),
			TailY:      exactDecimal(e2),
			Quadrature: exactDecimal(qEta),
		},
		LowestEstimate:  exactDecimal(lam1),
		HighestEstimate: exactDecimal(lamN),
		GalerkinLowest:  exactDecimal(gLow.Lo()),
		GalerkinHighest: exactDecimal(gHigh.Hi()),
		AdvantageF:      adv,
		DeficitF:        def,
	}
	return res, nil
}

func upper(x interval.F) interval.F { return interval.PointF(x.Hi()) }
func lower(x interval.F) interval.F { return interval.PointF(x.Lo()) }

func indexOf(v []float64, x float64) int {
	for i, y := range v {
		if y == x {
			return i
		}
	}
	return 0
}

// normalised returns v/||v|| in float64 (the witness is whatever vector
// results; its Rayleigh quotient is enclosed exactly as given).
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

// bounds writes x with 17 significant digits, rounded outward.
func bounds(x interval.F) Bounds {
	lo, hi, err := interval.Decimals(x, 17)
	if err != nil {
		return Bounds{Lower: "-inf", Upper: "inf"}
	}
	return Bounds{Lower: lo, Upper: hi}
}

// upStr writes the upper end of x with 6 significant digits, rounded up.
func upStr(x interval.F) string {
	_, hi := x.Endpoints()
	if hi == nil {
		return "inf"
	}
	return interval.DecimalUp(hi, 6)
}

// exactDecimal writes the float64 v exactly in decimal.
func exactDecimal(v float64) string {
	d, err := certificates.FloatDecimal(v)
	if err != nil {
		return fmt.Sprint(v) // NaN or an infinity: no number reads it back
	}
	return d.String()
}
