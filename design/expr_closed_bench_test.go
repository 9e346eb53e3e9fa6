package design

import "testing"

// BenchmarkClosedLogRecurrence1000 times the closed-form route alone for
// -log(x) on [0,1]: 1000 pairs at the 256 bits a 32-digit, 1000-point Gauss
// rule asks for (exact moments, two modified Chebyshev runs and their
// comparison), the part of BenchmarkLogWeight1000Digits32 before Newton.
func BenchmarkClosedLogRecurrence1000(b *testing.B) {
	src := exprSource(b, "-log(x)", "0,1")
	cf, ok := src.closedForm()
	if !ok {
		b.Fatal("no closed form")
	}
	for i := 0; i < b.N; i++ {
		if _, err := src.closedRoute(cf, 1000, 256); err != nil {
			b.Fatal(err)
		}
	}
}
