package report

import (
	"errors"
	"fmt"
	"os"

	"github.com/sparkmargin/sparkmargin/report/audit"
)

// The site's actions across reruns: before an audit workbook is written over,
// its Findings sheet is read (audit.ReadPreviousAudit) so that the actions
// typed into it are carried to the new audit (audit.PlanActions); a file that
// is not an audit of this tool is not written over without Run.Force.

// previousAudit reads the audit at path that this run will replace: nil when
// there is none. A file there that is not a sparkmargin audit is refused
// (Unusable) unless r.Force; with Force it is replaced and nothing carried.
func (r *Run) previousAudit(path, tmp string) (*audit.PreviousAudit, error) {
	if fi, err := os.Stat(path); err != nil || fi.IsDir() {
		// Nothing there (or no file to read: a folder, a path through a
		// file): the writer says what is wrong with the target, if anything.
		return nil, nil
	}
	prev, err := audit.ReadPreviousAudit(path, tmp)
	switch {
	case err == nil:
		return prev, nil
	case errors.Is(err, audit.ErrNotAnAudit) && r.Force:
		fmt.Fprintf(r.errOut(), "sparkmargin: --force: replacing %s, which is not a sparkmargin audit; nothing is carried from it\n", path)
		return nil, nil
	case errors.Is(err, audit.ErrNotAnAudit):
		return nil, unusable(fmt.Errorf("refusing to write the audit over %s: it is %w; it may be someone's own workbook. "+
			"Give another file with -o, or --force to replace it", path, err))
	}
	return nil, unusable(fmt.Errorf("reading the actions of the audit being replaced, %s: %w (move the file aside, or repair it, to rerun)", path, err))
}

// notePlan keeps the action plan of the audit written to workbook, for the
// terminal summary (printActions).
func (r *Run) notePlan(workbook string, pl *audit.ActionPlan) {
	if r.plans == nil {
		r.plans = map[string]*audit.ActionPlan{}
	}
	r.plans[workbook] = pl
}

// printActions says how many actions the audit written to workbook carried,
// how many findings closed and how many are new; nothing for a first run.
func (r *Run) printActions(workbook string) {
	pl := r.plans[workbook]
	if pl == nil {
		return
	}
	w := r.out()
	fmt.Fprintf(w, "%s\n", pl.Counts)
	if pl.Legacy {
		fmt.Fprintf(w, "(the previous audit's mark was not found: saved by another program, or written by an earlier version of the tool; its actions were read all the same)\n")
	}
}
