package moments

import (
	"strings"
	"testing"
)

// TestDoubleStarRefused: "**", the power of some other languages, is
// refused with the hint to write "^" (issue 19), at its position.
func TestDoubleStarRefused(t *testing.T) {
	for _, src := range []string{"x**2", "exp(x) ** 0.5", "2**x"} {
		_, err := ParseExpr(src, "x")
		if err == nil || !strings.Contains(err.Error(), `write a power with "^"`) || !strings.Contains(err.Error(), "position") {
			t.Errorf("%q: %v", src, err)
		}
	}
	if _, err := ParseExpr("x*2*x", "x"); err != nil {
		t.Errorf("single stars: %v", err)
	}
}
