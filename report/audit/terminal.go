package audit

import (
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
)

// SummaryOptions trims the terminal summary; the zero value prints it whole.
// Whatever the options, the objects-by-verdict line, the warnings and the
// cautions line are always printed (the cautions line is a safety rule).
type SummaryOptions struct {
	// Top > 0 prints only the Top worst-ranked stations, then a line saying
	// how many more the workbook's Stations sheet holds.
	Top int
	// Quiet prints no station table and no blank line before the counts; the
	// counts lines (objects, Monte Carlo and borderline counts when sampled)
	// and the survey-rows line are always printed.
	// Top and Quiet do not go together (assess refuses both).
	Quiet bool
}

// WriteSummary writes the short plain-text summary of an audit for the
// terminal: the ranked stations (rank, station, verdict, worst ratio, counts),
// the objects by verdict, the survey rows accepted and rejected, and the
// cautions line. Columns are aligned with text/tabwriter; no colours.
func WriteSummary(w io.Writer, a *assess.Audit) error {
	return WriteSummaryWith(w, a, SummaryOptions{})
}

// WriteSummaryWith is WriteSummary trimmed by opt.
func WriteSummaryWith(w io.Writer, a *assess.Audit, opt SummaryOptions) error {
	if a == nil {
		return fmt.Errorf("write summary: no audit")
	}
	if !opt.Quiet {
		if err := writeStationTable(w, a, opt.Top); err != nil {
			return err
		}
	}
	return writeSummaryTail(w, a, opt.Quiet)
}

// writeStationTable writes the ranked stations, the top ones only when top > 0
// (a.Stations is in rank order, worst first), and a line counting the rest.
func writeStationTable(w io.Writer, a *assess.Audit, top int) error {
	stations := a.Stations
	more := 0
	if top > 0 && top < len(stations) {
		stations, more = stations[:top], len(stations)-top
	}
	sampled := a.Options.Samples > 0
	// Five short columns, then each station's main reason on a line of its
	// own under the station, and its notes (incomplete, ranked on an
	// assumption) as numbered notes under the table: the table fits a
	// 100-column terminal.
	header := []string{"Rank", "Station", "Verdict", "Worst E/MIE"}
	if sampled {
		header = append(header, "P(any incendive)")
	}
	header = append(header, "Objects (incendive/marginal/non-incendive/not assessed)")
	rows := [][]string{header}
	var reasons, notes []string
	for i := range stations {
		s := &stations[i]
		name := s.Station.ID
		if s.Station.Name != "" {
			name = shorten(name+" "+s.Station.Name, stationRunes)
		}
		ratio := stationRatioText(s) // never a 0 beside a verdict: "no atmosphere", "no discharge", "n/a"
		if ratio == "" {
			ratio = book.FormatRatio(book.FinitePtr(s.WorstRatio))
		}
		if n := s.Notes(); len(n) > 0 {
			notes = append(notes, fmt.Sprintf("[%d] %s: %s", len(notes)+1, s.Station.ID, strings.Join(n, "; ")))
			ratio += fmt.Sprintf(" [%d]", len(notes))
		}
		row := []string{fmt.Sprint(s.Rank), name, s.Verdict.String(), ratio}
		if sampled {
			p := "–"
			if s.ProbabilityAnyIncendive != nil {
				p = fmt.Sprintf("%.3f", *s.ProbabilityAnyIncendive)
			}
			row = append(row, p)
		}
		row = append(row, fmt.Sprintf("%d (%d/%d/%d/%d)", len(s.Objects), s.Counts[assess.Incendive], s.Counts[assess.Marginal], s.Counts[assess.NonIncendive], s.Counts[assess.NotAssessed]))
		rows = append(rows, row)
		reasons = append(reasons, shorten(s.Main.String(), mainReasonRunes))
	}
	width := make([]int, len(header))
	for _, r := range rows {
		for c, v := range r {
			width[c] = max(width[c], utf8.RuneCountInString(v))
		}
	}
	for k, r := range rows {
		var b strings.Builder
		for c, v := range r {
			b.WriteString(v)
			if c < len(r)-1 {
				b.WriteString(strings.Repeat(" ", width[c]-utf8.RuneCountInString(v)+2))
			}
		}
		if _, err := fmt.Fprintln(w, b.String()); err != nil {
			return fmt.Errorf("write summary: %w", err)
		}
		if k > 0 && reasons[k-1] != "" {
			fmt.Fprintln(w, strings.Repeat(" ", width[0]+2)+reasons[k-1])
		}
	}
	if len(notes) > 0 {
		fmt.Fprintln(w, "Notes:")
		for _, n := range notes {
			fmt.Fprintln(w, "  "+n)
		}
	}
	if more > 0 {
		fmt.Fprintf(w, "... %d more station(s) in the audit workbook's %s sheet\n", more, SheetStations)
	}
	return nil
}

// mainReasonRunes is how much of a station's main reason the terminal shows
// under the station (the whole text is on the Stations sheet); stationRunes
// how much of its ID and name.
const (
	mainReasonRunes = 92
	stationRunes    = 32
)

// shorten cuts s to at most n runes, ending in "…" when cut.
func shorten(s string, n int) string {
	rs := []rune(s)
	if len(rs) <= n {
		return s
	}
	return string(rs[:n-1]) + "…"
}

// writeSummaryTail writes the counts, warnings, survey rows and cautions lines.
func writeSummaryTail(w io.Writer, a *assess.Audit, quiet bool) error {
	sampled := a.Options.Samples > 0
	var parts []string
	total := 0
	for _, v := range verdictOrder() {
		parts = append(parts, fmt.Sprintf("%d %s", a.Counts[v], v))
		total += a.Counts[v]
	}
	if !quiet {
		fmt.Fprintln(w) // a blank line after the station table
	}
	fmt.Fprintf(w, "Objects: %d (%s); findings: %d\n", total, strings.Join(parts, ", "), len(a.Findings))
	if len(a.Findings) > maxRejectedRows {
		fmt.Fprintf(w, "Findings sheet: the first %d of %d findings (a sheet holds %d rows); the audit JSON (--json) lists every finding\n", maxRejectedRows, len(a.Findings), book.MaxSheetRows)
	}
	if a.Survey != nil && !a.Survey.Site.RelativeHumidity.Known {
		fmt.Fprintf(w, "Warning: the Site sheet gives no relative humidity (an error for check): stations without their own were assessed at the dry-day %g %%RH, shown on the Summary sheet\n", assess.DryDayHumidity)
	}
	if sampled { // counts lines: kept under --quiet
		fmt.Fprintf(w, "Monte Carlo: %d samples per object, seed %d (uncertainties on the Method sheet)\n", a.Options.Samples, a.Options.Seed)
		if n := len(a.Borderline); n > 0 {
			fmt.Fprintf(w, "Borderline: %d object(s) whose sampled verdicts differ from the point verdict or reach a more severe one above %.0f %%: what to measure next on the Summary sheet\n", n, 100*assess.BorderlineThreshold)
		}
	}
	if a.Survey != nil {
		read, acc, rej, notUsed := a.Survey.RowCounts()
		var where []string
		for _, c := range a.Survey.Counts {
			if c.Rejected > 0 && !c.NotUsedByAssess() {
				where = append(where, fmt.Sprintf("%s %d", c.Sheet, c.Rejected))
			}
		}
		line := fmt.Sprintf("Survey rows: %d read, %d accepted, %d rejected", read, acc, rej)
		if len(where) > 0 {
			line += " (" + strings.Join(where, ", ") + ")"
		}
		if n := len(a.Survey.Warnings()); n > 0 {
			line += fmt.Sprintf("; %d warning(s)", n)
		}
		if notUsed > 0 {
			line += fmt.Sprintf("; %s: %d row(s) with a problem, listed as notes", ChangesNotUsed, notUsed)
		}
		if rej > 0 || notUsed > 0 || len(a.Survey.Warnings()) > 0 {
			line += " (see the Rejected sheet)"
		}
		fmt.Fprintln(w, line)
		if problemBound(a.Survey) > maxRejectedRows {
			if total, listed := ProblemsListed(a.Survey); total > listed {
				fmt.Fprintf(w, "Rejected sheet: the first %d of %d problems (a sheet holds %d rows); the audit JSON (--json) and 'sparkmargin check' list every problem\n", listed, total, book.MaxSheetRows)
			}
		}
	}
	_, err := fmt.Fprintf(w, "\n%s\n", templates.CautionLine)
	if err != nil {
		return fmt.Errorf("write summary: %w", err)
	}
	return nil
}
