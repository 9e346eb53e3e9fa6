package main

import (
	"context"
	"fmt"
	"math/big"
	"os"
	"strings"

	"quadwright/design"
	"quadwright/precision"
)

// ruleKinds lists the values --kind takes, in the order the help gives them.
var ruleKinds = append([]string{"gauss", "radau", "lobatto", "kronrod", "anti-gauss", "interpolatory"}, design.PresetKinds...)

// kindHelp is the help text of --kind.
var kindHelp = "kind of rule: " + strings.Join(ruleKinds, ", ") + "; for kronrod and anti-gauss --points is the size N of the Gauss rule they extend or pair with (2N+1 and N+1 points are printed)"

// makeRule builds the rule of the kind asked (--kind, --fixed, --nodes)
// for the measure m.
func (o *buildOptions) makeRule(ctx context.Context, m design.Measure, req design.Request) (*design.Rule, error) {
	kind := strings.ToLower(strings.TrimSpace(o.kind))
	var fixed []*big.Rat
	if strings.TrimSpace(o.fixed) != "" {
		var err error
		if fixed, err = parseFixedList(o.fixed); err != nil {
			return nil, err
		}
	}
	if o.nodesFile != "" {
		if kind != "gauss" && kind != "interpolatory" {
			return nil, fmt.Errorf("--nodes: it prescribes every node, which --kind %s does not allow (use --kind interpolatory, or leave --kind out)", kind)
		}
		if fixed != nil {
			return nil, fmt.Errorf("--fixed: give either --fixed or --nodes, not both (--nodes prescribes every node)")
		}
		nodes, err := readNodeFile(o.nodesFile)
		if err != nil {
			return nil, err
		}
		if req.Points != len(nodes) {
			return nil, fmt.Errorf("--points %d: the --nodes file %s lists %d nodes, and every node counts", req.Points, o.nodesFile, len(nodes))
		}
		return design.Interpolatory(ctx, m, req, nodes, "interpolatory")
	}
	switch kind {
	case "gauss":
		if fixed != nil {
			return design.GaussFixed(ctx, m, req, fixed)
		}
		return design.Gauss(ctx, m, req)
	case "radau":
		switch len(fixed) {
		case 0:
			return design.Radau(ctx, m, req, nil)
		case 1:
			return design.Radau(ctx, m, req, fixed[0])
		}
		return nil, fmt.Errorf("--fixed %s: a Radau rule has one prescribed node, not %d", o.fixed, len(fixed))
	case "lobatto":
		switch len(fixed) {
		case 0:
			return design.Lobatto(ctx, m, req, nil, nil)
		case 2:
			return design.Lobatto(ctx, m, req, fixed[0], fixed[1])
		}
		return nil, fmt.Errorf("--fixed %s: a Lobatto rule has two prescribed nodes, not %d", o.fixed, len(fixed))
	case "interpolatory":
		return nil, fmt.Errorf("--kind interpolatory: give the nodes with --nodes FILE")
	}
	if fixed != nil {
		return nil, fmt.Errorf("--fixed: --kind %s takes no prescribed nodes", kind)
	}
	switch kind {
	case "kronrod":
		return design.Kronrod(ctx, m, req)
	case "anti-gauss":
		return design.AntiGauss(ctx, m, req)
	}
	for _, p := range design.PresetKinds {
		if kind == p {
			return design.Preset(ctx, m, req, kind)
		}
	}
	return nil, fmt.Errorf("--kind %q: choose one of %s", o.kind, strings.Join(ruleKinds, ", "))
}

// pointsForNodes returns --points as given, or, when it is absent and
// --nodes names a readable file, the number of nodes in that file (the
// file fixes N; a file that cannot be read is reported by makeRule).
func (o *buildOptions) pointsForNodes() string {
	if o.points != "" || o.nodesFile == "" {
		return o.points
	}
	nodes, err := readNodeFile(o.nodesFile)
	if err != nil {
		return "1"
	}
	return fmt.Sprint(len(nodes))
}

// parseFixedList reads --fixed: exact numbers (decimal or p/q) separated
// by commas.
func parseFixedList(s string) ([]*big.Rat, error) {
	parts := strings.Split(s, ",")
	out := make([]*big.Rat, 0, len(parts))
	for i, p := range parts {
		p = strings.TrimSpace(p)
		if p == "" {
			return nil, fmt.Errorf("--fixed %q: item %d is empty; give numbers separated by commas, as in -1,1", s, i+1)
		}
		v, err := precision.ParseExact(p)
		if err != nil {
			return nil, fmt.Errorf("--fixed %q: item %d, %q, is not a number (decimal or p/q)", s, i+1, p)
		}
		out = append(out, v)
	}
	return out, nil
}

// readNodeFile reads the --nodes file.
func readNodeFile(path string) ([]*big.Rat, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("--nodes %s: cannot read it (%v)", path, unwrapPathError(err))
	}
	return parseNodeList(string(b), path)
}

// parseNodeList reads one exact number (decimal or p/q) per line; blank
// lines and lines starting with # are skipped. name is the file, for
// messages.
func parseNodeList(text, name string) ([]*big.Rat, error) {
	var out []*big.Rat
	for i, line := range strings.Split(text, "\n") {
		line = strings.TrimSpace(line)
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		v, err := precision.ParseExact(line)
		if err != nil {
			if len(line) > 40 {
				line = line[:40] + "..."
			}
			return nil, fmt.Errorf("--nodes %s line %d: %q is not a number (one decimal or p/q per line)", name, i+1, line)
		}
		out = append(out, v)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("--nodes %s: the file lists no node", name)
	}
	return out, nil
}
