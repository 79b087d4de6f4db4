package main

import (
	"bytes"
	"encoding/json"
	"path/filepath"
	"testing"

	"wedgebound/certificates"
)

func flightCmd(args []string, out, errb *bytes.Buffer) int { return runFlight(args, out, errb) }

// Two scaled stages (alpha_k = m_k/t_k = 100 and 100/3) give
// alpha = 1/(0.01 + 0.03) = 25, the kick 2 after the first stage moves the
// particle by 2 * 0.03 = 0.06; the bracket equals strip --alpha 25.
func TestFlightJSON(t *testing.T) {
	code, out, errs := runCmd(flightCmd, "--stage", "mass=1,duration=0.01,kick=2", "--stage", "mass=2,duration=0.06", "--width", "1e-6", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var r struct {
		Reduction struct{ Alpha, Shift, ShiftedTarget string } `json:"reduction"`
		Advantage struct{ Lower, Upper string }
	}
	if err := json.Unmarshal([]byte(out), &r); err != nil {
		t.Fatal(err)
	}
	if r.Reduction.Alpha != "25" || r.Reduction.Shift != "0.06" {
		t.Errorf("reduction %+v", r.Reduction)
	}
	code, out2, _ := runCmd(stripCmd, "--alpha", "25", "--width", "1e-6", "--json")
	var s struct{ Advantage struct{ Lower, Upper string } }
	if code != 0 || json.Unmarshal([]byte(out2), &s) != nil || s.Advantage != r.Advantage {
		t.Errorf("strip --alpha 25 gives %+v, flight %+v", s.Advantage, r.Advantage)
	}
}

func TestFlightBadInput(t *testing.T) {
	for _, args := range [][]string{
		{},
		{"--stage", "mass=1"},
		{"--stage", "mass=1u,duration=1ms"},
		{"--stage", "mass=1,duration=1", "--stages", "x.json"},
		{"--stages", "/nonexistent.json"},
		{"--stage", "mass=0,duration=1"},
		{"--length", "1um", "--stage", "mass=1u,duration=1ms,kick=3N"},
	} {
		if code, _, errs := runCmd(flightCmd, args...); code != 2 || errs == "" {
			t.Errorf("%q: exit %d, %q", args, code, errs)
		}
	}
}

func TestFlightCertificate(t *testing.T) {
	path := filepath.Join(t.TempDir(), "f.json")
	code, _, errs := runCmd(flightCmd, "--stages", "../../testdata/flights/four-stages.json", "--width", "1e-6", "--out", path)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	c, err := certificates.ReadFile(path)
	if err != nil || c.Kind != certificates.KindFlight || len(c.Flight.Input.Stages) != 4 {
		t.Fatalf("%v %+v", err, c)
	}
}
