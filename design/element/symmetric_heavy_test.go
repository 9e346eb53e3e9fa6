//go:build heavy

package element

import (
	"context"
	"testing"
)

// The catalogue's searches of middle degrees run again from scratch (seed
// 1, as the catalogues were made) and find the published counts (from
// memory) again: a check that the search, not only its stored results,
// still works.
func TestSearchPublishedHeavy(t *testing.T) {
	ctx := context.Background()
	for _, c := range []struct {
		s Shape
		d int
	}{{Triangle, 12}, {Quadrilateral, 15}, {Hexahedron, 9}, {Tetrahedron, 6}, {Prism, 5}, {Pyramid, 6}} {
		p := Published(c.s, c.d)
		res, ok, err := Search(ctx, c.s, c.d, p, 1, 4000)
		if err != nil || !ok {
			t.Errorf("%s degree %d: no %d-point rule (%v)", c.s, c.d, p, err)
			continue
		}
		if _, err := NewCatalogueEntry(ctx, c.d, res, 1); err != nil {
			t.Errorf("%s degree %d: %v", c.s, c.d, err)
		}
	}
}

// The catalogue's descents (element.Smallest, ten descents) run again and
// reach the catalogued counts: pyramid degree 10 at the published 83 and
// prism degree 9 at 59, one under the published 60 (from memory).
func TestSmallestHeavy(t *testing.T) {
	ctx := context.Background()
	for _, c := range []struct {
		s    Shape
		d, p int
		seed uint64
	}{{Pyramid, 10, 83, 1}, {Prism, 9, 59, 7}} {
		res, reached, ok, err := Smallest(ctx, c.s, c.d, Published(c.s, c.d), c.seed, 10)
		if err != nil || !ok || !reached {
			t.Errorf("%s degree %d: no rule of the published count (reached %v, %v)", c.s, c.d, reached, err)
			continue
		}
		if n := res.Structure.Points(SymmetryOf(c.s)); n != c.p {
			t.Errorf("%s degree %d: %d points, want %d", c.s, c.d, n, c.p)
		}
		if _, err := NewCatalogueEntry(ctx, c.d, res, c.seed); err != nil {
			t.Errorf("%s degree %d: %v", c.s, c.d, err)
		}
	}
}
