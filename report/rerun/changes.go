package rerun

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// Change codes, the same as the whatif flags without dashes and the Change column
// of the survey's Changes sheet (inventory.ChangeKinds).
const (
	ChangeRH           = "rh"
	ChangeStationRH    = "station-rh"
	ChangeEarth        = "earth"
	ChangeMaterial     = "material"
	ChangeFootwear     = "footwear"
	ChangeMargin       = "margin"
	ChangeSpeed        = "speed"
	ChangeConductivity = "conductivity"
	ChangeBagType      = "bag-type"
	// Liquid transfer (appended with the operation-by-operation liquid rules).
	ChangeFilling        = "filling"
	ChangeVesselMaterial = "vessel-material"
)

// Sentinel errors of a change, usable with errors.Is on a *ChangeError. The
// grammar's three are inventory's (the Changes sheet's problems wrap the same).
var (
	// ErrSyntax: the change is not written as the flag needs (ID=VALUE).
	ErrSyntax = inventory.ErrChangeSyntax
	// ErrUnknownChange: the change code is not one whatif knows.
	ErrUnknownChange = inventory.ErrUnknownChange
	// ErrUnknownTarget: the object, station or material named is not in the survey.
	ErrUnknownTarget = errors.New("unknown target")
	// ErrWrongTarget: the target exists but the change does not apply to it.
	ErrWrongTarget = errors.New("change does not apply to the target")
	// ErrBadValue: the value is not a usable number with a unit of the right dimension.
	ErrBadValue = inventory.ErrBadChangeValue
)

// Change is one planned change to a survey, from a whatif flag or a row of the
// survey's Changes sheet.
type Change struct {
	Kind   string // one of the Change codes
	Target string // object ID, "station:ID", or "" for site-wide changes
	Value  string // the value as written, with its unit
	Source string // "--earth" for a flag, "Changes!5" for a sheet row
	Note   string // why (from the sheet's Notes)
	// OverriddenBy is, for a Changes sheet row, the flag that sets the same
	// target ("--station-rh ST-DRX=60"): the flag wins and the row is not
	// applied (CollectChanges marks it); "" otherwise.
	OverriddenBy string
}

// FromFlag: the change was given as a whatif flag (not a Changes sheet row).
func (c Change) FromFlag() bool { return strings.HasPrefix(c.Source, "--") }

// Text returns the change as a flag would write it: "--earth DRM-DRUM=1e6".
func (c Change) Text() string {
	if c.Target == "" {
		return "--" + c.Kind + " " + c.Value
	}
	return "--" + c.Kind + " " + c.Target + "=" + c.Value
}

// Applied is one change after validation and application.
type Applied struct {
	Change
	SI          float64  // the value in SI units (percent for RH, plain for margin); NaN for text values
	SIText      string   // the value as applied, with its SI unit ("1e+06 Ω", "PE", "C")
	Description string   // what was changed, in words
	Objects     []string // the object IDs the change reached, in survey order (nil for site-wide)
	Stations    []string // the station IDs whose RH changed (RH changes)
	// Warning: the value was applied but is likely meant otherwise (an RH
	// below 1 %, inventory.LowRHWarning, with its fix); "" none. The
	// Description ends with it.
	Warning string
}

// ChangeError is a change that cannot be applied, with where it came from and a fix.
type ChangeError struct {
	Change  Change
	Message string
	Fix     string // e.g. `did you mean "DRM-DRUM"?`; "" when none is obvious
	Err     error  // one of the sentinels
}

// Error formats the error as `--earth DRM-DRUMM=1e6: object "DRM-DRUMM" is not in the survey; did you mean "DRM-DRUM"?`.
func (e *ChangeError) Error() string {
	place := e.Change.Source
	if place == "" || strings.HasPrefix(place, "--") {
		place = e.Change.Text()
	} else {
		place += " (" + e.Change.Kind + ")"
	}
	s := place + ": " + e.Message
	if e.Fix != "" {
		s += "; " + e.Fix
	}
	return s
}

// Unwrap returns the sentinel.
func (e *ChangeError) Unwrap() error { return e.Err }

// siteWide reports whether a change takes no target.
func siteWide(kind string) bool {
	k, ok := inventory.LookupChangeKind(kind)
	return ok && k.Targets == inventory.TargetSite
}

// ParseFlag reads the argument of a whatif flag: "--rh 55" and "--margin 20" take
// a bare value; the others take TARGET=VALUE, TARGET an object ID or station:ID
// (a station ID for --station-rh). The value is read by inventory.ParseChange,
// as a Changes sheet row is: a line that works in one works in the other.
func ParseFlag(kind, arg string) (Change, error) {
	c := Change{Kind: kind, Source: "--" + kind}
	k, ok := inventory.LookupChangeKind(kind)
	if !ok {
		c.Value = arg
		return c, &ChangeError{Change: c, Message: fmt.Sprintf("change %q is not known", kind), Fix: "use one of: " + strings.Join(inventory.ChangeKinds(), ", "), Err: ErrUnknownChange}
	}
	arg = strings.TrimSpace(arg)
	if k.Targets == inventory.TargetSite {
		c.Value = arg
		if strings.Contains(arg, "=") {
			return c, &ChangeError{Change: c, Message: "takes a bare value, not TARGET=VALUE", Fix: fmt.Sprintf("write --%s %s (use --station-rh ID=60 for one station)", kind, k.Example), Err: ErrSyntax}
		}
	} else {
		t, v, ok := strings.Cut(arg, "=")
		c.Target, c.Value = strings.TrimSpace(t), strings.TrimSpace(v)
		if !ok || c.Target == "" || c.Value == "" {
			c.Target, c.Value = "", arg
			return c, &ChangeError{Change: c, Message: fmt.Sprintf("%q is not TARGET=VALUE", arg), Fix: fmt.Sprintf("write --%s %s", kind, k.Example), Err: ErrSyntax}
		}
	}
	if _, err := inventory.ParseChange(c.Kind, c.Target, c.Value); err != nil {
		return c, changeError(c, err)
	}
	return c, nil
}

// changeError turns the grammar's problem into a *ChangeError at the change's place.
func changeError(c Change, err error) error {
	var cp *inventory.ChangeProblem
	if errors.As(err, &cp) {
		return &ChangeError{Change: c, Message: cp.Message, Fix: cp.Fix, Err: cp.Err}
	}
	return &ChangeError{Change: c, Message: err.Error(), Err: fmt.Errorf("%w: %w", ErrBadValue, err)}
}

// FlagHelp is the help text of the whatif flag of a change kind, from the change table.
func FlagHelp(kind string) string {
	k, _ := inventory.LookupChangeKind(kind)
	return k.Usage()
}

// KindsNote is the whatif Method sheet's list of the change kinds, from the change table.
func KindsNote() string {
	var parts []string
	for _, k := range inventory.ChangeKindTable() {
		parts = append(parts, fmt.Sprintf("%s: %s (e.g. %s)", k.Code, k.Help, k.Example))
	}
	return "The change kinds (a flag --CODE or a row of the survey's Changes sheet, one grammar for both): " + strings.Join(parts, "; ") + "."
}

// FromSheet returns the survey's Changes sheet rows as changes, in sheet order.
func FromSheet(s *inventory.Survey) []Change {
	out := make([]Change, 0, len(s.Changes))
	for _, c := range s.Changes {
		out = append(out, Change{Kind: strings.ToLower(strings.TrimSpace(c.Change)), Target: strings.TrimSpace(c.Target), Value: c.Value,
			Source: fmt.Sprintf("%s!%d", inventory.SheetChanges, c.Row), Note: c.Note})
	}
	return out
}

// CloneSurvey returns a deep copy of s: every slice is copied, so changing the
// copy never touches s.
func CloneSurvey(s *inventory.Survey) *inventory.Survey {
	c := *s
	c.Site.Items = append([]inventory.SiteItem(nil), s.Site.Items...)
	c.Site.Defaults = append([]inventory.SiteDefault(nil), s.Site.Defaults...)
	c.Site.Limits = append([]inventory.SiteLimit(nil), s.Site.Limits...)
	c.Site.Uncertainties = append([]inventory.SiteUncertainty(nil), s.Site.Uncertainties...)
	c.Atmospheres = append([]inventory.Atmosphere(nil), s.Atmospheres...)
	c.Stations = append([]inventory.Station(nil), s.Stations...)
	c.Objects = append([]inventory.Object(nil), s.Objects...)
	c.Materials = append([]inventory.Material(nil), s.Materials...)
	c.Changes = append([]inventory.Change(nil), s.Changes...)
	c.Problems = append([]inventory.Problem(nil), s.Problems...)
	c.Rejected = make([]inventory.Rejected, len(s.Rejected))
	for i, r := range s.Rejected {
		r.Problems = append([]inventory.Problem(nil), r.Problems...)
		c.Rejected[i] = r
	}
	c.Counts = append([]inventory.SheetCount(nil), s.Counts...)
	return &c
}

// Apply validates each change like survey input and applies them, in order, to a
// deep copy of s (s is never modified). before is the assessment of s: it says
// which rows are conductors for a station-wide earthing change. The first
// invalid change stops the run with a *ChangeError.
func Apply(s *inventory.Survey, before *assess.Audit, changes []Change) (*inventory.Survey, []Applied, error) {
	out := CloneSurvey(s)
	applied := make([]Applied, 0, len(changes))
	for _, c := range changes {
		a, err := apply(out, before, c)
		if err != nil {
			return nil, nil, err
		}
		applied = append(applied, a)
	}
	return out, applied, nil
}

func apply(s *inventory.Survey, before *assess.Audit, c Change) (Applied, error) {
	a := Applied{Change: c, SI: math.NaN()}
	fail := func(sentinel error, fix, format string, args ...any) (Applied, error) {
		return a, &ChangeError{Change: c, Message: fmt.Sprintf(format, args...), Fix: fix, Err: sentinel}
	}
	p, err := inventory.ParseChange(c.Kind, c.Target, c.Value)
	if err != nil {
		return a, changeError(c, err)
	}
	c.Kind = p.Kind.Code
	a.Change.Kind = c.Kind
	switch c.Kind {
	case ChangeRH:
		v := p.Number
		s.Site.RelativeHumidity = inventory.Known(v)
		a.SI, a.SIText = v, num(v)+" %"
		for _, st := range s.Stations {
			if !st.RelativeHumidity.Known {
				a.Stations = append(a.Stations, st.ID)
				a.Objects = append(a.Objects, objectsAt(s, st.ID, func(*inventory.Object) bool { return true })...)
			}
		}
		a.Description = fmt.Sprintf("site RH set to %s %%; applies to the %d station(s) that give no RH of their own", num(v), len(a.Stations))
		if len(a.Stations) == 0 {
			a.Description += " (every station gives its own: use --station-rh ID=VALUE to change them)"
		}
		a.warn(p)
		return a, nil
	case ChangeMargin:
		v := p.Number
		s.Site.RequiredMargin = inventory.Known(v)
		a.SI, a.SIText = v, num(v)
		for _, o := range s.Objects {
			a.Objects = append(a.Objects, o.ID)
		}
		a.Description = fmt.Sprintf("required margin set to %s: energy must stay below MIE / %s", num(v), num(v))
		return a, nil
	}

	// Targeted changes.
	stationID, objectID, err := resolveTarget(s, c, p)
	if err != nil {
		return a, err
	}
	targets := []int{}
	if objectID != "" {
		for i := range s.Objects {
			if s.Objects[i].ID == objectID {
				targets = append(targets, i)
			}
		}
	}
	if c.Kind == ChangeStationRH {
		if stationID == "" {
			return fail(ErrWrongTarget, "give a station ID, e.g. --station-rh ST-UNW=60", "station-rh takes a station, not object %q", objectID)
		}
		v := p.Number
		for i := range s.Stations {
			if s.Stations[i].ID == stationID {
				s.Stations[i].RelativeHumidity = inventory.Known(v)
			}
		}
		a.SI, a.SIText, a.Stations = v, num(v)+" %", []string{stationID}
		a.Objects = objectsAt(s, stationID, func(*inventory.Object) bool { return true })
		a.Description = fmt.Sprintf("RH at station %s set to %s %%; the model recomputes each material's surface resistivity from its humidity slope", stationID, num(v))
		a.warn(p)
		return a, nil
	}
	pick := func(ok func(*inventory.Object) bool, what string) error {
		if stationID != "" {
			for i := range s.Objects {
				if s.Objects[i].Station == stationID && ok(&s.Objects[i]) {
					targets = append(targets, i)
				}
			}
			if len(targets) == 0 {
				return &ChangeError{Change: c, Message: fmt.Sprintf("station %s has no %s", stationID, what), Err: ErrWrongTarget}
			}
			return nil
		}
		if !ok(&s.Objects[targets[0]]) {
			o := s.Objects[targets[0]]
			return &ChangeError{Change: c, Message: fmt.Sprintf("object %s is a %s, not a %s", o.ID, o.Kind, what), Fix: "choose " + strings.Join(objectsMatching(s, ok), ", "), Err: ErrWrongTarget}
		}
		return nil
	}
	conductor := conductorTest(before)
	tail := ""
	switch c.Kind {
	case ChangeEarth, ChangeFootwear:
		v := p.Number
		if c.Kind == ChangeEarth {
			if stationID != "" {
				err = pick(conductor, "conductor")
			} else {
				err = pick(func(*inventory.Object) bool { return true }, "object")
			}
		} else {
			err = pick(func(o *inventory.Object) bool { return o.Kind == inventory.KindPerson }, "person")
		}
		if err != nil {
			return a, err
		}
		var dropped []string
		for _, i := range targets {
			o := &s.Objects[i]
			o.Resistance = inventory.Known(v)
			// A conductor's or person's measured potential was set by the old leakage
			// path: it no longer holds, and the model estimates the potential from the
			// charging current (or its documented worst-case default) and the new resistance.
			if o.SurfacePotential.Known && (o.Kind == inventory.KindPerson || conductor(o)) {
				dropped = append(dropped, fmt.Sprintf("%s (%s kV)", o.ID, num(o.SurfacePotential.Value/1e3)))
				o.SurfacePotential = inventory.Quantity{}
			}
		}
		a.SI, a.SIText = v, num(v)+" Ω"
		what := "resistance to earth"
		if c.Kind == ChangeFootwear {
			what = "footwear/floor resistance to earth"
		}
		a.Description = fmt.Sprintf("%s set to %s Ω", what, num(v))
		if len(dropped) > 0 {
			tail = "; the measured potential of " + strings.Join(dropped, ", ") +
				" was taken with the old earthing and is dropped: the model estimates it from the charging current and the new resistance"
		}
	case ChangeMaterial:
		m, err := material(s, c, p.Word)
		if err != nil {
			return a, err
		}
		if err := pick(func(*inventory.Object) bool { return true }, "object"); err != nil {
			return a, err
		}
		for _, i := range targets {
			s.Objects[i].Material = m.Name
		}
		a.SIText = m.Name
		a.Description = fmt.Sprintf("material swapped to %s (%s, surface resistivity %s Ω/sq at 50 %%, humidity slope %s decade(s) per 10 %%RH)",
			m.Name, m.Class, num(m.SurfaceResistivity), num(m.HumiditySlope))
	case ChangeSpeed:
		v := p.Number
		if err := pick(func(*inventory.Object) bool { return true }, "object"); err != nil {
			return a, err
		}
		for _, i := range targets {
			s.Objects[i].Speed = inventory.Known(v)
		}
		a.SI, a.SIText = v, num(v)+" m/s"
		a.Description = fmt.Sprintf("speed (liquid: flow velocity in the line) set to %s m/s", num(v))
	case ChangeConductivity:
		v := p.Number
		if err := pick(func(o *inventory.Object) bool { return o.Kind == inventory.KindLiquid }, "liquid"); err != nil {
			return a, err
		}
		for _, i := range targets {
			s.Objects[i].Conductivity = inventory.Known(v)
		}
		a.SI, a.SIText = v, num(v)+" S/m"
		a.Description = fmt.Sprintf("liquid conductivity set to %s pS/m (e.g. with a conductivity additive)", num(v*1e12))
	case ChangeBagType:
		t := p.Word
		if err := pick(func(o *inventory.Object) bool { return o.Kind == inventory.KindBag }, "bag"); err != nil {
			return a, err
		}
		for _, i := range targets {
			s.Objects[i].BagType = t
		}
		a.SIText = t
		a.Description = "bag type set to " + t
	case ChangeFilling:
		f, err := model.ParseFilling(p.Word)
		if err != nil || f == model.FillUnknown {
			return fail(ErrBadValue, "use top, bottom or dip pipe", "%q is not a filling method", c.Value)
		}
		if err := pick(func(o *inventory.Object) bool { return o.Kind == inventory.KindLiquid }, "liquid"); err != nil {
			return a, err
		}
		for _, i := range targets {
			s.Objects[i].Filling = f.String()
		}
		a.SIText = f.String()
		a.Description = "filling method set to " + f.String()
		if f != model.FillTop {
			a.Description += " (for a low-conductivity liquid the slow start needs the row's Inlet velocity; without one it is not shown met)"
		}
	case ChangeVesselMaterial:
		m, err := model.ParseVesselMaterial(p.Word)
		if err != nil || m == model.VesselMaterialUnknown {
			return fail(ErrBadValue, "use metal, insulating, lined or glass", "%q is not a vessel material", c.Value)
		}
		if err := pick(func(o *inventory.Object) bool { return o.Kind == inventory.KindLiquid }, "liquid"); err != nil {
			return a, err
		}
		for _, i := range targets {
			s.Objects[i].VesselMaterial = m.String()
		}
		a.SIText = m.String()
		a.Description = "receiving vessel material set to " + m.String()
	default:
		// A kind in inventory's change table without its apply step here
		// (TestChangeKindsAllApplied fails on it).
		return fail(ErrUnknownChange, "", "change %s has no apply step", c.Kind)
	}
	for _, i := range targets {
		a.Objects = append(a.Objects, s.Objects[i].ID)
	}
	if stationID != "" {
		a.Description += fmt.Sprintf(" on %d row(s) at station %s", len(a.Objects), stationID)
	}
	a.Description += tail
	return a, nil
}

// warn records the grammar's warning on the value (an RH below 1 %, as check
// warns for an RH cell) and ends the description with it.
func (a *Applied) warn(p inventory.PlannedChange) {
	if p.Warning == "" {
		return
	}
	a.Warning = p.Warning + "; " + p.WarningFix
	a.Description += "; warning: " + a.Warning
}

// conductorTest says which rows a station-wide earthing change reaches: the rows
// the assessment treats as conductors that must be earthed (assess.IsConductorRow),
// and type C bags.
func conductorTest(before *assess.Audit) func(*inventory.Object) bool {
	cond := map[string]bool{}
	if before != nil {
		for i := range before.Objects {
			r := &before.Objects[i]
			if assess.IsConductorRow(&r.Input, &r.Eval) || (r.Object.Kind == inventory.KindBag && strings.EqualFold(r.Object.BagType, "C")) {
				cond[r.Object.ID] = true
			}
		}
	}
	return func(o *inventory.Object) bool { return cond[o.ID] }
}

// resolveTarget finds the station or object a change names (p is the change
// as the grammar read it: a station, or an object).
func resolveTarget(s *inventory.Survey, c Change, p inventory.PlannedChange) (station, object string, err error) {
	if p.Station != "" {
		if _, ok := s.Station(p.Station); ok {
			return p.Station, "", nil
		}
		return "", "", unknown(c, "station", p.Station, stationIDs(s))
	}
	t := p.Object
	for _, o := range s.Objects {
		if o.ID == t {
			return "", t, nil
		}
	}
	if _, ok := s.Station(t); ok {
		return "", "", &ChangeError{Change: c, Message: fmt.Sprintf("%q is a station, not an object", t), Fix: fmt.Sprintf("write station:%s to reach its rows", t), Err: ErrWrongTarget}
	}
	ids := make([]string, len(s.Objects))
	for i, o := range s.Objects {
		ids[i] = o.ID
	}
	return "", "", unknown(c, "object", t, ids)
}

func unknown(c Change, what, id string, candidates []string) error {
	fix := ""
	if near := nearest(id, candidates); near != "" {
		fix = fmt.Sprintf("did you mean %q?", near)
		if what == "station" && strings.HasPrefix(strings.ToLower(c.Target), "station:") {
			fix = fmt.Sprintf("did you mean \"station:%s\"?", near)
		}
	}
	return &ChangeError{Change: c, Message: fmt.Sprintf("%s %q is not in the survey (accepted rows)", what, id), Fix: fix, Err: ErrUnknownTarget}
}

func stationIDs(s *inventory.Survey) []string {
	out := make([]string, len(s.Stations))
	for i, st := range s.Stations {
		out[i] = st.ID
	}
	return out
}

func objectsAt(s *inventory.Survey, station string, ok func(*inventory.Object) bool) []string {
	var out []string
	for i := range s.Objects {
		if s.Objects[i].Station == station && ok(&s.Objects[i]) {
			out = append(out, s.Objects[i].ID)
		}
	}
	return out
}

func objectsMatching(s *inventory.Survey, ok func(*inventory.Object) bool) []string {
	var out []string
	for i := range s.Objects {
		if ok(&s.Objects[i]) {
			out = append(out, s.Objects[i].ID)
		}
	}
	if len(out) > 6 {
		out = append(out[:6], "...")
	}
	if len(out) == 0 {
		return []string{"another target (no row of that kind in the survey)"}
	}
	return out
}

// material resolves a material name: the survey's (built in or Materials sheet),
// then the built-in aliases.
func material(s *inventory.Survey, c Change, name string) (inventory.Material, error) {
	if m, ok := s.Material(name); ok {
		return m, nil
	}
	if m, ok := inventory.LookupMaterial(name); ok {
		if sm, ok := s.Material(m.Name); ok {
			return sm, nil
		}
		return m, nil
	}
	names := make([]string, 0, len(s.Materials))
	for _, m := range s.Materials {
		names = append(names, m.Name)
	}
	sort.Strings(names)
	fix := "add it to the Materials sheet or run 'sparkmargin library' for the built-in names"
	if near := nearest(name, names); near != "" {
		fix = fmt.Sprintf("did you mean %q? (or %s)", near, fix)
	}
	return inventory.Material{}, &ChangeError{Change: c, Message: fmt.Sprintf("material %q is neither built in nor on the Materials sheet", name), Fix: fix, Err: ErrUnknownTarget}
}

// num formats a number for a message with up to 3 significant digits.
func num(v float64) string {
	if math.IsNaN(v) {
		return "unknown"
	}
	return fmtSig(v)
}

// nearest is inventory.Nearest, except that a candidate with the same letters in
// another order (a transposition slip, "PTEF" for "PTFE") wins over an equally
// near one of other letters.
func nearest(s string, candidates []string) string {
	key := func(t string) string {
		r := []rune(strings.ToLower(t))
		sort.Slice(r, func(i, j int) bool { return r[i] < r[j] })
		return string(r)
	}
	k := key(s)
	for _, c := range candidates {
		if key(c) == k {
			return c
		}
	}
	return inventory.Nearest(s, candidates)
}
