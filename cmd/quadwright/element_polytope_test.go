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

const lShape = "0 0\n2 0\n2 1\n1 1\n1 2\n0 2\n"

func TestPolygonRuleAndAudit(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "l.txt", lShape)
	_, errs, code := run(t, dir, "element", "--polygon", "l.txt", "--degree", "4", "--digits", "20", "--format", "json", "-o", "l4.json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	b, _ := os.ReadFile(filepath.Join(dir, "l4.json"))
	var rf struct {
		Kind   string `json:"kind"`
		Domain struct {
			Shape    string     `json:"shape"`
			Vertices [][]string `json:"vertices"`
		} `json:"domain"`
		Points, Degree, Digits int
	}
	if err := json.Unmarshal(b, &rf); err != nil {
		t.Fatal(err)
	}
	if rf.Domain.Shape != "polygon" || len(rf.Domain.Vertices) != 6 || rf.Degree < 4 || rf.Digits != 20 || rf.Points > 8 {
		t.Errorf("rule file: %+v", rf)
	}
	out, errs, code := run(t, dir, "audit", "l4.json")
	if code != 0 || !strings.Contains(out, "negative weights:  0") || !strings.Contains(out, "nodes outside:     0") {
		t.Errorf("audit exit %d: %s%s", code, out, errs)
	}
}

func TestPolyhedronRule(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "tet.txt", "v 0 0 0\nv 2 0 0\nv 0 2 0\nv 0 0 2\nf 1 3 2\nf 1 2 4\nf 2 3 4\nf 3 1 4\n")
	out, errs, code := run(t, dir, "element", "--polyhedron", "tet.txt", "--degree", "3", "--format", "json")
	if code != 0 || !strings.Contains(out, `"shape": "polyhedron"`) || !strings.Contains(out, `"faces"`) {
		t.Fatalf("exit %d: %s %s", code, out, errs)
	}
}

// Each refusal: one sentence naming the problem, exit 1, no output file.
func TestPolytopeRefusals(t *testing.T) {
	dir := t.TempDir()
	box := "v 0 0 0\nv 1 0 0\nv 1 1 0\nv 0 1 0\nv 0 0 1\nv 1 0 1\nv 1 1 1\nv 0 1 1\nf 1 4 3 2\nf 5 6 7 8\nf 1 2 6 5\nf 2 3 7 6\nf 3 4 8 7\nf 4 1 5 8\n"
	for _, c := range []struct {
		flag, text, want string
	}{
		{"--polygon", "0 0\n1 1\n1 0\n0 1\n", "intersect: the polygon is not simple"},
		{"--polygon", "0 0\n1 0\n1 1\n1 0\n0 1\n", "vertices 2 and 4 are the same point"},
		{"--polygon", "0 0\n1 0\n2 0\n", "lies on the line through its neighbours"}, // zero area
		{"--polyhedron", strings.Replace(box, "f 4 1 5 8\n", "", 1), "the surface is not closed"},
		{"--polyhedron", strings.Replace(box, "v 0 1 1\n", "v 0 1 2\n", 1), "is not planar"},
		{"--polyhedron", strings.Replace(box, "f 5 6 7 8", "f 8 7 6 5", 1), "orientation is inconsistent"},
	} {
		writeFile(t, dir, "cell.txt", c.text)
		_, errs, code := run(t, dir, "element", c.flag, "cell.txt", "--degree", "3", "-o", "out.json")
		if code != 1 || !strings.Contains(errs, c.want) || strings.Count(strings.TrimSpace(errs), "\n") != 0 {
			t.Errorf("%s %q: exit %d, stderr %q; want %q", c.flag, c.text, code, errs, c.want)
		}
		if _, err := os.Stat(filepath.Join(dir, "out.json")); err == nil {
			t.Errorf("%q: an output file was written", c.want)
		}
	}
}

// A batch: JSON lines in input order, a bad cell named on stderr by
// index with exit 1, and shards that concatenate byte for byte to the
// whole on any number of cores.
func TestPolygonBatchShards(t *testing.T) {
	dir := t.TempDir()
	cells := []string{
		lShape,
		"10 3\n10 4.5\n8.5 4.5\n8.5 6\n7 6\n7 3\n", // the L-shape rotated, scaled, moved
		"0 0\n1 0\n0 1\n",
		"0 0\n1 1\n1 0\n0 1\n", // bad: self-intersecting
		"0 0\n3 0\n3 1\n0 1\n",
		"5 5\n6 5\n5 6\n", // similar to cell 3
		"0 0\n4 0\n4 3\n2 1\n0 3\n",
	}
	writeFile(t, dir, "cells.txt", strings.Join(cells, "\n"))
	whole, errs, code := run(t, dir, "element", "--polygons", "cells.txt", "--degree", "4")
	if code != 1 || !strings.Contains(errs, "cell 4") || strings.Contains(errs, "cell 5:") {
		t.Fatalf("exit %d, stderr %q", code, errs)
	}
	lines := strings.Split(strings.TrimSpace(whole), "\n")
	if len(lines) != 6 {
		t.Fatalf("%d lines, want 6", len(lines))
	}
	for i, want := range []int{1, 2, 3, 5, 6, 7} {
		var l struct{ Cell int }
		json.Unmarshal([]byte(lines[i]), &l)
		if l.Cell != want {
			t.Errorf("line %d is cell %d, want %d", i+1, l.Cell, want)
		}
	}
	for _, env := range [][]string{{"GOMAXPROCS=1"}, {"GOMAXPROCS=3"}} {
		var cat strings.Builder
		for k := 1; k <= 3; k++ {
			out, _, _ := runEnv(t, dir, env, "element", "--polygons", "cells.txt", "--degree", "4", "--shard", string(rune('0'+k))+"/3")
			cat.WriteString(out)
		}
		if cat.String() != whole {
			t.Errorf("%v: the shards concatenated differ from the whole", env)
		}
	}
	// -o writes the good cells atomically even though the exit is 1.
	_, _, code = run(t, dir, "element", "--polygons", "cells.txt", "--degree", "4", "-o", "rules.jsonl")
	b, err := os.ReadFile(filepath.Join(dir, "rules.jsonl"))
	if code != 1 || err != nil || string(b) != whole {
		t.Errorf("-o: exit %d, %v, same as stdout: %v", code, err, string(b) == whole)
	}
	if _, errs, code := run(t, dir, "element", "--polygons", "cells.txt", "--degree", "4", "--shard", "4/3"); code != 1 || !strings.Contains(errs, "--shard") {
		t.Errorf("--shard 4/3: exit %d %s", code, errs)
	}
}

// runEnv is run with extra environment variables.
func runEnv(t *testing.T, dir string, env []string, args ...string) (string, string, int) {
	t.Helper()
	old := os.Environ()
	cmd := exec.Command(binary, args...)
	cmd.Dir = dir
	cmd.Env = append(old, env...)
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
