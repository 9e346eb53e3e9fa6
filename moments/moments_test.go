package moments

import (
	"context"
	"math/big"
	"strings"
	"testing"

	"quadwright/precision"
)

const testPrec = 400 // bits of the reference values

func mustInterval(t testing.TB, s string) Interval {
	t.Helper()
	iv, err := ParseInterval(s)
	if err != nil {
		t.Fatal(err)
	}
	return iv
}

func mustWeight(t testing.TB, src, iv string, breaks ...*big.Rat) *Weight {
	t.Helper()
	w, err := NewWeight(src, mustInterval(t, iv), breaks)
	if err != nil {
		t.Fatal(err)
	}
	return w
}

func rat(s string) *big.Rat {
	r, err := precision.ParseExact(s)
	if err != nil {
		panic(err)
	}
	return r
}

// checkMoments compares m with ref: |m_k - ref_k| must lie within the
// estimate errEst_k, and within 10^-digits scale_k (scale_k the integral of
// |q_k w|, the accuracy Moments promises).
func checkMoments(t *testing.T, label string, m, est []*big.Float, ref, scale func(k int) *big.Float, digits int) {
	t.Helper()
	tol := new(big.Float).SetPrec(64).SetFloat64(1)
	for i := 0; i < digits; i++ {
		tol.Quo(tol, big.NewFloat(10))
	}
	for k := range m {
		err := new(big.Float).SetPrec(testPrec).Sub(m[k], ref(k))
		err.Abs(err)
		if err.Cmp(est[k]) > 0 {
			t.Errorf("%s: moment %d = %s, want %s: error %.3g above the estimate %.3g", label, k,
				precision.FormatSig(m[k], digits+3), precision.FormatSig(ref(k), digits+3), err, est[k])
		}
		lim := new(big.Float).Mul(tol, scale(k))
		if err.Cmp(lim) > 0 {
			t.Errorf("%s: moment %d: error %.3g above 10^-%d times the scale %.3g", label, k, err, digits, scale(k))
		}
	}
}

func gammaRat(x *big.Rat) *big.Float { return precision.GammaRat(x, testPrec) }

// The Beta function: the integral of x^(a+k) (1-x)^b over [0, 1] is
// B(a+k+1, b+1) = Gamma(a+k+1) Gamma(b+1) / Gamma(a+b+k+2) (Abramowitz and
// Stegun 6.2.1, 6.2.2); the Gamma values from precision.GammaRat.
func TestMomentsJacobiBeta(t *testing.T) {
	exps := []string{"-0.5", "0.3", "2.5"}
	const n, digits = 24, 40
	for _, a := range exps {
		for _, b := range exps {
			src := "x^" + a + "*(1-x)^" + b
			w := mustWeight(t, src, "0,1")
			m, est, err := w.Moments(context.Background(), n, MonomialBasis(), digits)
			if err != nil {
				t.Fatalf("%s: %v", src, err)
			}
			ref := func(k int) *big.Float {
				ak := new(big.Rat).Add(rat(a), big.NewRat(int64(k)+1, 1))
				b1 := new(big.Rat).Add(rat(b), big.NewRat(1, 1))
				r := new(big.Float).SetPrec(testPrec).Mul(gammaRat(ak), gammaRat(b1))
				return r.Quo(r, gammaRat(new(big.Rat).Add(ak, b1)))
			}
			checkMoments(t, src, m, est, ref, ref, digits)
		}
	}
}

// The Gamma function: the integral of x^(a+k) e^-x over [0, inf) is
// Gamma(a+k+1) (Abramowitz and Stegun 6.1.1).
func TestMomentsGamma(t *testing.T) {
	const n, digits = 24, 40
	for _, a := range []string{"-0.5", "0.3", "2.5"} {
		src := "x^" + a + "*exp(-x)"
		w := mustWeight(t, src, "0,inf")
		m, est, err := w.Moments(context.Background(), n, MonomialBasis(), digits)
		if err != nil {
			t.Fatalf("%s: %v", src, err)
		}
		ref := func(k int) *big.Float { return gammaRat(new(big.Rat).Add(rat(a), big.NewRat(int64(k)+1, 1))) }
		checkMoments(t, src, m, est, ref, ref, digits)
	}
}

// The integral of x^k (-log x) over [0, 1] is 1/(k+1)^2 (Gradshteyn and
// Ryzhik 4.272, from memory; it follows from the integral of x^(k+s), 1/(k+s+1),
// differentiated in s at 0).
func TestMomentsLog(t *testing.T) {
	const n, digits = 60, 40
	w := mustWeight(t, "-log(x)", "0,1")
	m, est, err := w.Moments(context.Background(), n, MonomialBasis(), digits)
	if err != nil {
		t.Fatal(err)
	}
	ref := func(k int) *big.Float {
		return new(big.Float).SetPrec(testPrec).SetRat(big.NewRat(1, int64(k+1)*int64(k+1)))
	}
	checkMoments(t, "-log(x)", m, est, ref, ref, digits)
}

// The integral of x^k e^(-x^2) over the line is Gamma((k+1)/2) for even k
// and 0 for odd k (Abramowitz and Stegun 6.1.1 after x^2 = s); the scale of
// an odd moment is the integral of |x|^k e^(-x^2), again Gamma((k+1)/2).
func TestMomentsHermite(t *testing.T) {
	const n, digits = 30, 40
	w := mustWeight(t, "exp(-x^2)", "-inf,inf")
	m, est, err := w.Moments(context.Background(), n, MonomialBasis(), digits)
	if err != nil {
		t.Fatal(err)
	}
	scale := func(k int) *big.Float { return gammaRat(big.NewRat(int64(k)+1, 2)) }
	ref := func(k int) *big.Float {
		if k%2 == 1 {
			return new(big.Float)
		}
		return scale(k)
	}
	checkMoments(t, "exp(-x^2)", m, est, ref, scale, digits)
}

// The moments of |x - c| on [0, 1], c = 3/10, exact rationals by hand:
// c^(k+2)/((k+1)(k+2)) + (1 - c^(k+2))/(k+2) - c (1 - c^(k+1))/(k+1). The
// kink is found by subdivision when no break names it.
func TestMomentsKink(t *testing.T) {
	c := big.NewRat(3, 10)
	ref := func(k int) *big.Float {
		k1, k2 := big.NewRat(int64(k)+1, 1), big.NewRat(int64(k)+2, 1)
		ck1, ck2 := ratPowInt(c, int64(k)+1), ratPowInt(c, int64(k)+2)
		one := big.NewRat(1, 1)
		r := new(big.Rat).Quo(ck2, new(big.Rat).Mul(k1, k2))
		r.Add(r, new(big.Rat).Quo(new(big.Rat).Sub(one, ck2), k2))
		r.Sub(r, new(big.Rat).Quo(new(big.Rat).Mul(c, new(big.Rat).Sub(one, ck1)), k1))
		return new(big.Float).SetPrec(testPrec).SetRat(r)
	}
	for _, tc := range []struct {
		breaks []*big.Rat
		digits int
	}{{[]*big.Rat{c}, 40}, {nil, 30}} {
		w := mustWeight(t, "abs(x-0.3)", "0,1", tc.breaks...)
		m, est, err := w.Moments(context.Background(), 8, MonomialBasis(), tc.digits)
		if err != nil {
			t.Fatalf("breaks %v: %v", tc.breaks, err)
		}
		checkMoments(t, "abs(x-0.3)", m, est, ref, ref, tc.digits)
	}
}

// In a basis orthogonal for the weight itself every moment but the first
// vanishes: the masses are 1 (weight 1 on [0, 1]), pi (Chebyshev weight),
// sqrt(pi) (e^(-x^2)), 1 (e^-(x-2) on [2, inf)) (Abramowitz and Stegun
// 22.2). The scale of moment k is bounded by sqrt(mass times the integral of
// q_k^2 w) (Cauchy-Schwarz); the test uses the mass times max |q_k|, a
// looser bound that is easier to state: (b-a)^k/2^(2k-1) (Chebyshev),
// and generous factors elsewhere, as the tolerance here only needs to catch
// a wrong basis, which gives errors of order one.
func TestMomentsOrthogonalBases(t *testing.T) {
	pi := precision.Pi(testPrec)
	sqrtPi := precision.Sqrt(precision.Pi(testPrec))
	cases := []struct {
		src, iv string
		basis   Basis
		mass    *big.Float
	}{
		{"1", "0,1", LegendreBasis(mustInterval(t, "0,1")), big.NewFloat(1)},
		{"(1-x^2)^-0.5", "-1,1", ChebyshevBasis(mustInterval(t, "-1,1")), pi},
		{"exp(-x^2)", "-inf,inf", HermiteBasis(), sqrtPi},
		{"exp(2-x)", "2,inf", LaguerreBasis(big.NewRat(2, 1)), big.NewFloat(1)},
		{"exp(x+1)", "-inf,-1", DefaultBasis(mustInterval(t, "-inf,-1")), big.NewFloat(1)},
	}
	for _, c := range cases {
		w := mustWeight(t, c.src, c.iv)
		m, est, err := w.Moments(context.Background(), 12, c.basis, 30)
		if err != nil {
			t.Fatalf("%s: %v", c.src, err)
		}
		for k := range m {
			want := new(big.Float)
			if k == 0 {
				want = c.mass
			}
			d := new(big.Float).Sub(m[k], want)
			if d.Abs(d).Cmp(est[k]) > 0 {
				t.Errorf("%s in the %s basis: moment %d = %.6g, want %.6g within %.3g", c.src, c.basis.Name, k, m[k], want, est[k])
			}
		}
	}
}

// The basis recurrences against the explicit monic polynomials of
// Abramowitz and Stegun 22.3 at one point (degree 2 and 3).
func TestBasisPolynomials(t *testing.T) {
	x := big.NewRat(3, 7)
	cases := []struct {
		b      Basis
		p2, p3 func(x *big.Rat) *big.Rat
	}{
		{LegendreBasis(Unit()), poly("-1/3", "0", "1"), poly("0", "-3/5", "0", "1")},
		{ChebyshevBasis(Unit()), poly("-1/2", "0", "1"), poly("0", "-3/4", "0", "1")},
		{LaguerreBasis(new(big.Rat)), poly("2", "-4", "1"), poly("-6", "18", "-9", "1")},
		{HermiteBasis(), poly("-1/2", "0", "1"), poly("0", "-3/2", "0", "1")},
		{MonomialBasis(), poly("0", "0", "1"), poly("0", "0", "0", "1")},
		// Legendre on [0, 2]: q_k(x) = P~_k(x - 1).
		{LegendreBasis(mustInterval(t, "0,2")), shifted(poly("-1/3", "0", "1"), -1), shifted(poly("0", "-3/5", "0", "1"), -1)},
	}
	for _, c := range cases {
		q := evalBasis(c.b, x, 4)
		if q[2].Cmp(c.p2(x)) != 0 || q[3].Cmp(c.p3(x)) != 0 {
			t.Errorf("%s basis at 3/7: q2 = %s, q3 = %s, want %s, %s", c.b.Name, q[2].RatString(), q[3].RatString(), c.p2(x).RatString(), c.p3(x).RatString())
		}
	}
}

func poly(coef ...string) func(*big.Rat) *big.Rat {
	return func(x *big.Rat) *big.Rat {
		r := new(big.Rat)
		for i := len(coef) - 1; i >= 0; i-- {
			r.Mul(r, x)
			r.Add(r, rat(coef[i]))
		}
		return r
	}
}

func shifted(p func(*big.Rat) *big.Rat, s int64) func(*big.Rat) *big.Rat {
	return func(x *big.Rat) *big.Rat { return p(new(big.Rat).Add(x, big.NewRat(s, 1))) }
}

func evalBasis(b Basis, x *big.Rat, n int) []*big.Rat {
	q := []*big.Rat{big.NewRat(1, 1)}
	prev := new(big.Rat)
	for k := 0; k+1 < n; k++ {
		next := new(big.Rat).Sub(x, b.A(k))
		next.Mul(next, q[k])
		next.Sub(next, new(big.Rat).Mul(b.B(k), prev))
		prev = q[k]
		q = append(q, next)
	}
	return q
}

func TestMomentsErrors(t *testing.T) {
	ctx := context.Background()
	cases := []struct {
		src, iv string
		n       int
		want    string
	}{
		{"x^-1.5", "0,1", 2, "weight x^-1.5 on [0, 1]: the weight is not integrable near x = 0"},
		{"(1-x)^-1", "0,1", 2, "weight (1-x)^-1 on [0, 1]: the weight is not integrable near x = 1"},
		{"1/(1+x^2)", "-inf,inf", 3, "weight 1/(1+x^2) on (-inf, inf): the moments of degree 1 and higher do not exist"},
		{"1/(1+x)", "0,inf", 1, "weight 1/(1+x) on [0, inf): the weight is not integrable: its integral diverges toward x = inf"},
		{"abs(x-1/3)^-1", "0,1", 1, "weight abs(x-1/3)^-1 on [0, 1]: the moments do not converge to 20 digits near x = 0.3333333333 "},
	}
	for _, c := range cases {
		w := mustWeight(t, c.src, c.iv)
		_, _, err := w.Moments(ctx, c.n, MonomialBasis(), 20)
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %s...", c.src, err, c.want)
		}
	}
	cctx, cancel := context.WithCancel(ctx)
	cancel()
	if _, _, err := mustWeight(t, "1", "0,1").Moments(cctx, 3, MonomialBasis(), 20); err != context.Canceled {
		t.Errorf("cancelled context: error %v", err)
	}
}

func TestNewWeightErrors(t *testing.T) {
	cases := []struct {
		src, iv string
		breaks  []*big.Rat
		want    string
	}{
		{"x-0.5", "0,1", nil, "weight x-0.5 on [0, 1]: the weight is negative at x = "},
		{"log(x-0.5)", "0,1", nil, `weight "log(x-0.5)": position 1: log of a number <= 0, at x = `},
		{"0*x", "0,1", nil, "weight 0*x on [0, 1]: the weight is zero at every sampled point"},
		{"1", "0,1", []*big.Rat{big.NewRat(1, 1)}, "--breaks 1: the break lies outside the open interval [0, 1]"},
		{"x^", "0,1", nil, `weight "x^": position 3:`},
	}
	for _, c := range cases {
		_, err := NewWeight(c.src, mustInterval(t, c.iv), c.breaks)
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("NewWeight(%q): error %v, want %s...", c.src, err, c.want)
		}
	}
	w := mustWeight(t, "-log(x)", "0,1", big.NewRat(1, 2), big.NewRat(1, 4), big.NewRat(1, 2))
	if len(w.Breaks) != 2 || w.Breaks[0].Cmp(big.NewRat(1, 4)) != 0 {
		t.Errorf("breaks %v, want [1/4 1/2]", w.Breaks)
	}
	if got := w.Label(); got != "weight -log(x) on [0, 1]" {
		t.Errorf("Label() = %q", got)
	}
}

// Discretize reproduces the moments 1/(k+1)^2 of -log(x) (see TestMomentsLog)
// with positive masses at ascending nodes inside the interval.
func TestDiscretize(t *testing.T) {
	const degree, digits = 39, 30
	w := mustWeight(t, "-log(x)", "0,1")
	x, c, err := w.Discretize(context.Background(), degree, digits)
	if err != nil {
		t.Fatal(err)
	}
	for j := range x {
		if c[j].Sign() <= 0 || x[j].Sign() <= 0 || x[j].Cmp(big.NewFloat(1)) >= 0 || (j > 0 && x[j].Cmp(x[j-1]) <= 0) {
			t.Fatalf("node %d: x = %v, c = %v: want ascending nodes in (0, 1) and positive masses", j, x[j], c[j])
		}
	}
	tol := new(big.Float).SetFloat64(1e-30)
	for k := 0; k <= degree; k++ {
		s := new(big.Float).SetPrec(testPrec)
		for j := range x {
			p := new(big.Float).SetPrec(testPrec).SetInt64(1)
			for i := 0; i < k; i++ {
				p.Mul(p, x[j])
			}
			s.Add(s, p.Mul(p, c[j]))
		}
		want := new(big.Float).SetPrec(testPrec).SetRat(big.NewRat(1, int64(k+1)*int64(k+1)))
		d := new(big.Float).Sub(s, want)
		d.Quo(d, want)
		if d.Abs(d).Cmp(tol) > 0 {
			t.Errorf("degree %d: discrete moment %.35g, want %.35g", k, s, want)
		}
	}
}

// Moments and Discretize of one weight share one quadrature: the discrete
// moments of the measure are the moments, to rounding (2^-150 relative to
// the scale, the working precision less guard bits; the scale of q_k w for
// weight 1 on [0, 1] is below 2 max|q_k| = 2 q_k(1), by Abramowitz and
// Stegun 22.14.7 for Legendre polynomials).
func TestDiscretizeMatchesMoments(t *testing.T) {
	w := mustWeight(t, "sqrt(x)*exp(x)", "0,1")
	const deg = 15
	basis := DefaultBasis(w.Interval)
	m, _, err := w.Moments(context.Background(), deg+1, basis, 30)
	if err != nil {
		t.Fatal(err)
	}
	x, c, err := w.Discretize(context.Background(), deg, 30)
	if err != nil {
		t.Fatal(err)
	}
	sums := make([]*big.Float, deg+1)
	for k := range sums {
		sums[k] = new(big.Float).SetPrec(testPrec)
	}
	for j := range x {
		prev, cur := new(big.Float).SetPrec(testPrec), new(big.Float).SetPrec(testPrec).Set(c[j])
		for k := 0; k <= deg; k++ {
			sums[k].Add(sums[k], cur)
			next := new(big.Float).SetPrec(testPrec).Sub(x[j], new(big.Float).SetPrec(testPrec).SetRat(basis.A(k)))
			next.Mul(next, cur)
			next.Sub(next, new(big.Float).SetPrec(testPrec).Mul(new(big.Float).SetPrec(testPrec).SetRat(basis.B(k)), prev))
			prev, cur = cur, next
		}
	}
	qAtOne := evalBasis(basis, big.NewRat(1, 1), deg+1)
	for k := 0; k <= deg; k++ {
		s := sums[k]
		d := new(big.Float).Sub(s, m[k])
		lim := new(big.Float).SetPrec(64).SetRat(qAtOne[k])
		lim.Mul(lim, new(big.Float).SetMantExp(big.NewFloat(1), -150))
		if d.Abs(d).Cmp(lim) > 0 {
			t.Errorf("degree %d: discrete moment %.30g, moment %.30g", k, s, m[k])
		}
	}
}

// BenchmarkMomentsLog200Digits40 and BenchmarkMomentsLog2000Digits40 time
// the modified moments (in the Legendre basis on [0, 1]) of -log(x) that the
// 100- and 1000-point rules at 32 digits need. Targets: well under 0.2 s and
// a few seconds. The node cache is warm after the first iteration, as it is
// for every weight after the first in a process.
func BenchmarkMomentsLog200Digits40(b *testing.B)  { benchLog(b, 200) }
func BenchmarkMomentsLog2000Digits40(b *testing.B) { benchLog(b, 2000) }

func benchLog(b *testing.B, n int) {
	basis := DefaultBasis(mustInterval(b, "0,1"))
	for i := 0; i < b.N; i++ {
		// A new weight each time: a weight remembers its last integration.
		w := mustWeight(b, "-log(x)", "0,1")
		if _, _, err := w.Moments(context.Background(), n, basis, 40); err != nil {
			b.Fatal(err)
		}
	}
}
