package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestAuditEveryElementFormat: a catalogue rule written by element in each
// of its formats audits to the same, true degree with no flags (issue 19,
// item 4). The degrees are the catalogue's verified ones, and each rule's
// point count allows at most the bound printed in the report; the audit
// tests one past that bound, so the degree is found, not bounded below.
func TestAuditEveryElementFormat(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct {
		shape  string
		degree int
	}{
		{"triangle", 5}, {"quadrilateral", 3}, {"tetrahedron", 3}, {"hexahedron", 8}, {"prism", 4}, {"pyramid", 3},
	} {
		want := -1
		for _, format := range []string{"json", "csv", "text"} {
			file := fmt.Sprintf("%s%d.%s", c.shape, c.degree, format)
			if _, errs, code := run(t, dir, "element", "--shape", c.shape, "--degree", fmt.Sprint(c.degree), "--format", format, "-o", file); code != 0 {
				t.Fatalf("element %s %d: exit %d: %s", c.shape, c.degree, code, errs)
			}
			rep, raw, code := elementAuditJSON(t, dir, file, "--quick")
			if code != 0 {
				t.Errorf("%s: exit %d", file, code)
				continue
			}
			tested, bound := int(raw["degree_tested_to"].(float64)), int(raw["degree_bound"].(float64))
			if rep.Degree < c.degree || tested <= rep.Degree || rep.Degree > bound {
				t.Errorf("%s: degree %d tested to %d (bound %d); want at least %d with a failure above it", file, rep.Degree, tested, bound, c.degree)
			}
			if want < 0 {
				want = rep.Degree
			} else if rep.Degree != want {
				t.Errorf("%s: degree %d, the json file gave %d", file, rep.Degree, want)
			}
			out, _, _ := run(t, dir, "audit", file, "--quick")
			if strings.Contains(out, "at least") || !strings.Contains(out, "reference "+c.shape) {
				t.Errorf("%s: text audit says \"at least\" or names another element:\n%s", file, out)
			}
		}
	}
	// The source-code exports read back too, with every digit of their
	// extended arrays.
	if _, errs, code := run(t, dir, "element", "--shape", "prism", "--degree", "4", "--digits", "25", "--format", "json", "-o", "p4.json"); code != 0 {
		t.Fatal(errs)
	}
	ref, _, _ := elementAuditJSON(t, dir, "p4.json", "--quick")
	for _, lang := range []string{"c", "cpp", "fortran", "go", "python", "julia"} {
		file := "p4." + lang
		if _, errs, code := run(t, dir, "export", "p4.json", "--to", lang, "-o", file); code != 0 {
			t.Fatalf("export %s: %s", lang, errs)
		}
		rep, raw, code := elementAuditJSON(t, dir, file, "--quick")
		if code != 0 || rep.Degree != ref.Degree || raw["digits"].(float64) < 25 {
			t.Errorf("%s: exit %d, degree %d (json file: %d), digits %v", file, code, rep.Degree, ref.Degree, raw["digits"])
		}
	}
	// The text output of a weighted rule carries its weight.
	if _, errs, code := run(t, dir, "element", "--shape", "triangle", "--degree", "3", "--weight", "x", "--digits", "20", "-o", "wx.txt"); code != 0 {
		t.Fatalf("weighted element: exit %d: %s", code, errs)
	}
	if rep, _, code := elementAuditJSON(t, dir, "wx.txt", "--quick"); code != 0 || rep.Weight != "x" || rep.Degree < 3 {
		t.Errorf("weighted text rule: exit %d, %+v", code, rep)
	}
	// A wrong row number in a text table is an error naming the line.
	b, _ := os.ReadFile(filepath.Join(dir, "wx.txt"))
	bad := strings.Replace(string(b), "\n2  ", "\n7  ", 1)
	os.WriteFile(filepath.Join(dir, "badrow.txt"), []byte(bad), 0o644)
	expectInputError(t, dir, []string{"audit", "badrow.txt"}, "row number")
}
