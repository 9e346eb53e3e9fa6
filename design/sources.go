package design

import (
	"context"
	"fmt"
	"math"
	"math/big"
	"sync"

	"quadwright/moments"
	"quadwright/precision"
)

// MomentSource is the measure of a moment list: raw moments (the monomial
// basis) or modified moments nu_k = integral of p_k, p_k the monic
// polynomials of Basis. The recurrence comes from the (modified) Chebyshev
// algorithm, with the moments taken as the exact values written; k moments
// fix floor(k/2) pairs. It is a DigitLimiter (moments written as decimals
// carry finitely many digits) and a Verifier (2N moments fix an N-point
// rule, but not the 2N-1 pairs of the standard check).
type MomentSource struct {
	List    *moments.MomentList
	Basis   moments.Basis
	Support moments.Interval // where the rule is said to live
	// NoSupport says the list came without a support (raw moments, no
	// --interval): Support is then the whole line, for computation only,
	// and nothing is tested against it.
	NoSupport bool

	cache recurrenceCache
	loss  digitsNote
	whole struct {
		once sync.Once
		err  error
	}
}

// wholeListPairs bounds the lists checkWholeList tests: the raw-moment
// Chebyshev algorithm needs precision growing with the length (about 1s
// for 200 moments on [0,1], minutes for 2000), so a longer list is tested
// on the moments each request uses, as they are used.
const wholeListPairs = 64

// checkWholeList tests, once, every pair the whole list fixes against the
// support (CheckSupport), so that a list is refused for any of its moments,
// not only those a rule uses. When the whole list fits no positive measure
// at all, or is longer than wholeListPairs pairs, the moments a request
// uses are still tested as they are used.
func (s *MomentSource) checkWholeList() error {
	s.whole.once.Do(func() {
		if s.NoSupport || s.MaxLen() == 0 || s.MaxLen() > wholeListPairs {
			return
		}
		rec, err := s.pairs(s.MaxLen(), 128, nil)
		if err == nil {
			s.whole.err = CheckSupport(rec, s.Support)
		}
	})
	return s.whole.err
}

// digitsNote remembers the outcome of the last SupportedDigits, so that
// Label can report it with the rule.
type digitsNote struct {
	mu             sync.Mutex
	given, kept, n int
	set            bool
}

func (d *digitsNote) record(given, kept, n int) {
	d.mu.Lock()
	defer d.mu.Unlock()
	d.given, d.kept, d.n, d.set = given, kept, n, true
}

// get returns what record last stored; set is false before any record.
func (d *digitsNote) get() (given, kept, n int, set bool) {
	d.mu.Lock()
	defer d.mu.Unlock()
	return d.given, d.kept, d.n, d.set
}

// String is "" before any estimate, else e.g. " (the input carries 25
// digits; 18 survive in the 5-point rule)".
func (d *digitsNote) String() string {
	d.mu.Lock()
	defer d.mu.Unlock()
	if !d.set {
		return ""
	}
	return fmt.Sprintf(" (the input carries %s; %s in the %d-point rule)", Plural(d.given, "digit", "digits"), Plural(d.kept, "survives", "survive"), d.n)
}

// NewMomentSource returns the source of the moments in ml, given in basis,
// for a measure on domain.
func NewMomentSource(ml *moments.MomentList, basis moments.Basis, domain moments.Interval) *MomentSource {
	return &MomentSource{List: ml, Basis: basis, Support: domain}
}

// MaxLen is half the number of moments.
func (s *MomentSource) MaxLen() int { return len(s.List.Values) / 2 }

// Label says where the moments come from and, once SupportedDigits has
// run on decimal moments, how many digits they carry and how many survive.
func (s *MomentSource) Label() string {
	if s.Basis.Name == "" || s.Basis.Name == "monomial" {
		return fmt.Sprintf("raw moments from %s%s", s.List.Name, &s.loss)
	}
	return fmt.Sprintf("modified moments (%s basis) from %s%s", s.Basis.Name, s.List.Name, &s.loss)
}

// Weight is not known as a function: it names the moment file.
func (s *MomentSource) Weight() string { return "moments(" + s.List.Name + ")" }

// Domain is the interval given with the moments.
func (s *MomentSource) Domain() moments.Interval { return s.Support }

// SupportGiven is false when the list came without a support.
func (s *MomentSource) SupportGiven() bool { return !s.NoSupport }

// ExactlyKnown reports that every moment was written exactly (integers,
// p/q, or decimals declared exact).
func (s *MomentSource) ExactlyKnown() bool {
	for _, v := range s.List.Values {
		if !v.Exact {
			return false
		}
	}
	return true
}

// Recurrence returns pairs 0..n-1 within a few ulp at prec bits of the
// pairs that the moments, read as exact, determine: the Chebyshev algorithm
// is rerun at doubled precisions until two runs agree (chebyshevConverged).
// It fails with a *MomentSequenceError when the moments are not those of a
// positive measure, and when fewer than 2n moments are given.
func (s *MomentSource) Recurrence(n int, prec uint) (*Recurrence, error) {
	if n > s.MaxLen() {
		return nil, fmt.Errorf("--moments %s: %d moments fix only %d recurrence pairs; %d pairs need %d moments", s.List.Name, len(s.List.Values), s.MaxLen(), n, 2*n)
	}
	if err := s.checkWholeList(); err != nil {
		return nil, fmt.Errorf("--moments %s: %w", s.List.Name, err)
	}
	return s.cache.get(n, prec, func(n int, prec uint) (*Recurrence, error) {
		rec, err := s.pairs(n, prec, nil)
		if err == nil && !s.NoSupport {
			err = CheckSupport(rec, s.Support)
		}
		if err != nil {
			return nil, fmt.Errorf("--moments %s: %w", s.List.Name, err)
		}
		return rec, nil
	})
}

// pairs runs the Chebyshev algorithm on the moments, each shifted by
// delta[k] when delta is not nil.
func (s *MomentSource) pairs(n int, prec uint, delta []*big.Rat) (*Recurrence, error) {
	return chebyshevConverged(func(w uint) (nu, a, b []*big.Float) {
		nu = make([]*big.Float, 2*n)
		for k := range nu {
			v := s.List.Values[k].Value
			if delta != nil && delta[k] != nil {
				v = new(big.Rat).Add(v, delta[k])
			}
			nu[k] = new(big.Float).SetPrec(w).SetRat(v)
		}
		a, b = basisPairs(s.Basis, 2*n-1, w)
		return nu, a, b
	}, n, prec)
}

// basisPairs rounds the first m coefficients of a basis recurrence to w bits.
func basisPairs(basis moments.Basis, m int, w uint) (a, b []*big.Float) {
	a = make([]*big.Float, m)
	b = make([]*big.Float, m)
	for l := 0; l < m; l++ {
		a[l] = new(big.Float).SetPrec(w)
		b[l] = new(big.Float).SetPrec(w)
		if basis.A != nil {
			a[l].SetRat(basis.A(l))
		}
		if basis.B != nil && l > 0 {
			b[l].SetRat(basis.B(l))
		}
	}
	return a, b
}

// SupportedDigits returns how many significant digits of the n-point rule
// the moments vouch for. Exact p/q moments support precision.MaxDigits.
// Otherwise the moments carry D0 digits, the largest number of significant
// digits among the decimals of the first 2n (so that exact short values
// such as 1 or 0.25 do not lower it, as in the audit's rule), every decimal
// moment is taken as known to half a unit in its D0-th digit (or in its last
// written place, if that is finer). For n <= firstOrderPairs, D is the
// first-order worst case over all those perturbations (firstOrderDigits).
// Above, where 2n rebuilds cost too much, the rule is recomputed from
// moments perturbed by that much in three sign patterns (all +,
// alternating, pseudo-random): D = floor(-log10(r)) - 1, r the largest
// relative change of a node or weight, capped at D0; the one digit of
// margin covers perturbations worse than the three tried (an estimate,
// common practice, not a bound).
func (s *MomentSource) SupportedDigits(ctx context.Context, n int) (int, error) {
	if 2*n > len(s.List.Values) {
		_, err := s.Recurrence(n, 64)
		return 0, err
	}
	cap, exact := 0, true
	for k := 0; k < 2*n; k++ {
		if !s.List.Values[k].Exact {
			exact = false
			cap = max(cap, s.List.Values[k].Digits)
		}
	}
	if exact {
		return precision.MaxDigits, nil
	}
	prec := precision.WorkingPrec(cap+8, n)
	base, err := s.Recurrence(n, prec)
	if err != nil {
		return 0, err
	}
	if n <= firstOrderPairs {
		kept, err := s.firstOrderDigits(ctx, base, n, prec, cap)
		if err == nil {
			s.loss.record(cap, kept, n)
		}
		return kept, err
	}
	var trials []*Recurrence
	for _, pat := range signPatterns(2 * n) {
		delta := make([]*big.Rat, 2*n)
		for k := range delta {
			if u := knownTo(s.List.Values[k], s.List.ULP[k], cap); u != nil {
				delta[k] = new(big.Rat).Mul(u, big.NewRat(int64(pat[k]), 2))
			}
		}
		rec, err := s.pairs(n, prec, delta)
		if err != nil {
			s.loss.record(cap, 0, n)
			return 0, nil // a perturbation within the written digits breaks positivity
		}
		trials = append(trials, rec)
	}
	kept, err := perturbedDigits(ctx, base, trials, n, prec, cap)
	if err == nil {
		s.loss.record(cap, kept, n)
	}
	return kept, err
}

// VerifyRule verifies with VerifyPrinted when the moments fix maxDeg pairs,
// else with VerifyPrintedProducts.
func (s *MomentSource) VerifyRule(ctx context.Context, nodes, weights []string, maxDeg int) (Exactness, error) {
	return verifyWithin(ctx, s, nodes, weights, maxDeg)
}

func verifyWithin(ctx context.Context, src RecurrenceSource, nodes, weights []string, maxDeg int) (Exactness, error) {
	if src.MaxLen() >= maxDeg {
		return VerifyPrinted(ctx, src, nodes, weights, maxDeg)
	}
	return VerifyPrintedProducts(ctx, src, nodes, weights, maxDeg)
}

// signPatterns returns the three sign patterns of SupportedDigits, each of
// length m: all +1, alternating, and a fixed pseudo-random one (a linear
// congruential generator with Knuth's MMIX constants, so that the result
// never depends on a seed).
func signPatterns(m int) [][]int {
	p := [][]int{make([]int, m), make([]int, m), make([]int, m)}
	state := uint64(0x2545f4914f6cdd1d)
	for k := 0; k < m; k++ {
		p[0][k] = 1
		p[1][k] = 1 - 2*(k%2)
		state = state*6364136223846793005 + 1442695040888963407
		p[2][k] = 1 - 2*int(state>>63)
	}
	return p
}

// perturbedDigits compares the n-point rule of base with those of trials,
// all computed at prec bits, and returns floor(-log10(r)) - 1, r the largest
// relative change of any node or weight, at most cap and at least 0.
func perturbedDigits(ctx context.Context, base *Recurrence, trials []*Recurrence, n int, prec uint, cap int) (int, error) {
	worst, ok, err := worstChange(ctx, base, trials, n, prec)
	if err != nil || !ok {
		return 0, err
	}
	return max(0, min(digitsOfChange(worst)-1, cap)), nil
}

// worstChange returns the largest relative change of a node or weight
// between the n-point rule of base and those of trials, all at prec bits;
// ok is false when the rule of a trial could not be computed.
func worstChange(ctx context.Context, base *Recurrence, trials []*Recurrence, n int, prec uint) (worst *big.Float, ok bool, err error) {
	s0, err := gaussStage(ctx, base.Prefix(n), n, prec, nil)
	if err != nil {
		return nil, false, err
	}
	worst = new(big.Float).SetPrec(64)
	d := new(big.Float).SetPrec(prec)
	for _, tr := range trials {
		s1, err := gaussStage(ctx, tr.Prefix(n), n, prec, s0.nodes)
		if err != nil {
			return nil, false, nil
		}
		for _, pair := range [2][2][]*big.Float{{s0.nodes, s1.nodes}, {s0.weights, s1.weights}} {
			for i := range pair[0] {
				if pair[0][i].Sign() == 0 && pair[1][i].Sign() == 0 {
					continue
				}
				d.Sub(pair[0][i], pair[1][i])
				r := new(big.Float).SetPrec(64).Quo(d.Abs(d), absF(pair[0][i]))
				if r.Cmp(worst) > 0 {
					worst.Set(r)
				}
			}
		}
	}
	return worst, true, nil
}

// digitsOfChange is floor(-log10(r)) for a relative change r > 0, and a
// large number (1 << 20) for r = 0.
func digitsOfChange(r *big.Float) int {
	if r.Sign() == 0 {
		return 1 << 20
	}
	mant := new(big.Float)
	e := r.MantExp(mant)
	mf, _ := mant.Float64()
	return int(math.Floor(-(math.Log10(mf) + float64(e)*math.Log10(2))))
}

// knownTo is the uncertainty of the decimal v written with last place ulp,
// in a list that carries D0 digits: the finer of ulp and one unit in v's
// D0-th significant digit; nil for an exact value or zero.
func knownTo(v precision.Number, ulp *big.Rat, D0 int) *big.Rat {
	if v.Exact || ulp == nil || v.Value.Sign() == 0 {
		return nil
	}
	if v.Digits >= D0 {
		return ulp
	}
	// ulp at v.Digits digits, scaled down to D0 digits.
	scale := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(D0-v.Digits)), nil)
	return new(big.Rat).Quo(ulp, new(big.Rat).SetInt(scale))
}

// recurrenceCache holds the pairs of a source at the largest length and
// precision computed so far, and serves shorter or less precise requests by
// rounding. It is safe for concurrent use.
type recurrenceCache struct {
	mu   sync.Mutex
	rec  *Recurrence
	prec uint
}

func (c *recurrenceCache) get(n int, prec uint, compute func(n int, prec uint) (*Recurrence, error)) (*Recurrence, error) {
	c.mu.Lock()
	defer c.mu.Unlock()
	if c.rec == nil || c.rec.Len() < n || c.prec < prec {
		if c.rec != nil {
			n2, p2 := max(n, c.rec.Len()), max(prec, c.prec)
			rec, err := compute(n2, p2)
			if err != nil {
				return nil, err
			}
			c.rec, c.prec = rec, p2
		} else {
			rec, err := compute(n, prec)
			if err != nil {
				return nil, err
			}
			c.rec, c.prec = rec, prec
		}
	}
	return roundRecurrence(c.rec.Prefix(n), prec), nil
}
