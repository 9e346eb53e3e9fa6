package element

import (
	"context"
	_ "embed"
	"encoding/json"
	"fmt"
	"math/big"
	"sync"

	"quadwright/precision"
)

// PublishedTriangle[d-1] is the point count of the best published fully
// symmetric triangle rule of degree d with positive weights and interior
// points, d = 1..20 (F. D. Witherden and P. E. Vincent, "On the
// identification of symmetric quadrature rules for finite element methods",
// Comput. Math. Appl. 69, 2015; from memory, as quoted in the issue).
var PublishedTriangle = []int{1, 3, 6, 6, 7, 12, 15, 16, 19, 25, 28, 33, 37, 42, 49, 55, 60, 67, 73, 79}

// CatalogueDigits is the number of significant digits of every value the
// catalogue stores.
const CatalogueDigits = 40

// CatalogueEntry is one catalogued rule: its orbit structure and
// parameters (see Structure) and, for readers, its nodes and weights, all
// at CatalogueDigits digits.
type CatalogueEntry struct {
	Degree    int        `json:"degree"`
	Points    int        `json:"points"`
	Published int        `json:"published_points"`
	Structure Structure  `json:"structure"`
	Params    []string   `json:"params"`
	Nodes     [][]string `json:"nodes"`
	Weights   []string   `json:"weights"`
	Seed      uint64     `json:"seed"`
	Starts    int        `json:"starts"`
}

// Catalogue is the file catalogue/triangle.json.
type Catalogue struct {
	Format     string           `json:"format"`
	Shape      string           `json:"shape"`
	Regenerate string           `json:"regenerate"`
	Rules      []CatalogueEntry `json:"rules"`
}

//go:embed catalogue/triangle.json
var triangleJSON []byte

var (
	catOnce sync.Once
	catData *Catalogue
)

// TriangleCatalogue returns the embedded catalogue; a catalogue that does
// not parse is a build defect and panics.
func TriangleCatalogue() *Catalogue {
	catOnce.Do(func() {
		catData = &Catalogue{}
		if err := json.Unmarshal(triangleJSON, catData); err != nil {
			panic("element: embedded triangle catalogue: " + err.Error())
		}
	})
	return catData
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
// the shape and degree. Only the triangle is catalogued so far.
func Symmetric(ctx context.Context, req Request) (r *Rule, ok bool, err error) {
	if req.Shape != Triangle {
		return nil, false, nil
	}
	e, found := TriangleCatalogue().lookup(req.Degree)
	if !found {
		return nil, false, nil
	}
	r, err = e.Rule(ctx, req.Digits)
	if r != nil {
		r.Requested = req.Degree
	}
	return r, true, err
}

// Rule rebuilds the catalogued rule at digits (0: float64 mode), verified.
func (e CatalogueEntry) Rule(ctx context.Context, digits int) (*Rule, error) {
	params := make([]*big.Float, len(e.Params))
	prec := precision.DigitsToBits(CatalogueDigits) + 16
	for i, s := range e.Params {
		v, err := precision.ParseExact(s)
		if err != nil {
			return nil, fmt.Errorf("catalogued triangle rule of degree %d: parameter %q is no number", e.Degree, s)
		}
		params[i] = new(big.Float).SetPrec(prec).SetRat(v)
	}
	r, _, err := symmetricRule(ctx, e.Structure, params, e.Degree, digits)
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
	r, v, err := symmetricRule(ctx, res.Structure, params, d, CatalogueDigits)
	if err != nil {
		return CatalogueEntry{}, err
	}
	e := CatalogueEntry{Degree: d, Points: r.Points(), Structure: res.Structure, Nodes: r.Nodes, Weights: r.Weights, Seed: seed, Starts: res.Starts}
	if d >= 1 && d <= len(PublishedTriangle) {
		e.Published = PublishedTriangle[d-1]
	}
	for _, x := range v {
		e.Params = append(e.Params, precision.FormatSig(x, CatalogueDigits))
	}
	return e, nil
}
