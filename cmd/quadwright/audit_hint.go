package main

import (
	"fmt"
	"strings"

	"quadwright/design"
	"quadwright/rulefile"
)

// fileMeasureHint refuses, with the flag to give, a rule file whose measure
// audit cannot rebuild by itself: one built from a moment list or a
// discrete measure (weight "moments(FILE)" or "measure(FILE)"), or a text
// table whose header names a measure but no weight. Without it such a file
// would fall to the default, weight 1 on its interval, and be audited
// against a measure it was never built for.
func fileMeasureHint(f *rulefile.File, path string) error {
	if flag, file, ok := design.FileWeight(f.Weight); ok {
		return fmt.Errorf("rule file %s: its measure was given by the file %s; audit it with %s %s (and --interval as it was built)", path, file, flag, file)
	}
	if strings.TrimSpace(f.Weight) == "" && f.Family == nil && strings.TrimSpace(f.Measure) != "" {
		return fmt.Errorf("rule file %s: its header names the measure %q but no weight; give the measure as it was built (--moments, --measure, --weight or --family)", path, f.Measure)
	}
	return nil
}
