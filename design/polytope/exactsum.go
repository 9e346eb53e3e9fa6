package polytope

import (
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"

	"quadwright/design/element"
)

// decimal is a printed value m 10^e read exactly, with its number of
// significant digits (those of m, trailing zeros included).
type decimal struct {
	m      *big.Int
	e      int
	digits int
}

// readDecimal reads a plain decimal "[-]d.ddd[e[+-]xx]", the form the
// rule printer writes. Anything else is an error naming it.
func readDecimal(s string) (decimal, error) {
	t := s
	neg := false
	if t != "" && (t[0] == '-' || t[0] == '+') {
		neg = t[0] == '-'
		t = t[1:]
	}
	e := 0
	if i := strings.IndexAny(t, "eE"); i >= 0 {
		x := t[i+1:]
		t = t[:i]
		sg := 1
		if x != "" && (x[0] == '-' || x[0] == '+') {
			if x[0] == '-' {
				sg = -1
			}
			x = x[1:]
		}
		if x == "" || len(x) > 6 {
			return decimal{}, fmt.Errorf("%q: not a decimal number", s)
		}
		v := 0
		for _, c := range x {
			if c < '0' || c > '9' {
				return decimal{}, fmt.Errorf("%q: not a decimal number", s)
			}
			v = 10*v + int(c-'0')
		}
		e = sg * v
	}
	// The significant digits go into a uint64 while they fit (19
	// digits), else into a string for big.Int.
	var b strings.Builder
	var acc uint64
	digits := 0
	seenPoint, any := false, false
	for i := 0; i < len(t); i++ {
		c := t[i]
		switch {
		case c == '.' && !seenPoint:
			seenPoint = true
		case c >= '0' && c <= '9':
			any = true
			if seenPoint {
				e--
			}
			if digits > 0 || c != '0' {
				digits++
				if digits <= 19 {
					acc = 10*acc + uint64(c-'0')
				} else {
					if digits == 20 {
						b.WriteString(strconv.FormatUint(acc, 10))
					}
					b.WriteByte(c)
				}
			}
		default:
			return decimal{}, fmt.Errorf("%q: not a decimal number", s)
		}
	}
	if !any {
		return decimal{}, fmt.Errorf("%q: not a decimal number", s)
	}
	d := decimal{m: new(big.Int), e: e, digits: digits}
	if digits > 19 {
		d.m.SetString(b.String(), 10)
	} else {
		d.m.SetUint64(acc)
	}
	if neg {
		d.m.Neg(d.m)
	}
	return d, nil
}

// alignDecimals returns the values as integers times one common power of
// ten 10^E (E the smallest exponent among them).
func alignDecimals(ds []decimal) ([]*big.Int, int) {
	E := math.MaxInt
	for _, d := range ds {
		if d.m.Sign() != 0 {
			E = min(E, d.e)
		}
	}
	if E == math.MaxInt {
		E = 0
	}
	out := make([]*big.Int, len(ds))
	for i, d := range ds {
		out[i] = new(big.Int).Set(d.m)
		if d.m.Sign() != 0 && d.e > E {
			out[i].Mul(out[i], pow10(d.e-E))
		}
	}
	return out, E
}

// pow10 returns 10^n (shared for small n: the caller must not change it).
func pow10(n int) *big.Int {
	if n < len(smallPow10) {
		return smallPow10[n]
	}
	return new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(n)), nil)
}

var smallPow10 = func() []*big.Int {
	out := make([]*big.Int, 64)
	for i := range out {
		out[i] = new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(i)), nil)
	}
	return out
}()

// printedRule is a printed rule read exactly: coordinate k of node i is
// c[k][i], weight i is w[i]; D is the most significant digits of any
// value.
type printedRule struct {
	c [][]decimal
	w []decimal
	D int
}

// readRule reads the printed nodes and weights (plain decimals, as the
// rule printer writes them); a value that is not one is an error naming
// it.
func readRule(nodes [][]string, weights []string, dim int) (*printedRule, error) {
	n := len(nodes)
	rd := &printedRule{c: make([][]decimal, dim), w: make([]decimal, n)}
	for k := range rd.c {
		rd.c[k] = make([]decimal, n)
	}
	for i := range nodes {
		if len(nodes[i]) != dim {
			return nil, fmt.Errorf("node %d has %d coordinates, the %s needs %d", i+1, len(nodes[i]), kindName(dim), dim)
		}
		for k, s := range nodes[i] {
			d, err := readDecimal(s)
			if err != nil {
				return nil, fmt.Errorf("node %d coordinate %d %v", i+1, k+1, err)
			}
			rd.c[k][i] = d
			rd.D = max(rd.D, d.digits)
		}
		d, err := readDecimal(weights[i])
		if err != nil {
			return nil, fmt.Errorf("weight %d %v", i+1, err)
		}
		rd.w[i] = d
		rd.D = max(rd.D, d.digits)
	}
	return rd, nil
}

// rat is d exactly.
func (d decimal) rat() *big.Rat {
	if d.e >= 0 {
		return new(big.Rat).SetInt(new(big.Int).Mul(d.m, pow10(d.e)))
	}
	return new(big.Rat).SetFrac(d.m, pow10(-d.e))
}

// point is node i exactly.
func (rd *printedRule) point(i int) []*big.Rat {
	p := make([]*big.Rat, len(rd.c))
	for k := range p {
		p[k] = rd.c[k][i].rat()
	}
	return p
}

// float is coordinate k of node i rounded to the nearest float64.
func (rd *printedRule) float(k, i int) float64 {
	d := rd.c[k][i]
	if d.m.IsInt64() && d.m.Int64() > -(1<<53) && d.m.Int64() < 1<<53 && d.e >= -22 && d.e <= 22 {
		// m and 10^|e| are exact doubles: one correctly rounded
		// operation gives the nearest double of m 10^e.
		if d.e < 0 {
			return float64(d.m.Int64()) / pow10f[-d.e]
		}
		return float64(d.m.Int64()) * pow10f[d.e]
	}
	f, _ := d.rat().Float64()
	return f
}

var pow10f = [23]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// exactSums tests the printed rule on every monomial of total degree <=
// maxDeg against the exact moments mono (in the order of
// element.Exponents(dim, maxDeg)) with the test of element.VerifyAgainst:
// monomial p of total degree d passes when
//
//	|sum_i w_i p(x_i) - I(p)| <= 10 u (1 + d) sum_i |w_i| |p(x_i)|,
//
// u = 10^(1-D), D the larger of minDigits and the most significant digits
// of any printed value. Every value is read as the exact decimal it is and
// scaled to an integer by one power of ten per coordinate (and one for the
// weights), so that the sums and the comparison run on integers: nothing
// is rounded anywhere, which is at least as strict as VerifyAgainst's sums
// at extended precision, and cheaper than its rationals. The
// WorstShare is the residual over the tolerance rounded to float64.
func exactSums(nodes [][]string, weights []string, mono []*big.Rat, dim, maxDeg, minDigits int) (element.Exactness, error) {
	rd, err := readRule(nodes, weights, dim)
	if err != nil {
		return element.Exactness{}, err
	}
	num := make([]*big.Int, len(mono))
	den := make([]*big.Int, len(mono))
	for j, m := range mono {
		num[j], den[j] = m.Num(), m.Denom()
	}
	return rd.exactSums(num, den, maxDeg, minDigits), nil
}

// exactSums is exactSums for a rule already read.
// The moments are the fractions num[j] / den[j], den[j] > 0.
func (rd *printedRule) exactSums(num, den []*big.Int, maxDeg, minDigits int) element.Exactness {
	dim, n := len(rd.c), len(rd.w)
	D := max(1, minDigits, rd.D)
	coord, wd := rd.c, rd.w
	X := make([][]*big.Int, dim)
	E := make([]int, dim)
	for k := range X {
		X[k], E[k] = alignDecimals(coord[k])
	}
	W, Ew := alignDecimals(wd)
	// pw[k][i][p] = X[k][i]^p
	pw := make([][][]*big.Int, dim)
	for k := range pw {
		pw[k] = make([][]*big.Int, n)
		for i := range pw[k] {
			pw[k][i] = make([]*big.Int, maxDeg+1)
			pw[k][i][0] = big.NewInt(1)
			for p := 1; p <= maxDeg; p++ {
				pw[k][i][p] = new(big.Int).Mul(pw[k][i][p-1], X[k][i])
			}
		}
	}
	exps := newExpIndex(dim, maxDeg).exps
	res := element.Exactness{Degree: -1, Tested: maxDeg, Digits: D}
	S, B, term, lhs, rhs, t := new(big.Int), new(big.Int), new(big.Int), new(big.Int), new(big.Int), new(big.Int)
	worst := 0.0
	for j, a := range exps {
		S.SetInt64(0)
		B.SetInt64(0)
		for i := 0; i < n; i++ {
			term.Set(W[i])
			for k, ak := range a {
				if ak > 0 {
					term.Mul(term, pw[k][i][ak])
				}
			}
			S.Add(S, term)
			if term.Sign() < 0 {
				B.Sub(B, term)
			} else {
				B.Add(B, term)
			}
		}
		// The sums are S 10^s and B 10^s; the test, times Q 10^(-s)
		// 10^(D-2) (I = P/Q), is |S Q - P 10^(-s)| 10^(D-2) <= (1 + d)
		// B Q, with the powers of ten moved to whichever side keeps them
		// whole.
		s := Ew
		d := 0
		for k, ak := range a {
			s += ak * E[k]
			d += ak
		}
		lhs.Mul(S, den[j])
		t.Set(num[j])
		if s < 0 {
			t.Mul(t, pow10(-s))
		} else if s > 0 {
			lhs.Mul(lhs, pow10(s))
		}
		lhs.Sub(lhs, t)
		lhs.Abs(lhs)
		rhs.Mul(B, den[j])
		if s > 0 {
			rhs.Mul(rhs, pow10(s))
		}
		rhs.Mul(rhs, big.NewInt(int64(1+d)))
		if D >= 2 {
			lhs.Mul(lhs, pow10(D-2))
		} else {
			rhs.Mul(rhs, pow10(2-D))
		}
		share := 0.0
		switch {
		case rhs.Sign() == 0 && lhs.Sign() != 0:
			share = math.Inf(1)
		case rhs.Sign() != 0 && lhs.Sign() != 0:
			q := new(big.Float).SetPrec(64).SetInt(lhs)
			share, _ = q.Quo(q, new(big.Float).SetPrec(64).SetInt(rhs)).Float64()
		}
		if lhs.Cmp(rhs) > 0 {
			break
		}
		worst = max(worst, share)
		if j+1 == len(exps) || sum(exps[j+1]) != d {
			res.Degree = d
			res.WorstShare = max(res.WorstShare, worst)
		}
	}
	return res
}
