package model

import "math"

// WalkingCurrent is the charging current of a person walking, about 1 uA at two
// steps a second (4e-7 C a step; Jonassen).
const WalkingCurrent = 1e-6

// MassFlowCurrent returns the charging current carried by a product stream:
// I = mass flow x charge-to-mass (A; derived; q/m ranges by process in the reference, section 7).
func MassFlowCurrent(massFlow, chargeToMass float64) float64 { return massFlow * chargeToMass }

// BeltCurrent returns the charging current of a belt or web carrying charge
// density sigma at speed v over width w: I = sigma v w (derived).
func BeltCurrent(sigma, v, w float64) float64 { return sigma * v * w }

// ConductorPotential returns the potential of a conductor with resistance R to
// earth and capacitance C charged by a current I for a time t:
// V(t) = I R (1 - exp(-t / (R C))); t NaN or +Inf gives the steady state I R
// (first-order RC circuit; TRGS 727 8.3, JNIOSH-TR). R = +Inf (no leakage) gives
// I t / C, and +Inf in the steady state; I = 0 gives 0.
func ConductorPotential(i, r, c, t float64) float64 {
	if i == 0 {
		return 0
	}
	if math.IsInf(r, 1) {
		if !finite(t) {
			return math.Inf(1)
		}
		return i * t / c
	}
	if !finite(t) {
		return i * r
	}
	return i * r * -math.Expm1(-t/(r*c))
}

// DecayTime returns the charge decay time constant tau = R C of a conductor (textbook).
func DecayTime(r, c float64) float64 { return r * c }

// TimeToPotential returns the time for a conductor at v0 to decay to v after
// charging stops: tau ln(v0 / v), 0 when v0 <= v (exponential RC decay).
func TimeToPotential(v0, v, tau float64) float64 {
	if math.Abs(v0) <= v {
		return 0
	}
	return tau * math.Log(math.Abs(v0)/v)
}

// RelativeAirDensity returns Peek's relative air density delta = (p / 101.325 kPa)
// (298.15 K / T), 1 at 25 °C and sea-level pressure (Peek 1929); the package takes
// sea-level pressure.
func RelativeAirDensity(temperature float64) float64 {
	return ReferenceTemperature / temperature
}

// PeekOnsetField returns the corona onset surface field of a smooth cylinder of
// radius r (m) in air: g_v = 3 MV/m delta m (1 + 0.301 / sqrt(delta r[cm])), with
// m the surface factor (1 smooth, 0.93-0.98 rough); r = 1 mm, delta = 1, m = 1
// gives 5.86 MV/m (Peek 1929; valid for radii of about 0.01-10 cm).
func PeekOnsetField(r, delta, m float64) float64 {
	rcm := r * 100
	return 3e6 * delta * m * (1 + 0.301/math.Sqrt(delta*rcm))
}

// CoronaOnsetPotential returns the potential at which a conductor of radius r
// reaches Peek's onset field at its surface: an isolated sphere holds V = g_v r;
// a cylinder with its axis at height h over earth V = g_v r arcosh(h / r)
// (h NaN or h <= r: the sphere). A screening cap, not an exact onset.
func CoronaOnsetPotential(r, h, delta float64) float64 {
	g := PeekOnsetField(r, delta, 1)
	if finite(h) && h > r {
		return g * r * math.Acosh(h/r)
	}
	return g * r
}
