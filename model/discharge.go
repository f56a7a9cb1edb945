package model

import "math"

// SparkEnergy returns the energy of a spark from a conductor of capacitance C at
// potential V: W = C V^2 / 2 (JNIOSH-TR; textbook).
func SparkEnergy(c, v float64) float64 { return c * v * v / 2 }

// SparkCharge returns the charge a spark from a conductor transfers: Q = C V (textbook).
func SparkCharge(c, v float64) float64 { return c * math.Abs(v) }

// MaxUnearthedCapacitance returns the largest capacitance that may stay unearthed
// at potential V for an atmosphere of minimum ignition energy mie: C = 2 MIE / V^2 (derived).
func MaxUnearthedCapacitance(mie, v float64) float64 { return 2 * mie / (v * v) }

// PropagatingBrushEnergy returns the documented upper estimate of a propagating
// brush discharge's energy: the field energy stored in the layer,
// W = sigma^2 A t / (2 eps0 epsr), bounded above by maxEnergy (published range:
// hundreds of mJ to J, from memory).
func PropagatingBrushEnergy(sigma, area, t, epsr, maxEnergy float64) float64 {
	w := sigma * sigma * area * t / (2 * Eps0 * epsr)
	return math.Min(w, maxEnergy)
}

// PropagatingBrushCharge bounds the charge one propagating brush discharge
// transfers (C): at most the charge on the layer, sigma x area, and at most the
// charge that releases the discharge's energy w at the layer's voltage v,
// Q = 2 w / v (W = Q V / 2, derived); an unknown voltage takes vmin, the 4 kV
// below which a layer's breakdown prevents a propagating brush (TRGS 727 Annex
// C), the larger charge. When w is the layer's whole stored energy (not capped)
// the bound equals sigma x area. With the energy bound of 1 J (from memory)
// this gives at most 500 uC: hundreds of uC, not the millicoulombs the whole
// layer carries, most of which stays bound (a documented bound of this tool).
func PropagatingBrushCharge(sigma, area, w, v, vmin float64) float64 {
	q := sigma * area
	if !(v > 0) || math.IsInf(v, 0) {
		v = vmin
	}
	if b := 2 * w / v; !(q <= b) {
		q = b
	}
	return q
}

// Glor's cone discharge formula: validity range.
const (
	ConeMinDiameter     = 0.5    // m
	ConeMaxDiameter     = 3.0    // m
	ConeMinParticleSize = 0.1e-3 // m
	ConeMaxParticleSize = 3e-3   // m
)

// ConeDischargeEnergy returns the energy of a cone (bulking brush) discharge on a
// powder heap by Glor's formula W[mJ] = 5.22 D^3.36 d^1.462, with D the silo
// diameter in m and d the median particle size in mm (valid D 0.5-3 m, d 0.1-3 mm;
// D = 1 m, d = 1 mm gives 5.22 mJ; formula from memory). inRange reports whether
// both lie in the validity range; outside it the value is an extrapolation.
func ConeDischargeEnergy(diameter, particleSize float64) (energy float64, inRange bool) {
	dmm := particleSize * 1e3
	energy = 5.22e-3 * math.Pow(diameter, 3.36) * math.Pow(dmm, 1.462)
	inRange = diameter >= ConeMinDiameter && diameter <= ConeMaxDiameter &&
		particleSize >= ConeMinParticleSize && particleSize <= ConeMaxParticleSize
	return energy, inRange
}

// ConeEnergyAtRange returns the cone discharge energy by Glor's formula, never
// extrapolated: outside the validity range (D 0.5-3 m, d 0.1-3 mm) it is the
// value at the nearest edge of the range (D and d clamped into it), as the words
// beside it say (principle 3). Below the range the formula falls and the edge
// value is an upper bound that must not clear; above it the formula is not valid
// and the edge value is only a lower bound (the energy rises with D and d): the
// assessment then keeps a finding so it is never a clearance (ConeAboveRange).
// inRange reports whether both lie in the range.
func ConeEnergyAtRange(diameter, particleSize float64) (energy float64, inRange bool) {
	w, ok := ConeDischargeEnergy(diameter, particleSize)
	if ok {
		return w, true
	}
	dc := math.Min(math.Max(diameter, ConeMinDiameter), ConeMaxDiameter)
	pc := math.Min(math.Max(particleSize, ConeMinParticleSize), ConeMaxParticleSize)
	edge, _ := ConeDischargeEnergy(dc, pc)
	return edge, false
}

// ConeAboveRange reports whether the silo diameter or the particle size lies above
// Glor's validity range (D > 3 m or d > 3 mm), where the edge value is a lower bound.
func ConeAboveRange(diameter, particleSize float64) bool {
	return diameter > ConeMaxDiameter || particleSize > ConeMaxParticleSize
}
