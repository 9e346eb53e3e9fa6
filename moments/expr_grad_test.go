package moments

import (
	"math"
	"testing"
)

// TestGrad64 checks the forward-mode gradient against derivatives worked
// by hand (calculus, from memory).
func TestGrad64(t *testing.T) {
	x, y, z := 0.3, -0.7, 1.1
	for _, c := range []struct {
		src  string
		want [3]float64
	}{
		{"x^2+y^2+z^2", [3]float64{2 * x, 2 * y, 2 * z}},
		{"x*y/z", [3]float64{y / z, x / z, -x * y / (z * z)}},
		{"sin(x)*exp(y)-log(z)", [3]float64{math.Cos(x) * math.Exp(y), math.Sin(x) * math.Exp(y), -1 / z}},
		{"sqrt(x^2+z^2)", [3]float64{x / math.Hypot(x, z), 0, z / math.Hypot(x, z)}},
		{"z^x", [3]float64{math.Pow(z, x) * math.Log(z), 0, x * math.Pow(z, x-1)}},
		{"atan(y)+tanh(x)+cosh(z)", [3]float64{1 - math.Pow(math.Tanh(x), 2), 1 / (1 + y*y), math.Sinh(z)}},
	} {
		e := MustParseExpr(c.src, "x", "y", "z")
		var g [3]float64
		v := e.Grad64([]float64{x, y, z}, g[:])
		if d := math.Abs(v - e.Eval64(x, y, z)); d > 1e-14*math.Max(1, math.Abs(v)) {
			t.Errorf("%s: value %v, Eval64 %v", c.src, v, e.Eval64(x, y, z))
		}
		for i := range g {
			if math.Abs(g[i]-c.want[i]) > 1e-14*math.Max(1, math.Abs(c.want[i])) {
				t.Errorf("%s: d/d%s = %v, want %v", c.src, "xyz"[i:i+1], g[i], c.want[i])
			}
		}
	}
}

// FuzzGradSpan: over a box, the interval enclosure holds the value and
// gradient at the box's corners and centre wherever they are finite.
func FuzzGradSpan(f *testing.F) {
	f.Add("x^2*y-sin(x*y)", -1.0, 0.5, 0.25)
	f.Add("exp(x)/(1+y^2)-tan(x)", 0.0, 1.0, 0.5)
	f.Add("abs(x-y)^3+sqrt(x+2)", -1.0, 1.0, 0.1)
	f.Fuzz(func(t *testing.T, src string, lo, hi, frac float64) {
		e, err := ParseExpr(src, "x", "y")
		if err != nil || !(lo <= hi) || math.IsInf(hi-lo, 0) || math.Abs(lo) > 1e6 || math.Abs(hi) > 1e6 {
			return
		}
		box := []Span{{lo, hi}, {lo, hi}}
		var gs [2]Span
		v := e.GradSpan(box, gs[:])
		frac = math.Abs(frac) - math.Floor(math.Abs(frac))
		p := lo + frac*(hi-lo)
		for _, pt := range [][2]float64{{lo, lo}, {hi, p}, {p, hi}, {p, p}} {
			var g [2]float64
			w := e.Grad64(pt[:], g[:])
			in := func(s Span, a float64) bool {
				return math.IsNaN(a) || math.IsInf(a, 0) || (s.Lo <= a && a <= s.Hi) || math.IsNaN(s.Lo) || math.IsNaN(s.Hi)
			}
			// Grad64 rounds too: allow its own few ulps of slack.
			slack := func(s Span) Span {
				return Span{s.Lo - 1e-9*math.Abs(s.Lo) - 1e-300, s.Hi + 1e-9*math.Abs(s.Hi) + 1e-300}
			}
			if !in(slack(v), w) {
				t.Fatalf("%q on [%v,%v]^2: value %v at %v outside [%v, %v]", src, lo, hi, w, pt, v.Lo, v.Hi)
			}
			for i := range g {
				if !in(slack(gs[i]), g[i]) {
					t.Fatalf("%q on [%v,%v]^2: derivative %d %v at %v outside [%v, %v]", src, lo, hi, i, g[i], pt, gs[i].Lo, gs[i].Hi)
				}
			}
		}
	})
}
