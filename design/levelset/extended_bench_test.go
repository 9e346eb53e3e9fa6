package levelset

import (
	"context"
	"testing"
)

// BenchmarkLevelSetBallDigits30 builds the 30-digit rule of order 8 for
// the ball (x-0.1)^2 + (y+0.05)^2 + (z-0.02)^2 < 0.64 on the reference
// hexahedron (the domain of BenchmarkLevelSetBall), error estimate
// included. Aim: a few seconds per element on one core.
func BenchmarkLevelSetBallDigits30(b *testing.B) {
	req := Request{Shape: "hexahedron", LevelSet: "(x-0.1)^2+(y+0.05)^2+(z-0.02)^2-0.64", Order: 8, Digits: 30}
	for i := 0; i < b.N; i++ {
		if _, err := Build(context.Background(), req); err != nil {
			b.Fatal(err)
		}
	}
}
