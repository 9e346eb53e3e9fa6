package main

import (
	"encoding/json"
	"fmt"
	"math"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// newtonCotesTable writes the closed 11-point Newton-Cotes rule on [-1, 1]
// as a text table of exact fractions, the weights from sum_i w_i x_i^k =
// 2/(k+1) (k even; 0 for k odd), k <= 10, solved exactly on big.Rat, and
// returns the exact stability factor sum |w| / |sum w|.
func newtonCotesTable(t *testing.T, path string) float64 {
	t.Helper()
	const n = 11
	x := make([]*big.Rat, n)
	a := make([][]*big.Rat, n)
	for i := range x {
		x[i] = big.NewRat(int64(2*i-(n-1)), n-1)
	}
	for k := 0; k < n; k++ {
		a[k] = make([]*big.Rat, n+1)
		for i := 0; i < n; i++ {
			p := big.NewRat(1, 1)
			for j := 0; j < k; j++ {
				p.Mul(p, x[i])
			}
			a[k][i] = p
		}
		a[k][n] = new(big.Rat)
		if k%2 == 0 {
			a[k][n].SetFrac64(2, int64(k+1))
		}
	}
	for c := 0; c < n; c++ {
		for r := c + 1; a[c][c].Sign() == 0; r++ {
			a[c], a[r] = a[r], a[c]
		}
		for r := 0; r < n; r++ {
			if r != c && a[r][c].Sign() != 0 {
				f := new(big.Rat).Quo(a[r][c], a[c][c])
				for j := c; j <= n; j++ {
					a[r][j].Sub(a[r][j], new(big.Rat).Mul(f, a[c][j]))
				}
			}
		}
	}
	var b strings.Builder
	b.WriteString("# closed Newton-Cotes, 11 points on [-1,1], exact weights\nnode,weight\n")
	abs, sum := new(big.Rat), new(big.Rat)
	for i := 0; i < n; i++ {
		w := new(big.Rat).Quo(a[i][n], a[i][i])
		abs.Add(abs, new(big.Rat).Abs(w))
		sum.Add(sum, w)
		fmt.Fprintf(&b, "%s, %s\n", x[i].RatString(), w.RatString())
	}
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	f, _ := new(big.Rat).Quo(abs, sum.Abs(sum)).Float64()
	return f
}

func auditJSON(t *testing.T, out string) map[string]any {
	t.Helper()
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("not JSON: %v\n%s", err, out)
	}
	for _, k := range []string{"points", "degree", "negative_weights", "stability_factor", "nodes_outside", "lost_digits"} {
		if _, ok := m[k]; !ok {
			t.Errorf("key %q missing", k)
		}
	}
	return m
}

func TestAuditNewtonCotes(t *testing.T) {
	dir := t.TempDir()
	factor := newtonCotesTable(t, filepath.Join(dir, "nc11.txt"))
	out, errs, code := run(t, dir, "audit", "nc11.txt", "--interval", "-1,1", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	m := auditJSON(t, out)
	if m["points"] != 11.0 || m["negative_weights"] != 4.0 || m["degree"] != 11.0 || m["nodes_outside"] != 0.0 {
		t.Errorf("points %v negative %v degree %v outside %v", m["points"], m["negative_weights"], m["degree"], m["nodes_outside"])
	}
	if f := m["stability_factor"].(float64); math.Abs(f-factor) > 1e-15*factor {
		t.Errorf("stability factor %v, exact %v", f, factor)
	}
	if l := m["lost_digits"].(float64); math.Abs(l-math.Log10(factor)) > 1e-14 {
		t.Errorf("lost digits %v, want %v", l, math.Log10(factor))
	}
	// --fail-on: the report is still written, and the exit status is 2.
	_, errs, code = run(t, dir, "audit", "nc11.txt", "--interval", "-1,1", "--fail-on", "negative,degree<5", "-o", "r.txt")
	if code != 2 || !strings.Contains(errs, "4 negative weights") || strings.Contains(errs, "degree 11 <") {
		t.Errorf("--fail-on negative: exit %d, stderr %q", code, errs)
	}
	if b, err := os.ReadFile(filepath.Join(dir, "r.txt")); err != nil || !strings.Contains(string(b), "4 negative") || !strings.Contains(string(b), "Caution") {
		t.Errorf("report file: %v\n%s", err, b)
	}
	_, errs, code = run(t, dir, "audit", "nc11.txt", "--interval", "-1,1", "--quick", "--fail-on", "lost>0.2")
	if code != 2 || !strings.Contains(errs, "lost digits") {
		t.Errorf("--fail-on lost>0.2: exit %d, stderr %q", code, errs)
	}
}

func TestAuditBuiltRule(t *testing.T) {
	dir := t.TempDir()
	for _, n := range []int{3, 7} {
		file := fmt.Sprintf("j%d.json", n)
		if _, errs, code := run(t, dir, "build", "--family", "jacobi", "--alpha", "0.5", "--beta", "-0.25", "--points", fmt.Sprint(n), "--digits", "25", "--format", "json", "-o", file); code != 0 {
			t.Fatalf("build: %s", errs)
		}
		out, errs, code := run(t, dir, "audit", file, "--format", "json", "--fail-on", fmt.Sprintf("negative,outside,degree<%d,lost>0", 2*n-1))
		if code != 0 {
			t.Fatalf("exit %d: %s", code, errs)
		}
		m := auditJSON(t, out)
		if m["degree"] != float64(2*n-1) || m["negative_weights"] != 0.0 || m["stability_factor"] != 1.0 || m["lost_digits"] != 0.0 || m["measure"] != "jacobi(alpha=0.5, beta=-0.25)" {
			t.Errorf("N=%d: %v", n, m)
		}
		if _, errs, code = run(t, dir, "audit", file, "--quick", "--fail-on", fmt.Sprintf("degree<%d", 2*n)); code != 2 || !strings.Contains(errs, fmt.Sprintf("degree %d < %d", 2*n-1, 2*n)) {
			t.Errorf("N=%d --fail-on degree<%d: exit %d %q", n, 2*n, code, errs)
		}
	}
	// The same rule audited against another measure fails at constants.
	out, _, code := run(t, dir, "audit", "j3.json", "--family", "legendre", "--format", "json", "--quick")
	if m := auditJSON(t, out); code != 0 || m["degree"] != -1.0 {
		t.Errorf("against legendre: exit %d degree %v", code, m["degree"])
	}
}

func TestAuditHTMLFile(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "simpson.txt"), []byte("0 1/6\n0.5 2/3\n1 1/6\n"), 0o644)
	out, errs, code := run(t, dir, "audit", "simpson.txt", "--interval", "0,1", "--format", "html", "-o", "s.html")
	if code != 0 || out != "" {
		t.Fatalf("exit %d: %s %s", code, errs, out)
	}
	b, err := os.ReadFile(filepath.Join(dir, "s.html"))
	if err != nil {
		t.Fatal(err)
	}
	page := string(b)
	if strings.Count(page, "<svg") != 3 || !strings.Contains(page, "simpson.txt") || !strings.Contains(page, "Caution") {
		t.Errorf("page:\n%.3000s", page)
	}
	// Simpson's rule: degree 3 (Abramowitz and Stegun 25.4.5).
	if !strings.Contains(page, "<td>3 (tested") {
		t.Errorf("degree 3 not reported")
	}
}

// TestAuditBadInput: every bad rule file or flag gives exit 1, one line on
// stderr naming the input, nothing on stdout and no output file.
func TestAuditBadInput(t *testing.T) {
	files := map[string]string{
		"empty.txt":   "",
		"garbage.txt": "0 1\n0.5 abc\n",
		"one.txt":     "0 1\n0.5\n",
		"dup.txt":     "0 1\n0.00 1\n",
		"nan.txt":     "0 1\nnan 1\n",
		"inf.txt":     "0 1\n1 inf\n",
		"ok.txt":      "-0.5 1\n0.5 1\n",
	}
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"empty.txt", "--interval", "-1,1"}, "empty.txt: is empty"},
		{[]string{"garbage.txt", "--interval", "-1,1"}, "line 2"},
		{[]string{"one.txt", "--interval", "-1,1"}, "line 2"},
		{[]string{"dup.txt", "--interval", "-1,1"}, "nodes 1 and 2"},
		{[]string{"nan.txt", "--interval", "-1,1"}, "line 2"},
		{[]string{"inf.txt", "--interval", "-1,1"}, "line 2"},
		{[]string{"missing.txt", "--interval", "-1,1"}, "missing.txt"},
		{[]string{"ok.txt"}, "--interval"},
		{[]string{"ok.txt", "--interval", "-1,1", "--fail-on", "bogus"}, `--fail-on "bogus"`},
		{[]string{"ok.txt", "--interval", "-1,1", "--fail-on", "degree<x"}, `--fail-on "degree<x"`},
		{[]string{"ok.txt", "--interval", "-1,1", "--tolerance", "0"}, "--tolerance 0"},
		{[]string{"ok.txt", "--interval", "-1,1", "--format", "xml"}, `--format "xml"`},
		{[]string{"ok.txt", "--family", "fibonacci"}, `"fibonacci"`},
	}
	for _, c := range cases {
		dir := t.TempDir()
		for name, data := range files {
			os.WriteFile(filepath.Join(dir, name), []byte(data), 0o644)
		}
		args := append([]string{"audit"}, append(c.args, "-o", "out.txt")...)
		out, errs, code := run(t, dir, args...)
		if code != 1 || !strings.Contains(errs, c.want) || strings.Count(strings.TrimSpace(errs), "\n") != 0 || out != "" {
			t.Errorf("%v: exit %d, stdout %q, stderr %q (want %q)", c.args, code, out, errs, c.want)
		}
		if _, err := os.Stat(filepath.Join(dir, "out.txt")); err == nil {
			t.Errorf("%v: output file written", c.args)
		}
	}
}

func TestBuildAttachesReport(t *testing.T) {
	out, errs, code := run(t, t.TempDir(), "build", "--family", "legendre", "--points", "5", "--digits", "20", "--format", "json")
	if code != 0 {
		t.Fatal(errs)
	}
	var rf struct {
		Report map[string]any `json:"report"`
	}
	if err := json.Unmarshal([]byte(out), &rf); err != nil {
		t.Fatal(err)
	}
	if rf.Report["negative_weights"] != 0.0 || rf.Report["stability_factor"] != 1.0 || rf.Report["degree"] != 9.0 {
		t.Errorf("report %v", rf.Report)
	}
	out, _, _ = run(t, t.TempDir(), "build", "--family", "legendre", "--points", "5")
	if !strings.Contains(out, "# report:   0 negative weights, stability factor 1") {
		t.Errorf("text:\n%s", out)
	}
}

func FuzzParseFailOn(f *testing.F) {
	f.Add("negative,outside,degree<7,lost>2.5")
	f.Add("degree<")
	f.Add("lost>nan")
	f.Fuzz(func(t *testing.T, s string) {
		checks, err := parseFailOn(s)
		if err == nil {
			for _, c := range checks {
				if c.kind == "lost" && !(c.lost >= 0) {
					t.Fatalf("accepted %q as lost > %v", s, c.lost)
				}
			}
		} else if strings.Contains(err.Error(), "\n") {
			t.Fatalf("error of more than one line: %q", err)
		}
	})
}

// TestAuditPerturbedWeight is the acceptance case: a Gauss rule
// with one weight changed in its 8th significant digit reports a degree of
// at most 1, and --fail-on degree<19 then exits 2.
func TestAuditPerturbedWeight(t *testing.T) {
	dir := t.TempDir()
	if _, errs, code := run(t, dir, "build", "--family", "legendre", "--points", "10", "--digits", "30", "--format", "json", "-o", "g.json"); code != 0 {
		t.Fatal(errs)
	}
	b, _ := os.ReadFile(filepath.Join(dir, "g.json"))
	var rf map[string]any
	if err := json.Unmarshal(b, &rf); err != nil {
		t.Fatal(err)
	}
	ws := rf["weights"].([]any)
	w := []byte(ws[3].(string)) // 0.2692667193..., 8th significant digit at index 9
	w[9] = '0' + (w[9]-'0'+1)%10
	ws[3] = string(w)
	b, _ = json.Marshal(rf)
	os.WriteFile(filepath.Join(dir, "p.json"), b, 0o644)
	out, errs, code := run(t, dir, "audit", "p.json", "--format", "json", "--quick", "--fail-on", "degree<19")
	if code != 2 || !strings.Contains(errs, "degree") {
		t.Errorf("exit %d, stderr %q", code, errs)
	}
	if m := auditJSON(t, out); m["degree"].(float64) > 1 {
		t.Errorf("perturbed rule: degree %v, want at most 1", m["degree"])
	}
}
