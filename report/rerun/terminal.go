package rerun

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

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
	fmt.Fprintln(w)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Station\tRank before\tVerdict before\tWorst ratio before\tRank after\tVerdict after\tWorst ratio after\tOutcome")
	for _, s := range x.Stations {
		b := [3]string{"–", "–", "–"}
		if s.Before != nil {
			b = [3]string{fmt.Sprint(s.Before.Rank), s.Before.Verdict.String(), audit.FormatRatio(s.Before.WorstRatio)}
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%d\t%s\t%s\t%s\n", s.ID, b[0], b[1], b[2], s.After.Rank, s.After.Verdict, audit.FormatRatio(s.After.WorstRatio), s.Outcome)
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
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\n", o.ID, o.Station, o.Before.Verdict, audit.FormatRatio(o.Before.Ratio), o.After.Verdict, audit.FormatRatio(o.After.Ratio), o.Outcome)
	}
	if moved == 0 {
		fmt.Fprintln(tw, "(no object's verdict or ratio moved)")
	}
	tw.Flush()
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

// WriteSweepSummary writes the compact terminal table of a sweep: one line per
// RH step with the counts and each station's worst ratio, then the RH from
// which each station is non-incendive.
func WriteSweepSummary(w io.Writer, s *Sweep) error {
	if len(s.Steps) == 0 {
		return nil
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	hdr := []string{"RH %", "Incendive", "Marginal"}
	for _, st := range s.Steps[0].Stations {
		hdr = append(hdr, st.ID)
	}
	fmt.Fprintln(tw, strings.Join(hdr, "\t")+"\t")
	for _, st := range s.Steps {
		row := []string{fmtSig(st.RH), fmt.Sprint(st.Incendive), fmt.Sprint(st.Marginal)}
		for _, x := range st.Stations {
			row = append(row, audit.FormatRatio(x.WorstRatio)+verdictMark(x.Verdict.String()))
		}
		fmt.Fprintln(tw, strings.Join(row, "\t")+"\t")
	}
	tw.Flush()
	fmt.Fprintln(w, "Station cells: worst ratio E/MIE; ! incendive, ~ marginal, blank non-incendive.")
	fmt.Fprintln(w)
	for _, c := range s.Clearances {
		fmt.Fprintf(w, "  %-8s %s\n", c.ID, c.Text)
	}
	fmt.Fprintln(w, MeasuredReadingsNote)
	caution(w)
	return nil
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

// WriteCompareSummary writes the compact terminal report of a compare.
func WriteCompareSummary(w io.Writer, c *Comparison) error {
	fmt.Fprintf(w, "Old: %s\nNew: %s\n\n", c.Old.Label, c.New.Label)
	fmt.Fprintf(w, "Added (%d):   %s\n", len(c.Added), listOrNone(c.Added))
	fmt.Fprintf(w, "Removed (%d): %s\n\n", len(c.Removed), listOrNone(c.Removed))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
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
	fmt.Fprintln(tw, "Station\tRank before\tRank after\tVerdict before\tVerdict after")
	for _, m := range c.Stations {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", m.ID, rankText(m.RankBefore), rankText(m.RankAfter), dash(m.VerdictBefore), dash(m.VerdictAfter))
	}
	if len(c.Stations) == 0 {
		fmt.Fprintln(tw, "(no station's rank moved)")
	}
	tw.Flush()
	caution(w)
	return nil
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
