package main

import (
	"encoding/json"
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// Exact raw moment files of known measures (p/q lines).
func factorialFile(m int) string { // e^-x on [0,inf): k! (A&S 6.1.6)
	var b strings.Builder
	f := int64(1)
	for k := 0; k < m; k++ {
		if k > 0 {
			f *= int64(k)
		}
		fmt.Fprintf(&b, "%d\n", f)
	}
	return b.String()
}

func hermiteFile(m int) string { // e^(-x^2)/sqrt(pi): (2j-1)!!/2^j (A&S 7.4.4)
	var b strings.Builder
	num, den := int64(1), int64(1)
	for k := 0; k < m; k++ {
		if k%2 == 1 {
			b.WriteString("0\n")
			continue
		}
		if k > 0 {
			num, den = num*int64(k-1), den*2
		}
		fmt.Fprintf(&b, "%d/%d\n", num, den)
	}
	return b.String()
}

func legendreFile(m int) string { // weight 1 on [-1,1]: 2/(k+1), odd 0
	var b strings.Builder
	for k := 0; k < m; k++ {
		if k%2 == 1 {
			b.WriteString("0\n")
		} else {
			fmt.Fprintf(&b, "2/%d\n", k+1)
		}
	}
	return b.String()
}

func TestMomentsOnWrongSupportRefused(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "lag.txt", factorialFile(8))
	writeFile(t, dir, "her.txt", hermiteFile(8))
	writeFile(t, dir, "leg.txt", legendreFile(8))
	writeFile(t, dir, "pts.txt", "-1 1/2\n1 1/2\n")
	if _, errs, code := run(t, dir, "build", "--family", "legendre", "--points", "2", "--digits", "20", "--format", "json", "-o", "g2.json"); code != 0 {
		t.Fatal(errs)
	}
	for _, c := range []struct {
		args []string
		want string
	}{
		// a half-line measure on a finite interval
		{[]string{"build", "--moments", "lag.txt", "--interval", "0,1", "--points", "2", "--digits", "20"}, "above the right end 1"},
		{[]string{"recurrence", "--moments", "lag.txt", "--interval", "0,1", "--count", "2"}, "above the right end 1"},
		{[]string{"audit", "g2.json", "--moments", "lag.txt", "--interval", "0,1"}, "above the right end 1"},
		// a symmetric measure on a half-line
		{[]string{"build", "--moments", "her.txt", "--interval", "0,inf", "--points", "2", "--digits", "20"}, "below the left end 0"},
		{[]string{"recurrence", "--moments", "her.txt", "--interval", "0,inf", "--count", "2"}, "below the left end 0"},
		// a measure on a wider interval
		{[]string{"build", "--moments", "leg.txt", "--interval", "0,1", "--points", "2", "--digits", "20"}, "below the left end 0"},
		{[]string{"build", "--moments", "leg.txt", "--basis", "legendre", "--interval", "-1/2,1/2", "--points", "2", "--digits", "20"}, "no positive measure on [-0.5, 0.5]"},
		{[]string{"audit", "g2.json", "--moments", "leg.txt", "--interval", "-1/2,1/2"}, "no positive measure on [-0.5, 0.5]"},
		// a discrete measure with a point off the interval
		{[]string{"build", "--measure", "pts.txt", "--interval", "0,1", "--points", "2", "--digits", "20"}, "the point -1 lies below the left end 0"},
	} {
		expectInputError(t, dir, c.args, c.want)
	}
}

func TestMomentsOnTrueSupportGiveTheRule(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "lag.txt", factorialFile(8))
	writeFile(t, dir, "her.txt", hermiteFile(8))
	writeFile(t, dir, "leg.txt", legendreFile(8))
	writeFile(t, dir, "pts.txt", "-1 1/2\n1 1/2\n")
	s2 := math.Sqrt(2)
	for _, c := range []struct {
		args   []string
		nodes  []float64
		domain []string
		source string
	}{
		{[]string{"--moments", "lag.txt", "--interval", "0,inf"}, []float64{2 - s2, 2 + s2}, []string{"0", "inf"}, "A&S Table 25.9, n = 2"},
		{[]string{"--moments", "her.txt", "--interval", "-inf,inf"}, []float64{-1 / s2, 1 / s2}, []string{"-inf", "inf"}, "A&S Table 25.10, n = 2"},
		{[]string{"--moments", "leg.txt", "--interval", "-1,1"}, []float64{-1 / math.Sqrt(3), 1 / math.Sqrt(3)}, []string{"-1", "1"}, "A&S Table 25.4, n = 2"},
		{[]string{"--measure", "pts.txt", "--interval", "-1,1"}, []float64{-1, 1}, []string{"-1", "1"}, "the measure itself"},
	} {
		args := append([]string{"build", "--points", "2", "--digits", "20", "--format", "json"}, c.args...)
		out, errs, code := run(t, dir, args...)
		if code != 0 {
			t.Errorf("%v: exit %d: %s", args, code, errs)
			continue
		}
		var rf struct {
			Degree int
			Nodes  []string
			Domain struct{ Interval []string }
		}
		if err := json.Unmarshal([]byte(out), &rf); err != nil {
			t.Fatal(err)
		}
		for i, s := range rf.Nodes {
			x, _ := strconv.ParseFloat(s, 64)
			if math.Abs(x-c.nodes[i]) > 1e-15 {
				t.Errorf("%v: node %s, want %.16g (%s)", c.args, s, c.nodes[i], c.source)
			}
		}
		if rf.Degree != 3 || strings.Join(rf.Domain.Interval, ",") != strings.Join(c.domain, ",") {
			t.Errorf("%v: degree %d, domain %v", c.args, rf.Degree, rf.Domain.Interval)
		}
	}
}

func TestSupportNotGivenLabel(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "lag.txt", factorialFile(8))
	out, errs, code := run(t, dir, "build", "--moments", "lag.txt", "--points", "2", "--digits", "12")
	if code != 0 {
		t.Fatal(errs)
	}
	// 2 -+ sqrt(2) to 12 digits (A&S Table 25.9)
	if !strings.Contains(out, ", support not given (nodes span [0.585786437627, 3.41421356237])") || strings.Contains(out, "(-inf, inf)") {
		t.Errorf("text header:\n%s", out)
	}
	out, errs, code = run(t, dir, "build", "--moments", "lag.txt", "--points", "2", "--digits", "12", "--format", "json")
	if code != 0 {
		t.Fatal(errs)
	}
	var rf struct {
		Report struct {
			Support  string
			NodeSpan []string `json:"node_span"`
		}
	}
	if err := json.Unmarshal([]byte(out), &rf); err != nil || rf.Report.Support != "not given" || len(rf.Report.NodeSpan) != 2 {
		t.Errorf("json report: %+v (%v)", rf.Report, err)
	}
	for _, cmd := range [][]string{
		{"recurrence", "--moments", "lag.txt", "--count", "2"},
		{"moments", "--moments", "lag.txt", "--count", "2"},
	} {
		out, errs, code := run(t, dir, cmd...)
		if code != 0 || !strings.Contains(out, ", support not given") {
			t.Errorf("%v: exit %d, %s%s", cmd, code, out, errs)
		}
		out, _, _ = run(t, dir, append(cmd, "--format", "json")...)
		if !strings.Contains(out, `"support": "not given"`) || !strings.Contains(out, `"interval": null`) {
			t.Errorf("%v json: %s", cmd, out)
		}
	}
}

// digitsOf reads the "digits" of a JSON rule.
func digitsOf(t *testing.T, out string) int {
	t.Helper()
	var rf struct{ Digits int }
	if err := json.Unmarshal([]byte(out), &rf); err != nil {
		t.Fatalf("%v: %s", err, out)
	}
	return rf.Digits
}

func TestDigitsAutoAndAdvice(t *testing.T) {
	dir := t.TempDir()
	writeFile(t, dir, "lag.txt", factorialFile(12))
	writeFile(t, dir, "leg.txt", legendreFile(12))
	// Gamma(k + 3/2) to 16 digits, from math.Gamma (float64, so 15-16
	// correct digits; our own data).
	var b strings.Builder
	for k := 0; k < 12; k++ {
		fmt.Fprintf(&b, "%.15e\n", math.Gamma(float64(k)+1.5))
	}
	writeFile(t, dir, "gam.txt", b.String())
	for k := 12; k < 24; k++ {
		fmt.Fprintf(&b, "%.15e\n", math.Gamma(float64(k)+1.5))
	}
	writeFile(t, dir, "gam24.txt", b.String())
	// 1/(k+1), the moments of weight 1 on [0, 1], to 16 digits (our own data).
	b.Reset()
	for k := 0; k < 24; k++ {
		fmt.Fprintf(&b, "%.15e\n", 1/float64(k+1))
	}
	writeFile(t, dir, "unit24.txt", b.String())
	for _, f := range []string{"lag.txt", "leg.txt"} {
		out, errs, code := run(t, dir, "build", "--moments", f, "--points", "4", "--digits", "auto", "--format", "json")
		if code != 0 || digitsOf(t, out) != 34 {
			t.Errorf("%s --digits auto: exit %d, %s", f, code, errs)
		}
	}
	writeFile(t, dir, "pts.txt", "-1 1/4\n0 1/2\n1 1/4\n")
	if out, errs, code := run(t, dir, "build", "--measure", "pts.txt", "--points", "2", "--digits", "auto", "--format", "json"); code != 0 || digitsOf(t, out) != 34 {
		t.Errorf("--measure --digits auto: exit %d, %s", code, errs)
	}
	if _, errs, code := run(t, dir, "build", "--family", "legendre", "--points", "2", "--exact-decimals"); code != 1 || !strings.Contains(errs, "--exact-decimals: only used with --moments or --measure") {
		t.Errorf("--exact-decimals with a family: exit %d, %s", code, errs)
	}
	out, errs, code := run(t, dir, "build", "--moments", "gam.txt", "--points", "4", "--digits", "auto", "--exact-decimals", "--format", "json")
	if code != 0 || digitsOf(t, out) != 34 {
		t.Errorf("--exact-decimals --digits auto: exit %d, %s", code, errs)
	}
	re := regexp.MustCompile(`--digits (\d+) or fewer`)
	advised := 0
	for _, kind := range [][]string{{"--kind", "gauss"}, {"--kind", "radau", "--interval", "0,inf"}, {"--kind", "lobatto", "--interval", "0,40"}, {"--kind", "gauss", "--interval", "0,inf"},
		{"--kind", "kronrod", "--interval", "0,1", "--moments", "unit24.txt"}, {"--kind", "anti-gauss", "--interval", "0,inf", "--moments", "gam24.txt"}} {
		for _, n := range []string{"3", "4", "5"} {
			args := append([]string{"build", "--moments", "gam.txt", "--points", n}, kind...)
			_, errs, code := run(t, dir, args...)
			m := re.FindStringSubmatch(errs)
			if code == 1 && strings.Contains(errs, "recurrence coefficients") {
				continue // too few moments: refused before any digits are advised
			}
			advised++
			if code != 1 || m == nil {
				t.Errorf("%v: exit %d, no advice in %q", args, code, errs)
				continue
			}
			K, _ := strconv.Atoi(m[1])
			out, errs, code := run(t, dir, append(args, "--digits", m[1], "--format", "json")...)
			if code != 0 || digitsOf(t, out) != K {
				t.Errorf("%v --digits %d (the advice): exit %d, %s", args, K, code, errs)
			}
			auto, _, _ := run(t, dir, append(args, "--digits", "auto", "--format", "json")...)
			if digitsOf(t, auto) != K {
				t.Errorf("%v: --digits auto gives %d, the advice %d", args, digitsOf(t, auto), K)
			}
			if _, errs, code := run(t, dir, append(args, "--digits", strconv.Itoa(K+1))...); code != 1 || !strings.Contains(errs, fmt.Sprintf("supports only %d", K)) {
				t.Errorf("%v --digits %d: exit %d, %s", args, K+1, code, errs)
			}
		}
	}
	if advised < 8 {
		t.Errorf("only %d cases reached the advice", advised)
	}
}

func TestInputDigitsMeasured(t *testing.T) {
	dir := t.TempDir()
	var b strings.Builder
	for k := 0; k < 12; k++ {
		fmt.Fprintf(&b, "%.15e\n", math.Gamma(float64(k)+1.5))
	}
	writeFile(t, dir, "gam.txt", b.String())
	out, errs, code := run(t, dir, "build", "--moments", "gam.txt", "--interval", "0,inf", "--points", "5", "--digits", "auto", "--format", "json")
	if code != 0 {
		t.Fatal(errs)
	}
	var rf struct {
		Digits int
		Report struct {
			Input *struct {
				Carried, Points, Bound, Measured, Draws int
				Spread                                  float64
			} `json:"input_digits"`
		}
	}
	if err := json.Unmarshal([]byte(out), &rf); err != nil {
		t.Fatal(err)
	}
	in := rf.Report.Input
	if in == nil || in.Carried != 16 || in.Points != 5 || in.Bound != rf.Digits || in.Draws < 2 || in.Spread <= 0 || in.Measured < in.Bound || in.Measured > in.Carried {
		t.Fatalf("input_digits %+v, digits %d", in, rf.Digits)
	}
	text, _, _ := run(t, dir, "build", "--moments", "gam.txt", "--interval", "0,inf", "--points", "5", "--digits", "auto")
	if !strings.Contains(text, fmt.Sprintf("# input:    16 digits carried; the 5-point rule keeps %d by the bound", in.Bound)) || !strings.Contains(text, fmt.Sprintf("%d measured", in.Measured)) {
		t.Errorf("text header:\n%s", text)
	}
}
