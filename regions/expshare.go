package regions

import (
	"math"
	"math/cmplx"
	"sync"

	"wedgebound/interval"
)

// Shared path nodes for many exponential profiles.
//
// The quadrature of I_k(s) (see expTerm) lays out its path per regime of s
// and grades the first panels down to the pole scale 2 theta/sqrt 2 of
// its own k; nothing else in the layout depends on k. Laid out once with
// the smallest pole scale of a family, the path serves every term of the
// family: the nodes t_j are the same for all and only the weights h_j(k)
// differ. Then the factors e^{-i s t_j}, the expensive part of a cell's
// enclosure, are enclosed once per cell for the whole family, and for a
// weighted sum of terms the weights combine before any s enters:
//
//	sum_i w_i B_i(s) = conj( sum_j H_j e^{-i s t_j} ) + pad,
//	H_j = sum_i w_i h_ij / (pi (k_i - 2i)),
//	pad = sum_i |w_i| err_i / (pi |k_i + 2i|),
//
// (B_i = conj(I_i)/(pi (k_i + 2i)) and w_i real), with err_i the
// remainder bound of term i on the shared layout. The slope uses the same
// exponentials with H_j (-i t_j) and the remainder bounds of I'. A cell
// then costs about as much as one term does alone, whatever the number of
// terms, and the enclosure of the sum is no wider than the sum of the
// terms' enclosures (the rounding of sum_i w_i h_ij is paid once per node,
// not once per node and term). The same layout serves the float model of
// the candidate search (Group.Approx).

// expGroup holds exponential terms that share their path layouts.
type expGroup[T interval.Real[T]] struct {
	terms []*expTerm[T]
	d     float64 // the smallest pole scale of the members

	mu      sync.Mutex
	regimes map[int]*groupRegime[T]
}

// groupRegime is one regime of a group, built once.
type groupRegime[T interval.Real[T]] struct {
	once sync.Once
	regs []*expRegime[T] // per member, all on the same nodes
	err  error
}

func newExpGroup[T interval.Real[T]](terms []*expTerm[T]) *expGroup[T] {
	g := &expGroup[T]{terms: terms, d: math.Inf(1), regimes: map[int]*groupRegime[T]{}}
	for _, e := range terms {
		g.d = math.Min(g.d, e.poleScale())
	}
	return g
}

// regime returns the members' quadratures of regime idx on the shared
// layout, building them on first use. Each member also keeps its own copy
// (so that its Enclose, Approx and Budget use the same nodes).
func (g *expGroup[T]) regime(idx int) ([]*expRegime[T], error) {
	g.mu.Lock()
	r, ok := g.regimes[idx]
	if !ok {
		r = &groupRegime[T]{}
		g.regimes[idx] = r
	}
	g.mu.Unlock()
	r.once.Do(func() {
		// Members that already hold this regime on a layout of the same
		// grading (built by another group of the same terms) share it.
		have := make([]*expRegime[T], len(g.terms))
		for i, e := range g.terms {
			e.mu.Lock()
			if reg, ok := e.regimes[idx]; ok && reg.d == g.d {
				have[i] = reg
			}
			e.mu.Unlock()
		}
		if all(have) {
			r.regs = have
			return
		}
		lay, err := newExpLayout(g.terms[0].k, idx, g.d)
		if err != nil {
			r.err = err
			return
		}
		r.regs, r.err = regimesOn(lay, g.terms)
		if r.err != nil {
			return
		}
		for i, e := range g.terms {
			e.mu.Lock()
			e.regimes[idx] = r.regs[i]
			e.mu.Unlock()
		}
	})
	return r.regs, r.err
}

// Group evaluates a list of relaxation terms together: its exponential
// terms on shared path nodes (see the notes above), any other term on its
// own.
type Group[T interval.Real[T]] struct {
	terms []Term[T]
	exp   *expGroup[T]
	expAt []int // the index in terms of each member of exp
}

// NewGroup groups the terms. The terms themselves are used (not copied):
// their exponential members from now on take the group's layouts.
func NewGroup[T interval.Real[T]](terms []Term[T]) *Group[T] {
	g := &Group[T]{terms: terms}
	var members []*expTerm[T]
	for i, t := range terms {
		if e, ok := t.(*expTerm[T]); ok {
			members = append(members, e)
			g.expAt = append(g.expAt, i)
		}
	}
	if len(members) > 0 {
		g.exp = newExpGroup(members)
	}
	return g
}

// Approx stores float64 values of D(s) and B(s) of every term in d and b
// (not certified; for the candidate search). Exponential terms share the
// factors e^{-i s t_j}.
func (g *Group[T]) Approx(s float64, d []float64, b []complex128) {
	shared := map[int]bool{}
	if g.exp != nil {
		if regs, err := g.exp.regime(regimeIndex(s)); err == nil {
			ft := regs[0].ft
			sums := make([]complex128, len(regs))
			for j, t := range ft {
				ex := cmplx.Exp(complex(0, -s) * t)
				for i, r := range regs {
					sums[i] += r.fh[j] * ex
				}
			}
			as := math.Abs(s)
			for i, e := range g.exp.terms {
				theta := math.Atan(2 / e.k.Lo())
				kf := (e.k.Lo() + e.k.Hi()) / 2
				mod := math.Hypot(kf, 2)
				at := g.expAt[i]
				d[at] = 2 * math.Exp(2*theta*s-math.Pi*as) / (mod * (1 + math.Exp(-2*math.Pi*as)))
				b[at] = cmplx.Conj(sums[i]) / (complex(math.Pi, 0) * complex(kf, 2))
				shared[at] = true
			}
		}
	}
	for i, t := range g.terms {
		if !shared[i] {
			d[i], b[i] = t.Approx(s)
		}
	}
}

// expSum is the weighted sum of a group's exponential terms.
type expSum[T interval.Real[T]] struct {
	g *expGroup[T]
	w []T

	mu      sync.Mutex
	regimes map[int]*sumRegime[T]
}

// sumRegime holds the combined node weights of one regime.
type sumRegime[T interval.Real[T]] struct {
	once      sync.Once
	t         []interval.C[T]
	hb, hd    []interval.C[T] // H_j and H_j (-i t_j)
	pad, padD T
	err       error
}

func (m *expSum[T]) regime(idx int) (*sumRegime[T], error) {
	m.mu.Lock()
	r, ok := m.regimes[idx]
	if !ok {
		r = &sumRegime[T]{}
		m.regimes[idx] = r
	}
	m.mu.Unlock()
	r.once.Do(func() {
		regs, err := m.g.regime(idx)
		if err != nil {
			r.err = err
			return
		}
		like := m.w[0]
		r.t = regs[0].t
		r.hb = make([]interval.C[T], len(r.t))
		r.hd = make([]interval.C[T], len(r.t))
		zero := interval.RealC(like.Int(0))
		for j := range r.hb {
			r.hb[j] = zero
		}
		r.pad, r.padD = like.Int(0), like.Int(0)
		pi := like.Pi()
		for i, e := range m.g.terms {
			// w_i / (pi (k_i - 2i)) and |w_i| / (pi |k_i + 2i|).
			c := interval.RealC(m.w[i]).Quo(e.kp.Conj().MulReal(pi))
			aw := m.w[i].Abs().Quo(e.mod.Mul(pi))
			for j := range r.hb {
				r.hb[j] = r.hb[j].Add(regs[i].h[j].Mul(c))
			}
			r.pad = r.pad.Add(aw.Mul(regs[i].err))
			r.padD = r.padD.Add(aw.Mul(regs[i].errD))
		}
		for j, t := range r.t {
			r.hd[j] = r.hb[j].Mul(interval.C[T]{Re: t.Im, Im: t.Re.Neg()})
		}
		r.pad, r.padD = interval.Upper(r.pad), interval.Upper(r.padD)
	})
	return r, r.err
}

// inRegime encloses sum_i w_i B_i and, if slope, sum_i w_i B_i' for every s
// in the interval s, which lies in regime idx.
func (m *expSum[T]) inRegime(s T, idx int, slope bool) (b, bp interval.C[T], err error) {
	r, err := m.regime(idx)
	if err != nil {
		return b, bp, err
	}
	sb := interval.RealC(s.Int(0))
	sd := sb
	for j, t := range r.t {
		// e^{-i s t} = e^{s Im t} (cos(s Re t) - i sin(s Re t))
		mag := interval.Exp(s.Mul(t.Im))
		sn, cs := interval.SinCos(s.Mul(t.Re))
		f := interval.C[T]{Re: cs.Mul(mag), Im: sn.Mul(mag).Neg()}
		sb = sb.Add(r.hb[j].Mul(f))
		if slope {
			sd = sd.Add(r.hd[j].Mul(f))
		}
	}
	b = interval.C[T]{Re: sb.Re.Pad(r.pad), Im: sb.Im.Pad(r.pad).Neg()}
	if slope {
		bp = interval.C[T]{Re: sd.Re.Pad(r.padD), Im: sd.Im.Pad(r.padD).Neg()}
	}
	return b, bp, nil
}

// enclose returns the weighted sum of the members' symbols (A = 0) and, if
// slope, of their slopes, for every s in s. Where the quadrature fails the
// B entries are Whole.
func (m *expSum[T]) enclose(s T, slope bool) (Symbol[T], Symbol[T]) {
	zero := s.Int(0)
	val := Symbol[T]{A: zero, D: zero}
	der := Symbol[T]{A: zero, D: zero}
	var tanh T
	if slope {
		tanh = interval.Tanh(s.Pi().Mul(s))
	}
	for i, e := range m.g.terms {
		d := e.diagonal(s)
		val.D = val.D.Add(d.Mul(m.w[i]))
		if slope {
			dp := d.Mul(e.theta.Scale(1).Sub(s.Pi().Mul(tanh)))
			der.D = der.D.Add(dp.Mul(m.w[i]))
		}
	}
	first := true
	for idx := regimeIndex(s.Lo()); idx <= regimeIndex(s.Hi()); idx++ {
		rlo, rhi := regimeRange(idx)
		part := intersectReal(s, s.Float(rlo).Hull(s.Float(rhi)))
		b, bp, err := m.inRegime(part, idx, slope)
		if err != nil {
			w := s.Whole()
			whole := interval.C[T]{Re: w, Im: w}
			val.B, der.B = whole, whole
			return val, der
		}
		if first {
			val.B, der.B, first = b, bp, false
		} else {
			val.B = val.B.Hull(b)
			if slope {
				der.B = der.B.Hull(bp)
			}
		}
	}
	return val, der
}

// all reports whether every regime is present and all lie on the same
// nodes.
func all[T interval.Real[T]](regs []*expRegime[T]) bool {
	for _, r := range regs {
		if r == nil || len(r.t) != len(regs[0].t) {
			return false
		}
	}
	return true
}
