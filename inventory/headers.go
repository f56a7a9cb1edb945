package inventory

import (
	"errors"
	"fmt"
	"strings"
)

// ErrUnknownColumn: a header names no column of the sheet's contract.
var ErrUnknownColumn = errors.New("unknown column")

// ErrDuplicateColumn: two headers of a sheet name the same column.
var ErrDuplicateColumn = errors.New("duplicate column")

// ErrMissingColumn: a column the sheet needs is not among its headers.
var ErrMissingColumn = errors.New("missing column")

// ErrHeaderUnit: the unit written in a header does not fit the column.
var ErrHeaderUnit = errors.New("header unit does not fit the column")

// NormalizeName folds a header or item name for matching: lower case, '-' and
// '_' read as spaces, surrounding and repeated spaces dropped.
func NormalizeName(s string) string {
	if isNormalName(s) {
		return s // already lower case, single spaces, nothing to map: the common case, without allocating
	}
	// strings.Map, not a Replacer: a Replacer is built on every call, and
	// names are normalised for every cell read.
	s = strings.Map(func(r rune) rune {
		switch r {
		case '-', '_', '\u00a0':
			return ' '
		}
		return r
	}, strings.ToLower(s))
	return strings.Join(strings.Fields(s), " ")
}

// isNormalName reports whether NormalizeName would return s unchanged: ASCII
// without upper-case letters, '-' or '_', and words parted by single spaces.
func isNormalName(s string) bool {
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c >= 0x80, c >= 'A' && c <= 'Z', c == '-', c == '_':
			return false
		case c == ' ':
			if i == 0 || i == len(s)-1 || s[i-1] == ' ' {
				return false
			}
		case c == '\t', c == '\n', c == '\v', c == '\f', c == '\r':
			return false
		}
	}
	return true
}

// headerAliases maps a few other names practitioners write to contract names
// (normalised on both sides).
func headerAliases() map[string]string {
	return map[string]string{
		"rh":                   "relative humidity",
		"humidity":             "relative humidity",
		"resistance":           "resistance to earth",
		"r to earth":           "resistance to earth",
		"q/m":                  "charge to mass",
		"charge to mass ratio": "charge to mass",
		"potential":            "surface potential",
		"epsr":                 "relative permittivity",
		"permittivity":         "relative permittivity",
		"object":               "id",
		"object id":            "id",
		"station id":           "id",
	}
}

// HeaderMatch is a header cell matched to a column of the contract.
type HeaderMatch struct {
	Column Column // the contract column
	Unit   string // unit numbers in this column are in: the header's own, else Column.Unit
	Own    bool   // the header wrote its own unit
}

// splitHeader splits "Field [kV/m]" or "Field (kV/m)" into name and unit;
// the unit is "" when there are no brackets.
func splitHeader(h string) (name, unit string, bracketed bool) {
	h = strings.TrimSpace(h)
	for _, br := range [][2]string{{"[", "]"}, {"(", ")"}} {
		if strings.HasSuffix(h, br[1]) {
			if i := strings.LastIndex(h, br[0]); i >= 0 {
				return strings.TrimSpace(h[:i]), strings.TrimSpace(h[i+1 : len(h)-1]), true
			}
		}
	}
	return h, "", false
}

// MatchHeader matches one header text against the columns of a sheet:
// case-insensitive, surrounding and repeated spaces ignored, '-' and '_' read as
// spaces, the unit in brackets, in parentheses, after a space, or absent. A unit
// written in the header replaces the column's default and must have its
// dimension. ok is false when the header names no column (err wraps
// ErrUnknownColumn); a matched column with a unit that does not fit returns ok
// true and an error wrapping ErrHeaderUnit (the caller decides what to do).
func MatchHeader(header string, cols []Column) (HeaderMatch, bool, error) {
	name, unit, bracketed := splitHeader(header)
	if c, ok := findColumn(name, cols); ok {
		if !bracketed || unit == "" {
			return HeaderMatch{Column: c, Unit: c.Unit}, true, nil
		}
		return headerWithUnit(c, unit)
	}
	if !bracketed {
		// "Field kV/m", "Volume resistivity ohm m": try every split from the right.
		words := strings.Fields(name)
		for i := len(words) - 1; i >= 1; i-- {
			n, u := strings.Join(words[:i], " "), strings.Join(words[i:], " ")
			if c, ok := findColumn(n, cols); ok {
				if m, ok, err := headerWithUnit(c, u); ok && err == nil {
					return m, true, nil
				}
			}
		}
	}
	return HeaderMatch{}, false, fmt.Errorf("%w: %q", ErrUnknownColumn, strings.TrimSpace(header))
}

// headerWithUnit checks a header's own unit against the column.
func headerWithUnit(c Column, unit string) (HeaderMatch, bool, error) {
	if strings.EqualFold(normUnitSpaces(unit), normUnitSpaces(c.Unit)) {
		return HeaderMatch{Column: c, Unit: c.Unit}, true, nil
	}
	switch c.Dim {
	case Text, Date:
		return HeaderMatch{Column: c}, true, fmt.Errorf("%w: %s is text and takes no unit, %q ignored", ErrHeaderUnit, c.Name, unit)
	case Dimensionless:
		if unit == "-" || unit == "1" {
			return HeaderMatch{Column: c}, true, nil
		}
		return HeaderMatch{Column: c}, true, fmt.Errorf("%w: %s is a plain number and takes no unit, not %q", ErrHeaderUnit, c.Name, unit)
	}
	if _, err := ParseUnit(unit, c.Dim); err != nil {
		var qe *QuantityError
		msg := err.Error()
		if errors.As(err, &qe) {
			if errors.Is(err, ErrWrongDimension) {
				msg = fmt.Sprintf("unit %q is a unit of %s but %s needs a unit of %s", unit, qe.UnitDim, c.Name, c.Dim)
			} else {
				msg = fmt.Sprintf("unit %q is not known; %s needs a unit of %s such as %s", unit, c.Name, c.Dim, c.Unit)
			}
		}
		return HeaderMatch{Column: c, Unit: c.Unit}, true, fmt.Errorf("%w: %s", ErrHeaderUnit, msg)
	}
	return HeaderMatch{Column: c, Unit: normUnitSpaces(unit), Own: true}, true, nil
}

// findColumn finds a column by normalised name or alias.
func findColumn(name string, cols []Column) (Column, bool) {
	n := NormalizeName(name)
	if n == "" {
		return Column{}, false
	}
	for _, c := range cols {
		if NormalizeName(c.Name) == n {
			return c, true
		}
	}
	if a, ok := headerAliases()[n]; ok {
		for _, c := range cols {
			if NormalizeName(c.Name) == a {
				return c, true
			}
		}
	}
	return Column{}, false
}

// ColumnLetter returns the spreadsheet letters of a 0-based column index (0 → "A", 26 → "AA").
func ColumnLetter(i int) string {
	if i < 0 {
		return ""
	}
	if i < 26 {
		return "ABCDEFGHIJKLMNOPQRSTUVWXYZ"[i : i+1]
	}
	s := ""
	for i >= 0 {
		s = string(rune('A'+i%26)) + s
		i = i/26 - 1
	}
	return s
}

// columnNames lists the names of columns for suggestions.
func columnNames(cols []Column) []string {
	out := make([]string, len(cols))
	for i, c := range cols {
		out[i] = c.Name
	}
	return out
}

// Nearest returns the candidate closest to s by edit distance on normalised
// names, if it is close enough to be a likely slip (at most a third of the
// longer name, and at most 4 edits); "" otherwise.
func Nearest(s string, candidates []string) string {
	n := NormalizeName(s)
	// A name cut short ("stainles" for "stainless steel") is a prefix of one candidate.
	if len([]rune(n)) >= 4 {
		var pre []string
		for _, c := range candidates {
			if strings.HasPrefix(NormalizeName(c), n) {
				pre = append(pre, c)
			}
		}
		if len(pre) == 1 {
			return pre[0]
		}
	}
	best, bestD := "", 1<<30
	for _, c := range candidates {
		d := editDistance(n, NormalizeName(c))
		if d < bestD {
			best, bestD = c, d
		}
	}
	if best == "" {
		return ""
	}
	l := max(len([]rune(n)), len([]rune(NormalizeName(best))))
	if bestD == 0 || bestD > 4 || bestD*2 > l {
		if bestD == 0 {
			return best
		}
		return ""
	}
	return best
}

// editDistance is the Levenshtein distance between a and b (in runes).
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	if len(ra) > 200 || len(rb) > 200 {
		return 1 << 20 // long texts are not slips of a short name
	}
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
