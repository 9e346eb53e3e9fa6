package main

import "quadwright/moments"

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
