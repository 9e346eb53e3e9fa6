package design

import (
	"context"
	"math"
	"math/big"

	"quadwright/precision"
)

// basisWalk is the basis an exactness chunk runs through: the monic
// polynomials q_0 = 1, q_k+1 = (z - a_k) q_k - b_k q_k-1 for k < steps, in a
// variable z that is either the node x itself (q_k = p_k) or, for a rule
// folded by pairUp, its square y = x^2 (q_k = r_k with p_2k(x) = r_k(x^2),
// see squaresWalk). One walk serves both, so that the two tests share one
// loop.
type basisWalk struct {
	a, b    []*precision.Real // a_k and b_k for k < steps, at the sums' precision
	steps   int
	squares bool // z = x^2: q_k is the degree-2k polynomial, and x p_2k'(x) = 2 z r_k'(z)
	skipOdd bool // z = x for a folded rule: the odd degrees get no sum, their pairs cancel exactly
	zeroA   bool // every a_k is 0: z - a_k is z
}

// degree returns the degree j of the rule's polynomial that q_k is.
func (bw *basisWalk) degree(k int) int {
	if bw.squares {
		return 2 * k
	}
	return k
}

// chunk adds, for its nodes, w_i p_j(x_i) to S[j] and
// |w_i| (|p_j(x_i)| + |x_i p_j'(x_i)|) to B[j] for every degree j the walk
// visits (0..len(S)-1 in x, the even ones in y = x^2), with p_j at prec bits
// and p_j' and B at boundPrec bits (in float64 with exponents when the
// coefficients and nodes fit, boundchain.go). With skipOdd the odd j get no
// sum. The recurrence is linear, so it runs on w_i q_k from q_0 = w_i: the
// weight enters once per node instead of once per degree, and each term is
// rounded as often as before (the chain's relative rounding does not
// depend on the scale of its start).
func (bw *basisWalk) chunk(ctx context.Context, nodes, weights []*big.Float, S, B []*precision.Real, prec uint) error {
	prog := progressOf(ctx)
	prog.Grow(int64(len(nodes)))
	fa, oka := floatCoeffs(bw.a[:bw.steps])
	fb, okb := floatCoeffs(bw.b[:bw.steps])
	var err error
	if oka && okb && nodesFit(nodes) {
		err = bw.chunkFloat(ctx, prog, fa, fb, nodes, weights, S, B, prec)
	} else {
		err = bw.chunkReal(ctx, prog, nodes, weights, S, B, prec)
	}
	if err == nil && len(nodes) > 0 {
		prog.Advance(1)
	}
	return err
}

// start sets z to the walk's variable at node x (both at prec bits) and
// returns the factor f with x p_j'(x) = f q_k'(z): x or 2z.
func (bw *basisWalk) start(z, x *precision.Real, nx *big.Float) float64 {
	x.SetBig(nx)
	if !bw.squares {
		z.Set(x)
		m, e := x.MantExp()
		return m * pow2(e) // nodesFit: |x| < 2^250
	}
	z.Mul(x, x)
	m, e := z.MantExp()
	return 2 * m * pow2(e) // nodesFit: |z| < 2^500
}

// chunkFloat is chunk with the derivative chain and the B_j in float64
// with exponents.
func (bw *basisWalk) chunkFloat(ctx context.Context, prog Progress, fa, fb []float64, nodes, weights []*big.Float, S, B []*precision.Real, prec uint) error {
	r := precision.NewRealSlice(7, prec)
	x, z, p0, p1, u, v, t := r[0], r[1], r[2], r[3], r[4], r[5], r[6]
	if bw.zeroA {
		t = z
	}
	bs := make([]scaled, len(S))
	var ch derivChain
	for i := range nodes {
		if i%16 == 0 {
			if err := ctx.Err(); err != nil {
				return err
			}
		}
		if i > 0 {
			prog.Advance(1)
		}
		f := bw.start(z, x, nodes[i])
		zf := f
		if bw.squares {
			zf = f / 2
		}
		f = math.Abs(f)
		p0.SetInt64(0)
		p1.SetBig(weights[i])
		ch.reset()
		for k := 0; k <= bw.steps; k++ {
			// p1 = w_i q_k(z), ch.d1 2^E = w_i q_k'(z): accumulate, then step.
			j := bw.degree(k)
			if !bw.skipOdd || j%2 == 0 {
				S[j].Add(S[j], p1)
			}
			pf := ch.scaledP(p1)
			bs[j].add(math.Abs(pf)+f*math.Abs(ch.d1), ch.E)
			if k == bw.steps {
				break
			}
			if !bw.zeroA {
				t.Sub(z, bw.a[k])
			}
			u.Mul(bw.b[k], p0)
			v.MulSub(t, p1, u)
			ch.step(zf-fa[k], fb[k], pf)
			p0, p1, v = p1, v, p0
		}
	}
	for j := range bs {
		B[j].Set(bs[j].real())
	}
	return nil
}

// chunkReal is chunk with the derivative chain and the B_j in Reals of
// boundPrec bits, for coefficients or nodes beyond float64's comfortable
// range.
func (bw *basisWalk) chunkReal(ctx context.Context, prog Progress, nodes, weights []*big.Float, S, B []*precision.Real, prec uint) error {
	r := precision.NewRealSlice(7, prec)
	x, z, p0, p1, u, v, t := r[0], r[1], r[2], r[3], r[4], r[5], r[6]
	if bw.zeroA {
		t = z
	}
	lo := precision.NewRealSlice(8, boundPrec)
	lf, d0, d1, lp, lu, lv, lt, lz := lo[0], lo[1], lo[2], lo[3], lo[4], lo[5], lo[6], lo[7]
	la := precision.NewRealSlice(bw.steps, boundPrec)
	lb := precision.NewRealSlice(bw.steps, boundPrec)
	for k := 0; k < bw.steps; k++ {
		la[k].Set(bw.a[k])
		lb[k].Set(bw.b[k])
	}
	for i := range nodes {
		if i%16 == 0 {
			if err := ctx.Err(); err != nil {
				return err
			}
		}
		if i > 0 {
			prog.Advance(1)
		}
		bw.start(z, x, nodes[i])
		lz.Set(z)
		if bw.squares {
			lf.MulPow2(lz, 1)
		} else {
			lf.Abs(lz)
		}
		p0.SetInt64(0)
		p1.SetBig(weights[i])
		d0.SetInt64(0)
		d1.SetInt64(0)
		for k := 0; k <= bw.steps; k++ {
			// p1 = w_i q_k(z), d1 = w_i q_k'(z): accumulate, then step to k+1.
			j := bw.degree(k)
			if !bw.skipOdd || j%2 == 0 {
				S[j].Add(S[j], p1)
			}
			lp.Set(p1)
			lu.Mul(lf, d1)
			lu.Abs(lu)
			lv.Abs(lp)
			lu.Add(lu, lv)
			B[j].Add(B[j], lu)
			if k == bw.steps {
				break
			}
			if !bw.zeroA {
				t.Sub(z, bw.a[k])
			}
			u.Mul(bw.b[k], p0)
			v.MulSub(t, p1, u)
			lt.Sub(lz, la[k])
			lu.Mul(lb[k], d0)
			lv.MulSub(lt, d1, lu)
			lv.Add(lv, lp)
			p0, p1, v = p1, v, p0
			d0, d1, lv = d1, lv, d0
		}
	}
	return nil
}

// nodesFit reports whether every |x_i| is below 2^250, so that x_i^2 fits
// the float chain.
func nodesFit(nodes []*big.Float) bool {
	for _, x := range nodes {
		if x.Sign() != 0 && x.MantExp(nil) > 250 {
			return false
		}
	}
	return true
}
