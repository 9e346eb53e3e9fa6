package stability

import (
	"fmt"
	"html"
	"io"
	"math"
	"strings"

	"quadwright/design/element"
)

// WriteHTML writes a self-contained page: the text report and a scatter
// plot of the nodes on the element (inline SVG; a 3-D element is shown in
// its x-y and x-z projections), each node a disc of area proportional to
// |w|, negative weights in red. nodes are the printed coordinates of the
// rule the report was made from.
func (r *ElementReport) WriteHTML(w io.Writer, title string, nodes [][]string, weights []string) error {
	var text strings.Builder
	if err := r.WriteText(&text, title); err != nil {
		return err
	}
	var b strings.Builder
	fmt.Fprintf(&b, "<!DOCTYPE html>\n<html><head><meta charset=\"utf-8\"><title>audit of %s</title>\n", html.EscapeString(title))
	b.WriteString("<style>body{font-family:sans-serif;margin:2em}pre{background:#f6f6f6;padding:1em}svg{border:1px solid #ccc;margin:0.5em}</style></head><body>\n")
	fmt.Fprintf(&b, "<h1>audit of %s</h1>\n<pre>%s</pre>\n", html.EscapeString(title), html.EscapeString(text.String()))
	s, err := element.ParseShape(r.Shape)
	if err != nil {
		return err
	}
	pts := make([][]float64, len(nodes))
	wts := make([]float64, len(nodes))
	wmax := 0.0
	for i := range nodes {
		pts[i] = make([]float64, len(nodes[i]))
		for k, c := range nodes[i] {
			fmt.Sscan(c, &pts[i][k])
		}
		fmt.Sscan(weights[i], &wts[i])
		wmax = max(wmax, math.Abs(wts[i]))
	}
	views := [][2]int{{0, 1}}
	switch s.Dim() {
	case 1:
		views = [][2]int{{0, -1}}
	case 3:
		views = [][2]int{{0, 1}, {0, 2}}
	}
	for _, v := range views {
		b.WriteString(scatterSVG(s, pts, wts, wmax, v))
	}
	b.WriteString("</body></html>\n")
	_, err = io.WriteString(w, b.String())
	return err
}

// scatterSVG draws the nodes projected on the coordinates view (the second
// -1 on the line) over the projection of the element's vertices.
func scatterSVG(s element.Shape, pts [][]float64, wts []float64, wmax float64, view [2]int) string {
	const size, pad = 360.0, 20.0
	coord := func(p []float64, k int) float64 {
		if k < 0 {
			return 0
		}
		return p[k]
	}
	var verts [][]float64
	for _, v := range s.Vertices() {
		q := make([]float64, len(v))
		for k, c := range v {
			fmt.Sscan(c, &q[k])
		}
		verts = append(verts, q)
	}
	lo, hi := [2]float64{math.Inf(1), math.Inf(1)}, [2]float64{math.Inf(-1), math.Inf(-1)}
	for _, q := range append(append([][]float64(nil), verts...), pts...) {
		for a := 0; a < 2; a++ {
			lo[a] = min(lo[a], coord(q, view[a]))
			hi[a] = max(hi[a], coord(q, view[a]))
		}
	}
	span := max(hi[0]-lo[0], hi[1]-lo[1], 1e-300)
	px := func(q []float64) (float64, float64) {
		return pad + (coord(q, view[0])-lo[0])/span*(size-2*pad), size - pad - (coord(q, view[1])-lo[1])/span*(size-2*pad)
	}
	names := "xyz"
	label := string(names[view[0]])
	if view[1] >= 0 {
		label += "-" + string(names[view[1]])
	}
	var b strings.Builder
	fmt.Fprintf(&b, "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%g\" height=\"%g\" viewBox=\"0 0 %g %g\"><title>nodes, %s projection</title>\n", size, size, size, size, label)
	for _, a := range verts {
		for _, c := range verts {
			x1, y1 := px(a)
			x2, y2 := px(c)
			fmt.Fprintf(&b, "<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"#bbb\" stroke-width=\"0.5\"/>\n", x1, y1, x2, y2)
		}
	}
	for i, p := range pts {
		x, y := px(p)
		r := 1.5
		if wmax > 0 {
			r = max(1.5, 8*math.Sqrt(math.Abs(wts[i])/wmax))
		}
		color := "#1f5fa8"
		if wts[i] < 0 {
			color = "#c0392b"
		}
		fmt.Fprintf(&b, "<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"%s\" fill-opacity=\"0.6\"/>\n", x, y, r, color)
	}
	fmt.Fprintf(&b, "<text x=\"4\" y=\"14\" font-size=\"12\">%s</text></svg>\n", label)
	return b.String()
}
