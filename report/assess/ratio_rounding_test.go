package assess

import "testing"

// ratioRounding are ratios with the text every output gives them (three
// significant digits, the decimal nearest the binary value, trailing zeros
// dropped in running text). 1.125 is exact in binary: the tie goes to even,
// "1.12"; 8.695 is stored a little above, "8.7"; 9.996 rounds up a digit
// to "10". Derived by hand (python3: format(x, '.2f') gives the same digits).
// The ratios are invented for the test.
// report/audit's TestRatioTablesRoundAsFindings checks book's formatter
// against the same list.
var ratioRounding = []struct {
	r    float64
	want string
}{{1.125, "1.12"}, {0.3333, "0.333"}, {25, "25"}, {8.695, "8.7"}, {9.996, "10"}, {100, "100"}, {41.666, "41.7"}}

// Review N8: a ratio in a finding's words is rounded as in the tables.
func TestRatioTextRoundsAsTheTables(t *testing.T) {
	for _, c := range ratioRounding {
		if got := ratioText(c.r); got != c.want {
			t.Errorf("ratio %g in a finding: %q, want %q", c.r, got, c.want)
		}
	}
}
