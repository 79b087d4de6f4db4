package checknum

import "wedgebound/interval"

// Legendre returns enclosures of P_0(x), ..., P_{n-1}(x) for every x in the
// argument, by the three-term recurrence
// j P_j = (2j - 1) x P_{j-1} - (j - 1) P_{j-2} in interval arithmetic at the
// argument's precision (the wrapping grows with j, so callers choose the
// precision with n in mind).
func Legendre(x interval.B, n int) []interval.B {
	p := make([]interval.B, n)
	for j := range p {
		switch j {
		case 0:
			p[j] = x.Int(1)
		case 1:
			p[j] = x
		default:
			p[j] = x.Mul(p[j-1]).Mul(x.Int(int64(2*j - 1))).Sub(p[j-2].Mul(x.Int(int64(j - 1)))).Quo(x.Int(int64(j)))
		}
	}
	return p
}
