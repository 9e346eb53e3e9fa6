package levelset

import (
	"math"
	"os"
	"testing"
)

// TestConvergenceTable prints the error against order for the disc and
// the ball of the README's convergence table (run with
// LEVELSET_TABLE=1 go test -run ConvergenceTable -v ./design/levelset/).
func TestConvergenceTable(t *testing.T) {
	if os.Getenv("LEVELSET_TABLE") == "" {
		t.Skip("set LEVELSET_TABLE=1 to print the table")
	}
	for _, q := range []int{2, 4, 6, 8, 10, 12, 14, 16, 20} {
		d := build(t, Request{Shape: "quadrilateral", LevelSet: "(x-0.1)^2+(y+0.05)^2-0.64", Order: q})
		c := build(t, Request{Shape: "quadrilateral", LevelSet: "(x-0.1)^2+(y+0.05)^2-0.64", Order: q, Side: Surface})
		line := func(r *Rule, want float64) (int, float64) { return len(r.Nodes), relErr(integral(r, one), want) }
		nd, ed := line(d, math.Pi*0.64)
		nc, ec := line(c, 2*math.Pi*0.8)
		if q > 12 {
			t.Logf("| %d | %d | %.1e | %d | %.1e | | | | |", q, nd, ed, nc, ec)
			continue
		}
		b := build(t, Request{Shape: "hexahedron", LevelSet: "(x-0.1)^2+(y+0.05)^2+(z-0.02)^2-0.64", Order: q})
		s := build(t, Request{Shape: "hexahedron", LevelSet: "(x-0.1)^2+(y+0.05)^2+(z-0.02)^2-0.64", Order: q, Side: Surface})
		nb, eb := line(b, 4*math.Pi*0.512/3)
		ns, es := line(s, 4*math.Pi*0.64)
		t.Logf("| %d | %d | %.1e | %d | %.1e | %d | %.1e | %d | %.1e |", q, nd, ed, nc, ec, nb, eb, ns, es)
	}
}
