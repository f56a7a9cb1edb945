package audit

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
)

// WriteSummary writes the short plain-text summary of an audit for the
// terminal: the ranked stations (rank, station, verdict, worst ratio, counts),
// the objects by verdict, the survey rows accepted and rejected, and the
// cautions line. Columns are aligned with text/tabwriter; no colours.
func WriteSummary(w io.Writer, a *assess.Audit) error {
	if a == nil {
		return fmt.Errorf("write summary: no audit")
	}
	sampled := a.Options.Samples > 0
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	header := "Rank\tStation\tVerdict\tWorst ratio E/MIE\tObjects\tIncendive\tMarginal\tNon-incendive\tNot assessed"
	if sampled {
		header += "\tP(any incendive)"
	}
	noted := false // a Note column only when a station has one (incomplete, or ranked on an assumed resistance)
	for i := range a.Stations {
		noted = noted || len(a.Stations[i].Notes()) > 0
	}
	if noted {
		header += "\tNote"
	}
	fmt.Fprintln(tw, header)
	for i := range a.Stations {
		s := &a.Stations[i]
		name := s.Station.ID
		if s.Station.Name != "" {
			name += " " + s.Station.Name
		}
		ratio := book.FormatRatio(book.FinitePtr(s.WorstRatio))
		if s.WorstRatioAssumed {
			ratio = assess.RatioAssumedText
		}
		fmt.Fprintf(tw, "%d\t%s\t%s\t%s\t%d\t%d\t%d\t%d\t%d", s.Rank, name, s.Verdict, ratio,
			len(s.Objects), s.Counts[assess.Incendive], s.Counts[assess.Marginal], s.Counts[assess.NonIncendive], s.Counts[assess.NotAssessed])
		if sampled {
			p := "–"
			if s.ProbabilityAnyIncendive != nil {
				p = fmt.Sprintf("%.3f", *s.ProbabilityAnyIncendive)
			}
			fmt.Fprint(tw, "\t"+p)
		}
		if noted {
			fmt.Fprint(tw, "\t"+strings.Join(s.Notes(), "; "))
		}
		fmt.Fprintln(tw)
	}
	if err := tw.Flush(); err != nil {
		return fmt.Errorf("write summary: %w", err)
	}
	var parts []string
	total := 0
	for _, v := range verdictOrder() {
		parts = append(parts, fmt.Sprintf("%d %s", a.Counts[v], v))
		total += a.Counts[v]
	}
	fmt.Fprintf(w, "\nObjects: %d (%s); findings: %d\n", total, strings.Join(parts, ", "), len(a.Findings))
	if a.Survey != nil && !a.Survey.Site.RelativeHumidity.Known {
		fmt.Fprintf(w, "Warning: the Site sheet gives no relative humidity (an error for check): stations without their own were assessed at the dry-day %g %%RH, shown on the Summary sheet\n", assess.DryDayHumidity)
	}
	if sampled {
		fmt.Fprintf(w, "Monte Carlo: %d samples per object, seed %d (uncertainties on the Method sheet)\n", a.Options.Samples, a.Options.Seed)
	}
	if a.Survey != nil {
		read, acc, rej := 0, 0, 0
		var where []string
		for _, c := range a.Survey.Counts {
			read += c.Read
			acc += c.Accepted
			rej += c.Rejected
			if c.Rejected > 0 {
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
		if rej > 0 || len(a.Survey.Warnings()) > 0 {
			line += " (see the Rejected sheet)"
		}
		fmt.Fprintln(w, line)
	}
	_, err := fmt.Fprintf(w, "\n%s\n", templates.CautionLine)
	if err != nil {
		return fmt.Errorf("write summary: %w", err)
	}
	return nil
}
