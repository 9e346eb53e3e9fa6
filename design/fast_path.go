package design

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"quadwright/design/fast"
	"quadwright/moments"
)

// FastOptions tunes the checks of BuildFast.
type FastOptions struct {
	// FullCheck tests exactness through the construction degree whatever
	// the size (O(N^2) work: minutes at N = 10^5).
	FullCheck bool
}

// Work budgets of the checks. The exactness test costs about N (K+1)
// recurrence steps for degrees 0..K (about 5 ns each in float64 on one
// core, ten times that in double-double); the sampled comparison about 3
// to 6 N steps per sample in double-double (more near the ends).
const (
	fastCheckBudget   = 2e8   // float64 steps: the full degree for N <= 10^4
	fastCheckBudgetDD = 2e7   // double-double steps (Laguerre): full for N <= about 3000
	fastSampleBudget  = 2.5e7 // samples times N: 200 samples up to N = 1.25 10^5
	fastMinSamples    = 16
	fastMaxSamples    = 200
)

// fastTol is the exactness tolerance 10 u with u = 10^-16, one unit in the
// 17th significant digit: the audit's criterion for a rule printed with 17
// digits (a shortest round-trip float64 has at most 17), so a degree
// passed here is one the audit confirms.
const fastTol = 1e-15

// FastServes returns "" when BuildFast serves the family with the kind of
// rule, else the reason it does not (for a message).
func FastServes(fam moments.Family, kind string) string {
	switch {
	case fam.Name == "laguerre" || fam.Name == "hermite":
		if kind != "gauss" {
			return fmt.Sprintf("the fast path builds only gauss rules for the %s family, not %s", fam.Name, kind)
		}
		if fam.Name == "laguerre" {
			// The Laguerre march takes alpha in float64; rounding it (as
			// for 0.3) shifts the rule by enough for the exactness test to
			// fail near degree N/2 (measured at N = 2000).
			if p := ratPair(fam.Alpha); p[1] != 0 || p[0] > fast.MaxJacobiExponent {
				return fmt.Sprintf("the fast path serves Laguerre alpha only when it is a float64 (such as 0.25 or -0.5) up to %d, not %s", fast.MaxJacobiExponent, moments.RatString(fam.Alpha))
			}
		}
		return ""
	case kind != "gauss" && kind != "radau" && kind != "lobatto":
		return fmt.Sprintf("the fast path builds gauss, radau and lobatto rules, not %s", kind)
	}
	a, b := fam.JacobiExponents()
	af, _ := a.Float64()
	bf, _ := b.Float64()
	lim := float64(fast.MaxJacobiExponent)
	switch kind {
	case "radau":
		bf++
	case "lobatto":
		af++
		bf++
	}
	if af > lim || bf > lim {
		return fmt.Sprintf("the fast path serves Jacobi exponents up to %d (%s rules: alpha, beta up to %d less the ones the fixed nodes add)", fast.MaxJacobiExponent, kind, fast.MaxJacobiExponent)
	}
	return ""
}

// BuildFast builds the n-point rule of a classical family (kind gauss,
// radau with the fixed node at the left end, or lobatto) in float64 with
// package fast, maps it onto the family's interval, and verifies it: the
// exactness test of CheckDegree through the construction degree when the
// work N (K+1) fits fastCheckBudget (or opt.FullCheck), else through the
// largest degree K that fits (Degree then reports K, not the
// construction degree), and the sampled comparison with fast.Reference
// (sampleAccuracy). A rule that fails either check is an error.
func BuildFast(ctx context.Context, fam moments.Family, kind string, n int, opt FastOptions) (*FastRule, error) {
	if why := FastServes(fam, kind); why != "" {
		return nil, fmt.Errorf("--family %s: %s", fam.Name, why)
	}
	if n < 1 || n > FastMaxPoints {
		return nil, fmt.Errorf("--points %d: the fast path builds rules of 1 to %d points", n, FastMaxPoints)
	}
	if (kind == "radau" && n < 2) || (kind == "lobatto" && n < 3) {
		return nil, fmt.Errorf("--points %d: a %s rule needs at least %d points", n, kind, map[string]int{"radau": 2, "lobatto": 3}[kind])
	}
	p := newFastPlan(fam, kind, n)
	x, w := make([]float64, n), make([]float64, n)
	var d []float64
	if p.finite {
		d = make([]float64, n)
	}
	if err := fast.Points(p.kind, n, p.alpha, p.beta, false, x, w, d); err != nil {
		return nil, fmt.Errorf("the fast %d-point %s rule of %s failed: %v", n, kind, fam.Label(), err)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	idx := fastSamples(n, p.free, p.sampleCount(n))
	starts := make([]float64, len(idx))
	for j, i := range idx {
		starts[j] = x[i]
	}
	p.mapOnto(x, w, d)
	d = nil
	for i := 1; i < n; i++ {
		if !(x[i] > x[i-1]) {
			return nil, fmt.Errorf("the fast %d-point %s rule of %s has nodes %d and %d out of order after the map onto %s", n, kind, fam.Label(), i, i+1, fam.Interval)
		}
	}
	src := FamilySource{Family: fam}
	r := &FastRule{
		Kind: kind, Measure: src.Label(), Weight: src.Weight(), Domain: src.Domain(),
		X: x, W: w, ConstructionDegree: p.degree, Method: p.method,
	}
	if err := r.checkDegree(ctx, p, opt.FullCheck); err != nil {
		return nil, err
	}
	acc, err := p.sampleAccuracy(ctx, x, w, idx, starts)
	if err != nil {
		return nil, err
	}
	r.Accuracy = acc
	if acc.NodeShare > 1 || acc.WeightShare > 1 {
		i, what, e := acc.WorstNode, "node", acc.NodeULP
		if acc.WeightShare > acc.NodeShare {
			i, what, e = acc.WorstWeight, "weight", acc.WeightULP
		}
		return nil, fmt.Errorf("the fast %d-point %s rule of %s failed its accuracy check: %s %d is off by %.3g ulp, beyond the bound (use --digits 17 for the extended-precision engine)", n, kind, fam.Label(), what, i+1, e)
	}
	return r, nil
}

// checkDegree sets r.Degree, r.WorstShare and r.DegreeCheck: for a
// finite interval every degree through the construction degree in the
// Chebyshev basis (checkChebyshev), on a half-line or the line in the
// orthogonal basis up to the work budget (checkOrthogonal).
func (r *FastRule) checkDegree(ctx context.Context, p *fastPlan, full bool) error {
	if p.finite {
		return r.checkChebyshev(ctx, p)
	}
	return r.checkOrthogonal(ctx, p.fam, full)
}

// fastDirectBudget bounds the direct double-double sums of the Chebyshev
// check (nodes times degrees; about 10 ns each on one core).
const (
	fastDirectBudget = 1e7
	fastDirectMin    = 8
)

// checkChebyshev tests every degree 0..ConstructionDegree with
// fast.CheckChebyshev against the Chebyshev moments of the family's
// weight, mapped onto its interval.
func (r *FastRule) checkChebyshev(ctx context.Context, p *fastPlan) error {
	n := len(r.X)
	K := r.ConstructionDegree
	a, b := p.fam.JacobiExponents()
	ref, err := moments.NewFamily("jacobi", a, b, nil)
	if err != nil {
		return err
	}
	rec, err := FamilySource{Family: ref}.Recurrence(1, fastRefPrec)
	if err != nil {
		return err
	}
	mh, _ := rec.Beta[0].Float64()
	ml, _ := new(big.Float).Sub(rec.Beta[0], new(big.Float).SetFloat64(mh)).Float64()
	iv := p.fam.Interval
	lo, half := [2]float64{-1, 0}, [2]float64{1, 0}
	if !iv.Equal(moments.Unit()) {
		lo = ratPair(iv.Lo.Value)
		half = ratPair(new(big.Rat).Quo(new(big.Rat).Sub(iv.Hi.Value, iv.Lo.Value), big.NewRat(2, 1)))
	}
	direct := min(K, max(fastDirectMin, int(fastDirectBudget/float64(n))))
	c, err := fast.CheckChebyshev(ctx, r.X, r.W, lo, half, [2]float64{mh, ml}, ratPair(a), ratPair(b), K, direct, fastTol)
	if err != nil {
		return fmt.Errorf("the fast %d-point %s rule of %s could not be checked: %v", n, r.Kind, r.Measure, err)
	}
	if c.Degree < K {
		return fmt.Errorf("the fast %d-point %s rule of %s failed its exactness test at degree %d (tested in the Chebyshev basis through degree %d)", n, r.Kind, r.Measure, c.Degree+1, K)
	}
	r.Degree, r.WorstShare = c.Degree, math.Max(c.DirectWorst, c.TransformWorst)
	r.DegreeCheck = fmt.Sprintf("exactness tested for every degree 0 to %d in the Chebyshev basis of the interval against the exact Chebyshev moments of the weight (recurrence in double-double): "+
		"degrees 0 to %d by direct double-double sums, each residual within the audit's criterion 10u sum|w_i|(|T_k(t_i)| + |x_i d/dx T_k(t_i)|), u = 1e-16 (largest %.2g of it); "+
		"every degree by one nonuniform FFT (Gaussian gridding, Greengard and Lee 2004; gonum's DCT on a periodic grid of %d points), each residual within 10u L_k + 2 tau(k) sum|w_i|, L_k a lower bound on the audit's scale sum|w_i x_i T_k'(t_i)| from a second transform (|sin| >= sin^2) and tau(k) the transform's error bound, from %.2g at degree 0 to %.2g at degree %d "+
		"(largest residual %.2g of that tolerance; the bound confirmed within %.2g of itself against direct double-double sums at degrees 0 to %d and %d)",
		K, c.Direct, c.DirectWorst, c.Grid, c.BoundLow, c.BoundHigh, K, c.TransformWorst, c.Agreement, c.Direct, K)
	if c.Symmetric {
		r.DegreeCheck += "; the printed rule is exactly symmetric about the middle and the weight even, so every odd degree holds exactly (mirror pairs cancel) and the transforms ran over the nodes right of the middle at the doubled angles, half the band"
	}
	return nil
}

// checkOrthogonal is the exactness test of CheckDegree in the orthogonal
// basis, for the Laguerre and Hermite rules: on a half-line or the line
// no basis is bounded over the nodes (they spread to about 4N), so the
// sums of w_i p_k(x_i) for all k are not one transform of bounded
// functions, and each degree costs O(N) recurrence steps; the test runs
// through the construction degree when the work fits fastCheckBudget (or
// full), else through the largest degree that fits.
func (r *FastRule) checkOrthogonal(ctx context.Context, fam moments.Family, full bool) error {
	n := len(r.X)
	double := fam.Name == "laguerre"
	budget, arith := fastCheckBudget, "float64"
	if double {
		budget, arith = fastCheckBudgetDD, "double-double"
	}
	K := r.ConstructionDegree
	if !full {
		K = min(K, int(budget/float64(n))-1)
	}
	K = max(K, 1)
	rec, err := FamilySource{Family: fam}.Recurrence(K+1, 64)
	if err != nil {
		return err
	}
	al, be := make([]float64, K+1), make([]float64, K+1)
	for k := 0; k <= K; k++ {
		al[k], _ = rec.Alpha[k].Float64()
		be[k], _ = rec.Beta[k].Float64()
	}
	deg, worst, err := fast.CheckDegree(ctx, al, be, r.X, r.W, K, fastTol, double)
	if err != nil {
		return err
	}
	if deg < K {
		return fmt.Errorf("the fast %d-point %s rule of %s failed its exactness test at degree %d (tested in %s arithmetic through degree %d)", n, r.Kind, r.Measure, deg+1, arith, K)
	}
	r.Degree, r.WorstShare = deg, worst
	r.DegreeCheck = fmt.Sprintf("exactness tested in %s arithmetic (compensated sums) for degrees 0 to %d in the orthogonal basis, with the audit's criterion at u = 1e-16", arith, K)
	if K < r.ConstructionDegree {
		r.DegreeCheck += fmt.Sprintf("; the rule is built for degree %d, but testing beyond %d would exceed the work budget N (K+1) <= %.0e (--verify full tests it all)", r.ConstructionDegree, K, budget)
	}
	r.DegreeCheck += fmt.Sprintf("; not by the Chebyshev transform of the finite-interval rules: on %s no polynomial basis is bounded over the nodes (they spread to about 4N), so the sums are not one transform of bounded functions, and each degree costs a pass over the nodes", fam.Interval)
	return nil
}

// fastPlan is how BuildFast computes a family's rule with package fast.
type fastPlan struct {
	fam         moments.Family
	kind        fast.Kind
	alpha, beta [2]float64 // the exact exponents as pairs hi + lo
	finite      bool
	degree      int
	// free counts the fixed nodes at the left end (1 radau, 1 lobatto)
	// and right end (1 lobatto): the sampled check compares the others
	// with the Gauss rule of the modified measure.
	freeLo, freeHi int
	free           func(i int) bool
	method         string
}

func newFastPlan(fam moments.Family, kind string, n int) *fastPlan {
	p := &fastPlan{fam: fam, finite: fam.IsFinite(), degree: 2*n - 1}
	switch fam.Name {
	case "laguerre":
		p.kind = fast.GaussLaguerre
		p.alpha = ratPair(fam.Alpha)
		p.method = "Glaser, Liu and Rokhlin 2007: zeros by Taylor series of the differential equation, marched in double-double (design/fast)"
	case "hermite":
		p.kind = fast.GaussHermite
		p.method = "Glaser, Liu and Rokhlin 2007: zeros by Taylor series of the differential equation, marched in double-double (design/fast)"
	default:
		a, b := fam.JacobiExponents()
		p.alpha, p.beta = ratPair(a), ratPair(b)
		p.kind = fast.GaussJacobi
		p.method = "Hale and Townsend 2013: interior asymptotic expansion with Newton steps, hypergeometric series next to the ends (design/fast)"
		if a.Sign() == 0 && b.Sign() == 0 && kind == "gauss" {
			p.kind = fast.GaussLegendre
			p.method = "Bogaert 2014: iteration-free expansions, the node angle in double-double (design/fast)"
		}
		switch kind {
		case "radau":
			p.kind, p.degree, p.freeLo = fast.RadauJacobiKind, 2*n-2, 1
			p.method += "; Radau rule from the Gauss rule of (1+x) w(x)"
		case "lobatto":
			p.kind, p.degree, p.freeLo, p.freeHi = fast.LobattoJacobiKind, 2*n-3, 1, 1
			p.method += "; Lobatto rule from the Gauss rule of (1-x^2) w(x)"
		}
	}
	p.free = func(i int) bool { return i >= p.freeLo && i < n-p.freeHi }
	return p
}

// mapOnto maps the rule from the family's reference interval onto its
// interval (finite families: affinely, weights times (B-A)/2; Laguerre on
// [a, inf): shifted by a; Hermite: unchanged).
func (p *fastPlan) mapOnto(x, w, d []float64) {
	iv := p.fam.Interval
	switch {
	case p.finite:
		if iv.Equal(moments.Unit()) {
			return
		}
		A, B := iv.Lo.Value, iv.Hi.Value
		half := new(big.Rat).Quo(new(big.Rat).Sub(B, A), big.NewRat(2, 1))
		fast.MapFinite(x, w, d, ratPair(A), ratPair(B), ratPair(half))
	case p.fam.Name == "laguerre" && iv.Lo.Value.Sign() != 0:
		fast.Shift(x, ratPair(iv.Lo.Value))
	}
}

// ratPair returns r as hi + lo, hi the nearest float64 and lo the
// nearest float64 to the rest.
func ratPair(r *big.Rat) [2]float64 {
	hi, _ := r.Float64()
	lo, _ := new(big.Rat).Sub(r, new(big.Rat).SetFloat64(hi)).Float64()
	return [2]float64{hi, lo}
}
