package moments

import (
	"math/big"
)

// kinkSamples is the number of points per zoom step of locateKink.
const kinkSamples = 16

// locateKink looks for the point of a finite piece near which the weight is
// least smooth (a kink, a jump, an interior singularity): it samples w at
// kinkSamples midpoints of equal cells at prec bits, takes the largest
// second difference, and zooms onto the two cells around it, an 8-fold
// narrowing per step, while that difference stands out (at least four
// times every one not next to it). It stops when the bracket is a few ulps
// of prec wide and returns its midpoint, an exact binary fraction; it
// reports false when no point stands out at the first step or w cannot be
// evaluated at a sample.
//
// Where the double-exponential levels of a piece do not agree, this finds
// the cause at the cost of a few hundred evaluations, instead of the ~2
// log2(10^digits) bisections that would otherwise close in on a kink at a
// point like 0.3 that no dyadic midpoint ever hits; a kink within 2^-(prec-8)
// of a piece's end costs that piece nothing.
func (p *deProblem) locateKink(pc dePiece) (*big.Rat, bool) {
	prec := p.prec
	lo := new(big.Float).SetPrec(prec).SetRat(pc.lo)
	hi := new(big.Float).SetPrec(prec).SetRat(pc.hi)
	xs := make([]*big.Float, kinkSamples)
	vs := make([]*big.Float, kinkSamples)
	d2 := make([]*big.Float, kinkSamples)
	found := false
	for step := 0; step < 4*int(prec); step++ {
		cell := new(big.Float).SetPrec(prec).Sub(hi, lo)
		cell.Quo(cell, big.NewFloat(kinkSamples))
		if cell.Sign() <= 0 {
			break
		}
		if m := maxAbsExp(lo, hi); m-cell.MantExp(nil) > int(prec)-8 {
			break
		}
		for i := range xs {
			x := new(big.Float).SetPrec(prec).Mul(cell, big.NewFloat(float64(i)+0.5))
			xs[i] = x.Add(x, lo)
			v, err := p.w.Expr.EvalBig(prec, xs[i])
			if err != nil {
				return nil, false
			}
			vs[i] = v
		}
		best := -1
		for i := 1; i+1 < kinkSamples; i++ {
			d := new(big.Float).SetPrec(prec).Add(vs[i-1], vs[i+1])
			d.Sub(d, new(big.Float).SetPrec(prec).Mul(vs[i], big.NewFloat(2)))
			d2[i] = d.Abs(d)
			if best < 0 || d2[i].Cmp(d2[best]) > 0 {
				best = i
			}
		}
		quarter := new(big.Float).Quo(d2[best], big.NewFloat(4))
		for i := 1; i+1 < kinkSamples; i++ {
			if (i < best-1 || i > best+1) && d2[i].Cmp(quarter) > 0 {
				best = -1
				break
			}
		}
		if best < 0 || d2[best].Sign() == 0 {
			break
		}
		found = true
		lo, hi = xs[best-1], xs[best+1]
	}
	if !found {
		return nil, false
	}
	m := new(big.Float).SetPrec(prec+1).Add(lo, hi)
	m.SetMantExp(m, -1)
	r, _ := m.Rat(nil)
	return r, true
}

// maxAbsExp returns the larger binary exponent of a and b (zeros count as
// very small).
func maxAbsExp(a, b *big.Float) int {
	ea, eb := a.MantExp(nil), b.MantExp(nil)
	if a.Sign() == 0 {
		ea = eb
	}
	if b.Sign() == 0 {
		eb = ea
	}
	return max(ea, eb)
}

// split cuts a piece that failed to converge: a finite one at the point
// locateKink finds, unless it finds none or one within 2^-10 of the width
// from an end, where the midpoint serves better; an infinite one as bisect
// does.
func (p *deProblem) split(pc dePiece) (dePiece, dePiece) {
	if pc.kind != tanhSinh {
		return pc.bisect()
	}
	c, ok := p.locateKink(pc)
	if ok {
		w := new(big.Rat).Sub(pc.hi, pc.lo)
		w.Quo(w, big.NewRat(1024, 1))
		if new(big.Rat).Sub(c, pc.lo).Cmp(w) > 0 && new(big.Rat).Sub(pc.hi, c).Cmp(w) > 0 {
			return newPiece(pc.lo, c, pc.depth+1), newPiece(c, pc.hi, pc.depth+1)
		}
	}
	return pc.bisect()
}
