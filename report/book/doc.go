// Package book is the workbook kit the audit and the reruns build their
// sheets with: cells before styling (Cell: a value, its number format, the
// "est." mark, a state colour), the style cache of one workbook (Styles), rows
// written cell by cell or streamed (NormalSink, StreamSink), column tables
// (Column: header, width and the cell of a row), row heights for wrapped text,
// the display units of every quantity (Unit: SI in, engineering units and
// their number formats out; FormatSig, FormatRatio for text) and the
// canonical zip that makes a workbook's bytes depend only on its content
// (WriteCanonical). It knows nothing of surveys, verdicts or sheets.
package book
