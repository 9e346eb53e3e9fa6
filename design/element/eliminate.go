package element

import "sort"

// orbitSpan returns, for each orbit of st in parameter order, its first
// parameter index, its number of parameters and its number of points.
func orbitSpan(st Structure) (first, size, points []int) {
	k := 0
	add := func(n, p int) {
		first, size, points = append(first, k), append(size, n), append(points, p)
		k += n
	}
	for o := 0; o < st.Centroid; o++ {
		add(1, 1)
	}
	for o := 0; o < st.Three; o++ {
		add(2, 3)
	}
	for o := 0; o < st.Six; o++ {
		add(3, 6)
	}
	return
}

// dropOrbit returns the structure and parameters of v without orbit o.
func dropOrbit(st Structure, v []float64, o int) (Structure, []float64) {
	first, size, points := orbitSpan(st)
	out := append(append([]float64(nil), v[:first[o]]...), v[first[o]+size[o]:]...)
	switch points[o] {
	case 1:
		st.Centroid--
	case 3:
		st.Three--
	default:
		st.Six--
	}
	return st, out
}

// eliminateTo runs the point elimination of H. Xiao and Z. Gimbutas ("A
// numerical algorithm for the construction of efficient quadrature rules
// in two and higher dimensions", Comput. Math. Appl. 59, 2010), restricted
// to whole symmetry orbits: a rule of structure big (more orbits than
// target, so its moment equations are underdetermined and easy to solve)
// is solved by Levenberg-Marquardt from v; then, while it has more orbits
// of some kind than target, the orbit of that kind with the least
// significance (weight times points) is removed and the rest re-solved,
// trying the three least significant in turn. ok reports whether target
// was reached with an acceptable rule; v is then its parameters.
func eliminateTo(sys0 *system, big, target Structure, v []float64) ([]float64, bool) {
	st := big
	sys := newSystem(st, sys0.deg)
	if sys.levenbergMarquardt(v, 300) > 1e-13 {
		return nil, false
	}
	for st != target {
		first, _, points := orbitSpan(st)
		var cand []int
		for o := range first {
			if (points[o] == 1 && st.Centroid > target.Centroid) || (points[o] == 3 && st.Three > target.Three) || (points[o] == 6 && st.Six > target.Six) {
				cand = append(cand, o)
			}
		}
		sort.SliceStable(cand, func(i, j int) bool {
			return v[first[cand[i]]]*float64(points[cand[i]]) < v[first[cand[j]]]*float64(points[cand[j]])
		})
		moved := false
		for _, o := range cand[:min(3, len(cand))] {
			nst, nv := dropOrbit(st, v, o)
			ns := newSystem(nst, sys0.deg)
			if ns.levenbergMarquardt(nv, 300) < 1e-13 && (nst != target || acceptable(nst, nv)) {
				st, v, moved = nst, nv, true
				break
			}
		}
		if !moved {
			return nil, false
		}
	}
	return v, acceptable(st, v)
}
