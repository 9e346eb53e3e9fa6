package stability

import (
	"math"

	"quadwright/design"
	"quadwright/moments"
)

// InputReport is design.InputDigits in a report: the digits a finite-digit
// input (a decimal moment list or discrete measure) carries, the bound that
// limits --digits, and the measured spread of the rule over seeded draws
// of the data within their written digits.
type InputReport struct {
	Carried     int    `json:"carried"`
	Points      int    `json:"points"`
	Bound       int    `json:"bound"`
	BoundMethod string `json:"bound_method"`
	Measured    int    `json:"measured"`
	Spread      Float  `json:"spread"`
	Draws       int    `json:"draws"`
	Seed        uint64 `json:"seed"`
}

// noteInput fills in what r says about its input: its InputDigits, and
// when no support was stated, Support "not given" with the span of the
// nodes (nodes outside are then not counted: there is nothing to be
// outside of).
func noteInput(s *Summary, r *design.Rule) {
	if in := r.Input; in != nil {
		spread := Float(in.Spread)
		if math.IsInf(in.Spread, 0) {
			spread = Float(math.Inf(1))
		}
		s.Input = &InputReport{Carried: in.Carried, Points: in.Points, Bound: in.Bound, BoundMethod: in.BoundMethod, Measured: in.Measured, Spread: spread, Draws: in.Draws, Seed: in.Seed}
	}
	if r.SupportUnknown && len(r.Nodes) > 0 {
		s.Support = "not given"
		s.NodeSpan = []string{r.Nodes[0], r.Nodes[len(r.Nodes)-1]}
		s.NodesOutside, s.NodesOnBoundary = 0, 0
	}
}

// noteAuditSupport labels the audit of a measure without a stated support
// "support not given" with the span of the rule's nodes, and counts no node
// as outside.
func noteAuditSupport(r *Report, m design.Measure, p *parsedRule) {
	s, ok := m.(design.SupportStater)
	if !ok || s.SupportGiven() || len(p.x) == 0 {
		return
	}
	lo, hi := p.x[0], p.x[0]
	for _, x := range p.x {
		if x.Cmp(lo) < 0 {
			lo = x
		}
		if x.Cmp(hi) > 0 {
			hi = x
		}
	}
	r.Summary.Support = "not given"
	r.Summary.NodeSpan = []string{moments.RatString(lo), moments.RatString(hi)}
	r.Summary.NodesOutside, r.Summary.NodesOnBoundary = 0, 0
	r.Domain = "support not given (nodes span [" + r.Summary.NodeSpan[0] + ", " + r.Summary.NodeSpan[1] + "])"
}
