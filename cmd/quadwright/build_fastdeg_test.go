package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestBuildFastReportsFullDegree: a 10^5-point float64 Legendre rule
// reports degree 2N-1 = 199999 in its JSON rule file and text header (it
// reported 1999 while the test stopped at a work budget), with the
// check's description under provenance.degree_check.
func TestBuildFastReportsFullDegree(t *testing.T) {
	dir := t.TempDir()
	if _, errs, code := run(t, dir, "build", "--family", "legendre", "--points", "100000", "--format", "json", "-o", "r.json"); code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(filepath.Join(dir, "r.json"))
	if err != nil {
		t.Fatal(err)
	}
	var rf struct {
		Degree     int `json:"degree"`
		Provenance struct {
			DegreeCheck string `json:"degree_check"`
		} `json:"provenance"`
	}
	if err := json.Unmarshal(b, &rf); err != nil {
		t.Fatal(err)
	}
	if rf.Degree != 199999 || !strings.Contains(rf.Provenance.DegreeCheck, "every degree 0 to 199999 in the Chebyshev basis") {
		t.Errorf("degree %d, check %q", rf.Degree, rf.Provenance.DegreeCheck)
	}
	out, errs, code := run(t, dir, "build", "--family", "legendre", "--points", "100000")
	if code != 0 || !strings.Contains(out, "# degree:   199999 ") {
		t.Errorf("exit %d: %s\n%s", code, errs, out[:min(len(out), 800)])
	}
}
