package levelset

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"
	"sync"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// MaxDigits bounds Request.Digits: the cost of a rule grows with the
// working precision, about linearly in the digits up to here.
const MaxDigits = 100

// refine recomputes the rule r (built in float64 on g) at extended
// precision and prints Request.Digits digits. The float64 plan of the
// rule, and that of order Q+4 for the estimated error, are recorded
// (tape.go) and replayed (extended.go) at two working precisions p1 =
// precision.WorkingPrec(D+E, Q) and p2 = p1 + 64, each with its own
// Gauss-Legendre rule from design.Gauss (D+E+12 and D+E+32 digits). Every
// printed value must be the same from both, else the rule is refused.
// Weights and node coordinates print D significant digits, as the
// contract asks; since the roots and nodes are accurate to the working
// precision relative to the element's size (the largest side of its
// bounding box), E (0 to D) is the number of decimal orders by which the
// smallest nonzero coordinate of the float64 rule lies below that size.
// A coordinate within half a unit of the D-th digit of the size from 0
// (a zero by symmetry, such as the middle node of an odd order on a
// centred piece) prints as 0 instead of digits of rounding noise. Each
// printed node is then read back and must
// lie strictly on the side asked (surface: within 10 units of the last
// printed place, times the gradient, of the interface), at p2 bits.
func refine(ctx context.Context, g *geom, r *Rule, wexpr *moments.Expr) error {
	d := r.Digits
	if d < 1 || d > MaxDigits {
		return fmt.Errorf("--digits %d: a cut-element rule takes 1 to %d digits", d, MaxDigits)
	}
	size := 0.0
	for k := 0; k < g.dim; k++ {
		size = math.Max(size, g.hi[k]-g.lo[k])
	}
	e := smallCoordDigits(r.Nodes, size, d)
	p1 := precision.WorkingPrec(d+e, r.Order)
	p2 := p1 + 64
	tp, err := record(g, r.Side, r.Order)
	if err != nil {
		return err
	}
	runs := [2]*xrule{}
	for i, p := range []uint{p1, p2} {
		x, err := replayRule(ctx, g, tp, r.Order, p, d+e+12+20*i, size, wexpr)
		if err != nil {
			return err
		}
		runs[i] = x
	}
	a, b := runs[0], runs[1]
	if len(a.nodes) != len(b.nodes) {
		panic("levelset: two replays of one tape differ in length")
	}
	n := len(a.nodes)
	r.Nodes, r.Weights = make([][]float64, n), make([]float64, n)
	r.PrintedNodes, r.PrintedWeights = make([][]string, n), make([]string, n)
	unit := math.Pow(10, math.Floor(math.Log10(size))-float64(d)+1) // one unit in the last printed place of a coordinate
	// The points of a line share their other coordinates (the same
	// values, by pointer, in both replays): each is printed once.
	printed := map[[2]*big.Float]string{}
	chk := newPrintCheck(g, r, p2, unit)
	printedX := &xrule{} // the printed rule read back, for the estimated error
	// Both runs must print the same: the p1 value is tested against the
	// p2 string's rounding interval, and printed only where that cannot
	// tell.
	rc := newRoundCheck(p2)
	for i := 0; i < n; i++ {
		for k := 0; k < g.dim; k++ {
			xf, _ := b.nodes[i][k].Float64()
			key := [2]*big.Float{a.nodes[i][k], b.nodes[i][k]}
			sb, ok := printed[key]
			if !ok {
				sb = printCoord(b.nodes[i][k], xf, unit, d)
				if sb != "0" && !rc.within(a.nodes[i][k], chk.readBack(sb), sb, d) {
					sa := printCoord(a.nodes[i][k], xf, unit, d)
					if sa != sb {
						return fmt.Errorf("--digits %d: a node coordinate came out %s at %d bits and %s at %d bits; the rule could not be confirmed to that many digits", d, sa, p1, sb, p2)
					}
				}
				printed[key] = sb
			}
			r.Nodes[i] = append(r.Nodes[i], xf)
			r.PrintedNodes[i] = append(r.PrintedNodes[i], sb)
		}
		if b.wts[i].Sign() <= 0 {
			return fmt.Errorf("level set %q: a weight came out not positive at (%s); the rule is refused", r.LevelSet, coords(r.Nodes[i]))
		}
		sb := precision.FormatSig(b.wts[i], d)
		pw, _, err := big.ParseFloat(sb, 10, p2, big.ToNearestEven)
		if err != nil {
			panic("levelset: a printed weight does not read back: " + sb)
		}
		if !rc.within(a.wts[i], pw, sb, d) {
			if sa := precision.FormatSig(a.wts[i], d); sa != sb {
				return fmt.Errorf("--digits %d: a weight came out %s at %d bits and %s at %d bits; the rule could not be confirmed to that many digits", d, sa, p1, sb, p2)
			}
		}
		r.Weights[i], _ = b.wts[i].Float64()
		r.PrintedWeights[i] = sb
		pn, err := chk.node(r.PrintedNodes[i])
		if err != nil {
			return err
		}
		printedX.nodes, printedX.wts = append(printedX.nodes, pn), append(printedX.wts, pw)
	}
	// The estimated error of the printed rule against the rule of order
	// Q+4: where the float64 one of Build is well above float64 rounding,
	// it plus the printed rule's difference from the unrounded one (the
	// triangle inequality; the second term matters at few digits), else
	// the printed rule against the Q+4 rule replayed at p1 (which costs
	// more than the rule itself). Either way audit finds about the same.
	if r.EstimatedError >= float64EstimateFloor {
		r.EstimatedError += g.compareX(printedX, b, p2)
	} else {
		tq, err := record(g, r.Side, r.Order+4)
		if err != nil {
			return err
		}
		hi, err := replayRule(ctx, g, tq, r.Order+4, p1, d+e+12, size, wexpr)
		if err != nil {
			return err
		}
		r.EstimatedError = g.compareX(printedX, hi, p1)
	}
	m := new(big.Float).SetPrec(p2)
	for _, w := range b.wts {
		m.Add(m, w)
	}
	r.Measure, _ = m.Float64()
	r.Method += fmt.Sprintf("; roots and Gauss-Legendre rules at %d and %d bits, which agree in every printed digit", p1, p2)
	return nil
}

// float64EstimateFloor is the estimated error above which the float64
// comparison of Build is kept at extended precision: a thousand times the
// rounding of float64 sums of a few thousand terms (common practice).
const float64EstimateFloor = 1e-10

// xrule is a rule at extended precision: nodes in x and weights (the
// Jacobian of the map and the weight function included).
type xrule struct {
	nodes []xpoint
	wts   []*big.Float
}

// record runs the float64 algorithm at order q on g with a tape.
func record(g *geom, side Side, q int) (*tape, error) {
	tp := &tape{}
	_, _, bd := pointsTaped(g, side, q, tp)
	if bd.overflow {
		return nil, fmt.Errorf("level set: needs more than %d subdivisions of the element to resolve at order %d", maxBoxes, q)
	}
	return tp, nil
}

// replayRule replays the float64 plan tp of order q at prec bits, with
// Gauss-Legendre rules of glDigits digits. The nodes keep the values the
// replay made (shared between the points of a line); the weights are
// new.
func replayRule(ctx context.Context, g *geom, tp *tape, q int, prec uint, glDigits int, size float64, wexpr *moments.Expr) (*xrule, error) {
	gx, gw, err := gaussLegendreBig(ctx, q, glDigits, prec)
	if err != nil {
		return nil, err
	}
	rp := newReplay(g, prec, gx, gw, tp.ev, size)
	var wt *moments.GradTape
	if wexpr != nil {
		wt = wexpr.CompileGrad(prec)
	}
	out := &xrule{}
	var werr error
	rp.integrate(func(u xpoint, w *big.Float) {
		if rp.err != nil || werr != nil {
			return
		}
		x := g.toXBig(u, prec)
		if g.kind != identity {
			w.Mul(w, g.jacBig(u, prec))
		}
		if wt != nil {
			v, _, err := wt.Eval(x[:g.dim], nil)
			if err != nil || v.Sign() <= 0 {
				werr = fmt.Errorf("weight %q: not positive and finite at a node of the rule", wexpr.String())
				return
			}
			w.Mul(w, v)
		}
		out.nodes, out.wts = append(out.nodes, x), append(out.wts, w)
	})
	if rp.err != nil {
		return nil, rp.err
	}
	if werr != nil {
		return nil, werr
	}
	if rp.pos != len(tp.ev) {
		panic("levelset: the replay left events of its tape")
	}
	return out, ctx.Err()
}

// gaussLegendreBig is the q-point Gauss-Legendre rule on [-1, 1] from the
// extended-precision engine of package design (Jacobi with alpha = beta =
// 0), confirmed there to digits digits, rounded to prec bits.
func gaussLegendreBig(ctx context.Context, q, digits int, prec uint) (x, w []*big.Float, err error) {
	key := glKey{q, digits, prec}
	glCache.Lock()
	c, ok := glCache.m[key]
	glCache.Unlock()
	if ok {
		return c[0], c[1], nil
	}
	defer func() {
		if err == nil {
			glCache.Lock()
			glCache.m[key] = [2][]*big.Float{x, w}
			glCache.Unlock()
		}
	}()
	fam, err := moments.NewFamily("jacobi", new(big.Rat), new(big.Rat), nil)
	if err != nil {
		panic("levelset: " + err.Error())
	}
	rl, err := design.Gauss(ctx, design.FamilySource{Family: fam}, design.Request{Points: q, Digits: digits})
	if err != nil {
		return nil, nil, err
	}
	for i := range rl.NodeValues {
		x = append(x, new(big.Float).SetPrec(prec).Set(rl.NodeValues[i]))
		w = append(w, new(big.Float).SetPrec(prec).Set(rl.WeightValues[i]))
	}
	return x, w, nil
}

// glCache keeps the Gauss-Legendre rules made by gaussLegendreBig, by
// order, digits and precision: their values are never changed.
var glCache = struct {
	sync.Mutex
	m map[glKey][2][]*big.Float
}{m: map[glKey][2][]*big.Float{}}

type glKey struct {
	q, digits int
	prec      uint
}

// smallCoordDigits is E of refine: the decimal orders, 0 to d, by which
// the smallest nonzero |coordinate| of the float64 nodes lies below size.
func smallCoordDigits(nodes [][]float64, size float64, d int) int {
	m := 1.0
	for _, p := range nodes {
		for _, c := range p {
			if a := math.Abs(c) / size; a > 0 && a < m {
				m = a
			}
		}
	}
	return min(d, int(math.Ceil(-math.Log10(m))))
}

// printCoord prints the coordinate v with d significant digits, or 0
// where it lies within half a unit of the d-th digit of the element's
// size from 0 (unit is that unit, 10^(1-d) times the size's power of
// ten); xf, the float64 value of the more precise run, makes that choice
// for both runs' strings.
func printCoord(v *big.Float, xf, unit float64, d int) string {
	if math.Abs(xf) < unit/2 {
		return "0"
	}
	return precision.FormatSig(v, d)
}

// printCheck reads printed nodes back and tests their side at prec bits
// (phi by a compiled tape; a coordinate string shared by several nodes is
// read once).
type printCheck struct {
	g    *geom
	r    *Rule
	prec uint
	unit *big.Float
	phi  *moments.GradTape
	read map[string]*big.Float
	x    []*big.Float
	n, t *big.Float
}

func newPrintCheck(g *geom, r *Rule, prec uint, unit float64) *printCheck {
	u := new(big.Float).SetPrec(prec).SetFloat64(10 * unit)
	return &printCheck{g: g, r: r, prec: prec, unit: u, phi: g.phi.CompileGrad(prec), read: map[string]*big.Float{},
		x: make([]*big.Float, g.dim), n: new(big.Float).SetPrec(prec), t: new(big.Float).SetPrec(prec)}
}

// readBack is the printed coordinate s read at the check's precision
// (once per string).
func (c *printCheck) readBack(s string) *big.Float {
	v, ok := c.read[s]
	if !ok {
		var err error
		if v, _, err = big.ParseFloat(s, 10, c.prec, big.ToNearestEven); err != nil {
			panic("levelset: a printed coordinate does not read back: " + s)
		}
		c.read[s] = v
	}
	return v
}

// node tests one printed node and returns it read back: strictly on the side asked, or for the
// surface within 10 units of the last printed place, times the gradient,
// of the interface.
func (c *printCheck) node(node []string) (xpoint, error) {
	var p xpoint
	for k, s := range node {
		v := c.readBack(s)
		c.x[k] = v
		p[k] = v
	}
	var tg [][]*big.Float
	if c.r.Side == Surface {
		tg = c.phi.Unit()
	}
	v, gr, err := c.phi.Eval(c.x, tg)
	if err != nil {
		return p, fmt.Errorf("level set %q: undefined at the node (%s)", c.r.LevelSet, joinCoords(node))
	}
	ok := false
	switch c.r.Side {
	case Inside:
		ok = v.Sign() < 0
	case Outside:
		ok = v.Sign() > 0
	default:
		c.n.SetInt64(0)
		for _, d := range gr {
			c.n.Add(c.n, c.t.Mul(d, d))
		}
		c.n.Sqrt(c.n)
		c.n.Mul(c.n, c.unit)
		ok = c.t.Abs(v).Cmp(c.n) <= 0
	}
	if !ok {
		return p, fmt.Errorf("level set %q: the printed node (%s) is not on the %s side to %d digits; the rule is refused", c.r.LevelSet, joinCoords(node), c.r.Side, c.r.Digits)
	}
	return p, nil
}

func joinCoords(s []string) string {
	out := ""
	for i, c := range s {
		if i > 0 {
			out += ", "
		}
		out += c
	}
	return out
}

// compareX is compare (the estimated error) for two extended-precision
// rules, summed at prec bits.
func (g *geom) compareX(a, b *xrule, prec uint) float64 {
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
	// (2 x - lo - hi) / (hi - lo) = x s - c, s = 2/(hi-lo), c = (lo+hi)/(hi-lo)
	var sc, cc [3]*big.Float
	for k := 0; k < g.dim; k++ {
		sc[k] = new(big.Float).SetPrec(prec).SetFloat64(hi[k] - lo[k])
		sc[k].Quo(big.NewFloat(2), sc[k])
		cc[k] = new(big.Float).SetPrec(prec).SetFloat64(lo[k] + hi[k])
		cc[k].Quo(cc[k], new(big.Float).SetPrec(prec).SetFloat64(hi[k]-lo[k]))
	}
	var xi [3]*big.Float
	for k := range xi {
		xi[k] = new(big.Float).SetPrec(prec)
	}
	t, wx := new(big.Float).SetPrec(prec), new(big.Float).SetPrec(prec)
	sum := func(x *xrule) []*big.Float {
		s := make([]bigSum, 1+g.dim+g.dim*(g.dim+1)/2)
		for i := range s {
			s[i] = newBigSum(prec)
		}
		for i, p := range x.nodes {
			for k := 0; k < g.dim; k++ {
				xi[k].Mul(p[k], sc[k])
				xi[k].Sub(xi[k], cc[k])
			}
			w := x.wts[i]
			s[0].add(w)
			m := 1
			for k := 0; k < g.dim; k++ {
				s[m].add(t.Mul(w, xi[k]))
				m++
			}
			for k := 0; k < g.dim; k++ {
				wx.Mul(w, xi[k])
				for j := k; j < g.dim; j++ {
					s[m].add(t.Mul(wx, xi[j]))
					m++
				}
			}
		}
		out := make([]*big.Float, len(s))
		for i := range s {
			out[i] = s[i].s
		}
		return out
	}
	sa, sb := sum(a), sum(b)
	if len(a.nodes) == 0 || len(b.nodes) == 0 || sb[0].Sign() == 0 {
		return math.Inf(1)
	}
	e := 0.0
	for j := range sa {
		d := new(big.Float).SetPrec(prec).Sub(sa[j], sb[j])
		d.Quo(d, sb[0])
		f, _ := d.Float64()
		e = math.Max(e, math.Abs(f))
	}
	return e
}

// bigSum is a running sum at a fixed precision. Its additions never have
// the receiver among their operands: math/big then shifts into the
// receiver's own storage instead of a new copy each time.
type bigSum struct{ s, t *big.Float }

func newBigSum(prec uint) bigSum {
	return bigSum{new(big.Float).SetPrec(prec), new(big.Float).SetPrec(prec)}
}

func (a *bigSum) add(x *big.Float) {
	a.t.Add(a.s, x)
	a.s, a.t = a.t, a.s
}

// CheckBoxText refuses, when digits > 0, a --box bound whose decimal text
// is not exactly the float64 it was read as (0.1 is not; 0.25 is): the
// extended-precision rule is built on the float64 bounds, and its digits
// would otherwise belong to a slightly different box.
func CheckBoxText(texts []string, digits int) error {
	if digits == 0 {
		return nil
	}
	for _, s := range texts {
		s = strings.TrimSpace(s)
		q, ok := new(big.Rat).SetString(s)
		v, err := strconv.ParseFloat(s, 64)
		if !ok || err != nil {
			return fmt.Errorf("--box: %q is not a number", s)
		}
		if f := new(big.Rat).SetFloat64(v); f == nil || f.Cmp(q) != 0 {
			return fmt.Errorf("--box: with --digits every bound must be a binary fraction exactly (such as 0.25 or -1.5), and %s is not", s)
		}
	}
	return nil
}
