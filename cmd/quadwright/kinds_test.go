package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestKindsJSON builds each kind through the command line and checks the
// contract's counting of points (2N+1 for kronrod, N+1 for anti-gauss, N
// for the others, prescribed nodes included), the kind recorded, the
// verified degree, and ascending nodes with the prescribed ones printed as
// given.
func TestKindsJSON(t *testing.T) {
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "nodes.txt"), []byte("# Simpson's nodes and one more\n1\n-1\n0\n\n1/2\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		args           []string
		kind           string
		points, degree int
		first, last    string
	}{
		{[]string{"--family", "legendre", "--kind", "radau", "--points", "5"}, "radau", 5, 8, "-1", ""},
		{[]string{"--family", "legendre", "--kind", "radau", "--fixed", "1", "--points", "5"}, "radau", 5, 8, "", "1"},
		{[]string{"--family", "laguerre", "--kind", "radau", "--points", "4"}, "radau", 4, 6, "0", ""},
		{[]string{"--family", "legendre", "--interval", "0,2", "--kind", "lobatto", "--points", "6"}, "lobatto", 6, 9, "0", "2"},
		{[]string{"--family", "jacobi", "--alpha", "0.5", "--kind", "lobatto", "--fixed", "-1.5,1", "--points", "6"}, "lobatto", 6, 9, "-1.5", "1"},
		{[]string{"--family", "legendre", "--kind", "kronrod", "--points", "7"}, "kronrod", 15, 23, "", ""},
		{[]string{"--family", "jacobi", "--alpha", "0.5", "--beta", "-0.3", "--kind", "kronrod", "--points", "4"}, "kronrod", 9, 13, "", ""},
		{[]string{"--family", "hermite", "--kind", "anti-gauss", "--points", "6"}, "anti-gauss", 7, 11, "", ""},
		{[]string{"--family", "legendre", "--fixed", "-2,1", "--points", "5"}, "gauss", 5, 7, "-2", "1"},
		{[]string{"--family", "legendre", "--nodes", "nodes.txt"}, "interpolatory", 4, 3, "-1", "1"},
		{[]string{"--family", "legendre", "--kind", "newton-cotes", "--points", "5"}, "newton-cotes", 5, 5, "-1", "1"},
		{[]string{"--family", "legendre", "--interval", "0,1", "--kind", "clenshaw-curtis", "--points", "8"}, "clenshaw-curtis", 8, 7, "0", "1"},
		{[]string{"--family", "chebyshev1", "--kind", "fejer", "--points", "6"}, "fejer", 6, 11, "", ""},
	}
	for _, c := range cases {
		args := append(append([]string{"build"}, c.args...), "--digits", "30", "--format", "json")
		out, errs, code := run(t, dir, args...)
		if code != 0 {
			t.Errorf("%v: exit %d: %s", c.args, code, errs)
			continue
		}
		var rf struct {
			Kind    string
			Points  int
			Degree  int
			Digits  int
			Nodes   []string
			Weights []string
		}
		if err := json.Unmarshal([]byte(out), &rf); err != nil {
			t.Fatalf("%v: %v", c.args, err)
		}
		if rf.Kind != c.kind || rf.Points != c.points || len(rf.Nodes) != c.points || rf.Degree != c.degree || rf.Digits != 30 {
			t.Errorf("%v: kind %s, points %d (%d nodes), degree %d, digits %d", c.args, rf.Kind, rf.Points, len(rf.Nodes), rf.Degree, rf.Digits)
			continue
		}
		if c.first != "" && rf.Nodes[0] != c.first || c.last != "" && rf.Nodes[len(rf.Nodes)-1] != c.last {
			t.Errorf("%v: nodes %v", c.args, rf.Nodes)
		}
		for i := 1; i < len(rf.Nodes); i++ {
			if lessDecimal(rf.Nodes[i], rf.Nodes[i-1]) {
				t.Errorf("%v: nodes not ascending at %d: %v", c.args, i, rf.Nodes)
			}
		}
	}
}

// lessDecimal compares two printed decimals (test helper on float64 is
// enough: neighbours differ in their leading digits).
func lessDecimal(a, b string) bool {
	var x, y float64
	if err := json.Unmarshal([]byte(a), &x); err != nil {
		return false
	}
	if err := json.Unmarshal([]byte(b), &y); err != nil {
		return false
	}
	return x < y
}

// TestKindsRefused checks that every request without a rule exits 1 with
// one sentence on stderr that says why, and writes nothing.
func TestKindsRefused(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "bad.txt"), []byte("0\nzero point five\n"), 0o644)
	os.WriteFile(filepath.Join(dir, "twice.txt"), []byte("0\n1/2\n0.5\n"), 0o644)
	os.WriteFile(filepath.Join(dir, "empty.txt"), []byte("# nothing\n\n"), 0o644)
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"--family", "hermite", "--kind", "kronrod", "--points", "3"}, "does not exist with real nodes and positive weights"},
		{[]string{"--family", "hermite", "--kind", "kronrod", "--points", "4"}, "does not exist with real nodes and positive weights"},
		{[]string{"--family", "hermite", "--kind", "kronrod", "--points", "5"}, "does not exist with real nodes and positive weights"},
		{[]string{"--family", "laguerre", "--kind", "kronrod", "--points", "1"}, "outside the support"},
		{[]string{"--family", "legendre", "--kind", "radau", "--fixed", "0.5", "--points", "4"}, "strictly inside"},
		{[]string{"--family", "hermite", "--kind", "radau", "--points", "4"}, "no finite end"},
		{[]string{"--family", "legendre", "--kind", "radau", "--fixed", "-1,1", "--points", "4"}, "one prescribed node"},
		{[]string{"--family", "legendre", "--kind", "lobatto", "--fixed", "-1,0", "--points", "4"}, "changes sign"},
		{[]string{"--family", "legendre", "--kind", "lobatto", "--fixed", "1", "--points", "4"}, "two prescribed nodes"},
		{[]string{"--family", "laguerre", "--kind", "lobatto", "--points", "4"}, "infinite end"},
		{[]string{"--family", "legendre", "--kind", "lobatto", "--points", "1"}, "at least 2"},
		{[]string{"--family", "legendre", "--fixed", "0", "--points", "4"}, "changes sign"},
		{[]string{"--family", "legendre", "--fixed", "-1,,1", "--points", "4"}, "item 2 is empty"},
		{[]string{"--family", "legendre", "--fixed", "-1,abc", "--points", "4"}, `"abc"`},
		{[]string{"--family", "legendre", "--fixed", "2,3,4", "--points", "2"}, "do not fit"},
		{[]string{"--family", "jacobi", "--alpha", "-0.9", "--beta", "-0.9", "--kind", "anti-gauss", "--points", "3"}, "outside the support"},
		{[]string{"--family", "legendre", "--kind", "kronrod", "--fixed", "1", "--points", "3"}, "takes no prescribed nodes"},
		{[]string{"--family", "legendre", "--kind", "simpson", "--points", "3"}, `--kind "simpson"`},
		{[]string{"--family", "legendre", "--kind", "interpolatory", "--points", "3"}, "--nodes"},
		{[]string{"--family", "legendre", "--nodes", "bad.txt"}, "line 2"},
		{[]string{"--family", "legendre", "--nodes", "twice.txt"}, "twice"},
		{[]string{"--family", "legendre", "--nodes", "empty.txt"}, "no node"},
		{[]string{"--family", "legendre", "--nodes", "missing.txt"}, "missing.txt"},
		{[]string{"--family", "legendre", "--nodes", "twice.txt", "--kind", "radau"}, "--nodes"},
		{[]string{"--family", "hermite", "--kind", "newton-cotes", "--points", "5"}, "finite interval"},
		{[]string{"--family", "legendre", "--kind", "clenshaw-curtis", "--points", "1"}, "at least 2"},
	}
	for _, c := range cases {
		args := append(append([]string{"build"}, c.args...), "-o", "out.json")
		before, _ := os.ReadDir(dir)
		out, errs, code := run(t, dir, args...)
		if code != 1 {
			t.Errorf("%v: exit %d, want 1 (stderr %q)", c.args, code, errs)
		}
		if !strings.Contains(errs, c.want) || strings.Count(strings.TrimSpace(errs), "\n") != 0 {
			t.Errorf("%v: stderr %q does not say %q in one line", c.args, errs, c.want)
		}
		if after, _ := os.ReadDir(dir); out != "" || len(after) != len(before) {
			t.Errorf("%v: output left behind", c.args)
		}
	}
}

func FuzzParseFixedList(f *testing.F) {
	for _, s := range []string{"-1,1", "0", "1/3, -2.5e3", ",", "1,,2", "abc", "1e99999999"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, err := parseFixedList(s)
		if err == nil && len(v) != strings.Count(s, ",")+1 {
			t.Errorf("%q: %d values", s, len(v))
		}
		if err != nil && strings.Contains(err.Error(), "\n") {
			t.Errorf("%q: multi-line error", s)
		}
	})
}

func FuzzParseNodeList(f *testing.F) {
	for _, s := range []string{"1\n-1\n0\n", "# c\n1/2\n\n", "", "x\n", "1e-5\n 2 \n"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, err := parseNodeList(s, "nodes.txt")
		if err == nil && len(v) == 0 {
			t.Errorf("%q: no error and no node", s)
		}
		if err != nil && !strings.HasPrefix(err.Error(), "--nodes nodes.txt") {
			t.Errorf("%q: error %q does not name the file", s, err)
		}
	})
}
