package inventory

import (
	"errors"
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"

	"golang.org/x/text/unicode/norm"
	"golang.org/x/text/unicode/runenames"
)

// Identifiers (object, station and atmosphere IDs, material names, and the
// references to them) are compared as the surveyor sees them. Text is read
// in Unicode normalisation form C, so that "Ü" typed as one character and as
// U followed by a combining diaeresis is one ID. A character that cannot be
// seen or that reorders what is seen (a zero-width space, a bidirectional
// control, another control or formatting character, a space other than the
// ordinary one) would make two IDs that look the same different, and an ID
// that is a spreadsheet error value (#N/A) is the trace of a failed formula
// or paste: both are refused where they stand, the character named by its
// code point and Unicode name.

// ErrIDCharacter: an ID or reference holds a character that cannot be seen
// or that changes how the text around it is shown.
var ErrIDCharacter = errors.New("invisible or control character in an ID")

// ErrErrorValueID: an ID or reference is a spreadsheet error value.
var ErrErrorValueID = errors.New("spreadsheet error value as an ID")

// spreadsheetErrors are the error values a spreadsheet shows in a cell whose
// formula failed, upper-cased.
// Source: ECMA-376 Part 1, 18.17.2 (the seven error values #DIV/0!, #N/A,
// #NAME?, #NULL!, #NUM!, #REF!, #VALUE!), from memory; #GETTING_DATA and the
// dynamic-array and data-type errors (#SPILL!, #CALC!, #FIELD!, #BLOCKED!,
// #CONNECT!, #BUSY!, #UNKNOWN!, #PYTHON!) are newer spreadsheet versions', from memory.
var spreadsheetErrors = map[string]bool{
	"#DIV/0!": true, "#N/A": true, "#NAME?": true, "#NULL!": true, "#NUM!": true, "#REF!": true, "#VALUE!": true,
	"#GETTING_DATA": true, "#SPILL!": true, "#CALC!": true, "#FIELD!": true, "#BLOCKED!": true,
	"#CONNECT!": true, "#BUSY!": true, "#UNKNOWN!": true, "#PYTHON!": true,
}

// IsSpreadsheetError reports whether s (spaces trimmed, any letter case) is a
// spreadsheet error value such as #N/A or #REF!.
func IsSpreadsheetError(s string) bool {
	s = strings.TrimSpace(s)
	if len(s) < 4 || s[0] != '#' {
		return false // every ID that is no error value, without allocating
	}
	return spreadsheetErrors[strings.ToUpper(s)]
}

// NormalizeText returns s in Unicode normalisation form C (s itself when it
// already is, as ASCII always is).
func NormalizeText(s string) string { return norm.NFC.String(s) }

// idCharKind says why a character may not stand in an ID ("" when it may).
func idCharKind(r rune) string {
	switch {
	case r == ' ':
		return ""
	case r == '\u200b' || r == '\u200c' || r == '\u200d' || r == '\u2060' || r == '\ufeff':
		return "a zero-width character"
	case r == '\u061c' || r == '\u200e' || r == '\u200f' || (r >= '\u202a' && r <= '\u202e') || (r >= '\u2066' && r <= '\u2069'):
		return "a bidirectional control, which reorders the text around it"
	case unicode.Is(unicode.Cc, r):
		return "a control character"
	case unicode.Is(unicode.Cf, r):
		return "an invisible formatting character"
	case unicode.Is(unicode.Zs, r):
		return "a space other than the ordinary space"
	case unicode.Is(unicode.Zl, r) || unicode.Is(unicode.Zp, r):
		return "a line or paragraph separator"
	case unicode.Is(unicode.Variation_Selector, r) || unicode.Is(unicode.Other_Default_Ignorable_Code_Point, r):
		return "an invisible character"
	case r == utf8.RuneError:
		return "the replacement character, left where text could not be decoded"
	}
	return ""
}

// RuneName names a character by its code point and Unicode name:
// "U+200B ZERO WIDTH SPACE"; a character without a name (the control
// characters) by its code point alone, "U+0007".
func RuneName(r rune) string {
	name := runenames.Name(r)
	if name == "" || strings.HasPrefix(name, "<") {
		return fmt.Sprintf("U+%04X", r)
	}
	return fmt.Sprintf("U+%04X %s", r, name)
}

// idFault describes the first character of id that may not stand in an ID:
// its name, why, and its position counted in characters from 1.
func idFault(id string) (msg string, ok bool) {
	pos := 0
	for _, r := range id {
		pos++
		if why := idCharKind(r); why != "" {
			return fmt.Sprintf("%s at character %d, %s", RuneName(r), pos, why), true
		}
	}
	return "", false
}

// VisibleText returns s with every character that may not stand in an ID
// written as <U+XXXX>, so that a message shows where it is.
func VisibleText(s string) string {
	if _, bad := idFault(s); !bad {
		return s
	}
	var b strings.Builder
	for _, r := range s {
		if idCharKind(r) != "" {
			fmt.Fprintf(&b, "<U+%04X>", r)
		} else {
			b.WriteRune(r)
		}
	}
	return b.String()
}

// stripIDChars returns s as it looks: a space other than the ordinary one
// read as a space, every other character that may not stand in an ID left out.
func stripIDChars(s string) string {
	if _, bad := idFault(s); !bad {
		return s
	}
	return strings.TrimSpace(strings.Map(func(r rune) rune {
		switch {
		case idCharKind(r) == "":
			return r
		case unicode.Is(unicode.Zs, r):
			return ' '
		}
		return -1
	}, s))
}

// checkID records an error on the row when the ID or reference text in
// column col is a spreadsheet error value or holds a character that may not
// stand in an ID; what names it in the message ("ID", "station"). It
// reports whether the text may be used.
func (f *field) checkID(col, what, text string) bool {
	if IsSpreadsheetError(text) {
		f.errorf(col, ErrErrorValueID, "type the "+what+" itself; if the cell holds a formula, replace it by its text",
			"%s %q is a spreadsheet error value (a formula that failed, or a value pasted from one), not an ID; this row is rejected", what, text)
		return false
	}
	if msg, bad := idFault(text); bad {
		f.errorf(col, ErrIDCharacter, "retype it without that character (it often comes with text pasted from a web page, a PDF or another program)",
			"%s %q holds %s: two IDs that look the same could then differ; this row is rejected", what, short(VisibleText(text), 80), msg)
		return false
	}
	return true
}

// didYouMean words a suggestion so that it never reads exactly as what was
// typed: where the two differ in characters that may look alike or not be
// seen at all (anything but plain ASCII letters, digits and signs), those
// characters are named.
func didYouMean(typed, near string) string {
	s := fmt.Sprintf("did you mean %q?", near)
	if d := lookAlikeDifference(typed, near); d != "" {
		s += " (" + d + ")"
	}
	return s
}

// lookAlikeDifference names the characters in which typed differs from near
// when that difference may be invisible; "" when it shows plainly.
func lookAlikeDifference(typed, near string) string {
	a, b := []rune(typed), []rune(near)
	i := 0
	for i < len(a) && i < len(b) && a[i] == b[i] {
		i++
	}
	j := 0
	for j < len(a)-i && j < len(b)-i && a[len(a)-1-j] == b[len(b)-1-j] {
		j++
	}
	da, db := a[i:len(a)-j], b[i:len(b)-j]
	plain := func(rs []rune) bool {
		for _, r := range rs {
			if r < '!' || r > '~' {
				return false
			}
		}
		return true
	}
	if plain(da) && plain(db) {
		return ""
	}
	names := func(rs []rune) string {
		var out []string
		for _, r := range rs {
			out = append(out, RuneName(r))
		}
		return strings.Join(out, ", ")
	}
	switch {
	case len(db) == 0:
		return fmt.Sprintf("what was typed also holds %s at character %d", names(da), i+1)
	case len(da) == 0:
		return fmt.Sprintf("what was typed lacks %s at character %d", names(db), i+1)
	}
	return fmt.Sprintf("what was typed has %s at character %d where the suggestion has %s", names(da), i+1, names(db))
}
