package levelset

import (
	"context"
	"testing"
)

// BenchmarkLevelSetDisc builds the float64 rule of order 10 for the disc
// x^2 + y^2 < 0.64 on the reference quadrilateral (with the order-14 rule
// of its error estimate). Target: 5 ms per element on one core.
func BenchmarkLevelSetDisc(b *testing.B) {
	req := Request{Shape: "quadrilateral", LevelSet: "(x-0.1)^2+(y+0.05)^2-0.64", Order: 10}
	for i := 0; i < b.N; i++ {
		if _, err := Build(context.Background(), req); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkLevelSetBall builds the float64 rule of order 8 for the ball
// x^2 + y^2 + z^2 < 0.64 on the reference hexahedron (with the order-12
// rule of its error estimate). Target: 50 ms per element on one core.
func BenchmarkLevelSetBall(b *testing.B) {
	req := Request{Shape: "hexahedron", LevelSet: "(x-0.1)^2+(y+0.05)^2+(z-0.02)^2-0.64", Order: 8}
	for i := 0; i < b.N; i++ {
		if _, err := Build(context.Background(), req); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkLevelSetBallPrinted is BenchmarkLevelSetBall with the printed
// (shortest round-trip) values that a rule file needs: Rule.Print, which
// Build leaves to the writers. No target.
func BenchmarkLevelSetBallPrinted(b *testing.B) {
	req := Request{Shape: "hexahedron", LevelSet: "(x-0.1)^2+(y+0.05)^2+(z-0.02)^2-0.64", Order: 8}
	for i := 0; i < b.N; i++ {
		r, err := Build(context.Background(), req)
		if err != nil {
			b.Fatal(err)
		}
		r.Print()
	}
}

// BenchmarkLevelSetDiscDigits builds the 30-digit rule of order 40 for the
// disc x^2 + y^2 < 0.49 on the reference quadrilateral (the accuracy test
// of TestDiscThirtyDigits), error estimate included. No target yet.
func BenchmarkLevelSetDiscDigits(b *testing.B) {
	req := Request{Shape: "quadrilateral", LevelSet: "x^2+y^2-0.49", Order: 40, Digits: 30}
	for i := 0; i < b.N; i++ {
		if _, err := Build(context.Background(), req); err != nil {
			b.Fatal(err)
		}
	}
}
