package export

import (
	"fmt"
	"io"
	"strings"

	"quadwright/precision"
	"quadwright/rulefile"
)

// Languages lists the targets of Write, in the order the help text gives them.
var Languages = []string{"c", "cpp", "fortran", "go", "python", "julia", "csv", "json"}

// Options says how a rule is written.
type Options struct {
	// Name is the identifier prefix: the arrays are Name_nodes and
	// Name_weights (Go: NameNodes, NameWeights). "" derives it from the
	// rule's kind ("gauss", "anti_gauss"; "rule" for a plain table).
	Name string
	// Package is the Go package clause; "" gives "rules".
	Package string
	// Program is the exporting program, "quadwright <version>", for the header.
	Program string
	// Source names the rule file the rule was read from, for the header ("" to omit).
	Source string
}

// maxNameLen keeps Name_weights_q within Fortran's 63-character names.
const maxNameLen = 48

// ValidateName checks an identifier prefix given by the user: a letter,
// then letters, digits and underscores, at most 48 characters (so that
// every derived name is valid in every target language, Fortran included).
// The error is one sentence naming the flag and the value.
func ValidateName(flag, name string) error {
	if name == "" {
		return fmt.Errorf("%s \"\": give an identifier such as gauss5", flag)
	}
	if len(name) > maxNameLen {
		return fmt.Errorf("%s %q: at most %d characters", flag, clip(name), maxNameLen)
	}
	for i, r := range name {
		ok := r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || i > 0 && (r >= '0' && r <= '9' || r == '_')
		if !ok {
			return fmt.Errorf("%s %q: character %d %q is not allowed; an identifier starts with a letter and holds only letters, digits and underscores", flag, clip(name), i+1, r)
		}
	}
	return nil
}

// goKeywords are the Go keywords, which a package clause cannot use.
var goKeywords = map[string]bool{
	"break": true, "case": true, "chan": true, "const": true, "continue": true, "default": true,
	"defer": true, "else": true, "fallthrough": true, "for": true, "func": true, "go": true,
	"goto": true, "if": true, "import": true, "interface": true, "map": true, "package": true,
	"range": true, "return": true, "select": true, "struct": true, "switch": true, "type": true, "var": true,
}

// ValidatePackage checks a Go package name: an identifier (as ValidateName
// checks it) that is not a Go keyword.
func ValidatePackage(flag, name string) error {
	if err := ValidateName(flag, name); err != nil {
		return err
	}
	if goKeywords[name] {
		return fmt.Errorf("%s %q: a Go keyword cannot name a package", flag, name)
	}
	return nil
}

// Write renders f in lang (one of Languages) to w. It fails, with one
// sentence naming the problem, on an unknown language, a bad Options.Name or
// Options.Package, or a rule whose values are not numbers or do not fit a
// double; nothing is written to w then. f is not modified.
func Write(w io.Writer, f *rulefile.File, lang string, opt Options) error {
	write, ok := writers[lang]
	if !ok {
		return fmt.Errorf("--to %q: choose one of %s", lang, strings.Join(Languages, ", "))
	}
	t, err := newTable(f, opt)
	if err != nil {
		return err
	}
	var b strings.Builder
	if err := write(&b, t); err != nil {
		return err
	}
	_, err = io.WriteString(w, b.String())
	return err
}

var writers = map[string]func(*strings.Builder, *table) error{
	"c":       writeC,
	"cpp":     writeCPP,
	"fortran": writeFortran,
	"go":      writeGo,
	"python":  writePython,
	"julia":   writeJulia,
	"csv":     writeCSV,
	"json":    writeJSON,
}

// table is a rule prepared for writing: every value parsed once.
type table struct {
	f       *rulefile.File
	opt     Options
	name    string      // identifier prefix
	dim     int         // coordinates per node
	nodes   [][]literal // nodes[i][c]
	weights []literal
	// digits is the rule's own D: the largest number of significant digits
	// among its decimals (fractions p/q do not count).
	digits int
	// extended is true when a float64 cannot carry every digit: more than
	// 17 digits, or an exact fraction.
	extended bool
	// fracDigits is the number of digits exact fractions were rounded to;
	// 0 when the rule has none.
	fracDigits int
}

func newTable(f *rulefile.File, opt Options) (*table, error) {
	if len(f.Nodes) == 0 || len(f.Nodes) != len(f.Weights) {
		return nil, fmt.Errorf("the rule has %d nodes and %d weights; export needs at least one of each, as many of one as of the other", len(f.Nodes), len(f.Weights))
	}
	t := &table{f: f, opt: opt, dim: len(f.Nodes[0])}
	if opt.Name != "" {
		if err := ValidateName("--name", opt.Name); err != nil {
			return nil, err
		}
		t.name = opt.Name
	} else {
		t.name = defaultName(f.Kind)
	}
	if opt.Package != "" {
		if err := ValidatePackage("--package", opt.Package); err != nil {
			return nil, err
		}
	}
	// Parse every value once; the digit count D must be known before
	// fractions are rounded (to max(D, fractionDigits) digits).
	nums := make([][]precision.Number, len(f.Nodes))
	wnums := make([]precision.Number, len(f.Weights))
	d := 0
	for i, n := range f.Nodes {
		if len(n) != t.dim || t.dim == 0 {
			return nil, fmt.Errorf("node %d has %d coordinates, node 1 has %d", i+1, len(n), t.dim)
		}
		nums[i] = make([]precision.Number, t.dim)
		for c, s := range n {
			v, err := precision.ParseNumber(s)
			if err != nil {
				return nil, fmt.Errorf("node %d: %v", i+1, err)
			}
			nums[i][c], d = v, max(d, v.Digits)
		}
		v, err := precision.ParseNumber(f.Weights[i])
		if err != nil {
			return nil, fmt.Errorf("weight %d: %v", i+1, err)
		}
		wnums[i], d = v, max(d, v.Digits)
	}
	fd := max(fractionDigits, d)
	t.nodes = make([][]literal, len(f.Nodes))
	t.weights = make([]literal, len(f.Weights))
	for i, n := range f.Nodes {
		t.nodes[i] = make([]literal, t.dim)
		for c, s := range n {
			l, err := newLiteral(s, nums[i][c], fd)
			if err != nil {
				return nil, fmt.Errorf("node %d: %v", i+1, err)
			}
			t.nodes[i][c] = l
			t.note(l, fd)
		}
		l, err := newLiteral(f.Weights[i], wnums[i], fd)
		if err != nil {
			return nil, fmt.Errorf("weight %d: %v", i+1, err)
		}
		t.weights[i] = l
		t.note(l, fd)
	}
	t.extended = t.extended || t.digits > 17 || f.Digits > 17
	return t, nil
}

func (t *table) note(l literal, fracDigits int) {
	t.digits = max(t.digits, l.sigDigits())
	if l.exact {
		t.extended, t.fracDigits = true, fracDigits
	}
}

// defaultName turns a kind into an identifier: "anti-gauss" -> "anti_gauss".
func defaultName(kind string) string {
	var b strings.Builder
	for i, r := range strings.ToLower(kind) {
		switch {
		case r >= 'a' && r <= 'z', i > 0 && r >= '0' && r <= '9':
			b.WriteRune(r)
		case i > 0 && (r == '-' || r == '_' || r == ' '):
			b.WriteByte('_')
		}
	}
	s := b.String()
	if s == "" || s == "unknown" || len(s) > maxNameLen {
		return "rule"
	}
	return s
}

// points is the number of nodes.
func (t *table) points() int { return len(t.weights) }

// coordNames are the names of the coordinates of a node, for headers.
func (t *table) coordNames() []string {
	if t.dim == 1 {
		return []string{"node"}
	}
	names := []string{"x", "y", "z"}
	if t.dim <= 3 {
		return names[:t.dim]
	}
	out := make([]string, t.dim)
	for i := range out {
		out[i] = fmt.Sprintf("x%d", i+1)
	}
	return out
}
