package design

import (
	"context"
	"math"
	"math/big"
	"math/rand/v2"

	"quadwright/precision"
)

// InputDigits is what a measure given to finitely many digits (a decimal
// moment list or discrete measure) vouches for in its Points-point Gauss
// rule, by two measures of the same loss:
//
//   - Bound is the figure that limits --digits (SupportedDigits), found as
//     BoundMethod says: "first-order worst case" (moment lists of at most
//     firstOrderPairs pairs: the largest linearised change over every
//     perturbation within half a unit of the last digit) or "three sign
//     patterns, less a digit" (longer lists and discrete measures).
//   - Measured is floor(-log10(2 Spread)), Spread the largest relative
//     change of a node or weight over Draws rebuilds from data moved by
//     amounts drawn uniformly within half a unit in their last digit
//     (seeded, so the figure is reproducible): the same rule as the
//     first-order bound, applied to the draws. Both at most Carried.
//
// The gap between them shows how pessimistic the bound is for these data.
type InputDigits struct {
	Carried     int     `json:"carried"`
	Points      int     `json:"points"`
	Bound       int     `json:"bound"`
	BoundMethod string  `json:"bound_method"`
	Measured    int     `json:"measured"`
	Spread      float64 `json:"spread"`
	Draws       int     `json:"draws"`
	Seed        uint64  `json:"seed"`
}

// The two ways SupportedDigits finds its bound (InputDigits.BoundMethod).
const (
	boundFirstOrder   = "first-order worst case"
	boundSignPatterns = "three sign patterns, less a digit"
)

// Draws and seed of the measured estimate. Eight draws put the spread
// within a small factor of its typical size (common practice for such
// Monte Carlo error estimates); the seed only makes the figure repeatable.
const (
	MeasuredDraws        = 8
	MeasuredSeed  uint64 = 1
)

// InputDescriber is implemented by sources whose input carries finitely
// many digits; DescribeInput returns nil when the input is exact or no
// digit limit has been computed yet (SupportedDigits sets the rule size).
type InputDescriber interface {
	DescribeInput(ctx context.Context) (*InputDigits, error)
}

// ExactInput is implemented by sources that can say whether every value of
// their input was written exactly; --digits auto then gives AutoDigits.
type ExactInput interface {
	ExactlyKnown() bool
}

// exactlyKnown reports whether src is an ExactInput whose input is exact.
func exactlyKnown(src RecurrenceSource) bool {
	e, ok := src.(ExactInput)
	return ok && e.ExactlyKnown()
}

// DescribeInput attaches m's InputDigits to r when m is an InputDescriber.
func DescribeInput(ctx context.Context, m Measure, r *Rule) error {
	d, ok := m.(InputDescriber)
	if !ok {
		return nil
	}
	in, err := d.DescribeInput(ctx)
	if err != nil {
		return err
	}
	r.Input = in
	return nil
}

// measureSpread rebuilds the n-point rule from MeasuredDraws perturbed
// recurrences (perturb draws one, with uniform deviates from rng) and
// fills in the measured fields of in. A draw whose data fit no positive
// measure gives Spread +Inf and Measured 0.
func measureSpread(ctx context.Context, in *InputDigits, base *Recurrence, prec uint, perturb func(rng *rand.Rand) (*Recurrence, error)) error {
	rng := rand.New(rand.NewPCG(MeasuredSeed, 0x9e3779b97f4a7c15))
	in.Draws, in.Seed = MeasuredDraws, MeasuredSeed
	var trials []*Recurrence
	for i := 0; i < MeasuredDraws; i++ {
		rec, err := perturb(rng)
		if err != nil {
			in.Spread, in.Measured = math.Inf(1), 0
			return nil
		}
		trials = append(trials, rec)
	}
	worst, ok, err := worstChange(ctx, base, trials, in.Points, prec)
	if err != nil {
		return err
	}
	if !ok {
		in.Spread, in.Measured = math.Inf(1), 0
		return nil
	}
	in.Spread, _ = worst.Float64()
	worst.Mul(worst, big.NewFloat(2))
	in.Measured = max(0, min(digitsOfChange(worst), in.Carried))
	return nil
}

// uniformHalf returns u times a deviate drawn uniformly from [-1/2, 1/2]
// (on a grid of 2^32 steps), or nil for u nil.
func uniformHalf(rng *rand.Rand, u *big.Rat) *big.Rat {
	if u == nil {
		return nil
	}
	r := big.NewRat(rng.Int64N(1<<32+1)-1<<31, 1<<32)
	return r.Mul(r, u)
}

// DescribeInput measures the spread of the rule SupportedDigits last
// limited (see InputDigits); nil for exact moments.
func (s *MomentSource) DescribeInput(ctx context.Context) (*InputDigits, error) {
	given, kept, n, set := s.loss.get()
	if !set {
		return nil, nil
	}
	in := &InputDigits{Carried: given, Points: n, Bound: kept, BoundMethod: boundSignPatterns}
	if n <= firstOrderPairs {
		in.BoundMethod = boundFirstOrder
	}
	prec := precision.WorkingPrec(given+8, n)
	base, err := s.Recurrence(n, prec)
	if err != nil {
		return nil, err
	}
	err = measureSpread(ctx, in, base, prec, func(rng *rand.Rand) (*Recurrence, error) {
		delta := make([]*big.Rat, 2*n)
		for k := range delta {
			delta[k] = uniformHalf(rng, knownTo(s.List.Values[k], s.List.ULP[k], given))
		}
		return s.pairs(n, prec, delta)
	})
	return in, err
}

// DescribeInput measures the spread of the rule SupportedDigits last
// limited (see InputDigits); nil for exact data. A mass drawn to zero or
// below stays as written.
func (s *DiscreteSource) DescribeInput(ctx context.Context) (*InputDigits, error) {
	given, kept, n, set := s.loss.get()
	if !set {
		return nil, nil
	}
	in := &InputDigits{Carried: given, Points: n, Bound: kept, BoundMethod: boundSignPatterns}
	prec := precision.WorkingPrec(given+8, n)
	base, err := s.Recurrence(n, prec)
	if err != nil {
		return nil, err
	}
	M := s.MaxLen()
	err = measureSpread(ctx, in, base, prec, func(rng *rand.Rand) (*Recurrence, error) {
		dx := make([]*big.Rat, M)
		dc := make([]*big.Rat, M)
		for i := 0; i < M; i++ {
			dx[i] = uniformHalf(rng, finerULP(s.Data.X[i], s.Data.XULP[i], given))
			dc[i] = uniformHalf(rng, finerULP(s.Data.Mass[i], s.Data.MassULP[i], given))
			if dc[i] != nil && new(big.Rat).Add(s.Data.Mass[i], dc[i]).Sign() <= 0 {
				dc[i] = nil
			}
		}
		return s.lanczos(n, prec, dx, dc)
	})
	return in, err
}
