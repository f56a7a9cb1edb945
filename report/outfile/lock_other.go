//go:build !unix

package outfile

import (
	"io/fs"
	"os"
)

// renameOpenFile: a file is closed before it is renamed.
const renameOpenFile = false

// lockFile does nothing here: without advisory locks, the process id in the
// name protects a live run's files.
func lockFile(*os.File) {}

// lockHeld is false: the process id decides.
func lockHeld(string) bool { return false }

// processAlive cannot be told without system calls this build lacks: every
// process counts as alive, so nothing named with a process id is removed.
func processAlive(int) bool { return true }

func ownedByMe(fs.FileInfo) bool { return true }
