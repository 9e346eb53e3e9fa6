package element

import (
	"slices"
	"sort"
)

// orbitSpan returns, for each orbit of st in parameter order, its type
// index, its first parameter index and its number of points.
func orbitSpan(sy *Symmetry, st Structure) (types, first, points []int) {
	k := 0
	for i, c := range st {
		for o := 0; o < c; o++ {
			types, first, points = append(types, i), append(first, k), append(points, sy.Types[i].Points())
			k += 1 + sy.Types[i].Params
		}
	}
	return
}

// dropOrbit returns the structure and parameters of v without orbit o.
func dropOrbit(sy *Symmetry, st Structure, v []float64, o int) (Structure, []float64) {
	types, first, _ := orbitSpan(sy, st)
	size := 1 + sy.Types[types[o]].Params
	out := append(append([]float64(nil), v[:first[o]]...), v[first[o]+size:]...)
	nst := slices.Clone(st)
	nst[types[o]]--
	return nst, out
}

// eliminateTo runs the point elimination of H. Xiao and Z. Gimbutas ("A
// numerical algorithm for the construction of efficient quadrature rules
// in two and higher dimensions", Comput. Math. Appl. 59, 2010), restricted
// to whole symmetry orbits: a rule of structure big (more orbits than
// target, so its moment equations are underdetermined and easy to solve)
// is solved by Levenberg-Marquardt from v; then, while it has more orbits
// of some type than target, the orbit of such a type with the least
// significance (weight times points) is removed and the rest re-solved,
// trying the three least significant in turn. ok reports whether target
// was reached with an acceptable rule; v is then its parameters.
func eliminateTo(sys0 *system, big, target Structure, v []float64) ([]float64, bool) {
	sy := sys0.sy
	st := big
	sys := sys0.like(st)
	if sys.levenbergMarquardt(v, 300) > 1e-13 {
		return nil, false
	}
	for !slices.Equal(st, target) {
		types, first, points := orbitSpan(sy, st)
		var cand []int
		for o := range first {
			if st[types[o]] > target[types[o]] {
				cand = append(cand, o)
			}
		}
		sort.SliceStable(cand, func(i, j int) bool {
			return v[first[cand[i]]]*float64(points[cand[i]]) < v[first[cand[j]]]*float64(points[cand[j]])
		})
		moved := false
		for _, o := range cand[:min(3, len(cand))] {
			nst, nv := dropOrbit(sy, st, v, o)
			ns := sys0.like(nst)
			if ns.levenbergMarquardt(nv, 300) < 1e-13 && (!slices.Equal(nst, target) || acceptable(sy, nst, nv)) {
				st, v, moved = nst, nv, true
				break
			}
		}
		if !moved {
			return nil, false
		}
	}
	return v, acceptable(sy, st, v)
}
