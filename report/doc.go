// Package report runs the pipeline of one survey or many: read the survey
// (inventory), judge it (report/assess) and write the audit (report/audit), in
// one pass, with progress reported through a callback and typed errors that
// the command maps to exit codes.
//
// Every output goes through report/outfile (safe file writing): written whole
// into a temporary file of the run's Workspace and renamed into place, so a
// killed run never leaves a half-written audit and the survey is never
// written to.
//
// The stages live below it, each in its own package: report/assess (the one
// judging engine), report/audit (the audit workbook, JSON, terminal summary
// and portfolio), report/book (the workbook kit), report/rerun (whatif,
// sweep, compare) and report/outfile. None of them imports this package
// (cmd/sparkmargin/arrows_test.go).
package report
