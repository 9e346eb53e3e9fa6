package fast

import "math"

// maxTerms bounds the number of terms of the interior expansion.
const maxTerms = 30

// termTol is the size below which a term of the interior expansion (of u,
// whose derivative is about rho) no longer changes the node or the weight
// in float64.
const termTol = 1e-18

// pi2 is the tail pi - float64(pi) for a double-double pi.
const pi2 = 1.2246467991473532e-16

// jacobiHalf computes the nodes of P_n^(a,b)(cos theta) for theta in
// (0, ~pi/2], counted from theta = 0 (the end x = 1, where the weight
// behaves as (1-x)^a). The other half of the rule is the half of the
// mirrored parameters (b, a).
type jacobiHalf struct {
	n      int
	a, b   float64
	rho    float64 // n + (a+b+1)/2
	irho   float64 // 1/rho
	ishift float64 // 1/(2 (2 rho + 1))
	cst    float64 // (a+b+1)/2
	ci, cb float64 // weight constants (jacobiConsts)
	coef   []float64
	am     []float64 // 1/(2^m (2 rho + 1)_m)
	bnd    []point   // nodes of the boundary block, k = 1..len(bnd)
	rhoDD  dd        // rho in double-double
	lnci   dd        // log ci in double-double
	aDD    dd        // the exponents in double-double
	bDD    dd
	powA   dd // 2a+1 and 2b+1 in double-double
	powB   dd
}

// point is one node x with its weight w and the distances 1-x and 1+x to
// the ends, each to a few ulp in relative terms (which x itself, rounded,
// cannot give near the ends).
type point struct{ x, w, omx, opx float64 }

// newJacobiHalf prepares the expansion coefficients
//
//	C_{m,l} = (1/2+a)_l (1/2-a)_l (1/2+b)_{m-l} (1/2-b)_{m-l} / (l! (m-l)!).
func newJacobiHalf(n int, ea, eb dd, ci, cb float64) *jacobiHalf {
	a, b := ea.hi, eb.hi
	h := &jacobiHalf{n: n, a: a, b: b, ci: ci, cb: cb, aDD: ea, bDD: eb}
	h.powA = ddAdd(ddMulF(ea, 2), ddF(1))
	h.powB = ddAdd(ddMulF(eb, 2), ddF(1))
	h.cst = (a + b + 1) / 2
	h.rho = float64(n) + h.cst
	h.irho = 1 / h.rho
	h.ishift = 1 / (2 * (2*h.rho + 1))
	h.rhoDD = ddAdd(ddF(float64(n)), ddMulF(ddAdd(twoSum(a, b), ddF(1)), 0.5))
	pa := make([]float64, maxTerms) // (1/2+a)_l (1/2-a)_l / l!
	pb := make([]float64, maxTerms)
	pa[0], pb[0] = 1, 1
	for l := 1; l < maxTerms; l++ {
		fl := float64(l - 1)
		pa[l] = pa[l-1] * (0.5 + a + fl) * (0.5 - a + fl) / float64(l)
		pb[l] = pb[l-1] * (0.5 + b + fl) * (0.5 - b + fl) / float64(l)
	}
	h.coef = make([]float64, maxTerms*maxTerms)
	h.am = make([]float64, maxTerms)
	q := 1.0
	r2 := 2*float64(n) + a + b + 1 // 2 rho
	for m := 0; m < maxTerms; m++ {
		h.am[m] = q
		q /= 2 * (r2 + 1 + float64(m))
		for l := 0; l <= m; l++ {
			h.coef[m*maxTerms+l] = pa[l] * pb[m-l]
		}
	}
	return h
}

// eval returns u(theta) and u'(theta) for the k-th node's branch, where
//
//	u(theta) = sin^(a+1/2)(theta/2) cos^(b+1/2)(theta/2) P_n^(a,b)(cos theta) / K
//
// up to the sign (-1)^k, from the expansion of Hahn (as used by Hale and
// Townsend, "Fast and accurate computation of Gauss-Legendre and
// Gauss-Jacobi quadrature nodes and weights", SIAM J. Sci. Comput. 35(2),
// A652-A674, 2013, eq. 3.1):
//
//	P_n(cos theta) = K sum_m f_m(theta) / (2^m (2 rho+1)_m),
//	f_m = sum_l C_{m,l} cos(theta_{m,l}) / (sin^(l+a+1/2)(theta/2) cos^(m-l+b+1/2)(theta/2)),
//	theta_{m,l} = (rho + m/2) theta - (a + l + 1/2) pi/2.
//
// The phase rho theta - (k + a/2 - 1/4) pi is formed with an exact product
// and a double-double pi, so the node keeps its relative accuracy for rho
// theta up to 2^52; the terms stop when they fall below termTol. ok is
// false when they did not (the expansion is not valid at this theta).
func (h *jacobiHalf) eval(k int, theta, s, c float64) (u, du float64, duDD dd, ok bool) {
	// r = rho*theta - (k + a/2 - 1/4) pi.
	nt := twoProd(float64(h.n), theta)
	kk := float64(k) - 0.25
	kp := twoProd(kk, math.Pi)
	r := (nt.hi - kp.hi) + (nt.lo - kp.lo) + h.cst*theta - kk*pi2 - h.a*(math.Pi/2)
	sr, cr := sinCosSmall(r)
	cy, sy := sr, -cr // cos and sin of phi = theta_{0,0}, sign (-1)^k dropped
	is := 1 / (s * c) // one division for cot, sec and csc of the half angle
	t := c * c * is   // cot(theta/2)
	ic := s * is      // 1/cos(theta/2)
	isinT := 0.5 * is // 1/sin(theta) = 1/(2 s c)
	tanH := s * ic
	cm := 1.0 // c^-m
	ok = false
	for m := 0; m < maxTerms; m++ {
		row := h.coef[m*maxTerms : m*maxTerms+m+1]
		var e [4]float64  // sum over l = j mod 4 of C t^l
		var el [4]float64 // the same with a factor l
		var mag float64
		tl := 1.0
		for l, cf := range row {
			v := cf * tl
			e[l&3] += v
			el[l&3] += float64(l) * v
			mag += math.Abs(v)
			tl *= t
		}
		f := h.am[m] * cm
		e02, e13 := e[0]-e[2], e[1]-e[3]
		l02, l13 := el[0]-el[2], el[1]-el[3]
		A := cy*e02 + sy*e13
		B := sy*e02 - cy*e13
		Cd := cy*l02 + sy*l13
		u += f * A
		if m > 0 {
			hm := 0.5 * float64(m)
			du += f * (-(h.rho+hm)*B + hm*tanH*A - Cd*isinT)
		}
		if f*mag*(1+float64(m)) < termTol && m > 0 {
			ok = true
			break
		}
		cy, sy = cy*c-sy*s, sy*c+cy*s
		cm *= ic
	}
	// The leading term of u' is rho cos r; near a zero (|r| small) it is
	// formed in double-double, cos r from its series, so that the weight
	// does not inherit the rounding of rho and of cos.
	crDD := ddF(cr)
	if math.Abs(r) < 1e-3 {
		r2 := r * r
		crDD = quickTwoSum(1, -r2*0.5*(1-r2*(1.0/12)*(1-r2*(1.0/30))))
	}
	duDD = ddAddFast(ddMul(h.rhoDD, crDD), ddF(du)) // |du| is below 1/rho of the first term
	return u, duDD.float(), duDD, ok
}

// node computes the k-th node (k > len(h.bnd)) by Newton's method on u in
// theta, from the leading-order zero with its first-order shift, and its
// weight ci sin^(2a+1)(theta/2) cos^(2b+1)(theta/2) / u'(theta)^2. The
// iteration stops once rho times the step is below 1e-6 (for large n
// after the first step): the zero is then known to O((rho step)^2 / rho),
// far below 1 ulp, and since u solves d2u/dtheta2 + Q u = 0 the
// derivative at the zero is the derivative at the last iterate times
// 1 + Q step^2 / 2, to relative O((rho step)^3).
func (h *jacobiHalf) node(k int) (p point, ok bool) {
	// Leading-order zero plus the shift that the m = 1 term causes,
	// E = [(1/4-a^2) cot(t/2) - (1/4-b^2) tan(t/2)] / (2 (2 rho + 1)),
	// which leaves rho |error| of order E^2.
	t0 := (float64(k) + h.a/2 - 0.25) * math.Pi * h.irho
	cot, tan := cotTanHalf(t0)
	e := ((0.25-h.a*h.a)*cot - (0.25-h.b*h.b)*tan) * h.ishift
	theta := t0 + e*h.irho
	var duDD dd
	var th dd
	var s, c dd // sin and cos of th/2
	for it := 0; it < 8; it++ {
		var u, du float64
		if !(theta > 0 && theta < 2.5) { // outside ddSinCos's range: diverged
			return p, false
		}
		s, c = ddSinCos(ddF(0.5 * theta))
		u, du, duDD, ok = h.eval(k, theta, s.hi, c.hi)
		d := u / du
		th = twoSum(theta, -d)
		theta = th.hi
		if r := math.Abs(d) * h.rho; r < 1e-6 {
			// u'(zero) = u'(theta) (1 + Q d^2 / 2) + O((rho d)^3), with
			// Q ~ rho^2 from u'' = -Q u: one step from a close start
			// gives the derivative at the zero.
			duDD = ddMul(duDD, quickTwoSum(1, r*r/2))
			// The half angle moves by delta = -d/2 (th carries the step
			// exactly): rotate s and c by it, with sin delta = delta and
			// cos delta = 1 - delta^2/2 to far below 2^-106 (|delta| <
			// 1e-6/rho).
			dl := -0.5 * d
			h2 := 0.5 * dl * dl
			s, c = quickTwoSum(s.hi, s.lo+(c.hi*dl-s.hi*h2)), quickTwoSum(c.hi, c.lo-(s.hi*dl+c.hi*h2))
			break
		}
		if it == 7 {
			ok = false
		}
	}
	// th = theta + th.lo carries the last Newton step exactly. The weight
	// ci s^(2a+1) c^(2b+1) / u'^2 is formed as exp(log ci + (2a+1) log s +
	// (2b+1) log c) / u'^2 with s = sin(th/2), c = cos(th/2) and the
	// logarithms in double-double, so that neither the rounding of theta
	// nor the error of math.Pow (up to 4 ulp) reaches the weight.
	l := ddAddFast(h.lnci, ddAddFast(ddMul(ddLog(s), h.powA), ddMul(ddLog(c), h.powB)))
	p.w = quoF(ddExpF(l), ddMul(duDD, duDD))
	// x = 1 - 2 s^2 and 1 - x = 2 s^2 (theta <= ~pi/2, so s^2 <= ~1/2 and
	// the subtraction loses nothing); 1 + x = 2 - 2 s^2 likewise.
	s2 := ddMulF(ddMul(s, s), 2)
	p.x = ddAddFast(ddF(1), ddNeg(s2)).float()
	p.omx = s2.float()
	p.opx = ddAddFast(ddF(2), ddNeg(s2)).float()
	return p, ok
}

// cotTanHalf returns cot(t/2) and tan(t/2) for 0 < t <= 1.6 to a relative
// error below 3e-3 (their Laurent and Taylor series to the fifth and
// seventh power), enough for the first-order shift of a starting guess.
func cotTanHalf(t float64) (cot, tan float64) {
	y := t / 2
	y2 := y * y
	cot = 1/y - y*(1.0/3+y2*(1.0/45+y2*(2.0/945)))
	tan = y * (1 + y2*(1.0/3+y2*(2.0/15+y2*(17.0/315))))
	return cot, tan
}

// quoF is a/b rounded to float64 for a float64 a and a double-double b,
// from the quotient of the leading parts and one FMA correction.
func quoF(a float64, b dd) float64 {
	q := a / b.hi
	r := math.FMA(-q, b.hi, a) - q*b.lo
	return q + r/b.hi
}

// sinCosSmall returns sin r and cos r: for |r| < 1/32 from their Taylor
// series (truncation below 1e-19 relative), else from math.Sincos. Near a
// zero of the interior expansion the phase r is small.
func sinCosSmall(r float64) (sin, cos float64) {
	if math.Abs(r) >= 1.0/32 {
		return math.Sincos(r)
	}
	q := r * r
	sin = r * (1 - q*(1.0/6)*(1-q*(1.0/20)*(1-q*(1.0/42)*(1-q*(1.0/72)))))
	cos = 1 - q*0.5*(1-q*(1.0/12)*(1-q*(1.0/30)*(1-q*(1.0/56)*(1-q*(1.0/90)))))
	return sin, cos
}
