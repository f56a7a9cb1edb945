package inventory

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"

	"github.com/xuri/excelize/v2"
)

// The Site sheet: its own items, their defaults, dates and humidity (the
// limit and uncertainty overrides are in sitesettings.go).
// applySite validates the Site sheet into Survey.Site.
func (v *validator) applySite(ss *siteSheet) {
	s := v.s
	s.Problems = append(s.Problems, ss.Problem...)
	if !ss.Present {
		s.Problems = append(s.Problems, Problem{Sheet: SheetSite, Severity: Error, Err: ErrMissingSheet,
			Message: "the workbook has no Site sheet (site name, survey date and relative humidity)", Fix: "add it from the template (sparkmargin template)"})
		return
	}
	site := &s.Site
	seen := map[string]int{}
	for _, r := range ss.Rows {
		st := v.newRow(SheetSite, r.Row)
		st.id = r.Item
		add := func(sev Severity, err error, msg, fix string) {
			st.probs = append(st.probs, Problem{Sheet: SheetSite, Row: r.Row, Column: "B", Field: r.Match.Column.Name, ID: r.Item,
				Severity: sev, Message: msg, Fix: fix, Err: err})
		}
		if r.Hidden {
			add(Warning, nil, "the row is hidden; it is read like any other", "")
		}
		if !r.Known {
			// A limit or uncertainty override, validated here (sitesettings.go)
			// so that check and assess see the same rows.
			it := SiteItem{Key: NormalizeName(r.Item), Item: r.Item, Value: r.Value, Row: r.Row}
			site.Items = append(site.Items, it)
			lim, unc, probs := siteSetting(it)
			if lim != nil {
				site.Limits = append(site.Limits, *lim)
			}
			if unc != nil {
				site.Uncertainties = append(site.Uncertainties, *unc)
			}
			st.probs = append(st.probs, probs...)
			continue
		}
		name := r.Match.Column.Name
		if first, dup := seen[name]; dup {
			add(Error, ErrDuplicateID, fmt.Sprintf("item %s is given twice (rows %d and %d)", name, first, r.Row), "delete one of the two rows")
			continue
		}
		seen[name] = r.Row
		switch r.Match.Column.Dim {
		case Text:
			switch name {
			case "Site":
				site.Name = r.Value
			case "Site ID":
				site.ID = r.Value
			case "Surveyed by":
				site.SurveyedBy = r.Value
			case SiteItemPreparedBy:
				site.SignOff.PreparedBy = r.Value
			case SiteItemReviewedBy:
				site.SignOff.ReviewedBy = r.Value
			case SiteItemApprovedBy:
				site.SignOff.ApprovedBy = r.Value
			case SiteItemRevision:
				site.SignOff.Revision = r.Value
			case SiteItemScope:
				site.SignOff.Scope = r.Value
			}
		case Date:
			if r.Value == "" {
				continue
			}
			d, err := parseDate(r.Value, ss.Date1904)
			if err != nil {
				add(Error, err, fmt.Sprintf("%q is not a date", short(r.Value, 60)), "write the date as 2026-03-14, or enter it as a spreadsheet date")
				continue
			}
			switch name {
			case SiteItemPreparedOn:
				site.SignOff.PreparedOn = d
			case SiteItemReviewedOn:
				site.SignOff.ReviewedOn = d
			case SiteItemApprovedOn:
				site.SignOff.ApprovedOn = d
			default:
				site.SurveyDate = d
			}
		default:
			p, err := ParseQuantity(r.Value, r.Match.Unit, r.Match.Column.Dim)
			if err != nil {
				var qe *QuantityError
				msg := err.Error()
				if errors.As(err, &qe) {
					msg = qe.Describe(name)
				}
				add(Error, err, "enter a number, e.g. "+siteExample(name), msg)
				continue
			}
			if p.Note != "" {
				add(Warning, nil, p.Note, "")
			}
			q := Quantity{Value: p.Value, Known: p.Known, RelUncertainty: p.RelUncertainty, Cell: fmt.Sprintf("B%d", r.Row)}
			switch name {
			case "Relative humidity":
				for _, pr := range checkRH(q) {
					add(pr.Severity, pr.Err, pr.Message, pr.Fix)
				}
				site.RelativeHumidity = q
			case "Air temperature":
				if q.Known && (q.Value < 223.15 || q.Value > 353.15) {
					fix := "enter the air temperature in °C"
					if c := q.Value - 273.15; c-273.15 >= -50 && c-273.15 <= 80 {
						fix = fmt.Sprintf("did you mean %.4g °C? (the value looks like kelvin)", c-273.15)
					}
					add(Error, ErrOutOfRange, fmt.Sprintf("air temperature %s is outside -50 to 80 °C", r.Value), fix)
					continue
				}
				site.AirTemperature = q
			case "Required margin":
				if q.Known && q.Value < 1 {
					add(Error, ErrOutOfRange, fmt.Sprintf("required margin %s is below 1: energies above MIE would count as non-incendive", r.Value), "enter a margin of 1 or more (10 is usual)")
					continue
				}
				site.RequiredMargin = q
			}
		}
	}
	var missing []string
	if site.Name == "" {
		missing = append(missing, "Site")
	}
	if site.SurveyDate.IsZero() {
		missing = append(missing, "Survey date")
	}
	if !site.RelativeHumidity.Known {
		missing = append(missing, "Relative humidity")
	}
	for _, m := range missing {
		if row, given := seen[m]; given {
			// given but blank or rejected: the row's own problem says why
			s.Problems = append(s.Problems, Problem{Sheet: SheetSite, Row: row, Column: "B", Field: m, Severity: Error, Err: ErrRequired,
				Message: fmt.Sprintf("%s is required", m), Fix: "enter it, e.g. " + siteExample(m)})
			continue
		}
		s.Problems = append(s.Problems, Problem{Sheet: SheetSite, Field: m, Severity: Error, Err: ErrRequired,
			Message: fmt.Sprintf("the Site sheet needs the item %s", m), Fix: fmt.Sprintf("add a row %q with its value, e.g. %s", itemHeader(m), siteExample(m))})
	}
	if !site.AirTemperature.Known {
		site.AirTemperature = Quantity{Value: 293.15, Known: true}
		site.Defaults = append(site.Defaults, SiteDefault{Item: SiteItemAirTemperature, Text: "Air temperature 20 °C (default)"})
	}
	if !site.RequiredMargin.Known {
		site.RequiredMargin = Quantity{Value: 10, Known: true}
		site.Defaults = append(site.Defaults, SiteDefault{Item: SiteItemRequiredMargin, Text: "Required margin 10 (default, a site choice)"})
	}
}

func itemHeader(name string) string {
	for _, c := range SiteItems() {
		if c.Name == name {
			return c.Header()
		}
	}
	return name
}

func siteExample(name string) string {
	switch name {
	case "Site":
		return "Plant 2 coating hall"
	case "Survey date":
		return "2026-03-14"
	case "Relative humidity":
		return "45"
	case "Air temperature":
		return "20"
	case "Required margin":
		return "10"
	case SiteItemPreparedOn, SiteItemReviewedOn, SiteItemApprovedOn:
		return "2026-03-20"
	}
	return "a value"
}

// parseDate reads an ISO date (2026-03-14, optionally with a time) or a
// spreadsheet date serial (days since 1899-12-30, or 1904 dates) into UTC midnight.
func parseDate(s string, date1904 bool) (time.Time, error) {
	s = strings.TrimSpace(s)
	for _, layout := range []string{"2006-01-02", "2006-01-02T15:04:05Z", "2006-01-02T15:04:05", "2006-01-02 15:04:05", "2006/01/02", "2006-01-02T15:04:05.999Z"} {
		if t, err := time.Parse(layout, s); err == nil {
			return time.Date(t.Year(), t.Month(), t.Day(), 0, 0, 0, 0, time.UTC), nil
		}
	}
	f, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(f) || f < 1 || f > 2958465 {
		return time.Time{}, ErrNotANumber
	}
	t, err := excelize.ExcelDateToTime(f, date1904)
	if err != nil {
		return time.Time{}, err
	}
	return time.Date(t.Year(), t.Month(), t.Day(), 0, 0, 0, 0, time.UTC), nil
}

// checkRH checks a relative humidity in percent.
func checkRH(q Quantity) []Problem {
	if !q.Known {
		return nil
	}
	switch {
	case q.Value < 0 || q.Value > 100:
		return []Problem{{Severity: Error, Err: ErrOutOfRange, Message: fmt.Sprintf("relative humidity %.4g %% is outside 0-100 %%", q.Value), Fix: "enter the RH in percent, e.g. 45"}}
	}
	if msg, fix := LowRHWarning(q.Value); msg != "" {
		return []Problem{{Severity: Warning, Message: msg, Fix: fix}}
	}
	return nil
}

// LowRHWarning is the warning for a relative humidity above 0 and below 1 %,
// most often a fraction of 1 meant as a percentage (a cell formatted as a
// percentage stores 45 % as 0.45): the message and the fix, "" when v is not
// so. The survey's RH cells, the whatif RH changes (flags and Changes rows)
// and the sweep's --rh values warn with these words; none refuses the value.
func LowRHWarning(v float64) (msg, fix string) {
	if !(v > 0 && v < 1) {
		return "", ""
	}
	return fmt.Sprintf("relative humidity %.4g %% is very low: a cell formatted as a percentage stores 45 %% as 0.45", v), fmt.Sprintf("did you mean %.4g %%?", v*100)
}
