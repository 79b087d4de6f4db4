package strip

import (
	"fmt"
	"math"
	"math/big"
	"sync"

	"wedgebound/certify"
	"wedgebound/interval"
)

// nodeBits is the precision of the stored node enclosures; every node is
// located to within 2^-nodeSepBits, far below float64 resolution, so that
// the kernel phases alpha x^2/4 keep full float64 accuracy up to alpha ~ 1e6.
const (
	nodeBits    = 128
	nodeSepBits = 100
)

// gaussRule holds enclosures of the n-point Gauss-Legendre rule on [-1, 1].
// node[i] is a B interval of width 2^(1-nodeSepBits) containing exactly one
// root of P_n (the nodes are in decreasing order and pairwise disjoint),
// center[i] is a point inside it, and weight[i] encloses the exact weight
// 2 / ((1 - x^2) P_n'(x)^2) at that root.
type gaussRule struct {
	n      int
	node   []interval.B
	center []interval.B
	weight []interval.F
}

var ruleCache sync.Map // int -> *gaussRule

// growthBits bounds the number of bits lost by the three-term recurrence of
// P_k(x) in interval arithmetic over k steps: the endpoint widths obey
// w_{k+1} <= 2|x| w_k + w_{k-1}, whose growth rate is |x| + sqrt(1 + x^2).
func growthBits(x float64, k int) uint {
	r := math.Abs(x) + math.Sqrt(1+x*x)
	return uint(float64(k)*math.Log2(r)) + 1
}

// legendrePair encloses P_k(x) and P_{k-1}(x) (k >= 1) for the point x by
// the recurrence j P_j = (2j - 1) x P_{j-1} - (j - 1) P_{j-2}.
func legendrePair(x interval.B, k int) (pk, pk1 interval.B) {
	p0, p1 := x.Int(1), x
	for j := 2; j <= k; j++ {
		p2 := x.Mul(p1).Mul(x.Int(int64(2*j - 1))).Sub(p0.Mul(x.Int(int64(j - 1)))).Quo(x.Int(int64(j)))
		p0, p1 = p1, p2
	}
	return p1, p0
}

// floatGaussNode returns a float64 approximation of the i-th largest root of
// P_n by Newton's method (only a starting point; it is verified later).
func floatGaussNode(n, i int) float64 {
	z := math.Cos(math.Pi * (float64(i) + 0.75) / (float64(n) + 0.5))
	for it := 0; it < 100; it++ {
		p0, p1 := 1.0, z
		for k := 2; k <= n; k++ {
			p0, p1 = p1, ((2*float64(k)-1)*z*p1-float64(k-1)*p0)/float64(k)
		}
		dp := float64(n) * (z*p1 - p0) / (z*z - 1)
		dz := p1 / dp
		z -= dz
		if math.Abs(dz) <= 1e-17 {
			break
		}
	}
	return z
}

// getRule returns the verified n-point rule, computing it on first use.
func getRule(n int, workers int) (*gaussRule, error) {
	if r, ok := ruleCache.Load(n); ok {
		return r.(*gaussRule), nil
	}
	r, err := newGaussRule(n, workers)
	if err != nil {
		return nil, err
	}
	ruleCache.Store(n, r)
	return r, nil
}

// newGaussRule verifies the n-point Gauss-Legendre rule (n >= 2).
//
// For each positive root: a float64 Newton iterate is refined by two
// unverified Newton steps in big.Float to x~ (aimNode), then P_n is
// evaluated at x~ - d and x~ + d
// (d = 2^-nodeSepBits) in interval arithmetic with enough guard bits for the
// recurrence; a strict sign change proves a root in between. The n node
// intervals (positive ones, their mirror images, and 0 for odd n, a root by
// parity) are checked pairwise disjoint, so each holds exactly one of the n
// roots. The weight uses w = 2 (1 - x^2) / (n P_{n-1}(x))^2, valid at a root
// of P_n (since (1 - x^2) P_n' = n (P_{n-1} - x P_n)), with P_{n-1} at the
// root enclosed by its value at x~ - d plus the Markov bound
// |P_{n-1}'| <= (n-1)^2 on [-1, 1] (A. A. Markov 1889; |P_m| <= 1 there)
// times the distance 2d.
func newGaussRule(n int, workers int) (*gaussRule, error) {
	if n < 2 {
		return nil, fmt.Errorf("strip: Gauss rule needs n >= 2, got %d", n)
	}
	half := n / 2
	r := &gaussRule{n: n, node: make([]interval.B, n), center: make([]interval.B, n), weight: make([]interval.F, n)}
	errs := make([]error, half)
	certify.For(half, workers, func(i int) {
		errs[i] = r.verifyNode(i)
	})
	for _, e := range errs {
		if e != nil {
			return nil, e
		}
	}
	if n%2 == 1 {
		z := interval.NewB(0, nodeBits)
		// P_{n-1}(0) at the exact point 0; the recurrence needs no guard bits
		// there (x = 0 makes it a two-term product).
		_, pn1 := legendrePair(interval.NewB(0, nodeBits+64), n)
		w := pn1.Mul(pn1.Int(int64(n))).Sqr()
		r.node[half], r.center[half] = z, z
		r.weight[half] = toF(w.Int(2).Quo(w))
	}
	for i := 0; i+1 < n; i++ {
		if !r.node[i+1].Less(r.node[i]) {
			return nil, fmt.Errorf("strip: Gauss nodes %d and %d of %d are not separated", i, i+1, n)
		}
	}
	if !r.node[n-1].Int(-1).Less(r.node[n-1]) || !r.node[0].Less(r.node[0].Int(1)) {
		return nil, fmt.Errorf("strip: Gauss nodes of %d leave (-1, 1)", n)
	}
	return r, nil
}

// verifyNode proves the i-th positive root (i < n/2) and stores it together
// with its mirror image.
func (r *gaussRule) verifyNode(i int) error {
	n := r.n
	g := floatGaussNode(n, i)
	xa := aimNode(g, n)
	prec := nodeBits + 64 + growthBits(g, n)
	x := interval.NewB(0, prec).Between(xa, xa)
	delta := x.Int(1).Scale(-nodeSepBits)
	lo, hi := x.Sub(delta).Mid(), x.Add(delta).Mid()
	plo, pn1lo := legendrePair(lo, n)
	phi, _ := legendrePair(hi, n)
	if plo.Sign() == 0 || phi.Sign() == 0 || plo.Sign() == phi.Sign() {
		return fmt.Errorf("strip: no verified sign change at Gauss node %d of %d", i, n)
	}
	X := lo.Hull(hi).WithPrec(nodeBits)
	// P_{n-1}(root) in P_{n-1}(lo) +- (n-1)^2 * 2 delta.
	m := int64(n - 1)
	pad := delta.Scale(1).Mul(delta.Int(m * m))
	p := pn1lo.Pad(pad)
	one := X.Int(1)
	w := one.Scale(1).Mul(one.Sub(X.Sqr())).Quo(p.Mul(X.Int(int64(n))).Sqr())
	wf := toF(w)
	c := x.WithPrec(nodeBits).Mid()
	r.node[i], r.center[i], r.weight[i] = X, c, wf
	r.node[n-1-i], r.center[n-1-i], r.weight[n-1-i] = X.Neg(), c.Neg(), wf
	return nil
}

// aimBits is the precision of the (unverified) Newton refinement.
const aimBits = 192

// aimNode refines the float root g of P_n by two Newton steps in plain
// big.Float arithmetic (the forward recurrence is numerically stable for a
// point argument). It only aims: the sign test in verifyNode is the proof.
func aimNode(g float64, n int) *big.Float {
	nf := func() *big.Float { return new(big.Float).SetPrec(aimBits) }
	x := nf().SetFloat64(g)
	for step := 0; step < 2; step++ {
		p0, p1 := nf().SetInt64(1), nf().Set(x)
		t, u := nf(), nf()
		for j := 2; j <= n; j++ {
			// p2 = ((2j-1) x p1 - (j-1) p0)/j
			t.Mul(x, p1)
			t.Mul(t, u.SetInt64(int64(2*j-1)))
			u.SetInt64(int64(j - 1))
			u.Mul(u, p0)
			t.Sub(t, u)
			t.Quo(t, u.SetInt64(int64(j)))
			p0, p1, t = p1, t, p0
		}
		// P_n' = n (x P_n - P_{n-1})/(x^2 - 1); x <- x - P_n/P_n'
		d := nf().Mul(x, p1)
		d.Sub(d, p0)
		d.Mul(d, u.SetInt64(int64(n)))
		x2 := nf().Mul(x, x)
		x2.Sub(x2, nf().SetInt64(1))
		d.Quo(d, x2)
		if d.Sign() == 0 {
			break
		}
		x.Sub(x, nf().Quo(p1, d))
	}
	return x
}

// legendreValues returns V[a][j], enclosures of sqrt(2j+1) P_j(s_a) for the
// exact nodes s_a of the rule and j < N: P_j is evaluated at the center of
// the node interval with guard bits for the recurrence, and the distance to
// the root (below 2^(1-nodeSepBits)) is covered by the Markov bound
// |P_j'| <= j^2. Mirror nodes use P_j(-s) = (-1)^j P_j(s).
func (r *gaussRule) legendreValues(N int, workers int) [][]interval.F {
	n := r.n
	V := make([][]interval.F, n)
	half := (n + 1) / 2
	certify.For(half, workers, func(a int) {
		c := r.center[a]
		prec := nodeBits + 64 + growthBits(c.Lo(), N)
		x := c.WithPrec(prec)
		dist := x.Int(1).Scale(1 - nodeSepBits)
		row := make([]interval.F, N)
		p0, p1 := x.Int(1), x
		for j := 0; j < N; j++ {
			var pj interval.B
			switch j {
			case 0:
				pj = p0
			case 1:
				pj = p1
			default:
				p2 := x.Mul(p1).Mul(x.Int(int64(2*j - 1))).Sub(p0.Mul(x.Int(int64(j - 1)))).Quo(x.Int(int64(j)))
				p0, p1 = p1, p2
				pj = p2
			}
			jj := int64(j)
			// |center - root| < d + 2^-128 |x| < 2d = dist (node widths 2d).
			pj = pj.Pad(dist.Mul(dist.Int(jj * jj)))
			row[j] = toF(pj).Mul(interval.PointF(float64(2*j + 1)).Sqrt())
		}
		V[a] = row
		if b := n - 1 - a; b != a {
			mir := make([]interval.F, N)
			for j := range row {
				if j%2 == 0 {
					mir[j] = row[j]
				} else {
					mir[j] = row[j].Neg()
				}
			}
			V[b] = mir
		}
	})
	return V
}

// toF rounds a B enclosure outward to float64 endpoints.
func toF(b interval.B) interval.F {
	lo, hi := b.Endpoints()
	return interval.F{}.Between(lo, hi)
}

// splitNode writes the exact node x = (s - 1)/2 of [-1, 0] as a float64
// head plus an F enclosure of the remainder, so that differences of nearby
// nodes keep full relative accuracy.
func splitNode(s interval.B) (head float64, tail interval.F) {
	x := s.Sub(s.Int(1)).Scale(-1)
	head = x.Mid().Lo()
	h := new(big.Float).SetFloat64(head)
	rem := x.Sub(x.Between(h, h))
	return head, toF(rem)
}
