package inventory

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Sentinel errors of cell parsing, usable with errors.Is on a *QuantityError
// or on a Problem that wraps one.
var (
	// ErrUnknownUnit: the unit written in a cell or header is not one the survey knows.
	ErrUnknownUnit = errors.New("unknown unit")
	// ErrWrongDimension: the unit is known but measures something else than the column.
	ErrWrongDimension = errors.New("unit of the wrong dimension")
	// ErrNotANumber: the cell holds text that is not a number.
	ErrNotANumber = errors.New("not a number")
	// ErrNotFinite: the cell holds NaN, Inf, or a number too large or too small to use.
	ErrNotFinite = errors.New("not a finite number")
	// ErrUncertainty: the ± part of a cell is not a usable relative uncertainty.
	ErrUncertainty = errors.New("unusable uncertainty")
	// ErrAmbiguousComma: the number is written with one comma before three
	// digits ("1,000"), which is a thousands separator or a decimal comma.
	ErrAmbiguousComma = errors.New("ambiguous comma")
	// ErrAmbiguousUnit: the unit reads two ways ("1M": mega or metres; "mohm":
	// milliohm or megohm; "1K": kilo or kelvin) and is refused rather than guessed.
	ErrAmbiguousUnit = errors.New("ambiguous unit")
)

// ambiguousUnit returns the two readings of a unit that can be read two ways,
// for a value of dimension want; ok false when the unit is plain. The rules
// (a screening choice of this tool: a misread resistance can clear a hazard):
//   - "M" alone: mega with its unit left out, or metres typed in capitals;
//   - "k" or "K" alone: kilo with its unit left out, or kelvin ("K" in a
//     temperature value is kelvin, the only reading there);
//   - "m" before ohm spelled in letters ("mohm", "1 mOhm") or an ohm word in
//     capitals ("MOHM"): milli by the SI letter case, but megohm is what a
//     resistance to earth usually is. "mΩ" keeps its SI meaning (with a warning).
func ambiguousUnit(unit string, want Dimension) (readings [2]string, ok bool) {
	u := normUnitSpaces(unit)
	with := func(p string) string {
		if si := SIUnit(want); si != "" && si != "%" && si != "K" {
			return "write " + p + si
		}
		return "write " + p + " and the unit"
	}
	switch {
	case u == "M":
		return [2]string{"mega, with its unit left out (" + with("M") + ")", "metres (write m)"}, true
	case u == "k" || (u == "K" && want != Temperature):
		return [2]string{"kilo, with its unit left out (" + with("k") + ")", "kelvin (write K only for a temperature)"}, true
	case len(u) > 3 && (u[0] == 'm' || u == strings.ToUpper(u)) && isOhmWord(u[1:]):
		return [2]string{"milliohm (write mΩ)", "megohm (write MΩ or Mohm)"}, true
	}
	return readings, false
}

// isOhmWord reports whether s is a base unit of resistance spelled in letters
// ("ohm", "Ohms", "ohm/sq"), in any letter case.
func isOhmWord(s string) bool {
	if !strings.HasPrefix(strings.ToLower(s), "ohm") {
		return false
	}
	for _, nb := range baseUnits() {
		if strings.EqualFold(nb.name, s) {
			return true
		}
	}
	return false
}

// String returns the dimension's name in words ("electric field").
func (d Dimension) String() string {
	switch d {
	case Text:
		return "text"
	case Dimensionless:
		return "plain number"
	case Length:
		return "length"
	case ElectricField:
		return "electric field"
	case Potential:
		return "potential"
	case Speed:
		return "speed"
	case MassFlow:
		return "mass flow"
	case ChargeToMass:
		return "charge-to-mass ratio"
	case Current:
		return "current"
	case Time:
		return "time"
	case Resistance:
		return "resistance"
	case Resistivity:
		return "resistivity"
	case Capacitance:
		return "capacitance"
	case Energy:
		return "energy"
	case Percent:
		return "percentage"
	case Temperature:
		return "temperature"
	case Conductivity:
		return "conductivity"
	case Slope:
		return "humidity slope"
	case Date:
		return "date"
	case Charge:
		return "charge"
	case Area:
		return "area"
	case ChargeDensity:
		return "charge density"
	case SpeedDiameter:
		return "velocity × diameter"
	}
	return fmt.Sprintf("dimension(%d)", uint8(d))
}

// SIUnit returns the symbol of the SI unit values of dimension d are stored in
// ("V/m", "Ω"); "" for plain numbers, text and dates. Percent stays "%" and
// temperature is stored in kelvin.
func SIUnit(d Dimension) string {
	switch d {
	case Length:
		return "m"
	case ElectricField:
		return "V/m"
	case Potential:
		return "V"
	case Speed:
		return "m/s"
	case MassFlow:
		return "kg/s"
	case ChargeToMass:
		return "C/kg"
	case Current:
		return "A"
	case Time:
		return "s"
	case Resistance:
		return "Ω"
	case Resistivity:
		return "Ω·m"
	case Capacitance:
		return "F"
	case Energy:
		return "J"
	case Percent:
		return "%"
	case Temperature:
		return "K"
	case Conductivity:
		return "S/m"
	case Charge:
		return "C"
	case Area:
		return "m²"
	case ChargeDensity:
		return "C/m²"
	case SpeedDiameter:
		return "m²/s"
	}
	return ""
}

// Unit is a parsed unit: SI value = number * Factor + Offset.
type Unit struct {
	Symbol string // as written (trimmed)
	Dim    Dimension
	Factor float64
	Offset float64 // only temperature (°C to K) has one
}

// baseUnit is a unit symbol before an SI prefix is applied.
type baseUnit struct {
	dim      Dimension
	factor   float64
	offset   float64
	prefixed bool // an SI prefix may stand before it
}

// namedBaseUnit is a base unit with its symbol.
type namedBaseUnit struct {
	name string
	baseUnit
}

// baseUnits returns the unit symbols the survey knows, before prefixes.
// A function rather than a package variable: no package-level mutable state;
// a slice, not a map, because it is built for every value parsed (a slice
// literal is cheap to build and scan) and so that matches come in table order.
func baseUnits() []namedBaseUnit {
	return []namedBaseUnit{
		// length
		{"m", baseUnit{Length, 1, 0, true}},
		// electric field
		{"V/m", baseUnit{ElectricField, 1, 0, true}},
		{"V/cm", baseUnit{ElectricField, 100, 0, true}},
		{"V/mm", baseUnit{ElectricField, 1000, 0, true}},
		// potential
		{"V", baseUnit{Potential, 1, 0, true}},
		// speed
		{"m/s", baseUnit{Speed, 1, 0, true}},
		{"m/min", baseUnit{Speed, 1.0 / 60, 0, true}},
		{"m/h", baseUnit{Speed, 1.0 / 3600, 0, true}},
		// mass flow
		{"g/s", baseUnit{MassFlow, 1e-3, 0, true}},
		{"g/min", baseUnit{MassFlow, 1e-3 / 60, 0, true}},
		{"g/h", baseUnit{MassFlow, 1e-3 / 3600, 0, true}},
		{"t/h", baseUnit{MassFlow, 1000.0 / 3600, 0, false}},
		{"t/min", baseUnit{MassFlow, 1000.0 / 60, 0, false}},
		// charge-to-mass
		{"C/kg", baseUnit{ChargeToMass, 1, 0, true}},
		{"C/g", baseUnit{ChargeToMass, 1e3, 0, true}},
		// current
		{"A", baseUnit{Current, 1, 0, true}},
		// time
		{"s", baseUnit{Time, 1, 0, true}},
		{"sec", baseUnit{Time, 1, 0, false}},
		{"min", baseUnit{Time, 60, 0, false}},
		{"h", baseUnit{Time, 3600, 0, false}},
		{"hr", baseUnit{Time, 3600, 0, false}},
		// resistance and surface resistivity (ohm per square)
		{"Ω", baseUnit{Resistance, 1, 0, true}},
		{"ohm", baseUnit{Resistance, 1, 0, true}},
		{"ohms", baseUnit{Resistance, 1, 0, true}},
		{"Ω/sq", baseUnit{Resistance, 1, 0, true}},
		{"Ω/□", baseUnit{Resistance, 1, 0, true}},
		{"ohm/sq", baseUnit{Resistance, 1, 0, true}},
		{"ohms/sq", baseUnit{Resistance, 1, 0, true}},
		{"ohm/square", baseUnit{Resistance, 1, 0, true}},
		{"ohm per square", baseUnit{Resistance, 1, 0, true}},
		// volume resistivity
		{"Ω·m", baseUnit{Resistivity, 1, 0, true}},
		{"Ω m", baseUnit{Resistivity, 1, 0, true}},
		{"Ωm", baseUnit{Resistivity, 1, 0, true}},
		{"Ω.m", baseUnit{Resistivity, 1, 0, true}},
		{"ohm m", baseUnit{Resistivity, 1, 0, true}},
		{"ohm·m", baseUnit{Resistivity, 1, 0, true}},
		{"ohm.m", baseUnit{Resistivity, 1, 0, true}},
		{"ohm-m", baseUnit{Resistivity, 1, 0, true}},
		{"Ω·cm", baseUnit{Resistivity, 0.01, 0, true}},
		{"Ω cm", baseUnit{Resistivity, 0.01, 0, true}},
		{"Ωcm", baseUnit{Resistivity, 0.01, 0, true}},
		{"ohm cm", baseUnit{Resistivity, 0.01, 0, true}},
		{"ohm·cm", baseUnit{Resistivity, 0.01, 0, true}},
		{"ohm.cm", baseUnit{Resistivity, 0.01, 0, true}},
		{"ohm-cm", baseUnit{Resistivity, 0.01, 0, true}},
		// capacitance
		{"F", baseUnit{Capacitance, 1, 0, true}},
		// energy
		{"J", baseUnit{Energy, 1, 0, true}},
		// percent
		{"%", baseUnit{Percent, 1, 0, false}},
		{"%RH", baseUnit{Percent, 1, 0, false}},
		{"% RH", baseUnit{Percent, 1, 0, false}},
		// temperature
		{"°C", baseUnit{Temperature, 1, 273.15, false}},
		{"℃", baseUnit{Temperature, 1, 273.15, false}},
		{"C", baseUnit{Temperature, 1, 273.15, false}},
		{"degC", baseUnit{Temperature, 1, 273.15, false}},
		{"K", baseUnit{Temperature, 1, 0, false}},
		// conductivity
		{"S/m", baseUnit{Conductivity, 1, 0, true}},
		{"S/cm", baseUnit{Conductivity, 100, 0, true}},
		// humidity slope: only the header's own wording
		{"decades per 10 %RH", baseUnit{Slope, 1, 0, false}},
		{"decades per 10 % RH", baseUnit{Slope, 1, 0, false}},
		{"decades/10 %RH", baseUnit{Slope, 1, 0, false}},
		{"dec/10%RH", baseUnit{Slope, 1, 0, false}},
		// Site sheet limit items only: charge, area, charge density, v·d
		// (after the survey's own units, so "C" is read as °C first where
		// no dimension is asked for)
		{"C", baseUnit{Charge, 1, 0, true}},
		{"m²", baseUnit{Area, 1, 0, false}},
		{"m2", baseUnit{Area, 1, 0, false}},
		{"m^2", baseUnit{Area, 1, 0, false}},
		{"cm²", baseUnit{Area, 1e-4, 0, false}},
		{"cm2", baseUnit{Area, 1e-4, 0, false}},
		{"cm^2", baseUnit{Area, 1e-4, 0, false}},
		{"mm²", baseUnit{Area, 1e-6, 0, false}},
		{"mm2", baseUnit{Area, 1e-6, 0, false}},
		{"mm^2", baseUnit{Area, 1e-6, 0, false}},
		{"C/m²", baseUnit{ChargeDensity, 1, 0, true}},
		{"C/m2", baseUnit{ChargeDensity, 1, 0, true}},
		{"C/m^2", baseUnit{ChargeDensity, 1, 0, true}},
		{"m²/s", baseUnit{SpeedDiameter, 1, 0, false}},
		{"m2/s", baseUnit{SpeedDiameter, 1, 0, false}},
		{"m^2/s", baseUnit{SpeedDiameter, 1, 0, false}},
	}
}

// siPrefixes maps an SI prefix to its factor (µ may be written u; K is taken as k).
func siPrefix(p string) (float64, bool) {
	switch p {
	case "p":
		return 1e-12, true
	case "n":
		return 1e-9, true
	case "µ", "μ", "u":
		return 1e-6, true
	case "m":
		return 1e-3, true
	case "c":
		return 1e-2, true
	case "k", "K":
		return 1e3, true
	case "M":
		return 1e6, true
	case "G":
		return 1e9, true
	case "T":
		return 1e12, true
	}
	return 0, false
}

// normUnitSpaces trims a unit and writes its inner spaces as single spaces.
func normUnitSpaces(s string) string {
	return strings.Join(strings.Fields(s), " ")
}

// lookupUnits returns every reading of the unit symbol (an exact base unit, or
// an SI prefix before one), case-sensitive matches first, then case-insensitive
// ones for the base ("kv/m", "OHM"). "c" (centi) is only accepted before m.
func lookupUnits(symbol string) []Unit {
	s := normUnitSpaces(symbol)
	// "Ω·m" is also typed with a middle dot look-alike or a space; "ohm m" handled by the table.
	s = strings.ReplaceAll(s, "⋅", "·")
	s = strings.ReplaceAll(s, "Ω", "Ω") // ohm sign U+2126 to Greek omega
	bases := baseUnits()
	var out []Unit
	add := func(base string, b baseUnit, pf float64) {
		out = append(out, Unit{Symbol: strings.TrimSpace(symbol), Dim: b.dim, Factor: b.factor * pf, Offset: b.offset})
	}
	try := func(fold bool) {
		for _, nb := range bases {
			name, b := nb.name, nb.baseUnit
			if (fold && strings.EqualFold(name, s)) || (!fold && name == s) {
				add(name, b, 1)
			}
		}
		if s == "" {
			return
		}
		_, size := utf8.DecodeRuneInString(s)
		p, rest := s[:size], s[size:]
		pf, ok := siPrefix(p)
		if !ok || rest == "" {
			return
		}
		for _, nb := range bases {
			name, b := nb.name, nb.baseUnit
			if !b.prefixed {
				continue
			}
			if p == "c" && !strings.HasPrefix(name, "m") {
				continue
			}
			if (fold && strings.EqualFold(name, rest)) || (!fold && name == rest) {
				add(name, b, pf)
			}
		}
	}
	try(false)
	if len(out) == 0 {
		try(true)
	}
	return out
}

// ParseUnit parses a unit symbol and checks it has dimension want. It returns
// ErrUnknownUnit or ErrWrongDimension (wrapped in a *QuantityError) otherwise.
func ParseUnit(symbol string, want Dimension) (Unit, error) {
	if r, ok := ambiguousUnit(symbol, want); ok {
		return Unit{}, &QuantityError{Text: symbol, Unit: symbol, Want: want, Readings: r, Err: ErrAmbiguousUnit}
	}
	us := lookupUnits(symbol)
	if len(us) == 0 {
		return Unit{}, &QuantityError{Text: symbol, Unit: symbol, Want: want, Err: ErrUnknownUnit}
	}
	for _, u := range us {
		if u.Dim == want {
			return u, nil
		}
	}
	return Unit{}, &QuantityError{Text: symbol, Unit: symbol, UnitDim: us[0].Dim, Want: want, Err: ErrWrongDimension}
}

// QuantityError says why a cell could not be read as a quantity. It wraps one
// of the sentinel errors (ErrUnknownUnit, ErrWrongDimension, ErrNotANumber,
// ErrNotFinite, ErrUncertainty).
type QuantityError struct {
	Text    string    // the cell text
	Unit    string    // the unit as written, when the problem is the unit
	UnitDim Dimension // dimension of that unit (ErrWrongDimension)
	Want    Dimension // dimension the column needs
	// Readings are the two ways an ambiguous unit reads (ErrAmbiguousUnit).
	Readings [2]string
	Err      error
}

// Error describes the problem without the column's name.
func (e *QuantityError) Error() string { return e.Describe("") }

// Unwrap returns the sentinel.
func (e *QuantityError) Unwrap() error { return e.Err }

// Describe words the problem for a surveyor, naming the column when given:
// `"150 pF" has the dimension of capacitance but column Resistance to earth
// needs a resistance (Ω)`.
func (e *QuantityError) Describe(column string) string {
	col := "the column"
	if column != "" {
		col = "column " + column
	}
	return e.DescribeFor(col)
}

// DescribeFor words the problem naming what needs the value as given ("the
// earth change", "--rh's STEP"): `"5 kV" has the dimension of potential but
// the earth change needs a resistance (Ω)`.
func (e *QuantityError) DescribeFor(col string) string {
	want := e.Want.String()
	if u := SIUnit(e.Want); u != "" {
		want += " (" + u + ")"
	}
	switch {
	case errors.Is(e.Err, ErrWrongDimension) && e.Want == Dimensionless:
		return fmt.Sprintf("%q has a unit of %s but %s takes a plain number", e.Text, e.UnitDim, col)
	case errors.Is(e.Err, ErrWrongDimension):
		return fmt.Sprintf("%q has the dimension of %s but %s needs a %s", e.Text, e.UnitDim, col, want)
	case errors.Is(e.Err, ErrAmbiguousUnit):
		return fmt.Sprintf("%q is ambiguous: %q could be %s, or %s; %s needs a %s",
			e.Text, strings.TrimSpace(e.Unit), e.Readings[0], e.Readings[1], col, want)
	case errors.Is(e.Err, ErrUnknownUnit):
		return fmt.Sprintf("%q: unit %q is not known; %s needs a %s", e.Text, e.Unit, col, want)
	case errors.Is(e.Err, ErrNotFinite):
		return fmt.Sprintf("%q is not a finite number that can be a reading", e.Text)
	case errors.Is(e.Err, ErrAmbiguousComma):
		n := strings.TrimSpace(e.Text)
		if i := strings.IndexFunc(n, func(r rune) bool { return !(unicode.IsDigit(r) || strings.ContainsRune("+-,", r)) }); i > 0 {
			n = strings.TrimSpace(n[:i])
		}
		return fmt.Sprintf("%q reads as %s with a thousands separator or as %s with a decimal comma; write %s or %s",
			e.Text, strings.Replace(n, ",", "", 1), strings.Replace(n, ",", ".", 1), strings.Replace(n, ",", "", 1), strings.Replace(n, ",", ".", 1))
	case errors.Is(e.Err, ErrUncertainty):
		return fmt.Sprintf("%q: the ± part must be a relative uncertainty in %% (e.g. ±10%%)", e.Text)
	default:
		return fmt.Sprintf("%q is not a number", e.Text)
	}
}

// Parsed is the result of reading one numeric cell.
type Parsed struct {
	Value          float64 // SI value (percent for Percent, kelvin for Temperature); 0 when not Known
	Known          bool    // false: blank or a "not measured" word
	RelUncertainty float64 // from a "±10%" suffix; 0 when none
	Number         float64 // the number as written, before unit conversion
	Unit           string  // the unit written in the cell, "" when the header's applied
	Note           string  // a remark for a warning ("n/a" read as not measured), "" when none
}

// notMeasuredWords are the texts read as "not measured" in numeric columns.
func isNotMeasured(s string) bool {
	switch strings.ToLower(s) {
	case "n/a", "na", "n.a.", "n.a", "-", "--", "–", "—", "?", "none", "not measured", "nil":
		return true
	}
	return false
}

// ParseQuantity reads a numeric cell of a column of dimension dim whose header
// gives headerUnit ("" for SI or a plain number). The cell may carry its own
// unit ("2.5 MV/m", "150 pF", "1 GΩ"), which wins over the header's and must
// have the same dimension; a relative uncertainty suffix ("±10%", "+/-10 %");
// a decimal comma when it holds no other comma; exponents (1e9, 1.5E-3).
// Blank gives Known false with no note; "n/a", "na", "-", "?", "none" give
// Known false with a Note. The value is returned in SI units (percent stays
// percent, °C becomes kelvin). Errors are *QuantityError wrapping a sentinel.
func ParseQuantity(text, headerUnit string, dim Dimension) (Parsed, error) {
	return parseQuantity(text, headerUnit, dim, nil, 0)
}

// parseQuantity is ParseQuantity with the header's unit taken from column
// col of table t when t is not nil (the reader parses each column's header
// unit once, see table.headerUnit).
func parseQuantity(text, headerUnit string, dim Dimension, t *table, col int) (Parsed, error) {
	s := strings.TrimSpace(strings.ReplaceAll(text, "\u00a0", " "))
	if s == "" {
		return Parsed{}, nil
	}
	if isNotMeasured(s) {
		return Parsed{Note: fmt.Sprintf("%q read as not measured", s)}, nil
	}
	qerr := func(err error) error { return &QuantityError{Text: s, Want: dim, Err: err} }

	// Uncertainty suffix.
	var rel float64
	if i, w := uncertaintyMark(s); i >= 0 {
		u := strings.TrimSpace(s[i+w:])
		s2 := strings.TrimSpace(s[:i])
		if !strings.HasSuffix(u, "%") {
			return Parsed{}, qerr(ErrUncertainty)
		}
		n, err := parseNumber(strings.TrimSpace(strings.TrimSuffix(u, "%")))
		if err != nil || n < 0 || n > 1000 {
			return Parsed{}, qerr(ErrUncertainty)
		}
		rel = n / 100
		s = s2
	}

	numText, unitText := splitNumberUnit(s)
	if numText == "" {
		low := strings.ToLower(strings.TrimLeft(s, "+-"))
		if strings.HasPrefix(low, "nan") || strings.HasPrefix(low, "inf") || strings.HasPrefix(low, "∞") {
			return Parsed{}, qerr(ErrNotFinite)
		}
		return Parsed{}, qerr(ErrNotANumber)
	}
	n, err := parseNumber(numText)
	if err != nil {
		if errors.Is(err, ErrNotFinite) || errors.Is(err, ErrAmbiguousComma) {
			return Parsed{}, qerr(err)
		}
		return Parsed{}, qerr(ErrNotANumber)
	}
	p := Parsed{Known: true, RelUncertainty: rel, Number: n}
	var u Unit
	switch {
	case unitText != "":
		if r, ok := ambiguousUnit(unitText, dim); ok {
			return Parsed{}, &QuantityError{Text: s, Unit: unitText, Want: dim, Readings: r, Err: ErrAmbiguousUnit}
		}
		us := lookupUnits(unitText)
		if len(us) == 0 && isDigit(unitText[0]) {
			return Parsed{}, qerr(ErrNotANumber) // "1 234": a space inside the number
		}
		if len(us) == 0 {
			// A trailing word that is no unit: "12 approx" is text, not a number.
			if !looksLikeUnit(unitText) {
				return Parsed{}, qerr(ErrNotANumber)
			}
			return Parsed{}, &QuantityError{Text: s, Unit: unitText, Want: dim, Err: ErrUnknownUnit}
		}
		found := false
		for _, c := range us {
			if c.Dim == dim {
				u, found = c, true
				break
			}
		}
		if !found {
			return Parsed{}, &QuantityError{Text: s, Unit: unitText, UnitDim: us[0].Dim, Want: dim, Err: ErrWrongDimension}
		}
		p.Unit = strings.TrimSpace(unitText)
	case headerUnit != "" && dim != Dimensionless && dim != Slope:
		var h Unit
		var err error
		if t != nil {
			h, err = t.headerUnit(col, headerUnit, dim)
		} else {
			h, err = ParseUnit(headerUnit, dim)
		}
		if err != nil {
			return Parsed{}, err
		}
		u = h
	default:
		u = Unit{Dim: dim, Factor: 1}
	}
	v := n*u.Factor + u.Offset
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return Parsed{}, qerr(ErrNotFinite)
	}
	if v == 0 {
		v = 0 // no negative zero
	}
	if dim == Resistance && strings.HasPrefix(p.Unit, "m") && !strings.HasPrefix(p.Unit, "min") {
		p.Note = fmt.Sprintf("%q read as milliohm; write M for megaohm", s)
	}
	p.Value = v
	return p, nil
}

// uncertaintyMark finds "±", "+/-" or "+-" in s and returns its index and width, or -1.
func uncertaintyMark(s string) (int, int) {
	for _, m := range []string{"±", "+/-", "+-"} {
		// "+-" must not be the sign of an exponent ("1e+-3" is not valid anyway).
		if i := strings.Index(s, m); i > 0 {
			return i, len(m)
		}
	}
	return -1, 0
}

// looksLikeUnit reports whether a trailing text could be meant as a unit
// (short, no spaces beyond those units have).
func looksLikeUnit(s string) bool {
	return utf8.RuneCountInString(s) <= 12
}

// splitNumberUnit splits "1.5e+6 ohm" into "1.5e+6" and "ohm". The number part
// is a sign, digits, '.' or ',', and an exponent; "" when s does not start with one.
func splitNumberUnit(s string) (string, string) {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	} else if strings.HasPrefix(s, "−") { // minus sign U+2212
		s = "-" + s[len("−"):]
		i++
	}
	start := i
	digits := 0
	for i < len(s) && (isDigit(s[i]) || s[i] == '.' || s[i] == ',') {
		if isDigit(s[i]) {
			digits++
		}
		i++
	}
	if digits == 0 || i == start {
		return "", s
	}
	// exponent
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && isDigit(s[k]) {
			k++
		}
		if k > j {
			i = k
		}
	}
	return s[:i], strings.TrimSpace(s[i:])
}

func isDigit(b byte) bool { return b >= '0' && b <= '9' }

// ParseNumber is the number grammar every input shares (survey cells, Site
// items, the Changes sheet and command-line values such as sweep's --rh): a
// number written with a decimal point, or a decimal comma when it is the only
// comma and there is no point ("1,5" is 1.5); an exponent is allowed. It fails
// with ErrNotANumber, ErrNotFinite, or ErrAmbiguousComma for a comma that may
// be a thousands separator ("1,000": 1000 or 1.0?).
func ParseNumber(t string) (float64, error) { return parseNumber(t) }

// thousandsLike reports whether t is one to three digits (the first not 0),
// a comma and three digits, with an optional sign: "1,000", "-12,500". A
// decimal comma is read in every other place ("1,5", "0,125", "1,2345").
func thousandsLike(t string) bool {
	t = strings.TrimLeft(t, "+-")
	i := strings.IndexByte(t, ',')
	if i < 1 || i > 3 || t[0] == '0' || len(t)-i-1 != 3 {
		return false
	}
	for j := 0; j < len(t); j++ {
		if j != i && !isDigit(t[j]) {
			return false
		}
	}
	return true
}

// parseNumber parses a number written with a decimal point, or a decimal comma
// when it is the only comma and there is no point.
func parseNumber(t string) (float64, error) {
	if t == "" {
		return 0, ErrNotANumber
	}
	for _, r := range t {
		if !(unicode.IsDigit(r) || strings.ContainsRune("+-.,eE", r)) {
			return 0, ErrNotANumber
		}
	}
	if c := strings.Count(t, ","); c > 0 {
		if c > 1 || strings.Contains(t, ".") {
			return 0, ErrNotANumber
		}
		if thousandsLike(t) {
			// "1,000" is 1000 to one reader and 1.0 to another: a capacitance
			// or a resistance read 1000 times too small could clear a hazard.
			return 0, ErrAmbiguousComma
		}
		t = strings.Replace(t, ",", ".", 1)
	}
	if strings.Count(t, ".") > 1 {
		return 0, ErrNotANumber
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil {
		var ne *strconv.NumError
		if errors.As(err, &ne) && errors.Is(ne.Err, strconv.ErrRange) {
			return 0, ErrNotFinite
		}
		return 0, ErrNotANumber
	}
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, ErrNotFinite
	}
	return v, nil
}

// FormatSI writes an SI value with its SI unit ("1.2e+04 V/m") so that
// ParseQuantity(FormatSI(v, d), "", d) gives v back (temperature is written in K).
func FormatSI(v float64, d Dimension) string {
	s := strconv.FormatFloat(v, 'g', -1, 64)
	if u := SIUnit(d); u != "" {
		return s + " " + u
	}
	return s
}
