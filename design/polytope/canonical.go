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
// translation, rotation and uniform scaling (built when called: a batch
// needs it once per class), its key, and the map from it to p. With the
// vertices z_i as complex numbers in counterclockwise order, the form
// started at vertex k is w_i = (z_(k+i) - z_k) / (z_(k+1) - z_k): exact,
// unchanged by any similarity (which multiplies the differences by one
// complex number), with w_0 = 0 and w_1 = 1. Of the starts on a longest
// edge (so that a sliver lies along the x axis of its form, where the
// frame's per-axis scaling undoes its aspect) the one with the smallest
// key is taken, so that the form depends on the class alone; the map back
// is z = z_k + e w with e = z_(k+1) - z_k, the rotation-and-scaling matrix
// [[a, -b], [b, a]].
//
// The arithmetic runs on integers: with the vertices scaled by their
// common denominator, w_i = (d_i . e, e x d_i) / |e|^2 with integer d_i
// and e, and the key is that tuple over its common denominator, reduced by
// the gcd of all its entries: the one such representation of the tuple of
// rationals, so equal keys mean equal forms.
func canonicalPolygon(p *Polygon) (func() *Polygon, string, similarity) {
	v := p.ccw()
	n := len(v)
	pts := make([][]*big.Rat, n)
	for i := range v {
		pts[i] = v[i][:]
	}
	L := commonDenom(pts)
	iv := scaleToInts(pts, L)
	t := new(big.Int)
	edge := func(k int) (e0, e1, nn *big.Int) {
		a, b := iv[k], iv[(k+1)%n]
		e0, e1 = new(big.Int).Sub(b[0], a[0]), new(big.Int).Sub(b[1], a[1])
		nn = new(big.Int).Mul(e0, e0)
		return e0, e1, nn.Add(nn, t.Mul(e1, e1))
	}
	lens := make([]*big.Int, n)
	longest := new(big.Int)
	for k := 0; k < n; k++ {
		_, _, lens[k] = edge(k)
		if lens[k].Cmp(longest) > 0 {
			longest = lens[k]
		}
	}
	ties := 0
	for k := 0; k < n; k++ {
		if lens[k].Cmp(longest) == 0 {
			ties++
		}
	}
	best, bestRat, bestK := "", "", -1
	var bestNum []*big.Int
	var bestDen *big.Int
	d0, d1 := new(big.Int), new(big.Int)
	for k := 0; k < n; k++ {
		if lens[k].Cmp(longest) != 0 {
			continue
		}
		e0, e1, nn := edge(k)
		num := make([]*big.Int, 2*n)
		g := new(big.Int).Set(nn)
		for i := 0; i < n; i++ {
			a := iv[(k+i)%n]
			d0.Sub(a[0], iv[k][0])
			d1.Sub(a[1], iv[k][1])
			// d / e = d conj(e) / |e|^2
			re := new(big.Int).Mul(d0, e0)
			re.Add(re, t.Mul(d1, e1))
			im := new(big.Int).Mul(d1, e0)
			im.Sub(im, t.Mul(d0, e1))
			num[2*i], num[2*i+1] = re, im
			if g.Cmp(bigOne) != 0 {
				g.GCD(nil, nil, g, t.Abs(re))
				g.GCD(nil, nil, g, t.Abs(im))
			}
		}
		var sb strings.Builder
		den := new(big.Int).Quo(nn, g)
		sb.WriteString(den.String())
		for _, x := range num {
			x.Quo(x, g)
			sb.WriteByte(',')
			sb.WriteString(x.String())
		}
		key := sb.String()
		if ties == 1 {
			best, bestK, bestNum, bestDen = key, k, num, den
			break
		}
		// Among starts on equally long edges, the order of the forms'
		// coordinates written as reduced rationals decides (any order
		// that depends on the form alone would do; this one picks the
		// start the rational route always picked).
		var rs strings.Builder
		for i, x := range num {
			rs.WriteString(new(big.Rat).SetFrac(x, den).RatString())
			rs.WriteByte(",;"[i%2])
		}
		if r := rs.String(); bestK < 0 || r < bestRat {
			best, bestRat, bestK, bestNum, bestDen = key, r, k, num, den
		}
	}
	e0, e1, nn := edge(bestK)
	a := new(big.Rat).SetFrac(e0, L)
	b := new(big.Rat).SetFrac(e1, L)
	sim := similarity{
		A:   [][]*big.Rat{{a, new(big.Rat).Neg(b)}, {b, a}},
		t:   []*big.Rat{v[bestK][0], v[bestK][1]},
		det: new(big.Rat).SetFrac(nn, new(big.Int).Mul(L, L)),
	}
	form := func() *Polygon {
		w := make([][2]*big.Rat, n)
		for i := range w {
			w[i] = [2]*big.Rat{new(big.Rat).SetFrac(bestNum[2*i], bestDen), new(big.Rat).SetFrac(bestNum[2*i+1], bestDen)}
		}
		return &Polygon{V: w}
	}
	return form, "polygon:" + best, sim
}

var bigOne = big.NewInt(1)

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
