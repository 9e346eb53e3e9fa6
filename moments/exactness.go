package moments

import "fmt"

// DeclareExact makes every value of the list exact as written: a decimal
// such as 0.3333 then means 3333/10000, not "1/3 to four digits". It is
// what the user asks for by declaring decimal moments exact; the digits the
// input supports are then no longer limited by the written places.
func (ml *MomentList) DeclareExact() {
	for k := range ml.Values {
		ml.Values[k].Exact, ml.Values[k].Digits = true, 0
		ml.ULP[k] = nil
	}
}

// DeclareExact makes every point and mass of the measure exact as written
// (see MomentList.DeclareExact).
func (dm *DiscreteMeasure) DeclareExact() {
	dm.Exact, dm.Digits = true, 0
	for i := range dm.X {
		dm.XULP[i], dm.MassULP[i] = nil, nil
	}
}

// CheckSupport fails, naming the first point outside and the end it lies
// beyond, unless every point of the measure lies in the closed interval iv.
func (dm *DiscreteMeasure) CheckSupport(iv Interval) error {
	if iv.Lo.Finite() && dm.X[0].Cmp(iv.Lo.Value) < 0 {
		return fmt.Errorf("--measure %s: the point %s lies below the left end %s of the support %s", dm.Name, RatString(dm.X[0]), iv.Lo, iv)
	}
	if last := dm.X[len(dm.X)-1]; iv.Hi.Finite() && last.Cmp(iv.Hi.Value) > 0 {
		return fmt.Errorf("--measure %s: the point %s lies above the right end %s of the support %s", dm.Name, RatString(last), iv.Hi, iv)
	}
	return nil
}
