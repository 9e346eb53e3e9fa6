package main

import (
	"context"
	"fmt"

	"quadwright/design"
)

// makeRule builds the rule of the kind asked (--kind, --fixed, --nodes)
// for the measure m.
func (o *buildOptions) makeRule(ctx context.Context, m design.Measure, req design.Request) (*design.Rule, error) {
	for _, un := range []struct{ name, val string }{{"--fixed", o.fixed}, {"--nodes", o.nodesFile}} {
		if un.val != "" {
			return nil, fmt.Errorf("%s: this version builds gauss rules only", un.name)
		}
	}
	switch o.kind {
	case "gauss":
		return design.Gauss(ctx, m, req)
	}
	return nil, fmt.Errorf("--kind %q: this version builds gauss rules only", o.kind)
}
