package rulefile

import (
	"context"
	"strings"
	"testing"

	"quadwright/design/element"
)

func TestElementRuleFileWeighted(t *testing.T) {
	r, err := element.Build(context.Background(), element.Request{Shape: element.Triangle, Degree: 2, Digits: 20, Weight: "x"})
	if err != nil {
		t.Fatal(err)
	}
	f := FromElementRule(r, "quadwright test")
	b, err := f.MarshalIndent()
	if err != nil {
		t.Fatal(err)
	}
	back, err := Parse("w.json", b)
	if err != nil {
		t.Fatal(err)
	}
	s, ok, err := back.ElementShape("w.json")
	if err != nil || !ok || s != element.Triangle || back.Weight != "x" || back.Kind != "weighted" || back.Degree != 2 {
		t.Errorf("read back: shape %v %v %v, file %+v", s, ok, err, back)
	}
	// An interval rule is no element rule; an unknown shape is an error.
	if _, ok, err := (&File{Domain: Domain{Shape: "interval"}}).ElementShape("i.json"); ok || err != nil {
		t.Errorf("interval: %v %v", ok, err)
	}
	bad := &File{Domain: Domain{Shape: "disc"}, Nodes: []Node{{"0", "0"}}}
	if _, _, err := bad.ElementShape("d.json"); err == nil || !strings.Contains(err.Error(), "\"disc\"") {
		t.Errorf("unknown shape: %v", err)
	}
	wrong := &File{Domain: Domain{Shape: "tetrahedron"}, Nodes: []Node{{"0", "0"}}}
	if _, _, err := wrong.ElementShape("t.json"); err == nil || !strings.Contains(err.Error(), "needs 3") {
		t.Errorf("coordinate count: %v", err)
	}
}
