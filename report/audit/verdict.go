package audit

import (
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
)

// Verdict colours carry the ISO 3864-1 safety meanings: red for danger
// (incendive), yellow for caution (marginal), green for a safe condition
// (non-incendive); not assessed is a neutral grey. Plain fills with the
// standard's contrast colours for the text (white on red and green, black on
// yellow and grey).
func verdictColours(v assess.Verdict) (fill, font string) {
	switch v {
	case assess.Incendive:
		return "C8102E", "FFFFFF"
	case assess.Marginal:
		return "FFD100", "000000"
	case assess.NonIncendive:
		return "00843D", "FFFFFF"
	}
	return "BFBFBF", "000000"
}

// verdictCell is a verdict in its safety colour, bold and centred.
func verdictCell(v assess.Verdict) book.Cell {
	fill, font := verdictColours(v)
	return book.Cell{V: v.String(), Fill: fill, Color: font, Bold: true, Align: "center"}
}
