// Package strip is the verifier of strip-bracket certificates; it
// registers itself with wedgebound/certificates/recheck. What it
// re-derives, and how, is listed below (Checker).
package strip

import (
	"fmt"
	"math"
	"math/big"
	"runtime"
	"sort"
	"strings"
	"time"

	"errors"
	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	"wedgebound/certificates/recheck/checknum"
	"wedgebound/interval"
)

// Verification of strip-bracket certificates.
//
// A strip certificate (certificates.Strip) claims brackets of both spectral
// edges of K_alpha, which is unitarily equivalent to the real symmetric
// kernel k(x, y) = -sin(alpha (x^2-y^2)/4)/(pi (x - y)) on L^2[-1, 0]. The
// verifier re-derives, with its own numerics (Clenshaw-Curtis instead of
// the certifier's Gauss-Legendre rule, its own kernel bounds on ellipses,
// its own eigenvalue proofs):
//
//  1. alpha from its exact value (or from the physical units), the recorded
//     enclosure of alpha, and alpha_rounding >= |alpha - alpha_used|/(2 pi)
//     (strip_alpha.go);
//  2. for both witnesses, an enclosure of the Rayleigh quotient
//     <psi, k psi>/sum c_j^2 at alpha_used (the rule at [(strip_rule.go)],
//     exact dot products, and a remainder bound of its own); then
//     advantage.lower <= max(-(R_min + e), 0) and
//     deficit.lower <= max(R_max - e, 0), because
//     inf spec k <= R_min, sup spec k >= R_max (variational principle),
//     inf spec k <= 0 <= sup spec k (k is compact on an infinite-dimensional
//     space), and ||K_alpha - K_alpha_used|| <= e;
//  3. discarded_part >= ||k - P k P|| by its own Chebyshev-coefficient bound
//     (tailF) with its own maximum of |k| on the recorded ellipses (or on
//     ellipses of its own choosing when those do not suffice);
//  4. galerkin_lowest <= lambda_min(G) and lambda_max(G) <= galerkin_highest
//     for the exact Galerkin matrix G (strip_galerkin.go), or a refutation by
//     a witness (lambda_min(G) <= R_min, lambda_max(G) >= R_max, since the
//     witnesses lie in the range of P);
//  5. advantage.upper >= -(min(galerkin_lowest, 0) - t - e) and
//     deficit.upper >= max(galerkin_highest, 0) + t + e, since P k P has
//     spectrum spec(G) and 0, and Weyl's inequality moves the edges by at
//     most t = discarded_part and e = alpha_rounding.
//
// Cost: the rule has about 2N + O(alpha) nodes M for basis size N; the
// kernel matrix is M^2 interval evaluations and the product U^T A U about
// N M^2 exact multiply-adds; the Cholesky proofs are O(N^3).

// Detail is what the strip verifier records besides the kind-neutral
// fields of recheck.Result.
type Detail struct {
	Alpha     string `json:"alpha"`
	BasisSize int    `json:"basis_size"`
	// RuleNodes is the number of Clenshaw-Curtis nodes the verifier used
	// per variable.
	RuleNodes int             `json:"rule_nodes"`
	Advantage recheck.Bracket `json:"advantage"`
	Deficit   recheck.Bracket `json:"deficit"`
	// AdvantageProved and DeficitProved are the brackets the verifier's own
	// numbers prove (an end is empty when its proof failed).
	AdvantageProved recheck.Bracket `json:"advantage_proved"`
	DeficitProved   recheck.Bracket `json:"deficit_proved"`
	// AdvantageRayleigh and DeficitRayleigh are the verifier's enclosures of
	// the witnesses' Rayleigh quotients.
	AdvantageRayleigh recheck.Bracket `json:"advantage_rayleigh"`
	DeficitRayleigh   recheck.Bracket `json:"deficit_rayleigh"`
	// Discarded is the verifier's bound on ||k - P k P||.
	Discarded string `json:"discarded"`
	// GalerkinDistance bounds the distance of the verifier's float Galerkin
	// matrix to the exact one; LowestProved and HighestProved are its
	// proved bounds on lambda_min(G) and lambda_max(G).
	GalerkinDistance string `json:"galerkin_distance"`
	LowestProved     string `json:"lowest_proved"`
	HighestProved    string `json:"highest_proved"`
	// Seconds lists the time of each stage.
	Seconds map[string]float64 `json:"seconds"`
}

// Strip verifier limits: the largest alpha_used and rule it attempts.
const (
	stripMaxAlpha = 1e6
	stripMaxNodes = 8000
)

// Targets of the verifier's own quadrature remainders (absolute).
const (
	stripTargetGalerkin = 1e-16
	stripTargetWitness  = 1e-20
)

type stripVerifier struct {
	s     *certificates.Strip
	opt   recheck.Options
	res   *recheck.Result
	sr    *Detail
	alpha interval.B
	start time.Time
	stage time.Time
}

func (v *stripVerifier) fail(f recheck.Failure) { v.res.Failures = append(v.res.Failures, f) }

func (v *stripVerifier) note(s string) { v.res.Notes = append(v.res.Notes, s) }

func (v *stripVerifier) lap(name string) {
	now := time.Now()
	v.sr.Seconds[name] = now.Sub(v.stage).Seconds()
	v.stage = now
}

func init() { recheck.Register(certificates.KindStrip, Checker{}) }

// Checker verifies strip-bracket certificates; the package registers it
// with recheck for certificates.KindStrip.
type Checker struct{}

// NewDetail returns an empty *Detail (recheck.DetailDecoder).
func (Checker) NewDetail() any { return new(Detail) }

// Check verifies a strip-bracket certificate (see the package comment).
func (Checker) Check(c *certificates.Certificate, opt recheck.Options) (*recheck.Result, error) {
	if c.Strip == nil {
		return nil, fmt.Errorf("%s certificate without its %q section", c.Kind, "strip")
	}
	start := time.Now()
	if opt.Workers <= 0 {
		opt.Workers = runtime.GOMAXPROCS(0)
	}
	s := c.Strip
	v := &stripVerifier{s: s, opt: opt, start: start, stage: start,
		res: &recheck.Result{Problem: stripDescribe(s), Bound: s.Advantage.Lower.String()},
		sr: &Detail{Alpha: s.Alpha.Value.String(), BasisSize: s.BasisSize, Advantage: bracketText(s.Advantage), Deficit: bracketText(s.Deficit),
			Seconds: map[string]float64{}}}
	v.res.Detail = v.sr
	// The schema's strict reading, in case c did not come from Decode.
	if err := certificates.CheckStrict(c); err != nil {
		v.fail(recheck.Failure{Where: "structure", Message: err.Error()})
		return v.res, nil
	}
	v.res.Statement = fmt.Sprintf("A(alpha) = -inf spec K_alpha in [%s, %s] and sup spec K_alpha in [%s, %s]",
		s.Advantage.Lower, s.Advantage.Upper, s.Deficit.Lower, s.Deficit.Upper)
	v.run()
	// Claims shown false come first, then those not proved, each in the
	// order checked.
	sort.SliceStable(v.res.Failures, func(i, j int) bool { return v.res.Failures[i].Refuted && !v.res.Failures[j].Refuted })
	return v.res, nil
}

// exact is a recorded number of the schema.
type exact interface {
	Rat() *big.Rat
	String() string
}

// readNumbers checks that every recorded number the proof uses is present
// (the schema's reader has read each exactly). One that is missing is a
// failure of the structure and ends the check.
func (v *stripVerifier) readNumbers() bool {
	s := v.s
	ok := true
	read := func(n exact, name string) {
		if n.Rat() == nil {
			v.fail(recheck.Failure{Where: "structure", Message: name + ": missing number"})
			ok = false
		}
	}
	read(s.Alpha.Lower, "alpha.lower")
	read(s.Alpha.Upper, "alpha.upper")
	read(s.AlphaUsed, "alpha_used")
	read(s.Errors.AlphaRounding, "errors.alpha_rounding")
	read(s.Errors.DiscardedPart, "errors.discarded_part")
	read(s.Errors.DiscardedEtaX, "errors.discarded_eta_x")
	read(s.Errors.DiscardedEtaY, "errors.discarded_eta_y")
	read(s.GalerkinLowest, "galerkin_lowest")
	read(s.GalerkinHighest, "galerkin_highest")
	for _, b := range []struct {
		b    certificates.StripBracket
		name string
	}{{s.Advantage, "advantage"}, {s.Deficit, "deficit"}, {s.AdvantageWitness.Rayleigh, "advantage_witness.rayleigh"}, {s.DeficitWitness.Rayleigh, "deficit_witness.rayleigh"}} {
		read(b.b.Lower, b.name+".lower")
		read(b.b.Upper, b.name+".upper")
	}
	for j, c := range s.AdvantageWitness.Coefficients {
		read(c, fmt.Sprintf("advantage_witness.coefficients[%d]", j))
	}
	for j, c := range s.DeficitWitness.Coefficients {
		read(c, fmt.Sprintf("deficit_witness.coefficients[%d]", j))
	}
	return ok
}

// rat returns the exact value of a recorded number (a copy); readNumbers
// has checked that every number the proof asks for is present.
func (v *stripVerifier) rat(n exact) *big.Rat { return n.Rat() }

// bracketText is a recorded bracket as text.
func bracketText(b certificates.StripBracket) recheck.Bracket {
	return recheck.Bracket{Lower: b.Lower.String(), Upper: b.Upper.String()}
}

func ratOfFloat(x float64) *big.Rat { r, _ := new(big.Float).SetFloat64(x).Rat(nil); return r }

// stripProof carries what one proof step hands to the next.
type stripProof struct {
	epsOwn *big.Rat // the verifier's own bound on ||K_alpha - K_alpha_used||

	auF   interval.F // alpha_used
	N     int        // basis size
	coefB [2][]interval.B
	coefF [2][]interval.F
	norm2 [2]*big.Rat // squared norms of the witnesses' coefficients

	n    int // the rule has n+1 nodes
	qEta float64
	rule *stripRule
	nd   *stripNodes
	rows *stripRows

	At          [][]float64 // float kernel matrix
	wrad        [2][]interval.F
	psiMid      [2][]float64
	psiRad      [2][]float64
	radA, normA interval.F
	quadG       interval.F
	quadW       [2]interval.F
	R           [2]interval.F // the witnesses' Rayleigh quotients
	advLoOwn    *big.Rat
	defLoOwn    *big.Rat
	tOwn        *big.Rat // the verifier's own bound on the discarded part
	lowOK       bool
	highOK      bool
	lowP, highP float64
}

// run performs the proof steps in the order of the package comment; a step
// returns false when the later steps cannot be checked.
func (v *stripVerifier) run() {
	if !v.readNumbers() {
		return
	}
	p := &stripProof{}
	for _, step := range []func(*stripProof) bool{
		v.stepAlpha,      // 1. alpha and alpha_rounding
		v.stepRule,       //    the verifier's rule and basis rows
		v.stepKernel,     //    the kernel matrix and its bounds
		v.stepRemainders, //    quadrature remainders
		v.stepWitnesses,  // 2. witnesses and the lower ends
		v.stepDiscarded,  // 3. the discarded part
		v.stepGalerkin,   // 4. the Galerkin eigenvalue bounds
		v.stepOuterEnds,  // 5. the upper ends, and refutations
	} {
		if !step(p) {
			return
		}
	}
	if len(v.res.Failures) == 0 {
		v.res.Recomputed = fmt.Sprintf("A(alpha) in [%s, %s], sup spec in [%s, %s]",
			v.sr.AdvantageProved.Lower, v.sr.AdvantageProved.Upper, v.sr.DeficitProved.Lower, v.sr.DeficitProved.Upper)
	}
}

// stepAlpha is proof step 1: alpha re-derived, its recorded enclosure and
// the alpha rounding term (checkAlpha), giving the verifier's own bound on
// ||K_alpha - K_alpha_used||.
func (v *stripVerifier) stepAlpha(p *stripProof) bool {
	q, ok := v.checkAlpha()
	v.lap("alpha")
	if !ok {
		return false
	}
	_, qh := q.Endpoints()
	p.epsOwn, _ = qh.Rat(nil) // exact: a big.Float is a rational
	return true
}

// stepRule reads alpha_used and the witnesses' coefficients and builds the
// verifier's Clenshaw-Curtis rule with the Legendre rows at its nodes.
func (v *stripVerifier) stepRule(p *stripProof) bool {
	s := v.s
	au := v.rat(s.AlphaUsed)
	auF, err := interval.F{}.Decimal(s.AlphaUsed.String())
	if err != nil || !auF.IsFinite() {
		v.fail(recheck.Failure{Where: "alpha_used", Message: "alpha_used cannot be enclosed"})
		return false
	}
	if auF.Hi() > stripMaxAlpha {
		v.fail(recheck.Failure{Where: "alpha_used", Message: fmt.Sprintf("alpha_used %s is above %g, beyond what this verifier handles", s.AlphaUsed, stripMaxAlpha)})
		return false
	}
	p.auF = auF
	auB := ratB(au, stripNodePrec)
	N := s.BasisSize
	p.N = N
	for w, wit := range []certificates.StripWitness{s.AdvantageWitness, s.DeficitWitness} {
		p.coefB[w] = make([]interval.B, N)
		p.coefF[w] = make([]interval.F, N)
		p.norm2[w] = new(big.Rat)
		for j, cs := range wit.Coefficients {
			r := v.rat(cs)
			p.coefB[w][j] = ratB(r, stripNodePrec)
			p.coefF[w][j] = stripToF(p.coefB[w][j])
			p.norm2[w].Add(p.norm2[w], new(big.Rat).Mul(r, r))
		}
	}
	n, qEta, ok := planStripRule(auF.Mid().Lo(), N, p.coefF)
	if !ok {
		v.fail(recheck.Failure{Where: "basis_size", Message: fmt.Sprintf("the verifier's rule for basis size %d at alpha %s would need more than %d nodes", N, s.AlphaUsed, stripMaxNodes)})
		return false
	}
	rule, err := newStripRule(n, v.opt.Workers)
	if err != nil {
		v.fail(recheck.Failure{Where: "rule", Message: err.Error()})
		return false
	}
	p.n, p.qEta, p.rule = n, qEta, rule
	v.sr.RuleNodes = n + 1
	p.nd = rule.nodeData(auB, v.opt.Workers)
	p.rows = rule.rows(N, p.coefB, v.opt.Workers)
	v.lap("rule")
	return true
}

// stepKernel evaluates the kernel matrix at the rule's nodes (float
// midpoints At with bounds on their distance radA to the exact matrix and
// on its norm normA) and the witnesses' weighted radii.
func (v *stripVerifier) stepKernel(p *stripProof) bool {
	M := p.n + 1
	auF, nd, rule, rows := p.auF, p.nd, p.rule, p.rows
	At := make([][]float64, M)
	radRow := make([]interval.F, M)
	normRow := make([]interval.F, M)
	for w := range p.wrad {
		p.wrad[w] = make([]interval.F, M)
		p.psiMid[w] = make([]float64, M)
		p.psiRad[w] = make([]float64, M)
		for a := 0; a < M; a++ {
			p.psiMid[w][a], p.psiRad[w][a] = midRad(rows.psi[w][a])
		}
	}
	psiMid, wrad := p.psiMid, p.wrad
	sqwF := make([]interval.F, M)
	for a := range sqwF {
		sqwF[a] = stripToF(rule.sqw[a])
	}
	checknum.For(M, v.opt.Workers, func(a int) {
		row := make([]float64, M)
		r2, n2 := interval.PointF(0), interval.PointF(0)
		var wr [2]interval.F
		for b := 0; b < M; b++ {
			var ww interval.F
			if a <= b {
				ww = sqwF[a].Mul(sqwF[b])
			} else {
				ww = sqwF[b].Mul(sqwF[a])
			}
			x := ww.Mul(nd.kernel(auF, a, b))
			mid, rad := midRad(x)
			row[b] = mid
			rr := interval.PointF(rad)
			r2 = r2.Add(rr.Sqr())
			n2 = n2.Add(interval.PointF(mid).Sqr())
			for w := range wr {
				wr[w] = wr[w].Add(rr.Mul(interval.PointF(math.Abs(psiMid[w][b]))))
			}
		}
		At[a] = row
		radRow[a], normRow[a] = r2, n2
		for w := range wr {
			wrad[w][a] = wr[w].Mul(interval.PointF(math.Abs(psiMid[w][a])))
		}
	})
	radA2, normA2 := interval.PointF(0), interval.PointF(0)
	for a := 0; a < M; a++ {
		radA2 = radA2.Add(radRow[a])
		normA2 = normA2.Add(normRow[a])
	}
	p.radA = interval.PointF(radA2.Sqrt().Hi())
	p.normA = interval.PointF(normA2.Sqrt().Hi())
	p.At = At
	v.lap("kernel")
	return true
}

// stepRemainders bounds the rule's remainders for the Galerkin entries and
// for the witnesses' quadratic forms.
func (v *stripVerifier) stepRemainders(p *stripProof) bool {
	logMk := newKernelSup(p.auF, p.qEta, 0).bound(1e-3)
	logC := stripLogC(p.n, p.rule.wsum, p.qEta, logMk)
	p.quadG = galerkinQuadF(logC, p.N, p.qEta, p.rule.wsum)
	for w := range p.quadW {
		p.quadW[w] = witnessQuadF(logC, p.coefF[w], p.qEta, p.rule.wsum)
	}
	if !p.quadG.IsFinite() || !p.quadW[0].IsFinite() || !p.quadW[1].IsFinite() {
		v.fail(recheck.Failure{Where: "rule", Message: "the verifier's quadrature remainder bound is not finite"})
		return false
	}
	v.lap("remainders")
	return true
}

// stepWitnesses is proof step 2: the witnesses' Rayleigh quotients, their
// recorded enclosures, and the lower ends of both brackets.
func (v *stripVerifier) stepWitnesses(p *stripProof) bool {
	s := v.s
	e := v.rat(s.Errors.AlphaRounding)
	R := &p.R
	for w := range R {
		R[w] = v.rayleigh(p.At, p.psiMid[w], p.psiRad[w], p.wrad[w], p.normA, p.radA, p.quadW[w], p.norm2[w])
	}
	v.sr.AdvantageRayleigh = bracketOf(R[0], 17)
	v.sr.DeficitRayleigh = bracketOf(R[1], 17)
	for w, wit := range []certificates.StripWitness{s.AdvantageWitness, s.DeficitWitness} {
		name := []string{"advantage_witness", "deficit_witness"}[w]
		mine := []recheck.Bracket{v.sr.AdvantageRayleigh, v.sr.DeficitRayleigh}[w]
		lo, hi := v.rat(wit.Rayleigh.Lower), v.rat(wit.Rayleigh.Upper)
		rl, rh := ratOfFloat(R[w].Lo()), ratOfFloat(R[w].Hi())
		if lo.Cmp(rh) > 0 || hi.Cmp(rl) < 0 {
			v.fail(recheck.Failure{Where: name + ".rayleigh", Refuted: true,
				Message: fmt.Sprintf("the recorded enclosure [%s, %s] of the Rayleigh quotient is false: the verifier's is [%s, %s]",
					wit.Rayleigh.Lower, wit.Rayleigh.Upper, mine.Lower, mine.Upper)})
		}
	}
	zero := new(big.Rat)
	rMinHi, rMaxLo := ratOfFloat(R[0].Hi()), ratOfFloat(R[1].Lo())
	// Proved lower ends, with the recorded e (checked above) and with the
	// verifier's own eps.
	advLoRec := ratMaxR(new(big.Rat).Neg(add(rMinHi, e)), zero)
	defLoRec := ratMaxR(sub(rMaxLo, e), zero)
	p.advLoOwn = ratMaxR(new(big.Rat).Neg(add(rMinHi, p.epsOwn)), zero)
	p.defLoOwn = ratMaxR(sub(rMaxLo, p.epsOwn), zero)
	v.sr.AdvantageProved.Lower = ratDown17(p.advLoOwn)
	v.sr.DeficitProved.Lower = ratDown17(p.defLoOwn)
	advLo, defLo := v.rat(s.Advantage.Lower), v.rat(s.Deficit.Lower)
	if advLo.Cmp(advLoRec) > 0 {
		v.fail(recheck.Failure{Where: "advantage", Bound: true, By: checknum.RatDecimal(sub(advLo, advLoRec)),
			Message: fmt.Sprintf("the lower end %s is not proved: the advantage witness gives A(alpha) >= max(-(R + e), 0) = %s (R <= %s, e = %s)",
				s.Advantage.Lower, ratDown17(advLoRec), v.sr.AdvantageRayleigh.Upper, s.Errors.AlphaRounding)})
	}
	if defLo.Cmp(defLoRec) > 0 {
		v.fail(recheck.Failure{Where: "deficit", Bound: true, By: checknum.RatDecimal(sub(defLo, defLoRec)),
			Message: fmt.Sprintf("the lower end %s is not proved: the deficit witness gives sup spec >= max(R - e, 0) = %s (R >= %s, e = %s)",
				s.Deficit.Lower, ratDown17(defLoRec), v.sr.DeficitRayleigh.Lower, s.Errors.AlphaRounding)})
	}
	v.lap("witnesses")
	return true
}

// stepDiscarded is proof step 3: discarded_part >= ||k - P k P||.
func (v *stripVerifier) stepDiscarded(p *stripProof) bool {
	s := v.s
	t := v.rat(s.Errors.DiscardedPart)
	tailOwn, tailNote := v.discarded(p.auF, p.N)
	if tailNote != "" {
		v.note(tailNote)
	}
	v.sr.Discarded = sciUp(tailOwn.Hi())
	p.tOwn = ratOfFloat(tailOwn.Hi())
	if p.tOwn.Cmp(t) > 0 {
		v.fail(recheck.Failure{Where: "errors.discarded_part", By: checknum.RatDecimal(sub(p.tOwn, t)),
			Message: fmt.Sprintf("cannot prove discarded_part %s >= ||k - P k P||: the verifier's bound is %s", s.Errors.DiscardedPart, v.sr.Discarded)})
	}
	v.lap("discarded")
	return true
}

// stepGalerkin is proof step 4: galerkin_lowest <= lambda_min(G) and
// lambda_max(G) <= galerkin_highest, or their refutation by a witness.
func (v *stripVerifier) stepGalerkin(p *stripProof) bool {
	s := v.s
	gl, gh := v.rat(s.GalerkinLowest), v.rat(s.GalerkinHighest)
	R := p.R
	gk := stripGalerkin(p.At, p.rows, p.quadG, p.radA, p.normA, v.opt.Workers)
	p.At = nil
	v.sr.GalerkinDistance = sciUp(gk.delta.Hi())
	glF, err1 := checknum.Enclose(interval.F{}, gl)
	ghF, err2 := checknum.Enclose(interval.F{}, gh)
	if err := errors.Join(err1, err2); err != nil {
		v.fail(recheck.Failure{Where: "galerkin_lowest", Message: "the recorded Galerkin bounds cannot be enclosed: " + err.Error()})
		return false
	}
	var lowOK, highOK bool
	var lowP, highP float64
	if R[0].Hi() < glF.Lo() {
		v.fail(recheck.Failure{Where: "galerkin_lowest", Refuted: true, By: fmtFloat(glF.Lo() - R[0].Hi()),
			Message: fmt.Sprintf("galerkin_lowest %s is false: the advantage witness lies in the Galerkin space and has Rayleigh quotient at most %s", s.GalerkinLowest, v.sr.AdvantageRayleigh.Upper)})
	} else {
		lowP, lowOK = gk.proveEdge(glF.Hi(), R[0].Lo(), 1, v.opt.Workers)
		if !lowOK {
			v.fail(recheck.Failure{Where: "galerkin_lowest",
				Message: fmt.Sprintf("cannot prove lambda_min(G) >= %s (the verifier's float Galerkin matrix is within %s of G; best proved %s)", s.GalerkinLowest, v.sr.GalerkinDistance, fmtFloat(lowP))})
		}
	}
	if R[1].Lo() > ghF.Hi() {
		v.fail(recheck.Failure{Where: "galerkin_highest", Refuted: true, By: fmtFloat(R[1].Lo() - ghF.Hi()),
			Message: fmt.Sprintf("galerkin_highest %s is false: the deficit witness lies in the Galerkin space and has Rayleigh quotient at least %s", s.GalerkinHighest, v.sr.DeficitRayleigh.Lower)})
	} else {
		highP, highOK = gk.proveEdge(ghF.Lo(), R[1].Hi(), -1, v.opt.Workers)
		if !highOK {
			v.fail(recheck.Failure{Where: "galerkin_highest",
				Message: fmt.Sprintf("cannot prove lambda_max(G) <= %s (the verifier's float Galerkin matrix is within %s of G; best proved %s)", s.GalerkinHighest, v.sr.GalerkinDistance, fmtFloat(highP))})
		}
	}
	if lowOK {
		v.sr.LowestProved = interval.DecimalDown(new(big.Float).SetFloat64(lowP), 17)
	}
	if highOK {
		v.sr.HighestProved = interval.DecimalUp(new(big.Float).SetFloat64(highP), 17)
	}
	p.lowOK, p.highOK, p.lowP, p.highP = lowOK, highOK, lowP, highP
	v.lap("galerkin")
	return true
}

// stepOuterEnds is proof step 5: the recorded upper ends follow from the
// recorded Galerkin bounds and error terms; the verifier's own upper ends,
// and the refutations they and the witnesses give.
func (v *stripVerifier) stepOuterEnds(p *stripProof) bool {
	s := v.s
	zero := new(big.Rat)
	e, t := v.rat(s.Errors.AlphaRounding), v.rat(s.Errors.DiscardedPart)
	gl, gh := v.rat(s.GalerkinLowest), v.rat(s.GalerkinHighest)
	advLo, defLo := v.rat(s.Advantage.Lower), v.rat(s.Deficit.Lower)
	tOwn, epsOwn := p.tOwn, p.epsOwn
	lowOK, highOK, lowP, highP := p.lowOK, p.highOK, p.lowP, p.highP
	advLoOwn, defLoOwn := p.advLoOwn, p.defLoOwn
	advHiRec := add(sub(t, ratMinR(gl, zero)), e)
	defHiRec := add(add(ratMaxR(gh, zero), t), e)
	advHi, defHi := v.rat(s.Advantage.Upper), v.rat(s.Deficit.Upper)
	if advHi.Cmp(advHiRec) < 0 {
		v.fail(recheck.Failure{Where: "advantage", Bound: true, By: checknum.RatDecimal(sub(advHiRec, advHi)),
			Message: fmt.Sprintf("the upper end %s is not supported: -(min(galerkin_lowest, 0) - discarded_part - alpha_rounding) = %s", s.Advantage.Upper, ratUp17(advHiRec))})
	}
	if defHi.Cmp(defHiRec) < 0 {
		v.fail(recheck.Failure{Where: "deficit", Bound: true, By: checknum.RatDecimal(sub(defHiRec, defHi)),
			Message: fmt.Sprintf("the upper end %s is not supported: max(galerkin_highest, 0) + discarded_part + alpha_rounding = %s", s.Deficit.Upper, ratUp17(defHiRec))})
	}

	// The verifier's own outer ends, and refutations of the claims.
	if lowOK {
		up := add(sub(tOwn, ratMinR(ratOfFloat(lowP), zero)), epsOwn)
		v.sr.AdvantageProved.Upper = ratUp17(up)
		if advLo.Cmp(up) > 0 {
			v.fail(recheck.Failure{Where: "advantage", Bound: true, Refuted: true, By: checknum.RatDecimal(sub(advLo, up)),
				Message: fmt.Sprintf("the lower end %s is false: the verifier proves A(alpha) <= %s", s.Advantage.Lower, ratUp17(up))})
		}
	}
	if highOK {
		up := add(add(ratMaxR(ratOfFloat(highP), zero), tOwn), epsOwn)
		v.sr.DeficitProved.Upper = ratUp17(up)
		if defLo.Cmp(up) > 0 {
			v.fail(recheck.Failure{Where: "deficit", Bound: true, Refuted: true, By: checknum.RatDecimal(sub(defLo, up)),
				Message: fmt.Sprintf("the lower end %s is false: the verifier proves sup spec K_alpha <= %s", s.Deficit.Lower, ratUp17(up))})
		}
	}
	if advHi.Cmp(advLoOwn) < 0 {
		v.fail(recheck.Failure{Where: "advantage", Bound: true, Refuted: true, By: checknum.RatDecimal(sub(advLoOwn, advHi)),
			Message: fmt.Sprintf("the upper end %s is false: the advantage witness proves A(alpha) >= %s", s.Advantage.Upper, ratDown17(advLoOwn))})
	}
	if defHi.Cmp(defLoOwn) < 0 {
		v.fail(recheck.Failure{Where: "deficit", Bound: true, Refuted: true, By: checknum.RatDecimal(sub(defLoOwn, defHi)),
			Message: fmt.Sprintf("the upper end %s is false: the deficit witness proves sup spec K_alpha >= %s", s.Deficit.Upper, ratDown17(defLoOwn))})
	}
	return true
}

func ratMaxR(a, b *big.Rat) *big.Rat {
	if a.Cmp(b) >= 0 {
		return a
	}
	return b
}

func ratMinR(a, b *big.Rat) *big.Rat {
	if a.Cmp(b) <= 0 {
		return a
	}
	return b
}

func add(a, b *big.Rat) *big.Rat { return new(big.Rat).Add(a, b) }

func sub(a, b *big.Rat) *big.Rat { return new(big.Rat).Sub(a, b) }

// rayleigh encloses <psi, k psi>/||c||^2 from the midpoints and radii of
// psi_hat (psi_hat_a = sqrt(w_a/2) psi(x_a)), the float kernel matrix At
// with ||A - At||_F <= radA and ||At||_F <= normA, wrad[a] >= |psi_a|
// sum_b rad(A_ab) |psi_b|, and the quadrature remainder quad. With
// psi_hat = p + dp and A = At + dA, psi_hat^T A psi_hat differs from
// p^T At p by at most sum_ab |p_a| |dA_ab| |p_b| + (2 ||p|| + ||dp||) ||dp||
// (normA + radA).
func (v *stripVerifier) rayleigh(At [][]float64, p, dp []float64, wrad []interval.F, normA, radA, quad interval.F, norm2 *big.Rat) interval.F {
	M := len(p)
	t := make([]float64, M)
	te := make([]float64, M)
	checknum.For(M, v.opt.Workers, func(a int) {
		t[a], te[a] = exactDot(At[a], p)
	})
	num, e0 := exactDot(p, t)
	errs := interval.PointF(e0)
	pn, dpn := interval.PointF(0), interval.PointF(0)
	for a := 0; a < M; a++ {
		errs = errs.Add(interval.PointF(math.Abs(p[a])).Mul(interval.PointF(te[a]))).Add(wrad[a])
		pn = pn.Add(interval.PointF(p[a]).Sqr())
		dpn = dpn.Add(interval.PointF(dp[a]).Sqr())
	}
	pn, dpn = pn.Sqrt(), dpn.Sqrt()
	errs = errs.Add(pn.Scale(1).Add(dpn).Mul(dpn).Mul(normA.Add(radA))).Add(quad)
	den := interval.F{}.Between(ratFloat(norm2, big.ToNegativeInf), ratFloat(norm2, big.ToPositiveInf))
	return interval.PointF(num).Pad(interval.PointF(errs.Hi())).Quo(den)
}

func ratFloat(r *big.Rat, mode big.RoundingMode) *big.Float {
	return new(big.Float).SetPrec(128).SetMode(mode).SetRat(r)
}

// discarded bounds ||k - P k P|| at the recorded ellipses, or at ellipses
// of the verifier's own choosing when that is smaller.
func (v *stripVerifier) discarded(alpha interval.F, N int) (interval.F, string) {
	s := v.s
	ex, ey := v.rat(s.Errors.DiscardedEtaX), v.rat(s.Errors.DiscardedEtaY)
	best := interval.F{}.Whole()
	e1, _ := ex.Float64() // the nearest float64: the ellipse is then the verifier's choice
	e2, _ := ey.Float64()
	if e1 > 0 && e2 > 0 && e1 < 50 && e2 < 50 {
		lm := newKernelSup(alpha, e1, e2).bound(1e-5)
		best = tailF(lm, N, e1, e2)
	}
	t := v.rat(s.Errors.DiscardedPart)
	if best.IsFinite() && ratOfFloat(best.Hi()).Cmp(t) <= 0 {
		return best, ""
	}
	// Own choice: minimise the float estimate of the same bound.
	af := alpha.Mid().Lo()
	bl, b1, b2 := math.Inf(1), 0.0, 0.0
	for e1 := 0.002; e1 < 12; e1 *= 1.02 {
		for e2 := 1e-6; e2 < 6; e2 *= 1.08 {
			l := logKernelEstimate(af, e1, e2) + math.Log(4) - float64(N)*e1 -
				math.Log(-math.Expm1(-e1)) + math.Log((math.Exp(e2)+1)/math.Expm1(e2))
			if l < bl {
				bl, b1, b2 = l, e1, e2
			}
		}
	}
	own := tailF(newKernelSup(alpha, b1, b2).bound(1e-5), N, b1, b2)
	if !best.IsFinite() || own.Hi() < best.Hi() {
		return own, fmt.Sprintf("discarded part bounded on the verifier's own ellipses (eta_x = %.6g, eta_y = %.6g)", b1, b2)
	}
	return best, ""
}

// planStripRule chooses an even n >= 2N and an ellipse eta for which the
// float estimates of the Galerkin and witness remainders meet their targets.
func planStripRule(alpha float64, N int, coef [2][]interval.F) (int, float64, bool) {
	var lpsi0 [2]float64
	abs := [2][]float64{make([]float64, N), make([]float64, N)}
	for w := range coef {
		var s float64
		for j, c := range coef[w] {
			abs[w][j] = c.Abs().Hi()
			s += abs[w][j] * math.Sqrt(float64(2*j+1))
		}
		lpsi0[w] = math.Log(s)
	}
	lpsi := func(w int, eta float64) float64 {
		top := math.Inf(-1)
		for j, a := range abs[w] {
			if a > 0 {
				top = math.Max(top, math.Log(a)+0.5*math.Log(float64(2*j+1))+eta*float64(j))
			}
		}
		var s float64
		for j, a := range abs[w] {
			if a > 0 {
				s += math.Exp(math.Log(a) + 0.5*math.Log(float64(2*j+1)) + eta*float64(j) - top)
			}
		}
		return top + math.Log(s)
	}
	n := 2 * N
	if n < 8 {
		n = 8
	}
	for ; n <= stripMaxNodes; n += 2 * int(math.Max(1, float64(n)/40)) {
		bestScore, bestEta := math.Inf(1), 0.0
		for eta := 0.01; eta < 8; eta *= 1.05 {
			lc := math.Log(2*(2+2/float64((n+2)*(n+2)-1))) + logKernelEstimate(alpha, eta, 0) -
				float64(n)*eta - math.Log(math.Expm1(2*eta))
			l1, l2 := logSumWeighted(N, eta, 1), logSumWeighted(N, eta, 2)
			l0 := 2 * math.Log(float64(N))
			lg := lc + 0.5*(l2+l0+math.Log(4+8*math.Exp(2*l1-l2-l0)+4)) - math.Log(4)
			score := lg - math.Log(stripTargetGalerkin)
			for w := range coef {
				lw := lc + math.Log(4.0/4) + lpsi(w, eta) + lpsi0[w]
				score = math.Max(score, lw-math.Log(stripTargetWitness))
			}
			if score < bestScore {
				bestScore, bestEta = score, eta
			}
		}
		if bestScore <= 0 {
			return n, bestEta, true
		}
	}
	return 0, 0, false
}

func bracketOf(x interval.F, digits int) recheck.Bracket {
	lo, hi, err := interval.Decimals(x, digits)
	if err != nil {
		return recheck.Bracket{Lower: "-inf", Upper: "inf"}
	}
	return recheck.Bracket{Lower: lo, Upper: hi}
}

func ratDown17(r *big.Rat) string {
	if r.Sign() == 0 {
		return "0"
	}
	return interval.DecimalDown(ratFloat(r, big.ToNegativeInf), 17)
}

func ratUp17(r *big.Rat) string {
	if r.Sign() == 0 {
		return "0"
	}
	return interval.DecimalUp(ratFloat(r, big.ToPositiveInf), 17)
}

func fmtFloat(x float64) string {
	if math.IsInf(x, 0) || math.IsNaN(x) {
		return fmt.Sprint(x)
	}
	if x < 0 {
		return "-" + sciUp(-x)
	}
	return sciUp(x)
}

// sciUp writes x >= 0 rounded up to 6 significant digits in scientific
// notation (the digits of interval.DecimalUp, with the point moved).
func sciUp(x float64) string {
	if math.IsInf(x, 0) || math.IsNaN(x) || x < 0 {
		return fmt.Sprint(x)
	}
	if x == 0 {
		return "0"
	}
	d := interval.DecimalUp(new(big.Float).SetFloat64(x), 6)
	if strings.ContainsAny(d, "eE") {
		return d
	}
	intPart, frac, _ := strings.Cut(d, ".")
	digits := strings.TrimLeft(intPart+frac, "0")
	exp := len(intPart) - 1 - (len(intPart+frac) - len(strings.TrimLeft(intPart+frac, "0")))
	digits = strings.TrimRight(digits, "0")
	if digits == "" {
		return "0"
	}
	m := digits[:1]
	if len(digits) > 1 {
		m += "." + digits[1:]
	}
	if exp == 0 {
		return m
	}
	return fmt.Sprintf("%se%d", m, exp)
}
