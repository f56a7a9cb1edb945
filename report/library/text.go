package library

import (
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"
	"unicode"
	"unicode/utf8"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
)

// The plain-text library: three tables in the practical units a surveyor
// writes on the Site and Materials sheets (mJ, nC, µC/m², kV/m, MΩ...), each
// line under libraryWidth characters; the sources, long and shared by many
// rows, are numbered notes under each table.

// libraryWidth is the longest line the text library writes (a terminal of
// 100 columns; the test checks it).
const libraryWidth = 100

// notes numbers texts in order of first use.
type notes struct {
	list  []string
	index map[string]int
}

func (n *notes) ref(text string) string {
	if n.index == nil {
		n.index = map[string]int{}
	}
	i, ok := n.index[text]
	if !ok {
		n.list = append(n.list, text)
		i = len(n.list)
		n.index[text] = i
	}
	return fmt.Sprintf("[%d]", i)
}

// write prints the notes, each wrapped to libraryWidth under its number.
func (n *notes) write(out io.Writer) {
	for i, t := range n.list {
		lead := fmt.Sprintf("  [%d] ", i+1)
		for j, line := range wrapWords(t, libraryWidth-len(lead)) {
			if j > 0 {
				lead = strings.Repeat(" ", len(lead))
			}
			fmt.Fprintln(out, lead+line)
		}
	}
}

// wrapWords breaks text into lines of at most width characters at spaces (a
// longer word stands alone on its line).
func wrapWords(text string, width int) []string {
	var lines []string
	line := ""
	for _, w := range strings.Fields(text) {
		if line != "" && utf8.RuneCountInString(line)+1+utf8.RuneCountInString(w) > width {
			lines = append(lines, line)
			line = ""
		}
		if line != "" {
			line += " "
		}
		line += w
	}
	return append(lines, line)
}

// siDisplay is the practical unit of a limit no Site item sets, by its SI unit.
func siDisplay(si string, v float64) book.Unit {
	switch si {
	case "J":
		return book.UnitMJ
	case "C":
		return book.UnitNC
	case "C/m^2":
		return book.UnitUCPerM2
	case "m^2":
		return book.UnitCM2
	case "V/m":
		return book.UnitKVPerM
	case "S/m":
		return book.UnitPSPerM
	case "A":
		return book.UnitUA
	case "F":
		return book.UnitPF
	case "C/kg":
		return book.UnitUCPerKg
	case "ohm":
		return book.UnitOhm
	case "ohm m":
		return book.UnitOhmM
	case "m^2/s":
		return book.UnitM2PerS
	case "m^3":
		return book.UnitCubicMetre
	case "V":
		return book.UnitVolt
	case "s":
		return book.UnitSecond
	case "m/s":
		return book.UnitMPerS
	case "m":
		if math.Abs(v) < 0.1 {
			return book.UnitMillimetre
		}
		return book.UnitMetre
	}
	return book.UnitDimless
}

// ohmPrefixes are the prefixes a resistance is written with: 1 MΩ, 100 GΩ.
var ohmPrefixes = []struct {
	p     string
	scale float64
}{{"T", 1e12}, {"G", 1e9}, {"M", 1e6}, {"k", 1e3}}

// plain is v to 3 significant digits without trailing zeros (book.FormatSigTrim).
func plain(v float64) string { return book.FormatSigTrim(v, 3) }

// unitText writes an SI value in a display unit, trimmed: "20 kV/mm".
func unitText(u book.Unit, si float64) string {
	v, ok := u.Display(si)
	if !ok {
		return "–"
	}
	return quantityText(v, u.Label())
}

// quantityText writes v (in unit) as a surveyor writes it on the Site sheet;
// a resistance takes an SI prefix ("1 MΩ", as a cell may say).
func quantityText(v float64, unit string) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "–"
	}
	if unit == "Ω" || unit == "ohm" {
		for _, p := range ohmPrefixes {
			if math.Abs(v) >= p.scale {
				return plain(v/p.scale) + " " + p.p + "Ω"
			}
		}
		unit = "Ω"
	}
	s := plain(v)
	if unit == "" {
		return s
	}
	return s + " " + unit
}

// limitWords turns a limit's field name into words, keeping acronyms:
// "BrushChargeDensity[other]" -> "Brush charge density [other]",
// "CoatingThicknessIIC" -> "Coating thickness IIC".
func limitWords(name string) string {
	base, idx, _ := strings.Cut(name, "[")
	rs := []rune(base)
	var words []string
	start := 0
	for i := 1; i <= len(rs); i++ {
		// A word ends before an upper-case letter that starts a new word:
		// after a lower-case letter, or inside an acronym before "Xy".
		if i == len(rs) || (unicode.IsUpper(rs[i]) && (unicode.IsLower(rs[i-1]) ||
			(i+1 < len(rs) && unicode.IsUpper(rs[i-1]) && unicode.IsLower(rs[i+1])))) {
			words = append(words, string(rs[start:i]))
			start = i
		}
	}
	for i, w := range words {
		if i > 0 && utf8.RuneCountInString(w) > 1 && strings.ToUpper(w) == w {
			continue // an acronym: IIC, MIE
		}
		if i > 0 {
			words[i] = strings.ToLower(w)
		}
	}
	out := strings.Join(words, " ")
	if idx != "" {
		out += " [" + idx
	}
	return out
}

// itemWords writes a Site item's matched name as it is typed on the sheet:
// "transferred charge iib" -> "Transferred charge IIB".
func itemWords(name string) string {
	words := strings.Fields(name)
	for i, w := range words {
		switch w {
		case "iia", "iib", "iic", "iii", "ibc", "mie", "vd", "c":
			words[i] = strings.ToUpper(w)
		}
	}
	s := strings.Join(words, " ")
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// Tabber makes the aligned-table writer of a table of out and the function
// that flushes it (the terminal's own, which spells µ and Ω in ASCII where
// the console cannot show them, before the columns are aligned).
type Tabber func(out io.Writer) (w io.Writer, flush func())

// plainTabs is a Tabber with no console translation.
func plainTabs(out io.Writer) (io.Writer, func()) {
	tw := tabwriter.NewWriter(out, 0, 0, 2, ' ', 0)
	return tw, func() { _ = tw.Flush() }
}

// WriteText writes the library as plain text in the Site sheet's practical
// units, each line under libraryWidth characters; tabbed aligns its tables
// (nil: a plain tabwriter).
func WriteText(out io.Writer, tabbed Tabber) {
	if tabbed == nil {
		tabbed = plainTabs
	}
	fmt.Fprintln(out, "Materials: surface resistivity at 50 % RH; a survey's Materials sheet overrides a built-in")
	fmt.Fprintln(out, "of the same name. Slope: decades of surface resistivity per 10 %RH.")
	var n notes
	tw, flush := tabbed(out)
	fmt.Fprintln(tw, "Name\tClass\tεr\tSurface\tSlope\tVolume\tBreakdown\tSource")
	for _, m := range inventory.BuiltinMaterials() {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", m.Name, m.Class, plain(m.Permittivity),
			unitText(book.UnitOhmSq, m.SurfaceResistivity), plain(m.HumiditySlope), unitText(book.UnitOhmM, m.VolumeResistivity),
			unitText(book.UnitKVPerMM, m.BreakdownStrength), n.ref(m.Source))
	}
	flush()
	n.write(out)

	fmt.Fprintln(out, "\nSubstances: MIE and group; conductivity and permittivity of the liquid")
	n = notes{}
	tw, flush = tabbed(out)
	fmt.Fprintln(tw, "Name\tKind\tMIE\tGroup\tConductivity\tεr\tSource")
	for _, s := range inventory.BuiltinSubstances() {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\n", s.Name, s.Kind, unitText(book.UnitMJ, s.MIE), s.Group,
			unitText(book.UnitPSPerM, s.Conductivity), plain(s.Permittivity), n.ref(s.Source))
	}
	flush()
	n.write(out)

	fmt.Fprintln(out, "\nLimits applied by default, in the unit of the Site item that overrides each; write the")
	fmt.Fprintln(out, "item and a value on the Site sheet to override one (Shock energy [mJ] | 500). [M]: recalled,")
	fmt.Fprintln(out, "not confirmed against the standard's text here. *: no Site item overrides it.")
	n = notes{}
	used := map[string]bool{}
	tw, flush = tabbed(out)
	fmt.Fprintln(tw, "Limit (Site item)\tValue\t\tSource")
	for _, c := range model.LimitTable() {
		name, value := limitWords(c.Key)+" *", quantityText(c.Default, "")
		if k, ok := inventory.LimitItemNamed(c.SiteItem); ok && c.SiteItem != "" {
			used[k.Name] = true
			name = itemWords(k.Name)
			if v, ok := k.FromSI(c.Default); ok {
				value = quantityText(v, k.Unit)
			}
		} else {
			u := siDisplay(c.Unit, c.Default)
			if v, ok := u.Display(c.Default); ok {
				value = quantityText(v, u.Label())
			}
		}
		mark := ""
		if c.FromMemory {
			mark = "[M]"
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\n", name, value, mark, n.ref(c.Source()))
	}
	flush()
	n.write(out)

	var several []string
	for _, k := range inventory.LimitItems() {
		if !used[k.Name] {
			several = append(several, itemWords(k.Name)+" ["+k.Unit+"]")
		}
	}
	if len(several) > 0 {
		fmt.Fprintln(out, "\nSite items that set several of the limits above at once (a narrower item wins):")
		for _, line := range wrapWords(strings.Join(several, "; "), libraryWidth-2) {
			fmt.Fprintln(out, "  "+line)
		}
	}
	fmt.Fprintln(out, "\nReferences (the sources above cite them by key)")
	for _, r := range model.References() {
		head := r.Key
		if r.Edition != "" {
			head += ", " + r.Edition
		}
		fmt.Fprintln(out, "  "+head)
		for _, line := range wrapWords(r.Title, libraryWidth-6) {
			fmt.Fprintln(out, "      "+line)
		}
	}
	fmt.Fprintln(out, "\nThe survey contract, with the uncertainty items: inventory/SURVEY.md.")
	fmt.Fprintln(out)
	for _, line := range wrapWords(templates.CautionLine, libraryWidth) {
		fmt.Fprintln(out, line)
	}
}
