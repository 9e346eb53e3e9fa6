package fast

import (
	"fmt"
	"math"
)

// Laguerre sets x and w to the nodes (ascending) and weights of the n-point
// generalized Gauss-Laguerre rule for the weight x^alpha exp(-x) on
// [0, inf); with scaled, w[i] is the weight times exp(x[i]), which stays in
// float64's range for any n (the plain weights underflow once x exceeds
// about 745). x and w must have length n. It returns an error naming alpha
// when alpha is not in (-1, MaxJacobiExponent].
//
// Method: the boundaryNodes smallest zeros come from the series
// L_n^alpha(x) = binom(n+alpha, n) 1F1(-n; alpha+1; x) in double-double,
// bracketed by a scan; from the last of them the function
// v(x) = exp(-x/2) L_n^alpha(x), which solves
//
//	x v'' + (alpha+1) v' + (n + (alpha+1)/2 - x/4) v = 0,
//
// is carried from zero to zero by Taylor series in double-double (Glaser,
// Liu and Rokhlin, SIAM J. Sci. Comput. 29, 2007; see marcher). The scaled
// weights are Gamma(n+alpha+1) / (n! x v'(x)^2) (the Christoffel numbers
// Gamma(n+alpha+1) / (n! x L_n'(x)^2) of the generalized Laguerre
// polynomials, common practice, checked against the recurrence reference
// in the tests, with L_n' = exp(x/2) v' at a zero), so no
// power of x is formed. The march is sequential: O(n) work on one core.
func Laguerre(n int, alpha float64, x, w []float64, scaled bool) error {
	checkLen(n, x, w)
	if err := checkExponent("alpha", alpha); err != nil {
		return err
	}
	// Weights with binom(n+alpha, n) divided out of v: el = Gamma(a+1)^2 n! / Gamma(n+a+1).
	ba := bf(alpha)
	el := expRound(sumLog(lgam(ba, 1), lgam(ba, 1), lgam(bf(0), n+1), neg(lgam(ba, n+1))))
	kb := min(boundaryNodes, n)
	lb := laguerreSeries{n: n, a: alpha}
	pts, ok := lb.smallZeros(kb)
	if !ok {
		return fmt.Errorf("the smallest nodes of the %d-point Gauss-Laguerre rule for alpha = %g could not be isolated", n, alpha)
	}
	put := func(i int, xi, vd dd) {
		// scaled weight el / (x V'^2), V = v / binom
		ws := ddDiv(ddF(el), ddMul(xi, ddMul(vd, vd)))
		x[i] = xi.float()
		if scaled {
			w[i] = ws.float()
		} else {
			w[i] = ws.float() * math.Exp(-xi.hi) * (1 - xi.lo)
		}
	}
	for i, p := range pts {
		put(i, p.x, p.dv)
	}
	if kb == n {
		return nil
	}
	// D = n + (alpha+1)/2 and k+alpha+1 in double-double: a rounded D
	// would march the equation of a slightly different n, a drift that
	// grows with every step.
	a1dd := twoSum(alpha, 1)
	Ddd := ddAdd(ddF(float64(n)), ddMulF(a1dd, 0.5))
	a1 := a1dd.hi
	D := Ddd.hi
	kk1 := make([]dd, taylorTerms) // (k+1)(k+alpha+1)
	for k := range kk1 {
		kk1[k] = ddMulF(ddAdd(a1dd, ddF(float64(k))), float64(k+1))
	}
	m := newMarcher(func(x0 dd, c []dd, cf []float64, h0 float64) int {
		// c_{k+2} = -[(k+1)(k+a+1) c_{k+1} + (D - x0/4) c_k - c_{k-1}/4] / (x0 (k+1)(k+2))
		b0 := ddSub(Ddd, ddMulF(x0, 0.25))
		inv := ddDiv(ddF(1), x0)
		for k := 0; k+2 < len(c); k++ {
			s := ddAddFast(ddMul(kk1[k], c[k+1]), ddMul(b0, c[k]))
			if k >= 1 {
				s = ddAddFast(s, dd{-c[k-1].hi / 4, -c[k-1].lo / 4})
			}
			c[k+2] = ddNeg(ddMul(ddMul(s, inv), invPair[k]))
		}
		K := len(c)
		for k := range c {
			cf[k] = c[k].hi
		}
		bf0, invf := b0.hi, inv.hi
		scale := math.Abs(c[1].hi * h0)
		hk := math.Pow(h0, float64(K))
		for k := K - 2; k+2 < len(cf); k++ {
			s := float64(k+1)*(float64(k)+a1)*cf[k+1] + bf0*cf[k] - 0.25*cf[k-1]
			cf[k+2] = -s * invf * invPair[k].hi
			hk *= h0
			if k+2 > K+2 && math.Abs(cf[k+2])*hk < 1e-34*scale && math.Abs(cf[k+1])*hk < 1e-34*scale*h0 {
				return k + 3
			}
		}
		return len(cf)
	}, ddTerms)
	last := pts[kb-1]
	x0, u, du := last.x, ddF(0), last.dv
	for i := kb; i < n; i++ {
		xf := x0.hi
		q := (D-xf/4)/xf - (a1*a1-2*a1)/(4*xf*xf) // normal-form wavenumber^2
		h0 := math.Pi / math.Sqrt(math.Max(q, 1/(xf*xf)))
		h, duh := m.step(x0, u, du, h0)
		x0 = ddAdd(x0, h)
		u, du = ddF(0), duh
		put(i, x0, du)
	}
	return nil
}

// laguerreSeries evaluates F(x) = 1F1(-n; a+1; x) and G = x F'(x) in
// double-double.
type laguerreSeries struct {
	n int
	a float64
}

func (s laguerreSeries) eval(x dd) (f, g dd) {
	t := ddF(1)
	f, g = t, ddF(0)
	big := 1.0
	for j := 0; j < s.n; j++ {
		fj := float64(j)
		den := ddMul(twoSum(fj+1, s.a), ddF(fj+1))
		t = ddMul(ddMul(t, ddDiv(ddF(fj-float64(s.n)), den)), x)
		f = ddAdd(f, t)
		g = ddAdd(g, ddMulF(t, fj+1))
		at := math.Abs(t.hi)
		big = math.Max(big, at)
		if at < 1e-33*big && math.Abs((fj-float64(s.n))*x.hi/den.hi) < 0.5 {
			break
		}
	}
	return f, g
}

type lagZero struct{ x, dv dd }

// smallZeros finds the first k zeros by a scan in q = 2 sqrt(kappa x),
// kappa = n + (a+1)/2 (where the zeros sit near the Bessel zeros j_{a,i}),
// and Newton's method in double-double with bisection as a safeguard; dv is
// V'(x) = exp(-x/2) F'(x) there, exp(-x/2) summed as a series in
// double-double.
func (s laguerreSeries) smallZeros(k int) ([]lagZero, bool) {
	kappa := float64(s.n) + (s.a+1)/2
	xOf := func(q float64) float64 { return q * q / (4 * kappa) }
	var out []lagZero
	prev := 0.0
	fPrev, _ := s.eval(ddF(0))
	for q := math.Pi / 16; len(out) < k && q < (float64(k)+math.Abs(s.a)+4)*math.Pi; q += math.Pi / 16 {
		f, _ := s.eval(ddF(xOf(q)))
		if (f.hi < 0) != (fPrev.hi < 0) {
			z, ok := refineZero(s.eval, xOf(prev), xOf(q), fPrev.hi < 0)
			if !ok {
				return nil, false
			}
			_, g := s.eval(z)
			dv := ddMul(expNegHalf(z), ddDiv(g, z))
			out = append(out, lagZero{z, dv})
		}
		prev, fPrev = q, f
	}
	return out, len(out) == k
}

// expNegHalf is exp(-x/2) in double-double for 0 <= x below a few
// hundred, as 1 / sum (x/2)^j / j! (a sum of positive terms, so no
// cancellation).
func expNegHalf(x dd) dd {
	y := ddMulF(x, 0.5)
	// Halve until y <= 1/8, sum, square back.
	sq := 0
	for y.hi > 0.125 {
		y = ddMulF(y, 0.5)
		sq++
	}
	t, s := ddF(1), ddF(1)
	for j := 1; j < 30; j++ {
		t = ddDiv(ddMul(t, y), ddF(float64(j)))
		s = ddAdd(s, t)
		if t.hi < 1e-34*s.hi {
			break
		}
	}
	for ; sq > 0; sq-- {
		s = ddMul(s, s)
	}
	return ddDiv(ddF(1), s)
}
