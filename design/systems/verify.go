package systems

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"quadwright/moments"
	"quadwright/precision"
)

// Check is the verdict on one function of a system for a printed rule.
type Check struct {
	Expression string
	Integrated bool
	// Share is |sum w_i f(x_i) - I(f)| over the tolerance
	// 10 u sum |w_i| (|f(x_i)| + |x_i f'(x_i)|) + err(I(f)); at most 1 for
	// an integrated function.
	Share float64
}

// unitOf is u of the contract's criterion: one unit in the D-th
// significant digit, 10^(1-D), or 2^-52 (one ulp of 1) in float64 mode.
func unitOf(digits int) *big.Float {
	if digits == 0 {
		return new(big.Float).SetMantExp(big.NewFloat(1), -52)
	}
	u := new(big.Rat).SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(digits-1)), nil))
	return new(big.Float).SetPrec(128).SetRat(u)
}

// readRule reads printed nodes and weights exactly, rounded to prec bits.
func readRule(nodes, weights []string, prec uint) (xs, ws []*big.Float, err error) {
	if len(nodes) != len(weights) || len(nodes) == 0 {
		return nil, nil, fmt.Errorf("the rule has %d nodes and %d weights", len(nodes), len(weights))
	}
	for i := range nodes {
		x, err := precision.ParseExact(nodes[i])
		if err != nil {
			return nil, nil, fmt.Errorf("node %d: %v", i+1, err)
		}
		w, err := precision.ParseExact(weights[i])
		if err != nil {
			return nil, nil, fmt.Errorf("weight %d: %v", i+1, err)
		}
		xs = append(xs, new(big.Float).SetPrec(prec).SetRat(x))
		ws = append(ws, new(big.Float).SetPrec(prec).SetRat(w))
	}
	return xs, ws, nil
}

// checkPrinted applies the contract's criterion to every function fs[k]
// with moment I[k] known within est[k], for the printed rule, with u from
// digits; values at prec bits.
func checkPrinted(fs []Function, nodes, weights []string, I, est []*big.Float, digits int, prec uint) ([]Check, error) {
	xs, ws, err := readRule(nodes, weights, prec)
	if err != nil {
		return nil, err
	}
	exprs := make([]*moments.Expr, len(fs))
	for k := range fs {
		exprs[k] = fs[k].Expr
	}
	sum := make([]*big.Float, len(fs))
	scale := make([]*big.Float, len(fs))
	for k := range fs {
		sum[k] = new(big.Float).SetPrec(prec)
		scale[k] = new(big.Float).SetPrec(prec)
	}
	t := new(big.Float).SetPrec(prec)
	for i := range xs {
		f, df, err := evalF(exprs, xs[i], prec, 64)
		if err != nil {
			return nil, err
		}
		aw := new(big.Float).Abs(ws[i])
		for k := range fs {
			sum[k].Add(sum[k], t.Mul(ws[i], f[k]))
			a := new(big.Float).SetPrec(prec).Abs(f[k])
			d := new(big.Float).SetPrec(prec).Mul(xs[i], df[k])
			a.Add(a, d.Abs(d))
			scale[k].Add(scale[k], a.Mul(a, aw))
		}
	}
	u := unitOf(digits)
	out := make([]Check, len(fs))
	for k := range fs {
		res := new(big.Float).SetPrec(prec).Sub(sum[k], I[k])
		res.Abs(res)
		tol := new(big.Float).SetPrec(prec).Mul(scale[k], u)
		tol.Mul(tol, big.NewFloat(10))
		tol.Add(tol, est[k])
		share := math.Inf(1)
		if tol.Sign() > 0 {
			share, _ = new(big.Float).Quo(res, tol).Float64()
		} else if res.Sign() == 0 {
			share = 0
		}
		out[k] = Check{Expression: fs[k].Source, Integrated: share <= 1, Share: share}
	}
	return out, nil
}

// CheckRule tells, function by function, whether the printed rule
// (nodes, weights with digits significant digits; 0: float64 values)
// integrates each of fs times w, by the contract's criterion, with the
// moments computed to digits+5 digits (22 in float64 mode).
func CheckRule(ctx context.Context, fs []Function, w *moments.Weight, nodes, weights []string, digits int) ([]Check, error) {
	md := max(digits, 17) + 5
	exprs := make([]*moments.Expr, len(fs))
	for k := range fs {
		exprs[k] = fs[k].Expr
	}
	I, est, _, _, err := w.FunctionMoments(ctx, exprs, md)
	if err != nil {
		return nil, err
	}
	return checkPrinted(fs, nodes, weights, I, est, digits, precision.WorkingPrec(md, len(fs))+64)
}
