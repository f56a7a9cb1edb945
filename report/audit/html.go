package audit

import (
	_ "embed"
	"errors"
	"fmt"
	"html/template"
	"io"
	"math"
	"sort"
	"strings"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
)

// The HTML report is one self-contained file: inline CSS, inline SVG, no
// script, no font, image or style sheet fetched from anywhere, so it reads the
// same offline, archived or printed from a browser. html/template escapes every
// text that comes from the survey (site, station and object names, notes).
//
// It carries the audit's content for reading rather than working in: site
// identity, the cautions, the stations ranked with their verdicts and main
// reasons, the findings with their basis and mitigation, the Method
// essentials, and three plots: (a) each object's effective energy against the
// MIE of its atmosphere and the required-margin line, (b) each station's
// verdict against relative humidity (a sweep the caller computes and passes
// in as a HumidityGrid: the audit package does not run reruns), (c) with
// --samples, the energy spread (p05, p50, p95) of each borderline object.
//
// The output is deterministic: no clock, no random order, no absolute path.

//go:embed html.tmpl
var htmlTemplate string

var htmlTmpl = template.Must(template.New("report").Funcs(template.FuncMap{
	"inc": func(i int) int { return i + 1 },
}).Parse(htmlTemplate))

// HumidityGrid is each station's verdict over a fixed grid of relative
// humidity, as the sweep computes it by default (the site's RH swept; a
// station with its own RH held at it); the caller (the report pipeline) runs the sweep and fills it.
type HumidityGrid struct {
	RH       []float64         // % RH, ascending
	Stations []HumidityStation // in the order the caller gives (the report draws them in rank order)
}

// HumidityStation is one station's verdict at each step of HumidityGrid.RH.
type HumidityStation struct {
	ID       string
	Verdicts []assess.Verdict // one per RH step
	Text     string           // where it clears, in words (e.g. "non-incendive from 55 % RH on")
}

// htmlMaxEnergyRows is the most objects plot (a) draws, worst ratio first; the
// rest are counted under the plot (a screening choice of this tool: a plot of
// thousands of rows is no longer read, and the workbook lists every object).
const htmlMaxEnergyRows = 60

// htmlMaxSpreadRows is the most borderline objects plot (c) draws.
const htmlMaxSpreadRows = 40

// energyPoint is what plot (a) and (c) need of one object.
type energyPoint struct {
	seq       int // survey order, the tie-break
	object    string
	station   string
	verdict   assess.Verdict
	energy    float64 // J
	mie       float64 // J
	ratio     float64
	assumedR  bool
	prob      *assess.Probability
	borderKey float64 // for plot (c): p95 / MIE
}

// stationLead is the object that sets a station's verdict: the most severe,
// then the highest ratio, then the first in survey order.
type stationLead struct {
	object  string
	verdict assess.Verdict
	ratio   float64
	reason  string
}

// HTMLWriter collects, while the survey is assessed, the little the HTML
// report needs of each object (the worst ratios, the borderline objects and
// the object that sets each station's verdict), so that it never holds the
// objects; Finish writes the report.
type HTMLWriter struct {
	n          int
	energy     []energyPoint // at most htmlMaxEnergyRows, worst ratio first
	energyAll  int           // objects with a stated energy against an MIE
	noDischarg int           // objects at an atmosphere with no discharge possible
	spread     []energyPoint // at most htmlMaxSpreadRows borderline objects
	spreadAll  int
	other      []energyPoint // borderline objects with no energy against an MIE, survey order, at most htmlMaxSpreadRows
	otherAll   int
	lead       map[string]stationLead
}

// NewHTMLWriter starts an HTML report.
func NewHTMLWriter() *HTMLWriter {
	return &HTMLWriter{lead: map[string]stationLead{}}
}

// Add takes a batch of assessed objects, in survey order.
func (h *HTMLWriter) Add(rs []assess.ObjectResult) error {
	for i := range rs {
		r := &rs[i]
		h.n++
		ratio := math.NaN()
		if r.Ratio != nil {
			ratio = *r.Ratio
		}
		id := r.Station.ID
		if id == "" {
			id = r.Object.Station
		}
		if l, ok := h.lead[id]; !ok || leads(r.Verdict, ratio, l.verdict, l.ratio) {
			h.lead[id] = stationLead{object: r.Object.ID, verdict: r.Verdict, ratio: ratio, reason: r.Reason}
		}
		mie := r.Environment.MIE
		hasMIE := r.Atmosphere != nil && mie > 0
		e := r.Eval.EffectiveEnergy
		p := energyPoint{seq: h.n, object: r.Object.ID, station: id, verdict: r.Verdict, energy: e, mie: mie,
			ratio: ratio, assumedR: r.RatioAssumed()}
		if p.assumedR && hasMIE {
			// The energy rests on an assumed input (resistance to earth or
			// charging current): its size is an artefact of the assumption.
			// Drawn at the MIE (ratio 1) and labelled as assumed, as the
			// Summary chart does.
			p.energy, p.ratio = mie, 1
		}
		if r.Probability != nil {
			pp := *r.Probability
			p.prob = &pp
		}
		if p.prob != nil && p.prob.Borderline(r.Verdict) {
			// an energy resting on an assumed resistance has no spread to draw (PercentilesWithheldText)
			if hasMIE && p.prob.EnergyP95 > 0 && !p.assumedR {
				p.borderKey = p.prob.EnergyP95 / mie
				h.spreadAll++
				h.spread = keepWorst(h.spread, p, htmlMaxSpreadRows, func(a, b energyPoint) bool {
					if a.borderKey != b.borderKey {
						return a.borderKey > b.borderKey
					}
					return a.seq < b.seq
				})
			} else {
				// Borderline on a check other than the energy (earthing,
				// shock, area, liquids): listed, not drawn.
				h.otherAll++
				if len(h.other) < htmlMaxSpreadRows {
					h.other = append(h.other, p)
				}
			}
		}
		if !hasMIE || r.Ratio == nil || math.IsNaN(ratio) || !r.EnergyStated() {
			continue
		}
		if (!(e > 0) || math.IsInf(e, 0)) && !p.assumedR {
			h.noDischarg++
			continue
		}
		h.energyAll++
		h.energy = keepWorst(h.energy, p, htmlMaxEnergyRows, func(a, b energyPoint) bool {
			if a.ratio != b.ratio {
				return a.ratio > b.ratio
			}
			return a.seq < b.seq
		})
	}
	return nil
}

// leads reports whether an object of verdict v and ratio r sets its station's
// verdict before one of verdict lv and ratio lr (ties: the earlier object).
func leads(v assess.Verdict, r float64, lv assess.Verdict, lr float64) bool {
	if v.Severity() != lv.Severity() {
		return v.Severity() > lv.Severity()
	}
	if math.IsNaN(lr) {
		return !math.IsNaN(r)
	}
	return r > lr
}

// keepWorst inserts p into xs (sorted by before) and keeps the first max.
func keepWorst(xs []energyPoint, p energyPoint, max int, before func(a, b energyPoint) bool) []energyPoint {
	i := sort.Search(len(xs), func(i int) bool { return before(p, xs[i]) })
	if i >= max {
		return xs
	}
	xs = append(xs, energyPoint{})
	copy(xs[i+1:], xs[i:])
	xs[i] = p
	if len(xs) > max {
		xs = xs[:max]
	}
	return xs
}

// WriteHTML writes the HTML report of an audit held whole (a.Objects filled);
// hum may be nil (no humidity plot).
func WriteHTML(w io.Writer, a *assess.Audit, info RunInfo, hum *HumidityGrid) error {
	h := NewHTMLWriter()
	if err := h.Add(a.Objects); err != nil {
		return err
	}
	return h.Finish(a, info, hum, w)
}

// Finish writes the report of a (its Stations, Findings and Counts; the
// objects came through Add) to out.
func (h *HTMLWriter) Finish(a *assess.Audit, info RunInfo, hum *HumidityGrid, out io.Writer) error {
	if a == nil || a.Survey == nil {
		return errors.New("write HTML: no audit or no survey")
	}
	page := h.page(a, info, hum)
	if err := htmlTmpl.Execute(out, page); err != nil {
		return fmt.Errorf("write HTML: %w", err)
	}
	return nil
}

// htmlPage is what the template reads; every string is plain text (the
// template escapes it), every number of the plots is already laid out.
type htmlPage struct {
	Site, Date, SurveyedBy, RH, Temperature, Margin string
	SurveyFile, SHA, Tool, Command                  string
	Sampled                                         string
	CautionLine                                     string
	Cautions                                        []string
	Counts                                          []htmlCount
	Objects, FindingsN                              int
	Stations                                        []htmlStation
	Findings                                        []htmlFinding
	Energy                                          *rowChart
	EnergyNote                                      string
	Humidity                                        *gridChart
	Spread                                          *rowChart
	SpreadNote                                      string
	Atmospheres                                     []htmlAtmosphere
	OtherBorder                                     []htmlBorder
	OtherNote                                       string
	Principles                                      []templates.Principle
	Formulas                                        []templates.MethodNote
	Defaults                                        []assess.Mark
	Verdicts                                        []htmlVerdictKey
	Rejected                                        int
	BorderlinePct                                   string
}

// htmlAtmosphere is one atmosphere a ranked station names.
type htmlAtmosphere struct {
	ID, Description, Kind, Zone, Group, MIE string
}

// htmlBorder is a borderline object whose verdict rests on a check other
// than its energy against an MIE, with its sampled verdict shares.
type htmlBorder struct {
	Object, Station, Verdict, Class, Shares string
}

type htmlCount struct {
	Verdict, Class   string
	Objects, Finding int
}

type htmlVerdictKey struct {
	Verdict, Class, Meaning string
	Mark                    string // the SVG path of its mark
}

type htmlStation struct {
	Rank                                 int
	ID, Name, Atmosphere, Verdict, Class string
	AtmosphereDetail                     string
	Ratio, Reason, Notes, Probability    string
	Objects, Incendive, Marginal         int
	NonIncendive, NotAssessed            int
}

type htmlFinding struct {
	Severity, Class, Station, Object, Check string
	Message, Basis, Mitigation              string
}

func verdictClass(v assess.Verdict) string {
	switch v {
	case assess.Incendive:
		return "v-inc"
	case assess.Marginal:
		return "v-mar"
	case assess.NonIncendive:
		return "v-non"
	}
	return "v-na"
}

// requiredMargin is the margin the assessment applied (assess.prepare): the
// Site sheet's when given, else assess.DefaultMargin.
func requiredMargin(a *assess.Audit) float64 {
	if m := a.Survey.Site.RequiredMargin; m.Known && m.Value > 0 {
		return m.Value
	}
	return assess.DefaultMargin
}

func (h *HTMLWriter) page(a *assess.Audit, info RunInfo, hum *HumidityGrid) htmlPage {
	site := a.Survey.Site
	margin := requiredMargin(a)
	p := htmlPage{
		Site: siteName(a), Date: dateText(a), SurveyedBy: orText(site.SurveyedBy, "not given"),
		RH:          "not given on the Site sheet (the workbook's Method sheet shows the value applied)",
		Temperature: plainNumber(kelvinToCelsius(assess.DefaultTemperature)) + " °C",
		Margin:      plainNumber(margin),
		SurveyFile:  info.file(a), SHA: info.sha(a), Tool: info.tool() + " " + info.ToolVersion, Command: info.CommandLine,
		CautionLine: templates.CautionLine, Cautions: templates.Cautions(),
		Principles: templates.Principles(), Formulas: templates.MethodNotes(), Defaults: a.MethodDefaults,
		Rejected: a.Survey.RejectedUsed(), BorderlinePct: plainNumber(100*assess.BorderlineThreshold) + " %",
	}
	if site.Defaulted(inventory.SiteItemRequiredMargin) || !(site.RequiredMargin.Known && site.RequiredMargin.Value > 0) {
		p.Margin += " (default: not given on the Site sheet)"
	}
	if rh := site.RelativeHumidity; rh.Known {
		p.RH = plainNumber(rh.Value) + " %"
	}
	if t := site.AirTemperature; t.Known && t.Value > 0 {
		p.Temperature = plainNumber(kelvinToCelsius(t.Value)) + " °C"
	}
	if t := site.AirTemperature; !(t.Known && t.Value > 0) || site.Defaulted(inventory.SiteItemAirTemperature) {
		p.Temperature += " (default: not given on the Site sheet)"
	}
	if a.Options.Samples > 0 {
		p.Sampled = fmt.Sprintf("Monte Carlo, %d samples per object, seed %d", a.Options.Samples, a.Options.Seed)
	}
	findingsBy := map[assess.Verdict]int{}
	for _, f := range a.Findings {
		findingsBy[f.Severity]++
	}
	for _, v := range verdictOrder() {
		p.Counts = append(p.Counts, htmlCount{Verdict: v.String(), Class: verdictClass(v), Objects: a.Counts[v], Finding: findingsBy[v]})
		p.Objects += a.Counts[v]
		p.Verdicts = append(p.Verdicts, htmlVerdictKey{Verdict: v.String(), Class: verdictClass(v), Meaning: verdictMeaning(v, margin), Mark: markPath(v, 7, 7, 6)})
	}
	p.FindingsN = len(a.Findings)
	firstFinding := map[string]*assess.Finding{}
	for i := range a.Findings {
		f := &a.Findings[i]
		if _, ok := firstFinding[f.StationID]; !ok {
			firstFinding[f.StationID] = f
		}
	}
	for i := range a.Stations {
		st := &a.Stations[i]
		hs := htmlStation{Rank: st.Rank, ID: st.Station.ID, Name: st.Station.Name, Atmosphere: atmosphereID(st.Atmosphere),
			Verdict: st.Verdict.String(), Class: verdictClass(st.Verdict), Objects: len(st.Objects),
			Incendive: st.Counts[assess.Incendive], Marginal: st.Counts[assess.Marginal],
			NonIncendive: st.Counts[assess.NonIncendive], NotAssessed: st.Counts[assess.NotAssessed],
			Notes: strings.Join(st.Notes(), "; ")}
		hs.AtmosphereDetail = atmosphereDetail(st.Atmosphere)
		hs.Ratio = htmlRatioText(st)
		hs.Reason = stationReason(st, firstFinding[st.Station.ID], h.lead[st.Station.ID])
		if st.ProbabilityAnyIncendive != nil {
			hs.Probability = book.UnitProbability.Text(*st.ProbabilityAnyIncendive)
		}
		p.Stations = append(p.Stations, hs)
	}
	seenAtm := map[string]bool{}
	for i := range a.Stations {
		at := a.Stations[i].Atmosphere
		if at == nil || seenAtm[at.ID] {
			continue
		}
		seenAtm[at.ID] = true
		ha := htmlAtmosphere{ID: at.ID, Description: orText(at.Description, at.Substance), Kind: at.Kind, Zone: at.Zone, Group: at.Group, MIE: "not given"}
		if at.MIE.Known {
			ha.MIE = book.UnitMJ.Text(at.MIE.Value)
			if at.MIEFromSubstance {
				ha.MIE += " (built-in value for " + at.Substance + ")"
			}
		}
		if at.GroupFromSubstance && ha.Group != "" {
			ha.Group += " (built-in)"
		}
		p.Atmospheres = append(p.Atmospheres, ha)
	}
	for _, f := range a.Findings {
		p.Findings = append(p.Findings, htmlFinding{Severity: f.Severity.String(), Class: verdictClass(f.Severity), Station: f.StationID,
			Object: f.ObjectID, Check: f.Check, Message: f.Message, Basis: f.Basis, Mitigation: f.Mitigation})
	}
	p.Energy = energyChart(h.energy, margin, false)
	if h.energyAll > len(h.energy) {
		p.EnergyNote = fmt.Sprintf("The %d objects with the highest ratio are drawn; %d more with a lower ratio are in the workbook's Objects sheet.", len(h.energy), h.energyAll-len(h.energy))
	}
	if h.noDischarg > 0 {
		p.EnergyNote = strings.TrimSpace(p.EnergyNote + fmt.Sprintf(" %d object(s) in a flammable atmosphere have no possible discharge and are not drawn.", h.noDischarg))
	}
	if a.Options.Samples > 0 {
		p.Spread = energyChart(h.spread, margin, true)
		for _, o := range h.other {
			p.OtherBorder = append(p.OtherBorder, htmlBorder{Object: o.object, Station: o.station, Verdict: o.verdict.String(), Class: verdictClass(o.verdict), Shares: sharesText(o.prob)})
		}
		if h.otherAll > len(h.other) {
			p.OtherNote = fmt.Sprintf("%d more are in the workbook's Objects sheet.", h.otherAll-len(h.other))
		}
		switch {
		case h.spreadAll == 0 && h.otherAll == 0:
			p.SpreadNote = fmt.Sprintf("No object is borderline: for every object the most likely sampled verdict is the point verdict, and no more severe verdict is likelier than %s.", plainNumber(100*assess.BorderlineThreshold)+" %")
		case h.spreadAll == 0:
			p.SpreadNote = "No borderline object has a sampled energy against an MIE to draw."
		case h.spreadAll > len(h.spread):
			p.SpreadNote = fmt.Sprintf("The %d borderline objects whose 95th percentile comes closest to (or furthest past) their MIE are drawn; %d more are in the workbook.", len(h.spread), h.spreadAll-len(h.spread))
		}
	}
	if hum != nil && len(hum.RH) > 0 {
		p.Humidity = humidityChart(hum, a)
	}
	return p
}

func orText(s, alt string) string {
	if strings.TrimSpace(s) == "" {
		return alt
	}
	return s
}

// kelvinToCelsius gives a temperature in °C to 0.1 °C.
func kelvinToCelsius(k float64) float64 { return math.Round((k-273.15)*10) / 10 }

// htmlRatioText is the worst ratio in words, as every output writes it
// (stationRatioText): never a bare 0 beside a verdict.
func htmlRatioText(st *assess.StationResult) string {
	if t := stationRatioText(st); t != "" {
		return t
	}
	return book.UnitRatio.Text(*st.WorstRatio)
}

// stationReason is the station's main reason: the most severe finding at the
// station (the findings are ordered by severity), else the reason of the
// object that sets its verdict.
func stationReason(st *assess.StationResult, f *assess.Finding, lead stationLead) string {
	if m := st.Main.String(); m != "" { // the reason the assessment gave the station (as on the Stations sheet)
		return m
	}
	if f != nil && f.Severity.Severity() >= st.Verdict.Severity() {
		return f.ObjectID + ": " + f.Message
	}
	if lead.object != "" && lead.reason != "" {
		return lead.object + ": " + lead.reason
	}
	if f != nil {
		return f.ObjectID + ": " + f.Message
	}
	if st.Verdict == assess.NonIncendive {
		return "no check failed"
	}
	return ""
}

func verdictMeaning(v assess.Verdict, margin float64) string {
	m := book.UnitDimless.Text(margin)
	switch v {
	case assess.Incendive:
		return "a possible discharge reaches the MIE of the atmosphere, or a check that implies ignition failed"
	case assess.Marginal:
		return "energy below the MIE but reaching MIE / " + m + " (the required margin), or a limit of a standard or a screening check is not met (earthing, insulating area, liquids, bags, a reading the model contradicts)"
	case assess.NonIncendive:
		return "every possible discharge stays below MIE / " + m + " and every check passed; not a permit to work"
	}
	return "an input the model needs is missing: the object is not judged (treat it as the stricter case until measured)"
}

// atmosphereDetail is the zone, group and MIE of an atmosphere in one short
// line ("zone 1 · IIA · MIE 0.24 mJ"); "" for none.
func atmosphereDetail(a *inventory.Atmosphere) string {
	if a == nil {
		return ""
	}
	var parts []string
	if a.Zone != "" {
		parts = append(parts, "zone "+a.Zone)
	}
	if a.Group != "" {
		parts = append(parts, a.Group)
	}
	if a.MIE.Known {
		parts = append(parts, "MIE "+book.UnitMJ.Text(a.MIE.Value))
	}
	return strings.Join(parts, " · ")
}

// sharesText is the sampled verdict shares in words, most severe first:
// "incendive 6.4 %, marginal 0 %, non-incendive 93.6 %" (not assessed only
// when sampled).
func sharesText(p *assess.Probability) string {
	parts := []string{
		"incendive " + book.UnitProbability.Text(p.Incendive),
		"marginal " + book.UnitProbability.Text(p.Marginal),
		"non-incendive " + book.UnitProbability.Text(p.NonIncendive),
	}
	if p.NotAssessed > 0 {
		parts = append(parts, "not assessed "+book.UnitProbability.Text(p.NotAssessed))
	}
	return strings.Join(parts, ", ")
}

// atmosphereID is the atmosphere's ID, "none" when the station has none.
func atmosphereID(a *inventory.Atmosphere) string {
	if a == nil {
		return "none"
	}
	return a.ID
}
