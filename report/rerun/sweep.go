package rerun

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
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
	Rank       int // the station's rank at this step (1 = worst)
	// WorstRatioAssumed: the worst ratio rests on an assumed resistance to
	// earth (assess.StationResult.WorstRatioAssumed): at least 1, its size no figure.
	WorstRatioAssumed bool
	RejectedRows      int // Objects rows naming the station rejected: incomplete
}

// ClearanceCause says, typed, why a station clears where it does or never does.
type ClearanceCause int

// Clearance causes.
const (
	// ClearsAlways: non-incendive over the whole range.
	ClearsAlways ClearanceCause = iota
	// ClearsFrom: non-incendive from ClearsAt on.
	ClearsFrom
	// NeverHumidity: still a hazard at the highest step, and the physics (not a
	// missing input) keeps it there: humidity alone does not clear it.
	NeverHumidity
	// NeverMissingInput: not non-incendive at the highest step because an input
	// the model needs is missing (not assessed) or assumed the stricter case (an
	// unmeasured resistance to earth): humidity cannot clear what is not known.
	NeverMissingInput
	// NeverReading: a reading on a row (a field or potential above its screen)
	// keeps the hazard: a reading stays as measured whatever the RH.
	NeverReading
	// HeldAtOwnRH: the station gives its own RH and was kept at it (not swept).
	HeldAtOwnRH
)

// Code is the cause's stable code for the JSON.
func (c ClearanceCause) Code() string {
	switch c {
	case ClearsAlways:
		return "always"
	case ClearsFrom:
		return "clears"
	case NeverHumidity:
		return "humidity does not clear"
	case NeverMissingInput:
		return "missing input"
	case NeverReading:
		return "reading holds"
	case HeldAtOwnRH:
		return "own rh kept"
	}
	return "unknown"
}

// StationClearance says from which RH on a station is non-incendive.
type StationClearance struct {
	ID, Name string
	// ClearsAt is the lowest step RH from which on every higher step is
	// non-incendive; NaN when the station is not non-incendive at the last step.
	ClearsAt float64
	// Always: the station is non-incendive over the whole range.
	Always bool
	Cause  ClearanceCause
	// Missing names the inputs that keep the station from non-incendive at the
	// highest step ("MIX-DRUM: resistance to earth not measured"), when an
	// input is the cause (alone or beside the physics).
	Missing []string
	// SetBy is the object that sets the station's worst verdict and ratio at
	// the highest step (or at its own RH when held): the cause is its.
	SetBy string
	// Readings names the rows whose reading holds the hazard.
	Readings []string
	Text     string // the sentence a report shows
}

// HeldStation is a station that gives its own RH and was kept at it.
type HeldStation struct {
	ID, Name string
	RH       float64 // %
}

// SweepOptions choose how the sweep sets the humidity.
type SweepOptions struct {
	// AllStations sets the swept RH at every station too, overriding a
	// station's own RH (a dryer exit kept at 20 % is then swept with the rest).
	// By default a station with its own RH keeps it: only the site RH (and so
	// the stations that give none) is swept.
	AllStations bool
}

// Sweep is a survey assessed over a range of relative humidities.
type Sweep struct {
	Survey      *inventory.Survey
	AllStations bool
	Held        []HeldStation // stations kept at their own RH, survey order (none with AllStations)
	Steps       []SweepStep
	Clearances  []StationClearance // survey station order
	// Warnings: swept RH values likely meant otherwise (below 1 %, a fraction
	// of 1 meant as a percentage: inventory.LowRHWarning), as check warns
	// for an RH cell; the sweep runs them as given.
	Warnings []string
}

// ParseRange reads "FROM:TO:STEP" in %RH (e.g. "10:90:5") into the list of RH
// values, TO included when the steps land on it; a single number is one step.
// Each part is read by the survey's cell grammar (inventory.ParseQuantity in
// %RH: "40 %", "40%RH", a decimal comma "2,5"), as a Site RH cell would be.
func ParseRange(s string) ([]float64, error) {
	parts := strings.Split(strings.TrimSpace(s), ":")
	num := func(t string, what string) (float64, error) {
		p, err := inventory.ParseQuantity(t, "%", inventory.Percent)
		if err != nil || !p.Known {
			why := fmt.Sprintf("%q is not a number", strings.TrimSpace(t))
			var qe *inventory.QuantityError
			if errors.As(err, &qe) {
				why = qe.DescribeFor("--rh's " + what)
			}
			return 0, fmt.Errorf("--rh %q: %s; write FROM:TO:STEP in %%RH, e.g. 10:90:5", s, why)
		}
		return p.Value, nil
	}
	rh := func(t, what string) (float64, error) {
		v, err := num(t, what)
		if err != nil {
			return 0, err
		}
		if v < 0 || v > 100 {
			return 0, fmt.Errorf("--rh %q: %s %% is not a relative humidity (0-100)", s, strings.TrimSpace(t))
		}
		return v, nil
	}
	switch len(parts) {
	case 1:
		v, err := rh(parts[0], "value")
		if err != nil {
			return nil, err
		}
		return []float64{v}, nil
	case 3:
	default:
		return nil, fmt.Errorf("--rh %q: write FROM:TO:STEP in %%RH, e.g. 10:90:5", s)
	}
	from, err := rh(parts[0], "FROM")
	if err != nil {
		return nil, err
	}
	to, err := rh(parts[1], "TO")
	if err != nil {
		return nil, err
	}
	step, err := num(parts[2], "STEP")
	if err != nil {
		return nil, err
	}
	if !(step > 0) {
		return nil, fmt.Errorf("--rh %q: the step %q must be a number above 0", s, strings.TrimSpace(parts[2]))
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

// RunSweep assesses s once per RH value set as the site RH. A station that
// gives its own RH keeps it (listed in Sweep.Held) unless o.AllStations, which
// sets the value at every station too. s is not modified.
func RunSweep(s *inventory.Survey, rh []float64, o SweepOptions) *Sweep {
	sw := &Sweep{Survey: s, AllStations: o.AllStations}
	if !o.AllStations {
		for _, st := range s.Stations {
			if st.RelativeHumidity.Known {
				sw.Held = append(sw.Held, HeldStation{ID: st.ID, Name: st.Name, RH: st.RelativeHumidity.Value})
			}
		}
	}
	// A range wholly below 1 % reads as fractions of 1 ("0.2:0.8:0.1"); a
	// fine step from 0 up to a real RH ("0:90:0.5") does not.
	if top := slices.Max(append([]float64{0}, rh...)); top > 0 {
		if msg, fix := inventory.LowRHWarning(top); msg != "" {
			sw.Warnings = append(sw.Warnings, fmt.Sprintf("--rh up to %s %%: %s; %s", fmtSig(top), msg, fix))
		}
	}
	var last *assess.Audit
	for _, v := range rh {
		c := stepSurvey(s, v, o)
		a := assess.Assess(c, assess.Options{Limits: Limits(c)})
		step := SweepStep{RH: v, Incendive: a.Counts[assess.Incendive], Marginal: a.Counts[assess.Marginal]}
		byID := map[string]*assess.StationResult{}
		for i := range a.Stations {
			byID[a.Stations[i].Station.ID] = &a.Stations[i]
		}
		for _, id := range sweepStationIDs(s, a) {
			x := SweepStation{ID: id, Verdict: assess.NotAssessed}
			if st := byID[id]; st != nil {
				x.Verdict, x.WorstRatio, x.Rank = st.Verdict, st.WorstRatio, st.Rank
				x.WorstRatioAssumed, x.RejectedRows = st.WorstRatioAssumed, st.RejectedRows
			}
			step.Stations = append(step.Stations, x)
		}
		sw.Steps = append(sw.Steps, step)
		last = a
	}
	sw.Clearances = clearances(s, sw.Steps, last, sw.Held)
	return sw
}

// stepSurvey is the copy of s one sweep step assesses: v as the site RH, and
// at every station too with o.AllStations.
func stepSurvey(s *inventory.Survey, v float64, o SweepOptions) *inventory.Survey {
	c := CloneSurvey(s)
	c.Site.RelativeHumidity = inventory.Known(v)
	if o.AllStations {
		for i := range c.Stations {
			c.Stations[i].RelativeHumidity = inventory.Known(v)
		}
	}
	return c
}

// Top returns the indexes (into a step's Stations) of the n worst stations by
// their rank at the lowest RH step, in survey order; every station when n <= 0
// or n covers them all.
func (sw *Sweep) Top(n int) []int {
	if len(sw.Steps) == 0 {
		return nil
	}
	st := sw.Steps[0].Stations
	idx := make([]int, len(st))
	for i := range idx {
		idx[i] = i
	}
	if n <= 0 || n >= len(st) {
		return idx
	}
	rank := func(i int) int {
		if st[i].Rank == 0 {
			return math.MaxInt
		}
		return st[i].Rank
	}
	sort.SliceStable(idx, func(a, b int) bool { return rank(idx[a]) < rank(idx[b]) })
	idx = idx[:n]
	sort.Ints(idx)
	return idx
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

func clearances(s *inventory.Survey, steps []SweepStep, last *assess.Audit, held []HeldStation) []StationClearance {
	if len(steps) == 0 {
		return nil
	}
	own := map[string]float64{}
	for _, h := range held {
		own[h.ID] = h.RH
	}
	var out []StationClearance
	lastStep := steps[len(steps)-1]
	for j, st := range lastStep.Stations {
		c := StationClearance{ID: st.ID, ClearsAt: math.NaN()}
		if x, ok := s.Station(st.ID); ok {
			c.Name = x.Name
		}
		if rh, ok := own[st.ID]; ok {
			c.Cause = HeldAtOwnRH
			c.Always = st.Verdict == assess.NonIncendive
			c.Text = fmt.Sprintf("held at its own RH %s %% (not swept; --all-stations sweeps it too): %s", fmtSig(rh), st.Verdict)
			if st.WorstRatio != nil {
				c.Text += fmt.Sprintf(" (worst ratio %s)", sigOrAssumed(*st.WorstRatio, st.WorstRatioAssumed))
			}
			if st.Verdict != assess.NonIncendive {
				sc := stationCauses(last, st.ID)
				c.SetBy, c.Missing, c.Readings = sc.SetBy, sc.Missing(), sc.Readings
				c.Text += "; " + sc.words()
			}
			out = append(out, c)
			continue
		}
		k := len(steps)
		for k > 0 && steps[k-1].Stations[j].Verdict == assess.NonIncendive {
			k--
		}
		switch {
		case k == 0:
			c.Always, c.ClearsAt, c.Cause = true, steps[0].RH, ClearsAlways
			c.Text = fmt.Sprintf("non-incendive over the whole range (%s-%s %% RH)", fmtSig(steps[0].RH), fmtSig(lastStep.RH))
		case k == len(steps):
			sc := stationCauses(last, st.ID)
			c.SetBy, c.Missing, c.Readings, c.Cause = sc.SetBy, sc.Missing(), sc.Readings, sc.Cause
			still := fmt.Sprintf("still %s at %s %% RH", st.Verdict, fmtSig(lastStep.RH))
			if st.WorstRatio != nil {
				still += fmt.Sprintf(" (worst ratio %s)", sigOrAssumed(*st.WorstRatio, st.WorstRatioAssumed))
			}
			switch c.Cause {
			case NeverMissingInput:
				c.Text = "never non-incendive over the range because an input is missing, not because of humidity: " + sc.words() + "; " + still
				if len(sc.Physics) > 0 {
					c.Text = "never non-incendive over the range; the worst ratio rests on a missing input: " + sc.words() + "; " + still
				}
			case NeverReading:
				c.Text = fmt.Sprintf("a measured reading holds the hazard at every RH (%s): take a new reading at the new RH; %s; %s", firstFew(c.Readings), sc.words(), still)
			default:
				c.Text = "humidity alone never gets it there: " + sc.words() + "; " + still
			}
		default:
			c.ClearsAt, c.Cause = steps[k].RH, ClearsFrom
			c.Text = fmt.Sprintf("non-incendive from %s %% RH on (still %s at %s %%)", fmtSig(steps[k].RH), steps[k-1].Stations[j].Verdict, fmtSig(steps[k-1].RH))
		}
		out = append(out, c)
	}
	return out
}

// stationCause is what keeps a station from non-incendive at the highest
// step: the object that sets its worst verdict and ratio (SetBy), the inputs
// missing or assumed on that object (SetMissing) and on the station's other
// rows (Also), the rows whose reading holds a hazard, the other rows the
// physics keeps a hazard (Physics), and the cause, taken from the setter.
type stationCause struct {
	SetBy      string
	SetText    string // what sets it: "spark, ratio 25; not earthed (resistance to earth 1.0e+11 Ω measured)"
	SetMissing []string
	Also       []string
	Readings   []string
	Physics    []string
	Cause      ClearanceCause
}

// Missing is every missing input, the setter's first ("ID: input").
func (c stationCause) Missing() []string {
	return append(append([]string(nil), c.SetMissing...), c.Also...)
}

// stationCauses says what keeps a station from non-incendive in audit a (the
// highest step). The cause is the setter's, the object with the station's
// worst verdict and, among those, the highest ratio (first in survey order on
// a tie): NeverMissingInput when its verdict rests on a missing input or an
// assumed (unmeasured) resistance to earth or charging current, NeverReading when its reading
// holds the hazard, else NeverHumidity. The other rows' missing inputs are
// listed as also missing.
func stationCauses(a *assess.Audit, station string) stationCause {
	out := stationCause{Cause: NeverHumidity}
	if a == nil {
		return out
	}
	var setter *assess.ObjectResult
	for i := range a.Objects {
		r := &a.Objects[i]
		if r.Station.ID != station || r.Verdict == assess.NonIncendive {
			continue
		}
		if setter == nil || worseRow(r, setter) {
			setter = r
		}
	}
	if setter == nil {
		return out
	}
	out.SetBy = setter.Object.ID
	for i := range a.Objects {
		r := &a.Objects[i]
		if r.Station.ID != station || r.Verdict == assess.NonIncendive {
			continue
		}
		miss, cause := rowCause(r)
		if r == setter {
			out.SetMissing, out.Cause = miss, cause
			out.SetText = setterText(r)
			if cause == NeverReading {
				out.Readings = append(out.Readings, r.Object.ID)
			}
			continue
		}
		out.Also = append(out.Also, miss...)
		switch cause {
		case NeverReading:
			out.Readings = append(out.Readings, r.Object.ID)
		case NeverHumidity:
			out.Physics = append(out.Physics, fmt.Sprintf("%s (%s)", r.Object.ID, r.Verdict))
		}
	}
	return out
}

// words says it in a line: the setter and its cause first, then what else
// is missing and what else the physics keeps a hazard.
func (c stationCause) words() string {
	if c.SetBy == "" {
		return "no row sets it"
	}
	t := fmt.Sprintf("set by %s (%s)", c.SetBy, c.SetText)
	also := c.Also
	switch {
	case c.Cause == NeverHumidity:
		// The physics sets it: the setter's own missing inputs are beside it.
		also = c.Missing()
	case len(c.SetMissing) > 0:
		t += ": " + byInput(c.SetMissing)
	}
	if len(also) > 0 {
		t += "; also missing: " + byInput(also)
	}
	if len(c.Physics) > 0 {
		shown := c.Physics
		more := ""
		if len(shown) > 3 {
			shown, more = shown[:3], fmt.Sprintf(" and %d more", len(c.Physics)-3)
		}
		t += "; also still a hazard: " + strings.Join(shown, ", ") + more
	}
	return t
}

// worseRow: r sets a worse station result than b: a more severe verdict, or
// the same verdict with a higher ratio (a row with no ratio lowest).
func worseRow(r, b *assess.ObjectResult) bool {
	if r.Verdict.Severity() != b.Verdict.Severity() {
		return r.Verdict.Severity() > b.Verdict.Severity()
	}
	if r.Ratio == nil {
		return false
	}
	return b.Ratio == nil || *r.Ratio > *b.Ratio
}

// rowCause says, from the row's typed result, why a row that is not
// non-incendive stays so: its missing or assumed inputs ("ID: input") and the
// cause it gives the station were it the setter.
func rowCause(r *assess.ObjectResult) ([]string, ClearanceCause) {
	id := r.Object.ID
	var miss []string
	for _, t := range r.Eval.NotAssessed.Texts() {
		miss = append(miss, id+": "+t)
	}
	if r.Atmosphere != nil && !r.Atmosphere.MIE.Known {
		miss = append(miss, fmt.Sprintf("%s: the MIE of atmosphere %s is not given", id, r.Atmosphere.ID))
	}
	switch {
	case r.Verdict == assess.NotAssessed:
		if len(miss) == 0 {
			miss = append(miss, id+": "+strings.TrimSuffix(r.Reason, "."))
		}
		return miss, NeverMissingInput
	case r.RatioAssumed() && assess.AssumedCurrentDominates(&r.Eval, r.Eval.Effective):
		// The resistance may be measured: what was assumed is the charging
		// current (model.FlagAssumedCurrent), so that is what to measure.
		return append([]string{id + ": charging current / potential in operation not measured (assumed the worst-case charging current, the stricter case)"}, miss...), NeverMissingInput
	case r.RatioAssumed():
		return append([]string{id + ": resistance to earth not measured (assumed no leakage, the stricter case)"}, miss...), NeverMissingInput
	case r.Eval.IsolatedConductor && math.IsNaN(r.Input.Resistance):
		return append([]string{id + ": resistance to earth not measured (taken as not earthed, the stricter case)"}, miss...), NeverMissingInput
	case r.Eval.Flags&model.FlagHumidityContradiction != 0:
		return miss, NeverReading
	}
	return miss, NeverHumidity
}

// setterText says what the setter shows: its verdict, discharge and ratio,
// and a measured resistance to earth that leaves a conductor unearthed.
func setterText(r *assess.ObjectResult) string {
	t := r.Verdict.String()
	if r.Ratio != nil && r.Eval.Effective != model.NoDischarge {
		t += fmt.Sprintf(", %s, ratio %s", dischargeWords(r.Eval.Effective), sigOrAssumed(*r.Ratio, r.RatioAssumed()))
	} else if r.Ratio != nil {
		t += fmt.Sprintf(", ratio %s", sigOrAssumed(*r.Ratio, r.RatioAssumed()))
	}
	if x := r.Input.Resistance; !math.IsNaN(x) && !r.Eval.Earthed && isConductorSpark(r) {
		t += "; not earthed: resistance to earth " + strings.Replace(fmt.Sprintf("%.1e", x), "e+", "e", 1) + " Ω measured"
	}
	return t
}

// dischargeWords names a discharge type in words ("propagating brush").
func dischargeWords(d model.DischargeType) string { return strings.ReplaceAll(d.String(), "_", " ") }

// isConductorSpark: the row's effective discharge is a spark (a conductor's).
func isConductorSpark(r *assess.ObjectResult) bool { return r.Eval.Effective == model.Spark }

// byInput words "ID: input" entries grouped by input: "resistance to earth
// not measured (...) on BAY-1, BAY-2 and 3 more".
func byInput(items []string) string {
	var order []string
	ids := map[string][]string{}
	for _, it := range items {
		id, what, ok := strings.Cut(it, ": ")
		if !ok {
			id, what = "", it
		}
		if _, seen := ids[what]; !seen {
			order = append(order, what)
		}
		ids[what] = append(ids[what], id)
	}
	var parts []string
	for _, what := range order {
		list := ids[what]
		shown := list
		if len(list) > 3 {
			shown = list[:3]
		}
		p := what + " on " + strings.Join(shown, ", ")
		if len(list) > 3 {
			p += fmt.Sprintf(" and %d more", len(list)-3)
		}
		parts = append(parts, p)
	}
	return strings.Join(parts, "; ")
}

// firstFew joins up to three items and counts the rest ("a; b; c; and 4 more"):
// the JSON's lists hold them all.
func firstFew(items []string) string {
	if len(items) <= 3 {
		return strings.Join(items, "; ")
	}
	return strings.Join(items[:3], "; ") + fmt.Sprintf("; and %d more", len(items)-3)
}
