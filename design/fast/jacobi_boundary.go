package fast

import "math"

// boundaryNodes is the number of nodes next to each end that come from the
// hypergeometric series rather than the interior expansion. At the K-th
// node rho theta is near K pi; the interior expansion needs rho theta well
// above 10 pi to reach float64 accuracy, and the series below loses about
// rho theta / ln 10 of double-double's 32 digits to cancellation.
const boundaryNodes = 10

// hyper evaluates, in double-double, F(z) = 2F1(-n, n+a+b+1; a+1; z) and
// G(z) = z F'(z), so that P_n^(a,b)(1-2z) = binom(n+a, n) F(z) (Szego,
// Orthogonal Polynomials, 1939, eq. 4.21.2). The series is summed until its
// terms fall below 2^-110 of the largest one (or terminates at j = n).
func (h *jacobiHalf) hyper(z dd) (f, g dd) {
	ab := ddAdd(h.aDD, h.bDD)
	t := ddF(1)
	f = t
	g = ddF(0)
	big := 1.0
	for j := 0; j < h.n; j++ {
		fj := float64(j)
		num := ddMul(ddF(fj-float64(h.n)), ddAdd(ab, ddF(fj+float64(h.n)+1)))
		den := ddMul(ddAdd(ddF(fj+1), h.aDD), ddF(fj+1))
		t = ddMul(ddMul(t, ddDiv(num, den)), z)
		f = ddAdd(f, t)
		g = ddAdd(g, ddMulF(t, fj+1))
		at := math.Abs(t.hi)
		big = math.Max(big, at)
		if at < 1e-33*big && math.Abs(num.hi*z.hi/den.hi) < 0.5 {
			break
		}
	}
	return f, g
}

// boundary computes the first kb nodes from the end x = 1 and their weights
// by Newton's method in double-double on F(z) = 0, z = (1-x)/2, in brackets
// found by scanning rho theta in steps of pi/16. The weight is
//
//	cb z / ((1-z) G(z)^2),  G = z F'(z),
//
// which is lambda = cw / ((1-x^2) P_n'(x)^2) with P_n' = -binom F'/2. The
// node x = 1-2z is formed in double-double and rounded once, so it is
// correctly rounded up to the error of z (a few units of 2^-100).
func (h *jacobiHalf) boundary(kb int) bool {
	h.bnd = h.bnd[:0]
	step := math.Pi / 16 / h.rho
	zOf := func(theta float64) float64 { s := math.Sin(theta / 2); return s * s }
	prevT := 0.0
	fPrev, _ := h.hyper(ddF(0))
	limit := (float64(kb) + math.Abs(h.a) + 3) * math.Pi / h.rho
	for theta := step; len(h.bnd) < kb && theta < limit; theta += step {
		f, _ := h.hyper(ddF(zOf(theta)))
		if (f.hi < 0) == (fPrev.hi < 0) {
			prevT, fPrev = theta, f
			continue
		}
		z, ok := refineZero(h.hyper, zOf(prevT), zOf(theta), fPrev.hi < 0)
		if !ok {
			return false
		}
		_, g := h.hyper(z)
		one := ddF(1)
		x := ddSub(one, ddMulF(z, 2))
		w := ddDiv(ddMulF(z, h.cb), ddMul(ddSub(one, z), ddMul(g, g)))
		h.bnd = append(h.bnd, point{x: x.float(), w: w.float(), omx: 2 * z.float(), opx: ddMulF(ddSub(one, z), 2).float()})
		prevT, fPrev = theta, f
	}
	return len(h.bnd) == kb
}

// refineZero finds the zero of F in [lo, hi] (F(lo) < 0 when loNeg), where
// eval(z) returns F(z) and G(z) = z F'(z), by Newton's method in z
// (z - F/F' = z (1 - F/G), a relative step that suits zeros near 0),
// falling back to bisection when a step leaves the bracket.
func refineZero(eval func(z dd) (f, g dd), lo, hi float64, loNeg bool) (dd, bool) {
	a, b := ddF(lo), ddF(hi)
	z := ddF((lo + hi) / 2)
	for it := 0; it < 200; it++ {
		f, g := eval(z)
		if (f.hi < 0) == loNeg {
			a = z
		} else {
			b = z
		}
		if g.hi == 0 {
			return z, false
		}
		step := ddMul(z, ddDiv(f, g))
		zn := ddSub(z, step)
		if math.Abs(step.hi) <= 1e-27*z.hi {
			// One more step from a point this close gains the rest of
			// double-double's precision (quadratic convergence).
			f, g = eval(zn)
			return ddSub(zn, ddMul(zn, ddDiv(f, g))), true
		}
		if ddSub(zn, a).hi <= 0 || ddSub(b, zn).hi <= 0 {
			zn = ddMulF(ddAdd(a, b), 0.5)
		}
		if ddSub(b, a).hi <= 1e-29*z.hi {
			return zn, true
		}
		z = zn
	}
	return z, false
}
