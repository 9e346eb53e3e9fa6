package element

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"gonum.org/v1/gonum/mat"

	"quadwright/precision"
)

// residualBig sets r[j] = sum_i w_i psi_j(x_i) - integral of psi_j for the
// rule v of st, every operation rounded to prec bits.
func residualBig(sy *Symmetry, st Structure, b *jacobiBasis, v []*big.Float, prec uint, r []*big.Float) {
	pts, ws := expandBig(sy, st, v, prec)
	for j := range r {
		r[j] = new(big.Float).SetPrec(prec)
	}
	// The integral of psi_0 = scale_0 is scale_0 times the measure, with
	// the float64 scale_0 taken exactly.
	mass := new(big.Float).SetPrec(prec).SetRat(sy.Shape.Measure())
	r[0].Mul(mass, new(big.Float).SetPrec(prec).SetFloat64(b.scale[0])).Neg(r[0])
	psi := make([]*big.Float, len(r))
	t := new(big.Float).SetPrec(prec)
	for i := range pts {
		b.valuesBig(pts[i], prec, psi)
		for j := range r {
			r[j].Add(r[j], t.Mul(ws[i], psi[j]))
		}
	}
}

// polish refines the parameters v0 (a float64 solution to about 1e-13) of
// a degree-d rule of structure st at prec bits by Gauss-Newton steps whose
// residual is formed at prec bits and whose Jacobian is the float64 one of
// the search, applied through its pseudo-inverse (gonum SVD, singular
// values below 1e-10 of the largest dropped: the moment equations in the
// full basis are redundant, only Equations(d) of them are independent).
// Each step multiplies the error by about the Jacobian's relative error,
// so the loop runs until the largest residual is below 2^(20-prec), or
// below 2^(40-prec) and no longer falling (the rounding floor), at most
// 8 + prec/20 steps. It returns the refined parameters at prec bits, or an
// error when the residual stops falling (the float64 solution was not a
// true one).
func polish(ctx context.Context, sy *Symmetry, st Structure, v0 []*big.Float, d int, prec uint) ([]*big.Float, error) {
	n := len(v0)
	sys := newSystem(sy, st, d)
	v := make([]*big.Float, n)
	v64 := make([]float64, n)
	for i := range v0 {
		v[i] = new(big.Float).SetPrec(prec).Set(v0[i])
		v64[i], _ = v0[i].Float64()
	}
	r64 := make([]float64, sys.m)
	J := mat.NewDense(sys.m, n, nil)
	sys.eval(v64, r64, J)
	var svd mat.SVD
	if !svd.Factorize(J, mat.SVDThin) {
		return nil, fmt.Errorf("the Jacobian of the degree-%d %s rule could not be factorised", d, sy.Shape)
	}
	sv := svd.Values(nil)
	rank := 0
	for _, s := range sv {
		if s > 1e-10*sv[0] {
			rank++
		}
	}
	r := make([]*big.Float, sys.m)
	rb := mat.NewDense(sys.m, 1, nil)
	var step mat.Dense
	// The residuals are sums of O(1) terms: their rounding floor at prec
	// bits is a modest multiple of 2^-prec.
	target := math.Ldexp(1, 20-int(prec))
	floor := math.Ldexp(1, 40-int(prec))
	prev := math.Inf(1)
	for it := 0; it < 8+int(prec)/20; it++ {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		residualBig(sy, st, sys.basis, v, prec, r)
		// The residual is scaled to float64 range before the solve; the
		// step is scaled back at prec bits.
		var mx float64
		for j := range r {
			f, _ := r[j].Float64()
			mx = max(mx, math.Abs(f))
		}
		if mx <= target || (mx <= floor && mx > prev/4) {
			return v, nil
		}
		prev = mx
		exp := math.Ilogb(mx)
		for j := range r {
			f, _ := new(big.Float).SetMantExp(r[j], -exp).Float64()
			rb.Set(j, 0, f)
		}
		svd.SolveTo(&step, rb, rank)
		for i := range v {
			dv := new(big.Float).SetPrec(prec).SetFloat64(step.At(i, 0))
			dv.SetMantExp(dv, exp)
			v[i].Sub(v[i], dv)
		}
	}
	return nil, fmt.Errorf("the degree-%d %s rule of %d points did not converge at %d bits", d, sy.Shape, st.Points(sy), prec)
}

// symmetricRule polishes the parameters of a fully symmetric rule of
// degree d at two precisions, confirms every printed coordinate and
// weight (design.ConfirmPrinted) and verifies the printed rule (finish).
// digits is as in Request.
func symmetricRule(ctx context.Context, sy *Symmetry, st Structure, params []*big.Float, d, digits int) (*Rule, []*big.Float, error) {
	base := digits
	if base == 0 {
		base = 17
	}
	r := &Rule{Shape: sy.Shape, Kind: "symmetric", Digits: digits, Requested: d,
		Method: fmt.Sprintf("fully symmetric (%s orbits: %s); Levenberg-Marquardt on the orthonormal-basis moment equations, Gauss-Newton polish at extended precision", sy.Group, st.Describe(sy))}
	for guard := 8; guard <= 8+3*16; guard += 16 {
		p1 := precision.WorkingPrec(base+guard, st.Points(sy))
		p2 := precision.RaisePrec(p1)
		v1, err := polish(ctx, sy, st, params, d, p1)
		if err != nil {
			return nil, nil, err
		}
		v2, err := polish(ctx, sy, st, v1, d, p2)
		if err != nil {
			return nil, nil, err
		}
		lo, hi := pack(sy, st, v1, p1), pack(sy, st, v2, p2)
		nodes, weights, ok := confirmAll(lo, hi, digits, p2)
		if !ok {
			continue
		}
		r.Nodes, r.Weights = nodes, weights
		r.WorkingPrec, r.CheckPrec = p1, p2
		out, err := finish(ctx, r, d+1, true)
		return out, v2, err
	}
	return nil, nil, fmt.Errorf("the symmetric %s rule of degree %d could not be confirmed to %d digits by a second computation at higher precision", sy.Shape, d, base)
}

func pack(sy *Symmetry, st Structure, v []*big.Float, prec uint) *assembled {
	pts, ws := expandBig(sy, st, v, prec)
	return &assembled{pts: pts, wts: ws}
}
