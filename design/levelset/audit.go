package levelset

import (
	"context"
	"fmt"
	"math"
	"strconv"
)

// Audit is the report on a cut-element rule read back from a file.
type Audit struct {
	Points          int     `json:"points"`
	Degree          int     `json:"degree"` // -1: no polynomial degree is claimed on a curved domain
	NegativeWeights int     `json:"negative_weights"`
	StabilityFactor float64 `json:"stability_factor"`
	NodesOutside    int     `json:"nodes_outside"` // off the element, or not strictly on the side (surface: off the interface)
	LostDigits      float64 `json:"lost_digits"`
	Order           int     `json:"order"`
	Measure         float64 `json:"measure"`
	// EstimatedError compares the rule read with the rule of order+4
	// built afresh on the same domain (see Rule.EstimatedError).
	EstimatedError float64 `json:"estimated_error"`
	// Digits is D, the most significant digits among the file's values;
	// above 17 every check runs at that precision (auditDigits), else in
	// float64.
	Digits int    `json:"digits"`
	Note   string `json:"note,omitempty"`
}

// AuditRule checks the rule (nodes, weights as decimal strings) on the
// domain of req: positivity, nodes on the side and inside the element,
// and the estimated error against a fresh rule of order req.Order+4. A
// rule printed with more than 17 significant digits is checked at its
// own digits (auditDigits); otherwise in float64.
func AuditRule(ctx context.Context, req Request, nodes [][]string, weights []string) (*Audit, error) {
	g, err := geometry(req, nil)
	if err != nil {
		return nil, err
	}
	if g.phi, err = ParseLevelSet(req.LevelSet, g.dim); err != nil {
		return nil, err
	}
	if len(nodes) != len(weights) {
		return nil, fmt.Errorf("%d nodes and %d weights", len(nodes), len(weights))
	}
	for i, n := range nodes {
		if len(n) != g.dim {
			return nil, fmt.Errorf("node %d has %d coordinates, the domain %d", i+1, len(n), g.dim)
		}
	}
	if req.Order < 1 || req.Order > MaxOrder {
		return nil, fmt.Errorf("order %d: out of range 1 to %d", req.Order, MaxOrder)
	}
	d, xs, rs, err := fileDigits(nodes, weights)
	if err != nil {
		return nil, err
	}
	if d > float64Digits {
		return auditDigits(ctx, g, req, d, xs, rs)
	}
	a := &Audit{Points: len(nodes), Degree: -1, Order: req.Order, Digits: d}
	pts := make([][3]float64, len(nodes))
	ws := make([]float64, len(nodes))
	sum, abs := 0.0, 0.0
	for i, n := range nodes {
		if len(n) != g.dim {
			return nil, fmt.Errorf("node %d has %d coordinates, the domain %d", i+1, len(n), g.dim)
		}
		for k, s := range n {
			if pts[i][k], err = strconv.ParseFloat(s, 64); err != nil {
				return nil, fmt.Errorf("node %d: %q is not a number", i+1, s)
			}
		}
		if ws[i], err = strconv.ParseFloat(weights[i], 64); err != nil {
			return nil, fmt.Errorf("weight %d: %q is not a number", i+1, weights[i])
		}
		if ws[i] < 0 {
			a.NegativeWeights++
		}
		sum += ws[i]
		abs += math.Abs(ws[i])
		if !g.holds(pts[i], req.Side) {
			a.NodesOutside++
		}
	}
	if sum == 0 {
		return nil, errZeroSum
	}
	a.Measure = sum
	a.StabilityFactor = abs / math.Abs(sum)
	a.LostDigits = math.Log10(a.StabilityFactor)
	if req.Order+4 > MaxOrder+4 || req.Order < 1 {
		return nil, fmt.Errorf("order %d: out of range 1 to %d", req.Order, MaxOrder)
	}
	ref := req
	ref.Order += 4
	ref.Digits = 0
	r, err := Build(ctx, ref)
	if err != nil {
		return nil, err
	}
	var hn [][3]float64
	for _, p := range r.Nodes {
		var q [3]float64
		copy(q[:], p)
		hn = append(hn, q)
	}
	a.EstimatedError = g.compare(pts, ws, hn, r.Weights)
	return a, nil
}

// holds reports whether x lies in the closed element and strictly on the
// side (surface: where |phi| is within rounding of 0, 1e-12 of the
// gradient's size times the element's).
func (g *geom) holds(x [3]float64, side Side) bool {
	in := true
	switch g.kind {
	case duffyTri:
		in = x[0] >= 0 && x[1] >= 0 && x[0]+x[1] <= 1
	case duffyTet:
		in = x[0] >= 0 && x[1] >= 0 && x[2] >= 0 && x[0]+x[1]+x[2] <= 1
	default:
		for k := 0; k < g.dim; k++ {
			in = in && x[k] >= g.lo[k] && x[k] <= g.hi[k]
		}
	}
	if !in {
		return false
	}
	var gr [3]float64
	v := g.phi.Grad64(x[:g.dim], gr[:g.dim])
	switch side {
	case Inside:
		return v < 0
	case Outside:
		return v > 0
	}
	size := 0.0
	for k := 0; k < g.dim; k++ {
		size = math.Max(size, g.hi[k]-g.lo[k])
	}
	n := math.Sqrt(gr[0]*gr[0] + gr[1]*gr[1] + gr[2]*gr[2])
	return math.Abs(v) <= 1e-12*n*size
}
