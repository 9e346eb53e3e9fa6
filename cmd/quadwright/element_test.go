package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestElementJSONContract(t *testing.T) {
	out, errs, code := run(t, t.TempDir(), "element", "--shape", "tetrahedron", "--degree", "3", "--digits", "30", "--format", "json", "--product")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var rf struct {
		Format, Kind, Weight string
		Domain               struct {
			Shape    string
			Vertices [][]string
		}
		Points, Degree, Digits int
		Nodes                  [][]string
		Weights                []string
	}
	if err := json.Unmarshal([]byte(out), &rf); err != nil {
		t.Fatal(err)
	}
	// N = 2 points per direction, exact through degree 2N-1 = 3.
	if rf.Format != "quadwright-rule/1" || rf.Kind != "collapsed" || rf.Weight != "1" || rf.Points != 8 || rf.Degree != 3 || rf.Digits != 30 {
		t.Errorf("unexpected header: %+v", rf)
	}
	if rf.Domain.Shape != "tetrahedron" || len(rf.Domain.Vertices) != 4 || len(rf.Nodes) != 8 || len(rf.Nodes[0]) != 3 || len(rf.Weights) != 8 {
		t.Errorf("unexpected domain or nodes: %+v", rf)
	}
}

func TestElementCSVAndText(t *testing.T) {
	out, errs, code := run(t, t.TempDir(), "element", "--shape", "quadrilateral", "--degree", "3", "--format", "csv")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	// 2x2 Gauss-Legendre: +-1/sqrt(3), weights 1 (Abramowitz and Stegun 25.4.29).
	want := "x,y,weight\n-0.5773502691896257,-0.5773502691896257,1\n-0.5773502691896257,0.5773502691896257,1\n0.5773502691896257,-0.5773502691896257,1\n0.5773502691896257,0.5773502691896257,1\n"
	if out != want {
		t.Errorf("csv:\n%s\nwant\n%s", out, want)
	}
	out, errs, code = run(t, t.TempDir(), "element", "--shape", "line", "--degree", "1", "--product", "--lobatto")
	if code != 0 || !strings.Contains(out, "# degree:   1") || !strings.Contains(out, "Gauss-Lobatto") {
		t.Errorf("text (exit %d, %s):\n%s", code, errs, out)
	}
}

func TestElementErrors(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"--shape", "cube", "--degree", "2"}, "--shape"},
		{[]string{"--degree", "2"}, "--shape is required"},
		{[]string{"--shape", "triangle"}, "--degree is required"},
		{[]string{"--shape", "triangle", "--degree", "-1"}, "--degree -1"},
		{[]string{"--shape", "hexahedron", "--degree", "31"}, "--degree 31"},
		{[]string{"--shape", "triangle", "--degree", "two"}, "--degree"},
		{[]string{"--shape", "triangle", "--degree", "2", "--digits", "0"}, "--digits"},
		{[]string{"--shape", "prism", "--degree", "2", "--lobatto"}, "--lobatto"},
	} {
		out := filepath.Join(dir, "rule.json")
		_, errs, code := run(t, dir, append(append([]string{"element"}, c.args...), "-o", out)...)
		if code != 1 || !strings.Contains(errs, c.want) || strings.Count(strings.TrimSpace(errs), "\n") != 0 {
			t.Errorf("%v: exit %d, stderr %q; want exit 1 and one line naming %s", c.args, code, errs, c.want)
		}
		if _, err := os.Stat(out); err == nil {
			t.Errorf("%v: an output file was left behind", c.args)
		}
	}
}

func TestElementSymmetricDefault(t *testing.T) {
	out, errs, code := run(t, t.TempDir(), "element", "--shape", "triangle", "--degree", "4", "--digits", "25", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var rf struct {
		Kind    string
		Points  int
		Degree  int
		Weights []string
	}
	if err := json.Unmarshal([]byte(out), &rf); err != nil {
		t.Fatal(err)
	}
	// The 6-point degree-4 rule (two 3-point orbits; Witherden and Vincent
	// 2015, from memory: 6 points).
	if rf.Kind != "symmetric" || rf.Points != 6 || rf.Degree != 4 || len(rf.Weights) != 6 {
		t.Errorf("got %+v", rf)
	}
	out, _, code = run(t, t.TempDir(), "element", "--shape", "triangle", "--degree", "4", "--product")
	if code != 0 || !strings.Contains(out, "collapsed rule") || !strings.Contains(out, "# points:   9") {
		t.Errorf("--product (exit %d):\n%s", code, out)
	}
}
