package levelset

import (
	"context"
	"fmt"
)

// refine recomputes the rule at extended precision (Request.Digits).
func refine(ctx context.Context, g *geom, r *Rule) error {
	return fmt.Errorf("--digits %d: not available yet for level-set rules", r.Digits)
}
