package design

import (
	"context"
	"errors"
	"fmt"
	"math/big"

	"quadwright/moments"
	"quadwright/precision"
)

// MaxPrescribedNodes bounds the rules whose nodes are all prescribed: their
// weights cost O(N^2) operations at a working precision that grows with
// the instability of the nodes.
const MaxPrescribedNodes = 2000

// Interpolatory builds the rule of m on the prescribed nodes (exact, any
// order, distinct; the rule lists them ascending) with the interpolatory
// weights, those that integrate every polynomial of degree <= N-1 exactly.
// kind is recorded in the rule ("interpolatory", or the preset's name).
// Its true degree, at least N-1, is verified by testing through 2N-1 and
// reported; negative weights, the ratio sum |w| / |sum w| and nodes outside
// the support are reported in Stability and Notes.
//
// The weights are w_i = integral of l_i dmu with l_i the Lagrange basis
// polynomial of node i. Each is computed without any linear solve, as
//
//	w_i = lambda_i sum_r g_r prod_{j != i} (y_r - z_j),   lambda_i = 1 / prod_{j != i} (z_i - z_j),
//
// with (y_r, g_r) the ceil(N/2)-point Gauss rule of m, built from m's own
// recurrence (its orthonormal basis), which is exact for the degree N-1
// products. Every factor is a product or quotient, so the only loss of
// accuracy is the cancellation in the sum over r, which is the instability
// of the weights themselves; the working precision is raised by the
// confirmation loop until two precisions agree on every printed digit.
// The monomial Vandermonde system is never formed.
func Interpolatory(ctx context.Context, m Measure, req Request, nodes []*big.Rat, kind string) (*Rule, error) {
	n := len(nodes)
	if n < 1 {
		return nil, errors.New("--nodes: the file lists no node")
	}
	if n > MaxPrescribedNodes {
		return nil, fmt.Errorf("--nodes: %d nodes are more than the %d this command takes", n, MaxPrescribedNodes)
	}
	zs := sortedDistinct(nodes)
	if len(zs) != n {
		return nil, fmt.Errorf("--nodes: a node is listed twice; the nodes must be distinct")
	}
	req.Points = n
	return interpolatoryRule(ctx, m, req, kind, n, func(p uint) []*big.Float {
		out := make([]*big.Float, n)
		for i, z := range zs {
			out[i] = ratFloat(z, p)
		}
		return out
	}, zs)
}

// sortedDistinct returns the values ascending with repeats removed.
func sortedDistinct(xs []*big.Rat) []*big.Rat {
	out := append([]*big.Rat(nil), xs...)
	for i := 1; i < len(out); i++ { // insertion sort: the lists are short
		for j := i; j > 0 && out[j].Cmp(out[j-1]) < 0; j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	k := 0
	for i := range out {
		if i == 0 || out[i].Cmp(out[k-1]) != 0 {
			out[k] = out[i]
			k++
		}
	}
	return out[:k]
}

// interpolatoryRule is the confirm-and-verify loop of a rule whose n nodes
// are all prescribed: nodesAt(p) returns them ascending at p bits; exact[i]
// is node i as an exact value, printed as given, or nil (a node such as a
// cosine, printed to the digits asked); exact may be nil or short.
func interpolatoryRule(ctx context.Context, m Measure, req Request, kind string, n int, nodesAt func(p uint) []*big.Float, exact []*big.Rat) (*Rule, error) {
	req, err := checkRequest(ctx, m, req, 0)
	if err != nil {
		return nil, err
	}
	g := (n + 1) / 2
	nominal := n - 1
	src, err := sourceFor(m, max(g, nominal), max(g, 2*n-1), firstPrec(req.Digits, n), fmt.Sprintf("the interpolatory weights on %d nodes", n))
	if err != nil {
		return nil, err
	}
	var inner []*big.Float // the last Gauss nodes: starting values for the next stage
	s1, s2, texts, err := confirmStages(n, req.Digits, func(p uint, prev *stage) (*stage, error) {
		rec, err := src.Recurrence(g, p)
		if err != nil {
			return nil, err
		}
		gs, err := gaussStage(ctx, rec, g, p, inner)
		if err != nil {
			return nil, err
		}
		inner = gs.nodes
		s := &stage{prec: p, nodes: nodesAt(p)}
		s.weights, err = lagrangeWeights(ctx, s.nodes, gs.nodes, gs.weights, p)
		return s, err
	})
	if err != nil {
		return nil, err
	}
	r := newRule(kind, m, s1, s2, texts, req.Digits, "interpolatory weights: Lagrange basis integrated by the measure's Gauss rule, no linear solve")
	for i, z := range exact {
		if z != nil {
			printFixed(texts, []int{i}, []*big.Rat{z}, req.Digits)
		}
	}
	r.Fixed = append([]string(nil), r.Nodes...)
	if err := verifyRule(ctx, src, r, nominal, 2*n-1); err != nil {
		return nil, err
	}
	r.Stability = stabilityOf(r)
	stabilityNotes(r)
	return r, nil
}

// lagrangeWeights returns w_i = lambda_i sum_r g_r prod_{j != i}(y_r - z_j)
// for the nodes z (distinct) and the rule (y, g), at prec bits: prefix and
// suffix products make each sum O(len(z) len(y)). A weight whose sum
// cancels below the rounding level is returned as exactly 0. The result carries
// relative errors of a few ulp times len(z), times the cancellation of
// the sum over r.
func lagrangeWeights(ctx context.Context, z, y, g []*big.Float, prec uint) ([]*big.Float, error) {
	n := len(z)
	zr := precision.NewRealSlice(n, prec)
	for i := range z {
		zr[i].SetBig(z[i])
	}
	acc := precision.NewRealSlice(n, prec)
	mag := precision.NewRealSlice(n, prec) // sum_r |g_r prod ...|: the scale of the cancellation
	pre := precision.NewRealSlice(n+1, prec)
	suf := precision.NewRealSlice(n+1, prec)
	yr, gr, t := precision.NewReal(prec), precision.NewReal(prec), precision.NewReal(prec)
	for r := range y {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		yr.SetBig(y[r])
		gr.SetBig(g[r])
		pre[0].SetInt64(1)
		for j := 0; j < n; j++ {
			t.Sub(yr, zr[j])
			pre[j+1].Mul(pre[j], t)
		}
		suf[n].SetInt64(1)
		for j := n - 1; j >= 0; j-- {
			t.Sub(yr, zr[j])
			suf[j].Mul(suf[j+1], t)
		}
		for i := 0; i < n; i++ {
			t.Mul(pre[i], suf[i+1])
			t.Mul(gr, t)
			acc[i].Add(acc[i], t)
			mag[i].Add(mag[i], t.Abs(t))
		}
	}
	out := make([]*big.Float, n)
	d := precision.NewReal(prec)
	for i := 0; i < n; i++ {
		if i%64 == 0 {
			if err := ctx.Err(); err != nil {
				return nil, err
			}
		}
		d.SetInt64(1)
		for j := 0; j < n; j++ {
			if j != i {
				t.Sub(zr[i], zr[j])
				d.Mul(d, t)
			}
		}
		if d.IsZero() {
			return nil, errors.New("--nodes: two nodes coincide at the working precision")
		}
		// A sum that cancelled by more than three quarters of the working
		// bits is a weight that is zero within rounding (a node that the
		// others make redundant, as 1/2 among -1, 0, 1 for degree 3): it is
		// set to exactly 0, at every precision alike, so the two stages
		// agree; a genuinely small weight keeps growing bits as the
		// precision is raised and stops being cleared.
		if acc[i].IsZero() || acc[i].Exponent() < mag[i].Exponent()-int64(3*prec/4) {
			acc[i].SetInt64(0)
		}
		acc[i].Quo(acc[i], d)
		out[i] = acc[i].Big(nil)
	}
	return out, nil
}

// nodeLabel prints a node for messages.
func nodeLabel(z *big.Rat) string { return moments.RatString(z) }
