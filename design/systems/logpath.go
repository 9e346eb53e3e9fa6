package systems

import (
	"context"
	"math/big"
	"strconv"
	"strings"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// logSystem recognises the log system: weight 1 on [0, c] (c > 0) and
// functions that are, in some order, exactly x^k and x^k log(x) for
// k = 0..N-1, each once. It returns N and c. Only the start of the
// solve depends on it; the rule is still solved, confirmed and verified
// against the functions as given.
func logSystem(pr Problem) (int, *big.Rat, bool) {
	w := pr.Weight
	iv := w.Interval
	if strings.TrimSpace(w.Source) != "1" || !iv.Lo.Finite() || !iv.Hi.Finite() || iv.Lo.Value.Sign() != 0 || iv.Hi.Value.Sign() <= 0 {
		return 0, nil, false
	}
	m := len(pr.Functions)
	if m == 0 || m%2 == 1 {
		return 0, nil, false
	}
	n := m / 2
	seen := make([]bool, m) // 2k: x^k, 2k+1: x^k log(x)
	for _, f := range pr.Functions {
		k, lg, ok := logTerm(f.Source)
		if !ok || k >= n || seen[2*k+lg] {
			return 0, nil, false
		}
		seen[2*k+lg] = true
	}
	return n, iv.Hi.Value, true
}

// logTerm reads "x^K" (also "1", "x", "x^(K)") as (K, 0) and that times
// log(x), on either side, or "log(x)" alone, as (K, 1); spaces ignored.
func logTerm(src string) (k, lg int, ok bool) {
	s := strings.Join(strings.Fields(src), "")
	if s == "log(x)" {
		return 0, 1, true
	}
	if t, found := strings.CutSuffix(s, "*log(x)"); found {
		s, lg = t, 1
	} else if t, found := strings.CutPrefix(s, "log(x)*"); found {
		s, lg = t, 1
	}
	switch {
	case s == "1" && lg == 0:
		return 0, 0, true
	case s == "x":
		return 1, lg, true
	}
	e, found := strings.CutPrefix(s, "x^")
	if !found {
		return 0, 0, false
	}
	if t, found := strings.CutPrefix(e, "("); found {
		if e, found = strings.CutSuffix(t, ")"); !found {
			return 0, 0, false
		}
	}
	k, err := strconv.Atoi(e)
	if err != nil || k < 0 || k > MaxFunctions || e != strconv.Itoa(k) {
		return 0, 0, false
	}
	return k, lg, true
}

// powerPath is the power-exponent path to the log system on [0, 1]: at s
// the 2N functions
//
//	g_2k = x^a_k,  g_2k+1 = (x^b_k - x^a_k)/(b_k - a_k),
//	a_k = k(2 - s),  b_k = a_k + 1 - s,
//
// distinct powers for s < 1 (a_k < b_k < a_k+1), so a Chebyshev system on
// (0, 1], which has its Gauss rule with positive weights and interior
// nodes for every s (S. Karlin and W. J. Studden, "Tchebycheff Systems",
// Interscience 1966, ch. II); at s = 0 they span the polynomials of
// degree < 2N (the start: the Gauss-Legendre rule), and as s -> 1 they
// tend to x^k and x^k log x. Where the straight-line blend of two bases
// runs a node into x = 1, this path keeps every intermediate rule. The
// equations are in the functions themselves, each divided by its moment
// (1/(a_k+1) and -1/((a_k+1)(b_k+1)), so every residual is relative: all
// terms of a sum have one sign); the working precision carries the bits
// their conditioning costs.
type powerPath struct{ n int }

func (pp powerPath) valid(xs, ws []*big.Float) bool {
	for i := range xs {
		if ws[i].Sign() <= 0 || xs[i].Sign() <= 0 || i > 0 && xs[i].Cmp(xs[i-1]) <= 0 {
			return false
		}
	}
	return xs[len(xs)-1].Cmp(big.NewFloat(1)) < 0
}

// equations returns F_j = sum_i w_i g_j(x_i) / mu_j - 1 and, when jac,
// its Jacobian, at prec bits, with analytic derivatives:
// g_2k' = a_k x^a_k / x, g_2k+1' = (x^a_k / x)(a_k P + x^d), P =
// (x^d - 1)/d, d = 1 - s.
func (pp powerPath) equations(s float64, xs, ws []*big.Float, prec uint, jac bool) ([]*big.Float, [][]*big.Float, error) {
	n, m := pp.n, 2*pp.n
	e := new(big.Float).SetPrec(prec).SetFloat64(2 - s)
	d := new(big.Float).SetPrec(prec).SetFloat64(1 - s)
	// 1/mu_j: a_k + 1 and -(a_k + 1)(b_k + 1).
	inv := make([]*big.Float, m)
	ak := make([]*big.Float, n)
	for k := 0; k < n; k++ {
		ak[k] = new(big.Float).SetPrec(prec).Mul(e, new(big.Float).SetInt64(int64(k)))
		a1 := new(big.Float).SetPrec(prec).Add(ak[k], big.NewFloat(1))
		b1 := new(big.Float).SetPrec(prec).Add(a1, d)
		inv[2*k] = a1
		inv[2*k+1] = b1.Mul(b1, a1).Neg(b1)
	}
	F := make([]*big.Float, m)
	for j := range F {
		F[j] = new(big.Float).SetPrec(prec).SetInt64(-1)
	}
	var J [][]*big.Float
	if jac {
		J = make([][]*big.Float, m)
		for j := range J {
			J[j] = make([]*big.Float, m)
		}
	}
	t := new(big.Float).SetPrec(prec)
	for i, x := range xs {
		L := precision.LogTo(x, prec+16)
		xe := precision.ExpTo(new(big.Float).SetPrec(prec+16).Mul(e, L), prec)
		z := new(big.Float).SetPrec(prec+16).Mul(d, L)
		P := phi(z, prec+16)
		xd := new(big.Float).SetPrec(prec).Mul(z, P)
		xd.Add(xd, big.NewFloat(1))
		P.Mul(P, L).SetPrec(prec) // (x^d - 1)/d
		invx := new(big.Float).SetPrec(prec).Quo(big.NewFloat(1), x)
		A := new(big.Float).SetPrec(prec).SetInt64(1) // x^a_k
		for k := 0; k < n; k++ {
			if k > 0 {
				A.Mul(A, xe)
			}
			g0 := new(big.Float).SetPrec(prec).Mul(A, inv[2*k])
			g1 := new(big.Float).SetPrec(prec).Mul(A, P)
			g1.Mul(g1, inv[2*k+1])
			F[2*k].Add(F[2*k], t.Mul(ws[i], g0))
			F[2*k+1].Add(F[2*k+1], t.Mul(ws[i], g1))
			if jac {
				// w_i (x^a_k / x) times a_k, and times a_k P + x^d.
				wa := new(big.Float).SetPrec(prec).Mul(ws[i], A)
				wa.Mul(wa, invx)
				d0 := new(big.Float).SetPrec(prec).Mul(wa, ak[k])
				d1 := new(big.Float).SetPrec(prec).Mul(ak[k], P)
				d1.Add(d1, xd).Mul(d1, wa)
				J[2*k][i] = d0.Mul(d0, inv[2*k])
				J[2*k+1][i] = d1.Mul(d1, inv[2*k+1])
				J[2*k][n+i] = g0
				J[2*k+1][n+i] = g1
			}
		}
	}
	return F, J, nil
}

// phi returns (e^z - 1)/z at prec bits (1 at z = 0): by its series
// sum z^j/(j+1)! for |z| < 1/2, where e^z - 1 would cancel, and from
// e^z otherwise.
func phi(z *big.Float, prec uint) *big.Float {
	out := new(big.Float).SetPrec(prec).SetInt64(1)
	if z.Sign() == 0 {
		return out
	}
	if z.MantExp(nil) >= 0 { // |z| >= 1/2
		ez := precision.ExpTo(z, prec+8)
		ez.Sub(ez, big.NewFloat(1))
		return out.Quo(ez, z)
	}
	term := new(big.Float).SetPrec(prec + 8).SetInt64(1)
	for j := 2; ; j++ {
		term.Mul(term, z)
		term.Quo(term, new(big.Float).SetInt64(int64(j)))
		if term.Sign() == 0 || term.MantExp(nil) < -int(prec)-8 {
			break
		}
		out.Add(out, term)
	}
	return out
}

// logStart follows the power path from the n-point Gauss-Legendre rule on
// [0, 1] to the log system and maps the rule to [0, c] (x = c t: x^k and
// x^k log x span what t^k and t^k log t do), solved to about 2^-40; the
// caller refines it in the user's functions. Every point of the path has
// a rule, so steps may be halved far (to 2^-20) before it gives up.
func logStart(ctx context.Context, n int, c *big.Rat, prec uint) ([]*big.Float, []*big.Float, error) {
	t, W, err := legendre01(ctx, n)
	if err != nil {
		return nil, nil, err
	}
	x, w, err := follow(ctx, powerPath{n}, t, W, prec, pathStep/2, pathStep, 0x1p-20, 40)
	if err != nil {
		return nil, nil, err
	}
	cf := new(big.Float).SetPrec(prec).SetRat(c)
	for i := range x {
		x[i].Mul(x[i], cf)
		w[i].Mul(w[i], cf)
	}
	return x, w, nil
}

// legendre01 is the n-point Gauss-Legendre rule on [0, 1] to 20 digits,
// nodes ascending.
func legendre01(ctx context.Context, n int) ([]*big.Float, []*big.Float, error) {
	unit := moments.Interval{Lo: moments.Endpoint{Value: new(big.Rat)}, Hi: moments.Endpoint{Value: big.NewRat(1, 1)}}
	fam, err := moments.NewFamily("legendre", nil, nil, &unit)
	if err != nil {
		return nil, nil, err
	}
	r, err := design.Gauss(ctx, design.FamilySource{Family: fam}, design.Request{Points: n, Digits: 20})
	if err != nil {
		return nil, nil, err
	}
	return r.NodeValues, r.WeightValues, nil
}

// pathStep is the step in s along the power path, halved where Newton
// fails: longer steps fail from N = 16 or so and cost more than they save
// (tuned on N = 16 and 32).
var pathStep = 0.0625
