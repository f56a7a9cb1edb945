package inventory

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// The Site sheet's settings beyond its own items: limit overrides ("Shock
// energy [mJ] | 400") and uncertainty overrides ("Uncertainty field [%] |
// 15"). inventory owns their names, units and validation, so that check and
// assess see the same rows: a setting whose value cannot be used rejects its
// row (an Error), one that names nothing known is a Warning and is ignored.
// The validated values cross to report/assess typed (Site.Limits,
// Site.Uncertainties), in SI units.

// ErrLimitValue is the cause of a Site item that names a limit but whose value cannot be used.
var ErrLimitValue = errors.New("unusable limit value")

// ErrUncertaintyValue is the cause of a Site item that names an uncertainty but
// whose value cannot be used.
var ErrUncertaintyValue = errors.New("unusable uncertainty value")

// ErrUnknownSiteItem is the cause of a Site item that is neither a site field nor a known limit.
var ErrUnknownSiteItem = errors.New("unknown Site item")

// LimitItem is one Site-sheet item that overrides a limit of the screening.
// The items are a view of model's limit table (model.LimitTable: each row's
// Site item and practical unit), generated into limititems_gen.go because
// inventory and model do not import each other; a test in report/assess fails
// when the generated view and the table disagree.
type LimitItem struct {
	Name string    // item name without unit, lower case, as matched: "shock energy"
	Unit string    // practical unit the value is in when the item and value give none
	Dim  Dimension // what the value measures; its unit is read as a survey cell's
	Note string    // what it sets: the limit table's keys and label
}

// FromSI converts an SI value of the limit k sets into k's Unit (the Site
// sheet's practical unit); false when k's Unit is not one its dimension takes.
func (k LimitItem) FromSI(v float64) (float64, bool) {
	f, ok := limitFactor(k, k.Unit)
	if !ok || f == 0 {
		return 0, false
	}
	return v / f, true
}

// limitFactor is the factor from unit to SI for k's dimension, by the survey's
// unit grammar (ParseUnit); a plain-number item takes no unit.
func limitFactor(k LimitItem, unit string) (float64, bool) {
	if k.Dim == Dimensionless {
		return 1, strings.TrimSpace(unit) == ""
	}
	u, err := ParseUnit(unit, k.Dim)
	if err != nil {
		return 0, false
	}
	return u.Factor, true
}

// LimitItems returns the Site-sheet items that override limits, in the order
// of the limit table. An item is written "name [unit]" (the unit optional, the
// Unit below when absent); the value may carry its own unit ("400 mJ").
// Group-indexed limits take the group at the end of the name ("transferred
// charge IIB [nC]").
func LimitItems() []LimitItem { return append([]LimitItem(nil), limitItems...) }

// LimitItemNamed returns the Site limit item of the normalised name.
func LimitItemNamed(name string) (LimitItem, bool) {
	for _, k := range limitItems {
		if k.Name == name {
			return k, true
		}
	}
	return LimitItem{}, false
}

// SiteLimit is a validated limit override of the Site sheet.
type SiteLimit struct {
	Name  string  // the LimitItem's Name
	Value float64 // SI units
	Row   int
}

// SpreadScale is how an uncertainty item's value reads.
type SpreadScale uint8

const (
	// SpreadRelative: a relative standard uncertainty in % (0.10 for "10").
	SpreadRelative SpreadScale = iota
	// SpreadLength: an absolute standard uncertainty of a length, mm, cm or m (SI).
	SpreadLength
	// SpreadRH: an absolute standard uncertainty of humidity in %RH.
	SpreadRH
	// SpreadLog: the standard deviation of ln(value), given in % (a factor
	// 1 + x/100), decades or as a factor.
	SpreadLog
)

// UncertaintyItem is one Site-sheet item that overrides a row of the
// uncertainty table (report/assess.DefaultUncertainties).
type UncertaintyItem struct {
	Name  string // item name without unit, lower case: "uncertainty field"
	Unit  string // unit of the value when none is written: "%", "mm", "%RH", "decades" or "factor"
	Scale SpreadScale
}

// SiteUncertainty is a validated uncertainty override of the Site sheet.
type SiteUncertainty struct {
	Name   string  // the UncertaintyItem's Name
	Spread float64 // relative (SpreadRelative), SI (SpreadLength), %RH, or of ln (SpreadLog); 0 turns sampling off
	// Unit is the unit the value was written in, for a SpreadLog row: "%",
	// "decades" or "factor"; "" when the row's default unit applies.
	Unit string
	Row  int
}

// UncertaintyItems returns the Site-sheet items that override the uncertainty
// table, in the table's order (report/assess's test checks that the two agree).
func UncertaintyItems() []UncertaintyItem {
	return []UncertaintyItem{
		{"uncertainty field", "%", SpreadRelative},
		{"uncertainty field distance", "mm", SpreadLength},
		{"uncertainty surface potential", "%", SpreadRelative},
		{"uncertainty resistance", "decades", SpreadLog},
		{"uncertainty measured capacitance", "%", SpreadLog},
		{"uncertainty estimated capacitance", "factor", SpreadLog},
		{"uncertainty person capacitance", "factor", SpreadLog},
		{"uncertainty mie dust", "factor", SpreadLog},
		{"uncertainty mie gas", "%", SpreadLog},
		{"uncertainty charging current", "factor", SpreadLog},
		{"uncertainty mass flow", "%", SpreadRelative},
		{"uncertainty charge to mass", "factor", SpreadLog},
		{"uncertainty size", "%", SpreadRelative},
		{"uncertainty speed", "%", SpreadRelative},
		{"uncertainty charging time", "%", SpreadRelative},
		{"uncertainty conductivity", "factor", SpreadLog},
		{"uncertainty relative humidity", "%RH", SpreadRH},
	}
}

// SiteSettings validates Site items that are not the sheet's own items: it
// returns the limit and uncertainty overrides they give and the problems of
// the others (each at its row; an Error means the row is not used).
func SiteSettings(items []SiteItem) ([]SiteLimit, []SiteUncertainty, []Problem) {
	var (
		lims  []SiteLimit
		uncs  []SiteUncertainty
		probs []Problem
	)
	for _, it := range items {
		l, u, p := siteSetting(it)
		if l != nil {
			lims = append(lims, *l)
		}
		if u != nil {
			uncs = append(uncs, *u)
		}
		probs = append(probs, p...)
	}
	return lims, uncs, probs
}

// siteSetting validates one Site item that is not one of the sheet's own items.
func siteSetting(it SiteItem) (*SiteLimit, *SiteUncertainty, []Problem) {
	name, keyUnit := siteItemName(it)
	if isUncertaintyItem(name) {
		for _, u := range UncertaintyItems() {
			if u.Name != name {
				continue
			}
			v, unit, err := parseSpread(it.Value, keyUnit, u)
			if err != nil {
				return nil, nil, []Problem{siteItemProblem(it, "B", Error, fmt.Sprintf("uncertainty %q: %v; the default is kept", it.Item, err),
					fmt.Sprintf("give a number >= 0 in %s, e.g. \"%s [%s] = 10\"", u.Unit, it.Item, u.Unit), fmt.Errorf("%w: %w", ErrUncertaintyValue, err))}
			}
			return nil, &SiteUncertainty{Name: name, Spread: v, Unit: unit, Row: it.Row}, nil
		}
		return nil, nil, []Problem{siteItemProblem(it, "A", Warning, fmt.Sprintf("item %q names no uncertainty; it is ignored", it.Item),
			"use one of the uncertainty items listed on the Method sheet (e.g. \"Uncertainty field [%]\")", ErrUnknownSiteItem)}
	}
	if k, ok := LimitItemNamed(name); ok {
		v, err := parseLimitValue(it.Value, keyUnit, k)
		if err != nil {
			return nil, nil, []Problem{siteItemProblem(it, "B", Error, fmt.Sprintf("limit %q: %v; the built-in value is kept", it.Item, err),
				fmt.Sprintf("give a positive number in %s, e.g. \"%s\"", unitOrPlain(k.Unit), exampleValue(k)), fmt.Errorf("%w: %w", ErrLimitValue, err))}
		}
		return &SiteLimit{Name: name, Value: v, Row: it.Row}, nil, nil
	}
	fix := "check the spelling against the limit items that sparkmargin library lists (e.g. \"Shock energy [mJ]\")"
	names := columnNames(SiteItems())
	for _, k := range limitItems {
		names = append(names, k.Name) // a misspelt limit item ("shock enrgy") is pointed to its name
	}
	if near := Nearest(splitName(it.Item), names); near != "" && it.Item != "" {
		fix = didYouMean(splitName(it.Item), near)
	}
	return nil, nil, []Problem{siteItemProblem(it, "A", Warning, fmt.Sprintf("item %q is not a site setting or a known limit; it is ignored", it.Item), fix, ErrUnknownSiteItem)}
}

func unitOrPlain(u string) string {
	if u == "" {
		return "a plain number"
	}
	return u
}

func exampleValue(k LimitItem) string {
	if k.Unit == "" {
		return "0.5"
	}
	return "1 " + k.Unit
}

// splitItemUnit splits "shock energy [mj]" or "shock energy (mJ)" into name and unit.
func splitItemUnit(s string) (name, unit string) {
	s = strings.TrimSpace(s)
	for _, br := range [][2]string{{"[", "]"}, {"(", ")"}} {
		if i := strings.LastIndex(s, br[0]); i >= 0 && strings.HasSuffix(s, br[1]) {
			return strings.TrimSpace(s[:i]), strings.TrimSpace(s[i+1 : len(s)-1])
		}
	}
	return s, ""
}

func normaliseItemName(s string) string {
	s = strings.ToLower(strings.TrimSpace(s))
	s = strings.NewReplacer("-", " ", "_", " ", "·", "", ".", "", ":", "").Replace(s)
	return strings.Join(strings.Fields(s), " ")
}

// siteItemName returns a Site item's normalised name and the unit written in it
// ("Shock energy [mJ]" gives "shock energy", "mJ").
func siteItemName(it SiteItem) (name, unit string) {
	name, unit = splitItemUnit(it.Key)
	if name == "" {
		name, unit = splitItemUnit(it.Item)
	}
	return normaliseItemName(name), unit
}

// isUncertaintyItem reports whether a normalised Site item name is an uncertainty item.
func isUncertaintyItem(name string) bool {
	return name == "uncertainty" || strings.HasPrefix(name, "uncertainty ")
}

// siteItemProblem is a problem at a Site sheet item: column A for the item's
// name, column B for its value.
func siteItemProblem(it SiteItem, column string, sev Severity, message, fix string, err error) Problem {
	return Problem{
		Sheet: SheetSite, Row: it.Row, Column: column, Field: it.Item, ID: it.Item, Severity: sev,
		Message: message, Fix: fix, Err: err,
	}
}

// splitValue splits "400 mJ" into "400" and "mJ" ("1,5 mJ" into "1,5" and
// "mJ": the number is read by ParseNumber, as a survey cell's).
func splitValue(raw string) (string, string) {
	raw = strings.TrimSpace(raw)
	if i := strings.IndexFunc(raw, func(r rune) bool {
		return !(r >= '0' && r <= '9' || r == '.' || r == ',' || r == 'e' || r == 'E' || r == '+' || r == '-')
	}); i >= 0 {
		return strings.TrimSpace(raw[:i]), strings.TrimSpace(raw[i:])
	}
	return raw, ""
}

// parseLimitValue reads "400", "400 mJ", "1,5" or "1e6" with the grammar of
// a survey cell (ParseQuantity): the value's own unit wins, else the unit in
// the item's name, else the item's practical unit.
func parseLimitValue(raw, keyUnit string, key LimitItem) (float64, error) {
	unit := key.Unit
	if keyUnit != "" {
		unit = keyUnit
	}
	if _, ok := limitFactor(key, unit); !ok {
		return 0, fmt.Errorf("unit %q does not fit (want %s)", unit, unitOrPlain(key.Unit))
	}
	p, err := ParseQuantity(raw, unit, key.Dim)
	var qe *QuantityError
	switch {
	case errors.As(err, &qe) && (errors.Is(err, ErrUnknownUnit) || errors.Is(err, ErrWrongDimension)):
		return 0, fmt.Errorf("unit %q does not fit (want %s)", qe.Unit, unitOrPlain(key.Unit))
	case err != nil:
		return 0, err
	case !p.Known:
		return 0, errors.New("no value given")
	case p.RelUncertainty != 0:
		return 0, fmt.Errorf("%q: a limit takes no ± part", strings.TrimSpace(raw))
	}
	v := p.Value
	if key.Dim == Dimensionless && p.Unit != "" {
		return 0, fmt.Errorf("unit %q does not fit (want %s)", p.Unit, unitOrPlain(key.Unit))
	}
	if !(v > 0) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a positive finite value", strings.TrimSpace(raw))
	}
	return v, nil
}

// spreadUnit is the canonical unit the value or the item names ("%", "decades", "factor").
func spreadUnit(raw, keyUnit string) string {
	_, u := splitValue(raw)
	if u == "" {
		u = keyUnit
	}
	switch canonSpreadUnit(u) {
	case "%":
		return "%"
	case "dec":
		return "decades"
	case "x":
		return "factor"
	}
	return ""
}

func canonSpreadUnit(u string) string {
	u = strings.ToLower(strings.TrimSpace(u))
	switch u {
	case "%", "percent", "pct":
		return "%"
	case "decade", "decades", "dec":
		return "dec"
	case "factor", "x", "×":
		return "x"
	case "mm", "cm", "m":
		return u
	case "%rh", "% rh", "rh":
		return "%rh"
	}
	return u
}

// parseSpread reads a Site value into the row's spread, and, for a SpreadLog
// row, the unit it was written in.
func parseSpread(raw, keyUnit string, u UncertaintyItem) (float64, string, error) {
	num, valUnit := splitValue(raw)
	if num == "" {
		return 0, "", errors.New("no value given")
	}
	v, err := parseNumber(num)
	if err != nil {
		return 0, "", fmt.Errorf("%q is not a number", raw)
	}
	if !(v >= 0) || math.IsInf(v, 0) {
		return 0, "", fmt.Errorf("%q is not a finite value >= 0", raw)
	}
	unit := u.Unit
	switch {
	case valUnit != "":
		unit = valUnit
	case keyUnit != "":
		unit = keyUnit
	}
	cu := canonSpreadUnit(unit)
	bad := fmt.Errorf("unit %q does not fit %s (want %s)", unit, u.Name, u.Unit)
	switch u.Scale {
	case SpreadRelative:
		if cu != "%" {
			return 0, "", bad
		}
		return v / 100, "", nil
	case SpreadRH:
		if cu != "%rh" && cu != "%" {
			return 0, "", bad
		}
		return v, "", nil
	case SpreadLength:
		f, ok := map[string]float64{"mm": 1e-3, "cm": 1e-2, "m": 1}[cu]
		if !ok {
			return 0, "", bad
		}
		return v * f, "", nil
	}
	written := spreadUnit(raw, keyUnit)
	switch cu {
	case "%":
		return math.Log1p(v / 100), written, nil
	case "dec":
		return v * math.Ln10, written, nil
	case "x":
		if v == 0 {
			return 0, written, nil // off, as for the other units
		}
		if v < 1 {
			return 0, "", fmt.Errorf("a factor must be at least 1, got %q", raw)
		}
		return math.Log(v), written, nil
	}
	return 0, "", bad
}
