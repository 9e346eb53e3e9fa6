package design

import (
	"math"
	"math/big"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// gonumSizes are the N at which quadwright's float64-mode Legendre and
// Hermite rules are compared with gonum's integrate/quad: every N to 40,
// then a spread up to 200 (all N to 200 with -tags heavy).
func gonumSizes() []int {
	var ns []int
	for n := 1; n <= 200; n++ {
		if n <= 40 || n%9 == 0 || n == 200 || heavy {
			ns = append(ns, n)
		}
	}
	return ns
}

// gonumTolerance says how far gonum's float64 values may be from ours.
type gonumTolerance struct {
	nodeAbs, nodeRel, weightRel float64
	decide                      float64 // beyond this relative weight difference the mpmath reference must decide
}

// compareGonum compares one rule with gonum's (gx, gw given in ascending
// order). Where a value differs beyond tolerance, or a weight beyond
// tol.decide, the mpmath reference for that N must exist and be closer to
// quadwright's value than to gonum's.
func compareGonum(t *testing.T, r *Rule, gx, gw []float64, rc *referenceCase, tol gonumTolerance, worst *[2]float64) {
	t.Helper()
	n := len(gx)
	for i := 0; i < n; i++ {
		ox, _ := strconv.ParseFloat(r.Nodes[i], 64)
		ow, _ := strconv.ParseFloat(r.Weights[i], 64)
		dx := math.Abs(ox - gx[i])
		dw := math.Abs(ow-gw[i]) / ow
		worst[0], worst[1] = math.Max(worst[0], dx), math.Max(worst[1], dw)
		nodeBad := dx > math.Max(tol.nodeAbs, tol.nodeRel*math.Abs(ox))
		if !nodeBad && dw <= tol.decide {
			continue
		}
		if rc == nil {
			if nodeBad || dw > tol.weightRel {
				t.Errorf("N=%d i=%d: quadwright (%s, %s), gonum (%v, %v), and no reference for this N to decide", n, i, r.Nodes[i], r.Weights[i], gx[i], gw[i])
			}
			continue
		}
		for _, v := range []struct {
			what   string
			ours   string
			theirs float64
			ref    string
		}{{"node", r.Nodes[i], gx[i], rc.Nodes[i]}, {"weight", r.Weights[i], gw[i], rc.Weights[i]}} {
			exact := rat(t, v.ref)
			of, _ := strconv.ParseFloat(v.ours, 64)
			ours := absDiff(new(big.Rat).SetFloat64(of), exact)
			theirs := absDiff(new(big.Rat).SetFloat64(v.theirs), exact)
			if ours > theirs || ours == theirs && of != v.theirs {
				t.Errorf("N=%d %s %d: the mpmath reference %s is closer to gonum's %v than to quadwright's %s", n, v.what, i, v.ref, v.theirs, v.ours)
			} else if ours < theirs {
				t.Logf("N=%d %s %d: gonum %v, quadwright %s; the mpmath reference %s sides with quadwright", n, v.what, i, v.theirs, v.ours, v.ref)
			}
		}
	}
}

// TestLegendreAgainstGonum compares with gonum's Legendre rule (Bogaert's
// iteration-free method, SIAM J. Sci. Comput. 36, 2014). gonum computes a
// node as cos(theta), so a node carries an absolute error of a few ulp of 1
// wherever it lies, central nodes included; its weights are within a few
// ulp relative. Tolerances (tuned to what gonum gives): 6e-16 absolute on
// nodes, 1e-14 relative on weights. gonum lists nodes in descending order.
// At N = 26 gonum returns 0 for the two end weights; the mpmath reference
// for N = 26 shows which value is right.
func TestLegendreAgainstGonum(t *testing.T) {
	src := family(t, "legendre", "", "", "")
	ref := loadReference(t)
	var worst [2]float64
	for _, n := range gonumSizes() {
		r := build(t, src, n, 0)
		x := make([]float64, n)
		w := make([]float64, n)
		quad.Legendre{}.FixedLocations(x, w, -1, 1)
		for i, j := 0, n-1; i < j; i, j = i+1, j-1 {
			x[i], x[j] = x[j], x[i]
			w[i], w[j] = w[j], w[i]
		}
		compareGonum(t, r, x, w, ref.find("legendre", "", "", n), gonumTolerance{nodeAbs: 6e-16, weightRel: 1e-14, decide: 1e-14}, &worst)
	}
	t.Logf("largest difference from gonum: nodes %.3g absolute, weights %.3g relative", worst[0], worst[1])
}

// TestHermiteAgainstGonum compares with gonum's Hermite rule (tabulated for
// N <= 200). Its tabulated weights are less accurate for larger N (up to
// about 1e-8 relative in the smallest weights at N = 200), so the weight
// tolerance is 2e-8 relative, nodes 8e-15 relative (both tuned); wherever a
// weight differs by more than 1e-13 relative and the mpmath reference holds
// that N (21, 27 and 200 are there for this), the reference decides.
func TestHermiteAgainstGonum(t *testing.T) {
	src := family(t, "hermite", "", "", "")
	ref := loadReference(t)
	var worst [2]float64
	for _, n := range gonumSizes() {
		r := build(t, src, n, 0)
		x := make([]float64, n)
		w := make([]float64, n)
		quad.Hermite{}.FixedLocations(x, w, math.Inf(-1), math.Inf(1))
		compareGonum(t, r, x, w, ref.find("hermite", "", "", n), gonumTolerance{nodeAbs: 8e-15, nodeRel: 8e-15, weightRel: 2e-8, decide: 1e-13}, &worst)
	}
	t.Logf("largest difference from gonum: nodes %.3g absolute, weights %.3g relative", worst[0], worst[1])
}
