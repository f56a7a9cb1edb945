package rerun

import (
	"fmt"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// FlagArg is one change flag as given on the command line.
type FlagArg struct{ Kind, Arg string }

// ChangeFlag is a repeatable command-line flag of one change kind that
// appends to one list shared by every kind, so that changes of different
// kinds keep their command-line order (a flag value: Set, Type, String).
type ChangeFlag struct {
	Kind string
	List *[]FlagArg
}

// Set appends one occurrence of the flag.
func (f ChangeFlag) Set(s string) error { *f.List = append(*f.List, FlagArg{f.Kind, s}); return nil }

// Type names the flag's value in the help: "value" for a site-wide kind, else "ID=value".
func (f ChangeFlag) Type() string {
	if k, _ := inventory.LookupChangeKind(f.Kind); k.Targets == inventory.TargetSite {
		return "value"
	}
	return "ID=value"
}

// String is the flag's values given so far, joined by commas.
func (f ChangeFlag) String() string {
	var out []string
	if f.List != nil {
		for _, c := range *f.List {
			if c.Kind == f.Kind {
				out = append(out, c.Arg)
			}
		}
	}
	return strings.Join(out, ",")
}

// CollectChanges gathers a what-if plan: the survey's Changes sheet first
// (unless useSheet is false), then the flags in their order. A rejected
// Changes row stops the run: a plan must not be half applied without notice.
// A sheet row whose kind and target a flag sets too is marked overridden
// (Change.OverriddenBy): the flag wins, and Run lists the row as overridden,
// not applied.
func CollectChanges(s *inventory.Survey, useSheet bool, flags []FlagArg) ([]Change, error) {
	var out []Change
	if useSheet {
		for _, r := range s.Rejected {
			if r.Sheet == inventory.SheetChanges && len(r.Problems) > 0 {
				return nil, fmt.Errorf("the survey's Changes sheet has a rejected row: %s (fix it or pass --no-sheet-changes)", r.Problems[0].Error())
			}
		}
		out = append(out, FromSheet(s)...)
	}
	for _, f := range flags {
		c, err := ParseFlag(f.Kind, f.Arg)
		if err != nil {
			return nil, err
		}
		out = append(out, c)
	}
	markOverridden(out)
	return out, nil
}

// markOverridden marks each Changes sheet row that a flag sets again (the
// same kind and the same target: the site for a site-wide kind, a station ID
// with or without station:, letter case ignored) as overridden by that flag.
func markOverridden(cs []Change) {
	for i := range cs {
		if cs[i].FromFlag() {
			continue
		}
		for j := range cs {
			if cs[j].FromFlag() && sameTarget(cs[i], cs[j]) {
				cs[i].OverriddenBy = cs[j].Text() // the last flag wins
			}
		}
	}
}

// sameTarget: a and b set the same thing.
func sameTarget(a, b Change) bool {
	if !strings.EqualFold(strings.TrimSpace(a.Kind), strings.TrimSpace(b.Kind)) {
		return false
	}
	norm := func(c Change) string {
		t := strings.TrimSpace(c.Target)
		if k, ok := inventory.LookupChangeKind(c.Kind); ok && k.Targets == inventory.TargetStation {
			if len(t) >= 8 && strings.EqualFold(t[:8], "station:") {
				t = strings.TrimSpace(t[8:])
			}
		}
		return strings.ToLower(t)
	}
	return norm(a) == norm(b)
}
