package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestShippedSpecs runs every spec in specs/ and checks that it yields a
// verified rule file.
func TestShippedSpecs(t *testing.T) {
	specs, _ := filepath.Glob("../../specs/*.toml")
	if len(specs) < 5 {
		t.Fatalf("only %d specs in specs/", len(specs))
	}
	for _, sp := range specs {
		abs, _ := filepath.Abs(sp)
		out, errs, code := run(t, t.TempDir(), "build", abs)
		if code != 0 {
			t.Errorf("%s: exit %d: %s", filepath.Base(sp), code, errs)
			continue
		}
		var rf map[string]any
		if err := json.Unmarshal([]byte(out), &rf); err != nil {
			t.Errorf("%s: output is not JSON: %v", filepath.Base(sp), err)
			continue
		}
		if rf["degree"].(float64) < 1 {
			t.Errorf("%s: degree %v", filepath.Base(sp), rf["degree"])
		}
	}
}

func TestSpecOverridesAndErrors(t *testing.T) {
	dir := t.TempDir()
	spec := filepath.Join(dir, "s.toml")
	os.WriteFile(spec, []byte("description = \"test\"\nfamily = \"jacobi\"\nalpha = -0.7\nbeta = \"2.3\"\npoints = 5\ndigits = 25\nformat = \"json\"\noutput = \"rule.json\"\n"), 0o644)
	// --points on the command line overrides the file; output is relative to the spec.
	_, errs, code := run(t, t.TempDir(), "build", spec, "--points", "6")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(filepath.Join(dir, "rule.json"))
	if err != nil {
		t.Fatal(err)
	}
	var rf map[string]any
	json.Unmarshal(b, &rf)
	if rf["points"].(float64) != 6 || rf["digits"].(float64) != 25 {
		t.Errorf("points %v digits %v", rf["points"], rf["digits"])
	}
	cases := []struct{ text, want string }{
		{"points = 5\nfamliy = \"legendre\"\n", `line 2: unknown key "famliy"`},
		{"family = \"legendre\"\npoints = 5\n[extra]\nx = 1\n", "extra"},
		{"family = \"legendre\"\npoints = \n", "line 2"},
		{"family = \"jacobi\"\nalpha = 0.12345678901234567\npoints = 3\n", "write it as a string"},
	}
	for _, c := range cases {
		os.WriteFile(spec, []byte(c.text), 0o644)
		out, errs, code := run(t, dir, "build", spec)
		if code != 1 || out != "" || !strings.Contains(errs, c.want) {
			t.Errorf("%q: exit %d, stderr %q, want %q", c.text, code, errs, c.want)
		}
	}
}
