package main

import (
	"context"
	"fmt"
	"math/big"
	"strings"

	"github.com/spf13/cobra"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// measureFlags are the flags that say which measure a command works on,
// as typed: exactly one of family, weight, momentsFile, measure.
type measureFlags struct {
	family, alpha, beta, interval string
	weight, breaks                string
	momentsFile, basis, measure   string
	// exactDecimals declares the decimals of a --moments or --measure
	// file exact as written.
	exactDecimals bool
}

// addMeasureFlags registers the measure flags on cmd (build, audit,
// moments, recurrence share them).
func addMeasureFlags(cmd *cobra.Command, mf *measureFlags) {
	f := cmd.Flags()
	f.StringVar(&mf.family, "family", "", "classical family: "+strings.Join(moments.FamilyNames, ", "))
	f.StringVar(&mf.alpha, "alpha", "", "family parameter alpha, exact decimal or p/q (jacobi: (1-x)^alpha, > -1, default 0; laguerre: x^alpha, > -1, default 0; gegenbauer: (1-x^2)^(alpha-1/2), > -1/2, required)")
	f.StringVar(&mf.beta, "beta", "", "Jacobi parameter beta, exact decimal or p/q: (1+x)^beta, > -1 (default 0)")
	f.StringVar(&mf.interval, "interval", "", "support A,B of the weight (inf, -inf allowed): required with --weight; a finite family is mapped affinely from [-1,1] onto it (default: the family's own interval)")
	f.StringVar(&mf.weight, "weight", "", "weight function of x, e.g. \"-log(x)\" (with --interval)")
	f.StringVar(&mf.breaks, "breaks", "", "interior points X,Y,.. where the weight is not smooth (with --weight; optional)")
	f.StringVar(&mf.momentsFile, "moments", "", "file of moments, one decimal or p/q per line, k = 0, 1, ... ('#' starts a comment; raw unless --basis); 2N moments are needed for N points")
	f.StringVar(&mf.basis, "basis", "", basisHelp)
	f.StringVar(&mf.measure, "measure", "", "file of a discrete measure, one \"x mass\" pair per line; N at most the number of distinct points (with --interval, every point must lie in it)")
	f.BoolVar(&mf.exactDecimals, exactDecimalsFlag, false, "read the decimals of a --moments or --measure file as exact values (0.1 is 1/10), not as known to their written digits: no digit limit, and --digits auto gives 34")
}

const basisHelp = "basis of the --moments file: monomial (raw moments, default), legendre or chebyshev (need a finite --interval), laguerre ([A,inf), default [0,inf)), hermite ((-inf,inf))"

// measureFlags returns build's measure flags.
func (o *buildOptions) measureFlags() measureFlags { return o.measure }

// resolveMeasure turns the measure flags of build (exactly one of --family,
// --weight, --moments, --measure) into the measure to build for. fam is
// non-nil for a family (the rule file records its parameters).
func (o *buildOptions) resolveMeasure(ctx context.Context) (design.Measure, *moments.Family, error) {
	return o.measureFlags().resolve(ctx)
}

// resolve returns the measure the flags name; fam is non-nil for a family.
// ctx bounds the computations of an expression weight's recurrence.
func (mf measureFlags) resolve(ctx context.Context) (design.Measure, *moments.Family, error) {
	var given []string
	for _, s := range []struct{ name, val string }{
		{"--family", mf.family}, {"--weight", mf.weight}, {"--moments", mf.momentsFile}, {"--measure", mf.measure},
	} {
		if strings.TrimSpace(s.val) != "" {
			given = append(given, s.name)
		}
	}
	switch len(given) {
	case 0:
		return nil, nil, fmt.Errorf("no measure given: name one with --family, --weight (with --interval), --moments or --measure")
	case 1:
	default:
		return nil, nil, fmt.Errorf("%s: give exactly one source of the measure", strings.Join(given, " and "))
	}
	if given[0] != "--family" {
		for _, s := range []struct{ name, val string }{{"--alpha", mf.alpha}, {"--beta", mf.beta}} {
			if s.val != "" {
				return nil, nil, fmt.Errorf("%s: a family parameter, not used with %s", s.name, given[0])
			}
		}
	}
	if mf.breaks != "" && given[0] != "--weight" {
		return nil, nil, fmt.Errorf("--breaks: only used with --weight")
	}
	if mf.exactDecimals && given[0] != "--moments" && given[0] != "--measure" {
		return nil, nil, fmt.Errorf("--%s: only used with --moments or --measure", exactDecimalsFlag)
	}
	if mf.basis != "" && given[0] != "--moments" {
		return nil, nil, fmt.Errorf("--basis %s: only used with --moments", mf.basis)
	}
	iv, err := mf.optionalInterval()
	if err != nil {
		return nil, nil, err
	}
	switch given[0] {
	case "--weight":
		w, err := mf.weightFunction(iv)
		if err != nil {
			return nil, nil, err
		}
		return design.NewExprSource(ctx, w), nil, nil
	case "--moments":
		basis, dom, err := momentBasis(mf.basis, iv)
		if err != nil {
			return nil, nil, err
		}
		ml, err := mf.readMoments()
		if err != nil {
			return nil, nil, err
		}
		src := design.NewMomentSource(ml, basis, dom)
		src.NoSupport = iv == nil && basis.Name == "monomial"
		return src, nil, nil
	case "--measure":
		dm, err := mf.readMeasure()
		if err != nil {
			return nil, nil, err
		}
		src := design.NewDiscreteSource(dm)
		if iv != nil {
			if err := dm.CheckSupport(*iv); err != nil {
				return nil, nil, err
			}
			src.Support = iv
		}
		return src, nil, nil
	}
	fam, err := mf.familyOf(iv)
	if err != nil {
		return nil, nil, err
	}
	return design.FamilySource{Family: fam}, &fam, nil
}

func (mf measureFlags) optionalInterval() (*moments.Interval, error) {
	if strings.TrimSpace(mf.interval) == "" {
		return nil, nil
	}
	v, err := moments.ParseInterval(mf.interval)
	if err != nil {
		return nil, fmt.Errorf("--interval: %v", err)
	}
	return &v, nil
}

func (mf measureFlags) familyOf(iv *moments.Interval) (moments.Family, error) {
	alpha, err := optionalRat("--alpha", mf.alpha)
	if err != nil {
		return moments.Family{}, err
	}
	beta, err := optionalRat("--beta", mf.beta)
	if err != nil {
		return moments.Family{}, err
	}
	return moments.NewFamily(mf.family, alpha, beta, iv)
}

// weightFunction parses --weight on --interval with --breaks.
func (mf measureFlags) weightFunction(iv *moments.Interval) (*moments.Weight, error) {
	if iv == nil {
		return nil, fmt.Errorf("--weight %s: give its support with --interval A,B", mf.weight)
	}
	var breaks []*big.Rat
	if strings.TrimSpace(mf.breaks) != "" {
		for _, s := range strings.Split(mf.breaks, ",") {
			r, err := precision.ParseExact(s)
			if err != nil {
				return nil, fmt.Errorf("--breaks: %v", err)
			}
			breaks = append(breaks, r)
		}
	}
	return moments.NewWeight(mf.weight, *iv, breaks)
}

// momentBasis resolves --basis with --interval into the basis of a moment
// file and the interval its rule is said to live on.
func momentBasis(name string, iv *moments.Interval) (moments.Basis, moments.Interval, error) {
	whole := moments.Interval{Lo: moments.Endpoint{Inf: -1}, Hi: moments.Endpoint{Inf: 1}}
	switch strings.ToLower(strings.TrimSpace(name)) {
	case "", "monomial", "raw":
		if iv == nil {
			return moments.MonomialBasis(), whole, nil
		}
		return moments.MonomialBasis(), *iv, nil
	case "legendre", "chebyshev":
		if iv == nil || !iv.Finite() {
			return moments.Basis{}, moments.Interval{}, fmt.Errorf("--basis %s: needs a finite --interval A,B", name)
		}
		if strings.EqualFold(strings.TrimSpace(name), "legendre") {
			return moments.LegendreBasis(*iv), *iv, nil
		}
		return moments.ChebyshevBasis(*iv), *iv, nil
	case "laguerre":
		if iv == nil {
			v := moments.Interval{Lo: moments.Endpoint{Value: new(big.Rat)}, Hi: moments.Endpoint{Inf: 1}}
			iv = &v
		}
		if !iv.Lo.Finite() || iv.Hi.Finite() {
			return moments.Basis{}, moments.Interval{}, fmt.Errorf("--basis laguerre: needs an --interval A,inf (default 0,inf)")
		}
		return moments.LaguerreBasis(iv.Lo.Value), *iv, nil
	case "hermite":
		if iv != nil && (iv.Lo.Finite() || iv.Hi.Finite()) {
			return moments.Basis{}, moments.Interval{}, fmt.Errorf("--basis hermite: lives on -inf,inf, not on %s", iv)
		}
		return moments.HermiteBasis(), whole, nil
	}
	return moments.Basis{}, moments.Interval{}, fmt.Errorf("--basis %q: choose monomial, legendre, chebyshev, laguerre or hermite", name)
}

// optionalRat reads an exact number flag; "" gives nil.
func optionalRat(flag, s string) (*big.Rat, error) {
	if strings.TrimSpace(s) == "" {
		return nil, nil
	}
	r, err := precision.ParseExact(s)
	if err != nil {
		return nil, fmt.Errorf("%s: %v", flag, err)
	}
	return r, nil
}
