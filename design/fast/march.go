package fast

import "math"

// taylorTerms bounds the Taylor series of one marching step; the terms fall
// as pi^k / k! in the oscillatory region, below 2^-110 by k = 48.
const taylorTerms = 60

// ddTerms is how many leading Taylor coefficients are carried in
// double-double; the later ones are below 4e-9 of the leading term
// (pi^k/k! < 4e-9 from k = 20 on), so float64 holds them to 4e-25.
const ddTerms = 20

// marcher advances a solution of a linear second-order differential
// equation with polynomial coefficients from zero to zero by Taylor series,
// the method of Glaser, Liu and Rokhlin, "A fast algorithm for the
// calculation of the roots of special functions", SIAM J. Sci. Comput.
// 29(4), 1420-1438, 2007. The series of u about x0 follows from the
// differential equation term by term, so no special function is
// evaluated; the leading ddTerms coefficients are carried in double-double
// and the rest in float64, so each step's relative error is a few units of
// 2^-104 and the errors of the many steps add up to well below float64's
// precision for n up to 10^7.
type marcher struct {
	// coef(x0, c, cf) fills c[2:] and cf[ddTerms:] from c[0], c[1] for
	// the expansion at x0, returning the number of terms used.
	coef func(x0 dd, c []dd, cf []float64, h0 float64) int
	c    []dd
	cf   []float64
}

func newMarcher(coef func(x0 dd, c []dd, cf []float64, h0 float64) int, nd int) *marcher {
	return &marcher{coef: coef, c: make([]dd, nd), cf: make([]float64, taylorTerms)}
}

// step finds the first zero h > 0 of sum_k c_k h^k near the guess h0 and
// returns it with the derivative of the series there. The value there is
// zero to about 2^-104 of the derivative times h, so the next step starts
// from u = 0 (the error that leaves is of the same order as the series').
func (m *marcher) step(x0 dd, u, du dd, h0 float64) (h, duh dd) {
	c, cf := m.c, m.cf
	c[0], c[1] = u, du
	nt := m.coef(x0, c, cf, h0)
	for k := 0; k < min(ddTerms, nt); k++ {
		cf[k] = c[k].hi
	}
	hf := h0
	for it := 0; it < 30; it++ {
		p, dp := hornerF(cf[:nt], hf)
		d := p / dp
		hf -= d
		if math.Abs(d) <= 1e-14*hf {
			break
		}
	}
	// One double-double Newton step from a float64-accurate zero reaches
	// double-double accuracy; the derivative is then evaluated there.
	h = ddF(hf)
	p := hornerValue(c, cf[:nt], h)
	h = ddSub(h, ddMulF(p, 1/dpAt(cf[:nt], hf)))
	duh = hornerSlope(c, cf[:nt], h)
	return h, duh
}

// dpAt is the derivative of the float64 series at h.
func dpAt(cf []float64, h float64) float64 {
	_, dp := hornerF(cf, h)
	return dp
}

// ddAddFast is a+b in double-double with one error-free sum: its error is
// a few units of 2^-106 of max(|a|, |b|), which is all a Horner sum needs.
func ddAddFast(a, b dd) dd {
	s := twoSum(a.hi, b.hi)
	return quickTwoSum(s.hi, s.lo+a.lo+b.lo)
}

// hornerValue returns sum c_k h^k, the terms k >= len(c) from cf in
// float64.
func hornerValue(c []dd, cf []float64, h dd) dd {
	n := len(cf)
	K := len(c)
	var p dd
	if n > K {
		var pf float64
		for k := n - 1; k >= K; k-- {
			pf = pf*h.hi + cf[k]
		}
		p = ddF(pf)
		K--
	} else {
		K = n - 1
		p = c[K]
		K--
	}
	for k := K; k >= 0; k-- {
		p = ddAddFast(ddMul(p, h), c[k])
	}
	return p
}

// hornerSlope returns sum k c_k h^(k-1) the same way.
func hornerSlope(c []dd, cf []float64, h dd) dd {
	n := len(cf)
	K := len(c)
	var p dd
	if n > K {
		var pf float64
		for k := n - 1; k >= K; k-- {
			pf = pf*h.hi + float64(k)*cf[k]
		}
		p = ddF(pf)
		K--
	} else {
		K = n - 1
		p = ddMulF(c[K], float64(K))
		K--
	}
	for k := K; k >= 1; k-- {
		p = ddAddFast(ddMul(p, h), ddMulF(c[k], float64(k)))
	}
	return p
}

func hornerF(c []float64, h float64) (p, dp float64) {
	n := len(c)
	p, dp = c[n-1], 0
	for k := n - 2; k >= 0; k-- {
		dp = dp*h + p
		p = p*h + c[k]
	}
	return p, dp
}

// invPair[k] = 1/((k+2)(k+1)) in double-double.
var invPair = func() []dd {
	v := make([]dd, taylorTerms)
	for k := range v {
		v[k] = ddDiv(ddF(1), ddF(float64((k+2)*(k+1))))
	}
	return v
}()
