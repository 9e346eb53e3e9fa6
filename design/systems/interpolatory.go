package systems

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// Interpolatory returns the weights that make the rule on the given nodes
// (as many as functions, distinct; ascending after sorting) integrate every
// function of pr times the weight: the solution of sum_i w_i f_j(x_i) =
// I(f_j). The system is solved in the orthonormalised basis u = R^-T f at
// two working precisions, printed where both agree and where the moments'
// error bounds, carried through the inverse, stay below a tenth of a unit
// in the last place, and verified per function. The Result carries the
// 1-norm condition numbers of the matrix f_j(x_i) as given and of u_j(x_i),
// which show how many digits moment matching on chosen nodes costs in the
// monomial-style equations and how many the orthonormalised ones keep.
func Interpolatory(ctx context.Context, pr Problem, nodes []*big.Rat, req design.Request) (*Result, error) {
	m := len(pr.Functions)
	if len(nodes) != m {
		return nil, fmt.Errorf("--nodes lists %d nodes for %d functions: interpolatory weights need as many nodes as functions", len(nodes), m)
	}
	for i := 1; i < m; i++ {
		if nodes[i].Cmp(nodes[i-1]) <= 0 {
			return nil, fmt.Errorf("--nodes: the nodes must be distinct and ascending (node %d is %s, after %s)", i+1, moments.RatString(nodes[i]), moments.RatString(nodes[i-1]))
		}
	}
	D := req.Digits
	if req.Auto {
		D = design.AutoDigits
	}
	d := max(D, 17)
	md := d + 10
	for attempt := 0; attempt < 3; attempt++ {
		res, extra, err := interpAttempt(ctx, pr, nodes, D, d, md)
		if err == nil || extra == 0 {
			return res, err
		}
		if pr.Moments != nil {
			return nil, fmt.Errorf("--function-moments %s: the values carry too few digits for %d printed digits of these weights (about %d more are needed)", pr.Moments.Name, d, extra)
		}
		md += extra
	}
	return nil, fmt.Errorf("the interpolatory weights could not be confirmed to %d digits", d)
}

func interpAttempt(ctx context.Context, pr Problem, nodes []*big.Rat, D, d, md int) (*Result, int, error) {
	m := len(nodes)
	I, est, xd, cd, err := pr.momentsAt(ctx, md)
	if err != nil {
		return nil, 0, err
	}
	wp := precision.WorkingPrec(md, m)
	xd, cd = thin(xd, cd, 16*m)
	u, err := newBasis(pr.exprs(), pr.names(), xd, cd, 2*wp+128)
	if err != nil {
		return nil, 0, err
	}
	p, p2 := precisions(d, m, u.condBits)
	// The matrices at p2: F[j][i] = f_j(x_i), U = R^-T F.
	F := make([][]*big.Float, m)
	U := make([][]*big.Float, m)
	for j := range F {
		F[j], U[j] = make([]*big.Float, m), make([]*big.Float, m)
	}
	for i, z := range nodes {
		x := new(big.Float).SetPrec(p2).SetRat(z)
		f, _, err := evalF(pr.exprs(), x, p2, 0)
		if err != nil {
			return nil, 0, fmt.Errorf("node %s: %v", moments.RatString(z), err)
		}
		uv := cloneAt(f, p2)
		u.solveRT(uv, p2)
		for j := range f {
			F[j][i], U[j][i] = f[j], uv[j]
		}
	}
	condF, condU := cond1(F, 192), cond1(U, 192)
	if math.IsInf(condU, 1) {
		return nil, 0, fmt.Errorf("the functions do not determine weights on these nodes: the matrix f_j(x_i) is singular")
	}
	solveAt := func(prec uint) ([]*big.Float, bool) {
		A := make([][]*big.Float, m)
		for j := range A {
			A[j] = cloneAt(U[j], prec)
		}
		b := cloneAt(I, prec)
		u.solveRT(b, prec)
		return b, solve(A, b, prec)
	}
	w1, ok1 := solveAt(p)
	w2, ok2 := solveAt(p2)
	if !ok1 || !ok2 {
		return nil, 0, fmt.Errorf("the functions do not determine weights on these nodes: the matrix f_j(x_i) is singular")
	}
	dz := sensitivity(U, u, est, 192)
	// A weight below 10^-(d+2) of the largest is printed as 0: the nodes
	// of a rule exact beyond the system (Boole's nodes among them) make
	// some weights vanish, which no number of digits can show otherwise.
	wmax := 0.0
	for _, v := range w2 {
		a, _ := new(big.Float).Abs(v).Float64()
		wmax = math.Max(wmax, a)
	}
	floor := wmax * math.Pow(10, -float64(d+2))
	extra := 0
	for i, v := range w2 {
		a, _ := new(big.Float).Abs(v).Float64()
		if lim := math.Max(a, floor) * math.Pow(10, -float64(d+1)); dz[i] > lim {
			extra = max(extra, int(math.Ceil(math.Log10(dz[i]/lim)))+3)
		}
	}
	if extra > 0 {
		return nil, extra, fmt.Errorf("the moments' error bounds leave fewer than %d digits of the weights", d)
	}
	texts := [2][]string{make([]string, m), make([]string, m)}
	xv := make([]*big.Float, m)
	for i := range nodes {
		xv[i] = new(big.Float).SetPrec(p2).SetRat(nodes[i])
		texts[0][i] = exactNode(nodes[i], xv[i], D)
		a1, _ := new(big.Float).Abs(w1[i]).Float64()
		a2, _ := new(big.Float).Abs(w2[i]).Float64()
		if a1 < floor && a2 < floor {
			texts[1][i] = "0"
			continue
		}
		var ok bool
		if texts[1][i], ok = design.ConfirmPrinted(w1[i], w2[i], D, p2); !ok {
			return nil, 0, fmt.Errorf("the weights computed at %d and %d bits disagree in a printed digit of weight %d", p, p2, i+1)
		}
	}
	checks, err := checkPrinted(pr.Functions, texts[0], texts[1], I, est, D, p2+64)
	if err != nil {
		return nil, 0, err
	}
	for _, c := range checks {
		if !c.Integrated {
			return nil, 0, fmt.Errorf("the printed rule does not integrate %s to its tolerance (residual %.3g times it); the nodes as printed may round them", c.Expression, c.Share)
		}
	}
	r := &design.Rule{
		Kind: "interpolatory", Measure: fmt.Sprintf("function system (%d functions)", m),
		Weight: pr.Weight.Source, Domain: pr.Weight.Interval,
		Nodes: texts[0], Weights: texts[1], NodeValues: xv, WeightValues: w2,
		Digits: D, WorkingPrec: p2, CheckPrec: p, Fixed: texts[0],
		Method: "interpolatory weights for the function system, solved in its orthonormalised basis",
	}
	r.Exactness, r.Degree = polynomialDegree(ctx, pr.Weight, texts[0], texts[1], m-1)
	r.Notes = append(r.Notes,
		fmt.Sprintf("exact for all %d functions of the system (largest residual %.2g times the tolerance)", m, worst(checks)),
		fmt.Sprintf("conditioning (1-norm): %.3g for the moment matrix f_j(x_i) as given, %.3g in the orthonormalised basis; about %.0f digits are lost to the first, %.0f to the second", condF, condU, math.Max(0, math.Log10(condF)), math.Max(0, math.Log10(condU))))
	return &Result{Rule: r, Functions: pr.names(), ExactFor: m, Checks: checks, CondGiven: condF, CondOrthonormal: condU}, 0, nil
}

// exactNode prints a given node: exactly when it has at most D (17 in
// float64 mode) significant digits, else rounded as the weights are.
func exactNode(z *big.Rat, v *big.Float, D int) string {
	s := moments.RatString(z)
	if q, err := precision.ParseExact(s); err == nil && q.Cmp(z) == 0 && len(s) <= max(D, 17)+3 {
		return s
	}
	if D == 0 {
		return precision.FormatFloat64(precision.NearestFloat64(v))
	}
	return precision.FormatSig(v, D)
}

// cond1 is ||A||_1 ||A^-1||_1 at prec bits (+Inf when A is singular).
func cond1(A [][]*big.Float, prec uint) float64 {
	m := len(A)
	norm := func(cols func(j int) []*big.Float) float64 {
		best := 0.0
		for j := 0; j < m; j++ {
			s := 0.0
			for _, v := range cols(j) {
				f, _ := v.Float64()
				s += math.Abs(f)
			}
			best = math.Max(best, s)
		}
		return best
	}
	na := norm(func(j int) []*big.Float {
		c := make([]*big.Float, m)
		for i := range c {
			c[i] = A[i][j]
		}
		return c
	})
	inv := make([][]*big.Float, m)
	for j := 0; j < m; j++ {
		cp := make([][]*big.Float, m)
		for i := range cp {
			cp[i] = cloneAt(A[i], prec)
		}
		e := make([]*big.Float, m)
		for i := range e {
			e[i] = new(big.Float).SetPrec(prec)
		}
		e[j].SetInt64(1)
		if !solve(cp, e, prec) {
			return math.Inf(1)
		}
		inv[j] = e
	}
	return na * norm(func(j int) []*big.Float { return inv[j] })
}
