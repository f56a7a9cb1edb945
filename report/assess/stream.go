package assess

import (
	"math"
	"runtime"
	"slices"
	"sort"
	"sync"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// Streamer assesses a survey's objects batch by batch, as they are read, and
// keeps only what grows with the stations and findings: the station
// aggregates (counts, worst ratio, the object IDs at each station), the
// findings, the defaults applied and, when sampling, each station's
// probability that no object is incendive. It is the one assessment engine:
// Assess is the Streamer with every result collected, and the streaming
// pipeline hands each batch's results to the writers instead, for surveys too
// large to hold every ObjectResult.
//
// Use: NewStreamer with the survey as far as it is known before its objects
// (Site, Atmospheres, Stations, Materials: what inventory.StreamFile gives its
// begin callback), Add for each batch of objects in survey order, Finish once.
type Streamer struct {
	a       *Audit
	ctx     objectContext
	tab     [NumUncertainInputs]Uncertainty
	workers int
	samp    []*sampler

	index    map[string]int // station ID -> position in stations
	stations []StationResult
	findings []Finding
	findObj  []uint32           // per finding: the object's position in the survey
	findSeq  []uint8            // per finding: its position among the object's findings
	none     map[string]float64 // per station: probability that no object is incendive
	seen     int                // objects assessed so far
	results  []ObjectResult
	// mainRatio is, per station (as stations before Finish), the ratio of the
	// object whose reason is the station's main reason.
	mainRatio []float64
	// mitigations holds one copy of each mitigation text: findings repeat a
	// few dozen texts, some built per finding.
	mitigations map[string]string
}

// findingOrder sorts findings in place by a packed key: severity (most
// severe first), station rank, object position, position among the object's
// findings (no copy of the findings is made, which matters for a million objects).
type findingOrder struct {
	keys []uint64
	f    []Finding
}

func (o findingOrder) Len() int           { return len(o.keys) }
func (o findingOrder) Less(i, j int) bool { return o.keys[i] < o.keys[j] }
func (o findingOrder) Swap(i, j int) {
	o.keys[i], o.keys[j] = o.keys[j], o.keys[i]
	o.f[i], o.f[j] = o.f[j], o.f[i]
}

// NewStreamer prepares the assessment of survey s with opts, as Assess does
// (limits from the Site sheet when opts.Limits is zero; with Samples > 0 the
// seed and uncertainty table resolved and recorded in the audit's Options).
func NewStreamer(s *inventory.Survey, opts Options) *Streamer {
	a, ctx := prepare(s, opts)
	if a.Options.Samples > 0 {
		if a.Options.Seed == 0 {
			a.Options.Seed = DefaultSeed
		}
		if a.Options.Uncertainties == nil {
			a.Options.Uncertainties = UncertaintiesFromSite(s.Site, DefaultUncertainties())
		}
	}
	st := &Streamer{a: a, ctx: ctx, index: map[string]int{}, none: map[string]float64{}, mitigations: map[string]string{}}
	st.tab = uncertaintyTable(a.Options.Uncertainties)
	st.workers = a.Options.Workers
	if st.workers <= 0 {
		st.workers = runtime.GOMAXPROCS(0)
	}
	for _, sta := range s.Stations {
		sr := StationResult{Station: sta, Verdict: NotAssessed, Counts: zeroCounts()}
		if at, ok := s.Atmosphere(sta.Atmosphere); ok && sta.Atmosphere != "" {
			sr.Atmosphere = &at
		}
		st.index[sta.ID] = len(st.stations)
		st.stations = append(st.stations, sr)
		st.mainRatio = append(st.mainRatio, math.Inf(-1))
	}
	return st
}

// Options returns the options the assessment runs with (resolved as Audit.Options).
func (st *Streamer) Options() Options { return st.a.Options }

// Add assesses a batch of objects (the next ones in survey order) and returns
// their results, with their Probability when sampling (the Monte Carlo runs
// on the batch with Options.Workers goroutines). The slice returned is reused
// by the next call: copy what must outlive it.
func (st *Streamer) Add(objs []inventory.Object) []ObjectResult {
	st.results = slices.Grow(st.results[:0], len(objs))[:len(objs)]
	for i := range objs {
		st.results[i] = st.ctx.assess(&objs[i])
	}
	if st.a.Options.Samples > 0 && len(objs) > 0 {
		st.sample(st.results)
	}
	for i := range st.results {
		st.aggregate(&st.results[i])
	}
	return st.results
}

// sample fills the Probability of every result of the batch.
func (st *Streamer) sample(rs []ObjectResult) {
	opts := &st.a.Options
	w := min(st.workers, len(rs))
	for len(st.samp) < w {
		st.samp = append(st.samp, newSampler(opts.Seed, opts.Samples, &opts.Limits, st.ctx.margin, &st.tab, st.a.Survey.Site.RelativeHumidity))
	}
	probs := make([]Probability, len(rs))
	var wg sync.WaitGroup
	for k := 0; k < w; k++ {
		wg.Add(1)
		go func(s *sampler) {
			defer wg.Done()
			for i := k; i < len(rs); i += w {
				probs[i] = s.object(&rs[i])
			}
		}(st.samp[k])
	}
	wg.Wait()
	for i := range rs {
		rs[i].Probability = &probs[i]
	}
}

// aggregate adds one result to the station aggregates, findings, counts and defaults.
func (st *Streamer) aggregate(o *ObjectResult) {
	a := st.a
	a.Counts[o.Verdict]++
	j, ok := st.index[o.Station.ID]
	if !ok {
		j = len(st.stations)
		st.index[o.Station.ID] = j
		st.stations = append(st.stations, StationResult{Station: o.Station, Verdict: NotAssessed, Counts: zeroCounts()})
		st.mainRatio = append(st.mainRatio, math.Inf(-1))
	}
	sr := &st.stations[j]
	// The main reason is the worst object's of the station's verdict: the
	// first with the highest ratio (none counts as below any ratio).
	ratio := math.Inf(-1)
	if o.Ratio != nil && !math.IsNaN(*o.Ratio) {
		ratio = *o.Ratio
	}
	switch {
	case len(sr.Objects) == 0 || o.Verdict.Severity() > sr.Verdict.Severity():
		sr.Verdict = o.Verdict
		sr.Main = mainReason(o)
		st.mainRatio[j] = ratio
	case o.Verdict == sr.Verdict && ratio > st.mainRatio[j]:
		sr.Main = mainReason(o)
		st.mainRatio[j] = ratio
	}
	sr.Objects = append(sr.Objects, o.Object.ID)
	sr.Counts[o.Verdict]++
	if o.Ratio != nil && (sr.WorstRatio == nil || *o.Ratio > *sr.WorstRatio) {
		r := *o.Ratio
		sr.WorstRatio = &r
		sr.WorstRatioAssumed = o.RatioAssumed()
	}
	for k, f := range o.Findings {
		if m, ok := st.mitigations[f.Mitigation]; ok {
			f.Mitigation = m
		} else {
			st.mitigations[f.Mitigation] = f.Mitigation
		}
		st.findings = append(st.findings, f)
		st.findObj = append(st.findObj, uint32(st.seen))
		st.findSeq = append(st.findSeq, uint8(k))
	}
	if p := o.Probability; p != nil {
		id := o.Object.Station
		if _, ok := st.none[id]; !ok {
			st.none[id] = 1
		}
		st.none[id] *= 1 - p.Incendive
	}
	a.MethodDefaults = mergeDefaults(a.MethodDefaults, o.Marks)
	if o.Borderline() {
		a.Borderline = append(a.Borderline, BorderlineObject{o.Object.ID, o.Object.Station, o.Verdict, *o.Probability, o.MeasureText()})
	}
	st.seen++
}

// mainReason is the reason an object gives its station's verdict: its first
// finding of the object's own severity (findings are in check order), else
// its one-sentence reason.
func mainReason(o *ObjectResult) MainReason {
	for _, f := range o.Findings {
		if f.Severity == o.Verdict {
			return MainReason{ObjectID: o.Object.ID, Check: f.Check, Text: f.Message}
		}
	}
	return MainReason{ObjectID: o.Object.ID, Text: o.Reason}
}

// mergeDefaults adds ds to the method defaults as methodDefaults does.
func mergeDefaults(out, ds []Mark) []Mark {
	for _, d := range ds {
		if !d.Prov.IsDefault() {
			continue // a measured or entered value is no default
		}
		found := false
		for j := range out {
			if out[j].Label == d.Label && out[j].Prov == d.Prov && out[j].Reason == d.Reason {
				if out[j].Value != d.Value {
					out[j].Value = "per object (see Objects)"
				}
				found = true
				break
			}
		}
		if !found {
			out = append(out, d)
		}
	}
	return out
}

// Objects returns the number of objects assessed so far.
func (st *Streamer) Objects() int { return st.seen }

// Finish ranks the stations, orders the findings and returns the audit: the
// same as Assess's, except that Objects is nil (each result was handed out by
// Add) and Survey is the survey given to NewStreamer (pass the completed one,
// with its final Problems and Counts, by setting Audit.Survey). The Streamer
// is not to be used afterwards.
func (st *Streamer) Finish() *Audit {
	a := st.a
	markRejected(st.stations, a.Survey)
	slices.SortStableFunc(st.stations, compareStations)
	for i := range st.stations {
		st.stations[i].Rank = i + 1
	}
	a.Stations = st.stations
	if a.Options.Samples > 0 {
		for k := range a.Stations {
			s := &a.Stations[k]
			q, ok := st.none[s.Station.ID]
			if !ok {
				q = 1
			}
			any := 1 - q
			s.ProbabilityAnyIncendive = &any
		}
	}
	rank := make(map[string]int, len(a.Stations))
	for _, s := range a.Stations {
		rank[s.Station.ID] = s.Rank
	}
	// Key: 2 bits severity (3 - Severity, so the most severe sorts first),
	// 24 bits station rank, 30 bits object position, 8 bits finding position.
	keys := make([]uint64, len(st.findings))
	for i := range st.findings {
		f := &st.findings[i]
		keys[i] = uint64(3-min(f.Severity.Severity(), 3))<<62 | uint64(rank[f.StationID]&(1<<24-1))<<38 |
			uint64(st.findObj[i]&(1<<30-1))<<8 | uint64(st.findSeq[i])
	}
	sort.Sort(findingOrder{keys, st.findings})
	if len(st.findings) > 0 {
		a.Findings = st.findings
	}
	st.findings, st.findObj, st.findSeq = nil, nil, nil
	return a
}
