package inventory

// Dimension is the physical dimension of a column; a unit written in a cell must
// have the column's dimension.
type Dimension uint8

// Dimensions of survey columns.
const (
	Text          Dimension = iota // free text or a code from a list
	Dimensionless                  // a plain number (relative permittivity, margin)
	Length                         // m
	ElectricField                  // V/m (also breakdown strength, kV/mm)
	Potential                      // V
	Speed                          // m/s
	MassFlow                       // kg/s
	ChargeToMass                   // C/kg
	Current                        // A
	Time                           // s
	Resistance                     // ohm (also surface resistivity, ohm per square)
	Resistivity                    // ohm m
	Capacitance                    // F
	Energy                         // J
	Percent                        // % (relative humidity)
	Temperature                    // °C on the sheet, K inside
	Conductivity                   // S/m
	Slope                          // decades per 10 %RH
	Date                           // a date
	// Dimensions of Site sheet limit items only (no survey column has them).
	Charge        // C
	Area          // m²
	ChargeDensity // C/m²
	SpeedDiameter // m²/s, velocity × pipe diameter of the filling rules
)

// Column is one column of the survey contract.
type Column struct {
	Name string    // header name without unit, as the template writes it
	Unit string    // header unit in brackets ("kV/m"); "" for none
	Dim  Dimension // dimension a cell's own unit must have
	Hint string    // input hint shown on the template header
	List string    // name of the drop-down list, "" for none (see Lists)
}

// Header returns the header text as the template writes it: "Field [kV/m]".
func (c Column) Header() string {
	if c.Unit == "" {
		return c.Name
	}
	return c.Name + " [" + c.Unit + "]"
}

// Drop-down list names.
const (
	ListKind           = "Kind"
	ListBacking        = "Backing"
	ListZone           = "Zone"
	ListGroup          = "Group"
	ListAtmosphereKind = "Kind of atmosphere"
	ListMaterial       = "Material"
	ListStation        = "Station"
	ListAtmosphere     = "Atmosphere"
	ListMaterialClass  = "Class"
	ListBagType        = "Bag type"
	ListFilling        = "Filling"
	ListSubstance      = "Substance"
	ListProcess        = "Process"
	// Liquid transfer (appended with the operation-by-operation liquid rules).
	ListVesselMaterial = "Vessel material"
	ListVesselClass    = "Vessel class"
	ListFilter         = "Filter"
	ListSecondPhase    = "Second phase"
)

// FixedLists returns the values of the drop-down lists that do not depend on the survey.
func FixedLists() map[string][]string {
	return map[string][]string{
		ListKind:           Kinds(),
		ListBacking:        {"none", "earthed"},
		ListZone:           {"0", "1", "2", "20", "21", "22", "none"},
		ListGroup:          {"IIA", "IIB", "IIC", "IIIA", "IIIB", "IIIC"},
		ListAtmosphereKind: {"gas", "vapour", "mist", "dust", "hybrid", "none"},
		ListMaterialClass:  {"conductive", "dissipative", "insulating"},
		ListBagType:        {"A", "B", "C", "D"},
		ListFilling:        {"top", "bottom", "dip pipe"},
		ListProcess:        {"moving web", "belt", "pneumatic conveying", "fixed equipment"},
		ListVesselMaterial: {"metal", "insulating", "lined", "glass"},
		ListVesselClass:    {"road tanker", "rail tank car", "fixed tank", "IBC", "drum", "can"},
		ListFilter:         {"none", "strainer", "filter"},
		ListSecondPhase:    {"none", "free water", "suspended solids", "immiscible liquid"},
	}
}

// SiteItems are the rows of the Site sheet (an Item | Value sheet).
var siteItems = []Column{
	{Name: "Site", Dim: Text, Hint: "Site or plant name (required)"},
	{Name: "Site ID", Dim: Text, Hint: "Optional: the same code on every survey of one site or line, so repeat surveys group together (else site name and line)"},
	{Name: "Survey date", Dim: Date, Hint: "Date of the readings, e.g. 2026-03-14 (required)"},
	{Name: "Surveyed by", Dim: Text, Hint: "Name or team (optional)"},
	{Name: "Relative humidity", Unit: "%", Dim: Percent, Hint: "Ambient RH during the readings, 0-100 (required)"},
	{Name: "Air temperature", Unit: "°C", Dim: Temperature, Hint: "For air density in the corona-onset cap; default 20 °C"},
	{Name: "Required margin", Dim: Dimensionless, Hint: "Energy must stay below MIE / margin to count as non-incendive; default 10 (a site choice)"},
	// The sign-off block of the audit (its Summary and Report sheets); each is
	// optional: a blank item leaves a line to sign by hand.
	{Name: SiteItemPreparedBy, Dim: Text, Hint: "Who prepared the assessment (optional; printed in the audit's sign-off block, else a blank line to sign)"},
	{Name: SiteItemPreparedOn, Dim: Date, Hint: "Date prepared, e.g. 2026-03-20 (optional)"},
	{Name: SiteItemReviewedBy, Dim: Text, Hint: "Who reviewed it (optional; else a blank line to sign)"},
	{Name: SiteItemReviewedOn, Dim: Date, Hint: "Date reviewed (optional)"},
	{Name: SiteItemApprovedBy, Dim: Text, Hint: "Who approved it (optional; else a blank line to sign)"},
	{Name: SiteItemApprovedOn, Dim: Date, Hint: "Date approved (optional)"},
	{Name: SiteItemRevision, Dim: Text, Hint: "Revision of the assessment, e.g. A or 2 (optional)"},
	{Name: SiteItemScope, Dim: Text, Hint: "What the assessment covers, e.g. line C2, coating to rewind (optional)"},
}

// SiteItems returns the items of the Site sheet.
func SiteItems() []Column { return append([]Column(nil), siteItems...) }

var atmosphereColumns = []Column{
	{Name: "ID", Dim: Text, Hint: "Short unique code, e.g. A-TOL"},
	{Name: "Description", Dim: Text, Hint: "e.g. toluene vapour at the coater"},
	{Name: "Substance", Dim: Text, List: ListSubstance, Hint: "Optional: a built-in substance fills MIE and Group when they are blank"},
	{Name: "Kind", Dim: Text, List: ListAtmosphereKind, Hint: "gas, vapour, mist, dust, hybrid or none"},
	{Name: "MIE", Unit: "mJ", Dim: Energy, Hint: "Minimum ignition energy the site accepts for it"},
	{Name: "Group", Dim: Text, List: ListGroup, Hint: "IIA, IIB, IIC (gas, vapour) or IIIA, IIIB, IIIC (dust)"},
	{Name: "Zone", Dim: Text, List: ListZone, Hint: "0, 1, 2, 20, 21, 22 or none, from the site's hazardous-area classification"},
	{Name: "Notes", Dim: Text, Hint: "Free text"},
}

var stationColumns = []Column{
	{Name: "ID", Dim: Text, Hint: "Unique station code, e.g. ST-UNW"},
	{Name: "Name", Dim: Text, Hint: "e.g. Unwind 2"},
	{Name: "Line", Dim: Text, Hint: "Production line or area"},
	{Name: "Atmosphere", Dim: Text, List: ListAtmosphere, Hint: "An ID from Atmospheres; blank: no flammable atmosphere"},
	{Name: "Relative humidity", Unit: "%", Dim: Percent, Hint: "Local RH where it differs from the site's"},
	{Name: "Notes", Dim: Text, Hint: "Free text"},
}

var objectColumns = []Column{
	{Name: "ID", Dim: Text, Hint: "Unique across the survey"},
	{Name: "Station", Dim: Text, List: ListStation, Hint: "An ID from Stations"},
	{Name: "Kind", Dim: Text, List: ListKind, Hint: "sheet, belt, roller, container, part, person, powder, liquid or bag"},
	{Name: "Description", Dim: Text, Hint: "Free text"},
	{Name: "Material", Dim: Text, List: ListMaterial, Hint: "A built-in material or one from the Materials sheet"},
	{Name: "Length", Unit: "m", Dim: Length, Hint: "Extent of a sheet, belt run or roller face"},
	{Name: "Width", Unit: "m", Dim: Length, Hint: "Width of a sheet, belt or web"},
	{Name: "Diameter", Unit: "m", Dim: Length, Hint: "Roller, container, silo or pipe diameter (liquid: the line's inner diameter)"},
	{Name: "Thickness", Unit: "mm", Dim: Length, Hint: "Insulating layer thickness (film, coating, liner, belt)"},
	{Name: "Backing", Dim: Text, List: ListBacking, Hint: "none, or earthed (the layer lies on earthed metal)"},
	{Name: "Distance to earth", Unit: "m", Dim: Length, Hint: "Gap to the nearest large earthed surface"},
	{Name: "Field", Unit: "kV/m", Dim: ElectricField, Hint: "Field-meter reading"},
	{Name: "Field distance", Unit: "m", Dim: Length, Hint: "Meter-to-surface distance for that reading"},
	{Name: "Surface potential", Unit: "kV", Dim: Potential, Hint: "Non-contact voltmeter reading, or a conductor's measured potential"},
	{Name: "Speed", Unit: "m/s", Dim: Speed, Hint: "Belt or web speed (liquid: flow velocity in the line)"},
	{Name: "Mass flow", Unit: "kg/s", Dim: MassFlow, Hint: "Powder or product flow into or through the object"},
	{Name: "Charge-to-mass", Unit: "µC/kg", Dim: ChargeToMass, Hint: "Measured, or from the process type"},
	{Name: "Charging current", Unit: "µA", Dim: Current, Hint: "Measured or estimated charging current"},
	{Name: "Charging time", Unit: "s", Dim: Time, Hint: "How long charging runs before a discharge could happen (e.g. a fill)"},
	{Name: "Particle size", Unit: "mm", Dim: Length, Hint: "Median particle size of a bulk powder"},
	{Name: "Resistance to earth", Unit: "Ω", Dim: Resistance, Hint: "Measured leakage resistance; blank: unknown, treated as not earthed"},
	{Name: "Capacitance", Unit: "pF", Dim: Capacitance, Hint: "Measured; blank takes a documented estimate"},
	{Name: "Conductivity", Unit: "pS/m", Dim: Conductivity, Hint: "Liquid conductivity (liquid rows)"},
	{Name: "Relative permittivity", Dim: Dimensionless, Hint: "Of the liquid, when not from a material (liquid rows)"},
	{Name: "Bag type", Dim: Text, List: ListBagType, Hint: "A, B, C or D (IEC 61340-4-4); blank: assessed as the most restrictive case"},
	{Name: "Filling", Dim: Text, List: ListFilling, Hint: "top (splash), bottom or dip pipe to the bottom (liquid rows); blank: top"},
	// Liquid transfer (appended with the operation-by-operation liquid rules).
	{Name: "Vessel material", Dim: Text, List: ListVesselMaterial, Hint: "Receiving vessel: metal, insulating (plastic), lined (or coated) or glass (liquid rows); blank: the stricter case"},
	{Name: "Vessel class", Dim: Text, List: ListVesselClass, Hint: "road tanker, rail tank car, fixed tank, IBC, drum or can (liquid rows); blank: the strictest class"},
	{Name: "Vessel diameter", Unit: "m", Dim: Length, Hint: "Diameter of a fixed tank (liquid rows); blank: not a large tank"},
	{Name: "Filter", Dim: Text, List: ListFilter, Hint: "Upstream of the vessel: none, strainer (coarse) or filter (fine or micro-filter) (liquid rows)"},
	{Name: "Residence time", Unit: "s", Dim: Time, Hint: "Time the liquid takes from the filter to the vessel (liquid rows); blank: none"},
	{Name: "Second phase", Dim: Text, List: ListSecondPhase, Hint: "none, free water, suspended solids or immiscible liquid (liquid rows)"},
	{Name: "Inlet velocity", Unit: "m/s", Dim: Speed, Hint: "Velocity at the inlet until it is submerged (liquid rows); blank: the slow start is not shown met"},
	{Name: "Layer breakdown", Unit: "kV", Dim: Potential, Hint: "Measured breakdown voltage of the insulating layer itself (IEC 60243-1 style); blank: taken above 4 kV. Only a measured value at or below 4 kV rules out a propagating brush"},
	{Name: "Process", Dim: Text, List: ListProcess, Hint: "moving web, belt, pneumatic conveying (product through this insulating pipe, hose or liner) or fixed equipment; blank: a belt, or a sheet with a Speed, is process material; anything else fixed equipment (area limit)"},
	{Name: "Notes", Dim: Text, Hint: "Free text"},
}

var materialColumns = []Column{
	{Name: "Name", Dim: Text, Hint: "Unique; a built-in name here overrides the built-in values"},
	{Name: "Class", Dim: Text, List: ListMaterialClass, Hint: "conductive, dissipative or insulating"},
	{Name: "Relative permittivity", Dim: Dimensionless, Hint: "epsr"},
	{Name: "Surface resistivity", Unit: "Ω/sq", Dim: Resistance, Hint: "At 50 % RH (ohm per square; a header in [Ω] is read the same)"},
	{Name: "Humidity slope", Unit: "decades per 10 %RH", Dim: Slope, Hint: "How fast log10 of surface resistivity falls with RH (0 for hydrophobic plastics)"},
	{Name: "Volume resistivity", Unit: "Ω·m", Dim: Resistivity, Hint: "Bulk resistivity (powders, thick parts)"},
	{Name: "Breakdown strength", Unit: "kV/mm", Dim: ElectricField, Hint: "Dielectric strength of the layer"},
	{Name: "Notes", Dim: Text, Hint: "Source of the values"},
}

var changeColumns = []Column{
	{Name: "Change", Dim: Text, Hint: changeKindHint()},
	{Name: "Target", Dim: Text, Hint: changeTargetHint()},
	{Name: "Value", Dim: Text, Hint: "New value with its unit, e.g. 60 %, 1e6 ohm, PE"},
	{Name: "Notes", Dim: Text, Hint: "Why: the plan this change belongs to"},
}

// SheetColumns returns the columns of a table sheet of the contract
// (Atmospheres, Stations, Objects, Materials, Changes); nil for others.
func SheetColumns(sheet string) []Column {
	var cols []Column
	switch sheet {
	case SheetAtmospheres:
		cols = atmosphereColumns
	case SheetStations:
		cols = stationColumns
	case SheetObjects:
		cols = objectColumns
	case SheetMaterials:
		cols = materialColumns
	case SheetChanges:
		cols = changeColumns
	default:
		return nil
	}
	return append([]Column(nil), cols...)
}

// Sheets returns the sheets of the contract in workbook order (Changes is optional
// and not written by the template).
func Sheets() []string {
	return []string{SheetSite, SheetAtmospheres, SheetStations, SheetObjects, SheetMaterials}
}
