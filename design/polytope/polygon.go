package polytope

import (
	"fmt"
	"math"
	"math/big"
)

func sub2(a, b [2]*big.Rat) [2]*big.Rat {
	return [2]*big.Rat{new(big.Rat).Sub(a[0], b[0]), new(big.Rat).Sub(a[1], b[1])}
}

// cross2 is the z-component of (b - a) x (c - a): twice the signed area of
// the triangle a, b, c.
func cross2(a, b, c [2]*big.Rat) *big.Rat {
	u, v := sub2(b, a), sub2(c, a)
	l := new(big.Rat).Mul(u[0], v[1])
	return l.Sub(l, new(big.Rat).Mul(u[1], v[0]))
}

// onSegment reports whether p, known collinear with a and b, lies on the
// closed segment ab.
func onSegment(a, b, p [2]*big.Rat) bool {
	for k := 0; k < 2; k++ {
		lo, hi := a[k], b[k]
		if lo.Cmp(hi) > 0 {
			lo, hi = hi, lo
		}
		if p[k].Cmp(lo) < 0 || p[k].Cmp(hi) > 0 {
			return false
		}
	}
	return true
}

// segmentsMeet reports whether the closed segments from vertex i to j and
// from k to l share a point.
func (o *outline) segmentsMeet(i, j, k, l int) bool {
	a, b, c, d := o.v[i], o.v[j], o.v[k], o.v[l]
	d1, d2 := o.orient(i, j, k), o.orient(i, j, l)
	d3, d4 := o.orient(k, l, i), o.orient(k, l, j)
	if d1*d2 < 0 && d3*d4 < 0 {
		return true
	}
	return d1 == 0 && onSegment(a, b, c) || d2 == 0 && onSegment(a, b, d) ||
		d3 == 0 && onSegment(c, d, a) || d4 == 0 && onSegment(c, d, b)
}

// outline is a closed polygonal line held exactly and as the nearest
// float64 values, for the orientation predicates.
type outline struct {
	v [][2]*big.Rat
	f [][2]float64
	// X is the largest magnitude of any float64 coordinate.
	X float64
}

func newOutline(v [][2]*big.Rat) *outline {
	o := &outline{v: v, f: make([][2]float64, len(v))}
	for i := range v {
		o.f[i][0], _ = v[i][0].Float64()
		o.f[i][1], _ = v[i][1].Float64()
		o.X = math.Max(o.X, math.Max(math.Abs(o.f[i][0]), math.Abs(o.f[i][1])))
	}
	return o
}

// orient is the sign of cross2 of the vertices i, j, k, decided in
// float64 when a proven bound on the float64 value's error says the sign
// is right, else exactly. Each coordinate converts with relative error at
// most u = 2^-53; with X at least the magnitude of every coordinate, each
// difference is then off by at most 4 u X (two conversions, one rounding,
// to first order), each product by at most 20 u X^2, the result by at
// most 48 u X^2: a float64 value larger than 64 u X^2 in magnitude has
// the sign of the exact one. (Common practice: J. R. Shewchuk, "Adaptive
// precision floating-point arithmetic and fast robust geometric
// predicates", Discrete Comput. Geom. 18, 1997, filters the same way.)
func (o *outline) orient(i, j, k int) int {
	a, b, c := o.f[i], o.f[j], o.f[k]
	d := (b[0]-a[0])*(c[1]-a[1]) - (b[1]-a[1])*(c[0]-a[0])
	if bound := 64 * 0x1p-53 * o.X * o.X; !math.IsInf(bound, 0) && bound > 0x1p-1000 && math.Abs(d) > bound {
		if d > 0 {
			return 1
		}
		return -1
	}
	return cross2(o.v[i], o.v[j], o.v[k]).Sign()
}

// areaSign is the sign of signedArea2(v), decided in float64 when a
// proven bound allows it (as orient: each of the n terms x_i y_(i+1) -
// x_(i+1) y_i is off by at most 8 u X^2, and summing n terms of magnitude
// at most 2 X^2 adds at most 2 n^2 u X^2), else exactly.
func areaSign(v [][2]*big.Rat) int { return newOutline(v).areaSign() }

func (o *outline) areaSign() int {
	n := len(o.f)
	s := 0.0
	for i := range o.f {
		j := (i + 1) % n
		s += o.f[i][0]*o.f[j][1] - o.f[j][0]*o.f[i][1]
	}
	nf := float64(n)
	if bound := 2 * (8*nf + 2*nf*nf) * 0x1p-53 * o.X * o.X; !math.IsInf(bound, 0) && bound > 0x1p-1000 && math.Abs(s) > bound {
		if s > 0 {
			return 1
		}
		return -1
	}
	return signedArea2(o.v).Sign()
}

// signedArea2 is twice the signed area (positive counterclockwise).
func signedArea2(v [][2]*big.Rat) *big.Rat {
	s := new(big.Rat)
	zero := [2]*big.Rat{new(big.Rat), new(big.Rat)}
	for i := range v {
		s.Add(s, cross2(zero, v[i], v[(i+1)%len(v)]))
	}
	return s
}

// Validate checks that p is a simple polygon: at least three vertices, no
// vertex repeated, no vertex on the line through its two neighbours (a
// straight or folded-back corner), no two edges meeting except adjacent
// ones at their common vertex, non-zero area. The error names the
// vertices or edges (1-based, edge i joining vertex i to vertex i+1).
func (p *Polygon) Validate() error {
	n := len(p.V)
	if n < 3 {
		return fmt.Errorf("a polygon needs at least 3 vertices, this one has %d", n)
	}
	seen := make(map[string]int, n)
	for i, v := range p.V {
		k := v[0].RatString() + " " + v[1].RatString()
		if j, ok := seen[k]; ok {
			return fmt.Errorf("vertices %d and %d are the same point (%s, %s)", j+1, i+1, v[0].RatString(), v[1].RatString())
		}
		seen[k] = i
	}
	o := newOutline(p.V)
	for i := range p.V {
		if o.orient((i+n-1)%n, i, (i+1)%n) == 0 {
			return fmt.Errorf("vertex %d lies on the line through its neighbours %d and %d (a degenerate corner)", i+1, (i+n-1)%n+1, (i+1)%n+1)
		}
	}
	if err := o.crossingEdges(); err != nil {
		return err
	}
	if o.areaSign() == 0 {
		return fmt.Errorf("the polygon has zero area")
	}
	return nil
}

// crossingEdges reports the first two non-adjacent edges of the closed
// outline v that share a point, and adjacent edges that fold back onto
// each other.
func crossingEdges(v [][2]*big.Rat) error { return newOutline(v).crossingEdges() }

func (o *outline) crossingEdges() error {
	v := o.v
	n := len(v)
	for i := 0; i < n; i++ {
		a, b, c := v[(i+n-1)%n], v[i], v[(i+1)%n]
		if o.orient((i+n-1)%n, i, (i+1)%n) != 0 {
			continue
		}
		u, w := sub2(a, b), sub2(c, b)
		dot := new(big.Rat).Mul(u[0], w[0])
		dot.Add(dot, new(big.Rat).Mul(u[1], w[1]))
		if dot.Sign() > 0 {
			return fmt.Errorf("edges %d and %d fold back onto each other at vertex %d", (i+n-1)%n+1, i+1, i+1)
		}
	}
	for i := 0; i < n; i++ {
		for j := i + 2; j < n; j++ {
			if i == 0 && j == n-1 {
				continue // adjacent through vertex 1
			}
			if o.segmentsMeet(i, (i+1)%n, j, (j+1)%n) {
				return fmt.Errorf("edges %d (vertices %d-%d) and %d (vertices %d-%d) intersect: the polygon is not simple", i+1, i+1, (i+1)%n+1, j+1, j+1, (j+1)%n+1)
			}
		}
	}
	return nil
}

// ccw returns the vertices in counterclockwise order.
// The result is computed once and kept (a cell's canonical form,
// subdivision and moments all ask for it); p.V must not change after.
func (p *Polygon) ccw() [][2]*big.Rat {
	if p.ccwV != nil {
		return p.ccwV
	}
	if areaSign(p.V) > 0 {
		p.ccwV = p.V
		return p.V
	}
	out := make([][2]*big.Rat, len(p.V))
	for i, v := range p.V {
		out[len(p.V)-1-i] = v
	}
	p.ccwV = out
	return out
}

// earClip triangulates the counterclockwise simple polygon v (exactly)
// by removing ears: n-2 triangles, each counterclockwise.
func earClip(v [][2]*big.Rat) [][3][2]*big.Rat {
	o := newOutline(v)
	idx := make([]int, len(v))
	for i := range idx {
		idx[i] = i
	}
	var tris [][3][2]*big.Rat
	for len(idx) > 3 {
		m := len(idx)
		cut := false
		for k := 0; k < m; k++ {
			ia, ib, ic := idx[(k+m-1)%m], idx[k], idx[(k+1)%m]
			a, b, c := v[ia], v[ib], v[ic]
			if o.orient(ia, ib, ic) <= 0 {
				continue // reflex or straight
			}
			ear := true
			for _, j := range idx {
				if j == ia || j == ib || j == ic {
					continue
				}
				if o.orient(ia, ib, j) >= 0 && o.orient(ib, ic, j) >= 0 && o.orient(ic, ia, j) >= 0 {
					ear = false
					break
				}
			}
			if !ear {
				continue
			}
			tris = append(tris, [3][2]*big.Rat{a, b, c})
			idx = append(idx[:k], idx[k+1:]...)
			cut = true
			break
		}
		if !cut {
			// Only straight corners remain (collinear leftovers of earlier
			// cuts): drop one, its triangle has zero area.
			for k := 0; k < m; k++ {
				if o.orient(idx[(k+m-1)%m], idx[k], idx[(k+1)%m]) == 0 {
					idx = append(idx[:k], idx[k+1:]...)
					cut = true
					break
				}
			}
			if !cut {
				panic("polytope: ear clipping found no ear in a validated polygon")
			}
		}
	}
	if o.orient(idx[0], idx[1], idx[2]) != 0 {
		tris = append(tris, [3][2]*big.Rat{v[idx[0]], v[idx[1]], v[idx[2]]})
	}
	return tris
}
