package model

import "math"

// UnknownMaterial is a material of which nothing is known: every property
// NaN (not given), neither conductive nor dissipative, no humidity slope.
func UnknownMaterial() Material {
	nan := math.NaN()
	return Material{Permittivity: nan, SurfaceResistivity: nan, VolumeResistivity: nan, BreakdownStrength: nan}
}

// NewInput returns the input of an object of kind k with every quantity not
// given (NaN, never 0) and an unknown material: a caller sets only what was
// measured or is known. The enumerations (vessel, filling, bag type, filter,
// second phase, process) are their unknown values, which the rules read as
// the stricter case.
func NewInput(k Kind) Input {
	nan := math.NaN()
	return Input{
		Kind:     k,
		Material: UnknownMaterial(),
		Length:   nan, Width: nan, Diameter: nan, Thickness: nan, DistanceToEarth: nan,
		Field: nan, FieldDistance: nan, SurfacePotential: nan,
		Speed: nan, MassFlow: nan, ChargeToMass: nan, ChargingCurrent: nan, ChargingTime: nan, ParticleSize: nan,
		Resistance: nan, Capacitance: nan, Conductivity: nan, Permittivity: nan, ProductMIE: nan,
		LayerBreakdown: nan, VesselDiameter: nan, FilterResidence: nan, InletVelocity: nan,
	}
}
