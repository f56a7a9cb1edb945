package book

import (
	"math"
	"strconv"
	"strings"
)

// Unit is an engineering display unit: the SI value is divided by Scale, the
// header shows Label and the workbook cell uses NumFmt. The units are
// constants so that no table of them is mutable package state.
type Unit uint8

// The display units of the audit. One set for the workbook and the terminal.
const (
	UnitDimless     Unit = iota // plain number, "[–]"
	UnitKV                      // potential, kV
	UnitPF                      // capacitance, pF
	UnitMJ                      // energy, mJ
	UnitUCPerM2                 // charge density, µC/m²
	UnitKVPerM                  // electric field, kV/m
	UnitNC                      // charge, nC
	UnitUA                      // current, µA
	UnitOhm                     // resistance, Ω (scientific)
	UnitOhmSq                   // surface resistivity, Ω/sq (scientific)
	UnitOhmM                    // volume resistivity, Ω·m (scientific)
	UnitSecond                  // time, s
	UnitMetre                   // length, m
	UnitMillimetre              // length, mm
	UnitCM2                     // area, cm²
	UnitMPerS                   // speed, m/s
	UnitKgPerS                  // mass flow, kg/s
	UnitUCPerKg                 // charge-to-mass ratio, µC/kg
	UnitPSPerM                  // conductivity, pS/m
	UnitM2PerS                  // velocity x diameter, m²/s
	UnitKVPerMM                 // breakdown strength, kV/mm
	UnitPercentRH               // relative humidity, %
	UnitRatio                   // energy over MIE, [–]
	UnitProbability             // a probability 0-1, shown as a percentage
	UnitCelsius                 // temperature in °C from kelvin
	UnitVolt                    // potential, V (small potentials: limits)
	UnitCubicMetre              // volume, m³
)

type unitSpec struct {
	label  string
	scale  float64
	offset float64
	numFmt string
}

func (u Unit) spec() unitSpec {
	switch u {
	case UnitKV:
		return unitSpec{"kV", 1e3, 0, fmtFixed2}
	case UnitPF:
		return unitSpec{"pF", 1e-12, 0, fmtFixed1}
	case UnitMJ:
		return unitSpec{"mJ", 1e-3, 0, fmtWide3}
	case UnitUCPerM2:
		return unitSpec{"µC/m²", 1e-6, 0, fmtWide2}
	case UnitKVPerM:
		return unitSpec{"kV/m", 1e3, 0, fmtFixed1}
	case UnitNC:
		return unitSpec{"nC", 1e-9, 0, fmtWide2}
	case UnitUA:
		return unitSpec{"µA", 1e-6, 0, fmtWide3}
	case UnitOhm:
		return unitSpec{"Ω", 1, 0, fmtSci}
	case UnitOhmSq:
		return unitSpec{"Ω/sq", 1, 0, fmtSci}
	case UnitOhmM:
		return unitSpec{"Ω·m", 1, 0, fmtSci}
	case UnitSecond:
		return unitSpec{"s", 1, 0, fmtWide2}
	case UnitMetre:
		return unitSpec{"m", 1, 0, fmtFixed3}
	case UnitMillimetre:
		return unitSpec{"mm", 1e-3, 0, fmtWide2}
	case UnitCM2:
		return unitSpec{"cm²", 1e-4, 0, fmtWide2}
	case UnitMPerS:
		return unitSpec{"m/s", 1, 0, fmtFixed2}
	case UnitKgPerS:
		return unitSpec{"kg/s", 1, 0, fmtWide3}
	case UnitUCPerKg:
		return unitSpec{"µC/kg", 1e-6, 0, fmtWide1}
	case UnitPSPerM:
		return unitSpec{"pS/m", 1e-12, 0, fmtSci}
	case UnitM2PerS:
		return unitSpec{"m²/s", 1, 0, fmtFixed3}
	case UnitKVPerMM:
		return unitSpec{"kV/mm", 1e6, 0, fmtFixed1}
	case UnitPercentRH:
		return unitSpec{"%", 1, 0, fmtFixed0}
	case UnitRatio:
		return unitSpec{"", 1, 0, fmtWide2}
	case UnitProbability:
		return unitSpec{"", 1, 0, fmtPercent1}
	case UnitVolt:
		return unitSpec{"V", 1, 0, fmtFixed0}
	case UnitCubicMetre:
		return unitSpec{"m³", 1, 0, fmtFixed2}
	case UnitCelsius:
		return unitSpec{"°C", 1, 273.15, fmtFixed1}
	}
	return unitSpec{"", 1, 0, fmtFixed2}
}

// Number formats. Wide-ranging quantities use a two-condition format so that
// small values do not display as a misleading 0.000 (a defined zero still
// shows as 0). Resistances and resistivities are always scientific.
const (
	fmtSci      = "0.0E+00"
	fmtWide3    = `[=0]0;[<0.001]0.0E+00;0.000`
	fmtWide2    = `[=0]0;[<0.01]0.0E+00;0.00`
	fmtWide1    = `[=0]0;[<0.1]0.0E+00;0.0`
	fmtFixed0   = "0"
	fmtFixed1   = "0.0"
	fmtFixed2   = "0.00"
	fmtFixed3   = "0.000"
	fmtPercent1 = "0.0%"
)

// Label returns the unit as written in headers, e.g. "kV"; "" when dimensionless.
func (u Unit) Label() string { return u.spec().label }

// NumFmt returns the Excel number format of a cell in this unit.
func (u Unit) NumFmt() string { return u.spec().numFmt }

// Header returns a column header with the unit in brackets, "Potential [kV]";
// a dimensionless quantity gets "[–]" so every numeric header shows its unit.
func (u Unit) Header(name string) string {
	if u == UnitProbability {
		return name + " [%]"
	}
	if u.Label() == "" {
		return name + " [–]"
	}
	return name + " [" + u.Label() + "]"
}

// Display converts an SI value to the unit and reports whether it is a real
// number to show: NaN and ±Inf (not defined, not computed) give false.
func (u Unit) Display(si float64) (float64, bool) {
	if math.IsNaN(si) || math.IsInf(si, 0) {
		return 0, false
	}
	sp := u.spec()
	v := (si - sp.offset) / sp.scale
	// Round to the 15 significant digits a spreadsheet keeps, so that
	// 350e-3 J shows as 350 mJ and not 349.99999999999994.
	if r, err := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 15, 64), 64); err == nil {
		v = r
	}
	return v, true
}

// Cell returns the display value for a workbook cell: a float64, or nil (an
// empty cell) when the quantity is not defined.
func (u Unit) Cell(si float64) any {
	v, ok := u.Display(si)
	if !ok {
		return nil
	}
	return v
}

// Text formats an SI value in the unit for plain text, "12.3 kV"; an undefined
// value gives "–".
func (u Unit) Text(si float64) string {
	v, ok := u.Display(si)
	if !ok {
		return "–"
	}
	if u == UnitProbability {
		return FormatSig(100*v, 3) + " %"
	}
	s := FormatSig(v, 3)
	if u.Label() == "" {
		return s
	}
	return s + " " + u.Label()
}

// FormatSigTrim is FormatSig with the trailing zeros of the mantissa dropped:
// "30", "0.156", "1e6", "1.5e-5" (the short form of a plain number in running text).
func FormatSigTrim(v float64, digits int) string {
	s := FormatSig(v, digits)
	mant, exp, hasExp := strings.Cut(s, "e")
	if strings.Contains(mant, ".") {
		mant = strings.TrimRight(strings.TrimRight(mant, "0"), ".")
	}
	if hasExp {
		return mant + "e" + exp
	}
	return mant
}

// FormatSig formats v with the given number of significant digits for plain
// text: fixed notation between 0.001 and 1e6, scientific outside, exact 0 as
// "0" and NaN or Inf as "–".
func FormatSig(v float64, digits int) string {
	switch {
	case math.IsNaN(v) || math.IsInf(v, 0):
		return "–"
	case v == 0:
		return "0"
	}
	if digits < 1 {
		digits = 1
	}
	a := math.Abs(v)
	if a < 1e-3 || a >= 1e6 {
		s := strconv.FormatFloat(v, 'e', digits-1, 64)
		// 1.2e-05 -> 1.2e-5: shorter and unambiguous.
		mant, exp, _ := strings.Cut(s, "e")
		sign := exp[:1]
		exp = strings.TrimLeft(exp[1:], "0")
		if sign == "+" {
			sign = ""
		}
		return mant + "e" + sign + exp
	}
	// Decimals so that the result has `digits` significant digits.
	mag := int(math.Floor(math.Log10(a)))
	dec := digits - 1 - mag
	if dec < 0 {
		dec = 0
	}
	s := strconv.FormatFloat(v, 'f', dec, 64)
	// Rounding may add a digit (9.995 -> 10.00): recompute once.
	if r, err := strconv.ParseFloat(s, 64); err == nil && r != 0 {
		if m2 := int(math.Floor(math.Log10(math.Abs(r)))); m2 > mag && dec > 0 {
			s = strconv.FormatFloat(v, 'f', dec-1, 64)
		}
	}
	return s
}

// SigNumFmt is the spreadsheet number format that shows v with the given
// number of significant digits as FormatSig writes it (fixed notation between
// 0.001 and 1e6, scientific outside), so that a workbook cell and the terminal
// show the same figures: 0.333, 25.0, 408, 0.00650.
func SigNumFmt(v float64, digits int) string {
	if digits < 1 {
		digits = 1
	}
	a := math.Abs(v)
	switch {
	case math.IsNaN(v) || math.IsInf(v, 0) || a == 0:
		return fmtFixed0
	case a < 1e-3 || a >= 1e6:
		return "0." + strings.Repeat("0", digits-1) + "E+00"
	}
	// The decimals FormatSig gives: from its text, after its rounding.
	t := FormatSig(v, digits)
	if _, frac, ok := strings.Cut(t, "."); ok {
		return "0." + strings.Repeat("0", len(frac))
	}
	return fmtFixed0
}

// FormatRatio formats an energy-to-MIE ratio for text: "–" for nil (no
// atmosphere), else three significant digits.
func FormatRatio(r *float64) string {
	if r == nil {
		return "–"
	}
	return FormatSig(*r, 3)
}

// Finite returns a pointer to v, or nil when v is NaN or infinite: the JSON
// null of "not defined".
func Finite(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// FinitePtr returns p unless it points at NaN or Inf.
func FinitePtr(p *float64) *float64 {
	if p == nil {
		return nil
	}
	return Finite(*p)
}
