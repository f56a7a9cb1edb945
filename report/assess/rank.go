package assess

import (
	"cmp"
	"slices"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// Rank builds the station results and orders them, worst first: by worst ratio
// (stations with no ratio after those with one), ties by the number of incendive
// objects, then of marginal objects (more first), then by station ID. A station's
// verdict is its worst object's by Verdict.Severity; a station with no objects is
// still listed, as not assessed with no ratio. Objects whose station is not on the
// Stations sheet get a station entry of their own, so none is lost.
func Rank(s *inventory.Survey, objs []ObjectResult) []StationResult {
	out := make([]StationResult, 0, len(s.Stations))
	index := map[string]int{}
	for _, st := range s.Stations {
		sr := StationResult{Station: st, Verdict: NotAssessed, Counts: zeroCounts()}
		if a, ok := s.Atmosphere(st.Atmosphere); ok && st.Atmosphere != "" {
			sr.Atmosphere = &a
		}
		index[st.ID] = len(out)
		out = append(out, sr)
	}
	for i := range objs {
		o := &objs[i]
		j, ok := index[o.Station.ID]
		if !ok {
			j = len(out)
			index[o.Station.ID] = j
			out = append(out, StationResult{Station: o.Station, Verdict: NotAssessed, Counts: zeroCounts()})
		}
		sr := &out[j]
		if len(sr.Objects) == 0 || o.Verdict.Severity() > sr.Verdict.Severity() {
			sr.Verdict = o.Verdict
		}
		sr.Objects = append(sr.Objects, o.Object.ID)
		sr.Counts[o.Verdict]++
		if o.Ratio != nil && (sr.WorstRatio == nil || *o.Ratio > *sr.WorstRatio) {
			r := *o.Ratio
			sr.WorstRatio = &r
			sr.WorstRatioAssumed = o.RatioAssumed()
		}
	}
	markRejected(out, s)
	slices.SortStableFunc(out, compareStations)
	for i := range out {
		out[i].Rank = i + 1
	}
	return out
}

func zeroCounts() map[Verdict]int {
	return map[Verdict]int{Incendive: 0, Marginal: 0, NotAssessed: 0, NonIncendive: 0}
}

// compareStations orders two stations, worst first.
func compareStations(a, b StationResult) int {
	switch {
	case a.WorstRatio != nil && b.WorstRatio == nil:
		return -1
	case a.WorstRatio == nil && b.WorstRatio != nil:
		return 1
	case a.WorstRatio != nil && *a.WorstRatio != *b.WorstRatio:
		return -cmp.Compare(*a.WorstRatio, *b.WorstRatio)
	}
	if c := cmp.Compare(b.Counts[Incendive], a.Counts[Incendive]); c != 0 {
		return c
	}
	if c := cmp.Compare(b.Counts[Marginal], a.Counts[Marginal]); c != 0 {
		return c
	}
	return cmp.Compare(a.Station.ID, b.Station.ID)
}

// orderFindings collects every object's findings ordered by severity (incendive
// first), then the station's rank, then the object's survey order, then check order.
func orderFindings(objs []ObjectResult, stations []StationResult) []Finding {
	rank := map[string]int{}
	for _, s := range stations {
		rank[s.Station.ID] = s.Rank
	}
	type keyed struct {
		f        Finding
		obj, seq int
	}
	var all []keyed
	for i := range objs {
		for j, f := range objs[i].Findings {
			all = append(all, keyed{f, i, j})
		}
	}
	slices.SortStableFunc(all, func(a, b keyed) int {
		if c := cmp.Compare(b.f.Severity.Severity(), a.f.Severity.Severity()); c != 0 {
			return c
		}
		if c := cmp.Compare(rank[a.f.StationID], rank[b.f.StationID]); c != 0 {
			return c
		}
		if c := cmp.Compare(a.obj, b.obj); c != 0 {
			return c
		}
		return cmp.Compare(a.seq, b.seq)
	})
	if len(all) == 0 {
		return nil
	}
	out := make([]Finding, len(all))
	for i := range all {
		out[i] = all[i].f
	}
	return out
}

// markRejected counts on each station the rejected Objects rows whose Station
// was readable: the verdict and rank stand for what was assessed, the mark
// (StationResult.IncompleteText) says what is missing.
func markRejected(stations []StationResult, s *inventory.Survey) {
	if s == nil {
		return
	}
	index := make(map[string]int, len(stations))
	for i := range stations {
		stations[i].RejectedRows = 0
		index[stations[i].Station.ID] = i
	}
	for _, r := range s.Rejected {
		if r.Sheet != inventory.SheetObjects || r.Station == "" {
			continue
		}
		if j, ok := index[r.Station]; ok {
			stations[j].RejectedRows++
		}
	}
}
