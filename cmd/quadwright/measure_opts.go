package main

import (
	"fmt"
	"math/big"
	"strings"

	"quadwright/design"
	"quadwright/moments"
	"quadwright/precision"
)

// resolveMeasure turns the measure flags of build (exactly one of --family,
// --weight, --moments, --measure) into the measure to build for. fam is
// non-nil for a family (the rule file records its parameters).
func (o *buildOptions) resolveMeasure() (design.Measure, *moments.Family, error) {
	for _, un := range []struct{ name, val string }{
		{"--weight", o.weight}, {"--moments", o.momentsFile}, {"--measure", o.measure}, {"--breaks", o.breaks},
	} {
		if un.val != "" {
			return nil, nil, fmt.Errorf("%s: this version builds rules for --family measures only", un.name)
		}
	}
	if o.family == "" {
		return nil, nil, fmt.Errorf("no measure given: name one with --family (for example --family legendre)")
	}
	alpha, err := optionalRat("--alpha", o.alpha)
	if err != nil {
		return nil, nil, err
	}
	beta, err := optionalRat("--beta", o.beta)
	if err != nil {
		return nil, nil, err
	}
	var iv *moments.Interval
	if o.interval != "" {
		v, err := moments.ParseInterval(o.interval)
		if err != nil {
			return nil, nil, fmt.Errorf("--interval: %v", err)
		}
		iv = &v
	}
	fam, err := moments.NewFamily(o.family, alpha, beta, iv)
	if err != nil {
		return nil, nil, err
	}
	return design.FamilySource{Family: fam}, &fam, nil
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
