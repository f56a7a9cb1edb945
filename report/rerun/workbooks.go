package rerun

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/xuri/excelize/v2"
)

// Sheet names of the whatif workbook, in order.
const (
	SheetSummary  = "Summary"
	SheetObjects  = "Objects"
	SheetStations = "Stations"
	SheetChanges  = "Changes applied"
	SheetMethod   = "Method"
	SheetCautions = "Cautions"
	SheetRejected = "Rejected"
	SheetSweep    = "Sweep"
	SheetAdded    = "Added"
	SheetRemoved  = "Removed"
	SheetChanged  = "Changed"
	// SheetRejectedObjects is the compare workbook's list of the Objects rows
	// rejected on either side (not compared: neither added nor removed).
	SheetRejectedObjects = "Rejected objects"
)

func rerunNotes() [][2]string {
	return [][2]string{
		{"Changes", "Each change is validated like survey input (IDs must be accepted rows, values carry a unit of the right dimension) and applied, in order (Changes sheet first, then the command-line flags), to a copy of the accepted rows. The survey file is never modified."},
		{"Before and after", "The survey is assessed as it is (before) and with the changes (after), with the same limits and the same model; a verdict is a hazard when it is incendive or marginal. Cleared: a hazard before, none after. Stayed: a hazard before and after. Appeared: none before, a hazard after."},
		{"Humidity", "A station's RH is its own, else the site's. When it changes, the model recomputes each material's surface resistivity from its 50 % value and its humidity slope (log10 of resistivity falls linearly by the slope per 10 %RH, clipped); a material with slope 0 (PTFE, PE, PP) does not respond. A site RH change reaches only stations that give no RH of their own. " + MeasuredReadingsNote},
		{"Earthing and footwear", "An earthing change sets the resistance to earth of one object, or of every row at a station the assessment treats as a conductor that must be earthed (parts, containers, liquid lines, conductive rollers, type C bags, and conducting or dissipative surfaces that are not earthed); a footwear change sets a person's resistance to earth through footwear and floor."},
	}
}

// whatifNotes are the whatif Method sheet's notes: the rerun notes and the
// change kinds, from the change table.
func whatifNotes() [][2]string {
	return append(rerunNotes(), [2]string{"Changes sheet and flags", SheetAndFlagsNote}, [2]string{"Change kinds", KindsNote()})
}

// SheetAndFlagsNote says how the Changes sheet and the flags combine.
const SheetAndFlagsNote = "The survey's Changes sheet rows are applied first, then the flags in their order (--no-sheet-changes leaves the sheet out). " +
	"When a flag sets the same target as a sheet row (the same change kind on the same object, station or the site), the flag wins: the sheet row is checked but not applied, and listed as overridden on the Changes applied sheet. " +
	"The Changes sheet is used by whatif only: a problem on one of its rows is listed by assess, sweep and whatif --no-sheet-changes as a note (the sheet not used by this command), not as a rejected row."

// WriteWhatifWorkbook writes the whatif workbook: Summary (counts before and
// after, counts moved, a chart), Objects and Stations before/after, Changes
// applied, Method, Cautions and Rejected.
func WriteWhatifWorkbook(w io.Writer, x *Whatif, info RunInfo) error {
	if x == nil || x.Before == nil || x.Before.Survey == nil {
		return errors.New("whatif workbook: no result")
	}
	s := x.Before.Survey
	b := newBook(x.After, info, SheetSummary, "What-if on the screening audit")

	// Summary.
	sh := SheetSummary
	b.check(b.f.SetColWidth(sh, "A", "A", 26))
	b.check(b.f.SetColWidth(sh, "B", "D", 14))
	b.Put(sh, 1, 1, audit.TitleCell("What-if: "+b.site))
	r := 3
	for _, kv := range [][2]string{{"Survey", s.Path}, {"Survey date", b.date}, {"Changes applied", fmt.Sprint(len(x.Applied))}} {
		b.Put(sh, 1, r, tx(kv[0]))
		b.Put(sh, 2, r, tx(kv[1]))
		r++
	}
	r++
	b.Put(sh, 1, r, audit.SectionCell("Objects by verdict"))
	r++
	countsAt := r
	var rows [][]audit.Cell
	for _, v := range []assess.Verdict{assess.Incendive, assess.Marginal, assess.NonIncendive, assess.NotAssessed} {
		rows = append(rows, []audit.Cell{vd(v.String()), in(x.Before.Counts[v]), in(x.After.Counts[v])})
	}
	r = b.Table(sh, r, []string{"Verdict", "Before", "After"}, []float64{26, 14, 14}, rows) + 1
	b.Put(sh, 1, r, audit.SectionCell("What moved"))
	r++
	st := map[Outcome]int{}
	for _, d := range x.Stations {
		st[d.Outcome]++
	}
	rows = nil
	for _, o := range []Outcome{Cleared, Stayed, Appeared, NoHazard, Unjudged} {
		rows = append(rows, []audit.Cell{tx(string(o)), in(x.Moved[o]), in(st[o])})
	}
	r = b.Table(sh, r, []string{"Outcome", "Objects", "Stations"}, []float64{26, 14, 14}, rows) + 1
	b.Put(sh, 1, r, audit.CautionCell("Screening estimates only: defer to local codes, the site's hazardous-area classification and a competent person (see the Cautions sheet)."))
	b.check(b.f.MergeCell(sh, fmt.Sprintf("A%d", r), fmt.Sprintf("C%d", r)))
	b.check(b.f.SetRowHeight(sh, r, 40))
	gap := uint(80)
	b.check(b.f.AddChart(sh, "E3", &excelize.Chart{
		Type: excelize.Col,
		Series: []excelize.ChartSeries{
			{Name: fmt.Sprintf("%s!$B$%d", sh, countsAt), Categories: fmt.Sprintf("%s!$A$%d:$A$%d", sh, countsAt+1, countsAt+4), Values: fmt.Sprintf("%s!$B$%d:$B$%d", sh, countsAt+1, countsAt+4), Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"A6A6A6"}}},
			{Name: fmt.Sprintf("%s!$C$%d", sh, countsAt), Categories: fmt.Sprintf("%s!$A$%d:$A$%d", sh, countsAt+1, countsAt+4), Values: fmt.Sprintf("%s!$C$%d:$C$%d", sh, countsAt+1, countsAt+4), Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"404040"}}},
		},
		Dimension: excelize.ChartDimension{Width: 560, Height: 320},
		Legend:    excelize.ChartLegend{Position: "bottom"},
		Title:     chartTitle("Objects by verdict, before and after the changes", 11),
		XAxis:     excelize.ChartAxis{Font: excelize.Font{Size: 9, Color: "000000"}},
		YAxis:     excelize.ChartAxis{MajorGridLines: true, Font: excelize.Font{Size: 9, Color: "000000"}, Title: chartTitle("objects", 9)},
		GapWidth:  &gap,
	}))
	b.PrintSetup(sh, "")

	// Objects.
	rows = nil
	for _, o := range x.Objects {
		mat := ""
		if o.After != nil {
			mat = o.After.Object.Material
		}
		row := []audit.Cell{tx(o.ID), tx(o.Station), tx(o.Kind), tx(mat), vd(o.Before.Verdict.String()), ratioCell(o.Before.Ratio, o.Before.RatioAssumed())}
		if o.After != nil {
			row = append(row, vd(o.After.Verdict.String()), ratioCell(o.After.Ratio, o.After.RatioAssumed()), ct(string(o.Outcome)), wr(o.Worse), wr(o.Held), wr(o.Why), wr(o.After.Reason))
		}
		rows = append(rows, row)
	}
	b.Table(SheetObjects, 1, []string{"ID", "Station", "Kind", "Material after", "Verdict before", "Ratio E/MIE before [–]", "Verdict after", "Ratio E/MIE after [–]", "Outcome", "Why worse", "Held by a reading", "What changed and why", "Reason after"},
		[]float64{12, 10, 10, 14, 14, 16, 14, 16, 11, 40, 36, 55, 55}, rows)
	b.PrintSetup(SheetObjects, "$1:$1")

	// Stations.
	rows = nil
	for _, d := range x.Stations {
		row := []audit.Cell{tx(d.ID), tx(d.Name)}
		if d.Before != nil {
			row = append(row, in(d.Before.Rank), vd(d.Before.Verdict.String()), ratioCell(d.Before.WorstRatio, d.Before.WorstRatioAssumed))
		} else {
			row = append(row, audit.EmptyCell(), audit.EmptyCell(), audit.EmptyCell())
		}
		row = append(row, in(d.After.Rank), vd(d.After.Verdict.String()), ratioCell(d.After.WorstRatio, d.After.WorstRatioAssumed), ct(string(d.Outcome)),
			wr(strings.Join(StationNotes(d.Before, d.After), "; ")))
		rows = append(rows, row)
	}
	b.Table(SheetStations, 1, []string{"Station", "Name", "Rank before", "Verdict before", "Worst ratio before [–]", "Rank after", "Verdict after", "Worst ratio after [–]", "Outcome", "Note"},
		[]float64{10, 28, 8, 14, 16, 8, 14, 16, 11, 45}, rows)
	b.PrintSetup(SheetStations, "$1:$1")

	// Changes applied.
	rows = nil
	for i, a := range x.Applied {
		rows = append(rows, []audit.Cell{in(i + 1), tx(a.Kind), tx(a.Target), tx(a.Value), tx(a.SIText), tx(a.Source), wr(a.Description), wr(strings.Join(a.Objects, ", ")), wr(a.Note)})
	}
	for _, c := range x.Overridden {
		rows = append(rows, []audit.Cell{tx("–"), tx(c.Kind), tx(c.Target), tx(c.Value), tx("not applied"), tx(c.Source),
			wr("overridden by the flag " + c.OverriddenBy + ": a flag wins over a Changes sheet row that sets the same target"), audit.EmptyCell(), wr(c.Note)})
	}
	if len(rows) == 0 {
		rows = append(rows, []audit.Cell{audit.EmptyCell(), tx("none: the survey as it is")})
	}
	b.Table(SheetChanges, 1, []string{"#", "Change", "Target", "Value as written", "Value applied", "From", "What was changed", "Objects reached", "Note"},
		[]float64{4, 11, 16, 14, 14, 12, 50, 30, 30}, rows)
	b.PrintSetup(SheetChanges, "$1:$1")

	b.AddMethodSheet(audit.MethodNotes{Title: "How this what-if works (the formulas, limits and defaults below are those of the run after the changes)", Notes: whatifNotes()})
	b.AddCautionsSheet()
	b.AddRejectedSheet(s)
	return b.write(w)
}

// SweepWideStations is how many stations the Sweep sheet gives columns (and
// chart lines) to: the worst by rank at the lowest RH. With more stations, every
// station's steps are on the SheetSweepLong sheet, one row per station and step,
// so no sheet grows to hundreds of columns.
const SweepWideStations = 10

// SheetSweepLong is the sweep workbook's sheet of every station at every step,
// written when the survey has more than SweepWideStations stations.
const SheetSweepLong = "Sweep by station"

// WriteSweepWorkbook writes the sweep workbook: the Sweep table (one row per RH
// step: counts and the worst ratio and verdict of up to SweepWideStations
// stations) with a line chart of the counts and one of the worst ratios, the
// Sweep by station sheet (every station at every step, when there are more),
// the Stations sheet (the RH from which each is non-incendive, or what keeps
// it from it, and the RH kept at a station that gives its own), and the
// audit's Method (with the sweep's notes), Cautions and Rejected sheets.
func WriteSweepWorkbook(w io.Writer, sw *Sweep, info RunInfo) error {
	if sw == nil || len(sw.Steps) == 0 || sw.Survey == nil {
		return errors.New("sweep workbook: no steps or no survey")
	}
	// The Method sheet is the audit of the survey as it is; the sweep replaces only the RH.
	base := assess.Assess(sw.Survey, assess.Options{Limits: Limits(sw.Survey)})
	b := newBook(base, info, SheetSweep, "Humidity sweep of the screening audit")
	wide := sw.Top(SweepWideStations)
	all := len(sw.Steps[0].Stations)
	held := map[string]float64{}
	for _, h := range sw.Held {
		held[h.ID] = h.RH
	}
	headers := []string{"RH [%]", "Incendive objects", "Marginal objects"}
	widths := []float64{8, 11, 11}
	var heldShown []string
	for _, j := range wide {
		id := sw.Steps[0].Stations[j].ID
		suffix := ""
		if rh, ok := held[id]; ok {
			// Its own RH is kept: the column repeats one value, it was not swept.
			suffix = " " + heldMark(rh)
			heldShown = append(heldShown, id+" "+heldMark(rh))
		}
		headers = append(headers, id+" worst ratio [–]"+suffix, id+" verdict"+suffix)
		widths = append(widths, 11, 12)
	}
	var rows [][]audit.Cell
	for _, st := range sw.Steps {
		row := []audit.Cell{audit.QuantityCell(book.UnitPercentRH, st.RH), in(st.Incendive), in(st.Marginal)}
		for _, j := range wide {
			x := st.Stations[j]
			row = append(row, ratioCell(x.WorstRatio, x.WorstRatioAssumed), vd(x.Verdict.String()))
		}
		rows = append(rows, row)
	}
	n := len(sw.Steps) + 1
	b.Table(SheetSweep, 1, headers, widths, rows)
	sh := quoteSheet(SheetSweep)
	cat := fmt.Sprintf("%s!$A$2:$A$%d", sh, n)
	line := func(col int, colour string) excelize.ChartSeries {
		c, _ := excelize.ColumnNumberToName(col)
		return excelize.ChartSeries{Name: fmt.Sprintf("%s!$%s$1", sh, c), Categories: cat, Values: fmt.Sprintf("%s!$%s$2:$%s$%d", sh, c, c, n),
			Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colour}}, Line: excelize.LineOptions{Width: 2, Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colour}}}, Marker: excelize.ChartMarker{Symbol: "circle", Size: 5, Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colour}}}}
	}
	noteRow := n + 2
	note := func(text string) {
		b.Put(SheetSweep, 1, noteRow, wr(text))
		b.check(b.f.MergeCell(SheetSweep, fmt.Sprintf("A%d", noteRow), fmt.Sprintf("L%d", noteRow)))
		b.check(b.f.SetRowHeight(SheetSweep, noteRow, 30))
		noteRow++
	}
	if len(heldShown) > 0 {
		note(fmt.Sprintf("Not swept: %s. A station that gives its own RH keeps it at every step (--all-stations sweeps it too); its columns show its result at that RH on every row.", strings.Join(heldShown, ", ")))
	}
	if len(wide) < all {
		note(fmt.Sprintf("The columns show the %d worst of %d stations (by rank at %s %% RH); every station at every step is on the %q sheet, and what each does on the Stations sheet.",
			len(wide), all, fmtSig(sw.Steps[0].RH), SheetSweepLong))
	}
	chartRow := n + 3
	if noteRow > n+2 {
		chartRow = noteRow + 1
	}
	anchor := fmt.Sprintf("A%d", chartRow)
	b.check(b.f.AddChart(SheetSweep, anchor, &excelize.Chart{
		Type:      excelize.Line,
		Series:    []excelize.ChartSeries{line(2, "C8102E"), line(3, "B08D00")},
		Dimension: excelize.ChartDimension{Width: 640, Height: 320},
		Legend:    excelize.ChartLegend{Position: "bottom"},
		Title:     chartTitle("Objects incendive and marginal against relative humidity", 11),
		XAxis:     excelize.ChartAxis{Font: excelize.Font{Size: 9, Color: "000000"}, Title: chartTitle("relative humidity [%]", 9)},
		YAxis:     excelize.ChartAxis{MajorGridLines: true, Font: excelize.Font{Size: 9, Color: "000000"}, Title: chartTitle("objects", 9)},
	}))
	// Worst ratio per station: log axis, so only stations with a ratio above 0 somewhere.
	palette := []string{"1F4E79", "C55A11", "548235", "7030A0", "BF9000", "2E75B6", "843C0C", "375623", "404040", "FF0000"}
	var ser []excelize.ChartSeries
	for k, j := range wide {
		pos := false
		for _, step := range sw.Steps {
			if r := step.Stations[j].WorstRatio; r != nil && *r > 0 {
				pos = true
			}
		}
		if pos {
			ser = append(ser, line(4+2*k, palette[len(ser)%len(palette)]))
		}
	}
	if len(ser) > 0 {
		b.check(b.f.AddChart(SheetSweep, fmt.Sprintf("H%d", chartRow), &excelize.Chart{
			Type:         excelize.Line,
			Series:       ser,
			Dimension:    excelize.ChartDimension{Width: 720, Height: 320},
			Legend:       excelize.ChartLegend{Position: "right"},
			Title:        chartTitle("Worst ratio E/MIE per station against relative humidity (log scale; 1 = MIE reached)", 11),
			XAxis:        excelize.ChartAxis{Font: excelize.Font{Size: 9, Color: "000000"}, Title: chartTitle("relative humidity [%]", 9)},
			YAxis:        excelize.ChartAxis{LogBase: 10, MajorGridLines: true, Font: excelize.Font{Size: 9, Color: "000000"}, Title: chartTitle("worst ratio [–]", 9)},
			ShowBlanksAs: "gap",
		}))
	}
	b.PrintSetup(SheetSweep, "$1:$1")

	if len(wide) < all {
		// Every station at every step, one row each: five columns however many stations.
		rows = nil
		for j := range sw.Steps[0].Stations {
			for _, st := range sw.Steps {
				x := st.Stations[j]
				mark := audit.EmptyCell()
				if rh, ok := held[x.ID]; ok {
					mark = tx(heldMark(rh) + ", not swept")
				}
				rows = append(rows, []audit.Cell{tx(x.ID), audit.QuantityCell(book.UnitPercentRH, st.RH), ratioCell(x.WorstRatio, x.WorstRatioAssumed), vd(x.Verdict.String()), mark})
			}
		}
		b.Table(SheetSweepLong, 1, []string{"Station", "Swept RH [%]", "Worst ratio [–]", "Verdict", "Station RH"}, []float64{12, 8, 12, 14, 24}, rows)
		b.PrintSetup(SheetSweepLong, "$1:$1")
	}

	rows = nil
	first, last := sw.Steps[0], sw.Steps[len(sw.Steps)-1]
	for j, c := range sw.Clearances {
		clears := audit.EmptyCell()
		if c.Cause == ClearsAlways || c.Cause == ClearsFrom {
			clears = audit.QuantityCell(book.UnitPercentRH, c.ClearsAt)
		}
		own, swept := audit.EmptyCell(), tx("swept")
		if rh, ok := held[c.ID]; ok {
			own, swept = audit.QuantityCell(book.UnitPercentRH, rh), tx(heldMark(rh)+" (not swept)")
		}
		rows = append(rows, []audit.Cell{tx(c.ID), tx(c.Name), swept, own, vd(first.Stations[j].Verdict.String()), vd(last.Stations[j].Verdict.String()), clears, wr(sweepStationText(first.Stations[j], c.Text))})
	}
	b.Table(SheetStations, 1, []string{"Station", "Name", "Swept or held", "Own RH kept [%]", fmt.Sprintf("Verdict at swept %s %%", fmtSig(first.RH)), fmt.Sprintf("Verdict at swept %s %%", fmtSig(last.RH)), "Non-incendive from RH [%]", "What humidity does"},
		[]float64{10, 28, 22, 10, 14, 14, 14, 60}, rows)
	b.PrintSetup(SheetStations, "$1:$1")
	notes := append(rerunNotes()[2:3], [2]string{"Sweep", sweepMethodText(sw)})
	b.AddMethodSheet(audit.MethodNotes{Title: "How this sweep works (the formulas, limits and defaults below are those of the survey as it is; only the RH is replaced at each step)", Notes: notes})
	b.AddCautionsSheet()
	b.AddRejectedSheet(sw.Survey)
	return b.write(w)
}

// heldMark marks a station kept at its own RH: "held at own RH 20 %".
func heldMark(rh float64) string { return fmt.Sprintf("held at own RH %s %%", fmtSig(rh)) }

// sweepStationText is a station's sweep text, led by its incomplete mark
// (Objects rows naming it rejected: its ranks leave those objects out).
func sweepStationText(x SweepStation, text string) string {
	if t := (assess.StationResult{RejectedRows: x.RejectedRows}).IncompleteText(); t != "" {
		return t + "; its verdicts and ranks leave those objects out. " + text
	}
	return text
}

// sweepMethodText is the Method sheet's note on how the sweep set the RH and
// what its clearances mean.
func sweepMethodText(sw *Sweep) string {
	warn := ""
	if len(sw.Warnings) > 0 {
		warn = "Warning: " + strings.Join(sw.Warnings, " ") + " "
	}
	return warn + "At each step the swept RH is set as the site RH and the survey is assessed again with the same limits. " +
		sweepHeldText(sw, 0) + " " +
		"A station becomes non-incendive at the lowest step from which every higher step is non-incendive. When the highest step is still incendive, marginal or not assessed, the Stations sheet says why: an input missing or assumed the stricter case (an unmeasured resistance to earth, a missing MIE or dimension) is named as the cause, since humidity cannot clear what is not known; a reading above its screen holds at every RH; otherwise humidity alone never gets it there. Steps are only as fine as the range given."
}

// SheetSettings is the compare workbook's sheet of Site and station settings changed.
const SheetSettings = "Settings changed"

// compareNotes are the Method sheet's account of what compare does and does not say.
func compareNotes() [][2]string {
	return [][2]string{
		{"What compare does", "Each survey is read and assessed on its own, with its own Site items, limits and atmospheres, exactly as 'assess' would; the two audits are then matched by object ID and station ID. An object only in NEW is added, only in OLD removed; an object in both is changed when any reading, setting, verdict or ratio differs. A station is listed when its rank moved or its verdict changed (even at the same rank), or when it is on one side only. Site items (RH, air temperature, required margin, limit overrides, Surveyed by, Site ID) and station settings (name, line, RH, atmosphere, substance, zone, MIE, gas or dust group) are compared one by one."},
		{"Units", "Values are shown as numbers in the display units of the survey and the audit (kV/m, kV, mJ, pF, µA, Ω, %...), the unit in its own column; the JSON gives each value in SI as well."},
		{"Same site", "Two surveys are taken as one site when both give a Site ID and the IDs agree, else when their site names agree (case and spaces aside): a screening choice of this tool. On a mismatch the comparison is still made and written, with a warning, stations only on one side counted apart from those whose rank or verdict moved, and compare exits with status 1 so that a script does not read two places as a repeat survey. A Site ID on one side only is noted: the portfolio (assess of several surveys) keeps such surveys apart."},
		{"Identity", "Each side is identified by its survey's SHA-256 checksum; for an audit JSON that is the survey's checksum recorded inside the JSON (the JSON file's own checksum is shown apart), so an audit JSON and the survey it was made from are recognised as the same survey."},
		{"Date order", "OLD should be the earlier survey. When OLD is dated after NEW, or a date is missing, a warning says so: 'added', 'removed', 'before' and 'after' then read backwards or cannot be ordered."},
		{"What compare does not say", "It does not say why a value changed (a new reading, a process change, a typing error), nor that a change is an improvement: a verdict that went from incendive to non-incendive rests on the new survey's readings and inputs, which a competent person should check. A rank is relative to the other stations of the same survey, so a rank can move while nothing changed at the station. When objects were added, removed or rejected at a station, its move is not called better or worse: the Move column says which objects differ (a station that lost an object is not improved by it). When either side is an audit JSON, the sides are compared on results only (no readings, no Site items)."},
		{"Rejected rows", "An Objects row rejected on either side (a typing error, a missing required reading) is not assessed on that side, so it is listed on the Rejected objects sheet, never as added or removed, and its station's rank leaves it out. compare then warns and exits with status 1, as assess does: see that side's audit and its Rejected sheet, or run 'sparkmargin check'."},
		{"Assumed resistance", "A worst ratio or ratio shown as '" + assess.RatioAssumedText + "' is a spark energy set by an assumed input, an unmeasured resistance to earth (taken as no leakage) or charging current (taken as the worst-case current): at least the MIE, its size no figure to read or compare; measure the resistance to earth or the charging current / potential in operation, as the object's reason says."},
		{"Screening", "Both audits are screening estimates: defer to local codes, the site's hazardous-area classification and a competent person (see the Cautions sheet)."},
	}
}

// valueCell is a compared value: a number in its display unit, else its text.
func valueCell(v Value) audit.Cell {
	if v.SI != nil {
		return audit.NumberCell(v.Shown, v.NumFmt)
	}
	return tx(v.Text)
}

// unitOf is the display unit of a change, from whichever side has a number.
func unitOf(a, b Value) string {
	if b.SI != nil {
		return b.Unit
	}
	return a.Unit
}

// WriteCompareWorkbook writes the compare workbook: Summary (both identities,
// the warnings, the counts), Settings changed (Site items and station
// settings), Added, Removed, Changed (one row per changed field, numbers in
// the survey's display units), Stations (rank moved or verdict changed),
// Method (identity, what compare does and does not say, the warnings) and Cautions.
func WriteCompareWorkbook(w io.Writer, c *Comparison, newSurvey *inventory.Survey, info RunInfo) error {
	if c == nil || c.Old == nil || c.New == nil {
		return errors.New("compare workbook: no comparison")
	}
	b := newBook(&assess.Audit{Survey: newSurvey}, info, SheetSummary, "Comparison of two surveys")
	sh := SheetSummary
	b.Put(sh, 1, 1, audit.TitleCell("Compare: "+c.Old.Identity.SiteText()+" → "+c.New.Identity.SiteText()))
	r := identityTable(b, sh, 3, c)
	r++
	for _, k := range c.Cautions {
		b.Put(sh, 1, r, audit.CautionCell("WARNING ("+string(k.Kind)+"): "+k.Text))
		b.check(b.f.MergeCell(sh, fmt.Sprintf("A%d", r), fmt.Sprintf("C%d", r)))
		b.check(b.f.SetRowHeight(sh, r, 45))
		r++
	}
	if len(c.Cautions) > 0 {
		r++
	}
	b.Put(sh, 1, r, audit.SectionCell("What differs"))
	r++
	var rows [][]audit.Cell
	for _, kv := range []struct {
		k string
		n int
	}{{"Site items changed", len(c.SiteChanges)}, {"Station settings changed", len(c.StationChanges)}, {"Objects added", len(c.Added)}, {"Objects removed", len(c.Removed)},
		{"Object rows rejected in OLD (not compared)", len(c.RejectedOld)}, {"Object rows rejected in NEW (not compared)", len(c.RejectedNew)},
		{"Objects changed", len(c.Changed)}, {"Object verdicts changed", countVerdictChanges(c)}, {"Stations on both sides whose rank or verdict moved", c.StationsMoved()},
		{"Stations only in NEW", c.StationsAdded()}, {"Stations only in OLD", c.StationsRemoved()}} {
		rows = append(rows, []audit.Cell{tx(kv.k), in(kv.n)})
	}
	r = b.Table(sh, r, []string{"What", "Count"}, []float64{30, 44, 44}, rows) + 1
	b.Put(sh, 1, r, audit.CautionCell("Screening estimates only: defer to local codes, the site's hazardous-area classification and a competent person (see the Cautions sheet)."))
	b.check(b.f.MergeCell(sh, fmt.Sprintf("A%d", r), fmt.Sprintf("C%d", r)))
	b.check(b.f.SetRowHeight(sh, r, 30))
	b.PrintSetup(sh, "")

	rows = nil
	for _, ch := range append(append([]FieldChange(nil), c.SiteChanges...), c.StationChanges...) {
		where := "Site"
		if ch.Station != "" {
			where = ch.Station
		}
		rows = append(rows, []audit.Cell{tx(where), tx(ch.Field), valueCell(ch.Before), valueCell(ch.After), ct(unitOf(ch.Before, ch.After))})
	}
	switch {
	case len(rows) == 0 && len(c.NotCompared) > 0:
		rows = append(rows, []audit.Cell{tx("none"), tx("no compared setting changed")})
	case len(rows) == 0:
		rows = append(rows, []audit.Cell{tx("none"), tx("no Site item or station setting changed")})
	}
	if t := c.NotComparedText(); t != "" {
		rows = append(rows, []audit.Cell{tx("note"), wr(t)})
	}
	b.Table(SheetSettings, 1, []string{"Where", "Setting", "Old value", "New value", "Unit"}, []float64{12, 26, 16, 16, 8}, rows)
	b.PrintSetup(SheetSettings, "$1:$1")

	one := func(sheet string, ids []string, side *Side) {
		byID := map[string]SideObject{}
		for _, o := range side.Objects {
			byID[o.ID] = o
		}
		var rows [][]audit.Cell
		for _, id := range ids {
			o := byID[id]
			rows = append(rows, []audit.Cell{tx(id), tx(o.Station), vd(o.Verdict), ratioCell(o.Ratio, o.RatioAssumed)})
		}
		if len(rows) == 0 {
			rows = append(rows, []audit.Cell{tx("none")})
		}
		b.Table(sheet, 1, []string{"ID", "Station", "Verdict", "Ratio E/MIE [–]"}, []float64{14, 12, 14, 12}, rows)
		b.PrintSetup(sheet, "$1:$1")
	}
	one(SheetAdded, c.Added, c.New)
	one(SheetRemoved, c.Removed, c.Old)

	rows = nil
	for _, g := range []struct {
		side string
		rs   []RejectedObject
	}{{"OLD", c.RejectedOld}, {"NEW", c.RejectedNew}} {
		for _, x := range g.rs {
			rows = append(rows, []audit.Cell{tx(g.side), tx(x.ID), tx(x.Station), in(x.Row), wr(x.Why), wr("rejected in " + g.side + ": see its audit / Rejected sheet; not compared, neither added nor removed")})
		}
	}
	if len(rows) == 0 {
		rows = append(rows, []audit.Cell{tx("none"), tx("no Objects row was rejected on either side")})
	}
	b.Table(SheetRejectedObjects, 1, []string{"Side", "ID", "Station", "Row", "Why rejected", "Note"}, []float64{8, 14, 12, 6, 50, 40}, rows)
	b.PrintSetup(SheetRejectedObjects, "$1:$1")

	rows = nil
	for _, ch := range c.Changed {
		for i, f := range ch.Fields {
			rows = append(rows, []audit.Cell{tx(ch.ID), tx(ch.Station), tx(f), valueCell(ch.Before[i]), valueCell(ch.After[i]), ct(unitOf(ch.Before[i], ch.After[i])), vd(ch.VerdictBefore), vd(ch.VerdictAfter)})
		}
	}
	if len(rows) == 0 {
		rows = append(rows, []audit.Cell{tx("none")})
	}
	b.Table(SheetChanged, 1, []string{"ID", "Station", "Field", "Old value", "New value", "Unit", "Verdict old", "Verdict new"}, []float64{14, 12, 20, 14, 14, 8, 14, 14}, rows)
	b.PrintSetup(SheetChanged, "$1:$1")

	rows = nil
	for _, m := range c.Stations {
		// The ratios sit between the ranks and the verdicts: a right-aligned
		// number beside the Move text ran into it ("8.70 down 1").
		row := []audit.Cell{tx(m.ID), tx(m.Name), audit.EmptyCell(), audit.EmptyCell(),
			ratioCell(m.WorstRatioBefore, m.WorstRatioAssumedBefore), ratioCell(m.WorstRatioAfter, m.WorstRatioAssumedAfter),
			vd(m.VerdictBefore), vd(m.VerdictAfter), wr(m.Move())}
		if m.RankBefore > 0 {
			row[2] = in(m.RankBefore)
		}
		if m.RankAfter > 0 {
			row[3] = in(m.RankAfter)
		}
		rows = append(rows, row)
	}
	if len(rows) == 0 {
		rows = append(rows, []audit.Cell{tx("none"), tx("no station's rank or verdict moved")})
	}
	b.Table(SheetStations, 1, []string{"Station", "Name", "Rank old", "Rank new", "Worst ratio old [–]", "Worst ratio new [–]", "Verdict old", "Verdict new", "Move"}, []float64{10, 28, 9, 9, 17, 17, 15, 15, 56}, rows)
	b.PrintSetup(SheetStations, "$1:$1")

	// Method: both identities, the warnings, what compare does and does not say.
	m := SheetMethod
	b.Put(m, 1, 1, audit.TitleCell("How this comparison was made"))
	r = identityTable(b, m, 3, c)
	for _, kv := range [][2]string{{"Tool", strings.TrimSpace("sparkmargin " + info.ToolVersion)}, {"Command line", info.CommandLine}} {
		if kv[1] != "" {
			b.Put(m, 1, r, tx(kv[0]))
			b.Put(m, 2, r, wr(kv[1]))
			r++
		}
	}
	r++
	b.Put(m, 1, r, audit.SectionCell("Warnings of this comparison"))
	r++
	var notes [][2]string
	for _, k := range c.Cautions {
		notes = append(notes, [2]string{string(k.Kind), k.Text})
	}
	if len(notes) == 0 {
		notes = append(notes, [2]string{"none", "Same site, OLD dated before NEW, two different files."})
	}
	r = methodNotes(b, m, r, []string{"Warning", "What it means"}, notes) + 1
	b.Put(m, 1, r, audit.SectionCell("What compare does and does not say"))
	r++
	methodNotes(b, m, r, []string{"Topic", "Note"}, compareNotes())
	b.PrintSetup(m, "")
	b.AddCautionsSheet()
	return b.write(w)
}

// methodNotes writes a two-column table of notes at row r of the compare
// Method sheet, whose columns are the identity table's (30 | 44 | 44): each
// note spans columns B and C, wrapped, its row as tall as its lines (no cap:
// the note is read in print). It returns the row after the table.
func methodNotes(b *rerunBook, sh string, r int, headers []string, rows [][2]string) int {
	r = b.Table(sh, r, headers, []float64{30, 44, 44}, nil)
	const noteWidth = 44 + 44
	for _, row := range rows {
		b.Put(sh, 1, r, wr(row[0]))
		b.Put(sh, 2, r, wr(row[1]))
		b.check(b.f.MergeCell(sh, fmt.Sprintf("B%d", r), fmt.Sprintf("C%d", r)))
		if h := notesHeight(row[1], noteWidth); h > 0 {
			b.check(b.f.SetRowHeight(sh, r, h))
		}
		r++
	}
	return r
}

// notesHeight is the height in points of a wrapped note of width characters,
// at most a sheet row's maximum (409 points); 0 for one line.
func notesHeight(s string, width float64) float64 {
	n := book.WrappedLines(s, width)
	if n <= 1 {
		return 0
	}
	return min(book.LineHeight*float64(n)+2, 409)
}

// ratioCell is a ratio cell, the assumed-resistance text instead of the
// number when the ratio rests on an assumed resistance to earth.
func ratioCell(r *float64, assumed bool) audit.Cell {
	if assumed {
		return ct(assess.RatioAssumedText)
	}
	return audit.RatioCell(r)
}

// identityTable writes both sides' identity at row r of sheet sh (Item | Old |
// New) and returns the row after it.
func identityTable(b *rerunBook, sh string, r int, c *Comparison) int {
	o, n := c.Old.Identity, c.New.Identity
	kind := func(id Identity) string {
		if id.Results {
			return "audit JSON (results only)"
		}
		return "survey workbook"
	}
	var rows [][]audit.Cell
	for _, kv := range [][3]string{
		{"File", o.Path, n.Path},
		{"Kind", kind(o), kind(n)},
		{"Site", o.SiteText(), n.SiteText()},
		{"Site ID", o.SiteID, n.SiteID},
		{"Survey date", o.DateText(), n.DateText()},
		{"SHA-256 of the survey", o.SHA256, n.SHA256},
		{"SHA-256 of the audit JSON file", o.FileSHA256, n.FileSHA256},
	} {
		if kv[0] == "SHA-256 of the audit JSON file" && kv[1] == "" && kv[2] == "" {
			continue
		}
		rows = append(rows, []audit.Cell{tx(kv[0]), wr(kv[1]), wr(kv[2])})
	}
	return b.Table(sh, r, []string{"Identity", "Old", "New"}, []float64{30, 44, 44}, rows)
}

func countVerdictChanges(c *Comparison) int {
	n := 0
	for _, ch := range c.Changed {
		if ch.VerdictChanged() {
			n++
		}
	}
	return n
}
