package stability

import (
	"fmt"
	"html/template"
	"io"
)

// figure is one plot of the page: a caption and its inline SVG.
type figure struct {
	ID, Caption string
	SVG         template.HTML
}

var pageTemplate = template.Must(template.New("audit").Funcs(template.FuncMap{"num": num, "percent": percent}).Parse(`<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>quadwright audit of {{.Title}}</title>
<style>
body { font-family: sans-serif; max-width: 62em; margin: 2em auto; padding: 0 1em; color: #222; }
table { border-collapse: collapse; margin: 1em 0; }
td, th { border: 1px solid #bbb; padding: 0.25em 0.6em; text-align: left; vertical-align: top; }
th { background: #f0f0f0; }
figure { margin: 1.5em 0; }
figcaption { font-weight: bold; margin-bottom: 0.4em; }
.bad { color: #b00; font-weight: bold; }
.caution { border-left: 4px solid #c80; padding: 0.5em 1em; background: #fff8e8; white-space: pre-wrap; }
</style>
</head>
<body>
<h1>quadwright audit of {{.Title}}</h1>
{{with .R}}
<table>
<tr><th>measure</th><td>{{.Measure}}, weight {{.Weight}} on {{.Domain}}</td></tr>
<tr><th>points</th><td>{{.Points}}</td></tr>
<tr><th>digits D</th><td>{{.Digits}}{{if .UnitGiven}} (from the tolerance given){{else if .Exact}} (exact fractions among the values){{end}}; u = {{.Unit}}, tolerance 10u = {{.Tolerance}}</td></tr>
<tr><th>degree of exactness</th><td>{{if eq .Degree .DegreeTested}}at least {{end}}{{.Degree}} (tested in the orthonormal basis to degree {{.DegreeTested}}){{with .Float64}}; after rounding to float64: {{.Degree}}{{end}}</td></tr>
<tr><th>negative weights</th><td{{if .NegativeWeights}} class="bad"{{end}}>{{.NegativeWeights}}{{if .NegativeWeights}}; most negative {{.MostNegative}} (weight {{.MostNegativeIndex}}); negative mass {{num .NegativeMass}}, {{percent .NegativeShare}} of sum |w|{{end}}</td></tr>
<tr><th>stability factor</th><td>{{num .StabilityFactor}} (sum |w| / |sum w|); lost digits {{num .LostDigits}}</td></tr>
<tr><th>nodes</th><td{{if .NodesOutside}} class="bad"{{end}}>{{.NodesOutside}} outside the interval, {{.NodesOnBoundary}} on its ends; smallest gap {{num .MinGap}}</td></tr>
{{with .Conditioning}}{{if .Monomial}}<tr><th>Vandermonde conditioning</th><td>{{.Norm}}: monomial basis {{num .Monomial}}, orthonormal basis {{num .Orthonormal}}</td></tr>{{end}}
{{if .HankelOrder}}<tr><th>Hankel conditioning</th><td>order {{.HankelOrder}}, 1-norm: {{num .Hankel}}; a construction from raw moments loses about {{printf "%.1f" .HankelLostDigits}} digits</td></tr>{{end}}{{end}}
</table>
{{with .Genz}}
<table>
<tr><th>test integrand (Genz 1984)</th><th>c</th><th>w</th><th>this rule</th><th>gauss, {{.GaussPoints}} points</th>{{if .ReferencePoints}}<th>error of the reference</th>{{end}}</tr>
{{$ref := .ReferencePoints}}{{range .Cases}}<tr><td>{{.Name}}</td><td>{{.C}}</td><td>{{.W}}</td><td>{{num .RuleError}}</td><td>{{num .GaussError}}</td>{{if $ref}}<td>{{num .ReferenceError}}</td>{{end}}</tr>
{{end}}</table>
<p>Relative errors; reference: {{.Reference}}{{if .ReferencePoints}} ({{.ReferencePoints}} nodes){{end}}; {{.Map}}.</p>
{{end}}
{{range .Notes}}<p>Note: {{.}}</p>
{{end}}
{{end}}
{{range .Figures}}<figure id="{{.ID}}">
<figcaption>{{.Caption}}</figcaption>
{{.SVG}}
</figure>
{{end}}
{{if .Caution}}<p class="caution">{{.Caution}}</p>{{end}}
</body>
</html>
`))

// WriteHTML writes the report as one self-contained HTML page: the tables
// of the text report and up to three figures drawn by gonum.org/v1/plot as
// inline SVG (nodes with |weight| on a log scale, the exactness residual by
// degree, the test-integrand errors). Every string from the user (title,
// measure, weight, printed values, caution) is HTML-escaped by html/template;
// the SVG is ours, and its text is escaped by the plot library.
func (r *Report) WriteHTML(w io.Writer, title, caution string) error {
	var figs []figure
	add := func(id, caption string, draw func() (string, error)) error {
		s, err := draw()
		if err != nil {
			return fmt.Errorf("drawing the %s plot: %v", id, err)
		}
		figs = append(figs, figure{ID: id, Caption: caption, SVG: template.HTML(s)})
		return nil
	}
	if err := add("weights", "Nodes on the interval, |weight| on a log scale (negative weights: red triangles labelled w<0)", r.plotWeights); err != nil {
		return err
	}
	if len(r.Residual) > 0 {
		if err := add("residual", "Exactness residual as a share of the tolerance, by degree", r.plotResidual); err != nil {
			return err
		}
	}
	if r.Genz != nil && len(r.Genz.Cases) > 0 {
		if err := add("genz", "Relative errors on the test integrands, beside the Gauss rule of the same size", r.plotGenz); err != nil {
			return err
		}
	}
	return pageTemplate.Execute(w, struct {
		Title, Caution string
		R              *Report
		Figures        []figure
	}{title, caution, r, figs})
}
