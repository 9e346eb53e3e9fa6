package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestBuildFunctionsJSON(t *testing.T) {
	out, errs, code := run(t, t.TempDir(), "build", "--functions", "x^k, x^k*log(x); k=0..2", "--interval", "0,1", "--digits", "25", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var rf map[string]any
	if err := json.Unmarshal([]byte(out), &rf); err != nil {
		t.Fatal(err)
	}
	if rf["kind"] != "generalized-gauss" || rf["points"].(float64) != 3 || rf["exact_for"].(float64) != 6 || rf["degree"].(float64) != 2 {
		t.Errorf("kind %v points %v exact_for %v degree %v", rf["kind"], rf["points"], rf["exact_for"], rf["degree"])
	}
	fs := rf["functions"].([]any)
	if len(fs) != 6 || fs[1] != "x^0*log(x)" {
		t.Errorf("functions %v", fs)
	}
}

func TestBuildFunctionsRefusals(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "m.txt"), []byte("1\n0.5\n"), 0o644)
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"--functions", "x^k; k=0..2", "--interval", "0,1"}, "odd number"},
		{[]string{"--functions", "x^k, log(x)", "--interval", "0,1"}, "no range clause"},
		{[]string{"--functions", "1, x, 3*x-1, x^2", "--interval", "0,1"}, "linearly dependent"},
		{[]string{"--functions", "1, x", "--interval", "0,1", "--weight", "x-0.5"}, "negative"},
		{[]string{"--functions", "x, x^2", "--interval", "-1,1"}, "no generalized Gauss rule"},
		{[]string{"--functions", "1, x", "--interval", "0,1", "--points", "2"}, "--points 2"},
		{[]string{"--functions", "1, x, x^2, x^3", "--interval", "0,1", "--function-moments", filepath.Join(dir, "m.txt")}, "2 values for 4 functions"},
		{[]string{"--functions", "1, x; k=2..1", "--interval", "0,1"}, "empty"},
	} {
		out := filepath.Join(dir, "rule.json")
		_, errs, code := run(t, dir, append(append([]string{"build"}, c.args...), "-o", out)...)
		if code != 1 || !strings.Contains(errs, c.want) {
			t.Errorf("%v: exit %d, %q; want 1 and %q", c.args, code, errs, c.want)
		}
		if _, err := os.Stat(out); err == nil {
			t.Errorf("%v: a rule file was written", c.args)
			os.Remove(out)
		}
	}
}

// The moments of 1, x, x^2, x^3 on [0,1] as a file: 1, 1/2, 1/3, 1/4 give
// the 2-point Gauss-Legendre rule on [0,1] (handbook formula:
// 1/2 -+ 1/(2 sqrt 3)).
func TestBuildFunctionMomentsFile(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "m.txt"), []byte("1\n1/2\n1/3\n1/4\n"), 0o644)
	out, errs, code := run(t, dir, "build", "--functions", "x^k; k=0..3", "--interval", "0,1", "--function-moments", "m.txt", "--digits", "20", "--format", "csv")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, "0.21132486540518711775,0.50000000000000000000") {
		t.Errorf("output:\n%s", out)
	}
}

// Interpolatory weights on given nodes, with the conditioning in the
// report: Simpson's weights 1/6, 2/3, 1/6 for 1, x, x^2 on 0, 1/2, 1.
func TestBuildFunctionsNodes(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "n.txt"), []byte("0\n1/2\n1\n"), 0o644)
	out, errs, code := run(t, dir, "build", "--functions", "1, x, x^2", "--interval", "0,1", "--nodes", "n.txt", "--digits", "20")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, want := range []string{"interpolatory", "0.66666666666666666667", "conditioning (1-norm)", "orthonormalised basis"} {
		if !strings.Contains(out, want) {
			t.Errorf("no %q in\n%s", want, out)
		}
	}
}

func TestAuditFunctions(t *testing.T) {
	dir := t.TempDir()
	_, errs, code := run(t, dir, "build", "--functions", "x^k, x^k*log(x); k=0..2", "--interval", "0,1", "--digits", "25", "--format", "json", "-o", "r.json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	out, errs, code := run(t, dir, "audit", "r.json", "--functions", "log(x), x^2*log(x)^2", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var rep struct {
		Degree    int `json:"degree"`
		Functions []struct {
			Expression string  `json:"expression"`
			Integrated bool    `json:"integrated"`
			Share      float64 `json:"residual_share"`
		} `json:"functions"`
	}
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatal(err)
	}
	if len(rep.Functions) != 2 || !rep.Functions[0].Integrated || rep.Functions[1].Integrated || rep.Degree != 2 {
		t.Errorf("report %+v", rep)
	}
}
