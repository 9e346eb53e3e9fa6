package polytope

import (
	"math/big"
	"strings"
)

// similarity is the exact affine map x -> A w + t from a canonical form
// to the cell, with det = det A > 0.
type similarity struct {
	A   [][]*big.Rat
	t   []*big.Rat
	det *big.Rat
}

// canonicalPolygon returns the canonical form of p's class under
// translation, rotation and uniform scaling, its key, and the map from it
// to p. With the vertices z_i as complex numbers in counterclockwise
// order, the form started at vertex k is w_i = (z_(k+i) - z_k) /
// (z_(k+1) - z_k): exact, unchanged by any similarity (which multiplies
// the differences by one complex number), with w_0 = 0 and w_1 = 1. Of
// the starts on a longest edge (so that a sliver lies along the x axis of
// its form, where the frame's per-axis scaling undoes its aspect) the
// one with the smallest key is taken, so that the form depends on the
// class alone; the map back is z = z_k + e w with e =
// z_(k+1) - z_k, the rotation-and-scaling matrix [[a, -b], [b, a]].
func canonicalPolygon(p *Polygon) (*Polygon, string, similarity) {
	v := p.ccw()
	n := len(v)
	lens := make([]*big.Rat, n)
	longest := new(big.Rat)
	for k := 0; k < n; k++ {
		e := sub2(v[(k+1)%n], v[k])
		lens[k] = new(big.Rat).Mul(e[0], e[0])
		lens[k].Add(lens[k], new(big.Rat).Mul(e[1], e[1]))
		if lens[k].Cmp(longest) > 0 {
			longest = lens[k]
		}
	}
	best, bestK := "", -1
	var bestW [][2]*big.Rat
	for k := 0; k < n; k++ {
		if lens[k].Cmp(longest) != 0 {
			continue
		}
		e := sub2(v[(k+1)%n], v[k])
		nn := new(big.Rat).Mul(e[0], e[0])
		nn.Add(nn, new(big.Rat).Mul(e[1], e[1]))
		w := make([][2]*big.Rat, n)
		var sb strings.Builder
		for i := 0; i < n; i++ {
			d := sub2(v[(k+i)%n], v[k])
			// d / e = d conj(e) / |e|^2
			re := new(big.Rat).Mul(d[0], e[0])
			re.Add(re, new(big.Rat).Mul(d[1], e[1])).Quo(re, nn)
			im := new(big.Rat).Mul(d[1], e[0])
			im.Sub(im, new(big.Rat).Mul(d[0], e[1])).Quo(im, nn)
			w[i] = [2]*big.Rat{re, im}
			sb.WriteString(re.RatString())
			sb.WriteByte(',')
			sb.WriteString(im.RatString())
			sb.WriteByte(';')
		}
		if key := sb.String(); bestK < 0 || key < best {
			best, bestK, bestW = key, k, w
		}
	}
	e := sub2(v[(bestK+1)%n], v[bestK])
	det := new(big.Rat).Mul(e[0], e[0])
	det.Add(det, new(big.Rat).Mul(e[1], e[1]))
	sim := similarity{
		A:   [][]*big.Rat{{e[0], new(big.Rat).Neg(e[1])}, {e[1], e[0]}},
		t:   []*big.Rat{v[bestK][0], v[bestK][1]},
		det: det,
	}
	return &Polygon{V: bestW}, "polygon:" + best, sim
}

// canonicalPolyhedron returns the canonical form of p under translation
// and uniform scaling (vertices and faces in p's own order): w_i = (v_i -
// v_0) / s with s the largest |coordinate| of v_i - v_0. Rotations are not
// taken out: a rotation that maps one polyhedron onto another is in
// general not rational.
func canonicalPolyhedron(p *Polyhedron) (*Polyhedron, string, similarity) {
	s := new(big.Rat)
	for _, v := range p.V {
		d := sub3(v, p.V[0])
		for k := range d {
			if a := new(big.Rat).Abs(d[k]); a.Cmp(s) > 0 {
				s = a
			}
		}
	}
	var sb strings.Builder
	sb.WriteString("polyhedron:")
	q := &Polyhedron{F: p.F}
	for _, v := range p.V {
		d := sub3(v, p.V[0])
		for k := range d {
			d[k].Quo(d[k], s)
			sb.WriteString(d[k].RatString())
			sb.WriteByte(',')
		}
		sb.WriteByte(';')
		q.V = append(q.V, d)
	}
	for _, f := range p.F {
		for _, i := range f {
			sb.WriteString(big.NewInt(int64(i)).String())
			sb.WriteByte(' ')
		}
		sb.WriteByte('|')
	}
	z := new(big.Rat)
	sim := similarity{
		A:   [][]*big.Rat{{s, z, z}, {z, s, z}, {z, z, s}},
		t:   []*big.Rat{p.V[0][0], p.V[0][1], p.V[0][2]},
		det: new(big.Rat).Mul(s, new(big.Rat).Mul(s, s)),
	}
	return q, sb.String(), sim
}
