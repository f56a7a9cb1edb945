package audit

import (
	"testing"

	"github.com/sparkmargin/sparkmargin/report/book"
)

// Review N8: the tables' ratio text (book.FormatSigTrim, three significant
// digits) gives the digits report/assess's ratioText gives in a finding, on
// the same hand-derived list (report/assess ratio_rounding_test.go; the ratios
// are invented for the test).
func TestRatioTablesRoundAsFindings(t *testing.T) {
	for _, c := range []struct {
		r    float64
		want string
	}{{1.125, "1.12"}, {0.3333, "0.333"}, {25, "25"}, {8.695, "8.7"}, {9.996, "10"}, {100, "100"}, {41.666, "41.7"}} {
		if got := book.FormatSigTrim(c.r, 3); got != c.want {
			t.Errorf("ratio %g in a table: %q, want %q", c.r, got, c.want)
		}
	}
}
