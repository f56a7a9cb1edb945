package library

import (
	"bytes"
	"regexp"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/sparkmargin/sparkmargin/model"
)

// TestLibraryText: the plain library fits a 100-column terminal, names no
// limit by its internal field name, gives every limit a line, and writes
// values in the Site sheet's practical units.
func TestLibraryText(t *testing.T) {
	var b bytes.Buffer
	WriteText(&b, nil)
	out := b.String()
	for i, line := range strings.Split(out, "\n") {
		if n := utf8.RuneCountInString(line); n > libraryWidth {
			t.Errorf("line %d has %d characters (at most %d): %q", i+1, n, libraryWidth, line)
		}
	}
	camel := regexp.MustCompile(`\b[A-Z][a-z]+[A-Z][a-z]`)
	if m := camel.FindString(out); m != "" {
		t.Errorf("an internal CamelCase name is shown: %q", m)
	}
	rows := 0
	for _, line := range strings.Split(out, "\n") {
		if strings.HasSuffix(strings.TrimSpace(line), "]") && strings.Contains(line, "  [") && !strings.HasPrefix(line, "  [") {
			rows++
		}
	}
	if want := len(model.LimitSources()); rows < want {
		t.Errorf("%d table rows with a source, want at least the %d limits", rows, want)
	}
	// Values as the Site sheet takes them. Source: the defaults listed in
	// SAFETY.md and the README (shock 350 mJ, conductor earthing 1e6 ohm,
	// person earthing 1e8 ohm, IIB transferred charge 25 nC).
	for _, want := range []string{
		`Shock energy +350 mJ `,
		`Conductor earthing limit +1 MΩ `,
		`Person earthing limit +100 MΩ `,
		`Transferred charge IIB +25 nC `,
	} {
		if !regexp.MustCompile(`(?m)^` + want).MatchString(out) {
			t.Errorf("no line matching %q", want)
		}
	}
}

func TestLibraryWords(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"BrushChargeDensity[other]", "Brush charge density [other]"},
		{"CoatingThicknessIIC", "Coating thickness IIC"},
		{"PersonEarthingMIE", "Person earthing MIE"},
		{"MaxChargingCurrent", "Max charging current"},
		{"AirBreakdown", "Air breakdown"},
	} {
		if got := limitWords(c.in); got != c.want {
			t.Errorf("limitWords(%q) = %q, want %q", c.in, got, c.want)
		}
	}
	for _, c := range []struct {
		v    float64
		unit string
		want string
	}{
		{1e6, "Ω", "1 MΩ"},
		{1e8, "ohm", "100 MΩ"},
		{1e13, "Ω", "10 TΩ"},
		{470, "Ω", "470 Ω"},
		{350, "mJ", "350 mJ"},
		{0.4, "", "0.4"},
		{1e10, "Ω·m", "1e10 Ω·m"},
	} {
		if got := quantityText(c.v, c.unit); got != c.want {
			t.Errorf("quantityText(%g, %q) = %q, want %q", c.v, c.unit, got, c.want)
		}
	}
}
