package main

import (
	"io"
	"os"
	"strings"
	"text/tabwriter"
	"unicode"
	"unicode/utf8"

	"golang.org/x/text/unicode/norm"
)

// The terminal text spells units as the audit does (µC/m², MΩ, °C). A
// console that cannot show those signs gets them in ASCII instead ("ASCII
// mode": uC/m^2, Mohm, degC), on the terminal text only: workbooks, JSON
// files and JSON on standard output keep the proper signs.
//
// ASCII mode is on with --ascii or SPARKMARGIN_ASCII=1, off with
// SPARKMARGIN_ASCII=0, and otherwise decided by the system (nativeASCII):
// never on macOS and Linux, whose terminals take UTF-8; on Windows, never
// for a console (the program writes a console in Unicode, whatever its code
// page), and for output redirected to a pipe or a file only when the
// console's output code page is not UTF-8, since the program reading it
// (Windows PowerShell 5.1, findstr, more) decodes it with that code page.

// asciiEnv is the environment variable that sets ASCII mode.
const asciiEnv = "SPARKMARGIN_ASCII"

// asciiMode decides ASCII mode from the --ascii flag, the environment
// variable's value and, when neither says, the system's own answer.
func asciiMode(flag bool, env string, native func() bool) bool {
	if flag {
		return true
	}
	switch strings.ToLower(strings.TrimSpace(env)) {
	case "1", "true", "yes", "on":
		return true
	case "0", "false", "no", "off":
		return false
	}
	return native != nil && native()
}

// asciiSpellings are the signs of the terminal text and their ASCII
// spelling, units first (the survey reads every one of these spellings back:
// "1 Mohm", "3 uC/kg").
var asciiSpellings = strings.NewReplacer(
	"µ", "u", "μ", "u",
	"Ω·m", "ohm m", "Ω/sq", "ohm/sq", "Ω/□", "ohm/sq", "Ω", "ohm", "\u2126", "ohm",
	"°C", "degC", "°", "deg",
	"²", "^2", "³", "^3",
	"·", " ", "×", "x", "±", "+/-", "≥", ">=", "≤", "<=", "≈", "~", "→", "->",
	"–", "-", "—", "-", "…", "...", "‘", "'", "’", "'", "“", "\"", "”", "\"",
	"ε", "eps", "σ", "sigma", "□", "sq",
	"\u00a0", " ", "\u202f", " ", "\u2009", " ",
)

// toASCII spells s in ASCII: the signs above, letters with accents without
// them (Müller -> Muller), anything else as '?'.
func toASCII(s string) string {
	s = asciiSpellings.Replace(s)
	if isASCII(s) {
		return s
	}
	var b strings.Builder
	for _, r := range norm.NFD.String(s) {
		switch {
		case r < utf8.RuneSelf:
			b.WriteRune(r)
		case unicode.Is(unicode.Mn, r): // a combining accent: dropped
		default:
			b.WriteByte('?')
		}
	}
	return b.String()
}

func isASCII(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] >= utf8.RuneSelf {
			return false
		}
	}
	return true
}

// asciiWriter writes terminal text through toASCII while on() says so. A
// multi-byte character split between two writes is held back until it is
// whole.
type asciiWriter struct {
	w       io.Writer
	on      func() bool
	pending []byte
}

func (a *asciiWriter) Write(p []byte) (int, error) {
	if !a.on() {
		if len(a.pending) > 0 {
			if _, err := a.w.Write(a.pending); err != nil {
				return 0, err
			}
			a.pending = a.pending[:0]
		}
		return a.w.Write(p)
	}
	buf := append(a.pending, p...)
	// Hold back an incomplete character at the end.
	cut := len(buf)
	for i := len(buf) - 1; i >= 0 && i >= len(buf)-utf8.UTFMax; i-- {
		if utf8.RuneStart(buf[i]) {
			if !utf8.FullRune(buf[i:]) {
				cut = i
			}
			break
		}
	}
	if _, err := io.WriteString(a.w, toASCII(string(buf[:cut]))); err != nil {
		return 0, err
	}
	a.pending = append(a.pending[:0], buf[cut:]...)
	return len(p), nil
}

// rawOut returns the writer under an asciiWriter: JSON keeps its signs.
func rawOut(w io.Writer) io.Writer {
	if a, ok := w.(*asciiWriter); ok {
		return a.w
	}
	return w
}

// nativeASCIIFor asks the system about the file behind w (see nativeASCII);
// a writer that is no file (a test's buffer) takes UTF-8.
func nativeASCIIFor(w io.Writer) bool {
	f, ok := w.(*os.File)
	return ok && nativeASCII(f)
}

// tabbed returns a tabwriter on out whose cells are spelled in ASCII before
// they are measured when out is in ASCII mode, so that the columns stay
// aligned when "Ω" becomes "ohm"; flush ends the table.
func tabbed(out io.Writer) (w io.Writer, flush func()) {
	tw := tabwriter.NewWriter(out, 0, 0, 2, ' ', 0)
	if a, ok := out.(*asciiWriter); ok {
		return &asciiWriter{w: tw, on: a.on}, func() { _ = tw.Flush() }
	}
	return tw, func() { _ = tw.Flush() }
}
