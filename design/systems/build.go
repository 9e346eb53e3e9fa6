package systems

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// Problem is a function system and the measure it is integrated against.
type Problem struct {
	Functions []Function
	Weight    *moments.Weight
	// Moments, when not nil, are the integrals of Functions[k] times the
	// weight read from a file (in the expanded order, one per function),
	// used instead of computing them; their digits limit the rule's.
	Moments *moments.MomentList
}

// Result is a rule for a system with its per-function verification.
type Result struct {
	Rule      *design.Rule
	Functions []string // the expanded expressions, in order
	ExactFor  int      // how many of them the printed rule integrates
	Checks    []Check
	// Conditioning of the moment matrix f_j(x_i) as given (monomial-style)
	// and of its orthonormalised form u_j(x_i), in the 1-norm; set for
	// interpolatory rules.
	CondGiven, CondOrthonormal float64
}

func (pr Problem) exprs() []*moments.Expr {
	out := make([]*moments.Expr, len(pr.Functions))
	for k := range pr.Functions {
		out[k] = pr.Functions[k].Expr
	}
	return out
}

func (pr Problem) names() []string {
	out := make([]string, len(pr.Functions))
	for k := range pr.Functions {
		out[k] = pr.Functions[k].Source
	}
	return out
}

// momentsAt returns the moments to md digits with their error bounds, and
// the discretisation of the weight that resolves the functions. Moments
// from a file are exact where written as p/q and known to half a unit in
// their last written place otherwise.
func (pr Problem) momentsAt(ctx context.Context, md int) (I, est, x, c []*big.Float, err error) {
	if pr.Moments == nil {
		return pr.Weight.FunctionMoments(ctx, pr.exprs(), md)
	}
	if len(pr.Moments.Values) != len(pr.Functions) {
		return nil, nil, nil, nil, fmt.Errorf("--function-moments %s has %d values for %d functions", pr.Moments.Name, len(pr.Moments.Values), len(pr.Functions))
	}
	_, _, x, c, err = pr.Weight.FunctionMoments(ctx, pr.exprs(), 12)
	if err != nil {
		return nil, nil, nil, nil, err
	}
	prec := precision.WorkingPrec(md, len(pr.Functions)) + 64
	for k, v := range pr.Moments.Values {
		I = append(I, new(big.Float).SetPrec(prec).SetRat(v.Value))
		e := new(big.Float).SetPrec(prec)
		if u := pr.Moments.ULP[k]; u != nil {
			e.SetRat(u)
			e.SetMantExp(e, -1)
		}
		est = append(est, e)
	}
	return I, est, x, c, nil
}

// startSystem returns the known system of 2n functions with its n-point
// rule (nodes ascending): the Gauss rule of the weight for polynomials in
// a centred variable, or, on [a, inf) with weight 1, the n-point
// Gauss-Legendre rule on [0, 1] mapped by t = e^-(x-a) for e^-j(x-a),
// j = 1..2n (x_i = a - log t_i, w_i = W_i / t_i).
func startSystem(ctx context.Context, w *moments.Weight, n int) (fs []*moments.Expr, xs, ws []*big.Float, label string, err error) {
	iv := w.Interval
	if iv.Lo.Finite() && !iv.Hi.Finite() && w.Source == "1" {
		a := moments.RatString(iv.Lo.Value)
		t, W, err := legendre01(ctx, n)
		if err != nil {
			return nil, nil, nil, "", err
		}
		for i := n - 1; i >= 0; i-- {
			lt := precision.Log(t[i])
			x := new(big.Float).SetPrec(t[i].Prec()).SetRat(iv.Lo.Value)
			xs = append(xs, x.Sub(x, lt))
			ws = append(ws, new(big.Float).SetPrec(t[i].Prec()).Quo(W[i], t[i]))
		}
		for j := 1; j <= 2*n; j++ {
			fs = append(fs, moments.MustParseExpr(fmt.Sprintf("exp(-%d*(x-(%s)))", j, a), "x"))
		}
		return fs, xs, ws, "the mapped Gauss-Legendre rule for e^-j(x-a)", nil
	}
	r, err := design.Gauss(ctx, design.NewExprSource(ctx, w), design.Request{Points: n, Digits: 20})
	if err != nil {
		if !iv.Finite() {
			return nil, nil, nil, "", fmt.Errorf("no start rule is known for this system: the polynomials are not integrable against %s (%v)", w.Label(), err)
		}
		return nil, nil, nil, "", err
	}
	v := "x"
	if iv.Finite() {
		c := new(big.Rat).Add(iv.Lo.Value, iv.Hi.Value)
		c.Quo(c, big.NewRat(2, 1))
		h := new(big.Rat).Sub(iv.Hi.Value, iv.Lo.Value)
		h.Quo(h, big.NewRat(2, 1))
		v = fmt.Sprintf("((x-(%s))/(%s))", moments.RatString(c), h.RatString())
	}
	for j := 0; j < 2*n; j++ {
		fs = append(fs, moments.MustParseExpr(fmt.Sprintf("%s^%d", v, j), "x"))
	}
	return fs, r.NodeValues, r.WeightValues, "the Gauss rule of the weight for polynomials", nil
}

// sums returns sum_i w_i q_j(x_i) over the start rule, at prec bits.
func sums(q *basis, xs, ws []*big.Float, prec uint) ([]*big.Float, error) {
	out := make([]*big.Float, 2*len(xs))
	for j := range out {
		out[j] = new(big.Float).SetPrec(prec)
	}
	t := new(big.Float).SetPrec(prec)
	for i := range xs {
		v, _, err := q.eval(xs[i], prec, false)
		if err != nil {
			return nil, err
		}
		for j := range out {
			out[j].Add(out[j], t.Mul(ws[i], v[j]))
		}
	}
	return out, nil
}

// thin keeps about every s-th point of a discretisation (ascending) with
// its mass times s, so that at most about limit remain: a coarser
// double-exponential rule of the same measure, still a positive inner
// product that resolves the functions, at a fraction of the cost of the
// Gram-Schmidt sweeps over it.
func thin(x, c []*big.Float, limit int) ([]*big.Float, []*big.Float) {
	s := len(x) / limit
	if s < 2 {
		return x, c
	}
	var tx, tc []*big.Float
	f := new(big.Float).SetInt64(int64(s))
	for i := s / 2; i < len(x); i += s {
		tx = append(tx, x[i])
		tc = append(tc, new(big.Float).SetPrec(c[i].Prec()).Mul(c[i], f))
	}
	return tx, tc
}

// sensitivity returns |J^-1 R^-T| est, the first-order bound on how far
// the moments' errors est (componentwise, in the user's functions) move
// the nodes and weights, J the Jacobian of the equations in u = R^-T f.
func sensitivity(J [][]*big.Float, u *basis, est []*big.Float, prec uint) []float64 {
	m := len(est)
	out := make([]float64, m)
	f, ok := factor(J, prec)
	if !ok {
		return nil
	}
	for j := 0; j < m; j++ {
		ej, _ := est[j].Float64()
		if ej == 0 {
			continue
		}
		col := make([]*big.Float, m) // R^-T e_j
		for i := range col {
			col[i] = new(big.Float).SetPrec(prec)
		}
		col[j].SetInt64(1)
		u.solveRT(col, prec)
		col = f.solve(col)
		for i := range col {
			v, _ := col[i].Float64()
			out[i] += math.Abs(v) * ej
		}
	}
	return out
}

// boundRT returns an upper bound on |R^-T| e: the forward solve with the
// comparison matrix (|r_jj| on the diagonal, -|r_ij| off it), whose
// inverse dominates |R^-1| entrywise.
func (b *basis) boundRT(e []*big.Float) []float64 {
	v := make([]*big.Float, len(e))
	t := new(big.Float).SetPrec(128)
	for j := range e {
		v[j] = new(big.Float).SetPrec(128).Abs(e[j])
		for i := 0; i < j; i++ {
			v[j].Add(v[j], t.Abs(t.Mul(b.r[i][j], v[i])))
		}
		v[j].Quo(v[j], new(big.Float).Abs(b.r[j][j]))
	}
	out := make([]float64, len(v))
	for j := range v {
		out[j], _ = v[j].Float64()
	}
	return out
}

// precisions picks the working precision p (and the confirming p + 64)
// for rules of digits d (17 in float64 mode) of m functions: the bits of
// the digits asked, the guard of WorkingPrec, and the bits the forward
// solve with R loses.
func precisions(d, m int, condBits float64) (uint, uint) {
	p := precision.WorkingPrec(d+4, m) + uint(math.Ceil(condBits))
	p = (p + 63) / 64 * 64
	return p, p + 64
}

// GeneralizedGauss builds the req.Points-node generalized Gauss rule of
// the 2N functions of pr: N nodes inside the open interval, N positive
// weights, integrating every function times the weight. The moments are
// computed to more digits than printed (or read from the file); the
// system is orthonormalised (newBasis), solved by continuation from the
// start system (startSystem, homotopy) at a working precision p, refined
// at p + 64, printed where both agree (design.ConfirmPrinted) and where
// the moments' own error bounds, carried through the inverse Jacobian,
// stay below a tenth of a unit in the last printed place; the printed rule
// is then verified against every function (the contract's criterion) and
// its polynomial degree tested. Any failure is an error saying which.
func GeneralizedGauss(ctx context.Context, pr Problem, req design.Request) (*Result, error) {
	m := len(pr.Functions)
	if m%2 == 1 {
		return nil, fmt.Errorf("the system has %d functions, an odd number: a generalized Gauss rule needs 2N functions for N points (give --nodes with %d nodes for the interpolatory weights)", m, m)
	}
	n := m / 2
	if req.Points != 0 && req.Points != n {
		return nil, fmt.Errorf("--points %d: a generalized Gauss rule for %d functions has %d points", req.Points, m, n)
	}
	D := req.Digits
	if req.Auto {
		D = design.AutoDigits
	}
	d := max(D, 17)
	md := d + 10
	var lastErr error
	st := &attemptState{}
	for attempt := 0; attempt < 3; attempt++ {
		res, extra, err := gaussAttempt(ctx, pr, n, D, d, md, st)
		if err == nil {
			return res, nil
		}
		lastErr = err
		if extra == 0 {
			return nil, err
		}
		if pr.Moments != nil {
			return nil, fmt.Errorf("--function-moments %s: the values carry too few digits for %d printed digits of this rule (about %d more are needed)", pr.Moments.Name, d, extra)
		}
		md += extra
	}
	return nil, lastErr
}

// attemptState is what one attempt leaves to the next when only the
// moments' digits fell short: its rule (refined by Newton instead of a new
// continuation), how it was reached, and the orthonormalised bases (they
// depend on the functions and the discretisation, not on the moments).
type attemptState struct {
	start  [2][]*big.Float
	method string
	u, q   *basis
}

// gaussAttempt is one computation with moments to md digits. extra > 0
// says that more moment digits (about extra) would let it succeed; st then
// holds this attempt's rule.
func gaussAttempt(ctx context.Context, pr Problem, n, D, d, md int, st *attemptState) (*Result, int, error) {
	m := 2 * n
	I, est, xd, cd, err := pr.momentsAt(ctx, md)
	if err != nil {
		return nil, 0, err
	}
	wp := precision.WorkingPrec(md, m)
	xd, cd = thin(xd, cd, 16*m)
	// Gram-Schmidt at wp + 192 bits serves systems that lose up to about
	// 128 bits to their conditioning; one that loses more is
	// orthonormalised again with room for it.
	gs := wp + 192
	if st.u == nil {
		u, err := newBasis(pr.exprs(), pr.names(), xd, cd, gs)
		if err != nil {
			return nil, 0, err
		}
		if _, p2 := precisions(d, m, u.condBits); p2+64 > gs {
			gs = p2 + 128
			if u, err = newBasis(pr.exprs(), pr.names(), xd, cd, gs); err != nil {
				return nil, 0, err
			}
		}
		st.u = u
	}
	u := st.u
	gs = u.prec
	h := &homotopy{u: u}
	p, p2 := precisions(d, m, u.condBits)
	iv := pr.Weight.Interval
	bounds := func(prec uint) {
		if iv.Lo.Finite() {
			h.lo = new(big.Float).SetPrec(prec).SetRat(iv.Lo.Value)
		}
		if iv.Hi.Finite() {
			h.hi = new(big.Float).SetPrec(prec).SetRat(iv.Hi.Value)
		}
		h.bu = cloneAt(I, prec)
		u.solveRT(h.bu, prec)
	}
	tooDependent := func() error {
		return fmt.Errorf("the system is too close to linearly dependent on %s: its orthonormalisation loses about %.0f digits", pr.Weight.Label(), u.condBits*math.Log10(2))
	}
	var x1, w1 []*big.Float
	method := st.method
	_, c, isLog := logSystem(pr)
	switch {
	case p2+64 > gs:
		return nil, 0, tooDependent()
	case st.start[0] != nil:
		bounds(p2)
		x1, w1, err = h.newton(ctx, 1, st.start[0], st.start[1], p, 0, 40)
	case isLog:
		// The log system's own path (logpath.go), where the blend of
		// two bases runs a node into an end.
		bounds(p2)
		var x0, w0 []*big.Float
		// The path's points are solved to 2^-40 in the raw functions,
		// which lose about condBits: the precision for that, not p.
		pathPrec := min(p, (uint(math.Ceil(u.condBits))+128+63)/64*64)
		if x0, w0, err = logStart(ctx, n, c, pathPrec); err == nil {
			x1, w1, err = h.newton(ctx, 1, x0, w0, p, 0, 40)
		}
		method = "Newton continuation (Ma, Rokhlin, Wandzura 1996) along a power-exponent path x^a_k, (x^b_k - x^a_k)/(b_k - a_k) from the Gauss-Legendre rule"
		if errors.Is(err, errNoConvergence) {
			x1, w1, err = nil, nil, nil // the general road below
		}
	}
	if errors.Is(err, errNoConvergence) {
		return nil, 0, fmt.Errorf("no generalized Gauss rule of %d points was reached for this system on %s: the rule of the attempt before did not refine", n, pr.Weight.Label())
	}
	if err != nil {
		return nil, 0, err
	}
	if x1 == nil {
		qfs, x0, w0, startLabel, err := startSystem(ctx, pr.Weight, n)
		if err != nil {
			return nil, 0, err
		}
		if st.q == nil {
			qnames := make([]string, len(qfs))
			for k := range qfs {
				qnames[k] = qfs[k].String()
			}
			if st.q, err = newBasis(qfs, qnames, xd, cd, gs); err != nil {
				return nil, 0, err
			}
		}
		h.q = st.q
		u.orient(h.q)
		if p, p2 = precisions(d, m, math.Max(u.condBits, h.q.condBits)); p2+64 > gs {
			return nil, 0, tooDependent()
		}
		bounds(p2)
		if h.bq, err = sums(h.q, x0, w0, p2); err != nil {
			return nil, 0, err
		}
		method = "Newton continuation (Ma, Rokhlin, Wandzura 1996) from " + startLabel
		x1, w1, err = h.continuation(ctx, x0, w0, p)
		if errors.Is(err, errNoConvergence) {
			method = "an oversampled positive rule reduced by point elimination and Gauss-Newton (Bremer, Gimbutas, Rokhlin 2010), after the continuation from " + startLabel + " failed"
			var fx, fw []*big.Float
			if fx, fw, err = h.fallback(ctx, xd, n, uint(math.Ceil(u.condBits))+128); err == nil {
				x1, w1, err = h.newton(ctx, 1, fx, fw, p, 0, 40)
			}
		}
		if errors.Is(err, errNoConvergence) {
			return nil, 0, fmt.Errorf("no generalized Gauss rule of %d points was reached for this system on %s: neither the continuation from %s nor point elimination from a positive rule found one (it may not exist with positive weights and interior nodes)", n, pr.Weight.Label(), startLabel)
		}
		if err != nil {
			return nil, 0, err
		}
	}
	x2, w2, err := h.newton(ctx, 1, x1, w1, p2, 0, 20)
	if err != nil {
		return nil, 0, fmt.Errorf("the rule found at %d bits did not refine at %d bits", p, p2)
	}
	// The moments' error, carried to the nodes and weights.
	_, J, err := h.equations(1, x2, w2, p2, true)
	if err != nil {
		return nil, 0, err
	}
	dz := sensitivity(J, u, est, 192)
	if dz == nil {
		return nil, 0, fmt.Errorf("the moment equations are singular at the rule found")
	}
	extra := 0
	vals := append(append([]*big.Float(nil), x2...), w2...)
	for i, v := range vals {
		a, _ := new(big.Float).Abs(v).Float64()
		lim := a * math.Pow(10, -float64(d+1))
		if dz[i] > lim {
			extra = max(extra, int(math.Ceil(math.Log10(dz[i]/lim)))+3)
		}
	}
	if extra > 0 {
		st.start, st.method = [2][]*big.Float{x2, w2}, method
		return nil, extra, fmt.Errorf("the moments' error bounds leave fewer than %d digits of the rule", d)
	}
	texts := [2][]string{make([]string, n), make([]string, n)}
	for i := 0; i < n; i++ {
		var ok1, ok2 bool
		texts[0][i], ok1 = design.ConfirmPrinted(x1[i], x2[i], D, p2)
		texts[1][i], ok2 = design.ConfirmPrinted(w1[i], w2[i], D, p2)
		if !ok1 || !ok2 {
			return nil, 0, fmt.Errorf("the rule computed at %d and %d bits disagrees in a printed digit of node %d", p, p2, i+1)
		}
	}
	checks, err := checkPrinted(pr.Functions, texts[0], texts[1], I, est, D, p2+64)
	if err != nil {
		return nil, 0, err
	}
	exact := 0
	for _, c := range checks {
		if !c.Integrated {
			return nil, 0, fmt.Errorf("the printed rule does not integrate %s to its tolerance (residual %.3g times it)", c.Expression, c.Share)
		}
		exact++
	}
	r := &design.Rule{
		Kind: "generalized-gauss", Measure: fmt.Sprintf("function system (%d functions)", m),
		Weight: pr.Weight.Source, Domain: pr.Weight.Interval,
		Nodes: texts[0], Weights: texts[1], NodeValues: x2, WeightValues: w2,
		Digits: D, WorkingPrec: p2, CheckPrec: p,
		Method: "moment equations in an orthonormalised basis; " + method,
	}
	r.Exactness, r.Degree = polynomialDegree(ctx, pr.Weight, texts[0], texts[1], m-1)
	r.Notes = append(r.Notes, fmt.Sprintf("exact for all %d functions of the system (largest residual %.2g times the tolerance)", m, worst(checks)))
	return &Result{Rule: r, Functions: pr.names(), ExactFor: exact, Checks: checks}, 0, nil
}

func worst(cs []Check) float64 {
	w := 0.0
	for _, c := range cs {
		w = math.Max(w, c.Share)
	}
	return w
}

// polynomialDegree is the polynomial degree of exactness verified on the
// printed values by design.VerifyPrinted (through maxDeg), or -1 when the
// polynomials have no moments against the weight.
func polynomialDegree(ctx context.Context, w *moments.Weight, nodes, weights []string, maxDeg int) (design.Exactness, int) {
	ex, err := design.VerifyPrinted(ctx, design.NewExprSource(ctx, w), nodes, weights, maxDeg)
	if err != nil {
		return design.Exactness{Degree: -1}, -1
	}
	return ex, ex.Degree
}
