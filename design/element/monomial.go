package element

import (
	"fmt"
	"math/big"
)

// MonomialIntegral returns the exact integral of x^e[0] y^e[1] z^e[2] (as
// many exponents as the element has coordinates, each >= 0) over the
// reference element s:
//
//	line [-1,1]:       L(a) = 2/(a+1) for even a, 0 for odd a;
//	quadrilateral:     L(a) L(b);          hexahedron: L(a) L(b) L(c);
//	triangle:          a! b! / (a+b+2)!;
//	tetrahedron:       a! b! c! / (a+b+c+3)!;
//	prism:             a! b! / (a+b+2)! * L(c);
//	pyramid:           L(a) L(b) c! (a+b+2)! / (a+b+c+3)!.
//
// The simplex forms are the Dirichlet integral (P. G. L. Dirichlet, 1839; A.
// H. Stroud, Approximate Calculation of Multiple Integrals, Prentice-Hall
// 1971, section 7.1). The pyramid form follows from the collapsed map
// x = u(1-z), y = v(1-z) with u, v in [-1,1] and Jacobian (1-z)^2: the
// integral is L(a) L(b) times the integral over [0,1] of
// (1-z)^(a+b+2) z^c, the Beta function B(c+1, a+b+3) (Abramowitz and
// Stegun 6.2.1). Wrong exponent counts or negative exponents panic.
func MonomialIntegral(s Shape, e []int) *big.Rat {
	if len(e) != s.Dim() {
		panic(fmt.Sprintf("element: MonomialIntegral on the %s with %d exponents", s, len(e)))
	}
	for _, k := range e {
		if k < 0 {
			panic("element: MonomialIntegral with a negative exponent")
		}
	}
	switch s {
	case Line:
		return lineMonomial(e[0])
	case Quadrilateral:
		return new(big.Rat).Mul(lineMonomial(e[0]), lineMonomial(e[1]))
	case Hexahedron:
		r := new(big.Rat).Mul(lineMonomial(e[0]), lineMonomial(e[1]))
		return r.Mul(r, lineMonomial(e[2]))
	case Triangle:
		return dirichlet(e[0], e[1])
	case Tetrahedron:
		return dirichlet(e[0], e[1], e[2])
	case Prism:
		return new(big.Rat).Mul(dirichlet(e[0], e[1]), lineMonomial(e[2]))
	case Pyramid:
		r := new(big.Rat).Mul(lineMonomial(e[0]), lineMonomial(e[1]))
		if r.Sign() == 0 {
			return r
		}
		ab := e[0] + e[1]
		num := new(big.Int).Mul(factorial(e[2]), factorial(ab+2))
		r.Mul(r, new(big.Rat).SetFrac(num, factorial(ab+e[2]+3)))
		return r
	}
	s.check()
	return nil
}

// lineMonomial is the integral of x^a over [-1,1].
func lineMonomial(a int) *big.Rat {
	if a%2 == 1 {
		return new(big.Rat)
	}
	return big.NewRat(2, int64(a+1))
}

// dirichlet is the integral of prod x_i^e_i over the unit simplex
// {x_i >= 0, sum x_i <= 1} of dimension len(e): prod e_i! / (sum e_i + len(e))!.
func dirichlet(e ...int) *big.Rat {
	num := big.NewInt(1)
	tot := len(e)
	for _, k := range e {
		num.Mul(num, factorial(k))
		tot += k
	}
	return new(big.Rat).SetFrac(num, factorial(tot))
}

func factorial(n int) *big.Int {
	if n < 2 {
		return big.NewInt(1)
	}
	return new(big.Int).MulRange(1, int64(n))
}

// monomials lists the exponent tuples of dim variables with total degree
// exactly d, in lexicographic order.
func monomials(dim, d int) [][]int {
	if dim == 1 {
		return [][]int{{d}}
	}
	var out [][]int
	for a := d; a >= 0; a-- {
		for _, rest := range monomials(dim-1, d-a) {
			out = append(out, append([]int{a}, rest...))
		}
	}
	return out
}
