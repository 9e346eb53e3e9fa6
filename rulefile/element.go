package rulefile

import (
	"fmt"
	"math/big"
	"strings"

	"quadwright/design/element"
	"quadwright/precision"
)

// FromElementRule makes the file of a built element rule: domain.shape is
// the element's name, domain.vertices its vertices, weight the rule's
// weight expression ("1" for an unweighted rule, "moments(FILE)" for one
// built from a moment table), and every node an array of coordinate
// strings. program is "quadwright <version>".
func FromElementRule(r *element.Rule, program string) *File {
	weight, measure := "1", "1 on the reference "+r.Shape.String()
	if r.Weight != "" {
		weight, measure = r.Weight, r.Weight+" on the reference "+r.Shape.String()
	}
	if r.MomentFile != "" {
		measure = "the weight whose moments are listed in " + r.MomentFile + ", on the reference " + r.Shape.String()
	}
	f := &File{
		Format: FormatName, Kind: r.Kind,
		Domain: Domain{Shape: r.Shape.String(), Vertices: r.Shape.Vertices()},
		Weight: weight, Points: r.Points(), Degree: r.Degree, Digits: r.Digits,
		Weights: append([]string(nil), r.Weights...),
		Measure: measure,
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

// ElementShape reports whether the file is an element rule (domain.shape
// names an element other than a plain interval) and which. A shape that is
// neither "interval" nor an element, or nodes whose coordinate count does
// not fit the element, is an error naming the file.
func (f *File) ElementShape(name string) (element.Shape, bool, error) {
	sh := strings.TrimSpace(f.Domain.Shape)
	if sh == "" || sh == "interval" {
		return 0, false, nil
	}
	s, err := element.ParseShape(sh)
	if err != nil {
		return 0, false, fmt.Errorf("rule file %s: domain.shape %q is neither \"interval\" nor one of %s", name, f.Domain.Shape, strings.Join(element.ShapeNames, ", "))
	}
	if f.Dim() != s.Dim() {
		return 0, false, fmt.Errorf("rule file %s: its nodes have %d coordinates, but a rule on the %s needs %d", name, f.Dim(), s, s.Dim())
	}
	return s, true, nil
}

// InferElement names the element of a table that names none (a CSV table
// of "x,y[,z],weight" lines, as element --format csv writes it): among the
// elements of the table's dimension (2 or 3), the one whose closed domain
// holds every node and whose area or volume the weights sum to, within a
// relative 1e-9 (a weight-1 rule integrates the constant; the element
// measures 1/2, 4, 1/6, 8, 1 and 4/3 are far apart). ok is false unless
// exactly one element fits: a weighted rule, whose weights sum to the
// weight's integral, is not guessed at.
func (f *File) InferElement() (s element.Shape, ok bool) {
	dim := f.Dim()
	if dim < 2 || dim > 3 {
		return 0, false
	}
	xs := make([][]*big.Rat, len(f.Nodes))
	sum := new(big.Rat)
	for i, n := range f.Nodes {
		xs[i] = make([]*big.Rat, dim)
		for k, c := range n {
			v, err := precision.ParseNumber(c)
			if err != nil {
				return 0, false
			}
			xs[i][k] = v.Value
		}
		w, err := precision.ParseNumber(f.Weights[i])
		if err != nil {
			return 0, false
		}
		sum.Add(sum, w.Value)
	}
	found := 0
	for _, name := range element.ShapeNames {
		c, _ := element.ParseShape(name)
		if c.Dim() != dim {
			continue
		}
		m := c.Measure()
		gap := new(big.Rat).Sub(sum, m)
		gap.Abs(gap)
		if gap.Cmp(new(big.Rat).Mul(m, big.NewRat(1, 1e9))) > 0 {
			continue
		}
		inside := true
		for _, x := range xs {
			if !c.Contains(x, false) {
				inside = false
				break
			}
		}
		if inside {
			s, found = c, found+1
		}
	}
	return s, found == 1
}
