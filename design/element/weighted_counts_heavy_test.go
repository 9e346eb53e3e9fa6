//go:build heavy

package element

import (
	"context"
	"math"
	"testing"
)

// TestWeightedCountsHeavy checks the point counts of weighted rules
// against the unweighted ones (the targets of our issue on weighted
// counts; the unweighted counts are the catalogue's, ours).
func TestWeightedCountsHeavy(t *testing.T) {
	ctx := context.Background()
	for _, c := range []struct {
		s    Shape
		w    string
		d    int
		most int
	}{
		{Triangle, "x", 20, 88},
		{Tetrahedron, "1+x", 10, 95},
	} {
		r, err := Build(ctx, Request{Shape: c.s, Degree: c.d, Weight: c.w})
		if err != nil {
			t.Errorf("%s %s degree %d: %v", c.s, c.w, c.d, err)
			continue
		}
		t.Logf("%s weight %s degree %d: %d points (target %d)", c.s, c.w, c.d, r.Points(), c.most)
		if r.Points() > c.most {
			t.Errorf("%s weight %s degree %d: %d points, more than %d", c.s, c.w, c.d, r.Points(), c.most)
		}
	}
	for d := 1; d <= 15; d++ {
		r, err := Build(ctx, Request{Shape: Quadrilateral, Degree: d, Weight: "1+x"})
		if err != nil {
			t.Errorf("quadrilateral 1+x degree %d: %v", d, err)
			continue
		}
		u, ok, err := Symmetric(ctx, Request{Shape: Quadrilateral, Degree: d})
		if err != nil || !ok {
			t.Errorf("quadrilateral degree %d: no catalogued rule (%v)", d, err)
			continue
		}
		lim := int(math.Floor(1.1 * float64(u.Points())))
		t.Logf("quadrilateral weight 1+x degree %d: %d points (catalogue %d, limit %d)", d, r.Points(), u.Points(), lim)
		if r.Points() > lim {
			t.Errorf("quadrilateral weight 1+x degree %d: %d points, catalogue %d", d, r.Points(), u.Points())
		}
	}
}
