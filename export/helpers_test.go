package export

import (
	"context"
	"math/big"
	"strings"
	"testing"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/rulefile"
)

// gaussFile builds the n-point Gauss-Legendre rule on [lo, hi] at digits
// (0: float64 mode) and returns its rule file.
func gaussFile(t testing.TB, lo, hi string, n, digits int) *rulefile.File {
	t.Helper()
	iv, err := moments.ParseInterval(lo + "," + hi)
	if err != nil {
		t.Fatal(err)
	}
	fam, err := moments.NewFamily("legendre", nil, nil, &iv)
	if err != nil {
		t.Fatal(err)
	}
	r, err := design.Gauss(context.Background(), design.FamilySource{Family: fam}, design.Request{Points: n, Digits: digits})
	if err != nil {
		t.Fatal(err)
	}
	return rulefile.FromRule(r, &fam, "quadwright test")
}

// legendreMoment is the integral of x^k over [lo, hi] (weight 1), exactly:
// (hi^(k+1) - lo^(k+1)) / (k+1).
func legendreMoment(lo, hi int64, k int) *big.Rat {
	p := func(a int64) *big.Int { return new(big.Int).Exp(big.NewInt(a), big.NewInt(int64(k+1)), nil) }
	num := new(big.Int).Sub(p(hi), p(lo))
	return new(big.Rat).SetFrac(num, big.NewInt(int64(k+1)))
}

// decimal40 is r to 45 significant digits, as a decimal literal.
func decimal40(r *big.Rat) string {
	f := new(big.Float).SetPrec(256).SetRat(r)
	return f.Text('e', 44)
}

// element2D is a hand-made 2-D rule: the 4-point product Gauss rule on
// [-1,1]^2, nodes (+-1/sqrt(3), +-1/sqrt(3)), weights 1 (from memory: the
// tensor product of the 2-point Gauss-Legendre rule, Abramowitz and Stegun
// Table 25.4), written to 30 digits, degree 3.
func element2D() *rulefile.File {
	const a = "0.577350269189625764509148780502"
	nodes := []rulefile.Node{{"-" + a, "-" + a}, {a, "-" + a}, {"-" + a, a}, {a, a}}
	return &rulefile.File{
		Format: rulefile.FormatName, Kind: "gauss",
		Domain: rulefile.Domain{Shape: "quadrilateral", Vertices: [][]string{{"-1", "-1"}, {"1", "-1"}, {"1", "1"}, {"-1", "1"}}},
		Weight: "1", Points: 4, Degree: 3, Digits: 30,
		Nodes: nodes, Weights: []string{"1.00000000000000000000000000000", "1.00000000000000000000000000000", "1.00000000000000000000000000000", "1.00000000000000000000000000000"},
	}
}

func render(t testing.TB, f *rulefile.File, lang string, opt Options) string {
	t.Helper()
	var b strings.Builder
	if err := Write(&b, f, lang, opt); err != nil {
		t.Fatalf("%s: %v", lang, err)
	}
	return b.String()
}
