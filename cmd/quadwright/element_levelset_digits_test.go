package main

import (
	"encoding/json"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"quadwright/precision"
)

// TestLevelSetDigits: `element --level-set ... --digits 30` writes a rule
// file with 30-digit weights whose sum is the area of the disc of radius
// 1/2, pi/4 (elementary geometry), to 1e-27 at order 40; audit reads it;
// bounds that are not binary fractions and too many digits are refused.
func TestLevelSetDigits(t *testing.T) {
	dir := t.TempDir()
	_, errs, code := run(t, dir, "element", "--shape", "quadrilateral", "--level-set", "x^2+y^2-0.25", "--degree", "40", "--digits", "30", "--format", "json", "-o", "disc.json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	data, err := os.ReadFile(filepath.Join(dir, "disc.json"))
	if err != nil {
		t.Fatal(err)
	}
	var rf struct {
		Digits  int
		Nodes   [][]string
		Weights []string
	}
	if err := json.Unmarshal(data, &rf); err != nil {
		t.Fatal(err)
	}
	if rf.Digits != 30 || len(rf.Nodes) != len(rf.Weights) || len(rf.Weights) == 0 {
		t.Fatalf("digits %d, %d nodes, %d weights", rf.Digits, len(rf.Nodes), len(rf.Weights))
	}
	sum := new(big.Float).SetPrec(256)
	for _, w := range rf.Weights {
		v, _, err := big.ParseFloat(w, 10, 256, big.ToNearestEven)
		if err != nil || v.Sign() <= 0 {
			t.Fatalf("weight %q", w)
		}
		sum.Add(sum, v)
	}
	want := precision.Pi(256)
	want.SetMantExp(want, -2)
	d := new(big.Float).Sub(sum, want)
	if e, _ := d.Quo(d, want).Float64(); e > 1e-27 || e < -1e-27 {
		t.Errorf("area: relative error %.3g, want <= 1e-27", e)
	}
	if _, errs, code := run(t, dir, "audit", "disc.json", "--fail-on", "negative,outside"); code != 0 {
		t.Errorf("audit exit %d: %s", code, errs)
	}
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"--box", "0,0.1,0,1", "--level-set", "x-0.05", "--digits", "20"}, "binary fraction"},
		{[]string{"--shape", "quadrilateral", "--level-set", "x", "--digits", "200"}, "--digits 200"},
	} {
		args := append([]string{"element", "--degree", "4", "-o", "x.json"}, c.args...)
		_, errs, code := run(t, dir, args...)
		if code != 1 || !strings.Contains(errs, c.want) || strings.Count(strings.TrimSpace(errs), "\n") > 0 {
			t.Errorf("%v: exit %d, stderr %q, want %q", c.args, code, errs, c.want)
		}
		if _, err := os.Stat(filepath.Join(dir, "x.json")); err == nil {
			t.Errorf("%v: left an output file", c.args)
		}
	}
}
