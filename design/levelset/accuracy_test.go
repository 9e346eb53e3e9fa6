package levelset

import (
	"fmt"
	"math"
	"testing"
)

// TestClosedFormsLowOrder checks the closed forms at the lowest orders
// the float64 path is asked to meet 1e-13 with (at most 20 in 2-D, 12 in
// 3-D), with the shapes shifted and turned so that the interface crosses
// the element's edges and faces at arbitrary points. Sources: pi r^2,
// 2 pi r, pi a b, the circular segment
// R^2 acos(d/R) - d sqrt(R^2 - d^2), the spherical cap pi h^2 (3R - h)/3
// and its area 2 pi R h (Archimedes) are handbook formulas (from memory);
// the moments of x^(2a) y^(2b) over the disc by Beta functions, see
// discMoment (Abramowitz and Stegun 6.2.1).
func TestClosedFormsLowOrder(t *testing.T) {
	const r, x0, y0 = 0.8, 0.1, -0.05
	disc := fmt.Sprintf("(x-%g)^2+(y-%g)^2-%g", x0, y0, r*r)
	cx := func(p []float64) float64 { return p[0] - x0 }
	cy := func(p []float64) float64 { return p[1] - y0 }
	// The disc of radius 0.55 at (0.6, -0.55) crosses the edges x = 1
	// and y = -1 at arbitrary points; the parts beyond the two edges are
	// circular segments (distances d1 = 0.4, d2 = 0.45 from the centre)
	// that do not overlap (d1^2 + d2^2 > R^2: the corner lies outside),
	// so the area inside is pi R^2 less both segments.
	const R2, X2, Y2 = 0.55, 0.6, -0.55
	seg := func(R, d float64) float64 { return R*R*math.Acos(d/R) - d*math.Sqrt(R*R-d*d) }
	two := fmt.Sprintf("(x-%g)^2+(y-(%g))^2-%g", X2, Y2, R2*R2)
	twoArea := math.Pi*R2*R2 - seg(R2, 1-X2) - seg(R2, Y2+1)
	twoArc := 2*math.Pi*R2 - 2*R2*math.Acos((1-X2)/R2) - 2*R2*math.Acos((Y2+1)/R2)
	th, ea, eb, ex, ey := 1.1, 0.83, 0.37, 0.07, -0.11
	ell := ellipseSet(ea, eb, ex, ey, th)
	yrot := func(p []float64) float64 {
		v := -math.Sin(th)*(p[0]-ex) + math.Cos(th)*(p[1]-ey)
		return v * v
	}
	// A ball of radius 0.9 at (0.03, -0.02, 0) cut by the face z = zc of
	// the box [-1,1]^2 x [zc, 1]: the cap of height h = R - zc.
	const Rb, zc = 0.9, 0.3137
	hb := Rb - zc
	capSet := fmt.Sprintf("(x-0.03)^2+(y+0.02)^2+z^2-%g", Rb*Rb)
	capBox := []float64{-1, 1, -1, 1, zc, 1}
	cases := []closedCase{
		{"disc area pi r^2 (order 12)", Request{Shape: "quadrilateral", LevelSet: disc, Order: 12}, one, math.Pi * r * r, 1e-13},
		{"disc x^4 y^2 (Beta function, order 14)", Request{Shape: "quadrilateral", LevelSet: disc, Order: 14}, func(p []float64) float64 { return math.Pow(cx(p), 4) * math.Pow(cy(p), 2) }, discMoment(r, 2, 1), 1e-13},
		{"disc x^2 y^6 (Beta function, order 16)", Request{Shape: "quadrilateral", LevelSet: disc, Order: 16}, func(p []float64) float64 { return cx(p) * cx(p) * math.Pow(cy(p), 6) }, discMoment(r, 1, 3), 1e-13},
		{"circle length 2 pi r (order 12)", Request{Shape: "quadrilateral", LevelSet: disc, Order: 12, Side: Surface}, one, 2 * math.Pi * r, 1e-13},
		{"circle x^2 ds = pi r^3 (order 12)", Request{Shape: "quadrilateral", LevelSet: disc, Order: 12, Side: Surface}, func(p []float64) float64 { return cx(p) * cx(p) }, math.Pi * r * r * r, 1e-13},
		{"disc across two edges: pi R^2 less two segments", Request{Shape: "quadrilateral", LevelSet: two, Order: 16}, one, twoArea, 1e-13},
		{"arc across two edges: 2 pi R less two arcs", Request{Shape: "quadrilateral", LevelSet: two, Order: 16, Side: Surface}, one, twoArc, 1e-13},
		{"ellipse turned by 1.1: pi a b", Request{Shape: "quadrilateral", LevelSet: ell, Order: 16}, one, math.Pi * ea * eb, 1e-13},
		{"ellipse turned by 1.1: y'^2 = pi a b^3/4", Request{Shape: "quadrilateral", LevelSet: ell, Order: 16}, yrot, math.Pi * ea * eb * eb * eb / 4, 1e-13},
		{"shifted annulus in a box: pi (r2^2 - r1^2)", Request{Shape: "box", Box: []float64{-1.5, 1.25, -1.25, 1.5}, LevelSet: "((x-0.13)^2+(y+0.21)^2-0.1)*((x-0.13)^2+(y+0.21)^2-0.83)", Order: 16}, one, math.Pi * (0.83 - 0.1), 1e-13},
		{"octant of a ball in a box (order 12)", Request{Shape: "box", Box: []float64{0, 1, 0, 1, 0, 1}, LevelSet: "x^2+y^2+z^2-0.49", Order: 12}, one, math.Pi * 0.343 / 6, 1e-13},
		{"spherical cap pi h^2 (3R-h)/3 cut by a face", Request{Shape: "box", Box: capBox, LevelSet: capSet, Order: 12}, one, math.Pi * hb * hb * (3*Rb - hb) / 3, 1e-13},
		{"cap surface 2 pi R h (Archimedes)", Request{Shape: "box", Box: capBox, LevelSet: capSet, Order: 12, Side: Surface}, one, 2 * math.Pi * Rb * hb, 1e-13},
	}
	for _, c := range cases {
		if testing.Short() && len(c.req.Box) != 4 && c.req.Shape != "quadrilateral" {
			continue
		}
		rl := build(t, c.req)
		got := integral(rl, c.f)
		e := relErr(got, c.want)
		if !(e <= c.tol) {
			t.Errorf("%s: %.17g, want %.17g (relative error %.2g > %.0e); %d points", c.name, got, c.want, e, c.tol, len(rl.Nodes))
		} else {
			t.Logf("%s: relative error %.2g, %d points", c.name, e, len(rl.Nodes))
		}
	}
}
