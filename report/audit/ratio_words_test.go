package audit

import (
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// Review N8: a station with no flammable atmosphere reads the same on the
// terminal and Summary (stationRatioText), the Report (stationRatioCell) and
// the HTML (htmlRatioText): "no atmosphere", the state in words.
func TestNoAtmosphereOneWording(t *testing.T) {
	st := &assess.StationResult{Station: inventory.Station{ID: "S9"}, Verdict: assess.Marginal}
	if got := stationRatioText(st); got != NoAtmosphereText {
		t.Errorf("terminal/Summary %q, want %q", got, NoAtmosphereText)
	}
	if got := htmlRatioText(st); got != NoAtmosphereText {
		t.Errorf("HTML %q, want %q", got, NoAtmosphereText)
	}
	if got := stationRatioCell(st).V; got != NoAtmosphereText {
		t.Errorf("Report %v, want %q", got, NoAtmosphereText)
	}
}
