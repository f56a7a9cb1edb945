package model

import "math"

// Clip bounds of the humidity model for surface resistivity (ohm per square):
// humidity alone is taken never to bring a surface below the dissipative class
// floor nor above a clean polymer's ceiling (common practice, no source).
const (
	SurfaceResistivityFloor   = 1e5
	SurfaceResistivityCeiling = 1e16
)

// SurfaceResistivityAt returns the surface resistivity at relative humidity rh (%)
// from the 50 % value rho50 and the material's slope (decades per 10 %RH, >= 0):
// log10 rho(rh) = log10 rho50 - slope (rh - 50) / 10, clipped to
// [SurfaceResistivityFloor, SurfaceResistivityCeiling] (never clipping past rho50
// itself). A linear log-resistivity model (reference section 9; paper about 0.8
// decade per 10 %RH, weak secondary source); valid for about 10-90 %RH.
func SurfaceResistivityAt(rho50, slope, rh float64) float64 {
	if !finite(rh) || slope <= 0 || !finite(slope) {
		return rho50
	}
	rho := rho50 * math.Pow(10, -slope*(rh-50)/10)
	lo := math.Min(rho50, SurfaceResistivityFloor)
	hi := math.Max(rho50, SurfaceResistivityCeiling)
	return math.Max(lo, math.Min(hi, rho))
}

// StripRelaxationTime returns the time constant with which a strip of width w,
// earthed along both edges, drains its charge through its surface:
// tau = rho_s c w^2 / pi^2, with c the capacitance per area (F/m^2) of the strip
// to its surroundings (slowest mode of the diffusion equation; valid for a long strip).
func StripRelaxationTime(rhoS, cPerArea, w float64) float64 {
	return rhoS * cPerArea * w * w / (math.Pi * math.Pi)
}

// LiquidRelaxationTime returns the charge relaxation time of a liquid:
// tau = eps0 epsr / kappa (IEC TS 60079-32-1; epsr 2, 1 pS/m gives 17.7 s).
func LiquidRelaxationTime(epsr, kappa float64) float64 { return Eps0 * epsr / kappa }
