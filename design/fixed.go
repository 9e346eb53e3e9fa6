package design

import (
	"fmt"
	"math/big"

	"quadwright/moments"
	"quadwright/precision"
)

// side says where z lies relative to the support iv: -1 at or left of the
// left end, +1 at or right of the right end, 0 strictly inside. An infinite
// end has nothing beyond it.
func side(z *big.Rat, iv moments.Interval) int {
	if iv.Lo.Finite() && z.Cmp(iv.Lo.Value) <= 0 {
		return -1
	}
	if iv.Hi.Finite() && z.Cmp(iv.Hi.Value) >= 0 {
		return 1
	}
	return 0
}

// outside reports whether x lies outside the closed interval iv.
func outside(x *big.Float, iv moments.Interval) bool {
	if iv.Lo.Finite() && x.Cmp(new(big.Float).SetPrec(x.Prec()+64).SetRat(iv.Lo.Value)) < 0 {
		return true
	}
	return iv.Hi.Finite() && x.Cmp(new(big.Float).SetPrec(x.Prec()+64).SetRat(iv.Hi.Value)) > 0
}

// firstOutside returns the first of nodes outside the closed interval iv,
// or nil when every node lies in it.
func firstOutside(nodes []*big.Float, iv moments.Interval) *big.Float {
	for _, x := range nodes {
		if outside(x, iv) {
			return x
		}
	}
	return nil
}

// monicPair returns pi_k(x) and pi_{k-1}(x) (pi_{-1} = 0) of rec, by the
// forward recurrence at prec bits; rec must hold k pairs (k >= 0).
func monicPair(rec *Recurrence, k int, x *big.Float, prec uint) (pk, pkm1 *big.Float) {
	p0 := new(big.Float).SetPrec(prec)
	p1 := new(big.Float).SetPrec(prec).SetInt64(1)
	t := new(big.Float).SetPrec(prec)
	for j := 0; j < k; j++ {
		t.Sub(x, rec.Alpha[j])
		t.Mul(t, p1)
		p0.Mul(p0, rec.Beta[j])
		if j == 0 {
			p0.SetInt64(0)
		}
		p0.Sub(t, p0)
		p0, p1 = p1, p0
	}
	return p1, p0
}

// isSymmetric reports whether the first n alphas of rec are all zero (a
// measure symmetric about 0).
func isSymmetric(rec *Recurrence, n int) bool {
	for k := 0; k < n && k < rec.Len(); k++ {
		if rec.Alpha[k].Sign() != 0 {
			return false
		}
	}
	return true
}

// copyPrefix returns a copy of the first n pairs of rec at prec bits.
func copyPrefix(rec *Recurrence, n int, prec uint) *Recurrence {
	r := &Recurrence{Alpha: make([]*big.Float, n), Beta: make([]*big.Float, n)}
	for k := 0; k < n; k++ {
		r.Alpha[k] = new(big.Float).SetPrec(prec).Set(rec.Alpha[k])
		r.Beta[k] = new(big.Float).SetPrec(prec).Set(rec.Beta[k])
	}
	return r
}

// fixedText is how a prescribed node z is printed: as typed when it is a
// terminating decimal of at most digits significant digits (so -1 prints
// "-1"), else rounded to digits digits; in float64 mode (digits 0) the
// nearest double in shortest form.
func fixedText(z *big.Rat, digits int) string {
	if digits == 0 {
		f, _ := z.Float64()
		return precision.FormatFloat64(f)
	}
	s := moments.RatString(z)
	if num, err := precision.ParseNumber(s); err == nil && num.Digits <= digits && !containsSlash(s) {
		return s
	}
	return precision.FormatSig(new(big.Float).SetPrec(precision.DigitsToBits(digits)+64).SetRat(z), digits)
}

func containsSlash(s string) bool {
	for _, c := range s {
		if c == '/' {
			return true
		}
	}
	return false
}

// setFixed puts the exact prescribed value z (rounded to s.prec) at node i
// of s: Newton lands within an ulp of it, and the exact value keeps the
// printed node what the user gave.
func setFixed(s *stage, i int, z *big.Rat) {
	s.nodes[i] = new(big.Float).SetPrec(s.prec).SetRat(z)
}

// printFixed replaces the printed nodes at the indices of fixed with their
// fixedText forms and returns those texts.
func printFixed(texts [2][]string, idx []int, fixed []*big.Rat, digits int) []string {
	out := make([]string, len(idx))
	for j, i := range idx {
		texts[0][i] = fixedText(fixed[j], digits)
		out[j] = texts[0][i]
	}
	return out
}

// ratFloat is z at prec bits.
func ratFloat(z *big.Rat, prec uint) *big.Float { return new(big.Float).SetPrec(prec).SetRat(z) }

// supportLabel describes the measure's support for messages.
func supportLabel(m Measure) string { return fmt.Sprintf("%s", m.Domain()) }
