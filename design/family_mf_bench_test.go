package design

import (
	"syscall"
	"testing"
)

// The Gauss-Legendre and Gauss-Jacobi(-0.7, 2.3) builds at 34 digits with
// the asymptotic double-double start (family_mf.go) and, for comparison,
// with the eigenvalue start it replaces.
func BenchmarkMFLegendre1000Digits34(b *testing.B)      { benchMF(b, "legendre", "", "", 1000, false) }
func BenchmarkMFLegendre1000Digits34Eigen(b *testing.B) { benchMF(b, "legendre", "", "", 1000, true) }
func BenchmarkMFJacobi1000Digits34(b *testing.B)        { benchMF(b, "jacobi", "-0.7", "2.3", 1000, false) }
func BenchmarkMFJacobi1000Digits34Eigen(b *testing.B) {
	benchMF(b, "jacobi", "-0.7", "2.3", 1000, true)
}
func BenchmarkMFLegendre100Digits34(b *testing.B)      { benchMF(b, "legendre", "", "", 100, false) }
func BenchmarkMFLegendre100Digits34Eigen(b *testing.B) { benchMF(b, "legendre", "", "", 100, true) }

func benchMF(b *testing.B, fam, a, be string, n int, off bool) {
	mfOff = off
	defer func() { mfOff = false }()
	src := family(b, fam, a, be, "")
	c0 := cpuNanos()
	for i := 0; i < b.N; i++ {
		if _, err := Gauss(b.Context(), src, Request{Points: n, Digits: 34}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(cpuNanos()-c0)/float64(b.N), "cpu-ns/op")
}

// cpuNanos is the process's user and system CPU time so far: under a
// shared machine's contention it moves much less than the wall clock.
func cpuNanos() int64 {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return ru.Utime.Nano() + ru.Stime.Nano()
}
