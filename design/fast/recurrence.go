package fast

import (
	"errors"
	"math"
	"math/big"

	"gonum.org/v1/gonum/lapack/gonum"
)

// recurrence holds the orthonormal three-term recurrence
//
//	sb[k+1] p_{k+1}(x) = (x - al[k]) p_k(x) - sb[k] p_{k-1}(x),
//
// in double-double, with sb[k] = sqrt(beta_k) for k = 1..n and mass =
// beta_0, for the small-n rules.
type recurrence struct {
	al, sb []dd
	mass   float64
}

const recPrec = 160

func splitDD(x *big.Float) dd {
	hi, _ := x.Float64()
	r := new(big.Float).SetPrec(recPrec).Sub(x, new(big.Float).SetFloat64(hi))
	lo, _ := r.Float64()
	return dd{hi, lo}
}

// jacobiRecurrence returns the first n+1 monic Jacobi pairs (the closed forms
// of Gautschi, Orthogonal Polynomials: Computation and Approximation, Oxford
// 2004, Table 1.1), formed at 160 bits from the float64 parameters.
func jacobiRecurrence(n int, a, b float64) recurrence {
	r := recurrence{al: make([]dd, n+1), sb: make([]dd, n+1), mass: jacobiMass(a, b)}
	A := new(big.Float).SetPrec(recPrec).SetFloat64(a)
	B := new(big.Float).SetPrec(recPrec).SetFloat64(b)
	nf := func() *big.Float { return new(big.Float).SetPrec(recPrec) }
	ab := nf().Add(A, B)
	b2a2 := nf().Sub(nf().Mul(B, B), nf().Mul(A, A))
	one := nf().SetInt64(1)
	for k := 0; k <= n; k++ {
		kk := nf().SetInt64(int64(k))
		s := nf().Add(nf().Mul(nf().SetInt64(2), kk), ab) // 2k+a+b
		var al *big.Float
		if k == 0 {
			al = nf().Quo(nf().Sub(B, A), nf().Add(ab, nf().SetInt64(2)))
		} else {
			al = nf().Quo(b2a2, nf().Mul(s, nf().Add(s, nf().SetInt64(2))))
		}
		r.al[k] = splitDD(al)
		var be *big.Float
		switch k {
		case 0:
			continue
		case 1:
			d := nf().Add(ab, nf().SetInt64(2))
			be = nf().Mul(nf().SetInt64(4), nf().Mul(nf().Add(one, A), nf().Add(one, B)))
			be.Quo(be, nf().Mul(nf().Mul(d, d), nf().Add(ab, nf().SetInt64(3))))
		default:
			be = nf().Mul(nf().SetInt64(4), kk)
			be.Mul(be, nf().Add(kk, A)).Mul(be, nf().Add(kk, B)).Mul(be, nf().Add(kk, ab))
			den := nf().Mul(s, s)
			den.Mul(den, nf().Add(s, one)).Mul(den, nf().Sub(s, one))
			be.Quo(be, den)
		}
		r.sb[k] = splitDD(nf().Sqrt(be))
	}
	return r
}

// evalOrtho returns p_n(x) and p_n'(x) for the scaled orthonormal
// polynomials (p_0 = 1), and p_{n-1}(x), by the forward recurrence in
// double-double.
func (r recurrence) evalOrtho(n int, x dd) (p, dp, q dd) {
	p0, p1 := ddF(0), ddF(1)
	d0, d1 := ddF(0), ddF(0)
	for k := 0; k < n; k++ {
		t := ddSub(x, r.al[k])
		var pn, dn dd
		if k == 0 {
			pn = t
			dn = ddF(1)
		} else {
			pn = ddSub(ddMul(t, p1), ddMul(r.sb[k], p0))
			dn = ddAdd(ddSub(ddMul(t, d1), ddMul(r.sb[k], d0)), p1)
		}
		pn = ddDiv(pn, r.sb[k+1])
		dn = ddDiv(dn, r.sb[k+1])
		p0, p1, d0, d1 = p1, pn, d1, dn
	}
	return p1, d1, p0
}

var errSmall = errors.New("fast: the recurrence rule did not converge")

// recurrenceRule sets x and w to the len(x)-point Gauss rule of r: a start
// from the eigenvalues of the Jacobi matrix (Golub and Welsch, "Calculation
// of Gauss quadrature rules", Math. Comp. 23, 1969; gonum's Dsterf), then
// Newton's method in double-double on the recurrence, and the Christoffel
// numbers beta_0 / (sqrt(beta_n) p_{n-1}(x) p_n'(x)) (Gautschi 2004,
// Theorem 1.46, orthonormal form). O(n^2); meant for n below about 100.
func recurrenceRule(r recurrence, pts []point) error {
	n := len(pts)
	d := make([]float64, n)
	e := make([]float64, max(n-1, 0))
	for k := 0; k < n; k++ {
		d[k] = r.al[k].float()
		if k+1 < n {
			e[k] = r.sb[k+1].float()
		}
	}
	if !(gonum.Implementation{}).Dsterf(n, d, e) {
		return errSmall
	}
	for i := 0; i < n; i++ {
		z := ddF(d[i])
		var dp, q dd
		for it := 0; it < 20; it++ {
			var p dd
			p, dp, q = r.evalOrtho(n, z)
			if dp.hi == 0 {
				return errSmall
			}
			step := ddDiv(p, dp)
			z = ddSub(z, step)
			if math.Abs(step.hi) <= 1e-30*math.Abs(z.hi) || step.hi == 0 {
				_, dp, q = r.evalOrtho(n, z)
				break
			}
		}
		wt := ddDiv(ddF(r.mass), ddMul(r.sb[n], ddMul(q, dp)))
		one := ddF(1)
		pts[i] = point{x: z.float(), w: wt.float(), omx: ddSub(one, z).float(), opx: ddAdd(one, z).float()}
	}
	return nil
}
