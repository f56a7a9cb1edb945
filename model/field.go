package model

import "math"

// IsolatedSheetField returns the field of an isolated infinite sheet of charge
// density sigma: E = sigma / (2 eps0) on each side, independent of distance
// (Gauss's law; valid while the distance is small against the sheet's size).
func IsolatedSheetField(sigma float64) float64 { return sigma / (2 * Eps0) }

// OneSidedField returns the field of a charged surface whose whole field lies on
// one side (a film on an earthed roller or plate): E = sigma / eps0 (Gauss's law).
func OneSidedField(sigma float64) float64 { return sigma / Eps0 }

// DiscAxisField returns the field on the axis of a uniformly charged disc of
// radius a at distance z: E = sigma/(2 eps0) (1 - z / sqrt(z^2 + a^2)), z >= 0
// (Coulomb's law integrated over the disc; textbook).
func DiscAxisField(sigma, a, z float64) float64 {
	return sigma / (2 * Eps0) * (1 - z/math.Hypot(z, a))
}

// RectangleAxisField returns the field on the centre axis of a uniformly charged
// rectangle of half-sides a and b at distance z > 0:
// E = sigma/(pi eps0) atan(a b / (z sqrt(a^2 + b^2 + z^2))); it tends to
// sigma/(2 eps0) as z -> 0 (Coulomb's law integrated over the rectangle; textbook).
func RectangleAxisField(sigma, a, b, z float64) float64 {
	if math.IsInf(a, 1) && math.IsInf(b, 1) {
		return IsolatedSheetField(sigma)
	}
	if math.IsInf(a, 1) || math.IsInf(b, 1) {
		// A strip infinite along one side: the limit of the formula.
		h := math.Min(a, b)
		return sigma / (math.Pi * Eps0) * math.Atan(h/z)
	}
	return sigma / (math.Pi * Eps0) * math.Atan(a*b/(z*math.Sqrt(a*a+b*b+z*z)))
}

// LineField returns the field at distance r from a line charge lambda (C/m):
// E = lambda / (2 pi eps0 r), falling as 1/r (Gauss's law; long line, r > 0).
func LineField(lambda, r float64) float64 { return lambda / (2 * math.Pi * Eps0 * r) }

// CylinderField returns the field at distance r from the axis of a long
// conducting cylinder of radius a carrying lambda (C/m): lambda/(2 pi eps0 r) for
// r >= a and 0 inside (Gauss's law; long cylinder).
func CylinderField(lambda, a, r float64) float64 {
	if r < a {
		return 0
	}
	return LineField(lambda, r)
}

// SphereField returns the field at distance r from the centre of a sphere or
// point carrying charge Q: E = Q / (4 pi eps0 r^2) outside (Gauss's law).
func SphereField(q, r float64) float64 { return q / (4 * math.Pi * Eps0 * r * r) }

// DensityBacked returns the charge density of a layer on an earthed backing from a
// field-meter reading E at distance z: sigma = eps0 E (1 + epsr z / t), with t the
// layer thickness and epsr its permittivity (parallel-plate split between the
// earthed meter and the earthed backing; valid for z small against the surface size).
func DensityBacked(e, z, t, epsr float64) float64 { return Eps0 * e * (1 + epsr*z/t) }

// DensityOverEarth returns the charge density of a free sheet at distance h above
// earth from a reading E at distance z: sigma = eps0 E (1 + z / h) (parallel-plate
// split; valid when h and z are small against the sheet's size).
func DensityOverEarth(e, z, h float64) float64 { return Eps0 * e * (1 + z/h) }

// DensityFreeRectangle returns the charge density of a rectangle of half-sides a, b
// in free space from an axial reading E at distance z, by inverting
// RectangleAxisField; a or b +Inf gives a strip, both +Inf the infinite sheet
// sigma = 2 eps0 E.
func DensityFreeRectangle(e, a, b, z float64) float64 {
	return e / RectangleAxisField(1, a, b, z)
}

// DensityFromPotentialBacked returns sigma = eps0 epsr V / t for a layer of
// thickness t on an earthed backing at surface potential V (parallel plate).
func DensityFromPotentialBacked(v, t, epsr float64) float64 { return Eps0 * epsr * v / t }

// DensityFromPotentialOverEarth returns sigma = eps0 V / h for a sheet at
// potential V at distance h over earth (parallel plate, h small against its size).
func DensityFromPotentialOverEarth(v, h float64) float64 { return Eps0 * v / h }

// MaxDensityOneSided returns the largest density a surface with all its field on
// one side can hold before air breaks down: eps0 Eb (2.65e-5 C/m^2 at 3 MV/m; CCPS glossary).
func MaxDensityOneSided(breakdown float64) float64 { return Eps0 * breakdown }

// MaxDensityTwoSided returns the largest density an isolated sheet (field on both
// sides) can hold: 2 eps0 Eb (5.3e-5 C/m^2 at 3 MV/m; derived).
func MaxDensityTwoSided(breakdown float64) float64 { return 2 * Eps0 * breakdown }
