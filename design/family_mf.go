package design

import (
	"math"
	"math/big"
	"runtime"
	"sync"

	"quadwright/design/fast"
	"quadwright/precision"
)

// mfMaxDigits is the largest digit count whose first stage starts from
// mfStart: up to quadruple precision's 34 digits a start with about 100
// correct bits leaves one Newton step at the stage's precision.
const mfMaxDigits = 34

// mfStartBits is the precision the start values are handed over at: the
// bits of a double-double, which gaussStage lowers by its rounding margin
// (2 log2 n + 8) before it plans the Newton steps.
const mfStartBits = 106

// mfMinPoints is the smallest rule that takes mfStart: below it the
// eigenvalue start of the Jacobi matrix costs less than the double-double
// refinement (measured with BenchmarkMFLegendre100Digits34).
const mfMinPoints = 200

// mfOff turns mfStart off (benchmarks against the eigenvalue start).
var mfOff = false

// mfStart returns starting values (ascending, mfStartBits bits each) for
// the first stage of the n-point Gauss rule of a finite classical family,
// or false when the route does not apply or did not settle (the caller then
// takes the float64 eigenvalue start as before).
//
// The float64 start comes from the asymptotic expansions of design/fast
// (Bogaert's for Legendre, Hale and Townsend's for Jacobi exponents in
// (-1, 5]), in O(n) instead of the O(n^2) eigenvalue start; each node is
// then refined by Newton's method on the recurrence rec in double-double
// (precision.DD), which takes a float64-accurate start to about 100 bits in
// one or two steps. These values are only starting values: the stage
// refines them at its own precision, and everything printed is confirmed
// by the second stage and the exactness test as for any other start.
func mfStart(m Measure, rec *Recurrence, n, digits int) ([]*big.Float, bool) {
	fs, ok := m.(FamilySource)
	if !ok || mfOff || digits < 1 || digits > mfMaxDigits || n < mfMinPoints || !fs.Family.IsFinite() {
		return nil, false
	}
	iv := fs.Family.Interval
	if !iv.Finite() {
		return nil, false
	}
	ea, eb := fs.Family.JacobiExponents()
	a, _ := ea.Float64()
	b, _ := eb.Float64()
	t := make([]float64, n)
	w := make([]float64, n)
	if a == 0 && b == 0 {
		fast.Legendre(n, t, w)
	} else if fast.Jacobi(n, a, b, t, w) != nil {
		return nil, false
	}
	lo, _ := iv.Lo.Value.Float64()
	hi, _ := iv.Hi.Value.Float64()
	c, h := (lo+hi)/2, (hi-lo)/2
	al := make([]precision.DD, n)
	be := make([]precision.DD, n)
	symmetric := true
	for k := 0; k < n; k++ {
		al[k] = precision.DDFromBig(rec.Alpha[k])
		be[k] = precision.DDFromBig(rec.Beta[k])
		if !finiteDD(al[k]) || !finiteDD(be[k]) {
			return nil, false
		}
		symmetric = symmetric && rec.Alpha[k].Sign() == 0
	}
	xs := make([]precision.DD, n)
	first := 0
	if symmetric {
		first = n / 2
	}
	ok = parallelRange(first, n, func(i int) bool {
		x, good := ddNewton(al, be, precision.DDFrom(c+h*t[i]))
		xs[i] = x
		return good
	})
	if !ok {
		return nil, false
	}
	if symmetric {
		for i := 0; i < first; i++ {
			xs[i] = xs[n-1-i].Neg()
		}
		if n%2 == 1 {
			xs[first] = precision.DD{}
		}
	}
	out := make([]*big.Float, n)
	for i, x := range xs {
		if i > 0 && !(x.Hi > xs[i-1].Hi || (x.Hi == xs[i-1].Hi && x.Lo > xs[i-1].Lo)) {
			return nil, false
		}
		v := new(big.Float).SetPrec(mfStartBits).SetFloat64(x.Hi)
		out[i] = v.Add(v, new(big.Float).SetFloat64(x.Lo))
	}
	return out, true
}

func finiteDD(x precision.DD) bool {
	return !math.IsInf(x.Hi, 0) && !math.IsNaN(x.Hi) && math.Abs(x.Hi) < 1e290 && (x.Hi == 0 || math.Abs(x.Hi) > 1e-290)
}

// ddNewton refines x towards a zero of pi_n (n = len(al)) by Newton's
// method on the forward recurrence in double-double. As in riseNewton the
// step's own values say how good the new iterate is, about K delta^2 with
// K = |pi_n”/(2 pi_n')| (a float64 side chain): the iteration stops once
// that is below 2^-100 |x|, about double-double's own level, usually after
// one step from the asymptotic start. It reports false when it did not get
// there.
func ddNewton(al, be []precision.DD, x precision.DD) (precision.DD, bool) {
	const maxIter = 8
	for it := 0; it < maxIter; it++ {
		p, dp, h := ddEval(al, be, x)
		if p.Hi == 0 {
			return x, true
		}
		if dp.Hi == 0 || !finite(p.Hi) || !finite(dp.Hi) || !finite(h) {
			return x, false
		}
		d := p.Quo(dp)
		x = x.Sub(d)
		k := math.Abs(h / dp.Hi)
		if x.Hi == 0 || k*d.Hi*d.Hi <= math.Ldexp(math.Abs(x.Hi), -100) || math.Abs(d.Hi) <= math.Ldexp(math.Abs(x.Hi), -100) {
			return x, true
		}
	}
	return x, false
}

func finite(v float64) bool { return !math.IsInf(v, 0) && !math.IsNaN(v) }

// ddEval returns pi_n(x) and pi_n'(x) by the forward recurrence in
// double-double, and pi_n”(x)/2 in float64. The monic values shrink like
// (scale/2)^n; all three are rescaled by a power of two every 32 steps so
// that they stay in float64 range (a common factor, which the quotients
// p/p' and p”/p' do not see).
func ddEval(al, be []precision.DD, x precision.DD) (precision.DD, precision.DD, float64) {
	p0, p1 := precision.DDFrom(1), x.SubFast(al[0])
	d0, d1 := precision.DD{}, precision.DDFrom(1)
	h0, h1 := 0.0, 0.0
	for k := 1; k < len(al); k++ {
		t := x.SubFast(al[k])
		p2 := t.Mul(p1).SubFast(be[k].Mul(p0))
		d2 := t.Mul(d1).SubFast(be[k].Mul(d0)).AddFast(p1)
		h2 := t.Hi*h1 - be[k].Hi*h0 + d1.Hi
		p0, p1, d0, d1, h0, h1 = p1, p2, d1, d2, h1, h2
		if k%32 == 0 {
			m := math.Max(math.Max(math.Abs(p1.Hi), math.Abs(d1.Hi)), math.Max(math.Abs(p0.Hi), math.Abs(d0.Hi)))
			m = math.Max(m, math.Max(math.Abs(h0), math.Abs(h1)))
			if m == 0 || !finite(m) {
				break
			}
			_, e := math.Frexp(m)
			s := math.Ldexp(1, -e)
			p0, p1, d0, d1 = p0.MulFloat(s), p1.MulFloat(s), d0.MulFloat(s), d1.MulFloat(s)
			h0, h1 = h0*s, h1*s
		}
	}
	return p1, d1, h1
}

// parallelRange calls do for lo..hi-1 on GOMAXPROCS workers, each node on
// its own (the result does not depend on the core count), and reports
// whether every call returned true.
func parallelRange(lo, hi int, do func(i int) bool) bool {
	workers := runtime.GOMAXPROCS(0)
	if hi-lo < 64 {
		workers = 1
	}
	var wg sync.WaitGroup
	fail := make([]bool, workers)
	for wk := 0; wk < workers; wk++ {
		a, b := lo+wk*(hi-lo)/workers, lo+(wk+1)*(hi-lo)/workers
		wg.Add(1)
		go func(wk, a, b int) {
			defer wg.Done()
			for i := a; i < b; i++ {
				if !do(i) {
					fail[wk] = true
					return
				}
			}
		}(wk, a, b)
	}
	wg.Wait()
	for _, f := range fail {
		if f {
			return false
		}
	}
	return true
}
