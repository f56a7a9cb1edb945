//go:build !windows

package outfile

// targetInUse is false: these systems replace a file that another program
// has open (the program keeps reading the old one).
func targetInUse(error) bool { return false }
