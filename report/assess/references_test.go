package assess

import (
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/model"
)

// citesReference reports whether text names an entry of the Method sheet's
// References list by its key (or is the site's own choice, the required margin).
func citesReference(text string) bool {
	if strings.Contains(text, "site choice") {
		return true
	}
	for _, r := range model.References() {
		if strings.Contains(text, r.Key) {
			return true
		}
	}
	return false
}

// TestFindingBasesCiteReferences: every check's basis, for every discharge,
// points into the References list by a key a reader finds there, and none
// points to "reference section N", which no user has.
func TestFindingBasesCiteReferences(t *testing.T) {
	for c := Check(0); c < NumChecks; c++ {
		texts := []string{c.Basis()}
		for d := model.DischargeType(0); d < model.NumDischargeTypes; d++ {
			texts = append(texts, c.BasisFor(d))
		}
		for _, s := range texts {
			if !citesReference(s) {
				t.Errorf("%s: basis %q cites no entry of model.References", c.Name(), s)
			}
			if strings.Contains(s, "reference section") {
				t.Errorf("%s: basis %q points to a section no user has", c.Name(), s)
			}
		}
	}
	for _, u := range DefaultUncertainties() {
		if strings.Contains(u.Note, "reference section") {
			t.Errorf("uncertainty %s: %q points to a section no user has", u.Name, u.Note)
		}
	}
}
