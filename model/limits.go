package model

// Limits are the published limits and screening choices the model and the
// assessment apply. DefaultLimits returns them, LimitTable says for each its
// label, units, Site item, default and source; a survey may override them
// (Site sheet). Per-group arrays are indexed by Group.
type Limits struct {
	// Brush discharge: charge-density screen per gas group (C/m^2), the
	// equivalent energy (J) and the area one brush drains (m^2).
	BrushChargeDensity [numGroups]float64
	BrushEnergy        float64
	BrushArea          float64

	// Transferred charge per group (C), EPL Gb/Gc (zones 1, 2); zone 0 uses ZoneZeroChargeFactor x these.
	TransferredCharge    [numGroups]float64
	ZoneZeroChargeFactor float64

	// Insulating surface area per group (m^2), EPL Ga (zone 0) and Gb/Gc (zones 1, 2).
	AreaGa [numGroups]float64
	AreaGb [numGroups]float64

	// Propagating brush: density it needs (C/m^2), the layer breakdown below which
	// it is prevented (V), the thickness above which it is not expected (m).
	PropagatingDensity   float64
	PropagatingBreakdown float64
	PropagatingThickness float64

	ConductorEarthing  float64 // ohm, conductors to earth
	PersonEarthing     float64 // ohm, person to earth
	PersonEarthingMIE  float64 // J, the person limit applies when MIE <= this
	ShockEnergy        float64 // J
	SafePotential      float64 // V, a conductor below it is safe (100 V)
	SparkMinPotential  float64 // V, Paschen floor (about 300 V)
	AirBreakdown       float64 // V/m
	NotEarthed         float64 // ohm, an unknown resistance to earth as shown; the conductor recipe computes it as no leakage (+Inf)
	PersonMaxPotential float64 // V, cap on an estimated body potential

	// Liquids (IEC 60079-32-1 filling limits).
	LowConductivity   float64 // S/m, at or below: low conductivity
	HighConductivity  float64 // S/m, above: high conductivity
	VDKappa           float64 // S/m, conductivity that selects VesselVDHigh over VesselVDLow
	SlowStartVelocity float64 // m/s until the inlet is submerged

	// Bags (IEC 61340-4-4).
	BagCToTab     float64 // ohm, any point to the earthing tab (type C)
	BagTabToEarth float64 // ohm, tab to plant earth (type C)
	BagMinMIE     float64 // J, ignition qualification of types C and D
	BagMaxCurrent float64 // A, charging current the qualification assumes

	// Added with the first implementation of Evaluate (fields only appended).

	PropagatingMaxEnergy float64 // J, upper bound of a propagating brush's energy
	MaxChargingCurrent   float64 // A, worst-case industrial charging current: bounds the potential of an earthed conductor with no charging on its row
	DissipativeSurface   float64 // ohm, surface resistance below which a surface is dissipative
	DissipativeEarthing  float64 // ohm, earthing a dissipative surface needs to leak its charge
	ConeResistivity      float64 // ohm m, bulk resistivity at or above which a cone can form
	ConeChargeToMass     float64 // C/kg, charge-to-mass at or above which a cone can form
	ConeField            float64 // V/m, measured heap-surface field at or below which none is expected
	ConeMinVolume        float64 // m^3, container volume below which none is expected
	BagDustLow           float64 // J, product MIE band edge (at or below: most sensitive band)
	BagDustHigh          float64 // J, product MIE band edge (above: least sensitive band)

	// Added with the rules of issue 11 (fields only appended).

	ConductorMaxPotential   float64 // V, cap on an unmeasured conductor potential (corona at edges and bolts)
	SmallPartCapacitance    float64 // F, an isolated metal part below it need not be earthed (IIA, IIB, Group III)
	SmallPartCapacitanceIIC float64 // F, the same for IIC and EPL Ga (zone 0)
	DustBrushMIE            float64 // J, a dust below this MIE is screened for brush discharges like a hybrid
	// Liquid transfer by vessel class (indexed by VesselClass; VesselUnknown
	// unused: an unknown class takes the strictest class). LiquidRules cites each.
	VesselVDLow             [NumVesselClasses]float64 // m^2/s, v d limit at or below VDKappa or unknown conductivity
	VesselVDHigh            [NumVesselClasses]float64 // m^2/s, v d limit above VDKappa (low-conductivity liquids)
	VesselMaxVelocity       [NumVesselClasses]float64 // m/s, velocity ceiling
	LargeTankDiameter       float64                   // m, a fixed tank at or above it has no v d limit
	SecondPhaseVelocity     float64                   // m/s, ceiling with a second phase
	SecondPhaseConductivity float64                   // S/m, below it a liquid with a second phase is low-conductivity
	FilterResidenceFactor   float64                   // relaxation times of residence after a fine filter
	FilterResidenceMax      float64                   // s, residence after a fine filter that always suffices
	FilterChargeFactor      float64                   // factor on the streaming current after a fine filter
	StrainerChargeFactor    float64                   // factor on the streaming current after a strainer
	SecondPhaseChargeFactor float64                   // factor on the streaming current with a second phase

	// Added with the follow-up contradiction checks (fields only appended).

	// EarthingContradictionFactor: a measured conductor potential more than this
	// many times the bound its measured earthing allows (worst-case charging
	// current x resistance to earth) contradicts the earthing path.
	EarthingContradictionFactor float64

	// Added with the review fixes (fields only appended).

	// SparkSurface: surface resistance below which a surface conducts well
	// enough to spark as an isolated conductor when it is not earthed: the
	// dissipative class bound of ESD practice (below 1e12 ohm/sq), stricter than
	// DissipativeSurface (1e9 ohm, which only decides the area exemption).
	SparkSurface float64
	// CoronaEnergy: the equivalent energy bound of a corona discharge (from a
	// sharp point or edge, a type D bag). Corona is compared with an atmosphere's
	// MIE only where it can ignite one, an MIE below this bound (hydrogen-like
	// gases); above it corona is not counted (corona below about 0.1-1 mJ ignites
	// only very sensitive gases such as hydrogen; below 1 mJ confirmed, the rest
	// from memory).
	CoronaEnergy float64
	// CoatingThickness, CoatingThicknessIIC: an insulating layer on earthed
	// metal no thicker than this (IIA, IIB; IIC) and of measured breakdown at
	// most PropagatingBreakdown is a coating, not held to the insulating-area
	// limit (IEC 60079-0).
	CoatingThickness    float64
	CoatingThicknessIIC float64
}
