package polytope

import (
	"fmt"
	"math/big"
)

type vec3 = [3]*big.Rat

func sub3(a, b vec3) vec3 {
	return vec3{new(big.Rat).Sub(a[0], b[0]), new(big.Rat).Sub(a[1], b[1]), new(big.Rat).Sub(a[2], b[2])}
}

func crossProd(u, v vec3) vec3 {
	m := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Mul(a, b) }
	return vec3{
		new(big.Rat).Sub(m(u[1], v[2]), m(u[2], v[1])),
		new(big.Rat).Sub(m(u[2], v[0]), m(u[0], v[2])),
		new(big.Rat).Sub(m(u[0], v[1]), m(u[1], v[0])),
	}
}

func dot3(u, v vec3) *big.Rat {
	s := new(big.Rat).Mul(u[0], v[0])
	s.Add(s, new(big.Rat).Mul(u[1], v[1]))
	return s.Add(s, new(big.Rat).Mul(u[2], v[2]))
}

// det3 is det[a-o, b-o, c-o]: six times the signed volume of the
// tetrahedron o, a, b, c.
func det3(o, a, b, c vec3) *big.Rat {
	return dot3(sub3(a, o), crossProd(sub3(b, o), sub3(c, o)))
}

// newell is the normal of a face by Newell's method: twice its vector
// area, exact; zero for a face of zero area.
func newell(v []vec3) vec3 {
	n := vec3{new(big.Rat), new(big.Rat), new(big.Rat)}
	o := v[0]
	for i := 1; i+1 < len(v); i++ {
		c := crossProd(sub3(v[i], o), sub3(v[i+1], o))
		for k := range n {
			n[k].Add(n[k], c[k])
		}
	}
	return n
}

func (p *Polyhedron) faceVerts(f int) []vec3 {
	out := make([]vec3, len(p.F[f]))
	for k, i := range p.F[f] {
		out[k] = p.V[i]
	}
	return out
}

// Validate checks that p is a closed, consistently oriented polyhedron:
// at least four vertices, every vertex in some face, every face with
// distinct vertices, non-zero area and all its vertices on one plane,
// every edge in exactly two faces that traverse it in opposite
// directions, and non-zero volume. The error names the face, edge or
// vertex (1-based). Self-intersection of the surface is not tested.
func (p *Polyhedron) Validate() error {
	if len(p.V) < 4 {
		return fmt.Errorf("a polyhedron needs at least 4 vertices, this one has %d", len(p.V))
	}
	if len(p.F) < 4 {
		return fmt.Errorf("a polyhedron needs at least 4 faces, this one has %d", len(p.F))
	}
	seen := make(map[string]int, len(p.V))
	for i, v := range p.V {
		k := v[0].RatString() + " " + v[1].RatString() + " " + v[2].RatString()
		if j, ok := seen[k]; ok {
			return fmt.Errorf("vertices %d and %d are the same point", j+1, i+1)
		}
		seen[k] = i
	}
	used := make([]bool, len(p.V))
	type edge struct{ a, b int }
	dir := map[edge]int{}
	for f, face := range p.F {
		in := map[int]bool{}
		for _, i := range face {
			if in[i] {
				return fmt.Errorf("face %d lists vertex %d twice", f+1, i+1)
			}
			in[i] = true
			used[i] = true
		}
		vs := p.faceVerts(f)
		n := newell(vs)
		if n[0].Sign() == 0 && n[1].Sign() == 0 && n[2].Sign() == 0 {
			return fmt.Errorf("face %d has zero area", f+1)
		}
		for k := range vs {
			if dot3(sub3(vs[k], vs[0]), n).Sign() != 0 {
				return fmt.Errorf("face %d is not planar: vertex %d is off the plane of the others", f+1, face[k]+1)
			}
		}
		if err := crossingEdges(project(vs, n)); err != nil {
			return fmt.Errorf("face %d is not a simple polygon: %v", f+1, err)
		}
		for k, a := range face {
			b := face[(k+1)%len(face)]
			e := edge{a, b}
			if g, ok := dir[e]; ok {
				return fmt.Errorf("edge %d-%d is traversed in the same direction by faces %d and %d: the orientation is inconsistent (or the edge lies in more than two faces)", a+1, b+1, g+1, f+1)
			}
			dir[e] = f
		}
	}
	for i, u := range used {
		if !u {
			return fmt.Errorf("vertex %d lies in no face", i+1)
		}
	}
	for e, f := range dir {
		if _, ok := dir[edge{e.b, e.a}]; !ok {
			return fmt.Errorf("edge %d-%d lies only in face %d: the surface is not closed", e.a+1, e.b+1, f+1)
		}
	}
	if p.volume6().Sign() == 0 {
		return fmt.Errorf("the polyhedron has zero volume")
	}
	if _, err := p.tetrahedra(); err != nil {
		return err
	}
	return nil
}

// volume6 is six times the signed volume (positive for outward faces).
func (p *Polyhedron) volume6() *big.Rat {
	s := new(big.Rat)
	o := vec3{new(big.Rat), new(big.Rat), new(big.Rat)}
	for f := range p.F {
		vs := p.faceVerts(f)
		for i := 1; i+1 < len(vs); i++ {
			s.Add(s, det3(o, vs[0], vs[i], vs[i+1]))
		}
	}
	return s
}

// orientation is +1 when the faces turn outward (counterclockwise seen
// from outside), -1 when inward.
func (p *Polyhedron) orientation() int {
	return p.volume6().Sign()
}

// boundaryTriangles triangulates every face (ear clipping in the
// coordinate plane the face projects onto best) into triangles oriented
// outward.
func (p *Polyhedron) boundaryTriangles() [][3]vec3 {
	sgn := p.orientation()
	var out [][3]vec3
	for f := range p.F {
		vs := p.faceVerts(f)
		if sgn < 0 {
			for i, j := 0, len(vs)-1; i < j; i, j = i+1, j-1 {
				vs[i], vs[j] = vs[j], vs[i]
			}
		}
		n := newell(vs)
		drop := dominant(n)
		ax := [2]int{(drop + 1) % 3, (drop + 2) % 3}
		flat := make([][2]*big.Rat, len(vs))
		back := map[string]vec3{}
		for i, v := range vs {
			flat[i] = [2]*big.Rat{v[ax[0]], v[ax[1]]}
			back[flat[i][0].RatString()+" "+flat[i][1].RatString()] = v
		}
		flip := n[drop].Sign() < 0
		if flip {
			for i, j := 0, len(flat)-1; i < j; i, j = i+1, j-1 {
				flat[i], flat[j] = flat[j], flat[i]
			}
		}
		for _, t := range earClipLoose(flat) {
			tri := [3]vec3{}
			for k := range t {
				tri[k] = back[t[k][0].RatString()+" "+t[k][1].RatString()]
			}
			if flip {
				tri[1], tri[2] = tri[2], tri[1]
			}
			out = append(out, tri)
		}
	}
	return out
}

// dominant is the axis of the largest component of n: the coordinate a
// face with normal n is projected along.
func dominant(n vec3) int {
	drop := 0
	for k := 1; k < 3; k++ {
		if new(big.Rat).Abs(n[k]).Cmp(new(big.Rat).Abs(n[drop])) > 0 {
			drop = k
		}
	}
	return drop
}

// project drops the dominant coordinate of a planar face's vertices
// (a one-to-one map of its plane).
func project(vs []vec3, n vec3) [][2]*big.Rat {
	drop := dominant(n)
	out := make([][2]*big.Rat, len(vs))
	for i, v := range vs {
		out[i] = [2]*big.Rat{v[(drop+1)%3], v[(drop+2)%3]}
	}
	return out
}

// earClipLoose is earClip for a face outline, which may have straight
// corners (a vertex on the line of its neighbours, common where faces
// meet along a subdivided edge).
func earClipLoose(v [][2]*big.Rat) [][3][2]*big.Rat {
	if areaSign(v) < 0 {
		w := make([][2]*big.Rat, len(v))
		for i := range v {
			w[len(v)-1-i] = v[i]
		}
		v = w
	}
	return earClip(v)
}

// tetrahedra subdivides the polyhedron into tetrahedra: cones from one
// point of its kernel over the boundary triangles. The point is tried
// among the centroid of the vertices, the vertices, the face centroids
// and the edge midpoints; a polyhedron star-shaped from none of them is
// refused (this build subdivides only such polyhedra).
func (p *Polyhedron) tetrahedra() ([][4]vec3, error) {
	tris := p.boundaryTriangles()
	var cands []vec3
	mean := func(vs []vec3) vec3 {
		c := vec3{new(big.Rat), new(big.Rat), new(big.Rat)}
		for _, v := range vs {
			for k := range c {
				c[k].Add(c[k], v[k])
			}
		}
		for k := range c {
			c[k].Quo(c[k], big.NewRat(int64(len(vs)), 1))
		}
		return c
	}
	cands = append(cands, mean(p.V))
	for f := range p.F {
		cands = append(cands, mean(p.faceVerts(f)))
	}
	cands = append(cands, p.V...)
	for f, face := range p.F {
		for k := range face {
			cands = append(cands, mean([]vec3{p.V[face[k]], p.V[face[(k+1)%len(face)]]}))
		}
		_ = f
	}
	for _, c := range cands {
		var tets [][4]vec3
		ok := true
		for _, t := range tris {
			s := det3(c, t[0], t[1], t[2]).Sign()
			if s < 0 {
				ok = false
				break
			}
			if s > 0 {
				tets = append(tets, [4]vec3{c, t[0], t[1], t[2]})
			}
		}
		if ok {
			return tets, nil
		}
	}
	return nil, fmt.Errorf("the polyhedron is not star-shaped from its centroid, a vertex, a face centroid or an edge midpoint; this build subdivides only such polyhedra (split the cell)")
}
