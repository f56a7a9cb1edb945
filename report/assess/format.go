package assess

import (
	"math"
	"strconv"
	"strings"
)

// The formatters below write SI values in the engineering units people read in
// findings and reasons: mJ, kV, pF, nC, cm², µA, pS/m, and ohms in scientific format.

// sig formats v with three significant digits and no exponent for everyday
// magnitudes (1e-4 to 1e7); outside that range it uses scientific format.
func sig(v float64) string {
	switch {
	case math.IsNaN(v):
		return "unknown"
	case math.IsInf(v, 1):
		return "∞"
	case math.IsInf(v, -1):
		return "-∞"
	case v == 0:
		return "0"
	}
	a := math.Abs(v)
	if a < 1e-4 || a >= 1e7 {
		return sci(v)
	}
	exp := math.Floor(math.Log10(a))
	scale := math.Pow(10, 2-exp)
	r := math.Round(v*scale) / scale
	return strconv.FormatFloat(r, 'f', -1, 64)
}

// sci formats v as "1.0e6" (two significant digits, no plus sign, no leading zeros in the exponent).
func sci(v float64) string {
	if math.IsNaN(v) {
		return "unknown"
	}
	if math.IsInf(v, 0) {
		return sig(v)
	}
	s := strconv.FormatFloat(v, 'e', 1, 64) // "1.0e+06"
	mant, exp, ok := strings.Cut(s, "e")
	if !ok {
		return s
	}
	neg := strings.HasPrefix(exp, "-")
	exp = strings.TrimLeft(exp, "+-")
	exp = strings.TrimLeft(exp, "0")
	if exp == "" {
		exp = "0"
	}
	if neg {
		exp = "-" + exp
	}
	return mant + "e" + exp
}

// unit appends the unit to a formatted number; an unknown value stays
// "unknown", with no unit after it.
func unit(num, u string) string {
	if num == "unknown" {
		return num
	}
	return num + " " + u
}

func mJ(j float64) string    { return unit(sig(j*1e3), "mJ") }
func kV(v float64) string    { return unit(sig(v/1e3), "kV") }
func volts(v float64) string { return unit(sig(v), "V") }
func pF(f float64) string    { return unit(sig(f*1e12), "pF") }
func nC(c float64) string {
	if math.Abs(c) >= 1e-6 { // a propagating brush's charge: µC, not hundreds of thousands of nC
		return unit(sig(c*1e6), "µC")
	}
	return unit(sig(c*1e9), "nC")
}
func cm2(a float64) string      { return unit(sig(a*1e4), "cm²") }
func ohm(r float64) string      { return unit(sci(r), "Ω") }
func uA(a float64) string       { return unit(sig(a*1e6), "µA") }
func pSm(k float64) string      { return unit(sig(k*1e12), "pS/m") }
func mps(v float64) string      { return unit(sig(v), "m/s") }
func m2ps(v float64) string     { return unit(sig(v), "m²/s") }
func seconds(t float64) string  { return unit(sig(t), "s") }
func percent(rh float64) string { return unit(sig(rh), "%") }
func celsius(k float64) string  { return unit(sig(k-273.15), "°C") }
func uCm2(s float64) string     { return unit(sig(s*1e6), "µC/m²") }
func plain(v float64) string    { return sig(v) }

// ratioText is a ratio of energy to MIE in running text, rounded as every
// table writes a ratio (report/book.FormatSigTrim, three significant digits:
// the decimal nearest the binary value, strconv's rounding), so that a finding
// and a table never round one ratio two ways (1.125: "1.12" in both). The
// judging engine does not import the output packages: the rule is repeated
// here and TestRatioTextRoundsAsTheTables (report/audit) holds them together.
func ratioText(r float64) string {
	a := math.Abs(r)
	if math.IsNaN(r) || math.IsInf(r, 0) || r == 0 || a < 1e-3 || a >= 1e6 {
		return sig(r)
	}
	mag := int(math.Floor(math.Log10(a)))
	dec := max(2-mag, 0)
	t := strconv.FormatFloat(r, 'f', dec, 64)
	if v, err := strconv.ParseFloat(t, 64); err == nil && dec > 0 && int(math.Floor(math.Log10(math.Abs(v)))) > mag {
		t = strconv.FormatFloat(r, 'f', dec-1, 64) // 9.995 -> 10.0, not 10.00
	}
	if strings.Contains(t, ".") {
		t = strings.TrimRight(strings.TrimRight(t, "0"), ".")
	}
	return t
}
