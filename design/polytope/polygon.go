package polytope

import (
	"fmt"
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

// segmentsMeet reports whether the closed segments ab and cd share a point.
func segmentsMeet(a, b, c, d [2]*big.Rat) bool {
	d1, d2 := cross2(a, b, c).Sign(), cross2(a, b, d).Sign()
	d3, d4 := cross2(c, d, a).Sign(), cross2(c, d, b).Sign()
	if d1*d2 < 0 && d3*d4 < 0 {
		return true
	}
	return d1 == 0 && onSegment(a, b, c) || d2 == 0 && onSegment(a, b, d) ||
		d3 == 0 && onSegment(c, d, a) || d4 == 0 && onSegment(c, d, b)
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
	for i := range p.V {
		a, b, c := p.V[(i+n-1)%n], p.V[i], p.V[(i+1)%n]
		if cross2(a, b, c).Sign() == 0 {
			return fmt.Errorf("vertex %d lies on the line through its neighbours %d and %d (a degenerate corner)", i+1, (i+n-1)%n+1, (i+1)%n+1)
		}
	}
	if err := crossingEdges(p.V); err != nil {
		return err
	}
	if signedArea2(p.V).Sign() == 0 {
		return fmt.Errorf("the polygon has zero area")
	}
	return nil
}

// crossingEdges reports the first two non-adjacent edges of the closed
// outline v that share a point, and adjacent edges that fold back onto
// each other.
func crossingEdges(v [][2]*big.Rat) error {
	n := len(v)
	for i := 0; i < n; i++ {
		a, b, c := v[(i+n-1)%n], v[i], v[(i+1)%n]
		u, w := sub2(a, b), sub2(c, b)
		dot := new(big.Rat).Mul(u[0], w[0])
		dot.Add(dot, new(big.Rat).Mul(u[1], w[1]))
		if cross2(a, b, c).Sign() == 0 && dot.Sign() > 0 {
			return fmt.Errorf("edges %d and %d fold back onto each other at vertex %d", (i+n-1)%n+1, i+1, i+1)
		}
	}
	for i := 0; i < n; i++ {
		for j := i + 2; j < n; j++ {
			if i == 0 && j == n-1 {
				continue // adjacent through vertex 1
			}
			if segmentsMeet(v[i], v[(i+1)%n], v[j], v[(j+1)%n]) {
				return fmt.Errorf("edges %d (vertices %d-%d) and %d (vertices %d-%d) intersect: the polygon is not simple", i+1, i+1, (i+1)%n+1, j+1, j+1, (j+1)%n+1)
			}
		}
	}
	return nil
}

// ccw returns the vertices in counterclockwise order.
func (p *Polygon) ccw() [][2]*big.Rat {
	if signedArea2(p.V).Sign() > 0 {
		return p.V
	}
	out := make([][2]*big.Rat, len(p.V))
	for i, v := range p.V {
		out[len(p.V)-1-i] = v
	}
	return out
}

// earClip triangulates the counterclockwise simple polygon v (exactly)
// by removing ears: n-2 triangles, each counterclockwise.
func earClip(v [][2]*big.Rat) [][3][2]*big.Rat {
	idx := make([]int, len(v))
	for i := range idx {
		idx[i] = i
	}
	var tris [][3][2]*big.Rat
	for len(idx) > 3 {
		m := len(idx)
		cut := false
		for k := 0; k < m; k++ {
			a, b, c := v[idx[(k+m-1)%m]], v[idx[k]], v[idx[(k+1)%m]]
			if cross2(a, b, c).Sign() <= 0 {
				continue // reflex or straight
			}
			ear := true
			for _, j := range idx {
				q := v[j]
				if j == idx[(k+m-1)%m] || j == idx[k] || j == idx[(k+1)%m] {
					continue
				}
				if cross2(a, b, q).Sign() >= 0 && cross2(b, c, q).Sign() >= 0 && cross2(c, a, q).Sign() >= 0 {
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
				if cross2(v[idx[(k+m-1)%m]], v[idx[k]], v[idx[(k+1)%m]]).Sign() == 0 {
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
	if cross2(v[idx[0]], v[idx[1]], v[idx[2]]).Sign() != 0 {
		tris = append(tris, [3][2]*big.Rat{v[idx[0]], v[idx[1]], v[idx[2]]})
	}
	return tris
}
