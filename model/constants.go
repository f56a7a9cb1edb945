package model

import "math"

// Physical constants and air properties used throughout the package (SI).
const (
	// Eps0 is the vacuum permittivity in F/m (CODATA 2018 recommended value).
	Eps0 = 8.8541878128e-12

	// AirBreakdownField is the breakdown field of air in V/m for gaps of about a
	// centimetre (AMS Glossary of Meteorology, about 3 MV/m).
	AirBreakdownField = 3e6

	// PaschenMinimum is the lowest breakdown voltage of any air gap in V (Paschen
	// minimum, about 327 V); below it no spark gap breaks down.
	PaschenMinimum = 327.0

	// ReferenceTemperature is the temperature in K at which Peek's relative air
	// density is 1 (25 °C at 101.325 kPa).
	ReferenceTemperature = 298.15

	// DefaultTemperature is the air temperature in K taken when none is given (20 °C,
	// the survey format's default).
	DefaultTemperature = 293.15
)

// finite reports whether x is a usable number (not NaN, not infinite).
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// given reports whether a measured input was given (not NaN).
func given(x float64) bool { return !math.IsNaN(x) }

// positive reports whether x is a finite number above zero.
func positive(x float64) bool { return finite(x) && x > 0 }
