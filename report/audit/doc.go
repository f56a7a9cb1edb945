// Package audit writes the outputs of an assessment: the audit workbook
// (WriteWorkbook, or WorkbookWriter when the Objects rows stream in), the JSON
// file of the output contract (WriteJSON, JSONWriter), the short ranked table
// for the terminal (WriteSummary), the portfolio across several surveys
// (WritePortfolio, WritePortfolioJSON) and the self-contained HTML report
// (WriteHTML, HTMLWriter; html.go), whose humidity plot the caller fills from
// a sweep, since this package builds no rerun. Every writer takes an io.Writer: the
// report package's pipeline writes them through its safe file writing, so a
// killed run never leaves a half-written audit in place.
//
// Every quantity arrives in SI units (report/assess.Audit); the outputs alone
// convert them to the engineering units people read (kV, pF, mJ, µC/m², kV/m,
// nC), using the unit table of format.go for both the workbook and the terminal.
// A quantity that is not defined for an object (NaN in the model) is an empty
// cell in the workbook and null in the JSON, never 0 and never "NaN".
package audit
