package inventory

import (
	"errors"
	"strings"
	"testing"
)

// Review item 22: "1M" in Resistance to earth is refused as ambiguous (mega
// with its unit left out, or metres: a screening choice of this tool, a
// misread resistance can clear a hazard), and the problem gives each of the
// two readings once across its message and its fix, not a second time in
// the fix.
func TestAmbiguousUnitReadingsOnce(t *testing.T) {
	s := utReadBook(t, utValidBook().set(SheetObjects, "C-1", "Resistance to earth", "1M"))
	found := false
	for _, p := range utProblemsAt(s, "Objects!U5") {
		if !errors.Is(p, ErrAmbiguousUnit) {
			continue
		}
		found = true
		all := p.Message + "; " + p.Fix
		for _, r := range []string{"mega, with its unit left out (write MΩ)", "metres (write m)"} {
			if n := strings.Count(all, r); n != 1 {
				t.Errorf("reading %q given %d times: %s", r, n, all)
			}
		}
		if !strings.Contains(p.Fix, "write the unit in full") {
			t.Errorf("fix %q", p.Fix)
		}
	}
	if !found {
		t.Fatalf("no ambiguous-unit problem at Objects!U5:\n%s", utDump(s))
	}
}
