package audit

import (
	"encoding/json"
	"fmt"
	"io"
	"sort"
	"text/tabwriter"

	"github.com/sparkmargin/sparkmargin/inventory"
)

func kindCounts(s *inventory.Survey) map[string]int {
	m := map[string]int{}
	for _, o := range s.Objects {
		m[o.Kind]++
	}
	return m
}

// WriteCheckText writes what the check command prints: the rows read per
// sheet and per kind, then every problem in sheet and row order.
func WriteCheckText(out io.Writer, s *inventory.Survey) {
	fmt.Fprintf(out, "Survey %s", s.Path)
	if s.Site.Name != "" {
		fmt.Fprintf(out, " (%s", s.Site.Name)
		if !s.Site.SurveyDate.IsZero() {
			fmt.Fprintf(out, ", %s", s.Site.SurveyDate.Format("2006-01-02"))
		}
		fmt.Fprint(out, ")")
	}
	fmt.Fprintln(out)
	tw := tabwriter.NewWriter(out, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Sheet\tRows read\tAccepted\tRejected")
	for _, c := range s.Counts {
		fmt.Fprintf(tw, "%s\t%d\t%d\t%d\n", c.Sheet, c.Read, c.Accepted, c.Rejected)
	}
	tw.Flush()
	kc := kindCounts(s)
	if len(kc) > 0 {
		fmt.Fprint(out, "Accepted objects by kind:")
		for _, k := range inventory.Kinds() {
			if n := kc[k]; n > 0 {
				fmt.Fprintf(out, " %s %d", k, n)
			}
		}
		fmt.Fprintln(out)
	}
	errs, warns := len(s.Errors()), len(s.Warnings())
	if errs+warns == 0 {
		fmt.Fprintln(out, "No problems found.")
		return
	}
	fmt.Fprintf(out, "%d error(s), %d warning(s):\n", errs, warns)
	for _, p := range s.Problems {
		fmt.Fprintf(out, "  %-7s %s\n", p.Severity.String(), p.Error())
	}
}

// CheckReport is the JSON document of the check command.
type CheckReport struct {
	Survey   string         `json:"survey"`
	SHA256   string         `json:"sha256"`
	Site     string         `json:"site"`
	Date     string         `json:"survey_date"`
	Sheets   []CheckSheet   `json:"sheets"`
	Kinds    []CheckKind    `json:"kinds"`
	Errors   int            `json:"errors"`
	Warnings int            `json:"warnings"`
	Problems []CheckProblem `json:"problems"`
}

// CheckSheet counts one sheet's rows.
type CheckSheet struct {
	Sheet    string `json:"sheet"`
	Read     int    `json:"read"`
	Accepted int    `json:"accepted"`
	Rejected int    `json:"rejected"`
}

// CheckKind counts the accepted objects of one kind.
type CheckKind struct {
	Kind  string `json:"kind"`
	Count int    `json:"count"`
}

// CheckProblem is one problem with its place.
type CheckProblem struct {
	Severity string `json:"severity"`
	Sheet    string `json:"sheet"`
	Row      int    `json:"row"`
	Column   string `json:"column"`
	Field    string `json:"field"`
	ID       string `json:"id"`
	Message  string `json:"message"`
	Fix      string `json:"fix"`
}

// WriteCheckJSON writes the check command's counts and problems as JSON.
func WriteCheckJSON(out io.Writer, s *inventory.Survey) error {
	j := CheckReport{Survey: s.Path, SHA256: s.SHA256, Site: s.Site.Name, Sheets: []CheckSheet{}, Kinds: []CheckKind{}, Problems: []CheckProblem{}}
	if !s.Site.SurveyDate.IsZero() {
		j.Date = s.Site.SurveyDate.Format("2006-01-02")
	}
	for _, c := range s.Counts {
		j.Sheets = append(j.Sheets, CheckSheet{c.Sheet, c.Read, c.Accepted, c.Rejected})
	}
	kc := kindCounts(s)
	kinds := make([]string, 0, len(kc))
	for k := range kc {
		kinds = append(kinds, k)
	}
	sort.Strings(kinds)
	for _, k := range kinds {
		j.Kinds = append(j.Kinds, CheckKind{k, kc[k]})
	}
	for _, p := range s.Problems {
		if p.Severity == inventory.Error {
			j.Errors++
		} else {
			j.Warnings++
		}
		j.Problems = append(j.Problems, CheckProblem{p.Severity.String(), p.Sheet, p.Row, p.Column, p.Field, p.ID, p.Message, p.Fix})
	}
	enc := json.NewEncoder(out)
	enc.SetIndent("", "  ")
	return enc.Encode(j)
}
