package moments

import (
	"context"
	"fmt"
	"math/big"
	"sync"

	"quadwright/precision"
)

const (
	// deMinLevel is the first level whose agreement with the one before is
	// trusted: coarser levels can agree by accident on oscillating
	// integrands.
	deMinLevel = 2
	// deTailBits bounds how far the level-0 walk follows an integrand toward
	// an end: distances down to 2^-deTailBits from a zero end, points up to
	// 2^deTailBits on an infinite side. A weight that still has not decayed
	// there is not integrable (x^-1.5 at 0) or has no moment of the degree
	// asked (1/(1+x^2) times x^2 at infinity).
	deTailBits = 1 << 18
	// deMinT is how far in t the walk goes at least, so that a weight which
	// vanishes near the middle of a piece is not mistaken for one that has
	// decayed.
	deMinT = 2.0
)

// piece integrates the moments over one piece. budget[k] is the absolute
// error allowed for moment k, or nil for 10^-digits times half the piece's
// own scale. It reports ok = false, with the sums of the finest level tried,
// when the levels have not agreed by p.maxLevel.
func (p *deProblem) piece(ctx context.Context, pc dePiece, budget []xfloat) (*deResult, bool, error) {
	acc := p.newAccum(true)
	eps := p.tol.scale(1.0 / 256)
	var xs, cs []*big.Float
	var count [2]int
	for side := 0; side < 2; side++ {
		neg := side == 1
		smalls := 0
		for i := 0; ; i++ {
			t := float64(i) * deH0
			if neg {
				t += deH0
			}
			nd := deNodes(pc.kind, p.nprec, 0, neg, i+1)[i]
			e := nd.d.MantExp(nil)
			pt, ok := dePoint{}, e <= deTailBits && e >= -deTailBits
			if ok {
				pt, ok = pc.point(nd, neg, p.prec, p.maxGap)
			}
			if !ok {
				return nil, false, p.divergence(pc, neg, max(0, acc.firstLarge(eps)))
			}
			c, err := p.mass(pc, pt)
			if err != nil {
				return nil, false, err
			}
			p.add(acc, pt, c)
			if acc.err != nil {
				return nil, false, acc.err
			}
			if p.keep {
				xs, cs = append(xs, pt.x), append(cs, c)
			}
			if acc.tiny(eps) {
				smalls++
			} else {
				smalls = 0
			}
			if smalls >= 2 && t >= deMinT {
				count[side] = i + 1
				break
			}
		}
	}
	prev := precision.NewRealSlice(p.nk, p.prec)
	for k := range prev {
		prev[k].MulPow2(acc.sum[k], -1) // h0 = 1/2
	}
	cur := precision.NewRealSlice(p.nk, p.prec)
	diff := precision.NewReal(p.prec)
	var prevDiff []xfloat
	res := &deResult{sum: cur, abs: make([]xfloat, p.nk), est: make([]xfloat, p.nk)}
	for l := 1; l <= p.maxLevel; l++ {
		if err := ctx.Err(); err != nil {
			return nil, false, err
		}
		nx, nc, err := p.level(pc, l, (count[0]-1)<<(l-1), count[1]<<(l-1), acc)
		if err != nil {
			return nil, false, err
		}
		if p.keep {
			xs, cs = append(xs, nx...), append(cs, nc...)
		}
		hExp := int64(l + 1) // h = 2^-(l+1)
		conv := l >= deMinLevel
		dk := make([]xfloat, p.nk)
		for k := 0; k < p.nk; k++ {
			cur[k].MulPow2(acc.sum[k], -int(hExp))
			ab := acc.abs[k].xf()
			res.abs[k] = xfloat{ab.m, ab.e - hExp}
			diff.Sub(cur[k], prev[k])
			dk[k] = xfReal(diff)
			est := dk[k]
			if prevDiff != nil && prevDiff[k].m != 0 {
				// The observed rate: double-exponential convergence squares
				// the error at each level, so the next difference is far
				// below this one; ten times the ratio keeps a margin for
				// the algebraic rate of a kink.
				if r := dk[k].scale(10); r.cmp(prevDiff[k]) < 0 {
					est = xfNorm(est.m*r.m/prevDiff[k].m, est.e+r.e-prevDiff[k].e)
				}
			}
			// Rounding: every term carries a few ulps from the weight
			// evaluation and about k+4 from the recurrence.
			est = est.add(res.abs[k].mul(xfPow2(10 - int64(p.prec))).scale(float64(k + 4)))
			res.est[k] = est
			lim := p.tol.mul(res.abs[k]).scale(0.5)
			if budget != nil {
				lim = budget[k]
			}
			if est.cmp(lim) > 0 {
				conv = false
			}
		}
		for k := range prev {
			prev[k].Set(cur[k])
		}
		prevDiff = dk
		if conv {
			if p.keep {
				h := new(big.Float).SetPrec(p.prec).SetMantExp(big.NewFloat(1), -int(hExp))
				for i := range cs {
					cs[i] = new(big.Float).SetPrec(p.prec).Mul(cs[i], h)
				}
				res.x, res.c = xs, cs
			}
			return res, true, nil
		}
	}
	return res, false, nil
}

// level adds the nodes new at level l (nPos with t > 0, nNeg with t < 0)
// into acc, in parallel, and returns their points and masses dx/dt w(x)
// when the problem keeps them. Mirrored nodes go through addPair when the
// piece is symmetric about the centre of the basis.
func (p *deProblem) level(pc dePiece, l, nPos, nNeg int, acc *accum) ([]*big.Float, []*big.Float, error) {
	pos := deNodes(pc.kind, p.nprec, l, false, nPos)
	negs := deNodes(pc.kind, p.nprec, l, true, nNeg)
	type item struct {
		nd        deNode
		neg, pair bool
	}
	items := make([]item, 0, nPos+nNeg)
	nPair := 0
	if p.paired(pc) {
		nPair = min(nPos, nNeg)
	}
	for i := 0; i < nPair; i++ {
		items = append(items, item{nd: pos[i], pair: true})
	}
	for i := nPair; i < nPos; i++ {
		items = append(items, item{nd: pos[i]})
	}
	for i := nPair; i < nNeg; i++ {
		items = append(items, item{nd: negs[i], neg: true})
	}
	n := len(items)
	var xs, cs []*big.Float
	if p.keep {
		xs, cs = make([]*big.Float, n+nPair), make([]*big.Float, n+nPair)
	}
	nw := workers(n)
	accs := make([]*accum, nw)
	errs := make([]error, nw)
	var wg sync.WaitGroup
	for w := 0; w < nw; w++ {
		accs[w] = p.newAccum(false)
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			for i := w; i < n; i += nw {
				it := items[i]
				pt, c, err := p.node(pc, it.nd, it.neg || it.pair)
				if err != nil {
					errs[w] = err
					return
				}
				if !it.pair {
					p.add(accs[w], pt, c)
					if accs[w].err != nil {
						errs[w] = accs[w].err
						return
					}
					if p.keep {
						xs[i], cs[i] = pt.x, c
					}
					continue
				}
				ptm, cm, err := p.node(pc, it.nd, false)
				if err != nil {
					errs[w] = err
					return
				}
				p.addPair(accs[w], pt.x, c, cm)
				if p.keep {
					xs[i], cs[i] = pt.x, c
					xs[n+i], cs[n+i] = ptm.x, cm
				}
			}
		}(w)
	}
	wg.Wait()
	for w := 0; w < nw; w++ {
		if errs[w] != nil {
			return nil, nil, errs[w]
		}
		acc.merge(accs[w])
	}
	return xs, cs, nil
}

// node places a node on the piece and returns the point and its mass.
func (p *deProblem) node(pc dePiece, nd deNode, neg bool) (dePoint, *big.Float, error) {
	pt, ok := pc.point(nd, neg, p.prec, p.maxGap)
	if !ok {
		// Finer than the last level-0 node, which was placed.
		panic("moments: a level node beyond the level-0 range")
	}
	c, err := p.mass(pc, pt)
	return pt, c, err
}

// paired reports whether the nodes of pc at t and -t are mirror images
// about the centre of the basis, which must have a constant A.
func (p *deProblem) paired(pc dePiece) bool {
	if !p.aConst || p.funcs != nil {
		return false
	}
	switch pc.kind {
	case tanhSinh:
		c := new(big.Rat).Add(pc.lo, pc.hi)
		return c.Quo(c, big.NewRat(2, 1)).Cmp(p.a0) == 0
	case sinhSinh:
		return p.a0.Sign() == 0
	}
	return false
}

// mass returns dx/dt w(x) at the point, at prec bits.
func (p *deProblem) mass(pc dePiece, pt dePoint) (*big.Float, error) {
	v, err := p.w.Expr.EvalBig(p.prec, pt.xExt)
	if err != nil {
		return nil, fmt.Errorf("%v, at x = %s (%s)", err, pc.where(pt), p.w.Label())
	}
	if v.Sign() < 0 {
		return nil, fmt.Errorf("%s: the weight is negative at x = %s", p.w.Label(), pc.where(pt))
	}
	return new(big.Float).SetPrec(p.prec).Mul(pt.dxdt, v), nil
}

// where writes a point for a message: as a decimal, or as "end - distance"
// when it lies too close to a finite end for a decimal to show it.
func (pc dePiece) where(pt dePoint) string {
	if pt.dist != nil && pt.x.Sign() != 0 && pt.x.MantExp(nil)-pt.dist.MantExp(nil) > 20 {
		sign := " + "
		if pt.below {
			sign = " - "
		}
		return RatString(pt.end) + sign + precision.FormatSig(pt.dist, 3)
	}
	return precision.FormatSig(pt.x, 10)
}

// divergence is the error of a walk that reached its limit on one side
// without the terms decaying; k is the lowest degree whose term had not.
func (p *deProblem) divergence(pc dePiece, neg bool, k int) error {
	end := "inf"
	switch {
	case pc.kind == tanhSinh && neg, pc.kind == expSinhR && neg:
		end = RatString(pc.lo)
	case pc.kind == tanhSinh, pc.kind == expSinhL && neg:
		end = RatString(pc.hi)
	case pc.kind == expSinhL, pc.kind == sinhSinh && neg:
		end = "-inf"
	}
	if k == 0 {
		if end == "inf" || end == "-inf" {
			return fmt.Errorf("%s: the weight is not integrable: its integral diverges toward x = %s", p.w.Label(), end)
		}
		return fmt.Errorf("%s: the weight is not integrable near x = %s (or too singular there for %d digits)", p.w.Label(), end, p.digits)
	}
	return fmt.Errorf("%s: the moments of degree %d and higher do not exist: the integral of |x|^%d w(x) diverges toward x = %s", p.w.Label(), k, k, end)
}
