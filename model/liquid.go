package model

import "math"

// ConductivityClass is a liquid's conductivity class for static electricity.
type ConductivityClass uint8

// Conductivity classes; ConductivityUnknown is screened as low.
const (
	ConductivityUnknown ConductivityClass = iota
	ConductivityLow                       // <= 50 pS/m
	ConductivityMedium                    // 50 pS/m to 1e4 pS/m
	ConductivityHigh                      // > 1e4 pS/m
)

// String returns low, medium, high or unknown.
func (c ConductivityClass) String() string {
	switch c {
	case ConductivityLow:
		return "low"
	case ConductivityMedium:
		return "medium"
	case ConductivityHigh:
		return "high"
	}
	return "unknown"
}

// ClassifyConductivity returns the class of conductivity kappa (S/m): low at or
// below lim.LowConductivity (50 pS/m, IEC TS 60079-32-1), high above
// lim.HighConductivity (1e4 pS/m, from memory), medium between; NaN gives unknown.
func ClassifyConductivity(kappa float64, lim Limits) ConductivityClass {
	switch {
	case math.IsNaN(kappa):
		return ConductivityUnknown
	case kappa <= lim.LowConductivity:
		return ConductivityLow
	case kappa > lim.HighConductivity:
		return ConductivityHigh
	}
	return ConductivityMedium
}

// StreamingCurrent returns the saturated streaming current of fully developed
// turbulent flow in a long earthed pipe: I = 3.75e-6 v^2 d^2 A (v in m/s, d in m;
// correlation from memory, roughly independent of conductivity; 5 m/s in 0.1 m
// gives 0.94 uA, consistent with 1-6 uA measured, NBS J. Res. 69C (1965)).
func StreamingCurrent(v, d float64) float64 { return 3.75e-6 * v * v * d * d }

// FillingVelocityLimit returns the highest flow velocity (m/s) for filling through a
// line of inner diameter d: v d <= lim.VDHigh (0.5 m^2/s) when kappa > lim.VDKappa
// (10 pS/m), <= lim.VDLow (0.38 m^2/s) at or below it or when kappa is unknown
// (NaN), and never above lim.MaxVelocity (7 m/s) (IEC TS 60079-32-1, road-tanker
// filling; the 7 m/s ceiling from memory). Until the inlet is submerged the slow
// start lim.SlowStartVelocity (1 m/s) applies instead.
func FillingVelocityLimit(kappa, d float64, lim Limits) float64 {
	vd := lim.VDLow
	if kappa > lim.VDKappa {
		vd = lim.VDHigh
	}
	return math.Min(vd/d, lim.MaxVelocity)
}

// ResidenceFactor is the number of relaxation times a charged liquid is given to
// relax (3 tau leaves 5 % of the charge) (common practice, no source).
const ResidenceFactor = 3.0
