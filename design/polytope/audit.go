package polytope

import (
	"context"
	"fmt"
	"math/big"

	"quadwright/design/element"
	"quadwright/precision"
)

// Report is what Audit finds in a printed rule on a cell.
type Report struct {
	Kind            string
	Points          int
	NegativeWeights int
	NodesOutside    int
	// Exactness is the test against the cell's exact moments; its Degree
	// is the highest total degree through which every monomial passes.
	Exactness element.Exactness
}

// AuditPolygon tests a printed rule (decimal strings) on the polygon:
// signs of the weights, nodes in the closed polygon (exactly), exactness
// through maxDeg against the exact moments.
func AuditPolygon(ctx context.Context, p *Polygon, nodes [][]string, weights []string, maxDeg int) (*Report, error) {
	return audit(ctx, polygonCell{p}, nodes, weights, maxDeg)
}

// AuditPolyhedron is AuditPolygon for a polyhedron.
func AuditPolyhedron(ctx context.Context, p *Polyhedron, nodes [][]string, weights []string, maxDeg int) (*Report, error) {
	return audit(ctx, polyhedronCell{p}, nodes, weights, maxDeg)
}

func audit(ctx context.Context, c cell, nodes [][]string, weights []string, maxDeg int) (*Report, error) {
	kind, _, _ := c.describe()
	dim := c.dimension()
	if maxDeg < 0 || maxDeg > MaxDegree(dim) {
		return nil, fmt.Errorf("--max-degree %d: give a whole number from 0 to %d for a rule on a %s", maxDeg, MaxDegree(dim), kind)
	}
	rep := &Report{Kind: kind, Points: len(nodes)}
	simp := c.simplices()
	for i := range nodes {
		if len(nodes[i]) != dim {
			return nil, fmt.Errorf("node %d has %d coordinates, a rule on a %s needs %d", i+1, len(nodes[i]), kind, dim)
		}
		w, err := precision.ParseExact(weights[i])
		if err != nil {
			return nil, fmt.Errorf("weight %d %q: not a decimal number", i+1, weights[i])
		}
		if w.Sign() < 0 {
			rep.NegativeWeights++
		}
		x := make([]*big.Rat, dim)
		for k, s := range nodes[i] {
			if x[k], err = precision.ParseExact(s); err != nil {
				return nil, fmt.Errorf("node %d coordinate %q: not a decimal number", i+1, s)
			}
		}
		if !inSimplices(simp, x) {
			rep.NodesOutside++
		}
	}
	ex, err := verifyExact(ctx, c, nodes, weights, maxDeg, 0)
	if err != nil {
		return nil, err
	}
	rep.Exactness = ex
	return rep, nil
}
