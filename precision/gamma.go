package precision

import (
	"math"
	"math/big"
	"sync"
)

// Exact cases: n! for n below this is formed as an integer (big.Int.MulRange)
// and rounded once.
const maxExactFactorial = 3000

// LogGamma returns ln|Gamma(x)| rounded to x.Prec() bits, within 1 ulp,
// and the sign of Gamma(x) (+1 or -1). x must be finite and not 0 or a
// negative integer, where Gamma has poles (that panics: a programmer error).
// LogGamma(1) = LogGamma(2) = 0 exactly.
//
// The method is the Stirling series, after shifting x up and with the
// reflection formula Gamma(x) Gamma(1-x) = pi/sin(pi x) for x < 1/2 (NIST
// Digital Library of Mathematical Functions, eqs. 5.5.3 and 5.11.1, with the
// bound on its remainder of DLMF 5.11(ii)); see logGammaPos. Near the zeros
// of ln|Gamma| (x near 1 and 2, and one in each interval (-n-1, -n)) the
// series cancels; the working precision is then raised until the error
// bound, which is carried through every step, is below 2^-40 ulp.
func LogGamma(x *big.Float) (*big.Float, int) {
	if x.IsInf() || (x.Sign() <= 0 && x.IsInt()) {
		panic("precision: LogGamma at a pole or an infinity")
	}
	return logGammaAdaptive(floatGammaArg{x}, resultPrec(x))
}

// LogGammaRat returns ln|Gamma(x)| rounded to prec bits, within 1 ulp, and
// the sign of Gamma(x), for the exact rational x (not 0 or a negative
// integer: that panics), as LogGamma does for a binary x.
func LogGammaRat(x *big.Rat, prec uint) (*big.Float, int) {
	if x.IsInt() && x.Sign() <= 0 {
		panic("precision: LogGammaRat at a pole")
	}
	return logGammaAdaptive(ratGammaArg{x}, prec)
}

// Gamma returns Gamma(x) rounded to x.Prec() bits: correctly rounded when
// x is a positive integer below 3000 ((x-1)! formed exactly), otherwise
// within 1 ulp, as sign*Exp(LogGamma) with ln|Gamma| carrying as many extra
// bits as its magnitude has. x must be finite and not 0 or a negative
// integer (that panics). The result is +Inf or 0 beyond the exponent range
// of big.Float (|ln Gamma(x)| > 1.48e9).
func Gamma(x *big.Float) *big.Float {
	if x.IsInf() || (x.Sign() <= 0 && x.IsInt()) {
		panic("precision: Gamma at a pole or an infinity")
	}
	p := resultPrec(x)
	if x.IsInt() && x.Cmp(big.NewFloat(maxExactFactorial)) < 0 {
		n, _ := x.Int64()
		return factorial(n-1, p)
	}
	return gammaFromLog(floatGammaArg{x}, p)
}

// GammaRat returns Gamma(x) rounded to prec bits for the exact rational x
// (not 0 or a negative integer: that panics). Positive integers below 3000
// give the correctly rounded (n-1)!; half-integers m+1/2 with |m| < 3000
// give the exact rational multiple of sqrt(pi) of DLMF 5.4.6 and 5.5.2,
// rounded within 1 ulp; other x go through LogGammaRat as Gamma does.
func GammaRat(x *big.Rat, prec uint) *big.Float {
	if x.IsInt() && x.Sign() <= 0 {
		panic("precision: GammaRat at a pole")
	}
	if x.IsInt() && x.Num().IsInt64() && x.Num().Int64() < maxExactFactorial {
		return factorial(x.Num().Int64()-1, prec)
	}
	if c := halfIntegerFactor(x); c != nil {
		w := prec + guardBits
		s := Sqrt(Pi(w))
		s.Mul(s, new(big.Float).SetPrec(w).SetRat(c))
		return new(big.Float).SetPrec(prec).Set(s)
	}
	return gammaFromLog(ratGammaArg{x}, prec)
}

// factorial returns n! correctly rounded at prec bits, 0 <= n.
func factorial(n int64, prec uint) *big.Float {
	f := new(big.Int).MulRange(1, n)
	if n == 0 {
		f.SetInt64(1)
	}
	return new(big.Float).SetPrec(prec).SetInt(f)
}

// halfIntegerFactor returns Gamma(x)/sqrt(pi) for x = m + 1/2,
// |m| < maxExactFactorial: (2m)!/(4^m m!) for m >= 0 and
// (-4)^k k!/(2k)! for m = -k < 0; nil for any other x.
func halfIntegerFactor(x *big.Rat) *big.Rat {
	if x.Denom().Cmp(big.NewInt(2)) != 0 {
		return nil
	}
	twoM := new(big.Int).Sub(x.Num(), big.NewInt(1)) // 2m
	if !twoM.IsInt64() || abs64(twoM.Int64()) >= 2*maxExactFactorial {
		return nil
	}
	m := twoM.Int64() / 2
	k := abs64(m)
	num := new(big.Int).MulRange(k+1, 2*k) // (2k)!/k!
	if k == 0 {
		num.SetInt64(1)
	}
	den := new(big.Int).Lsh(big.NewInt(1), uint(2*k))
	if m >= 0 {
		return new(big.Rat).SetFrac(num, den)
	}
	r := new(big.Rat).SetFrac(den, num)
	if k%2 == 1 {
		r.Neg(r)
	}
	return r
}

func abs64(v int64) int64 {
	if v < 0 {
		return -v
	}
	return v
}

// gammaFromLog returns sign*exp(ln|Gamma(x)|) at prec bits within 1 ulp.
func gammaFromLog(x gammaArg, prec uint) *big.Float {
	q := prec + guardBits
	for {
		lg, sign := logGammaAdaptive(x, q)
		// The absolute error of lg, below 2^(e-q), is the relative error
		// of the exponential: it must stay below 2^-(prec+40).
		if e := lg.MantExp(nil); lg.Sign() != 0 && e > int(q)-int(prec)-40 {
			q = prec + 48 + uint(e)
			continue
		}
		g := Exp(lg)
		if sign < 0 {
			g.Neg(g)
		}
		return new(big.Float).SetPrec(prec).Set(g)
	}
}

// A gammaArg is the argument x of ln Gamma, exact, with the few values
// derived from it that the reflection formula needs rounded only once.
type gammaArg interface {
	// at returns x rounded to w bits.
	at(w uint) *big.Float
	// reflect returns the nearest integer n to x, x-n in [-1/2, 1/2]
	// and 1-x, the latter two rounded to w bits.
	reflect(w uint) (n *big.Int, frac, oneMinus *big.Float)
	// smallInt returns x and true if x is an integer in [1, maxExactFactorial).
	smallInt() (int64, bool)
}

type floatGammaArg struct{ x *big.Float }

func (a floatGammaArg) at(w uint) *big.Float { return new(big.Float).SetPrec(w).Set(a.x) }

func (a floatGammaArg) reflect(w uint) (*big.Int, *big.Float, *big.Float) {
	r := new(big.Float).SetPrec(a.x.Prec()+1).Add(a.x, big.NewFloat(0.5))
	n, _ := r.Int(nil) // truncates toward zero
	if r.Sign() < 0 && !r.IsInt() {
		n.Sub(n, big.NewInt(1))
	}
	// x - n is exact at x's precision: its bits are x's bits below the
	// units place.
	f := new(big.Float).SetPrec(a.x.Prec() + 1).SetInt(n)
	f.Sub(a.x, f)
	f.SetPrec(w)
	om := new(big.Float).SetPrec(w).Sub(big.NewFloat(1), a.x)
	return n, f, om
}

func (a floatGammaArg) smallInt() (int64, bool) {
	if !a.x.IsInt() || a.x.Sign() <= 0 || a.x.Cmp(big.NewFloat(maxExactFactorial)) >= 0 {
		return 0, false
	}
	n, _ := a.x.Int64()
	return n, true
}

type ratGammaArg struct{ x *big.Rat }

func (a ratGammaArg) at(w uint) *big.Float { return new(big.Float).SetPrec(w).SetRat(a.x) }

func (a ratGammaArg) reflect(w uint) (*big.Int, *big.Float, *big.Float) {
	r := new(big.Rat).Add(a.x, big.NewRat(1, 2))
	n := new(big.Int).Div(r.Num(), r.Denom()) // Euclidean: floor for den > 0
	f := new(big.Rat).Sub(a.x, new(big.Rat).SetInt(n))
	om := new(big.Rat).Sub(big.NewRat(1, 1), a.x)
	return n, new(big.Float).SetPrec(w).SetRat(f), new(big.Float).SetPrec(w).SetRat(om)
}

func (a ratGammaArg) smallInt() (int64, bool) {
	if !a.x.IsInt() || !a.x.Num().IsInt64() {
		return 0, false
	}
	n := a.x.Num().Int64()
	return n, n >= 1 && n < maxExactFactorial
}

// logGammaAdaptive returns ln|Gamma(x)| at prec bits within 1 ulp and the
// sign of Gamma(x), raising the working precision until the carried error
// bound is below 2^-40 ulp of the result.
func logGammaAdaptive(x gammaArg, prec uint) (*big.Float, int) {
	if n, ok := x.smallInt(); ok && n <= 2 {
		return new(big.Float).SetPrec(prec), 1
	}
	// The Stirling terms are about max(x0, |x|) ln max(x0, |x|) in size,
	// and as many bits as that has cancel in the sum: start with them.
	mag := x.at(64)
	mag.Abs(mag)
	if x0 := big.NewFloat(x0Of(prec + guardBits)); mag.Cmp(x0) < 0 {
		mag = x0
	}
	ex := max(mag.MantExp(nil), 0)
	w := prec + guardBits + uint(ex+2*bitLen(ex))
	for {
		val, sign, errExp := logGammaAt(x, w)
		if val.Sign() != 0 {
			deficit := errExp - (val.MantExp(nil) - int(prec) - 40)
			if deficit <= 0 {
				return new(big.Float).SetPrec(prec).Set(val), sign
			}
			w += uint(deficit) + 32
			continue
		}
		w *= 2
	}
}

// logGammaAt returns ln|Gamma(x)| computed at w bits, the sign of
// Gamma(x) and errExp such that the absolute error is below 2^errExp.
func logGammaAt(x gammaArg, w uint) (val *big.Float, sign int, errExp int) {
	if n, ok := x.smallInt(); ok {
		f := factorial(n-1, w)
		l := Log(f)
		return l, 1, l.MantExp(nil) - int(w) + 2
	}
	v := x.at(w)
	if v.Cmp(big.NewFloat(0.5)) >= 0 {
		val, errExp = logGammaPos(v, w, nil)
		return val, 1, errExp
	}
	// Reflection: ln|Gamma(x)| = ln pi - ln|sin(pi x)| - ln Gamma(1-x),
	// with sin(pi x) = (-1)^n sin(pi (x-n)) free of cancellation; the sine
	// joins the shift product of logGammaPos, to save a logarithm.
	n, f, om := x.reflect(w)
	s := new(big.Float).SetPrec(w).Mul(f, Pi(w))
	s = Sin(s)
	sign = s.Sign()
	if n.Bit(0) == 1 {
		sign = -sign
	}
	lg, lgErr := logGammaPos(om, w, s.Abs(s))
	lp := lnPi.get(w)
	val = new(big.Float).SetPrec(w).Sub(lp, lg)
	return val, sign, max(lgErr, lp.MantExp(nil)-int(w)) + 1
}

// logGammaPos returns ln Gamma(y0) + ln div (ln Gamma(y0) if div is nil) at
// w bits for y0 >= 1/2 given at w bits and div > 0 within 2 ulp at w bits,
// and errExp with the absolute error below 2^errExp; the bound includes the
// effect of an error of 1 ulp in y0 itself.
//
// With N = max(0, ceil(x0 - y0)), x0 about w/2, and y = y0 + N,
//
//	ln Gamma(y0) = (y - 1/2) ln y - y + ln(2 pi)/2
//	             + sum_{k=1}^{m} B_2k / (2k (2k-1) y^(2k-1))
//	             - ln(y0 (y0+1) ... (y0+N-1)),
//
// the Stirling series (DLMF 5.11.1) and the recurrence Gamma(y+1) = y Gamma(y).
// For real y > 0 the remainder after m terms has the sign of, and is
// smaller in magnitude than, the first term omitted (DLMF 5.11(ii)), so m is
// the number of terms before one falls below the error allowance. The
// Bernoulli numbers come from bernoulli.
func logGammaPos(y0 *big.Float, w uint, div *big.Float) (*big.Float, int) {
	x0 := x0Of(w)
	n := int64(0)
	if yf, _ := y0.Float64(); yf < x0 {
		n = int64(math.Ceil(x0 - yf))
	}
	// y0 + k is exact at w+32 bits: y0 >= 1/2 has w bits and k < 2^31.
	y := new(big.Float).SetPrec(w + 32).Set(y0)
	var lnP *big.Float
	if n > 0 {
		prod := new(big.Float).SetPrec(w).Set(y0)
		one := big.NewFloat(1)
		for k := int64(1); k < n; k++ {
			y.Add(y, one)
			prod.Mul(prod, y)
		}
		y.Add(y, one)
		if div != nil {
			prod.Quo(prod, div)
		}
		lnP = Log(prod)
	} else if div != nil {
		lnP = Log(new(big.Float).SetPrec(w).Quo(big.NewFloat(1), div))
	}
	lny := Log(y)
	val := new(big.Float).SetPrec(w).Sub(y, big.NewFloat(0.5))
	val.Mul(val, lny)
	mag := max(val.MantExp(nil), y.MantExp(nil), 1)
	if lnP != nil {
		mag = max(mag, lnP.MantExp(nil))
	}
	errExp := mag + bitLen(int(2*n+8)) + 3 - int(w)
	val.Sub(val, y)
	val.Add(val, lnSqrt2Pi.get(w))
	val.Add(val, stirlingSum(y, w, errExp-2))
	if lnP != nil {
		val.Sub(val, lnP)
	}
	return val, errExp
}

// x0Of returns the point above which the Stirling series is summed at w
// bits: there its smallest term, about e^(-2 pi x0), is far below 2^-w, and
// about w/10 terms reach 2^-w (310 at 3400 bits); below it the argument is
// shifted, at one multiplication per unit.
func x0Of(w uint) float64 {
	return float64(w/2 + 16)
}

// stirlingSum returns sum_{k=1}^{m} B_2k/(2k(2k-1) y^(2k-1)) at w bits,
// with m the first index after which the next term is below 2^limit.
func stirlingSum(y *big.Float, w uint, limit int) *big.Float {
	ly := float64(y.MantExp(nil)) // log2 y <= ly
	if yf, _ := y.Float64(); yf < math.MaxFloat64 {
		ly = math.Log2(yf)
	}
	m := 0
	for k := 1; k < 1<<20; k++ {
		// log2 |B_2k| <= 1 + log2((2k)!) - 2k log2(2 pi) + 1 (zeta(2k) < 2)
		lg, _ := math.Lgamma(float64(2*k + 1))
		est := 2 + lg/math.Ln2 - float64(2*k)*math.Log2(2*math.Pi) -
			math.Log2(float64(2*k*(2*k-1))) - float64(2*k-1)*ly
		if est < float64(limit) {
			break
		}
		m = k
	}
	c := stirlingCoefficients(m, w)
	inv := new(big.Float).SetPrec(w).Quo(big.NewFloat(1), y)
	inv2 := new(big.Float).SetPrec(w).Mul(inv, inv)
	sum := new(big.Float).SetPrec(w)
	term := new(big.Float).SetPrec(w)
	for k := 1; k <= m; k++ {
		sum.Add(sum, term.Mul(c[k], inv))
		inv.Mul(inv, inv2)
	}
	return sum
}

var lnPi = constant{compute: func(w uint) *big.Float {
	return Log(Pi(w + 16)).SetPrec(w)
}}

var lnSqrt2Pi = constant{compute: func(w uint) *big.Float {
	v := new(big.Float).SetPrec(w+16).Add(Log(Pi(w+16)), Ln2(w+16))
	v.SetMantExp(v, -1)
	return v.SetPrec(w)
}}

// stirlingCache holds B_2k/(2k(2k-1)), k >= 1, as exact rationals and
// rounded at prec bits (index 0 unused).
var stirlingCache struct {
	mu   sync.Mutex
	rat  []*big.Rat
	prec uint
	flt  []*big.Float
}

// stirlingCoefficients returns B_2k/(2k(2k-1)) for 1 <= k <= m (index 0
// unused) rounded at w bits or more. The slice and its elements are shared
// and must not be modified.
func stirlingCoefficients(m int, w uint) []*big.Float {
	c := &stirlingCache
	c.mu.Lock()
	defer c.mu.Unlock()
	if len(c.flt) > m && c.prec >= w {
		return c.flt
	}
	if len(c.rat) <= m {
		b := bernoulli(max(m, 2*len(c.rat)))
		c.rat = make([]*big.Rat, len(b))
		for k := 1; k < len(b); k++ {
			c.rat[k] = new(big.Rat).Quo(b[k], big.NewRat(int64(2*k*(2*k-1)), 1))
		}
	}
	c.prec = max(c.prec, w)
	c.flt = make([]*big.Float, len(c.rat))
	for k := 1; k < len(c.rat); k++ {
		c.flt[k] = new(big.Float).SetPrec(c.prec).SetRat(c.rat[k])
	}
	return c.flt
}

// bernoulli returns B_2k exactly for 1 <= k <= n (index 0 unused), from the
// tangent numbers T_k computed by the integer recurrence of
//
//	R. P. Brent and D. Harvey, "Fast computation of Bernoulli, Tangent and
//	Secant numbers", in Computational and Analytical Mathematics, Springer
//	Proceedings in Mathematics & Statistics 50 (2013) 127-142, Algorithm
//	TangentNumbers,
//
// and B_2k = (-1)^(k-1) 2k T_k / (4^k (4^k - 1)). O(n^2) big.Int
// operations on numbers of O(n log n) bits.
func bernoulli(n int) []*big.Rat {
	t := make([]*big.Int, n+1)
	t[1] = big.NewInt(1)
	for k := 2; k <= n; k++ {
		t[k] = new(big.Int).Mul(t[k-1], big.NewInt(int64(k-1)))
	}
	tmp := new(big.Int)
	for k := 2; k <= n; k++ {
		for j := k; j <= n; j++ {
			tmp.Mul(t[j-1], big.NewInt(int64(j-k)))
			t[j].Mul(t[j], big.NewInt(int64(j-k+2)))
			t[j].Add(t[j], tmp)
		}
	}
	b := make([]*big.Rat, n+1)
	for k := 1; k <= n; k++ {
		num := new(big.Int).Mul(t[k], big.NewInt(int64(2*k)))
		if k%2 == 0 {
			num.Neg(num)
		}
		four := new(big.Int).Lsh(big.NewInt(1), uint(2*k))
		den := new(big.Int).Sub(four, big.NewInt(1))
		den.Mul(den, four)
		b[k] = new(big.Rat).SetFrac(num, den)
	}
	return b
}
