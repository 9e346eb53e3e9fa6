package rulefile_test

import (
	"context"
	"fmt"
	"os"
	"path/filepath"

	"quadwright/design"
	"quadwright/export"
	"quadwright/moments"
	"quadwright/rulefile"
)

// The main path end to end: build a rule, write it as a rule file, read it
// back and export it as source code. Examples that build for a custom weight
// or attach an audit report to the file belong beside this one as those
// capabilities land.
func Example() {
	fam, _ := moments.NewFamily("laguerre", nil, nil, nil)
	rule, err := design.Gauss(context.Background(), design.FamilySource{Family: fam}, design.Request{Points: 2, Digits: 20})
	if err != nil {
		fmt.Println(err)
		return
	}
	data, err := rulefile.FromRule(rule, &fam, "quadwright example").MarshalIndent()
	if err != nil {
		fmt.Println(err)
		return
	}
	dir, _ := os.MkdirTemp("", "rulefile-example")
	defer os.RemoveAll(dir)
	path := filepath.Join(dir, "laguerre2.json")
	if err := os.WriteFile(path, data, 0o644); err != nil {
		fmt.Println(err)
		return
	}

	f, err := rulefile.Read(path)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(f.Kind, f.Measure, "points", f.Points, "degree", f.Degree, "digits", f.Digits)
	// The 2-point Gauss-Laguerre rule: nodes 2 -+ sqrt(2), weights
	// (2 +- sqrt(2))/4 (Abramowitz and Stegun, Table 25.9).
	if err := export.Write(os.Stdout, f, "csv", export.Options{}); err != nil {
		fmt.Println(err)
	}
	// Output:
	// gauss laguerre(alpha=0) points 2 degree 3 digits 20
	// node,weight
	// 0.58578643762690495120,0.85355339059327376220
	// 3.4142135623730950488,0.14644660940672623780
}

// Parse reads a node/weight table as users bring it from elsewhere; exact
// fractions stay exact.
func ExampleParse() {
	f, err := rulefile.Parse("simpson.txt", []byte("# Simpson's rule on [-1, 1]\nnode,weight\n-1,1/3\n0,4/3\n1,1/3\n"))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(f.Points, f.Coordinates(), f.Weights)
	// Output:
	// 3 [-1 0 1] [1/3 4/3 1/3]
}
