package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"

	"github.com/pelletier/go-toml/v2"
	"github.com/spf13/cobra"
)

// Spec files hold a command's options in TOML, one key per flag, with the
// flag's name as the key (`points = 12`, `interval = "0,1"` or
// `interval = ["0", "1"]`), plus a free-text `description`. A flag given on
// the command line overrides the file. Paths in a spec (moments, measure,
// nodes, output) are relative to the spec file's folder.

// specPathKeys are the keys whose values are file paths.
var specPathKeys = map[string]bool{"moments": true, "measure": true, "nodes": true, "output": true}

// applySpec reads the spec at path into cmd's flags, skipping flags the user
// set on the command line. Unknown keys are refused with their name and line.
func applySpec(cmd *cobra.Command, path string) error {
	data, err := os.ReadFile(path)
	if err != nil {
		return fmt.Errorf("spec %s: %v", path, unwrapPathError(err))
	}
	var doc map[string]any
	if err := toml.Unmarshal(data, &doc); err != nil {
		var de *toml.DecodeError
		if errors.As(err, &de) {
			row, col := de.Position()
			return fmt.Errorf("spec %s: line %d, column %d: %s", path, row, col, strings.TrimPrefix(de.Error(), "toml: "))
		}
		return fmt.Errorf("spec %s: not valid TOML (%v)", path, err)
	}
	dir := filepath.Dir(path)
	// Apply in a fixed order so that errors are reported deterministically.
	keys := make([]string, 0, len(doc))
	for k := range doc {
		keys = append(keys, k)
	}
	sortByLine(keys, data)
	for _, key := range keys {
		val := doc[key]
		if key == "description" {
			if _, ok := val.(string); !ok {
				return fmt.Errorf("spec %s: line %d: description must be a string", path, keyLine(data, key))
			}
			continue
		}
		fl := cmd.Flags().Lookup(key)
		if fl == nil || key == "help" {
			return fmt.Errorf("spec %s: line %d: unknown key %q (the keys are the flags of %q, e.g. points, digits)", path, keyLine(data, key), key, cmd.Name())
		}
		if fl.Changed {
			continue
		}
		s, err := specValue(val)
		if err != nil {
			return fmt.Errorf("spec %s: line %d: %s: %v", path, keyLine(data, key), key, err)
		}
		if specPathKeys[key] && s != "" && !filepath.IsAbs(s) {
			s = filepath.Join(dir, s)
		}
		if err := cmd.Flags().Set(key, s); err != nil {
			return fmt.Errorf("spec %s: line %d: %s: %v", path, keyLine(data, key), key, err)
		}
	}
	return nil
}

// specValue turns a TOML value into the flag's text.
func specValue(v any) (string, error) {
	switch x := v.(type) {
	case string:
		return x, nil
	case int64:
		return strconv.FormatInt(x, 10), nil
	case float64:
		s := strconv.FormatFloat(x, 'g', -1, 64)
		digits := strings.TrimLeft(strings.Map(func(r rune) rune {
			if r >= '0' && r <= '9' {
				return r
			}
			return -1
		}, strings.SplitN(strings.ToLower(s), "e", 2)[0]), "0")
		if len(digits) >= 16 {
			return "", fmt.Errorf("the number %s may not carry every digit written: write it as a string", s)
		}
		return s, nil
	case bool:
		return strconv.FormatBool(x), nil
	case []any:
		parts := make([]string, len(x))
		for i, e := range x {
			s, err := specValue(e)
			if err != nil {
				return "", err
			}
			if strings.Contains(s, ",") {
				return "", fmt.Errorf("a list element may not hold a comma")
			}
			parts[i] = s
		}
		return strings.Join(parts, ","), nil
	case map[string]any:
		return "", fmt.Errorf("tables are not used in spec files; write the keys at the top level")
	}
	return "", fmt.Errorf("a value of type %T is not understood", v)
}

// keyLine finds the line on which key is assigned (1 if it cannot tell).
func keyLine(data []byte, key string) int {
	re := regexp.MustCompile(`^\s*["']?` + regexp.QuoteMeta(key) + `["']?\s*=`)
	for i, line := range strings.Split(string(data), "\n") {
		if re.MatchString(line) {
			return i + 1
		}
	}
	return 1
}

func sortByLine(keys []string, data []byte) {
	lines := make(map[string]int, len(keys))
	for _, k := range keys {
		lines[k] = keyLine(data, k)
	}
	for i := 1; i < len(keys); i++ {
		for j := i; j > 0 && (lines[keys[j]] < lines[keys[j-1]] || lines[keys[j]] == lines[keys[j-1]] && keys[j] < keys[j-1]); j-- {
			keys[j], keys[j-1] = keys[j-1], keys[j]
		}
	}
}
