package design

import (
	"context"
	"math"
	"math/big"

	"quadwright/design/fast"
	"quadwright/moments"
)

// sampleCount is how many nodes BuildFast compares with the reference:
// fastMaxSamples for Gauss-Legendre, whose reference costs O(1) per point
// (fast.LegendreReference), else about fastSampleBudget/n (at least
// fastMinSamples, at most fastMaxSamples), the recurrence costing O(n).
func (p *fastPlan) sampleCount(n int) int {
	if p.kind == fast.GaussLegendre {
		return fastMaxSamples
	}
	return int(min(fastMaxSamples, max(fastMinSamples, fastSampleBudget/float64(n))))
}

// fastSamples returns count indices for BuildFast to compare with the
// reference (fewer when there are fewer free nodes): an eighth next to each end and in the middle and the
// rest evenly spread, among the free nodes only.
func fastSamples(n int, free func(int) bool, count int) []int {
	seen := map[int]bool{}
	var idx []int
	add := func(i int) {
		if i >= 0 && i < n && free(i) && !seen[i] {
			seen[i] = true
			idx = append(idx, i)
		}
	}
	edge := max(count/8, 1)
	for i := 0; i < edge+1; i++ {
		add(i)
		add(n - 1 - i)
		add(n/2 - edge/2 + i)
	}
	// Spread the rest evenly; an index already taken gives way to the
	// next free one, so that count indices are compared when there are
	// that many free nodes.
	rest := max(count-len(idx), 0)
	for j := 0; j < rest; j++ {
		i := int(int64(j) * int64(n) / int64(rest))
		for try := 0; try < n; try, i = try+1, (i+1)%n {
			if free(i) && !seen[i] {
				add(i)
				break
			}
		}
	}
	return idx
}

const fastRefPrec = 256

// sampleAccuracy compares the printed points at idx with
// fast.LegendreReference (Gauss-Legendre) or fast.Reference (Newton's
// method on the recurrence of the Gauss rule whose nodes they are), both
// in double-double from the unmapped computed nodes starts, the
// reference mapped onto the interval at fastRefPrec bits.
func (p *fastPlan) sampleAccuracy(ctx context.Context, x, w []float64, idx []int, starts []float64) (FastAccuracy, error) {
	n := len(x)
	refFam, refN := p.fam, n
	a, b := big.NewRat(0, 1), big.NewRat(0, 1)
	kind := fast.GaussJacobi
	switch p.fam.Name {
	case "laguerre":
		kind = fast.GaussLaguerre
		a = p.fam.Alpha
		refFam, _ = moments.NewFamily("laguerre", a, nil, nil)
	case "hermite":
		kind = fast.GaussHermite
		refFam, _ = moments.NewFamily("hermite", nil, nil, nil)
	default:
		a, b = p.fam.JacobiExponents()
		a, b = new(big.Rat).Set(a), new(big.Rat).Set(b)
		switch p.kind {
		case fast.RadauJacobiKind:
			b.Add(b, big.NewRat(1, 1))
			refN = n - 1
		case fast.LobattoJacobiKind:
			a.Add(a, big.NewRat(1, 1))
			b.Add(b, big.NewRat(1, 1))
			refN = n - 2
		}
		var err error
		if refFam, err = moments.NewFamily("jacobi", a, b, nil); err != nil {
			return FastAccuracy{}, err
		}
	}
	rec, err := FamilySource{Family: refFam}.Recurrence(1, fastRefPrec)
	if err != nil {
		return FastAccuracy{}, err
	}
	mh, _ := rec.Beta[0].Float64()
	ml, _ := new(big.Float).Sub(rec.Beta[0], new(big.Float).SetFloat64(mh)).Float64()
	m := newFastMap(p)
	var pts []fast.RefPoint
	if p.kind == fast.GaussLegendre {
		pts, err = fast.NewLegendreReference(n).Points(ctx, starts)
	} else {
		ref := fast.NewReference(kind, refN, ratPair(a), ratPair(b), [2]float64{mh, ml})
		pts, err = ref.Points(ctx, starts)
	}
	if err != nil {
		return FastAccuracy{}, err
	}
	type result struct{ node, nodeShare, weight, weightShare float64 }
	res := make([]result, len(idx))
	for j, i := range idx {
		if !pts[j].OK {
			res[j] = result{math.Inf(1), math.Inf(1), math.Inf(1), math.Inf(1)}
			continue
		}
		xb, wb, bound := m.apply(pts[j].X, pts[j].WM, pts[j].WE)
		xe, wu := errULP(x[i], xb), errULP(w[i], wb)
		res[j] = result{xe, xe * ulpOf(xb) / bound, wu, wu / m.weightULPs}
	}
	acc := FastAccuracy{Samples: len(idx)}
	for j, r := range res {
		if r.node > acc.NodeULP {
			acc.NodeULP = r.node
		}
		if r.nodeShare > acc.NodeShare {
			acc.NodeShare, acc.WorstNode = r.nodeShare, idx[j]
		}
		if r.weight > acc.WeightULP {
			acc.WeightULP = r.weight
		}
		if r.weightShare > acc.WeightShare {
			acc.WeightShare, acc.WorstWeight = r.weightShare, idx[j]
		}
	}
	return acc, nil
}

// fastMap carries a reference point from the family's reference variable
// t onto the rule's interval, at fastRefPrec bits.
type fastMap struct {
	kind       fast.Kind
	finite     bool
	lo, half   *big.Float // x = lo + half (t + 1) (finite); x = lo + t (Laguerre)
	halfF      float64
	mapped     bool // the values were mapped (one more rounding each)
	weightULPs float64
}

func newFastMap(p *fastPlan) fastMap {
	m := fastMap{kind: p.kind, finite: p.finite, weightULPs: 4, halfF: 1}
	iv := p.fam.Interval
	nb := func(r *big.Rat) *big.Float { return new(big.Float).SetPrec(fastRefPrec).SetRat(r) }
	switch {
	case p.finite && !iv.Equal(moments.Unit()):
		m.mapped, m.weightULPs = true, 5
		m.lo = nb(iv.Lo.Value)
		m.half = nb(new(big.Rat).Quo(new(big.Rat).Sub(iv.Hi.Value, iv.Lo.Value), big.NewRat(2, 1)))
		m.halfF, _ = m.half.Float64()
	case p.fam.Name == "laguerre" && iv.Lo.Value.Sign() != 0:
		m.mapped = true
		m.lo = nb(iv.Lo.Value)
	}
	return m
}

// apply returns the mapped node and weight of the reference point t = z,
// lambda = wm 2^we (the weight divided by 1+t for radau, by 1-t^2 for
// lobatto), and the node's error bound.
func (m fastMap) apply(z, wm [2]float64, we int) (x, w *big.Float, bound float64) {
	nf := func() *big.Float { return new(big.Float).SetPrec(fastRefPrec) }
	t := nf().SetFloat64(z[0])
	t.Add(t, nf().SetFloat64(z[1]))
	w = nf().SetFloat64(wm[0])
	w.Add(w, nf().SetFloat64(wm[1]))
	w.SetMantExp(w, we)
	one := nf().SetInt64(1)
	switch m.kind {
	case fast.RadauJacobiKind:
		w.Quo(w, nf().Add(one, t))
	case fast.LobattoJacobiKind:
		w.Quo(w, nf().Mul(nf().Add(one, t), nf().Sub(one, t)))
	}
	x = t
	tf, _ := t.Float64()
	if m.finite {
		theta := math.Acos(math.Max(-1, math.Min(1, tf)))
		bound = m.halfF * math.Max(2*ulp(theta)*math.Sin(theta), ulp(tf))
	} else {
		bound = ulp(tf)
	}
	if m.mapped {
		if m.finite {
			x = nf().Add(m.lo, nf().Mul(m.half, nf().Add(t, one)))
			w.Mul(w, m.half)
		} else {
			x = nf().Add(m.lo, t)
		}
		bound += ulpOf(x)
	}
	return x, w, bound
}

// errULP returns |v - ref| in units of the last place of ref's nearest
// float64.
func errULP(v float64, ref *big.Float) float64 {
	d, _ := new(big.Float).Sub(ref, new(big.Float).SetFloat64(v)).Float64()
	return math.Abs(d) / ulpOf(ref)
}

func ulpOf(v *big.Float) float64 {
	f, _ := v.Float64()
	return ulp(f)
}

// ulp is the gap from |v| to the next float64 away from 0.
func ulp(v float64) float64 {
	v = math.Abs(v)
	if math.IsInf(v, 0) {
		return math.Inf(1)
	}
	return math.Nextafter(v, math.Inf(1)) - v
}
