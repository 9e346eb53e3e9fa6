package export

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"testing"

	"quadwright/rulefile"
)

// The compile tests put each export inside a tiny program that integrates
// x^(2N-1) over [1, 3] with the N-point Gauss-Legendre rule, which is exact
// for it: the integral is (3^(2N) - 1)/(2N). Each program prints the
// relative error in units of its type's machine epsilon. The bound is the
// first-order rounding analysis of the sum (node rounding amplified 2N-1
// times by the power, 2N-2 products, N additions), not a tuned value:
// 2(2N-1) + 2N + N + 4 epsilons.
const (
	ruleN   = 6
	ruleDeg = 2*ruleN - 1
	ruleLo  = 1
	ruleHi  = 3
)

func epsBound() float64 { return float64(2*ruleDeg + 2*ruleN + ruleN + 4) }

func exactLiteral() string { return decimal40(legendreMoment(ruleLo, ruleHi, ruleDeg)) }

// tool finds a compiler or interpreter, skipping the test when it is missing.
func tool(t *testing.T, name string) string {
	t.Helper()
	p, err := exec.LookPath(name)
	if err != nil {
		t.Skipf("%s is not installed on this machine; skipping", name)
	}
	return p
}

func runIn(t *testing.T, dir string, env []string, name string, args ...string) string {
	t.Helper()
	cmd := exec.Command(name, args...)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), env...)
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("%s %s: %v\n%s", name, strings.Join(args, " "), err, out)
	}
	return string(out)
}

// checkErrors reads "label err" lines and holds each err to the bound.
func checkErrors(t *testing.T, out string, want ...string) {
	t.Helper()
	seen := map[string]bool{}
	for _, line := range strings.Split(strings.TrimSpace(out), "\n") {
		f := strings.Fields(line)
		if len(f) != 2 {
			t.Fatalf("unexpected output line %q", line)
		}
		v, err := strconv.ParseFloat(f[1], 64)
		if err != nil {
			t.Fatalf("unexpected output line %q", line)
		}
		seen[f[0]] = true
		if v > epsBound() {
			t.Errorf("%s: relative error %.3g eps, bound %.0f eps", f[0], v, epsBound())
		}
		t.Logf("%s: relative error %.3g units", f[0], v)
	}
	for _, w := range want {
		if !seen[w] {
			t.Errorf("no result for %s in\n%s", w, out)
		}
	}
}

func writeFiles(t *testing.T, dir string, files map[string]string) {
	t.Helper()
	for name, data := range files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(data), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// compileAndIntegrate exports the 40-digit rule to lang as ruleFile,
// writes the program main (a format taking the degree and the exact value)
// as mainFile, builds it with compiler and args (output "check"), runs it
// and checks the errors it prints for the labels want.
func compileAndIntegrate(t *testing.T, compiler, lang, ruleFile, mainFile, main string, args []string, want ...string) {
	t.Helper()
	dir := t.TempDir()
	f := gaussFile(t, strconv.Itoa(ruleLo), strconv.Itoa(ruleHi), ruleN, 40)
	writeFiles(t, dir, map[string]string{
		ruleFile: render(t, f, lang, Options{}),
		mainFile: fmt.Sprintf(main, ruleDeg, exactLiteral()),
	})
	runIn(t, dir, nil, compiler, args...)
	checkErrors(t, runIn(t, dir, nil, filepath.Join(dir, "check")), want...)
}

const cMain = `#include <float.h>
#include <math.h>
#include <stdio.h>
#include "rule.h"

#define DEG %d

int main(void) {
    double s = 0;
    for (int i = 0; i < gauss_points; i++) {
        double p = 1;
        for (int k = 0; k < DEG; k++) p *= gauss_nodes[i];
        s += gauss_weights[i] * p;
    }
    printf("double %%.6g\n", fabs(s / %[2]s - 1) / DBL_EPSILON);
#ifdef EXTENDED
    long double sl = 0;
    for (int i = 0; i < gauss_points; i++) {
        long double p = 1;
        for (int k = 0; k < DEG; k++) p *= gauss_nodes_ld[i];
        sl += gauss_weights_ld[i] * p;
    }
    printf("long_double %%.6Lg\n", fabsl(sl / %[2]sL - 1) / LDBL_EPSILON);
#ifdef __SIZEOF_FLOAT128__
    __float128 sq = 0;
    for (int i = 0; i < gauss_points; i++) {
        __float128 p = 1;
        for (int k = 0; k < DEG; k++) p *= gauss_nodes_q[i];
        sq += gauss_weights_q[i] * p;
    }
    __float128 rq = sq / %[2]sQ - 1;
    if (rq < 0) rq = -rq;
    /* FLT128_EPSILON = 2^-112 (IEEE 754 binary128), without quadmath.h. */
    printf("float128 %%.6g\n", (double)(rq / 1.92592994438723585305597794258492732e-34Q));
#endif
#endif
    return 0;
}
`

func TestCCompilesAndIntegrates(t *testing.T) {
	gcc := tool(t, "gcc")
	for _, digits := range []int{40, 0} {
		dir := t.TempDir()
		f := gaussFile(t, strconv.Itoa(ruleLo), strconv.Itoa(ruleHi), ruleN, digits)
		writeFiles(t, dir, map[string]string{
			"rule.h": render(t, f, "c", Options{}),
			"main.c": fmt.Sprintf(cMain, ruleDeg, exactLiteral()),
		})
		args := []string{"-std=c11", "-Wall", "-Wextra", "-Werror", "-o", "check", "main.c", "-lm"}
		want := []string{"double"}
		if digits > 17 {
			args = append([]string{"-DEXTENDED"}, args...)
			want = append(want, "long_double")
			if runtime.GOARCH == "amd64" {
				want = append(want, "float128")
			}
		}
		runIn(t, dir, nil, gcc, args...)
		checkErrors(t, runIn(t, dir, nil, filepath.Join(dir, "check")), want...)
	}
}

const cppMain = `#include <cmath>
#include <cstdio>
#include <limits>
#include "rule.hpp"

template <typename T, typename A>
T integrate(const A& nodes, const A& weights) {
    T s = 0;
    for (std::size_t i = 0; i < gauss_points; i++) {
        T p = 1;
        for (int k = 0; k < %d; k++) p *= nodes[i];
        s += weights[i] * p;
    }
    return s;
}

static_assert(gauss_nodes.size() == gauss_points, "size");

int main() {
    double s = integrate<double>(gauss_nodes, gauss_weights);
    std::printf("double %%.6g\n", std::fabs(s / %[2]s - 1) / std::numeric_limits<double>::epsilon());
    long double sl = integrate<long double>(gauss_nodes_ld, gauss_weights_ld);
    std::printf("long_double %%.6Lg\n", std::fabs(sl / %[2]sL - 1) / std::numeric_limits<long double>::epsilon());
}
`

func TestCPPCompilesAndIntegrates(t *testing.T) {
	compileAndIntegrate(t, tool(t, "g++"), "cpp", "rule.hpp", "main.cpp", cppMain,
		[]string{"-std=c++17", "-Wall", "-Wextra", "-Werror", "-o", "check", "main.cpp"}, "double", "long_double")
}

const goMain = `package main

import (
	"fmt"
	"math"
	"math/big"
)

func main() {
	s := 0.0
	for i, x := range GaussNodes {
		s += GaussWeights[i] * math.Pow(x, %d)
	}
	fmt.Printf("float64 %%.6g\n", math.Abs(s/%[2]s-1)/0x1p-52)
	exact, _ := new(big.Float).SetPrec(200).SetString("%[2]s")
	sum := new(big.Float).SetPrec(200)
	for i := range GaussNodeDigits {
		x, _ := new(big.Float).SetPrec(200).SetString(GaussNodeDigits[i])
		w, _ := new(big.Float).SetPrec(200).SetString(GaussWeightDigits[i])
		p := new(big.Float).SetPrec(200).SetInt64(1)
		for k := 0; k < %[1]d; k++ {
			p.Mul(p, x)
		}
		sum.Add(sum, p.Mul(p, w))
	}
	rel, _ := sum.Quo(sum, exact).Sub(sum, big.NewFloat(1)).Float64()
	// in units of 10^-40, the rule's last digit
	fmt.Printf("digits %%.6g\n", math.Abs(rel)/1e-40)
}
`

func TestGoCompilesAndIntegrates(t *testing.T) {
	goTool := filepath.Join(runtime.GOROOT(), "bin", "go")
	dir := t.TempDir()
	f := gaussFile(t, strconv.Itoa(ruleLo), strconv.Itoa(ruleHi), ruleN, 40)
	writeFiles(t, dir, map[string]string{
		"go.mod":  "module exportcheck\n\ngo 1.21\n",
		"rule.go": render(t, f, "go", Options{Package: "main"}),
		"main.go": fmt.Sprintf(goMain, ruleDeg, exactLiteral()),
	})
	out := runIn(t, dir, []string{"GOFLAGS=-mod=mod", "GOWORK=off"}, goTool, "run", ".")
	checkErrors(t, out, "float64", "digits")
}

const fortranMain = `program check
  use gauss_rule
  use iso_fortran_env, only: real64, real128
  implicit none
  real(real64) :: s
  real(real128) :: sq
  integer :: i
  s = 0
  sq = 0
  do i = 1, gauss_points
    s = s + gauss_weights(i) * gauss_nodes(i)**%d
    sq = sq + gauss_weights_q(i) * gauss_nodes_q(i)**%[1]d
  end do
  print '(a, es12.4)', 'real64 ', abs(s / %[2]s_real64 - 1) / epsilon(s)
  print '(a, es12.4)', 'real128 ', abs(sq / %[2]s_real128 - 1) / epsilon(sq)
end program check
`

func TestFortranCompilesAndIntegrates(t *testing.T) {
	compileAndIntegrate(t, tool(t, "gfortran"), "fortran", "rule.f90", "main.f90", fortranMain,
		[]string{"-std=f2008", "-Wall", "-Werror", "-o", "check", "rule.f90", "main.f90"}, "real64", "real128")
}

// TestFortranCompilesUnusualShapes compiles an element rule, literals of
// 300 digits (split inside the token), a 600-node rule and a 400-node 2-D
// rule (data statements past the 255-line continuation limit) under
// -std=f2008.
func TestFortranCompilesUnusualShapes(t *testing.T) {
	gf := tool(t, "gfortran")
	long := "0." + strings.Repeat("1234567890", 30)
	var tab, many strings.Builder
	for i := 1; i <= 3; i++ {
		tab.WriteString(strconv.Itoa(i) + long[1:] + " " + long + "\n")
	}
	for i := 1; i <= 600; i++ {
		fmt.Fprintf(&many, "0.%d123456789012345678901234567890123 0.5\n", 1000+i)
	}
	var many2d strings.Builder
	for i := 1; i <= 400; i++ {
		fmt.Fprintf(&many2d, "0.%d12345678901234567890123456789012345 0.25 0.5\n", 1000+i)
	}
	files := map[string]string{"element.f90": render(t, element2D(), "fortran", Options{Name: "quad4"})}
	for name, src := range map[string]string{"long": tab.String(), "many": many.String(), "many2d": many2d.String()} {
		f, err := rulefile.Parse(name, []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		files[name+".f90"] = render(t, f, "fortran", Options{Name: name})
	}
	files["main.f90"] = `program check
  use quad4_rule
  use long_rule
  use many_rule
  use many2d_rule
  implicit none
  print '(f8.4)', sum(quad4_weights) + sum(quad4_nodes(1, :)) + long_nodes_q(3) + many_weights_q(600) &
    + many2d_nodes_q(2, 400) - many2d_weights(17)
end program check
`
	dir := t.TempDir()
	writeFiles(t, dir, files)
	runIn(t, dir, nil, gf, "-std=f2008", "-Wall", "-Werror", "-o", "check", "element.f90", "long.f90", "many.f90", "many2d.f90", "main.f90")
	// 4 + 0 + 3.1234567890... + 0.5 + 0.25 - 0.5, to 4 decimals.
	if out := strings.TrimSpace(runIn(t, dir, nil, filepath.Join(dir, "check"))); out != "7.3735" {
		t.Errorf("element/long/many check printed %q, want 7.3735", out)
	}
}

func TestPythonParsesAndRuns(t *testing.T) {
	py := "/usr/bin/python3"
	if _, err := os.Stat(py); err != nil {
		py = tool(t, "python3")
	}
	for _, c := range []struct {
		name string
		f    *rulefile.File
		mass string
	}{
		{"legendre40", gaussFile(t, strconv.Itoa(ruleLo), strconv.Itoa(ruleHi), ruleN, 40), "2"},
		{"legendre64", gaussFile(t, strconv.Itoa(ruleLo), strconv.Itoa(ruleHi), ruleN, 0), "2"},
		{"quad4", element2D(), "4"},
	} {
		dir := t.TempDir()
		src := render(t, c.f, "python", Options{Name: "r"})
		writeFiles(t, dir, map[string]string{"rule.py": src})
		runIn(t, dir, nil, py, "-c", "import ast,sys; ast.parse(open(sys.argv[1]).read())", "rule.py")
		check := fmt.Sprintf(`import math, rule
from decimal import Decimal, getcontext
assert len(rule.r_nodes) == len(rule.r_weights) == rule.r_points
assert math.isclose(sum(rule.r_weights), %s, rel_tol=1e-15)
if hasattr(rule, "r_weights_decimal"):
    getcontext().prec = 60
    s = sum(w * x**%d for x, w in zip(rule.r_nodes_decimal, rule.r_weights_decimal))
    exact = Decimal("%s")
    assert abs(s / exact - 1) < Decimal("1e-38"), s
print("ok")
`, c.mass, ruleDeg, exactLiteral())
		if c.name == "quad4" {
			check = strings.Replace(check, "x**", "x[0]**", 1)
			check = strings.Replace(check, exactLiteral(), "0", 1)
			check = strings.Replace(check, "abs(s / exact - 1)", "abs(s - exact)", 1)
		}
		if out := runIn(t, dir, nil, py, "-c", check); strings.TrimSpace(out) != "ok" {
			t.Errorf("%s: %s", c.name, out)
		}
	}
}
