package rerun

import (
	"fmt"
	"io"
	"slices"
	"strings"
	"text/tabwriter"
	"unicode/utf8"

	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/audit"
	"github.com/sparkmargin/sparkmargin/templates"
)

// MeasuredReadingsNote says how a rerun treats the survey's readings: a change
// of humidity (or any change that is not of a reading) moves the model's
// defaults, never a reading on a row (principle 1: a measurement beats a default).
const MeasuredReadingsNote = "Measured readings stay as measured: a humidity or earthing change moves what the model assumed, not a field, potential or current read on a row, so a surface whose reading is above its screen keeps that hazard until the reading itself is changed (take a new reading at the new conditions)."

func caution(w io.Writer) {
	fmt.Fprintf(w, "\n%s\n", templates.CautionLine)
}

// WriteWhatifSummary writes the compact terminal table of a whatif: the changes,
// the stations before and after, the objects whose verdict or ratio moved, and
// the counts cleared, stayed and appeared.
func WriteWhatifSummary(w io.Writer, x *Whatif) error {
	fmt.Fprintln(w, "Changes applied:")
	for i, a := range x.Applied {
		fmt.Fprintf(w, "  %d. %s (%s): %s\n", i+1, a.Text(), a.Source, a.Description)
	}
	if len(x.Overridden) > 0 {
		fmt.Fprintln(w, "Overridden, not applied:")
		for _, c := range x.Overridden {
			fmt.Fprint(w, wrapText("  - ", OverriddenText(c), terminalWidth, "    "))
		}
	}
	fmt.Fprintln(w)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	noted := false // a Note column only when a station is incomplete or ranked on an assumed resistance
	for _, s := range x.Stations {
		noted = noted || len(s.After.Notes()) > 0 || (s.Before != nil && len(s.Before.Notes()) > 0)
	}
	hdr := "Station\tRank before\tVerdict before\tWorst ratio before\tRank after\tVerdict after\tWorst ratio after\tOutcome"
	if noted {
		hdr += "\tNote"
	}
	fmt.Fprintln(tw, hdr)
	for _, s := range x.Stations {
		b := [3]string{"–", "–", "–"}
		if s.Before != nil {
			b = [3]string{fmt.Sprint(s.Before.Rank), s.Before.Verdict.String(), StationRatioText(s.Before)}
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%d\t%s\t%s\t%s", s.ID, b[0], b[1], b[2], s.After.Rank, s.After.Verdict, StationRatioText(s.After), s.Outcome)
		if noted {
			fmt.Fprint(tw, "\t"+strings.Join(StationNotes(s.Before, s.After), "; "))
		}
		fmt.Fprintln(tw)
	}
	tw.Flush()
	fmt.Fprintln(w)
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Object\tStation\tBefore\tRatio\tAfter\tRatio\tOutcome")
	moved := 0
	for _, o := range x.Objects {
		if o.After == nil || (o.Before.Verdict == o.After.Verdict && ratioEq(o.Before.Ratio, o.After.Ratio)) {
			continue
		}
		moved++
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\n", o.ID, o.Station, o.Before.Verdict, ObjectRatioText(o.Before), o.After.Verdict, ObjectRatioText(o.After), o.Outcome)
	}
	if moved == 0 {
		fmt.Fprintln(tw, "(no object's verdict or ratio moved)")
	}
	tw.Flush()
	var worse []string
	for _, o := range x.Objects {
		if o.Worse != "" {
			worse = append(worse, o.Worse)
		}
	}
	if len(worse) > 0 {
		fmt.Fprintln(w, "\nWhy worse:")
		for _, t := range worse {
			fmt.Fprint(w, wrapText("  ", t, terminalWidth, "    "))
		}
	}
	var held []string
	for _, o := range x.Objects {
		if o.Held != "" {
			held = append(held, o.ID+": "+o.Held)
		}
	}
	if len(held) > 0 {
		fmt.Fprintln(w, "\nHeld by a reading the change cannot undo:")
		for _, t := range held {
			fmt.Fprint(w, wrapText("  ", t, terminalWidth, "    "))
		}
	}
	fmt.Fprintf(w, "\nObjects: %d cleared, %d stayed, %d appeared, %d without hazard before and after",
		x.Moved[Cleared], x.Moved[Stayed], x.Moved[Appeared], x.Moved[NoHazard])
	if n := x.Moved[Unjudged]; n > 0 {
		fmt.Fprintf(w, ", %d not assessed after the changes", n)
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, MeasuredReadingsNote)
	caution(w)
	return nil
}

// StationRatioText is a station's worst ratio as the terminal shows it:
// assess.RatioAssumedText when it rests on an assumed resistance to earth (its
// size no figure), "no discharge" or "n/a" where there is no number.
func StationRatioText(s *assess.StationResult) string {
	return markedRatio(s.WorstRatio, s.WorstRatioAssumed, true)
}

// ObjectRatioText is an object's ratio as the terminal shows it, the
// assumed-resistance text where its size is an artefact.
func ObjectRatioText(r *assess.ObjectResult) string {
	return markedRatio(r.Ratio, r.RatioAssumed(), true)
}

// StationNotes are a station's marks before and after a rerun: incomplete
// (Objects rows rejected: its rank leaves them out) and ranked on an assumed
// resistance, each said once, "before:"/"after:" where only one side has it.
func StationNotes(before, after *assess.StationResult) []string {
	var out []string
	var b []string
	if before != nil {
		b = before.Notes()
	}
	a := after.Notes()
	for _, n := range a {
		if slices.Contains(b, n) {
			out = append(out, n)
		} else {
			out = append(out, "after: "+n)
		}
	}
	for _, n := range b {
		if !slices.Contains(a, n) {
			out = append(out, "before: "+n)
		}
	}
	return out
}

// SweepColumnsPerTable is how many station columns one terminal table of a
// sweep holds: more stations are printed as further tables of the same steps,
// so no line grows past about 120 characters.
const SweepColumnsPerTable = 8

// DefaultSweepTop is how many stations the sweep's terminal summary shows by
// default (the worst by rank at the lowest RH); the workbook and JSON hold all.
const DefaultSweepTop = 10

// WriteSweepSummary writes the compact terminal tables of a sweep: one line per
// RH step with the counts and the worst ratio of top stations (the n worst by
// rank at the lowest RH, every station when top <= 0), SweepColumnsPerTable
// stations per table, then the RH from which each shown station is
// non-incendive and the stations kept at their own RH.
func WriteSweepSummary(w io.Writer, s *Sweep, top int) error {
	if len(s.Steps) == 0 {
		return nil
	}
	for _, t := range s.Warnings {
		fmt.Fprint(w, wrapText("Warning: ", t, terminalWidth, "  "))
	}
	shown := s.Top(top)
	for start := 0; start < len(shown) || start == 0; start += SweepColumnsPerTable {
		block := shown[start:min(start+SweepColumnsPerTable, len(shown))]
		if start > 0 {
			fmt.Fprintln(w)
		}
		tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
		hdr := []string{"RH %", "Incendive", "Marginal"}
		for _, j := range block {
			id := s.Steps[0].Stations[j].ID
			if s.isHeld(id) {
				id += "*" // held at its own RH: the footnote below says so
			}
			hdr = append(hdr, id)
		}
		fmt.Fprintln(tw, strings.Join(hdr, "\t")+"\t")
		for _, st := range s.Steps {
			row := []string{fmtSig(st.RH), fmt.Sprint(st.Incendive), fmt.Sprint(st.Marginal)}
			for _, j := range block {
				x := st.Stations[j]
				row = append(row, markedRatio(x.WorstRatio, x.WorstRatioAssumed, true)+verdictMark(x.Verdict.String()))
			}
			fmt.Fprintln(tw, strings.Join(row, "\t")+"\t")
		}
		tw.Flush()
		if len(shown) == 0 {
			break
		}
	}
	fmt.Fprintln(w, "Station cells: worst ratio E/MIE; ! incendive, ~ marginal, ? not assessed, blank non-incendive.")
	var heldShown []string
	for _, j := range shown {
		for _, h := range s.Held {
			if h.ID == s.Steps[0].Stations[j].ID {
				heldShown = append(heldShown, fmt.Sprintf("%s %s", h.ID, heldMark(h.RH)))
			}
		}
	}
	if len(heldShown) > 0 {
		fmt.Fprint(w, wrapText("", "* not swept: "+strings.Join(heldShown, ", ")+"; every row shows its result at that RH.", terminalWidth, "  "))
	}
	for _, x := range s.Steps[0].Stations {
		if x.RejectedRows > 0 {
			fmt.Fprint(w, wrapText("", x.ID+" "+sweepStationText(x, ""), terminalWidth, "  "))
		}
	}
	fmt.Fprintln(w)
	for _, j := range shown {
		c := s.Clearances[j]
		fmt.Fprint(w, wrapText(fmt.Sprintf("  %-8s ", c.ID), c.Text, terminalWidth, strings.Repeat(" ", 11)))
	}
	if more := len(s.Clearances) - len(shown); more > 0 {
		fmt.Fprint(w, wrapText("  ", fmt.Sprintf("... and %d more station(s): the %d worst by rank at %s %% RH are shown; the workbook and JSON hold every one (--top 0 prints all)",
			more, len(shown), fmtSig(s.Steps[0].RH)), terminalWidth, "      "))
	}
	fmt.Fprint(w, wrapText("", sweepHeldText(s, DefaultSweepTop), terminalWidth, "  "))
	fmt.Fprint(w, wrapText("", MeasuredReadingsNote, terminalWidth, ""))
	caution(w)
	return nil
}

// isHeld: the station was kept at its own RH.
func (s *Sweep) isHeld(id string) bool {
	for _, h := range s.Held {
		if h.ID == id {
			return true
		}
	}
	return false
}

// sweepHeldText says how the sweep set the stations' RH: which stations kept
// their own, or that every station was swept.
// At most limit stations are named (all when limit <= 0).
func sweepHeldText(s *Sweep, limit int) string {
	if s.AllStations {
		return "Every station was set to the swept RH, its own RH overridden (--all-stations)."
	}
	if len(s.Held) == 0 {
		return "The swept RH is the site's; no station gives an RH of its own, so every station follows it."
	}
	var parts []string
	for i, h := range s.Held {
		if limit > 0 && i == limit {
			parts = append(parts, fmt.Sprintf("and %d more (see the Stations sheet or the JSON)", len(s.Held)-limit))
			break
		}
		parts = append(parts, fmt.Sprintf("%s %s%%", h.ID, fmtSig(h.RH)))
	}
	return fmt.Sprintf("The swept RH is the site's; %d station(s) give their own RH and were kept at it (--all-stations sweeps them too): %s.",
		len(s.Held), strings.Join(parts, ", "))
}

func verdictMark(v string) string {
	switch v {
	case "incendive":
		return " !"
	case "marginal":
		return " ~"
	case "not assessed":
		return " ?"
	}
	return "  "
}

// WriteCompareSummary writes the compact terminal report of a compare: both
// identities, the cautions, the Site and station settings changed, the objects
// added, removed and changed, and the stations whose rank or verdict moved.
func WriteCompareSummary(w io.Writer, c *Comparison) error {
	for _, s := range []struct {
		role string
		side *Side
	}{{"Old", c.Old}, {"New", c.New}} {
		id := s.side.Identity
		fmt.Fprintf(w, "%s: %s\n     site %s, surveyed %s, survey SHA-256 %s\n", s.role, dash(id.Path), id.SiteText(), id.DateText(), shortSum(id.SHA256))
	}
	for _, k := range c.Cautions {
		fmt.Fprintf(w, "WARNING (%s): %s\n", k.Kind, k.Text)
	}
	fmt.Fprintln(w)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Setting changed\tWhere\tBefore\tAfter")
	for _, ch := range append(append([]FieldChange(nil), c.SiteChanges...), c.StationChanges...) {
		where := "Site"
		if ch.Station != "" {
			where = ch.Station
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\n", ch.Field, where, dash(ch.Before.Text), dash(ch.After.Text))
	}
	switch none := len(c.SiteChanges)+len(c.StationChanges) == 0; {
	case none && len(c.NotCompared) > 0:
		fmt.Fprintln(tw, "(no compared setting changed)")
	case none:
		fmt.Fprintln(tw, "(no Site item or station setting changed)")
	}
	tw.Flush()
	if t := c.NotComparedText(); t != "" {
		fmt.Fprint(w, wrapText("", t, terminalWidth, "  "))
	}
	fmt.Fprintln(w)
	fmt.Fprintf(w, "Added (%d):   %s\n", len(c.Added), listOrNone(c.Added))
	fmt.Fprintf(w, "Removed (%d): %s\n", len(c.Removed), listOrNone(c.Removed))
	for _, g := range c.rejectedSides() {
		fmt.Fprint(w, wrapText("", fmt.Sprintf("Rejected in %s (%d, not compared, neither added nor removed: see its audit / Rejected sheet): %s", g.side, g.n, g.ids), terminalWidth, "  "))
	}
	fmt.Fprintln(w)
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Changed object\tStation\tVerdict before\tVerdict after\tFields changed")
	for _, ch := range c.Changed {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", ch.ID, ch.Station, ch.VerdictBefore, ch.VerdictAfter, strings.Join(ch.Fields, ", "))
	}
	if len(c.Changed) == 0 {
		fmt.Fprintln(tw, "(none)")
	}
	tw.Flush()
	fmt.Fprintln(w)
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Station\tRank before\tRank after\tVerdict before\tVerdict after\tWorst ratio before\tWorst ratio after\tMove")
	for _, m := range c.Stations {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", m.ID, rankText(m.RankBefore), rankText(m.RankAfter), dash(m.VerdictBefore), dash(m.VerdictAfter),
			markedRatio(m.WorstRatioBefore, m.WorstRatioAssumedBefore, m.RankBefore != 0), markedRatio(m.WorstRatioAfter, m.WorstRatioAssumedAfter, m.RankAfter != 0), m.Move())
	}
	if len(c.Stations) == 0 {
		fmt.Fprintln(tw, "(no station's rank or verdict moved)")
	}
	tw.Flush()
	fmt.Fprintf(w, "Stations: %d on both sides whose rank or verdict moved, %d only in NEW, %d only in OLD\n", c.StationsMoved(), c.StationsAdded(), c.StationsRemoved())
	if c.HasCaution(CautionDifferentSites) {
		fmt.Fprintln(w, "Different sites: the lists above compare two places, not a survey repeated over time.")
	}
	caution(w)
	return nil
}

// markedRatio is a ratio as text, RatioAssumedText when it rests on an
// assumed resistance to earth, "–" when the side has none (on is false).
func markedRatio(r *float64, assumed, on bool) string {
	switch {
	case !on:
		return "–"
	case assumed:
		return assess.RatioAssumedText
	}
	return audit.FormatRatio(r)
}

// shortSum is the first 12 hex digits of a checksum, "not known" for none.
func shortSum(s string) string {
	if s == "" {
		return "not known"
	}
	if len(s) > 12 {
		return s[:12] + "…"
	}
	return s
}

func listOrNone(s []string) string {
	if len(s) == 0 {
		return "none"
	}
	return strings.Join(s, ", ")
}

func rankText(r int) string {
	if r == 0 {
		return "–"
	}
	return fmt.Sprint(r)
}

func dash(s string) string {
	if s == "" {
		return "–"
	}
	return s
}

// terminalWidth is the width the sweep's prose lines are wrapped to.
const terminalWidth = 110

// wrapText writes prefix (kept as it is) and then s broken at spaces into
// lines of at most width characters (a word longer than that stays whole), the
// lines after the first starting with indent; the result ends with a newline.
func wrapText(prefix, s string, width int, indent string) string {
	var b strings.Builder
	b.WriteString(prefix)
	line := utf8.RuneCountInString(prefix)
	for i, word := range strings.Fields(s) {
		n := utf8.RuneCountInString(word)
		if i > 0 && line+1+n > width {
			b.WriteString("\n" + indent)
			line = utf8.RuneCountInString(indent)
		} else if i > 0 {
			b.WriteByte(' ')
			line++
		}
		b.WriteString(word)
		line += n
	}
	b.WriteByte('\n')
	return b.String()
}

// sigOrAssumed is a ratio to 3 significant digits (fmtSig), or
// assess.RatioAssumedText when it rests on an assumed resistance to earth.
func sigOrAssumed(r float64, assumed bool) string {
	if assumed {
		return assess.RatioAssumedText
	}
	return fmtSig(r)
}
