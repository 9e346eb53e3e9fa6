package element

import "math/big"

// ratPoly is a polynomial with exact coefficients, by exponent tuple.
type ratPoly map[string]*ratTerm

type ratTerm struct {
	e []int
	c *big.Rat
}

func (p ratPoly) add(e []int, c *big.Rat) {
	if c.Sign() == 0 {
		return
	}
	k := monomialKey(e)
	if t, ok := p[k]; ok {
		t.c.Add(t.c, c)
		return
	}
	p[k] = &ratTerm{e: append([]int(nil), e...), c: new(big.Rat).Set(c)}
}

func (p ratPoly) mul(q ratPoly, dim int) ratPoly {
	out := ratPoly{}
	e := make([]int, dim)
	c := new(big.Rat)
	for _, a := range p {
		for _, b := range q {
			for k := range e {
				e[k] = a.e[k] + b.e[k]
			}
			out.add(e, c.Mul(a.c, b.c))
		}
	}
	return out
}

func affinePoly(c [4]int64, dim int) ratPoly {
	p := ratPoly{}
	e := make([]int, dim)
	p.add(e, big.NewRat(c[0], 1))
	for k := 0; k < dim; k++ {
		e[k] = 1
		p.add(e, big.NewRat(c[k+1], 1))
		e[k] = 0
	}
	return p
}

func (p ratPoly) scaled(c *big.Rat) ratPoly {
	out := ratPoly{}
	for _, t := range p {
		out.add(t.e, new(big.Rat).Mul(t.c, c))
	}
	return out
}

func (p ratPoly) plus(q ratPoly) ratPoly {
	out := ratPoly{}
	for _, t := range p {
		out.add(t.e, t.c)
	}
	for _, t := range q {
		out.add(t.e, t.c)
	}
	return out
}

// exact returns every basis function as an exact polynomial in the
// coordinates (computed once; not safe for concurrent first use).
func (bb *boxBasis) exact() []ratPoly {
	if bb.polys == nil {
		bb.polys = bb.makeExact()
	}
	return bb.polys
}

func (bb *boxBasis) makeExact() []ratPoly {
	dim := bb.shape.Dim()
	sets := bb.alphas
	tabs := make([]map[int64][]ratPoly, len(bb.factors))
	for k, f := range bb.factors {
		p, q := affinePoly(f.p, dim), affinePoly(f.q, dim)
		q2 := q.mul(q, dim)
		tabs[k] = map[int64][]ratPoly{}
		for a := range sets[k] {
			h := make([]ratPoly, bb.deg+1)
			h[0] = affinePoly([4]int64{1, 0, 0, 0}, dim)
			for n := 1; n <= bb.deg; n++ {
				c1, c2, c3 := jacobiCoefs(a, n)
				lin := p.scaled(c1).plus(q.scaled(c2))
				h[n] = lin.mul(h[n-1], dim)
				if n >= 2 {
					h[n] = h[n].plus(q2.mul(h[n-2], dim).scaled(new(big.Rat).Neg(c3)))
				}
			}
			tabs[k][a] = h
		}
	}
	out := make([]ratPoly, len(bb.exps))
	for j, e := range bb.exps {
		v := tabs[0][bb.factors[0].alpha(e)][e[0]]
		for k := 1; k < len(bb.factors); k++ {
			v = v.mul(tabs[k][bb.factors[k].alpha(e)][e[k]], dim)
		}
		out[j] = v
	}
	return out
}

// fromMonomials returns the exact basis moments int phi_j w from the
// monomial moments mono (in the order of bb.exps: the same tuples).
func (bb *boxBasis) fromMonomials(mono []*big.Rat) []*big.Rat {
	index := make(map[string]int, len(bb.exps))
	for j, e := range bb.exps {
		index[monomialKey(e)] = j
	}
	out := make([]*big.Rat, len(bb.exps))
	t := new(big.Rat)
	for j, p := range bb.exact() {
		sum := new(big.Rat)
		for k, term := range p {
			sum.Add(sum, t.Mul(term.c, mono[index[k]]))
		}
		out[j] = sum
	}
	return out
}
