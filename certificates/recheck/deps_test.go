package recheck_test

import (
	"os/exec"
	"strings"
	"testing"
)

// The verifier's trusted base, per kind: besides the standard library a
// kind's package may depend only on the interval library, the certificate
// schema, the core (recheck), the shared numerics (recheck/checknum) and
// itself, never on the certifier's packages nor on another kind. The
// command adds the flag parser. The test logs each base (go test -v).
func TestTrustedBase(t *testing.T) {
	base := []string{"wedgebound/interval", "wedgebound/certificates", "wedgebound/certificates/recheck", "wedgebound/certificates/recheck/checknum"}
	kinds, err := exec.Command("go", "list", "wedgebound/certificates/recheck/...").Output()
	if err != nil {
		t.Skipf("go list not available: %v", err)
	}
	pkgs := []string{"wedgebound/cmd/wedgecheck"}
	for _, p := range strings.Fields(string(kinds)) {
		if p != "wedgebound/certificates/recheck/checknum" && !strings.HasSuffix(p, "test") { // test support is not in the base
			pkgs = append(pkgs, p)
		}
	}
	for _, pkg := range pkgs {
		out, err := exec.Command("go", "list", "-deps", pkg).Output()
		if err != nil {
			t.Fatalf("go list -deps %s: %v", pkg, err)
		}
		allowed := map[string]bool{pkg: true, "github.com/spf13/pflag": pkg == "wedgebound/cmd/wedgecheck"}
		for _, b := range base {
			allowed[b] = true
		}
		if pkg == "wedgebound/cmd/wedgecheck" {
			for _, p := range pkgs {
				allowed[p] = true
			}
		}
		var ours []string
		for _, dep := range strings.Fields(string(out)) {
			if !strings.Contains(strings.SplitN(dep, "/", 2)[0], ".") && !strings.HasPrefix(dep, "wedgebound") {
				continue // standard library
			}
			ours = append(ours, dep)
			if !allowed[dep] {
				t.Errorf("%s depends on %s, outside the verifier's trusted base", pkg, dep)
			}
		}
		t.Logf("trusted base of %s: standard library, %s", pkg, strings.Join(ours, ", "))
	}
}
