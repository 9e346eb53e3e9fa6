package main

import (
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

var binary string

func TestMain(m *testing.M) {
	dir, err := os.MkdirTemp("", "quadwright-cli-test")
	if err != nil {
		panic(err)
	}
	binary = filepath.Join(dir, "quadwright")
	if out, err := exec.Command("go", "build", "-o", binary, ".").CombinedOutput(); err != nil {
		panic("building quadwright: " + err.Error() + "\n" + string(out))
	}
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

// run executes the program and returns stdout, stderr and the exit status.
func run(t *testing.T, dir string, args ...string) (string, string, int) {
	t.Helper()
	cmd := exec.Command(binary, args...)
	cmd.Dir = dir
	var so, se bytes.Buffer
	cmd.Stdout, cmd.Stderr = &so, &se
	err := cmd.Run()
	code := 0
	if ee, ok := err.(*exec.ExitError); ok {
		code = ee.ExitCode()
	} else if err != nil {
		t.Fatal(err)
	}
	return so.String(), se.String(), code
}

func TestBuildJSONContract(t *testing.T) {
	out, errs, code := run(t, t.TempDir(), "build", "--family", "jacobi", "--alpha", "-0.7", "--beta", "2.3", "--points", "10", "--digits", "30", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var rf map[string]any
	if err := json.Unmarshal([]byte(out), &rf); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"format", "kind", "domain", "weight", "points", "degree", "digits", "nodes", "weights"} {
		if _, ok := rf[k]; !ok {
			t.Errorf("key %q missing", k)
		}
	}
	if rf["format"] != "quadwright-rule/1" || rf["kind"] != "gauss" || rf["points"].(float64) != 10 || rf["degree"].(float64) != 19 || rf["digits"].(float64) != 30 {
		t.Errorf("unexpected header: %v", rf)
	}
	dom := rf["domain"].(map[string]any)
	if dom["shape"] != "interval" {
		t.Errorf("domain %v", dom)
	}
	nodes := rf["nodes"].([]any)
	if len(nodes) != 10 {
		t.Fatalf("%d nodes", len(nodes))
	}
}

func TestBuildCSVAndText(t *testing.T) {
	out, errs, code := run(t, t.TempDir(), "build", "--family", "legendre", "--points", "3", "--format", "csv")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	// float64 mode: the nearest doubles to -sqrt(3/5), 0, sqrt(3/5) and 5/9, 8/9, 5/9,
	// the 3-point Gauss-Legendre rule in closed form (Abramowitz and Stegun
	// Table 25.4, from memory).
	want := []string{"node,weight", "-0.7745966692414834,0.5555555555555556", "0,0.8888888888888888", "0.7745966692414834,0.5555555555555556"}
	if strings.Join(lines, "\n") != strings.Join(want, "\n") {
		t.Errorf("csv:\n%s\nwant\n%s", out, strings.Join(want, "\n"))
	}
	out, _, code = run(t, t.TempDir(), "build", "--family", "hermite", "--points", "4", "--digits", "20")
	if code != 0 || !strings.Contains(out, "degree:   7") || !strings.Contains(out, "exp(-x^2)") {
		t.Errorf("text output:\n%s", out)
	}
}

func TestBuildWritesFileAtomically(t *testing.T) {
	dir := t.TempDir()
	_, errs, code := run(t, dir, "build", "--family", "laguerre", "--alpha", "1.5", "--points", "6", "--digits", "25", "-o", "lag.json", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if _, err := os.Stat(filepath.Join(dir, "lag.json")); err != nil {
		t.Fatal(err)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("left-over files: %v", entries)
	}
}

// TestBadInput checks that every bad input gets exit status 1, one line on
// stderr that names the input, nothing on stdout, and no output file.
func TestBadInput(t *testing.T) {
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"build", "--family", "legendre", "--points", "0"}, "--points 0"},
		{[]string{"build", "--family", "legendre", "--points", "-3"}, "--points -3"},
		{[]string{"build", "--family", "legendre", "--points", "abc"}, `--points "abc"`},
		{[]string{"build", "--family", "legendre", "--points", "20000001"}, "--points 20000001"},
		{[]string{"build", "--family", "legendre", "--points", "999999", "--digits", "20"}, "--points 999999"},
		{[]string{"build", "--family", "legendre"}, "--points"},
		{[]string{"build", "--family", "legendre", "--points", "4", "--digits", "0"}, "--digits 0"},
		{[]string{"build", "--family", "legendre", "--points", "4", "--digits", "1001"}, "--digits 1001"},
		{[]string{"build", "--family", "legendre", "--points", "4", "--digits", "many"}, `--digits "many"`},
		{[]string{"build", "--family", "jacobi", "--alpha", "-1", "--points", "4"}, "--alpha -1"},
		{[]string{"build", "--family", "jacobi", "--beta", "-1.5", "--points", "4"}, "--beta -1.5"},
		{[]string{"build", "--family", "jacobi", "--alpha", "0.1.2", "--points", "4"}, "--alpha"},
		{[]string{"build", "--family", "laguerre", "--alpha", "-1", "--points", "4"}, "--alpha -1"},
		{[]string{"build", "--family", "gegenbauer", "--alpha", "-0.5", "--points", "4"}, "--alpha -0.5"},
		{[]string{"build", "--family", "legendre", "--interval", "0,inf", "--points", "4"}, "--interval"},
		{[]string{"build", "--family", "laguerre", "--interval", "0,1", "--points", "4"}, "--interval"},
		{[]string{"build", "--family", "hermite", "--interval", "0,inf", "--points", "4"}, "--interval"},
		{[]string{"build", "--family", "legendre", "--interval", "1,0", "--points", "4"}, "interval"},
		{[]string{"build", "--family", "legendre", "--interval", "1", "--points", "4"}, "interval"},
		{[]string{"build", "--family", "fibonacci", "--points", "4"}, `"fibonacci"`},
		{[]string{"build", "--family", "legendre", "--alpha", "1", "--points", "4"}, "--alpha"},
		{[]string{"build", "--family", "legendre", "--points", "4", "--format", "xml"}, `--format "xml"`},
		{[]string{"build", "--points", "4"}, "--family"},
		{[]string{"build", "--family", "legendre", "--points", "4", "--bogus"}, "--bogus"},
	}
	for _, c := range cases {
		expectInputError(t, t.TempDir(), c.args, c.want)
	}
}

// expectInputError runs args (with -o out.txt) in dir and requires exit
// status 1, one line on stderr naming want, nothing on stdout and no
// out.txt left behind.
func expectInputError(t *testing.T, dir string, argv []string, want string) {
	t.Helper()
	args := append(append([]string(nil), argv...), "-o", "out.txt")
	out, errs, code := run(t, dir, args...)
	if code != 1 {
		t.Errorf("%v: exit %d, want 1 (stderr %q)", argv, code, errs)
	}
	if !strings.Contains(errs, want) {
		t.Errorf("%v: stderr %q does not name %q", argv, errs, want)
	}
	if strings.Count(strings.TrimSpace(errs), "\n") != 0 {
		t.Errorf("%v: more than one line on stderr: %q", argv, errs)
	}
	if out != "" {
		t.Errorf("%v: stdout %q", argv, out)
	}
	if _, err := os.Stat(filepath.Join(dir, "out.txt")); err == nil {
		t.Errorf("%v: output file left behind", argv)
	}
	matches, _ := filepath.Glob(filepath.Join(dir, ".out.txt.tmp-*"))
	if len(matches) != 0 {
		t.Errorf("%v: temporary files left behind: %v", argv, matches)
	}
}

func TestDemo(t *testing.T) {
	dir := t.TempDir()
	out, errs, code := run(t, dir, "demo", "--out", filepath.Join(dir, "demo"))
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, filepath.Join(dir, "demo")) {
		t.Errorf("demo does not say where it wrote: %s", out)
	}
	for _, f := range []string{"summary.txt", "audit-newton-cotes-11.html", "audit-gauss-legendre-11.html", "bem-log-panel.json", "spectral-lobatto.json", "measured-moments.json"} {
		if _, err := os.Stat(filepath.Join(dir, "demo", f)); err != nil {
			t.Error(err)
		}
	}
	if !strings.Contains(out, "4 negative weights") {
		t.Errorf("the demo's audit of the poor rule does not show its negative weights:\n%s", out)
	}
}
