package report

import (
	"fmt"
	"math"
	"strings"

	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/templates"
)

func containsFold(s, sub string) bool {
	return strings.Contains(strings.ToLower(s), strings.ToLower(sub))
}

// limitRow is one limit applied, with its value in display units and its source.
type limitRow struct {
	name   string
	value  float64 // SI
	unit   Unit
	source string
}

// limitRows lists the limits of l with their sources and editions.
//
// TODO(model.LimitSources): the source texts here repeat the project's
// reference notes (electrostatics.md §5-8b); once package model exports the
// sources beside its DefaultLimits, take them from there instead. Values always
// come from the limits actually applied (Options.Limits, survey overrides merged).
func limitRows(l model.Limits) []limitRow {
	g := func(name string, arr [7]float64, u Unit, src string) []limitRow {
		return []limitRow{
			{name + ", IIA", arr[model.IIA], u, src},
			{name + ", IIB", arr[model.IIB], u, src},
			{name + ", IIC", arr[model.IIC], u, src},
		}
	}
	var out []limitRow
	out = append(out, g("Brush charge-density screen", l.BrushChargeDensity, UnitUCPerM2, "JNIOSH-TR (secondary summary); a documented, overridable screen")...)
	out = append(out,
		limitRow{"Brush equivalent energy", l.BrushEnergy, UnitMJ, "CLC/TR 50404 summaries (3-4 mJ, upper end taken)"},
		limitRow{"Area one brush discharge drains", l.BrushArea, UnitCM2, "documented choice of this tool"},
	)
	out = append(out, g("Transferred charge, EPL Gb/Gc (zones 1, 2)", l.TransferredCharge, UnitNC, "IEC 60079-0 7.4.2 / IEC TS 60079-32-1:2013+A1:2017 (from memory)")...)
	out = append(out, limitRow{"Zone 0 factor on transferred charge", l.ZoneZeroChargeFactor, UnitDimless, "documented choice (zone 0 values not confirmed)"})
	out = append(out, g("Insulating area, EPL Ga (zone 0)", l.AreaGa, UnitCM2, "IEC 60079-0 (from memory)")...)
	out = append(out, g("Insulating area, EPL Gb/Gc (zones 1, 2)", l.AreaGb, UnitCM2, "IEC 60079-0 (from memory)")...)
	out = append(out,
		limitRow{"Propagating brush: charge density needed", l.PropagatingDensity, UnitUCPerM2, "JNIOSH-TR; TRGS 727 Annex C"},
		limitRow{"Propagating brush: layer breakdown below which prevented", l.PropagatingBreakdown, UnitKV, "TRGS 727 Annex C; IEC 60079-0:2017"},
		limitRow{"Propagating brush: thickness above which not expected", l.PropagatingThickness, UnitMillimetre, "from memory (8-10 mm)"},
		limitRow{"Conductor resistance to earth", l.ConductorEarthing, UnitOhm, "TRGS 727 8.3"},
		limitRow{"Person-to-earth resistance", l.PersonEarthing, UnitOhm, "TRGS 727 7.2 (zones 0, 1, 20, 21)"},
		limitRow{"Person limit applies at MIE up to", l.PersonEarthingMIE, UnitMJ, "TRGS 727 7.2"},
		limitRow{"Shock energy to people", l.ShockEnergy, UnitMJ, "TRGS 727 Annex D"},
		limitRow{"Safe conductor potential", l.SafePotential, UnitKV, "JNIOSH-TR (100 V)"},
		limitRow{"Spark minimum potential (Paschen floor)", l.SparkMinPotential, UnitKV, "Paschen minimum in air, about 300-327 V"},
		limitRow{"Air breakdown field", l.AirBreakdown, UnitKVPerM, "AMS Glossary (about 3 MV/m, cm gaps)"},
		limitRow{"Resistance taken when unknown", l.NotEarthed, UnitOhm, "documented choice: treated as not earthed"},
		limitRow{"Cap on an estimated body potential", l.PersonMaxPotential, UnitKV, "ESD Association walking tests (tens of kV)"},
		limitRow{"Liquid: low conductivity at or below", l.LowConductivity, UnitPSPerM, "IEC TS 60079-32-1"},
		limitRow{"Liquid: high conductivity above", l.HighConductivity, UnitPSPerM, "IEC TS 60079-32-1 (from memory)"},
		limitRow{"Liquid: v·d limit above the conductivity bound", l.VDHigh, UnitM2PerS, "IEC TS 60079-32-1 (road tankers)"},
		limitRow{"Liquid: v·d limit at or below it, or unknown", l.VDLow, UnitM2PerS, "IEC TS 60079-32-1 (road tankers)"},
		limitRow{"Liquid: conductivity bound of the v·d limits", l.VDKappa, UnitPSPerM, "IEC TS 60079-32-1"},
		limitRow{"Liquid: maximum velocity", l.MaxVelocity, UnitMPerS, "IEC TS 60079-32-1 (from memory)"},
		limitRow{"Liquid: velocity until the inlet is submerged", l.SlowStartVelocity, UnitMPerS, "IEC TS 60079-32-1 (from memory)"},
		limitRow{"Bag type C: any point to earthing tab", l.BagCToTab, UnitOhm, "IEC 61340-4-4:2018 (1e7 Ω in the earlier edition)"},
		limitRow{"Bag type C: tab to plant earth", l.BagTabToEarth, UnitOhm, "IEC 61340-4-4"},
		limitRow{"Bags C, D: MIE their qualification assumes", l.BagMinMIE, UnitMJ, "IEC 61340-4-4"},
		limitRow{"Bags C, D: charging current their qualification assumes", l.BagMaxCurrent, UnitUA, "IEC 61340-4-4"},
	)
	return out
}

// limitValue returns the display cell of a limit: empty when the limit is not
// set (zero or NaN), since 0 would read as a limit of zero.
func limitValue(r limitRow) cell {
	if r.value == 0 || math.IsNaN(r.value) {
		return cell{numFmt: r.unit.NumFmt()}
	}
	return quantity(r.unit, r.value)
}

// method writes the Method sheet: identity of the run, formulas with their
// sources, constants, limits applied, defaults applied and materials used.
func (wb *workbook) method() error {
	f, s, a := wb.f, SheetMethod, wb.a
	if err := setWidths(f, s, []float64{40, 60, 14, 12, 50}); err != nil {
		return err
	}
	sink := normalSink{f: f, sheet: s, st: wb.st}
	r := 1
	section := func(title string, hdr []string) error {
		ref := fmt.Sprintf("A%d", r)
		if err := f.SetCellValue(s, ref, title); err != nil {
			return err
		}
		if err := f.SetCellStyle(s, ref, fmt.Sprintf("E%d", r), wb.st.section()); err != nil {
			return err
		}
		r++
		if hdr != nil {
			if err := sink.header(r, hdr); err != nil {
				return err
			}
			r++
		}
		return nil
	}
	put := func(cells ...cell) error {
		if err := sink.row(r, cells); err != nil {
			return err
		}
		// Wrapped long texts: estimate the height from the longest cell.
		h := 0.0
		widths := []float64{40, 60, 14, 12, 50}
		for i, c := range cells {
			if t, ok := c.v.(string); ok && c.wrap && i < len(widths) {
				h = math.Max(h, wrappedHeight(t, widths[i]))
			}
		}
		if h > 17 {
			if err := f.SetRowHeight(s, r, h); err != nil {
				return err
			}
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
		if err := put(boldText(kv[0]), optText(kv[1])); err != nil {
			return err
		}
	}
	if a.Options.Samples > 0 {
		if err := put(boldText("Uncertainty"), text(fmt.Sprintf("Monte Carlo, %d samples per object, seed %d", a.Options.Samples, a.Options.Seed))); err != nil {
			return err
		}
	}
	r++

	if err := section("Formulas", []string{"Quantity", "Formula", "Applies to", "", "Source"}); err != nil {
		return err
	}
	for _, m := range templates.MethodNotes() {
		if err := put(wrapText(m.Quantity), wrapText(m.Formula), wrapText(m.AppliesTo), cell{}, wrapText(m.Source)); err != nil {
			return err
		}
	}
	// The Applies-to text runs over C:D; merge them so it wraps over both.
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
		{"Air breakdown field (cm gaps)", breakdown / 1e3, "kV/m", "0", "AMS Glossary (about 3 MV/m)"},
		{"Breakdown-limited charge density, one side", 8.8541878128e-12 * breakdown / 1e-6, "µC/m²", "0.00", "derived: ε0 × air breakdown field; CCPS glossary 2.65e-5 C/m²"},
		{"Paschen minimum in air", paschen, "V", "0", "Paschen's law; about 327 V, no gap breaks down below about 300 V"},
		{"Corona onset, smooth cylinder r = 1 mm", 5860, "kV/m", "0", "Peek 1929: 30 δ m (1 + 0.301/√(δ r)) kV/cm, 58.6 kV/cm"},
	}
	for _, c := range consts {
		if err := put(text(c.name), cell{v: c.v, numFmt: c.fmt}, text(c.unit), cell{}, wrapText(c.src)); err != nil {
			return err
		}
	}
	r++

	if err := section("Limits applied", []string{"Limit", "Value", "Unit", "", "Source and edition"}); err != nil {
		return err
	}
	for _, l := range limitRows(a.Options.Limits) {
		unit := l.unit.Label()
		if unit == "" {
			unit = "–"
		}
		if err := put(wrapText(l.name), limitValue(l), text(unit), cell{}, wrapText(l.source)); err != nil {
			return err
		}
	}
	if err := put(wrapText("Required margin on MIE (Site sheet)"), est(inQ(UnitDimless, site.RequiredMargin), siteDefaulted(site.Defaults, "margin")), text("–"), cell{}, wrapText("the site's choice; default 10")); err != nil {
		return err
	}
	r++

	if err := section("Defaults applied", []string{"Quantity", "Value", "", "", "Why and from where"}); err != nil {
		return err
	}
	nd := 0
	for _, d := range site.Defaults {
		if err := put(text("Site: "+d), cell{}, cell{}, cell{}, text("Site sheet value not given: default used")); err != nil {
			return err
		}
		nd++
	}
	for _, at := range a.Survey.Atmospheres {
		if at.MIEFromSubstance {
			if err := put(text("MIE of atmosphere "+at.ID), text(UnitMJ.Text(at.MIE.OrNaN())), cell{}, cell{}, wrapText("from the built-in substance list ("+at.Substance+")")); err != nil {
				return err
			}
			nd++
		}
		if at.GroupFromSubstance {
			if err := put(text("Group of atmosphere "+at.ID), text(at.Group), cell{}, cell{}, wrapText("from the built-in substance list ("+at.Substance+")")); err != nil {
				return err
			}
			nd++
		}
	}
	for _, d := range a.MethodDefaults {
		if err := put(wrapText(d.Field), wrapText(d.Value), cell{}, cell{}, wrapText(d.Reason)); err != nil {
			return err
		}
		nd++
	}
	if nd == 0 {
		if err := put(text("none: every value was measured or given")); err != nil {
			return err
		}
	}
	r++

	if err := section("Materials used", []string{"Material", "Class", UnitOhmSq.Header("Surface resistivity at 50 % RH"), "Slope [decades per 10 %RH]", "Source"}); err != nil {
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
		if err := put(text(m.Name), text(m.Class), quantity(UnitOhmSq, m.SurfaceResistivity), quantity(UnitDimless, m.HumiditySlope), wrapText(src)); err != nil {
			return err
		}
	}
	return wb.printSetup(s, 1, "", "")
}
