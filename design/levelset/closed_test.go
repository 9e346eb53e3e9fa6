package levelset

import (
	"context"
	"fmt"
	"math"
	"testing"
)

func build(t testing.TB, req Request) *Rule {
	t.Helper()
	r, err := Build(context.Background(), req)
	if err != nil {
		t.Fatalf("%+v: %v", req, err)
	}
	return r
}

// integral sums w f over the rule.
func integral(r *Rule, f func(p []float64) float64) float64 {
	s := 0.0
	for i, p := range r.Nodes {
		s += r.Weights[i] * f(p)
	}
	return s
}

func one([]float64) float64 { return 1 }

func relErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }

func beta(a, b float64) float64 {
	la, _ := math.Lgamma(a)
	lb, _ := math.Lgamma(b)
	lab, _ := math.Lgamma(a + b)
	return math.Exp(la + lb - lab)
}

// discMoment is the integral of x^(2a) y^(2b) over the disc of radius r
// at the origin: in polar coordinates r^(2a+2b+2)/(2a+2b+2) times
// 2 B(a+1/2, b+1/2) (Abramowitz and Stegun 6.2.1 for the angular integral
// of cos^(2a) sin^(2b)).
func discMoment(r float64, a, b int) float64 {
	n := float64(2*a + 2*b + 2)
	return math.Pow(r, n) / n * 2 * beta(float64(a)+0.5, float64(b)+0.5)
}

type closedCase struct {
	name string
	req  Request
	f    func(p []float64) float64
	want float64
	tol  float64
}

// ellipseSet is the level set of the ellipse with semi-axes a, b centred
// at (x0, y0) and turned by th.
func ellipseSet(a, b, x0, y0, th float64) string {
	c, s := math.Cos(th), math.Sin(th)
	xr := fmt.Sprintf("(%.17g*(x-%.17g)+%.17g*(y-%.17g))", c, x0, s, y0)
	yr := fmt.Sprintf("(%.17g*(x-%.17g)+%.17g*(y-%.17g))", -s, x0, c, y0)
	return fmt.Sprintf("%s^2/%.17g+%s^2/%.17g-1", xr, a*a, yr, b*b)
}

func closedCases() []closedCase {
	const r, x0, y0 = 0.8, 0.1, -0.05
	disc := fmt.Sprintf("(x-%g)^2+(y-%g)^2-%g", x0, y0, r*r)
	cx := func(p []float64) float64 { return p[0] - x0 }
	cy := func(p []float64) float64 { return p[1] - y0 }
	th, ea, eb, ex, ey := 0.6, 0.7, 0.4, -0.13, 0.21
	ell := ellipseSet(ea, eb, ex, ey, th)
	yrot := func(p []float64) float64 {
		v := -math.Sin(th)*(p[0]-ex) + math.Cos(th)*(p[1]-ey)
		return v * v
	}
	// A disc crossing the edge x = 1 at arbitrary points: the part
	// beyond is a circular segment of area R^2 acos(d/R) - d sqrt(R^2-d^2)
	// (handbook formula), and the arc beyond has length 2 R acos(d/R).
	const R, cX, cY = 0.6, 0.7, 0.23
	d := 1 - cX
	seg := R*R*math.Acos(d/R) - d*math.Sqrt(R*R-d*d)
	// A ball crossing the face z = 1: the cap beyond has volume
	// pi h^2 (3R - h)/3 (handbook formula), h = 0.2 here.
	const Rb, zb = 0.8, 0.4
	h := zb + Rb - 1
	cases := []closedCase{
		{"disc area pi r^2", Request{Shape: "quadrilateral", LevelSet: disc, Order: 16}, one, math.Pi * r * r, 1e-13},
		{"disc x^4 y^2 (Beta function)", Request{Shape: "quadrilateral", LevelSet: disc, Order: 16}, func(p []float64) float64 { return math.Pow(cx(p), 4) * math.Pow(cy(p), 2) }, discMoment(r, 2, 1), 1e-13},
		{"disc x^2 (Beta function)", Request{Shape: "quadrilateral", LevelSet: disc, Order: 20}, func(p []float64) float64 { return cx(p) * cx(p) }, discMoment(r, 1, 0), 1e-13},
		{"disc outside 4 - pi r^2", Request{Shape: "quadrilateral", LevelSet: disc, Order: 16, Side: Outside}, one, 4 - math.Pi*r*r, 1e-13},
		{"circle length 2 pi r", Request{Shape: "quadrilateral", LevelSet: disc, Order: 20, Side: Surface}, one, 2 * math.Pi * r, 1e-13},
		{"circle x^2 ds = pi r^3", Request{Shape: "quadrilateral", LevelSet: disc, Order: 16, Side: Surface}, func(p []float64) float64 { return cx(p) * cx(p) }, math.Pi * r * r * r, 1e-13},
		{"rotated ellipse area pi a b", Request{Shape: "quadrilateral", LevelSet: ell, Order: 16}, one, math.Pi * ea * eb, 1e-13},
		{"rotated ellipse y'^2 = pi a b^3/4", Request{Shape: "quadrilateral", LevelSet: ell, Order: 16}, yrot, math.Pi * ea * eb * eb * eb / 4, 1e-13},
		{"annulus area pi (r2^2 - r1^2)", Request{Shape: "quadrilateral", LevelSet: "(x^2+y^2-0.09)*(x^2+y^2-0.49)", Order: 16}, one, math.Pi * (0.49 - 0.09), 1e-13},
		{"annulus boundary 2 pi (r1 + r2)", Request{Shape: "quadrilateral", LevelSet: "(x^2+y^2-0.09)*(x^2+y^2-0.49)", Order: 16, Side: Surface}, one, 2 * math.Pi * (0.3 + 0.7), 1e-13},
		{"disc cut by an edge: pi R^2 - segment", Request{Shape: "quadrilateral", LevelSet: fmt.Sprintf("(x-%g)^2+(y-%g)^2-%g", cX, cY, R*R), Order: 16}, one, math.Pi*R*R - seg, 1e-13},
		{"arc cut by an edge: 2 pi R - 2 R acos(d/R)", Request{Shape: "quadrilateral", LevelSet: fmt.Sprintf("(x-%g)^2+(y-%g)^2-%g", cX, cY, R*R), Order: 16, Side: Surface}, one, 2*math.Pi*R - 2*R*math.Acos(d/R), 1e-13},
		{"quarter disc in a box", Request{Shape: "box", Box: []float64{0, 1, 0, 1.5}, LevelSet: "x^2+y^2-0.81", Order: 16}, one, math.Pi * 0.81 / 4, 1e-13},
		{"disc in the triangle", Request{Shape: "triangle", LevelSet: "(x-0.3)^2+(y-0.25)^2-0.0225", Order: 20}, one, math.Pi * 0.0225, 1e-13},
		{"circle in the triangle", Request{Shape: "triangle", LevelSet: "(x-0.3)^2+(y-0.25)^2-0.0225", Order: 20, Side: Surface}, one, 2 * math.Pi * 0.15, 1e-13},
		{"ball 4 pi R^3/3", Request{Shape: "hexahedron", LevelSet: "(x-0.1)^2+(y+0.05)^2+(z-0.02)^2-0.64", Order: 12}, one, 4 * math.Pi * 0.512 / 3, 1e-13},
		{"sphere 4 pi R^2", Request{Shape: "hexahedron", LevelSet: "(x-0.1)^2+(y+0.05)^2+(z-0.02)^2-0.64", Order: 12, Side: Surface}, one, 4 * math.Pi * 0.64, 1e-13},
		{"ball less a spherical cap pi h^2 (3R-h)/3", Request{Shape: "hexahedron", LevelSet: fmt.Sprintf("x^2+y^2+(z-%g)^2-%g", zb, Rb*Rb), Order: 12}, one, 4*math.Pi*Rb*Rb*Rb/3 - math.Pi*h*h*(3*Rb-h)/3, 1e-13},
		// Three faces through the centre: order 14 here; order 12 reached 1.9e-13
		// before the branch-point splitting of heightDirection, 2.9e-15 since
		// (TestClosedFormsLowOrder).
		{"octant of a ball in a box", Request{Shape: "box", Box: []float64{0, 1, 0, 1, 0, 1}, LevelSet: "x^2+y^2+z^2-0.49", Order: 14}, one, math.Pi * 0.343 / 6, 1e-13},
		{"ball in the tetrahedron", Request{Shape: "tetrahedron", LevelSet: "(x-0.2)^2+(y-0.2)^2+(z-0.2)^2-0.0225", Order: 12}, one, 4 * math.Pi * 0.003375 / 3, 1e-13},
		{"sphere in the tetrahedron", Request{Shape: "tetrahedron", LevelSet: "(x-0.2)^2+(y-0.2)^2+(z-0.2)^2-0.0225", Order: 12, Side: Surface}, one, 4 * math.Pi * 0.0225, 1e-13},
	}
	return cases
}

// TestClosedForms checks the rules against closed forms, each named in
// its case (pi r^2 and the like are handbook formulas, from memory).
func TestClosedForms(t *testing.T) {
	for _, c := range closedCases() {
		if testing.Short() && c.req.Shape != "quadrilateral" {
			continue
		}
		r := build(t, c.req)
		got := integral(r, c.f)
		if e := relErr(got, c.want); !(e <= c.tol) {
			t.Errorf("%s: %.17g, want %.17g (relative error %.2g > %.0e); %d points", c.name, got, c.want, e, c.tol, len(r.Nodes))
		}
		for i, w := range r.Weights {
			if !(w > 0) {
				t.Fatalf("%s: weight %d is %v", c.name, i, w)
			}
		}
	}
}
