package inventory

import (
	"fmt"
	"math"
	"strings"
	"time"
)

// Sheet names of the survey contract (matched case-insensitively on input).
const (
	SheetSite        = "Site"
	SheetAtmospheres = "Atmospheres"
	SheetStations    = "Stations"
	SheetObjects     = "Objects"
	SheetMaterials   = "Materials"
	SheetChanges     = "Changes"
)

// Quantity is one numeric survey value, converted to SI units.
// A blank cell ("not measured") has Known false; it is never read as zero.
type Quantity struct {
	Value float64 // SI value; meaningful only when Known
	Known bool    // false: blank, "n/a", "-", "?"
	// RelUncertainty is a relative standard uncertainty given in the cell
	// itself ("12 kV ±10%" gives 0.10); 0 means none given, use the default.
	RelUncertainty float64
	// Cell is the A1 reference the value came from ("K14"), for messages.
	Cell string
}

// Known returns a known quantity with value v (used by tests and by whatif changes).
func Known(v float64) Quantity { return Quantity{Value: v, Known: true} }

// OrNaN returns the SI value, or NaN when the quantity was not given.
// The model package takes NaN as "not given".
func (q Quantity) OrNaN() float64 {
	if !q.Known {
		return math.NaN()
	}
	return q.Value
}

// Site is the Site sheet: one survey's identity and site-wide settings.
type Site struct {
	Name string
	// ID is the optional Site ID item: a code the surveyor gives every survey
	// of one site or line, so that repeat surveys are known as one site.
	ID         string
	SurveyDate time.Time // UTC midnight of the survey date
	SurveyedBy string
	// RelativeHumidity in percent (0-100): the one quantity kept in the unit people use,
	// because every formula and table in the trade is stated in %RH.
	RelativeHumidity Quantity
	// AirTemperature in kelvin (the sheet gives °C); default 293.15 K.
	AirTemperature Quantity
	// RequiredMargin: energy must stay below MIE / margin to be non-incendive. Default 10.
	RequiredMargin Quantity
	// Items holds every other Item/Value pair of the sheet as written, keyed
	// by the normalised item name. The overrides they give are validated into
	// Limits and Uncertainties (sitesettings.go); read those, not Items.
	Items []SiteItem
	// Limits are the limit overrides of the Site sheet, in sheet order, SI units.
	Limits []SiteLimit
	// Uncertainties are the uncertainty-table overrides of the Site sheet, in sheet order.
	Uncertainties []SiteUncertainty
	// Defaults lists the site values that were defaulted, for the Method sheet.
	Defaults []SiteDefault
	// SignOff is the sign-off block as the Site sheet gives it (all optional).
	SignOff SignOff
}

// SignOff is who prepared, reviewed and approved the assessment, when, its
// revision and its scope, from the Site sheet's optional items of those
// names; an empty field is a line left to fill in by hand.
type SignOff struct {
	PreparedBy, ReviewedBy, ApprovedBy string
	PreparedOn, ReviewedOn, ApprovedOn time.Time // UTC midnight; zero when not given
	Revision, Scope                    string
}

// Names of the Site sheet's sign-off items (SiteItems).
const (
	SiteItemPreparedBy = "Prepared by"
	SiteItemPreparedOn = "Prepared on"
	SiteItemReviewedBy = "Reviewed by"
	SiteItemReviewedOn = "Reviewed on"
	SiteItemApprovedBy = "Approved by"
	SiteItemApprovedOn = "Approved on"
	SiteItemRevision   = "Revision"
	SiteItemScope      = "Scope"
)

// Site items that the reader may default (SiteDefault.Item).
const (
	SiteItemAirTemperature = "Air temperature"
	SiteItemRequiredMargin = "Required margin"
)

// SiteDefault is a Site value the reader set because the sheet gave none.
type SiteDefault struct {
	Item string // the item defaulted, as SiteItems names it (SiteItemAirTemperature, ...)
	Text string // the value and why, as the Method sheet shows it: "Air temperature 20 °C (default)"
}

// Defaulted reports whether the reader defaulted the Site item (a SiteItem* name).
func (s Site) Defaulted(item string) bool {
	for _, d := range s.Defaults {
		if d.Item == item {
			return true
		}
	}
	return false
}

// DefaultTexts returns the texts of the defaults, in order.
func (s Site) DefaultTexts() []string {
	out := make([]string, len(s.Defaults))
	for i, d := range s.Defaults {
		out[i] = d.Text
	}
	return out
}

// SiteItem is one extra Item/Value row of the Site sheet.
type SiteItem struct {
	Key   string // normalised item name (lower case, single spaces, unit kept)
	Item  string // item text as written
	Value string // raw cell text
	Row   int
}

// Atmosphere is one row of the Atmospheres sheet.
type Atmosphere struct {
	ID          string
	Description string
	Substance   string   // canonical built-in name when matched, else as written
	Kind        string   // gas, vapour, mist, dust, hybrid, none (lower case)
	MIE         Quantity // joules
	Group       string   // IIA, IIB, IIC, IIIA, IIIB, IIIC or ""
	Zone        string   // "0","1","2","20","21","22","none"
	Notes       string
	// MIEFromSubstance and GroupFromSubstance record that the value was filled
	// from the built-in substance list (an assumed default shown on the Method sheet).
	MIEFromSubstance   bool
	GroupFromSubstance bool
	Row                int
}

// Station is one row of the Stations sheet.
type Station struct {
	ID               string
	Name             string
	Line             string
	Atmosphere       string   // an Atmosphere ID, "" for none
	RelativeHumidity Quantity // percent; not Known means "use the site's"
	Notes            string
	Row              int
}

// Object kinds.
const (
	KindSheet     = "sheet"
	KindBelt      = "belt"
	KindRoller    = "roller"
	KindContainer = "container"
	KindPart      = "part"
	KindPerson    = "person"
	KindPowder    = "powder"
	KindLiquid    = "liquid"
	KindBag       = "bag"
)

// Kinds lists every object kind in the order the template's drop-down shows them.
func Kinds() []string {
	return []string{KindSheet, KindBelt, KindRoller, KindContainer, KindPart, KindPerson, KindPowder, KindLiquid, KindBag}
}

// Object is one row of the Objects sheet, every quantity in SI units.
type Object struct {
	ID          string
	Station     string
	Kind        string // one of the Kind constants
	Description string
	Material    string // canonical material name ("" when not given)

	Length          Quantity // m
	Width           Quantity // m
	Diameter        Quantity // m
	Thickness       Quantity // m (the sheet gives mm)
	Backing         string   // "none" or "earthed" ("" when not given)
	DistanceToEarth Quantity // m

	Field            Quantity // V/m (field-meter reading)
	FieldDistance    Quantity // m
	SurfacePotential Quantity // V

	Speed           Quantity // m/s
	MassFlow        Quantity // kg/s
	ChargeToMass    Quantity // C/kg
	ChargingCurrent Quantity // A
	ChargingTime    Quantity // s
	ParticleSize    Quantity // m (the sheet gives mm)

	Resistance  Quantity // ohm to earth; not Known: unknown, treated as not earthed
	Capacitance Quantity // F; not Known: the model estimates it

	Conductivity Quantity // S/m (liquid; the sheet gives pS/m)
	Permittivity Quantity // relative permittivity of the liquid (dimensionless)
	BagType      string   // "A","B","C","D" or ""
	Filling      string   // "top","bottom","dip pipe" or ""

	// Liquid transfer (appended with the operation-by-operation liquid rules).
	VesselMaterial string   // "metal","insulating","lined","glass" or ""
	VesselClass    string   // "road tanker","rail tank car","fixed tank","IBC","drum","can" or ""
	VesselDiameter Quantity // m, a fixed tank's diameter
	Filter         string   // "none","strainer","filter" or ""
	Residence      Quantity // s, residence time between the filter and the vessel
	SecondPhase    string   // "none","free water","suspended solids","immiscible liquid" or ""
	InletVelocity  Quantity // m/s until the inlet is submerged

	Notes string
	Row   int

	// Insulating-surface inputs (appended).
	LayerBreakdown Quantity // V, measured breakdown voltage of the layer (the sheet gives kV); not Known: taken above 4 kV
	Process        string   // "moving web", "belt", "pneumatic conveying", "fixed equipment" or ""
}

// Material is one material, built-in or from the survey's Materials sheet.
type Material struct {
	Name               string
	Class              string  // conductive, dissipative, insulating
	Permittivity       float64 // relative; NaN when unknown
	SurfaceResistivity float64 // ohm (per square) at 50 % RH; NaN when unknown
	HumiditySlope      float64 // decades of surface resistivity per 10 %RH (>= 0)
	VolumeResistivity  float64 // ohm m; NaN when unknown
	BreakdownStrength  float64 // V/m; NaN when unknown
	Source             string  // where the values come from ("from memory", a handbook, the survey)
	BuiltIn            bool    // false: from the survey's Materials sheet
	FromMemory         bool    // a built-in whose values were recalled, not confirmed against a source
	Row                int     // Materials sheet row, 0 for built-ins
}

// Substance is a built-in flammable gas, vapour or liquid with its ignition data.
type Substance struct {
	Name         string
	Kind         string  // gas or vapour
	MIE          float64 // J
	Group        string  // IIA, IIB, IIC
	Conductivity float64 // S/m of the liquid; NaN when not a liquid or unknown
	Permittivity float64 // relative permittivity of the liquid; NaN when unknown
	Source       string
	FromMemory   bool // a value (MIE, group or liquid data) recalled, not confirmed against a source
}

// Severity says whether a problem rejects its row.
type Severity int

const (
	// Error rejects the row it is on (or the whole survey when it is a sheet-level problem).
	Error Severity = iota
	// Warning is reported but the row is still accepted.
	Warning
)

func (s Severity) String() string {
	if s == Warning {
		return "warning"
	}
	return "error"
}

// Problem is one located issue in a survey, in the manner of csv.ParseError:
// it says where (sheet, row, column, field), what, and how to fix it.
type Problem struct {
	Sheet    string
	Row      int    // 1-based sheet row; 0 for sheet-level problems
	Column   string // column letters ("K"); "" for row- or sheet-level problems
	Field    string // header name of the field ("Field"), "" when not tied to one
	ID       string // ID of the row's object, station... when known
	Severity Severity
	Message  string // what is wrong, in words a surveyor can act on
	Fix      string // suggested fix, "" when none is obvious
	Err      error  // underlying cause, for errors.Is / errors.As
}

// Cell returns the place as "Objects!K14", "Objects!14" or "Objects".
func (p Problem) Cell() string {
	switch {
	case p.Row > 0 && p.Column != "":
		return fmt.Sprintf("%s!%s%d", p.Sheet, p.Column, p.Row)
	case p.Row > 0:
		return fmt.Sprintf("%s!%d", p.Sheet, p.Row)
	default:
		return p.Sheet
	}
}

// Error formats the problem as `Objects!K14 (Field): message; fix`.
func (p Problem) Error() string {
	s := p.Cell()
	if p.Field != "" {
		s += " (" + p.Field + ")"
	}
	s += ": " + p.Message
	if p.Fix != "" {
		s += "; " + p.Fix
	}
	return s
}

// Unwrap returns the underlying cause.
func (p Problem) Unwrap() error { return p.Err }

// Rejected is one input row that was not accepted, with every problem that rejected it.
type Rejected struct {
	Sheet string
	Row   int
	ID    string
	// Station is the station an Objects row names, when its Station cell was
	// readable and names an accepted station ("" otherwise): the station's
	// result is marked incomplete.
	Station  string
	Problems []Problem
}

// SheetCount says how many data rows of a sheet were read, accepted and rejected.
// Read == Accepted + Rejected always holds.
type SheetCount struct {
	Sheet    string
	Read     int
	Accepted int
	Rejected int
}

// NotUsedByAssess reports whether the sheet is the optional Changes sheet:
// only whatif reads it (and stops on a rejected row of it), so for the other
// commands its rows are neither assessed nor rejected: a row with a problem
// there is a note, counted apart ("not used by this command").
func (c SheetCount) NotUsedByAssess() bool { return c.Sheet == SheetChanges }

// RowCounts sums the rows read, accepted and rejected on the sheets the
// assessment uses, and counts apart the Changes rows with a problem
// (SheetCount.NotUsedByAssess): those are notes, not rejected rows.
func (s *Survey) RowCounts() (read, accepted, rejected, changesWithProblem int) {
	for _, c := range s.Counts {
		if c.NotUsedByAssess() {
			changesWithProblem += c.Rejected
			continue
		}
		read += c.Read
		accepted += c.Accepted
		rejected += c.Rejected
	}
	return read, accepted, rejected, changesWithProblem
}

// RejectedUsed counts the rejected rows of the sheets the assessment uses
// (the Changes sheet's left out: see SheetCount.NotUsedByAssess).
func (s *Survey) RejectedUsed() int {
	n := 0
	for _, r := range s.Rejected {
		if r.Sheet != SheetChanges {
			n++
		}
	}
	return n
}

// Change is one planned change from the survey's optional Changes sheet
// (used by whatif; the same syntax as its flags).
type Change struct {
	Change string // e.g. "rh", "station-rh", "earth", "material", "footwear", "margin"
	Target string // ID, "station:ID" or "" for site-wide
	Value  string // raw value text
	Note   string
	Row    int
}

// Survey is a read and validated line-survey workbook.
type Survey struct {
	Path   string // file it was read from ("" when built in memory)
	SHA256 string // hex digest of the file's bytes, for the audit's Method sheet

	Site        Site
	Atmospheres []Atmosphere // accepted rows, in sheet order
	Stations    []Station    // accepted rows, in sheet order
	Objects     []Object     // accepted rows, in sheet order
	// Materials holds every built-in material overridden or extended by the
	// survey's Materials sheet, in a stable order (built-ins first, then the survey's).
	Materials []Material
	Changes   []Change

	Problems []Problem    // every problem, errors and warnings, in sheet/row/column order
	Rejected []Rejected   // rows not accepted, in sheet/row order
	Counts   []SheetCount // per sheet, in contract order

	// DeclaredObjectRows is the number of data rows the Objects sheet says it
	// has (its <dimension> element, less a header row); 0 when it says
	// nothing. A writer's claim, known before the rows are read: it sizes the
	// progress line and is never used to judge.
	DeclaredObjectRows int
}

// Material returns the material with the given name (case-insensitive) or false.
func (s *Survey) Material(name string) (Material, bool) {
	for _, m := range s.Materials {
		if strings.EqualFold(m.Name, name) {
			return m, true
		}
	}
	return Material{}, false
}

// Station returns the accepted station with the given ID or false.
func (s *Survey) Station(id string) (Station, bool) {
	for _, st := range s.Stations {
		if st.ID == id {
			return st, true
		}
	}
	return Station{}, false
}

// Atmosphere returns the accepted atmosphere with the given ID or false.
func (s *Survey) Atmosphere(id string) (Atmosphere, bool) {
	for _, a := range s.Atmospheres {
		if a.ID == id {
			return a, true
		}
	}
	return Atmosphere{}, false
}

// Errors returns the problems of Error severity.
func (s *Survey) Errors() []Problem {
	var out []Problem
	for _, p := range s.Problems {
		if p.Severity == Error {
			out = append(out, p)
		}
	}
	return out
}

// Warnings returns the problems of Warning severity.
func (s *Survey) Warnings() []Problem {
	var out []Problem
	for _, p := range s.Problems {
		if p.Severity == Warning {
			out = append(out, p)
		}
	}
	return out
}
