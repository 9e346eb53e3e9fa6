package element

import (
	"fmt"
	"math"
	"math/big"
	"strings"
)

// Structure is the orbit make-up of a fully symmetric rule: Structure[i]
// orbits of the type Symmetry.Types[i] of the element. Types without
// parameters (a centre point) occur at most once.
type Structure []int

// Points is the number of points of the structure on sy.
func (st Structure) Points(sy *Symmetry) int {
	n := 0
	for i, c := range st {
		n += c * sy.Types[i].Points()
	}
	return n
}

// Unknowns is the number of free parameters: per orbit its weight and its
// coordinates.
func (st Structure) Unknowns(sy *Symmetry) int {
	n := 0
	for i, c := range st {
		n += c * (1 + sy.Types[i].Params)
	}
	return n
}

// Describe names the orbits of st, for example "1 of (1/3,1/3), 8 of
// (a,a), 9 of (a,b)".
func (st Structure) Describe(sy *Symmetry) string {
	var parts []string
	for i, c := range st {
		if c > 0 {
			parts = append(parts, fmt.Sprintf("%d of %s", c, sy.Types[i].Name))
		}
	}
	return strings.Join(parts, ", ")
}

// orbitList returns the type of every orbit of st in parameter order.
func (st Structure) orbitList(sy *Symmetry) []*OrbitType {
	var out []*OrbitType
	for i, c := range st {
		for k := 0; k < c; k++ {
			out = append(out, &sy.Types[i])
		}
	}
	return out
}

// The parameter vector v of a structure lists, orbit by orbit in the
// order of orbitList, the orbit's weight and then its Params coordinates.
// Every point of an orbit carries the orbit's weight.

// expand64 returns the points and weights of the rule v of st.
func expand64(sy *Symmetry, st Structure, v []float64) (pts [][]float64, ws []float64) {
	k := 0
	dim := sy.Shape.Dim()
	for _, o := range st.orbitList(sy) {
		t := v[k+1 : k+1+o.Params]
		for p := range o.c64 {
			x := make([]float64, dim)
			for c := 0; c < dim; c++ {
				x[c] = o.c64[p][c]
				for q, tq := range t {
					x[c] += o.A64[p][c][q] * tq
				}
			}
			pts, ws = append(pts, x), append(ws, v[k])
		}
		k += 1 + o.Params
	}
	return pts, ws
}

// expandBig is expand64 at prec bits: the constant parts of the orbit
// points (such as 1/3) are rounded to prec, the rest is exact integer
// arithmetic on the parameters rounded to prec.
func expandBig(sy *Symmetry, st Structure, v []*big.Float, prec uint) (pts [][]*big.Float, ws []*big.Float) {
	k := 0
	dim := sy.Shape.Dim()
	tmp := new(big.Float).SetPrec(prec)
	for _, o := range st.orbitList(sy) {
		t := v[k+1 : k+1+o.Params]
		for _, f := range o.pts {
			x := make([]*big.Float, dim)
			for c := 0; c < dim; c++ {
				x[c] = new(big.Float).SetPrec(prec).SetRat(f.c[c])
				for q, tq := range t {
					if a := f.A[c][q]; a != 0 {
						x[c].Add(x[c], tmp.Mul(tq, tmp.SetInt64(a)))
					}
				}
			}
			pts, ws = append(pts, x), append(ws, v[k])
		}
		k += 1 + o.Params
	}
	return pts, ws
}

// acceptable reports whether v is a rule with weights >= 1e-9 times the
// element's measure, points at least 1e-9 inside, and orbits that do not
// degenerate: any two points of the rule at least 1e-6 apart (an orbit
// whose parameters reach a fixed point of a symmetry loses points, and two
// orbits that meet are one).
func acceptable(sy *Symmetry, st Structure, v []float64) bool {
	pts, ws := expand64(sy, st, v)
	vol, _ := sy.Shape.Measure().Float64()
	for i, x := range pts {
		if ws[i] < 1e-9*vol || !inside(sy.Shape, x, 1e-9) {
			return false
		}
	}
	for i := range pts {
		for j := 0; j < i; j++ {
			d := 0.0
			for c := range pts[i] {
				d += (pts[i][c] - pts[j][c]) * (pts[i][c] - pts[j][c])
			}
			if math.Sqrt(d) < 1e-6 {
				return false
			}
		}
	}
	return true
}

// roughlyInside reports whether every point of v lies within margin of
// the element (a negative margin allows points that far outside).
func roughlyInside(sy *Symmetry, st Structure, v []float64, margin float64) bool {
	pts, _ := expand64(sy, st, v)
	for _, x := range pts {
		if !inside(sy.Shape, x, margin) {
			return false
		}
	}
	return true
}
