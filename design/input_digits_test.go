package design

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"quadwright/moments"
)

// gammaList is Gamma(k + 3/2), k < m, to 16 digits from math.Gamma (the
// moments of x^(1/2) e^-x on [0, inf), A&S 6.1.1; float64, our own data).
func gammaList(t testing.TB, m int) *moments.MomentList {
	var b strings.Builder
	for k := 0; k < m; k++ {
		fmt.Fprintf(&b, "%.15e\n", math.Gamma(float64(k)+1.5))
	}
	ml, err := moments.ParseMomentList(strings.NewReader(b.String()), "gamma.txt")
	if err != nil {
		t.Fatal(err)
	}
	return ml
}

func TestDescribeInputMeasuredBesideBound(t *testing.T) {
	ctx := context.Background()
	half := moments.Interval{Lo: moments.Endpoint{Value: ratOf(0, 1)}, Hi: moments.Endpoint{Inf: 1}}
	src := NewMomentSource(gammaList(t, 12), moments.MonomialBasis(), half)
	r, err := Gauss(ctx, src, Request{Points: 5, Auto: true})
	if err != nil {
		t.Fatal(err)
	}
	if err := DescribeInput(ctx, src, r); err != nil {
		t.Fatal(err)
	}
	in := r.Input
	// The bound rests on three sign patterns and a digit of margin, the
	// measured figure on uniform draws: the bound may not exceed it.
	if in == nil || in.Carried != 16 || in.Points != 5 || in.Bound != r.Digits || in.Measured < in.Bound || in.Measured > 16 || in.Draws != MeasuredDraws || !(in.Spread > 0) {
		t.Fatalf("input %+v, rule digits %d", in, r.Digits)
	}
	again, err := src.DescribeInput(ctx)
	if err != nil || *again != *in {
		t.Errorf("seeded draws differ between runs: %+v, %+v (%v)", in, again, err)
	}
	// Declared exact, the same list asks for no limit and gives 34 digits.
	ml := gammaList(t, 12)
	ml.DeclareExact()
	ex := NewMomentSource(ml, moments.MonomialBasis(), half)
	r, err = Gauss(ctx, ex, Request{Points: 5, Auto: true})
	if err != nil || r.Digits != AutoDigits {
		t.Fatalf("exact list: digits %v, %v", r, err)
	}
	if in, err := ex.DescribeInput(ctx); err != nil || in != nil {
		t.Errorf("exact list describes its input: %+v, %v", in, err)
	}
}

func TestDescribeInputDiscrete(t *testing.T) {
	ctx := context.Background()
	dm, err := moments.ParseMeasure(strings.NewReader("0.1234567 0.3\n0.5 0.4\n0.8765432 0.3\n"), "d.txt")
	if err != nil {
		t.Fatal(err)
	}
	src := NewDiscreteSource(dm)
	r, err := Gauss(ctx, src, Request{Points: 2, Auto: true})
	if err != nil {
		t.Fatal(err)
	}
	if err := DescribeInput(ctx, src, r); err != nil {
		t.Fatal(err)
	}
	if in := r.Input; in == nil || in.Carried != 7 || in.Bound != r.Digits || in.Measured < in.Bound {
		t.Fatalf("input %+v, digits %d", r.Input, r.Digits)
	}
}

// BenchmarkCheckWholeList is the support test of a 128-moment list (the
// longest tested whole), -log(x) on [0, 1]: moments 1/(k+1)^2.
func BenchmarkCheckWholeList(b *testing.B) {
	var s strings.Builder
	for k := 0; k < 2*wholeListPairs; k++ {
		fmt.Fprintf(&s, "1/%d\n", (k+1)*(k+1))
	}
	for i := 0; i < b.N; i++ {
		ml, err := moments.ParseMomentList(strings.NewReader(s.String()), "log.txt")
		if err != nil {
			b.Fatal(err)
		}
		src := NewMomentSource(ml, moments.MonomialBasis(), moments.Interval{Lo: moments.Endpoint{Value: ratOf(0, 1)}, Hi: moments.Endpoint{Value: ratOf(1, 1)}})
		if err := src.checkWholeList(); err != nil {
			b.Fatal(err)
		}
	}
}
