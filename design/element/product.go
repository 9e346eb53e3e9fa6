package element

import (
	"context"
	"fmt"
	"math/big"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// factor is a 1-D rule used as one direction of a product.
type factor int

const (
	legendre   factor = iota // Gauss-Legendre on [-1,1]
	legendre01               // Gauss-Legendre on [0,1]
	jacobi1                  // Gauss-Jacobi for (1-v) on [0,1]
	jacobi2                  // Gauss-Jacobi for (1-v)^2 on [0,1]
	lobatto                  // Gauss-Lobatto on [-1,1]
)

// line1D is a 1-D rule held at prec bits.
type line1D struct {
	x, w []*big.Float
	prec uint
}

// oneD builds the n-point rule of kind f from design.Gauss asked for
// digits correct digits; the values returned are Gauss's unrounded ones at
// its working precision, mapped exactly (the maps below are affine with
// power-of-two coefficients, exact in binary up to the one rounding of
// 1 - x in collapsed coordinates, which happens later).
//
// A Jacobi rule for (1-t)^a on [-1,1] maps onto (1-v)^a on [0,1] by
// v = (1+t)/2, w -> w 2^-(a+1). The n-point Gauss-Lobatto rule has the
// ends +-1 with weight 2/(n(n-1)) and, inside, the zeros of P'_(n-1),
// which are the nodes t_i of the (n-2)-point Gauss-Jacobi rule for
// (1-t^2), with weights w_i / (1 - t_i^2) (the Lobatto rule applied to
// (1-t^2) g reproduces the Jacobi rule on g; Abramowitz and Stegun 25.4.32).
func oneD(ctx context.Context, f factor, n, digits int) (*line1D, error) {
	gauss := func(a int64, m int) (*design.Rule, error) {
		fam, err := moments.NewFamily("jacobi", big.NewRat(a, 1), big.NewRat(0, 1), nil)
		if f == lobatto {
			fam, err = moments.NewFamily("jacobi", big.NewRat(1, 1), big.NewRat(1, 1), nil)
		}
		if err != nil {
			panic("element: " + err.Error())
		}
		return design.Gauss(ctx, design.FamilySource{Family: fam}, design.Request{Points: m, Digits: digits})
	}
	out := &line1D{}
	switch f {
	case legendre, legendre01, jacobi1, jacobi2:
		a := map[factor]int64{legendre: 0, legendre01: 0, jacobi1: 1, jacobi2: 2}[f]
		r, err := gauss(a, n)
		if err != nil {
			return nil, err
		}
		out.prec = r.WorkingPrec
		for i := range r.NodeValues {
			x := new(big.Float).SetPrec(out.prec).Set(r.NodeValues[i])
			w := new(big.Float).SetPrec(out.prec).Set(r.WeightValues[i])
			if f != legendre {
				x.Add(x, big.NewFloat(1))
				x.SetMantExp(x, -1)
				w.SetMantExp(w, -int(a+1))
			}
			out.x = append(out.x, x)
			out.w = append(out.w, w)
		}
	case lobatto:
		if n < 2 {
			panic("element: Gauss-Lobatto rule with fewer than 2 points")
		}
		out.prec = precision.WorkingPrec(digits, n)
		var r *design.Rule
		if n > 2 {
			var err error
			if r, err = gauss(1, n-2); err != nil {
				return nil, err
			}
			out.prec = r.WorkingPrec
		}
		end := new(big.Float).SetPrec(out.prec).Quo(big.NewFloat(2), new(big.Float).SetInt64(int64(n*(n-1))))
		out.x = append(out.x, new(big.Float).SetPrec(out.prec).SetInt64(-1))
		out.w = append(out.w, end)
		if r != nil {
			for i := range r.NodeValues {
				x := new(big.Float).SetPrec(out.prec).Set(r.NodeValues[i])
				// 1 - t^2 as (1-t)(1+t): each factor is exact in binary
				// up to one rounding, where 1 - t*t would cancel.
				om := new(big.Float).SetPrec(out.prec).Sub(big.NewFloat(1), x)
				op := new(big.Float).SetPrec(out.prec).Add(big.NewFloat(1), x)
				om.Mul(om, op)
				w := new(big.Float).SetPrec(out.prec).Quo(r.WeightValues[i], om)
				out.x = append(out.x, x)
				out.w = append(out.w, w)
			}
		}
		out.x = append(out.x, new(big.Float).SetPrec(out.prec).SetInt64(1))
		out.w = append(out.w, new(big.Float).SetPrec(out.prec).Set(end))
	}
	return out, nil
}

// plan returns the factors of the product rule of s, the 1-D point count
// for degree deg, the degree the construction reaches, its kind and a
// description.
func plan(s Shape, deg int, lob bool) (fs []factor, n, nominal int, kind, method string) {
	n = (deg + 2) / 2 // ceil((deg+1)/2)
	nominal = 2*n - 1
	kind = "product"
	if lob {
		n = max(2, (deg+4)/2) // ceil((deg+3)/2)
		nominal = 2*n - 3
	}
	g := legendre
	if lob {
		g = lobatto
	}
	switch s {
	case Line:
		fs, method = []factor{g}, "Gauss-Legendre"
	case Quadrilateral:
		fs, method = []factor{g, g}, "tensor product of Gauss-Legendre rules"
	case Hexahedron:
		fs, method = []factor{g, g, g}, "tensor product of Gauss-Legendre rules"
	case Triangle:
		fs, kind = []factor{legendre01, jacobi1}, "collapsed"
		method = "conical product (Stroud 1971): Gauss-Legendre in u, Gauss-Jacobi(1,0) in v; x = u(1-v), y = v"
	case Tetrahedron:
		fs, kind = []factor{legendre01, jacobi1, jacobi2}, "collapsed"
		method = "conical product (Stroud 1971): Gauss-Legendre in u, Gauss-Jacobi(1,0) in v, Gauss-Jacobi(2,0) in w; x = u(1-v)(1-w), y = v(1-w), z = w"
	case Prism:
		fs, kind = []factor{legendre01, jacobi1, legendre}, "collapsed"
		method = "conical product on the triangle (Stroud 1971) times Gauss-Legendre in z"
	case Pyramid:
		fs, kind = []factor{legendre, legendre, jacobi2}, "collapsed"
		method = "conical product (Stroud 1971): Gauss-Legendre in u and v, Gauss-Jacobi(2,0) in z; x = u(1-z), y = v(1-z)"
	}
	if lob {
		method = "Gauss-Lobatto"
		if s != Line {
			method = "tensor product of Gauss-Lobatto rules"
		}
	}
	return fs, n, nominal, kind, method
}

// mapPoint sets p to the element point of the factor coordinates t,
// rounded to prec bits: a few roundings per coordinate, so each carries
// all but a few of its prec bits.
func mapPoint(s Shape, t []*big.Float, prec uint, p []*big.Float) {
	one := big.NewFloat(1)
	oneMinus := func(v *big.Float) *big.Float { return new(big.Float).SetPrec(prec).Sub(one, v) }
	switch s {
	case Line, Quadrilateral, Hexahedron:
		for k := range t {
			p[k].Set(t[k])
		}
	case Triangle, Prism:
		p[0].Mul(t[0], oneMinus(t[1]))
		p[1].Set(t[1])
		if s == Prism {
			p[2].Set(t[2])
		}
	case Tetrahedron:
		ow := oneMinus(t[2])
		p[0].Mul(t[0], oneMinus(t[1]))
		p[0].Mul(p[0], ow)
		p[1].Mul(t[1], ow)
		p[2].Set(t[2])
	case Pyramid:
		oz := oneMinus(t[2])
		p[0].Mul(t[0], oz)
		p[1].Mul(t[1], oz)
		p[2].Set(t[2])
	}
}

// tensor forms every combination of the factor rules (the last factor
// varying fastest), mapped to the element at prec bits. The Jacobian
// factors of the collapse are carried by the Gauss-Jacobi weights, so a
// weight is the plain product of the factor weights.
func tensor(s Shape, rules []*line1D, prec uint) (pts [][]*big.Float, wts []*big.Float) {
	dim := len(rules)
	idx := make([]int, dim)
	t := make([]*big.Float, dim)
	for {
		w := new(big.Float).SetPrec(prec).SetInt64(1)
		for k := range idx {
			t[k] = rules[k].x[idx[k]]
			w.Mul(w, rules[k].w[idx[k]])
		}
		p := make([]*big.Float, dim)
		for k := range p {
			p[k] = new(big.Float).SetPrec(prec)
		}
		mapPoint(s, t, prec, p)
		pts = append(pts, p)
		wts = append(wts, w)
		k := dim - 1
		for ; k >= 0; k-- {
			idx[k]++
			if idx[k] < len(rules[k].x) {
				break
			}
			idx[k] = 0
		}
		if k < 0 {
			return pts, wts
		}
	}
}

// Product builds the product (line, quadrilateral, hexahedron) or collapsed
// (triangle, tetrahedron, prism, pyramid) rule of req, verified.
//
// With N = ceil((D+1)/2) points per direction (Gauss-Lobatto:
// ceil((D+3)/2)) the rule integrates every polynomial of total degree
// 2N-1 (Lobatto 2N-3) >= D: for the collapsed shapes a monomial of total
// degree d becomes, in the collapsed coordinates, a polynomial of degree
// <= d in each direction times the Jacobian weight that the Gauss-Jacobi
// factors carry (A. H. Stroud, Approximate Calculation of Multiple
// Integrals, Prentice-Hall 1971, section 2.7, conical product rules). All
// weights are positive and all nodes interior, except the ends of Lobatto
// rules, which lie on the boundary.
//
// The rule is assembled twice: from 1-D rules asked for D+8 digits (at
// their working precision p1) and from 1-D rules asked for D+32 digits (at
// p2 > p1), D = 17 in float64 mode. Every printed coordinate and weight
// must be confirmed by the second assembly (design.ConfirmPrinted), else
// the guard digits grow and both are redone. The printed rule is then
// tested on every monomial through degree 2N (VerifyPrinted); a degree
// below D is an error.
func Product(ctx context.Context, req Request) (*Rule, error) {
	if err := checkRequest(req); err != nil {
		return nil, err
	}
	fs, n, nominal, kind, method := plan(req.Shape, req.Degree, req.Lobatto)
	base := req.Digits
	if base == 0 {
		base = 17
	}
	r := &Rule{Shape: req.Shape, Kind: kind, Method: method, Digits: req.Digits, Requested: req.Degree}
	for range fs {
		r.Factors = append(r.Factors, n)
	}
	for guard := 8; guard <= 8+3*16; guard += 16 {
		lo, prec1, err := assemble(ctx, req.Shape, fs, n, base+guard)
		if err != nil {
			return nil, err
		}
		hi, prec2, err := assemble(ctx, req.Shape, fs, n, base+guard+24)
		if err != nil {
			return nil, err
		}
		nodes, weights, ok := confirmAll(lo, hi, req.Digits, prec2)
		if !ok {
			continue
		}
		r.Nodes, r.Weights = nodes, weights
		r.WorkingPrec, r.CheckPrec = prec1, prec2
		return finish(ctx, r, nominal+1, !req.Lobatto)
	}
	return nil, fmt.Errorf("the %s rule of degree %d could not be confirmed to %d digits by a second computation at higher precision", req.Shape, req.Degree, base)
}

// assembled is one assembly of a product rule.
type assembled struct {
	pts [][]*big.Float
	wts []*big.Float
}

func assemble(ctx context.Context, s Shape, fs []factor, n, digits int) (*assembled, uint, error) {
	rules := make([]*line1D, len(fs))
	var prec uint
	for k, f := range fs {
		// Identical factors are built once.
		for j := 0; j < k; j++ {
			if fs[j] == f {
				rules[k] = rules[j]
			}
		}
		if rules[k] == nil {
			r, err := oneD(ctx, f, n, digits)
			if err != nil {
				return nil, 0, err
			}
			rules[k] = r
		}
		prec = max(prec, rules[k].prec)
	}
	pts, wts := tensor(s, rules, prec)
	return &assembled{pts, wts}, prec, nil
}

// confirmAll prints every value of hi and confirms it against lo.
func confirmAll(lo, hi *assembled, digits int, prec uint) ([][]string, []string, bool) {
	nodes := make([][]string, len(hi.pts))
	weights := make([]string, len(hi.wts))
	for i := range hi.pts {
		nodes[i] = make([]string, len(hi.pts[i]))
		for k := range hi.pts[i] {
			s, ok := design.ConfirmPrinted(lo.pts[i][k], hi.pts[i][k], digits, prec)
			if !ok {
				return nil, nil, false
			}
			nodes[i][k] = s
		}
		s, ok := design.ConfirmPrinted(lo.wts[i], hi.wts[i], digits, prec)
		if !ok {
			return nil, nil, false
		}
		weights[i] = s
	}
	return nodes, weights, true
}
