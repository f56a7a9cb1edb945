package assess

import (
	"testing"

	"github.com/sparkmargin/sparkmargin/report/book"
)

// Review N8: a ratio is rounded one way in a finding's words and in the
// tables (book's formatter). 1.125 is exact in binary, so the rounding rule
// shows: the review saw "1.13" in the finding and "1.12" in the HTML.
func TestRatioTextRoundsAsTheTables(t *testing.T) {
	for _, r := range []float64{1.125, 0.3333, 25, 8.695, 100} {
		if got, want := ratioText(r), book.UnitRatio.Text(r); got != book.FormatSigTrim(r, 3) || book.FormatSigTrim(r, 3) != trimZeros(want) {
			t.Errorf("ratio %g: finding %q, table %q", r, got, want)
		}
	}
}

// trimZeros drops the trailing zeros a table cell keeps ("25.0" -> "25").
func trimZeros(s string) string {
	for len(s) > 1 && s[len(s)-1] == '0' && containsDot(s) {
		s = s[:len(s)-1]
	}
	if s[len(s)-1] == '.' {
		s = s[:len(s)-1]
	}
	return s
}

func containsDot(s string) bool {
	for _, c := range s {
		if c == '.' {
			return true
		}
	}
	return false
}
