package rulefile

import (
	"bytes"
	"encoding/json"
	"fmt"

	"quadwright/design"
	"quadwright/moments"
)

// FormatName is the value of the "format" key.
const FormatName = "quadwright-rule/1"

// File is a rule file. The first nine fields are the contract's required
// keys, in its order; the rest are quadwright's own and optional on reading.
type File struct {
	Format  string   `json:"format"`
	Kind    string   `json:"kind"`
	Domain  Domain   `json:"domain"`
	Weight  string   `json:"weight"`
	Points  int      `json:"points"`
	Degree  int      `json:"degree"`
	Digits  int      `json:"digits"`
	Nodes   []Node   `json:"nodes"`
	Weights []string `json:"weights"`

	Measure    string          `json:"measure,omitempty"`
	Family     *Family         `json:"family,omitempty"`
	Provenance *Provenance     `json:"provenance,omitempty"`
	Report     json.RawMessage `json:"report,omitempty"`

	// Functions and ExactFor describe a rule for a function system
	// (CONTRACT.md, "Function systems"): the expanded expressions, and how
	// many of them the printed rule was verified to integrate.
	Functions []string `json:"functions,omitempty"`
	ExactFor  *int     `json:"exact_for,omitempty"`
}

// Domain is where the rule lives: an interval, or (for element rules) a
// named element with its vertices.
type Domain struct {
	Shape    string     `json:"shape"`
	Interval []string   `json:"interval,omitempty"`
	Vertices [][]string `json:"vertices,omitempty"`
	// Faces, for a polyhedron, lists each face's 1-based vertex indices.
	Faces [][]int `json:"faces,omitempty"`
	// Support is "not given" when the measure came without a stated
	// support (raw moments without --interval): Interval is then the whole
	// line only as the measure's nominal domain, not a claim of the user's.
	Support string `json:"support,omitempty"`
}

// Node is one node: a single coordinate (written as a JSON string) or, for
// element rules, several (written as an array of strings).
type Node []string

// MarshalJSON writes a one-coordinate node as a bare string.
func (n Node) MarshalJSON() ([]byte, error) {
	if len(n) == 1 {
		return json.Marshal(n[0])
	}
	return json.Marshal([]string(n))
}

// UnmarshalJSON reads a string or an array of strings.
func (n *Node) UnmarshalJSON(b []byte) error {
	b = bytes.TrimSpace(b)
	if len(b) > 0 && b[0] == '"' {
		var s string
		if err := json.Unmarshal(b, &s); err != nil {
			return err
		}
		*n = Node{s}
		return nil
	}
	var a []string
	if err := json.Unmarshal(b, &a); err != nil {
		return fmt.Errorf("a node must be a decimal string or an array of them")
	}
	*n = a
	return nil
}

// Family records a classical family's name and exact parameters.
type Family struct {
	Name  string `json:"name"`
	Alpha string `json:"alpha,omitempty"`
	Beta  string `json:"beta,omitempty"`
}

// Provenance says how the rule was made and checked.
type Provenance struct {
	Program          string `json:"program"`
	Method           string `json:"method"`
	WorkingPrecision uint   `json:"working_precision_bits"`
	CheckPrecision   uint   `json:"check_precision_bits"`
	ExactnessTested  int    `json:"exactness_tested_to"`
	ResidualShare    string `json:"largest_residual_share_of_tolerance"`
}

// FromRule makes the file of a built rule. fam may be nil (a measure that
// is not a family); program is "quadwright <version>".
func FromRule(r *design.Rule, fam *moments.Family, program string) *File {
	f := &File{
		Format: FormatName, Kind: r.Kind,
		Domain: Domain{Shape: "interval", Interval: r.Domain.Strings(), Support: supportNote(r)},
		Weight: r.Weight, Points: r.Points(), Degree: r.Degree, Digits: r.Digits,
		Weights: append([]string(nil), r.Weights...), Measure: r.Measure,
		Provenance: &Provenance{
			Program: program, Method: r.Method,
			WorkingPrecision: r.WorkingPrec, CheckPrecision: r.CheckPrec,
			ExactnessTested: r.Exactness.Tested, ResidualShare: fmt.Sprintf("%.2g", r.Exactness.WorstShare()),
		},
	}
	f.Nodes = make([]Node, len(r.Nodes))
	for i, s := range r.Nodes {
		f.Nodes[i] = Node{s}
	}
	if fam != nil {
		fj := &Family{Name: fam.Name}
		if fam.Alpha != nil {
			fj.Alpha = moments.RatString(fam.Alpha)
		}
		if fam.Beta != nil {
			fj.Beta = moments.RatString(fam.Beta)
		}
		f.Family = fj
	}
	return f
}

// MarshalIndent renders the file as indented JSON with a final newline.
func (f *File) MarshalIndent() ([]byte, error) {
	b, err := json.MarshalIndent(f, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// Coordinates returns the nodes of a one-dimensional rule as strings; it
// panics on an element rule (programmer error: check Dim first).
func (f *File) Coordinates() []string {
	out := make([]string, len(f.Nodes))
	for i, n := range f.Nodes {
		if len(n) != 1 {
			panic("rulefile: Coordinates of a multi-dimensional rule")
		}
		out[i] = n[0]
	}
	return out
}

// Dim is the number of coordinates per node (1 for an interval rule).
func (f *File) Dim() int {
	if len(f.Nodes) == 0 {
		return 1
	}
	return len(f.Nodes[0])
}

// supportNote is Domain.Support for r: "not given" when r's measure came
// without a stated support, else empty.
func supportNote(r *design.Rule) string {
	if r.SupportUnknown {
		return "not given"
	}
	return ""
}
