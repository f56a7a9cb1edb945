package rerun

import (
	"bytes"
	"encoding/json"
	"fmt"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

// A dryer exit kept at 20 % RH stays at 20 % while the site is swept; with
// --all-stations it is swept too. The plant is invented for the demo.
func TestSweepKeepsStationRH(t *testing.T) {
	web := func(id string) inventory.Object {
		return inventory.Object{ID: id, Kind: "sheet", Material: "paper", Length: known(1), Width: known(1), Thickness: known(50e-6),
			Backing: "none", Field: known(500e3), FieldDistance: known(0.1), Resistance: known(1e6)}
	}
	s := surveyOf(atmToluene, 40, web("WEB"), web("DRY"))
	s.Stations[1].RelativeHumidity = known(20) // ST-DRY: its own RH, invented for the demo

	for _, v := range []float64{10, 55, 90} {
		c := stepSurvey(s, v, SweepOptions{})
		if got := c.Site.RelativeHumidity.Value; got != v {
			t.Errorf("step %g: site RH %g", v, got)
		}
		if st := c.Stations[0]; st.RelativeHumidity.Known {
			t.Errorf("step %g: ST-WEB gives no RH of its own, got %g", v, st.RelativeHumidity.Value)
		}
		if st := c.Stations[1]; !st.RelativeHumidity.Known || st.RelativeHumidity.Value != 20 {
			t.Errorf("step %g: ST-DRY RH %v, want its own 20 %%", v, st.RelativeHumidity)
		}
		// The environment the assessment uses at the dryer exit is 20 %, at the web the step's.
		a := assess.Assess(c, assess.Options{Limits: Limits(c)})
		for _, o := range a.Objects {
			want := v
			if o.Station.ID == "ST-DRY" {
				want = 20
			}
			if o.Environment.RelativeHumidity != want {
				t.Errorf("step %g: %s assessed at %g %% RH, want %g", v, o.Object.ID, o.Environment.RelativeHumidity, want)
			}
		}
		all := stepSurvey(s, v, SweepOptions{AllStations: true})
		if got := all.Stations[1].RelativeHumidity.Value; got != v {
			t.Errorf("step %g with --all-stations: ST-DRY RH %g, want %g", v, got, v)
		}
	}
	if s.Stations[1].RelativeHumidity.Value != 20 || s.Site.RelativeHumidity.Value != 40 {
		t.Fatal("the sweep modified the survey")
	}

	rh, err := ParseRange("10:90:40")
	if err != nil {
		t.Fatal(err)
	}
	sw := RunSweep(s, rh, SweepOptions{})
	if len(sw.Held) != 1 || sw.Held[0].ID != "ST-DRY" || sw.Held[0].RH != 20 {
		t.Fatalf("held %+v, want ST-DRY at 20 %%", sw.Held)
	}
	var dry StationClearance
	for _, c := range sw.Clearances {
		if c.ID == "ST-DRY" {
			dry = c
		}
	}
	if dry.Cause != HeldAtOwnRH || !strings.Contains(dry.Text, "held at its own RH 20 %") {
		t.Errorf("ST-DRY clearance %v %q", dry.Cause, dry.Text)
	}
	// Terminal, JSON and Method sheet say which station was held.
	var term, js bytes.Buffer
	if err := WriteSweepSummary(&term, sw, 0); err != nil {
		t.Fatal(err)
	}
	if flat := strings.Join(strings.Fields(term.String()), " "); !strings.Contains(flat, "kept at it (--all-stations sweeps them too): ST-DRY 20%") {
		t.Errorf("terminal does not name the held station:\n%s", term.String())
	}
	if !strings.Contains(sweepMethodText(sw), "ST-DRY 20%") {
		t.Errorf("Method text does not name the held station: %s", sweepMethodText(sw))
	}
	if err := WriteSweepJSON(&js, sw); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		AllStations bool `json:"all_stations"`
		Held        []struct {
			ID    string  `json:"id"`
			RHPct float64 `json:"rh_pct"`
		} `json:"held_stations"`
		Survey struct {
			Site, SurveyDate string
		} `json:"survey"`
		Cautions []string `json:"cautions"`
	}
	if err := json.Unmarshal(js.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.AllStations || len(doc.Held) != 1 || doc.Held[0].ID != "ST-DRY" || doc.Held[0].RHPct != 20 || len(doc.Cautions) == 0 || doc.Survey.Site == "" {
		t.Errorf("JSON: %s", js.String())
	}

	swAll := RunSweep(s, rh, SweepOptions{AllStations: true})
	if len(swAll.Held) != 0 || !strings.Contains(sweepMethodText(swAll), "--all-stations") {
		t.Errorf("--all-stations: held %v, method %q", swAll.Held, sweepMethodText(swAll))
	}
}

// A station that never clears because an input is missing says so, not that
// humidity alone never gets it there.
func TestSweepNamesMissingInput(t *testing.T) {
	// An unearthed drum whose resistance to earth was not measured: the model
	// assumes no leakage (principle 2, the stricter case), so the spark is at
	// least the MIE whatever the RH (reference section 12). Invented for the demo.
	drum := inventory.Object{ID: "DRUM", Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6),
		Capacitance: known(100e-12), ChargingTime: known(1)}
	// A measured earthed drum: the physics, not an input, decides (humidity does
	// not change a conductor's charge).
	earthed := inventory.Object{ID: "DRM2", Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6),
		Resistance: known(1e11), Capacitance: known(100e-12), ChargingTime: known(1)}
	s := surveyOf(atmToluene, 30, drum, earthed)
	rh, _ := ParseRange("20:80:30")
	sw := RunSweep(s, rh, SweepOptions{})
	got := map[string]StationClearance{}
	for _, c := range sw.Clearances {
		got[c.ID] = c
	}
	c := got["ST-DRUM"]
	if c.Cause != NeverMissingInput || len(c.Missing) == 0 || !strings.Contains(c.Missing[0], "DRUM: resistance to earth not measured") || !strings.Contains(c.Text, "resistance to earth not measured (assumed no leakage, the stricter case) on DRUM") {
		t.Errorf("ST-DRUM: cause %q, missing %v, text %q", c.Cause.Code(), c.Missing, c.Text)
	}
	if strings.Contains(c.Text, "humidity alone") || !strings.Contains(c.Text, "because an input is missing") {
		t.Errorf("ST-DRUM text %q", c.Text)
	}
	if c := got["ST-DRM2"]; c.Cause != NeverHumidity || !strings.Contains(c.Text, "humidity alone never gets it there") {
		t.Errorf("ST-DRM2: cause %q, text %q", c.Cause.Code(), c.Text)
	}

	// An atmosphere with no MIE: a well-earthed drum (1e5 Ω, below the 1e6 Ω
	// earthing limit, TRGS 727 cl. 8.3) is not assessed at any RH, the MIE named;
	// the drum earthed through 1e11 Ω stays marginal on its earthing whatever
	// the RH, and the missing MIE is named beside it. Invented for the demo.
	noMIE := inventory.Atmosphere{ID: "A-UNK", Kind: "vapour", Group: "IIA", Zone: "1"}
	good := earthed
	good.ID, good.Resistance = "GOOD", known(1e5)
	s2 := surveyOf(noMIE, 30, good, earthed)
	sw2 := RunSweep(s2, rh, SweepOptions{})
	got = map[string]StationClearance{}
	for _, c := range sw2.Clearances {
		got[c.ID] = c
	}
	if c := got["ST-GOOD"]; c.Cause != NeverMissingInput || !strings.Contains(strings.Join(c.Missing, ";"), "MIE") {
		t.Errorf("no MIE, earthed: cause %q, missing %v, text %q", c.Cause.Code(), c.Missing, c.Text)
	}
	if c := got["ST-DRM2"]; c.Cause != NeverHumidity || !strings.Contains(c.Text, "also missing: the MIE of atmosphere A-UNK is not given on DRM2") {
		t.Errorf("no MIE, 1e11 Ω: cause %q, missing %v, text %q", c.Cause.Code(), c.Missing, c.Text)
	}
}

// Many stations: no line of the terminal tables past 130 characters, and no
// sheet wider than the counts plus SweepWideStations stations.
func TestSweepManyStationsStayNarrow(t *testing.T) {
	var objs []inventory.Object
	for i := range 40 {
		objs = append(objs, inventory.Object{ID: fmt.Sprintf("DRUM-%02d", i), Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6),
			Resistance: known(1e11), Capacitance: known(100e-12), ChargingTime: known(1)}) // invented for the demo
	}
	s := surveyOf(atmToluene, 30, objs...)
	rh, _ := ParseRange("10:90:5")
	sw := RunSweep(s, rh, SweepOptions{})
	for _, top := range []int{0, DefaultSweepTop} {
		var b bytes.Buffer
		if err := WriteSweepSummary(&b, sw, top); err != nil {
			t.Fatal(err)
		}
		for _, l := range strings.Split(b.String(), "\n") {
			if l != MeasuredReadingsNote && !strings.HasPrefix(l, "Screening estimates") && utf8.RuneCountInString(l) > 130 {
				t.Errorf("top %d: line of %d characters: %.80s...", top, utf8.RuneCountInString(l), l)
			}
		}
		if top > 0 && !strings.Contains(b.String(), "and 30 more station(s)") {
			t.Errorf("top %d: the stations left out are not counted:\n%s", top, b.String())
		}
	}
	var x bytes.Buffer
	if err := WriteSweepWorkbook(&x, sw, RunInfo{}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&x)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	cols, _ := f.GetCols(SheetSweep)
	if len(cols) > 3+2*SweepWideStations {
		t.Errorf("Sweep sheet has %d columns, want at most %d", len(cols), 3+2*SweepWideStations)
	}
	rows, _ := f.GetRows(SheetSweepLong)
	if len(rows) != 1+40*len(rh) {
		t.Errorf("%s has %d rows, want %d (a header and one per station and step)", SheetSweepLong, len(rows), 1+40*len(rh))
	}
}

// The cause named for a station that never clears is that of the object that
// sets its worst ratio at the highest step; the other rows' missing inputs are
// "also missing". Invented for the demo, after the review's powder station: a
// drum earthed through a measured 1e11 Ω and an unmeasured small part.
func TestSweepCauseIsTheWorstObjects(t *testing.T) {
	// DRUM: I = 0.5 kg/s x 10 µC/kg = 5 µA; R C = 1e11 x 100 pF = 10 s; after
	// 1 s V = I R (1 - e^-0.1) = 47.6 kV; W = C V²/2 = 113 mJ; ratio to
	// toluene's 0.24 mJ about 470 (hand calculation, W = C V²/2, textbook).
	drum := inventory.Object{ID: "DRUM", Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6),
		Resistance: known(1e11), Capacitance: known(100e-12), ChargingTime: known(1)}
	// PART: same current, 10 pF, resistance not measured (taken as 1e13 Ω, no
	// leakage): V at most the 50 kV cap, W <= 10 pF x (50 kV)² / 2 = 12.5 mJ,
	// ratio at most 52, below the drum's (hand calculation).
	part := inventory.Object{ID: "PART", Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6),
		Capacitance: known(10e-12), ChargingTime: known(1)}
	s := surveyOf(atmToluene, 30, drum, part)
	s.Objects[1].Station = s.Stations[0].ID // both at ST-DRUM
	s.Stations = s.Stations[:1]
	rh, _ := ParseRange("20:80:30")
	sw := RunSweep(s, rh, SweepOptions{})
	c := sw.Clearances[0]
	if c.ID != "ST-DRUM" || c.SetBy != "DRUM" || c.Cause != NeverHumidity {
		t.Fatalf("clearance %s: set by %q, cause %q, want DRUM, %q: %s", c.ID, c.SetBy, c.Cause.Code(), NeverHumidity.Code(), c.Text)
	}
	for _, want := range []string{"set by DRUM (incendive, spark", "resistance to earth 1.0e11 Ω measured", "also missing: resistance to earth not measured (assumed no leakage, the stricter case) on PART"} {
		if !strings.Contains(c.Text, want) {
			t.Errorf("text lacks %q: %s", want, c.Text)
		}
	}
	if strings.Contains(c.Text, "because an input is missing") {
		t.Errorf("the worst ratio rests on a measured resistance, not a missing input: %s", c.Text)
	}
	if len(c.Missing) != 1 || !strings.HasPrefix(c.Missing[0], "PART: ") {
		t.Errorf("missing %v, want PART's resistance only", c.Missing)
	}

	// Earth the drum (1e5 Ω, below the 1e6 Ω limit, TRGS 727 cl. 8.3): PART
	// now sets the ratio, and its missing resistance is the cause.
	s.Objects[0].Resistance = known(1e5)
	c = RunSweep(s, rh, SweepOptions{}).Clearances[0]
	if c.SetBy != "PART" || c.Cause != NeverMissingInput || !strings.Contains(c.Text, "set by PART") || strings.Contains(c.Text, "also missing") {
		t.Errorf("earthed drum: set by %q, cause %q: %s", c.SetBy, c.Cause.Code(), c.Text)
	}
}

// A station held at its own RH is marked as held wherever its values appear:
// the Sweep sheet's headers and note, the Sweep by station rows, the Stations
// sheet and the terminal table. Eleven invented stations (more than
// SweepWideStations, so the long sheet is written); ST-D05 keeps 20 %.
func TestSweepMarksHeldStation(t *testing.T) {
	var objs []inventory.Object
	for i := range SweepWideStations + 1 {
		objs = append(objs, inventory.Object{ID: fmt.Sprintf("D%02d", i), Kind: "container", MassFlow: known(0.5), ChargeToMass: known(10e-6),
			Resistance: known(1e11), Capacitance: known(float64(100-i) * 1e-12), ChargingTime: known(1)}) // invented for the demo
	}
	s := surveyOf(atmToluene, 30, objs...)
	s.Stations[5].RelativeHumidity = known(20)
	rh, _ := ParseRange("10:90:40")
	sw := RunSweep(s, rh, SweepOptions{})

	var term bytes.Buffer
	if err := WriteSweepSummary(&term, sw, 0); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(term.String(), "ST-D05*") || !strings.Contains(term.String(), "* not swept: ST-D05 held at own RH 20 %") {
		t.Errorf("terminal does not mark the held column:\n%s", term.String())
	}
	var x bytes.Buffer
	if err := WriteSweepWorkbook(&x, sw, RunInfo{}); err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(&x)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, _ := f.GetRows(SheetSweep)
	hdr := strings.Join(rows[0], "|")
	if !strings.Contains(hdr, "ST-D05 worst ratio [–] held at own RH 20 %|ST-D05 verdict held at own RH 20 %") || strings.Contains(hdr, "ST-D04 worst ratio [–] held") {
		t.Errorf("Sweep headers: %s", hdr)
	}
	var noted bool
	for _, r := range rows[len(rh)+1:] {
		if len(r) > 0 && strings.Contains(r[0], "Not swept: ST-D05 held at own RH 20 %") {
			noted = true
		}
	}
	if !noted {
		t.Errorf("Sweep sheet has no note of the held station: %q", rows[len(rh)+1:])
	}
	long, _ := f.GetRows(SheetSweepLong)
	for _, r := range long[1:] {
		isHeld := len(r) > 4 && r[4] == "held at own RH 20 %, not swept"
		if isHeld != (r[0] == "ST-D05") {
			t.Errorf("%s row %q: held mark %v", SheetSweepLong, r, isHeld)
		}
	}
	st, _ := f.GetRows(SheetStations)
	if !strings.Contains(strings.Join(st[0], "|"), "Verdict at swept 10 %") {
		t.Errorf("Stations header %q", st[0])
	}
	for _, r := range st[1:] {
		want := "swept"
		if r[0] == "ST-D05" {
			want = "held at own RH 20 % (not swept)"
		}
		if r[2] != want {
			t.Errorf("Stations %s: %q, want %q", r[0], r[2], want)
		}
	}
}

// An RH below 1 % is most often a fraction of 1 meant as a percentage: the
// whatif RH changes and a sweep range wholly below 1 % warn with the words
// check uses for an RH cell (inventory.LowRHWarning), and run as given.
func TestLowRHWarns(t *testing.T) {
	// 0.4 read as a fraction is 0.4 x 100 = 40 % (arithmetic).
	wantMsg := "relative humidity 0.4 % is very low: a cell formatted as a percentage stores 45 % as 0.45"
	wantFix := "did you mean 40 %?"
	web := inventory.Object{ID: "WEB", Kind: "sheet", Material: "paper", Length: known(1), Width: known(1), Thickness: known(50e-6),
		Backing: "none", Field: known(500e3), FieldDistance: known(0.1), Resistance: known(1e6)} // invented for the demo
	s := surveyOf(atmToluene, 40, web)
	for _, f := range [][2]string{{"rh", "0.4"}, {"station-rh", "ST-WEB=0.4"}} {
		w := run(t, s, f)
		if got := w.Applied[0].Warning; got != wantMsg+"; "+wantFix || !strings.HasSuffix(w.Applied[0].Description, "warning: "+wantMsg+"; "+wantFix) {
			t.Errorf("--%s %s: warning %q, description %q", f[0], f[1], got, w.Applied[0].Description)
		}
	}
	if w := run(t, s, [2]string{"rh", "40"}); w.Applied[0].Warning != "" {
		t.Errorf("--rh 40 warns: %q", w.Applied[0].Warning)
	}
	for _, c := range []struct {
		rh   string
		warn bool
	}{{"0.4", true}, {"0.1:0.4:0.1", true}, {"0:90:0.5", false}, {"40", false}} {
		rh, err := ParseRange(c.rh)
		if err != nil {
			t.Fatal(err)
		}
		sw := RunSweep(s, rh, SweepOptions{})
		var term bytes.Buffer
		_ = WriteSweepSummary(&term, sw, 0)
		flat := strings.Join(strings.Fields(term.String()), " ")
		if got := strings.Contains(flat, "Warning: --rh up to 0.4 %: "+wantMsg+"; "+wantFix); got != c.warn {
			t.Errorf("--rh %s: warned %v, want %v:\n%s", c.rh, got, c.warn, term.String())
		}
		if c.warn != strings.Contains(sweepMethodText(sw), wantMsg) {
			t.Errorf("--rh %s: Method text %q", c.rh, sweepMethodText(sw))
		}
	}
}

// A roller whose resistance to earth is measured (1e9 Ω, above the 1e6 Ω
// earthing limit, TRGS 727 cl. 8.3) but whose charging current and potential
// are not: the model takes the worst-case current (100 µA, JNIOSH-TR, the
// stricter case), so V = I R = 100 kV, capped at the conductor maximum, and the
// spark is at least the MIE (model.FlagAssumedCurrent). What is missing is the
// charging current or the potential in operation, not the resistance that was
// measured. Invented for the demo, after the review's dryer idler.
func TestSweepNamesAssumedCurrent(t *testing.T) {
	idler := inventory.Object{ID: "IDL", Kind: "roller", Resistance: known(1e9), Capacitance: known(50e-12)}
	s := surveyOf(atmToluene, 30, idler)
	rh, _ := ParseRange("10:90:20")
	c := RunSweep(s, rh, SweepOptions{}).Clearances[0]
	if c.Cause != NeverMissingInput || !strings.Contains(c.Text, "charging current / potential in operation not measured") {
		t.Errorf("cause %q, text %q", c.Cause.Code(), c.Text)
	}
	if strings.Contains(c.Text, "resistance to earth not measured") {
		t.Errorf("the resistance was measured, the text asks for it: %s", c.Text)
	}
	if len(c.Missing) != 1 || !strings.HasPrefix(c.Missing[0], "IDL: charging current") {
		t.Errorf("missing %v", c.Missing)
	}
}
