package stability

import (
	"bytes"
	"fmt"
	"image/color"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"
)

var (
	colPositive = color.RGBA{R: 31, G: 119, B: 180, A: 255}
	colNegative = color.RGBA{R: 214, G: 39, B: 40, A: 255}
	colPass     = color.RGBA{R: 44, G: 160, B: 44, A: 255}
	colGauss    = color.RGBA{R: 127, G: 127, B: 127, A: 255}
)

// svgOf draws p on a w x h canvas and returns the SVG element alone (no XML
// declaration), ready to be placed inline in an HTML page.
func svgOf(p *plot.Plot, w, h vg.Length) (string, error) {
	c := vgsvg.New(w, h)
	p.Draw(draw.New(c))
	var buf bytes.Buffer
	if _, err := c.WriteTo(&buf); err != nil {
		return "", err
	}
	s := buf.String()
	i := strings.Index(s, "<svg")
	if i < 0 {
		return "", fmt.Errorf("the plot library wrote no svg element")
	}
	return s[i:], nil
}

// logRange returns positive values for a log axis: v with non-positive or
// non-finite entries replaced by floor (or ceiling), and the axis range.
func logRange(v []float64) (out []float64, lo, hi float64) {
	lo, hi = math.Inf(1), 0
	for _, x := range v {
		if x > 0 && !math.IsInf(x, 0) {
			lo, hi = math.Min(lo, x), math.Max(hi, x)
		}
	}
	if hi == 0 {
		lo, hi = 1e-17, 1
	}
	floor, ceil := lo/10, hi*10
	out = make([]float64, len(v))
	for i, x := range v {
		switch {
		case math.IsInf(x, 1):
			out[i] = ceil
		case !(x > 0):
			out[i] = floor
		default:
			out[i] = x
		}
	}
	lo = math.Pow(10, math.Floor(math.Log10(floor)))
	hi = math.Pow(10, math.Ceil(math.Log10(ceil)))
	return out, lo, hi
}

func logY(p *plot.Plot, lo, hi float64) {
	p.Y.Scale = plot.LogScale{}
	p.Y.Tick.Marker = decadeTicks{}
	p.Y.Min, p.Y.Max = lo, hi
}

// decadeTicks marks every power of ten in range and labels at most about
// eight of them ("1e-12"), so that axes spanning many decades stay legible.
type decadeTicks struct{}

// Ticks returns the tick marks for [min, max], min > 0.
func (decadeTicks) Ticks(min, max float64) []plot.Tick {
	lo, hi := int(math.Floor(math.Log10(min))), int(math.Ceil(math.Log10(max)))
	step := 1 + (hi-lo)/8
	var ticks []plot.Tick
	for e := lo; e <= hi; e++ {
		v := math.Pow(10, float64(e))
		if v < min || v > max {
			continue
		}
		t := plot.Tick{Value: v}
		if (e-lo)%step == 0 {
			switch {
			case e >= 0 && e <= 3:
				t.Label = strconv.Itoa(int(v))
			default:
				t.Label = fmt.Sprintf("1e%d", e)
			}
		}
		ticks = append(ticks, t)
	}
	return ticks
}

// addGlyphs adds the points xy (none: nothing) as glyphs of one shape and
// colour, with a legend entry.
func addGlyphs(p *plot.Plot, xy plotter.XYs, name string, col color.Color, shape draw.GlyphDrawer) error {
	if len(xy) == 0 {
		return nil
	}
	s, err := plotter.NewScatter(xy)
	if err != nil {
		return err
	}
	s.GlyphStyle = draw.GlyphStyle{Color: col, Radius: vg.Points(3.5), Shape: shape}
	p.Add(s)
	p.Legend.Add(name, s)
	return nil
}

// plotWeights draws the nodes on the interval with |weight| on a log scale:
// positive weights as blue discs, negative ones as red triangles labelled
// "w<0", and the finite ends of the interval as vertical lines.
func (r *Report) plotWeights() (string, error) {
	p := plot.New()
	p.Title.Text = "Nodes and |weights|"
	p.X.Label.Text = "node x"
	p.Y.Label.Text = "|w| (log scale)"
	abs := make([]float64, len(r.Weights))
	for i, w := range r.Weights {
		abs[i] = math.Abs(w)
	}
	ys, lo, hi := logRange(abs)
	var pos, neg plotter.XYs
	var negLabels []string
	for i, x := range r.Nodes {
		if r.Weights[i] < 0 {
			neg = append(neg, plotter.XY{X: x, Y: ys[i]})
			negLabels = append(negLabels, "w<0")
		} else {
			pos = append(pos, plotter.XY{X: x, Y: ys[i]})
		}
	}
	logY(p, lo, hi)
	if err := addGlyphs(p, pos, "weight > 0 (disc)", colPositive, draw.CircleGlyph{}); err != nil {
		return "", err
	}
	if err := addGlyphs(p, neg, "weight < 0 (triangle, labelled w<0)", colNegative, draw.PyramidGlyph{}); err != nil {
		return "", err
	}
	if len(neg) > 0 {
		if len(neg) <= 60 {
			l, err := plotter.NewLabels(plotter.XYLabels{XYs: neg, Labels: negLabels})
			if err != nil {
				return "", err
			}
			l.Offset = vg.Point{X: vg.Points(4), Y: vg.Points(4)}
			for i := range l.TextStyle {
				l.TextStyle[i].Color = colNegative
			}
			p.Add(l)
		}
	}
	if len(r.Interval) == 2 {
		for _, e := range r.Interval {
			var x float64
			if _, err := fmt.Sscan(e, &x); err != nil || math.IsInf(x, 0) {
				continue
			}
			ln, err := plotter.NewLine(plotter.XYs{{X: x, Y: lo}, {X: x, Y: hi}})
			if err != nil {
				return "", err
			}
			ln.LineStyle.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
			p.Add(ln)
		}
	}
	p.Legend.Top = true
	return svgOf(p, 16*vg.Centimeter, 9*vg.Centimeter)
}

// plotResidual draws the exactness residual, as a share of the tolerance,
// against the degree: passing degrees as green discs, failing ones as red
// crosses, and the tolerance (share 1) as a dashed line.
func (r *Report) plotResidual() (string, error) {
	p := plot.New()
	p.Title.Text = "Exactness residual by degree"
	p.X.Label.Text = "degree j"
	p.Y.Label.Text = "residual / tolerance (log scale)"
	v := make([]float64, len(r.Residual))
	for i, f := range r.Residual {
		v[i] = float64(f)
	}
	ys, lo, hi := logRange(append(v, 1))
	ys = ys[:len(v)]
	logY(p, lo, hi)
	var pass, fail plotter.XYs
	for j, y := range ys {
		if j <= r.Degree {
			pass = append(pass, plotter.XY{X: float64(j), Y: y})
		} else {
			fail = append(fail, plotter.XY{X: float64(j), Y: y})
		}
	}
	if err := addGlyphs(p, pass, "integrated (disc)", colPass, draw.CircleGlyph{}); err != nil {
		return "", err
	}
	if err := addGlyphs(p, fail, "not integrated (cross)", colNegative, draw.CrossGlyph{}); err != nil {
		return "", err
	}
	ln, err := plotter.NewLine(plotter.XYs{{X: 0, Y: 1}, {X: math.Max(1, float64(len(v)-1)), Y: 1}})
	if err != nil {
		return "", err
	}
	ln.LineStyle.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
	p.Add(ln)
	p.Legend.Add("tolerance", ln)
	p.Legend.Top = true
	p.Legend.Left = true
	return svgOf(p, 16*vg.Centimeter, 9*vg.Centimeter)
}

// plotGenz draws the relative errors on the test integrands for this rule
// (discs) and the Gauss rule of the same size (squares).
func (r *Report) plotGenz() (string, error) {
	g := r.Genz
	p := plot.New()
	p.Title.Text = "Errors on Genz's test integrands"
	p.Y.Label.Text = "relative error (log scale)"
	names := make([]string, len(g.Cases))
	var all []float64
	for i, cs := range g.Cases {
		names[i] = cs.Name
		all = append(all, float64(cs.RuleError), float64(cs.GaussError))
	}
	ys, lo, hi := logRange(all)
	logY(p, lo, hi)
	var mine, gauss plotter.XYs
	for i := range g.Cases {
		mine = append(mine, plotter.XY{X: float64(i) - 0.1, Y: ys[2*i]})
		gauss = append(gauss, plotter.XY{X: float64(i) + 0.1, Y: ys[2*i+1]})
	}
	if err := addGlyphs(p, mine, "this rule (disc)", colPositive, draw.CircleGlyph{}); err != nil {
		return "", err
	}
	if err := addGlyphs(p, gauss, fmt.Sprintf("gauss, %d points (square)", g.GaussPoints), colGauss, draw.BoxGlyph{}); err != nil {
		return "", err
	}
	p.NominalX(names...)
	p.Legend.Top = true
	return svgOf(p, 16*vg.Centimeter, 9*vg.Centimeter)
}
