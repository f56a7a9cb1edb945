package assess

// Provenance says where a value the audit shows comes from. It is chosen
// where the value is chosen (the assessment of the row, its station, its
// atmosphere and the model's estimate) and carried typed to the writers, which
// show it as a short mark beside the value (Provenance.Mark) and, in the JSON,
// by name (Provenance.String).
type Provenance uint8

// Provenances, from the surveyor's own reading to the tool's own choice.
const (
	ProvNone      Provenance = iota // no value
	ProvMeasured                    // read on the object's survey row
	ProvEntered                     // typed by the surveyor for the site, station or atmosphere (not on this object's row)
	ProvLibrary                     // from the built-in material or substance list
	ProvEstimated                   // a model default or estimate, not a reading
	ProvOverride                    // a Site sheet override of a limit or a tool default
)

// String is the provenance's name in the JSON and the legend: "measured",
// "entered", "library", "estimated", "override"; "" for ProvNone.
func (p Provenance) String() string {
	switch p {
	case ProvMeasured:
		return "measured"
	case ProvEntered:
		return "entered"
	case ProvLibrary:
		return "library"
	case ProvEstimated:
		return "estimated"
	case ProvOverride:
		return "override"
	}
	return ""
}

// Mark is the short mark shown beside a value in a cell: "" for a measured
// value (the plain case), "ent.", "lib.", "est.", "ovr." for the others.
// "est." is only ever on an estimate.
func (p Provenance) Mark() string {
	switch p {
	case ProvEntered:
		return "ent."
	case ProvLibrary:
		return "lib."
	case ProvEstimated:
		return "est."
	case ProvOverride:
		return "ovr."
	}
	return ""
}

// IsDefault reports whether a value of this provenance is the tool's choice
// rather than the surveyor's: estimated, library or override values are listed
// with their reasons on the Method sheet.
func (p Provenance) IsDefault() bool {
	return p == ProvEstimated || p == ProvLibrary || p == ProvOverride
}

// ProvenanceLegend lists every provenance with its mark and its meaning, in
// the order the audit's legend shows them (one table: the workbook's legends
// and the JSON documentation are derived from it).
var ProvenanceLegend = []struct {
	Prov Provenance
	Text string
}{
	{ProvMeasured, "measured: read on the object's survey row (no mark)"},
	{ProvEntered, "entered: a site, station or atmosphere value typed by the surveyor on the Site, Stations or Atmospheres sheet (ent.)"},
	{ProvLibrary, "library: from the tool's built-in material or substance list (lib.)"},
	{ProvEstimated, "estimated: a model default or estimate, not a reading; reason on the Method sheet (est.)"},
	{ProvOverride, "override: a Site sheet value replacing a limit or a tool default (ovr.)"},
}

// LegendText is the one-line legend of the marks beside values.
const LegendText = "Marks beside a value: none = measured on the object's survey row; ent. = entered for the site, station or atmosphere; " +
	"lib. = built-in library (material or substance); est. = estimated (a model default; reasons on Method); ovr. = Site sheet override of a limit or default. " +
	"Computed values carry est. only when they rest on an estimate."

// Item names a value shown with its provenance (typed, so that no writer
// finds a value again by its label).
type Item uint8

// Items shown with a provenance.
const (
	ItemNone Item = iota
	ItemRequiredMargin
	ItemAirTemperature
	ItemSite // another Site sheet value the reader defaulted
	ItemRelativeHumidity
	ItemMIE
	ItemGroup
	ItemZone
	ItemMaterial
	ItemBagType
	ItemFilling
	ItemVesselMaterial
	ItemVesselClass
	ItemFilter
	ItemSecondPhase
	ItemConductivity
	ItemPermittivity
	ItemCapacitance
	ItemResistance
	ItemEarthing
	ItemChargeDensity
	ItemPotential
	ItemChargingCurrent
	ItemBrushEnergy
	ItemPropagatingEnergy
	ItemModel // another model assumption (its Label names the quantity)
	numItems
)

var itemKeys = [numItems]string{
	"", "required_margin", "air_temperature", "site", "relative_humidity", "mie", "group", "zone", "material",
	"bag_type", "filling", "vessel_material", "vessel_class", "filter", "second_phase", "conductivity",
	"permittivity", "capacitance", "resistance_to_earth", "earthing_requirement", "charge_density", "potential",
	"charging_current", "brush_energy", "propagating_brush_energy", "model",
}

// Key is the item's JSON key ("relative_humidity", "capacitance", ...).
func (i Item) Key() string {
	if i < numItems {
		return itemKeys[i]
	}
	return ""
}

// Mark is one value that fed an object's result with its provenance: the
// typed item and provenance, the value as shown and, for a value the tool
// chose (estimated, library, override), why and from where.
type Mark struct {
	Item   Item
	Prov   Provenance
	Label  string // the quantity as the audit names it, e.g. "Capacitance"
	Value  string // the value with its unit, e.g. "200 pF"
	Reason string // why and from where, e.g. "not measured: estimated, ..." ("" for a measured or entered value)
}

// Provenance returns the provenance of item it on the object: the most
// derived of its marks (estimated over library over entered over measured),
// ProvNone when the assessment recorded none.
func (r *ObjectResult) Provenance(it Item) Provenance {
	p := ProvNone
	for i := range r.Marks {
		if m := &r.Marks[i]; m.Item == it && provRank(m.Prov) > provRank(p) {
			p = m.Prov
		}
	}
	return p
}

func provRank(p Provenance) int {
	switch p {
	case ProvMeasured:
		return 1
	case ProvEntered:
		return 2
	case ProvLibrary:
		return 3
	case ProvOverride:
		return 4
	case ProvEstimated:
		return 5
	}
	return 0
}

// Defaults returns the object's marks the tool chose (estimated, library,
// override), in order: the "Defaults applied" of the Objects sheet.
func (r *ObjectResult) Defaults() []Mark {
	var out []Mark
	for _, m := range r.Marks {
		if m.Prov.IsDefault() {
			out = append(out, m)
		}
	}
	return out
}
