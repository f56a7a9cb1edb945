package inventory

import (
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"testing"
)

// strictXMLSound reports whether encoding/xml's strict decoder reads b to
// its end with one root element closed, in UTF-8 and without a DOCTYPE
// (which xmlTok refuses on purpose: a workbook never needs one).
func strictXMLSound(b []byte) bool {
	d := xml.NewDecoder(bytes.NewReader(b))
	d.Strict = true
	d.CharsetReader = func(label string, r io.Reader) (io.Reader, error) { return nil, errors.New("not checked") }
	depth, elements := 0, 0
	for {
		tok, err := d.Token()
		if err == io.EOF {
			return depth == 0 && elements > 0
		}
		if err != nil {
			return false
		}
		switch e := tok.(type) {
		case xml.StartElement:
			depth++
			elements++
		case xml.EndElement:
			depth--
		case xml.Directive:
			return false
		case xml.ProcInst:
			if e.Target == "xml" && bytes.Contains(bytes.ToLower(e.Inst), []byte("encoding")) &&
				!bytes.Contains(bytes.ToLower(e.Inst), []byte("utf-8")) {
				return false
			}
		}
	}
}

// quickSound reports whether xmlTok reads b to its end.
func quickSound(b []byte) bool {
	x := newXMLTok(bytes.NewReader(b))
	for {
		k, err := x.next()
		if err != nil {
			return false
		}
		if k == tokEOF {
			return true
		}
	}
}

// xmlTok is never surer than encoding/xml: every part it passes, the strict
// decoder passes too. Cases are
// hand-written XML and every cut and one-byte change of a small sheet part.
// Source: W3C XML 1.0 (Fifth Edition), 2.2 (Char: the allowed characters),
// 2.4 (]]> in character data), 4.1 (character and entity references), and
// the behaviour of Go's encoding/xml strict decoder, which the test runs.
func TestXMLTokNeverSurerThanDecoder(t *testing.T) {
	sheet := `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" +
		`<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>` +
		`<row r="1"><c r="A1" t="s"><v>0</v></c><c r="B1"><v>1.5</v></c></row>` +
		`<row r="2"><c r="A2" t="inlineStr"><is><t>a &amp; b &#xA; µ &lt;x&gt;</t></is></c><c r="XFE2"><v>1</v></c></row>` +
		`</sheetData></worksheet>`
	cases := []string{
		sheet,
		`<a/>`, `<a></a>`, `</a><a>`, `<a>`, `<a x=1/>`, `<a x/>`, `<a x="<"/>`, `<a>]]></a>`, `<a>]]</a>`,
		`<a>&bogus;</a>`, `<a>&#0;</a>`, `<a>&#xD800;</a>`, `<a>&#65;</a>`, `<a>&#;</a>`, `<a>&#X41;</a>`,
		"<a>\x01</a>", "<a>\xff</a>", "<a>\xef\xbf\xbe</a>", `<a:b:c/>`, `<:c/>`, `<c:/>`, `<x:c r="XFE1"/>`,
		`<?xml version="1.1"?><a/>`, `<?xml version="1.0" encoding="UTF-16"?><a/>`, `<!-- c --><a/>`,
		`<a b="1"c="2"/>`, `<a></a >`, `<a></a b>`, `<1a/>`, `<a>text`, "\ufeff<a/>",
	}
	for i := 0; i <= len(sheet); i += 7 {
		cases = append(cases, sheet[:i])
	}
	for i := 0; i < len(sheet); i += 3 {
		for _, c := range []byte{'<', '>', '&', '"', '/', ' ', 0, 0xC3, 'Z'} {
			b := []byte(sheet)
			b[i] = c
			cases = append(cases, string(b))
		}
	}
	sure := 0
	for _, c := range cases {
		q := quickSound([]byte(c))
		if q {
			sure++
		}
		if q && !strictXMLSound([]byte(c)) {
			t.Errorf("xmlTok passes what encoding/xml refuses: %q", short(c, 200))
		}
	}
	// A tenth is a floor invented for the demo: most one-byte changes break the XML.
	if !quickSound([]byte(sheet)) || sure < len(cases)/10 {
		t.Errorf("xmlTok passes %d of %d cases (and the plain sheet: %v); it should pass plain parts", sure, len(cases), quickSound([]byte(sheet)))
	}
}

// FuzzXMLTok: whatever the bytes, xmlTok passes a part only when the strict
// decoder does too.
func FuzzXMLTok(f *testing.F) {
	for _, s := range []string{
		`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>` + "\n" + `<worksheet><sheetData><row r="1"><c r="A1" t="s"><v>0</v></c></row></sheetData></worksheet>`,
		`<sst count="1"><si><t>a &amp; b&#xA;</t></si></sst>`, `<a/>`, `<x:c r="XFE1"/>`, `<a>]]></a>`,
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, b []byte) {
		if quickSound(b) && !strictXMLSound(b) {
			t.Errorf("xmlTok passes what encoding/xml refuses: %q", short(string(b), 200))
		}
	})
}
