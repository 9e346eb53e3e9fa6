package fast_test

import (
	"syscall"
	"testing"
	"time"

	"gonum.org/v1/gonum/integrate/quad"

	"quadwright/design/fast"
)

// The benchmarks run side by side so that their ratios can be read off one
// run: go test -run XXX -bench . ./design/fast/. Besides wall time each
// reports cpu-ms/op, the process CPU time (all cores) per rule, which a
// machine shared with other jobs does not inflate.

func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// measureCPU runs f b.N times and reports its CPU time per call.
func measureCPU(b *testing.B, f func()) {
	b.ResetTimer()
	start := cpuTime()
	for i := 0; i < b.N; i++ {
		f()
	}
	b.ReportMetric(float64(cpuTime()-start)/1e6/float64(b.N), "cpu-ms/op")
}

func BenchmarkGaussLegendre1e6(b *testing.B) {
	n := 1000000
	x, w := make([]float64, n), make([]float64, n)
	measureCPU(b, func() { fast.Legendre(n, x, w) })
}

func BenchmarkGonumLegendre1e6(b *testing.B) {
	n := 1000000
	x, w := make([]float64, n), make([]float64, n)
	measureCPU(b, func() { quad.Legendre{}.FixedLocations(x, w, -1, 1) })
}

func BenchmarkGaussJacobi1e6(b *testing.B) {
	n := 1000000
	x, w := make([]float64, n), make([]float64, n)
	measureCPU(b, func() {
		if err := fast.Jacobi(n, -0.3, 0.8, x, w); err != nil {
			b.Fatal(err)
		}
	})
}

func BenchmarkGaussHermite1e6(b *testing.B) {
	n := 1000000
	x, w := make([]float64, n), make([]float64, n)
	measureCPU(b, func() { fast.Hermite(n, x, w, true) })
}

func BenchmarkGaussLaguerre1e6(b *testing.B) {
	n := 1000000
	x, w := make([]float64, n), make([]float64, n)
	measureCPU(b, func() {
		if err := fast.Laguerre(n, 0, x, w, true); err != nil {
			b.Fatal(err)
		}
	})
}
