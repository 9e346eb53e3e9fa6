package design

import (
	"context"
	"math/big"
)

// firstOrderPairs bounds the moment lists whose digit limit is the
// first-order worst case (2n rebuilds of the n-point rule); longer lists
// keep the three sign patterns of SupportedDigits, whose cost does not grow
// with n.
const firstOrderPairs = 32

// firstOrderDigits returns the digits of the n-point rule that survive every
// perturbation of the moments within half a unit of their last digit, to
// first order: with Delta_k the change of a node or weight v when moment k
// alone moves by its half unit r_k, the linearised change over the whole
// box |delta m_k| <= r_k is at most sum_k |Delta_k| (a linear function
// takes its largest value on the box at the corner of its signs), so
// rel = max_v sum_k |Delta_k(v)| / |v| bounds the relative change of every
// value. A printed digit count D keeps the error below one unit in the last
// place (at least 10^-D |v|) when the input's share is at most half of it
// and the rounding takes the other half, so D = floor(-log10(2 rel)),
// capped at cap. A perturbation that leaves the positive measures gives 0.
// base is the recurrence of the moments as written, at prec bits.
func (s *MomentSource) firstOrderDigits(ctx context.Context, base *Recurrence, n int, prec uint, cap int) (int, error) {
	s0, err := gaussStage(ctx, base.Prefix(n), n, prec, nil)
	if err != nil {
		return 0, err
	}
	vals := append(append([]*big.Float(nil), s0.nodes...), s0.weights...)
	sum := make([]*big.Float, len(vals))
	for i := range sum {
		sum[i] = new(big.Float).SetPrec(64)
	}
	d := new(big.Float).SetPrec(prec)
	for k := 0; k < 2*n; k++ {
		u := knownTo(s.List.Values[k], s.List.ULP[k], cap)
		if u == nil {
			continue
		}
		delta := make([]*big.Rat, 2*n)
		delta[k] = new(big.Rat).Mul(u, big.NewRat(1, 2))
		rec, err := s.pairs(n, prec, delta)
		if err != nil {
			return 0, nil
		}
		s1, err := gaussStage(ctx, rec.Prefix(n), n, prec, s0.nodes)
		if err != nil {
			return 0, nil
		}
		moved := append(append([]*big.Float(nil), s1.nodes...), s1.weights...)
		for i := range vals {
			d.Sub(moved[i], vals[i])
			sum[i].Add(sum[i], new(big.Float).SetPrec(64).Abs(d))
		}
	}
	worst := new(big.Float).SetPrec(64)
	for i, v := range vals {
		if v.Sign() == 0 {
			continue
		}
		r := new(big.Float).SetPrec(64).Quo(sum[i], absF(v))
		if r.Cmp(worst) > 0 {
			worst.Set(r)
		}
	}
	worst.Mul(worst, big.NewFloat(2))
	return max(0, min(digitsOfChange(worst), cap)), nil
}
