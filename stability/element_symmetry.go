package stability

import (
	"fmt"
	"math/big"
	"sort"
	"strings"

	"quadwright/design/element"
)

// SymmetryReport says under which symmetries of its element a rule is
// invariant: the maps g with g(x_i) = x_j and w_i = w_j for every node,
// pairing the nodes one to one. They form a subgroup of the element's
// symmetry group (the stabiliser of the rule), so the largest subgroup
// under which the rule is invariant is exactly this set.
type SymmetryReport struct {
	// Group names the element's symmetry group and GroupOrder its order.
	Group      string `json:"group"`
	GroupOrder int    `json:"group_order"`
	// Order is the order of the subgroup leaving the rule invariant (1:
	// only the identity; GroupOrder: fully symmetric), and Maps lists its
	// elements as coordinate maps, such as "(x,y) -> (y,x)".
	Order int      `json:"order"`
	Maps  []string `json:"maps"`
	Full  bool     `json:"fully_symmetric"`
}

// symmetryMap is one symmetry of a reference element: an affine map with
// integer coefficients, so that images of exact points are exact.
type symmetryMap struct {
	name  string
	apply func(p []*big.Rat) []*big.Rat
}

// elementGroup returns the symmetry group of the reference element s and
// its name: x -> -x on the line; the signed permutations of the
// coordinates on the quadrilateral (D4, 8) and hexahedron (Oh, 48); the
// permutations of the barycentric coordinates on the triangle (S3, 6) and
// tetrahedron (S4, 24); S3 times z -> +-z on the prism (D3h, 12); the
// signed permutations of x and y, z fixed, on the pyramid (C4v, 8). The
// identity comes first.
func elementGroup(s element.Shape) ([]symmetryMap, string) {
	vars := []string{"x", "y", "z"}[:s.Dim()]
	switch s {
	case element.Line:
		return signedPerms(1, 1, vars), "Z2"
	case element.Quadrilateral:
		return signedPerms(2, 2, vars), "D4"
	case element.Hexahedron:
		return signedPerms(3, 3, vars), "Oh"
	case element.Pyramid:
		return signedPerms(2, 3, vars), "C4v"
	case element.Triangle:
		return baryPerms(2, 2, vars, false), "S3"
	case element.Tetrahedron:
		return baryPerms(3, 3, vars, false), "S4"
	case element.Prism:
		return baryPerms(2, 3, vars, true), "D3h"
	}
	panic("stability: elementGroup of an unknown shape")
}

// permutations lists the permutations of 0..n-1, the identity first.
func permutations(n int) [][]int {
	if n == 1 {
		return [][]int{{0}}
	}
	var out [][]int
	for _, p := range permutations(n - 1) {
		for pos := len(p); pos >= 0; pos-- {
			q := append(append(append([]int(nil), p[:pos]...), n-1), p[pos:]...)
			out = append(out, q)
		}
	}
	return out
}

// signedPerms are the maps permuting and negating the first k of the
// coordinates (the rest fixed).
func signedPerms(k, dim int, vars []string) []symmetryMap {
	var out []symmetryMap
	for _, perm := range permutations(k) {
		for signs := 0; signs < 1<<k; signs++ {
			perm, signs := perm, signs
			img := make([]string, dim)
			for c := 0; c < dim; c++ {
				img[c] = vars[c]
				if c < k {
					img[c] = vars[perm[c]]
					if signs>>c&1 == 1 {
						img[c] = "-" + img[c]
					}
				}
			}
			out = append(out, symmetryMap{
				name: mapName(vars, img),
				apply: func(p []*big.Rat) []*big.Rat {
					q := make([]*big.Rat, len(p))
					for c := range p {
						q[c] = new(big.Rat).Set(p[c])
						if c < k {
							q[c].Set(p[perm[c]])
							if signs>>c&1 == 1 {
								q[c].Neg(q[c])
							}
						}
					}
					return q
				},
			})
		}
	}
	sortIdentityFirst(out, vars)
	return out
}

// baryPerms are the permutations of the k+1 barycentric coordinates of the
// k-simplex in the first k coordinates (l_0 = 1 - sum x_c, l_c = x_c), the
// rest fixed or, with flip, also negated.
func baryPerms(k, dim int, vars []string, flip bool) []symmetryMap {
	l0 := "1-" + strings.Join(vars[:k], "-")
	bary := append([]string{l0}, vars[:k]...)
	var out []symmetryMap
	flips := 1
	if flip {
		flips = 2
	}
	for _, perm := range permutations(k + 1) {
		for f := 0; f < flips; f++ {
			perm, f := perm, f
			img := make([]string, dim)
			for c := 0; c < dim; c++ {
				if c < k {
					img[c] = bary[perm[c+1]]
				} else {
					img[c] = vars[c]
					if f == 1 {
						img[c] = "-" + vars[c]
					}
				}
			}
			out = append(out, symmetryMap{
				name: mapName(vars, img),
				apply: func(p []*big.Rat) []*big.Rat {
					l := make([]*big.Rat, k+1)
					l[0] = big.NewRat(1, 1)
					for c := 0; c < k; c++ {
						l[c+1] = p[c]
						l[0] = new(big.Rat).Sub(l[0], p[c])
					}
					q := make([]*big.Rat, len(p))
					for c := range p {
						if c < k {
							q[c] = new(big.Rat).Set(l[perm[c+1]])
						} else {
							q[c] = new(big.Rat).Set(p[c])
							if f == 1 {
								q[c].Neg(q[c])
							}
						}
					}
					return q
				},
			})
		}
	}
	sortIdentityFirst(out, vars)
	return out
}

func mapName(vars, img []string) string {
	return "(" + strings.Join(vars, ",") + ") -> (" + strings.Join(img, ",") + ")"
}

func sortIdentityFirst(maps []symmetryMap, vars []string) {
	id := mapName(vars, vars)
	sort.SliceStable(maps, func(a, b int) bool { return maps[a].name == id && maps[b].name != id })
}

// ruleSymmetry finds the maps of s's group that leave the rule (exact
// points xs, weights ws) invariant: every image point within tol of a node
// in every coordinate, with a weight within tol times its own.
func ruleSymmetry(s element.Shape, xs [][]*big.Rat, ws []*big.Rat, tol *big.Rat) SymmetryReport {
	group, name := elementGroup(s)
	rep := SymmetryReport{Group: name, GroupOrder: len(group)}
	n := len(xs)
	first := make([]float64, n)
	order := make([]int, n)
	for i := range xs {
		first[i], _ = xs[i][0].Float64()
		order[i] = i
	}
	sort.Slice(order, func(a, b int) bool { return first[order[a]] < first[order[b]] })
	sorted := make([]float64, n)
	for k, i := range order {
		sorted[k] = first[i]
	}
	tolF, _ := tol.Float64()
	win := tolF + 1e-9
	d := new(big.Rat)
	within := func(a, b, t *big.Rat) bool {
		d.Sub(a, b)
		return d.Abs(d).Cmp(t) <= 0
	}
	for _, g := range group {
		used := make([]bool, n)
		ok := true
		for i := 0; i < n && ok; i++ {
			img := g.apply(xs[i])
			f, _ := img[0].Float64()
			lo := sort.SearchFloat64s(sorted, f-win)
			wt := new(big.Rat).Mul(tol, new(big.Rat).Abs(ws[i]))
			found := false
			for k := lo; k < n && sorted[k] <= f+win; k++ {
				j := order[k]
				if used[j] {
					continue
				}
				match := within(ws[j], ws[i], wt)
				for c := 0; match && c < len(img); c++ {
					match = within(img[c], xs[j][c], tol)
				}
				if match {
					used[j], found = true, true
					break
				}
			}
			ok = found
		}
		if ok {
			rep.Order++
			rep.Maps = append(rep.Maps, g.name)
		}
	}
	rep.Full = rep.Order == rep.GroupOrder
	return rep
}

// describe is the symmetry in a sentence for the text report.
func (r SymmetryReport) describe(shape string) string {
	switch {
	case r.Full:
		return fmt.Sprintf("fully symmetric: invariant under all %d symmetries of the %s (%s)", r.GroupOrder, shape, r.Group)
	case r.Order <= 1:
		return fmt.Sprintf("no symmetry: only the identity of the %d symmetries of the %s (%s) leaves it invariant", r.GroupOrder, shape, r.Group)
	}
	return fmt.Sprintf("invariant under a subgroup of order %d of the %d symmetries of the %s (%s): %s", r.Order, r.GroupOrder, shape, r.Group, strings.Join(r.Maps[1:], "; "))
}
