package stability

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"quadwright/design/element"
	"quadwright/precision"
)

// Accuracy is what the residuals by degree say about the accuracy of the
// printed values, in a sentence a user reads ("nodes and weights good to
// about 11 digits; at that accuracy the rule reaches degree 15").
type Accuracy struct {
	// Degree is K, the last degree at or above the verified one after which
	// the residual jumps by at least JumpFactor over all those before it:
	// below it the residuals are rounding, above it the rule is not exact.
	Degree int `json:"degree"`
	// Residual is the largest relative residual through degree K
	// (RelResidual), and Digits floor(-log10 Residual), the digits to which
	// the values behave as correct (0 for a residual of 1 or more; absent
	// for exact residuals).
	Residual Float `json:"residual"`
	Digits   int   `json:"digits"`
	// WithinTolerance: Residual <= 10u, the residuals are what the printed
	// digits explain and K is the verified degree.
	WithinTolerance bool   `json:"within_tolerance"`
	Text            string `json:"text"`
}

// JumpFactor is the least jump between the residuals up to K and the one at
// K+1 that impliedAccuracy reads as the end of exactness (two orders of
// magnitude, common practice: rounding moves a residual by a small
// factor, a polynomial the rule does not integrate by many orders).
const JumpFactor = 100

// impliedAccuracy reads the relative residuals of r (RelResidual, with
// Residual the shares of 10u): K is the last degree at or above r.Degree
// where residual_{K+1} exceeds max_{j<=K} residual_j by JumpFactor or more
// (the last, not the largest jump: a low degree that passes by a lucky
// cancellation makes a large jump of its own). A rule whose values
// carry errors of 1e-11 has residuals near 1e-11 through its design degree
// and of order one after it, whatever the tolerance its printed digits set;
// the residual through K then says to how many digits the values behave as
// correct, and K is the degree the rule reaches at that accuracy (at the
// tolerance 10u' = that residual, every degree through K passes and K+1
// fails). It returns nil when fewer than one degree was tested or no
// residual is known.
func impliedAccuracy(r *Report) *Accuracy {
	// No N-point rule integrates the square of its node polynomial
	// (capAtNodePolynomial), so K stays at most 2N-1 unless the measure
	// itself has so few points that the verified degree goes beyond.
	bound := -1
	if r.Degree <= 2*r.Points-1 {
		bound = 2*r.Points - 1
	}
	return accuracyOf(r.RelResidual, r.Residual, r.Degree, bound, r.Digits)
}

// accuracyOf is impliedAccuracy on residuals res[j] and their shares of
// the tolerance share[j] by degree j, for a rule of verified degree that
// cannot pass beyond bound (-1: no bound known), printed to digits digits.
func accuracyOf(res, share []Float, degree, bound, digits int) *Accuracy {
	if len(res) == 0 || len(res) != len(share) {
		return nil
	}
	from := max(degree, 0)
	last := len(res) - 1
	if bound >= 0 {
		last = min(last, bound)
	}
	best := -1
	upTo := 0.0
	for j := 0; j <= last && j < len(res)-1; j++ {
		upTo = math.Max(upTo, float64(res[j]))
		if j < from {
			continue
		}
		next := float64(res[j+1])
		var gap float64
		switch {
		case next == 0 || math.IsNaN(next):
			continue
		case upTo == 0:
			gap = math.Inf(1)
		default:
			gap = next / upTo
		}
		if gap >= JumpFactor {
			best = j
		}
	}
	if best < 0 {
		if degree < last {
			return nil // no clear end of exactness among the degrees tested
		}
		best = last
	}
	a := &Accuracy{Degree: best}
	worst, most := 0.0, 0.0
	for j := 0; j <= best; j++ {
		worst = math.Max(worst, float64(res[j]))
		most = math.Max(most, float64(share[j]))
	}
	a.Residual, a.WithinTolerance = Float(worst), most <= 1
	switch {
	case worst == 0:
		a.Text = fmt.Sprintf("the residuals through degree %d are zero: the values are exact for it", best)
	case a.WithinTolerance:
		a.Digits = digitsOf(worst)
		a.Text = fmt.Sprintf("the residuals through degree %d reach %.1e, within what the %d digits of the values explain", best, worst, digits)
	default:
		a.Digits = digitsOf(worst)
		a.Text = fmt.Sprintf("the residuals through degree %d reach %.1e: the nodes and weights are good to about %d digits, not the %d they are printed to; at that accuracy the rule reaches degree %d", best, worst, a.Digits, digits, best)
	}
	return a
}

func digitsOf(residual float64) int {
	return max(0, int(math.Floor(-math.Log10(residual))))
}

// elementAccuracy is impliedAccuracy for an element rule: the residuals by
// total degree (element.DegreeResiduals, at the bits the exactness test
// used) through the degree tested, bounded by the degree the point count
// allows. It returns the residuals by degree beside it: relative to their
// scale, and as shares of their tolerance.
func elementAccuracy(ctx context.Context, s element.Shape, xs [][]*big.Rat, ws []*big.Rat, u, slack *big.Rat, ex element.Exactness, integral element.Integral, bound int) (a *Accuracy, rel, share []Float, err error) {
	prec := precision.DigitsToBits(ex.Digits) + 64
	if uBits := u.Denom().BitLen() - u.Num().BitLen() + 1; uBits > 0 {
		prec = max(prec, uint(uBits)+64)
	}
	r64, s64, err := element.DegreeResiduals(ctx, s, xs, ws, u, slack, ex.Tested, prec, integral)
	if err != nil {
		return nil, nil, nil, err
	}
	rel, share = make([]Float, len(r64)), make([]Float, len(s64))
	for j := range r64 {
		rel[j], share[j] = Float(r64[j]), Float(s64[j])
	}
	return accuracyOf(rel, share, ex.Degree, bound, ex.Digits), rel, share, nil
}
