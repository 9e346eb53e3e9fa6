package rulefile

import (
	"fmt"

	"quadwright/design/element"
)

// FromElementRule makes the file of a built element rule: domain.shape is
// the element's name, domain.vertices its vertices, weight "1", and every
// node an array of coordinate strings. program is "quadwright <version>".
func FromElementRule(r *element.Rule, program string) *File {
	f := &File{
		Format: FormatName, Kind: r.Kind,
		Domain: Domain{Shape: r.Shape.String(), Vertices: r.Shape.Vertices()},
		Weight: "1", Points: r.Points(), Degree: r.Degree, Digits: r.Digits,
		Weights: append([]string(nil), r.Weights...),
		Measure: "1 on the reference " + r.Shape.String(),
		Provenance: &Provenance{
			Program: program, Method: r.Method,
			WorkingPrecision: r.WorkingPrec, CheckPrecision: r.CheckPrec,
			ExactnessTested: r.Exactness.Tested, ResidualShare: fmt.Sprintf("%.2g", r.Exactness.WorstShare),
		},
	}
	f.Nodes = make([]Node, len(r.Nodes))
	for i, p := range r.Nodes {
		f.Nodes[i] = append(Node(nil), p...)
	}
	return f
}
