package audit

import (
	"fmt"
	"math"
	"sort"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
	"github.com/xuri/excelize/v2"
)

// summaryWidths are the Summary column widths: A labels, A-J the ranked stations table.
func summaryWidths() []float64 { return []float64{22, 12, 26, 14, ratioTextWidth, 9, 10, 10, 11, 10} }

// summaryMainWidth is the width of the station table's Main reason column (K).
const summaryMainWidth = 40

// summaryNoteWidth is the width of the station table's Note column (K), present
// only when a station is incomplete.
const summaryNoteWidth = 24

// summary writes the Summary sheet: identity, counts by verdict, rows read,
// the ranked stations, the chart of worst ratios and the cautions in short.
func (wb *workbook) summary() error {
	f, s, a := wb.f, SheetSummary, wb.a
	site := a.Survey.Site
	// A Note column (K) on the station table only when a station is incomplete
	// (object rows naming it rejected), as on the Stations sheet and the terminal.
	incomplete := false
	for i := range a.Stations {
		incomplete = incomplete || a.Stations[i].IncompleteText() != ""
	}
	widths := append(summaryWidths(), summaryMainWidth)
	if incomplete {
		widths = append(widths, summaryNoteWidth)
	}
	if err := book.SetWidths(f, s, widths); err != nil {
		return err
	}
	sink := book.NormalSink{F: f, Sheet: s, St: wb.st}
	r := 1
	if err := f.SetCellValue(s, "A1", "Electrostatic ignition screening audit"); err != nil {
		return err
	}
	if err := f.SetCellStyle(s, "A1", "A1", wb.st.Title()); err != nil {
		return err
	}
	if err := f.SetRowHeight(s, 1, 24); err != nil {
		return err
	}
	// The cautions line right under the title, in a caution box.
	r = 2
	if err := wb.cautionBox(s); err != nil {
		return err
	}

	section := func(row int, title string) error {
		ref := fmt.Sprintf("A%d", row)
		if err := f.SetCellValue(s, ref, title); err != nil {
			return err
		}
		return f.SetCellStyle(s, ref, fmt.Sprintf("J%d", row), wb.st.Section())
	}

	r = 4
	if err := section(r, "Survey"); err != nil {
		return err
	}
	r++
	ident := [][2]book.Cell{
		{book.Text("Site"), book.Text(siteName(a))},
		{book.Text("Site ID"), book.OptText(site.ID)},
		{book.Text("Survey date"), book.Text(dateText(a))},
		{book.Text("Surveyed by"), book.OptText(site.SurveyedBy)},
		{book.Text(book.UnitPercentRH.Header("Relative humidity")), siteHumidityCell(site)},
		{book.Text(book.UnitCelsius.Header("Air temperature")), marked(inQ(book.UnitCelsius, site.AirTemperature), siteProv(site, assess.ItemAirTemperature))},
		{book.Text(book.UnitDimless.Header("Required margin")), marked(inQ(book.UnitDimless, site.RequiredMargin), siteProv(site, assess.ItemRequiredMargin))},
		{book.Text("Survey file"), book.OptText(wb.info.file(a))},
		{book.Text("Survey SHA-256"), book.OptText(wb.info.sha(a))},
		{book.Text("Tool"), book.Text(wb.info.tool() + " " + wb.info.ToolVersion)},
	}
	for _, kv := range ident {
		if kv[0].V == "Site ID" && site.ID == "" {
			continue // optional: no row when the survey gives none
		}
		kv[0].Bold = true
		kv[1].Align = "left"
		if err := sink.Row(r, []book.Cell{kv[0], kv[1]}, 0); err != nil {
			return err
		}
		r++
	}
	// The legend of the marks beside values, once, for every sheet.
	if err := wb.mergedNote(s, r, assess.LegendText); err != nil {
		return err
	}
	r++

	// Counts by verdict.
	r++
	if err := section(r, "Objects by verdict"); err != nil {
		return err
	}
	r++
	if err := sink.Header(r, []string{"Verdict", "Objects [count]", "Findings [count]"}); err != nil {
		return err
	}
	r++
	findingsBy := map[assess.Verdict]int{}
	for _, fd := range a.Findings {
		findingsBy[fd.Severity]++
	}
	total := 0
	for _, v := range verdictOrder() {
		n := a.Counts[v]
		total += n
		if err := sink.Row(r, []book.Cell{verdictCell(v), book.Integer(n), book.Integer(findingsBy[v])}, 0); err != nil {
			return err
		}
		r++
	}
	if err := sink.Row(r, []book.Cell{book.BoldText("All objects"), book.Integer(total), book.Integer(len(a.Findings))}, 0); err != nil {
		return err
	}
	r += 2

	// Rows read, accepted, rejected.
	if err := section(r, "Survey rows"); err != nil {
		return err
	}
	r++
	if err := sink.Header(r, []string{"Survey sheet", "Read [rows]", "Accepted [rows]", "Rejected [rows]"}); err != nil {
		return err
	}
	r++
	for _, c := range a.Survey.Counts {
		cells := []book.Cell{book.Text(c.Sheet), book.Integer(c.Read), book.Integer(c.Accepted), book.Integer(c.Rejected)}
		if c.NotUsedByAssess() {
			// Not used by this command: its rows are neither accepted nor
			// rejected; a row with a problem is a note on the Rejected sheet.
			cells = []book.Cell{book.Text(c.Sheet), book.Integer(c.Read), book.Text("not used by this command"),
				book.Text(fmt.Sprintf("none (%d row(s) with a problem: notes)", c.Rejected))}
		}
		if err := sink.Row(r, cells, 0); err != nil {
			return err
		}
		r++
	}
	if n := len(a.Survey.Warnings()); n > 0 {
		if err := sink.Row(r, []book.Cell{book.Text(fmt.Sprintf("%d warning(s) on accepted rows: see the Rejected sheet", n))}, 0); err != nil {
			return err
		}
		r++
	}
	r++

	// Ranked stations.
	if err := section(r, "Stations, worst first"); err != nil {
		return err
	}
	r++
	header := []string{"Station", "Rank", "Name", "Verdict", book.UnitRatio.Header("Worst ratio E/MIE"),
		"Objects [count]", "Incendive [count]", "Marginal [count]", "Non-incendive [count]", "Not assessed [count]", "Main reason"}
	if incomplete {
		header = append(header, "Note")
	}
	if err := sink.Header(r, header); err != nil {
		return err
	}
	if err := f.SetRowHeight(s, r, 30); err != nil {
		return err
	}
	r++
	for i := range a.Stations {
		st := &a.Stations[i]
		main := book.WrapText(st.Main.String())
		cells := []book.Cell{
			book.BoldText(st.Station.ID), book.Integer(st.Rank), book.WrapText(st.Station.Name), verdictCell(st.Verdict),
			stationRatioCell(st), book.Integer(len(st.Objects)),
			book.Integer(st.Counts[assess.Incendive]), book.Integer(st.Counts[assess.Marginal]),
			book.Integer(st.Counts[assess.NonIncendive]), book.Integer(st.Counts[assess.NotAssessed]), main,
		}
		sized := []book.Cell{{}, {}, book.WrapText(st.Station.Name), {}, {}, {}, {}, {}, {}, {}, main}
		if incomplete {
			note := book.WrapText(st.IncompleteText())
			cells = append(cells, note)
			sized = append(sized, make([]book.Cell, len(cells)-len(sized)-1)...)
			sized = append(sized, note)
		}
		if err := sink.Row(r, cells, book.RowHeight(widths, sized)); err != nil {
			return err
		}
		r++
	}
	r++

	// The uncertainty run, when one was made: its draws, the borderline
	// objects and what to measure next.
	if a.Options.Samples > 0 {
		var err error
		if r, err = wb.summaryUncertainty(r, section, sink); err != nil {
			return err
		}
	}

	// Chart of worst ratio per station, pointing at the Stations sheet; it
	// starts a new printed page so that it is never cut in two.
	if len(a.Stations) > 0 {
		if err := f.InsertPageBreak(s, fmt.Sprintf("A%d", r)); err != nil {
			return err
		}
		if err := section(r, "Worst ratio per station"); err != nil {
			return err
		}
		r++
		rows := chartRows(len(a.Stations))
		if err := wb.chart(fmt.Sprintf("A%d", r), rows); err != nil {
			return err
		}
		r += rows + 2 // spreadsheet programs draw default rows a little lower than 20 px
		caption := "Ratio = effective discharge energy / MIE of the station's atmosphere, log scale; 1 means the MIE is reached. " +
			"Every station with a verdict is listed with it; a station whose ratio is \"no discharge\" (no discharge possible), \"" + NoAtmosphereText + "\" (no flammable atmosphere: judged on shock and earthing alone) or \"n/a\" (not assessed) has no bar; " +
			"\">= 1 (assumed)\" is drawn at 1: the energy reaches the MIE only because the resistance to earth or the charging current is assumed, its size is no figure. A ratio below the axis is drawn at its bottom."
		if err := sink.Row(r, []book.Cell{book.WrapText(caption)}, 0); err != nil {
			return err
		}
		if err := f.MergeCell(s, fmt.Sprintf("A%d", r), fmt.Sprintf("J%d", r)); err != nil {
			return err
		}
		// The caption's own height, wrapped over the merged width, so that it is
		// printed whole below the chart.
		if err := f.SetRowHeight(s, r, wrappedHeight(caption, sum(summaryWidths()))); err != nil {
			return err
		}
		r += 2
	}

	// Cautions in short.
	if err := section(r, "Cautions"); err != nil {
		return err
	}
	r++
	for i, c := range templates.Cautions() {
		ref := fmt.Sprintf("A%d", r)
		if err := f.SetCellValue(s, ref, fmt.Sprintf("%d. %s", i+1, c)); err != nil {
			return err
		}
		if err := f.MergeCell(s, ref, fmt.Sprintf("J%d", r)); err != nil {
			return err
		}
		if err := f.SetCellStyle(s, ref, ref, wb.st.Of(book.WrapText(""))); err != nil {
			return err
		}
		if err := f.SetRowHeight(s, r, wrappedHeight(c, sum(summaryWidths()))); err != nil {
			return err
		}
		r++
	}
	if _, err := wb.signoff(s, r+1, summarySignoff); err != nil {
		return err
	}
	return wb.printSetup(s, 1, "", "")
}

func sum(xs []float64) float64 {
	t := 0.0
	for _, x := range xs {
		t += x
	}
	return t
}

// chartRows returns the height of the Summary chart in sheet rows (20 px
// each): room for the axes plus a bar line per station, at most one page.
func chartRows(stations int) int {
	n := 6 + (stations*3+1)/2
	if n < 16 {
		n = 16
	}
	if n > 26 {
		n = 26
	}
	return n
}

// chart adds the native bar chart of the stations' worst ratios, on a log
// value axis, in one neutral colour (the verdicts are coloured in the table).
func (wb *workbook) chart(at string, rows int) error {
	n := wb.stationRows
	sheet := "'" + SheetStations + "'"
	gap := uint(60)
	lo, hi := ratioAxis(wb.a.Stations)
	return wb.f.AddChart(SheetSummary, at, &excelize.Chart{
		Type: excelize.Bar,
		Series: []excelize.ChartSeries{{
			Name:       sheet + "!$" + wb.chartValueCol + "$1",
			Categories: fmt.Sprintf("%s!$%s$2:$%s$%d", sheet, wb.chartLabelCol, wb.chartLabelCol, n),
			Values:     fmt.Sprintf("%s!$%s$2:$%s$%d", sheet, wb.chartValueCol, wb.chartValueCol, n),
			// One neutral colour: excelize colours single bars only in pie
			// charts, and the verdict colours stay on the table above.
			Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"4D4D4D"}},
		}},
		Format:    excelize.GraphicOptions{OffsetX: 4, OffsetY: 4},
		Dimension: excelize.ChartDimension{Width: 900, Height: uint(rows*20 - 8)},
		Legend:    excelize.ChartLegend{Position: "none"},
		Title:     excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: "Worst ratio E/MIE per station (log scale)", Font: &excelize.Font{Size: 11, Bold: true}}}},
		XAxis:     excelize.ChartAxis{ReverseOrder: true, Font: excelize.Font{Size: 9, Color: "000000"}},
		YAxis: excelize.ChartAxis{
			LogBase: 10, Minimum: &lo, Maximum: &hi, MajorGridLines: true, Font: excelize.Font{Size: 9, Color: "000000"},
			Title: excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: "effective energy / MIE [–]", Font: &excelize.Font{Size: 9, Color: "000000"}}}},
		},
		GapWidth:     &gap,
		ShowBlanksAs: "gap",
	})
}

// ratioAxis returns the log axis range of the ratio chart: whole decades from
// below the smallest positive ratio (showing at least 1/margin = 0.1, not
// below 1e-4) to above the largest (at least 10), so every bar is drawn.
func ratioAxis(stations []assess.StationResult) (lo, hi float64) {
	lo, hi = 0.1, 10
	for i := range stations {
		r := chartValue(&stations[i]) // the bars drawn (1 for an assumed resistance)
		if r == nil || *r <= 0 {
			continue
		}
		if d := math.Pow(10, math.Floor(math.Log10(*r))); d < lo {
			lo = d
		}
		if d := math.Pow(10, math.Ceil(math.Log10(*r))); d > hi {
			hi = d
		}
	}
	return math.Max(lo, 1e-4), hi
}

// siteHumidityCell shows the site's relative humidity (entered), or, when the
// Site sheet gives none (an error that check reports), the value the
// assessment used for stations without their own, marked as estimated.
func siteHumidityCell(site inventory.Site) book.Cell {
	if !site.RelativeHumidity.Known {
		return est(book.Quantity(book.UnitPercentRH, assess.DryDayHumidity), true)
	}
	return marked(inQ(book.UnitPercentRH, site.RelativeHumidity), assess.ProvEntered)
}

// measureNextRows is the most borderline objects the Summary lists under
// "What to measure next" (the rest are flagged on the Objects sheet).
const measureNextRows = 30

// summaryUncertainty writes the Summary's account of the uncertainty run from
// row r: the draws and seed, how many objects are borderline, and the list of
// what to measure next (object, station, verdict, probabilities, advice),
// worst station first; it returns the next free row.
func (wb *workbook) summaryUncertainty(r int, section func(int, string) error, sink book.NormalSink) (int, error) {
	a := wb.a
	rank := map[string]int{}
	for _, st := range a.Stations {
		rank[st.Station.ID] = st.Rank
	}
	border := append([]assess.BorderlineObject(nil), a.Borderline...)
	sort.SliceStable(border, func(i, j int) bool { return rank[border[i].StationID] < rank[border[j].StationID] })
	if err := section(r, "Uncertainty run"); err != nil {
		return r, err
	}
	r++
	text := fmt.Sprintf("Monte Carlo: %d samples per object, seed %d (uncertainties on the Method sheet). %d object(s) borderline: "+
		"the point verdict differs from the most likely sampled verdict, or the more severe verdicts together exceed %.0f %% (a screening choice of this tool).",
		a.Options.Samples, a.Options.Seed, len(border), 100*assess.BorderlineThreshold)
	if err := wb.mergedNote(SheetSummary, r, text); err != nil {
		return r, err
	}
	r += 2
	if len(border) == 0 {
		return r, nil
	}
	if err := section(r, "What to measure next"); err != nil {
		return r, err
	}
	r++
	if err := sink.Header(r, []string{"Object", "Station", "Verdict", book.UnitProbability.Header("P(incendive)"), book.UnitProbability.Header("P(marginal)"), book.UnitProbability.Header("P(non-incendive)"), "What to measure and what it settles", "", "", ""}); err != nil {
		return r, err
	}
	if err := wb.f.MergeCell(SheetSummary, fmt.Sprintf("G%d", r), fmt.Sprintf("J%d", r)); err != nil {
		return r, err
	}
	if err := wb.f.SetRowHeight(SheetSummary, r, 30); err != nil {
		return r, err
	}
	r++
	widths := summaryWidths()
	adviceWidth := sum(widths[6:])
	for i, o := range border {
		if i == measureNextRows {
			if err := sink.Row(r, []book.Cell{book.Text(fmt.Sprintf("... %d more borderline object(s): see Borderline on the Objects sheet", len(border)-measureNextRows))}, 0); err != nil {
				return r, err
			}
			r++
			break
		}
		p := o.Probability
		advice := book.WrapText(o.Measure)
		cells := []book.Cell{book.BoldText(o.ObjectID), book.Text(o.StationID), verdictCell(o.Verdict),
			book.Quantity(book.UnitProbability, p.Incendive), book.Quantity(book.UnitProbability, p.Marginal), book.Quantity(book.UnitProbability, p.NonIncendive), advice}
		if err := sink.Row(r, cells, wrappedHeight(o.Measure, adviceWidth)); err != nil {
			return r, err
		}
		if err := wb.f.MergeCell(SheetSummary, fmt.Sprintf("G%d", r), fmt.Sprintf("J%d", r)); err != nil {
			return r, err
		}
		r++
	}
	return r + 1, nil
}

// siteValue is a Site sheet value the audit shows with its provenance.
type siteValue struct {
	item assess.Item
	prov assess.Provenance
}

// siteValues gives the provenance of the site's own values: the relative
// humidity entered (estimated: the dry-day value, when none is given), the
// air temperature entered or defaulted, and the required margin an override
// of the tool's default 10 when given, the default otherwise.
func siteValues(site inventory.Site) []siteValue {
	rh := assess.ProvEntered
	if !site.RelativeHumidity.Known {
		rh = assess.ProvEstimated
	}
	t := assess.ProvEntered
	if !(site.AirTemperature.Known && site.AirTemperature.Value > 0) || site.Defaulted(inventory.SiteItemAirTemperature) {
		t = assess.ProvEstimated
	}
	m := assess.ProvOverride
	if !(site.RequiredMargin.Known && site.RequiredMargin.Value > 0) || site.Defaulted(inventory.SiteItemRequiredMargin) {
		m = assess.ProvEstimated
	}
	return []siteValue{{assess.ItemRelativeHumidity, rh}, {assess.ItemAirTemperature, t}, {assess.ItemRequiredMargin, m}}
}

// siteProv is the provenance of one site value (siteValues).
func siteProv(site inventory.Site, it assess.Item) assess.Provenance {
	for _, v := range siteValues(site) {
		if v.item == it {
			return v.prov
		}
	}
	return assess.ProvNone
}

// NoAtmosphereText is a station's worst ratio where the station has no
// flammable atmosphere: no MIE to compare with. It is the one wording of the
// terminal, the Summary, Stations and Report sheets and the HTML.
const NoAtmosphereText = "no atmosphere"

// stationRatioText is the text shown for a station's worst ratio where it is
// no number to read: ">= 1 (assumed)", "no atmosphere", "no discharge", "n/a"
// (assess.RatioText: none computed); "" otherwise. Every output of a station's
// ratio goes through it.
func stationRatioText(st *assess.StationResult) string {
	switch {
	case st.WorstRatioAssumed:
		return assess.RatioAssumedText
	case st.Atmosphere == nil:
		return NoAtmosphereText
	}
	return assess.RatioText(book.FinitePtr(st.WorstRatio))
}

// stationRatioCell is the worst ratio of a station as the Summary, Stations
// sheet and terminal show it: the number, or why there is none.
func stationRatioCell(st *assess.StationResult) book.Cell {
	if t := stationRatioText(st); t != "" {
		return book.Code(t)
	}
	return ratioCell(book.FinitePtr(st.WorstRatio))
}

// mergedNote writes a wrapped note across A:J of row r of sheet s.
func (wb *workbook) mergedNote(s string, r int, text string) error {
	ref := fmt.Sprintf("A%d", r)
	if err := wb.f.SetCellValue(s, ref, text); err != nil {
		return err
	}
	if err := wb.f.MergeCell(s, ref, fmt.Sprintf("J%d", r)); err != nil {
		return err
	}
	if err := wb.f.SetCellStyle(s, ref, ref, wb.st.Of(book.WrapText(""))); err != nil {
		return err
	}
	return wb.f.SetRowHeight(s, r, wrappedHeight(text, sum(summaryWidths())))
}

// cautionBox writes the cautions line in a caution box across A2:J2 of sheet s,
// right under the title (the audit's Summary and the portfolio's).
func (wb *workbook) cautionBox(s string) error {
	f := wb.f
	if err := f.MergeCell(s, "A2", "J2"); err != nil {
		return err
	}
	if err := f.SetCellValue(s, "A2", templates.CautionLine); err != nil {
		return err
	}
	if err := f.SetCellStyle(s, "A2", "J2", wb.st.Caution()); err != nil {
		return err
	}
	return f.SetRowHeight(s, 2, 30)
}
