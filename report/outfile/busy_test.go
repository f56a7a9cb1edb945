package outfile

import "testing"

// TestInUseCode: the Windows codes of a file open in another program.
// Source: Microsoft, "System Error Codes (0-499)".
func TestInUseCode(t *testing.T) {
	for code, want := range map[uintptr]bool{5: true, 32: true, 33: true, 2: false, 3: false, 112: false} {
		if got := inUseCode(code); got != want {
			t.Errorf("inUseCode(%d) = %v, want %v", code, got, want)
		}
	}
}
