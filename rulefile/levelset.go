package rulefile

import (
	"encoding/json"
	"fmt"
	"os"
	"strconv"
	"strings"

	"quadwright/design/levelset"
)

// LevelSetShape is domain.shape of a rule on a cut element.
const LevelSetShape = "level-set"

// LevelSetDomain is the domain of a cut-element rule: the element (or
// box) that the level set cuts, the level set, and the side.
type LevelSetDomain struct {
	Shape    string     `json:"shape"` // "level-set"
	Element  string     `json:"element"`
	Vertices [][]string `json:"vertices"`
	Box      []string   `json:"box,omitempty"`
	LevelSet string     `json:"level_set"`
	Side     string     `json:"side"`
}

// LevelSetFile is the rule file of a cut element: the contract's required
// keys in its order, then the order Q of the one-dimensional rules and the
// estimated error. degree is -1: a rule on a curved domain is exact for no
// space of polynomials, and no degree is claimed.
type LevelSetFile struct {
	Format         string         `json:"format"`
	Kind           string         `json:"kind"`
	Domain         LevelSetDomain `json:"domain"`
	Weight         string         `json:"weight"`
	Points         int            `json:"points"`
	Degree         int            `json:"degree"`
	Digits         int            `json:"digits"`
	Nodes          []Node         `json:"nodes"`
	Weights        []string       `json:"weights"`
	Order          int            `json:"order"`
	EstimatedError string         `json:"estimated_error"`
	ErrorTest      string         `json:"estimated_error_test"`
	Measure        string         `json:"measure"`
	Note           string         `json:"note,omitempty"`
	Program        string         `json:"program"`
	Method         string         `json:"method"`
}

// ErrorTestText says how estimated_error was measured.
const ErrorTestText = "largest difference, relative to the measure, between this rule and the one of order+4 on the same domain, over the integrands 1 and the coordinates and their products of degree 2 (scaled to [-1,1] on the element's bounding box)"

// FromLevelSetRule makes the file of a built cut-element rule.
func FromLevelSetRule(r *levelset.Rule, program string) *LevelSetFile {
	r.Print()
	f := &LevelSetFile{
		Format: FormatName, Kind: "level-set",
		Domain: LevelSetDomain{Shape: LevelSetShape, Element: r.Shape, LevelSet: r.LevelSet, Side: r.Side.String()},
		Weight: "1", Points: len(r.PrintedNodes), Degree: -1, Digits: r.Digits,
		Weights: append([]string(nil), r.PrintedWeights...), Order: r.Order,
		EstimatedError: strconv.FormatFloat(r.EstimatedError, 'e', 2, 64), ErrorTest: ErrorTestText,
		Measure: strconv.FormatFloat(r.Measure, 'g', 17, 64), Note: r.Note,
		Program: program, Method: r.Method,
	}
	if r.Weight != "" {
		f.Weight = r.Weight
	}
	for _, v := range r.Vertices {
		var s []string
		for _, c := range v {
			s = append(s, strconv.FormatFloat(c, 'g', -1, 64))
		}
		f.Domain.Vertices = append(f.Domain.Vertices, s)
	}
	for _, c := range r.Box {
		f.Domain.Box = append(f.Domain.Box, strconv.FormatFloat(c, 'g', -1, 64))
	}
	for _, p := range r.PrintedNodes {
		f.Nodes = append(f.Nodes, append(Node(nil), p...))
	}
	return f
}

// MarshalIndent renders the file as indented JSON with a final newline.
func (f *LevelSetFile) MarshalIndent() ([]byte, error) {
	b, err := json.MarshalIndent(f, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// IsLevelSet reports whether the file's domain.shape is "level-set".
func (f *File) IsLevelSet() bool { return strings.TrimSpace(f.Domain.Shape) == LevelSetShape }

// ReadLevelSet loads a cut-element rule file written by FromLevelSetRule;
// errors name the file.
func ReadLevelSet(path string) (*LevelSetFile, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("rule file %s: %v", path, unwrap(err))
	}
	var f LevelSetFile
	if err := json.Unmarshal(data, &f); err != nil {
		return nil, fmt.Errorf("rule file %s: not a level-set rule file (%v)", path, err)
	}
	if f.Domain.Shape != LevelSetShape || strings.TrimSpace(f.Domain.LevelSet) == "" {
		return nil, fmt.Errorf("rule file %s: domain.level_set is missing", path)
	}
	if len(f.Nodes) != len(f.Weights) || len(f.Nodes) == 0 {
		return nil, fmt.Errorf("rule file %s: %d nodes and %d weights", path, len(f.Nodes), len(f.Weights))
	}
	return &f, nil
}

// Request rebuilds the request the file was made from (order, side,
// element or box, weight), for an audit to recompute the domain.
func (f *LevelSetFile) Request(path string) (levelset.Request, error) {
	req := levelset.Request{Shape: f.Domain.Element, LevelSet: f.Domain.LevelSet, Order: f.Order}
	side, err := levelset.ParseSide(f.Domain.Side)
	if err != nil {
		return req, fmt.Errorf("rule file %s: domain.side %q: choose inside, outside or surface", path, f.Domain.Side)
	}
	req.Side = side
	for _, s := range f.Domain.Box {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			return req, fmt.Errorf("rule file %s: domain.box %q is not a number", path, s)
		}
		req.Box = append(req.Box, v)
	}
	if w := strings.TrimSpace(f.Weight); w != "1" && w != "" {
		req.Weight = w
	}
	return req, nil
}
