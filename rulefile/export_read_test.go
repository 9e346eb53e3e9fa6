package rulefile_test

import (
	"bytes"
	"context"
	"strings"
	"testing"

	"quadwright/design"
	"quadwright/design/element"
	"quadwright/export"
	"quadwright/moments"
	"quadwright/rulefile"
)

// TestReadExports: a rule exported to every language reads back with the
// same nodes and weights, every digit of the extended arrays where the
// rule has more than 17 (issue 19: audits read every output format).
// The rules are quadwright's own: the 6-point Gauss-Legendre rule at 30
// digits and the catalogued degree-5 triangle rule in float64 mode.
func TestReadExports(t *testing.T) {
	fam, err := moments.NewFamily("legendre", nil, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	g, err := design.Gauss(context.Background(), design.FamilySource{Family: fam}, design.Request{Points: 6, Digits: 30})
	if err != nil {
		t.Fatal(err)
	}
	tri, err := element.Build(context.Background(), element.Request{Shape: element.Triangle, Degree: 5})
	if err != nil {
		t.Fatal(err)
	}
	for _, src := range []*rulefile.File{rulefile.FromRule(g, &fam, "quadwright test"), rulefile.FromElementRule(tri, "quadwright test")} {
		for _, lang := range export.Languages {
			var b bytes.Buffer
			if err := export.Write(&b, src, lang, export.Options{Program: "quadwright test", Source: "r.json"}); err != nil {
				t.Fatal(err)
			}
			f, err := rulefile.Parse("r."+lang, b.Bytes())
			if err != nil {
				t.Errorf("%s: %v", lang, err)
				continue
			}
			if s, ok := f.InferElement(); lang == "csv" && ok {
				f.Domain.Shape = s.String() // a CSV table names no element (the audit infers it too)
			}
			if f.Points != src.Points || f.Domain.Shape != src.Domain.Shape || f.Dim() != src.Dim() {
				t.Errorf("%s: %d points on %q (%d coordinates)", lang, f.Points, f.Domain.Shape, f.Dim())
				continue
			}
			for i := range src.Nodes {
				if strings.Join(f.Nodes[i], ",") != strings.Join(src.Nodes[i], ",") || !sameNumber(f.Weights[i], src.Weights[i]) {
					t.Errorf("%s: node %d reads %v %s, written %v %s", lang, i+1, f.Nodes[i], f.Weights[i], src.Nodes[i], src.Weights[i])
					break
				}
			}
		}
	}
	// A header announcing more points than listed is an error naming the array.
	var b bytes.Buffer
	export.Write(&b, rulefile.FromRule(g, &fam, "quadwright test"), "python", export.Options{Program: "quadwright test"})
	bad := strings.Replace(b.String(), "points:   6", "points:   7", 1)
	if _, err := rulefile.Parse("bad.py", []byte(bad)); err == nil || !strings.Contains(err.Error(), "the header announces 7") {
		t.Errorf("wrong count: %v", err)
	}
}

// sameNumber compares two decimals as numbers ("0.5" and "5e-1").
func sameNumber(a, b string) bool {
	if a == b {
		return true
	}
	f, err := rulefile.Parse("n", []byte("0 "+a+"\n1 "+b+"\n"))
	return err == nil && f.Weights[0] == f.Weights[1]
}
