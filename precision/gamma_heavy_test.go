//go:build heavy

package precision

import "testing"

// TestLogGammaRecurrenceHeavy runs the recurrence check of gamma_test.go at
// 1000 digits (3322 bits) on more arguments; run with -tags heavy.
func TestLogGammaRecurrenceHeavy(t *testing.T) { checkRecurrence(t, DigitsToBits(1000), 200) }
