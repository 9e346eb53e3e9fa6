package rulefile

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestParseTable(t *testing.T) {
	f, err := Parse("t", []byte("# Simpson\nnode,weight\n-1, 1/3\n0 4/3\n1\t0.3333333333\n"))
	if err != nil {
		t.Fatal(err)
	}
	if f.Points != 3 || f.Coordinates()[2] != "1" || f.Weights[1] != "4/3" {
		t.Errorf("%+v", f)
	}
}

func TestParseErrors(t *testing.T) {
	cases := []struct{ data, want string }{
		{"", "is empty"},
		{"  \n\n", "is empty"},
		{"# only a comment\n", "no node/weight"},
		{"0 1\n0.5\n", "line 2"},
		{"0 1\n0.5 x\n", "line 2"},
		{"0 1\nnan 1\n", "line 2"},
		{"0 1\n1 inf\n", "line 2"},
		{"0 1\n0.0 1\n", "the same point"},
		{"0 1\n1 2 3\n", "line 2"},
		{`{"format": "other"}`, "format"},
		{`{"format": "quadwright-rule/1", "points": 1, "nodes": ["0"], "weights": []}`, "1 nodes but 0 weights"},
		{`{"format": "quadwright-rule/1",`, "not valid JSON"},
	}
	for _, c := range cases {
		_, err := Parse("r.txt", []byte(c.data))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: error %v, want %q", c.data, err, c.want)
		}
	}
}

func TestReadMissing(t *testing.T) {
	_, err := Read(filepath.Join(t.TempDir(), "none.json"))
	if err == nil || !strings.Contains(err.Error(), "none.json") {
		t.Errorf("error %v", err)
	}
}

func TestJSONRoundTrip(t *testing.T) {
	src := `{"format": "quadwright-rule/1", "kind": "gauss", "domain": {"shape": "interval", "interval": ["-1", "1"]},
 "weight": "1", "points": 2, "degree": 3, "digits": 5, "nodes": ["-0.57735", "0.57735"], "weights": ["1.0000", "1.0000"]}`
	f, err := Parse("g.json", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	b, err := f.MarshalIndent()
	if err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(t.TempDir(), "g.json")
	os.WriteFile(p, b, 0o644)
	g, err := Read(p)
	if err != nil {
		t.Fatal(err)
	}
	if g.Coordinates()[1] != "0.57735" || g.Degree != 3 {
		t.Errorf("%+v", g)
	}
}

func FuzzParse(f *testing.F) {
	f.Add([]byte("0 1\n1 2\n"))
	f.Add([]byte(`{"format": "quadwright-rule/1", "points": 1, "nodes": ["0"], "weights": ["2"]}`))
	f.Add([]byte("x,y,weight\n0,0,0.5\n"))
	f.Add([]byte("// gauss rule exported by quadwright 0\n// domain:   interval [-1, 1]\n// points:   2\n// arrays:   g_nodes, g_weights (double)\nstatic const double g_nodes[2] = {-0.5, 0.5};\nstatic const double g_weights[2] = {1, 1};\n"))
	f.Add([]byte("# r rule exported by quadwright\n# domain:   triangle with vertices (0,0)\n# points:   1\n# lists:    r_nodes, r_weights\nr_nodes = [(1/3, 0.3)]\nr_weights = [\"0.5\"]\n"))
	f.Add([]byte("# quadwright symmetric rule on the reference prism\n# weight:   x (the rule integrates)\ni x y z weight\n1 0 0 0 1\n"))
	f.Add([]byte("# measure:  m, weight 1 on [0, 1]\ni node weight\n1 0.5 1\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		r, err := Parse("fuzz", data)
		if err == nil && (len(r.Nodes) != len(r.Weights) || len(r.Nodes) == 0) {
			t.Fatalf("accepted an inconsistent rule: %+v", r)
		}
		if err == nil {
			r.InferElement()
			r.ElementShape("fuzz")
		}
	})
}
