package regions

import (
	"math"
	"math/cmplx"
	"testing"

	"wedgebound/interval"
)

func TestEdgeProbe(t *testing.T) {
	like := interval.PointF(0)
	for _, c := range []struct {
		c, s float64
		want complex128
	}{{1, 0.5, 0.041394546536902666 - 0.025932143671708232i}, {1, -2, 0.04649355383599089 - 0.07499688624244379i}, {2, -5, 0.055058342478305614 + 0.004614027342470018i}} {
		e := newEdge(like.Float(c.c), c.c, false)
		v, ok := e.value(like.Float(c.s), false)
		t.Logf("E(%v,%v) = %v ok=%v width %.2g / %.2g, want %v", c.c, c.s, midC(v), ok, v.Re.Rad(), v.Im.Rad(), c.want)
		if !ok || cmplx.Abs(midC(v)-c.want) > 1e-6 {
			t.Errorf("mismatch")
		}
	}
	b, err := NewTerm(like, "band", map[string]string{"from": "0", "to": "1"})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range [][2]float64{{0.5, 0.709084201856183}, {-2, -0.00027661744414562755}} {
		m := b.Enclose(like.Float(c[0]))
		t.Logf("D(%v) = [%v, %v] want %v", c[0], m.D.Lo(), m.D.Hi(), c[1])
		if math.Abs(m.D.Lo()-c[1]) > 1e-9 {
			t.Errorf("D mismatch")
		}
	}
}
