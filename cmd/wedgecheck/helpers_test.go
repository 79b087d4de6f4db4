package main

import (
	"bytes"
	"os"
	"path/filepath"
	"sync"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck/relaxation/reltest"
)

// backflowProblem is the backflow geometry: states with positive momentum
// (half-plane p > 0) and the wedge {p > 0, -p < x < 0} (regions package doc).
func backflowProblem(edge string) certificates.Problem {
	return certificates.Problem{
		Vertex:    [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("0")},
		Rays:      [2][2]certificates.Fraction{{certificates.MustFraction("0"), certificates.MustFraction("1")}, {certificates.MustFraction("-1"), certificates.MustFraction("1")}},
		Halfplane: certificates.Halfplane{Normal: [2]certificates.Fraction{certificates.MustFraction("0"), certificates.MustFraction("1")}, Offset: certificates.MustFraction("0")},
		Edge:      edge,
	}
}

func expTerm(k, w string) certificates.Term {
	return certificates.Term{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal(k)}, Weight: certificates.MustDecimal(w)}
}

type built struct {
	once sync.Once
	c    *certificates.Certificate
	err  error
}

var cache sync.Map

// certFor builds (once per test binary) a certificate with the verifier's
// own reference builder.
func certFor(t testing.TB, name string, o reltest.BuildOptions) *certificates.Certificate {
	t.Helper()
	v, _ := cache.LoadOrStore(name, &built{})
	b := v.(*built)
	b.once.Do(func() { b.c, b.err = reltest.BuildCertificate(o) })
	if b.err != nil {
		t.Fatalf("building %s: %v", name, b.err)
	}
	return clone(t, b.c)
}

// clone deep-copies a certificate through its JSON form.
func clone(t testing.TB, c *certificates.Certificate) *certificates.Certificate {
	t.Helper()
	b, err := certificates.Encode(c)
	if err != nil {
		t.Fatal(err)
	}
	d, err := certificates.Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// quadrantLower is the bare quadrant claiming 0.1560 for the lower edge:
// inf spec = -0.155940 (R. F. Werner, J. Phys. A 21 (1988) 4565, from
// memory; -0.15593984319124276 with mpmath in the regions package doc).
func quadrantLower(t testing.TB) *certificates.Certificate {
	return certFor(t, "quadrant-lower", reltest.BuildOptions{Problem: backflowProblem("lower"), Bound: "0.1560", Lo: "-8", Hi: "8"})
}

// quadrantUpper claims 1.0077 for the upper edge: sup spec = 1.007680
// (same sources; 1.00767997007003414 in the regions package doc).
func quadrantUpper(t testing.TB) *certificates.Certificate {
	return certFor(t, "quadrant-upper", reltest.BuildOptions{Problem: backflowProblem("upper"), Bound: "1.0077", Lo: "-8", Hi: "8"})
}

// expLower is the backflow relaxation with one exp term (k = 150, weight
// 8.46), for which floating-point scans give min lambda_min about
// -0.05265; it claims 0.06.
func expLower(t testing.TB) *certificates.Certificate {
	return certFor(t, "exp-lower", reltest.BuildOptions{Problem: backflowProblem("lower"), Terms: []certificates.Term{expTerm("150", "8.46")}, Bound: "0.06", Lo: "-40", Hi: "16"})
}

// writeCert seals nothing: it writes c as it is.
func writeCert(t testing.TB, dir, name string, c *certificates.Certificate) string {
	t.Helper()
	b, err := certificates.Encode(c)
	if err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(dir, name)
	if err := os.WriteFile(p, b, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func writeRaw(t testing.TB, dir, name string, data []byte) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := os.WriteFile(p, data, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// runCheck runs the command and returns its exit status and output.
func runCheck(t testing.TB, args ...string) (int, string) {
	t.Helper()
	var out, errb bytes.Buffer
	code := run(args, &out, &errb)
	return code, out.String() + errb.String()
}
