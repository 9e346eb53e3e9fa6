package element

import (
	"context"
	"fmt"
	"math/big"
	"strings"
	"sync"

	"quadwright/moments"
	"quadwright/precision"
)

// ParseWeight parses a weight expression in the coordinates of the
// element: x on the line, x and y on the triangle and quadrilateral, x, y
// and z on the 3-D shapes (a name beyond them is an error giving its
// position, as moments.ParseExpr reports it).
func ParseWeight(src string, s Shape) (*moments.Expr, error) {
	return moments.ParseExpr(src, []string{"x", "y", "z"}[:s.Dim()]...)
}

// productNodes returns the n-points-per-direction product or collapsed rule
// of s (Product's construction, exact for total degree 2n-1 against weight
// 1) with nodes and weights accurate to about digits digits, at its
// working precision.
func productNodes(ctx context.Context, s Shape, n, digits int) (*assembled, uint, error) {
	fs, _, _, _, _ := plan(s, 2*n-1, false)
	return assemble(ctx, s, fs, n, digits)
}

// discreteWeight is the product rule with the weight folded in: the
// positive discrete measure lambda_i = W_i w(X_i) at the nodes X_i.
type discreteWeight struct {
	pts    [][]*big.Float
	lambda []*big.Float
	prec   uint
}

// sampleWeight evaluates w at every node of the n-point product rule
// (accurate to digits digits) and returns the discrete measure. A weight
// that cannot be evaluated, is negative at a node, or vanishes at every
// node is an error naming the expression and the point.
func sampleWeight(ctx context.Context, s Shape, w *moments.Expr, n, digits int) (*discreteWeight, error) {
	pr, prec, err := productNodes(ctx, s, n, digits)
	if err != nil {
		return nil, err
	}
	dw := &discreteWeight{pts: pr.pts, lambda: make([]*big.Float, len(pr.pts)), prec: prec}
	positive := false
	for i, x := range pr.pts {
		if i%64 == 0 {
			if err := ctx.Err(); err != nil {
				return nil, err
			}
		}
		v, err := w.EvalBig(prec, x...)
		if err != nil {
			return nil, fmt.Errorf("--weight %q cannot be evaluated at %s inside the %s (%v)", w.String(), pointString(x), s, err)
		}
		if v.Sign() < 0 {
			return nil, fmt.Errorf("--weight %q is negative at %s inside the %s; a weight must be >= 0 on the element", w.String(), pointString(x), s)
		}
		positive = positive || v.Sign() > 0
		// EvalBig may hand back one of its arguments (w = x): never write to v.
		dw.lambda[i] = new(big.Float).SetPrec(prec).Mul(v, pr.wts[i])
	}
	if !positive {
		return nil, fmt.Errorf("--weight %q vanishes at every sample point of the %s; it has no mass to integrate against", w.String(), s)
	}
	return dw, nil
}

func pointString(x []*big.Float) string {
	names := "xyz"
	parts := make([]string, len(x))
	for k, v := range x {
		parts[k] = fmt.Sprintf("%c = %.6g", names[k], v)
	}
	return "(" + strings.Join(parts, ", ") + ")"
}

// momentChunks fixes how sums over points are split among goroutines, so
// that the rounding of every moment is the same on any number of cores.
const momentChunks = 8

// discreteMoments returns, at prec bits, the basis moments
// sum_i lambda_i phi_j(X_i) and the monomial moments sum_i lambda_i X_i^e
// (both in the order of bb.exps) of the discrete measure.
func discreteMoments(ctx context.Context, dw *discreteWeight, bb *boxBasis, prec uint) (phi, mono []*big.Float, err error) {
	M := bb.size()
	n := len(dw.pts)
	sumsP := make([][]*precision.Real, momentChunks)
	sumsM := make([][]*precision.Real, momentChunks)
	errs := make([]error, momentChunks)
	var wg sync.WaitGroup
	for c := 0; c < momentChunks; c++ {
		sumsP[c] = precision.NewRealSlice(M, prec)
		sumsM[c] = precision.NewRealSlice(M, prec)
		wg.Add(1)
		go func(c int) {
			defer wg.Done()
			re := bb.newRealEval(prec)
			dim := bb.shape.Dim()
			x := precision.NewRealSlice(dim, prec)
			val := precision.NewRealSlice(M, prec)
			pw := make([][]*precision.Real, dim)
			for k := range pw {
				pw[k] = precision.NewRealSlice(bb.deg+1, prec)
			}
			lam, t := precision.NewReal(prec), precision.NewReal(prec)
			for i := c * n / momentChunks; i < (c+1)*n/momentChunks; i++ {
				if i%64 == 0 {
					if e := ctx.Err(); e != nil {
						errs[c] = e
						return
					}
				}
				for k := 0; k < dim; k++ {
					x[k].SetBig(dw.pts[i][k])
					pw[k][0].SetInt64(1)
					for e := 1; e <= bb.deg; e++ {
						pw[k][e].Mul(pw[k][e-1], x[k])
					}
				}
				lam.SetBig(dw.lambda[i])
				re.eval(x, val)
				for j, e := range bb.exps {
					sumsP[c][j].MulAdd(lam, val[j], sumsP[c][j])
					t.Set(pw[0][e[0]])
					for k := 1; k < dim; k++ {
						t.Mul(t, pw[k][e[k]])
					}
					sumsM[c][j].MulAdd(lam, t, sumsM[c][j])
				}
			}
		}(c)
	}
	wg.Wait()
	for _, e := range errs {
		if e != nil {
			return nil, nil, e
		}
	}
	phi, mono = make([]*big.Float, M), make([]*big.Float, M)
	for j := 0; j < M; j++ {
		for c := 1; c < momentChunks; c++ {
			sumsP[0][j].Add(sumsP[0][j], sumsP[c][j])
			sumsM[0][j].Add(sumsM[0][j], sumsM[c][j])
		}
		phi[j] = sumsP[0][j].Big(new(big.Float).SetPrec(prec))
		mono[j] = sumsM[0][j].Big(new(big.Float).SetPrec(prec))
	}
	return phi, mono, nil
}

// maxSampleOrder bounds the points per direction of the product rules
// that weightMoments tries (about 65 000 points on every shape but the
// line).
func maxSampleOrder(s Shape) int {
	return [...]int{512, 256, 256, 40, 40, 40, 40}[s.check()]
}

// weightMoments computes the moments of w against bb at prec bits by the
// product rules of s with n, n + n/2, ... points per direction (n
// starting at ceil((deg+1)/2) + 1, so that a polynomial weight of degree
// <= 3 is integrated exactly by the first), each with w sampled at its
// nodes, until two successive orders agree on every basis moment within
// 10^-agree times the mass. It returns the later order's moments and that
// order. Weights with a singularity or a kink converge slowly or not at
// all; past maxSampleOrder that is an error suggesting a moment table.
func weightMoments(ctx context.Context, s Shape, w *moments.Expr, bb *boxBasis, digits, agree int, prec uint) (phi, mono []*big.Float, order int, err error) {
	n := (bb.deg+2)/2 + 1
	var prev []*big.Float
	lim := new(big.Float).SetPrec(prec)
	diff := new(big.Float).SetPrec(prec)
	for {
		dw, err := sampleWeight(ctx, s, w, n, digits)
		if err != nil {
			return nil, nil, 0, err
		}
		p, m, err := discreteMoments(ctx, dw, bb, prec)
		if err != nil {
			return nil, nil, 0, err
		}
		if prev != nil {
			// phi_0 = 1, so p[0] is the mass.
			lim.Mul(p[0], pow10Float(-agree, prec))
			ok := true
			for j := range p {
				diff.Sub(p[j], prev[j])
				if diff.Abs(diff).Cmp(lim) > 0 {
					ok = false
					break
				}
			}
			if ok {
				return p, m, n, nil
			}
		}
		next := n + max(2, n/2)
		if next > maxSampleOrder(s) {
			return nil, nil, 0, fmt.Errorf("--weight %q: its moments on the %s did not settle to %d digits with product rules of up to %d points per direction (a singular or non-smooth weight?); give its moments in a file with --moments instead", w.String(), s, agree, n)
		}
		prev, n = p, next
	}
}

// pow10Float is 10^k at prec bits.
func pow10Float(k int, prec uint) *big.Float {
	r := new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(absInt(k))), nil))
	if k < 0 {
		r.Inv(r)
	}
	return new(big.Float).SetPrec(prec).SetRat(r)
}

func absInt(k int) int {
	if k < 0 {
		return -k
	}
	return k
}

// latticeSize is the number of intervals per direction of the lattice on
// which checkWeightSign evaluates a weight.
func latticeSize(s Shape) int {
	return [...]int{400, 40, 40, 16, 16, 16, 16}[s.check()]
}

// checkWeightSign evaluates w on a lattice of the closed element (the
// points i/m of the unit cube, vertices and faces included, mapped exactly
// as the collapsed coordinates map them) at 256 bits and refuses a weight
// that is negative or cannot be evaluated at one of them, naming the point.
// A value below -2^-200 (1 + the largest |w| seen) counts as negative, so
// that a weight vanishing on the boundary, such as 1-x-y on the triangle,
// is not refused for the rounding of its zero. A value that cannot be
// formed on the boundary (a singularity such as 1/sqrt(x) or -log(x) on the
// edge x = 0) is no error here: the moments then settle slowly or not at
// all, and weightMoments says so; inside the element it is an error.
func checkWeightSign(ctx context.Context, s Shape, w *moments.Expr) error {
	const prec = 256
	m := latticeSize(s)
	dim := s.Dim()
	t := make([]*big.Rat, dim)
	idx := make([]int, dim)
	one := big.NewRat(1, 1)
	x := make([]*big.Float, dim)
	worst, largest := new(big.Float), new(big.Float)
	var worstAt []*big.Float
	for count := 0; ; count++ {
		if count%256 == 0 {
			if err := ctx.Err(); err != nil {
				return err
			}
		}
		for k := range t {
			t[k] = big.NewRat(int64(idx[k]), int64(m))
		}
		p := latticePoint(s, t, one)
		for k := range x {
			x[k] = new(big.Float).SetPrec(prec).SetRat(p[k])
		}
		v, err := w.EvalBig(prec, x...)
		// On the boundary a weight may be singular (-log(x) at x = 0);
		// inside it must have a value.
		if err != nil && s.Contains(p, true) {
			return fmt.Errorf("--weight %q cannot be evaluated at %s inside the %s (%v)", w.String(), pointString(x), s, err)
		}
		if err == nil && !v.IsInf() {
			if a := new(big.Float).Abs(v); a.Cmp(largest) > 0 {
				largest = a
			}
			if v.Cmp(worst) < 0 {
				worst = v
				worstAt = append([]*big.Float(nil), x...)
			}
		}
		k := dim - 1
		for ; k >= 0; k-- {
			idx[k]++
			if idx[k] <= m {
				break
			}
			idx[k] = 0
		}
		if k < 0 {
			break
		}
	}
	lim := new(big.Float).SetPrec(prec).Add(largest, big.NewFloat(1))
	lim.SetMantExp(lim, -200)
	if worst.Sign() < 0 && new(big.Float).Neg(worst).Cmp(lim) > 0 {
		return fmt.Errorf("--weight %q is negative at %s on the %s (%.6g); a weight must be >= 0 on the element", w.String(), pointString(worstAt), s, worst)
	}
	return nil
}

// latticePoint maps t in [0,1]^dim exactly onto the closed element.
func latticePoint(s Shape, t []*big.Rat, one *big.Rat) []*big.Rat {
	om := func(v *big.Rat) *big.Rat { return new(big.Rat).Sub(one, v) }
	sym := func(v *big.Rat) *big.Rat { // 2v - 1
		r := new(big.Rat).Add(v, v)
		return r.Sub(r, one)
	}
	mul := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Mul(a, b) }
	switch s {
	case Line:
		return []*big.Rat{sym(t[0])}
	case Quadrilateral:
		return []*big.Rat{sym(t[0]), sym(t[1])}
	case Hexahedron:
		return []*big.Rat{sym(t[0]), sym(t[1]), sym(t[2])}
	case Triangle:
		return []*big.Rat{mul(t[0], om(t[1])), t[1]}
	case Prism:
		return []*big.Rat{mul(t[0], om(t[1])), t[1], sym(t[2])}
	case Tetrahedron:
		return []*big.Rat{mul(mul(t[0], om(t[1])), om(t[2])), mul(t[1], om(t[2])), t[2]}
	case Pyramid:
		return []*big.Rat{mul(sym(t[0]), om(t[2])), mul(sym(t[1]), om(t[2])), t[2]}
	}
	s.check()
	return nil
}
