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

// segmentsMeet reports whether the closed segments ab and cd share a point.
func segmentsMeet(a, b, c, d [2]*big.Rat) bool {
	d1, d2 := orient2(a, b, c), orient2(a, b, d)
	d3, d4 := orient2(c, d, a), orient2(c, d, b)
	if d1*d2 < 0 && d3*d4 < 0 {
		return true
	}
	return d1 == 0 && onSegment(a, b, c) || d2 == 0 && onSegment(a, b, d) ||
		d3 == 0 && onSegment(c, d, a) || d4 == 0 && onSegment(c, d, b)
}

// orient2 is the sign of cross2(a, b, c), decided in float64 when a
// proven bound on the float64 value's error says the sign is right, else
// exactly. Each coordinate converts with relative error at most u = 2^-53;
// with X the largest magnitude among the six, each difference is then off
// by at most 4 u X (two conversions, one rounding, to first order), each
// product by at most 20 u X^2, the result by at most 48 u X^2: a float64
// value larger than 64 u X^2 in magnitude has the sign of the exact one.
// (Common practice: J. R. Shewchuk's adaptive predicates, "Adaptive
// precision floating-point arithmetic and fast robust geometric
// predicates", Discrete Comput. Geom. 18, 1997, use the same kind of
// static filter.)
func orient2(a, b, c [2]*big.Rat) int {
	var f [6]float64
	for k, r := range [6]*big.Rat{a[0], a[1], b[0], b[1], c[0], c[1]} {
		f[k], _ = r.Float64()
	}
	X := 0.0
	for _, v := range f {
		X = math.Max(X, math.Abs(v))
	}
	d := (f[2]-f[0])*(f[5]-f[1]) - (f[3]-f[1])*(f[4]-f[0])
	if bound := 64 * 0x1p-53 * X * X; !math.IsInf(bound, 0) && bound > 0x1p-1000 && math.Abs(d) > bound {
		if d > 0 {
			return 1
		}
		return -1
	}
	return cross2(a, b, c).Sign()
}

// areaSign is the sign of signedArea2(v), decided in float64 when a
// proven bound allows it (as orient2: each of the n terms x_i y_(i+1) -
// x_(i+1) y_i is off by at most 8 u X^2, and summing n terms of magnitude
// at most 2 X^2 adds at most 2 n^2 u X^2), else exactly.
func areaSign(v [][2]*big.Rat) int {
	n := len(v)
	f := make([][2]float64, n)
	X := 0.0
	for i := range v {
		f[i][0], _ = v[i][0].Float64()
		f[i][1], _ = v[i][1].Float64()
		X = math.Max(X, math.Max(math.Abs(f[i][0]), math.Abs(f[i][1])))
	}
	s := 0.0
	for i := range f {
		j := (i + 1) % n
		s += f[i][0]*f[j][1] - f[j][0]*f[i][1]
	}
	nf := float64(n)
	if bound := 2 * (8*nf + 2*nf*nf) * 0x1p-53 * X * X; !math.IsInf(bound, 0) && bound > 0x1p-1000 && math.Abs(s) > bound {
		if s > 0 {
			return 1
		}
		return -1
	}
	return signedArea2(v).Sign()
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
		if orient2(a, b, c) == 0 {
			return fmt.Errorf("vertex %d lies on the line through its neighbours %d and %d (a degenerate corner)", i+1, (i+n-1)%n+1, (i+1)%n+1)
		}
	}
	if err := crossingEdges(p.V); err != nil {
		return err
	}
	if areaSign(p.V) == 0 {
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
		if orient2(a, b, c) != 0 {
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
			if segmentsMeet(v[i], v[(i+1)%n], v[j], v[(j+1)%n]) {
				return fmt.Errorf("edges %d (vertices %d-%d) and %d (vertices %d-%d) intersect: the polygon is not simple", i+1, i+1, (i+1)%n+1, j+1, j+1, (j+1)%n+1)
			}
		}
	}
	return nil
}

// ccw returns the vertices in counterclockwise order.
func (p *Polygon) ccw() [][2]*big.Rat {
	if areaSign(p.V) > 0 {
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
			if orient2(a, b, c) <= 0 {
				continue // reflex or straight
			}
			ear := true
			for _, j := range idx {
				q := v[j]
				if j == idx[(k+m-1)%m] || j == idx[k] || j == idx[(k+1)%m] {
					continue
				}
				if orient2(a, b, q) >= 0 && orient2(b, c, q) >= 0 && orient2(c, a, q) >= 0 {
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
				if orient2(v[idx[(k+m-1)%m]], v[idx[k]], v[idx[(k+1)%m]]) == 0 {
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
	if orient2(v[idx[0]], v[idx[1]], v[idx[2]]) != 0 {
		tris = append(tris, [3][2]*big.Rat{v[idx[0]], v[idx[1]], v[idx[2]]})
	}
	return tris
}
