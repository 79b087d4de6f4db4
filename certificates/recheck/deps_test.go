package recheck

import (
	"os/exec"
	"strings"
	"testing"
)

// The verifier's trusted base: besides the standard library it may depend
// only on the interval library and the certificate schema, never on the
// certifier's packages.
func TestTrustedBase(t *testing.T) {
	for _, pkg := range []string{"wedgebound/certificates/recheck", "wedgebound/cmd/wedgecheck"} {
		out, err := exec.Command("go", "list", "-deps", pkg).Output()
		if err != nil {
			t.Skipf("go list not available: %v", err)
		}
		allowed := map[string]bool{
			"wedgebound/interval":             true,
			"wedgebound/certificates":         true,
			"wedgebound/certificates/recheck": true,
			"wedgebound/cmd/wedgecheck":       true,
			"github.com/spf13/pflag":          pkg == "wedgebound/cmd/wedgecheck",
		}
		for _, dep := range strings.Fields(string(out)) {
			if !strings.Contains(strings.SplitN(dep, "/", 2)[0], ".") && !strings.HasPrefix(dep, "wedgebound") {
				continue // standard library
			}
			if !allowed[dep] {
				t.Errorf("%s depends on %s, outside the verifier's trusted base", pkg, dep)
			}
		}
	}
}
