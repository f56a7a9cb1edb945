package audit

import (
	"cmp"
	"encoding/json"
	"fmt"
	"io"
	"slices"
	"strings"
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
	PortfolioTrend    = "Trend"
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
	SiteID     string   // the optional Site ID item
	Lines      []string // the stations' lines, distinct, sorted
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
	// WorstRatioAssumed: the worst ratio rests on an assumed resistance to
	// earth (assess.StationResult.WorstRatioAssumed): at least 1, its size no
	// figure, so the portfolio neither ranks nor draws by it.
	WorstRatioAssumed bool
	Objects           int
	Counts            map[assess.Verdict]int
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
		p.SHA256, p.Site, p.SiteID, p.SurveyDate, p.Rejected = s.SHA256, s.Site.Name, s.Site.ID, s.Site.SurveyDate, s.RejectedUsed()
		for _, st := range s.Stations {
			if l := strings.TrimSpace(st.Line); l != "" && !slices.Contains(p.Lines, l) {
				p.Lines = append(p.Lines, l)
			}
		}
		slices.Sort(p.Lines)
	}
	for v, n := range a.Counts {
		p.Counts[v] = n
	}
	for _, st := range a.Stations {
		ps := PortfolioStation{ID: st.Station.ID, Name: st.Station.Name, Line: st.Station.Line, SiteRank: st.Rank,
			Verdict: st.Verdict, WorstRatioAssumed: st.WorstRatioAssumed, Objects: len(st.Objects), Counts: map[assess.Verdict]int{}}
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

// Repeat surveys. A portfolio may hold several surveys of one site: the
// surveys are grouped by site identity (Groups), and only the latest survey
// of each site is ranked; the earlier ones are its trend. The latest is the
// one with the latest survey date; a survey without a date (a draft) never
// beats a dated one and is shown in the trend as a draft (give it its date to
// rank it); when every survey of a site is a draft, the one with more objects
// assessed, then the last by file name, is taken. Two surveys of one site on
// the same date: the one with more objects assessed, then the last by file
// name, is taken and the other shown as earlier. A screening choice of this tool.

// RepeatSurveysNote says how the portfolio reads repeat surveys (Cautions sheet, JSON).
const RepeatSurveysNote = "Repeat surveys: surveys are one site when they give the same Site ID, else when they give the same site name (case and spaces aside) and their stations share a line (the same name on lines with nothing in common is two lines of one works: two sites); give a Site ID to say it outright. A screening choice of this tool. Only the latest dated survey of each site is ranked and counted; earlier surveys and drafts without a survey date are shown on the Trend sheet and never outrank a dated survey; of two surveys on one date, the one with more objects assessed, then the last by file name, is ranked. Sites or stations with the same verdict and worst ratio share a rank (=2)."

// normName is a name compared: lower case, runs of spaces as one.
func normName(s string) string { return strings.ToLower(strings.Join(strings.Fields(s), " ")) }

// siteKey is the survey's site identity before its lines are looked at: its
// Site ID when given, else its site name; "" when it names neither.
func (s *PortfolioSurvey) siteKey() string {
	if id := normName(s.SiteID); id != "" {
		return "id:" + id
	}
	if n := normName(s.Site); n != "" {
		return "site:" + n
	}
	return ""
}

// lineSet is the survey's station lines, compared as names.
func (s *PortfolioSurvey) lineSet() map[string]bool {
	m := map[string]bool{}
	for _, l := range s.Lines {
		if n := normName(l); n != "" {
			m[n] = true
		}
	}
	return m
}

// dateText is the survey date, or "draft (no date)".
func (s *PortfolioSurvey) dateText() string {
	if s.SurveyDate.IsZero() {
		return "draft (no date)"
	}
	return dateOf(s.SurveyDate)
}

// newerFirst orders the surveys of one site: dated before drafts, later dates
// first, then more objects assessed first, then file name descending.
func newerFirst(a, b *PortfolioSurvey) int {
	switch az, bz := a.SurveyDate.IsZero(), b.SurveyDate.IsZero(); {
	case az && !bz:
		return 1
	case !az && bz:
		return -1
	}
	if c := b.SurveyDate.Compare(a.SurveyDate); c != 0 {
		return c
	}
	if c := cmp.Compare(total(b.Counts), total(a.Counts)); c != 0 {
		return c
	}
	return cmp.Compare(b.File, a.File)
}

// SiteGroup is one site of the portfolio: its latest survey and the earlier ones.
type SiteGroup struct {
	Key     string
	Latest  *PortfolioSurvey
	Earlier []*PortfolioSurvey // newest first, drafts last
}

// Groups groups the surveys by site, in the order of each site's first
// survey. Surveys giving a Site ID are one site when their IDs agree. Surveys
// without one are one site when their site names agree and their stations'
// lines have one in common (or either names none): the same name on lines
// with nothing in common is taken as two lines of one works, two sites. A
// survey naming neither a site nor a Site ID is a site of its own.
func (p *Portfolio) Groups() []SiteGroup {
	var out []SiteGroup
	var lines []map[string]bool // per group, the union of its surveys' lines
	for i := range p.Surveys {
		s := &p.Surveys[i]
		k, ls := s.siteKey(), s.lineSet()
		at := -1
		for j := range out {
			if k == "" || out[j].Key != k {
				continue
			}
			if strings.HasPrefix(k, "id:") || len(ls) == 0 || len(lines[j]) == 0 || overlaps(ls, lines[j]) {
				at = j
				break
			}
		}
		if at < 0 {
			out = append(out, SiteGroup{Key: k})
			lines = append(lines, map[string]bool{})
			at = len(out) - 1
		}
		out[at].Earlier = append(out[at].Earlier, s)
		for l := range ls {
			lines[at][l] = true
		}
	}
	for i := range out {
		all := out[i].Earlier
		slices.SortStableFunc(all, newerFirst)
		out[i].Latest, out[i].Earlier = all[0], all[1:]
	}
	return out
}

func overlaps(a, b map[string]bool) bool {
	for k := range a {
		if b[k] {
			return true
		}
	}
	return false
}

// RankedSite is the latest survey of a site with its rank across the portfolio.
type RankedSite struct {
	Rank   int
	Shared bool // another site has the same rank (same verdict and worst ratio)
	Label  string
	*PortfolioSurvey
	Verdict    assess.Verdict // the worst station's
	WorstRatio *float64       // the worst ratio not resting on an assumed resistance
	// WorstRatioAssumed: a station's worst ratio rests on an assumed
	// resistance to earth: the site's worst is at least 1, its size unknown.
	WorstRatioAssumed bool
	Earlier           []EarlierSurvey // the site's earlier surveys, newest first
}

// EarlierSurvey is an earlier survey of a ranked site, for its trend.
type EarlierSurvey struct {
	*PortfolioSurvey
	Verdict           assess.Verdict
	WorstRatio        *float64
	WorstRatioAssumed bool
}

// RankText is the rank as shown: "=2" when shared.
func (s RankedSite) RankText() string { return rankText(s.Rank, s.Shared) }

func rankText(r int, shared bool) string {
	if shared {
		return fmt.Sprintf("=%d", r)
	}
	return fmt.Sprint(r)
}

// RankedStation is a station with its rank across the portfolio.
type RankedStation struct {
	Rank   int
	Shared bool
	Site   *PortfolioSurvey
	Label  string // the site's label, as on the Sites sheet
	*PortfolioStation
}

// ratioFirst orders a worst ratio resting on an assumed resistance first (at
// least 1, its size unknown: the stricter case, never ranked by the
// artefact's size), then worst ratio (descending, none last), then incendive
// and marginal counts (more first); 0 when those tie.
func ratioFirst(ra, rb *float64, aa, ab bool, ca, cb map[assess.Verdict]int) int {
	switch {
	case aa && !ab:
		return -1
	case !aa && ab:
		return 1
	case aa && ab:
		// both assumed: neither size is a figure; counts decide
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

// tied reports whether two ranked entries share a rank: the same verdict and
// the same worst ratio (or none on both), or both resting on an assumed resistance.
func tied(va, vb assess.Verdict, ra, rb *float64, aa, ab bool) bool {
	if va != vb || aa != ab {
		return false
	}
	if aa {
		return true
	}
	if (ra == nil) != (rb == nil) {
		return false
	}
	return ra == nil || *ra == *rb
}

// worstOf is a survey's verdict (its worst station's), its worst ratio not
// resting on an assumed resistance, and whether a station's worst does.
func worstOf(s *PortfolioSurvey) (assess.Verdict, *float64, bool) {
	v, r, assumed := assess.NotAssessed, (*float64)(nil), false
	for j := range s.Stations {
		st := &s.Stations[j]
		if st.Objects > 0 && (v == assess.NotAssessed || st.Verdict.Severity() > v.Severity()) {
			v = st.Verdict
		}
		if st.WorstRatioAssumed {
			assumed = true
			continue
		}
		if st.WorstRatio != nil && (r == nil || *st.WorstRatio > *r) {
			r = st.WorstRatio
		}
	}
	return v, r, assumed
}

// uniqueLabels makes each label unique: the site and its date, then the file
// name where two are alike, then a number.
func uniqueLabels(sites, dates, files []string) []string {
	out := make([]string, len(sites))
	for i := range sites {
		out[i] = sites[i] + " (" + dates[i] + ")"
	}
	dups := func() map[string]int {
		n := map[string]int{}
		for _, l := range out {
			n[l]++
		}
		return n
	}
	n := dups()
	for i := range out {
		if n[out[i]] > 1 {
			out[i] += ", " + files[i]
		}
	}
	n, seen := dups(), map[string]int{}
	for i, l := range out {
		if n[l] > 1 {
			seen[l]++
			out[i] = fmt.Sprintf("%s #%d", l, seen[l])
		}
	}
	return out
}

// Sites ranks the latest survey of each site worst first: by worst station
// ratio, then the numbers of incendive and marginal objects, then label (the
// same order as the stations of one audit). Sites with the same verdict and
// worst ratio share a rank ("=2"); labels are unique.
func (p *Portfolio) Sites() []RankedSite {
	groups := p.Groups()
	out := make([]RankedSite, len(groups))
	for i, g := range groups {
		rs := RankedSite{PortfolioSurvey: g.Latest}
		rs.Verdict, rs.WorstRatio, rs.WorstRatioAssumed = worstOf(g.Latest)
		for _, e := range g.Earlier {
			v, r, a := worstOf(e)
			rs.Earlier = append(rs.Earlier, EarlierSurvey{e, v, r, a})
		}
		out[i] = rs
	}
	var sites, dates, files []string
	for _, s := range out {
		sites, dates, files = append(sites, siteLabel(s.PortfolioSurvey)), append(dates, s.dateText()), append(files, s.File)
	}
	for i, l := range uniqueLabels(sites, dates, files) {
		out[i].Label = l
	}
	slices.SortStableFunc(out, func(a, b RankedSite) int {
		if c := ratioFirst(a.WorstRatio, b.WorstRatio, a.WorstRatioAssumed, b.WorstRatioAssumed, a.Counts, b.Counts); c != 0 {
			return c
		}
		return cmp.Compare(a.Label, b.Label)
	})
	for i := range out {
		out[i].Rank = i + 1
		if i > 0 && tied(out[i-1].Verdict, out[i].Verdict, out[i-1].WorstRatio, out[i].WorstRatio, out[i-1].WorstRatioAssumed, out[i].WorstRatioAssumed) {
			out[i].Rank, out[i].Shared, out[i-1].Shared = out[i-1].Rank, true, true
		}
	}
	return out
}

// Stations ranks every station of the latest survey of each site worst first,
// in the order of one audit's stations (ties by station ID), then by site
// label; stations with the same verdict and worst ratio share a rank.
func (p *Portfolio) Stations() []RankedStation {
	var out []RankedStation
	for _, s := range p.Sites() {
		for j := range s.Stations {
			out = append(out, RankedStation{Site: s.PortfolioSurvey, Label: s.Label, PortfolioStation: &s.Stations[j]})
		}
	}
	slices.SortStableFunc(out, func(a, b RankedStation) int {
		if c := ratioFirst(a.WorstRatio, b.WorstRatio, a.WorstRatioAssumed, b.WorstRatioAssumed, a.Counts, b.Counts); c != 0 {
			return c
		}
		if c := cmp.Compare(a.ID, b.ID); c != 0 {
			return c
		}
		return cmp.Compare(a.Label, b.Label)
	})
	for i := range out {
		out[i].Rank = i + 1
		if i > 0 && tied(out[i-1].Verdict, out[i].Verdict, out[i-1].WorstRatio, out[i].WorstRatio, out[i-1].WorstRatioAssumed, out[i].WorstRatioAssumed) {
			out[i].Rank, out[i].Shared, out[i-1].Shared = out[i-1].Rank, true, true
		}
	}
	return out
}

// TrendText is a site's earlier surveys in a line: "2025-02-10: incendive, worst 3.1 (2 incendive, 1 marginal); ...".
func (s RankedSite) TrendText() string {
	var parts []string
	for _, e := range s.Earlier {
		parts = append(parts, fmt.Sprintf("%s: %s, worst %s (%d incendive, %d marginal)", e.dateText(), e.Verdict, assumedRatioText(e.WorstRatio, e.WorstRatioAssumed),
			e.Counts[assess.Incendive], e.Counts[assess.Marginal]))
	}
	return strings.Join(parts, "; ")
}

// totals counts the objects of the latest survey of each site (an earlier
// survey of a site would count its objects twice).
func (p *Portfolio) totals() map[assess.Verdict]int {
	t := map[assess.Verdict]int{}
	for _, g := range p.Groups() {
		for v, n := range g.Latest.Counts {
			t[v] += n
		}
	}
	return t
}

// assumedRatioText is a worst ratio as text, assess.RatioAssumedText when it
// rests on an assumed resistance to earth.
func assumedRatioText(r *float64, assumed bool) string {
	if assumed {
		return assess.RatioAssumedText
	}
	return FormatRatio(r)
}

// assumedRatioCell is a worst ratio cell: the assumed-resistance text instead
// of a number whose size is an artefact.
func assumedRatioCell(r *float64, assumed bool) book.Cell {
	if assumed {
		return book.Code(assess.RatioAssumedText)
	}
	return ratioText(r)
}

// siteChartLabel is a site's category on the portfolio chart: its label and
// verdict, with the ratio's text where the bar is no figure.
func siteChartLabel(s RankedSite) string {
	st := assess.StationResult{Verdict: s.Verdict, WorstRatio: s.WorstRatio, WorstRatioAssumed: s.WorstRatioAssumed}
	l := s.Label + " " + s.Verdict.String()
	if t := stationRatioText(&st); t != "" {
		l += " (" + t + ")"
	}
	return l
}

// siteChartValue is the bar drawn for a site, as the audit's Summary chart
// draws a station (chartValue): 1 for an assumed resistance.
func siteChartValue(s RankedSite) *float64 {
	st := assess.StationResult{Verdict: s.Verdict, WorstRatio: s.WorstRatio, WorstRatioAssumed: s.WorstRatioAssumed}
	return chartValue(&st)
}

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
	for _, s := range []string{PortfolioSites, PortfolioTrend, PortfolioStations, PortfolioCautions} {
		if _, err := f.NewSheet(s); err != nil {
			return fmt.Errorf("write portfolio: sheet %s: %w", s, err)
		}
	}
	sites, stations := p.Sites(), p.Stations()
	wb.footerDate = portfolioFooterDate(sites)
	count := func(c map[assess.Verdict]int, v assess.Verdict) book.Cell { return book.Integer(c[v]) }
	siteCols := []book.Column[RankedSite]{
		{Header: "Rank", Width: 6, Value: func(s RankedSite) book.Cell { return rankCell(s.Rank, s.Shared) }},
		{Header: "Site", Width: 30, Value: func(s RankedSite) book.Cell { return book.WrapText(s.Label) }},
		{Header: "Survey file", Width: 22, Value: func(s RankedSite) book.Cell { return book.WrapText(s.File) }},
		{Header: "Survey date", Width: 11, Value: func(s RankedSite) book.Cell { return book.Text(s.dateText()) }},
		{Header: "Verdict", Width: 14, Value: func(s RankedSite) book.Cell { return verdictCell(s.Verdict) }},
		{Header: book.UnitRatio.Header("Worst ratio E/MIE"), Width: 11, Value: func(s RankedSite) book.Cell { return assumedRatioCell(s.WorstRatio, s.WorstRatioAssumed) }},
		{Header: "Stations [count]", Width: 9, Value: func(s RankedSite) book.Cell { return book.Integer(len(s.Stations)) }},
		{Header: "Objects [count]", Width: 9, Value: func(s RankedSite) book.Cell { return book.Integer(total(s.Counts)) }},
		{Header: "Incendive [count]", Width: 10, Value: func(s RankedSite) book.Cell { return count(s.Counts, assess.Incendive) }},
		{Header: "Marginal [count]", Width: 10, Value: func(s RankedSite) book.Cell { return count(s.Counts, assess.Marginal) }},
		{Header: "Non-incendive [count]", Width: 11, Value: func(s RankedSite) book.Cell { return count(s.Counts, assess.NonIncendive) }},
		{Header: "Not assessed [count]", Width: 10, Value: func(s RankedSite) book.Cell { return count(s.Counts, assess.NotAssessed) }},
		{Header: "Findings [count]", Width: 9, Value: func(s RankedSite) book.Cell { return book.Integer(s.Findings) }},
		{Header: "Rows rejected [count]", Width: 10, Value: func(s RankedSite) book.Cell { return book.Integer(s.Rejected) }},
		{Header: "Audit workbook", Width: 30, Value: func(s RankedSite) book.Cell { return book.WrapText(s.Audit) }},
		{Header: "Site ID", Width: 12, Value: func(s RankedSite) book.Cell { return book.OptText(s.SiteID) }},
		{Header: "Lines", Width: 14, Value: func(s RankedSite) book.Cell { return book.OptText(strings.Join(s.Lines, ", ")) }},
		{Header: "Earlier surveys [count]", Width: 9, Value: func(s RankedSite) book.Cell { return book.Integer(len(s.Earlier)) }},
		{Header: "Previous survey date", Width: 11, Value: func(s RankedSite) book.Cell {
			return prev(s, func(e EarlierSurvey) book.Cell { return book.Text(e.dateText()) })
		}},
		{Header: "Previous verdict", Width: 14, Value: func(s RankedSite) book.Cell {
			return prev(s, func(e EarlierSurvey) book.Cell { return verdictCell(e.Verdict) })
		}},
		{Header: book.UnitRatio.Header("Previous worst ratio E/MIE"), Width: 11, Value: func(s RankedSite) book.Cell {
			return prev(s, func(e EarlierSurvey) book.Cell { return assumedRatioCell(e.WorstRatio, e.WorstRatioAssumed) })
		}},
		// What the Summary chart draws: a site resting on an assumed resistance
		// as a bar at 1 (at least the MIE), labelled so, never its artefact size.
		{Header: chartLabelHeader, Width: 30, Value: func(s RankedSite) book.Cell { return book.Text(siteChartLabel(s)) }},
		{Header: chartValueHeader, Width: 10, Value: func(s RankedSite) book.Cell { return ratioCell(siteChartValue(s)) }},
		{Header: "Trend (earlier surveys, newest first)", Width: 60, Value: func(s RankedSite) book.Cell { return book.WrapText(s.TrendText()) }},
	}
	trend := trendRows(sites)
	trendCols := []book.Column[trendRow]{
		{Header: "Site", Width: 30, Value: func(t trendRow) book.Cell { return book.WrapText(t.label) }},
		{Header: "Site rank", Width: 7, Value: func(t trendRow) book.Cell { return rankCell(t.rank, t.shared) }},
		{Header: "Survey date", Width: 14, Value: func(t trendRow) book.Cell { return book.Text(t.s.dateText()) }},
		{Header: "Survey file", Width: 22, Value: func(t trendRow) book.Cell { return book.WrapText(t.s.File) }},
		{Header: "Role", Width: 22, Value: func(t trendRow) book.Cell { return book.WrapText(t.role) }},
		{Header: "Verdict", Width: 14, Value: func(t trendRow) book.Cell { return verdictCell(t.v) }},
		{Header: book.UnitRatio.Header("Worst ratio E/MIE"), Width: 11, Value: func(t trendRow) book.Cell { return assumedRatioCell(t.r, t.assumed) }},
		{Header: "Incendive [count]", Width: 10, Value: func(t trendRow) book.Cell { return count(t.s.Counts, assess.Incendive) }},
		{Header: "Marginal [count]", Width: 10, Value: func(t trendRow) book.Cell { return count(t.s.Counts, assess.Marginal) }},
		{Header: "Non-incendive [count]", Width: 11, Value: func(t trendRow) book.Cell { return count(t.s.Counts, assess.NonIncendive) }},
		{Header: "Not assessed [count]", Width: 10, Value: func(t trendRow) book.Cell { return count(t.s.Counts, assess.NotAssessed) }},
		{Header: "Findings [count]", Width: 9, Value: func(t trendRow) book.Cell { return book.Integer(t.s.Findings) }},
		{Header: "Audit workbook", Width: 30, Value: func(t trendRow) book.Cell { return book.WrapText(t.s.Audit) }},
	}
	stationCols := []book.Column[RankedStation]{
		{Header: "Rank", Width: 6, Value: func(s RankedStation) book.Cell { return rankCell(s.Rank, s.Shared) }},
		{Header: "Site", Width: 30, Value: func(s RankedStation) book.Cell { return book.WrapText(s.Label) }},
		{Header: "Survey file", Width: 22, Value: func(s RankedStation) book.Cell { return book.WrapText(s.Site.File) }},
		{Header: "Station", Width: 10, Value: func(s RankedStation) book.Cell { return book.Text(s.ID) }},
		{Header: "Name", Width: 24, Value: func(s RankedStation) book.Cell { return book.WrapText(s.Name) }},
		{Header: "Line", Width: 14, Value: func(s RankedStation) book.Cell { return book.WrapText(s.Line) }},
		{Header: "Rank in site", Width: 8, Value: func(s RankedStation) book.Cell { return book.Integer(s.SiteRank) }},
		{Header: "Verdict", Width: 14, Value: func(s RankedStation) book.Cell { return verdictCell(s.Verdict) }},
		{Header: book.UnitRatio.Header("Worst ratio E/MIE"), Width: 11, Value: func(s RankedStation) book.Cell {
			return assumedRatioCell(s.WorstRatio, s.WorstRatioAssumed)
		}},
		{Header: "Objects [count]", Width: 9, Value: func(s RankedStation) book.Cell { return book.Integer(s.Objects) }},
		{Header: "Incendive [count]", Width: 10, Value: func(s RankedStation) book.Cell { return count(s.Counts, assess.Incendive) }},
		{Header: "Marginal [count]", Width: 10, Value: func(s RankedStation) book.Cell { return count(s.Counts, assess.Marginal) }},
	}
	wb.chartLabelCol, wb.chartValueCol = columnLetter(siteCols, chartLabelHeader), columnLetter(siteCols, chartValueHeader)
	if err := tableSheetNormal(wb, PortfolioSites, siteCols, sites); err != nil {
		return fmt.Errorf("write portfolio: sheet %s: %w", PortfolioSites, err)
	}
	if err := tableSheetNormal(wb, PortfolioTrend, trendCols, trend); err != nil {
		return fmt.Errorf("write portfolio: sheet %s: %w", PortfolioTrend, err)
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

// rankCell is a rank as a number; a shared rank shows as "=2" (a number format, the cell stays a number).
func rankCell(r int, shared bool) book.Cell {
	c := book.Integer(r)
	if shared {
		c.NumFmt = `"="0`
	}
	return c
}

// prev is a cell of a site's previous survey, empty when it has none.
func prev(s RankedSite, f func(EarlierSurvey) book.Cell) book.Cell {
	if len(s.Earlier) == 0 {
		return book.Cell{}
	}
	return f(s.Earlier[0])
}

// portfolioFooterDate is the page footer's date of a portfolio: the latest
// survey date of every ranked site, as one date or the span of them.
func portfolioFooterDate(sites []RankedSite) string {
	var first, last time.Time
	for _, s := range sites {
		d := s.SurveyDate
		if d.IsZero() {
			continue
		}
		if first.IsZero() || d.Before(first) {
			first = d
		}
		if last.IsZero() || d.After(last) {
			last = d
		}
	}
	switch {
	case last.IsZero():
		return "Survey dates not given"
	case first.Equal(last):
		return "Survey date " + dateOf(last)
	}
	return "Latest survey dates " + dateOf(first) + " to " + dateOf(last)
}

// trendRow is one survey on the Trend sheet.
type trendRow struct {
	label, role string
	rank        int
	shared      bool
	s           *PortfolioSurvey
	v           assess.Verdict
	r           *float64
	assumed     bool
}

// trendRows lists every survey by site, in rank order, the latest first.
func trendRows(sites []RankedSite) []trendRow {
	var out []trendRow
	for _, s := range sites {
		out = append(out, trendRow{s.Label, "latest: ranked", s.Rank, s.Shared, s.PortfolioSurvey, s.Verdict, s.WorstRatio, s.WorstRatioAssumed})
		for _, e := range s.Earlier {
			role := "earlier: not ranked"
			if e.SurveyDate.IsZero() {
				role = "draft (no date): not ranked"
			}
			// An earlier survey is labelled with its own date, not the latest's.
			label := siteLabel(e.PortfolioSurvey) + " (" + e.dateText() + ")"
			out = append(out, trendRow{label, role, s.Rank, s.Shared, e.PortfolioSurvey, e.Verdict, e.WorstRatio, e.WorstRatioAssumed})
		}
	}
	return out
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
	rows := append(append([]string(nil), templates.Cautions()...), RepeatSurveysNote)
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
	if err := kv("Sites ranked (latest survey of each)", book.Integer(len(sites))); err != nil {
		return err
	}
	if err := kv("Objects [count] (latest surveys)", book.Integer(total(tot))); err != nil {
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
			st = append(st, assess.StationResult{WorstRatio: x.WorstRatio, WorstRatioAssumed: x.WorstRatioAssumed})
		}
		lo, hi := ratioAxis(st)
		sheet := "'" + PortfolioSites + "'"
		gap := uint(60)
		if err := f.AddChart(s, fmt.Sprintf("A%d", r), &excelize.Chart{
			Type: excelize.Bar,
			Series: []excelize.ChartSeries{{
				Name:       sheet + "!$" + wb.chartValueCol + "$1",
				Categories: fmt.Sprintf("%s!$%s$2:$%s$%d", sheet, wb.chartLabelCol, wb.chartLabelCol, n),
				Values:     fmt.Sprintf("%s!$%s$2:$%s$%d", sheet, wb.chartValueCol, wb.chartValueCol, n),
				Fill:       excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"4D4D4D"}},
			}},
			Format:    excelize.GraphicOptions{OffsetX: 4, OffsetY: 4},
			Dimension: excelize.ChartDimension{Width: 900, Height: uint(chartRows(len(sites))*20 - 8)},
			Legend:    excelize.ChartLegend{Position: "none"},
			Title:     excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: "Worst ratio E/MIE per site, latest survey (log scale)", Font: &excelize.Font{Size: 11, Bold: true}}}},
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
// "worst_ratio_assumed_resistance" (sites, earlier surveys, stations) marks a
// worst ratio resting on an assumed resistance to earth, as in the assess
// JSON: such an entry ranks ahead of every figure (the stricter case; its
// size is no figure); a site's "worst_ratio" is then its worst ratio that does
// not rest on an assumption (null when none).
func WritePortfolioJSON(w io.Writer, p Portfolio, info RunInfo) error {
	type jearlier struct {
		File       string            `json:"file"`
		SHA256     string            `json:"sha256"`
		SurveyDate *string           `json:"survey_date"` // null: a draft
		Audit      string            `json:"audit"`
		Verdict    string            `json:"verdict"`
		WorstRatio *float64          `json:"worst_ratio"`
		Assumed    bool              `json:"worst_ratio_assumed_resistance"`
		Objects    jsonVerdictCounts `json:"objects"`
		Findings   int               `json:"findings"`
	}
	type jsite struct {
		Rank       int               `json:"rank"`
		RankShared bool              `json:"rank_shared"`
		Label      string            `json:"label"`
		Site       string            `json:"site"`
		SiteID     string            `json:"site_id"`
		Lines      []string          `json:"lines"`
		File       string            `json:"file"`
		SHA256     string            `json:"sha256"`
		SurveyDate string            `json:"survey_date"`
		Audit      string            `json:"audit"`
		Verdict    string            `json:"verdict"`
		WorstRatio *float64          `json:"worst_ratio"` // the worst not resting on an assumed resistance
		Assumed    bool              `json:"worst_ratio_assumed_resistance"`
		Stations   int               `json:"stations"`
		Objects    jsonVerdictCounts `json:"objects"`
		Findings   int               `json:"findings"`
		Rejected   int               `json:"rows_rejected"`
		Earlier    []jearlier        `json:"earlier"` // newest first
	}
	type jstation struct {
		Rank       int               `json:"rank"`
		RankShared bool              `json:"rank_shared"`
		Label      string            `json:"site_label"`
		Site       string            `json:"site"`
		File       string            `json:"file"`
		Station    string            `json:"station"`
		Name       string            `json:"name"`
		Line       string            `json:"line"`
		SiteRank   int               `json:"rank_in_site"`
		Verdict    string            `json:"verdict"`
		WorstRatio *float64          `json:"worst_ratio"`
		Assumed    bool              `json:"worst_ratio_assumed_resistance"`
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
	}{Tool: jsonTool{info.tool(), info.ToolVersion}, Workbook: workbookRecord(info), Objects: verdictCounts(p.totals()), Sites: []jsite{}, Stations: []jstation{}, Failed: []jfail{}, Cautions: append(append([]string(nil), templates.Cautions()...), RepeatSurveysNote)}
	for _, s := range p.Sites() {
		lines := s.Lines
		if lines == nil {
			lines = []string{}
		}
		js := jsite{s.Rank, s.Shared, s.Label, s.Site, s.SiteID, lines, s.File, s.SHA256, dateOf(s.SurveyDate), s.Audit, s.Verdict.String(),
			s.WorstRatio, s.WorstRatioAssumed, len(s.Stations), verdictCounts(s.Counts), s.Findings, s.Rejected, []jearlier{}}
		for _, e := range s.Earlier {
			var d *string
			if !e.SurveyDate.IsZero() {
				t := dateOf(e.SurveyDate)
				d = &t
			}
			js.Earlier = append(js.Earlier, jearlier{e.File, e.SHA256, d, e.Audit, e.Verdict.String(), e.WorstRatio, e.WorstRatioAssumed, verdictCounts(e.Counts), e.Findings})
		}
		doc.Sites = append(doc.Sites, js)
	}
	for _, s := range p.Stations() {
		doc.Stations = append(doc.Stations, jstation{s.Rank, s.Shared, s.Label, s.Site.Site, s.Site.File, s.ID, s.Name, s.Line, s.SiteRank,
			s.Verdict.String(), s.WorstRatio, s.WorstRatioAssumed, verdictCounts(s.Counts)})
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
