package main

import (
	"bytes"
	"strings"
	"testing"
	"time"

	"wedgebound/certificates"
	"wedgebound/certify"
	"wedgebound/certify/relaxation"
	"wedgebound/regions"
)

// Issue 17 item 11: the certify progress counts what is really done. A run
// with given weights (no search) reports cover events whose last cell count
// is the certificate's number of cells (not the initial pieces), and the
// display shows cells proved, the rate and the time left.
func TestCertifyProgressCountsCells(t *testing.T) {
	var last certify.CoverStatus
	stages := map[string]bool{}
	res, err := relaxation.Run(relaxation.Config{Problem: regions.Presets["backflow"], Terms: []certificates.Term{{Kind: "exp", Params: map[string]certificates.Decimal{"k": certificates.MustDecimal("150")}, Weight: certificates.MustDecimal("8.46")}},
		Work: func(w relaxation.Work) {
			stages[w.Stage] = true
			if w.Cover != nil {
				last = *w.Cover
			}
		}})
	if err != nil {
		t.Fatal(err)
	}
	n := len(res.Certificate.Relaxation.Cover)
	if last.Cells != n || last.PiecesDone != last.Pieces || last.Evaluations < n || last.Budget <= last.Evaluations {
		t.Errorf("last status %+v, certificate has %d cells", last, n)
	}
	for _, s := range []string{"tail range", "quadrature set-up", "cover"} {
		if !stages[s] {
			t.Errorf("no %q event", s)
		}
	}

	var buf bytes.Buffer
	p := &progress{w: &buf, on: true, start: time.Now().Add(-10 * time.Second), stage: "cover", stageStart: time.Now().Add(-4 * time.Second)}
	p.cover("cover", certify.CoverStatus{Pieces: 100, PiecesDone: 25, Cells: 300, Evaluations: 400, Budget: 10000})
	out := buf.String()
	for _, want := range []string{"pieces 25/100", "300 cells proved", "400 enclosures", "/s", "about 12s left"} {
		if !strings.Contains(out, want) {
			t.Errorf("display %q lacks %q", out, want)
		}
	}
}
