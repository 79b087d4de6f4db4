package main

import (
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
)

// FuzzDecode feeds arbitrary bytes to the certificate reader and to the
// verifier's handling of what it returns; nothing may panic. Run it with
// go test ./cmd/wedgecheck -run '^$' -fuzz FuzzDecode -fuzztime 30s.
func FuzzDecode(f *testing.F) {
	good, err := certificates.Encode(quadrantUpper(f))
	if err != nil {
		f.Fatal(err)
	}
	f.Add(good)
	f.Add(good[:len(good)/3])
	f.Add([]byte(`{}`))
	f.Add([]byte(`{"schema":"wedgebound/certificate/v1","kind":"halfplane-relaxation"}`))
	f.Add([]byte(`{"schema":"wedgebound/certificate/v1","kind":"strip-bracket","tool":{"name":"x","version":"1"},"strip":{"alpha":"1/0"},"sha256":""}`))
	f.Add([]byte(`[1e999, "NaN", null]`))
	f.Fuzz(func(t *testing.T, data []byte) {
		c, err := certificates.Decode(data)
		if err != nil {
			staleDespiteInvalid(data)
			if c != nil {
				certificates.Hash(c)
			}
			return
		}
		// A document that decodes with a valid hash: verification must not
		// panic either (bounded work: few cells, shallow bisection).
		if c.Relaxation != nil && len(c.Relaxation.Cover) <= 200 {
			recheck.Verify(c, recheck.Options{MaxDepth: 2, NoTailExtension: true, NoHighPrecision: true})
		}
	})
}
