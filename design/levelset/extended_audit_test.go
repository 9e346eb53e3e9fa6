package levelset

import (
	"context"
	"math"
	"strings"
	"testing"
)

// TestAuditAtFileDigits: a 30-digit rule file is audited at 30 digits: the
// circle x^2 + y^2 = 1/4 (a surface rule, order 6) has every printed node
// on the interface to its digits and the estimated error refine gave; one
// coordinate moved in its 20th significant digit, which a float64 audit
// (tolerance 1e-12) cannot see, counts as off the interface.
func TestAuditAtFileDigits(t *testing.T) {
	ctx := context.Background()
	req := Request{Shape: "quadrilateral", LevelSet: "x^2+y^2-1/4", Side: Surface, Order: 6, Digits: 30}
	r, err := Build(ctx, req)
	if err != nil {
		t.Fatal(err)
	}
	aq := req
	aq.Digits = 0
	a, err := AuditRule(ctx, aq, r.PrintedNodes, r.PrintedWeights)
	if err != nil {
		t.Fatal(err)
	}
	if a.Digits != 30 || a.NodesOutside != 0 || a.NegativeWeights != 0 || a.Points != len(r.PrintedNodes) {
		t.Fatalf("audit: %+v", a)
	}
	if e := math.Abs(a.Measure-r.Measure) / r.Measure; e > 1e-15 {
		t.Errorf("measure %.17g, the rule's %.17g", a.Measure, r.Measure)
	}
	if e := math.Abs(a.EstimatedError-r.EstimatedError) / r.EstimatedError; !(e < 1e-6) {
		t.Errorf("estimated error %.6g, the rule's %.6g", a.EstimatedError, r.EstimatedError)
	}
	nodes := make([][]string, len(r.PrintedNodes))
	for i := range nodes {
		nodes[i] = append([]string(nil), r.PrintedNodes[i]...)
	}
	c := nodes[0][0]
	if len(c) < 24 || !strings.Contains(c, ".") {
		t.Fatalf("coordinate %q", c)
	}
	// The 20th significant digit: c is -0.ddd... or 0.ddd...
	i := strings.IndexAny(c, "123456789") + 19
	digit := byte('1')
	if c[i] == '1' {
		digit = '2'
	}
	nodes[0][0] = c[:i] + string(digit) + c[i+1:]
	b, err := AuditRule(ctx, aq, nodes, r.PrintedWeights)
	if err != nil {
		t.Fatal(err)
	}
	if b.NodesOutside != 1 {
		t.Errorf("a node moved in its 20th digit: %d nodes off the interface, want 1 (%s -> %s)", b.NodesOutside, c, nodes[0][0])
	}
}
