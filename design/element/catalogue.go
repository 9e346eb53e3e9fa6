package element

import (
	"context"
	"embed"
	"encoding/json"
	"fmt"
	"math/big"
	"sync"

	"quadwright/precision"
)

// published[s][d-1] is the point count of the best published fully
// symmetric rule of degree d on s with positive weights and interior
// points (F. D. Witherden and P. E. Vincent, "On the identification of
// symmetric quadrature rules for finite element methods", Comput. Math.
// Appl. 69, 2015). FROM MEMORY, as quoted in the issue and the team's
// brief, not checked against the paper; the catalogue prints them beside
// its own counts.
var published = map[Shape][]int{
	Triangle:      {1, 3, 6, 6, 7, 12, 15, 16, 19, 25, 28, 33, 37, 42, 49, 55, 60, 67, 73, 79},
	Quadrilateral: {1, 4, 4, 8, 8, 12, 12, 20, 20, 28, 28, 37, 37, 48, 48},
	Hexahedron:    {1, 6, 6, 14, 14, 34, 34, 58, 58, 90, 90},
	Tetrahedron:   {1, 4, 8, 14, 14, 24, 35, 46, 59, 81},
	Prism:         {1, 5, 8, 11, 16, 28, 35, 46, 60, 71},
	Pyramid:       {1, 5, 6, 10, 15, 24, 31, 47, 62, 83},
}

// Published returns the published point count for degree d on s (see
// published; from memory), or 0 when none is known.
func Published(s Shape, d int) int {
	p := published[s]
	if d < 1 || d > len(p) {
		return 0
	}
	return p[d-1]
}

// PublishedDegrees is the highest degree with a published count on s.
func PublishedDegrees(s Shape) int { return len(published[s]) }

// CatalogueDigits is the number of significant digits of every value the
// catalogue stores.
const CatalogueDigits = 40

// CatalogueEntry is one catalogued rule: its orbit structure and
// parameters (see Structure and expand64) and, for readers, its nodes and
// weights, all at CatalogueDigits digits.
type CatalogueEntry struct {
	Degree    int        `json:"degree"`
	Points    int        `json:"points"`
	Published int        `json:"published_points"`
	Structure Structure  `json:"structure"`
	Orbits    string     `json:"orbits"`
	Params    []string   `json:"params"`
	Nodes     [][]string `json:"nodes"`
	Weights   []string   `json:"weights"`
	Seed      uint64     `json:"seed"`
	Starts    int        `json:"starts"`
}

// Catalogue is one file catalogue/SHAPE.json.
type Catalogue struct {
	Format     string   `json:"format"`
	Shape      string   `json:"shape"`
	Group      string   `json:"group"`
	OrbitTypes []string `json:"orbit_types"`
	Published  string   `json:"published_source"`
	Regenerate string   `json:"regenerate"`
	// Notes explain where the catalogue's counts differ from the
	// published ones.
	Notes []string         `json:"notes,omitempty"`
	Rules []CatalogueEntry `json:"rules"`
	shape Shape
}

// CatalogueFormat names the catalogue file format.
const CatalogueFormat = "quadwright-element-catalogue/2"

//go:embed catalogue/*.json
var catalogueFS embed.FS

var (
	catMu   sync.Mutex
	catData = map[Shape]*Catalogue{}
)

// CatalogueOf returns the embedded catalogue of s (with no rules when the
// shape has none); a catalogue that does not parse is a build defect and
// panics.
func CatalogueOf(s Shape) *Catalogue {
	catMu.Lock()
	defer catMu.Unlock()
	if c, ok := catData[s]; ok {
		return c
	}
	c := &Catalogue{Shape: s.String()}
	if b, err := catalogueFS.ReadFile("catalogue/" + s.String() + ".json"); err == nil {
		if err := json.Unmarshal(b, c); err != nil {
			panic("element: embedded " + s.String() + " catalogue: " + err.Error())
		}
		if c.Shape != s.String() {
			panic("element: embedded catalogue " + s.String() + ".json names the " + c.Shape)
		}
	}
	catData[s] = c
	return c
}

// lookup returns the catalogued rule with the fewest points among those of
// degree >= d (the lowest such degree on a tie).
func (c *Catalogue) lookup(d int) (CatalogueEntry, bool) {
	var best CatalogueEntry
	found := false
	for _, e := range c.Rules {
		if e.Degree >= d && (!found || e.Points < best.Points || (e.Points == best.Points && e.Degree < best.Degree)) {
			best, found = e, true
		}
	}
	return best, found
}

// Symmetric returns the catalogued fully symmetric rule of req's shape for
// req's degree (the catalogued rule with fewest points whose degree is at
// least the one asked), rebuilt at req.Digits: the catalogued parameters
// are the start of the Gauss-Newton polish at two precisions, so any
// number of digits can be asked, and the printed rule is confirmed and
// verified as in Product. ok is false when the catalogue has no rule for
// the shape and degree.
func Symmetric(ctx context.Context, req Request) (r *Rule, ok bool, err error) {
	if SymmetryOf(req.Shape) == nil {
		return nil, false, nil
	}
	e, found := CatalogueOf(req.Shape).lookup(req.Degree)
	if !found {
		return nil, false, nil
	}
	r, err = e.Rule(ctx, req.Shape, req.Digits)
	if r != nil {
		r.Requested = req.Degree
	}
	return r, true, err
}

// Rule rebuilds the catalogued rule of shape s at digits (0: float64
// mode), verified.
func (e CatalogueEntry) Rule(ctx context.Context, s Shape, digits int) (*Rule, error) {
	sy := SymmetryOf(s)
	if sy == nil || len(e.Structure) != len(sy.Types) || len(e.Params) != e.Structure.Unknowns(sy) {
		return nil, fmt.Errorf("catalogued %s rule of degree %d: its orbit structure does not fit the shape", s, e.Degree)
	}
	params := make([]*big.Float, len(e.Params))
	prec := precision.DigitsToBits(CatalogueDigits) + 16
	for i, p := range e.Params {
		v, err := precision.ParseExact(p)
		if err != nil {
			return nil, fmt.Errorf("catalogued %s rule of degree %d: parameter %q is no number", s, e.Degree, p)
		}
		params[i] = new(big.Float).SetPrec(prec).SetRat(v)
	}
	r, _, err := symmetricRule(ctx, sy, e.Structure, params, e.Degree, digits)
	if err != nil {
		return nil, err
	}
	r.Published = e.Published
	return r, nil
}

// NewCatalogueEntry polishes a search result of degree d to
// CatalogueDigits digits, verifies it, and returns its catalogue entry.
func NewCatalogueEntry(ctx context.Context, d int, res SearchResult, seed uint64) (CatalogueEntry, error) {
	params := make([]*big.Float, len(res.Params))
	for i, v := range res.Params {
		params[i] = new(big.Float).SetPrec(64).SetFloat64(v)
	}
	return newEntry(ctx, res.Shape, d, res.Structure, params, seed, res.Starts)
}

// RebuildEntry polishes a catalogued entry of s again from its parameters
// and returns it afresh (nodes in the current orbit order).
func RebuildEntry(ctx context.Context, s Shape, e CatalogueEntry) (CatalogueEntry, error) {
	params := make([]*big.Float, len(e.Params))
	for i, p := range e.Params {
		v, err := precision.ParseExact(p)
		if err != nil {
			return CatalogueEntry{}, fmt.Errorf("parameter %q is no number", p)
		}
		params[i] = new(big.Float).SetPrec(precision.DigitsToBits(CatalogueDigits) + 16).SetRat(v)
	}
	return newEntry(ctx, s, e.Degree, e.Structure, params, e.Seed, e.Starts)
}

func newEntry(ctx context.Context, s Shape, d int, st Structure, params []*big.Float, seed uint64, starts int) (CatalogueEntry, error) {
	sy := SymmetryOf(s)
	r, v, err := symmetricRule(ctx, sy, st, params, d, CatalogueDigits)
	if err != nil {
		return CatalogueEntry{}, err
	}
	e := CatalogueEntry{Degree: d, Points: r.Points(), Published: Published(s, d), Structure: st, Orbits: st.Describe(sy),
		Nodes: r.Nodes, Weights: r.Weights, Seed: seed, Starts: starts}
	for _, x := range v {
		e.Params = append(e.Params, precision.FormatSig(x, CatalogueDigits))
	}
	return e, nil
}

// NewCatalogue returns an empty catalogue of s with its header filled.
func NewCatalogue(s Shape, regenerate string) *Catalogue {
	sy := SymmetryOf(s)
	c := &Catalogue{Format: CatalogueFormat, Shape: s.String(), Group: sy.Group, Regenerate: regenerate,
		Published: "published_points: F. D. Witherden and P. E. Vincent, Comput. Math. Appl. 69 (2015), from memory, unverified"}
	for _, o := range sy.Types {
		c.OrbitTypes = append(c.OrbitTypes, fmt.Sprintf("%s: %d points", o.Name, o.Points()))
	}
	return c
}
