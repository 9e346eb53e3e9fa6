package systems

import (
	"context"
	"fmt"
	"testing"

	"quadwright/design"
	"quadwright/moments"
)

func benchSystem(b *testing.B, list, iv string, digits int) {
	fs, err := ParseFunctions(list)
	if err != nil {
		b.Fatal(err)
	}
	in, _ := moments.ParseInterval(iv)
	for i := 0; i < b.N; i++ {
		// A fresh weight each time: no memo of an earlier run helps.
		w, err := moments.NewWeight("1", in, nil)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := GeneralizedGauss(context.Background(), Problem{Functions: fs, Weight: w}, design.Request{Digits: digits}); err != nil {
			b.Fatal(err)
		}
	}
}

func logList(n int) string { return fmt.Sprintf("x^k, x^k*log(x); k=0..%d", n-1) }

// BenchmarkLogSystem8Digits32 is the 8-point log system at 32 digits.
func BenchmarkLogSystem8Digits32(b *testing.B) { benchSystem(b, logList(8), "0,1", 32) }

// BenchmarkLogSystem16Digits32 is the 16-point log system at 32 digits
// (target: at most 1 s on one core).
func BenchmarkLogSystem16Digits32(b *testing.B) { benchSystem(b, logList(16), "0,1", 32) }

// BenchmarkLogSystem32Digits32 is the 32-point log system at 32 digits
// (target: at most 10 s on one core).
func BenchmarkLogSystem32Digits32(b *testing.B) { benchSystem(b, logList(32), "0,1", 32) }
