package main

import (
	"strings"
	"testing"

	"wedgebound/certificates"
)

// Extreme but well-formed inputs end in a clear FAIL (or PASS), never in a
// crash or a silent PASS of something unproved.
func TestExtremeInputs(t *testing.T) {
	dir := t.TempDir()
	for _, tc := range []struct {
		name string
		edit func(r *certificates.Relaxation)
		code int
		want string
	}{
		{"cell beyond |s| = 2^30", func(r *certificates.Relaxation) {
			r.Cover[len(r.Cover)-1].Hi = certificates.MustDecimal("5000000000")
			r.Above.From = certificates.MustDecimal("5000000000")
		}, exitFail, "beyond |s| = 2^30"},
		{"huge weight", func(r *certificates.Relaxation) {
			r.Terms[0].Weight = certificates.MustDecimal("1000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000")
		}, exitFail, "cover["},
		{"smallest k", func(r *certificates.Relaxation) { r.Terms[0].Params["k"] = certificates.MustDecimal("0.000001") }, exitFail, ""},
		{"largest k", func(r *certificates.Relaxation) { r.Terms[0].Params["k"] = certificates.MustDecimal("1000000") }, exitFail, ""},
		{"k out of range", func(r *certificates.Relaxation) { r.Terms[0].Params["k"] = certificates.MustDecimal("10000000") }, exitFail, "outside the supported range"},
		{"bound huge", func(r *certificates.Relaxation) {
			r.Claim.Bound = certificates.MustDecimal("1000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000")
		}, exitPass, ""},
		{"tiny first cell", func(r *certificates.Relaxation) {
			c0 := r.Cover[0]
			r.Cover[0].Hi = certificates.MustDecimal("-39.99999999999999999999999999999")
			r.Cover = append([]certificates.Cell{r.Cover[0]}, append([]certificates.Cell{{Lo: r.Cover[0].Hi, Hi: c0.Hi, EigLower: c0.EigLower, EigUpper: c0.EigUpper}}, r.Cover[1:]...)...)
		}, exitPass, ""},
	} {
		c := expLower(t)
		tc.edit(c.Relaxation)
		certificates.Seal(c)
		code, out := checkAll(t, writeCert(t, dir, "x.json", c))
		if code != tc.code || !strings.Contains(out, tc.want) {
			t.Errorf("%s: exit %d (want %d), report lacks %q:\n%s", tc.name, code, tc.code, tc.want, out)
		}
	}
}
