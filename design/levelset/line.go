package levelset

import (
	"math"
	"slices"
	"sort"
)

// line integrates along direction k through the point p (whose
// coordinates in free other than k are set), over [b[k].Lo, b[k].Hi], the
// one-dimensional step of Saye's algorithm: the roots of every function on
// the segment cut it into pieces, and each piece where every signed
// function has its sign gets the q-point Gauss-Legendre rule (surface:
// the root of fs[0] gets the weight w |grad phi| / |d phi/du_k|, the
// area element of the graph over the other coordinates). robust asks for
// every root, found by interval bisection, where the box level could not
// prove each function monotone along k.
func (bd *builder) line(k int, free []int, b [3]span, p [3]float64, w float64, fs []fn, surface, robust bool, emit emitter) {
	a, c := b[k].Lo, b[k].Hi
	// The buffers of this level: an emission below runs only the lines of
	// levels with more free coordinates, which have buffers of their own.
	lb := &bd.bufs[len(free)]
	roots := lb.roots[:0]
	defer func() { lb.roots = roots[:0] }()
	for i := range fs {
		if surface && i > 0 {
			break
		}
		roots = bd.rootsOn(&fs[i], k, free, p, a, c, robust, roots)
	}
	// The line is recorded (tape.go) before anything is emitted: an
	// emission runs the lines of the level above, whose records follow.
	if surface {
		var emitted []float64
		var ws []float64
		for _, t := range roots {
			q := p
			q[k] = t
			_, gu, gx := bd.g.eval(fs[0].at(q, free))
			n := math.Sqrt(gx[0]*gx[0] + gx[1]*gx[1] + gx[2]*gx[2])
			if gu[k] == 0 || math.IsNaN(n) || math.IsInf(n, 0) {
				continue
			}
			emitted, ws = append(emitted, t), append(ws, w*n/math.Abs(gu[k]))
		}
		bd.recSurface(k, free, b, emitted)
		for i, t := range emitted {
			q := p
			q[k] = t
			emit(q, ws[i])
		}
		return
	}
	slices.Sort(roots)
	cuts := append(append(lb.cuts[:0], a), roots...)
	cuts = append(cuts, c)
	kept := lb.kept[:0]
	defer func() { lb.cuts, lb.kept = cuts[:0], kept[:0] }()
	for j := 0; j+1 < len(cuts); j++ {
		t0, t1 := cuts[j], cuts[j+1]
		if !(t1 > t0) {
			continue
		}
		q := p
		q[k] = 0.5 * (t0 + t1)
		ok := true
		for i := range fs {
			if fs[i].s != 0 && !(float64(fs[i].s)*bd.g.value(fs[i].at(q, free)) > 0) {
				ok = false
				break
			}
		}
		if ok {
			kept = append(kept, j)
		}
	}
	if bd.tape != nil {
		bd.recLine(k, free, b, cuts, slices.Clone(kept))
	}
	for _, j := range kept {
		t0, t1 := cuts[j], cuts[j+1]
		q := p
		h, m := 0.5*(t1-t0), 0.5*(t1+t0)
		for t := range bd.gx {
			q[k] = m + h*bd.gx[t]
			emit(q, w*h*bd.gw[t])
		}
	}
}

// rootsOn appends to roots the zeros of t -> f(p with p_k = t) on [a, c]:
// the one sign change of a monotone function, or (robust) every zero at
// which the function changes sign, isolated by interval bisection. A zero
// of even order (a tangency) is not a cut: the integrand of the next level
// stays smooth across it.
func (bd *builder) rootsOn(f *fn, k int, free []int, p [3]float64, a, c float64, robust bool, roots []float64) []float64 {
	h := func(t float64) float64 {
		q := p
		q[k] = t
		return bd.g.value(f.at(q, free))
	}
	if !robust {
		return bd.bracketed(f, k, free, p, a, c, h(a), h(c), roots)
	}
	var rec func(lo, hi, hlo, hhi float64, depth int)
	rec = func(lo, hi, hlo, hhi float64, depth int) {
		if bd.lineWork++; bd.lineWork > maxLineWork {
			bd.overflow = true
			return
		}
		var bx [3]span
		for _, i := range free {
			bx[i] = span{Lo: p[i], Hi: p[i]}
		}
		bx[k] = span{Lo: lo, Hi: hi}
		v, gu := bd.g.evalSpan(f.spanAt(bx, free))
		if v.Finite() && (v.Lo > 0 || v.Hi < 0) {
			return
		}
		d := gu[k]
		mono := d.Finite() && (d.Lo >= 0 || d.Hi <= 0)
		mid := 0.5 * (lo + hi)
		if mono || depth >= maxLineDepth || !(mid > lo && mid < hi) {
			roots = bd.bracketed(f, k, free, p, lo, hi, hlo, hhi, roots)
			return
		}
		hm := h(mid)
		rec(lo, mid, hlo, hm, depth+1)
		rec(mid, hi, hm, hhi, depth+1)
	}
	n0 := len(roots)
	rec(a, c, h(a), h(c), 0)
	// A zero met exactly at a bisection point is reported by both halves.
	mine := roots[n0:]
	sort.Float64s(mine)
	var uniq []float64
	for i, t := range mine {
		if i == 0 || t != mine[i-1] {
			uniq = append(uniq, t)
		}
	}
	// Two zeros closer than 1e-6 of the segment with the function within
	// rounding of 0 between them are a tangency that rounding split (a
	// circle touching a face, phi there a square plus a constant that
	// cancels to +-1e-17): no cut. Tolerances tuned on the tangent cases.
	scale := math.Max(1, math.Max(math.Abs(h(a)), math.Abs(h(c))))
	out := roots[:n0]
	for i := 0; i < len(uniq); i++ {
		if i+1 < len(uniq) && uniq[i+1]-uniq[i] < 1e-6*(c-a) && math.Abs(h(0.5*(uniq[i]+uniq[i+1]))) <= 1e-13*scale {
			i++
			continue
		}
		out = append(out, uniq[i])
	}
	return out
}

// maxLineDepth bounds the interval bisection along a line: 2^-48 of the
// segment, below which two zeros are one for every printed digit.
const maxLineDepth = 48

// bracketed appends the zero of a sign change between ha = h(a) and
// hc = h(c), found by Newton's method safeguarded by bisection on the
// bracket, to within a few ulps; a zero at an end counts when the other
// end has a sign.
func (bd *builder) bracketed(f *fn, k int, free []int, p [3]float64, a, c, ha, hc float64, roots []float64) []float64 {
	switch {
	case ha == 0 && hc == 0:
		return roots // identically zero along the line: no cut
	case ha == 0:
		// A zero on the lower end is the upper end of the box below,
		// which counts it; only the element's own face keeps it here, so
		// that an interface along a face between boxes is counted once.
		if a != bd.g.lo[k] {
			return roots
		}
		bd.recRoot(f, a, a, a)
		return append(roots, a)
	case hc == 0:
		bd.recRoot(f, c, c, c)
		return append(roots, c)
	case (ha > 0) == (hc > 0), math.IsNaN(ha), math.IsNaN(hc):
		return roots
	}
	lo, hi := a, c
	if ha > 0 {
		lo, hi = c, a // keep h(lo) < 0 < h(hi)
	}
	// Newton starts from the root of the same function on the line
	// before (the neighbouring node of the level below) when it lies in
	// the bracket, else from the middle; the bracket keeps it safe.
	// With two roots before, their linear extrapolation (the next node of
	// the level below is usually the next along the same line there) is
	// tried first.
	t := 0.5 * (a + c)
	w := bd.warm(f, len(free))
	if w.f == f {
		if g := 2*w.t - w.t0; w.n >= 2 && (g-lo)*(g-hi) < 0 {
			t = g
		} else if g := w.t; (g-lo)*(g-hi) < 0 {
			t = g
		}
	} else {
		w.n = 0
	}
	defer func() { w.f, w.t0, w.t, w.n = f, w.t, t, w.n+1 }()
	for it := 0; it < 200; it++ {
		q := p
		q[k] = t
		v, gu, _ := bd.g.eval(f.at(q, free))
		if v == 0 {
			bd.recRoot(f, t, a, c)
			return append(roots, t)
		}
		if v < 0 {
			lo = t
		} else {
			hi = t
		}
		next := t - v/gu[k]
		inside := (next-lo)*(next-hi) < 0
		if !inside || math.IsNaN(next) {
			next = 0.5 * (lo + hi)
		}
		if next == t || next == lo || next == hi || math.Abs(hi-lo) <= 2*ulp(t) {
			break
		}
		t = next
	}
	// The last iterate or the better end of the final bracket.
	bd.recRoot(f, t, a, c)
	return append(roots, t)
}

func ulp(t float64) float64 {
	return math.Nextafter(math.Abs(t), math.Inf(1)) - math.Abs(t) + math.SmallestNonzeroFloat64
}

// lineBufs are the reused buffers of the lines of one level.
type lineBufs struct {
	roots, cuts []float64
	kept        []int
}

// warmStart is the last root found for the function f at one level.
type warmStart struct {
	f     *fn
	t0, t float64 // the last two roots, t the later
	n     int     // roots recorded for f
}

// warm returns the warm-start slot of f at the level with n free
// coordinates: the one already holding f, else the least recently
// filled of a few.
func (bd *builder) warm(f *fn, n int) *warmStart {
	ws := &bd.warmth[n]
	for i := range ws {
		if ws[i].f == f {
			return &ws[i]
		}
	}
	bd.warmNext[n] = (bd.warmNext[n] + 1) % len(ws)
	return &ws[bd.warmNext[n]]
}
