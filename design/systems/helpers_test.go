package systems

import (
	"bufio"
	"context"
	"math/big"
	"os"
	"strconv"
	"strings"
	"testing"

	"quadwright/design"
	"quadwright/moments"
)

// refRule is one rule of a reference file: nodes and weights at 40 digits.
type refRule struct{ x, w []*big.Float }

// readRefs reads a testdata file of "N i node weight" lines, keyed by N.
func readRefs(t *testing.T, name string) map[int]*refRule {
	t.Helper()
	f, err := os.Open("testdata/" + name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	out := map[int]*refRule{}
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		if line == "" || line[0] == '#' {
			continue
		}
		fs := strings.Fields(line)
		n, _ := strconv.Atoi(fs[0])
		x, _, err1 := big.ParseFloat(fs[2], 10, 256, big.ToNearestEven)
		w, _, err2 := big.ParseFloat(fs[3], 10, 256, big.ToNearestEven)
		if err1 != nil || err2 != nil {
			t.Fatalf("%s: bad line %q", name, line)
		}
		if out[n] == nil {
			out[n] = &refRule{}
		}
		out[n].x = append(out[n].x, x)
		out[n].w = append(out[n].w, w)
	}
	return out
}

func build(t testing.TB, list, iv, weight string, digits int) (*Result, error) {
	t.Helper()
	fs, err := ParseFunctions(list)
	if err != nil {
		t.Fatal(err)
	}
	in, err := moments.ParseInterval(iv)
	if err != nil {
		t.Fatal(err)
	}
	w, err := moments.NewWeight(weight, in, nil)
	if err != nil {
		return nil, err
	}
	return GeneralizedGauss(context.Background(), Problem{Functions: fs, Weight: w}, design.Request{Digits: digits})
}

// samePrinted fails unless every printed value equals the reference
// rounded the same way (FormatSig, or the nearest double in float64 mode).
func samePrinted(t *testing.T, label string, r *design.Rule, ref *refRule) {
	t.Helper()
	if len(r.Nodes) != len(ref.x) {
		t.Fatalf("%s: %d nodes, reference %d", label, len(r.Nodes), len(ref.x))
	}
	for i := range ref.x {
		wx, ww := printAs(ref.x[i], r.Digits), printAs(ref.w[i], r.Digits)
		if r.Nodes[i] != wx || r.Weights[i] != ww {
			t.Errorf("%s: point %d is %s, %s; reference %s, %s", label, i+1, r.Nodes[i], r.Weights[i], wx, ww)
		}
	}
}
