package moments

import (
	"fmt"
	"math/big"
	"strings"

	"quadwright/precision"
)

// Endpoint is one end of an interval: a finite exact rational, or an
// infinite end (Inf = -1 for -inf, +1 for +inf, with Value nil).
type Endpoint struct {
	Inf   int
	Value *big.Rat
}

// Finite reports whether e is a finite end.
func (e Endpoint) Finite() bool { return e.Inf == 0 }

// String returns "inf", "-inf" or the exact value as a decimal when it has a
// terminating expansion, else as p/q.
func (e Endpoint) String() string {
	switch e.Inf {
	case -1:
		return "-inf"
	case 1:
		return "inf"
	}
	return RatString(e.Value)
}

// Interval is the closed support [Lo, Hi] of a measure, Lo < Hi.
type Interval struct {
	Lo, Hi Endpoint
}

// Finite reports whether both ends are finite.
func (iv Interval) Finite() bool { return iv.Lo.Finite() && iv.Hi.Finite() }

// String returns "[lo, hi]" with infinite ends shown open.
func (iv Interval) String() string {
	l, r := "[", "]"
	if !iv.Lo.Finite() {
		l = "("
	}
	if !iv.Hi.Finite() {
		r = ")"
	}
	return l + iv.Lo.String() + ", " + iv.Hi.String() + r
}

// Strings returns the two ends as the strings of the rule file's
// "domain.interval" array.
func (iv Interval) Strings() []string { return []string{iv.Lo.String(), iv.Hi.String()} }

// Equal reports whether iv and jv have the same ends.
func (iv Interval) Equal(jv Interval) bool {
	eq := func(a, b Endpoint) bool {
		if a.Inf != b.Inf {
			return false
		}
		return a.Inf != 0 || a.Value.Cmp(b.Value) == 0
	}
	return eq(iv.Lo, jv.Lo) && eq(iv.Hi, jv.Hi)
}

// Unit is [-1, 1], the reference interval of the finite families.
func Unit() Interval {
	return Interval{Endpoint{Value: big.NewRat(-1, 1)}, Endpoint{Value: big.NewRat(1, 1)}}
}

// ParseInterval reads "A,B" where each end is an exact decimal or p/q, or
// inf, +inf, -inf. It fails, naming the text, unless A < B, the left end is
// not +inf and the right end is not -inf.
func ParseInterval(s string) (Interval, error) {
	parts := strings.Split(s, ",")
	if len(parts) != 2 {
		return Interval{}, fmt.Errorf("interval %q: expected two ends separated by a comma, as in 0,1 or 0,inf", s)
	}
	var ends [2]Endpoint
	for i, p := range parts {
		p = strings.TrimSpace(p)
		switch strings.ToLower(p) {
		case "inf", "+inf", "infinity", "+infinity":
			ends[i] = Endpoint{Inf: 1}
		case "-inf", "-infinity":
			ends[i] = Endpoint{Inf: -1}
		default:
			v, err := precision.ParseExact(p)
			if err != nil {
				return Interval{}, fmt.Errorf("interval %q: %v", s, err)
			}
			ends[i] = Endpoint{Value: v}
		}
	}
	iv := Interval{ends[0], ends[1]}
	if iv.Lo.Inf == 1 || iv.Hi.Inf == -1 {
		return Interval{}, fmt.Errorf("interval %q: the left end must be below the right end", s)
	}
	if iv.Finite() && iv.Lo.Value.Cmp(iv.Hi.Value) >= 0 {
		return Interval{}, fmt.Errorf("interval %q: the left end must be below the right end", s)
	}
	return iv, nil
}

// RatString writes r as a terminating decimal when it has one (as the user
// most likely typed it), else as p/q.
func RatString(r *big.Rat) string {
	d := new(big.Int).Set(r.Denom())
	k := 0
	two, five := big.NewInt(2), big.NewInt(5)
	m := new(big.Int)
	for _, f := range []*big.Int{two, five} {
		for {
			q, rem := new(big.Int).QuoRem(d, f, m)
			if rem.Sign() != 0 {
				break
			}
			d = q
			k++
		}
	}
	if d.Cmp(big.NewInt(1)) != 0 {
		return r.RatString()
	}
	// A terminating decimal has at most k digits after the point.
	s := r.FloatString(k)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(s, "0")
		s = strings.TrimSuffix(s, ".")
	}
	return s
}
