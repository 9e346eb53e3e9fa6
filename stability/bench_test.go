package stability

import (
	"context"
	"testing"

	"quadwright/design"
)

// BenchmarkSummarize and BenchmarkBuild1000 together give the share of a
// build that the attached short report costs (target: well under a tenth).
func BenchmarkSummarize(b *testing.B) {
	for _, n := range []int{100, 1000} {
		g, err := design.Gauss(context.Background(), legendreOnB(b), design.Request{Points: n, Digits: 34})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(itoa(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := Summarize(g); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkBuild(b *testing.B) {
	for _, n := range []int{100, 1000} {
		b.Run(itoa(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := design.Gauss(context.Background(), legendreOnB(b), design.Request{Points: n, Digits: 34}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkAudit is the full audit of a 34-digit Gauss rule.
func BenchmarkAudit(b *testing.B) {
	for _, n := range []int{20, 100} {
		g, err := design.Gauss(context.Background(), legendreOnB(b), design.Request{Points: n, Digits: 34})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(itoa(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := Audit(context.Background(), legendreOnB(b), g.Nodes, g.Weights, Options{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func legendreOnB(testing.TB) design.FamilySource { return legendreFamily() }
