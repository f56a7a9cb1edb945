package inventory

import (
	"bytes"
	"testing"
)

// The optional Site ID item is read as written, under its name in any case;
// a survey without it has none (the demo).
func TestSiteID(t *testing.T) {
	for _, c := range []struct{ item, value, want string }{
		{"Site ID", "OST-C2", "OST-C2"}, // invented for the demo
		{"site id", " OST-C2 ", "OST-C2"},
		{"", "", ""},
	} {
		sh := DemoSurvey().Clone()
		if c.item != "" {
			site := sh.Sheet(SheetSite)
			site.Rows = append(site.Rows, []any{c.item, c.value})
		}
		var buf bytes.Buffer
		if err := WriteSurvey(&buf, sh); err != nil {
			t.Fatal(err)
		}
		s, err := Read(buf.Bytes(), "site-id.xlsx", ReadOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if s.Site.ID != c.want {
			t.Errorf("%q = %q: Site.ID %q, want %q", c.item, c.value, s.Site.ID, c.want)
		}
		for _, p := range s.Problems {
			if p.Sheet == SheetSite {
				t.Errorf("%q: problem on the Site sheet: %+v", c.item, p)
			}
		}
	}
}
