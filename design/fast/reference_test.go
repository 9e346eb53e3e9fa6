package fast_test

import (
	"context"
	"math"
	"math/big"
	"testing"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// refPrec is the precision of the sampled reference: Newton's method on the
// monic recurrence at 192 bits, whose forward evaluation loses about
// log2(n) bits, leaves well over 100 correct bits for n <= 10^6.
const refPrec = 192

// reference evaluates Gauss nodes and weights of one family at sampled
// indices, independently of the package under test: Newton's method on the
// monic three-term recurrence of design.FamilySource at refPrec bits,
// started from a float64 node, and the Christoffel number
// beta_0 beta_1 ... beta_{n-1} / (pi_{n-1}(x) pi_n'(x)).
type reference struct {
	n    int
	a, b []*precision.Real
	norm *precision.Real
	mass float64
}

func newReference(t testing.TB, f moments.Family, n int) *reference {
	t.Helper()
	rec, err := design.FamilySource{Family: f}.Recurrence(n, refPrec)
	if err != nil {
		t.Fatal(err)
	}
	r := &reference{n: n, a: precision.NewRealSlice(n, refPrec), b: precision.NewRealSlice(n, refPrec)}
	r.norm = precision.NewReal(refPrec).SetInt64(1)
	for k := 0; k < n; k++ {
		r.a[k].SetBig(rec.Alpha[k])
		r.b[k].SetBig(rec.Beta[k])
		r.norm.Mul(r.norm, r.b[k])
	}
	r.mass, _ = rec.Beta[0].Float64()
	return r
}

// point refines x0 to the nearest zero of pi_n and returns it with its
// weight, both at refPrec bits.
func (r *reference) point(x0 float64) (x, w *big.Float) {
	s := precision.NewRealSlice(10, refPrec)
	xr, p0, p1, d0, d1, t, u, v, ww, delta := s[0], s[1], s[2], s[3], s[4], s[5], s[6], s[7], s[8], s[9]
	xr.SetFloat64(x0)
	eval := func() {
		p0.SetInt64(1)
		p1.Sub(xr, r.a[0])
		d0.SetInt64(0)
		d1.SetInt64(1)
		for k := 1; k < r.n; k++ {
			t.Sub(xr, r.a[k])
			u.Mul(r.b[k], p0)
			v.MulSub(t, p1, u)
			u.Mul(r.b[k], d0)
			ww.MulSub(t, d1, u)
			ww.Add(ww, p1)
			p0, p1, v = p1, v, p0
			d0, d1, ww = d1, ww, d0
		}
	}
	for it := 0; it < 8; it++ {
		eval()
		if p1.IsZero() {
			break
		}
		delta.Quo(p1, d1)
		xr.Sub(xr, delta)
		if xr.IsZero() || delta.Exponent() < xr.Exponent()-refPrec+16 {
			break
		}
	}
	eval()
	wt := precision.NewReal(refPrec).Mul(p0, d1)
	wt.Quo(r.norm, wt)
	return xr.Big(nil), wt.Big(nil)
}

// accuracy holds measured errors of a float64 rule against the reference.
type accuracy struct {
	// NodeShare is the largest node error divided by the acceptance bound
	// max(2 ulp(theta) sin(theta), 1 ulp(x)), theta = arccos x: <= 1 passes.
	NodeShare float64
	// NodeULP is the largest node error in units of ulp(x).
	NodeULP float64
	// WeightULP is the largest relative weight error in units of ulp(w).
	WeightULP float64
	// Worst* are the indices where the maxima occur.
	WorstNode, WorstWeight int
}

func ulp(v float64) float64 {
	v = math.Abs(v)
	if v == 0 {
		return math.SmallestNonzeroFloat64
	}
	return math.Nextafter(v, math.Inf(1)) - v
}

// measure compares x[i], w[i] for the sampled indices with the reference.
func measure(r *reference, x, w []float64, idx []int) accuracy {
	var acc accuracy
	for _, i := range idx {
		xr, wr := r.point(x[i])
		xt, _ := xr.Float64()
		wt, _ := wr.Float64()
		dx, _ := new(big.Float).Sub(xr, new(big.Float).SetFloat64(x[i])).Float64()
		dw, _ := new(big.Float).Sub(wr, new(big.Float).SetFloat64(w[i])).Float64()
		theta := math.Acos(math.Min(1, math.Max(-1, xt)))
		bound := math.Max(2*ulp(theta)*math.Sin(theta), ulp(xt))
		if s := math.Abs(dx) / bound; s > acc.NodeShare {
			acc.NodeShare, acc.WorstNode = s, i
		}
		acc.NodeULP = math.Max(acc.NodeULP, math.Abs(dx)/ulp(xt))
		if e := math.Abs(dw) / ulp(wt); e > acc.WeightULP {
			acc.WeightULP, acc.WorstWeight = e, i
		}
	}
	return acc
}

// samples returns about count indices of an n-point rule: every index near
// both ends and in the middle, and an even spread in between.
func samples(n, count int) []int {
	seen := map[int]bool{}
	var idx []int
	add := func(i int) {
		if i >= 0 && i < n && !seen[i] {
			seen[i] = true
			idx = append(idx, i)
		}
	}
	edge := count / 8
	for i := 0; i < edge; i++ {
		add(i)
		add(n - 1 - i)
		add(n/2 - edge/2 + i)
	}
	rest := count - len(idx)
	for j := 0; j < rest; j++ {
		add(int(int64(j) * int64(n) / int64(rest)))
	}
	return idx
}

func jacobiFamily(t testing.TB, a, b float64) moments.Family {
	t.Helper()
	name := "jacobi"
	f, err := moments.NewFamily(name, new(big.Rat).SetFloat64(a), new(big.Rat).SetFloat64(b), nil)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// gaussRule is design.Gauss in float64 mode, parsed back.
func gaussRule(t testing.TB, f moments.Family, n int) (x, w []float64) {
	t.Helper()
	rule, err := design.Gauss(context.Background(), design.FamilySource{Family: f}, design.Request{Points: n})
	if err != nil {
		t.Fatal(err)
	}
	x, w = make([]float64, n), make([]float64, n)
	for i := range x {
		x[i] = mustFloat(t, rule.Nodes[i])
		w[i] = mustFloat(t, rule.Weights[i])
	}
	return x, w
}

func mustFloat(t testing.TB, s string) float64 {
	t.Helper()
	r, err := precision.ParseExact(s)
	if err != nil {
		t.Fatal(err)
	}
	f, _ := r.Float64()
	return f
}
