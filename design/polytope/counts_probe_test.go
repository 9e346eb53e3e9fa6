package polytope

import (
	"context"
	"os"
	"strconv"
	"strings"
	"testing"
	"time"
)

// TestCountProbe prints point counts for QW_PROBE="name:deg,..." (a
// measuring aid; skipped unless the variable is set).
func TestCountProbe(t *testing.T) {
	spec := os.Getenv("QW_PROBE")
	if spec == "" {
		t.Skip("QW_PROBE not set")
	}
	for _, item := range strings.Split(spec, ",") {
		f := strings.Split(item, ":")
		deg, _ := strconv.Atoi(f[1])
		t0 := time.Now()
		for _, c := range testPolygons {
			if strings.HasPrefix(c.name, f[0]) {
				r, err := BuildPolygon(context.Background(), mustPolygon(t, c.src), Options{Degree: deg})
				if err != nil {
					t.Logf("%s %d: %v", c.name, deg, err)
					continue
				}
				t.Logf("%s %d: %d points, bound %d (%v)", c.name, deg, r.Points(), bound(2, deg), time.Since(t0))
			}
		}
		for _, c := range testPolyhedra {
			if strings.HasPrefix(c.name, f[0]) {
				r, err := BuildPolyhedron(context.Background(), mustPolyhedron(t, c.src), Options{Degree: deg})
				if err != nil {
					t.Logf("%s %d: %v", c.name, deg, err)
					continue
				}
				t.Logf("%s %d: %d points, bound %d (%v)", c.name, deg, r.Points(), bound(3, deg), time.Since(t0))
			}
		}
	}
}
