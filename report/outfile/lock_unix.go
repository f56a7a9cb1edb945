//go:build unix

package outfile

import (
	"errors"
	"io/fs"
	"os"
	"syscall"
)

// renameOpenFile: the system renames a file that is open, so a temporary
// file keeps its lock until it is in place.
const renameOpenFile = true

// lockFile takes an exclusive advisory lock on f for as long as f is open;
// the system drops it when the process ends in any way, SIGKILL included.
// A file system without locks leaves the file unlocked (the process id in
// its name still protects it while the process lives).
func lockFile(f *os.File) { _ = syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB) }

// lockHeld reports whether a process holds the lock of the file at path. A
// file that cannot be opened counts as held (it is not ours to remove).
func lockHeld(path string) bool {
	f, err := os.Open(path)
	if err != nil {
		return true
	}
	defer f.Close()
	if err := syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB); err != nil {
		return errors.Is(err, syscall.EWOULDBLOCK) || errors.Is(err, syscall.EAGAIN)
	}
	_ = syscall.Flock(int(f.Fd()), syscall.LOCK_UN)
	return false
}

// processAlive reports whether a process with this id exists (signal 0
// checks without sending; EPERM means it exists under another user).
func processAlive(pid int) bool {
	err := syscall.Kill(pid, 0)
	return err == nil || errors.Is(err, syscall.EPERM)
}

// ownedByMe reports whether the file belongs to the user running the tool.
func ownedByMe(fi fs.FileInfo) bool {
	st, ok := fi.Sys().(*syscall.Stat_t)
	return !ok || int(st.Uid) == os.Getuid()
}
