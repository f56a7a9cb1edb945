package inventory

import (
	"io/fs"
	"os"
)

// CheckRegularFile returns an *UnreadableError (wrapping ErrUnreadable) when
// path is not a regular file, following symlinks: a named pipe (opening it
// would wait for a writer for ever), a device or a socket. It only stats the
// path and never opens it. A path that does not exist, or a folder, is left
// to the reader, which says so in its own words.
func CheckRegularFile(path string) error {
	fi, err := os.Stat(path)
	if err != nil || fi.Mode().IsRegular() || fi.IsDir() {
		return nil
	}
	return &UnreadableError{Path: path, Reason: notRegular(fi.Mode())}
}

// notRegular says what a file of mode m is instead of a workbook.
func notRegular(m fs.FileMode) string {
	const give = "; give the path of a survey workbook (.xlsx)"
	switch {
	case m&fs.ModeNamedPipe != 0:
		return "it is a named pipe (FIFO), not a regular file, and is not read" + give
	case m&fs.ModeSocket != 0:
		return "it is a socket, not a regular file, and is not read" + give
	case m&fs.ModeDevice != 0, m&fs.ModeCharDevice != 0:
		return "it is a device, not a regular file, and is not read" + give
	default:
		return "it is not a regular file, and is not read" + give
	}
}
