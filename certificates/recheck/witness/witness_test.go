package witness

import (
	"math/big"
	"os"
	"os/exec"
	"strings"
	"testing"

	"wedgebound/certificates"
)

const shipped = "../../../testdata/witness-backflow.json"

// small is a witness certificate of a small basis (widths 0.01 .. 10) for the
// tampering tests.
const small = "../../../testdata/witness-small.json"

func load(t *testing.T) *certificates.Certificate {
	t.Helper()
	c, err := certificates.ReadFile(shipped)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

func rat(t *testing.T, s string) *big.Rat {
	t.Helper()
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		t.Fatalf("bad decimal %q", s)
	}
	return r
}

// The shipped certificate passes, and its bound lies where the published
// estimates and the project's other certificates say it must.
func TestShippedWitnessPasses(t *testing.T) {
	c := load(t)
	d, fails, err := Check(c.Witness, 0)
	if err != nil {
		t.Fatal(err)
	}
	if len(fails) > 0 {
		t.Fatalf("shipped witness certificate fails: %v", fails)
	}
	b := rat(t, c.Witness.Bound.String())
	// Floating-point estimates of c_bm: 0.0384517 (A. J. Bracken and
	// G. F. Melloy, J. Phys. A 27 (1994) 2197; M. Penz, G. Gruebl, S. Kreidl,
	// P. Wagner, J. Phys. A 39 (2006) 423) and 0.0384506 (C. J. Fewster and
	// H. J. Kirk-Karakaya, arXiv:2505.13184, 2025). A lower bound above
	// either would contradict them; the shipped one stays below both.
	if b.Cmp(rat(t, "0.0384506")) > 0 {
		t.Errorf("bound %s exceeds the 2025 estimate 0.0384506", c.Witness.Bound)
	}
	// The project's finite-strip lower bound 0.0377800 at alpha = 1e4 (seen
	// here, not a published source): the whole-line witness must beat it.
	if b.Cmp(rat(t, "0.03778")) <= 0 {
		t.Errorf("bound %s does not improve on the strip bound 0.03778", c.Witness.Bound)
	}
	// Cross-check between two routes: the shipped relaxation certificate
	// proves c_bm <= its bound (Mellin-picture upper bound).
	rc, err := certificates.ReadFile("../../../testdata/backflow.json")
	if err != nil {
		t.Fatal(err)
	}
	if b.Cmp(rat(t, rc.Relaxation.Claim.Bound.String())) >= 0 {
		t.Errorf("witness lower bound %s is not below the certified upper bound %s", c.Witness.Bound, rc.Relaxation.Claim.Bound)
	}
	// The recomputed enclosure is narrow (the two routes agree closely).
	lo, hi := rat(t, d.Quotient.Lower), rat(t, d.Quotient.Upper)
	if w, _ := new(big.Rat).Sub(hi, lo).Float64(); w > 1e-8 {
		t.Errorf("recomputed quotient [%s, %s] is wide", d.Quotient.Lower, d.Quotient.Upper)
	}
}

func reseal(t *testing.T, c *certificates.Certificate) *certificates.Certificate {
	t.Helper()
	if err := certificates.Seal(c); err != nil {
		t.Fatal(err)
	}
	b, err := certificates.Encode(c)
	if err != nil {
		t.Fatal(err)
	}
	d, err := certificates.Decode(b)
	if err != nil {
		return nil // rejected by the schema: also a rejection
	}
	return d
}

// Tampered and re-hashed certificates are rejected.
func TestTamperedWitnessRejected(t *testing.T) {
	cases := map[string]func(w *certificates.Witness){
		"coefficient": func(w *certificates.Witness) {
			v, _ := new(big.Rat).SetString(w.Coefficients[7].String())
			v.Mul(v, big.NewRat(101, 100))
			w.Coefficients[7] = certificates.MustDecimal(v.FloatString(30))
		},
		"bound": func(w *certificates.Witness) {
			w.Bound = certificates.MustDecimal("0.0383")
			w.Quotient = certificates.Interval{Lower: certificates.MustDecimal("0.0383"), Upper: certificates.MustDecimal("0.0384")}
		},
		"width": func(w *certificates.Witness) { w.Basis[10].Width = certificates.MustDecimal("0.5") },
		"power": func(w *certificates.Witness) { w.Basis[3].Power++ },
		"chirp": func(w *certificates.Witness) {
			if w.Basis[4].Chirp == "sin" {
				w.Basis[4].Chirp = "cos"
			} else {
				w.Basis[4].Chirp = "sin"
			}
		},
	}
	for name, edit := range cases {
		c, err := certificates.ReadFile(small)
		if err != nil {
			t.Fatal(err)
		}
		edit(c.Witness)
		d := reseal(t, c)
		if d == nil {
			continue
		}
		_, fails, err := Check(d.Witness, 0)
		if err == nil && len(fails) == 0 {
			t.Errorf("tampered %s: accepted", name)
		}
	}
}

// The verifier may use only the standard library, interval, certificates,
// the verifier core and its shared numerics (recheck/checknum).
func TestWitnessTrustedBase(t *testing.T) {
	out, err := exec.Command("go", "list", "-deps", "wedgebound/certificates/recheck/witness").Output()
	if err != nil {
		t.Skipf("go list not available: %v", err)
	}
	for _, dep := range strings.Fields(string(out)) {
		if strings.HasPrefix(dep, "wedgebound") && dep != "wedgebound/interval" && dep != "wedgebound/certificates" &&
			dep != "wedgebound/certificates/recheck" && dep != "wedgebound/certificates/recheck/checknum" &&
			dep != "wedgebound/certificates/recheck/witness" {
			t.Errorf("verifier depends on %s", dep)
		}
		if strings.Contains(strings.SplitN(dep, "/", 2)[0], ".") {
			t.Errorf("verifier depends on %s", dep)
		}
	}
}

func TestMain(m *testing.M) { os.Exit(m.Run()) }
