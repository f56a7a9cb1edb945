package book

import (
	"fmt"

	"github.com/xuri/excelize/v2"
)

// Cell is one workbook cell before styling: a value (string, float64, int or
// nil for an empty cell) and how to show it.
type Cell struct {
	V      any
	NumFmt string // number format; "" for text
	// Mark is the provenance mark shown after a number in its own cell ("est."
	// for an estimate, "lib.", "ent.", "ovr."; "" none): the cell stays a
	// number. An estimate is also set in italics.
	Mark string
	// Fill and Color, when Fill is set, colour the cell as a state (a
	// verdict): pattern fill, bold centred text in Color.
	Fill, Color string
	Wrap        bool
	Bold        bool
	Align       string // "", "center", "left", "right"
}

// Styled reports whether the cell needs a style even when empty.
func (c Cell) Styled() bool { return c.V != nil || c.NumFmt != "" || c.Fill != "" }

// Text, WrapText, BoldText and Integer are plain cells.
func Text(s string) Cell     { return Cell{V: s} }
func WrapText(s string) Cell { return Cell{V: s, Wrap: true} }
func BoldText(s string) Cell { return Cell{V: s, Bold: true} }
func Integer(n int) Cell     { return Cell{V: n, NumFmt: "0", Align: "center"} }

// Code is a short code (zone, group, severity), centred; "" is an empty cell.
func Code(s string) Cell {
	if s == "" {
		return Cell{}
	}
	return Cell{V: s, Align: "center"}
}

// Quantity returns the cell of an SI value shown in unit u; NaN is an empty cell.
func Quantity(u Unit, si float64) Cell {
	c := Cell{V: u.Cell(si), NumFmt: u.NumFmt()}
	if v, ok := u.Display(si); ok && u == UnitRatio {
		// A ratio shows three significant digits, as the terminal and JSON
		// readers see it (FormatRatio): 0.333, 25.0, 0.0065.
		c.NumFmt = SigNumFmt(v, 3)
	}
	return c
}

// OptText returns an empty cell for "".
func OptText(s string) Cell {
	if s == "" {
		return Cell{}
	}
	return Text(s)
}

// styleKey identifies a cell style; styles are created once per workbook and reused.
type styleKey struct {
	numFmt  string
	mark    string
	fill    string // state colour ("" none) and its text colour
	color   string
	wrap    bool
	bold    bool
	header  bool
	title   int // 0 none, 1 title, 2 section
	caution bool
	align   string
}

// Styles creates and caches the style IDs of one workbook (no package state).
type Styles struct {
	f     *excelize.File
	cache map[styleKey]int
	err   error
}

// NewStyles returns the style cache of workbook f.
func NewStyles(f *excelize.File) *Styles {
	return &Styles{f: f, cache: map[styleKey]int{}}
}

func (s *Styles) get(k styleKey) int {
	if id, ok := s.cache[k]; ok {
		return id
	}
	st := &excelize.Style{Alignment: &excelize.Alignment{Vertical: "top", WrapText: k.wrap, Horizontal: k.align}}
	font := &excelize.Font{Family: "Liberation Sans", Size: 10, Bold: k.bold}
	if k.numFmt != "" {
		nf := k.numFmt
		if k.mark != "" {
			nf = MarkFormat(nf, k.mark)
			font.Italic = k.mark == EstMark
		}
		st.CustomNumFmt = &nf
	}
	if k.fill != "" {
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{k.fill}}
		font.Color = k.color
		font.Bold = true
		st.Alignment.Horizontal = "center"
	}
	if k.header {
		font.Bold = true
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"E7E6E6"}}
		st.Alignment.WrapText = true
		st.Alignment.Vertical = "bottom"
		st.Alignment.Horizontal = "center"
		st.Border = []excelize.Border{{Type: "bottom", Color: "404040", Style: 2}}
	}
	switch k.title {
	case 1:
		font.Size = 16
		font.Bold = true
	case 2:
		font.Size = 12
		font.Bold = true
		st.Border = []excelize.Border{{Type: "bottom", Color: "404040", Style: 1}}
	}
	if k.caution {
		font.Bold = true
		font.Color = "000000"
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"FFF2CC"}}
		st.Alignment.WrapText = true
	}
	st.Font = font
	id, err := s.f.NewStyle(st)
	if err != nil && s.err == nil {
		s.err = fmt.Errorf("create cell style: %w", err)
	}
	s.cache[k] = id
	return id
}

// Of returns the style of a cell.
func (s *Styles) Of(c Cell) int {
	k := styleKey{numFmt: c.NumFmt, mark: c.Mark, wrap: c.Wrap, bold: c.Bold, align: c.Align}
	if c.Fill != "" {
		k.fill, k.color = c.Fill, c.Color
	}
	return s.get(k)
}

// Header, Title, Section and Caution return the styles of a table header, a
// sheet title, a section heading and a caution band.
func (s *Styles) Header() int  { return s.get(styleKey{header: true}) }
func (s *Styles) Title() int   { return s.get(styleKey{title: 1}) }
func (s *Styles) Section() int { return s.get(styleKey{title: 2}) }
func (s *Styles) Caution() int { return s.get(styleKey{caution: true}) }

// Err returns the first error creating a style.
func (s *Styles) Err() error { return s.err }

// EstMark is the mark of an estimated value.
const EstMark = "est."

// EstFormat appends the "est." marker to every section of a number format, so
// an estimated value reads "200.0 est." in its own cell and stays a number.
func EstFormat(nf string) string { return MarkFormat(nf, EstMark) }

// MarkFormat appends a provenance mark to every section of a number format.
func MarkFormat(nf, mark string) string {
	out := ""
	sect := ""
	for _, r := range nf + ";" {
		if r == ';' {
			if out != "" {
				out += ";"
			}
			out += sect + `" ` + mark + `"`
			sect = ""
			continue
		}
		sect += string(r)
	}
	return out
}
