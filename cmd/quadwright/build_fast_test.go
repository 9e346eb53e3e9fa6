package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestBuildFastJSON: from design.FastThreshold points in float64 mode,
// build takes the fast path; the rule file carries the contract's keys,
// digits 0, the verified degree (here the whole 2N-1) and the measured
// accuracy in ulps.
func TestBuildFastJSON(t *testing.T) {
	out, errs, code := run(t, t.TempDir(), "build", "--family", "jacobi", "--alpha", "-0.3", "--beta", "0.8", "--points", "1200", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var rf map[string]any
	if err := json.Unmarshal([]byte(out), &rf); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"format", "kind", "domain", "weight", "points", "degree", "digits", "nodes", "weights", "construction_degree", "accuracy", "provenance", "report"} {
		if _, ok := rf[k]; !ok {
			t.Errorf("key %q missing", k)
		}
	}
	if rf["points"].(float64) != 1200 || rf["degree"].(float64) != 2399 || rf["digits"].(float64) != 0 || rf["construction_degree"].(float64) != 2399 {
		t.Errorf("points %v degree %v digits %v construction %v", rf["points"], rf["degree"], rf["digits"], rf["construction_degree"])
	}
	acc := rf["accuracy"].(map[string]any)
	if acc["samples"].(float64) < 100 || acc["node_share_of_bound"].(float64) > 1 || acc["weight_share_of_bound"].(float64) > 1 {
		t.Errorf("accuracy %v", acc)
	}
	if n := len(rf["nodes"].([]any)); n != 1200 {
		t.Errorf("%d nodes", n)
	}
	if !strings.Contains(rf["provenance"].(map[string]any)["method"].(string), "Hale and Townsend") {
		t.Errorf("provenance %v", rf["provenance"])
	}
}

// TestBuildFastStreamsCSV: above design.MaxPoints only the fast path
// builds; the CSV goes to the file through a temporary one, every line a
// node,weight pair of floats in ascending order.
func TestBuildFastStreamsCSV(t *testing.T) {
	dir := t.TempDir()
	_, errs, code := run(t, dir, "build", "--family", "legendre", "--interval", "0,2", "--points", "30001", "--format", "csv", "-o", "big.csv")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(filepath.Join(dir, "big.csv"))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSuffix(string(b), "\n"), "\n")
	if lines[0] != "node,weight" || len(lines) != 30002 {
		t.Fatalf("header %q, %d lines", lines[0], len(lines))
	}
	prev, sum := -1.0, 0.0
	for _, l := range lines[1:] {
		f := strings.Split(l, ",")
		x, err1 := strconv.ParseFloat(f[0], 64)
		w, err2 := strconv.ParseFloat(f[1], 64)
		if err1 != nil || err2 != nil || !(x > prev) || !(w > 0) {
			t.Fatalf("bad line %q", l)
		}
		prev, sum = x, sum+w
	}
	// The weights of the rule on [0, 2] sum to 2, the length (exact
	// integral of 1); 30001 positive terms round to within 1e-12.
	if d := sum - 2; d > 1e-12 || d < -1e-12 {
		t.Errorf("weights sum to %v", sum)
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Errorf("%d files left in the folder", len(ents))
	}
}

// TestBuildFastBadInput: requests the fast path cannot serve fail with
// exit status 1, a message naming the input, and no file.
func TestBuildFastBadInput(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"--family", "legendre", "--points", "30000", "--digits", "20"}, "--points 30000"},
		{[]string{"--family", "legendre", "--points", "30000", "--kind", "kronrod"}, "kronrod"},
		{[]string{"--family", "legendre", "--points", "30000", "--engine", "extended"}, "--points 30000"},
		{[]string{"--family", "legendre", "--points", "20000001"}, "--points 20000001"},
		{[]string{"--family", "legendre", "--points", "2000", "--engine", "quick"}, "--engine"},
		{[]string{"--family", "legendre", "--points", "2000", "--verify", "most"}, "--verify"},
		{[]string{"--family", "jacobi", "--alpha", "7", "--points", "2000", "--engine", "fast"}, "exponents"},
		{[]string{"--weight", "1", "--interval", "0,1", "--points", "30000"}, "--points 30000"},
		{[]string{"--family", "laguerre", "--points", "30000", "--kind", "radau"}, "radau"},
	} {
		args := append(append([]string{"build"}, c.args...), "-o", "out.csv", "--format", "csv")
		_, errs, code := run(t, dir, args...)
		if code != 1 || !strings.Contains(errs, c.want) {
			t.Errorf("%v: exit %d, stderr %q (want %q)", c.args, code, errs, c.want)
		}
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 0 {
		t.Errorf("%d files left behind", len(ents))
	}
}

// TestBuildFastVerifyFull: --verify full tests the whole degree even
// where the budget would stop earlier; the text header says how.
func TestBuildFastVerifyFull(t *testing.T) {
	out, errs, code := run(t, t.TempDir(), "build", "--family", "hermite", "--points", "1500", "--verify", "full")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, want := range []string{"# degree:   2999", "# accuracy: measured at", "# check:    exactness tested in float64"} {
		if !strings.Contains(out, want) {
			t.Errorf("header lacks %q:\n%s", want, out[:min(len(out), 1500)])
		}
	}
}

// TestBuildFastAudit: the audit, in exact arithmetic on the printed
// decimals, confirms the degree the fast path reports (a Lobatto rule
// mapped onto [0, 1], so the map and the fixed end nodes are covered).
func TestBuildFastAudit(t *testing.T) {
	dir := t.TempDir()
	if _, errs, code := run(t, dir, "build", "--family", "legendre", "--kind", "lobatto", "--interval", "0,1", "--points", "1000", "--format", "json", "-o", "l.json"); code != 0 {
		t.Fatalf("build: exit %d: %s", code, errs)
	}
	out, errs, code := run(t, dir, "audit", "l.json", "--quick", "--format", "json")
	if code != 0 {
		t.Fatalf("audit: exit %d: %s", code, errs)
	}
	var rep map[string]any
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatal(err)
	}
	if rep["degree"].(float64) != 1997 || rep["nodes_on_boundary"].(float64) != 2 || rep["nodes_outside"].(float64) != 0 {
		t.Errorf("audit: degree %v, on boundary %v, outside %v", rep["degree"], rep["nodes_on_boundary"], rep["nodes_outside"])
	}
}
