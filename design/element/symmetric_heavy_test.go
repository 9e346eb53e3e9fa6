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
