package export

import (
	"encoding/json"
	"go/format"
	"strings"
	"testing"

	"quadwright/rulefile"
)

// TestEveryDigitCarried checks that every value of the rule appears with
// all its digits in each language that promises them (every language for
// a rule of more than 17 digits), together with the provenance header.
func TestEveryDigitCarried(t *testing.T) {
	rules := map[string]*rulefile.File{
		"legendre-40": gaussFile(t, "1", "3", 7, 40),
		"element-2d":  element2D(),
	}
	for rname, f := range rules {
		tab, err := newTable(f, Options{})
		if err != nil {
			t.Fatal(err)
		}
		for _, lang := range Languages {
			out := render(t, f, lang, Options{Program: "quadwright 9.9", Package: "main"})
			for i, n := range tab.nodes {
				for _, c := range n {
					if !strings.Contains(out, c.plain()) {
						t.Errorf("%s/%s: node %d value %s missing", rname, lang, i+1, c.plain())
					}
				}
				if !strings.Contains(out, tab.weights[i].plain()) {
					t.Errorf("%s/%s: weight %d missing", rname, lang, i+1)
				}
			}
			if lang == "csv" || lang == "json" {
				continue
			}
			for _, want := range []string{caution, "exported by quadwright 9.9", "points:   " + itoa(len(f.Nodes)), "degree:   " + itoa(f.Degree), "digits:   " + itoa(f.Digits)} {
				if !strings.Contains(out, want) {
					t.Errorf("%s/%s: header lacks %q", rname, lang, want)
				}
			}
		}
	}
}

func itoa(i int) string { b, _ := json.Marshal(i); return string(b) }

// TestFloat64ModeHasNoExtendedVariant: a float64-mode rule (digits 0,
// shortest doubles) gets the double arrays only.
func TestFloat64ModeHasNoExtendedVariant(t *testing.T) {
	f := gaussFile(t, "-1", "1", 4, 0)
	for lang, extended := range map[string]string{"c": "long double", "cpp": "long double", "fortran": "real128", "go": "Digits", "python": "Decimal", "julia": "BigFloat"} {
		out := render(t, f, lang, Options{})
		if strings.Contains(out, extended) {
			t.Errorf("%s: float64-mode rule has an extended variant (%q)", lang, extended)
		}
		if !strings.Contains(out, "float64 mode") {
			t.Errorf("%s: header does not say float64 mode", lang)
		}
	}
}

func TestNames(t *testing.T) {
	cases := []struct {
		name string
		ok   bool
	}{
		{"gauss5", true}, {"G", true}, {"lobatto_12", true}, {"a_b_c", true},
		{"", false}, {"5gauss", false}, {"_x", false}, {"gauss-5", false}, {"gauß", false},
		{"a b", false}, {strings.Repeat("a", 49), false}, {strings.Repeat("a", 48), true},
	}
	for _, c := range cases {
		err := ValidateName("--name", c.name)
		if (err == nil) != c.ok {
			t.Errorf("%q: error %v, want ok=%v", c.name, err, c.ok)
		}
		if err != nil && (!strings.HasPrefix(err.Error(), "--name") || strings.Contains(err.Error(), "\n")) {
			t.Errorf("%q: error %q does not name the flag in one line", c.name, err)
		}
	}
	if ValidatePackage("--package", "func") == nil || ValidatePackage("--package", "quad") != nil {
		t.Error("package validation")
	}
	for kind, want := range map[string]string{"gauss": "gauss", "anti-gauss": "anti_gauss", "unknown": "rule", "": "rule", "Radau": "radau", "9x": "x"} {
		if got := defaultName(kind); got != want {
			t.Errorf("defaultName(%q) = %q, want %q", kind, got, want)
		}
	}
	for p, want := range map[string]string{"gauss": "Gauss", "anti_gauss": "AntiGauss", "lobatto5": "Lobatto5", "a__b": "AB"} {
		if got := goName(p); got != want {
			t.Errorf("goName(%q) = %q, want %q", p, got, want)
		}
	}
}

func TestWriteErrors(t *testing.T) {
	good := element2D()
	bad := *good
	bad.Weights = []string{"1", "1", "1", "zz"}
	short := *good
	short.Weights = short.Weights[:2]
	huge := *good
	huge.Weights = []string{"1", "1", "1", "1e999"}
	cases := []struct {
		f    *rulefile.File
		lang string
		opt  Options
		want string
	}{
		{good, "cobol", Options{}, `--to "cobol"`},
		{good, "c", Options{Name: "1x"}, `--name "1x"`},
		{good, "go", Options{Package: "type"}, `--package "type"`},
		{&bad, "c", Options{}, "weight 4"},
		{&short, "c", Options{}, "4 nodes and 2 weights"},
		{&huge, "fortran", Options{}, "beyond the range of a double"},
	}
	for _, c := range cases {
		var b strings.Builder
		err := Write(&b, c.f, c.lang, c.opt)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %q", c.lang, err, c.want)
		}
		if b.Len() != 0 {
			t.Errorf("%s: wrote %d bytes before failing", c.lang, b.Len())
		}
	}
}

// TestHeaderCannotBreakOut feeds a rule file whose text fields try to end
// the comment; every header line must stay a comment.
func TestHeaderCannotBreakOut(t *testing.T) {
	f := element2D()
	f.Weight = "1\n#include <evil.h>\r\nint x; */ ??/"
	f.Measure = "bad\\"
	f.Report = json.RawMessage(`{"negative_weights": 2, "stability_factor": "1.8", "nodes_outside": 0}`)
	markers := map[string]string{"c": "//", "cpp": "//", "go": "//", "fortran": "!", "python": "#", "julia": "#"}
	for lang, m := range markers {
		out := render(t, f, lang, Options{})
		for _, line := range strings.Split(out, "\n") {
			if strings.Contains(line, "evil") && !strings.HasPrefix(line, m) {
				t.Errorf("%s: header text escaped the comment: %q", lang, line)
			}
			if strings.HasPrefix(line, m) && (strings.HasSuffix(line, "\\") || strings.Contains(line, "*/") || strings.Contains(line, "??/")) {
				t.Errorf("%s: comment line can splice or close: %q", lang, line)
			}
		}
		if !strings.Contains(out, "report:   negative weights 2, stability factor 1.8, nodes outside 0") {
			t.Errorf("%s: report summary missing:\n%s", lang, out)
		}
	}
}

func TestGoOutputIsGofmtClean(t *testing.T) {
	for _, f := range []*rulefile.File{gaussFile(t, "0", "2", 5, 30), element2D(), gaussFile(t, "-1", "1", 3, 0)} {
		out := render(t, f, "go", Options{Name: "panel"})
		got, err := format.Source([]byte(out))
		if err != nil {
			t.Fatalf("not valid Go: %v\n%s", err, out)
		}
		if string(got) != out {
			t.Errorf("not gofmt-clean:\n%s", out)
		}
		if !strings.HasPrefix(out, "// Code generated by quadwright export; DO NOT EDIT.\n") {
			t.Errorf("generated-code line missing:\n%s", out[:80])
		}
	}
}

func TestJuliaSyntax(t *testing.T) {
	for _, f := range []*rulefile.File{gaussFile(t, "0", "2", 5, 30), element2D(), gaussFile(t, "-1", "1", 3, 0), fractionTable(t)} {
		out := render(t, f, "julia", Options{})
		if err := checkJulia(out); err != nil {
			t.Errorf("%v\n%s", err, out)
		}
	}
	for _, bad := range []string{"x = [1.0, 2.0", "x = [1.0, 2..0]", "y = f(1.0]", "z = setprecision(BigFloat, 10) do\n [1.0]\n", `w = [parse(BigFloat, "1.x")]`} {
		if checkJulia(bad) == nil {
			t.Errorf("checkJulia accepted %q", bad)
		}
	}
}

// fractionTable is a rule table with exact fractions: Simpson's rule on
// [-1, 1] (from memory: weights 1/3, 4/3, 1/3).
func fractionTable(t testing.TB) *rulefile.File {
	f, err := rulefile.Parse("simpson.txt", []byte("-1 1/3\n0 4/3\n1 1/3\n"))
	if err != nil {
		t.Fatal(err)
	}
	return f
}

func TestTableInput(t *testing.T) {
	f := fractionTable(t)
	out := render(t, f, "c", Options{})
	for _, want := range []string{"enum { rule_points = 3 };", "0.3333333333333333333333333333333333333333L", "1.333333333333333333333333333333333333333Q", "0.3333333333333333,", "degree:   not recorded"} {
		if !strings.Contains(out, want) {
			t.Errorf("C from a table lacks %q:\n%s", want, out)
		}
	}
	js := render(t, f, "json", Options{})
	g, err := rulefile.Parse("norm.json", []byte(js))
	if err != nil {
		t.Fatalf("normalised JSON does not read back: %v\n%s", err, js)
	}
	if g.Digits != fractionDigits || g.Weights[1] != "1.333333333333333333333333333333333333333" || g.Nodes[0][0] != "-1" {
		t.Errorf("normalised JSON: %+v", g)
	}
	csv := render(t, element2D(), "csv", Options{})
	if !strings.HasPrefix(csv, "x,y,weight\n-0.577350269189625764509148780502,-0.577350269189625764509148780502,1.00000000000000000000000000000\n") {
		t.Errorf("element csv:\n%s", csv)
	}
}

func TestFortranLineLimits(t *testing.T) {
	// 300-digit values force literals split inside the token; 600 nodes
	// force the data-statement form (beyond 255 continuation lines).
	long := "0." + strings.Repeat("1234567890", 30)
	var tab strings.Builder
	for i := 1; i <= 3; i++ {
		tab.WriteString(itoa(i) + long[1:] + " " + long + "\n")
	}
	big := &strings.Builder{}
	for i := 1; i <= 600; i++ {
		big.WriteString("0." + itoa(1000+i) + "123456789012345678901234567890123 0.5\n")
	}
	for name, src := range map[string]string{"long": tab.String(), "many": big.String()} {
		f, err := rulefile.Parse(name, []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		out := render(t, f, "fortran", Options{})
		for _, line := range strings.Split(out, "\n") {
			if len(line) > 132 {
				t.Fatalf("%s: line of %d characters: %q", name, len(line), line)
			}
		}
		if name == "many" && !strings.Contains(out, "protected :: rule_nodes_q(600)") {
			t.Errorf("many: no data-statement form")
		}
		if name == "long" && !strings.Contains(out, "&\n    &") {
			t.Errorf("long: no token continuation")
		}
	}
}

func TestFortranNotesSubnormals(t *testing.T) {
	f, err := rulefile.Parse("tiny", []byte("0 1e-320\n1 1\n2 1e-400\n"))
	if err != nil {
		t.Fatal(err)
	}
	out := render(t, f, "fortran", Options{})
	if !strings.Contains(out, "! note:     1 values lie below the normal real64 range") {
		t.Errorf("no subnormal note:\n%s", out)
	}
}

func FuzzValidateName(f *testing.F) {
	for _, s := range []string{"gauss", "", "1x", "a_b", "ü", strings.Repeat("z", 60)} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		err := ValidateName("--name", s)
		if err != nil {
			if strings.Contains(err.Error(), "\n") {
				t.Fatalf("multi-line error %q", err)
			}
			return
		}
		// An accepted name must give a valid identifier in every language.
		out := render(t, element2D(), "go", Options{Name: s})
		if _, err := format.Source([]byte(out)); err != nil {
			t.Fatalf("name %q gives invalid Go: %v", s, err)
		}
		if err := checkJulia(render(t, element2D(), "julia", Options{Name: s})); err != nil {
			t.Fatalf("name %q gives invalid Julia: %v", s, err)
		}
	})
}
