//go:build !unix

package assess

// processCPU reports no CPU time where getrusage is not available.
func processCPU() (float64, bool) { return 0, false }
