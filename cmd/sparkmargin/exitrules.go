package main

import (
	"fmt"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/rerun"
)

// The exit rules of the reruns, applied after their outputs are written.

// rejectedShortfall is assess's exit rule for a rerun, after its outputs are
// written: an Objects row rejected fails the run (status 1), since the
// stations marked incomplete are ranked without that object.
func rejectedShortfall(s *inventory.Survey) error {
	if n := report.RejectedObjects(s); n > 0 {
		return withCode(exitProblems, fmt.Errorf("%d object row(s) were rejected: the outputs are written, but the stations marked incomplete are ranked without them; see the Rejected sheet", n))
	}
	return nil
}

// compareShortfall is the exit rule of compare, after its outputs are
// written: an Objects row rejected on either side fails the run as it fails
// assess (an object not assessed is a hazard the comparison does not cover),
// and so does a comparison of two different sites (not a repeat survey).
func compareShortfall(c *rerun.Comparison) error {
	switch {
	case c.Rejected() > 0:
		return withCode(exitProblems, fmt.Errorf("%d object row(s) were rejected (OLD %d, NEW %d): they are listed apart, not as added or removed, and their stations are compared without them; see each side's audit / Rejected sheet",
			c.Rejected(), len(c.RejectedOld), len(c.RejectedNew)))
	case c.HasCaution(rerun.CautionDifferentSites):
		return withCode(exitProblems, fmt.Errorf("the two sides are different sites: the comparison is written, but it is of two places, not a repeat survey"))
	}
	return nil
}
