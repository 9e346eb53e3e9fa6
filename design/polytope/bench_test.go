package polytope

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// randomHexagon is a convex hexagon: six points of a circle of radius
// about 1 around (cx, cy), at angles at least 0.4 apart, coordinates
// rounded to 6 decimals (convex position survives the rounding).
func randomHexagon(rng *rand.Rand) string {
	var ang [6]float64
	for {
		for i := range ang {
			ang[i] = rng.Float64() * 2 * math.Pi
		}
		sortFloats(ang[:])
		ok := ang[0]+2*math.Pi-ang[5] > 0.4
		for i := 1; i < 6; i++ {
			ok = ok && ang[i]-ang[i-1] > 0.4
		}
		if ok {
			break
		}
	}
	cx, cy, r := rng.Float64()*10, rng.Float64()*10, 0.5+rng.Float64()
	var b strings.Builder
	for _, a := range ang {
		fmt.Fprintf(&b, "%.6f %.6f\n", cx+r*math.Cos(a), cy+r*math.Sin(a))
	}
	return b.String()
}

func sortFloats(a []float64) {
	for i := 1; i < len(a); i++ {
		for j := i; j > 0 && a[j] < a[j-1]; j-- {
			a[j], a[j-1] = a[j-1], a[j]
		}
	}
}

func hexBlocks(n int, seed uint64) []Block {
	rng := rand.New(rand.NewPCG(seed, 1))
	out := make([]Block, n)
	for i := range out {
		out[i] = Block{Index: i + 1, Line: 1, Text: randomHexagon(rng)}
	}
	return out
}

// repeatedBlocks is n translated and scaled copies of 10 hexagons (exact:
// the translations and scales are short decimals).
func repeatedBlocks(n int) []Block {
	base := hexBlocks(10, 7)
	out := make([]Block, n)
	for i := range out {
		var b strings.Builder
		s := 1 + float64(i%7)/4
		dx, dy := float64(i%100), float64(i/100)
		for _, line := range strings.Split(strings.TrimSpace(base[i%10].Text), "\n") {
			var x, y float64
			fmt.Sscan(line, &x, &y)
			fmt.Fprintf(&b, "%.8f %.8f\n", s*x+dx, s*y+dy)
		}
		out[i] = Block{Index: i + 1, Line: 1, Text: b.String()}
	}
	return out
}

func runBatch(b *testing.B, blocks []Block) {
	b.ResetTimer() // the cells' text is not part of the batch
	for i := 0; i < b.N; i++ {
		for _, r := range Batch(context.Background(), blocks, "bench", BatchOptions{Options: Options{Degree: 4}, Dim: 2}) {
			if r.Err != nil {
				b.Fatal(r.Err)
			}
		}
	}
}

// BenchmarkPolygonBatch: 1000 random convex hexagons at degree 4 in
// float64 (target: 10 s with -cpu 1).
func BenchmarkPolygonBatch(b *testing.B) { runBatch(b, hexBlocks(1000, 1)) }

// BenchmarkPolygonBatchRepeated: 10000 translated and scaled copies of 10
// hexagons at degree 4 (target: 2 s with -cpu 1).
func BenchmarkPolygonBatchRepeated(b *testing.B) { runBatch(b, repeatedBlocks(10000)) }

// BenchmarkPolygonBatch50 is a tenth... a fiftieth of BenchmarkPolygonBatch, for quick looks.
func BenchmarkPolygonBatch50(b *testing.B) { runBatch(b, hexBlocks(50, 1)) }

// BenchmarkPolygonBatchRepeated1000 is a tenth of BenchmarkPolygonBatchRepeated, for quick looks.
func BenchmarkPolygonBatchRepeated1000(b *testing.B) { runBatch(b, repeatedBlocks(1000)) }
