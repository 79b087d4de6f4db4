#!/usr/bin/env python3
"""Reference for the edges of one relaxation with an exponential profile
(NOT part of wedgebound; floating-point, not rigorous).

The symbol is the quadrant plus w e^{-k xp} on quadrant III (k = 150,
w = 8.46 by default: testdata/terms/exp150.json). Its 2x2 Mellin symbol
M(s) = [[A, B], [conj B, D]] has

    A(s) = (1 + tanh(pi s))/2,
    B(s) = (i/(2 pi)) J(s) + w conj(P(s)),
    J(s) = (1/2) [psi(3/4 + i s/2) - psi(1/4 + i s/2)],
    D(s) = w e^{2 theta s} / (|k + 2i| cosh(pi s)),  theta = atan(2/k),

where P(s) is the (+,-) Mellin entry of the quadrant-I profile, computed
here by quadrature straight from its definition (not from the r-integral
and contour paths wedgebound uses):

    P(s) = (1/pi) int_1^inf G(2 tau) (tau - 1)^{-1/2+is} (tau + 1)^{-1/2-is} dtau,
    G(w) = 1/(k - i w)   (the Fourier transform of e^{-k u} on u > 0),

with tau = 1 + u^2 to remove the square-root end point. P'(s) carries the
extra factor i log((tau - 1)/(tau + 1)). D's closed form is checked once
against its defining integral (1/pi) int_R G(2 tanh v) e^{-2isv} sech v dv.

The edges are inf_s lambda_min(M(s)) and sup_s lambda_max(M(s)): a scan on
[-24, 24] (step 1/8) at low precision, then findroot on lambda'(s) (closed
form in A', D', B') from every local extremum of the scan within 1e-4 of the
best, at DIGITS + 15 digits.

Usage: edges_mpmath.py DIGITS [K W]   prints both edges and where they are
attained. Run with 40 it is the source of testdata/terms/exp150-edges.txt.
"""
import sys
import mpmath as mp


def main():
    digits = int(sys.argv[1])
    # k and w stay decimal strings, converted at the working precision of
    # each call (an mpf made at 15 digits would carry 8.46 to 53 bits only).
    kstr = sys.argv[2] if len(sys.argv) > 2 else "150"
    wstr = sys.argv[3] if len(sys.argv) > 3 else "8.46"

    def symbol(s, deriv):
        pi = mp.pi
        k, w = mp.mpf(kstr), mp.mpf(wstr)
        theta = mp.atan(2 / k)
        t = mp.tanh(pi * s)
        a = (1 + t) / 2
        z1 = mp.mpc(0.75, s / 2)
        z2 = mp.mpc(0.25, s / 2)
        j = (mp.psi(0, z1) - mp.psi(0, z2)) / 2
        d = w * mp.exp(2 * theta * s) / (abs(mp.mpc(k, 2)) * mp.cosh(pi * s))

        def f(u, n):
            tau = 1 + u * u
            ratio = u * u / (tau + 1)  # (tau - 1)/(tau + 1)
            v = 2 * mp.power(ratio, 1j * s) / (mp.sqrt(tau + 1) * (k - 2j * tau))
            if n:
                v *= 1j * mp.log(ratio)
            return v

        pts = [0, mp.mpf(1) / 4, 1, 3, 10, 40, mp.inf]
        p = mp.quad(lambda u: f(u, 0), pts) / pi
        b = 1j / (2 * pi) * j + w * mp.conj(p)
        if not deriv:
            return a, d, b, None, None, None
        ap = pi / 2 / mp.cosh(pi * s) ** 2
        dp = d * (2 * theta - pi * t)
        jp = 1j / 4 * (mp.psi(1, z1) - mp.psi(1, z2))
        pp = mp.quad(lambda u: f(u, 1), pts) / pi
        bp = 1j / (2 * pi) * jp + w * mp.conj(pp)
        return a, d, b, ap, dp, bp

    def lam(s, sign):
        a, d, b, _, _, _ = symbol(s, False)
        return (a + d) / 2 + sign * mp.sqrt(((a - d) / 2) ** 2 + abs(b) ** 2)

    def dlam(s, sign):
        a, d, b, ap, dp, bp = symbol(s, True)
        r = mp.sqrt(((a - d) / 2) ** 2 + abs(b) ** 2)
        num = (a - d) / 2 * (ap - dp) / 2 + mp.re(mp.conj(b) * bp)
        return (ap + dp) / 2 + sign * num / r

    # Check of D's closed form against its defining integral at one s.
    mp.mp.dps = 30
    k = mp.mpf(kstr)
    s0 = mp.mpf("-0.3")
    dq = mp.quad(lambda v: mp.exp(-2j * s0 * v) / (mp.cosh(v) * (k - 2j * mp.tanh(v))), [-mp.inf, -1, 0, 1, mp.inf]) / mp.pi
    dc = mp.exp(2 * mp.atan(2 / k) * s0) / (abs(mp.mpc(k, 2)) * mp.cosh(mp.pi * s0))
    print("D closed form check at s = -0.3: |quadrature - closed| =", mp.nstr(abs(dq - dc), 3))

    mp.mp.dps = 15
    grid = [mp.mpf(i) / 8 for i in range(-192, 193)]
    for sign, name in ((-1, "inf"), (1, "sup")):
        mp.mp.dps = 15
        vals = [sign * lam(s, sign) for s in grid]  # maximise sign * lambda
        best = max(vals)
        cands = [i for i in range(1, len(grid) - 1)
                 if vals[i] >= vals[i - 1] and vals[i] >= vals[i + 1] and vals[i] >= best - mp.mpf("1e-4")]
        results = []
        for i in cands:
            mp.mp.dps = 20
            s = mp.findroot(lambda x: dlam(x, sign), (grid[i - 1], grid[i + 1]), solver="anderson")
            mp.mp.dps = digits + 15
            s = mp.findroot(lambda x: dlam(x, sign), mp.mpf(s), tol=mp.mpf(10) ** (-(digits + 10)))
            results.append((lam(s, sign), s))
            print("  local", name, "candidate", mp.nstr(results[-1][0], digits), "at s =", mp.nstr(s, digits // 2 + 2))
        v, s = max(results, key=lambda r: sign * r[0])
        print(name, mp.nstr(v, digits), "at s =", mp.nstr(s, digits // 2 + 2))


if __name__ == "__main__":
    main()
