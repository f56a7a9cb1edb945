package audit

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
	"github.com/xuri/excelize/v2"
)

// The Report sheet: the audit condensed to what a reviewer reads, signs and
// hands on, set to print in portrait on a few pages. It is the workbook's first
// sheet, so that it is what opens and prints by default; the detail (Objects,
// the full Findings with their basis, Method) stays on the other sheets, each
// with its own print setup.
//
// Findings are grouped by station, check and severity: one row per group
// with its objects worst first, the worst finding's words, the mitigation once
// and each object's action under its name, so that a thousand-object survey with a
// recurring fault reads as one line per fault and station.

// SheetReport is the condensed, printable sheet.
const SheetReport = "Report"

// reportWidths are the Report's columns: # or rank, station and objects,
// verdict, finding (or name), mitigation (or reason), action (or ratio).
func reportWidths() []float64 { return []float64{6, 14, 13, 36, 34, 18} }

// reportFinding is a group of findings of one station, check and severity.
type reportFinding struct {
	station, check string
	severity       assess.Verdict
	objects        []string // worst first
	message        string   // the worst finding's
	mitigations    []string // each different one, in order
	actions        []string // per object: "OBJ: owner · due · status"
}

// groupFindings groups the audit's findings for the Report, most severe first,
// then by station rank, then in the order of the Findings sheet. Within a
// group the objects are listed worst first (highest ratio of energy to MIE;
// no ratio counts as least) and the group's words are the worst finding's, so
// that the object that sets the station's rank leads its row. Actions are
// listed per object ("OBJ: owner · due · status"), never one object's action
// for the whole group.
// ratio gives the objects' ratios (objectRatios); an object without one counts
// as least.
func groupFindings(a *assess.Audit, pl *ActionPlan, ratio map[string]float64) []*reportFinding {
	rank := map[string]int{}
	for i := range a.Stations {
		rank[a.Stations[i].Station.ID] = a.Stations[i].Rank
	}
	worth := func(id string) float64 {
		if r, ok := ratio[id]; ok && !math.IsNaN(r) {
			return r
		}
		return -1
	}
	type member struct {
		object, message, action string
	}
	var out []*reportFinding
	members := map[*reportFinding][]member{}
	idx := map[string]*reportFinding{}
	for i := range a.Findings {
		f := &a.Findings[i]
		k := f.StationID + "\x00" + f.Check + "\x00" + f.Severity.String()
		g := idx[k]
		if g == nil {
			g = &reportFinding{station: f.StationID, check: f.Check, severity: f.Severity}
			idx[k] = g
			out = append(out, g)
		}
		if f.Mitigation != "" && !contains(g.mitigations, f.Mitigation) {
			g.mitigations = append(g.mitigations, f.Mitigation)
		}
		members[g] = append(members[g], member{f.ObjectID, f.Message, actionText(pl.open(i))})
	}
	for _, g := range out {
		ms := members[g]
		sort.SliceStable(ms, func(i, j int) bool { return worth(ms[i].object) > worth(ms[j].object) })
		g.message = ms[0].message
		for _, m := range ms {
			if m.object != "" {
				g.objects = append(g.objects, m.object)
			}
			if m.action == "" {
				continue
			}
			t := m.action
			if m.object != "" {
				t = m.object + ": " + t
			}
			if !contains(g.actions, t) {
				g.actions = append(g.actions, t)
			}
		}
	}
	sort.SliceStable(out, func(i, j int) bool {
		si, sj := out[i].severity.Severity(), out[j].severity.Severity()
		if si != sj {
			return si > sj
		}
		return stationOrder(rank, out[i].station) < stationOrder(rank, out[j].station)
	})
	return out
}

// objectRatios is the ratio of energy to MIE of each object with a finding
// and a ratio (an assumed ratio counts as 1, its size being no figure).
func objectRatios(rs []assess.ObjectResult, into map[string]float64) map[string]float64 {
	if into == nil {
		into = map[string]float64{}
	}
	for i := range rs {
		r := &rs[i]
		if r.Ratio == nil || len(r.Findings) == 0 {
			continue
		}
		v := *r.Ratio
		if r.RatioAssumed() {
			v = 1
		}
		into[r.Object.ID] = v
	}
	return into
}

func stationOrder(rank map[string]int, id string) int {
	if r, ok := rank[id]; ok {
		return r
	}
	return 1 << 30
}

func contains(xs []string, s string) bool {
	for _, x := range xs {
		if x == s {
			return true
		}
	}
	return false
}

// actionText is an action in one line: owner, due, status, comment.
func actionText(a Action) string {
	due := a.Due
	if a.DueSerial > 0 {
		if t, err := excelize.ExcelDateToTime(a.DueSerial, false); err == nil {
			due = t.Format("2006-01-02")
		}
	}
	var parts []string
	for _, p := range []string{a.Owner, due, a.Status, a.Comment} {
		if p != "" {
			parts = append(parts, p)
		}
	}
	return strings.Join(parts, " · ")
}

// objectsText lists a group's objects, at most eight by name.
func objectsText(ids []string) string {
	const most = 8
	if len(ids) <= most {
		return strings.Join(ids, ", ")
	}
	return strings.Join(ids[:most], ", ") + fmt.Sprintf(" and %d more", len(ids)-most)
}

// reportHumidityText is the survey's relative humidity as the Report's survey
// block gives it: the site's (or, none given, the dry-day value the
// assessment took, said so) and how many stations carry their own.
func reportHumidityText(a *assess.Audit) string {
	site := a.Survey.Site
	t := ""
	if site.RelativeHumidity.Known {
		t = book.FormatSigTrim(site.RelativeHumidity.Value, 3) + " % at the site (entered)"
	} else {
		t = fmt.Sprintf("not given on the Site sheet: %s %% taken (dry day, the stricter case)", book.FormatSigTrim(assess.DryDayHumidity, 3))
	}
	own := 0
	for _, st := range a.Survey.Stations {
		if st.RelativeHumidity.Known {
			own++
		}
	}
	if own > 0 {
		t += fmt.Sprintf("; %d station(s) with their own (Stations sheet, RH used)", own)
	}
	return t
}

// reportReason is the reason a station's verdict reads as it does: the
// station's main reason (the one the Stations sheet shows), else the words of
// the first finding at the station whose severity is the verdict, else a
// plain statement of the verdict.
func reportReason(a *assess.Audit, st *assess.StationResult) string {
	if st.Main.ObjectID != "" {
		return st.Main.ObjectID + ": " + st.Main.Text
	}
	for i := range a.Findings {
		f := &a.Findings[i]
		if f.StationID == st.Station.ID && f.Severity == st.Verdict {
			return f.Message
		}
	}
	switch st.Verdict {
	case assess.NonIncendive:
		return "every object assessed stays below the limits with the required margin"
	case assess.NotAssessed:
		return "no object could be judged: inputs missing (see the Objects sheet)"
	}
	return ""
}

// report writes the Report sheet.
func (wb *workbook) report() error {
	f, s, a := wb.f, SheetReport, wb.a
	widths := reportWidths()
	if err := book.SetWidths(f, s, widths); err != nil {
		return err
	}
	ncol := len(widths)
	lastCol := book.LastCol(ncol)
	sink := book.NormalSink{F: f, Sheet: s, St: wb.st}
	r := 1
	span := func(row int, v string, style int, height float64) error {
		from, to := fmt.Sprintf("A%d", row), fmt.Sprintf("%s%d", lastCol, row)
		if err := f.MergeCell(s, from, to); err != nil {
			return err
		}
		if err := f.SetCellValue(s, from, v); err != nil {
			return err
		}
		if err := f.SetCellStyle(s, from, to, style); err != nil {
			return err
		}
		if height > 0 {
			return f.SetRowHeight(s, row, height)
		}
		return nil
	}
	section := func(title string) error {
		ref := fmt.Sprintf("A%d", r)
		if err := f.SetCellValue(s, ref, title); err != nil {
			return err
		}
		if err := f.SetCellStyle(s, ref, fmt.Sprintf("%s%d", lastCol, r), wb.st.Section()); err != nil {
			return err
		}
		if err := f.SetRowHeight(s, r, 22); err != nil {
			return err
		}
		r++
		return nil
	}
	total := sum(widths)
	if err := span(r, "Electrostatic ignition screening report: "+siteName(a), wb.st.Title(), 24); err != nil {
		return err
	}
	r++
	if err := span(r, templates.CautionLine, wb.st.Caution(), rowCap(wrappedHeight(templates.CautionLine, total)+4)); err != nil {
		return err
	}
	r += 2

	// Identity, counts and what was left out.
	if err := section("Survey"); err != nil {
		return err
	}
	site := a.Survey.Site
	counts := make([]string, 0, 4)
	for _, v := range verdictOrder() {
		counts = append(counts, fmt.Sprintf("%d %s", a.Counts[v], v))
	}
	// A Changes row with a problem is a note, not a rejected row
	// (inventory.SheetCount.NotUsedByAssess).
	_, _, rejected, _ := a.Survey.RowCounts()
	ident := [][2]string{
		{"Site", siteName(a)},
		{"Site ID", site.ID},
		{"Survey date", dateText(a)},
		{"Surveyed by", site.SurveyedBy},
		{"Scope", site.SignOff.Scope},
		{"Revision", site.SignOff.Revision},
		{"Relative humidity", reportHumidityText(a)},
		{"Objects by verdict", strings.Join(counts, ", ")},
		{"Findings", fmt.Sprintf("%d, grouped below by station and check (each one, with its basis, on the Findings sheet)", len(a.Findings))},
		{"Rows rejected", fmt.Sprintf("%d (see the Rejected sheet: a rejected object is a hazard this audit does not cover)", rejected)},
		{"Survey file", wb.info.file(a) + "  SHA-256 " + wb.info.sha(a)},
		{"Tool", wb.info.tool() + " " + wb.info.ToolVersion + " (method, formulas and sources on the Method sheet)"},
	}
	for _, kv := range ident {
		if kv[1] == "" {
			continue
		}
		lab, val := fmt.Sprintf("A%d", r), fmt.Sprintf("C%d", r)
		if err := f.MergeCell(s, lab, fmt.Sprintf("B%d", r)); err != nil {
			return err
		}
		if err := f.MergeCell(s, val, fmt.Sprintf("%s%d", lastCol, r)); err != nil {
			return err
		}
		if err := sink.Row(r, []book.Cell{book.BoldText(kv[0]), {}, book.WrapText(kv[1])}, 0); err != nil {
			return err
		}
		if err := f.SetRowHeight(s, r, rowCap(wrappedHeight(kv[1], total-widths[0]-widths[1]))); err != nil {
			return err
		}
		r++
	}
	r++

	// Stations, worst first, with the reason for each verdict.
	if err := section("Stations, worst first"); err != nil {
		return err
	}
	if err := sink.Header(r, []string{"Rank", "Station", "Verdict", "Name and atmosphere", "Main reason", book.UnitRatio.Header("Worst E/MIE")}); err != nil {
		return err
	}
	if err := f.SetRowHeight(s, r, 30); err != nil {
		return err
	}
	r++
	for i := range a.Stations {
		st := &a.Stations[i]
		name := st.Station.Name
		if st.Atmosphere != nil {
			name += "\n" + atmosphereText(st.Atmosphere)
		} else {
			name += "\nno flammable atmosphere"
		}
		if t := st.IncompleteText(); t != "" {
			name += "\n" + t
		}
		cells := []book.Cell{book.Integer(st.Rank), book.Cell{V: st.Station.ID, Bold: true, Wrap: true}, verdictCell(st.Verdict),
			book.WrapText(name), book.WrapText(reportReason(a, st)), stationRatioCell(st)}
		if err := sink.Row(r, cells, reportHeight(cells)); err != nil {
			return err
		}
		r++
	}
	r++

	// Findings, grouped, with mitigations and the site's actions.
	if err := section("Findings and actions"); err != nil {
		return err
	}
	if err := sink.Header(r, []string{"#", "Station: objects", "Severity", "Finding (worst of the group)", "Mitigation", "Action (owner · due · status)"}); err != nil {
		return err
	}
	if err := f.SetRowHeight(s, r, 30); err != nil {
		return err
	}
	r++
	ratios := wb.findingRatios
	if ratios == nil {
		ratios = objectRatios(a.Objects, nil)
	}
	groups := groupFindings(a, wb.actions, ratios)
	for i, g := range groups {
		where := g.station
		if len(g.objects) > 0 {
			where += ": " + objectsText(g.objects)
		}
		msg := g.message
		if n := len(g.objects); n > 1 {
			msg += fmt.Sprintf(" (worst of %d objects)", n)
		}
		cells := []book.Cell{book.Integer(i + 1), book.WrapText(where), verdictCell(g.severity),
			book.WrapText(msg), book.WrapText(strings.Join(g.mitigations, "\n")), book.WrapText(strings.Join(g.actions, "\n"))}
		if err := sink.Row(r, cells, reportHeight(cells)); err != nil {
			return err
		}
		r++
	}
	if len(groups) == 0 {
		if err := sink.Row(r, []book.Cell{{}, book.Text("none")}, 0); err != nil {
			return err
		}
		r++
	}
	if pl := wb.actions; pl != nil && len(pl.ClosedSince) > 0 {
		t := fmt.Sprintf("%d finding(s) of the previous audit closed since (%d with an action): listed at the foot of the Findings sheet; check that each closed because the hazard was removed.",
			len(pl.ClosedSince), pl.Counts.ClosedActions)
		if err := span(r, t, wb.st.Of(book.WrapText("")), rowCap(wrappedHeight(t, total))); err != nil {
			return err
		}
		r++
	}
	r++

	// Cautions in full, then the sign-off.
	if err := section("Cautions"); err != nil {
		return err
	}
	for i, c := range templates.Cautions() {
		t := fmt.Sprintf("%d. %s", i+1, c)
		if err := span(r, t, wb.st.Of(book.WrapText("")), rowCap(wrappedHeight(t, total))); err != nil {
			return err
		}
		r++
	}
	r++
	last, err := wb.signoff(s, r, signoffSpans{{1, 2}, {3, 4}, {5, 5}, {6, 6}})
	if err != nil {
		return err
	}
	return wb.reportPrintSetup(last - 1)
}

// reportHeight is the height of a Report row: every line of its wrapped
// cells, without the cap of the table sheets (book.MaxLines), since the
// Report is read on paper where a cut text is lost.
func reportHeight(cells []book.Cell) float64 {
	w := reportWidths()
	lines := 1
	for i, c := range cells {
		t, ok := c.V.(string)
		if !ok || !c.Wrap || i >= len(w) {
			continue
		}
		lines = max(lines, book.WrappedLines(t, w[i]*0.95))
	}
	if lines == 1 {
		return 0
	}
	return rowCap(book.LineHeight*float64(lines) + 4)
}

// maxRowHeight is the tallest row a spreadsheet takes, in points.
const maxRowHeight = 409

// rowCap keeps a row height within what a spreadsheet takes (a longer text
// is still all in its cell).
func rowCap(h float64) float64 { return min(h, maxRowHeight) }

// reportPrintSetup prints the Report in portrait A4, one page wide, with the
// title row repeated and the print area over the whole report.
func (wb *workbook) reportPrintSetup(lastRow int) error {
	s := SheetReport
	if err := wb.printSetup(s, 1, "", ""); err != nil {
		return err
	}
	portrait := "portrait"
	if err := wb.f.SetPageLayout(s, &excelize.PageLayoutOptions{Orientation: &portrait}); err != nil {
		return err
	}
	q := "'" + s + "'"
	if err := wb.f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Titles", RefersTo: q + "!$1:$1", Scope: s}); err != nil {
		return err
	}
	return wb.f.SetDefinedName(&excelize.DefinedName{
		Name: "_xlnm.Print_Area", RefersTo: fmt.Sprintf("%s!$A$1:$%s$%d", q, book.LastCol(len(reportWidths())), lastRow), Scope: s,
	})
}
