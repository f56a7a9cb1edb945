package audit

import (
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/report/assess"
)

// Review N11: the counts say how many open findings have no action typed,
// not only how many are new: three findings, one carried with an owner, one
// carried with nothing typed, one new; two have no action (by count).
func TestActionCountsNoAction(t *testing.T) {
	fs := []assess.Finding{
		{StationID: "S1", ObjectID: "A", Check: "c"},
		{StationID: "S1", ObjectID: "B", Check: "c"},
		{StationID: "S1", ObjectID: "C", Check: "c"},
	}
	prev := &PreviousAudit{rows: []priorFinding{
		{Key: keyOf(&fs[0]), Action: Action{Owner: "M. Kell"}},
		{Key: keyOf(&fs[1])},
	}}
	pl := PlanActions(prev, fs)
	c := pl.Counts
	if c.Carried != 1 || c.New != 1 || c.NoAction != 2 {
		t.Errorf("counts %+v, want 1 carried, 1 new, 2 with no action", c)
	}
	if !strings.Contains(c.String(), "2 open finding(s) with no action") {
		t.Errorf("line %q does not say how many have no action", c.String())
	}
}
