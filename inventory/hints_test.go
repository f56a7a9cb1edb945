package inventory

import (
	"strings"
	"testing"
)

// TestHintsSpeakOfTheUsersSurvey: a change error's hint gives the user's own
// target, or a placeholder, never the demo survey's IDs; an ambiguous unit is
// told once to be written in full (no "write its unit in full; write the unit
// in full").
func TestHintsSpeakOfTheUsersSurvey(t *testing.T) {
	demoIDs := []string{"DRM-DRUM", "COAT-WEB", "ST-UNW"}
	cases := []struct{ code, target, value, want string }{
		{"earth", "MY-ROLL", "lots", "--earth MY-ROLL="},     // a value that is no number: the user's own object
		{"earth", "", "1e6", "--earth OBJECT-ID="},           // no target: a placeholder
		{"station-rh", "", "60", "--station-rh STATION-ID="}, // no station: a placeholder
		{"material", "MY-WEB", "", "--material MY-WEB="},     // blank value: the user's own object
	}
	for _, c := range cases {
		_, err := ParseChange(c.code, c.target, c.value)
		if err == nil {
			t.Errorf("%s %q=%q: no error", c.code, c.target, c.value)
			continue
		}
		msg := err.Error()
		if !strings.Contains(msg, c.want) {
			t.Errorf("%s %q=%q: %q lacks %q", c.code, c.target, c.value, msg, c.want)
		}
		for _, id := range demoIDs {
			if strings.Contains(msg, id) {
				t.Errorf("%s %q=%q: the hint cites the demo's %s: %q", c.code, c.target, c.value, id, msg)
			}
		}
	}
	// The ambiguous unit: "write ... in full" once.
	s := utReadBook(t, utValidBook().set(SheetObjects, "OP-1", "Resistance to earth", "1 mohm"))
	for _, r := range s.Rejected {
		for i := range r.Problems {
			if e := r.Problems[i].Error(); strings.Count(e, "in full") > 1 {
				t.Errorf("the unit hint is said twice: %q", e)
			}
		}
	}
}
