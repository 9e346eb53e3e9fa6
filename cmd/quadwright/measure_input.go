package main

import (
	"quadwright/design"
	"quadwright/moments"
)

// exactDecimalsFlag is the flag that declares the decimals of a moment or
// measure file exact.
const exactDecimalsFlag = "exact-decimals"

// readMoments reads --moments, its decimals made exact with
// --exact-decimals.
func (mf measureFlags) readMoments() (*moments.MomentList, error) {
	ml, err := moments.ReadMomentFile(mf.momentsFile)
	if err == nil && mf.exactDecimals {
		ml.DeclareExact()
	}
	return ml, err
}

// readMeasure reads --measure, its decimals made exact with
// --exact-decimals.
func (mf measureFlags) readMeasure() (*moments.DiscreteMeasure, error) {
	dm, err := moments.ReadMeasureFile(mf.measure)
	if err == nil && mf.exactDecimals {
		dm.DeclareExact()
	}
	return dm, err
}

// supportLabel is the phrase for m's support after its name: " on [a, b]" as
// stated, or ", support not given".
func supportLabel(m design.Measure) string {
	if s, ok := m.(design.SupportStater); ok && !s.SupportGiven() {
		return ", support not given"
	}
	return " on " + m.Domain().String()
}

// supportJSON is the "interval" of a JSON listing: the stated ends, or nil
// (with "support": "not given" beside it) when none was stated.
func supportJSON(m design.Measure, out map[string]any) {
	if s, ok := m.(design.SupportStater); ok && !s.SupportGiven() {
		out["interval"], out["support"] = nil, "not given"
		return
	}
	out["interval"] = m.Domain().Strings()
}
