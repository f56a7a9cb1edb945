package model

// This file fixes the model's entry point and its value types, the contract the
// assessment code (report/assess) is written against. Fields may be added;
// existing names and meanings stay. Every quantity is SI; NaN means "not given"
// on input and "not defined for this object" on output.

// Kind is the kind of surveyed object; the recipe of each is in Evaluate.
type Kind uint8

// Object kinds, as in the survey's Kind column.
const (
	KindUnknown Kind = iota
	Sheet
	Belt
	Roller
	Container
	Part
	Person
	Powder
	Liquid
	Bag
)

// Group is a gas or dust group (IEC 60079-0).
type Group uint8

// Groups; GroupNone when the atmosphere has none.
const (
	GroupNone Group = iota
	IIA
	IIB
	IIC
	IIIA
	IIIB
	IIIC
	numGroups
)

// Zone is a hazardous-area zone (IEC 60079-10-1 / -10-2).
type Zone uint8

// Zones; ZoneNone for an unclassified or non-hazardous area.
const (
	ZoneNone Zone = iota
	Zone0
	Zone1
	Zone2
	Zone20
	Zone21
	Zone22
)

// AtmosphereKind is what burns: gas, vapour, mist, dust or a hybrid of dust and gas.
type AtmosphereKind uint8

// Atmosphere kinds; NoAtmosphere where the station has none.
const (
	NoAtmosphere AtmosphereKind = iota
	Gas
	Vapour
	Mist
	Dust
	Hybrid
)

// Material holds the electrical properties the model needs of a material.
type Material struct {
	Name               string
	Conductive         bool    // class conductive (metals, conductive rubber)
	Dissipative        bool    // class dissipative at 50 % RH
	Permittivity       float64 // relative; NaN unknown
	SurfaceResistivity float64 // ohm per square at 50 % RH; NaN unknown
	HumiditySlope      float64 // decades per 10 %RH, >= 0
	VolumeResistivity  float64 // ohm m; NaN unknown
	BreakdownStrength  float64 // V/m; NaN unknown
}

// Input is one surveyed object in SI units; NaN fields were not measured.
type Input struct {
	Kind     Kind
	Material Material

	Length, Width, Diameter float64 // m
	Thickness               float64 // m, insulating layer
	EarthedBacking          bool    // the layer lies on earthed metal
	DoubleLayer             bool    // a caller that knows of double-layer charge (propagating brush without backing); the survey uses Process and the charging current density instead
	DistanceToEarth         float64 // m

	Field            float64 // V/m, field-meter reading
	FieldDistance    float64 // m
	SurfacePotential float64 // V

	Speed           float64 // m/s (belt, web; liquid: flow velocity in the line)
	MassFlow        float64 // kg/s
	ChargeToMass    float64 // C/kg
	ChargingCurrent float64 // A
	ChargingTime    float64 // s
	ParticleSize    float64 // m, median

	Resistance  float64 // ohm to earth; NaN unknown (treated as not earthed)
	Capacitance float64 // F; NaN: estimated

	Conductivity float64 // S/m (liquid)
	// ConductivityAssumed says Conductivity is not a reading but a typical
	// value (built-in substance list): it sets the filling clauses (a
	// documented choice), but the liquid is also taken as conductive for the
	// isolated-liquid spark, a value not on the row never clearing it (principle 2).
	ConductivityAssumed bool
	Permittivity        float64 // relative permittivity of a liquid; NaN: from the material or 2
	BagType             BagType
	Filling             Filling

	// ProductMIE is the MIE (J) of the powder a bag holds; NaN: the station's
	// dust MIE when its atmosphere is dust or hybrid, else the most sensitive band.
	ProductMIE float64

	// Insulating-surface inputs (appended).

	// LayerBreakdown is the measured breakdown voltage (V) of the insulating layer
	// (IEC 60243-1 style test on the layer itself); NaN: not measured, taken as
	// above Limits.PropagatingBreakdown (thin films hold 100-600 kV/mm).
	LayerBreakdown float64
	// Process says whether the row is process material or fixed equipment, and
	// whether pneumatic conveying charges it (see IsProcessMaterial).
	Process Process
	// CapacitanceEstimated says that Capacitance is not a measurement but a value
	// drawn about the model's estimate (uncertainty sampling): it may not clear a
	// requirement that only a measured capacitance clears (small-part exemption).
	CapacitanceEstimated bool
	// Liquid transfer (appended with the operation-by-operation liquid rules).
	VesselMaterial  VesselMaterial // receiving vessel's material; unknown: the stricter of metal and insulating
	VesselClass     VesselClass    // receiving vessel's class; unknown: the strictest class
	VesselDiameter  float64        // m, a fixed tank's diameter; NaN unknown (not a large tank)
	Filter          Filter         // filter or strainer upstream of the vessel
	FilterResidence float64        // s, residence time between the filter and the vessel; NaN unknown (none)
	SecondPhase     SecondPhase    // second phase carried by the liquid
	InletVelocity   float64        // m/s until the inlet is submerged; NaN: unknown (the slow start not shown met)
}

// BagType is the flexible bulk container type of IEC 61340-4-4.
type BagType uint8

// Bag types; BagUnknown is assessed as the most restrictive case.
const (
	BagUnknown BagType = iota
	BagA
	BagB
	BagC
	BagD
)

// Filling is how a liquid enters its receiving container.
type Filling uint8

// Filling modes.
const (
	FillUnknown Filling = iota
	FillTop
	FillBottom
	FillDipPipe
)

// Environment is the object's surroundings: the station's humidity and atmosphere.
type Environment struct {
	RelativeHumidity float64 // percent, 0-100
	Temperature      float64 // K
	Atmosphere       AtmosphereKind
	Group            Group
	Zone             Zone
	MIE              float64 // J; NaN where there is no atmosphere
}

// DischargeType names a discharge; the strings are the JSON contract.
type DischargeType uint8

// Discharge types in the fixed order of Evaluation.Discharges.
const (
	Spark DischargeType = iota
	Brush
	PropagatingBrush
	Corona
	Cone
	NumDischargeTypes
)

// NoDischarge is Evaluation.Effective when no discharge is possible.
const NoDischarge = NumDischargeTypes

// String returns the contract name: spark, brush, propagating_brush, corona, cone.
func (d DischargeType) String() string {
	switch d {
	case Spark:
		return "spark"
	case Brush:
		return "brush"
	case PropagatingBrush:
		return "propagating_brush"
	case Corona:
		return "corona"
	case Cone:
		return "cone"
	case NoDischarge:
		return "none"
	}
	return "unknown"
}

// Discharge is the screening result for one discharge type.
// Evaluate fills it without allocating; Reason() formats the one-sentence reason.
type Discharge struct {
	Type     DischargeType
	Possible bool
	Energy   float64 // J, effective or equivalent energy; NaN where not defined
	Charge   float64 // C transferred in one discharge; NaN where not defined
	// Code says why (one of the Reason* codes); A and B are the numbers the reason quotes.
	Code Reason
	A, B float64
}

// Reason is a code for the one-sentence reason of a discharge screening result.
type Reason uint16

// Evaluation is what the model computed for one object. NaN: not defined for the kind.
type Evaluation struct {
	Kind Kind

	Capacitance       float64 // F
	CapacitanceModel  CapModel
	Potential         float64 // V (conductor potential, or a surface's potential)
	PotentialSource   PotentialSource
	ChargeDensity     float64 // C/m^2
	SurfaceField      float64 // V/m
	ChargingCurrent   float64 // A
	StoredEnergy      float64 // J, C V^2 / 2 for conductors
	TransferredCharge float64 // C, the largest charge one possible discharge transfers

	Discharges [NumDischargeTypes]Discharge
	// EffectiveEnergy is the largest energy (J) among the possible discharges that
	// can ignite the environment's atmosphere kind: a brush discharge is left out
	// for a pure dust cloud (it ignites gas, vapour, mist and hybrid mixtures only);
	// corona has no defined energy and is never counted. 0 when none.
	EffectiveEnergy float64
	Effective       DischargeType // the discharge that gave EffectiveEnergy; NoDischarge when none

	InsulatingArea     float64 // m^2 of insulating surface (sheets, belts, bags), NaN otherwise
	SurfaceResistivity float64 // ohm per square at the environment's RH, NaN when unknown
	Dissipative        bool    // the surface leaks its charge at this RH: resistivity below Limits.DissipativeSurface (the area exemption's bound)
	DecayTime          float64 // s, tau = R C, or strip or liquid relaxation time
	TimeTo100V         float64 // s after charging stops, conductors; NaN otherwise

	// Liquids.
	RelaxationTime   float64 // s, eps0 epsr / kappa
	StreamingCurrent float64 // A
	VelocityDiameter float64 // m^2/s, v d

	// Assumed lists the defaults the model applied (estimated capacitance, unknown
	// resistance taken as not earthed...); Flags what it noticed (suspect reading,
	// potential capped at corona onset, formula outside its range).
	Assumed Assumption
	Flags   Flag

	// NotAssessed is non-zero when the model cannot judge the object (missing inputs).
	NotAssessed Missing

	// Added with the first implementation of Evaluate.
	Resistance        float64           // ohm to earth used: measured, or Limits.NotEarthed when unknown; NaN for surfaces
	CoronaOnset       float64           // V, corona-onset cap of the conductor's radius; NaN when not known
	ConductivityClass ConductivityClass // liquids
	ResidenceTime     float64           // s, residence a liquid needs to relax (3 tau)
	VelocityLimit     float64           // m/s, filling velocity limit for the line (liquids)
	BagAllowed        bool              // bags: the type may be used here (type C: if earthed)
	BagCode           Reason            // bags: why (Reason text)

	// Insulating surfaces (appended).
	AirField        float64 // V/m, air-side field of a backed layer: the reading (parallel-plate split); NaN otherwise
	LayerField      float64 // V/m, field inside a backed layer, V / t; NaN otherwise
	LayerVoltage    float64 // V across a backed layer: measured surface potential or E z; NaN otherwise
	LayerBreakdown  float64 // V, breakdown the layer is compared with: measured, else the thin-film upper strength x thickness (ThinFilmStrength, a physics bound that never clears); NaN unknown
	BreakdownSource BreakdownSource
	ChargingDensity float64 // A/m^2, charging current over the surface's area; NaN unknown
	// ProcessMaterial: the surface is process material (IsProcessMaterial), judged by
	// its charge; otherwise a fixed equipment surface held to the area limits.
	ProcessMaterial bool
	// Earthed: the surface is earthed as a conductor (earthed backing, or
	// resistance to earth at most Limits.ConductorEarthing).
	Earthed bool
	// IsolatedConductor: the surface conducts (conductive, dissipative by its
	// resistivity at this RH, or of dissipative class) and is not earthed: it is
	// assessed for a spark as an isolated conductor.
	IsolatedConductor bool
	// ConductingSurface: the spark rule counts the surface as a conductor,
	// earthed or not (conductive or dissipative material class, or resistivity
	// at this RH below Limits.SparkSurface); conductingSurface.
	ConductingSurface bool
	// Liquid transfer (appended with the operation-by-operation liquid rules).
	RuleClass         ConductivityClass // class the filling rules use: low also for a second phase below Limits.SecondPhaseConductivity
	LiquidBreaches    LiquidClause      // filling clauses not met, or not shown met for want of an input
	VDLimit           float64           // m^2/s, the v d limit applied; +Inf none; NaN not applicable
	VelocityCeiling   float64           // m/s, the velocity ceiling applied (the second-phase limit when lower)
	InletVelocity     float64           // m/s until submerged, as judged; NaN when not given or not applicable
	FilterResidence   float64           // s, residence needed after a fine filter; NaN when there is none
	ChargeFactor      float64           // factor on the plain-pipe streaming current (filter, second phase)
	VesselCapacitance float64           // F, the typical capacitance of the vessel class taken; NaN when measured or not used
	// Contradictions between a reading and the model (appended).
	// EarthingBound is the highest potential (V) the measured resistance to earth
	// allows a conductor under the worst-case charging current (I R); NaN when the
	// resistance is not measured or the potential is not measured.
	EarthingBound float64
	// ReadingDensity is the charge density (C/m^2) the reading inverts to when it
	// exceeds what air lets the surface hold (FlagReadingAboveBreakdown); the
	// density used (ChargeDensity) is then capped at the breakdown limit. NaN otherwise.
	ReadingDensity float64
	// UncappedPotential is an estimated potential (V) before the cap at
	// Limits.ConductorMaxPotential (FlagCappedConductor), or a measured potential
	// above the realistic maximum (FlagMeasuredAboveMaximum: the energy is taken
	// at the maximum); NaN when not capped.
	UncappedPotential float64

	// Added with the review fixes (appended).
	// BrushDensity is the charge density (C/m^2) a brush discharge can drain and
	// the brush screen is applied to: ChargeDensity, except on a layer on an
	// earthed backing, where only the air-side charge eps0 x the air-side field
	// can leave in a brush (the bound charge facing the backing cannot). NaN when
	// there is no reading.
	BrushDensity float64
	// ConeExtrapolated is Glor's formula evaluated beyond its range (J), shown
	// as "not valid" beside the edge value used (the cone's Energy), when the
	// silo diameter or particle size lies above the range (FlagConeAboveRange); NaN otherwise.
	ConeExtrapolated float64
}

// BreakdownSource says where Evaluation.LayerBreakdown came from.
type BreakdownSource uint8

// Breakdown sources.
const (
	BreakdownUnknown  BreakdownSource = iota
	BreakdownMeasured                 // Input.LayerBreakdown, measured on the layer
	BreakdownThinFilm                 // not measured: the thin-film upper strength x thickness, a physics bound used only to flag a contradiction (the breakdown is taken above 4 kV)
)

// String says where the layer breakdown voltage came from.
func (b BreakdownSource) String() string {
	switch b {
	case BreakdownMeasured:
		return "measured on the layer"
	case BreakdownThinFilm:
		return "not measured: taken above 4 kV; the value is the thin-film upper strength (about 600 kV/mm) x thickness, the most a film holds, used only to flag a reading above it (a bulk strength x thickness does not apply to films and is not used)"
	}
	return "not known: taken above 4 kV"
}

// CapModel says which model gave a capacitance.
type CapModel uint8

// PotentialSource says where a potential came from.
type PotentialSource uint8

// Assumption is a bit set of defaults the model applied.
type Assumption uint64

// Flag is a bit set of things the model noticed about the inputs or results.
type Flag uint32

// Missing is a bit set of inputs the kind needed and did not have.
type Missing uint32
