package levelset

import (
	"context"
	"fmt"
)

// refine would recompute the rule at extended precision (Request.Digits);
// the extended-precision path is not built yet, so --digits is refused
// rather than printing float64 values as if they carried more digits.
func refine(ctx context.Context, g *geom, r *Rule) error {
	return fmt.Errorf("--digits %d: cut-element rules are built in float64 only so far; leave out --digits", r.Digits)
}
