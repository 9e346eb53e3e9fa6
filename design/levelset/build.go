package levelset

import (
	"context"
	"fmt"
	"math"
	"strconv"
	"strings"

	"quadwright/moments"
)

// Build makes the rule the request asks for. Errors are one sentence
// naming the offending input: a malformed level set or weight, an unknown
// shape, an order out of range, a level set or weight undefined (or a
// weight not positive) inside the element, and an empty domain (the
// element lies wholly on the other side, or the interface misses it).
func Build(ctx context.Context, req Request) (*Rule, error) {
	if req.Order < 1 || req.Order > MaxOrder {
		return nil, fmt.Errorf("--degree %d: give the order of the one-dimensional rules, 1 to %d", req.Order, MaxOrder)
	}
	if req.Digits < 0 || req.Digits > MaxDigits {
		return nil, fmt.Errorf("--digits %d: a cut-element rule takes 1 to %d digits", req.Digits, MaxDigits)
	}
	g, err := geometry(req, nil)
	if err != nil {
		return nil, err
	}
	if g.phi, err = ParseLevelSet(req.LevelSet, g.dim); err != nil {
		return nil, err
	}
	var wexpr *moments.Expr
	if strings.TrimSpace(req.Weight) != "" {
		if wexpr, err = parseIn("weight", req.Weight, g.dim); err != nil {
			return nil, err
		}
	}
	if err := g.checkDefined(req.LevelSet); err != nil {
		return nil, err
	}
	r := &Rule{Request: req, Dim: g.dim, Vertices: g.vertices()}
	r.Method = fmt.Sprintf("Saye's algorithm (SIAM J. Sci. Comput. 2015): height directions from the gradient, subdivision where the implicit function theorem fails, %d-point Gauss-Legendre rules on every piece", req.Order)
	if g.kind != identity {
		r.Method += ", on the cube through the collapsed (Duffy) map"
	}
	switch g.wholeSide(req.Side) {
	case 1:
		r.Whole = true
		r.Note = fmt.Sprintf("the element lies wholly on the %s side of the level set: this is the plain %d-point product rule of the element", req.Side, req.Order)
	case -1:
		return nil, g.emptyError(req)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	nodes, wts, bd := points(g, req.Side, req.Order)
	if bd.overflow {
		return nil, fmt.Errorf("level set %q: needs more than %d subdivisions of the element to resolve; it oscillates or turns too sharply to integrate at this order", req.LevelSet, maxBoxes)
	}
	if len(nodes) == 0 {
		return nil, g.emptyError(req)
	}
	if bd.forced > 0 {
		r.Note = joinNote(r.Note, fmt.Sprintf("%d small boxes where no height direction could be confirmed were integrated without that guarantee", bd.forced))
	}
	// Float64 rounding can put a node of a piece thinner than a few ulps
	// on the wrong side; such a node (its weight is of that thinness) is
	// left out so that every node is strictly on the asked side.
	dropped := 0
	keepN, keepW := nodes[:0], wts[:0]
	for i, p := range nodes {
		if req.Side != Surface {
			v := g.compiled().Value(p[:g.dim])
			if (req.Side == Inside && !(v < 0)) || (req.Side == Outside && !(v > 0)) {
				dropped++
				continue
			}
		}
		keepN, keepW = append(keepN, p), append(keepW, wts[i])
	}
	nodes, wts = keepN, keepW
	if dropped > 0 && req.Digits == 0 {
		r.Note = joinNote(r.Note, fmt.Sprintf("%d nodes within rounding of the interface were left out", dropped))
	}
	if len(nodes) == 0 {
		return nil, g.emptyError(req)
	}
	if wexpr != nil {
		for i, p := range nodes {
			v := wexpr.Eval64(p[:g.dim]...)
			if !(v > 0) || math.IsInf(v, 0) {
				return nil, fmt.Errorf("weight %q: %v at (%s), a node of the rule: a weight must be positive and finite on the domain", req.Weight, v, coords(p[:g.dim]))
			}
			wts[i] *= v
		}
	}
	// The rule of order Q+4 is only summed, never stored.
	lo := g.newSums()
	for i, p := range nodes {
		lo.add(p, wts[i])
	}
	r.EstimatedError = compareSums(lo, sumsAt(g, req.Side, req.Order+4, wexpr))
	for _, w := range wts {
		r.Measure += w
	}
	flat := make([]float64, g.dim*len(nodes))
	r.Nodes = make([][]float64, len(nodes))
	for i, p := range nodes {
		if !(wts[i] > 0) {
			return nil, fmt.Errorf("level set %q: a weight %v came out not positive at (%s); the rule is refused", req.LevelSet, wts[i], coords(p[:g.dim]))
		}
		r.Nodes[i] = flat[g.dim*i : g.dim*(i+1) : g.dim*(i+1)]
		copy(r.Nodes[i], p[:g.dim])
	}
	r.Weights = wts
	if req.Digits > 0 {
		if err := refine(ctx, g, r, wexpr); err != nil {
			return nil, err
		}
		return r, nil
	}
	return r, nil
}

// Print fills PrintedNodes and PrintedWeights of a float64 rule (Digits
// 0) with the shortest strings that read back as the same float64
// values, all cut from one buffer; Build leaves them to this (the writers
// of rule files call it), since formatting half a million numbers would
// cost more than building the rule. A rule already printed (every rule of
// Digits > 0) is left as it is.
func (r *Rule) Print() {
	if r.PrintedNodes != nil || len(r.Nodes) == 0 {
		return
	}
	cells := 0
	for _, p := range r.Nodes {
		cells += len(p) + 1
	}
	// 24 bytes hold any shortest float64 ("-1.2345678901234567e-308").
	buf := make([]byte, 0, 24*cells)
	ends := make([]int, 0, cells)
	for i, p := range r.Nodes {
		for _, c := range p {
			buf = strconv.AppendFloat(buf, c, 'g', -1, 64)
			ends = append(ends, len(buf))
		}
		buf = strconv.AppendFloat(buf, r.Weights[i], 'g', -1, 64)
		ends = append(ends, len(buf))
	}
	all := string(buf)
	strs := make([]string, len(ends))
	start := 0
	for j, e := range ends {
		strs[j], start = all[start:e], e
	}
	r.PrintedNodes = make([][]string, len(r.Nodes))
	r.PrintedWeights = make([]string, len(r.Nodes))
	j := 0
	for i, p := range r.Nodes {
		r.PrintedNodes[i] = strs[j : j+len(p) : j+len(p)]
		r.PrintedWeights[i] = strs[j+len(p)]
		j += len(p) + 1
	}
}

func joinNote(a, b string) string {
	if a == "" {
		return b
	}
	return a + "; " + b
}

func coords(p []float64) string {
	s := make([]string, len(p))
	for i, c := range p {
		s[i] = strconv.FormatFloat(c, 'g', 6, 64)
	}
	return strings.Join(s, ", ")
}

// checkDefined samples phi at the centres of a 9^dim grid of cells of the
// computational box and at its centre; a NaN or infinite value there is
// an undefined level set.
func (g *geom) checkDefined(src string) error {
	const n = 9
	total := 1
	for i := 0; i < g.dim; i++ {
		total *= n
	}
	for m := 0; m < total; m++ {
		var u [3]float64
		r := m
		for i := 0; i < g.dim; i++ {
			u[i] = g.lo[i] + (g.hi[i]-g.lo[i])*(float64(r%n)+0.5)/n
			r /= n
		}
		x := g.toX(u)
		var gr [3]float64
		v := g.phi.Grad64(x[:g.dim], gr[:g.dim])
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("level set %q: undefined at (%s) inside the element", src, coords(x[:g.dim]))
		}
	}
	return nil
}

// wholeSide is 1 when interval arithmetic proves the element wholly on
// the side (up to a zero on its boundary), -1 when it proves the side
// empty (or the surface absent), 0 otherwise.
func (g *geom) wholeSide(side Side) int {
	var b [3]span
	for i := 0; i < g.dim; i++ {
		b[i] = span{Lo: g.lo[i], Hi: g.hi[i]}
	}
	v, _ := g.evalSpan(b)
	if !v.Finite() {
		return 0
	}
	switch side {
	case Surface:
		if v.Lo > 0 || v.Hi < 0 {
			return -1
		}
	case Inside:
		if v.Hi <= 0 {
			return 1
		}
		if v.Lo >= 0 {
			return -1
		}
	case Outside:
		if v.Lo >= 0 {
			return 1
		}
		if v.Hi <= 0 {
			return -1
		}
	}
	return 0
}

func (g *geom) emptyError(req Request) error {
	what := map[Side]string{
		Inside:  "it lies wholly where the level set is >= 0, so the inside part is empty",
		Outside: "it lies wholly where the level set is <= 0, so the outside part is empty",
		Surface: "the level set does not vanish on it, so the surface is empty",
	}[req.Side]
	return fmt.Errorf("level set %q on the %s: %s", req.LevelSet, g.name(req), what)
}

func (g *geom) name(req Request) string {
	if req.Shape == "box" {
		return "box"
	}
	return req.Shape
}

// sums accumulates the test integrands of the estimated error (see
// Rule.EstimatedError) over a rule: 1, xi_k, xi_k xi_j (at most 10 in
// 3-D), xi the coordinates centred and scaled to [-1, 1] on the element's
// bounding box.
type sums struct {
	dim    int
	lo, hi [3]float64
	// inv[k] is 1/(hi[k]-lo[k]) when that width is a power of two (the
	// product is then the quotient exactly), else 0: divide.
	inv [3]float64
	s   [10]float64
	n   int
}

func (g *geom) newSums() *sums {
	m := &sums{dim: g.dim}
	for i, v := range g.vertices() {
		for k := range v {
			if i == 0 || v[k] < m.lo[k] {
				m.lo[k] = v[k]
			}
			if i == 0 || v[k] > m.hi[k] {
				m.hi[k] = v[k]
			}
		}
	}
	for k := 0; k < m.dim; k++ {
		if fr, _ := math.Frexp(m.hi[k] - m.lo[k]); fr == 0.5 {
			m.inv[k] = 1 / (m.hi[k] - m.lo[k])
		}
	}
	return m
}

func (m *sums) add(p [3]float64, w float64) {
	var xi [3]float64
	for k := 0; k < m.dim; k++ {
		if m.inv[k] != 0 {
			xi[k] = (2*p[k] - m.lo[k] - m.hi[k]) * m.inv[k]
		} else {
			xi[k] = (2*p[k] - m.lo[k] - m.hi[k]) / (m.hi[k] - m.lo[k])
		}
	}
	m.n++
	m.s[0] += w
	j := 1
	for k := 0; k < m.dim; k++ {
		m.s[j] += w * xi[k]
		j++
	}
	for k := 0; k < m.dim; k++ {
		for l := k; l < m.dim; l++ {
			m.s[j] += w * xi[k] * xi[l]
			j++
		}
	}
}

// sumsAt runs the algorithm at order q and sums the test integrands over
// its rule (the weight function, when given, included) without storing
// the rule.
func sumsAt(g *geom, side Side, q int, wexpr *moments.Expr) *sums {
	m := g.newSums()
	run(g, side, q, nil, func(x [3]float64, w float64) {
		if wexpr != nil {
			w *= wexpr.Eval64(x[:g.dim]...)
		}
		m.add(x, w)
	})
	return m
}

// compare is the estimated error of the rule (nodes, wts) against the one
// of order Q+4 (hn, hw): see Rule.EstimatedError.
func (g *geom) compare(nodes [][3]float64, wts []float64, hn [][3]float64, hw []float64) float64 {
	a, b := g.newSums(), g.newSums()
	for i, p := range nodes {
		a.add(p, wts[i])
	}
	for i, p := range hn {
		b.add(p, hw[i])
	}
	return compareSums(a, b)
}

// compareSums is max |a_j - b_j| / |b_0| over the test integrands.
func compareSums(a, b *sums) float64 {
	if a.n == 0 || b.n == 0 || b.s[0] == 0 {
		return math.Inf(1)
	}
	e := 0.0
	for j := 0; j < 1+a.dim+a.dim*(a.dim+1)/2; j++ {
		e = math.Max(e, math.Abs(a.s[j]-b.s[j])/math.Abs(b.s[0]))
	}
	return e
}
