package moments

import (
	"fmt"
	"math/big"
	"strings"
)

// Family is a classical weight function with exact parameters, on its
// reference interval or mapped affinely onto a finite one.
//
// The finite families are Jacobi weights (1-t)^A (1+t)^B on [-1, 1]. On an
// interval [a, b] the measure is w(t(x)) dx with t the affine map of [a, b]
// onto [-1, 1], so that masses (and rule weights) scale by (b-a)/2.
// Laguerre is x^A e^(-x) on [0, inf) (or (x-a)^A e^(-(x-a)) on [a, inf)),
// Hermite e^(-x^2) on (-inf, inf).
type Family struct {
	Name     string   // one of FamilyNames
	Alpha    *big.Rat // family parameter A (nil where the family has none)
	Beta     *big.Rat // Jacobi's B (nil for the other families)
	Interval Interval // where the rule lives
}

// FamilyNames lists the families in the order the help text gives them.
var FamilyNames = []string{"legendre", "jacobi", "gegenbauer", "chebyshev1", "chebyshev2", "chebyshev3", "chebyshev4", "laguerre", "hermite"}

var (
	ratHalf    = big.NewRat(1, 2)
	ratMinus1  = big.NewRat(-1, 1)
	ratMinusHf = big.NewRat(-1, 2)
)

// NewFamily checks a family's name, parameters and interval and returns it.
// alpha and beta may be nil: Jacobi then defaults to 0 for both, Laguerre to
// alpha = 0; Gegenbauer needs alpha. iv nil means the reference interval.
// Every error is one sentence that names the offending input.
func NewFamily(name string, alpha, beta *big.Rat, iv *Interval) (Family, error) {
	name = strings.ToLower(strings.TrimSpace(name))
	f := Family{Name: name}
	takesAlpha := map[string]bool{"jacobi": true, "gegenbauer": true, "laguerre": true}
	switch {
	case !knownFamily(name):
		return Family{}, fmt.Errorf("family %q does not exist; choose one of %s", name, strings.Join(FamilyNames, ", "))
	case alpha != nil && !takesAlpha[name]:
		return Family{}, fmt.Errorf("--alpha: the %s family has no parameter alpha", name)
	case beta != nil && name != "jacobi":
		return Family{}, fmt.Errorf("--beta: the %s family has no parameter beta (only jacobi has one)", name)
	}
	switch name {
	case "jacobi":
		f.Alpha, f.Beta = orZero(alpha), orZero(beta)
		if f.Alpha.Cmp(ratMinus1) <= 0 {
			return Family{}, fmt.Errorf("--alpha %s: the Jacobi weight (1-x)^alpha (1+x)^beta needs alpha > -1", RatString(f.Alpha))
		}
		if f.Beta.Cmp(ratMinus1) <= 0 {
			return Family{}, fmt.Errorf("--beta %s: the Jacobi weight (1-x)^alpha (1+x)^beta needs beta > -1", RatString(f.Beta))
		}
	case "laguerre":
		f.Alpha = orZero(alpha)
		if f.Alpha.Cmp(ratMinus1) <= 0 {
			return Family{}, fmt.Errorf("--alpha %s: the Laguerre weight x^alpha e^(-x) needs alpha > -1", RatString(f.Alpha))
		}
	case "gegenbauer":
		if alpha == nil {
			return Family{}, fmt.Errorf("--alpha: the gegenbauer family needs its parameter (weight (1-x^2)^(alpha-1/2), alpha > -1/2)")
		}
		f.Alpha = new(big.Rat).Set(alpha)
		if f.Alpha.Cmp(ratMinusHf) <= 0 {
			return Family{}, fmt.Errorf("--alpha %s: the Gegenbauer weight (1-x^2)^(alpha-1/2) needs alpha > -1/2", RatString(f.Alpha))
		}
	}
	ref := f.Reference()
	if iv == nil {
		f.Interval = ref
		return f, nil
	}
	switch {
	case f.IsFinite() && !iv.Finite():
		return Family{}, fmt.Errorf("--interval %s: the %s family lives on a finite interval; give finite ends", iv, name)
	case name == "laguerre" && (!iv.Lo.Finite() || iv.Hi.Inf != 1):
		return Family{}, fmt.Errorf("--interval %s: the laguerre family lives on [a, inf); give a finite left end and inf", iv)
	case name == "hermite" && (iv.Lo.Inf != -1 || iv.Hi.Inf != 1):
		return Family{}, fmt.Errorf("--interval %s: the hermite family lives on (-inf, inf)", iv)
	}
	f.Interval = *iv
	return f, nil
}

func knownFamily(name string) bool {
	for _, n := range FamilyNames {
		if n == name {
			return true
		}
	}
	return false
}

func orZero(r *big.Rat) *big.Rat {
	if r == nil {
		return new(big.Rat)
	}
	return new(big.Rat).Set(r)
}

// IsFinite reports whether the family is one of the Jacobi-type families on
// a finite interval.
func (f Family) IsFinite() bool { return f.Name != "laguerre" && f.Name != "hermite" }

// Reference returns the family's own interval.
func (f Family) Reference() Interval {
	switch f.Name {
	case "laguerre":
		return Interval{Endpoint{Value: new(big.Rat)}, Endpoint{Inf: 1}}
	case "hermite":
		return Interval{Endpoint{Inf: -1}, Endpoint{Inf: 1}}
	}
	return Unit()
}

// JacobiExponents returns (A, B) with the weight (1-t)^A (1+t)^B on
// [-1, 1], for every finite family.
func (f Family) JacobiExponents() (a, b *big.Rat) {
	switch f.Name {
	case "legendre":
		return new(big.Rat), new(big.Rat)
	case "jacobi":
		return f.Alpha, f.Beta
	case "gegenbauer":
		e := new(big.Rat).Sub(f.Alpha, ratHalf)
		return e, e
	case "chebyshev1":
		return ratMinusHf, ratMinusHf
	case "chebyshev2":
		return ratHalf, ratHalf
	case "chebyshev3":
		return ratMinusHf, ratHalf
	case "chebyshev4":
		return ratHalf, ratMinusHf
	}
	panic("moments: JacobiExponents of the infinite family " + f.Name)
}

// Label is the family with its parameters, as in "jacobi(alpha=-0.7, beta=2.3)".
func (f Family) Label() string {
	switch {
	case f.Beta != nil:
		return fmt.Sprintf("%s(alpha=%s, beta=%s)", f.Name, RatString(f.Alpha), RatString(f.Beta))
	case f.Alpha != nil:
		return fmt.Sprintf("%s(alpha=%s)", f.Name, RatString(f.Alpha))
	}
	return f.Name
}

// Weight returns the weight function in x, on the family's interval, as an
// expression in the syntax that quadwright reads (so that a rule file's
// weight can be read back): for a finite family on [a, b],
// (2/(b-a))^(A+B) (b-x)^A (x-a)^B.
func (f Family) Weight() string {
	switch f.Name {
	case "hermite":
		return "exp(-x^2)"
	case "laguerre":
		lo := f.Interval.Lo.Value
		base := "x"
		if lo.Sign() != 0 {
			base = "(x" + signed(new(big.Rat).Neg(lo)) + ")"
		}
		if f.Alpha.Sign() == 0 {
			return "exp(-" + base + ")"
		}
		return base + "^" + power(f.Alpha) + "*exp(-" + base + ")"
	}
	a, b := f.JacobiExponents()
	iv := f.Interval
	if iv.Equal(Unit()) {
		var terms []string
		if f.Name == "gegenbauer" || f.Name == "chebyshev1" || f.Name == "chebyshev2" {
			if a.Sign() != 0 {
				return "(1-x^2)^" + power(a)
			}
			return "1"
		}
		if a.Sign() != 0 {
			terms = append(terms, "(1-x)^"+power(a))
		}
		if b.Sign() != 0 {
			terms = append(terms, "(1+x)^"+power(b))
		}
		if len(terms) == 0 {
			return "1"
		}
		return strings.Join(terms, "*")
	}
	lo, hi := iv.Lo.Value, iv.Hi.Value
	var terms []string
	if s := new(big.Rat).Add(a, b); s.Sign() != 0 {
		scale := new(big.Rat).Quo(big.NewRat(2, 1), new(big.Rat).Sub(hi, lo))
		if scale.Cmp(big.NewRat(1, 1)) != 0 {
			terms = append(terms, raised("("+RatString(scale)+")", s))
		}
	}
	if a.Sign() != 0 {
		terms = append(terms, raised("("+RatString(hi)+"-x)", a))
	}
	if b.Sign() != 0 {
		base := "x"
		if lo.Sign() != 0 {
			base = "(x" + signed(new(big.Rat).Neg(lo)) + ")"
		}
		terms = append(terms, raised(base, b))
	}
	if len(terms) == 0 {
		return "1"
	}
	return strings.Join(terms, "*")
}

// raised writes base^e, or base alone for e = 1.
func raised(base string, e *big.Rat) string {
	if e.Cmp(big.NewRat(1, 1)) == 0 {
		return base
	}
	return base + "^" + power(e)
}

// power writes an exponent so that it parses back: a bare decimal (signed
// exponents are allowed) or a parenthesised fraction.
func power(r *big.Rat) string {
	s := RatString(r)
	if strings.Contains(s, "/") {
		return "(" + s + ")"
	}
	return s
}

// signed writes r with an explicit sign, for "x+1" and "x-0.5".
func signed(r *big.Rat) string {
	s := RatString(r)
	if strings.Contains(s, "/") {
		s = "(" + strings.TrimPrefix(s, "-") + ")"
		if r.Sign() < 0 {
			return "-" + s
		}
		return "+" + s
	}
	if r.Sign() < 0 {
		return s
	}
	return "+" + s
}
