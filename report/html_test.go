package report

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/outfile"
	"github.com/sparkmargin/sparkmargin/report/rerun"
)

// TestHumidityGrid: the HTML report's humidity grid is the sweep's result
// over 10-90 % RH in 5 % steps (17 steps, the sweep command's default), one
// verdict per station and step in the sweep's station order, and each
// station's sentence of where it clears.
func TestHumidityGrid(t *testing.T) {
	data, err := inventory.DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	p := filepath.Join(t.TempDir(), "demo.xlsx")
	if err := os.WriteFile(p, data, 0o644); err != nil {
		t.Fatal(err)
	}
	s, err := inventory.ReadFile(p, inventory.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	g := HumidityGrid(s)
	if len(g.RH) != 17 || g.RH[0] != 10 || g.RH[16] != 90 {
		t.Fatalf("grid RH %v, want 10, 15, ... 90", g.RH)
	}
	sw := rerun.RunSweep(s, g.RH, rerun.SweepOptions{})
	if len(g.Stations) != len(sw.Clearances) {
		t.Fatalf("%d stations in the grid, the sweep has %d", len(g.Stations), len(sw.Clearances))
	}
	for j, hs := range g.Stations {
		if hs.ID != sw.Clearances[j].ID || hs.Text != sw.Clearances[j].Text {
			t.Errorf("station %d: %s %q, sweep %s %q", j, hs.ID, hs.Text, sw.Clearances[j].ID, sw.Clearances[j].Text)
		}
		for i, v := range hs.Verdicts {
			if w := sw.Steps[i].Stations[j].Verdict; v != w {
				t.Errorf("%s at %g %% RH: %s, sweep %s", hs.ID, g.RH[i], v, w)
			}
		}
	}
}

// TestAssessOneWritesHTML: the pipeline writes the HTML report with the
// workbook when Outputs.HTML names it, and refuses an HTML path that is the
// workbook's.
func TestAssessOneWritesHTML(t *testing.T) {
	dir := t.TempDir()
	data, err := inventory.DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	survey := filepath.Join(dir, "demo.xlsx")
	if err := os.WriteFile(survey, data, 0o644); err != nil {
		t.Fatal(err)
	}
	ws := outfile.NewWorkspace(dir)
	defer ws.Close()
	var out bytes.Buffer
	r := &Run{Workspace: ws, Out: &out}
	o := Outputs{Workbook: filepath.Join(dir, "a.xlsx"), HTML: filepath.Join(dir, "a.html")}
	if err := r.AssessOne(survey, o, PortfolioFiles{}); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(o.HTML)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), "Verdict against relative humidity") || strings.Contains(string(b), "No humidity sweep") {
		t.Error("the HTML report lacks the humidity plot")
	}
	if !strings.Contains(out.String(), "HTML report:") {
		t.Errorf("the summary does not name the HTML report:\n%s", out.String())
	}
	o.HTML = o.Workbook
	if err := r.AssessOne(survey, o, PortfolioFiles{}); err == nil || !strings.Contains(err.Error(), "same file") {
		t.Errorf("HTML over the workbook: %v, want a refusal", err)
	}
}
