package rulefile

import (
	"fmt"
	"strings"

	"quadwright/design/polytope"
)

// FromPolytopeRule makes the file of a rule on a user's polygon or
// polyhedron: domain.shape "polygon" or "polyhedron", domain.vertices the
// vertices as written and, for a polyhedron, domain.faces the faces with
// 1-based indices; weight "1".
func FromPolytopeRule(r *polytope.Rule, program string) *File {
	f := &File{
		Format: FormatName, Kind: r.Kind,
		Domain: Domain{Shape: r.Kind, Vertices: r.Vertices},
		Weight: "1", Points: r.Points(), Degree: r.Degree, Digits: r.Digits,
		Weights: append([]string(nil), r.Weights...),
		Measure: "1 on the " + r.Kind + " of domain.vertices",
		Provenance: &Provenance{
			Program: program, Method: r.Method,
			WorkingPrecision: r.WorkingPrec, CheckPrecision: r.CheckPrec,
			ExactnessTested: r.Exactness.Tested, ResidualShare: fmt.Sprintf("%.2g", r.Exactness.WorstShare),
		},
	}
	for _, face := range r.Faces {
		g := make([]int, len(face))
		for k, i := range face {
			g[k] = i + 1
		}
		f.Domain.Faces = append(f.Domain.Faces, g)
	}
	f.Nodes = make([]Node, len(r.Nodes))
	for i, p := range r.Nodes {
		f.Nodes[i] = append(Node(nil), p...)
	}
	return f
}

// PolytopeDomain reports whether the file's domain is a user's polygon or
// polyhedron and, if so, the cell as the file gives it (validated).
func (f *File) PolytopeDomain(name string) (polygon *polytope.Polygon, polyhedron *polytope.Polyhedron, ok bool, err error) {
	switch strings.TrimSpace(f.Domain.Shape) {
	case "polygon":
		var b strings.Builder
		for _, v := range f.Domain.Vertices {
			b.WriteString(strings.Join(v, " ") + "\n")
		}
		p, err := polytope.ParsePolygon(strings.NewReader(b.String()), "rule file "+name+" domain.vertices")
		return p, nil, true, err
	case "polyhedron":
		var b strings.Builder
		for _, v := range f.Domain.Vertices {
			b.WriteString("v " + strings.Join(v, " ") + "\n")
		}
		for _, face := range f.Domain.Faces {
			b.WriteString("f")
			for _, i := range face {
				fmt.Fprintf(&b, " %d", i)
			}
			b.WriteString("\n")
		}
		p, err := polytope.ParsePolyhedron(strings.NewReader(b.String()), "rule file "+name+" domain")
		return nil, p, true, err
	}
	return nil, nil, false, nil
}
