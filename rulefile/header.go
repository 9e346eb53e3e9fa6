package rulefile

import (
	"strings"

	"quadwright/precision"
)

// tableHeader is what the comment lines above a text table say about the
// rule, as quadwright's own text output writes them: the element of an
// element rule ("# quadwright symmetric rule on the reference triangle"),
// its weight ("# weight:   x (the rule integrates w p over the element)"),
// and for a rule on an interval the measure line ("# measure:  legendre,
// weight 1 on [-1, 1]"). Comments of any other shape are left alone, so a
// hand-written table reads as before.
type tableHeader struct {
	shape, weight, measure string
	interval               []string
}

// readComment takes what it can from one comment (the text after '#').
func (h *tableHeader) readComment(c string) {
	c = strings.TrimSpace(c)
	const ref = " rule on the reference "
	if strings.HasPrefix(c, "quadwright ") {
		if i := strings.LastIndex(c, ref); i >= 0 {
			h.shape = strings.TrimSpace(c[i+len(ref):])
		}
		return
	}
	if v, ok := strings.CutPrefix(c, "weight:"); ok {
		v = strings.TrimSpace(v)
		if i := strings.LastIndex(v, " (the rule integrates"); i >= 0 {
			v = strings.TrimSpace(v[:i])
		}
		if f, ok := strings.CutPrefix(v, "the weight whose moments are listed in "); ok {
			v = "moments(" + f + ")"
		}
		h.weight = v
		return
	}
	if v, ok := strings.CutPrefix(c, "measure:"); ok {
		// "NAME, weight W on [A, B]": the interval is the last bracket.
		i := strings.LastIndex(v, " on [")
		j := strings.LastIndex(v, "]")
		if i < 0 || j < i {
			return
		}
		ends := strings.Split(v[i+len(" on ["):j], ",")
		if len(ends) != 2 {
			return
		}
		a, b := strings.TrimSpace(ends[0]), strings.TrimSpace(ends[1])
		if a == "" || b == "" {
			return
		}
		h.interval = []string{a, b}
		h.measure = strings.TrimSpace(v[:i])
		if k := strings.Index(v, ", weight "); k >= 0 && k+len(", weight ") <= i {
			h.weight = strings.TrimSpace(v[k+len(", weight ") : i])
			h.measure = strings.TrimSpace(v[:k])
		}
	}
}

// apply records the header in f: only a shape that is not "interval"
// makes the rule an element rule; the interval's ends are kept only when
// both parse as numbers (an infinite end such as "inf" leaves the domain
// unset, as for any table).
func (h *tableHeader) apply(f *File) {
	if h.shape != "" {
		f.Domain.Shape = h.shape
	}
	if h.weight != "" {
		f.Weight = h.weight
	}
	if h.measure != "" {
		f.Measure = h.measure
	}
	if h.shape == "" && len(h.interval) == 2 && isFinite(h.interval[0]) && isFinite(h.interval[1]) {
		f.Domain.Interval = h.interval
	}
}

func isFinite(s string) bool {
	_, err := precision.ParseNumber(s)
	return err == nil
}
