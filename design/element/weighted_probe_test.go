package element

import (
	"context"
	"os"
	"strconv"
	"strings"
	"testing"
	"time"
)

// TestWeightedCountProbe prints weighted point counts for
// QW_WPROBE="shape:weight:deg;..." (a measuring aid; skipped unless the
// variable is set).
func TestWeightedCountProbe(t *testing.T) {
	spec := os.Getenv("QW_WPROBE")
	if spec == "" {
		t.Skip("QW_WPROBE not set")
	}
	for _, item := range strings.Split(spec, ";") {
		f := strings.Split(item, ":")
		deg, _ := strconv.Atoi(f[2])
		s, err := ParseShape(f[0])
		if err != nil {
			t.Fatal(err)
		}
		t0 := time.Now()
		r, err := Build(context.Background(), Request{Shape: s, Degree: deg, Weight: f[1]})
		if err != nil {
			t.Logf("%s: %v", item, err)
			continue
		}
		t.Logf("%s: %d points (%v)", item, r.Points(), time.Since(t0))
	}
}
