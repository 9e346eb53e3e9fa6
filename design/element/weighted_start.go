package element

import (
	"context"
	"math"
	"math/big"

	"gonum.org/v1/gonum/mat"
)

// subsample is the Tchakaloff start shared by Weighted and SolveRegion:
// nonnegative least squares (nnls) of the candidate measure's orthonormal
// basis values Q (from orthonormalize) against the moments ms.mu in the
// basis psi = phi C, and the positive entries turned back into weights
// u_i = v_i sqrt(lambda_i) at the candidate nodes, held at prec bits. It
// also returns ||C^T mu||_2, the scale the residual tolerances refer to.
// The rule is empty when no candidate got a positive weight.
func (ms *momentSystem) subsample(Q *mat.Dense, cand *discreteWeight, prec uint) (*wrule, float64) {
	M := ms.bb.size()
	mu64 := make([]float64, M)
	for j := range mu64 {
		mu64[j], _ = ms.mu[j].Float64()
	}
	b := make([]float64, M)
	mat.NewVecDense(M, b).MulVec(ms.C.T(), mat.NewVecDense(M, mu64))
	bn := 0.0
	for _, v := range b {
		bn += v * v
	}
	bn = math.Sqrt(bn)
	var QT mat.Dense
	QT.CloneFrom(Q.T())
	v, _ := nnls(&QT, b, 1e-15, 4*M)
	start := &wrule{}
	dim := ms.s.Dim()
	for i, vi := range v {
		if vi <= 0 {
			continue
		}
		l, _ := cand.lambda[i].Float64()
		ui := new(big.Float).SetPrec(prec).SetFloat64(vi * math.Sqrt(l))
		xi := make([]*big.Float, dim)
		for k := range xi {
			xi[k] = new(big.Float).SetPrec(prec).Set(cand.pts[i][k])
		}
		start.x, start.u = append(start.x, xi), append(start.u, ui)
	}
	return start, bn
}

// thin solves the subsample to float64-level residuals and runs point
// elimination on it (eliminate64), both in float64 on the orthonormal
// basis: the moment equations are solved there only to 10^-13 relative,
// which float64 reaches, and the thinned rule is only the start of the
// solve at the working precision, which decides every printed digit.
// When the float64 solve fails the same steps run at 128 bits (solve,
// then thin64 or eliminate); when that fails too, start itself comes
// back. The survivors come back at prec bits.
func (ms *momentSystem) thin(ctx context.Context, start *wrule, bn float64, prec uint) *wrule {
	s := newSys64(ms)
	if r := s.solve(ctx, toRule64(start), 1e-13, 25, len(start.x)); r != nil {
		return s.eliminate(ctx, r).at(prec)
	}
	tol := math.Log2(bn) - 13*math.Log2(10)
	if fewer, _, err := ms.solve(ctx, start.at(128), 128, tol, 25); err == nil {
		if t := ms.thin64(ctx, fewer, tol); t != nil {
			return t.at(prec)
		}
		return ms.eliminate(ctx, fewer, 128, tol).at(prec)
	}
	return start
}

// insideOpen is the open-domain test of the iterations: the region's own
// when one is set (SolveRegion), else the reference element's.
func (ms *momentSystem) insideOpen(x []float64) bool {
	if ms.inside != nil {
		return ms.inside(x)
	}
	return insideOpen64(ms.s, x)
}
