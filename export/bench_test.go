package export

import (
	"fmt"
	"io"
	"strings"
	"testing"

	"quadwright/rulefile"
)

// benchRule is a synthetic 1000-node table at 34 digits: the size and
// precision of a large extended-precision build.
func benchRule(b *testing.B) *rulefile.File {
	var s strings.Builder
	for i := 1; i <= 1000; i++ {
		fmt.Fprintf(&s, "0.%04d123456789012345678901234567891 0.%04d987654321098765432109876543211\n", i, 1000+i)
	}
	f, err := rulefile.Parse("bench", []byte(s.String()))
	if err != nil {
		b.Fatal(err)
	}
	return f
}

// BenchmarkWrite renders the 1000-node, 34-digit rule in each language.
// Target: under 100 ms per language (export is interactive); parsing
// the values exactly (precision.ParseNumber) takes most of it.
func BenchmarkWrite(b *testing.B) {
	f := benchRule(b)
	for _, lang := range Languages {
		b.Run(lang, func(b *testing.B) {
			for b.Loop() {
				if err := Write(io.Discard, f, lang, Options{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
