package design

import (
	"context"
	"fmt"
	"math/big"
	"math/bits"

	"quadwright/moments"
	"quadwright/precision"
)

// DiscreteSource is the measure sum_i Mass[i] delta(x - X[i]) of a
// discrete measure read from a file. Its M distinct points fix exactly M
// recurrence pairs (beta_M would be 0), computed by the stable Lanczos
// method; an N-point Gauss rule exists for N <= M (for N = M it is the
// measure itself). It is a DigitLimiter when any value was written as a
// decimal, and a Verifier (an N-point rule with N > M/2 cannot be checked
// through the 2N-1 pairs the standard test uses).
type DiscreteSource struct {
	Data *moments.DiscreteMeasure
	// Support, when not nil, is the interval stated with the data (every
	// point lies in it; see moments.DiscreteMeasure.CheckSupport) and is
	// the rule's Domain.
	Support *moments.Interval

	cache recurrenceCache
	loss  digitsNote
}

// NewDiscreteSource returns the source of dm.
func NewDiscreteSource(dm *moments.DiscreteMeasure) *DiscreteSource {
	return &DiscreteSource{Data: dm}
}

// MaxLen is the number of distinct support points.
func (s *DiscreteSource) MaxLen() int { return len(s.Data.X) }

// Label names the file.
func (s *DiscreteSource) Label() string {
	return fmt.Sprintf("discrete measure of %d points from %s%s", len(s.Data.X), s.Data.Name, &s.loss)
}

// Weight names the file: a discrete measure has no weight function.
func (s *DiscreteSource) Weight() string { return "measure(" + s.Data.Name + ")" }

// ExactlyKnown reports that every point and mass was written exactly.
func (s *DiscreteSource) ExactlyKnown() bool { return s.Data.Exact }

// Domain is the stated Support, else [smallest point, largest point].
func (s *DiscreteSource) Domain() moments.Interval {
	if s.Support != nil {
		return *s.Support
	}
	x := s.Data.X
	lo, hi := x[0], x[len(x)-1]
	if lo.Cmp(hi) == 0 {
		// A one-point measure: an interval needs Lo < Hi.
		hi = new(big.Rat).Add(hi, big.NewRat(1, 1))
	}
	return moments.Interval{Lo: moments.Endpoint{Value: lo}, Hi: moments.Endpoint{Value: hi}}
}

// Recurrence returns pairs 0..n-1, n <= MaxLen, by Lanczos at
// prec + 64 + 2 log2(M) bits, rounded to prec: a few ulp at prec bits.
func (s *DiscreteSource) Recurrence(n int, prec uint) (*Recurrence, error) {
	if n > s.MaxLen() {
		return nil, fmt.Errorf("--measure %s: %d distinct points fix only %d recurrence pairs; %d were needed", s.Data.Name, s.MaxLen(), s.MaxLen(), n)
	}
	return s.cache.get(n, prec, func(n int, prec uint) (*Recurrence, error) {
		rec, err := s.lanczos(n, prec, nil, nil)
		if err == nil && s.symmetric() {
			// Exactly symmetric data have alpha_k = 0 exactly; Lanczos
			// leaves rounding noise there.
			zeroAlphas(rec)
		}
		return rec, err
	})
}

func (s *DiscreteSource) lanczos(n int, prec uint, dx, dc []*big.Rat) (*Recurrence, error) {
	M := len(s.Data.X)
	w := prec + 64 + 2*uint(bits.Len(uint(M)))
	x := make([]*big.Float, M)
	c := make([]*big.Float, M)
	for i := 0; i < M; i++ {
		xv, cv := s.Data.X[i], s.Data.Mass[i]
		if dx != nil && dx[i] != nil {
			xv = new(big.Rat).Add(xv, dx[i])
		}
		if dc != nil && dc[i] != nil {
			cv = new(big.Rat).Add(cv, dc[i])
		}
		x[i] = new(big.Float).SetPrec(w).SetRat(xv)
		c[i] = new(big.Float).SetPrec(w).SetRat(cv)
	}
	rec, err := Lanczos(context.Background(), x, c, n, w)
	if err != nil {
		return nil, err
	}
	return roundRecurrence(rec, prec), nil
}

// SupportedDigits is precision.MaxDigits for exact data; otherwise the
// data carry D0 = Data.Digits digits, every decimal point and mass is taken
// as known to half a unit in its D0-th significant digit (or in its last
// written place, if finer), and the n-point rule is recomputed from data perturbed by that much
// in the three sign patterns of MomentSource.SupportedDigits, with the same
// rule for D.
func (s *DiscreteSource) SupportedDigits(ctx context.Context, n int) (int, error) {
	if n > s.MaxLen() {
		return 0, fmt.Errorf("--measure %s: %d distinct points allow a Gauss rule of at most %d points, not %d", s.Data.Name, s.MaxLen(), s.MaxLen(), n)
	}
	if s.Data.Exact {
		return precision.MaxDigits, nil
	}
	cap := s.Data.Digits
	prec := precision.WorkingPrec(cap+8, n)
	base, err := s.Recurrence(n, prec)
	if err != nil {
		return 0, err
	}
	M := s.MaxLen()
	var trials []*Recurrence
	for _, pat := range signPatterns(2 * M) {
		dx := make([]*big.Rat, M)
		dc := make([]*big.Rat, M)
		for i := 0; i < M; i++ {
			if u := finerULP(s.Data.X[i], s.Data.XULP[i], cap); u != nil {
				dx[i] = new(big.Rat).Mul(u, big.NewRat(int64(pat[2*i]), 2))
			}
			if u := finerULP(s.Data.Mass[i], s.Data.MassULP[i], cap); u != nil {
				dc[i] = new(big.Rat).Mul(u, big.NewRat(int64(pat[2*i+1]), 2))
				if new(big.Rat).Add(s.Data.Mass[i], dc[i]).Sign() <= 0 {
					dc[i] = nil // a mass known to less than its own size stays as written
				}
			}
		}
		rec, err := s.lanczos(n, prec, dx, dc)
		if err != nil {
			return 0, err
		}
		trials = append(trials, rec)
	}
	kept, err := perturbedDigits(ctx, base, trials, n, prec, cap)
	if err == nil {
		s.loss.record(cap, kept, n)
	}
	return kept, err
}

// VerifyRule verifies with VerifyPrinted when the measure fixes maxDeg
// pairs, else with VerifyPrintedProducts.
func (s *DiscreteSource) VerifyRule(ctx context.Context, nodes, weights []string, maxDeg int) (Exactness, error) {
	return verifyWithin(ctx, s, nodes, weights, maxDeg)
}

// finerULP is the finer of ulp and one unit in the D0-th significant
// digit of v (|v| 10^(1-D0), within a factor of ten); nil for exact values
// and zero.
func finerULP(v, ulp *big.Rat, D0 int) *big.Rat {
	if ulp == nil || v.Sign() == 0 {
		return nil
	}
	rel := new(big.Rat).Abs(v)
	rel.Quo(rel, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(D0-1)), nil)))
	if rel.Cmp(ulp) < 0 {
		return rel
	}
	return ulp
}

// symmetric reports whether the data are exactly symmetric about 0: the
// point -x with the same mass for every point x.
func (s *DiscreteSource) symmetric() bool {
	x, c := s.Data.X, s.Data.Mass
	for i, j := 0, len(x)-1; i <= j; i, j = i+1, j-1 {
		if new(big.Rat).Add(x[i], x[j]).Sign() != 0 || c[i].Cmp(c[j]) != 0 {
			return false
		}
	}
	return true
}
