package design_test

import (
	"context"
	"fmt"
	"math/big"

	"quadwright/design"
	"quadwright/moments"
)

// The main path as a library: a measure, a verified rule, its check.
// Examples for custom weights (a weight expression or a moment list as the
// measure) and for audits belong beside these as those packages land.

// Build the 3-point Gauss-Legendre rule to 20 digits. The printed values
// are those of Abramowitz and Stegun, Table 25.4 (nodes 0 and
// +-sqrt(3/5), weights 8/9 and 5/9), rounded to 20 digits.
func ExampleGauss() {
	fam, err := moments.NewFamily("legendre", nil, nil, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	rule, err := design.Gauss(context.Background(), design.FamilySource{Family: fam}, design.Request{Points: 3, Digits: 20})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s rule for %s on %s, verified degree %d\n", rule.Kind, rule.Measure, rule.Domain, rule.Degree)
	for i := range rule.Nodes {
		fmt.Printf("%24s  %s\n", rule.Nodes[i], rule.Weights[i])
	}
	// Output:
	// gauss rule for legendre on [-1, 1], verified degree 5
	//  -0.77459666924148337704  0.55555555555555555556
	//                        0  0.88888888888888888889
	//   0.77459666924148337704  0.55555555555555555556
}

// A rule for a weight with a singularity at one end: the Jacobi weight
// (1-x)^(-1/2) (1+x)^(1/3) mapped onto [0, 2], to 25 digits, and how it was
// checked.
func ExampleGauss_jacobiOnAnInterval() {
	iv, _ := moments.ParseInterval("0,2")
	fam, err := moments.NewFamily("jacobi", big.NewRat(-1, 2), big.NewRat(1, 3), &iv)
	if err != nil {
		fmt.Println(err)
		return
	}
	rule, err := design.Gauss(context.Background(), design.FamilySource{Family: fam}, design.Request{Points: 4, Digits: 25})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(rule.Measure, "on", rule.Domain)
	fmt.Println("points:", rule.Points(), "degree:", rule.Degree, "digits:", rule.Digits)
	fmt.Println("confirmed by a second computation at another precision:", rule.CheckPrec != rule.WorkingPrec)
	// Output:
	// jacobi(alpha=-0.5, beta=1/3) on [0, 2]
	// points: 4 degree: 7 digits: 25
	// confirmed by a second computation at another precision: true
}

// VerifyPrinted audits printed values against a measure: Simpson's rule
// (weights 1/3, 4/3, 1/3 on [-1, 1], here to 20 digits) integrates cubics
// exactly but not quartics, so its degree of exactness for the Legendre
// weight is 3. (The digits matter: the tolerance is one unit in the 20th
// digit, the most any of the values carries.)
func ExampleVerifyPrinted() {
	fam, _ := moments.NewFamily("legendre", nil, nil, nil)
	ex, err := design.VerifyPrinted(context.Background(), design.FamilySource{Family: fam},
		[]string{"-1", "0", "1"}, []string{"0.33333333333333333333", "1.3333333333333333333", "0.33333333333333333333"}, 5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("degree of exactness:", ex.Degree)
	// Output:
	// degree of exactness: 3
}
