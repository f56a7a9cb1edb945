//go:build unix

package assess

import "syscall"

// processCPU returns the CPU time (user + system, seconds) this process has
// used so far, and true.
func processCPU() (float64, bool) {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0, false
	}
	tv := func(t syscall.Timeval) float64 { return float64(t.Sec) + float64(t.Usec)/1e6 }
	return tv(ru.Utime) + tv(ru.Stime), true
}
