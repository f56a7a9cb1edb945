package audit

import (
	"errors"
	"fmt"
	"os"
	"strconv"
	"strings"

	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/xuri/excelize/v2"
)

// Actions that survive reruns. The Findings sheet has four columns the site
// fills in (Action owner, Due, Status, Comment); a rerun that writes over an
// audit first reads them back (ReadPreviousAudit) and carries them to the
// same finding of the new audit (PlanActions), keyed by station, object and
// check. Findings the new run no longer raises are listed, with their
// actions, in a "closed since last run" part under the open findings.
//
// The previous audit is read with excelize (already the writer's library):
// the audit is our own workbook, small but for its Objects sheet, which is
// never loaded (excelize reads a sheet only when asked, and parts larger than
// UnzipXMLSizeLimit are spilled to disk). The inventory package's cell scanner
// belongs to the survey format and is not exported.

// AuditMark is the custom document property every audit carries, so that a
// file is known as a sparkmargin audit by its content, not by its name; its
// value is the version of the Findings layout (ActionLayout).
const AuditMark = "sparkmargin audit"

// ActionLayout is the version of the Findings sheet's layout that the mark records.
const ActionLayout = "1"

// Headers of the Findings sheet that the reader looks up by name (the column
// table uses the same constants, so the two cannot drift).
const (
	hdrSeverity   = "Severity"
	hdrStation    = "Station"
	hdrObject     = "Object"
	hdrCheck      = "Check"
	hdrFinding    = "Finding"
	hdrMitigation = "Mitigation"
	hdrBasis      = "Basis"
	hdrOwner      = "Action owner"
	hdrDue        = "Due"
	hdrStatus     = "Status"
	hdrComment    = "Comment"
)

// Titles of the closed parts of the Findings sheet; the reader finds the parts
// by the start of these texts in column A.
const (
	closedSinceTitle   = "Closed since last run"
	closedEarlierTitle = "Closed before the last run"
)

// ErrNotAnAudit: the file exists but is not an audit this tool wrote (no
// audit mark, or not a workbook at all).
var ErrNotAnAudit = errors.New("not a sparkmargin audit")

// FindingKey identifies a finding across runs: the station, the object and
// the check (assess.Finding.Check, a stable name).
type FindingKey struct {
	Station, Object, Check string
}

func keyOf(f *assess.Finding) FindingKey {
	return FindingKey{strings.TrimSpace(f.StationID), strings.TrimSpace(f.ObjectID), strings.TrimSpace(f.Check)}
}

// Action is what the site typed against one finding.
type Action struct {
	Owner, Status, Comment string
	// Due is the due date as the cell showed it; DueSerial the spreadsheet
	// date when the cell held a date (0: the cell held text or nothing).
	Due       string
	DueSerial float64
}

// Empty reports whether nothing was typed.
func (a Action) Empty() bool {
	return a.Owner == "" && a.Due == "" && a.DueSerial == 0 && a.Status == "" && a.Comment == ""
}

// priorFinding is one finding row of the previous audit.
type priorFinding struct {
	Key                                  FindingKey
	Severity, Message, Mitigation, Basis string
	Action                               Action
	closedEarlier                        bool // listed closed already in the previous audit
	used                                 bool
}

// PreviousAudit is the Findings sheet of the audit a run is about to replace.
type PreviousAudit struct {
	Path string
	// Legacy: the file carries no audit mark (saved by another program, which
	// may drop it, or written by an earlier version) but our creator property.
	Legacy bool
	rows   []priorFinding
}

// maxPreviousAudit is the largest file ReadPreviousAudit opens: an audit of a
// full survey sheet stays far below it.
const maxPreviousAudit = 2 << 30

// ReadPreviousAudit reads the findings and actions of the audit at path. A
// file that is not a workbook, or a workbook without the audit mark (and not
// an audit of an earlier version), gives an error wrapping ErrNotAnAudit.
// The errors do not name path: the caller says which file it was.
func ReadPreviousAudit(path, tmpDir string) (p *PreviousAudit, err error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if !fi.Mode().IsRegular() || fi.Size() > maxPreviousAudit {
		return nil, fmt.Errorf("%w (not a regular workbook file)", ErrNotAnAudit)
	}
	defer func() {
		if r := recover(); r != nil {
			p, err = nil, fmt.Errorf("%w (the workbook could not be read: %v)", ErrNotAnAudit, r)
		}
	}()
	f, err := excelize.OpenFile(path, excelize.Options{TmpDir: tmpDir, UnzipSizeLimit: maxPreviousAudit})
	if err != nil {
		return nil, fmt.Errorf("%w (not a workbook: %v)", ErrNotAnAudit, err)
	}
	defer func() { _ = f.Close() }()
	p = &PreviousAudit{Path: path}
	marked, err := hasAuditMark(f)
	if err != nil {
		return nil, fmt.Errorf("%w (%v)", ErrNotAnAudit, err)
	}
	if !marked {
		props, _ := f.GetDocProps()
		if props == nil || !strings.HasPrefix(props.Creator, "sparkmargin") {
			return nil, fmt.Errorf("%w (the workbook carries no audit mark)", ErrNotAnAudit)
		}
		p.Legacy = true
	}
	if err := p.readFindings(f); err != nil {
		if p.Legacy {
			return nil, fmt.Errorf("%w (%v)", ErrNotAnAudit, err)
		}
		return nil, fmt.Errorf("sheet %s: %w", SheetFindings, err)
	}
	return p, nil
}

func hasAuditMark(f *excelize.File) (bool, error) {
	props, err := f.GetCustomProps()
	if err != nil {
		return false, err
	}
	for _, c := range props {
		if c.Name == AuditMark {
			return true, nil
		}
	}
	return false, nil
}

// setAuditMark puts the audit mark into the workbook's custom properties.
func setAuditMark(f *excelize.File) error {
	return f.SetCustomProps(excelize.CustomProperty{Name: AuditMark, Value: ActionLayout})
}

// readFindings reads the Findings sheet: its header row names the columns
// (found by name, so a reordered sheet still reads), the rows under it are the
// open findings until the title of a closed part.
func (p *PreviousAudit) readFindings(f *excelize.File) error {
	if idx, err := f.GetSheetIndex(SheetFindings); err != nil || idx < 0 {
		return errors.New("no Findings sheet")
	}
	raw, err := f.GetRows(SheetFindings, excelize.Options{RawCellValue: true})
	if err != nil {
		return err
	}
	shown, err := f.GetRows(SheetFindings)
	if err != nil {
		return err
	}
	if len(raw) == 0 {
		return errors.New("no header row")
	}
	col := map[string]int{}
	for i, h := range raw[0] {
		col[strings.TrimSpace(h)] = i
	}
	for _, h := range []string{hdrStation, hdrObject, hdrCheck} {
		if _, ok := col[h]; !ok {
			return fmt.Errorf("no %q column in row 1", h)
		}
	}
	cell := func(row []string, h string) string {
		i, ok := col[h]
		if !ok || i >= len(row) {
			return ""
		}
		return strings.TrimSpace(row[i])
	}
	closedEarlier := false
	for r := 1; r < len(raw); r++ {
		row := raw[r]
		first := ""
		if len(row) > 0 {
			first = strings.TrimSpace(row[0])
		}
		switch {
		case strings.HasPrefix(first, closedSinceTitle):
			closedEarlier = true // rows closed since the run before are now closed earlier
			continue
		case strings.HasPrefix(first, closedEarlierTitle):
			closedEarlier = true
			continue
		case first == "#" || cell(row, hdrCheck) == hdrCheck:
			continue // a repeated header row
		}
		k := FindingKey{cell(row, hdrStation), cell(row, hdrObject), cell(row, hdrCheck)}
		if k.Check == "" {
			continue // a blank or foreign row
		}
		var sr []string
		if r < len(shown) {
			sr = shown[r]
		}
		act := Action{Owner: cell(row, hdrOwner), Status: cell(row, hdrStatus), Comment: cell(row, hdrComment), Due: cell(sr, hdrDue)}
		if rd := cell(row, hdrDue); rd != "" && rd != act.Due {
			// The cell holds a number shown otherwise: a date.
			if v, err := strconv.ParseFloat(rd, 64); err == nil && v > 0 && v < 2958466 {
				act.DueSerial = v
			}
		}
		if act.Due == "" {
			act.Due = cell(row, hdrDue)
		}
		p.rows = append(p.rows, priorFinding{
			Key: k, Severity: cell(row, hdrSeverity), Message: cell(row, hdrFinding),
			Mitigation: cell(row, hdrMitigation), Basis: cell(row, hdrBasis),
			Action: act, closedEarlier: closedEarlier,
		})
	}
	return nil
}

// ActionCounts says what a rerun did with the site's actions.
type ActionCounts struct {
	Carried       int // open findings whose action came over from the previous audit
	Closed        int // findings open in the previous audit that this run no longer raises
	ClosedActions int // of those, how many had an action typed
	New           int // findings not open in the previous audit
	NoAction      int // open findings with nothing typed against them (new ones included)
}

// ActionPlan is the action of every finding of the new audit and the
// findings closed since the previous one.
type ActionPlan struct {
	From   string   // the previous audit's path
	Legacy bool     // it carried no audit mark (an earlier version's)
	Open   []Action // aligned with the audit's Findings
	// ClosedSince are the findings open in the previous audit and gone now;
	// ClosedEarlier those already closed in it, kept for their actions.
	ClosedSince, ClosedEarlier []assess.Finding
	closedSinceActs            []Action
	closedEarlierActs          []Action
	Counts                     ActionCounts
}

// PlanActions matches the findings of a new audit with the rows of the
// previous one by FindingKey (several findings with one key are matched in
// order). A nil previous audit gives a nil plan: a first run.
func PlanActions(prev *PreviousAudit, findings []assess.Finding) *ActionPlan {
	if prev == nil {
		return nil
	}
	pl := &ActionPlan{From: prev.Path, Legacy: prev.Legacy, Open: make([]Action, len(findings))}
	rows := append([]priorFinding(nil), prev.rows...)
	byKey := map[FindingKey][]int{}
	for i := range rows {
		byKey[rows[i].Key] = append(byKey[rows[i].Key], i)
	}
	for i := range findings {
		k := keyOf(&findings[i])
		idx := byKey[k]
		var m *priorFinding
		// An open row of the previous audit first, then a closed one (reopened).
		for pass := 0; pass < 2 && m == nil; pass++ {
			for _, j := range idx {
				if !rows[j].used && rows[j].closedEarlier == (pass == 1) {
					m = &rows[j]
					break
				}
			}
		}
		if m == nil || m.closedEarlier {
			pl.Counts.New++
		}
		if m == nil {
			continue
		}
		m.used = true
		pl.Open[i] = m.Action
		if !m.Action.Empty() {
			pl.Counts.Carried++
		}
	}
	for i := range pl.Open {
		if pl.Open[i].Empty() {
			pl.Counts.NoAction++
		}
	}
	for i := range rows {
		r := &rows[i]
		if r.used {
			continue
		}
		f := assess.Finding{StationID: r.Key.Station, ObjectID: r.Key.Object, Check: r.Key.Check,
			Severity: verdictNamed(r.Severity), Message: r.Message, Mitigation: r.Mitigation, Basis: r.Basis}
		switch {
		case !r.closedEarlier:
			pl.ClosedSince = append(pl.ClosedSince, f)
			pl.closedSinceActs = append(pl.closedSinceActs, r.Action)
			pl.Counts.Closed++
			if !r.Action.Empty() {
				pl.Counts.ClosedActions++
			}
		case !r.Action.Empty():
			// Closed before the last run: kept only for the site's own words.
			pl.ClosedEarlier = append(pl.ClosedEarlier, f)
			pl.closedEarlierActs = append(pl.closedEarlierActs, r.Action)
		}
	}
	return pl
}

// verdictNamed returns the verdict a Severity cell names (not assessed when
// it names none).
func verdictNamed(s string) assess.Verdict {
	for _, v := range verdictOrder() {
		if strings.EqualFold(strings.TrimSpace(s), v.String()) {
			return v
		}
	}
	return assess.NotAssessed
}

// String is the terminal line of the counts.
func (c ActionCounts) String() string {
	return fmt.Sprintf("Actions: %d carried over from the previous audit; %d finding(s) closed since (%d with an action), listed at the foot of the Findings sheet; %d new finding(s); %d open finding(s) with no action typed (owner, due, status).",
		c.Carried, c.Closed, c.ClosedActions, c.New, c.NoAction)
}

// dueCell is the Due cell of an action: a date when one was typed as a date,
// else its text; an empty cell keeps the date format for the site's entry.
func dueCell(a Action) book.Cell {
	if a.DueSerial > 0 {
		return book.Cell{V: a.DueSerial, NumFmt: dueFormat, Align: "center"}
	}
	if a.Due != "" {
		return book.Cell{V: a.Due, Align: "center"}
	}
	return book.Cell{NumFmt: dueFormat, Align: "center"}
}

// dueFormat is the Due column's date format (ISO 8601, read alike everywhere).
const dueFormat = "yyyy-mm-dd"

// SetActions gives the writer the plan of the actions carried from the
// previous audit (nil: a first run, the action columns blank).
func (w *WorkbookWriter) SetActions(pl *ActionPlan) { w.wb.actions = pl }

// open returns the action of the i-th finding (none without a plan).
func (pl *ActionPlan) open(i int) Action {
	if pl == nil || i >= len(pl.Open) {
		return Action{}
	}
	return pl.Open[i]
}

// closed returns every closed finding the plan lists.
func (pl *ActionPlan) closed() []assess.Finding {
	if pl == nil {
		return nil
	}
	return append(append([]assess.Finding(nil), pl.ClosedSince...), pl.ClosedEarlier...)
}

// closedFindings writes the closed parts under the open findings: a blank
// row, a title, the header again and the rows, for the findings closed since
// the last run and then those closed before it (kept for their actions).
func (wb *workbook) closedFindings(ts *tableStream[findingRow]) error {
	pl := wb.actions
	if pl == nil {
		return nil
	}
	parts := []struct {
		title string
		fs    []assess.Finding
		acts  []Action
	}{
		{fmt.Sprintf("%s (%d): findings of the previous audit that this run no longer raises, kept with their actions. "+
			"Check that each closed because the hazard was removed, not because its object or station left the survey or was rejected (see the Rejected sheet).",
			closedSinceTitle, len(pl.ClosedSince)), pl.ClosedSince, pl.closedSinceActs},
		{fmt.Sprintf("%s (%d): findings closed in an earlier run, kept because an action was typed against them.",
			closedEarlierTitle, len(pl.ClosedEarlier)), pl.ClosedEarlier, pl.closedEarlierActs},
	}
	for _, p := range parts {
		if len(p.fs) == 0 {
			continue // a part only when it holds something: an unchanged rerun gives the same workbook
		}
		ts.next++ // a blank row
		// The title and header rows go through the writer the data rows
		// go through, so that the sheet's rows stay in order.
		title := []book.Cell{{V: p.title, Bold: true}}
		var err error
		if ts.direct != nil {
			err = ts.direct.Row(ts.next, title, 0)
		} else {
			err = ts.sink.Row(ts.next, title, 0)
		}
		if err != nil {
			return err
		}
		ts.next++
		if ts.direct != nil {
			err = ts.direct.HeaderRow(ts.next, book.Headers(ts.cols))
		} else {
			err = ts.sink.Header(ts.next, book.Headers(ts.cols))
		}
		if err != nil {
			return err
		}
		ts.next++
		for i := range p.fs {
			if err := ts.Row(findingRow{0, &p.fs[i], p.acts[i]}); err != nil {
				return err
			}
		}
	}
	return nil
}

// fitWidth is the width of a column of IDs: wide enough for the longest
// (a character and a half of margin), never less than min nor more than 40.
func fitWidth(min float64, ids []string) float64 {
	w := min
	for _, id := range ids {
		if n := float64(len([]rune(id))) + 2; n > w {
			w = n
		}
	}
	if w > 40 {
		w = 40
	}
	return w
}

// optString is s, or nil (an empty cell) for "".
func optString(s string) any {
	if s == "" {
		return nil
	}
	return s
}
