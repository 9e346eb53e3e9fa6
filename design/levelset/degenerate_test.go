package levelset

import (
	"context"
	"math"
	"strings"
	"testing"
)

// TestDegenerate covers the degenerate placements of the interface; each
// closed form is named (handbook formulas, from memory).
func TestDegenerate(t *testing.T) {
	// A sliver: x > 1 - 1e-7 on the quadrilateral, area 2e-7 exactly;
	// and the circular segment of height 1e-6 beyond x = 1, area
	// R^2 acos(d/R) - d sqrt(R^2-d^2) with d = R - 1e-6 (the formula itself
	// cancels about 5 digits, hence the tolerance, tuned).
	const R = 0.5
	d := R - 1e-6
	seg := R*R*math.Acos(d/R) - d*math.Sqrt(R*R-d*d)
	cases := []closedCase{
		{"tangent to a face at a non-dyadic point: pi r^2", Request{Shape: "quadrilateral", LevelSet: "(x+0.3)^2+(y-0.1)^2-0.49", Order: 16}, one, math.Pi * 0.49, 1e-13},
		{"tangent to a face: circle 2 pi r", Request{Shape: "quadrilateral", LevelSet: "(x+0.3)^2+(y-0.1)^2-0.49", Order: 16, Side: Surface}, one, 2 * math.Pi * 0.7, 1e-13},
		{"through two vertices: quarter disc pi r^2/4, r = 2", Request{Shape: "quadrilateral", LevelSet: "(x-1)^2+(y-1)^2-4", Order: 16}, one, math.Pi, 1e-13},
		{"through two vertices: quarter circle pi r/2", Request{Shape: "quadrilateral", LevelSet: "(x-1)^2+(y-1)^2-4", Order: 20, Side: Surface}, one, math.Pi, 1e-13},
		{"diagonal through two vertices: half the square", Request{Shape: "quadrilateral", LevelSet: "x+y", Order: 4}, one, 2, 1e-14},
		{"straight sliver 2e-7", Request{Shape: "quadrilateral", LevelSet: "x-(1-1e-7)", Order: 4, Side: Outside}, one, 2e-7, 1e-8},
		{"circular sliver (segment of height 1e-6)", Request{Shape: "quadrilateral", LevelSet: "(x-1.499999)^2+y^2-0.25", Order: 20}, one, seg, 1e-7},
		{"two discs in one element", Request{Shape: "quadrilateral", LevelSet: "((x+0.5)^2+y^2-0.09)*((x-0.5)^2+y^2-0.09)", Order: 16}, one, 2 * math.Pi * 0.09, 1e-13},
		{"high curvature: disc of radius 0.01", Request{Shape: "quadrilateral", LevelSet: "(x-0.123)^2+(y+0.377)^2-0.0001", Order: 16}, one, math.Pi * 1e-4, 1e-13},
		{"high curvature: circle of radius 0.01", Request{Shape: "quadrilateral", LevelSet: "(x-0.123)^2+(y+0.377)^2-0.0001", Order: 16, Side: Surface}, one, 2 * math.Pi * 0.01, 1e-13},
		{"interface along an edge: its length", Request{Shape: "quadrilateral", LevelSet: "y-1", Order: 4, Side: Surface}, one, 2, 1e-15},
	}
	for _, c := range cases {
		r := build(t, c.req)
		got := integral(r, c.f)
		if e := relErr(got, c.want); !(e <= c.tol) {
			t.Errorf("%s: %.17g, want %.17g (relative error %.2g > %.0e); %d points", c.name, got, c.want, e, c.tol, len(r.Nodes))
		}
		g, _ := geometry(c.req, nil)
		g.phi, _ = ParseLevelSet(c.req.LevelSet, g.dim)
		for i, p := range r.Nodes {
			var q [3]float64
			copy(q[:], p)
			if !(r.Weights[i] > 0) || !g.holds(q, c.req.Side) {
				t.Fatalf("%s: node %d %v (weight %v) not on the %s side", c.name, i, p, r.Weights[i], c.req.Side)
			}
		}
	}
}

// TestUncut: an element wholly on the asked side gets the plain product
// rule with a note; wholly on the other side, a refusal.
func TestUncut(t *testing.T) {
	r := build(t, Request{Shape: "quadrilateral", LevelSet: "x^2+y^2-9", Order: 5})
	if !r.Whole || r.Note == "" || len(r.Nodes) != 25 || relErr(integral(r, one), 4) > 1e-15 {
		t.Errorf("wholly inside: whole %v, note %q, %d points, area %v", r.Whole, r.Note, len(r.Nodes), integral(r, one))
	}
	r = build(t, Request{Shape: "quadrilateral", LevelSet: "y-1", Order: 3})
	if !r.Whole || len(r.Nodes) != 9 {
		t.Errorf("interface along an edge, inside: whole %v, %d points", r.Whole, len(r.Nodes))
	}
	for _, req := range []Request{
		{Shape: "quadrilateral", LevelSet: "x^2+y^2-9", Order: 5, Side: Outside},
		{Shape: "hexahedron", LevelSet: "x^2+y^2+z^2+1", Order: 5},
		{Shape: "triangle", LevelSet: "x+y+1", Order: 5, Side: Surface},
	} {
		_, err := Build(context.Background(), req)
		if err == nil || !strings.Contains(err.Error(), "empty") {
			t.Errorf("%+v: %v, want the empty-domain refusal", req, err)
		}
	}
}

// TestRefusals: each bad input is one sentence naming it.
func TestRefusals(t *testing.T) {
	for _, c := range []struct {
		req  Request
		want string
	}{
		{Request{Shape: "quadrilateral", LevelSet: "x^^2", Order: 4}, `level set "x^^2": position 3`},
		{Request{Shape: "quadrilateral", LevelSet: "x+w", Order: 4}, `unknown name "w"`},
		{Request{Shape: "quadrilateral", LevelSet: "log(x)-y", Order: 4}, "undefined at"},
		{Request{Shape: "quadrilateral", LevelSet: "1/x-y", Order: 4}, "undefined at"},
		{Request{Shape: "quadrilateral", LevelSet: "x", Order: 0}, "--degree 0"},
		{Request{Shape: "prism", LevelSet: "x", Order: 4}, `--shape "prism"`},
		{Request{Shape: "box", Box: []float64{1, 0, 0, 1}, LevelSet: "x", Order: 4}, "--box"},
		{Request{Shape: "box", Box: []float64{0, 1, 0}, LevelSet: "x", Order: 4}, "--box"},
		{Request{Shape: "quadrilateral", LevelSet: "x", Weight: "x", Order: 4}, `weight "x"`},
	} {
		_, err := Build(context.Background(), c.req)
		if err == nil || !strings.Contains(err.Error(), c.want) || strings.Count(err.Error(), ". ") > 0 {
			t.Errorf("%+v: %v, want an error with %q", c.req, err, c.want)
		}
	}
	if _, err := ParseSide("middle"); err == nil || !strings.Contains(err.Error(), `--side "middle"`) {
		t.Errorf("side: %v", err)
	}
}

// FuzzLevelSet feeds arbitrary level sets, boxes and sides to Build: an
// error or a rule with positive weights, never a panic.
func FuzzLevelSet(f *testing.F) {
	f.Add("x^2+y^2-0.5", 0.0, 1.0, 0)
	f.Add("sin(3*x)*cos(y)-0.1", -1.0, 2.0, 2)
	f.Add("abs(x)-y^3+tan(x*y)", -3.0, 0.5, 1)
	f.Add("log(x+2)-exp(y)/3", 0.0, 0.0, 0)
	f.Fuzz(func(t *testing.T, src string, lo, hi float64, side int) {
		if len(src) > 200 {
			return
		}
		req := Request{Shape: "box", Box: []float64{lo, hi, lo, hi}, LevelSet: src, Order: 2, Side: Side(((side % 3) + 3) % 3)}
		r, err := Build(context.Background(), req)
		if err != nil {
			return
		}
		for i, w := range r.Weights {
			if !(w > 0) {
				t.Fatalf("%q: weight %d = %v", src, i, w)
			}
		}
	})
}
