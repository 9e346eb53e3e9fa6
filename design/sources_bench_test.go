package design

import (
	"context"
	"testing"

	"quadwright/moments"
)

// BenchmarkLogWeight100Digits32 and BenchmarkLogWeight1000Digits32 time a
// whole verified build of the Gauss rule for -log(x) on [0,1] from the
// expression (both routes to the recurrence, the cross-check, two stages
// and the exactness check), at 32 digits. Targets: 0.2 s and 10 s.
func BenchmarkLogWeight100Digits32(b *testing.B)  { benchLogWeight(b, 100) }
func BenchmarkLogWeight1000Digits32(b *testing.B) { benchLogWeight(b, 1000) }

func benchLogWeight(b *testing.B, n int) {
	iv, err := moments.ParseInterval("0,1")
	if err != nil {
		b.Fatal(err)
	}
	for i := 0; i < b.N; i++ {
		w, err := moments.NewWeight("-log(x)", iv, nil)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := Gauss(context.Background(), NewExprSource(context.Background(), w), Request{Points: n, Digits: 32}); err != nil {
			b.Fatal(err)
		}
	}
}
