package design

import (
	"context"
	"math"
	"math/big"

	"quadwright/precision"
)

// squaresChunk is exactnessChunk for a rule folded by pairUp, run in the
// squared variable y = x^2 (see refineSquares for the recurrence of r_k with
// pi_2k(x) = r_k(x^2)): for the even degrees j = 2k it adds w_i r_k(y_i) to
// S[j] and |w_i| (|r_k(y_i)| + 2 y_i |r_k'(y_i)|) to B[j], which are
// w_i p_j(x_i) and |w_i| (|p_j(x_i)| + |x_i p_j'(x_i)|) since
// x p_j'(x) = 2 y r_k'(y). The odd degrees get nothing: their pairs cancel
// exactly. Each node costs half the steps of the recurrence in x.
func squaresChunk(ctx context.Context, b []*precision.Real, nodes, weights []*big.Float, S, B []*precision.Real, prec uint) error {
	prog := progressOf(ctx)
	prog.Grow(int64(len(nodes)))
	m := len(S)
	K := (m - 1) / 2 // the highest k with 2k <= maxDeg
	c := precision.NewRealSlice(K+1, prec)
	d := precision.NewRealSlice(K+1, prec)
	for k := 0; k < K; k++ {
		if k == 0 {
			c[0].Set(b[1])
			continue
		}
		c[k].Add(b[2*k], b[2*k+1])
		d[k].Mul(b[2*k-1], b[2*k])
	}
	lc := precision.NewRealSlice(K+1, boundPrec)
	ld := precision.NewRealSlice(K+1, boundPrec)
	for k := 0; k < K; k++ {
		lc[k].Set(c[k])
		ld[k].Set(d[k])
	}
	r := precision.NewRealSlice(7, prec)
	x, y, w, p0, p1, u, v := r[0], r[1], r[2], r[3], r[4], r[5], r[6]
	t := precision.NewReal(prec)
	lo := precision.NewRealSlice(8, boundPrec)
	aw, ly2, d0, d1, lp, lu, lv, lt := lo[0], lo[1], lo[2], lo[3], lo[4], lo[5], lo[6], lo[7]
	ly := precision.NewReal(boundPrec)
	fc, okc := floatCoeffs(c)
	fd, okd := floatCoeffs(d)
	if okc && okd && nodesFit(nodes) {
		return squaresChunkFloat(ctx, prog, nodes, weights, S, B, c, d, fc, fd, K, prec)
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
		x.SetBig(nodes[i])
		y.Mul(x, x)
		w.SetBig(weights[i])
		aw.Abs(lu.Set(w))
		ly.Set(y)
		ly2.MulPow2(ly, 1)
		p0.SetInt64(0)
		p1.SetInt64(1)
		d0.SetInt64(0)
		d1.SetInt64(0)
		for k := 0; k <= K; k++ {
			// p1 = r_k(y), d1 = r_k'(y): accumulate, then step to k+1.
			j := 2 * k
			S[j].MulAdd(w, p1, S[j])
			lp.Set(p1)
			lu.Mul(ly2, d1)
			lu.Abs(lu)
			lv.Abs(lp)
			lu.Add(lu, lv)
			B[j].MulAdd(aw, lu, B[j])
			if k == K {
				break
			}
			t.Sub(y, c[k])
			u.Mul(d[k], p0)
			v.MulSub(t, p1, u)
			lt.Sub(ly, lc[k])
			lu.Mul(ld[k], d0)
			lv.MulSub(lt, d1, lu)
			lv.Add(lv, lp)
			p0, p1, v = p1, v, p0
			d0, d1, lv = d1, lv, d0
		}
	}
	if len(nodes) > 0 {
		prog.Advance(1)
	}
	return nil
}

// squaresChunkFloat is squaresChunk with the derivative chain and the B_j
// in float64 with exponents (boundchain.go), for coefficients that fit a
// float64.
func squaresChunkFloat(ctx context.Context, prog Progress, nodes, weights []*big.Float, S, B []*precision.Real, c, d []*precision.Real, fc, fd []float64, K int, prec uint) error {
	r := precision.NewRealSlice(7, prec)
	x, y, w, p0, p1, u, v := r[0], r[1], r[2], r[3], r[4], r[5], r[6]
	t := precision.NewReal(prec)
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
		x.SetBig(nodes[i])
		y.Mul(x, x)
		w.SetBig(weights[i])
		wm, we := w.MantExp()
		wm = math.Abs(wm)
		ym, ye := y.MantExp()
		yf := ym * pow2(ye) // nodesFit: |y| < 2^500
		y2 := 2 * yf
		p0.SetInt64(0)
		p1.SetInt64(1)
		ch.reset()
		for k := 0; k <= K; k++ {
			// p1 = r_k(y), ch.d1 2^E = r_k'(y): accumulate, then step.
			j := 2 * k
			S[j].MulAdd(w, p1, S[j])
			pf := ch.scaledP(p1)
			bs[j].add(wm*(math.Abs(pf)+y2*math.Abs(ch.d1)), ch.E+we)
			if k == K {
				break
			}
			t.Sub(y, c[k])
			u.Mul(d[k], p0)
			v.MulSub(t, p1, u)
			ch.step(yf-fc[k], fd[k], pf)
			p0, p1, v = p1, v, p0
		}
	}
	if len(nodes) > 0 {
		prog.Advance(1)
	}
	for j := range bs {
		B[j].Set(bs[j].real())
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
