// Package report runs the pipeline of one survey or many: read the survey
// (inventory), judge it (report/assess) and write the audit (report/audit), in
// one pass, with progress reported through a callback and typed errors that
// the command maps to exit codes. It also owns safe file writing: every output
// is written to a temporary file of the run's Workspace and renamed into place
// (WriteFileAtomic, Workspace.Prepare and Commit), so a killed run never
// leaves a half-written audit in place and the survey is never written to.
//
// The stages live below it, each in its own package: report/assess (the one
// judging engine), report/audit (the audit workbook, JSON, terminal summary
// and portfolio) and report/rerun (whatif, sweep, compare). None of them
// imports this package.
package report
