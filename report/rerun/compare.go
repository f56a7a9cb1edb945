package rerun

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"math"
	"slices"
	"strings"
	"time"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
)

// Compare takes two surveys of one site, OLD (the earlier) and NEW (the
// later), and says what differs: the identity of each side (file, checksum,
// site, survey date), cautions where the two may not be comparable (two
// different sites, the dates in reverse order, a date missing, the same file
// twice, a side that is an audit JSON without readings), the Site items and
// station settings that changed (RH, air temperature, margin, limit overrides,
// atmosphere, zone, MIE, gas group, line), the objects added, removed and
// changed, and every station whose rank moved or whose verdict changed.
//
// Values keep their number: each is held in SI and in the display unit the
// survey and the audit use (kV/m, mJ, pF...), so the workbook stores numbers
// as numbers in those units. Two sides are the same site when both give a
// Site ID and the IDs agree, else when the site names agree (case and spaces
// aside): a screening choice of this tool.

// Identity is what is known of the survey behind one side.
type Identity struct {
	Path string // the file as given
	// SHA256 is the survey's checksum: of the file's bytes for a survey side,
	// the survey's recorded inside an audit JSON for a JSON side (so an audit
	// JSON and the survey it was made from have the same identity); the JSON
	// file's own checksum is FileSHA256.
	SHA256     string
	FileSHA256 string    // of the audit JSON file's bytes; "" for a survey side
	Site       string    // the Site item, "" when not named
	SiteID     string    // the optional Site ID item
	SurveyDate time.Time // zero: not given
	// SurveySHA256 is the checksum of the survey an audit JSON was made from
	// (the JSON's own "survey"); "" for a survey side (SHA256 is the survey's).
	SurveySHA256 string
	// Results is true for an audit JSON: its objects carry results, not readings.
	Results bool
}

// SiteText is the site name, or "site not named".
func (id Identity) SiteText() string {
	if strings.TrimSpace(id.Site) == "" {
		return "site not named"
	}
	return id.Site
}

// DateText is the survey date as 2006-01-02, or "not given (draft)".
func (id Identity) DateText() string {
	if id.SurveyDate.IsZero() {
		return "not given (draft)"
	}
	return id.SurveyDate.UTC().Format("2006-01-02")
}

// SurveyIdentity is the identity of a survey read from path.
func SurveyIdentity(path string, s *inventory.Survey) Identity {
	id := Identity{Path: path}
	if s != nil {
		id.SHA256, id.Site, id.SiteID, id.SurveyDate = s.SHA256, s.Site.Name, s.Site.ID, s.Site.SurveyDate
	}
	return id
}

// Value is one compared value: text, or a number held in SI and shown in its
// display unit.
type Value struct {
	Text   string   // as shown, with its unit; "" when not given
	SI     *float64 // the number in SI; nil for text or not given
	Shown  float64  // the number in Unit (when SI is set)
	Unit   string   // display unit label, "" when dimensionless
	NumFmt string   // the workbook's number format for Shown
}

// sig4 is v to 4 significant digits without trailing zeros (book.FormatSigTrim).
func sig4(v float64) string { return book.FormatSigTrim(v, 4) }

func textValue(s string) Value { return Value{Text: s} }

// numValue is an SI value shown in unit u; NaN or Inf is "not given".
func numValue(u book.Unit, si float64) Value {
	v, ok := u.Display(si)
	if !ok {
		return Value{}
	}
	x := si
	t := sig4(v)
	if u.Label() != "" {
		t += " " + u.Label()
	}
	return Value{Text: t, SI: &x, Shown: v, Unit: u.Label(), NumFmt: u.NumFmt()}
}

func quantityValue(u book.Unit, q inventory.Quantity) Value {
	if !q.Known {
		return Value{}
	}
	return numValue(u, q.Value)
}

// Equal reports whether two values are the same: numbers within a relative
// 1e-12 (a JSON round trip), else the same text.
func (v Value) Equal(w Value) bool {
	if v.SI != nil && w.SI != nil {
		a, b := *v.SI, *w.SI
		return a == b || math.Abs(a-b) <= 1e-12*math.Max(math.Abs(a), math.Abs(b))
	}
	if (v.SI == nil) != (w.SI == nil) {
		return false
	}
	return v.Text == w.Text
}

// Field is one named value of an object, a station or the site.
type Field struct {
	Name  string
	Value Value
}

// Side is one survey (or audit JSON) as compare sees it.
type Side struct {
	Label    string // file name
	Identity Identity
	Site     []Field // Site items and limit overrides
	// StationFields are each station's settings (name, line, RH, atmosphere,
	// zone, MIE, gas group), in station order.
	StationFields []StationFields
	Objects       []SideObject
	Stations      []SideStation // ranked, worst first
	// Rejected are the Objects rows the side's reader rejected: not assessed,
	// so neither "added" nor "removed" (see that side's audit, Rejected sheet).
	Rejected []RejectedObject
}

// RejectedObject is one Objects row rejected on a side.
type RejectedObject struct {
	ID, Station string // as far as the row could be read ("" when not)
	Row         int    // the row of the Objects sheet; 0 when not known
	Why         string // the first problem of the row
}

// StationFields is one station's settings.
type StationFields struct {
	ID     string
	Fields []Field
}

// SideObject is one object with the fields compare looks at.
type SideObject struct {
	ID, Station string
	Verdict     string
	Ratio       *float64
	// RatioAssumed: the ratio is at least 1 only because of an assumed
	// resistance to earth (assess.ObjectResult.RatioAssumed): its size is no figure.
	RatioAssumed bool
	Fields       []Field // in column order
}

// SideStation is one station's rank and verdict.
type SideStation struct {
	ID, Name   string
	Rank       int
	Verdict    string
	WorstRatio *float64
	// WorstRatioAssumed: the worst ratio rests on an assumed resistance to
	// earth (assess.StationResult.WorstRatioAssumed): at least 1, its size no figure.
	WorstRatioAssumed bool
	RejectedRows      int // Objects rows naming the station that were rejected
}

// Changed is one object found in both with different fields.
type Changed struct {
	ID, Station                 string
	Fields                      []string // names of the fields that differ, column order
	Before, After               []Value  // their values, aligned with Fields
	VerdictBefore, VerdictAfter string
	RatioBefore, RatioAfter     *float64
	// RatioAssumedBefore/After: that side's ratio rests on an assumed resistance.
	RatioAssumedBefore, RatioAssumedAfter bool
}

// FieldChange is one Site item or station setting that differs.
type FieldChange struct {
	Station       string // "" for a Site item
	Field         string
	Before, After Value
}

// RankMove is one station whose rank moved or whose verdict changed (or that
// is only on one side: rank 0).
type RankMove struct {
	ID, Name                          string
	RankBefore, RankAfter             int // 0: not on that side
	VerdictBefore, VerdictAfter       string
	WorstRatioBefore, WorstRatioAfter *float64
	// WorstRatioAssumedBefore/After: that side's worst ratio rests on an
	// assumed resistance to earth (at least 1, its size no figure).
	WorstRatioAssumedBefore, WorstRatioAssumedAfter bool
	// Added, Removed and Rejected are the objects of the station added,
	// removed, or rejected on either side: the station's set of objects is
	// not the same, so a move is not called better or worse.
	Added, Removed, Rejected []string
	// OnlyOthers: the station's own objects, verdict and worst ratio are the
	// same on both sides, and its rank moved only because objects were added,
	// removed or rejected at other stations: not better, not worse.
	OnlyOthers bool
}

// ObjectsDiffer reports whether the station's objects are not the same on
// both sides (added, removed or rejected on a side).
func (m RankMove) ObjectsDiffer() bool { return len(m.Added)+len(m.Removed)+len(m.Rejected) > 0 }

// Move says what happened to the station: "up 2 (worse)", "same rank, verdict
// changed", or, when its objects differ between the sides, the move and why
// ("down 1: object COT-PAN removed"), never "better" or "worse": a station
// that lost an object is not improved by it.
func (m RankMove) Move() string {
	var s string
	switch {
	case m.RankBefore == 0:
		return "new station"
	case m.RankAfter == 0:
		return "station removed"
	case m.RankAfter < m.RankBefore:
		s = fmt.Sprintf("up %d", m.RankBefore-m.RankAfter)
		if !m.ObjectsDiffer() && !m.OnlyOthers {
			s += " (worse)"
		}
	case m.RankAfter > m.RankBefore:
		s = fmt.Sprintf("down %d", m.RankAfter-m.RankBefore)
		if !m.ObjectsDiffer() && !m.OnlyOthers {
			s += " (better)"
		}
	default:
		s = "same rank, verdict changed"
	}
	switch {
	case m.ObjectsDiffer():
		s += ": " + m.objectsText()
	case m.OnlyOthers:
		s += ": its own result unchanged, objects added, removed or rejected at other stations"
	}
	return s
}

// objectsText says which objects of the station differ: "object COT-PAN
// removed; objects A, B added; object X rejected on one side".
func (m RankMove) objectsText() string {
	var parts []string
	for _, g := range []struct {
		ids  []string
		what string
	}{{m.Removed, "removed"}, {m.Added, "added"}, {m.Rejected, "rejected on one side (not compared)"}} {
		switch len(g.ids) {
		case 0:
		case 1:
			parts = append(parts, "object "+g.ids[0]+" "+g.what)
		default:
			parts = append(parts, "objects "+strings.Join(g.ids, ", ")+" "+g.what)
		}
	}
	return strings.Join(parts, "; ")
}

// CautionKind names a reason the two sides may not compare as a repeat survey.
type CautionKind string

// The cautions of a comparison.
const (
	CautionDifferentSites CautionKind = "different sites"
	CautionReversedDates  CautionKind = "dates reversed"
	CautionSameDate       CautionKind = "same survey date"
	CautionNoDate         CautionKind = "survey date missing"
	CautionOneSiteID      CautionKind = "Site ID on one side"
	CautionSameFile       CautionKind = "same file"
	CautionResultsOnly    CautionKind = "results only"
	// CautionRejected: Objects rows were rejected on a side; those objects
	// are not assessed there, so they are listed apart, never as added or removed.
	CautionRejected CautionKind = "rows rejected"
)

// Caution is one warning about the comparison, with its kind for programs.
type Caution struct {
	Kind CautionKind
	Text string
}

// Comparison is the difference between two surveys of the same site.
type Comparison struct {
	Old, New       *Side
	Cautions       []Caution
	SiteChanges    []FieldChange // Site items, in the order of the new side then removed ones
	StationChanges []FieldChange // station settings of stations on both sides
	// NotCompared names the settings one side does not hold (an audit JSON
	// holds the site RH, air temperature and margin and each station's
	// atmosphere, zone, MIE and group, not a station's own RH nor the limit
	// overrides): "not compared (audit JSON side)", never "no change".
	NotCompared    []string
	Added, Removed []string // object IDs, in the order of their side
	// RejectedOld and RejectedNew are the Objects rows rejected on each side:
	// not assessed there, so neither added nor removed.
	RejectedOld, RejectedNew []RejectedObject
	Changed                  []Changed
	Stations                 []RankMove // new side's ranking order, then removed stations
}

// Rejected is the number of Objects rows rejected on either side.
func (c *Comparison) Rejected() int { return len(c.RejectedOld) + len(c.RejectedNew) }

// StationsAdded and StationsRemoved count the stations on one side only;
// StationsMoved the stations on both whose rank or verdict moved.
func (c *Comparison) StationsAdded() int {
	return countMoves(c.Stations, func(m RankMove) bool { return m.RankBefore == 0 })
}

// StationsRemoved counts the stations only on the old side.
func (c *Comparison) StationsRemoved() int {
	return countMoves(c.Stations, func(m RankMove) bool { return m.RankAfter == 0 })
}

// StationsMoved counts the stations on both sides whose rank or verdict moved.
func (c *Comparison) StationsMoved() int {
	return countMoves(c.Stations, func(m RankMove) bool { return m.RankBefore != 0 && m.RankAfter != 0 })
}

func countMoves(ms []RankMove, f func(RankMove) bool) int {
	n := 0
	for _, m := range ms {
		if f(m) {
			n++
		}
	}
	return n
}

// SideFromAudit takes an audit of a survey: the Site items, each station's
// settings, every reading and setting of the Objects sheet, then the verdict
// and the ratio.
func SideFromAudit(label string, a *assess.Audit) *Side {
	s := &Side{Label: label}
	if a.Survey != nil {
		s.Identity = SurveyIdentity(a.Survey.Path, a.Survey)
		s.Site = siteFields(a.Survey)
		s.StationFields = stationFields(a.Survey)
	}
	for i := range a.Objects {
		r := &a.Objects[i]
		o := SideObject{ID: r.Object.ID, Station: r.Object.Station, Verdict: r.Verdict.String(), Ratio: r.Ratio, RatioAssumed: r.RatioAssumed()}
		o.Fields = objectFields(&r.Object)
		rv := ratioValue(r.Ratio)
		if o.RatioAssumed {
			rv = textValue(assess.RatioAssumedText)
		}
		o.Fields = append(o.Fields, Field{"Verdict", textValue(o.Verdict)}, Field{"Ratio E/MIE", rv})
		s.Objects = append(s.Objects, o)
	}
	for _, st := range a.Stations {
		s.Stations = append(s.Stations, SideStation{ID: st.Station.ID, Name: st.Station.Name, Rank: st.Rank, Verdict: st.Verdict.String(), WorstRatio: st.WorstRatio,
			WorstRatioAssumed: st.WorstRatioAssumed, RejectedRows: st.RejectedRows})
	}
	if a.Survey != nil {
		for _, r := range a.Survey.Rejected {
			if r.Sheet != inventory.SheetObjects {
				continue
			}
			x := RejectedObject{ID: r.ID, Station: r.Station, Row: r.Row}
			if len(r.Problems) > 0 {
				x.Why = r.Problems[0].Message
			}
			s.Rejected = append(s.Rejected, x)
		}
	}
	return s
}

// siteFields are the Site items compared, then each limit override in the
// practical unit of its item.
func siteFields(s *inventory.Survey) []Field {
	st := s.Site
	out := []Field{
		{"Site ID", textValue(st.ID)},
		{"Surveyed by", textValue(st.SurveyedBy)},
		{"Relative humidity", quantityValue(book.UnitPercentRH, st.RelativeHumidity)},
		{"Air temperature", quantityValue(book.UnitCelsius, st.AirTemperature)},
		{"Required margin", quantityValue(book.UnitDimless, st.RequiredMargin)},
	}
	items := inventory.LimitItems()
	for _, l := range st.Limits {
		v := Value{Text: fmtSig(l.Value)}
		si := l.Value
		v.SI = &si
		v.Shown = si
		for _, k := range items {
			if k.Name != l.Name {
				continue
			}
			if x, ok := k.FromSI(l.Value); ok {
				v.Shown, v.Unit = x, k.Unit
				v.Text = strings.TrimSpace(sig4(x) + " " + k.Unit)
			}
		}
		out = append(out, Field{"Limit: " + l.Name, v})
	}
	return out
}

// stationFields are each station's settings; zone, MIE and group are its
// atmosphere's.
func stationFields(s *inventory.Survey) []StationFields {
	atm := map[string]inventory.Atmosphere{}
	for _, a := range s.Atmospheres {
		atm[a.ID] = a
	}
	var out []StationFields
	for _, st := range s.Stations {
		rh := quantityValue(book.UnitPercentRH, st.RelativeHumidity)
		if rh.SI == nil {
			rh = textValue("the site's")
		}
		f := []Field{{"Name", textValue(st.Name)}, {"Line", textValue(st.Line)}, {"Relative humidity", rh}, {"Atmosphere", textValue(st.Atmosphere)}}
		a, ok := atm[st.Atmosphere]
		if !ok {
			a = inventory.Atmosphere{}
		}
		f = append(f, Field{"Substance", textValue(a.Substance)}, Field{"Kind of atmosphere", textValue(a.Kind)}, Field{"Zone", textValue(a.Zone)},
			Field{"MIE", quantityValue(book.UnitMJ, a.MIE)}, Field{"Gas or dust group", textValue(a.Group)})
		out = append(out, StationFields{ID: st.ID, Fields: f})
	}
	return out
}

func objectFields(o *inventory.Object) []Field {
	q := func(name string, u book.Unit, v inventory.Quantity) Field { return Field{name, quantityValue(u, v)} }
	t := func(name, v string) Field { return Field{name, textValue(v)} }
	return []Field{
		t("Station", o.Station), t("Kind", o.Kind), t("Material", o.Material),
		q("Length", book.UnitMetre, o.Length), q("Width", book.UnitMetre, o.Width), q("Diameter", book.UnitMetre, o.Diameter), q("Thickness", book.UnitMillimetre, o.Thickness),
		t("Backing", o.Backing), q("Distance to earth", book.UnitMetre, o.DistanceToEarth),
		q("Field", book.UnitKVPerM, o.Field), q("Field distance", book.UnitMetre, o.FieldDistance), q("Surface potential", book.UnitKV, o.SurfacePotential),
		q("Speed", book.UnitMPerS, o.Speed), q("Mass flow", book.UnitKgPerS, o.MassFlow), q("Charge-to-mass", book.UnitUCPerKg, o.ChargeToMass),
		q("Charging current", book.UnitUA, o.ChargingCurrent), q("Charging time", book.UnitSecond, o.ChargingTime), q("Particle size", book.UnitMillimetre, o.ParticleSize),
		q("Resistance to earth", book.UnitOhm, o.Resistance), q("Capacitance", book.UnitPF, o.Capacitance),
		q("Conductivity", book.UnitPSPerM, o.Conductivity), q("Relative permittivity", book.UnitDimless, o.Permittivity),
		t("Bag type", o.BagType), t("Filling", o.Filling),
		q("Layer breakdown", book.UnitKV, o.LayerBreakdown), t("Process", o.Process),
		t("Vessel material", o.VesselMaterial), t("Vessel class", o.VesselClass), q("Vessel diameter", book.UnitMetre, o.VesselDiameter),
		t("Filter", o.Filter), q("Residence time", book.UnitSecond, o.Residence), t("Second phase", o.SecondPhase), q("Inlet velocity", book.UnitMPerS, o.InletVelocity),
	}
}

func ratioValue(r *float64) Value {
	if r == nil {
		return Value{}
	}
	return numValue(book.UnitRatio, *r)
}

// auditJSON is the part of audit.WriteJSON's document compare reads.
type auditJSON struct {
	Survey struct {
		File   string `json:"file"`
		SHA256 string `json:"sha256"`
	} `json:"survey"`
	Site struct {
		ID              string   `json:"id"`
		Name            string   `json:"name"`
		SurveyDate      string   `json:"survey_date"`
		SurveyedBy      string   `json:"surveyed_by"`
		RHPct           *float64 `json:"relative_humidity_pct"`
		AirTemperatureK *float64 `json:"air_temperature_K"`
		RequiredMargin  *float64 `json:"required_margin"`
	} `json:"site"`
	Stations []struct {
		ID         string   `json:"id"`
		Name       string   `json:"name"`
		Line       string   `json:"line"`
		Atmosphere *string  `json:"atmosphere"`
		MIEJ       *float64 `json:"mie_J"`
		Zone       *string  `json:"zone"`
		Group      *string  `json:"group"`
		Rank       int      `json:"rank"`
		Verdict    string   `json:"verdict"`
		WorstRatio *float64 `json:"worst_ratio"`
		Assumed    bool     `json:"worst_ratio_assumed_resistance"`
		Rejected   int      `json:"rejected_rows"`
	} `json:"stations"`
	Objects  []map[string]json.RawMessage `json:"objects"`
	Rejected []struct {
		Sheet   string `json:"sheet"`
		Row     int    `json:"row"`
		ID      string `json:"id"`
		Message string `json:"message"`
	} `json:"rejected"`
}

// jsonField is an object key of an audit JSON compared, its name and display unit.
type jsonField struct {
	Key, Name string
	Unit      book.Unit
	Text      bool
}

// jsonFields are the object keys of an audit JSON compared, in order; the JSON
// carries the model's results, not the survey's readings.
func jsonFields() []jsonField {
	return []jsonField{
		{"station", "Station", 0, true}, {"kind", "Kind", 0, true}, {"potential_V", "Potential", book.UnitKV, false}, {"capacitance_F", "Capacitance", book.UnitPF, false},
		{"charge_density_C_per_m2", "Charge density", book.UnitUCPerM2, false}, {"surface_field_V_per_m", "Surface field", book.UnitKVPerM, false},
		{"charging_current_A", "Charging current", book.UnitUA, false}, {"surface_resistivity_ohm", "Surface resistivity", book.UnitOhmSq, false},
		{"energy_J", "Energy", book.UnitMJ, false}, {"effective_discharge", "Effective discharge", 0, true}, {"verdict", "Verdict", 0, true}, {"ratio", "Ratio E/MIE", book.UnitRatio, false},
	}
}

func strOf(p *string) string {
	if p == nil {
		return ""
	}
	return *p
}

// SideFromJSON reads an audit JSON as written by audit.WriteJSON. Its objects
// carry results, not readings, so the fields compared are the model's
// quantities (potential, capacitance, charge density...), the verdict and the ratio.
func SideFromJSON(label string, data []byte) (*Side, error) {
	var d auditJSON
	if err := json.Unmarshal(data, &d); err != nil {
		return nil, fmt.Errorf("%s: not an audit JSON: %w", label, err)
	}
	if d.Objects == nil && d.Stations == nil {
		return nil, fmt.Errorf("%s: not an audit JSON: no \"objects\" nor \"stations\"", label)
	}
	sum := sha256.Sum256(data)
	// The survey's identity is the checksum recorded in the JSON; the JSON
	// file's own checksum is kept apart.
	s := &Side{Label: label, Identity: Identity{Path: label, SHA256: d.Survey.SHA256, FileSHA256: hex.EncodeToString(sum[:]), Site: d.Site.Name, SiteID: d.Site.ID, SurveySHA256: d.Survey.SHA256, Results: true}}
	if t, err := time.Parse("2006-01-02", d.Site.SurveyDate); err == nil {
		s.Identity.SurveyDate = t
	}
	num := func(u book.Unit, p *float64) Value {
		if p == nil {
			return Value{}
		}
		return numValue(u, *p)
	}
	s.Site = []Field{{"Surveyed by", textValue(d.Site.SurveyedBy)}, {"Relative humidity", num(book.UnitPercentRH, d.Site.RHPct)},
		{"Air temperature", num(book.UnitCelsius, d.Site.AirTemperatureK)}, {"Required margin", num(book.UnitDimless, d.Site.RequiredMargin)}}
	for i, m := range d.Objects {
		var id string
		if err := json.Unmarshal(m["id"], &id); err != nil || id == "" {
			return nil, fmt.Errorf("%s: objects[%d] has no \"id\"", label, i)
		}
		o := SideObject{ID: id}
		for _, k := range jsonFields() {
			raw, ok := m[k.Key]
			val := Value{}
			if ok && string(raw) != "null" {
				var str string
				var f float64
				switch {
				case json.Unmarshal(raw, &str) == nil:
					val = textValue(str)
				case json.Unmarshal(raw, &f) == nil:
					val = numValue(k.Unit, f)
					if k.Key == "ratio" {
						o.Ratio = &f
						var assumed bool
						if raw, ok := m["ratio_assumed_resistance"]; ok && json.Unmarshal(raw, &assumed) == nil && assumed {
							o.RatioAssumed = true
							val = textValue(assess.RatioAssumedText)
						}
					}
				default:
					val = textValue(string(raw))
				}
			}
			switch k.Key {
			case "station":
				o.Station = val.Text
			case "verdict":
				o.Verdict = val.Text
			}
			o.Fields = append(o.Fields, Field{k.Name, val})
		}
		s.Objects = append(s.Objects, o)
	}
	for _, st := range d.Stations {
		s.Stations = append(s.Stations, SideStation{ID: st.ID, Name: st.Name, Rank: st.Rank, Verdict: st.Verdict, WorstRatio: st.WorstRatio,
			WorstRatioAssumed: st.Assumed, RejectedRows: st.Rejected})
		s.StationFields = append(s.StationFields, StationFields{ID: st.ID, Fields: []Field{
			{"Name", textValue(st.Name)}, {"Line", textValue(st.Line)}, {"Atmosphere", textValue(strOf(st.Atmosphere))},
			{"Zone", textValue(strOf(st.Zone))}, {"MIE", num(book.UnitMJ, st.MIEJ)}, {"Gas or dust group", textValue(strOf(st.Group))}}})
	}
	rows := map[int]bool{} // the JSON lists each problem: one entry per row
	for _, r := range d.Rejected {
		if r.Sheet == inventory.SheetObjects && !rows[r.Row] {
			rows[r.Row] = true
			s.Rejected = append(s.Rejected, RejectedObject{ID: r.ID, Row: r.Row, Why: r.Message})
		}
	}
	return s, nil
}

// normSite is a site name or ID compared: case and runs of spaces aside.
func normSite(s string) string { return strings.ToLower(strings.Join(strings.Fields(s), " ")) }

// cautions are the reasons the two sides may not compare as two surveys of
// one site in date order.
func cautions(old, new Identity) []Caution {
	var out []Caution
	add := func(k CautionKind, format string, a ...any) {
		out = append(out, Caution{k, fmt.Sprintf(format, a...)})
	}
	switch {
	case old.SiteID != "" && new.SiteID != "" && normSite(old.SiteID) != normSite(new.SiteID):
		add(CautionDifferentSites, "The two surveys are of different sites: Site ID %q (old) and %q (new). The comparison is of two places, not a repeat survey.", old.SiteID, new.SiteID)
	case (old.SiteID == "" || new.SiteID == "") && normSite(old.Site) != normSite(new.Site):
		add(CautionDifferentSites, "The two surveys name different sites: %q (old) and %q (new). Check that they are the same site before reading the differences as changes over time.", old.SiteText(), new.SiteText())
	case (old.SiteID == "") != (new.SiteID == ""):
		add(CautionOneSiteID, "Only one survey gives a Site ID (old %q, new %q): compared as one site by name, but a portfolio of the two ranks them as two sites until both give the same Site ID.", old.SiteID, new.SiteID)
	}
	switch {
	case old.SurveyDate.IsZero() || new.SurveyDate.IsZero():
		add(CautionNoDate, "A survey date is missing (old: %s, new: %s): the order of the two surveys cannot be checked.", old.DateText(), new.DateText())
	case old.SurveyDate.After(new.SurveyDate):
		add(CautionReversedDates, "The old survey (%s) is dated after the new one (%s): the order looks reversed, so 'added', 'removed', 'before' and 'after' read backwards. Swap OLD and NEW unless this is meant.", old.DateText(), new.DateText())
	case old.SurveyDate.Equal(new.SurveyDate) && sameSurvey(old, new):
		// said below: the same survey
	case old.SurveyDate.Equal(new.SurveyDate):
		add(CautionSameDate, "Both surveys carry the same date (%s): two versions of one survey, not a repeat survey.", old.DateText())
	}
	switch {
	case sameSurvey(old, new) && (old.FileSHA256 == "") != (new.FileSHA256 == ""):
		add(CautionSameFile, "Both sides are the same survey (same SHA-256 checksum %s; one side is the audit JSON made from it): nothing in the survey can have changed.", shortSum(old.SHA256))
	case sameSurvey(old, new) && old.FileSHA256 != "" && old.FileSHA256 != new.FileSHA256:
		add(CautionSameFile, "Both audit JSON files were made from the same survey (same SHA-256 checksum %s): nothing in the survey can have changed; any difference is of the tool or its options.", shortSum(old.SHA256))
	case sameSurvey(old, new):
		add(CautionSameFile, "The two files are identical (same SHA-256 checksum): the same survey, nothing can have changed.")
	}
	if old.Results || new.Results {
		add(CautionResultsOnly, "At least one side is an audit JSON, which holds results and no readings: both sides are compared on the audit's results (potential, energy, verdict) and on the settings the JSON holds (site RH, air temperature, margin; each station's atmosphere, zone, MIE and group); a station's own RH, the limit overrides and the readings are not compared.")
	}
	return out
}

// sameSurvey reports whether both sides are of the same survey file (their
// survey checksums agree).
func sameSurvey(old, new Identity) bool { return old.SHA256 != "" && old.SHA256 == new.SHA256 }

// fieldChanges lists the fields of after whose value differs in before, then
// the fields only in before (a limit override removed).
func fieldChanges(station string, before, after []Field) []FieldChange {
	bv := map[string]Value{}
	for _, f := range before {
		bv[f.Name] = f.Value
	}
	seen := map[string]bool{}
	var out []FieldChange
	for _, f := range after {
		seen[f.Name] = true
		b, ok := bv[f.Name]
		if !ok {
			if f.Value.Text == "" && f.Value.SI == nil {
				continue
			}
			b = Value{}
		}
		if !b.Equal(f.Value) {
			out = append(out, FieldChange{Station: station, Field: f.Name, Before: b, After: f.Value})
		}
	}
	for _, f := range before {
		if !seen[f.Name] && (f.Value.Text != "" || f.Value.SI != nil) {
			out = append(out, FieldChange{Station: station, Field: f.Name, Before: f.Value})
		}
	}
	return out
}

// commonFields keeps the fields of a that other holds too and adds the names
// of the others to skipped, after where ("station relative humidity"; the
// limit overrides as one "limit overrides").
func commonFields(where string, a, other []Field, skipped map[string]bool) []Field {
	has := map[string]bool{}
	for _, f := range other {
		has[f.Name] = true
	}
	var out []Field
	for _, f := range a {
		if has[f.Name] {
			out = append(out, f)
			continue
		}
		if f.Value.Text == "" && f.Value.SI == nil && !strings.HasPrefix(f.Name, "Limit: ") {
			continue // not given on this side either: nothing left out
		}
		switch {
		case strings.HasPrefix(f.Name, "Limit: "):
			skipped["limit overrides"] = true
		default:
			n := strings.ToLower(f.Name[:1]) + f.Name[1:]
			if !strings.HasPrefix(n, where) {
				n = where + " " + n
			}
			skipped[n] = true
		}
	}
	return out
}

// NotComparedText says which settings were not compared, or "".
func (c *Comparison) NotComparedText() string {
	if len(c.NotCompared) == 0 {
		return ""
	}
	return "not compared (audit JSON side): " + strings.Join(c.NotCompared, ", ")
}

// Compare finds the cautions, the Site and station settings changed, the
// objects added, removed and changed between two sides, and the stations whose
// rank moved or verdict changed.
func Compare(old, new *Side) *Comparison {
	c := &Comparison{Old: old, New: new, Cautions: cautions(old.Identity, new.Identity)}
	// An audit JSON side holds some of the settings only: those both sides
	// hold are compared, the others named as not compared.
	results := old.Identity.Results || new.Identity.Results
	notCompared := map[string]bool{}
	if results {
		// An audit JSON never holds these (audit.WriteJSON).
		notCompared["station relative humidity"], notCompared["limit overrides"] = true, true
	}
	both := func(where string, a, b []Field) ([]Field, []Field) {
		if !results {
			return a, b
		}
		return commonFields(where, a, b, notCompared), commonFields(where, b, a, notCompared)
	}
	oSite, nSite := both("site", old.Site, new.Site)
	c.SiteChanges = fieldChanges("", oSite, nSite)
	oldSF := map[string][]Field{}
	for _, s := range old.StationFields {
		oldSF[s.ID] = s.Fields
	}
	for _, s := range new.StationFields {
		if b, ok := oldSF[s.ID]; ok {
			ob, nb := both("station", b, s.Fields)
			c.StationChanges = append(c.StationChanges, fieldChanges(s.ID, ob, nb)...)
		}
	}
	for n := range notCompared {
		c.NotCompared = append(c.NotCompared, n)
	}
	slices.Sort(c.NotCompared)
	c.RejectedOld, c.RejectedNew = old.Rejected, new.Rejected
	rejOld, rejNew := rejectedIDs(old.Rejected), rejectedIDs(new.Rejected)
	// stationOf finds an object's station on either side (rejected rows give theirs when readable).
	stationOf := map[string]string{}
	for _, r := range append(append([]RejectedObject(nil), old.Rejected...), new.Rejected...) {
		if r.ID != "" && r.Station != "" {
			stationOf[r.ID] = r.Station
		}
	}
	oldByID := map[string]*SideObject{}
	for i := range old.Objects {
		oldByID[old.Objects[i].ID] = &old.Objects[i]
		stationOf[old.Objects[i].ID] = old.Objects[i].Station
	}
	added, removed, rejected := map[string][]string{}, map[string][]string{}, map[string][]string{}
	newIDs := map[string]bool{}
	for i := range new.Objects {
		n := &new.Objects[i]
		newIDs[n.ID] = true
		stationOf[n.ID] = n.Station
		o, ok := oldByID[n.ID]
		if !ok {
			if rejOld[n.ID] {
				// rejected in OLD: not assessed there, so not "added"
				rejected[n.Station] = append(rejected[n.Station], n.ID)
				continue
			}
			c.Added = append(c.Added, n.ID)
			added[n.Station] = append(added[n.Station], n.ID)
			continue
		}
		ch := Changed{ID: n.ID, Station: n.Station, VerdictBefore: o.Verdict, VerdictAfter: n.Verdict, RatioBefore: o.Ratio, RatioAfter: n.Ratio,
			RatioAssumedBefore: o.RatioAssumed, RatioAssumedAfter: n.RatioAssumed}
		ov := map[string]Value{}
		for _, f := range o.Fields {
			ov[f.Name] = f.Value
		}
		for _, f := range n.Fields {
			if b, ok := ov[f.Name]; ok && !b.Equal(f.Value) {
				ch.Fields = append(ch.Fields, f.Name)
				ch.Before = append(ch.Before, b)
				ch.After = append(ch.After, f.Value)
			}
		}
		if len(ch.Fields) > 0 {
			c.Changed = append(c.Changed, ch)
		}
	}
	for _, o := range old.Objects {
		if newIDs[o.ID] {
			continue
		}
		if rejNew[o.ID] {
			// rejected in NEW: not assessed there, so never "removed"
			rejected[o.Station] = append(rejected[o.Station], o.ID)
			continue
		}
		c.Removed = append(c.Removed, o.ID)
		removed[o.Station] = append(removed[o.Station], o.ID)
	}
	// A row rejected on both sides, or rejected on one side and absent on
	// the other, still leaves its station's objects uncertain.
	for _, r := range append(append([]RejectedObject(nil), old.Rejected...), new.Rejected...) {
		st := stationOf[r.ID]
		if r.ID == "" || st == "" || slices.Contains(rejected[st], r.ID) {
			continue
		}
		rejected[st] = append(rejected[st], r.ID)
	}
	if n := c.Rejected(); n > 0 {
		c.Cautions = append(c.Cautions, Caution{CautionRejected, rejectedCautionText(c)})
	}
	anyDiffer := len(added)+len(removed)+len(rejected) > 0
	oldSt := map[string]SideStation{}
	for _, s := range old.Stations {
		oldSt[s.ID] = s
	}
	seen := map[string]bool{}
	for _, n := range new.Stations {
		seen[n.ID] = true
		o, ok := oldSt[n.ID]
		if ok && o.Rank == n.Rank && o.Verdict == n.Verdict {
			continue
		}
		m := RankMove{ID: n.ID, Name: n.Name, RankAfter: n.Rank, VerdictAfter: n.Verdict, WorstRatioAfter: n.WorstRatio, WorstRatioAssumedAfter: n.WorstRatioAssumed,
			Added: added[n.ID], Removed: removed[n.ID], Rejected: rejected[n.ID]}
		if ok {
			m.RankBefore, m.VerdictBefore, m.WorstRatioBefore, m.WorstRatioAssumedBefore = o.Rank, o.Verdict, o.WorstRatio, o.WorstRatioAssumed
			m.OnlyOthers = anyDiffer && !m.ObjectsDiffer() && o.Verdict == n.Verdict && o.WorstRatioAssumed == n.WorstRatioAssumed && ratioEq(o.WorstRatio, n.WorstRatio)
		}
		c.Stations = append(c.Stations, m)
	}
	for _, o := range old.Stations {
		if !seen[o.ID] {
			c.Stations = append(c.Stations, RankMove{ID: o.ID, Name: o.Name, RankBefore: o.Rank, VerdictBefore: o.Verdict, WorstRatioBefore: o.WorstRatio,
				WorstRatioAssumedBefore: o.WorstRatioAssumed})
		}
	}
	return c
}

func rejectedIDs(rs []RejectedObject) map[string]bool {
	out := map[string]bool{}
	for _, r := range rs {
		if r.ID != "" {
			out[r.ID] = true
		}
	}
	return out
}

// rejectedCautionText says which side rejected Objects rows and where to look.
func rejectedCautionText(c *Comparison) string {
	var parts []string
	for _, g := range c.rejectedSides() {
		parts = append(parts, fmt.Sprintf("%d object row(s) rejected in %s (%s): see its audit's Rejected sheet ('sparkmargin check')", g.n, g.side, g.ids))
	}
	return strings.Join(parts, "; ") + ". Those objects are not assessed on that side: they are listed as rejected, never as added or removed, and their stations' ranks leave them out."
}

// rejectedSide is one side's rejected object rows: "OLD" or "NEW", how
// many, and their texts joined by "; ".
type rejectedSide struct {
	side string
	n    int
	ids  string
}

// rejectedSides lists the sides with rejected object rows, OLD first.
func (c *Comparison) rejectedSides() []rejectedSide {
	var out []rejectedSide
	for _, g := range []struct {
		side string
		rs   []RejectedObject
	}{{"OLD", c.RejectedOld}, {"NEW", c.RejectedNew}} {
		if len(g.rs) == 0 {
			continue
		}
		ids := make([]string, len(g.rs))
		for k, r := range g.rs {
			ids[k] = r.Text()
		}
		out = append(out, rejectedSide{g.side, len(g.rs), strings.Join(ids, "; ")})
	}
	return out
}

// Text names a rejected row: "PWD-DRUM (row 4: ...)".
func (r RejectedObject) Text() string {
	id := r.ID
	if id == "" {
		id = "ID not readable"
	}
	var at []string
	if r.Row > 0 {
		at = append(at, fmt.Sprintf("row %d", r.Row))
	}
	if r.Why != "" {
		at = append(at, r.Why)
	}
	if len(at) == 0 {
		return id
	}
	return id + " (" + strings.Join(at, ": ") + ")"
}

// HasCaution reports whether the comparison carries a caution of kind k.
func (c *Comparison) HasCaution(k CautionKind) bool {
	return slices.ContainsFunc(c.Cautions, func(x Caution) bool { return x.Kind == k })
}

// VerdictChanged reports whether the object's verdict differs between the sides.
func (c Changed) VerdictChanged() bool { return c.VerdictBefore != c.VerdictAfter }

// hasField reports whether name is among the changed fields.
func (c Changed) hasField(name string) bool { return slices.Contains(c.Fields, name) }
