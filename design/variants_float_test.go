package design

import (
	"context"
	"math/big"
	"strconv"
	"testing"

	"quadwright/precision"
)

// TestVariantsFloat64Mode checks float64 mode (CONTRACT.md) for every kind:
// each printed value is the float64 nearest to the value of the same rule
// built at 40 digits (which decides the rounding unless the true value lies
// within 1e-40 relative of a midpoint; a test would report it). N = 1..12
// and a few larger; -tags heavy: N = 1..60.
func TestVariantsFloat64Mode(t *testing.T) {
	ctx := context.Background()
	kinds := []struct {
		name  string
		src   FamilySource
		build func(m Measure, req Request) (*Rule, error)
		minN  int
	}{
		{"radau", family(t, "jacobi", "-0.7", "2.3", ""), func(m Measure, req Request) (*Rule, error) { return Radau(ctx, m, req, nil) }, 1},
		{"radau", family(t, "laguerre", "1.5", "", ""), func(m Measure, req Request) (*Rule, error) { return Radau(ctx, m, req, nil) }, 1},
		{"lobatto", family(t, "legendre", "", "", "0,3"), func(m Measure, req Request) (*Rule, error) { return Lobatto(ctx, m, req, nil, nil) }, 2},
		{"kronrod", family(t, "legendre", "", "", ""), func(m Measure, req Request) (*Rule, error) { return Kronrod(ctx, m, req) }, 1},
		{"kronrod", family(t, "gegenbauer", "0.75", "", ""), func(m Measure, req Request) (*Rule, error) { return Kronrod(ctx, m, req) }, 1},
		{"anti-gauss", family(t, "hermite", "", "", ""), func(m Measure, req Request) (*Rule, error) { return AntiGauss(ctx, m, req) }, 1},
		{"fixed", family(t, "chebyshev2", "", "", ""), func(m Measure, req Request) (*Rule, error) {
			return GaussFixed(ctx, m, req, []*big.Rat{big.NewRat(-3, 2), big.NewRat(1, 1)})
		}, 2},
		{"clenshaw-curtis", family(t, "jacobi", "0.5", "0", ""), func(m Measure, req Request) (*Rule, error) { return Preset(ctx, m, req, "clenshaw-curtis") }, 2},
	}
	ns := []int{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 17, 31, 64}
	if heavy {
		ns = ns[:0]
		for n := 1; n <= 60; n++ {
			ns = append(ns, n)
		}
	}
	for _, k := range kinds {
		for _, n := range ns {
			if n < k.minN {
				continue
			}
			f, err := k.build(k.src, Request{Points: n})
			if err != nil {
				t.Fatalf("%s %s N=%d float64: %v", k.name, k.src.Label(), n, err)
			}
			e, err := k.build(k.src, Request{Points: n, Digits: 40})
			if err != nil {
				t.Fatalf("%s %s N=%d: %v", k.name, k.src.Label(), n, err)
			}
			if f.Degree != e.Degree {
				t.Errorf("%s %s N=%d: degree %d in float64 mode, %d at 40 digits", k.name, k.src.Label(), n, f.Degree, e.Degree)
			}
			for i := range f.Nodes {
				for _, pair := range [][2]string{{f.Nodes[i], e.Nodes[i]}, {f.Weights[i], e.Weights[i]}} {
					got, err := strconv.ParseFloat(pair[0], 64)
					if err != nil {
						t.Fatal(err)
					}
					want, _ := new(big.Float).SetPrec(200).SetRat(rat(t, pair[1])).Float64()
					if got != want || pair[0] != precision.FormatFloat64(got) {
						t.Errorf("%s %s N=%d i=%d: float64 mode %s, nearest double to %s is %v", k.name, k.src.Label(), n, i, pair[0], pair[1], want)
					}
				}
			}
		}
	}
}
