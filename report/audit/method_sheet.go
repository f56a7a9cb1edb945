package audit

import (
	"fmt"
	"math"
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
	siteItem   string // the Site item that overrides it, "" when none
}

// limitRows lists every row of the limit table (model.LimitTable) with the
// value actually applied (Options.Limits, survey overrides merged), the
// default and its source.
func limitRows(applied model.Limits) []limitRow {
	var out []limitRow
	for _, s := range model.LimitTable() {
		out = append(out, limitRow{name: s.Label, value: s.Value(applied), def: s.Default, unit: limitUnit(s),
			source: s.Source(), fromMemory: s.FromMemory, siteItem: s.SiteItem})
	}
	return out
}

// verifyRow is one value the audit applied that was recalled, not confirmed
// against its source's text: a limit of the limit table, a built-in material
// used by an object, or a built-in substance an atmosphere took its MIE or
// group from. The Method sheet and the JSON list the same rows.
type verifyRow struct {
	what     string // "limit", "material" or "substance"
	key      string // the limit's key, the material's or substance's name
	name     string // in words
	value    float64
	unit     book.Unit
	unitSI   string
	override string // how a survey overrides it
	source   string
}

// materialsUsed names the materials of the objects.
func materialsUsed(objs []assess.ObjectResult) map[string]bool {
	used := map[string]bool{}
	for i := range objs {
		if m := objs[i].Material; m != nil {
			used[m.Name] = true
		}
	}
	return used
}

// verifyRows lists the values of the audit to verify before relying on them;
// used names the materials its objects used (materialsUsed).
func verifyRows(a *assess.Audit, used map[string]bool) []verifyRow {
	var out []verifyRow
	for _, s := range model.LimitTable() {
		if !s.FromMemory {
			continue
		}
		over := ""
		if s.SiteItem != "" {
			over = "Site sheet item \"" + s.SiteItem + "\""
		}
		// In the unit of its Site item, as the Limits table shows it (limitUnit):
		// the large-tank diameter in m, not mm.
		out = append(out, verifyRow{what: "limit", key: s.Key, name: s.Label, value: s.Value(a.Options.Limits), unit: limitUnit(s),
			unitSI: s.Unit, override: over, source: s.Source()})
	}
	if a.Survey == nil {
		return out
	}
	listed := map[string]bool{}
	for _, m := range a.Survey.Materials {
		if used[m.Name] && m.BuiltIn && m.FromMemory && !listed[m.Name] {
			listed[m.Name] = true
			out = append(out, verifyRow{what: "material", key: m.Name, name: "Built-in material " + m.Name + " (class, resistivities, humidity slope)",
				override: "a Materials sheet row of the same name", source: m.Source})
		}
	}
	seen := map[string]bool{}
	for _, at := range a.Survey.Atmospheres {
		if !at.MIEFromSubstance && !at.GroupFromSubstance || seen[at.Substance] {
			continue
		}
		sub, ok := inventory.LookupSubstance(at.Substance)
		if !ok || !sub.FromMemory {
			continue
		}
		seen[at.Substance] = true
		out = append(out, verifyRow{what: "substance", key: sub.Name, name: "Built-in substance " + sub.Name + ": MIE (group " + sub.Group + ")",
			value: sub.MIE, unit: book.UnitMJ, unitSI: "J", override: "the MIE and Group columns of the Atmospheres sheet", source: sub.Source})
	}
	return out
}

// displayUnits are the units the limit table shows limits in.
var displayUnits = []book.Unit{book.UnitDimless, book.UnitVolt, book.UnitKV, book.UnitMetre, book.UnitMJ, book.UnitUCPerM2, book.UnitKVPerM, book.UnitNC,
	book.UnitUA, book.UnitOhm, book.UnitOhmM, book.UnitSecond, book.UnitMillimetre, book.UnitCM2, book.UnitMPerS,
	book.UnitUCPerKg, book.UnitPSPerM, book.UnitM2PerS, book.UnitCubicMetre, book.UnitPF}

// limitUnit is the unit the Method sheet shows a limit in: the practical unit
// of the Site item that overrides it, so that the value applied and the Site
// item read alike (kV, m), else the table's display unit.
func limitUnit(s model.LimitSpec) book.Unit {
	if s.SiteUnit != "" {
		if u := displayUnit(s.SiteUnit); u != book.UnitDimless {
			return u
		}
	}
	return displayUnit(s.Display)
}

// displayUnit is the audit unit of a limit table row's display unit (its label).
func displayUnit(label string) book.Unit {
	for _, u := range displayUnits {
		if u.Label() == label {
			return u
		}
	}
	return book.UnitDimless
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
		{"Air breakdown field (cm gaps)", breakdown / 1e3, "kV/m", "0", "AMS Glossary of Meteorology (about 3 MV/m); the value applied"},
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

	if err := section("Verify before relying on these", []string{"Value", "Value applied", "Unit", "How to override it", "Source: recalled, not confirmed against the text"}); err != nil {
		return err
	}
	for _, v := range verifyRows(a, materialsUsed(a.Objects)) {
		unit := v.unit.Label()
		if unit == "" {
			unit = "–"
		}
		val := book.Cell{}
		if v.value != 0 && !math.IsNaN(v.value) {
			val = leftAligned(book.Quantity(v.unit, v.value))
		}
		if v.what == "material" {
			unit = ""
		}
		if err := put(book.WrapText(v.name), val, book.Text(unit), optWrap(v.override), book.WrapText(v.source)); err != nil {
			return err
		}
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
		// A survey material's Source already names its sheet and row.
		src := m.Source
		if err := put(book.Text(m.Name), book.Text(m.Class), book.Quantity(book.UnitOhmSq, m.SurfaceResistivity), book.Quantity(book.UnitDimless, m.HumiditySlope), book.WrapText(src)); err != nil {
			return err
		}
	}
	r++

	if err := section("References", []string{"Key (as the sources cite it)", "Document", "Edition", "Kind", "Note"}); err != nil {
		return err
	}
	for _, ref := range model.References() {
		if err := put(book.WrapText(ref.Key), book.WrapText(ref.Title), book.OptText(ref.Edition), book.Text(ref.Kind), optWrap(ref.Note)); err != nil {
			return err
		}
	}
	return wb.printSetup(s, 1, "", "")
}

// optWrap is a wrapped text cell, empty for "".
func optWrap(s string) book.Cell {
	if s == "" {
		return book.Cell{}
	}
	return book.WrapText(s)
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
