package main

import (
	"bytes"
	"encoding/csv"
	"encoding/xml"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestSweepWritesCSVAndSVG(t *testing.T) {
	dir := t.TempDir()
	c, s := filepath.Join(dir, "a.csv"), filepath.Join(dir, "a.svg")
	code, out, errs := runCmd(sweepCmd, "--from", "1", "--to", "100", "--points", "5", "--csv", c, "--svg", s)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if errs != "" {
		t.Errorf("stderr is not a terminal, yet got %q", errs)
	}
	if !strings.Contains(out, "best certified lower bound for the backflow constant: c_bm >= 0.0319") {
		t.Errorf("summary line: %q", out)
	}
	f, err := os.ReadFile(c)
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(bytes.NewReader(f)).ReadAll()
	if err != nil || len(rows) != 6 || rows[0][0] != "alpha" || rows[5][0] != "100" {
		t.Fatalf("CSV: %v %q", err, rows)
	}
	// The certified brackets increase along the sweep (A is non-decreasing).
	for i := 2; i < len(rows); i++ {
		if ratOf(t, rows[i][3]).Cmp(ratOf(t, rows[i-1][4])) <= 0 {
			t.Errorf("row %d: advantage lower %s not above previous upper %s", i, rows[i][3], rows[i-1][4])
		}
	}
	img, err := os.ReadFile(s)
	if err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(bytes.NewReader(img))
	root := ""
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok && root == "" {
			root = se.Name.Local
		}
	}
	if root != "svg" || !bytes.Contains(img, []byte("Bracken")) {
		t.Errorf("SVG root %q", root)
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 2 {
		t.Errorf("left files behind: %v", ents)
	}
}

func TestSweepToStdout(t *testing.T) {
	code, out, errs := runCmd(sweepCmd, "--from", "2", "--to", "2", "--points", "1", "--quiet")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.HasPrefix(out, "alpha,basis_size,") || !strings.Contains(out, "\n2,") {
		t.Errorf("stdout: %q", out)
	}
}

func TestSweepBadInput(t *testing.T) {
	for _, c := range [][]string{
		{"--from", "0"},
		{"--from", "10", "--to", "1"},
		{"--points", "0"},
		{"--from", "1", "--to", "2", "--points", "1"},
		{"--width", "2"},
		{"--from", "x"},
		{"stray"},
	} {
		code, _, errs := runCmd(sweepCmd, c...)
		if code != 2 || strings.TrimSpace(errs) == "" {
			t.Errorf("%q: exit %d, stderr %q", c, code, errs)
		}
	}
}

// --matched adds the matched bracket to every row; it lies at or above the
// projectile advantage's lower end (a weaker rival: M >= A).
func TestSweepMatched(t *testing.T) {
	dir := t.TempDir()
	csvPath := dir + "/s.csv"
	code, _, errs := runCmd(sweepCmd, "--from", "0.5", "--to", "1", "--points", "2", "--matched", "--quiet", "--csv", csvPath, "--svg", dir+"/s.svg")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(csvPath)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(b)), "\n")
	if len(lines) != 3 || !strings.HasSuffix(lines[0], "matched_lower,matched_upper") {
		t.Fatalf("csv:\n%s", b)
	}
	for _, l := range lines[1:] {
		f := strings.Split(l, ",")
		aLo, mLo, mHi := ratOf(t, f[3]), ratOf(t, f[7]), ratOf(t, f[8])
		if mHi.Cmp(aLo) < 0 || mLo.Cmp(mHi) > 0 {
			t.Errorf("row %s", l)
		}
	}
}
