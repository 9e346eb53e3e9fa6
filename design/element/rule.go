package element

import (
	"context"
	"fmt"
	"math/big"

	"quadwright/precision"
)

// Request says which element rule to build.
type Request struct {
	Shape  Shape
	Degree int // total degree of exactness asked, 0..MaxDegree(Shape)
	// Digits is the number of significant decimal digits printed,
	// 1..precision.MaxDigits; 0 selects float64 mode (the nearest double
	// of every coordinate and weight).
	Digits int
	// Product asks for the product or collapsed rule even where the
	// catalogue holds a symmetric one.
	Product bool
	// Lobatto builds the tensor product from Gauss-Lobatto rules (line,
	// quadrilateral and hexahedron only); it implies Product.
	Lobatto bool
	// Weight, when not empty, is a weight expression in the element's
	// coordinates (ParseWeight): the rule is then built for the integral
	// of w p over the element (Weighted). Moments, when not nil, gives the
	// weight by its monomial moments instead. At most one of the two.
	Weight  string
	Moments *MomentTable
}

// Rule is a verified element rule with its provenance.
type Rule struct {
	Shape Shape
	// Kind is "product" (tensor product), "collapsed" (conical product)
	// or "symmetric" (fully symmetric, from the catalogue).
	Kind   string
	Method string
	// Nodes[i] holds the Shape.Dim() coordinates of node i and Weights[i]
	// its weight, printed: Digits significant digits each with an error
	// below one unit in the last place, or in float64 mode (Digits == 0)
	// the double nearest to the true value in shortest round-trip form.
	Nodes   [][]string
	Weights []string
	Digits  int
	// Requested is the degree asked; Degree the degree of exactness
	// verified on the printed values (Exactness.Degree), never less than
	// Requested.
	Requested int
	Degree    int
	Exactness Exactness
	// WorkingPrec and CheckPrec are the bits of the two computations whose
	// agreement confirmed every printed digit.
	WorkingPrec, CheckPrec uint
	// Factors is the number of 1-D points in each direction (product and
	// collapsed rules).
	Factors []int
	// Weight is the weight expression of a weighted rule ("" for weight 1);
	// MomentFile names the moment table it was built from, if any.
	Weight     string
	MomentFile string
	// Published is the point count of the best published fully symmetric
	// rule of this degree with positive weights and interior points (0 when
	// unknown); set for symmetric rules.
	Published int
}

// Points is the number of nodes.
func (r *Rule) Points() int { return len(r.Nodes) }

// MaxDegree is the largest degree that Build accepts for the shape:
// 999 on the line, 99 on the 2-D shapes, 30 on the 3-D ones. The bound
// keeps the monomial test (C(D+dim, dim) monomials over about
// ((D+1)/2)^dim points) within seconds.
func MaxDegree(s Shape) int {
	switch s.Dim() {
	case 1:
		return 999
	case 2:
		return 99
	}
	return 30
}

// checkRequest validates the user-facing fields of req.
func checkRequest(req Request) error {
	req.Shape.check()
	if req.Degree < 0 || req.Degree > MaxDegree(req.Shape) {
		return fmt.Errorf("--degree %d: the degree on the %s must be between 0 and %d", req.Degree, req.Shape, MaxDegree(req.Shape))
	}
	if req.Digits < 0 || req.Digits > precision.MaxDigits {
		return fmt.Errorf("--digits %d: the digits must be between 1 and %d", req.Digits, precision.MaxDigits)
	}
	if req.Weight != "" || req.Moments != nil {
		return checkWeighted(req)
	}
	if req.Lobatto && req.Shape != Line && req.Shape != Quadrilateral && req.Shape != Hexahedron {
		return fmt.Errorf("--lobatto: Gauss-Lobatto products exist for the line, quadrilateral and hexahedron, not the %s", req.Shape)
	}
	return nil
}

// Build returns the rule asked: the catalogued symmetric rule of the
// degree when there is one and neither Product nor Lobatto is set (see
// Symmetric), else the product or collapsed rule (Product); with a Weight
// or Moments, the weighted rule (Weighted).
func Build(ctx context.Context, req Request) (*Rule, error) {
	if err := checkRequest(req); err != nil {
		return nil, err
	}
	if req.Weight != "" || req.Moments != nil {
		return Weighted(ctx, req)
	}
	if !req.Product && !req.Lobatto {
		if r, ok, err := Symmetric(ctx, req); ok || err != nil {
			return r, err
		}
	}
	return Product(ctx, req)
}

// finish verifies a printed rule: positive weights, nodes inside (in the
// open element when strict, else in the closed one), and exactness through
// at least the requested degree (tested to maxDeg).
func finish(ctx context.Context, r *Rule, maxDeg int, strict bool) (*Rule, error) {
	for i, w := range r.Weights {
		v, err := precision.ParseExact(w)
		if err != nil || v.Sign() <= 0 {
			return nil, fmt.Errorf("the %s rule of degree %d has a weight that is not positive (weight %d = %s)", r.Shape, r.Requested, i+1, w)
		}
		p := make([]*big.Rat, len(r.Nodes[i]))
		for k, c := range r.Nodes[i] {
			if p[k], err = precision.ParseExact(c); err != nil {
				return nil, fmt.Errorf("node %d coordinate %q: not a decimal number", i+1, c)
			}
		}
		if !r.Shape.Contains(p, strict) {
			return nil, fmt.Errorf("the %s rule of degree %d has node %d %v outside the element", r.Shape, r.Requested, i+1, r.Nodes[i])
		}
	}
	minDigits := r.Digits
	if minDigits == 0 {
		minDigits = 17
	}
	ex, err := VerifyPrinted(ctx, r.Shape, r.Nodes, r.Weights, minDigits, maxDeg)
	if err != nil {
		return nil, err
	}
	if ex.Degree < r.Requested {
		return nil, fmt.Errorf("the printed %s rule for degree %d could not be verified: it integrates monomials only through degree %d", r.Shape, r.Requested, ex.Degree)
	}
	r.Exactness = ex
	r.Degree = ex.Degree
	return r, nil
}
