package element

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// The descent: a fully symmetric rule of many orbits, positive and inside,
// is chosen by NNLS among random candidate orbits (Tchakaloff's theorem
// promises one; see nnls), and then made smaller one move at a time, each
// move followed by Levenberg-Marquardt from the rule just changed, which
// starts close to a solution: the point elimination of H. Xiao and Z.
// Gimbutas ("A numerical algorithm for the construction of efficient
// quadrature rules in two and higher dimensions", Comput. Math. Appl. 59,
// 2010) on whole orbits, with moves of our own that trade an orbit for one
// of a type with fewer points (demotions). Every rule on the way keeps
// positive weights and interior points, and only structures from which a
// rule of the target count can still be reached are entered.

// orb is one orbit of a rule under construction: its type (an index into
// Symmetry.Types), its weight (at each point) and its parameters.
type orb struct {
	typ int
	w   float64
	t   []float64
}

// flatten returns the structure and parameter vector of the orbits os
// (sorted by type in place).
func flatten(sy *Symmetry, os []orb) (Structure, []float64) {
	sort.SliceStable(os, func(i, j int) bool { return os[i].typ < os[j].typ })
	st := Structure(make([]int, len(sy.Types)))
	var v []float64
	for _, o := range os {
		st[o.typ]++
		v = append(v, o.w)
		v = append(v, o.t...)
	}
	return st, v
}

// unflatten is the inverse of flatten.
func unflatten(sy *Symmetry, st Structure, v []float64) []orb {
	var out []orb
	k := 0
	for i, c := range st {
		p := sy.Types[i].Params
		for n := 0; n < c; n++ {
			out = append(out, orb{i, v[k], append([]float64(nil), v[k+1:k+1+p]...)})
			k += 1 + p
		}
	}
	return out
}

// single is the structure of one orbit of type i.
func single(sy *Symmetry, i int) Structure {
	st := Structure(make([]int, len(sy.Types)))
	st[i] = 1
	return st
}

// descentCandidates is the number of random candidate orbits of each type
// with parameters offered to the NNLS start.
const descentCandidates = 300

// tchakaloffStart returns a fully symmetric rule of degree d with positive
// weights and interior points: the NNLS solution (at most Equations(d)
// orbits) of the invariant moment equations over descentCandidates random
// orbits of each type, the centre too. The NNLS may stop short of an
// exact rule; the descent's first solve finishes it.
func tchakaloffStart(sys *system, rng *rand.Rand) []orb {
	sy := sys.sy
	var cand []orb
	for i, o := range sy.Types {
		n := 1
		if o.Params > 0 {
			n = descentCandidates
		}
		for k := 0; k < n; k++ {
			if t, ok := randomOrbit(sy, i, rng); ok {
				cand = append(cand, orb{i, 1, t})
			}
		}
	}
	m := sys.m
	A := mat.NewDense(m, len(cand), nil)
	col := make([]float64, m)
	b := make([]float64, m)
	for i := range b {
		b[i] = sys.mass * sys.proj.qt[i*sys.proj.m] // the invariant moments
	}
	for k, c := range cand {
		orbitSums(sys, c.typ, c.t, col)
		A.SetCol(k, col)
	}
	x, _ := nnls(A, b, 1e-15, 10*m)
	var out []orb
	for k, w := range x {
		if w > 0 {
			c := cand[k]
			c.w = w
			out = append(out, c)
		}
	}
	return out
}

// significance returns each orbit's weight times the squared norm of the
// invariant basis summed over its points (Xiao and Gimbutas's measure of
// what a node carries of the moments).
func significance(sys *system, os []orb) []float64 {
	sig := make([]float64, len(os))
	r := make([]float64, sys.m)
	for k, o := range os {
		orbitSums(sys, o.typ, o.t, r)
		q := 0.0
		for _, e := range r {
			q += e * e
		}
		sig[k] = o.w * q
	}
	return sig
}

// orbitSums sets out to the invariant basis of the projected system sys
// summed over the points of the orbit of type typ with parameters t.
func orbitSums(sys *system, typ int, t []float64, out []float64) {
	s1 := sys.like(single(sys.sy, typ))
	s1.eval(append([]float64{1}, t...), out, nil)
	for i := range out {
		out[i] += s1.mass * s1.proj.qt[i*s1.proj.m] // eval subtracted the moments
	}
}

// descentMoves is the number of moves of each kind tried before a descent
// gives up.
const descentMoves = 100

// descend makes the rule os (of the projected system sys, any structure)
// smaller until it has a structure of targets (all of one point count),
// trying at each step the removal of the least significant orbits, then
// the demotions of the orbits nearest a type with fewer points. ok
// reports success; the returned orbits are then the rule.
func descend(sys *system, os []orb, targets []Structure) ([]orb, bool) {
	sy := sys.sy
	p := targets[0].Points(sy)
	solve := func(c []orb) ([]orb, bool) {
		st, v := flatten(sy, c)
		if st.Unknowns(sy) < sys.m || !reachableAny(sy, st, targets) {
			return nil, false
		}
		if sys.like(st).levenbergMarquardt(v, 100) > 1e-13 || !acceptable(sy, st, v) {
			return nil, false
		}
		return unflatten(sy, st, v), true
	}
	os, ok := solve(os)
	if !ok {
		return nil, false
	}
	for {
		if st, _ := flatten(sy, os); st.Points(sy) <= p {
			return os, true
		}
		moved := false
		for _, c := range moves(sys, os) {
			if c, good := solve(c); good {
				os, moved = c, true
				break
			}
		}
		if !moved {
			return os, false
		}
	}
}

// moves lists the rules one move from os in the order they are tried:
// the removals of the descentMoves least significant orbits, then the
// descentMoves nearest demotions.
func moves(sys *system, os []orb) [][]orb {
	sig := significance(sys, os)
	order := make([]int, len(os))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return sig[order[a]] < sig[order[b]] })
	var out [][]orb
	for _, k := range order[:min(descentMoves, len(order))] {
		out = append(out, append(append([]orb(nil), os[:k]...), os[k+1:]...))
	}
	dm := demotions(sys.sy, os)
	return append(out, dm[:min(descentMoves, len(dm))]...)
}

// demotions lists the rules made from os by replacing one orbit with the
// nearest orbit of a type with fewer parameters and points (keeping its
// mass), nearest first. Where the rule has no centre and the demotion
// loses one parameter, the same move with a small centre weight added is
// listed too: it keeps the number of unknowns and loses points, which is
// the step from a square system to a smaller one.
func demotions(sy *Symmetry, os []orb) [][]orb {
	type move struct {
		d  float64
		os []orb
	}
	var out []move
	dim := sy.Shape.Dim()
	center, hasCenter := -1, false
	for i, t := range sy.Types {
		if t.Params == 0 {
			center = i
		}
	}
	for _, o := range os {
		hasCenter = hasCenter || sy.Types[o.typ].Params == 0
	}
	for k, o := range os {
		T := &sy.Types[o.typ]
		pts, _ := expand64(sy, single(sy, o.typ), append([]float64{1}, o.t...))
		for ui := range sy.Types {
			U := &sy.Types[ui]
			if U.Points() >= T.Points() || U.Params >= T.Params {
				continue
			}
			best, bu := math.Inf(1), []float64(nil)
			for _, y := range pts {
				u, d2, ok := nearestOnType(U, y, dim)
				if ok && d2 < best {
					best, bu = d2, u
				}
			}
			if bu == nil {
				continue
			}
			c := append([]orb(nil), os...)
			c[k] = orb{ui, o.w * float64(T.Points()) / float64(U.Points()), bu}
			out = append(out, move{best, c})
			if center >= 0 && !hasCenter && T.Params-U.Params == 1 {
				out = append(out, move{best, append(append([]orb(nil), c...), orb{center, c[k].w / 10, nil})})
			}
		}
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].d < out[j].d })
	res := make([][]orb, len(out))
	for i := range out {
		res[i] = out[i].os
	}
	return res
}

// nearestOnType returns the parameters u whose first orbit point of type
// U is nearest y (least squares) and the squared distance.
func nearestOnType(U *OrbitType, y []float64, dim int) ([]float64, float64, bool) {
	u := make([]float64, U.Params)
	if U.Params > 0 {
		A := mat.NewDense(dim, U.Params, nil)
		rhs := mat.NewVecDense(dim, nil)
		for c := 0; c < dim; c++ {
			for q := 0; q < U.Params; q++ {
				A.Set(c, q, U.A64[0][c][q])
			}
			rhs.SetVec(c, y[c]-U.c64[0][c])
		}
		var sol mat.VecDense
		if sol.SolveVec(A, rhs) != nil {
			return nil, 0, false
		}
		for q := range u {
			u[q] = sol.AtVec(q)
		}
	}
	d2 := 0.0
	for c := 0; c < dim; c++ {
		x := U.c64[0][c] - y[c]
		for q := range u {
			x += U.A64[0][c][q] * u[q]
		}
		d2 += x * x
	}
	return u, d2, true
}

// reachableAny reports whether removals and demotions can turn st into
// one of targets.
func reachableAny(sy *Symmetry, st Structure, targets []Structure) bool {
	for _, tg := range targets {
		if reachable(sy, st, tg) {
			return true
		}
	}
	return false
}

// reachable reports whether removals and demotions (to types of fewer
// parameters) can turn st into target, level by level from the most
// parameters down: a level's shortfall must be covered by the surplus of
// the levels above. Centres are not counted (a demotion can add one).
func reachable(sy *Symmetry, st, target Structure) bool {
	top := 0
	for _, t := range sy.Types {
		top = max(top, t.Params)
	}
	carry := 0
	for L := top; L >= 1; L-- {
		deficit, surplus := 0, 0
		for i, t := range sy.Types {
			switch {
			case t.Params != L:
			case st[i] < target[i]:
				deficit += target[i] - st[i]
			default:
				surplus += st[i] - target[i]
			}
		}
		if deficit > carry {
			return false
		}
		carry += surplus - deficit
	}
	return true
}

// Smallest runs n descents aimed at p points on s at degree d and returns
// the rule of fewest points any of them reached (every rule on a descent's
// way solves the moment equations with positive weights and interior
// points, so a descent that stops short still yields one). reached
// reports whether one reached p points or fewer; ok is false when no
// descent produced a rule. The descents draw from a PCG stream seeded by
// seed, d and p.
func Smallest(ctx context.Context, s Shape, d, p int, seed uint64, n int) (res SearchResult, reached, ok bool, err error) {
	sy := SymmetryOf(s)
	if sy == nil {
		return SearchResult{}, false, false, fmt.Errorf("the %s has no symmetric rules to search", s)
	}
	sts := sy.Structures(d, p)
	if len(sts) == 0 {
		return SearchResult{Shape: s}, false, false, nil
	}
	rng := rand.New(rand.NewPCG(seed, uint64(d)<<32|uint64(p)|1<<63))
	sys := newProjectedSystem(sy, sts[0], d)
	best := -1
	for k := 0; k < n; k++ {
		if err := ctx.Err(); err != nil {
			return SearchResult{}, false, false, err
		}
		os, done := descend(sys, tchakaloffStart(sys, rng), sts)
		if os == nil {
			continue
		}
		st, v := flatten(sy, os)
		if best < 0 || st.Points(sy) < best {
			best, res, ok = st.Points(sy), result(newSystem(sy, st, d), v, k+1), true
		}
		if done {
			return res, true, true, nil
		}
	}
	return res, false, ok, nil
}
