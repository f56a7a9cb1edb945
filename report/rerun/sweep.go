package rerun

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// SweepStep is the assessment at one relative humidity.
type SweepStep struct {
	RH        float64 // %
	Incendive int
	Marginal  int
	Stations  []SweepStation // in the survey's station order
}

// SweepStation is one station at one RH step.
type SweepStation struct {
	ID         string
	Verdict    assess.Verdict
	WorstRatio *float64
}

// StationClearance says from which RH on a station is non-incendive.
type StationClearance struct {
	ID, Name string
	// ClearsAt is the lowest step RH from which on every higher step is
	// non-incendive; NaN when the station is not non-incendive at the last step.
	ClearsAt float64
	// Always: the station is non-incendive over the whole range.
	Always bool
	Text   string // the sentence a report shows
}

// Sweep is a survey assessed over a range of relative humidities.
type Sweep struct {
	Survey     *inventory.Survey
	Steps      []SweepStep
	Clearances []StationClearance // survey station order
}

// ParseRange reads "FROM:TO:STEP" in %RH (e.g. "10:90:5") into the list of RH
// values, TO included when the steps land on it; a single number is one step.
func ParseRange(s string) ([]float64, error) {
	parts := strings.Split(strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(s), "%")), ":")
	num := func(t string) (float64, error) {
		v, err := inventory.ParseNumber(strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(t), "%")))
		if err != nil {
			return 0, fmt.Errorf("--rh %q: %q is not a number; write FROM:TO:STEP in %%RH, e.g. 10:90:5", s, t)
		}
		if v < 0 || v > 100 {
			return 0, fmt.Errorf("--rh %q: %s %% is not a relative humidity (0-100)", s, t)
		}
		return v, nil
	}
	switch len(parts) {
	case 1:
		v, err := num(parts[0])
		if err != nil {
			return nil, err
		}
		return []float64{v}, nil
	case 3:
	default:
		return nil, fmt.Errorf("--rh %q: write FROM:TO:STEP in %%RH, e.g. 10:90:5", s)
	}
	from, err := num(parts[0])
	if err != nil {
		return nil, err
	}
	to, err := num(parts[1])
	if err != nil {
		return nil, err
	}
	step, err := strconv.ParseFloat(strings.TrimSpace(parts[2]), 64)
	if err != nil || !(step > 0) || math.IsInf(step, 0) {
		return nil, fmt.Errorf("--rh %q: the step %q must be a number above 0", s, parts[2])
	}
	if to < from {
		return nil, fmt.Errorf("--rh %q: FROM must not exceed TO", s)
	}
	n := int(math.Floor((to-from)/step+1e-9)) + 1
	if n > 1001 {
		return nil, fmt.Errorf("--rh %q: %d steps is too many (at most 1001)", s, n)
	}
	out := make([]float64, n)
	for i := range out {
		out[i] = math.Round((from+float64(i)*step)*1e9) / 1e9
	}
	return out, nil
}

// RunSweep assesses s once per RH value, with that RH at the site and at every
// station (a station's own RH is overridden too: the sweep asks what one
// humidity everywhere would do). s is not modified.
func RunSweep(s *inventory.Survey, rh []float64) *Sweep {
	sw := &Sweep{Survey: s}
	for _, v := range rh {
		c := CloneSurvey(s)
		c.Site.RelativeHumidity = inventory.Known(v)
		for i := range c.Stations {
			c.Stations[i].RelativeHumidity = inventory.Known(v)
		}
		a := assess.Assess(c, assess.Options{Limits: Limits(c)})
		step := SweepStep{RH: v, Incendive: a.Counts[assess.Incendive], Marginal: a.Counts[assess.Marginal]}
		byID := map[string]*assess.StationResult{}
		for i := range a.Stations {
			byID[a.Stations[i].Station.ID] = &a.Stations[i]
		}
		for _, id := range sweepStationIDs(s, a) {
			st := byID[id]
			step.Stations = append(step.Stations, SweepStation{ID: id, Verdict: st.Verdict, WorstRatio: st.WorstRatio})
		}
		sw.Steps = append(sw.Steps, step)
	}
	sw.Clearances = clearances(s, sw.Steps)
	return sw
}

// sweepStationIDs lists the stations in survey order, then any station that only
// objects name.
func sweepStationIDs(s *inventory.Survey, a *assess.Audit) []string {
	var ids []string
	seen := map[string]bool{}
	for _, st := range s.Stations {
		ids = append(ids, st.ID)
		seen[st.ID] = true
	}
	for _, st := range a.Stations {
		if !seen[st.Station.ID] {
			ids = append(ids, st.Station.ID)
			seen[st.Station.ID] = true
		}
	}
	return ids
}

func clearances(s *inventory.Survey, steps []SweepStep) []StationClearance {
	if len(steps) == 0 {
		return nil
	}
	var out []StationClearance
	last := steps[len(steps)-1]
	for j, st := range last.Stations {
		c := StationClearance{ID: st.ID, ClearsAt: math.NaN()}
		if x, ok := s.Station(st.ID); ok {
			c.Name = x.Name
		}
		k := len(steps)
		for k > 0 && steps[k-1].Stations[j].Verdict == assess.NonIncendive {
			k--
		}
		switch {
		case k == 0:
			c.Always, c.ClearsAt = true, steps[0].RH
			c.Text = fmt.Sprintf("non-incendive over the whole range (%s-%s %% RH)", fmtSig(steps[0].RH), fmtSig(last.RH))
		case k == len(steps):
			c.Text = fmt.Sprintf("humidity alone never gets it there: still %s at %s %% RH", st.Verdict, fmtSig(last.RH))
			if st.WorstRatio != nil {
				c.Text += fmt.Sprintf(" (worst ratio %s)", fmtSig(*st.WorstRatio))
			}
		default:
			c.ClearsAt = steps[k].RH
			c.Text = fmt.Sprintf("non-incendive from %s %% RH on (still %s at %s %%)", fmtSig(steps[k].RH), steps[k-1].Stations[j].Verdict, fmtSig(steps[k-1].RH))
		}
		out = append(out, c)
	}
	return out
}
