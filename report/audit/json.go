package audit

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
)

// The JSON document of the output contract (architecture.md). Structs, not
// maps, keep the key order fixed; every quantity is SI; a pointer that is nil
// is null: not defined for the kind, not measured, or no atmosphere.
type jsonAudit struct {
	Tool     jsonTool      `json:"tool"`
	Options  *jsonOptions  `json:"options,omitempty"`
	Survey   jsonSurvey    `json:"survey"`
	Workbook *jsonSurvey   `json:"workbook,omitempty"` // the audit workbook written with this JSON
	Site     jsonSite      `json:"site"`
	SignOff  jsonSignOff   `json:"signoff"` // the sign-off block (signoff.go)
	Counts   jsonCounts    `json:"counts"`
	Stations []jsonStation `json:"stations"`
	Objects  []jsonObject  `json:"objects"`
	Rejected []jsonProblem `json:"rejected"`
	Warnings []jsonProblem `json:"warnings"`
	Cautions []string      `json:"cautions"`
	// References are the documents the sources cite by key; Verify the
	// limits applied that were recalled, not confirmed against the text.
	References []jsonReference `json:"references"`
	Verify     []jsonVerify    `json:"verify"`
}

type jsonTool struct {
	Name    string `json:"name"`
	Version string `json:"version"`
}

// jsonOptions records how the assessment sampled (present when it did).
type jsonOptions struct {
	Samples       int               `json:"samples"`
	Seed          uint64            `json:"seed"`
	Uncertainties []jsonUncertainty `json:"uncertainties"`
}

// jsonUncertainty is one row of the uncertainty table; spread is the standard
// deviation: relative (normal, relative), SI or %RH (normal, absolute), of ln (log-normal).
type jsonUncertainty struct {
	Input        string  `json:"input"`
	Distribution string  `json:"distribution"`
	Spread       float64 `json:"spread"`
	Text         string  `json:"text"`
	SiteItem     string  `json:"site_item"`
	Overridden   bool    `json:"overridden"`
}

type jsonSurvey struct {
	File   string `json:"file"`
	SHA256 string `json:"sha256"`
}

type jsonSite struct {
	// ID is the optional Site ID item ("" when not given): compare and the
	// portfolio group repeat surveys of one site by it.
	ID                  string   `json:"id"`
	Name                string   `json:"name"`
	SurveyDate          string   `json:"survey_date"`
	SurveyedBy          string   `json:"surveyed_by"`
	RelativeHumidityPct *float64 `json:"relative_humidity_pct"`
	AirTemperatureK     *float64 `json:"air_temperature_K"`
	RequiredMargin      *float64 `json:"required_margin"`
	Defaults            []string `json:"defaults"`
	// Provenance of the site values: relative_humidity, air_temperature,
	// required_margin ("entered", "estimated", "override").
	Provenance map[string]string `json:"provenance"`
}

// jsonVerdictCounts holds counts or probabilities keyed by the verdict spelling.
type jsonVerdictCounts struct {
	Incendive    int `json:"incendive"`
	Marginal     int `json:"marginal"`
	NonIncendive int `json:"non-incendive"`
	NotAssessed  int `json:"not assessed"`
}

func verdictCounts(m map[assess.Verdict]int) jsonVerdictCounts {
	return jsonVerdictCounts{m[assess.Incendive], m[assess.Marginal], m[assess.NonIncendive], m[assess.NotAssessed]}
}

type jsonRows struct {
	Sheet    string `json:"sheet"`
	Read     int    `json:"read"`
	Accepted int    `json:"accepted"`
	Rejected int    `json:"rejected"`
}

type jsonCounts struct {
	Objects  jsonVerdictCounts `json:"objects"`
	Findings int               `json:"findings"`
	Rows     []jsonRows        `json:"rows"`
}

type jsonStation struct {
	ID                      string            `json:"id"`
	Name                    string            `json:"name"`
	Line                    string            `json:"line"`
	Atmosphere              *string           `json:"atmosphere"`
	MIEJ                    *float64          `json:"mie_J"`
	Zone                    *string           `json:"zone"`
	Group                   *string           `json:"group"`
	Rank                    int               `json:"rank"`
	Verdict                 string            `json:"verdict"`
	WorstRatio              *float64          `json:"worst_ratio"`
	Objects                 []string          `json:"objects"`
	Counts                  jsonVerdictCounts `json:"counts"`
	ProbabilityAnyIncendive *float64          `json:"probability_any_incendive,omitempty"`
	// RejectedRows counts the Objects rows naming the station that were
	// rejected: the station's verdict and rank rest on the others only.
	RejectedRows int `json:"rejected_rows"`
	// WorstRatioAssumedResistance: worst_ratio is an artefact of an assumed
	// resistance to earth (read it as at least 1); the rank rests on it.
	WorstRatioAssumedResistance bool `json:"worst_ratio_assumed_resistance"`
	// GroupAssessed is the group the station was assessed with, "est." when
	// assumed, "lib." when from the substance list.
	GroupAssessed string `json:"group_assessed,omitempty"`
	// WorstRatioText says why worst_ratio is no number to read: "no atmosphere", "no discharge", "n/a" (none computed) or ">= 1 (assumed)" (stationRatioText).
	WorstRatioText string `json:"worst_ratio_text,omitempty"`
	// MainReason is the finding (or object reason) that set the verdict.
	MainReason *jsonMainReason `json:"main_reason,omitempty"`
}

type jsonDischarge struct {
	Type     string   `json:"type"`
	Possible bool     `json:"possible"`
	EnergyJ  *float64 `json:"energy_J"`
	ChargeC  *float64 `json:"charge_C"`
	Reason   string   `json:"reason"`
}

type jsonFinding struct {
	Check      string `json:"check"`
	Severity   string `json:"severity"`
	Message    string `json:"message"`
	Mitigation string `json:"mitigation"`
	Basis      string `json:"basis"`
}

// jsonDefault is one value the tool chose for an object (estimated, library
// or override), with its reason.
type jsonDefault struct {
	Field      string `json:"field"`
	Value      string `json:"value"`
	Reason     string `json:"reason"`
	Provenance string `json:"provenance"`
}

// jsonMainReason is the finding (or object reason) that set a station's verdict.
type jsonMainReason struct {
	Object string `json:"object"`
	Check  string `json:"check"`
	Text   string `json:"text"`
}

type jsonProbability struct {
	Incendive    float64 `json:"incendive"`
	Marginal     float64 `json:"marginal"`
	NonIncendive float64 `json:"non-incendive"`
	NotAssessed  float64 `json:"not assessed"`
	// Borderline: the point verdict differs from the most likely sampled one,
	// or the more severe verdicts exceed assess.BorderlineThreshold.
	Borderline bool `json:"borderline"`
	// Driver is, for a borderline object, the drawn input that drives its
	// outcome most and what measuring it settles.
	Driver *jsonDriver `json:"driver,omitempty"`
}

// jsonDriver is the input that drives a borderline object's outcome most.
type jsonDriver struct {
	Input       string  `json:"input"`
	Correlation float64 `json:"rank_correlation"`
	Advice      string  `json:"advice"`
}

type jsonObject struct {
	ID                     string          `json:"id"`
	Station                string          `json:"station"`
	Kind                   string          `json:"kind"`
	Verdict                string          `json:"verdict"`
	Reason                 string          `json:"reason"`
	Ratio                  *float64        `json:"ratio"`
	EnergyJ                *float64        `json:"energy_J"`
	EffectiveDischarge     *string         `json:"effective_discharge"`
	PotentialV             *float64        `json:"potential_V"`
	CapacitanceF           *float64        `json:"capacitance_F"`
	CapacitanceMeasured    bool            `json:"capacitance_measured"`
	ChargeDensityCPerM2    *float64        `json:"charge_density_C_per_m2"`
	SurfaceFieldVPerM      *float64        `json:"surface_field_V_per_m"`
	ChargingCurrentA       *float64        `json:"charging_current_A"`
	StoredEnergyJ          *float64        `json:"stored_energy_J"`
	TransferredChargeC     *float64        `json:"transferred_charge_C"`
	InsulatingAreaM2       *float64        `json:"insulating_area_m2"`
	SurfaceResistivityOhm  *float64        `json:"surface_resistivity_ohm"`
	DecayTimeS             *float64        `json:"decay_time_s"`
	TimeTo100VS            *float64        `json:"time_to_100V_s"`
	RelaxationTimeS        *float64        `json:"relaxation_time_s"`
	StreamingCurrentA      *float64        `json:"streaming_current_A"`
	VelocityDiameterM2PerS *float64        `json:"velocity_diameter_m2_per_s"`
	AirFieldVPerM          *float64        `json:"air_field_V_per_m"`
	LayerFieldVPerM        *float64        `json:"layer_field_V_per_m"`
	LayerVoltageV          *float64        `json:"layer_voltage_V"`
	LayerBreakdownV        *float64        `json:"layer_breakdown_V"`
	LayerBreakdownSource   *string         `json:"layer_breakdown_source"`
	ChargingDensityAPerM2  *float64        `json:"charging_current_density_A_per_m2"`
	ProcessMaterial        *bool           `json:"process_material"`
	IsolatedConductor      bool            `json:"isolated_conductor"`
	VDLimitM2PerS          *float64        `json:"vd_limit_m2_per_s,omitempty"`
	VelocityLimitMPerS     *float64        `json:"velocity_limit_m_per_s,omitempty"`
	ChargeFactor           *float64        `json:"charge_factor,omitempty"`
	FilterResidenceS       *float64        `json:"filter_residence_needed_s,omitempty"`
	FillingClausesNotMet   []string        `json:"filling_clauses_not_met,omitempty"`
	Discharges             []jsonDischarge `json:"discharges"`
	Findings               []jsonFinding   `json:"findings"`
	Defaults               []jsonDefault   `json:"defaults"`
	// Provenance gives, per value that fed the result, where it came from:
	// "measured", "entered", "library", "estimated" or "override" (keys:
	// relative_humidity, mie, group, zone, material, capacitance,
	// resistance_to_earth, potential, charging_current, ...; assess.Item.Key).
	Provenance map[string]string `json:"provenance"`
	// RatioText says why ratio is no number to read: "n/a" (null ratio),
	// "no discharge" (ratio 0) or ">= 1 (assumed)"; absent for a ratio to read.
	RatioText   string           `json:"ratio_text,omitempty"`
	Probability *jsonProbability `json:"probability,omitempty"`
	EnergyJP05  *float64         `json:"energy_J_p05,omitempty"`
	EnergyJP50  *float64         `json:"energy_J_p50,omitempty"`
	EnergyJP95  *float64         `json:"energy_J_p95,omitempty"`
	// EnergyNote qualifies energy_J where the number is not to be read as it
	// stands: EnergyAtLeastMIE ("at least the MIE", an assumed resistance or current dominating).
	EnergyNote string `json:"energy_note,omitempty"`
	// RatioAssumedResistance: ratio is an artefact of an assumed resistance to
	// earth or charging current (read it as at least 1, with energy_note).
	RatioAssumedResistance bool `json:"ratio_assumed_resistance,omitempty"`
}

type jsonProblem struct {
	Sheet   string `json:"sheet"`
	Row     int    `json:"row"`
	Column  string `json:"column"`
	Field   string `json:"field"`
	ID      string `json:"id"`
	Message string `json:"message"`
	Fix     string `json:"fix"`
}

func problemJSON(p inventory.Problem) jsonProblem {
	return jsonProblem{p.Sheet, p.Row, p.Column, p.Field, p.ID, p.Message, p.Fix}
}

func strPtr(s string) *string { return &s }

// WriteJSON writes the audit as the JSON document of the output contract: the
// stable keys of architecture.md with SI values, null where a kind has no such
// quantity or there is no atmosphere (NaN is never written), plus the counts,
// the cautions and, when the assessment sampled, the probabilities. Output is
// indented and its key order fixed, so the same audit gives the same bytes.
func WriteJSON(w io.Writer, a *assess.Audit, info RunInfo) error {
	if a == nil || a.Survey == nil {
		return errors.New("write JSON: no audit or no survey")
	}
	doc := jsonDoc(a, info, materialsUsed(a.Objects))
	for i := range a.Objects {
		doc.Objects = append(doc.Objects, objectJSON(&a.Objects[i]))
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	if err := enc.Encode(doc); err != nil {
		return fmt.Errorf("write JSON: %w", err)
	}
	return nil
}

// jsonDoc builds the JSON document of a, without its objects.
// workbookRecord is the JSON's record of its audit workbook, nil when none was written with it.
func workbookRecord(info RunInfo) *jsonSurvey {
	if info.Workbook == "" {
		return nil
	}
	return &jsonSurvey{File: info.Workbook, SHA256: info.WorkbookSHA256}
}

// jsonReference is one entry of the References list (model.References).
type jsonReference struct {
	Key     string `json:"key"`
	Edition string `json:"edition"`
	Kind    string `json:"kind"`
	Title   string `json:"title"`
	Note    string `json:"note"`
}

// jsonVerify is one value applied that was recalled, not confirmed against
// its source's text (the Method sheet's "Verify before relying on these").
type jsonVerify struct {
	What     string   `json:"what"`  // limit, material or substance
	Limit    string   `json:"limit"` // the limit's key, or the material's or substance's name
	Label    string   `json:"label"`
	ValueSI  *float64 `json:"value_si"`
	UnitSI   string   `json:"unit_si"`
	Override string   `json:"override"`
	Source   string   `json:"source"`
}

// jsonSources are the References and Verify lists of the audit.
func jsonSources(a *assess.Audit, used map[string]bool) ([]jsonReference, []jsonVerify) {
	refs, verify := []jsonReference{}, []jsonVerify{}
	for _, r := range model.References() {
		refs = append(refs, jsonReference{r.Key, r.Edition, r.Kind, r.Title, r.Note})
	}
	for _, v := range verifyRows(a, used) {
		var val *float64
		if v.value != 0 {
			val = book.Finite(v.value)
		}
		verify = append(verify, jsonVerify{v.what, v.key, v.name, val, v.unitSI, v.override, v.source})
	}
	return refs, verify
}

func jsonDoc(a *assess.Audit, info RunInfo, used map[string]bool) jsonAudit {
	s := a.Survey
	doc := jsonAudit{
		Tool:     jsonTool{info.tool(), info.ToolVersion},
		Survey:   jsonSurvey{info.file(a), info.sha(a)},
		Workbook: workbookRecord(info),
		Site: jsonSite{
			ID:                  s.Site.ID,
			Name:                s.Site.Name,
			SurveyedBy:          s.Site.SurveyedBy,
			RelativeHumidityPct: book.Finite(s.Site.RelativeHumidity.OrNaN()),
			AirTemperatureK:     book.Finite(s.Site.AirTemperature.OrNaN()),
			RequiredMargin:      book.Finite(s.Site.RequiredMargin.OrNaN()),
			Defaults:            s.Site.DefaultTexts(),
			Provenance:          map[string]string{},
		},
		SignOff: signoffJSON(s.Site.SignOff),
		Counts: jsonCounts{
			Objects:  verdictCounts(a.Counts),
			Findings: len(a.Findings),
			Rows:     []jsonRows{},
		},
		Stations: []jsonStation{},
		Objects:  []jsonObject{},
		Rejected: []jsonProblem{},
		Warnings: []jsonProblem{},
		Cautions: templates.Cautions(),
	}
	for _, sv := range siteValues(s.Site) {
		doc.Site.Provenance[sv.item.Key()] = sv.prov.String()
	}
	doc.References, doc.Verify = jsonSources(a, used)
	if a.Options.Samples > 0 {
		tab := a.Options.Uncertainties
		if tab == nil {
			tab = assess.DefaultUncertainties()
		}
		doc.Options = &jsonOptions{Samples: a.Options.Samples, Seed: a.Options.Seed, Uncertainties: []jsonUncertainty{}}
		for _, u := range tab {
			doc.Options.Uncertainties = append(doc.Options.Uncertainties, jsonUncertainty{u.Name, u.Dist.String(), u.Spread, u.Text(), u.SiteItem(), u.Overridden})
		}
	}
	if !s.Site.SurveyDate.IsZero() {
		doc.Site.SurveyDate = s.Site.SurveyDate.UTC().Format("2006-01-02")
	}
	for _, c := range s.Counts {
		doc.Counts.Rows = append(doc.Counts.Rows, jsonRows{c.Sheet, c.Read, c.Accepted, c.Rejected})
	}
	for i := range a.Stations {
		st := &a.Stations[i]
		js := jsonStation{
			ID: st.Station.ID, Name: st.Station.Name, Line: st.Station.Line,
			Rank: st.Rank, Verdict: st.Verdict.String(), WorstRatio: book.FinitePtr(st.WorstRatio),
			Objects: append([]string{}, st.Objects...), Counts: verdictCounts(st.Counts),
			ProbabilityAnyIncendive: book.FinitePtr(st.ProbabilityAnyIncendive),
			RejectedRows:            st.RejectedRows, WorstRatioAssumedResistance: st.WorstRatioAssumed,
			GroupAssessed: assess.GroupText(st.Atmosphere), WorstRatioText: stationRatioText(st),
		}
		if st.Main.ObjectID != "" {
			js.MainReason = &jsonMainReason{st.Main.ObjectID, st.Main.Check, st.Main.Text}
		}
		if at := st.Atmosphere; at != nil {
			js.Atmosphere = strPtr(at.ID)
			js.MIEJ = book.Finite(at.MIE.OrNaN())
			if at.Zone != "" {
				js.Zone = strPtr(at.Zone)
			}
			if at.Group != "" {
				js.Group = strPtr(at.Group)
			}
		}
		doc.Stations = append(doc.Stations, js)
	}
	for _, r := range problemRows(s) {
		if r.p.Severity == inventory.Warning {
			doc.Warnings = append(doc.Warnings, problemJSON(r.p))
		} else {
			doc.Rejected = append(doc.Rejected, problemJSON(r.p))
		}
	}
	return doc
}

func objectJSON(o *assess.ObjectResult) jsonObject {
	e := &o.Eval
	jo := jsonObject{
		ID: o.Object.ID, Station: o.Object.Station, Kind: o.Object.Kind,
		Verdict: o.Verdict.String(), Reason: o.Reason,
		Ratio:                  book.FinitePtr(o.Ratio),
		PotentialV:             book.Finite(e.Potential),
		CapacitanceF:           book.Finite(e.Capacitance),
		CapacitanceMeasured:    o.Object.Capacitance.Known,
		ChargeDensityCPerM2:    book.Finite(e.ChargeDensity),
		SurfaceFieldVPerM:      book.Finite(e.SurfaceField),
		ChargingCurrentA:       book.Finite(e.ChargingCurrent),
		StoredEnergyJ:          book.Finite(e.StoredEnergy),
		TransferredChargeC:     book.Finite(e.TransferredCharge),
		InsulatingAreaM2:       book.Finite(e.InsulatingArea),
		SurfaceResistivityOhm:  book.Finite(e.SurfaceResistivity),
		DecayTimeS:             book.Finite(e.DecayTime),
		TimeTo100VS:            book.Finite(e.TimeTo100V),
		RelaxationTimeS:        book.Finite(e.RelaxationTime),
		StreamingCurrentA:      book.Finite(e.StreamingCurrent),
		VelocityDiameterM2PerS: book.Finite(e.VelocityDiameter),
		AirFieldVPerM:          book.Finite(e.AirField),
		LayerFieldVPerM:        book.Finite(e.LayerField),
		LayerVoltageV:          book.Finite(e.LayerVoltage),
		LayerBreakdownV:        book.Finite(e.LayerBreakdown),
		ChargingDensityAPerM2:  book.Finite(e.ChargingDensity),
		IsolatedConductor:      e.IsolatedConductor,
		Discharges:             []jsonDischarge{},
		Findings:               []jsonFinding{},
		Defaults:               []jsonDefault{},
	}
	if jo.LayerBreakdownV != nil {
		jo.LayerBreakdownSource = strPtr(e.BreakdownSource.String())
	}
	switch e.Kind {
	case model.Sheet, model.Belt, model.Roller:
		if !math.IsNaN(e.InsulatingArea) || e.Kind != model.Roller {
			pm := e.ProcessMaterial
			jo.ProcessMaterial = &pm
		}
	}
	if e.Kind == model.Liquid {
		jo.VDLimitM2PerS, jo.VelocityLimitMPerS = book.Finite(e.VDLimit), book.Finite(e.VelocityLimit)
		jo.ChargeFactor, jo.FilterResidenceS = book.Finite(e.ChargeFactor), book.Finite(e.FilterResidence)
		jo.FillingClausesNotMet = e.LiquidBreaches.Texts()
	}
	if o.EnergyStated() {
		jo.EnergyJ = book.Finite(e.EffectiveEnergy)
		if jo.EnergyJ != nil && *jo.EnergyJ > 0 {
			jo.EffectiveDischarge = strPtr(e.Effective.String())
		}
		if assess.AssumedInputDominates(e, e.Effective) && o.Ratio != nil && *o.Ratio >= 1 {
			jo.EnergyNote = EnergyAtLeastMIE
			jo.RatioAssumedResistance = true
		}
	}
	for i, d := range e.Discharges {
		// The array index is the type (fixed order of model.Evaluation.Discharges).
		jo.Discharges = append(jo.Discharges, jsonDischarge{
			Type: model.DischargeType(i).String(), Possible: d.Possible,
			EnergyJ: book.Finite(d.Energy), ChargeC: book.Finite(d.Charge), Reason: dischargeReason(d),
		})
	}
	for _, f := range o.Findings {
		jo.Findings = append(jo.Findings, jsonFinding{f.Check, f.Severity.String(), f.Message, f.Mitigation, f.Basis})
	}
	for _, d := range o.Defaults() {
		jo.Defaults = append(jo.Defaults, jsonDefault{d.Label, d.Value, d.Reason, d.Prov.String()})
	}
	jo.Provenance = map[string]string{}
	for _, m := range o.Marks {
		if k := m.Item.Key(); k != "" {
			jo.Provenance[k] = o.Provenance(m.Item).String()
		}
	}
	jo.RatioText = assess.RatioText(o.Ratio)
	if jo.RatioText == "" && o.RatioAssumed() {
		jo.RatioText = assess.RatioAssumedText
	}
	if p := o.Probability; p != nil {
		jo.Probability = &jsonProbability{Incendive: p.Incendive, Marginal: p.Marginal, NonIncendive: p.NonIncendive, NotAssessed: p.NotAssessed, Borderline: o.Borderline()}
		if d := p.Driver; d.Input != "" {
			jo.Probability.Driver = &jsonDriver{d.Input, d.Correlation, o.MeasureText()}
		}
		if !o.RatioAssumed() { // withheld: they would be the spread of an assumption (PercentilesWithheldText)
			jo.EnergyJP05 = book.Finite(p.EnergyP05)
			jo.EnergyJP50 = book.Finite(p.EnergyP50)
			jo.EnergyJP95 = book.Finite(p.EnergyP95)
		}
	}
	return jo
}
