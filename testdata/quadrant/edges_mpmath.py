#!/usr/bin/env python3
"""Yardstick and reference for the quadrant edges (NOT part of wedgebound).

Floating-point (non-rigorous) computation with mpmath of the extreme values
of the eigenvalues of the quadrant's 2x2 Mellin symbol
    A(s) = (1 + tanh(pi s))/2,  D = 0,  B(s) = (i/(2 pi)) J(s),
    J(s) = (1/2) [psi(3/4 + i s/2) - psi(1/4 + i s/2)],
    lambda_-/+(s) = A/2 -/+ sqrt(A^2/4 + |J|^2/(4 pi^2)),
by root-finding (secant/Newton in mpmath.findroot) on the derivative
lambda'(s), written in closed form with the trigamma function.

Usage: edges_mpmath.py DIGITS   prints inf and sup to DIGITS digits.
It is the speed yardstick of BENCHMARKS.md and, run at 1100 digits, the
source of testdata/quadrant/edges-1100.txt.
"""
import sys
import mpmath as mp


def main():
    digits = int(sys.argv[1])
    mp.mp.dps = digits + 10
    pi = mp.pi

    def parts(s):
        z1 = mp.mpc(0.75, s / 2)
        z2 = mp.mpc(0.25, s / 2)
        j = (mp.psi(0, z1) - mp.psi(0, z2)) / 2
        jp = 1j / 4 * (mp.psi(1, z1) - mp.psi(1, z2))
        t = mp.tanh(pi * s)
        a = (1 + t) / 2
        ap = pi / 2 / mp.cosh(pi * s) ** 2
        beta = abs(j) ** 2 / (4 * pi ** 2)
        betap = 2 * mp.re(mp.conj(j) * jp) / (4 * pi ** 2)
        r = mp.sqrt(a * a / 4 + beta)
        rp = (a * ap / 2 + betap) / (2 * r)
        return a, r, ap, rp

    def lam(s, sign):
        a, r, _, _ = parts(s)
        return a / 2 + sign * r

    def dlam(s, sign):
        _, _, ap, rp = parts(s)
        return ap / 2 + sign * rp

    out = []
    for sign, guess in ((-1, -0.3), (1, 1.0)):
        # Start from a double-precision root, then polish at full precision.
        with mp.workdps(20):
            s0 = mp.findroot(lambda s: dlam(s, sign), mp.mpf(guess))
        s = mp.findroot(lambda s: dlam(s, sign), s0, tol=mp.mpf(10) ** (-2 * digits))
        out.append((s, lam(s, sign)))
    for name, (s, v) in zip(("inf", "sup"), out):
        print(name, mp.nstr(v, digits), "at s =", mp.nstr(s, digits))


if __name__ == "__main__":
    main()
