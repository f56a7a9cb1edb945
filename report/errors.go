package report

import (
	"errors"

	"github.com/sparkmargin/sparkmargin/inventory"
)

// Failure is the class of a run's failure; the command maps each to its exit code.
type Failure int

// The classes are ordered: the worst of several failures is their max.
const (
	// Problems: the survey was read but nothing could be assessed, or rows
	// were rejected under Strict. The command exits 1.
	Problems Failure = iota + 1
	// Unusable: the input cannot be used or an output cannot be written
	// (unreadable survey, clashing paths, a folder without surveys, a disk
	// error). The command exits 2.
	Unusable
)

// Error is a failure of the pipeline with its class.
type Error struct {
	Kind Failure
	Err  error
}

func (e *Error) Error() string { return e.Err.Error() }
func (e *Error) Unwrap() error { return e.Err }

// unusable wraps err as an Unusable failure (nil stays nil).
func unusable(err error) error {
	if err == nil {
		return nil
	}
	return &Error{Kind: Unusable, Err: err}
}

// problems wraps err as a Problems failure.
func problems(err error) error { return &Error{Kind: Problems, Err: err} }

// KindOf returns the class of err: its Error's Kind, else Unusable.
func KindOf(err error) Failure {
	var e *Error
	if errors.As(err, &e) {
		return e.Kind
	}
	return Unusable
}

// RequireRegular refuses, in one sentence (exit 2), an input that is not a
// regular file: a named pipe would block the read for ever, a device or a
// socket is no workbook. It looks with stat only and never opens the path.
func RequireRegular(path string) error {
	return unusable(inventory.CheckRegularFile(path))
}
