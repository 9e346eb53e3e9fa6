package stability

import (
	"bytes"
	"context"
	"encoding/xml"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"quadwright/design"
)

// labelled is a measure whose label comes from the user.
type labelled struct {
	design.FamilySource
	label string
}

func (m labelled) Label() string { return m.label }

// auditPage audits the 11-point Newton-Cotes rule (negative weights, failing
// degrees, test integrands) with hostile strings in the title and label, and
// returns the page.
func auditPage(t *testing.T) string {
	t.Helper()
	x, w := newtonCotes(11)
	m := labelled{legendreOn(t, ""), `legendre <b onmouseover="x">&`}
	r, err := Audit(context.Background(), m, ratStrings(x, 30), ratStrings(w, 30), Options{})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := r.WriteHTML(&b, `nc11 <script>alert("t")</script>.txt`, "Caution: <verify> & check.\n"); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

var figureRE = regexp.MustCompile(`(?s)<figure id="([a-z]+)">(.*?)</figure>`)

// TestHTMLPage parses the page: three figures, each with one SVG that
// parses as XML and holds non-empty paths and text; no external asset; user
// strings escaped.
func TestHTMLPage(t *testing.T) {
	page := auditPage(t)
	for _, bad := range []string{`<script>alert`, `<b onmouseover`, `<verify>`, `src="http`, `href="http`, `@import`} {
		if strings.Contains(page, bad) {
			t.Errorf("page contains %q", bad)
		}
	}
	if !strings.Contains(page, "&lt;script&gt;") || !strings.Contains(page, "&lt;b onmouseover=") {
		t.Error("user strings not escaped as expected")
	}
	figs := figureRE.FindAllStringSubmatch(page, -1)
	if len(figs) != 3 {
		t.Fatalf("%d figures, want 3", len(figs))
	}
	for _, f := range figs {
		paths, texts := svgCounts(t, f[1], f[2])
		if paths < 5 || texts < 3 {
			t.Errorf("figure %s: %d non-empty paths, %d texts", f[1], paths, texts)
		}
	}
	if !strings.Contains(figs[0][2], "w&lt;0") {
		t.Error("the weights figure does not label the negative weights")
	}
}

// svgCounts parses the one <svg> element of a figure and counts its path
// elements with a non-empty d attribute and its text elements.
func svgCounts(t *testing.T, id, fig string) (paths, texts int) {
	i, j := strings.Index(fig, "<svg"), strings.LastIndex(fig, "</svg>")
	if i < 0 || j < i || strings.Count(fig, "<svg") != 1 {
		t.Fatalf("figure %s: no single svg element", id)
	}
	dec := xml.NewDecoder(strings.NewReader(fig[i : j+len("</svg>")]))
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("figure %s: svg does not parse: %v", id, err)
		}
		se, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		switch se.Name.Local {
		case "path":
			for _, a := range se.Attr {
				if a.Name.Local == "d" && strings.TrimSpace(a.Value) != "" {
					paths++
				}
			}
		case "text":
			texts++
		}
	}
	return paths, texts
}

// TestHTMLInChromium opens the page in headless Chromium (Debian's package,
// which .ci/run installs when it can) and has the browser measure every
// figure: its SVG's bounding box and its painted paths. Skipped when
// /usr/bin/chromium is missing (TestHTMLPage still checks the SVG).
func TestHTMLInChromium(t *testing.T) {
	const browser = "/usr/bin/chromium"
	if _, err := os.Stat(browser); err != nil {
		t.Skip("no /usr/bin/chromium: the SVG is checked by TestHTMLPage only")
	}
	page := auditPage(t)
	probe := `<script>
const out = [];
document.querySelectorAll('figure').forEach(f => {
  const s = f.querySelector('svg');
  let box = 'none', n = 0;
  if (s) {
    const b = s.getBBox();
    box = Math.round(b.width) + 'x' + Math.round(b.height);
    s.querySelectorAll('path').forEach(p => { if (p.getTotalLength() > 0) n++; });
  }
  out.push(f.id + ':' + box + ':' + n);
});
document.body.setAttribute('data-figures', out.join(';'));
</script>
</body>`
	dir := t.TempDir()
	file := filepath.Join(dir, "page.html")
	if err := os.WriteFile(file, []byte(strings.Replace(page, "</body>", probe, 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, browser, "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic",
		"--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--user-data-dir="+filepath.Join(dir, "profile"), "--dump-dom", "file://"+file)
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	if err := cmd.Run(); err != nil {
		t.Fatalf("chromium: %v\n%s", err, errb.String())
	}
	m := regexp.MustCompile(`data-figures="([^"]*)"`).FindStringSubmatch(out.String())
	if m == nil {
		t.Fatalf("the probe did not run; dom:\n%.2000s", out.String())
	}
	figs := strings.Split(m[1], ";")
	if len(figs) != 3 {
		t.Fatalf("browser saw %d figures: %q", len(figs), m[1])
	}
	for _, f := range figs {
		parts := strings.Split(f, ":")
		if len(parts) != 3 {
			t.Fatalf("probe output %q", f)
		}
		wh := strings.Split(parts[1], "x")
		n, _ := strconv.Atoi(parts[2])
		w, _ := strconv.Atoi(wh[0])
		h := 0
		if len(wh) == 2 {
			h, _ = strconv.Atoi(wh[1])
		}
		if w < 100 || h < 100 || n < 5 {
			t.Errorf("figure %s: drawn box %s, %d painted paths", parts[0], parts[1], n)
		}
	}
}
