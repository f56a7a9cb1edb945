package audit

import (
	"bytes"
	"regexp"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/report/assess"
)

// testHumidity is a humidity grid for the hand-made audit (invented for the
// demo): S1 clears from 60 % RH on, S2 never does, S3 is always clear.
func testHumidity() *HumidityGrid {
	I, M, N := assess.Incendive, assess.Marginal, assess.NonIncendive
	return &HumidityGrid{
		RH: []float64{20, 40, 60, 80},
		Stations: []HumidityStation{
			{ID: "S1", Verdicts: []assess.Verdict{I, M, N, N}, Text: "non-incendive from 60 % RH on (still marginal at 40 %)"},
			{ID: "S2", Verdicts: []assess.Verdict{I, I, I, I}, Text: "humidity alone never gets it there: still incendive at 80 % RH"},
			{ID: "S3", Verdicts: []assess.Verdict{N, N, N, N}, Text: "non-incendive over the whole range (20-80 % RH)"},
		},
	}
}

// htmlAudit is the hand-made audit with one object made borderline (invented
// for the demo): O3 is incendive at its point estimate, but its samples make
// marginal the more likely verdict (55 %: a median 0.2 mJ just below the
// MIE 0.24 mJ, a long tail up to 12 mJ), so plot (c) draws it.
func htmlAudit() *assess.Audit {
	a := testAudit()
	for i := range a.Objects {
		if a.Objects[i].Object.ID == "O3" {
			a.Objects[i].Probability = &assess.Probability{Samples: 1000, Incendive: 0.45, Marginal: 0.55, EnergyP05: 5e-5, EnergyP50: 2e-4, EnergyP95: 1.2e-2}
		}
	}
	return a
}

func testHTML(t *testing.T) []byte {
	t.Helper()
	var b bytes.Buffer
	if err := WriteHTML(&b, htmlAudit(), RunInfo{ToolVersion: "test", CommandLine: "sparkmargin assess demo-plant.xlsx --html report.html"}, testHumidity()); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

func TestHTMLGolden(t *testing.T) {
	golden(t, "audit.golden.html", testHTML(t))
}

func TestHTMLDeterministic(t *testing.T) {
	if a, b := testHTML(t), testHTML(t); !bytes.Equal(a, b) {
		t.Fatal("two runs gave different HTML")
	}
}

// TestHTMLSelfContained: the report fetches nothing: no URL, no src or href
// to a file, no script, no @import; and it names the cautions.
func TestHTMLSelfContained(t *testing.T) {
	h := string(testHTML(t))
	for _, re := range []*regexp.Regexp{
		regexp.MustCompile(`(?i)https?:`), regexp.MustCompile(`(?i)\bsrc\s*=`), regexp.MustCompile(`(?i)\bhref\s*=`),
		regexp.MustCompile(`(?i)<script`), regexp.MustCompile(`(?i)@import`), regexp.MustCompile(`(?i)url\(`),
		regexp.MustCompile(`(?i)<link\b`), regexp.MustCompile(`(?i)<img\b`), regexp.MustCompile(`(?i)<iframe\b`),
	} {
		if m := re.FindString(h); m != "" {
			t.Errorf("the report holds %q: it must not fetch anything", m)
		}
	}
	for _, want := range []string{"screening estimate", "hazardous-area classification", "competent person", "Riverside Films Works", "@media print"} {
		if !strings.Contains(h, want) {
			t.Errorf("the report does not say %q", want)
		}
	}
}

// TestHTMLEscapes: text from the survey is escaped, never markup.
func TestHTMLEscapes(t *testing.T) {
	a := htmlAudit()
	a.Survey.Site.Name = `<script>alert("x")</script> & Co`
	a.Stations[0].Station.Name = `<b onmouseover="x">hot</b>`
	for i := range a.Objects {
		if a.Objects[i].Station.ID == a.Stations[0].Station.ID {
			a.Objects[i].Object.ID = `<img src=x>`
		}
	}
	var b bytes.Buffer
	if err := WriteHTML(&b, a, RunInfo{}, testHumidity()); err != nil {
		t.Fatal(err)
	}
	h := b.String()
	for _, bad := range []string{"<script>", "<b onmouseover", "<img src"} {
		if strings.Contains(h, bad) {
			t.Errorf("survey text %q reached the HTML unescaped", bad)
		}
	}
	if !strings.Contains(h, "&lt;script&gt;") {
		t.Error("the site name is not in the HTML, escaped")
	}
}
