package element

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"quadwright/moments"
	"quadwright/precision"
)

// MaxWeightedDegree is the largest degree Weighted accepts: 60 on the
// line, 30 on the 2-D shapes, 12 on the 3-D ones (C(D+dim, dim) moment
// equations, solved densely: 496 on a 2-D element at degree 30, 455 on a
// 3-D one at degree 12).
func MaxWeightedDegree(s Shape) int {
	return [...]int{60, 30, 30, 12, 12, 12, 12}[s.check()]
}

// MaxWeightedDigits is the most digits Weighted prints: its second
// precision asks the 1-D rules of the product for about 40 more, and those
// are built to at most precision.MaxDigits.
const MaxWeightedDigits = 900

func checkWeighted(req Request) error {
	if req.Weight != "" && req.Moments != nil {
		return fmt.Errorf("--weight and --moments both give the weight: choose one")
	}
	if req.Product || req.Lobatto {
		return fmt.Errorf("--product and --lobatto build rules for weight 1; leave them out with --weight or --moments")
	}
	if req.Degree < 0 || req.Degree > MaxWeightedDegree(req.Shape) {
		return fmt.Errorf("--degree %d: weighted rules on the %s are built for degrees 0 to %d", req.Degree, req.Shape, MaxWeightedDegree(req.Shape))
	}
	if req.Digits < 0 || req.Digits > MaxWeightedDigits {
		return fmt.Errorf("--digits %d: weighted element rules are built with 1 to %d digits", req.Digits, MaxWeightedDigits)
	}
	if req.Moments != nil && req.Moments.Dim != req.Shape.Dim() {
		return fmt.Errorf("--moments %s: lines with %d exponents, but the %s needs %d", req.Moments.Name, req.Moments.Dim, req.Shape, req.Shape.Dim())
	}
	return nil
}

// Weighted builds a rule for the integral of w p over the element s, exact
// for every polynomial p of total degree <= req.Degree, with positive
// weights, nodes in the open element and every printed digit confirmed and
// verified. The weight is an expression (req.Weight) or a moment table
// (req.Moments).
//
// The route:
//
//  1. Moments against the box basis (Legendre products on the bounding
//     box, boxBasis) at extended precision: for an expression, from
//     product rules of increasing order with the weight sampled at their
//     nodes until two orders agree (weightMoments; a polynomial weight of
//     low degree is exact at the first); for a table, exactly from its
//     monomial moments.
//  2. A positive rule with at most C(D+dim, dim) points by Tchakaloff
//     subsampling: nonnegative least squares (Lawson-Hanson, nnls) on the
//     nodes of a product rule, in the basis made orthonormal for that
//     discrete measure by a float64 QR factorisation (A. Sommariva and M.
//     Vianello, Numer. Funct. Anal. Optim. 36, 2015). With an expression,
//     the product rule times the sampled weight is itself a positive
//     solution for its own moments, so the subsample starts as close to
//     the weight's moments as that product rule integrates them.
//  3. Point elimination (eliminate, after Xiao and Gimbutas 2010): points
//     are removed (in batches, then one at a time) while the others can
//     still solve the moment equations with positive weights and interior
//     nodes, at 128 bits and within a fixed budget of work.
//  4. Gauss-Newton with minimum-norm steps on the moment equations
//     (momentSystem.solve) at a working precision p1 and again at p2 >
//     p1, the moments recomputed at p2; every printed value of the second
//     must be confirmed by the first (design.ConfirmPrinted).
//  5. The printed rule is read back exactly and tested on every monomial
//     through the degree against the weight's monomial moments
//     (VerifyAgainst, the contract's tolerance); anything less is an
//     error.
//
// For a table of decimal moments carrying D0 digits, the digits asked may
// not exceed what the moments support (the smaller of D0 and the digits
// that survive a perturbation of every moment by half a unit in its last
// place, estimated to first order); the error gives both numbers.
func Weighted(ctx context.Context, req Request) (*Rule, error) {
	if err := checkRequest(req); err != nil {
		return nil, err
	}
	s, deg := req.Shape, req.Degree
	base := req.Digits
	if base == 0 {
		base = 17
	}
	bb := newBoxBasis(s, deg)
	M := bb.size()
	r := &Rule{Shape: s, Kind: "weighted", Digits: req.Digits, Requested: deg}
	var w *moments.Expr
	var tableMono []*big.Rat
	d0 := 0
	if req.Weight != "" {
		var err error
		if w, err = ParseWeight(req.Weight, s); err != nil {
			return nil, err
		}
		if err := checkWeightSign(ctx, s, w); err != nil {
			return nil, err
		}
		r.Weight = req.Weight
	} else {
		var err error
		if tableMono, d0, err = req.Moments.Needed(deg); err != nil {
			return nil, err
		}
		if d0 > 0 && base > d0 {
			return nil, digitsError(req, d0)
		}
		r.Weight = "moments(" + req.Moments.Name + ")"
		r.MomentFile = req.Moments.Name
	}
	r.Method = "Tchakaloff subsampling of a product rule (Lawson-Hanson NNLS), point elimination (Xiao-Gimbutas), then Gauss-Newton on the moment equations at extended precision"

	// Candidates: a product rule with at least 3M nodes and deg+2 per
	// direction, so that no polynomial of degree <= deg vanishes at all of
	// them (deg+1 Gauss points would be the zeros of one).
	nc := max(deg+2, int(math.Ceil(math.Pow(float64(3*M), 1/float64(s.Dim())))))
	candidates := func(n int) (*discreteWeight, error) {
		if w != nil {
			return sampleWeight(ctx, s, w, n, 20)
		}
		pr, prec, err := productNodes(ctx, s, n, 20)
		if err != nil {
			return nil, err
		}
		return &discreteWeight{pts: pr.pts, lambda: pr.wts, prec: prec}, nil
	}
	cand, err := candidates(nc)
	if err != nil {
		return nil, err
	}
	target := (M+s.Dim())/(s.Dim()+1) + s.Dim() + 1
	Q, C, cond, err := orthonormalize(cand, bb)
	if err != nil {
		return nil, fmt.Errorf("%s on the %s: %v", r.Weight, s, err)
	}
	guard := 10 + int(math.Ceil(math.Log10(cond)))

	for try := 0; try < 2; try, guard = try+1, guard+16 {
		d1 := base + guard
		prec1 := precision.DigitsToBits(d1) + 32
		mu1, _, order, err := stageMoments(ctx, s, w, tableMono, bb, d1, base+guard-4, prec1, 0)
		if err != nil {
			return nil, err
		}
		ms := &momentSystem{s: s, bb: bb, C: C, mu: mu1}
		start, bn := ms.subsample(Q, cand, prec1)
		if len(start.x) == 0 {
			return nil, fmt.Errorf("%s on the %s: no positive rule was found for its moments (are they the moments of a weight >= 0?)", r.Weight, s)
		}
		tolLog2 := func(digits int) float64 { return math.Log2(bn) - float64(digits)*math.Log2(10) }
		start = ms.thin(ctx, start, bn, prec1)
		// As for SolveRegion: elimination from one candidate rule can
		// stall above what the equations allow, and a product rule of
		// another order gives another start (on the first try only).
		for k := 1; try == 0 && k < 3 && len(start.x) > target; k++ {
			cand2, err := candidates(nc + k)
			if err != nil {
				break
			}
			Q2, C2, _, err := orthonormalize(cand2, bb)
			if err != nil {
				continue
			}
			ms2 := &momentSystem{s: s, bb: bb, C: C2, mu: mu1}
			s2, bn2 := ms2.subsample(Q2, cand2, prec1)
			if len(s2.x) == 0 {
				continue
			}
			if s2 = ms2.thin(ctx, s2, bn2, prec1); len(s2.x) < len(start.x) {
				start, bn, C, ms, Q, cand = s2, bn2, C2, ms2, Q2, cand2
			}
		}
		maxIter := 40 + base/5
		r1, _, err := ms.solve(ctx, start, prec1, tolLog2(base+guard/2), maxIter)
		if err != nil {
			return nil, fmt.Errorf("%s on the %s, degree %d: no rule with positive weights and interior nodes found: %v", r.Weight, s, deg, err)
		}
		if d0 > 0 {
			sup := ms.supportedDigits(r1, bb, req.Moments.lastPlaces(deg), d0)
			if base > sup {
				return nil, digitsError(req, sup)
			}
		}
		d2 := d1 + 24
		prec2 := precision.DigitsToBits(d2) + 32
		mu2, mono2, _, err := stageMoments(ctx, s, w, tableMono, bb, d2, 0, prec2, order)
		if err != nil {
			return nil, err
		}
		ms2 := &momentSystem{s: s, bb: bb, C: C, mu: mu2}
		r2, _, err := ms2.solve(ctx, r1.at(prec2), prec2, tolLog2(base+guard), maxIter)
		if err != nil {
			return nil, fmt.Errorf("%s on the %s, degree %d: the rule could not be confirmed at higher precision: %v", r.Weight, s, deg, err)
		}
		snapZeros(r1, r2, base+guard/2)
		nodes, weights, ok := confirmWeighted(r1, r2, req.Digits, prec2)
		if !ok {
			continue
		}
		r.Nodes, r.Weights = nodes, weights
		r.WorkingPrec, r.CheckPrec = prec1, prec2
		var integral Integral
		var slack *big.Rat
		if w != nil {
			// The computed moments are known to the agreement of the
			// sampling orders, 10^-(base+guard-4) of the mass.
			integral = floatIntegral(bb, mono2)
			slack, _ = new(big.Float).Mul(mu2[0], pow10Float(-(base+guard-4), prec2)).Rat(nil)
		} else {
			integral = tableIntegral(bb, tableMono)
		}
		return finishWeighted(ctx, r, base, integral, slack)
	}
	return nil, fmt.Errorf("%s on the %s, degree %d: the rule could not be confirmed to %d digits by a second computation at higher precision", r.Weight, s, deg, base)
}

func digitsError(req Request, sup int) error {
	if req.Digits == 0 {
		return fmt.Errorf("float64 mode needs 17 correct digits to fix the nearest double, but the moments in %s support only %d for a degree-%d rule on the %s; ask for --digits %d or fewer", req.Moments.Name, sup, req.Degree, req.Shape, max(sup, 1))
	}
	return fmt.Errorf("--digits %d: the moments in %s support only %d correct digits for a degree-%d rule on the %s", req.Digits, req.Moments.Name, sup, req.Degree, req.Shape)
}

// stageMoments returns the basis moments at prec bits and the monomial
// moments (nil for a table, whose own are exact): for an expression with
// order 0 by weightMoments (agreeing to agree digits), else from the
// product rule of that order sampled at digits digits.
func stageMoments(ctx context.Context, s Shape, w *moments.Expr, table []*big.Rat, bb *boxBasis, digits, agree int, prec uint, order int) (phi, mono []*big.Float, n int, err error) {
	if w == nil {
		exact := bb.fromMonomials(table)
		phi = make([]*big.Float, len(exact))
		for j, v := range exact {
			phi[j] = new(big.Float).SetPrec(prec).SetRat(v)
		}
		if phi[0].Sign() <= 0 {
			return nil, nil, 0, fmt.Errorf("the moment of x^0 (the mass) must be positive")
		}
		return phi, nil, 0, nil
	}
	if order == 0 {
		return weightMoments(ctx, s, w, bb, digits, agree, prec)
	}
	dw, err := sampleWeight(ctx, s, w, order, digits)
	if err != nil {
		return nil, nil, 0, err
	}
	phi, mono, err = discreteMoments(ctx, dw, bb, prec)
	return phi, mono, order, err
}
