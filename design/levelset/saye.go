package levelset

import (
	"math"
)

// fn is one implicit function of a level of the recursion: phi with the
// coordinates outside the level's free set fixed at fix (the faces the
// recursion eliminated), and the sign s it must have (-1, +1, or 0 for a
// function whose zero set only splits the domain).
type fn struct {
	fix [3]float64
	s   int
}

// at fills the fixed coordinates of f into the point p of the free ones.
func (f *fn) at(p [3]float64, free []int) [3]float64 {
	q := f.fix
	for _, i := range free {
		q[i] = p[i]
	}
	return q
}

func (f *fn) spanAt(b [3]span, free []int) [3]span {
	var q [3]span
	for i := range q {
		q[i] = span{Lo: f.fix[i], Hi: f.fix[i]}
	}
	for _, i := range free {
		q[i] = b[i]
	}
	return q
}

// emitter receives the points (coordinates of the level's free set) and
// weights of a level's rule.
type emitter func(p [3]float64, w float64)

// builder runs Saye's algorithm (R. I. Saye, "High-order quadrature
// methods for implicitly defined surfaces and volumes in hyperrectangles",
// SIAM J. Sci. Comput. 37 (2015), A993-A1019, Algorithms 1 to 3) on the
// computational box of g, with q-point Gauss-Legendre rules on every
// sub-interval.
type builder struct {
	g        *geom
	q        int
	gx, gw   []float64 // q-point Gauss-Legendre on [-1, 1]
	maxDepth int
	maxSlope float64
	// subdivided counts the boxes split because the implicit function
	// theorem could not be confirmed in any direction; forced counts the
	// boxes at maxDepth treated without that guarantee.
	subdivided, forced int
	overflow           bool // more than maxBoxes splits: the rule is refused
	lineWork           int
	tape               *tape // when not nil, the run is recorded (tape.go)
	bufs               [4]lineBufs
	warmth             [4][4]warmStart
	warmNext           [4]int
}

// integrate emits the rule on the box b over the coordinates free for the
// functions fs: the set where every s_i phi_i > 0 (surface false), or the
// zero set of fs[0] with its area measure (surface true, one function).
func (bd *builder) integrate(free []int, b [3]span, fs []fn, surface bool, depth int, emit emitter) {
	// Prune the functions of one sign on the box (Saye, Algorithm 3,
	// step 1): one of the sign asked is dropped, one of the other sign
	// empties the domain. A sign that holds up to a zero on the box's
	// boundary counts: it changes nothing of positive measure.
	kept := make([]fn, 0, len(fs))
	for _, f := range fs {
		v, _ := bd.g.evalSpan(f.spanAt(b, free))
		if !v.Finite() {
			kept = append(kept, f)
			continue
		}
		if surface {
			if v.Lo > 0 || v.Hi < 0 {
				bd.rec(event{kind: evEmpty})
				return
			}
			kept = append(kept, f)
			continue
		}
		switch {
		case v.Lo == 0 && v.Hi == 0:
			// Identically zero on the box (a face function of an
			// interface along that face): the sign test falls to the
			// lines, whose end roots carry it.
			continue
		case v.Lo >= 0 && f.s < 0, v.Hi <= 0 && f.s > 0:
			bd.rec(event{kind: evEmpty})
			return
		case v.Lo >= 0 || v.Hi <= 0:
			continue
		}
		kept = append(kept, f)
	}
	fs = kept
	if len(fs) == 0 {
		bd.rec(event{kind: evTensor, free: free, b: b})
		bd.tensor(free, b, emit)
		return
	}
	if len(free) == 1 {
		var p [3]float64
		bd.rec(event{kind: evLine1})
		bd.line(free[0], free, b, p, 1, fs, surface, true, emit)
		return
	}
	k, ratio, sig := bd.heightDirection(free, b, fs, surface)
	mono := !math.IsInf(ratio, 1)
	// A steep height function (the slope bound |grad phi| / |d phi/du_k|
	// large over the box) has its vertical tangent close by, a
	// square-root singularity just outside the box that slows the
	// convergence of the next level's Gauss rules; smaller boxes move it
	// relatively further away.
	if (!mono || ratio > bd.maxSlope) && depth < bd.maxDepth && !bd.overflow {
		bd.subdivided++
		bd.rec(event{kind: evSplit})
		bd.split(free, b, fs, surface, depth, emit)
		return
	}
	if !mono {
		bd.forced++
	}
	// The faces x_k = lo and x_k = hi carry the new functions, with the
	// signs of Saye's sgn(m, s, S, sigma) = sigma m when S or s = sigma m,
	// else 0 (m = -1 for the lower face, +1 for the upper).
	sub := make([]int, 0, len(free)-1)
	for _, i := range free {
		if i != k {
			sub = append(sub, i)
		}
	}
	derived := make([]fn, 0, 2*len(fs))
	for i, f := range fs {
		for _, m := range []int{-1, 1} {
			d := f
			d.fix[k] = b[k].Lo
			if m > 0 {
				d.fix[k] = b[k].Hi
			}
			d.s = 0
			if mono && sig[i] != 0 && (surface || f.s == sig[i]*m) {
				d.s = sig[i] * m
			}
			derived = append(derived, d)
		}
	}
	bd.rec(event{kind: evReduce, k: k})
	bd.integrate(sub, b, derived, false, 0, func(p [3]float64, w float64) {
		bd.line(k, free, b, p, w, fs, surface, !mono, emit)
	})
}

// heightDirection chooses the direction k of the largest share of the
// gradient at the box centre (Saye, section 3.2) and reports whether every
// function is monotone along it over the whole box (its partial derivative
// of one sign, by interval arithmetic), with the signs. When k fails,
// another direction that passes is taken.
func (bd *builder) heightDirection(free []int, b [3]span, fs []fn, surface bool) (int, float64, []int) {
	var c [3]float64
	for _, i := range free {
		c[i] = 0.5 * (b[i].Lo + b[i].Hi)
	}
	var score [3]float64
	for _, f := range fs {
		_, gu, _ := bd.g.eval(f.at(c, free))
		n := 0.0
		for _, i := range free {
			n += gu[i] * gu[i]
		}
		if n > 0 && !math.IsInf(n, 0) {
			for _, i := range free {
				score[i] += math.Abs(gu[i]) / math.Sqrt(n)
			}
		}
	}
	order := append([]int(nil), free...)
	for i := 1; i < len(order); i++ {
		for j := i; j > 0 && score[order[j]] > score[order[j-1]]; j-- {
			order[j], order[j-1] = order[j-1], order[j]
		}
	}
	var grads [][3]span
	for _, f := range fs {
		_, gu := bd.g.evalSpan(f.spanAt(b, free))
		grads = append(grads, gu)
	}
	best, bestRatio, bestIndep := -1, math.Inf(1), len(fs)+1
	var bestSig []int
	for _, k := range order {
		sig := make([]int, len(fs))
		ratio, ok, indep := 0.0, true, 0
		for i := range fs {
			d := grads[i][k]
			// Strictly monotone: a derivative vanishing on the box, even
			// on its boundary, can meet the interface there, where the
			// height function has an infinite slope and the next level's
			// integrand a square-root singularity.
			switch {
			case !d.Finite():
				ok = false
			case d.Lo > 0:
				sig[i] = 1
			case d.Hi < 0:
				sig[i] = -1
			case d.Lo == 0 && d.Hi == 0 && !surface:
				// independent of x_k on the box: usable, but any
				// direction along which something varies is better
				indep++
				continue
			default:
				ok = false
			}
			if !ok {
				break
			}
			// The variation of d phi/du_k over the box against its
			// smallest size: how near (in box widths) its zero, the
			// vertical tangent of the height function, may lie.
			dmin := math.Min(math.Abs(d.Lo), math.Abs(d.Hi))
			ratio = math.Max(ratio, (d.Hi-d.Lo)/dmin)
			// The height function's own vertical tangent: on the
			// interface (d phi/du_k)^2 falls at the rate of about
			// 2 |phi_kk| |grad' phi| (grad' over the other
			// coordinates), so it vanishes, a square-root branch point
			// of the height function, some (d phi/du_k)^2 /
			// (2 |phi_kk| |grad' phi|) away in those coordinates. Against
			// the widest of the other sides (the Gauss rules of the
			// next level span it), with phi_kk bounded by the variation
			// of d phi/du_k along k: a ball in a box whose face level is
			// wider than its height would converge slowly without it.
			if wk := b[k].Hi - b[k].Lo; len(free) > 1 && wk > 0 {
				gf, wf := 0.0, 0.0
				for _, j := range free {
					if j == k {
						continue
					}
					m := math.Max(math.Abs(grads[i][j].Lo), math.Abs(grads[i][j].Hi))
					gf += m * m
					wf = math.Max(wf, b[j].Hi-b[j].Lo)
				}
				near := (d.Hi - d.Lo) / wk * math.Sqrt(gf) * wf / (dmin * dmin)
				ratio = math.Max(ratio, near*bd.maxSlope/branchBound)
			}
			if surface {
				// The area element |grad phi| / |d phi/du_k| itself
				// must stay moderate for the surface weights.
				n := 0.0
				for _, j := range free {
					m := math.Max(math.Abs(grads[i][j].Lo), math.Abs(grads[i][j].Hi))
					n += m * m
				}
				ratio = math.Max(ratio, math.Sqrt(n)/dmin/surfaceSlope)
			}
		}
		if ok && (indep < bestIndep || indep == bestIndep && ratio < bestRatio) {
			best, bestRatio, bestSig, bestIndep = k, ratio, sig, indep
		}
	}
	if best >= 0 {
		return best, bestRatio, bestSig
	}
	return order[0], math.Inf(1), make([]int, len(fs))
}

// surfaceSlope scales the area-element bound of surface rules against
// slopeBound (tuned on the tangent and through-vertex circles of the tests).
var surfaceSlope = 2.0

// branchBound is the largest width of the face level, in units of the
// estimated distance to the height function's branch point (see
// heightDirection), that a box keeps before it is split; tuned on the
// octant of a ball in a box, the shifted disc and ball of the tests
// (order 12: 2.9e-15, 8.8e-16 and 3.4e-14, against 1.9e-13, 1.8e-11 and
// 2.9e-14 without it, for 2 to 25 per cent more points).
var branchBound = 4.0

// maxBoxes bounds the splits of one rule: a level set that needs more
// (sin(1/x) near x = 0) is refused rather than left to run for hours.
const maxBoxes = 2000

// maxLineWork bounds the interval evaluations of the root searches along
// lines, for the same reason.
const maxLineWork = 300000

// split halves the box across its widest free side (the first of the
// widest, in the order of the height-direction scores) and integrates on
// both halves. Saye splits into 2^d boxes at once; halving one side at a
// time reaches the same boxes where they are needed and fewer elsewhere.
func (bd *builder) split(free []int, b [3]span, fs []fn, surface bool, depth int, emit emitter) {
	if bd.subdivided > maxBoxes {
		bd.overflow = true
		return
	}
	i := free[0]
	for _, j := range free {
		if b[j].Hi-b[j].Lo > b[i].Hi-b[i].Lo {
			i = j
		}
	}
	mid := 0.5 * (b[i].Lo + b[i].Hi)
	lo, hi := b, b
	lo[i].Hi, hi[i].Lo = mid, mid
	bd.integrate(free, lo, fs, surface, depth+1, emit)
	bd.integrate(free, hi, fs, surface, depth+1, emit)
}

// tensor emits the tensor product of Gauss-Legendre rules on the box.
func (bd *builder) tensor(free []int, b [3]span, emit emitter) {
	var rec func(j int, p [3]float64, w float64)
	rec = func(j int, p [3]float64, w float64) {
		if j == len(free) {
			emit(p, w)
			return
		}
		i := free[j]
		h, c := 0.5*(b[i].Hi-b[i].Lo), 0.5*(b[i].Hi+b[i].Lo)
		for t := range bd.gx {
			p[i] = c + h*bd.gx[t]
			rec(j+1, p, w*h*bd.gw[t])
		}
	}
	rec(0, [3]float64{}, 1)
}
