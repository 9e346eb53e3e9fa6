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
			v := g.phi.Eval64(p[:g.dim]...)
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
	hiN, hiW, _ := points(g, req.Side, req.Order+4)
	if wexpr != nil {
		for i, p := range hiN {
			hiW[i] *= wexpr.Eval64(p[:g.dim]...)
		}
	}
	r.EstimatedError = g.compare(nodes, wts, hiN, hiW)
	for _, w := range wts {
		r.Measure += w
	}
	for i, p := range nodes {
		if !(wts[i] > 0) {
			return nil, fmt.Errorf("level set %q: a weight %v came out not positive at (%s); the rule is refused", req.LevelSet, wts[i], coords(p[:g.dim]))
		}
		r.Nodes = append(r.Nodes, append([]float64(nil), p[:g.dim]...))
		r.Weights = append(r.Weights, wts[i])
	}
	if req.Digits > 0 {
		if err := refine(ctx, g, r, wexpr); err != nil {
			return nil, err
		}
		return r, nil
	}
	r.PrintedNodes = make([][]string, len(r.Nodes))
	r.PrintedWeights = make([]string, len(r.Weights))
	for i, p := range r.Nodes {
		for _, c := range p {
			r.PrintedNodes[i] = append(r.PrintedNodes[i], strconv.FormatFloat(c, 'g', -1, 64))
		}
		r.PrintedWeights[i] = strconv.FormatFloat(r.Weights[i], 'g', -1, 64)
	}
	return r, nil
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

// compare is the estimated error of the rule (nodes, wts) against the one
// of order Q+4 (hn, hw): see Rule.EstimatedError.
func (g *geom) compare(nodes [][3]float64, wts []float64, hn [][3]float64, hw []float64) float64 {
	lo, hi := [3]float64{}, [3]float64{}
	for i, v := range g.vertices() {
		for k := range v {
			if i == 0 || v[k] < lo[k] {
				lo[k] = v[k]
			}
			if i == 0 || v[k] > hi[k] {
				hi[k] = v[k]
			}
		}
	}
	// The test integrands 1, xi_k, xi_k xi_j (at most 10 in 3-D).
	sum := func(ns [][3]float64, ws []float64) []float64 {
		s := make([]float64, 1+g.dim+g.dim*(g.dim+1)/2)
		for i, p := range ns {
			var xi [3]float64
			for k := 0; k < g.dim; k++ {
				xi[k] = (2*p[k] - lo[k] - hi[k]) / (hi[k] - lo[k])
			}
			w := ws[i]
			s[0] += w
			m := 1
			for k := 0; k < g.dim; k++ {
				s[m] += w * xi[k]
				m++
			}
			for k := 0; k < g.dim; k++ {
				for j := k; j < g.dim; j++ {
					s[m] += w * xi[k] * xi[j]
					m++
				}
			}
		}
		return s
	}
	a, b := sum(nodes, wts), sum(hn, hw)
	if len(nodes) == 0 || len(hn) == 0 || b[0] == 0 {
		return math.Inf(1)
	}
	e := 0.0
	for j := range a {
		e = math.Max(e, math.Abs(a[j]-b[j])/math.Abs(b[0]))
	}
	return e
}
