package main

import (
	"bytes"
	"strings"
	"testing"
)

// The numbers in these tests are invented for the test (any value would do): only their unit
// signs are translated. The ASCII spellings are those the survey reader accepts (inventory units).

func TestASCIIMode(t *testing.T) {
	yes := func() bool { return true }
	no := func() bool { return false }
	for _, c := range []struct {
		flag   bool
		env    string
		native func() bool
		want   bool
	}{
		{false, "", no, false},
		{false, "", yes, true}, // the system says so (a Windows pipe on an OEM code page)
		{false, "", nil, false},
		{true, "", no, true},
		{true, "0", no, true}, // the flag wins
		{false, "1", no, true},
		{false, " Yes ", no, true},
		{false, "0", yes, false}, // the variable overrides the system
		{false, "off", yes, false},
		{false, "maybe", no, false},
	} {
		if got := asciiMode(c.flag, c.env, c.native); got != c.want {
			t.Errorf("asciiMode(%v, %q, native=%v) = %v, want %v", c.flag, c.env, c.native != nil && c.native(), got, c.want)
		}
	}
}

// TestToASCII: the spellings are ones the survey reads back ("1 Mohm",
// "uC/m^2", "ohm m" are units of inventory's unit table).
func TestToASCII(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"1 MΩ", "1 Mohm"},
		{"1 M\u2126", "1 Mohm"}, // the ohm sign U+2126
		{"400 µC", "400 uC"},
		{"250 µC/m²", "250 uC/m^2"},
		{"1e10 Ω·m", "1e10 ohm m"},
		{"1e12 Ω/sq", "1e12 ohm/sq"},
		{"20 °C", "20 degC"},
		{"0.38 m²/s", "0.38 m^2/s"},
		{"ratio ≥ 1 – see", "ratio >= 1 - see"},
		{"Müller, Śląsk", "Muller, Slask"},
		{"εr", "epsr"},
		{"水", "?"},
		{"plain", "plain"},
	} {
		if got := toASCII(c.in); got != c.want {
			t.Errorf("toASCII(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}

// TestASCIIWriterSplitRune: a character split between two writes is spelled
// once it is whole.
func TestASCIIWriterSplitRune(t *testing.T) {
	var b bytes.Buffer
	w := &asciiWriter{w: &b, on: func() bool { return true }}
	s := []byte("1 MΩ and 3 µA")
	i := bytes.Index(s, []byte("Ω")) + 1 // inside the two bytes of Ω
	if _, err := w.Write(s[:i]); err != nil {
		t.Fatal(err)
	}
	if _, err := w.Write(s[i:]); err != nil {
		t.Fatal(err)
	}
	if b.String() != "1 Mohm and 3 uA" {
		t.Errorf("got %q", b.String())
	}
	if rawOut(w) != &b {
		t.Error("rawOut does not give the writer underneath")
	}
}

// TestASCIIRun: --ascii and SPARKMARGIN_ASCII=1 make the terminal text pure
// ASCII; JSON on standard output keeps its signs.
func TestASCIIRun(t *testing.T) {
	nonASCII := func(s string) string {
		for _, r := range s {
			if r > 127 {
				return string(r)
			}
		}
		return ""
	}
	code, out, _ := runCLI(t, "library", "--ascii")
	if code != 0 || nonASCII(out) != "" || !strings.Contains(out, "1 Mohm") {
		t.Errorf("library --ascii: exit %d, non-ASCII %q", code, nonASCII(out))
	}
	code, out, _ = runCLI(t, "library")
	if code != 0 || !strings.Contains(out, "1 MΩ") {
		t.Errorf("library: exit %d, no 1 MΩ", code)
	}
	t.Setenv(asciiEnv, "1")
	code, out, _ = runCLI(t, "library")
	if code != 0 || nonASCII(out) != "" {
		t.Errorf("%s=1 library: exit %d, non-ASCII %q", asciiEnv, code, nonASCII(out))
	}
	code, out, _ = runCLI(t, "library", "--json")
	if code != 0 || !strings.Contains(out, "µC/m²") {
		t.Errorf("%s=1 library --json: exit %d, the JSON lost its signs", asciiEnv, code)
	}
}
