package rerun

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"path/filepath"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/outfile"
	"github.com/sparkmargin/sparkmargin/templates"
)

// The JSON documents of whatif, sweep and compare: exactly the stable keys of
// the rerun contract, SI values, null for a ratio that is not defined (no
// atmosphere). Structs, not maps, keep the key order fixed.

type jsonChange struct {
	Change  string   `json:"change"`
	Target  string   `json:"target"`
	Value   string   `json:"value"`
	SIValue *float64 `json:"si_value"`
	Applied string   `json:"applied"`
	Source  string   `json:"source"`
	Note    string   `json:"note"`
	Objects []string `json:"objects"`
}

type jsonVerdictRatio struct {
	Verdict string   `json:"verdict"`
	Ratio   *float64 `json:"ratio"`
	// the ratio is at least 1 only because of an assumed resistance to earth: its size is no figure
	RatioAssumed bool `json:"ratio_assumed_resistance"`
}

type jsonWhatifObject struct {
	ID      string           `json:"id"`
	Station string           `json:"station"`
	Before  jsonVerdictRatio `json:"before"`
	After   jsonVerdictRatio `json:"after"`
}

type jsonStationState struct {
	Rank       int      `json:"rank"`
	Verdict    string   `json:"verdict"`
	WorstRatio *float64 `json:"worst_ratio"`
	// as the assess JSON: the worst ratio rests on an assumed resistance to earth
	WorstRatioAssumed bool `json:"worst_ratio_assumed_resistance"`
	// Objects rows naming the station were rejected: its rank leaves them out
	RejectedRows   int    `json:"rejected_rows"`
	IncompleteText string `json:"incomplete,omitempty"`
}

func stationState(s *assess.StationResult) *jsonStationState {
	return &jsonStationState{s.Rank, s.Verdict.String(), finite(s.WorstRatio), s.WorstRatioAssumed, s.RejectedRows, s.IncompleteText()}
}

// jsonTool names the program that wrote a document, as the assess JSON does.
type jsonTool struct {
	Name    string `json:"name"`
	Version string `json:"version"`
}

// jsonFile is a file and its SHA-256, as the assess JSON records its workbook.
type jsonFile struct {
	File   string `json:"file"`
	SHA256 string `json:"sha256"`
}

// JSONInfo is what a whatif or sweep JSON records of its run: the tool's
// version and the workbook written with it (file name and SHA-256; "" when none).
type JSONInfo struct {
	ToolVersion    string
	Workbook       string
	WorkbookSHA256 string
}

func (ji JSONInfo) tool() jsonTool { return jsonTool{"sparkmargin", ji.ToolVersion} }

func (ji JSONInfo) workbook() *jsonFile {
	if ji.Workbook == "" {
		return nil
	}
	return &jsonFile{ji.Workbook, ji.WorkbookSHA256}
}

type jsonWhatifStation struct {
	ID     string            `json:"id"`
	Before *jsonStationState `json:"before"`
	After  *jsonStationState `json:"after"`
}

type jsonWhatif struct {
	Tool     jsonTool            `json:"tool"`
	Survey   jsonRerunSurvey     `json:"survey"`
	Workbook *jsonFile           `json:"workbook,omitempty"` // the workbook written with this JSON
	Changes  []jsonChange        `json:"changes"`
	Objects  []jsonWhatifObject  `json:"objects"`
	Stations []jsonWhatifStation `json:"stations"`
	Cautions []string            `json:"cautions"`
}

// jsonRerunSurvey is the identity of the survey a whatif or a sweep ran on.
type jsonRerunSurvey struct {
	Site       string `json:"site"`
	SurveyDate string `json:"survey_date"` // YYYY-MM-DD, "" when not given
	File       string `json:"file"`
	SHA256     string `json:"sha256"`
}

func rerunSurvey(s *inventory.Survey) jsonRerunSurvey {
	if s == nil {
		return jsonRerunSurvey{}
	}
	d := jsonRerunSurvey{Site: s.Site.Name, File: s.Path, SHA256: s.SHA256}
	if !s.Site.SurveyDate.IsZero() {
		d.SurveyDate = s.Site.SurveyDate.UTC().Format("2006-01-02")
	}
	return d
}

func finite(p *float64) *float64 {
	if p == nil || math.IsNaN(*p) || math.IsInf(*p, 0) {
		return nil
	}
	v := *p
	return &v
}

func encode(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}

// WriteWhatifJSON writes the whatif document: {"survey": {"site",
// "survey_date", "file", "sha256"}, "changes", "objects": [{"id",
// "station", "before": {"verdict", "ratio"}, "after": {...}}], "stations": [{"id",
// "before": {"rank", "verdict", "worst_ratio"}, "after": {...}}]}. Each change
// carries change, target, value (as written), si_value, applied, source, note and
// the objects it reached; "cautions" closes the document.
//
// "tool" ({"name", "version"}) and "workbook" ({"file", "sha256"}, the
// workbook written with the JSON, absent when none) are as in the assess JSON;
// a ratio carries "ratio_assumed_resistance" and a station state
// "worst_ratio_assumed_resistance", "rejected_rows" and "incomplete" as the
// assess JSON's stations do.
func WriteWhatifJSON(w io.Writer, x *Whatif, info JSONInfo) error {
	d := jsonWhatif{Tool: info.tool(), Workbook: info.workbook(), Changes: []jsonChange{}, Objects: []jsonWhatifObject{}, Stations: []jsonWhatifStation{}, Cautions: templates.Cautions()}
	if x.Before != nil {
		d.Survey = rerunSurvey(x.Before.Survey)
	}
	for _, a := range x.Applied {
		si := a.SI
		objs := a.Objects
		if objs == nil {
			objs = []string{}
		}
		d.Changes = append(d.Changes, jsonChange{a.Kind, a.Target, a.Value, finite(&si), a.SIText, a.Source, a.Note, objs})
	}
	for _, o := range x.Objects {
		j := jsonWhatifObject{ID: o.ID, Station: o.Station}
		if o.Before != nil {
			j.Before = jsonVerdictRatio{o.Before.Verdict.String(), finite(o.Before.Ratio), o.Before.RatioAssumed()}
		}
		if o.After != nil {
			j.After = jsonVerdictRatio{o.After.Verdict.String(), finite(o.After.Ratio), o.After.RatioAssumed()}
		}
		d.Objects = append(d.Objects, j)
	}
	for _, s := range x.Stations {
		j := jsonWhatifStation{ID: s.ID}
		if s.Before != nil {
			j.Before = stationState(s.Before)
		}
		if s.After != nil {
			j.After = stationState(s.After)
		}
		d.Stations = append(d.Stations, j)
	}
	return encode(w, d)
}

type jsonSweepStation struct {
	ID                string   `json:"id"`
	Verdict           string   `json:"verdict"`
	WorstRatio        *float64 `json:"worst_ratio"`
	WorstRatioAssumed bool     `json:"worst_ratio_assumed_resistance"`
	RejectedRows      int      `json:"rejected_rows"`
}

type jsonSweepStep struct {
	RHPct     float64            `json:"rh_pct"`
	Incendive int                `json:"incendive"`
	Marginal  int                `json:"marginal"`
	Stations  []jsonSweepStation `json:"stations"`
}

type jsonSweepHeld struct {
	ID    string  `json:"id"`
	RHPct float64 `json:"rh_pct"`
}

type jsonSweepClearance struct {
	ID string `json:"id"`
	// ClearsAtRHPct: the lowest RH from which on the station is non-incendive;
	// null when it never is over the range (or is kept at its own RH).
	ClearsAtRHPct *float64 `json:"clears_at_rh_pct"`
	Cause         string   `json:"cause"` // ClearanceCause.Code
	Missing       []string `json:"missing_inputs"`
	Readings      []string `json:"readings_holding"`
	Text          string   `json:"text"`
}

type jsonSweep struct {
	Tool        jsonTool             `json:"tool"`
	Survey      jsonRerunSurvey      `json:"survey"`
	Workbook    *jsonFile            `json:"workbook,omitempty"` // the workbook written with this JSON
	AllStations bool                 `json:"all_stations"`
	Held        []jsonSweepHeld      `json:"held_stations"`
	Steps       []jsonSweepStep      `json:"steps"`
	Clearances  []jsonSweepClearance `json:"clearances"`
	Cautions    []string             `json:"cautions"`
}

// WriteSweepJSON writes the sweep document: {"survey": {"site", "survey_date",
// "file", "sha256"}, "all_stations", "held_stations": [{"id", "rh_pct"}] (the
// stations kept at their own RH), "steps": [{"rh_pct", "incendive",
// "marginal", "stations": [{"id", "verdict", "worst_ratio"}]}], "clearances":
// [{"id", "clears_at_rh_pct", "cause", "missing_inputs", "readings_holding",
// "text"}], "cautions"}, with "tool" and "workbook" as the assess JSON; a
// station at a step carries "worst_ratio_assumed_resistance" and
// "rejected_rows" (incomplete: its rank leaves those objects out).
func WriteSweepJSON(w io.Writer, s *Sweep) error { return WriteSweepJSONWith(w, s, JSONInfo{}) }

// WriteSweepJSONWith is WriteSweepJSON recording the run's tool version and
// the workbook written with the JSON.
func WriteSweepJSONWith(w io.Writer, s *Sweep, info JSONInfo) error {
	d := jsonSweep{Tool: info.tool(), Workbook: info.workbook(), Survey: rerunSurvey(s.Survey), AllStations: s.AllStations, Held: []jsonSweepHeld{}, Steps: []jsonSweepStep{},
		Clearances: []jsonSweepClearance{}, Cautions: templates.Cautions()}
	for _, h := range s.Held {
		d.Held = append(d.Held, jsonSweepHeld{h.ID, h.RH})
	}
	for _, st := range s.Steps {
		j := jsonSweepStep{RHPct: st.RH, Incendive: st.Incendive, Marginal: st.Marginal, Stations: []jsonSweepStation{}}
		for _, x := range st.Stations {
			j.Stations = append(j.Stations, jsonSweepStation{x.ID, x.Verdict.String(), finite(x.WorstRatio), x.WorstRatioAssumed, x.RejectedRows})
		}
		d.Steps = append(d.Steps, j)
	}
	for _, c := range s.Clearances {
		j := jsonSweepClearance{ID: c.ID, Cause: c.Cause.Code(), Missing: nonNil(c.Missing), Readings: nonNil(c.Readings), Text: c.Text}
		if c.Cause == ClearsAlways || c.Cause == ClearsFrom {
			j.ClearsAtRHPct = finite(&c.ClearsAt)
		}
		d.Clearances = append(d.Clearances, j)
	}
	return encode(w, d)
}

type jsonValue struct {
	Text  string   `json:"text"`
	SI    *float64 `json:"si"`
	Value *float64 `json:"value"` // in unit
	Unit  string   `json:"unit"`
}

func jvalue(v Value) jsonValue {
	j := jsonValue{Text: v.Text, Unit: v.Unit}
	if v.SI != nil {
		j.SI, j.Value = finite(v.SI), finite(&v.Shown)
	}
	return j
}

type jsonFieldChange struct {
	Field  string    `json:"field"`
	Before jsonValue `json:"before"`
	After  jsonValue `json:"after"`
}

type jsonStationChange struct {
	Station string `json:"station"`
	jsonFieldChange
}

type jsonChanged struct {
	ID            string            `json:"id"`
	Station       string            `json:"station"`
	Fields        []string          `json:"fields"`
	Values        []jsonFieldChange `json:"values"`
	VerdictBefore string            `json:"verdict_before"`
	VerdictAfter  string            `json:"verdict_after"`
}

type jsonRankMove struct {
	ID               string   `json:"id"`
	RankBefore       *int     `json:"rank_before"`
	RankAfter        *int     `json:"rank_after"`
	VerdictBefore    *string  `json:"verdict_before"`
	VerdictAfter     *string  `json:"verdict_after"`
	WorstRatioBefore *float64 `json:"worst_ratio_before"`
	WorstRatioAfter  *float64 `json:"worst_ratio_after"`
	// the worst ratio rests on an assumed resistance to earth: at least 1, its size no figure
	AssumedBefore bool     `json:"worst_ratio_before_assumed_resistance"`
	AssumedAfter  bool     `json:"worst_ratio_after_assumed_resistance"`
	Added         []string `json:"objects_added"`
	Removed       []string `json:"objects_removed"`
	Rejected      []string `json:"objects_rejected"`
	Move          string   `json:"move"`
}

type jsonRejected struct {
	ID      string `json:"id"`
	Station string `json:"station"`
	Row     int    `json:"row"`
	Why     string `json:"why"`
}

type jsonStationCounts struct {
	Moved   int `json:"moved"`    // on both sides, rank or verdict moved
	OnlyNew int `json:"only_new"` // stations added
	OnlyOld int `json:"only_old"` // stations removed
}

type jsonIdentity struct {
	Path         string  `json:"path"`
	SHA256       string  `json:"sha256"`
	Site         string  `json:"site"`
	SiteID       string  `json:"site_id"`
	SurveyDate   *string `json:"survey_date"` // null: not given
	SurveySHA256 string  `json:"survey_sha256,omitempty"`
	FileSHA256   string  `json:"file_sha256,omitempty"` // an audit JSON's own checksum
	ResultsOnly  bool    `json:"results_only"`
}

type jsonCaution struct {
	Kind string `json:"kind"`
	Text string `json:"text"`
}

type jsonCompare struct {
	Old            jsonIdentity        `json:"old"`
	New            jsonIdentity        `json:"new"`
	Warnings       []jsonCaution       `json:"warnings"`
	SiteChanges    []jsonFieldChange   `json:"site_changes"`
	StationChanges []jsonStationChange `json:"station_changes"`
	// SettingsNotCompared: the settings an audit JSON side does not hold
	// ([] when both sides are surveys).
	SettingsNotCompared []string          `json:"settings_not_compared"`
	Added               []string          `json:"added"`
	Removed             []string          `json:"removed"`
	RejectedOld         []jsonRejected    `json:"rejected_old"`
	RejectedNew         []jsonRejected    `json:"rejected_new"`
	Changed             []jsonChanged     `json:"changed"`
	Stations            []jsonRankMove    `json:"stations"`
	StationCounts       jsonStationCounts `json:"station_counts"`
	DifferentSites      bool              `json:"different_sites"`
	Cautions            []string          `json:"cautions"`
}

func jrejected(rs []RejectedObject) []jsonRejected {
	out := []jsonRejected{}
	for _, r := range rs {
		out = append(out, jsonRejected{r.ID, r.Station, r.Row, r.Why})
	}
	return out
}

func rankPtr(r int) *int {
	if r == 0 {
		return nil
	}
	return &r
}

func strPtr(s string) *string {
	if s == "" {
		return nil
	}
	return &s
}

func jidentity(id Identity) jsonIdentity {
	j := jsonIdentity{Path: id.Path, SHA256: id.SHA256, Site: id.Site, SiteID: id.SiteID, SurveySHA256: id.SurveySHA256, FileSHA256: id.FileSHA256, ResultsOnly: id.Results}
	if !id.SurveyDate.IsZero() {
		j.SurveyDate = strPtr(id.DateText())
	}
	return j
}

// WriteCompareJSON writes the compare document: "old" and "new" (the identity
// of each side: path, sha256, site, site_id, survey_date or null), "warnings"
// ([{kind, text}]: different sites, dates reversed...), "site_changes" and
// "station_changes" ([{station, field, before, after}], each value {text, si,
// value, unit}: SI and the display unit of the survey and audit), "added" and
// "removed" (object IDs), "changed" ([{id, station, fields, values,
// verdict_before, verdict_after}]), "stations" (each station whose rank moved or
// verdict changed: ranks, verdicts, worst ratios, null where the station is not
// on that side) and "cautions" (the screening cautions).
func WriteCompareJSON(w io.Writer, c *Comparison) error {
	d := jsonCompare{Old: jidentity(c.Old.Identity), New: jidentity(c.New.Identity), Warnings: []jsonCaution{}, SiteChanges: []jsonFieldChange{},
		StationChanges: []jsonStationChange{}, Added: nonNil(c.Added), Removed: nonNil(c.Removed), RejectedOld: jrejected(c.RejectedOld), RejectedNew: jrejected(c.RejectedNew),
		Changed: []jsonChanged{}, Stations: []jsonRankMove{}, StationCounts: jsonStationCounts{c.StationsMoved(), c.StationsAdded(), c.StationsRemoved()},
		DifferentSites: c.HasCaution(CautionDifferentSites), Cautions: templates.Cautions()}
	for _, k := range c.Cautions {
		d.Warnings = append(d.Warnings, jsonCaution{string(k.Kind), k.Text})
	}
	d.SettingsNotCompared = append([]string{}, c.NotCompared...)
	for _, ch := range c.SiteChanges {
		d.SiteChanges = append(d.SiteChanges, jsonFieldChange{ch.Field, jvalue(ch.Before), jvalue(ch.After)})
	}
	for _, ch := range c.StationChanges {
		d.StationChanges = append(d.StationChanges, jsonStationChange{ch.Station, jsonFieldChange{ch.Field, jvalue(ch.Before), jvalue(ch.After)}})
	}
	for _, ch := range c.Changed {
		j := jsonChanged{ID: ch.ID, Station: ch.Station, Fields: ch.Fields, Values: []jsonFieldChange{}, VerdictBefore: ch.VerdictBefore, VerdictAfter: ch.VerdictAfter}
		for i, f := range ch.Fields {
			j.Values = append(j.Values, jsonFieldChange{f, jvalue(ch.Before[i]), jvalue(ch.After[i])})
		}
		d.Changed = append(d.Changed, j)
	}
	for _, m := range c.Stations {
		d.Stations = append(d.Stations, jsonRankMove{m.ID, rankPtr(m.RankBefore), rankPtr(m.RankAfter), strPtr(m.VerdictBefore), strPtr(m.VerdictAfter),
			finite(m.WorstRatioBefore), finite(m.WorstRatioAfter), m.WorstRatioAssumedBefore, m.WorstRatioAssumedAfter,
			nonNil(m.Added), nonNil(m.Removed), nonNil(m.Rejected), m.Move()})
	}
	return encode(w, d)
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// WriteLinked writes a rerun's workbook and JSON (either may be "") as one
// pair in the run's workspace, the JSON recording the tool version and the
// workbook's file name and SHA-256 as the assess JSON does.
func WriteLinked(ws *outfile.Workspace, toolVersion, xlsx, jsonPath string, book func(io.Writer) error, doc func(io.Writer, JSONInfo) error) error {
	var pw, pj *outfile.Pending
	var err error
	ji := JSONInfo{ToolVersion: toolVersion}
	if xlsx != "" {
		if pw, err = ws.Prepare(xlsx, book); err != nil {
			return fmt.Errorf("writing the workbook: %w", err)
		}
		ji.Workbook, ji.WorkbookSHA256 = filepath.Base(xlsx), pw.SHA256()
	}
	if jsonPath != "" {
		if pj, err = ws.Prepare(jsonPath, func(w io.Writer) error { return doc(w, ji) }); err != nil {
			ws.Discard(pw)
			return fmt.Errorf("writing the JSON: %w", err)
		}
	}
	if err := ws.Commit(pw, pj); err != nil {
		return fmt.Errorf("writing the outputs: %w", err)
	}
	return nil
}
