package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

func TestLevelSetJSONAndAudit(t *testing.T) {
	dir := t.TempDir()
	_, errs, code := run(t, dir, "element", "--shape", "quadrilateral", "--level-set", "x^2+y^2-0.25", "--degree", "20", "--format", "json", "-o", "disc.json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	data, err := os.ReadFile(filepath.Join(dir, "disc.json"))
	if err != nil {
		t.Fatal(err)
	}
	var rf struct {
		Format, Kind, Weight string
		Domain               struct{ Shape, Element, Level_set, Side string }
		Points, Degree       int
		Nodes                [][]string
		Weights              []string
		EstimatedError       string `json:"estimated_error"`
	}
	if err := json.Unmarshal(data, &rf); err != nil {
		t.Fatal(err)
	}
	if rf.Format != "quadwright-rule/1" || rf.Domain.Shape != "level-set" || rf.Domain.Element != "quadrilateral" || rf.Domain.Side != "inside" || rf.Points != len(rf.Nodes) || rf.EstimatedError == "" {
		t.Fatalf("unexpected header: %+v", rf)
	}
	// Area of the disc of radius 1/2: pi/4 (handbook formula).
	sum := 0.0
	for _, w := range rf.Weights {
		v, _ := strconv.ParseFloat(w, 64)
		sum += v
	}
	if math.Abs(sum-math.Pi/4) > 1e-13 {
		t.Errorf("area %v, want pi/4", sum)
	}
	out, errs, code := run(t, dir, "audit", "disc.json", "--format", "json", "--fail-on", "negative,outside")
	if code != 0 {
		t.Fatalf("audit exit %d: %s", code, errs)
	}
	var rep struct {
		Points, Negative_weights, Nodes_outside int
		Estimated_error                         float64
	}
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatal(err)
	}
	if rep.Points != rf.Points || rep.Negative_weights != 0 || rep.Nodes_outside != 0 || !(rep.Estimated_error < 1e-13) {
		t.Errorf("audit: %+v", rep)
	}
}

func TestLevelSetWholeAndRefusals(t *testing.T) {
	dir := t.TempDir()
	out, errs, code := run(t, dir, "element", "--box", "0,1,0,1", "--level-set", "x+y-5", "--degree", "3", "--format", "csv")
	if code != 0 || !strings.Contains(errs, "wholly on the inside") || strings.Count(out, "\n") != 10 {
		t.Errorf("whole element: exit %d, stderr %q, %d lines", code, errs, strings.Count(out, "\n"))
	}
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"--shape", "quadrilateral", "--level-set", "x+y-5", "--side", "outside"}, "empty"},
		{[]string{"--shape", "quadrilateral", "--level-set", "x+*y"}, `level set "x+*y": position 3`},
		{[]string{"--shape", "quadrilateral", "--level-set", "x", "--side", "middle"}, `--side "middle"`},
		{[]string{"--shape", "quadrilateral", "--level-set", "sqrt(x)-y"}, "undefined"},
		{[]string{"--box", "0,1,a,2", "--level-set", "x"}, `--box "0,1,a,2"`},
		{[]string{"--shape", "pyramid", "--level-set", "x"}, `--shape "pyramid"`},
	} {
		args := append([]string{"element", "--degree", "4", "-o", "x.json"}, c.args...)
		_, errs, code := run(t, dir, args...)
		if code != 1 || !strings.Contains(errs, c.want) || strings.Count(strings.TrimSpace(errs), "\n") > 0 {
			t.Errorf("%v: exit %d, stderr %q, want %q", c.args, code, errs, c.want)
		}
		if _, err := os.Stat(filepath.Join(dir, "x.json")); err == nil {
			t.Errorf("%v: left an output file", c.args)
		}
	}
}
