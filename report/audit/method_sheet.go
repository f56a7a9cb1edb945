package audit

import (
	"fmt"
	"math"
	"reflect"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
)

func containsFold(s, sub string) bool {
	return strings.Contains(strings.ToLower(s), strings.ToLower(sub))
}

// limitRow is one limit applied, with its value in display units and its source.
type limitRow struct {
	name       string
	value      float64 // SI, as applied
	def        float64 // SI, the model's default
	unit       book.Unit
	source     string
	fromMemory bool
}

// limitRows lists every limit of model.LimitSources with the value actually
// applied (Options.Limits, survey overrides merged), the default and its source.
func limitRows(applied model.Limits) []limitRow {
	rv := reflect.ValueOf(applied)
	var out []limitRow
	for _, c := range model.LimitSources() {
		v, ok := limitField(rv, c.Limit)
		if !ok {
			v = c.Value
		}
		out = append(out, limitRow{name: limitLabel(c.Limit), value: v, def: c.Value, unit: siDisplayUnit(c.Unit),
			source: c.Source, fromMemory: c.FromMemory})
	}
	return out
}

// limitField reads the Limits field named as in model.Citation.Limit:
// "ShockEnergy" or "TransferredCharge[IIB]" ("[other]" is the no-group entry).
func limitField(rv reflect.Value, name string) (float64, bool) {
	field, group, indexed := strings.Cut(strings.TrimSuffix(name, "]"), "[")
	f := rv.FieldByName(field)
	if !f.IsValid() {
		return 0, false
	}
	if indexed {
		if f.Kind() != reflect.Array {
			return 0, false
		}
		i := int(model.GroupNone)
		if group != "other" {
			if pg, err := model.ParseGroup(group); err == nil {
				i = int(pg)
			} else if vc, err := model.ParseVesselClass(group); err == nil && strings.HasPrefix(field, "Vessel") {
				i = int(vc) // per-vessel-class liquid limits: "VesselVDLow[road tanker]"
			} else {
				return 0, false
			}
		}
		if i >= f.Len() {
			return 0, false
		}
		f = f.Index(i)
	}
	if f.Kind() != reflect.Float64 {
		return 0, false
	}
	return f.Float(), true
}

// siDisplayUnit maps the SI unit of a citation to the audit's display unit.
func siDisplayUnit(si string) book.Unit {
	switch si {
	case "C/m^2":
		return book.UnitUCPerM2
	case "J":
		return book.UnitMJ
	case "m^2":
		return book.UnitCM2
	case "C":
		return book.UnitNC
	case "V":
		return book.UnitVolt
	case "V/m":
		return book.UnitKVPerM
	case "ohm":
		return book.UnitOhm
	case "ohm m":
		return book.UnitOhmM
	case "F":
		return book.UnitPF
	case "S/m":
		return book.UnitPSPerM
	case "m^2/s":
		return book.UnitM2PerS
	case "m/s":
		return book.UnitMPerS
	case "A":
		return book.UnitUA
	case "m":
		return book.UnitMillimetre
	case "C/kg":
		return book.UnitUCPerKg
	case "m^3":
		return book.UnitCubicMetre
	case "s":
		return book.UnitSecond
	}
	return book.UnitDimless
}

// limitLabel names a limit in words; an unknown field keeps its name.
func limitLabel(name string) string {
	field, group, indexed := strings.Cut(strings.TrimSuffix(name, "]"), "[")
	labels := map[string]string{
		"BrushChargeDensity":      "Brush discharge: charge-density screen",
		"BrushEnergy":             "Brush discharge: equivalent energy",
		"BrushArea":               "Brush discharge: area one discharge drains",
		"TransferredCharge":       "Transferred charge, EPL Gb/Gc (zones 1, 2)",
		"ZoneZeroChargeFactor":    "Zone 0 factor on the transferred charge",
		"AreaGa":                  "Insulating area, EPL Ga (zone 0)",
		"AreaGb":                  "Insulating area, EPL Gb/Gc (zones 1, 2)",
		"PropagatingDensity":      "Propagating brush: charge density it needs",
		"PropagatingBreakdown":    "Propagating brush: layer breakdown below which it is prevented",
		"PropagatingThickness":    "Propagating brush: thickness above which it is not expected",
		"PropagatingMaxEnergy":    "Propagating brush: upper bound of the energy",
		"ConductorEarthing":       "Conductor resistance to earth",
		"PersonEarthing":          "Person-to-earth resistance",
		"PersonEarthingMIE":       "Person-to-earth limit applies at MIE up to",
		"ShockEnergy":             "Shock energy to people",
		"SafePotential":           "Safe conductor potential",
		"SparkMinPotential":       "Spark minimum potential (Paschen)",
		"AirBreakdown":            "Air breakdown field",
		"NotEarthed":              "Resistance shown when not measured (the potential is computed with no leakage)",
		"PersonMaxPotential":      "Cap on an estimated body potential",
		"LowConductivity":         "Liquid: low conductivity at or below",
		"HighConductivity":        "Liquid: high conductivity above",
		"VDKappa":                 "Liquid filling: conductivity bound of the v·d limits",
		"SlowStartVelocity":       "Liquid filling: velocity until the inlet is submerged",
		"BagCToTab":               "Bag type C: any point to the earthing tab",
		"BagTabToEarth":           "Bag type C: tab to plant earth",
		"BagMinMIE":               "Bags C and D: lowest MIE of their qualification",
		"BagMaxCurrent":           "Bags C and D: charging current of their qualification",
		"MaxChargingCurrent":      "Largest charging current taken when none is known",
		"DissipativeSurface":      "Surface resistance counted as dissipative",
		"DissipativeEarthing":     "Earthing of a dissipative surface",
		"ConeResistivity":         "Cone discharge: bulk resistivity needed",
		"ConeChargeToMass":        "Cone discharge: charge-to-mass needed",
		"ConeField":               "Cone discharge: heap field below which none is expected",
		"ConeMinVolume":           "Cone discharge: container volume below which none is expected",
		"BagDustLow":              "Bags: MIE band boundary (low)",
		"BagDustHigh":             "Bags: MIE band boundary (high)",
		"ConductorMaxPotential":   "Cap on an unmeasured conductor potential",
		"SmallPartCapacitance":    "Small metal part exempt from earthing below",
		"SmallPartCapacitanceIIC": "Small metal part exempt from earthing below (IIC, zone 0)",
		"DustBrushMIE":            "Dust screened for brush discharges below MIE",

		"VesselVDLow":             "Liquid filling: v·d limit at or below the conductivity bound, or unknown",
		"VesselVDHigh":            "Liquid filling: v·d limit above the conductivity bound (low-conductivity liquids)",
		"VesselMaxVelocity":       "Liquid filling: velocity ceiling",
		"LargeTankDiameter":       "Liquid filling: fixed tank diameter with no v·d limit",
		"SecondPhaseVelocity":     "Liquid filling: velocity ceiling with a second phase",
		"SecondPhaseConductivity": "Liquid: with a second phase, low conductivity below",
		"FilterResidenceFactor":   "Liquid: relaxation times of residence after a fine filter",
		"FilterResidenceMax":      "Liquid: residence after a fine filter that always suffices",
		"FilterChargeFactor":      "Liquid: streaming current factor after a fine filter",
		"StrainerChargeFactor":    "Liquid: streaming current factor after a strainer",
		"SecondPhaseChargeFactor": "Liquid: streaming current factor with a second phase",

		"EarthingContradictionFactor": "Measured potential above this many times the earthing bound I R: a contradiction",
		"SparkSurface":                "Surface resistance below which an unearthed surface sparks as a conductor",
		"CoronaEnergy":                "Corona: equivalent energy bound (counted only against an MIE below it)",
		"CoatingThickness":            "Coating on earthed metal exempt from the area limit up to (with breakdown at most 4 kV)",
		"CoatingThicknessIIC":         "Coating on earthed metal exempt from the area limit up to, IIC (with breakdown at most 4 kV)",
	}
	l, ok := labels[field]
	if !ok {
		l = field
	}
	if field == "TransferredCharge" && strings.HasPrefix(group, "III") {
		l = "Transferred charge, dust (against propagating brush discharges)"
	}
	if indexed {
		if group == "other" {
			group = "no group, dusts"
		}
		l += ", " + group
	}
	return l
}

// limitValue returns the display cell of a limit: empty when the limit is not
// set (zero or NaN), since 0 would read as a limit of zero.
func limitValue(r limitRow) book.Cell {
	if r.value == 0 || math.IsNaN(r.value) {
		return book.Cell{NumFmt: r.unit.NumFmt()}
	}
	return book.Quantity(r.unit, r.value)
}

// method writes the Method sheet: identity of the run, formulas with their
// sources, constants, limits applied, defaults applied and materials used.
func (wb *workbook) method() error {
	f, s, a := wb.f, SheetMethod, wb.a
	widths := []float64{36, 56, 30, 18, 50}
	if err := book.SetWidths(f, s, widths); err != nil {
		return err
	}
	sink := book.NormalSink{F: f, Sheet: s, St: wb.st}
	r := 1
	section := func(title string, hdr []string) error {
		ref := fmt.Sprintf("A%d", r)
		if err := f.SetCellValue(s, ref, title); err != nil {
			return err
		}
		if err := f.SetCellStyle(s, ref, fmt.Sprintf("E%d", r), wb.st.Section()); err != nil {
			return err
		}
		r++
		if hdr != nil {
			if err := sink.Header(r, hdr); err != nil {
				return err
			}
			r++
		}
		return nil
	}
	put := func(cells ...book.Cell) error {
		if err := sink.Row(r, cells, book.RowHeight(widths, cells)); err != nil {
			return err
		}
		r++
		return nil
	}

	if err := section("Audit identity", nil); err != nil {
		return err
	}
	site := a.Survey.Site
	for _, kv := range [][2]string{
		{"Tool", wb.info.tool() + " " + wb.info.ToolVersion},
		{"Command", wb.info.CommandLine},
		{"Survey file", wb.info.file(a)},
		{"Survey file SHA-256", wb.info.sha(a)},
		{"Site", siteName(a)},
		{"Survey date", dateText(a)},
		{"Surveyed by", site.SurveyedBy},
	} {
		if err := put(book.BoldText(kv[0]), book.OptText(kv[1])); err != nil {
			return err
		}
	}
	if a.Options.Samples > 0 {
		if err := put(book.BoldText("Uncertainty"), book.Text(fmt.Sprintf("Monte Carlo, %d samples per object, seed %d", a.Options.Samples, a.Options.Seed))); err != nil {
			return err
		}
	}
	r++

	if err := section("Principles", nil); err != nil {
		return err
	}
	for _, p := range templates.Principles() {
		if err := put(book.Cell{V: p.Title, Wrap: true, Bold: true}, book.WrapText(p.Text)); err != nil {
			return err
		}
	}
	r++

	for _, n := range wb.methodNotes {
		if err := section(n.Title, nil); err != nil {
			return err
		}
		for _, kv := range n.Notes {
			if err := put(book.Cell{V: kv[0], Wrap: true, Bold: true}, book.WrapText(kv[1])); err != nil {
				return err
			}
		}
		r++
	}

	if err := section("Formulas", []string{"Quantity", "Formula", "Applies to", "", "Source"}); err != nil {
		return err
	}
	for _, m := range templates.MethodNotes() {
		if err := put(book.WrapText(m.Quantity), book.WrapText(m.Formula), book.WrapText(m.AppliesTo), book.Cell{}, book.WrapText(m.Source)); err != nil {
			return err
		}
	}
	// The Applies-to text runs over C:D; merge them so it wraps over both.
	r++

	if err := section("Liquid filling rules", []string{"Clause", "Rule", "Vessel class", "Source mark", "Reference and edition"}); err != nil {
		return err
	}
	for _, lr := range model.LiquidRules() {
		vessel := "every class"
		if lr.Vessel != model.VesselUnknown {
			vessel = lr.Vessel.String()
		}
		mark := "confirmed"
		if lr.FromMemory {
			mark = "from memory, not confirmed"
		}
		if err := put(book.WrapText(strings.Join(lr.Clause.Texts(), "")), book.WrapText(lr.Rule), book.Text(vessel), book.Text(mark), book.WrapText(lr.Ref)); err != nil {
			return err
		}
	}
	r++

	if err := section("Constants", []string{"Constant", "Value", "Unit", "", "Source"}); err != nil {
		return err
	}
	breakdown := a.Options.Limits.AirBreakdown
	if breakdown == 0 {
		breakdown = 3e6
	}
	paschen := 327.0
	consts := []struct {
		name string
		v    float64
		unit string
		fmt  string
		src  string
	}{
		{"Vacuum permittivity ε0", 8.8541878128e-12, "F/m", "0.0000000000E+00", "CODATA 2018"},
		{"Air breakdown field (cm gaps)", breakdown / 1e3, "kV/m", "0", "AMS Glossary (about 3 MV/m); the value applied"},
		{"Breakdown-limited charge density, one side", 8.8541878128e-12 * breakdown / 1e-6, "µC/m²", "0.00", "derived: ε0 × air breakdown field; CCPS glossary 2.65e-5 C/m²"},
		{"Paschen minimum in air", paschen, "V", "0", "Paschen's law; about 327 V, no gap breaks down below about 300 V"},
		{"Corona onset, smooth cylinder r = 1 mm", 5860, "kV/m", "0", "Peek 1929: 30 δ m (1 + 0.301/√(δ r)) kV/cm, 58.6 kV/cm"},
	}
	for _, c := range consts {
		if err := put(book.Text(c.name), book.Cell{V: c.v, NumFmt: c.fmt, Align: "left"}, book.Text(c.unit), book.Cell{}, book.WrapText(c.src)); err != nil {
			return err
		}
	}
	r++

	if err := section("Limits applied", []string{"Limit", "Value applied", "Unit", "Survey override", "Source and edition"}); err != nil {
		return err
	}
	for _, l := range limitRows(a.Options.Limits) {
		unit := l.unit.Label()
		if unit == "" {
			unit = "–"
		}
		src := l.source
		if l.fromMemory {
			src += " (from memory, not confirmed)"
		}
		over := book.Cell{}
		if l.value != l.def && !(math.IsNaN(l.value) && math.IsNaN(l.def)) {
			over = book.WrapText("yes; default " + l.unit.Text(l.def))
		}
		v := limitValue(l)
		v.Align = "left"
		if err := put(book.WrapText(l.name), v, book.Text(unit), over, book.WrapText(src)); err != nil {
			return err
		}
	}
	if err := put(book.WrapText("Required margin on MIE (Site sheet)"), leftAligned(est(inQ(book.UnitDimless, site.RequiredMargin), site.Defaulted(inventory.SiteItemRequiredMargin))), book.Text("–"), book.Cell{}, book.WrapText("the site's choice; default 10")); err != nil {
		return err
	}
	r++

	if err := section("Defaults applied", []string{"Quantity", "Value", "Provenance", "", "Why and from where"}); err != nil {
		return err
	}
	nd := 0
	for _, d := range a.MethodDefaults {
		if err := put(book.WrapText(d.Label), book.WrapText(d.Value), book.Text(d.Prov.String()), book.Cell{}, book.WrapText(d.Reason)); err != nil {
			return err
		}
		nd++
	}
	// Site values the survey reader defaulted, unless the assessment listed them already.
	for _, d := range site.Defaults {
		listed := false
		for _, m := range a.MethodDefaults {
			if d.Item == m.Label {
				listed = true
			}
		}
		if listed {
			continue
		}
		if err := put(book.WrapText("Site sheet: "+d.Text), book.Cell{}, book.Cell{}, book.Cell{}, book.Text("not given on the Site sheet: default used")); err != nil {
			return err
		}
		nd++
	}
	if nd == 0 {
		if err := put(book.Text("none: every value was measured or given")); err != nil {
			return err
		}
	}
	r++

	// The legend of the provenance marks beside values (assess.ProvenanceLegend).
	if err := section("Provenance of values", []string{"Mark", "Provenance", "", "", "Meaning"}); err != nil {
		return err
	}
	for _, l := range assess.ProvenanceLegend {
		mark := l.Prov.Mark()
		if mark == "" {
			mark = "(none)"
		}
		if err := put(book.Code(mark), book.Text(l.Prov.String()), book.Cell{}, book.Cell{}, book.WrapText(l.Text)); err != nil {
			return err
		}
	}
	if err := put(book.Cell{}, book.Cell{}, book.Cell{}, book.Cell{}, book.WrapText("A computed value (energy, potential, charging current, capacitance) is marked est. when it rests on an estimated input; otherwise it carries no mark.")); err != nil {
		return err
	}
	r++

	if a.Options.Samples > 0 {
		if err := wb.methodUncertainty(section, put); err != nil {
			return err
		}
		r++
	}

	if err := section("Materials used", []string{"Material", "Class", book.UnitOhmSq.Header("Surface resistivity at 50 % RH"), "Slope [dec/10 %RH]", "Source"}); err != nil {
		return err
	}
	used := map[string]bool{}
	for i := range a.Objects {
		if m := a.Objects[i].Material; m != nil {
			used[strings.ToLower(m.Name)] = true
		}
	}
	for _, m := range a.Survey.Materials {
		if !used[strings.ToLower(m.Name)] {
			continue
		}
		src := m.Source
		if !m.BuiltIn {
			src = fmt.Sprintf("survey Materials sheet, row %d: %s", m.Row, m.Source)
		}
		if err := put(book.Text(m.Name), book.Text(m.Class), book.Quantity(book.UnitOhmSq, m.SurfaceResistivity), book.Quantity(book.UnitDimless, m.HumiditySlope), book.WrapText(src)); err != nil {
			return err
		}
	}
	return wb.printSetup(s, 1, "", "")
}

func leftAligned(c book.Cell) book.Cell {
	c.Align = "left"
	return c
}

// methodUncertainty lists the uncertainty table the Monte Carlo drew from
// (Audit.Options.Uncertainties; the defaults when the audit recorded none),
// how a cell's own "±x %" is taken, and how the draws were made.
func (wb *workbook) methodUncertainty(section func(string, []string) error, put func(...book.Cell) error) error {
	a := wb.a
	if err := section("Uncertainty (Monte Carlo)", []string{"Input", "Uncertainty (one standard deviation)", "Distribution", "Site item", "Why"}); err != nil {
		return err
	}
	tab := a.Options.Uncertainties
	if tab == nil {
		tab = assess.DefaultUncertainties()
	}
	for _, u := range tab {
		v := u.Text()
		switch {
		case u.Spread == 0:
			v = "not drawn"
		case u.Overridden:
			v += " (Site sheet)"
		}
		if err := put(book.WrapText(u.Name), book.WrapText(v), book.Text(u.Dist.String()), book.WrapText(u.SiteItem()), book.WrapText(u.Note)); err != nil {
			return err
		}
	}
	if err := put(book.WrapText("A cell's own uncertainty"), book.WrapText("\"12 kV ±10%\" wins over the table"), book.Text("relative"), book.Cell{},
		book.WrapText("a relative standard uncertainty; a log-normal row takes it as a factor 1 + x")); err != nil {
		return err
	}
	if err := put(book.WrapText("Draws"), book.WrapText(fmt.Sprintf("%d per object, seed %d", a.Options.Samples, a.Options.Seed)), book.Cell{}, book.Cell{},
		book.WrapText("each object its own stream (seed and object ID): results depend neither on the number of workers nor on the row order; "+
			"inputs drawn independently, materials and limits not drawn; a station's P(any incendive) is 1 - Π(1 - P(incendive)) over its objects, "+
			"taken as independent (an upper bound, since they share the MIE and humidity)")); err != nil {
		return err
	}
	if err := put(book.WrapText("Borderline"), book.WrapText(fmt.Sprintf("more severe verdicts above %.0f %%", 100*assess.BorderlineThreshold)), book.Cell{}, book.Cell{},
		book.WrapText(fmt.Sprintf("a screening choice of this tool: an object is flagged borderline when its point verdict differs from its most likely sampled verdict, "+
			"or when the verdicts more severe than its point verdict together have a sampled probability above %.0f %% (one draw in ten)", 100*assess.BorderlineThreshold))); err != nil {
		return err
	}
	return put(book.WrapText("What to measure next"), book.WrapText("the input that drives a borderline object most"), book.Cell{}, book.Cell{},
		book.WrapText("a screening choice of this tool: of the inputs drawn for the object, the one whose draws have the largest absolute Spearman rank correlation "+
			"with the outcome of the draw (ranked by verdict, then by E/MIE); inputs are drawn independently, so measuring it narrows the outcome the most. "+
			"Inputs not drawn (material properties, limits, values not given) cannot be named: see Defaults applied. "+
			fmt.Sprintf("Below an absolute rank correlation of %.1f no input is named (it would explain under a tenth of the spread)", assess.WeakDriver)))
}
