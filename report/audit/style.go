package audit

import (
	"fmt"

	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/xuri/excelize/v2"
)

// Verdict colours carry the ISO 3864-1 safety meanings: red for danger
// (incendive), yellow for caution (marginal), green for a safe condition
// (non-incendive); not assessed is a neutral grey. Plain fills with the
// standard's contrast colours for the text (white on red and green, black on
// yellow and grey).
func verdictColours(v assess.Verdict) (fill, font string) {
	switch v {
	case assess.Incendive:
		return "C8102E", "FFFFFF"
	case assess.Marginal:
		return "FFD100", "000000"
	case assess.NonIncendive:
		return "00843D", "FFFFFF"
	}
	return "BFBFBF", "000000"
}

// cell is one workbook cell before styling: a value (string, float64, int or
// nil for an empty cell) and how to show it.
type cell struct {
	v         any
	numFmt    string // number format; "" for text
	est       bool   // the value was fed by an assumed default: shown with "est."
	verdict   bool   // colour by verdict
	verdictOf assess.Verdict
	wrap      bool
	bold      bool
	align     string // "", "center", "left", "right"
}

func text(s string) cell     { return cell{v: s} }
func wrapText(s string) cell { return cell{v: s, wrap: true} }
func boldText(s string) cell { return cell{v: s, bold: true} }
func integer(n int) cell     { return cell{v: n, numFmt: "0", align: "center"} }

// code is a short code (zone, group, severity), centred; "" is an empty cell.
func code(s string) cell {
	if s == "" {
		return cell{}
	}
	return cell{v: s, align: "center"}
}
func verdictCell(v assess.Verdict) cell {
	return cell{v: v.String(), verdict: true, verdictOf: v}
}

// quantity returns the cell of an SI value shown in unit u; NaN is an empty cell.
func quantity(u Unit, si float64) cell { return cell{v: u.Cell(si), numFmt: u.NumFmt()} }

// optText returns an empty cell for "".
func optText(s string) cell {
	if s == "" {
		return cell{}
	}
	return text(s)
}

// styleKey identifies a cell style; styles are created once per workbook and reused.
type styleKey struct {
	numFmt  string
	est     bool
	verdict int // 0 none, else verdict+1
	wrap    bool
	bold    bool
	header  bool
	title   int // 0 none, 1 title, 2 section
	caution bool
	align   string
}

// styles creates and caches the style IDs of one workbook (no package state).
type styles struct {
	f     *excelize.File
	cache map[styleKey]int
	err   error
}

func newStyles(f *excelize.File) *styles {
	return &styles{f: f, cache: map[styleKey]int{}}
}

func (s *styles) get(k styleKey) int {
	if id, ok := s.cache[k]; ok {
		return id
	}
	st := &excelize.Style{Alignment: &excelize.Alignment{Vertical: "top", WrapText: k.wrap, Horizontal: k.align}}
	font := &excelize.Font{Family: "Liberation Sans", Size: 10, Bold: k.bold}
	if k.numFmt != "" {
		nf := k.numFmt
		if k.est {
			nf = estFormat(nf)
			font.Italic = true
		}
		st.CustomNumFmt = &nf
	}
	if k.verdict > 0 {
		fill, fc := verdictColours(assess.Verdict(k.verdict - 1))
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fill}}
		font.Color = fc
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

// of returns the style of a cell.
func (s *styles) of(c cell) int {
	k := styleKey{numFmt: c.numFmt, est: c.est, wrap: c.wrap, bold: c.bold, align: c.align}
	if c.verdict {
		k.verdict = int(c.verdictOf) + 1
	}
	return s.get(k)
}

func (s *styles) header() int  { return s.get(styleKey{header: true}) }
func (s *styles) title() int   { return s.get(styleKey{title: 1}) }
func (s *styles) section() int { return s.get(styleKey{title: 2}) }
func (s *styles) caution() int { return s.get(styleKey{caution: true}) }

// estFormat appends the "est." marker to every section of a number format, so
// an estimated value reads "200.0 est." in its own cell and stays a number.
func estFormat(nf string) string {
	out := ""
	sect := ""
	for _, r := range nf + ";" {
		if r == ';' {
			if out != "" {
				out += ";"
			}
			out += sect + `" est."`
			sect = ""
			continue
		}
		sect += string(r)
	}
	return out
}
