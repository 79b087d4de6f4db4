// Package interval provides rigorous interval arithmetic: every operation
// returns an interval that contains the exact result for every choice of
// arguments inside the operand intervals.
//
// Two real types share one interface: F, with float64 endpoints widened
// outward by one ulp after each operation (fast, about 15 digits), and B,
// with math/big endpoints and directed rounding at any precision from 53
// bits upward. Algorithms are written once, as generic functions over Real,
// and run on either type. C is the complex rectangle built on a real type.
//
// Domain errors never produce a silent wrong number: an operation whose
// result is undefined or unbounded (division by an interval containing
// zero, log of a non-positive interval, overflow) returns the whole real
// line, which IsFinite reports and every certificate check rejects.
//
// This comment is the package's mathematical reference: the rounding model,
// what every enclosure guarantees, and the series and remainder bounds of
// the special functions. The proof of each kernel's remainder bound sits in
// the doc comment of the function named beside it.
//
// # Rounding model
//
// F. IEEE 754 double precision computes +, -, *, / and sqrt correctly
// rounded (IEEE 754-2008, clause 5.4, from memory; common practice), so in
// round-to-nearest the computed value differs from the exact one by at most
// half an ulp. F computes each endpoint in round-to-nearest and moves it one
// ulp outward (math.Nextafter), which encloses the exact endpoint. Exact
// operations (negation, absolute value, scaling by powers of two within the
// normal range) are not widened. F has no guard bits: elementary functions
// on F are evaluated with the same interval operations and explicit series
// remainders, so their enclosures are valid but may be a few ulps wide.
//
// B. Endpoints are big.Float values at the interval's precision p
// (53 <= p <= 65536); the lower endpoint is computed with rounding mode
// ToNegativeInf and the upper with ToPositiveInf. math/big performs Add,
// Sub, Mul and Quo correctly rounded in the requested mode (math/big
// documentation). Its Sqrt is not guaranteed correctly rounded, so the root
// is computed with extra bits, rounded in the wanted direction and checked
// by squaring exactly (B.Sqrt). Conversions to float64 (Lo, Hi) are checked
// against the exact value and moved one step when they land on the wrong
// side.
//
// # What an enclosure guarantees
//
// Every function f of the package, applied to intervals X1, ..., Xk,
// returns an interval (or rectangle) Y with f(x1, ..., xk) in Y for all
// xi in Xi. This inclusion property is preserved by composition, so any
// expression evaluated in interval arithmetic encloses the range of the
// expression over the argument box (R. E. Moore, Interval Analysis, 1966;
// common practice). Enclosures are not tight in general (the dependency
// problem): x - x is not [0, 0]. Where tightness matters the code uses
// the mean-value form
//
//	f(X) in f(c) + f'(X) (X - c),   c in X,
//
// valid on a convex domain because f(x) - f(c) = (x - c) int_0^1 f'(c + t(x - c)) dt
// and the integral lies in the convex hull of f'(X). For complex rectangles
// the same holds with the rectangle enclosing f'(X) (LogGamma, Digamma,
// Trigamma use it for wide rectangles).
//
// A result that cannot be bounded is Whole (for C: a Whole part). Whole
// propagates through every later operation, and certificate code treats a
// non-finite enclosure as "not proved".
//
// # Elementary functions
//
// Each elementary function is evaluated at the two endpoints of the
// argument as point intervals, with every rounding enclosed and the
// truncation error of its series added explicitly; a monotone function then
// takes the hull, and a non-monotone one also includes the extreme values
// at critical points inside the argument (elem.go).
//
//   - Exp: x = k ln2 + r, |r| <= ln2/2, exp(r) = exp(r/2^s)^(2^s); the Taylor
//     tail after the first omitted term T_n is at most 2|T_n| because the
//     term ratio is below 1/2.
//   - Log, Log1p: v = m 2^e, m in [1/sqrt2, sqrt2); log1p(x) halved s times by
//     x -> x/(1 + sqrt(1 + x)), then log1p(x) = 2 atanh(x/(2 + x)) by its
//     odd series, tail at most |T_n|/(1 - t^2) <= 2|T_n|.
//   - Sin, Cos, Tan: reduction by an enclosure of pi/2, s halvings, Taylor
//     series with tail at most 2|T_n| (term ratios below 1/2), double-angle
//     steps in interval arithmetic (sinCosKernel).
//   - Atan, Atan2: atan v = sign(v) pi/2 - atan(1/v) for |v| > 1, halvings
//     x -> x/(1 + sqrt(1 + x^2)), alternating series with tail
//     at most |T_n|/(1 - x^2) <= 2|T_n|.
//   - Sinh, Cosh, Tanh, Sech from Exp, arranged to avoid overflow and
//     cancellation; Pow(x, y) = exp(y log x).
//
// Constants are computed in exact integer fixed point with every truncation
// counted: pi = 16 atan(1/5) - 4 atan(1/239) (Machin's formula; common
// practice) and ln2 = 2 atanh(1/3), each by its alternating or positive
// series with the tail bounded by the first omitted term; Catalan's constant
// from psi'(1/4) = pi^2 + 8G (OEIS A006752) and Euler's gamma from
// psi(1) = -gamma (DLMF 5.4.12).
//
// Complex rectangles: +, -, * by the real formulas; 1/z = conj z/|z|^2
// (Whole parts when the rectangle contains 0); |z| tight up to rounding;
// Arg and Log are Whole across the branch cut (-inf, 0]; Exp as
// e^a (cos b + i sin b).
//
// # Log-gamma, digamma and trigamma
//
// For Re z > 0 (gamma.go, gamma_series.go), with the periodic Bernoulli
// function P(t) = B_{2n}(t - floor t),
//
//	ln Gamma(z) = (z - 1/2) ln z - z + ln(2 pi)/2
//	              + sum_{k=1}^{n-1} B_{2k}/(2k (2k-1) z^{2k-1}) + R_n(z),
//	R_n(z) = int_0^inf (B_{2n} - P(t)) / (2n (z + t)^{2n}) dt
//
// (F. W. J. Olver, Asymptotics and Special Functions, 1974, ch. 8 section 4;
// DLMF 5.11(ii)). Differentiating j times under the integral gives the
// series of psi (j = 1), psi' (j = 2) and psi^(2) (j = 3): terms
// a_k z^{-(2k+j-1)} with a_k = (-1)^j B_{2k} (2k+j-2)!/(2k)!.
//
// Remainder bound (derived in gamma_series.go):
//
//	|R_n^{(j)}(z)| <= |a_n| |z| v^{n + j/2},   v = 2/((|z| + Re z) |z|),
//
// from (i) |B_{2n}(x)| <= |B_{2n}| on [0, 1] (DLMF 24.9.1), so B_{2n} - P(t)
// keeps the sign of B_{2n}; (ii) |z + t| >= (|z| + t) cos(theta/2) for
// theta = |arg z| (the difference of squares is (1 - cos theta)(|z| - t)^2/2)
// and sec^2(theta/2) = 2|z|/(|z| + Re z); (iii) on the positive axis
// R_n = term_n + R_{n+1} with R_n and R_{n+1} of opposite signs, so
// |R_n| <= |term_n|. The bound decreases in |z| and in Re z, so over a
// rectangle it is taken at the lower bounds of both.
//
// Small or negative arguments are first shifted by the recurrences
// (DLMF 5.5.2 and its derivatives)
//
//	psi(z) = psi(z + s) - sum_{k<s} 1/(z + k),
//	psi'(z) = psi'(z + s) + sum_{k<s} 1/(z + k)^2,
//
// with s and n chosen per call by float planning only; the remainder added
// is always the rigorous one. Bernoulli numbers are exact rationals from the
// tangent numbers (R. P. Brent and D. Harvey, 2011).
package interval
