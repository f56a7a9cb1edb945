package rerun

import (
	"fmt"
	"math"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
)

// Outcome is what a change did to one object's or station's hazard. An object or
// station is a hazard when its verdict is incendive or marginal.
type Outcome string

// Outcomes of a rerun.
const (
	Cleared  Outcome = "cleared"  // a hazard before, none after
	Stayed   Outcome = "stayed"   // a hazard before and after
	Appeared Outcome = "appeared" // none before, a hazard after
	NoHazard Outcome = "no hazard"
	// Unjudged: not assessed after the changes (inputs the model needs are missing):
	// neither cleared nor safe.
	Unjudged Outcome = "not assessed"
)

// IsHazard reports whether a verdict counts as a hazard (incendive or marginal).
func IsHazard(v assess.Verdict) bool { return v == assess.Incendive || v == assess.Marginal }

// OutcomeOf classifies a before/after pair of verdicts.
func OutcomeOf(before, after assess.Verdict) Outcome {
	if after == assess.NotAssessed {
		return Unjudged
	}
	switch b, a := IsHazard(before), IsHazard(after); {
	case b && !a:
		return Cleared
	case b && a:
		return Stayed
	case !b && a:
		return Appeared
	}
	return NoHazard
}

// ObjectDelta is one object before and after the changes.
type ObjectDelta struct {
	ID, Station, Kind string
	Before, After     *assess.ObjectResult // nil only when the object is missing on that side
	Outcome           Outcome
	Changed           bool   // a change reached this row or its station
	Why               string // the physics of the difference, in words
	// Worse says, in a line, why a change made the row worse (a more severe
	// verdict, or a higher ratio), from its typed results before and after
	// ("REW-BELT: now dissipative at 55 % RH and not earthed: judged as an
	// isolated conductor; earth it"); "" when it is not worse.
	Worse string
	// Held says, for an object a change reached that is still a hazard after
	// it, that its result is held by a reading on its row which the change
	// cannot undo (the reading contradicts the model after the change:
	// model.FlagHumidityContradiction or model.FlagEarthingContradiction;
	// principle 1, a measurement beats a model): "held by its field reading of
	// 120 kV/m: re-measure after the change"; "" otherwise.
	Held string
}

// StationDelta is one station before and after the changes.
type StationDelta struct {
	ID, Name      string
	Before, After *assess.StationResult
	Outcome       Outcome
}

// Whatif is the before/after assessment of a survey under a set of changes.
type Whatif struct {
	Before, After *assess.Audit
	Applied       []Applied
	// Overridden are the Changes sheet rows a flag set again: not applied,
	// the flag wins (Change.OverriddenBy).
	Overridden []Change
	Objects    []ObjectDelta  // survey order
	Stations   []StationDelta // in the order of the ranking after the changes
	Moved      map[Outcome]int
}

// Limits returns the limits an assessment of s uses: the defaults with the Site
// sheet's overrides (the reader rejected the rows whose values cannot be used).
func Limits(s *inventory.Survey) model.Limits {
	return assess.LimitsFromSite(s.Site, model.DefaultLimits())
}

// Run assesses s, applies the changes to a deep copy and assesses it again.
// s is not modified.
// A change marked overridden (a Changes sheet row a flag sets again) is
// checked as the others but not applied, and listed in Whatif.Overridden.
func Run(s *inventory.Survey, changes []Change) (*Whatif, error) {
	before := assess.Assess(s, assess.Options{Limits: Limits(s)})
	var active, overridden []Change
	for _, c := range changes {
		if c.OverriddenBy != "" {
			// Checked all the same: a row in error is reported, not hidden by the flag.
			if _, err := apply(CloneSurvey(s), before, c); err != nil {
				return nil, err
			}
			overridden = append(overridden, c)
			continue
		}
		active = append(active, c)
	}
	changed, applied, err := Apply(s, before, active)
	if err != nil {
		return nil, err
	}
	after := assess.Assess(changed, assess.Options{Limits: Limits(changed)})
	w := Diff(before, after, applied)
	w.Overridden = overridden
	return w, nil
}

// OverriddenText says, in a line, that a sheet row is overridden by a flag.
func OverriddenText(c Change) string {
	t := c.Kind + " " + c.Value
	if c.Target != "" {
		t = c.Kind + " " + c.Target + "=" + c.Value
	}
	return fmt.Sprintf("%s (%s): not applied, overridden by the flag %s (a flag wins over a Changes sheet row that sets the same target)", t, c.Source, c.OverriddenBy)
}

// Diff pairs the objects and stations of two audits of the same survey.
func Diff(before, after *assess.Audit, applied []Applied) *Whatif {
	w := &Whatif{Before: before, After: after, Applied: applied, Moved: map[Outcome]int{Cleared: 0, Stayed: 0, Appeared: 0, NoHazard: 0, Unjudged: 0}}
	reached := map[string]bool{}
	rhStations := map[string]bool{}
	siteWideChange := false
	for _, a := range applied {
		for _, id := range a.Objects {
			reached[id] = true
		}
		for _, id := range a.Stations {
			rhStations[id] = true
		}
		if a.Kind == ChangeMargin {
			siteWideChange = true
		}
	}
	idx := map[string]int{}
	for i := range after.Objects {
		idx[after.Objects[i].Object.ID] = i
	}
	for i := range before.Objects {
		b := &before.Objects[i]
		d := ObjectDelta{ID: b.Object.ID, Station: b.Object.Station, Kind: b.Object.Kind, Before: b}
		if j, ok := idx[d.ID]; ok {
			d.After = &after.Objects[j]
			d.Outcome = OutcomeOf(b.Verdict, d.After.Verdict)
			d.Changed = reached[d.ID] || rhStations[d.Station] || siteWideChange
			d.Why = why(b, d.After, d.Changed)
			if d.Changed {
				d.Worse = worse(b, d.After)
				d.Held = heldByReading(b, d.After)
			}
		}
		w.Moved[d.Outcome]++
		w.Objects = append(w.Objects, d)
	}
	bst := map[string]*assess.StationResult{}
	for i := range before.Stations {
		bst[before.Stations[i].Station.ID] = &before.Stations[i]
	}
	for i := range after.Stations {
		a := &after.Stations[i]
		d := StationDelta{ID: a.Station.ID, Name: a.Station.Name, After: a, Before: bst[a.Station.ID]}
		if d.Before != nil {
			d.Outcome = OutcomeOf(d.Before.Verdict, a.Verdict)
		}
		w.Stations = append(w.Stations, d)
	}
	return w
}

// heldByReading says that a hazard after the changes is held by the reading
// on the row, which the change leaves in place (a field reading, or a surface
// potential the change did not drop), from typed results: the reading
// contradicts what the model gives after the change (the surface now leaks at
// the RH, or the earthing now drains it: model.FlagHumidityContradiction,
// model.FlagEarthingContradiction), or the change moved neither the verdict
// nor the ratio. The reading is kept (principle 1, a measurement beats a
// model), so only a new reading taken after the change can clear it. ""
// when the row is no hazard or holds no reading.
func heldByReading(b, a *assess.ObjectResult) string {
	if a == nil || !IsHazard(a.Verdict) {
		return ""
	}
	o := a.Object
	if !o.Field.Known && !o.SurfacePotential.Known {
		return ""
	}
	contradicts := a.Eval.Flags&(model.FlagHumidityContradiction|model.FlagEarthingContradiction) != 0
	unmoved := b != nil && b.Verdict == a.Verdict && ratioEq(b.Ratio, a.Ratio)
	if !contradicts && !unmoved {
		return ""
	}
	what := fmt.Sprintf("surface potential reading of %s kV", fmtSig(o.SurfacePotential.Value/1e3))
	if o.Field.Known {
		what = fmt.Sprintf("field reading of %s kV/m", fmtSig(o.Field.Value/1e3))
	}
	return fmt.Sprintf("held by its %s: re-measure after the change", what)
}

// why explains an object's before/after difference with the model's physics:
// for an RH change, whether the material's surface responds to humidity.
func why(b, a *assess.ObjectResult, changed bool) string {
	if !changed {
		return "not reached by any change: " + verdictPhrase(a)
	}
	var parts []string
	rhB, rhA := b.Environment.RelativeHumidity, a.Environment.RelativeHumidity
	if rhB != rhA {
		parts = append(parts, humidityPhrase(b, a))
	}
	if b.Object.SurfacePotential.Known && !a.Object.SurfacePotential.Known {
		parts = append(parts, fmt.Sprintf("the measured %s kV (taken with the old earthing) no longer applies", fmtSig(b.Object.SurfacePotential.Value/1e3)))
	}
	if rb, ra := b.Object.Resistance, a.Object.Resistance; rb != ra {
		parts = append(parts, fmt.Sprintf("resistance to earth %s → %s Ω%s", ohmText(rb), ohmText(ra), potentialPhrase(b, a)))
	}
	if b.Object.Material != a.Object.Material {
		parts = append(parts, fmt.Sprintf("material %s → %s", orNone(b.Object.Material), orNone(a.Object.Material)))
	}
	if b.Object.Speed != a.Object.Speed {
		parts = append(parts, fmt.Sprintf("speed %s → %s m/s", qText(b.Object.Speed, 1), qText(a.Object.Speed, 1)))
	}
	if b.Object.Conductivity != a.Object.Conductivity {
		parts = append(parts, fmt.Sprintf("conductivity %s → %s pS/m", qText(b.Object.Conductivity, 1e12), qText(a.Object.Conductivity, 1e12)))
	}
	if b.Object.BagType != a.Object.BagType {
		parts = append(parts, fmt.Sprintf("bag type %s → %s", orNone(b.Object.BagType), orNone(a.Object.BagType)))
	}
	if b.Object.Filling != a.Object.Filling {
		parts = append(parts, fmt.Sprintf("filling %s → %s", orNone(b.Object.Filling), orNone(a.Object.Filling)))
	}
	if b.Object.VesselMaterial != a.Object.VesselMaterial {
		parts = append(parts, fmt.Sprintf("vessel material %s → %s", orNone(b.Object.VesselMaterial), orNone(a.Object.VesselMaterial)))
	}
	if len(parts) == 0 && b.Verdict == a.Verdict && ratioEq(b.Ratio, a.Ratio) {
		parts = append(parts, "the change does not alter this row's result")
	}
	return strings.Join(parts, "; ") + ": " + verdictPhrase(a)
}

// worse says why the row got worse, from its typed results (empty when it
// did not): a surface that became an unearthed conductor (its resistivity
// now below the dissipative bound at this RH, or a conducting material on a
// row not earthed), a discharge of another type, a higher resistance to
// earth, else the ratio's move.
func worse(b, a *assess.ObjectResult) string {
	sb, sa := b.Verdict.Severity(), a.Verdict.Severity()
	up := sa > sb
	if sa == sb && a.Verdict != assess.NonIncendive && b.Ratio != nil && a.Ratio != nil && *a.Ratio > *b.Ratio*(1+1e-9) {
		up = true
	}
	if !up {
		return ""
	}
	id := a.Object.ID
	move := fmt.Sprintf("%s → %s", verdictPhrase(b), verdictPhrase(a))
	rb, ra := b.Object.Resistance, a.Object.Resistance
	switch {
	case a.Eval.IsolatedConductor && !b.Eval.IsolatedConductor:
		how := "now conducts"
		if x := a.Eval.SurfaceResistivity; !math.IsNaN(x) {
			how = fmt.Sprintf("now %s (%s Ω/sq)", resistivityClass(x), fmtSig(x))
		}
		if b.Object.Material != a.Object.Material {
			how = fmt.Sprintf("the new material %s is %s", orNone(a.Object.Material), strings.TrimPrefix(how, "now "))
		} else if b.Environment.RelativeHumidity != a.Environment.RelativeHumidity {
			how += fmt.Sprintf(" at %s %% RH", fmtSig(a.Environment.RelativeHumidity))
		}
		return fmt.Sprintf("%s: %s and not earthed: judged as an isolated conductor that can spark; earth it (%s)", id, how, move)
	case a.Eval.Effective != b.Eval.Effective && a.Eval.Effective != model.NoDischarge && b.Eval.Effective != model.NoDischarge:
		return fmt.Sprintf("%s: its worst discharge is now a %s (was a %s) (%s)", id, dischargeWords(a.Eval.Effective), dischargeWords(b.Eval.Effective), move)
	case ra.Known && (!rb.Known || ra.Value > rb.Value) && ra != rb:
		return fmt.Sprintf("%s: resistance to earth %s → %s Ω leaks less charge (%s)", id, ohmText(rb), ohmText(ra), move)
	}
	return fmt.Sprintf("%s: worse after the change (%s)", id, move)
}

// resistivityClass names a surface resistivity's class: conductive below
// 1e5 Ω/sq, dissipative below 1e12 Ω/sq, insulating above (the classes of
// the built-in materials, inventory/library.go; IEC TS 60079-32-1).
func resistivityClass(x float64) string {
	switch {
	case x < 1e5:
		return "conductive"
	case x < 1e12:
		return "dissipative"
	}
	return "insulating"
}

// humidityPhrase says how the row's material responds to an RH change, from its
// humidity slope: only surfaces whose resistivity responds change the result.
func humidityPhrase(b, a *assess.ObjectResult) string {
	from, rh := fmtSig(b.Environment.RelativeHumidity), fmtSig(a.Environment.RelativeHumidity)
	same := ratioEq(b.Ratio, a.Ratio) && b.Verdict == a.Verdict
	m := a.Material
	switch {
	case m == nil:
		return fmt.Sprintf("RH %s → %s %%: the row gives no material, so humidity does not enter its result", from, rh)
	case strings.EqualFold(m.Class, inventory.ClassConductive):
		return fmt.Sprintf("RH %s → %s %%: %s is a conductor, humidity does not change its charge or its discharge", from, rh, m.Name)
	case m.HumiditySlope <= 0 || math.IsNaN(m.SurfaceResistivity):
		if same {
			return fmt.Sprintf("%s surface does not respond to humidity: %s unchanged at %s %%", m.Name, hazardName(b), rh)
		}
		return fmt.Sprintf("%s surface does not respond to humidity (slope 0), RH %s → %s %%", m.Name, from, rh)
	}
	s := fmt.Sprintf("%s surface resistivity %s → %s Ω/sq from %s to %s %% RH (%s decade(s) per 10 %%RH)",
		m.Name, fmtSig(b.Eval.SurfaceResistivity), fmtSig(a.Eval.SurfaceResistivity), from, rh, fmtSig(m.HumiditySlope))
	switch {
	case a.Eval.Flags&model.FlagHumidityContradiction != 0:
		s += "; the reading above the screen stays as measured, so its hazard stays (take a new reading at this RH)"
	case a.Eval.IsolatedConductor && !b.Eval.IsolatedConductor:
		s += "; the surface is now dissipative but not earthed, so it is assessed as an isolated conductor that can spark"
	}
	return s
}

// hazardName names what stays the same: "brush hazard", "spark hazard", "result".
func hazardName(r *assess.ObjectResult) string {
	switch r.Eval.Effective {
	case model.NoDischarge:
		return "result"
	case model.PropagatingBrush:
		return "propagating brush hazard"
	}
	return r.Eval.Effective.String() + " hazard"
}

func potentialPhrase(b, a *assess.ObjectResult) string {
	pb, pa := b.Eval.Potential, a.Eval.Potential
	if math.IsNaN(pb) || math.IsNaN(pa) || pb == pa {
		return ""
	}
	return fmt.Sprintf(", potential %s → %s V, stored energy %s → %s mJ", fmtSig(pb), fmtSig(pa), fmtSig(b.Eval.StoredEnergy*1e3), fmtSig(a.Eval.StoredEnergy*1e3))
}

func verdictPhrase(r *assess.ObjectResult) string {
	s := r.Verdict.String()
	if r.Ratio != nil {
		s += ", ratio " + fmtSig(*r.Ratio)
	}
	return s
}

func ratioEq(a, b *float64) bool {
	if a == nil || b == nil {
		return a == nil && b == nil
	}
	return *a == *b || math.Abs(*a-*b) <= 1e-12*math.Max(math.Abs(*a), math.Abs(*b))
}

func ohmText(q inventory.Quantity) string {
	if !q.Known {
		return "not measured"
	}
	return fmtSig(q.Value)
}

func qText(q inventory.Quantity, scale float64) string {
	if !q.Known {
		return "not given"
	}
	return fmtSig(q.Value * scale)
}

func orNone(s string) string {
	if s == "" {
		return "not given"
	}
	return s
}

// fmtSig is v to 3 significant digits without trailing zeros (book.FormatSigTrim).
func fmtSig(v float64) string { return book.FormatSigTrim(v, 3) }
