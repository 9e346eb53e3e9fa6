package design

import (
	"context"
	"errors"
	"math"
	"math/big"
	"strconv"
	"strings"
	"testing"
	"time"

	"quadwright/moments"
)

// Exact raw moments of known measures, k < m, written as p/q lines.
func factorialMoments(m int) []*big.Rat { // e^-x on [0,inf): k! (A&S 6.1.6)
	out := make([]*big.Rat, m)
	f := big.NewInt(1)
	for k := range out {
		if k > 0 {
			f.Mul(f, big.NewInt(int64(k)))
		}
		out[k] = new(big.Rat).SetInt(f)
	}
	return out
}

// e^(-x^2)/sqrt(pi) on (-inf, inf): m_2j = (2j-1)!!/2^j, odd ones 0 (A&S 7.4.4).
func hermiteMoments(m int) []*big.Rat {
	out := make([]*big.Rat, m)
	v := big.NewRat(1, 1)
	for k := range out {
		if k%2 == 1 {
			out[k] = new(big.Rat)
			continue
		}
		if k > 0 {
			v = new(big.Rat).Mul(v, big.NewRat(int64(k-1), 2))
		}
		out[k] = v
	}
	return out
}

// weight 1 on [lo, hi]: (hi^(k+1) - lo^(k+1))/(k+1), from the integral of x^k.
func uniformMoments(m int, lo, hi int64) []*big.Rat {
	out := make([]*big.Rat, m)
	for k := range out {
		a := new(big.Int).Exp(big.NewInt(hi), big.NewInt(int64(k+1)), nil)
		b := new(big.Int).Exp(big.NewInt(lo), big.NewInt(int64(k+1)), nil)
		out[k] = new(big.Rat).SetFrac(a.Sub(a, b), big.NewInt(int64(k+1)))
	}
	return out
}

// delta(x) + dx on [0, 1]: an atom at the left end (our own scenario).
func atomMoments(m int) []*big.Rat {
	out := uniformMoments(m, 0, 1)
	out[0] = big.NewRat(2, 1)
	return out
}

func ratList(t testing.TB, vals []*big.Rat) *moments.MomentList {
	t.Helper()
	var b strings.Builder
	for _, v := range vals {
		b.WriteString(v.RatString() + "\n")
	}
	ml, err := moments.ParseMomentList(strings.NewReader(b.String()), "known.txt")
	if err != nil {
		t.Fatal(err)
	}
	return ml
}

func iv(t testing.TB, s string) moments.Interval {
	t.Helper()
	v, err := moments.ParseInterval(s)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// supportCase is a moment list of a known measure, written in a basis on
// the stated support; fail says which end must be refused ("" accepted),
// nodes the 2-point Gauss rule expected when accepted (nil: only that it
// is built and its nodes lie strictly inside).
type supportCase struct {
	name    string
	raw     []*big.Rat
	basis   string // monomial, legendre, chebyshev, laguerre
	support string
	fail    string // "left", "right" or ""
	nodes   []float64
	source  string
}

func supportCases() []supportCase {
	s2, s3 := math.Sqrt(2), 1/math.Sqrt(3)
	lag := []float64{2 - s2, 2 + s2}  // A&S Table 25.9, n = 2: 0.585786437627, 3.414213562373
	her := []float64{-1 / s2, 1 / s2} // A&S Table 25.10, n = 2: 0.707106781187
	leg := []float64{-s3, s3}         // A&S Table 25.4, n = 2: 0.577350269190
	return []supportCase{
		// a half-line measure on a finite interval
		{"laguerre on [0,1]", factorialMoments(8), "monomial", "0,1", "right", nil, "A&S 6.1.6 moments k!"},
		{"laguerre on [0,8]", factorialMoments(8), "monomial", "0,8", "right", nil, "A&S 6.1.6 moments k!; the 4-point node 9.3950709123 (A&S Table 25.9) lies above 8"},
		{"laguerre on [0,10]", factorialMoments(8), "monomial", "0,10", "", nil, "A&S Table 25.9: every node of the 4-point rule, the most 8 moments fix, lies below 10"},
		{"laguerre on [0,inf)", factorialMoments(8), "monomial", "0,inf", "", lag, "A&S Table 25.9"},
		{"laguerre on [-1,inf)", factorialMoments(8), "monomial", "-1,inf", "", lag, "A&S Table 25.9"},
		// a symmetric measure on a half-line
		{"hermite on [0,inf)", hermiteMoments(8), "monomial", "0,inf", "left", nil, "A&S 7.4.4 moments"},
		{"hermite on (-inf,0]", hermiteMoments(8), "monomial", "-inf,0", "right", nil, "A&S 7.4.4 moments"},
		{"hermite on (-inf,inf)", hermiteMoments(8), "monomial", "-inf,inf", "", her, "A&S Table 25.10"},
		// a measure on a wider interval
		{"legendre on [0,1]", uniformMoments(8, -1, 1), "monomial", "0,1", "left", nil, "integral of x^k on [-1,1]"},
		{"legendre on [-1/2,1/2]", uniformMoments(8, -1, 1), "monomial", "-1/2,1/2", "left", nil, "integral of x^k on [-1,1]"},
		{"legendre on [-1,1]", uniformMoments(8, -1, 1), "monomial", "-1,1", "", leg, "A&S Table 25.4"},
		{"legendre on [-2,2]", uniformMoments(8, -1, 1), "monomial", "-2,2", "", leg, "A&S Table 25.4 (a measure on [-1,1] lives on [-2,2])"},
		// every basis
		{"uniform [0,2], chebyshev basis on [0,1]", uniformMoments(8, 0, 2), "chebyshev", "0,1", "right", nil, "integral of x^k on [0,2]"},
		{"uniform [0,2], chebyshev basis on [0,2]", uniformMoments(8, 0, 2), "chebyshev", "0,2", "", []float64{1 - s3, 1 + s3}, "A&S Table 25.4 mapped onto [0,2]"},
		{"uniform [-1,1], legendre basis on [0,1]", uniformMoments(8, -1, 1), "legendre", "0,1", "left", nil, "integral of x^k on [-1,1]"},
		{"uniform [-1,1], laguerre basis on [0,inf)", uniformMoments(8, -1, 1), "laguerre", "0,inf", "left", nil, "integral of x^k on [-1,1]"},
		{"uniform [-1,1], laguerre basis on [-1,inf)", uniformMoments(8, -1, 1), "laguerre", "-1,inf", "", leg, "A&S Table 25.4"},
		// an atom at a closed end is on the support
		{"atom at 0 plus uniform on [0,1]", atomMoments(8), "monomial", "0,1", "", nil, "our own scenario"},
	}
}

func (c supportCase) momentSource(t testing.TB) *MomentSource {
	sup := iv(t, c.support)
	var basis moments.Basis
	switch c.basis {
	case "monomial":
		basis = moments.MonomialBasis()
	case "legendre":
		basis = moments.LegendreBasis(sup)
	case "chebyshev":
		basis = moments.ChebyshevBasis(sup)
	case "laguerre":
		basis = moments.LaguerreBasis(sup.Lo.Value)
	}
	vals, err := ratList(t, c.raw).BasisMoments(len(c.raw), basis)
	if err != nil {
		t.Fatal(err)
	}
	return NewMomentSource(ratList(t, vals), basis, sup)
}

func TestMomentsRefusedOffTheirSupport(t *testing.T) {
	for _, c := range supportCases() {
		src := c.momentSource(t)
		r, err := Gauss(context.Background(), src, Request{Points: 2, Digits: 15})
		var se *SupportError
		if c.fail != "" {
			if !errors.As(err, &se) {
				t.Errorf("%s (%s): err %v, want a SupportError", c.name, c.source, err)
				continue
			}
			if se.Upper != (c.fail == "right") {
				t.Errorf("%s: refused at the wrong end: %v", c.name, err)
			}
			if !strings.Contains(err.Error(), c.fail+" end") {
				t.Errorf("%s: %q does not name the %s end", c.name, err, c.fail)
			}
			continue
		}
		if err != nil {
			t.Errorf("%s (%s): %v", c.name, c.source, err)
			continue
		}
		sup := src.Support
		for i, s := range r.Nodes {
			x, _ := strconv.ParseFloat(s, 64)
			if c.nodes != nil && math.Abs(x-c.nodes[i]) > 1e-12 {
				t.Errorf("%s: node %d = %s, want %.12f (%s)", c.name, i, s, c.nodes[i], c.source)
			}
			if (sup.Lo.Finite() && new(big.Rat).SetFloat64(x).Cmp(sup.Lo.Value) <= 0) || (sup.Hi.Finite() && new(big.Rat).SetFloat64(x).Cmp(sup.Hi.Value) >= 0) {
				t.Errorf("%s: node %s not strictly inside %s", c.name, s, sup)
			}
		}
	}
}

// The smallest failing rule is named: k! on [0, 1] has m_1/m_0 = 1, so
// its 1-point rule sits on the right end; on [0, 3] the 1-point node 1 and
// the 2-point nodes 2 -+ sqrt(2) (3.41 > 3) make the 2-point rule the first.
func TestSupportErrorNamesSmallestRule(t *testing.T) {
	for _, c := range []struct {
		support string
		points  int
	}{{"0,1", 1}, {"0,3", 2}} {
		src := NewMomentSource(ratList(t, factorialMoments(8)), moments.MonomialBasis(), iv(t, c.support))
		_, err := src.Recurrence(4, 128)
		var se *SupportError
		if !errors.As(err, &se) || se.Points != c.points || !se.Upper {
			t.Errorf("[%s]: %v, want the %d-point rule over the right end", c.support, err, c.points)
		}
	}
}

// FuzzCheckSupport feeds arbitrary moment files and intervals through the
// support test: it must return an error or a recurrence, never panic.
func FuzzCheckSupport(f *testing.F) {
	f.Add("1\n1\n2\n6\n", "0,1")
	f.Add("2\n0\n2/3\n0\n", "-1,1")
	f.Add("1\n0.5\n0.3333\n0.25\n", "0,inf")
	f.Add("1\n-3\n1e300\n5\n", "-inf,0")
	f.Fuzz(func(t *testing.T, text, ivs string) {
		ml, err := moments.ParseMomentList(strings.NewReader(text), "fuzz.txt")
		if err != nil || len(ml.Values) > 12 {
			return
		}
		sup, err := moments.ParseInterval(ivs)
		if err != nil {
			return
		}
		for _, v := range ml.Values {
			if v.Value.Num().BitLen() > 2000 || v.Value.Denom().BitLen() > 2000 {
				return
			}
		}
		src := NewMomentSource(ml, moments.MonomialBasis(), sup)
		if n := src.MaxLen(); n > 0 {
			_, _ = src.Recurrence(n, 96)
			ctx, cancel := context.WithTimeout(context.Background(), 2*time.Second)
			defer cancel()
			if _, err := src.SupportedDigits(ctx, min(n, 3)); err == nil {
				_, _ = src.DescribeInput(ctx)
			}
		}
	})
}
