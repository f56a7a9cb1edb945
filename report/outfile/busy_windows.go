//go:build windows

package outfile

import (
	"errors"
	"syscall"
)

// targetInUse reports whether a failed rename says the target is open in
// another program: Windows does not replace a file another program holds
// open without sharing it, as Excel holds an open workbook.
func targetInUse(err error) bool {
	var errno syscall.Errno
	return errors.As(err, &errno) && inUseCode(uintptr(errno))
}
