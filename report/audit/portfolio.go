package audit

import (
	"cmp"
	"encoding/json"
	"fmt"
	"io"
	"slices"
	"time"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
	"github.com/sparkmargin/sparkmargin/templates"
	"github.com/xuri/excelize/v2"
)

// Sheet names of the portfolio workbook, in order.
const (
	PortfolioSummary  = "Summary"
	PortfolioSites    = "Sites"
	PortfolioStations = "Stations"
	PortfolioCautions = "Cautions"
)

// PortfolioSurvey is one assessed survey (one site) of a portfolio, kept
// small: its identity, counts and station results, not its objects.
type PortfolioSurvey struct {
	File       string // the survey's file name
	SHA256     string
	Audit      string // the audit workbook written for it
	Site       string
	SurveyDate time.Time
	Counts     map[assess.Verdict]int // objects by verdict
	Findings   int
	Rejected   int // survey rows rejected
	Stations   []PortfolioStation
}

// PortfolioStation is one station of a portfolio survey.
type PortfolioStation struct {
	ID, Name, Line string
	SiteRank       int // the station's rank within its survey
	Verdict        assess.Verdict
	WorstRatio     *float64
	Objects        int
	Counts         map[assess.Verdict]int
}

// PortfolioFailure is a survey that could not be assessed, and why.
type PortfolioFailure struct {
	File   string
	Reason string
}

// Portfolio is the set of surveys assessed in one run.
type Portfolio struct {
	Surveys []PortfolioSurvey
	Failed  []PortfolioFailure
}

// PortfolioEntry keeps what the portfolio needs of an audit.
func PortfolioEntry(a *assess.Audit, file, audit string) PortfolioSurvey {
	p := PortfolioSurvey{File: file, Audit: audit, Counts: map[assess.Verdict]int{}, Findings: len(a.Findings)}
	if s := a.Survey; s != nil {
		p.SHA256, p.Site, p.SurveyDate, p.Rejected = s.SHA256, s.Site.Name, s.Site.SurveyDate, len(s.Rejected)
	}
	for v, n := range a.Counts {
		p.Counts[v] = n
	}
	for _, st := range a.Stations {
		ps := PortfolioStation{ID: st.Station.ID, Name: st.Station.Name, Line: st.Station.Line, SiteRank: st.Rank,
			Verdict: st.Verdict, Objects: len(st.Objects), Counts: map[assess.Verdict]int{}}
		if r := book.FinitePtr(st.WorstRatio); r != nil {
			v := *r
			ps.WorstRatio = &v
		}
		for v, n := range st.Counts {
			ps.Counts[v] = n
		}
		p.Stations = append(p.Stations, ps)
	}
	return p
}

// RankedSite is a survey with its rank across the portfolio.
type RankedSite struct {
	Rank int
	*PortfolioSurvey
	Verdict    assess.Verdict // the worst station's
	WorstRatio *float64
}

// RankedStation is a station with its rank across the portfolio.
type RankedStation struct {
	Rank int
	Site *PortfolioSurvey
	*PortfolioStation
}

// ratioFirst orders worst ratio (descending, none last), then incendive and
// marginal counts (more first); 0 when those tie.
func ratioFirst(ra, rb *float64, ca, cb map[assess.Verdict]int) int {
	switch {
	case ra != nil && rb == nil:
		return -1
	case ra == nil && rb != nil:
		return 1
	case ra != nil && *ra != *rb:
		return -cmp.Compare(*ra, *rb)
	}
	if c := cmp.Compare(cb[assess.Incendive], ca[assess.Incendive]); c != 0 {
		return c
	}
	return cmp.Compare(cb[assess.Marginal], ca[assess.Marginal])
}

// Sites ranks the surveys worst first: by worst station ratio, then the
// numbers of incendive and marginal objects, then file name (the same order
// as the stations of one audit).
func (p *Portfolio) Sites() []RankedSite {
	out := make([]RankedSite, len(p.Surveys))
	for i := range p.Surveys {
		s := &p.Surveys[i]
		rs := RankedSite{PortfolioSurvey: s, Verdict: assess.NotAssessed}
		for j := range s.Stations {
			st := &s.Stations[j]
			if st.Objects > 0 && (rs.Verdict == assess.NotAssessed || st.Verdict.Severity() > rs.Verdict.Severity()) {
				rs.Verdict = st.Verdict
			}
			if st.WorstRatio != nil && (rs.WorstRatio == nil || *st.WorstRatio > *rs.WorstRatio) {
				rs.WorstRatio = st.WorstRatio
			}
		}
		out[i] = rs
	}
	slices.SortStableFunc(out, func(a, b RankedSite) int {
		if c := ratioFirst(a.WorstRatio, b.WorstRatio, a.Counts, b.Counts); c != 0 {
			return c
		}
		return cmp.Compare(a.File, b.File)
	})
	for i := range out {
		out[i].Rank = i + 1
	}
	return out
}

// Stations ranks every station of every survey worst first, in the order of
// one audit's stations (ties by station ID), then by survey file.
func (p *Portfolio) Stations() []RankedStation {
	var out []RankedStation
	for i := range p.Surveys {
		s := &p.Surveys[i]
		for j := range s.Stations {
			out = append(out, RankedStation{Site: s, PortfolioStation: &s.Stations[j]})
		}
	}
	slices.SortStableFunc(out, func(a, b RankedStation) int {
		if c := ratioFirst(a.WorstRatio, b.WorstRatio, a.Counts, b.Counts); c != 0 {
			return c
		}
		if c := cmp.Compare(a.ID, b.ID); c != 0 {
			return c
		}
		return cmp.Compare(a.Site.File, b.Site.File)
	})
	for i := range out {
		out[i].Rank = i + 1
	}
	return out
}

func (p *Portfolio) totals() map[assess.Verdict]int {
	t := map[assess.Verdict]int{}
	for _, s := range p.Surveys {
		for v, n := range s.Counts {
			t[v] += n
		}
	}
	return t
}

// Columns of the portfolio's Sites sheet the Summary chart points at.
const (
	sitesLabelCol = "B"
	sitesRatioCol = "F"
)

// PortfolioTitlePrefix begins the document title of every portfolio
// workbook; a folder run knows its previous portfolio by it.
const PortfolioTitlePrefix = "Electrostatic ignition screening portfolio: "

// WritePortfolio writes the portfolio workbook: Summary (surveys assessed and
// not, objects by verdict, the chart of each site's worst ratio), Sites
// (surveys ranked worst first), Stations (every station ranked across the
// portfolio: site, station, rank, verdict, worst ratio) and Cautions. The
// package parts are in canonical order, so the same portfolio gives the same bytes.
func WritePortfolio(w io.Writer, p Portfolio, info RunInfo) error {
	f := excelize.NewFile(excelize.Options{TmpDir: info.TmpDir})
	defer func() { _ = f.Close() }()
	name := fmt.Sprintf("portfolio of %d surveys", len(p.Surveys))
	wb := &workbook{f: f, st: book.NewStyles(f), info: info, a: &assess.Audit{Survey: &inventory.Survey{Site: inventory.Site{Name: name}}}}
	if err := f.SetSheetName("Sheet1", PortfolioSummary); err != nil {
		return fmt.Errorf("write portfolio: %w", err)
	}
	for _, s := range []string{PortfolioSites, PortfolioStations, PortfolioCautions} {
		if _, err := f.NewSheet(s); err != nil {
			return fmt.Errorf("write portfolio: sheet %s: %w", s, err)
		}
	}
	sites, stations := p.Sites(), p.Stations()
	count := func(c map[assess.Verdict]int, v assess.Verdict) book.Cell { return book.Integer(c[v]) }
	siteCols := []book.Column[RankedSite]{
		{Header: "Rank", Width: 6, Value: func(s RankedSite) book.Cell { return book.Integer(s.Rank) }},
		{Header: "Site", Width: 30, Value: func(s RankedSite) book.Cell { return book.WrapText(siteLabel(s.PortfolioSurvey)) }},
		{Header: "Survey file", Width: 22, Value: func(s RankedSite) book.Cell { return book.WrapText(s.File) }},
		{Header: "Survey date", Width: 11, Value: func(s RankedSite) book.Cell { return book.OptText(dateOf(s.SurveyDate)) }},
		{Header: "Verdict", Width: 14, Value: func(s RankedSite) book.Cell { return verdictCell(s.Verdict) }},
		{Header: book.UnitRatio.Header("Worst ratio E/MIE"), Width: 11, Value: func(s RankedSite) book.Cell { return ratioText(s.WorstRatio) }},
		{Header: "Stations [count]", Width: 9, Value: func(s RankedSite) book.Cell { return book.Integer(len(s.Stations)) }},
		{Header: "Objects [count]", Width: 9, Value: func(s RankedSite) book.Cell { return book.Integer(total(s.Counts)) }},
		{Header: "Incendive [count]", Width: 10, Value: func(s RankedSite) book.Cell { return count(s.Counts, assess.Incendive) }},
		{Header: "Marginal [count]", Width: 10, Value: func(s RankedSite) book.Cell { return count(s.Counts, assess.Marginal) }},
		{Header: "Non-incendive [count]", Width: 11, Value: func(s RankedSite) book.Cell { return count(s.Counts, assess.NonIncendive) }},
		{Header: "Not assessed [count]", Width: 10, Value: func(s RankedSite) book.Cell { return count(s.Counts, assess.NotAssessed) }},
		{Header: "Findings [count]", Width: 9, Value: func(s RankedSite) book.Cell { return book.Integer(s.Findings) }},
		{Header: "Rows rejected [count]", Width: 10, Value: func(s RankedSite) book.Cell { return book.Integer(s.Rejected) }},
		{Header: "Audit workbook", Width: 30, Value: func(s RankedSite) book.Cell { return book.WrapText(s.Audit) }},
	}
	stationCols := []book.Column[RankedStation]{
		{Header: "Rank", Width: 6, Value: func(s RankedStation) book.Cell { return book.Integer(s.Rank) }},
		{Header: "Site", Width: 30, Value: func(s RankedStation) book.Cell { return book.WrapText(siteLabel(s.Site)) }},
		{Header: "Survey file", Width: 22, Value: func(s RankedStation) book.Cell { return book.WrapText(s.Site.File) }},
		{Header: "Station", Width: 10, Value: func(s RankedStation) book.Cell { return book.Text(s.ID) }},
		{Header: "Name", Width: 24, Value: func(s RankedStation) book.Cell { return book.WrapText(s.Name) }},
		{Header: "Line", Width: 14, Value: func(s RankedStation) book.Cell { return book.WrapText(s.Line) }},
		{Header: "Rank in site", Width: 8, Value: func(s RankedStation) book.Cell { return book.Integer(s.SiteRank) }},
		{Header: "Verdict", Width: 14, Value: func(s RankedStation) book.Cell { return verdictCell(s.Verdict) }},
		{Header: book.UnitRatio.Header("Worst ratio E/MIE"), Width: 11, Value: func(s RankedStation) book.Cell { return ratioText(s.WorstRatio) }},
		{Header: "Objects [count]", Width: 9, Value: func(s RankedStation) book.Cell { return book.Integer(s.Objects) }},
		{Header: "Incendive [count]", Width: 10, Value: func(s RankedStation) book.Cell { return count(s.Counts, assess.Incendive) }},
		{Header: "Marginal [count]", Width: 10, Value: func(s RankedStation) book.Cell { return count(s.Counts, assess.Marginal) }},
	}
	if err := tableSheetNormal(wb, PortfolioSites, siteCols, sites); err != nil {
		return fmt.Errorf("write portfolio: sheet %s: %w", PortfolioSites, err)
	}
	if err := tableSheetStream(wb, PortfolioStations, stationCols, len(stations), func(i int) RankedStation { return stations[i] }, 1, "", 0); err != nil {
		return fmt.Errorf("write portfolio: sheet %s: %w", PortfolioStations, err)
	}
	if err := portfolioCautions(wb); err != nil {
		return fmt.Errorf("write portfolio: sheet %s: %w", PortfolioCautions, err)
	}
	if err := portfolioSummary(wb, p, sites, info); err != nil {
		return fmt.Errorf("write portfolio: sheet %s: %w", PortfolioSummary, err)
	}
	if wb.st.Err() != nil {
		return fmt.Errorf("write portfolio: %w", wb.st.Err())
	}
	f.SetActiveSheet(0)
	d := portfolioDate(p).Format("2006-01-02T15:04:05Z")
	if err := f.SetDocProps(&excelize.DocProperties{
		Creator: info.tool() + " " + info.ToolVersion, LastModifiedBy: info.tool(), Created: d, Modified: d,
		Title: PortfolioTitlePrefix + name, Subject: "Screening estimates; see the Cautions sheet", Language: "en",
	}); err != nil {
		return fmt.Errorf("write portfolio: document properties: %w", err)
	}
	if err := book.WriteCanonical(f, w, info.TmpDir); err != nil {
		return fmt.Errorf("write portfolio: %w", err)
	}
	return nil
}

func siteLabel(s *PortfolioSurvey) string {
	if s.Site == "" {
		return "site not named"
	}
	return s.Site
}

func dateOf(t time.Time) string {
	if t.IsZero() {
		return ""
	}
	return t.UTC().Format("2006-01-02")
}

func total(c map[assess.Verdict]int) int {
	n := 0
	for _, v := range c {
		n += v
	}
	return n
}

// portfolioDate is the latest survey date (a fixed date when none), so that
// the document properties never depend on the clock.
func portfolioDate(p Portfolio) time.Time {
	var d time.Time
	for _, s := range p.Surveys {
		if s.SurveyDate.After(d) {
			d = s.SurveyDate
		}
	}
	if d.IsZero() {
		return time.Date(2000, 1, 1, 0, 0, 0, 0, time.UTC)
	}
	return d.UTC()
}

func portfolioCautions(wb *workbook) error {
	rows := make([]string, len(templates.Cautions()))
	copy(rows, templates.Cautions())
	type crow struct {
		n int
		s string
	}
	cs := make([]crow, len(rows))
	for i, s := range rows {
		cs[i] = crow{i + 1, s}
	}
	return tableSheetNormal(wb, PortfolioCautions, []book.Column[crow]{
		{Header: "#", Width: 5, Value: func(c crow) book.Cell { return book.Integer(c.n) }},
		{Header: "Caution", Width: 120, Value: func(c crow) book.Cell { return book.WrapText(c.s) }},
	}, cs)
}

func portfolioSummary(wb *workbook, p Portfolio, sites []RankedSite, info RunInfo) error {
	f, s := wb.f, PortfolioSummary
	if err := book.SetWidths(f, s, []float64{30, 14, 40, 14, 12, 10, 10, 10, 10, 10}); err != nil {
		return err
	}
	sink := book.NormalSink{F: f, Sheet: s, St: wb.st}
	if err := f.SetCellValue(s, "A1", "Electrostatic ignition screening portfolio"); err != nil {
		return err
	}
	if err := f.SetCellStyle(s, "A1", "A1", wb.st.Title()); err != nil {
		return err
	}
	if err := wb.cautionBox(s); err != nil {
		return err
	}
	r := 4
	kv := func(k string, v book.Cell) error {
		v.Align = "left"
		err := sink.Row(r, []book.Cell{book.BoldText(k), v}, 0)
		r++
		return err
	}
	tot := p.totals()
	if err := kv("Surveys assessed", book.Integer(len(p.Surveys))); err != nil {
		return err
	}
	if err := kv("Surveys not assessed", book.Integer(len(p.Failed))); err != nil {
		return err
	}
	if err := kv("Objects [count]", book.Integer(total(tot))); err != nil {
		return err
	}
	for _, v := range verdictOrder() {
		if err := kv(v.String()+" [count]", book.Integer(tot[v])); err != nil {
			return err
		}
	}
	if err := kv("Tool", book.Text(info.tool()+" "+info.ToolVersion)); err != nil {
		return err
	}
	if len(p.Failed) > 0 {
		r++
		if err := sink.Header(r, []string{"Survey not assessed", "", "Why"}); err != nil {
			return err
		}
		r++
		for _, fl := range p.Failed {
			if err := sink.Row(r, []book.Cell{book.WrapText(fl.File), {}, book.WrapText(fl.Reason)}, wrappedHeight(fl.Reason, 40)); err != nil {
				return err
			}
			r++
		}
	}
	r++
	if len(sites) > 0 {
		n := len(sites) + 1
		var st []assess.StationResult
		for _, x := range sites {
			st = append(st, assess.StationResult{WorstRatio: x.WorstRatio})
		}
		lo, hi := ratioAxis(st)
		sheet := "'" + PortfolioSites + "'"
		gap := uint(60)
		if err := f.AddChart(s, fmt.Sprintf("A%d", r), &excelize.Chart{
			Type: excelize.Bar,
			Series: []excelize.ChartSeries{{
				Name:       sheet + "!$" + sitesRatioCol + "$1",
				Categories: fmt.Sprintf("%s!$%s$2:$%s$%d", sheet, sitesLabelCol, sitesLabelCol, n),
				Values:     fmt.Sprintf("%s!$%s$2:$%s$%d", sheet, sitesRatioCol, sitesRatioCol, n),
				Fill:       excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"4D4D4D"}},
			}},
			Format:    excelize.GraphicOptions{OffsetX: 4, OffsetY: 4},
			Dimension: excelize.ChartDimension{Width: 900, Height: uint(chartRows(len(sites))*20 - 8)},
			Legend:    excelize.ChartLegend{Position: "none"},
			Title:     excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: "Worst ratio E/MIE per site (log scale)", Font: &excelize.Font{Size: 11, Bold: true}}}},
			XAxis:     excelize.ChartAxis{ReverseOrder: true, Font: excelize.Font{Size: 9, Color: "000000"}},
			YAxis: excelize.ChartAxis{LogBase: 10, Minimum: &lo, Maximum: &hi, MajorGridLines: true, Font: excelize.Font{Size: 9, Color: "000000"},
				Title: excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: "effective energy / MIE [–]", Font: &excelize.Font{Size: 9, Color: "000000"}}}}},
			GapWidth:     &gap,
			ShowBlanksAs: "gap",
		}); err != nil {
			return err
		}
	}
	return wb.printSetup(s, 1, "", "")
}

// WritePortfolioJSON writes the portfolio as JSON: the surveys assessed and
// not, the sites ranked and every station ranked across the portfolio, SI
// values, null where there is no ratio, and the cautions. Key order is fixed.
func WritePortfolioJSON(w io.Writer, p Portfolio, info RunInfo) error {
	type jsite struct {
		Rank       int               `json:"rank"`
		Site       string            `json:"site"`
		File       string            `json:"file"`
		SHA256     string            `json:"sha256"`
		SurveyDate string            `json:"survey_date"`
		Audit      string            `json:"audit"`
		Verdict    string            `json:"verdict"`
		WorstRatio *float64          `json:"worst_ratio"`
		Stations   int               `json:"stations"`
		Objects    jsonVerdictCounts `json:"objects"`
		Findings   int               `json:"findings"`
		Rejected   int               `json:"rows_rejected"`
	}
	type jstation struct {
		Rank       int               `json:"rank"`
		Site       string            `json:"site"`
		File       string            `json:"file"`
		Station    string            `json:"station"`
		Name       string            `json:"name"`
		Line       string            `json:"line"`
		SiteRank   int               `json:"rank_in_site"`
		Verdict    string            `json:"verdict"`
		WorstRatio *float64          `json:"worst_ratio"`
		Objects    jsonVerdictCounts `json:"objects"`
	}
	type jfail struct {
		File   string `json:"file"`
		Reason string `json:"reason"`
	}
	doc := struct {
		Tool     jsonTool          `json:"tool"`
		Workbook *jsonSurvey       `json:"workbook,omitempty"` // the portfolio workbook written with this JSON
		Objects  jsonVerdictCounts `json:"objects"`
		Sites    []jsite           `json:"sites"`
		Stations []jstation        `json:"stations"`
		Failed   []jfail           `json:"not_assessed"`
		Cautions []string          `json:"cautions"`
	}{Tool: jsonTool{info.tool(), info.ToolVersion}, Workbook: workbookRecord(info), Objects: verdictCounts(p.totals()), Sites: []jsite{}, Stations: []jstation{}, Failed: []jfail{}, Cautions: templates.Cautions()}
	for _, s := range p.Sites() {
		doc.Sites = append(doc.Sites, jsite{s.Rank, s.Site, s.File, s.SHA256, dateOf(s.SurveyDate), s.Audit, s.Verdict.String(),
			s.WorstRatio, len(s.Stations), verdictCounts(s.Counts), s.Findings, s.Rejected})
	}
	for _, s := range p.Stations() {
		doc.Stations = append(doc.Stations, jstation{s.Rank, s.Site.Site, s.Site.File, s.ID, s.Name, s.Line, s.SiteRank,
			s.Verdict.String(), s.WorstRatio, verdictCounts(s.Counts)})
	}
	for _, fl := range p.Failed {
		doc.Failed = append(doc.Failed, jfail{fl.File, fl.Reason})
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	if err := enc.Encode(doc); err != nil {
		return fmt.Errorf("write portfolio JSON: %w", err)
	}
	return nil
}
