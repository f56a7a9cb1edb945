package rerun

import (
	"fmt"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// FlagArg is one change flag as given on the command line.
type FlagArg struct{ Kind, Arg string }

// CollectChanges gathers a what-if plan: the survey's Changes sheet first
// (unless useSheet is false), then the flags in their order. A rejected
// Changes row stops the run: a plan must not be half applied without notice.
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
	return out, nil
}
