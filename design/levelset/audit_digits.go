package levelset

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"quadwright/moments"
	"quadwright/precision"
)

// float64Digits is the most significant digits a float64-mode rule file
// prints (shortest round-trip form); a file with more was written at
// extended precision and is audited at its own digits.
const float64Digits = 17

// fileDigits reads the rule's values as exact decimals and returns D, the
// largest number of significant digits among them (the contract's rule),
// with the values.
func fileDigits(nodes [][]string, weights []string) (int, [][]*big.Rat, []*big.Rat, error) {
	d := 1
	xs := make([][]*big.Rat, len(nodes))
	ws := make([]*big.Rat, len(weights))
	for i, n := range nodes {
		for _, s := range n {
			v, err := precision.ParseNumber(s)
			if err != nil {
				return 0, nil, nil, fmt.Errorf("node %d: %v", i+1, err)
			}
			d = max(d, v.Digits)
			xs[i] = append(xs[i], v.Value)
		}
	}
	for i, s := range weights {
		v, err := precision.ParseNumber(s)
		if err != nil {
			return 0, nil, nil, fmt.Errorf("weight %d: %v", i+1, err)
		}
		d = max(d, v.Digits)
		ws[i] = v.Value
	}
	return d, xs, ws, nil
}

// auditDigits is AuditRule for a file of D > 17 digits: every check at
// DigitsToBits(D) + 64 bits. Nodes are tested in the closed element
// exactly (as rationals) and on the side with phi at that precision (the
// surface: within 10 units of the last printed place of a coordinate,
// times the gradient, as refine prints them); the sums of the measure and
// the stability factor are formed at that precision; the estimated error
// compares the rule read with the float64 plan of order+4 replayed at that
// precision (Gauss-Legendre rules of D+12 digits), as refine does.
func auditDigits(ctx context.Context, g *geom, req Request, d int, xs [][]*big.Rat, ws []*big.Rat) (*Audit, error) {
	if d > precision.MaxDigits {
		return nil, fmt.Errorf("a value carries %d significant digits, more than the %d an audit reads", d, precision.MaxDigits)
	}
	prec := precision.DigitsToBits(d) + 64
	a := &Audit{Points: len(xs), Degree: -1, Order: req.Order, Digits: d}
	size := 0.0
	for k := 0; k < g.dim; k++ {
		size = math.Max(size, g.hi[k]-g.lo[k])
	}
	unit := math.Pow(10, math.Floor(math.Log10(size))-float64(d)+1)
	file := &xrule{}
	sum, abs := newBigSum(prec), newBigSum(prec)
	t := new(big.Float).SetPrec(prec)
	phi := g.phi.CompileGrad(prec)
	lim := new(big.Float).SetPrec(prec)
	tol := new(big.Float).SetPrec(prec).SetFloat64(10 * unit)
	for i := range xs {
		var p xpoint
		for k, c := range xs[i] {
			p[k] = new(big.Float).SetPrec(prec).SetRat(c)
		}
		w := new(big.Float).SetPrec(prec).SetRat(ws[i])
		if w.Sign() < 0 {
			a.NegativeWeights++
		}
		sum.add(w)
		abs.add(t.Abs(w))
		file.nodes, file.wts = append(file.nodes, p), append(file.wts, w)
		if !g.inElement(xs[i]) {
			a.NodesOutside++
			continue
		}
		var tg [][]*big.Float
		if req.Side == Surface {
			tg = phi.Unit()
		}
		v, gr, err := phi.Eval(p[:g.dim], tg)
		if err != nil {
			a.NodesOutside++
			continue
		}
		ok := false
		switch req.Side {
		case Inside:
			ok = v.Sign() < 0
		case Outside:
			ok = v.Sign() > 0
		default:
			lim.SetInt64(0)
			for _, c := range gr {
				lim.Add(lim, t.Mul(c, c))
			}
			lim.Sqrt(lim)
			lim.Mul(lim, tol)
			ok = t.Abs(v).Cmp(lim) <= 0
		}
		if !ok {
			a.NodesOutside++
		}
	}
	if sum.s.Sign() == 0 {
		return nil, errZeroSum
	}
	a.Measure, _ = sum.s.Float64()
	sf := new(big.Float).SetPrec(prec).Quo(abs.s, t.Abs(sum.s))
	a.StabilityFactor, _ = sf.Float64()
	a.LostDigits = math.Log10(a.StabilityFactor)
	var wexpr *moments.Expr
	if req.Weight != "" {
		var err error
		if wexpr, err = parseIn("weight", req.Weight, g.dim); err != nil {
			return nil, err
		}
	}
	if err := g.checkDefined(req.LevelSet); err != nil {
		return nil, err
	}
	if g.wholeSide(req.Side) == -1 {
		return nil, g.emptyError(req)
	}
	tp, err := record(g, req.Side, req.Order+4)
	if err != nil {
		return nil, err
	}
	ref, err := replayRule(ctx, g, tp, req.Order+4, prec, d+12, size, wexpr)
	if err != nil {
		return nil, err
	}
	if len(ref.nodes) == 0 {
		return nil, g.emptyError(req)
	}
	a.EstimatedError = g.compareX(file, ref, prec)
	a.Note = fmt.Sprintf("checked at %d digits (%d bits), the most significant digits of the file's values", d, prec)
	return a, nil
}

// errZeroSum refuses a rule whose weights sum to zero: it has no measure
// and no stability factor.
var errZeroSum = fmt.Errorf("the weights sum to 0, so the rule has no measure to audit")

// inElement reports whether the point x (exact) lies in the closed
// element.
func (g *geom) inElement(x []*big.Rat) bool {
	zero, one := new(big.Rat), big.NewRat(1, 1)
	switch g.kind {
	case duffyTri, duffyTet:
		s := new(big.Rat)
		for _, c := range x {
			if c.Cmp(zero) < 0 {
				return false
			}
			s.Add(s, c)
		}
		return s.Cmp(one) <= 0
	}
	for k, c := range x {
		lo, hi := new(big.Rat).SetFloat64(g.lo[k]), new(big.Rat).SetFloat64(g.hi[k])
		if c.Cmp(lo) < 0 || c.Cmp(hi) > 0 {
			return false
		}
	}
	return true
}
