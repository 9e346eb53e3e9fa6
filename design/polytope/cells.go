package polytope

import (
	"math"
	"math/big"
)

type polygonCell struct{ p *Polygon }

func (c polygonCell) dimension() int { return 2 }

func (c polygonCell) canonical() (func() cell, string, similarity) {
	q, key, sim := canonicalPolygon(c.p)
	return func() cell { return polygonCell{q()} }, key, sim
}

func (c polygonCell) moments(deg int) []*big.Rat { return PolygonMoments(c.p, deg) }

func (c polygonCell) momentFracs(deg int) ([]*big.Int, []*big.Int) {
	return polygonMomentFracs(c.p, deg)
}

func (c polygonCell) simplices() [][][]*big.Rat {
	var out [][][]*big.Rat
	for _, t := range earClip(c.p.ccw()) {
		out = append(out, [][]*big.Rat{t[0][:], t[1][:], t[2][:]})
	}
	return out
}

// frameOf returns the centre of the bounding box of the points and its
// half-extent along each axis. The frame is scaled per axis, not
// uniformly: a sliver (aspect 30) framed uniformly fills a strip of the
// box, on which the box's Legendre basis of degree 8 is already
// numerically dependent; the polynomials of degree <= D are the same
// after any affine map.
func frameOf(pts [][]*big.Rat) ([]*big.Rat, []*big.Rat) {
	dim := len(pts[0])
	c := make([]*big.Rat, dim)
	h := make([]*big.Rat, dim)
	for k := 0; k < dim; k++ {
		lo, hi := pts[0][k], pts[0][k]
		for _, p := range pts {
			if p[k].Cmp(lo) < 0 {
				lo = p[k]
			}
			if p[k].Cmp(hi) > 0 {
				hi = p[k]
			}
		}
		c[k] = new(big.Rat).Add(lo, hi)
		c[k].Quo(c[k], big.NewRat(2, 1))
		h[k] = new(big.Rat).Sub(hi, lo)
		h[k].Quo(h[k], big.NewRat(2, 1))
	}
	return c, h
}

func toFrame(p []*big.Rat, c []*big.Rat, h []*big.Rat) []*big.Rat {
	out := make([]*big.Rat, len(p))
	for k := range p {
		out[k] = new(big.Rat).Sub(p[k], c[k])
		out[k].Quo(out[k], h[k])
	}
	return out
}

func (c polygonCell) framed() (cell, []*big.Rat, []*big.Rat) {
	pts := make([][]*big.Rat, len(c.p.V))
	for i := range c.p.V {
		pts[i] = c.p.V[i][:]
	}
	ctr, h := frameOf(pts)
	q := &Polygon{V: make([][2]*big.Rat, len(pts))}
	for i, p := range pts {
		f := toFrame(p, ctr, h)
		q.V[i] = [2]*big.Rat{f[0], f[1]}
	}
	return polygonCell{q}, ctr, h
}

// insideOpen is the float64 test of the iterations: inside by the
// crossing number, and farther than 1e-12 (of the frame's half-width 1)
// from every edge.
func (c polygonCell) insideOpen() func(x []float64) bool {
	v := c.p.V
	n := len(v)
	xs := make([][2]float64, n)
	for i := range v {
		xs[i][0], _ = v[i][0].Float64()
		xs[i][1], _ = v[i][1].Float64()
	}
	return func(x []float64) bool {
		in := false
		for i := 0; i < n; i++ {
			a, b := xs[i], xs[(i+1)%n]
			if (a[1] > x[1]) != (b[1] > x[1]) {
				t := (x[1] - a[1]) / (b[1] - a[1])
				if a[0]+t*(b[0]-a[0]) > x[0] {
					in = !in
				}
			}
			if segDist2(a, b, x) < 1e-24 {
				return false
			}
		}
		return in
	}
}

// segDist2 is the squared distance from x to the segment ab (squared,
// so that the test of every node against every edge takes no root).
func segDist2(a, b [2]float64, x []float64) float64 {
	dx, dy := b[0]-a[0], b[1]-a[1]
	t := ((x[0]-a[0])*dx + (x[1]-a[1])*dy) / (dx*dx + dy*dy)
	t = math.Max(0, math.Min(1, t))
	ex, ey := x[0]-a[0]-t*dx, x[1]-a[1]-t*dy
	return ex*ex + ey*ey
}

func (c polygonCell) describe() (string, [][]string, [][]int) {
	return "polygon", c.p.Src, nil
}

type polyhedronCell struct{ p *Polyhedron }

func (c polyhedronCell) dimension() int { return 3 }

func (c polyhedronCell) canonical() (func() cell, string, similarity) {
	q, key, sim := canonicalPolyhedron(c.p)
	return func() cell { return polyhedronCell{q} }, key, sim
}

func (c polyhedronCell) moments(deg int) []*big.Rat { return PolyhedronMoments(c.p, deg) }

func (c polyhedronCell) momentFracs(deg int) ([]*big.Int, []*big.Int) {
	return polyhedronMomentFracs(c.p, deg)
}

func (c polyhedronCell) simplices() [][][]*big.Rat {
	tets, err := c.p.tetrahedra()
	if err != nil {
		panic("polytope: a validated polyhedron has no subdivision")
	}
	out := make([][][]*big.Rat, len(tets))
	for i, t := range tets {
		out[i] = [][]*big.Rat{t[0][:], t[1][:], t[2][:], t[3][:]}
	}
	return out
}

func (c polyhedronCell) framed() (cell, []*big.Rat, []*big.Rat) {
	pts := make([][]*big.Rat, len(c.p.V))
	for i := range c.p.V {
		pts[i] = c.p.V[i][:]
	}
	ctr, h := frameOf(pts)
	q := &Polyhedron{F: c.p.F, V: make([][3]*big.Rat, len(pts))}
	for i, p := range pts {
		f := toFrame(p, ctr, h)
		q.V[i] = [3]*big.Rat{f[0], f[1], f[2]}
	}
	return polyhedronCell{q}, ctr, h
}

// insideOpen: in some cone tetrahedron of the star subdivision (all
// barycentric coordinates >= -1e-12) and farther than 1e-12 from its
// boundary face (the coordinate of the apex >= 1e-12).
func (c polyhedronCell) insideOpen() func(x []float64) bool {
	type tet struct {
		T [3][3]float64
		o [3]float64
	} // inverse of the edge matrix, apex
	var ts []tet
	for _, s := range c.simplices() {
		var o [3]float64
		var E [3][3]float64
		for k := 0; k < 3; k++ {
			o[k], _ = s[0][k].Float64()
		}
		for j := 0; j < 3; j++ {
			for k := 0; k < 3; k++ {
				v, _ := s[j+1][k].Float64()
				E[k][j] = v - o[k]
			}
		}
		ts = append(ts, tet{inv3(E), o})
	}
	return func(x []float64) bool {
		for _, t := range ts {
			var l [3]float64
			sum := 0.0
			for j := 0; j < 3; j++ {
				for k := 0; k < 3; k++ {
					l[j] += t.T[j][k] * (x[k] - t.o[k])
				}
				sum += l[j]
			}
			if l[0] >= -1e-12 && l[1] >= -1e-12 && l[2] >= -1e-12 && 1-sum >= 1e-12 {
				return true
			}
		}
		return false
	}
}

func inv3(m [3][3]float64) [3][3]float64 {
	var r [3][3]float64
	det := m[0][0]*(m[1][1]*m[2][2]-m[1][2]*m[2][1]) - m[0][1]*(m[1][0]*m[2][2]-m[1][2]*m[2][0]) + m[0][2]*(m[1][0]*m[2][1]-m[1][1]*m[2][0])
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			a, b := (j+1)%3, (j+2)%3
			c, d := (i+1)%3, (i+2)%3
			r[i][j] = (m[a][c]*m[b][d] - m[a][d]*m[b][c]) / det
		}
	}
	return r
}

func (c polyhedronCell) describe() (string, [][]string, [][]int) {
	return "polyhedron", c.p.Src, c.p.F
}
