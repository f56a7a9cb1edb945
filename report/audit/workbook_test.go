package audit

import (
	"archive/zip"
	"bytes"
	"flag"
	"fmt"
	"html"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/templates"
	"github.com/xuri/excelize/v2"
	"gonum.org/v1/gonum/floats/scalar"
)

var keep = flag.String("keep", "", "also write the test workbook into this folder, to render it")

func testWorkbook(t *testing.T) []byte {
	t.Helper()
	var b bytes.Buffer
	if err := WriteWorkbook(&b, testAudit(), testInfo()); err != nil {
		t.Fatalf("WriteWorkbook: %v", err)
	}
	if *keep != "" {
		if err := os.WriteFile(filepath.Join(*keep, "audit-test.xlsx"), b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return b.Bytes()
}

func openWorkbook(t *testing.T, b []byte) *excelize.File {
	t.Helper()
	f, err := excelize.OpenReader(bytes.NewReader(b))
	if err != nil {
		t.Fatalf("open workbook: %v", err)
	}
	t.Cleanup(func() { _ = f.Close() })
	return f
}

func rowsOf(t *testing.T, f *excelize.File, sheet string) [][]string {
	t.Helper()
	rows, err := f.GetRows(sheet, excelize.Options{RawCellValue: true})
	if err != nil {
		t.Fatalf("rows of %s: %v", sheet, err)
	}
	return rows
}

func colIndex(t *testing.T, header []string, name string) int {
	t.Helper()
	for i, h := range header {
		if h == name {
			return i
		}
	}
	t.Fatalf("no column %q in %v", name, header)
	return -1
}

func TestWorkbookSheetsAndHeaders(t *testing.T) {
	f := openWorkbook(t, testWorkbook(t))
	if got, want := strings.Join(f.GetSheetList(), ","), strings.Join(Sheets(), ","); got != want {
		t.Fatalf("sheets %s, want %s", got, want)
	}
	// Every numeric column has a unit in brackets.
	for _, sheet := range []string{SheetStations, SheetObjects} {
		hdr := rowsOf(t, f, sheet)[0]
		rows := rowsOf(t, f, sheet)[1:]
		for c, h := range hdr {
			numeric := false
			for _, r := range rows {
				if c < len(r) && r[c] != "" {
					if _, err := strconv.ParseFloat(r[c], 64); err == nil {
						numeric = true
					}
				}
			}
			if numeric && !strings.Contains(h, "[") && h != "Rank" && h != "Zone" {
				t.Errorf("%s: numeric column %q has no unit", sheet, h)
			}
		}
	}
	for _, want := range []string{"Capacitance [pF]", "Potential [kV]", "Effective energy [mJ]", "Charge density [µC/m²]",
		"Surface field [kV/m]", "Transferred charge [nC]", "Resistance to earth [Ω]", "Ratio E/MIE [–]", "P(incendive) [%]"} {
		colIndex(t, rowsOf(t, f, SheetObjects)[0], want)
	}
}

func TestWorkbookObjectsValues(t *testing.T) {
	a := testAudit()
	f := openWorkbook(t, testWorkbook(t))
	rows := rowsOf(t, f, SheetObjects)
	hdr := rows[0]
	if len(rows)-1 != len(a.Objects) {
		t.Fatalf("Objects has %d rows, want every accepted object (%d)", len(rows)-1, len(a.Objects))
	}
	byID := map[string][]string{}
	for _, r := range rows[1:] {
		for len(r) < len(hdr) {
			r = append(r, "")
		}
		byID[r[0]] = r
	}
	for _, o := range a.Objects {
		if _, ok := byID[o.Object.ID]; !ok {
			t.Errorf("object %s missing from Objects", o.Object.ID)
		}
	}
	num := func(id, col string) (float64, bool) {
		s := byID[id][colIndex(t, hdr, col)]
		if s == "" {
			return 0, false
		}
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatalf("%s %s = %q: stored as text, want a number", id, col, s)
		}
		return v, true
	}
	checks := []struct {
		id, col string
		want    float64
	}{
		{"O3", "Capacitance [pF]", 200},               // Saito 1963 typical body
		{"O3", "Effective energy [mJ]", 10},           // derived: 200 pF x (10 kV)^2 / 2
		{"O3", "Ratio E/MIE [–]", 41.666666666666664}, // derived: 10 / 0.24
		{"O5", "Potential [kV]", 47.6},                // Source: electrostatics.md §10 case 6
		{"O5", "Stored energy [mJ]", 113.288},         // derived: 100 pF x (47.6 kV)^2 / 2
		{"O1", "Charge density [µC/m²]", 12},          // invented for the demo
		{"O1", "Surface field [kV/m]", 677.6454},      // derived: 12e-6 / 1.7708e-11 = 677.645 kV/m
		{"O1", "Transferred charge [nC]", 120},        // derived: 12 uC/m^2 x 100 cm^2
		{"O2", "Transferred charge [nC]", 150},        // derived: 30 pF x 5 kV
		{"O5", "Resistance to earth [Ω]", 1e11},       // invented for the demo
		{"O8", "Relaxation time [s]", 21.25005},       // derived: eps0 x 2.4 / 1 pS/m
		{"O1", "Insulating area [cm²]", 36000},        // derived: 3.6 m^2
		{"O1", "P(incendive) [%]", 0.93},              // stored as a fraction, shown as %
	}
	for _, c := range checks {
		got, ok := num(c.id, c.col)
		if !ok || !scalar.EqualWithinAbsOrRel(got, c.want, 1e-12, 1e-6) {
			t.Errorf("%s %s = %v (present %v), want %v", c.id, c.col, got, ok, c.want)
		}
	}
	// Never a 0 or a blank beside a verdict: why there is no ratio (issue 15 item 2).
	for _, c := range []struct{ id, want string }{
		{"O4", "no discharge"}, // the fixture's ratio 0: no discharge possible
		{"O7", "n/a"},          // no atmosphere
		{"O9", "n/a"},          // no atmosphere
	} {
		if got := byID[c.id][colIndex(t, hdr, "Ratio E/MIE [–]")]; got != c.want {
			t.Errorf("%s ratio %q, want %q", c.id, got, c.want)
		}
	}
	// An object without draws shows "n/a" beside its verdict, not 0.0 % (issue 15 item 8).
	if got := byID["O3"][colIndex(t, hdr, "P(incendive) [%]")]; got != "n/a" {
		t.Errorf("O3 P(incendive) %q, want n/a (no sample for this object)", got)
	}
	// The probabilities stand beside the verdict, not at the far right.
	if v, p := colIndex(t, hdr, "Verdict"), colIndex(t, hdr, "P(incendive) [%]"); p != v+2 {
		t.Errorf("P(incendive) in column %d, verdict in %d: want it beside the verdict (after Borderline)", p, v)
	}
	empties := []struct{ id, col string }{
		{"O9", "Effective energy [mJ]"},
		{"O1", "Capacitance [pF]"}, // NaN: not defined for a sheet
		{"O3", "Charge density [µC/m²]"},
	}
	for _, e := range empties {
		if s := byID[e.id][colIndex(t, hdr, e.col)]; s != "" {
			t.Errorf("%s %s = %q, want an empty cell", e.id, e.col, s)
		}
	}
	for _, r := range rows {
		for _, c := range r {
			if strings.Contains(c, "NaN") || strings.Contains(c, "Inf") {
				t.Fatalf("cell text %q", c)
			}
		}
	}
	// The person's capacitance was a default: its cell shows "est." beside the value.
	ref, _ := excelize.CoordinatesToCellName(colIndex(t, hdr, "Capacitance [pF]")+1, rowOf(byID, rows, "O3"))
	shown, _ := f.GetCellValue(SheetObjects, ref)
	if !strings.HasSuffix(shown, "est.") {
		t.Errorf("O3 capacitance shows %q, want the est. marker", shown)
	}
	if d := byID["O3"][colIndex(t, hdr, defaultsHeader)]; !strings.Contains(d, "200 pF est.") {
		t.Errorf("O3 defaults = %q, want the 200 pF default listed", d)
	}
}

func rowOf(byID map[string][]string, rows [][]string, id string) int {
	for i, r := range rows {
		if len(r) > 0 && r[0] == id {
			return i + 1
		}
	}
	return 0
}

func TestWorkbookRejectedFindingsStations(t *testing.T) {
	a := testAudit()
	f := openWorkbook(t, testWorkbook(t))
	rej := rowsOf(t, f, SheetRejected)
	errorsN, warnings := 0, 0
	for _, r := range rej[1:] {
		switch r[0] {
		case "error":
			errorsN++
		case "warning":
			warnings++
		}
	}
	if errorsN != 2 || warnings != 1 {
		t.Errorf("Rejected: %d errors, %d warnings; want 2 and 1", errorsN, warnings)
	}
	fs := rowsOf(t, f, SheetFindings)
	if got := fs[0]; strings.Join(got, "|") != "#|Severity|Station|Object|Check|Finding|Mitigation|Basis|Action owner|Due|Status|Comment" {
		t.Errorf("Findings header %v", got)
	}
	if len(fs)-1 != len(a.Findings) {
		t.Fatalf("Findings rows %d, want %d", len(fs)-1, len(a.Findings))
	}
	for i, fd := range a.Findings {
		if fs[i+1][3] != fd.ObjectID || fs[i+1][4] != fd.Check {
			t.Errorf("finding %d = %v, want order as given (%s %s)", i+1, fs[i+1], fd.ObjectID, fd.Check)
		}
	}
	st := rowsOf(t, f, SheetStations)
	if st[1][1] != "S1" || st[3][1] != "S3" || st[3][10] != NoAtmosphereText {
		t.Errorf("Stations rows %v", st)
	}
	if c := st[0][10]; c != "Worst ratio E/MIE [–]" {
		t.Errorf("Stations column K = %q", c)
	}
	// The chart's data: every station with its verdict (S3 has no atmosphere).
	label := colIndex(t, st[0], chartLabelHeader)
	if got := st[3][label]; got != "S3 marginal ("+NoAtmosphereText+")" {
		t.Errorf("S3 chart label %q", got)
	}
}

func TestWorkbookLayout(t *testing.T) {
	b := testWorkbook(t)
	f := openWorkbook(t, b)
	for _, s := range []string{SheetStations, SheetObjects, SheetFindings, SheetRejected, SheetCautions} {
		p, err := f.GetPanes(s)
		if err != nil || !p.Freeze || p.YSplit != 1 {
			t.Errorf("%s: panes %+v (%v), want the header row frozen", s, p, err)
		}
	}
	names := map[string]string{}
	for _, d := range f.GetDefinedName() {
		names[d.Scope+"/"+d.Name] = d.RefersTo
	}
	for _, s := range []string{SheetStations, SheetObjects, SheetFindings, SheetRejected, SheetCautions} {
		if ref := names[s+"/_xlnm.Print_Titles"]; !strings.Contains(ref, "$1:$1") {
			t.Errorf("%s: print titles %q, want the header row repeated", s, ref)
		}
	}
	for _, s := range Sheets() {
		hf, err := f.GetHeaderFooter(s)
		if err != nil || !strings.Contains(hf.OddFooter, "Riverside Films Works") || !strings.Contains(hf.OddFooter, "2026-03-17") ||
			!strings.Contains(hf.OddFooter, "&P of &N") {
			t.Errorf("%s: footer %q (%v)", s, hf.OddFooter, err)
		}
		pl, err := f.GetPageLayout(s)
		want := "landscape"
		if s == SheetReport {
			want = "portrait" // the condensed report prints as a document
		}
		if err != nil || pl.Orientation == nil || *pl.Orientation != want || pl.FitToWidth == nil || *pl.FitToWidth != 1 && s != SheetObjects && s != SheetStations { // Objects and Stations: more pages wide
			t.Errorf("%s: page layout %+v (%v), want %s fitted to width", s, pl, err, want)
		}
	}
	props, err := f.GetDocProps()
	if err != nil || !strings.HasPrefix(props.Created, "2026-03-17") || !strings.HasPrefix(props.Modified, "2026-03-17") {
		t.Errorf("doc props %+v (%v), want created and modified on the survey date", props, err)
	}
	// The chart is a part of the package; excelize does not read charts back.
	zr, err := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if err != nil {
		t.Fatal(err)
	}
	found := false
	for _, zf := range zr.File {
		if zf.Name == "xl/charts/chart1.xml" {
			rc, _ := zf.Open()
			raw, _ := io.ReadAll(rc)
			rc.Close()
			x := html.UnescapeString(string(raw))
			found = true
			for _, want := range []string{"Stations'!$U$2:$U$4", "Stations'!$T$2:$T$4", `<logBase val="10"`} {
				if !strings.Contains(x, want) {
					t.Errorf("chart lacks %s", want)
				}
			}
		}
	}
	if !found {
		t.Error("no chart part xl/charts/chart1.xml")
	}
	// Summary: counts by verdict and rows, ranked stations, cautions.
	sum := rowsOf(t, f, SheetSummary)
	flat := ""
	for _, r := range sum {
		flat += strings.Join(r, "|") + "\n"
	}
	for _, want := range []string{"Riverside Films Works", "2026-03-17", "J. Okafor", "incendive|4", "Objects|10|9|1", "S3|3|Warehouse & dispatch|marginal", "1. Every figure"} {
		if !strings.Contains(flat, want) {
			t.Errorf("Summary lacks %q", want)
		}
	}
}

func TestWorkbookDeterministic(t *testing.T) {
	ba, bb := testWorkbook(t), testWorkbook(t)
	if !bytes.Equal(ba, bb) {
		t.Error("two writes of the same audit give different bytes")
	}
	a, b := openWorkbook(t, ba), openWorkbook(t, bb)
	for _, s := range Sheets() {
		ra, rb := rowsOf(t, a, s), rowsOf(t, b, s)
		if len(ra) != len(rb) {
			t.Fatalf("%s: %d vs %d rows", s, len(ra), len(rb))
		}
		for i := range ra {
			if strings.Join(ra[i], "\x00") != strings.Join(rb[i], "\x00") {
				t.Errorf("%s row %d differs", s, i+1)
			}
		}
	}
}

func TestMain(m *testing.M) {
	flag.Parse()
	os.Exit(m.Run())
}

// bigAudit repeats the fixture's objects n times (IDs made unique), for benchmarks.
func bigAudit(n int) *assess.Audit {
	a := testAudit()
	base := a.Objects
	a.Objects = make([]assess.ObjectResult, 0, n)
	for i := 0; len(a.Objects) < n; i++ {
		for _, o := range base {
			o.Object.ID = fmt.Sprintf("%s-%d", o.Object.ID, i)
			a.Objects = append(a.Objects, o)
		}
	}
	return a
}

func BenchmarkWriteWorkbook10k(b *testing.B) {
	a := bigAudit(10000)
	for b.Loop() {
		if err := WriteWorkbook(io.Discard, a, testInfo()); err != nil {
			b.Fatal(err)
		}
	}
}

// A per-vessel-class liquid limit overridden on the Site sheet shows its applied value.
func TestLimitRowsVesselClass(t *testing.T) {
	l := model.DefaultLimits()
	l.VesselVDLow[model.VesselIBC] = 0.3 // invented for the test
	found := false
	for _, r := range limitRows(l) {
		if strings.HasSuffix(r.name, ", IBC") && strings.Contains(r.name, "at or below") {
			found = true
			// Source: IEC TS 60079-32-1 road-tanker 0.38 m²/s taken for IBCs (reference section 8).
			if r.value != 0.3 || r.def != 0.38 || !r.fromMemory {
				t.Errorf("IBC v·d row %+v, want applied 0.3, default 0.38, from memory", r)
			}
		}
	}
	if !found {
		t.Error("no IBC v·d row on the Method sheet")
	}
}

func TestWorkbookMethod(t *testing.T) {
	f := openWorkbook(t, testWorkbook(t))
	flat := ""
	for _, r := range rowsOf(t, f, SheetMethod) {
		flat += strings.Join(r, "|") + "\n"
	}
	for _, want := range []string{
		"Survey file SHA-256|5b1f0c0e", "Tool|sparkmargin 0.0.0-test", "Command|sparkmargin assess demo-plant.xlsx",
		"Vacuum permittivity ε0|0.0000000000088541878128|F/m||CODATA 2018",         // Source: CODATA 2018
		"Conductor resistance to earth|100000000|Ω|yes; default 1.00e6 Ω|TRGS 727", // the fixture's override of 1e6 ohm (TRGS 727 8.3)
		"Shock energy to people|350|mJ||TRGS 727",                                  // Source: TRGS 727 Annex D, 350 mJ
		"Capacitance|200 pF|estimated||typical human body (Saito 1963)",
		"Charge density, earthed backing",
		// The liquid filling rules, each with its vessel class, source mark and reference (model.LiquidRules).
		"|road tanker|confirmed|IEC TS 60079-32-1:2013+A1:2017, clause 7 (liquids), road tankers",
		"|rail tank car|from memory, not confirmed|IEC TS 60079-32-1:2013+A1:2017, clause 7 (liquids), rail tank cars",
	} {
		if !strings.Contains(flat, want) {
			t.Errorf("Method lacks %q", want)
		}
	}
	cautions := rowsOf(t, f, SheetCautions)
	if len(cautions) < 2 || !strings.HasPrefix(cautions[1][1], "Every figure") {
		t.Errorf("Cautions sheet %v", cautions)
	}
}

// TestSummaryIncompleteMark: the Summary sheet's station table marks a station
// whose object rows were rejected, as the Stations sheet and the terminal do
// (review 2 item N11, first review item 6); with no station incomplete it has no
// Note column.
func TestSummaryIncompleteMark(t *testing.T) {
	const mark = "incomplete: 2 object rows rejected, see Rejected"
	for _, rejected := range []int{0, 2} {
		a := testAudit()
		a.Stations[0].RejectedRows = rejected
		var b bytes.Buffer
		if err := WriteWorkbook(&b, a, testInfo()); err != nil {
			t.Fatal(err)
		}
		rows := rowsOf(t, openWorkbook(t, b.Bytes()), SheetSummary)
		header, station := -1, -1
		for i, r := range rows {
			if len(r) > 1 && r[0] == "Station" && r[1] == "Rank" {
				header = i
			}
			if header >= 0 && i > header && len(r) > 0 && r[0] == a.Stations[0].Station.ID {
				station = i
				break
			}
		}
		if header < 0 || station < 0 {
			t.Fatalf("Summary has no station table for %s:\n%v", a.Stations[0].Station.ID, rows)
		}
		hasNote := len(rows[header]) > 11 && rows[header][11] == "Note"
		switch {
		case rejected == 0 && hasNote:
			t.Errorf("no station incomplete, yet a Note column: %v", rows[header])
		case rejected > 0 && (!hasNote || len(rows[station]) <= 11 || rows[station][11] != mark):
			t.Errorf("incomplete station row %v under header %v; want Note %q", rows[station], rows[header], mark)
		}
	}
}

// TestWorkbookMethodSources: the Method sheet lists the references by key
// with their editions, and under "Verify before relying on these" the limits
// recalled, not confirmed (the IIC zone 0 area of IEC 60079-0, 4 cm², from
// memory), not the confirmed ones (TRGS 727 Annex D shock energy).
func TestWorkbookMethodSources(t *testing.T) {
	f := openWorkbook(t, testWorkbook(t))
	section := ""
	inVerify, refs := map[string]bool{}, map[string]string{}
	for _, r := range rowsOf(t, f, SheetMethod) {
		if len(r) == 0 {
			continue
		}
		if len(r) == 1 {
			section = r[0]
			continue
		}
		switch section {
		case "Verify before relying on these":
			inVerify[r[0]] = true
		case "References":
			if len(r) > 2 {
				refs[r[0]] = r[2]
			}
		}
	}
	if !inVerify["Insulating area, EPL Ga (zone 0), IIC"] || inVerify["Shock energy to people"] {
		t.Errorf("verify list %v: want the IIC zone 0 area, not the shock energy", inVerify)
	}
	if refs["TRGS 727"] != "2016" || refs["IEC TS 60079-32-1"] != "2013+A1:2017" {
		t.Errorf("references %v", refs)
	}
}

// TestMethodFormulaSourcesCiteReferences: every formula on the Method sheet
// names its source by a key of the References list, or is this tool's own
// rule (its principles and verdict rule, on the same sheet) or material data
// (the Materials used list).
func TestMethodFormulaSourcesCiteReferences(t *testing.T) {
	for _, m := range templates.MethodNotes() {
		ok := strings.Contains(m.Source, "this tool") || strings.Contains(m.Source, "material data")
		for _, r := range model.References() {
			ok = ok || strings.Contains(m.Source, r.Key)
		}
		if !ok || strings.Contains(m.Source, "reference section") {
			t.Errorf("%s: source %q cites no entry of the References list", m.Quantity, m.Source)
		}
	}
}
