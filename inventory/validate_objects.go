package inventory

import (
	"fmt"
	"math"
	"strings"
)

// Validation of the Objects sheet.

// KindRequirement says in words what an object kind needs on its row.
type KindRequirement struct {
	Kind  string
	Needs string // the rule in words, as check reports it
}

// KindRequirements returns the per-kind requirements validation applies, for
// the README and the check command.
func KindRequirements() []KindRequirement {
	out := make([]KindRequirement, len(kindNeedTable))
	for i, k := range kindNeedTable {
		out[i] = KindRequirement{Kind: k.Kind, Needs: k.Summary}
	}
	return out
}

func (v *validator) objects(t *table, stations map[string]refState, mats map[string]matState) map[string]refState {
	p := v.newObjectPass(stations, mats)
	if len(t.Rows) > 0 {
		v.s.Objects = make([]Object, 0, len(t.Rows)) // an Object is large: no regrowing
	}
	for _, rr := range t.Rows {
		_ = p.row(t, rr)
	}
	return p.out
}

// objectPass holds the state of validating the Objects sheet row by row.
type objectPass struct {
	v         *validator
	out       map[string]refState // nil: not kept (no Changes rows refer to objects)
	ids       idRegistry
	seen      map[int]bool
	lists     map[string][]string
	hints     map[string]string // kindHints, built once
	matRefs   map[string]matHit // Materials sheet look-ups (sheetMaterial)
	stPresent bool
	stations  map[string]refState
	mats      map[string]matState
	// quiet drops the row state of rows without problems (they are only counted),
	// and each receives every accepted object instead of Survey.Objects.
	quiet bool
	each  func(Object) error
}

func (v *validator) newObjectPass(stations map[string]refState, mats map[string]matState) *objectPass {
	return &objectPass{v: v, out: map[string]refState{}, ids: idRegistry{}, seen: map[int]bool{}, lists: FixedLists(), hints: kindHints(), matRefs: map[string]matHit{},
		stPresent: v.tables[SheetStations].Present, stations: stations, mats: mats}
}

// row validates one Objects row; the error is each's.
func (op *objectPass) row(t *table, rr rawRow) error {
	v := op.v
	f := v.beginRow(t, rr, "ID", op.seen)
	o := Object{ID: f.st.id, Row: rr.Row, Description: f.text("Description"), Notes: f.text("Notes")}
	dup := false
	if o.ID == "" {
		f.errorf("ID", ErrRequired, "give every object a unique ID", "ID is blank")
	} else if !op.ids.check(f, "ID", o.ID) {
		dup = true
	}
	if raw := f.text("Kind"); raw != "" {
		if k, ok := op.hints[NormalizeName(raw)]; ok {
			// A word of the trade for a kind: the surveyor chooses, since the kind picks the model.
			f.errorf("Kind", ErrNotInList, fmt.Sprintf("did you mean %q? (use one of: %s)", k, strings.Join(Kinds(), ", ")),
				"%q is not one of the Kind values", short(raw, 60))
		} else {
			o.Kind = f.enumValue("Kind", op.lists[ListKind], nil)
		}
	}
	if o.Kind == "" && f.text("Kind") == "" {
		f.errorf("Kind", ErrRequired, "use one of: "+strings.Join(Kinds(), ", "), "Kind is blank")
	}
	who := strings.TrimSpace(o.Kind + " " + short(o.ID, 60))
	if ref := f.text("Station"); ref == "" {
		f.errorf("Station", ErrRequired, "enter the ID of the station the object is at", "%s needs a Station", who)
	} else if id, ok := f.resolve("Station", ref, op.stations, SheetStations, op.stPresent); ok {
		o.Station = id
		f.st.station = id
	}
	if mref := f.text("Material"); mref != "" {
		o.Material = v.resolveMaterial(f, mref, op.mats, op.matRefs)
	}
	o.Backing = f.enumValue("Backing", op.lists[ListBacking], map[string]string{"grounded": "earthed", "earth": "earthed", "on earthed metal": "earthed", "no": "none", "free": "none"})
	o.BagType = bagTypeValue(f, op.lists[ListBagType])
	o.Filling = f.enumValue("Filling", op.lists[ListFilling], map[string]string{"dip tube": "dip pipe", "diptube": "dip pipe", "top fill": "top", "bottom fill": "bottom", "splash": "top"})
	o.VesselMaterial = f.enumValue("Vessel material", op.lists[ListVesselMaterial], map[string]string{"plastic": "insulating", "steel": "metal", "stainless steel": "metal", "coated": "lined", "lined or coated": "lined", "conductive": "metal"})
	o.VesselClass = f.enumValue("Vessel class", op.lists[ListVesselClass], map[string]string{"rail car": "rail tank car", "rail tanker": "rail tank car", "storage tank": "fixed tank", "fixed storage tank": "fixed tank", "tank": "fixed tank", "tanker": "road tanker", "small container": "can", "can or small container": "can", "barrel": "drum"})
	o.Filter = f.enumValue("Filter", op.lists[ListFilter], map[string]string{"micro filter": "filter", "microfilter": "filter", "micro-filter": "filter", "fine filter": "filter", "coarse strainer": "strainer", "no": "none"})
	o.SecondPhase = f.enumValue("Second phase", op.lists[ListSecondPhase], map[string]string{"water": "free water", "solids": "suspended solids", "immiscible": "immiscible liquid", "no": "none"})

	// The cells are parsed in the order of the columns below (their problems
	// come in that order); the Parsed of those checked for slips is kept.
	var pLength, pWidth, pDiameter, pField, pSurface, pSpeed, pParticle, pCapacitance Parsed
	o.Length, pLength = f.qty("Length")
	o.Width, pWidth = f.qty("Width")
	o.Diameter, pDiameter = f.qty("Diameter")
	o.Thickness, _ = f.qty("Thickness")
	o.DistanceToEarth, _ = f.qty("Distance to earth")
	o.Field, pField = f.qty("Field")
	o.FieldDistance, _ = f.qty("Field distance")
	o.SurfacePotential, pSurface = f.qty("Surface potential")
	o.Speed, pSpeed = f.qty("Speed")
	o.MassFlow, _ = f.qty("Mass flow")
	o.ChargeToMass, _ = f.qty("Charge-to-mass")
	o.ChargingCurrent, _ = f.qty("Charging current")
	o.ChargingTime, _ = f.qty("Charging time")
	o.ParticleSize, pParticle = f.qty("Particle size")
	o.Resistance, _ = f.qty("Resistance to earth")
	o.Capacitance, pCapacitance = f.qty("Capacitance")
	o.Conductivity, _ = f.qty("Conductivity")
	o.Permittivity, _ = f.qty("Relative permittivity")
	var pBreakdown Parsed
	o.LayerBreakdown, pBreakdown = f.qty("Layer breakdown")
	o.Process = f.enumValue("Process", op.lists[ListProcess], map[string]string{"web": "moving web", "film": "moving web", "moving film": "moving web", "conveyor belt": "belt", "pneumatic": "pneumatic conveying", "equipment": "fixed equipment"})
	o.VesselDiameter, _ = f.qty("Vessel diameter")
	o.Residence, _ = f.qty("Residence time")
	o.InletVelocity, _ = f.qty("Inlet velocity")

	// physical ranges
	for _, n := range []struct {
		name string
		q    Quantity
	}{{"Length", o.Length}, {"Width", o.Width}, {"Diameter", o.Diameter}, {"Thickness", o.Thickness},
		{"Distance to earth", o.DistanceToEarth}, {"Field distance", o.FieldDistance}, {"Particle size", o.ParticleSize},
		{"Charging time", o.ChargingTime}, {"Resistance to earth", o.Resistance}, {"Capacitance", o.Capacitance},
		{"Conductivity", o.Conductivity}, {"Layer breakdown", o.LayerBreakdown}, {"Vessel diameter", o.VesselDiameter}} {
		f.positive(n.name, n.q)
	}
	f.nonNegative("Residence time", o.Residence)
	f.nonNegative("Inlet velocity", o.InletVelocity)
	f.slip("Length", o.Length, pLength, MaxSize, "larger than any plant object")
	f.slip("Width", o.Width, pWidth, MaxSize, "larger than any plant object")
	f.slip("Diameter", o.Diameter, pDiameter, MaxSize, "larger than any plant object")
	f.slip("Particle size", o.ParticleSize, pParticle, MaxParticleSize, "above 100 mm, no powder")
	f.nonNegative("Speed", o.Speed)
	f.slip("Speed", o.Speed, pSpeed, MaxSpeed, "faster than any web, belt or line flow")
	f.nonNegative("Mass flow", o.MassFlow)
	// Readings above what air or a plant object allows are warnings, the row
	// assessed (readingSlip); a size, speed, capacitance or MIE slip stays an
	// error, since taken as written it could clear the object.
	f.readingSlip("Field", o.Field, pField, MaxAirField, "more than air can hold (it breaks down at about 3 MV/m)",
		"the row is assessed with the charge density capped at the breakdown limit (finding reading-above-breakdown)")
	thinBacked := o.Backing == "earthed" && o.Thickness.Known && o.Thickness.Value < ThinLayer
	if !thinBacked {
		f.readingSlip("Surface potential", o.SurfacePotential, pSurface, MaxSurfacePotential, "beyond what a plant object holds in air",
			"the row is assessed with the reading as written (the stricter case; an insulator's density is capped at the breakdown limit)")
	}
	f.slip("Capacitance", o.Capacitance, pCapacitance, MaxCapacitance, "above 1 µF (a person is about 200 pF, a road tanker about 1 nF)")
	f.readingSlip("Layer breakdown", o.LayerBreakdown, pBreakdown, MaxSurfacePotential, "above what a plant layer holds (films hold 100-600 kV/mm)",
		"the row is assessed with the layer able to give a propagating brush (the stricter case)")
	if o.ChargingCurrent.Known && math.Abs(o.ChargingCurrent.Value) > MaxChargingCurrent {
		f.warnf("Charging current", ErrUnitSlip, "check the unit: the column is in µA", "charging current %s is above 1 mA; industrial charging currents rarely exceed 100 µA", f.text("Charging current"))
	}
	if o.Permittivity.Known && (o.Permittivity.Value < 1 || o.Permittivity.Value > 100) {
		f.errorf("Relative permittivity", ErrOutOfRange, "enter epsr, e.g. 2.4 for toluene", "relative permittivity %.4g is outside 1-100", o.Permittivity.Value)
	}
	if o.Field.Known && !o.FieldDistance.Known && f.text("Field distance") == "" {
		f.errorf("Field distance", ErrRequired, "enter the meter-to-surface distance of the reading", "%s: a Field reading needs its Field distance", who)
	}
	v.kindNeeds(f, &o, who)
	if o.LayerBreakdown.Known && o.Kind != "" && o.Kind != KindSheet && o.Kind != KindBelt && o.Kind != KindRoller {
		f.warnf("Layer breakdown", nil, "leave it blank, or give the layer its own sheet, belt or roller row", "%s: a Layer breakdown is read only on sheet, belt and roller rows", who)
	}
	o.BagType = strings.ToUpper(o.BagType)
	if o.Kind == KindBag && o.BagType == "" && f.text("Bag type") == "" {
		f.warnf("Bag type", ErrRequired, "enter the bag type (A, B, C or D) from its label", "%s: no Bag type; assessed as the most restrictive case", who)
	}
	if o.Kind == KindBag && o.Station != "" {
		if st, ok := v.s.Station(o.Station); ok && st.Atmosphere == "" {
			f.errorf("Station", ErrRequired, "give the station an Atmosphere (kind dust with the product's MIE, or kind none for a non-combustible product)",
				"%s: station %s has no Atmosphere; the product's MIE decides which bag types may be used", who, o.Station)
		}
	}
	if o.Kind == KindLiquid {
		liquidNeeds(f, &o, who)
	}
	if (o.Kind == KindSheet || o.Kind == KindBelt) && o.Material == "" && f.text("Material") == "" {
		f.warnf("Material", nil, "enter the material", "%s: no Material; the model takes default material properties", who)
	}
	accepted := !f.st.rejected()
	if o.ID != "" && !dup && op.out != nil {
		op.out[o.ID] = refState{ID: o.ID, Row: rr.Row, Accepted: accepted}
	}
	if op.quiet && len(f.st.probs) == 0 && len(f.st.shared) == 0 {
		// A row with no problem needs no row state: it is counted.
		rows := v.rows[t.Sheet]
		v.rows[t.Sheet] = rows[:len(rows)-1]
		v.quiet[t.Sheet]++
	}
	if !accepted {
		return nil
	}
	if op.each != nil {
		return op.each(o)
	}
	v.s.Objects = append(v.s.Objects, o)
	return nil
}

// kindHints maps words surveyors use for things to the kind that models them,
// for suggestions only.
func kindHints() map[string]string {
	return map[string]string{
		"web": KindSheet, "film": KindSheet, "foil": KindSheet, "liner": KindSheet, "plate": KindSheet,
		"conveyor": KindBelt, "conveyor belt": KindBelt, "drive belt": KindBelt,
		"roll": KindRoller, "drum roller": KindRoller, "idler": KindRoller, "shaft": KindPart,
		"drum": KindContainer, "tank": KindContainer, "vessel": KindContainer, "bucket": KindContainer, "ibc": KindContainer, "can": KindContainer, "tote": KindContainer,
		"operator": KindPerson, "worker": KindPerson, "human": KindPerson, "people": KindPerson,
		"dust": KindPowder, "granulate": KindPowder, "granules": KindPowder, "pellets": KindPowder,
		"solvent": KindLiquid, "fluid": KindLiquid,
		"fibc": KindBag, "big bag": KindBag, "bulk bag": KindBag, "sack": KindBag,
		"nozzle": KindPart, "flange": KindPart, "tool": KindPart, "probe": KindPart,
	}
}

// kindNeeds checks the per-kind requirements (see KindRequirements).
func (v *validator) kindNeeds(f *field, o *Object, who string) {
	// A value given but unreadable has its own problem: it is not reported missing as well.
	given := func(name string, q Quantity) bool { return q.Known || f.text(name) != "" }
	reading := (given("Field", o.Field) && given("Field distance", o.FieldDistance)) || given("Surface potential", o.SurfacePotential)
	const readingText = "a reading (Field with Field distance, or Surface potential)"
	var need []string
	// The plain requirements come from the one table (kindNeedTable); the
	// alternatives and conditions below are the table's "one of" and "if" columns.
	for _, name := range kindRequiredColumns(o.Kind) {
		if !given(name, objectQuantity(o, name)) {
			need = append(need, name)
		}
	}
	switch o.Kind {
	case KindSheet, KindBelt:
		// A conductive or dissipative layer with a measured resistance to earth is
		// judged on its earthing; an insulating one needs a reading.
		m, known := v.s.Material(o.Material)
		cond := known && m.Class != ClassInsulating
		if !reading && !(cond && given("Resistance to earth", o.Resistance)) {
			if known && !cond {
				need = append(need, readingText)
			} else {
				need = append(need, readingText+" (or, for a conductive or dissipative material, Resistance to earth)")
			}
		}
		if o.Backing == "earthed" && !given("Thickness", o.Thickness) {
			need = append(need, "Thickness (the layer lies on earthed metal)")
		}
		potentialGeometryNeed(f, o, who, given)
	case KindRoller:
		if !reading && !given("Resistance to earth", o.Resistance) {
			need = append(need, "a reading (Field with Field distance, or Surface potential) or its Resistance to earth")
		}
		if m, known := v.s.Material(o.Material); !(known && m.Class == ClassConductive) && !given("Resistance to earth", o.Resistance) {
			potentialGeometryNeed(f, o, who, given)
		}
	case KindContainer, KindPart:
		// A conductor's potential comes from a Surface potential or from its
		// charging; a field reading near a conductor does not give it.
		charging := (given("Mass flow", o.MassFlow) && given("Charge-to-mass", o.ChargeToMass)) || given("Charging current", o.ChargingCurrent)
		// Unknown means the stricter case (principle 2): with neither a reading, a
		// charging nor a resistance the conductor is assessed as not earthed (its
		// earthing is judged) and its spark is not evaluated, as with a measured
		// resistance above the limit; no charging current is invented.
		if !given("Surface potential", o.SurfacePotential) && !charging && !given("Resistance to earth", o.Resistance) {
			f.warnf("Resistance to earth", nil, "measure its Resistance to earth, and its Surface potential in operation or its Charging current (or Mass flow and Charge-to-mass)",
				"%s: no reading, no charging and no Resistance to earth on the row: assessed as not earthed (its earthing is judged); its spark is not evaluated", who)
		}
		if !given("Surface potential", o.SurfacePotential) && !charging && o.Resistance.Known && o.Resistance.Value > ConductorEarthingLimit {
			f.warnf("Resistance to earth", nil, "measure its Surface potential in operation, or its Charging current (or Mass flow and Charge-to-mass)",
				"%s: not earthed within 1 Mohm and no charging on the row: its spark is not evaluated, only its earthing is judged", who)
		}
	case KindPerson:
		if !given("Surface potential", o.SurfacePotential) && !given("Resistance to earth", o.Resistance) {
			// Unknown means the stricter case (principle 2): unknown footwear and floor are not earthed.
			f.warnf("Resistance to earth", nil, "measure the person's Resistance to earth (footwear and floor) and the body potential in operation",
				"%s: neither a Surface potential nor a Resistance to earth: assessed as not earthed (no leakage; the person-earthing requirement is judged where it applies), the body potential estimated from walking and capped at the person maximum, marked as resting on the assumed resistance", who)
		}
	case KindPowder:
		// The brush discharges of the charged powder do not need these (they are
		// counted whatever the flow); the cone discharge needs Diameter and Particle
		// size and is not evaluated without them (principle 2: the row is kept).
		var blank []string
		for _, n := range []struct {
			name string
			q    Quantity
		}{{"Mass flow", o.MassFlow}, {"Diameter", o.Diameter}, {"Particle size", o.ParticleSize}} {
			if !given(n.name, n.q) {
				blank = append(blank, n.name)
			}
		}
		if len(blank) > 0 {
			cone := "the cone discharge is evaluated from Diameter and Particle size"
			if !given("Diameter", o.Diameter) || !given("Particle size", o.ParticleSize) {
				cone = "the cone discharge is not evaluated without Diameter and Particle size"
			}
			f.warnf(blank[0], nil, "measure and enter "+joinAnd(blank)+" (Diameter: silo or container; Particle size: median)",
				"%s: no %s: assessed without; the brush discharges of the charged powder are counted whatever the flow, %s", who, joinAnd(blank), cone)
		}
	case KindLiquid:
		if !given("Conductivity", o.Conductivity) {
			// Unknown means the stricter case (principle 2): the row is assessed.
			f.warnf("Conductivity", ErrRequired, "measure the liquid's conductivity (or name a substance the built-in list knows) and enter it in pS/m",
				"%s: no Conductivity; the built-in substance list's typical value is used when the atmosphere names a substance it knows, otherwise the row is assessed as the stricter case of each rule: low (≤ 50 pS/m) for the filling clauses, conductive for a spark of the liquid in an insulating or unearthed vessel", who)
		}
	}
	if len(need) == 0 {
		return
	}
	// Only report what is missing, not what was given but unreadable (that has its own problem).
	f.st.probs = append(f.st.probs, Problem{Sheet: f.t.Sheet, Row: f.rr.Row, Column: f.idLetter(), ID: o.ID, Severity: Error, Err: ErrRequired,
		Message: fmt.Sprintf("%s: needs %s", who, joinAnd(need)),
		Fix:     "measure and enter them, or delete the row if the object is not part of the survey"})
}

// ConductorEarthingLimit is the resistance to earth (ohm) above which check
// warns that a conductor with no charging on its row is judged on its earthing
// only (TRGS 727:2016 8.3; the assessment's limit may be overridden on the Site sheet).
const ConductorEarthingLimit = 1e6

// potentialGeometryNeed warns when a Surface potential reading on an insulating
// surface lacks what it needs to give a charge density: the layer on earthed
// metal with its Thickness, or a Distance to earth. The row is kept (it is listed
// as not assessed with the same words); nothing is said when a Field reading with
// its distance is on the row (it is used instead) or no Surface potential is.
func potentialGeometryNeed(f *field, o *Object, who string, given func(string, Quantity) bool) {
	if !given("Surface potential", o.SurfacePotential) || (given("Field", o.Field) && given("Field distance", o.FieldDistance)) {
		return
	}
	if o.Backing == "earthed" || given("Distance to earth", o.DistanceToEarth) {
		return
	}
	f.warnf("Surface potential", ErrRequired, "enter Backing earthed with the layer's Thickness, or the Distance to earth, or a Field reading with its distance",
		"%s: a Surface potential on a free surface gives no charge density: needs Backing earthed with Thickness, or Distance to earth; not assessed until then", who)
}

// liquidNeeds warns about a liquid row's transfer inputs that are blank and so
// assessed as the stricter case (the assessment says the same beside the value).
func liquidNeeds(f *field, o *Object, who string) {
	blank := func(name, v string) bool { return v == "" && f.text(name) == "" }
	if blank("Vessel material", o.VesselMaterial) {
		f.warnf("Vessel material", ErrRequired, "enter metal, insulating, lined or glass", "%s: no Vessel material; assessed as the stricter of metal (unearthed) and insulating (no safe filling limits)", who)
	}
	if blank("Vessel class", o.VesselClass) {
		f.warnf("Vessel class", ErrRequired, "enter road tanker, rail tank car, fixed tank, IBC, drum or can", "%s: no Vessel class; the strictest class's filling limits and the largest typical capacitance are taken", who)
	}
	if blank("Filling", o.Filling) {
		f.warnf("Filling", ErrRequired, "enter top, bottom or dip pipe", "%s: no Filling; assessed as top (splash) filling", who)
	}
	if o.VesselClass == "fixed tank" && !o.VesselDiameter.Known && f.text("Vessel diameter") == "" {
		f.warnf("Vessel diameter", ErrRequired, "enter the tank's diameter", "%s: a fixed tank with no Vessel diameter is not taken as a large tank (the v·d limit applies)", who)
	}
	if blank("Filter", o.Filter) {
		f.warnf("Filter", ErrRequired, "enter none, strainer or filter", "%s: no Filter; assessed as a fine filter with no residence time after it (the stricter case)", who)
	}
	if blank("Second phase", o.SecondPhase) {
		f.warnf("Second phase", ErrRequired, "enter none, free water, suspended solids or immiscible liquid", "%s: no Second phase; assessed as present (the stricter case)", who)
	}
	if o.Filter == "filter" && !o.Residence.Known && f.text("Residence time") == "" {
		f.warnf("Residence time", ErrRequired, "enter the time the liquid takes from the filter to the vessel", "%s: a fine filter with no Residence time; taken as none", who)
	}
	// The slow start concerns low-conductivity liquids; a second phase makes a liquid
	// below 1000 pS/m one (IEC TS 60079-32-1, reference section 8 [C]).
	twoPhase := o.SecondPhase != "none" // not stated: taken as present
	chargeable := !o.Conductivity.Known || o.Conductivity.Value <= 50e-12 || (twoPhase && o.Conductivity.Value < 1000e-12)
	if chargeable && (o.Filling == "bottom" || o.Filling == "dip pipe") && !o.InletVelocity.Known && f.text("Inlet velocity") == "" {
		f.warnf("Inlet velocity", ErrRequired, "enter the velocity at the inlet until it is submerged (at most 1 m/s for low-conductivity liquids)", "%s: no Inlet velocity; the slow start until the inlet is submerged is not shown met", who)
	}
}

func joinAnd(s []string) string {
	switch len(s) {
	case 0:
		return ""
	case 1:
		return s[0]
	}
	return strings.Join(s[:len(s)-1], ", ") + " and " + s[len(s)-1]
}

// bagTypeValue reads "C", "type C", "Type-C".
// types is the list of bag types (FixedLists()[ListBagType]).
func bagTypeValue(f *field, types []string) string {
	raw := f.text("Bag type")
	if raw == "" {
		return ""
	}
	n := strings.ToUpper(strings.TrimSpace(strings.TrimPrefix(NormalizeName(raw), "type")))
	for _, b := range types {
		if n == b {
			return b
		}
	}
	return f.enumValue("Bag type", types, nil)
}

// resolveMaterial finds a material by name: the survey's Materials sheet
// first, then the built-ins and their aliases.
// cache remembers the look-ups on mats (see sheetMaterial).
func (v *validator) resolveMaterial(f *field, ref string, mats map[string]matState, cache map[string]matHit) string {
	if !f.checkID("Material", "material", ref) {
		return ""
	}
	if m, ok := sheetMaterial(ref, mats, cache); ok {
		if !m.accepted {
			f.errorf("Material", ErrRejectedReference, fmt.Sprintf("fix Materials!%d first", m.row),
				"material %q was rejected (Materials!%d), so this row cannot be assessed", short(ref, 60), m.row)
			return ""
		}
		return m.m.Name
	}
	if name, ok := v.builtinMaterial(ref); ok {
		return name
	}
	var names []string
	for _, m := range v.s.Materials {
		names = append(names, m.Name)
	}
	fix := "use a built-in material (sparkmargin library) or add it to the Materials sheet"
	if near := Nearest(ref, names); near != "" {
		fix = didYouMean(ref, near) + " (or add the material to the Materials sheet)"
	}
	f.errorf("Material", ErrUnknownReference, fix, "material %q is neither built in nor on the Materials sheet", short(ref, 60))
	return ""
}

// sheetMaterial finds ref on the Materials sheet: the same name lower-cased,
// else the first name that matches once normalised (in the map's order, as
// it always was), remembered in cache per reference (mats does not change
// while the objects are read).
func sheetMaterial(ref string, mats map[string]matState, cache map[string]matHit) (matState, bool) {
	if h, ok := cache[ref]; ok {
		return h.m, h.ok
	}
	m, ok := mats[strings.ToLower(ref)]
	if !ok {
		for k, km := range mats {
			if sameName(k, ref) {
				m, ok = km, true
				break
			}
		}
	}
	cache[ref] = matHit{m, ok}
	return m, ok
}

type matHit struct {
	m  matState
	ok bool
}

// builtinMaterial is LookupMaterial(ref)'s name, remembered per reference
// for the pass (a survey names the same few materials on many rows).
func (v *validator) builtinMaterial(ref string) (string, bool) {
	if hit, ok := v.builtins[ref]; ok {
		return hit.name, hit.ok
	}
	bm, ok := LookupMaterial(ref)
	if v.builtins == nil {
		v.builtins = map[string]builtinHit{}
	}
	v.builtins[ref] = builtinHit{bm.Name, ok}
	return bm.Name, ok
}

type builtinHit struct {
	name string
	ok   bool
}

// objectQuantity is the quantity of o in the Objects column name; a zero
// Quantity for a column that is not a quantity (its cell text decides then).
func objectQuantity(o *Object, name string) Quantity {
	switch name {
	case "Length":
		return o.Length
	case "Width":
		return o.Width
	case "Diameter":
		return o.Diameter
	case "Mass flow":
		return o.MassFlow
	case "Particle size":
		return o.ParticleSize
	case "Speed":
		return o.Speed
	case "Conductivity":
		return o.Conductivity
	}
	return Quantity{}
}
