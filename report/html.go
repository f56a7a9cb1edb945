package report

import (
	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/rerun"
)

// The HTML report's data is composed here, in the pipeline root, because it
// joins two stages that must not know each other: the audit's outputs
// (report/audit, which writes the page and must not import report/rerun) and
// the humidity sweep (report/rerun, which builds on the audit and must not
// import the root). The root already sees both; it runs the sweep and hands
// the audit writer its result as a typed audit.HumidityGrid.

// HTMLSweepRH is the humidity grid of the HTML report's verdict-against-RH
// plot, in % RH: the sweep command's default range (10:90:5).
var HTMLSweepRH = func() []float64 {
	var rh []float64
	for v := 10.0; v <= 90; v += 5 {
		rh = append(rh, v)
	}
	return rh
}()

// HumidityGrid assesses s over HTMLSweepRH as the sweep command does by
// default (the site RH swept; a station with its own RH kept at it, and its
// clearance text says so; rerun.RunSweep) and returns each
// station's verdict per step and where it clears. s needs its Objects.
func HumidityGrid(s *inventory.Survey) *audit.HumidityGrid {
	sw := rerun.RunSweep(s, HTMLSweepRH, rerun.SweepOptions{})
	g := &audit.HumidityGrid{}
	for _, st := range sw.Steps {
		g.RH = append(g.RH, st.RH)
	}
	text := map[string]string{}
	for _, c := range sw.Clearances {
		text[c.ID] = c.Text
	}
	if len(sw.Steps) == 0 {
		return g
	}
	for j, st := range sw.Steps[0].Stations {
		hs := audit.HumidityStation{ID: st.ID, Text: text[st.ID]}
		for _, step := range sw.Steps {
			hs.Verdicts = append(hs.Verdicts, step.Stations[j].Verdict)
		}
		g.Stations = append(g.Stations, hs)
	}
	return g
}
