package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// elementAudit is the part of an element audit report the tests read.
type elementAudit struct {
	Points, Degree, NegativeWeights, NodesOutside int
	StabilityFactor, LostDigits                   float64
	Weight                                        string
	Symmetry                                      struct {
		Group      string
		GroupOrder int `json:"group_order"`
		Order      int
	}
}

func elementAuditJSON(t *testing.T, dir string, args ...string) (elementAudit, map[string]any, int) {
	t.Helper()
	out, errs, code := run(t, dir, append([]string{"audit", "--format", "json"}, args...)...)
	if code != 0 && code != 2 {
		t.Fatalf("audit %v: exit %d: %s", args, code, errs)
	}
	var rep elementAudit
	var raw map[string]any
	if err := json.Unmarshal([]byte(out), &raw); err != nil {
		t.Fatalf("audit %v: %v\n%s", args, err, out)
	}
	dec := json.NewDecoder(strings.NewReader(out))
	if err := dec.Decode(&rep); err != nil {
		t.Fatal(err)
	}
	rep.NegativeWeights = int(raw["negative_weights"].(float64))
	rep.NodesOutside = int(raw["nodes_outside"].(float64))
	rep.StabilityFactor = raw["stability_factor"].(float64)
	rep.LostDigits = raw["lost_digits"].(float64)
	return rep, raw, code
}

func TestElementWeightedAndAudit(t *testing.T) {
	dir := t.TempDir()
	// The radius weight x on the triangle (axisymmetric elements).
	_, errs, code := run(t, dir, "element", "--shape", "triangle", "--degree", "4", "--weight", "x", "--digits", "25", "--format", "json", "-o", "tx.json")
	if code != 0 {
		t.Fatalf("element --weight x: exit %d: %s", code, errs)
	}
	var rf struct {
		Kind, Weight string
		Degree       int
		Nodes        [][]string
	}
	b, _ := os.ReadFile(filepath.Join(dir, "tx.json"))
	if err := json.Unmarshal(b, &rf); err != nil || rf.Kind != "weighted" || rf.Weight != "x" || rf.Degree != 4 || len(rf.Nodes[0]) != 2 {
		t.Fatalf("rule file: %+v (%v)", rf, err)
	}
	// The audit takes the file's own weight; against weight 1 the same
	// rule fails at degree 0 (its weights sum to 1/6, the triangle's area
	// is 1/2).
	rep, raw, _ := elementAuditJSON(t, dir, "tx.json")
	for _, k := range []string{"points", "degree", "negative_weights", "stability_factor", "nodes_outside", "lost_digits"} {
		if _, ok := raw[k]; !ok {
			t.Errorf("audit JSON lacks %q", k)
		}
	}
	if rep.Degree < 4 || rep.Weight != "x" || rep.NegativeWeights != 0 || rep.NodesOutside != 0 || rep.StabilityFactor != 1 || rep.LostDigits != 0 {
		t.Errorf("audit of the weighted rule: %+v", rep)
	}
	rep, _, _ = elementAuditJSON(t, dir, "tx.json", "--weight", "1")
	if rep.Degree != -1 {
		t.Errorf("audit against weight 1: degree %d, want -1", rep.Degree)
	}

	// A moment table: exact moments of weight 1 (a! b! / (a+b+2)!).
	table := "# weight 1 on the triangle\n0 0 1/2\n1 0 1/6\n0 1 1/6\n2 0 1/12\n1 1 1/24\n0 2 1/12\n"
	os.WriteFile(filepath.Join(dir, "m.txt"), []byte(table), 0o644)
	out, errs, code := run(t, dir, "element", "--shape", "triangle", "--degree", "2", "--moments", "m.txt", "--digits", "30")
	if code != 0 || !strings.Contains(out, "# weight:   the weight whose moments are listed in m.txt") /* issue 19: no moments(FILE) labels */ || !strings.Contains(out, "# degree:   2") {
		t.Errorf("element --moments: exit %d %s\n%s", code, errs, out)
	}
}

func TestElementWeightedBadInput(t *testing.T) {
	dir := t.TempDir()
	write := func(name, text string) {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	write("bad.txt", "0 0 1/2\n1 0 x\n")
	write("short.txt", "0 0 1/2\n1 0 1/6\n0 1 1/6\n")
	write("digits.txt", "0 0 0.50000000000\n1 0 0.16666666667\n0 1 0.16666666667\n")
	el := func(args ...string) []string { return append([]string{"element"}, args...) }
	for _, c := range []struct {
		args []string
		want string
	}{
		{el("--shape", "triangle", "--degree", "2", "--weight", "x^^2"), "position 3"},
		{el("--shape", "triangle", "--degree", "2", "--weight", "x*z"), "unknown name \"z\""},
		{el("--shape", "quadrilateral", "--degree", "2", "--weight", "x"), "is negative at"},
		{el("--shape", "triangle", "--degree", "2", "--weight", "x", "--product"), "--product"},
		{el("--shape", "triangle", "--degree", "2", "--moments", "bad.txt"), "bad.txt, line 2"},
		{el("--shape", "triangle", "--degree", "2", "--moments", "short.txt"), "x^2 y^0"},
		{el("--shape", "triangle", "--degree", "1", "--moments", "digits.txt", "--digits", "20"), "support only 11"},
		{el("--shape", "triangle", "--degree", "1", "--moments", "missing.txt"), "missing.txt"},
		{el("--shape", "triangle", "--degree", "2", "--moments", "short.txt", "--weight", "x"), "choose one"},
	} {
		expectInputError(t, dir, c.args, c.want)
	}
}

func TestAuditElementRules(t *testing.T) {
	dir := t.TempDir()
	build := func(name string, args ...string) {
		_, errs, code := run(t, dir, append([]string{"element", "--format", "json", "-o", name}, args...)...)
		if code != 0 {
			t.Fatalf("element %v: exit %d: %s", args, code, errs)
		}
	}
	// The collapsed 3x3 product on the triangle is exact through degree
	// 2*3-1 = 5 (Stroud 1971) and, as x = u(1-v), y = v with the
	// Gauss-Legendre u symmetric under u -> 1-u, invariant under exactly
	// one reflection besides the identity, (x,y) -> (1-x-y,y); the
	// 3x3 tensor product on the square has all 8 of D4; the catalogued
	// 15-point degree-7 triangle rule all 6 of S3.
	build("tri.json", "--shape", "triangle", "--degree", "4", "--product")
	build("quad.json", "--shape", "quadrilateral", "--degree", "5", "--digits", "30")
	build("sym.json", "--shape", "triangle", "--degree", "7", "--digits", "30")
	build("hex.json", "--shape", "hexahedron", "--degree", "3")
	if out, _, _ := run(t, dir, "audit", "tri.json"); !strings.Contains(out, "(x,y) -> (1-x-y,y)") {
		t.Errorf("collapsed rule: the reflection is not named:\n%s", out)
	}
	for _, c := range []struct {
		file          string
		degree, order int
		group         string
		groupOrder    int
	}{
		{"tri.json", 5, 2, "S3", 6},
		{"quad.json", 5, 8, "D4", 8},
		{"sym.json", 7, 6, "S3", 6},
		{"hex.json", 3, 48, "Oh", 48},
	} {
		rep, _, code := elementAuditJSON(t, dir, c.file)
		if code != 0 || rep.Degree != c.degree || rep.Symmetry.Order != c.order || rep.Symmetry.Group != c.group || rep.Symmetry.GroupOrder != c.groupOrder {
			t.Errorf("%s: exit %d, %+v; want degree %d, symmetry order %d of %s", c.file, code, rep, c.degree, c.order, c.group)
		}
	}
	// One node moved outside the square: nodes_outside 1, and the
	// degree falls; --fail-on outside exits 2.
	b, _ := os.ReadFile(filepath.Join(dir, "quad.json"))
	var rf map[string]any
	json.Unmarshal(b, &rf)
	rf["nodes"].([]any)[0].([]any)[0] = "-1.5"
	b, _ = json.Marshal(rf)
	os.WriteFile(filepath.Join(dir, "moved.json"), b, 0o644)
	rep, _, code := elementAuditJSON(t, dir, "moved.json", "--fail-on", "outside")
	if code != 2 || rep.NodesOutside != 1 || rep.Degree >= 1 || rep.Symmetry.Order == 8 {
		t.Errorf("moved node: exit %d, %+v", code, rep)
	}
	// A text table of "x y weight" lines needs --shape.
	os.WriteFile(filepath.Join(dir, "centroid.txt"), []byte("1/3 1/3 1/2\n"), 0o644)
	rep, _, code = elementAuditJSON(t, dir, "centroid.txt", "--shape", "triangle")
	if code != 0 || rep.Degree != 1 || rep.Symmetry.Order != 6 {
		t.Errorf("centroid rule: exit %d, %+v; want degree 1, fully symmetric", code, rep)
	}
	// Without --shape the table's weights, summing to the triangle's area
	// with the node inside it, name the triangle (issue 19: every output
	// of element audits without flags); a table that fits no element
	// still needs --shape.
	if rep, _, code = elementAuditJSON(t, dir, "centroid.txt"); code != 0 || rep.Symmetry.Group != "S3" || rep.Degree != 1 {
		t.Errorf("centroid rule without --shape: exit %d, %+v", code, rep)
	}
	os.WriteFile(filepath.Join(dir, "unnamed.txt"), []byte("0.2 0.2 1\n"), 0o644)
	expectInputError(t, dir, []string{"audit", "unnamed.txt"}, "--shape")
	expectInputError(t, dir, []string{"audit", "quad.json", "--family", "legendre"}, "--family")
	out, errs, code := run(t, dir, "audit", "sym.json")
	if code != 0 || !strings.Contains(out, "fully symmetric") || !strings.Contains(out, "degree:            7") {
		t.Errorf("text audit: exit %d %s\n%s", code, errs, out)
	}
	_, errs, code = run(t, dir, "audit", "sym.json", "--format", "html", "-o", "sym.html")
	if h, _ := os.ReadFile(filepath.Join(dir, "sym.html")); code != 0 || !strings.Contains(string(h), "<svg") {
		t.Errorf("html audit: exit %d %s", code, errs)
	}
}
