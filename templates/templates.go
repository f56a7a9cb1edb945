// Package templates holds the embedded texts of sparkmargin: the cautions every
// output repeats, the method notes, the mitigation wording and the description
// of the invented demo plant. It holds text only, no logic.
package templates

import (
	_ "embed"
	"strings"
)

//go:embed cautions.txt
var cautions string

// Cautions returns the cautions, one sentence per element, in the order SAFETY.md gives them.
func Cautions() []string {
	var out []string
	for _, l := range strings.Split(strings.TrimSpace(cautions), "\n") {
		if l = strings.TrimSpace(l); l != "" {
			out = append(out, l)
		}
	}
	return out
}

// CautionLine is the one-line caution the terminal summary ends with.
const CautionLine = "Screening estimates only: defer to local codes, the site's hazardous-area classification and a competent person; measure capacitance, resistance to earth and fields in situ (see SAFETY.md)."
