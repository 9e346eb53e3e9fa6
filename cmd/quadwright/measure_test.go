package main

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/spf13/cobra"
)

// writeFile writes content to dir/name and returns the name.
func writeFile(t *testing.T, dir, name, content string) string {
	t.Helper()
	if err := os.WriteFile(filepath.Join(dir, name), []byte(content), 0o644); err != nil {
		t.Fatal(err)
	}
	return name
}

// logMomentFile is the raw moments 1/(k+1)^2 of -log(x) on [0,1]
// (Gradshteyn and Ryzhik 4.272) as p/q lines.
func logMomentFile(m int) string {
	var b strings.Builder
	b.WriteString("# raw moments of -log(x) on [0,1]\n")
	for k := 0; k < m; k++ {
		fmt.Fprintf(&b, "1/%d\n", (k+1)*(k+1))
	}
	return b.String()
}

func TestBuildFromMomentsWeightAndMeasure(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "log.txt", logMomentFile(20))
	// A two-point measure with masses 1/2 at 0 and 1 (an invented
	// scenario): its 2-point rule is itself.
	writeFile(t, dir, "coin.txt", "0 1/2\n1 1/2\n")
	// The first node and weight of the 10-point -log(x) rule, 30 digits,
	// from testdata/moments_ref/rules.json (mpmath, see its README).
	const x0, w0 = "0.00904263096219965063694662745251", "0.120955131954570514988582388553"
	for _, args := range [][]string{
		{"build", "--moments", "log.txt", "--points", "10", "--digits", "30", "--format", "json"},
		{"build", "--moments", "log.txt", "--points", "5", "--digits", "30", "--format", "json"},
		{"build", "--weight", "-log(x)", "--interval", "0,1", "--points", "10", "--digits", "30", "--format", "json"},
		{"build", "--measure", "coin.txt", "--points", "2", "--digits", "20", "--format", "json"},
	} {
		out, errs, code := run(t, dir, args...)
		if code != 0 {
			t.Fatalf("%v: exit %d: %s", args, code, errs)
		}
		var rf struct {
			Points, Degree, Digits int
			Nodes, Weights         []string
		}
		if err := json.Unmarshal([]byte(out), &rf); err != nil {
			t.Fatalf("%v: %v", args, err)
		}
		n := 0
		fmt.Sscan(args[len(args)-5], &n)
		if rf.Points != n || rf.Degree != 2*n-1 {
			t.Errorf("%v: points %d degree %d", args, rf.Points, rf.Degree)
		}
		switch {
		case args[1] == "--measure":
			if rf.Nodes[0] != "0" || rf.Nodes[1] != "1.0000000000000000000" || rf.Weights[0] != "0.50000000000000000000" {
				t.Errorf("%v: %v %v", args, rf.Nodes, rf.Weights)
			}
		case n == 10:
			if rf.Nodes[0] != x0 || rf.Weights[0] != w0 {
				t.Errorf("%v: first node %s weight %s, want %s %s", args, rf.Nodes[0], rf.Weights[0], x0, w0)
			}
		}
	}
}

// TestMeasureInputErrors: every bad measure input exits 1 with one line
// on stderr naming it, nothing on stdout and no output file.
func TestMeasureInputErrors(t *testing.T) {
	files := map[string]string{
		"bad_line.txt":  "1\n1/4\n1/9 oops\n",
		"nan.txt":       "1\nNaN\n",
		"invalid.txt":   "1\n0\n1\n0\n1/2\n0\n",
		"negative.txt":  "0 1\n1 -0.25\n",
		"rounded.txt":   "1\n0.25\n0.111\n0.0625\n0.04\n0.0278\n",
		"short.txt":     "1\n1/4\n1/9\n",
		"two_point.txt": "0 1\n1 1\n",
	}
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"build", "--moments", "bad_line.txt", "--points", "1"}, "bad_line.txt, line 3"},
		{[]string{"build", "--moments", "nan.txt", "--points", "1"}, "nan.txt, line 2"},
		{[]string{"build", "--moments", "invalid.txt", "--points", "3", "--digits", "10"}, "beta_2"},
		{[]string{"build", "--measure", "negative.txt", "--points", "1"}, "negative.txt, line 2: mass -0.25 is negative"},
		{[]string{"build", "--moments", "rounded.txt", "--points", "3", "--digits", "30"}, "--digits 30: the input supports only"},
		{[]string{"build", "--moments", "rounded.txt", "--points", "3"}, "float64 mode needs 17"},
		{[]string{"build", "--moments", "short.txt", "--points", "2", "--digits", "10"}, "3 moments fix only 1"},
		{[]string{"build", "--measure", "two_point.txt", "--points", "3", "--digits", "10"}, "at most 2 points"},
		{[]string{"build", "--moments", "missing.txt", "--points", "2"}, "missing.txt"},
		{[]string{"build", "--weight", "-log(x)", "--points", "2"}, "--interval"},
		{[]string{"build", "--weight", "1/x", "--interval", "0,1", "--points", "2", "--digits", "10"}, "1/x"},
		{[]string{"build", "--weight", "x", "--interval", "-1,1", "--points", "2", "--digits", "10"}, "negative"},
		{[]string{"build", "--weight", "x^", "--interval", "0,1", "--points", "2"}, "position"},
		{[]string{"build", "--family", "legendre", "--weight", "1", "--points", "2"}, "exactly one"},
		{[]string{"build", "--moments", "short.txt", "--basis", "legendre", "--points", "1"}, "--basis legendre"},
		{[]string{"build", "--moments", "short.txt", "--basis", "spline", "--points", "1"}, `--basis "spline"`},
		{[]string{"moments", "--measure", "negative.txt"}, "line 2"},
		{[]string{"moments", "--weight", "-log(x)", "--interval", "0,1", "--count", "0"}, "--count"},
		{[]string{"recurrence", "--moments", "invalid.txt", "--count", "3"}, "beta_2"},
		{[]string{"recurrence", "--moments", "rounded.txt", "--count", "3", "--digits", "30"}, "supports only"},
	}
	for _, c := range cases {
		dir := t.TempDir()
		for name, content := range files {
			writeFile(t, dir, name, content)
		}
		expectInputError(t, dir, c.args, c.want)
	}
}

func TestMomentsAndRecurrenceCommands(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "log.txt", logMomentFile(8))
	cases := []struct {
		args []string
		want []string
	}{
		// 1/(k+1)^2 (Gradshteyn and Ryzhik 4.272) to 20 digits.
		{[]string{"moments", "--weight", "-log(x)", "--interval", "0,1", "--count", "3", "--digits", "20", "--format", "csv"},
			[]string{"k,moment", "0,1.0000000000000000000", "1,0.25000000000000000000", "2,0.11111111111111111111"}},
		// The same from the moment file, exactly.
		{[]string{"moments", "--moments", "log.txt", "--count", "3", "--digits", "20", "--format", "csv"},
			[]string{"0,1.0000000000000000000", "2,0.11111111111111111111"}},
		// Legendre on [-1,1]: beta_0 = 2, beta_1 = 1/3, beta_2 = 4/15,
		// alpha_k = 0 (Abramowitz and Stegun 22.7.10, monic form).
		{[]string{"recurrence", "--family", "legendre", "--count", "3", "--digits", "10", "--format", "csv"},
			[]string{"k,alpha,beta", "0,0,2.000000000", "1,0,0.3333333333", "2,0,0.2666666667"}},
		// -log(x): alpha_0 = 1/4, beta_1 = m2/m0 - (m1/m0)^2 = 1/9 - 1/16 = 7/144 (by hand).
		{[]string{"recurrence", "--moments", "log.txt", "--count", "2", "--digits", "12", "--format", "csv"},
			[]string{"0,0.250000000000,1.00000000000", "1,0.464285714286,0.0486111111111"}},
		{[]string{"recurrence", "--weight", "-log(x)", "--interval", "0,1", "--count", "2", "--digits", "12", "--format", "csv"},
			[]string{"0,0.250000000000,1.00000000000", "1,0.464285714286,0.0486111111111"}},
		// Weight 1 on [-1,1] in its own basis: nu = 2, 0, 0 (orthogonality).
		{[]string{"moments", "--weight", "1", "--interval", "-1,1", "--count", "3", "--out-basis", "legendre", "--digits", "10", "--format", "json"},
			[]string{`"basis": "legendre"`, `"2.000000000"`}},
	}
	for _, c := range cases {
		out, errs, code := run(t, dir, c.args...)
		if code != 0 {
			t.Errorf("%v: exit %d: %s", c.args, code, errs)
			continue
		}
		for _, w := range c.want {
			if !strings.Contains(out, w) {
				t.Errorf("%v: output lacks %q:\n%s", c.args, w, out)
			}
		}
	}
}

// TestMeasureExamplesRun runs every line of the Example blocks of the
// moments and recurrence commands.
func TestMeasureExamplesRun(t *testing.T) {
	for _, cmd := range []*cobra.Command{newMomentsCommand(), newRecurrenceCommand()} {
		for _, line := range strings.Split(cmd.Example, "\n") {
			args := splitArgs(strings.TrimSpace(line))
			if len(args) < 2 || args[0] != "quadwright" {
				continue
			}
			if _, errs, code := run(t, t.TempDir(), args[1:]...); code != 0 {
				t.Errorf("example %q: exit %d: %s", line, code, errs)
			}
		}
	}
}

// splitArgs splits a shell line on spaces, keeping double-quoted words
// together (enough for the examples).
func splitArgs(s string) []string {
	var out []string
	var cur strings.Builder
	quoted, have := false, false
	for _, r := range s {
		switch {
		case r == '"':
			quoted, have = !quoted, true
		case r == ' ' && !quoted:
			if have {
				out = append(out, cur.String())
				cur.Reset()
				have = false
			}
		default:
			cur.WriteRune(r)
			have = true
		}
	}
	if have {
		out = append(out, cur.String())
	}
	return out
}
