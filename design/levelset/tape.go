package levelset

import "sort"

// The extended-precision path keeps the float64 plan: the boxes, their
// splits, the height directions, and along each line which roots cut it
// and which pieces are kept. A float64 run with a tape records them in
// the order the recursion meets them; replay (extended.go) walks the same
// recursion in that order at extended precision, recomputing only the
// numbers: the roots (from their float64 brackets) and the Gauss-Legendre
// nodes on every piece.

// evKind is what one call of builder.integrate, or one line, did.
type evKind uint8

const (
	evEmpty  evKind = iota // pruned: nothing of the domain on the box
	evTensor               // no function left: the tensor Gauss rule of the box
	evLine1                // one free coordinate: a line event follows
	evSplit                // split in two: the two halves' events follow
	evReduce               // height direction k: the face level's events follow, a line per point it emits
	evLine                 // one line: its cuts and kept pieces
)

// cut is a root along a line: its float64 value t, found in the bracket
// [lo, hi] (lo == hi: an end of the segment where the function is 0), of
// the function f.
type cut struct {
	t, lo, hi float64
	f         fn
	end       bool // an end of the segment, not a root
}

type event struct {
	kind    evKind
	free    []int
	b       [3]span
	k       int // evReduce, evLine: the direction
	surface bool
	// evLine, not surface: cuts[0] and cuts[last] are the ends of the
	// segment (lo == hi there), pieces the j of the kept [cuts[j],
	// cuts[j+1]]; surface: the cuts emitted, in order.
	cuts   []cut
	pieces []int
}

// tape is the record of one float64 run.
type tape struct {
	ev []event
	// brk collects the brackets of the roots of the line in progress.
	brk []cut
}

func (bd *builder) rec(e event) {
	if bd.tape != nil {
		e.free = append([]int(nil), e.free...)
		bd.tape.ev = append(bd.tape.ev, e)
	}
}

func (bd *builder) recRoot(f *fn, t, lo, hi float64) {
	if bd.tape != nil {
		bd.tape.brk = append(bd.tape.brk, cut{t: t, lo: lo, hi: hi, f: *f})
	}
}

// bracketOf finds the recorded bracket of the root t of the line in
// progress.
func (bd *builder) bracketOf(t float64) cut {
	for _, c := range bd.tape.brk {
		if c.t == t {
			return c
		}
	}
	panic("levelset: a root without its bracket")
}

// recLine records a non-surface line: the sorted cuts with the ends and
// the kept pieces.
func (bd *builder) recLine(k int, free []int, b [3]span, cuts []float64, kept []int) {
	if bd.tape == nil {
		return
	}
	e := event{kind: evLine, k: k, free: free, b: b, pieces: kept}
	for j, t := range cuts {
		if j == 0 || j == len(cuts)-1 {
			e.cuts = append(e.cuts, cut{t: t, lo: t, hi: t, end: true})
			continue
		}
		e.cuts = append(e.cuts, bd.bracketOf(t))
	}
	sort.SliceStable(e.cuts[1:len(e.cuts)-1], func(i, j int) bool { return e.cuts[1+i].t < e.cuts[1+j].t })
	bd.rec(e)
	bd.tape.brk = bd.tape.brk[:0]
}

// recSurface records a surface line: the roots emitted.
func (bd *builder) recSurface(k int, free []int, b [3]span, roots []float64) {
	if bd.tape == nil {
		return
	}
	e := event{kind: evLine, k: k, free: free, b: b, surface: true}
	for _, t := range roots {
		e.cuts = append(e.cuts, bd.bracketOf(t))
	}
	bd.rec(e)
	bd.tape.brk = bd.tape.brk[:0]
}
