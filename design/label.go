package design

import (
	"fmt"
	"strings"
)

// WeightPhrase is how a report line names a measure's weight after the
// measure's label: ", weight EXPR" for a weight known as a function (a
// family's or an expression), and "" for one known only through a file, a
// moment list or a discrete measure (Weight "moments(FILE)" or
// "measure(FILE)"), whose label already names the file: "moments(FILE)" is
// our record of it, not anything a user would write.
func WeightPhrase(weight string) string {
	if _, _, ok := FileWeight(weight); ok || strings.TrimSpace(weight) == "" {
		return ""
	}
	return ", weight " + weight
}

// FileWeight reports whether weight is the record of a weight known only
// through a file, "moments(FILE)" or "measure(FILE)", and if so which flag
// gives it ("--moments" or "--measure") and the file.
func FileWeight(weight string) (flag, file string, ok bool) {
	w := strings.TrimSpace(weight)
	for _, k := range []string{"moments", "measure"} {
		if rest, found := strings.CutPrefix(w, k+"("); found && strings.HasSuffix(rest, ")") {
			return "--" + k, strings.TrimSuffix(rest, ")"), true
		}
	}
	return "", "", false
}

// WeightName names a weight in a sentence: the expression itself, or for a
// weight known only through a file "the weight whose moments are listed in
// FILE" ("the discrete measure in FILE").
func WeightName(weight string) string {
	flag, file, ok := FileWeight(weight)
	switch {
	case !ok:
		return weight
	case flag == "--moments":
		return "the weight whose moments are listed in " + file
	}
	return "the discrete measure in " + file
}

// Plural writes n with the word that agrees with it: "1 digit survives",
// "2 digits survive".
func Plural(n int, one, many string) string {
	if n == 1 {
		return fmt.Sprintf("%d %s", n, one)
	}
	return fmt.Sprintf("%d %s", n, many)
}
