package assess

import (
	"cmp"

	"github.com/sparkmargin/sparkmargin/inventory"
)

func zeroCounts() map[Verdict]int {
	return map[Verdict]int{Incendive: 0, Marginal: 0, NotAssessed: 0, NonIncendive: 0}
}

// compareStations orders two stations, worst first: by worst ratio (stations
// with no ratio after those with one), ties by the number of incendive
// objects, then of marginal objects (more first), then by station ID. A
// station's verdict is its worst object's by Verdict.Severity; a station with
// no objects is still listed, as not assessed with no ratio. Objects whose
// station is not on the Stations sheet get a station entry of their own, so
// none is lost.
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
