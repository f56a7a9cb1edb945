package audit

import (
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
)

// fitObjectIDs sizes the Objects sheet's Object and Station columns (the
// first two of objectColumns) to the longest ID of rs, so that no ID is cut
// off on screen or on paper. The streaming writer knows only the first batch
// when it must set the widths; a longer ID later in a large survey overflows
// into the next column as text does.
func fitObjectIDs(cols []book.Column[objRow], rs []assess.ObjectResult) {
	var ob, st []string
	for i := range rs {
		ob, st = append(ob, rs[i].Object.ID), append(st, rs[i].Object.Station)
	}
	for i, ids := range [][]string{ob, st} {
		if i < len(cols) {
			cols[i].Width = fitWidth(cols[i].Width, ids)
		}
	}
}
