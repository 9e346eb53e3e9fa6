package fast

import (
	"math"
	"math/big"

	"quadwright/precision"
)

// Hermite sets x and w to the nodes (ascending) and weights of the n-point
// Gauss-Hermite rule for the weight exp(-x^2) on the real line; with
// scaled, w[i] is the weight times exp(x[i]^2), which stays in float64's
// range for any n (the plain weights underflow to 0 once x^2 exceeds about
// 745, from n near 400 on). x and w must have length n.
//
// Method: the orthonormal Hermite function phi_n(x) = H_n(x) exp(-x^2/2) /
// sqrt(2^n n! sqrt(pi)) solves d2phi/dx2 + (2n+1-x^2) phi = 0; its value and
// slope at 0 are closed forms, and the zeros are found one after the
// other by Taylor series in double-double (Glaser, Liu and Rokhlin, SIAM
// J. Sci. Comput. 29, 2007; see marcher). The weights are
// 2 exp(-x^2) / phi_n'(x)^2 (the Christoffel numbers
// 2^(n-1) n! sqrt(pi) / (n^2 H_{n-1}(x)^2) of Abramowitz and Stegun 25.4.46,
// rewritten with phi_n' = sqrt(2n) phi_{n-1} at a zero), so they carry the
// double-double accuracy of phi_n' and one rounding. The march is sequential: O(n) work on one core.
func Hermite(n int, x, w []float64, scaled bool) {
	checkLen(n, x, w)
	hermiteMarch(n, x, w, scaled)
}

// hermiteMarch is Hermite's sequential march from x = 0.
func hermiteMarch(n int, x, w []float64, scaled bool) {
	A := float64(2*n + 1)
	m := newMarcher(hermiteCoef(A), ddTerms)
	half := n / 2
	// Positive zeros go to x[n-half..n-1]; for odd n the middle node is 0.
	var x0, u, du dd
	idx := n - half
	if n%2 == 1 {
		du = hermiteSlope0(n)
		x[half], w[half] = 0, hermiteWeight(ddF(0), du, scaled)
	} else {
		u = hermiteValue0(n)
	}
	for j := 0; j < half; j++ {
		a := A - x0.hi*x0.hi
		h0 := math.Pi / math.Sqrt(math.Max(a, 1))
		if j == 0 && n%2 == 0 {
			h0 /= 2
		}
		h, duh := m.step(x0, u, du, h0)
		x0 = ddAdd(x0, h)
		u, du = ddF(0), duh
		x[idx+j], w[idx+j] = x0.float(), hermiteWeight(x0, du, scaled)
	}
	for j := 0; j < half; j++ {
		x[half-1-j], w[half-1-j] = -x[idx+j], w[idx+j]
	}
}

// hermiteWeight is 2 / phi'^2, times exp(-x^2) unless scaled; x^2 is formed
// in double-double so that exp(-x^2) keeps its relative accuracy.
func hermiteWeight(x, du dd, scaled bool) float64 {
	v := ddDiv(ddF(2), ddMul(du, du))
	if scaled {
		return v.float()
	}
	x2 := ddMul(x, x)
	e := math.Exp(-x2.hi) * (1 - x2.lo)
	return v.float() * e
}

// hermiteValue0 is phi_n(0) for even n, |phi_n(0)|^2 = n! / ((n/2)!^2 2^n sqrt(pi)),
// in double-double.
func hermiteValue0(n int) dd {
	l := sumLog(lgam(bf(0), n+1), neg(lgam(bf(0), n/2+1)), neg(lgam(bf(0), n/2+1)),
		neg(new(big.Float).SetPrec(constPrec).Mul(bf(float64(n)), precLn2())),
		neg(new(big.Float).SetPrec(constPrec).Quo(precision.Log(precision.Pi(constPrec)), bf(2))))
	l.Quo(l, bf(2))
	return splitDDc(precision.Exp(l))
}

// hermiteSlope0 is phi_n'(0) for odd n, |phi_n'(0)|^2 = 4n (n-1)! / (((n-1)/2)!^2 2^n sqrt(pi)).
func hermiteSlope0(n int) dd {
	l := sumLog(precision.Log(bf(float64(4*n))), lgam(bf(0), n), neg(lgam(bf(0), (n-1)/2+1)), neg(lgam(bf(0), (n-1)/2+1)),
		neg(new(big.Float).SetPrec(constPrec).Mul(bf(float64(n)), precLn2())),
		neg(new(big.Float).SetPrec(constPrec).Quo(precision.Log(precision.Pi(constPrec)), bf(2))))
	l.Quo(l, bf(2))
	return splitDDc(precision.Exp(l))
}

func splitDDc(x *big.Float) dd {
	hi, _ := x.Float64()
	r := new(big.Float).SetPrec(constPrec).Sub(x, new(big.Float).SetFloat64(hi))
	lo, _ := r.Float64()
	return dd{hi, lo}
}

// hermiteCoef returns the marcher's Taylor coefficients of phi_n about x0
// (A = 2n+1).
func hermiteCoef(A float64) func(x0 dd, c []dd, cf []float64, h0 float64) int {
	return func(x0 dd, c []dd, cf []float64, h0 float64) int {
		// phi(x0+h) = sum c_k h^k; (k+2)(k+1) c_{k+2} = -(A - x0^2) c_k + 2 x0 c_{k-1} + c_{k-2}.
		a := ddSub(ddF(A), ddMul(x0, x0))
		x2 := ddMulF(x0, 2)
		for k := 0; k+2 < len(c); k++ {
			s := ddNeg(ddMul(a, c[k]))
			if k >= 1 {
				s = ddAddFast(s, ddMul(x2, c[k-1]))
			}
			if k >= 2 {
				s = ddAddFast(s, c[k-2])
			}
			c[k+2] = ddMul(s, invPair[k])
		}
		K := len(c)
		for k := range c {
			cf[k] = c[k].hi
		}
		af, xf := a.hi, x2.hi
		scale := math.Abs(c[1].hi*h0) + math.Abs(c[0].hi)
		hk := math.Pow(h0, float64(K))
		for k := K - 2; k+2 < len(cf); k++ {
			cf[k+2] = (-af*cf[k] + xf*cf[k-1] + cf[k-2]) * invPair[k].hi
			hk *= h0
			if k+2 > K+2 && math.Abs(cf[k+2])*hk < 1e-34*scale && math.Abs(cf[k+1])*hk < 1e-34*scale*h0 {
				return k + 3
			}
		}
		return len(cf)
	}
}
