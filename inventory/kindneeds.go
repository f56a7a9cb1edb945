package inventory

// Need says how much an object kind needs one Objects column.
type Need uint8

// Needs of a column for a kind, from the strictest.
const (
	NotNeeded   Need = iota // check does not ask for it (the assessment may still use a value given)
	Optional                // used when given; blank is assessed as the stricter case or a documented estimate
	Conditional             // needed in a case the rule names (e.g. Thickness when Backing is earthed)
	OneOf                   // one of the kind's alternatives is needed (a reading, charging or earthing)
	Required                // needed on every row of the kind
)

// String is the word the help sheet writes ("–" for not needed, so that the
// needed cells stand out).
func (n Need) String() string {
	switch n {
	case Required:
		return "required"
	case OneOf:
		return "one of"
	case Conditional:
		return "if"
	case Optional:
		return "optional"
	}
	return "–" // not needed
}

// ColumnNeed is one Objects column a kind asks for.
type ColumnNeed struct {
	Column string // Objects column name (Column.Name)
	Need   Need
}

// KindNeed is what one object kind needs on its row: its columns and the rule
// in words. kindNeedTable is the one table check (kindNeeds), KindRequirements
// and the template's help sheet and highlights are derived from.
type KindNeed struct {
	Kind    string
	Columns []ColumnNeed
	Summary string // the rule in words, as check reports it
}

// readingAlternatives are the columns of a reading of a surface or roller.
var readingAlternatives = []ColumnNeed{{"Field", OneOf}, {"Field distance", OneOf}, {"Surface potential", OneOf}}

func cols(groups ...[]ColumnNeed) []ColumnNeed {
	var out []ColumnNeed
	for _, g := range groups {
		out = append(out, g...)
	}
	return out
}

// surfaceExtras are the optional columns of an insulating surface (sheet, belt,
// a roller assessed as a surface): Charging time (how long a dissipative
// surface charges before it leaves the zone, and a conducting surface's
// charging), Layer breakdown (a measured breakdown of a backed or double layer,
// else the material's strength), Process (what the surface is: process material
// or fixed equipment; pneumatic conveying for a double layer).
var surfaceExtras = []ColumnNeed{{"Charging time", Optional}, {"Layer breakdown", Optional}, {"Process", Optional}}

var sheetNeeds = cols(
	[]ColumnNeed{{"Material", Optional}, {"Length", Required}, {"Width", Required}, {"Thickness", Conditional}, {"Backing", Conditional}, {"Distance to earth", Conditional}},
	readingAlternatives,
	[]ColumnNeed{{"Resistance to earth", OneOf}},
	surfaceExtras,
)

// kindNeedTable: every kind needs Station (the station gives the RH and the
// atmosphere every rule uses); withStation adds it in one place.
var kindNeedTable = withStation([]KindNeed{
	{KindSheet, sheetNeeds,
		"Length and Width, and a reading (Field with Field distance, or Surface potential) or, for a conductive or dissipative material, Resistance to earth; Thickness when Backing is earthed; a Surface potential alone also needs Backing earthed or Distance to earth (a warning)"},
	{KindBelt, cols(sheetNeeds, []ColumnNeed{{"Speed", Optional}}),
		"as sheet (Speed optional: it gives the charging current)"},
	{KindRoller, cols([]ColumnNeed{{"Material", Optional}, {"Diameter", Required}}, readingAlternatives, []ColumnNeed{{"Resistance to earth", OneOf}, {"Capacitance", Optional}}, surfaceExtras),
		"Diameter, and a reading (Field with Field distance, or Surface potential) or Resistance to earth; Capacitance, Charging time, Layer breakdown and Process used when given"},
	{KindContainer, cols(containerNeeds, containerOnlyNeeds),
		"nothing beyond Kind and Station; Surface potential, its charging (Charging current, or Mass flow with Charge-to-mass; Charging time), Resistance to earth and Capacitance are used when given (Relative permittivity: of the container's insulating floor, with Diameter and Thickness); with no reading and no charging, a warning: the spark is not evaluated and the earthing is judged (a blank Resistance taken as not earthed)"},
	{KindPart, containerNeeds, "as container"},
	{KindPerson, []ColumnNeed{{"Surface potential", Optional}, {"Resistance to earth", Optional}},
		"nothing beyond Kind and Station; with neither Surface potential nor Resistance to earth, a warning: taken as not earthed, the body potential estimated from walking (capped at the person maximum)"},
	{KindPowder, []ColumnNeed{{"Mass flow", Optional}, {"Diameter", Optional}, {"Particle size", Optional}, {"Charge-to-mass", Optional}},
		"nothing beyond Kind and Station; Mass flow, Diameter (silo or container) and Particle size blank are each a warning (the brush of the charged powder is counted whatever the flow; the cone discharge is not evaluated without Diameter and Particle size); Charge-to-mass optional"},
	{KindLiquid, []ColumnNeed{{"Speed", Required}, {"Diameter", Required}, {"Charging current", Optional},
		{"Resistance to earth", Optional}, {"Capacitance", Optional}, {"Conductivity", Optional}, {"Relative permittivity", Optional},
		{"Filling", Optional}, {"Vessel material", Optional}, {"Vessel class", Optional}, {"Vessel diameter", Conditional},
		{"Filter", Optional}, {"Residence time", Conditional}, {"Second phase", Optional}, {"Inlet velocity", Conditional}},
		"Speed (flow velocity) and Diameter (line inner diameter); Conductivity blank is a warning (assessed as the stricter case: low for the filling clauses, conductive for a spark of the liquid); a blank transfer input (Vessel material, Vessel class, Filling, Filter, Second phase) is assessed as the stricter case with a warning; Resistance to earth and Capacitance are the receiving vessel's (blank: not earthed, the Vessel class's typical capacitance), Relative permittivity the liquid's (blank: the substance list's, else 2, marked), Charging current used when measured"},
	{KindBag, []ColumnNeed{{"Bag type", Optional}},
		"a station with an Atmosphere (the product's MIE decides the bag types allowed); Bag type optional (blank: the most restrictive case)"},
})

// withStation puts Station, required, first in every kind's columns.
func withStation(ks []KindNeed) []KindNeed {
	for i := range ks {
		ks[i].Columns = append([]ColumnNeed{{"Station", Required}}, ks[i].Columns...)
	}
	return ks
}

var containerNeeds = []ColumnNeed{{"Surface potential", Optional}, {"Mass flow", Optional}, {"Charge-to-mass", Optional}, {"Charging current", Optional}, {"Charging time", Optional}, {"Resistance to earth", Optional}, {"Capacitance", Optional}}

// containerOnlyNeeds: a container's capacitance is estimated as a plate over its
// base when Diameter and Thickness (of an insulating floor or liner) are given;
// Relative permittivity is that layer's (blank: 2, marked).
var containerOnlyNeeds = []ColumnNeed{{"Relative permittivity", Optional}}

// KindNeeds returns the per-kind needs (a copy of the one table).
func KindNeeds() []KindNeed {
	out := make([]KindNeed, len(kindNeedTable))
	for i, k := range kindNeedTable {
		out[i] = KindNeed{Kind: k.Kind, Columns: append([]ColumnNeed(nil), k.Columns...), Summary: k.Summary}
	}
	return out
}

// kindColumnNeed is what kind needs of column (NotNeeded when the table does not name it).
func kindColumnNeed(kind, column string) Need {
	for _, k := range kindNeedTable {
		if k.Kind != kind {
			continue
		}
		for _, c := range k.Columns {
			if c.Column == column {
				return c.Need
			}
		}
	}
	return NotNeeded
}

// kindRequiredColumns are the columns kind needs on every row, in table order.
func kindRequiredColumns(kind string) []string {
	var out []string
	for _, k := range kindNeedTable {
		if k.Kind == kind {
			for _, c := range k.Columns {
				// Station has its own check on every row (with its own
				// words: "needs a Station; enter the ID..."): not twice.
				if c.Need == Required && c.Column != "Station" {
					out = append(out, c.Column)
				}
			}
		}
	}
	return out
}
