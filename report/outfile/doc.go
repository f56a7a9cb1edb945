// Package outfile owns safe file writing for every command: each output is
// written whole into a temporary file beside its target and renamed into
// place (WriteAtomic, Workspace.Prepare and Commit, Workspace.WritePair), so
// a killed run never leaves a half-written audit; the temporary files of one
// run belong to its Workspace, removed on every way out and on an interrupt;
// and a run whose outputs would reach one of its inputs or each other is
// refused before anything is written (RefuseClashes), so the survey is never
// written to. "-" names standard output (Stdout).
//
// It knows no survey, verdict or sheet: it imports nothing of the module.
package outfile
