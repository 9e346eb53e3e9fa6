package main

import (
	"encoding/csv"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestBuildFailOn: build --fail-on takes audit's conditions and exit
// status 2, after the rule is written. The n-point Gauss-Legendre rule has
// degree 2n-1 (A&S 25.4.29), positive weights and its nodes inside.
func TestBuildFailOn(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct {
		args []string
		code int
		say  string
	}{
		{[]string{"--points", "5", "--fail-on", "degree<9,negative,outside,lost>0.5"}, 0, ""},
		{[]string{"--points", "5", "--fail-on", "degree<10"}, 2, "degree 9 < 10"},
		{[]string{"--points", "5", "--digits", "20", "--fail-on", "degree<12"}, 2, "degree 9 < 12"},
		// The fast path (from design.FastThreshold points) reports the degree its test established.
		{[]string{"--points", "3000", "--fail-on", "negative"}, 0, ""},
	} {
		os.Remove(filepath.Join(dir, "r.txt"))
		args := append([]string{"build", "--family", "legendre", "-o", "r.txt"}, c.args...)
		_, errs, code := run(t, dir, args...)
		if code != c.code || !strings.Contains(errs, c.say) {
			t.Errorf("%v: exit %d %q, want %d naming %q", c.args, code, errs, c.code, c.say)
		}
		if _, err := os.Stat(filepath.Join(dir, "r.txt")); err != nil {
			t.Errorf("%v: the rule was not written: %v", c.args, err)
		}
	}
	expectInputError(t, dir, []string{"build", "--family", "legendre", "--points", "3", "--fail-on", "degree<x"}, "--fail-on")
	// A rule with a node outside: lobatto with a prescribed node beyond the end.
	_, errs, code := run(t, dir, "build", "--weight", "1", "--interval", "0,1", "--points", "3", "--fixed", "-1", "--fail-on", "outside")
	if code != 2 || !strings.Contains(errs, "1 node outside the interval") {
		t.Errorf("node outside: exit %d %q", code, errs)
	}
}

// TestAuditCSV: audit --format csv is the residual table by degree; the
// residual of a passing degree is at most 10u and its share at most 1,
// and the share is the residual over 10u.
func TestAuditCSV(t *testing.T) {
	dir := t.TempDir()
	if _, errs, code := run(t, dir, "build", "--family", "legendre", "--points", "4", "--digits", "25", "--format", "json", "-o", "g4.json"); code != 0 {
		t.Fatal(errs)
	}
	out, errs, code := run(t, dir, "audit", "g4.json", "--format", "csv")
	if code != 0 {
		t.Fatal(errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(rows) != 1+10 || strings.Join(rows[0], ",") != "degree,residual,share_of_tolerance,passes" {
		t.Fatalf("table %v %q", err, out)
	}
	tol := 1e-23 // 10u with u = 10^(1-25)
	for j, row := range rows[1:] {
		res, _ := strconv.ParseFloat(row[1], 64)
		share, _ := strconv.ParseFloat(row[2], 64)
		pass := j <= 7 || j%2 == 1 // degree 2N-1 = 7; odd degrees vanish by symmetry
		if row[0] != strconv.Itoa(j) || (row[3] == "true") != pass || (share <= 1) != pass {
			t.Errorf("row %v: want degree %d passing %v", row, j, pass)
		}
		if res != 0 && (share/(res/tol) < 0.999 || share/(res/tol) > 1.001) {
			t.Errorf("row %v: share is not residual / 10u", row)
		}
	}
	// An element rule's table: the largest monomial residual of each total
	// degree; the 7-point degree-5 triangle rule passes through 5 and fails
	// at 6, the one degree past its point count's bound that the audit tests.
	if _, errs, code := run(t, dir, "element", "--shape", "triangle", "--degree", "5", "--format", "json", "-o", "t5.json"); code != 0 {
		t.Fatal(errs)
	}
	out, errs, code = run(t, dir, "audit", "t5.json", "--format", "csv")
	if code != 0 {
		t.Fatal(errs)
	}
	rows, err = csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(rows) != 1+7 || strings.Join(rows[0], ",") != "degree,residual,share_of_tolerance,passes" {
		t.Fatalf("element table %v %q", err, out)
	}
	for j, row := range rows[1:] {
		if pass := j <= 5; row[0] != strconv.Itoa(j) || (row[3] == "true") != pass {
			t.Errorf("element row %v: want degree %d passing %v", row, j, pass)
		}
	}
}

// TestFileMeasureLabels: a rule built from a moment list names the file in
// its measure, not "moments(FILE)", and its audit asks for the list
// instead of falling back to weight 1.
func TestFileMeasureLabels(t *testing.T) {
	dir := t.TempDir()
	// Raw moments of weight 1 on [-1,1]: 2/(k+1) for even k, 0 for odd.
	os.WriteFile(filepath.Join(dir, "leg.txt"), []byte("2\n0\n2/3\n0\n2/5\n0\n"), 0o644)
	out, errs, code := run(t, dir, "build", "--moments", "leg.txt", "--interval", "-1,1", "--points", "3", "-o", "m.txt")
	if code != 0 {
		t.Fatal(errs, out)
	}
	b, _ := os.ReadFile(filepath.Join(dir, "m.txt"))
	if strings.Contains(string(b), "moments(") || !strings.Contains(string(b), "leg.txt") {
		t.Errorf("label:\n%s", b)
	}
	expectInputError(t, dir, []string{"audit", "m.txt"}, "--moments")
	run(t, dir, "build", "--moments", "leg.txt", "--interval", "-1,1", "--points", "3", "--format", "json", "-o", "m.json")
	expectInputError(t, dir, []string{"audit", "m.json"}, "--moments leg.txt")
	if out, errs, code := run(t, dir, "audit", "m.json", "--moments", "leg.txt", "--interval", "-1,1", "--quick"); code != 0 || !strings.Contains(out, "5 (tested in the orthonormal basis to degree 5)") {
		t.Errorf("audit with the list: exit %d %s\n%s", code, errs, out)
	}
}
