package stability

import (
	"context"
	"encoding/json"
	"math"
	"math/big"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"quadwright/design"
	"quadwright/moments"
)

// reference is testdata/audit/reference.json, made by gen_audit.py beside it
// (mpmath: direct tanh-sinh integration and exact Hankel inverses).
type reference struct {
	Genz []struct {
		Name     string  `json:"name"`
		C        float64 `json:"c"`
		W        float64 `json:"w"`
		Integral string  `json:"integral"`
	} `json:"genz"`
	Hankel []struct {
		Family string `json:"family"`
		Order  int    `json:"order"`
		Log10  string `json:"log10_cond1"`
	} `json:"hankel"`
}

func loadReference(t *testing.T) reference {
	t.Helper()
	b, err := os.ReadFile("../testdata/audit/reference.json")
	if err != nil {
		t.Fatal(err)
	}
	var r reference
	if err := json.Unmarshal(b, &r); err != nil {
		t.Fatal(err)
	}
	return r
}

// TestGenzClosedForms holds Genz.Integral (closed forms) against
// mpmath's direct integration (reference.json) and against gonum's
// Gauss-Legendre quadrature on the pieces between the kinks and jumps.
// Tolerances: 4e-15 relative, a few ulp of the float64 closed forms (tuned).
func TestGenzClosedForms(t *testing.T) {
	ref := loadReference(t)
	if len(ref.Genz) != len(GenzSet) {
		t.Fatalf("reference has %d integrands, GenzSet %d", len(ref.Genz), len(GenzSet))
	}
	for i, g := range GenzSet {
		r := ref.Genz[i]
		if r.Name != g.Name || r.C != g.C || r.W != g.W {
			t.Fatalf("reference case %d is %+v, GenzSet has %+v", i, r, g)
		}
		want, _ := strconv.ParseFloat(r.Integral, 64)
		got := g.Integral()
		if math.Abs(got-want) > 4e-15*math.Abs(want) {
			t.Errorf("%s: closed form %v, mpmath %v", g.Name, got, want)
		}
		num := quad.Fixed(g.Eval, 0, g.W, 200, nil, 0) + quad.Fixed(g.Eval, g.W, 1, 200, nil, 0)
		if math.Abs(num-want) > 1e-13*math.Abs(want) {
			t.Errorf("%s: gonum quadrature %v, mpmath %v", g.Name, num, want)
		}
	}
}

// TestHankel holds HankelLostDigits against the exact Hankel matrices
// inverted by mpmath (reference.json). Tolerance 1e-9 digits (tuned: the
// recurrence route agrees far better than that).
func TestHankel(t *testing.T) {
	ref := loadReference(t)
	lag, err := moments.NewFamily("laguerre", nil, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	src := map[string]design.RecurrenceSource{"legendre": legendreOn(t, ""), "laguerre": design.FamilySource{Family: lag}}
	for _, h := range ref.Hankel {
		prec := uint(128+8*h.Order+63) / 64 * 64
		rec, err := src[h.Family].Recurrence(h.Order, prec)
		if err != nil {
			t.Fatal(err)
		}
		got := HankelLostDigits(rec, h.Order, prec)
		want, _ := strconv.ParseFloat(h.Log10, 64)
		if math.Abs(got-want) > 1e-9 {
			t.Errorf("%s order %d: %v digits, mpmath %v", h.Family, h.Order, got, want)
		}
	}
}

// TestGenzCompare runs the comparison for weight 1 (closed forms) and for
// a Jacobi weight (reference: the measure's own many-point Gauss rule). A
// Gauss rule compared with itself shows equal errors; the smooth integrands
// of the reference converge to float64 (1e-13, tuned), the non-smooth ones
// less (the kink to 1e-4, the jump to 5e-2: they limit any Gauss rule to
// algebraic convergence, O(M^-1) for a jump; tuned). The report states this
// estimate beside every case.
func TestGenzCompare(t *testing.T) {
	jac, err := moments.NewFamily("jacobi", big.NewRat(-1, 2), big.NewRat(3, 10), nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, m := range []design.Measure{legendreOn(t, "0,2.5"), design.FamilySource{Family: jac}} {
		g, err := design.Gauss(context.Background(), m, design.Request{Points: 12})
		if err != nil {
			t.Fatal(err)
		}
		rep, err := genzCompare(context.Background(), m, stringsToFloats(g.Nodes), stringsToFloats(g.Weights))
		if err != nil || rep == nil {
			t.Fatalf("%s: %v %v", m.Label(), rep, err)
		}
		for _, c := range rep.Cases {
			if c.RuleError != c.GaussError {
				t.Errorf("%s %s: rule error %v, gauss error %v", m.Label(), c.Name, c.RuleError, c.GaussError)
			}
			lim := 1e-13
			switch c.Name {
			case "continuous":
				lim = 1e-4
			case "discontinuous":
				lim = 5e-2
			}
			if rep.ReferencePoints > 0 && !(c.ReferenceError < Float(lim)) {
				t.Errorf("%s %s: reference error %v", m.Label(), c.Name, c.ReferenceError)
			}
			if !(c.RuleError < 1) {
				t.Errorf("%s %s: error %v", m.Label(), c.Name, c.RuleError)
			}
		}
	}
}
