// Package model is the electrostatic screening model of sparkmargin: pure
// functions in SI units, each documented with its formula, validity range and
// source, and one entry point, Evaluate, that applies them to one surveyed object.
// It does no I/O and words no verdicts; the assessment compares its results with
// the limits (LimitTable, one row per limit with its label, units, Site item,
// default and source; DefaultLimits, overridable by a survey; References lists
// the documents the sources cite by key, with editions). Every default applied is recorded in Evaluation.Assumed,
// everything noticed in Evaluation.Flags, every missing input in
// Evaluation.NotAssessed. The figures are screening estimates: they defer to
// local codes, the site's hazardous-area classification and a competent person.
//
// # Principles
//
// Every rule of the model and of the assessment built on it follows three
// principles (a wrong "non-incendive" is worse than no tool):
//
//  1. A measurement beats a default. No default or library value (the humidity
//     model, a library dielectric strength, a typical capacitance, an
//     extrapolated formula) may clear a hazard that a reading on the row shows.
//     Where a reading contradicts the model, the reading's hazard is kept and a
//     flag (FlagHumidityContradiction, FlagBreakdownContradiction) lets the
//     assessment write a finding that names the contradiction and what to check.
//  2. Unknown means the stricter case. A blank input takes the value that gives
//     the stricter verdict, and Evaluation.Assumed says so beside the value.
//  3. Never extrapolate into a clearance. Outside a formula's range the value at
//     the nearest edge of the range is used (never less), and it is marked.
//
// # Method, step by step
//
// Insulating surfaces (sheet, belt, and a roller that is not a conductor, see
// RollerIsConductor):
//
//  1. Surface resistivity at the station's RH from the material's 50 % value and
//     slope (SurfaceResistivityAt); dissipative if below Limits.DissipativeSurface.
//     A dissipative class with no resistivity does not count as dissipative.
//     Process material or fixed equipment: IsProcessMaterial (Process input; blank:
//     a belt, or a sheet with a Speed, is process material; anything else equipment).
//  2. Charge density sigma from the field-meter reading E at distance z: on an
//     earthed backing eps0 E (1 + epsr z/t); an insulating roller with a Diameter
//     as a cylinder eps0 E (R + z)/R (on an earthed core the larger of the two);
//     over earth at distance h the split eps0 E (1 + z/h) only while
//     h + z <= OverEarthValidity x the smaller side (OverEarthValid), and never
//     below the free sheet, so a distance to earth never makes it milder than a
//     blank one; otherwise the finite rectangle in free space (Length x Width;
//     unknown sides infinite). Or from a surface potential V: eps0 epsr V/t backed,
//     eps0 V/h over earth (the larger of it and the disc of equal area outside the
//     split's validity; for a roller the larger of it and the cylinder over a
//     plane); with no backing and no distance to earth, the free sheet of the
//     object's size, V 8 eps0 r / A, a lower bound (AssumedFreeSheetLowerBound):
//     it shows a brush above the screen and clears none below it
//     (MissingDistanceToEarth). A reading above air breakdown, or a density above what air can
//     hold (eps0 x 3 MV/m with all the field on one side, twice that on a free
//     sheet), is a bad reading: flagged (FlagSuspectReading,
//     FlagReadingAboveBreakdown), the raw inversion kept in ReadingDensity and the
//     density used capped at that limit (a thin earthed-backed layer, which holds
//     its field inside the layer, is not capped).
//  3. Surface field sigma/eps0 (backed, cylinder, split) or sigma/(2 eps0) (free).
//     A backed layer also gets its air-side field (the reading), its internal
//     field E z/t and the voltage across it E z (AirField, LayerField,
//     LayerVoltage); a free sheet has no potential E z.
//  4. Humidity: a dissipative surface that is earthed (backing, or resistance to
//     earth <= Limits.DissipativeEarthing) and decays faster than it travels to
//     the hazard leaks its charge; this clears only what was not measured: a
//     reading above a screen keeps its discharge and raises FlagHumidityContradiction.
//  5. Brush: possible when sigma exceeds the group's screen; equivalent energy
//     Limits.BrushEnergy (4 mJ); charge sigma x Limits.BrushArea (100 cm^2). On a
//     layer on earthed metal sigma is the charge a brush can drain:
//     min(sigma, eps0 Eb), the most an earthed electrode closer than the meter
//     could draw before air breaks down (AssumedElectrodeDraw for a field
//     reading; the stricter case), whatever the thickness and whichever
//     instrument read it (a field E at z is the layer voltage E z): the IEC
//     60079-0 coating thickness is a construction rule for the area limit only.
//  6. Propagating brush: needs an earthed backing or a process that builds a
//     double layer (charging current density above PropagatingCurrentDensity,
//     about 1 mA/m^2, BG RCI FAQ 1.12; or Process pneumatic conveying, from
//     memory), a layer thinner than 8 mm, a layer breakdown voltage not measured
//     at or below 4 kV (Input.LayerBreakdown; unknown is taken above 4 kV, and a
//     bulk strength x thickness never clears: thin films hold 100-600 kV/mm), and
//     sigma >= 2.5e-4 C/m^2 measured, or the process; energy the stored field
//     energy of the layer, at most 1 J (a process-driven one at 1 J). A layer
//     whose voltage exceeds its measured breakdown, or the thin-film upper
//     strength ThinFilmStrength x thickness (about 600 kV/mm, reference
//     section 12) when none was measured, raises FlagBreakdownContradiction; a bulk
//     strength x thickness is not used. A reading above a measured breakdown of
//     4 kV or less keeps the propagating brush (principle 1; BG RCI FAQ 1.12).
//  7. Belts: charging current sigma v w (or the row's, the larger). Decay of a
//     strip earthed at its edges tau = rho_s c w^2/pi^2.
//  8. A conducting surface (conductive, of dissipative class whatever its
//     resistivity, or below the ESD dissipative class bound Limits.SparkSurface,
//     1e12 ohm/sq, at the station's RH: reference section 6) not earthed (no earthed backing, resistance blank or above
//     Limits.ConductorEarthing) is an isolated conductor (IsolatedConductor): its
//     spark W = C V^2/2 with V measured, or sigma A / C from the reading, or from
//     its charging current; C measured, else the disc of equal area 8 eps0 r
//     (the stricter for a charge read on it) or eps0 A/h when larger. An
//     estimated V is capped as a conductor's (Limits.ConductorMaxPotential, a
//     roller's corona onset; UncappedPotential keeps the estimate); a measured V
//     is kept, but above the maximum (FlagMeasuredAboveMaximum; the reading in
//     UncappedPotential) the spark is taken at the maximum; far above what a
//     measured earthing allows: FlagEarthingContradiction.
//
// Conductors (conductive roller, container, part, person):
//
//  1. Capacitance: measured; else a container on an insulating layer as a
//     parallel plate; a container (or a powder row's receiving vessel) from the
//     vessel size table (VesselSizeCapacitance: drum up to 200 L 100 pF, 250-500 L
//     300 pF, larger vessel, IBC or tanker 1000 pF; size unknown 1000 pF), never
//     the isolated sphere of a floor-standing vessel; a cylinder over earth when
//     Diameter, Length and Distance to earth are given; else the typical value of
//     the kind (person 200 pF, part 20 pF), or the sphere of the object's size if larger.
//  2. Resistance: measured; unknown is taken as not earthed with no leakage at all
//     (the stricter case for any measured resistance).
//  3. Charging current: measured; mass flow x charge-to-mass; a person walking
//     1 uA. No current is invented for a conductor with no charging mechanism on
//     its row: earthed within Limits.ConductorEarthing it cannot reach the spark
//     floor even at the worst-case 100 uA (ReasonSparkEarthedBound); otherwise the
//     spark is not evaluated (MissingConductorCharging says what to measure) and
//     only its earthing is judged. A conductor the row shows charged by motion (a
//     conductive roller, or a Speed on the row; chargedInMotion) that is not
//     earthed within that bound has an unknown potential: the stricter case is
//     taken, the worst-case Limits.MaxChargingCurrent (100 uA, JNIOSH-TR) through
//     its resistance, V = I R, so a measured resistance still leaks
//     (AssumedMaxCurrent, FlagAssumedCurrent).
//  4. Potential: measured (above Limits.ConductorMaxPotential, a person's above
//     Limits.PersonMaxPotential, it is flagged as a contradiction,
//     FlagMeasuredAboveMaximum, and the spark taken at that maximum: reference
//     sections 3 and 12, realistic potentials; above
//     Limits.EarthingContradictionFactor times the I R its measured resistance
//     allows under the worst-case current, 1 uA walking for a person, 100 uA
//     otherwise, FlagEarthingContradiction, EarthingBound); else V(t) = I R
//     (1 - exp(-t/RC)) (steady state I R when no charging time; with no leakage
//     I t / C, or unbounded), capped at Limits.ConductorMaxPotential (50 kV,
//     common practice, no source) and at Peek's corona onset of the object's
//     radius (a person: at Limits.PersonMaxPotential). FlagAssumedResistance marks
//     an estimate set by an unknown resistance.
//  5. Spark when V >= 300 V: W = C V^2/2, Q = C V. Decay tau = R C, time to 100 V.
//
// Powder: charging current mass flow x q/m; the receiving container follows the
// conductor recipe when its Resistance or Capacitance is on the row. Brush
// discharges from the charged powder, its cloud and its sack or liner (4 mJ)
// unless the row shows the powder does not charge; they count against gas,
// vapour, mist and hybrid atmospheres and dusts below Limits.DustBrushMIE
// (BrushIgnites). Cone discharge screened out by bulk resistivity < 1e10 ohm m or
// q/m < 1 uC/kg, or by a measured heap field <= 500 kV/m together with a container
// under 0.25 m^3 (JNIOSH-TR states the two jointly); otherwise its energy by
// Glor's formula, outside D 0.5-3 m, d 0.1-3 mm the value at the nearest edge of
// the range, never less (ConeEnergyAtRange), flagged.
//
// Liquid, judged operation by operation as IEC TS 60079-32-1 does (LiquidRules
// lists each clause with its reference, edition and source mark):
//
//  1. Conductivity class (low <= 50 pS/m, high > 1e4 pS/m); the filling rules
//     treat a liquid with a second phase below 1000 pS/m as low. Unknown: low.
//  2. Relaxation time eps0 epsr/kappa; streaming current 3.75e-6 v^2 d^2 of a
//     plain pipe, times LiquidChargeFactor for a fine filter (100, relaxed over
//     the residence time after it, never below 1), a strainer (1) and a second
//     phase (10); CurrentCase words which case was taken.
//  3. The clauses of the vessel class, for low-conductivity liquids: v d at or
//     below the class's limit (road tankers 0.38 / 0.5 m^2/s), the 7 m/s ceiling,
//     1 m/s until the inlet is submerged, no top (splash) filling, 1 m/s with a
//     second phase, a residence time after a fine filter, and no filling into an
//     insulating vessel (no safe limits); medium and high: the ceiling only. An
//     unknown vessel class takes the strictest class, an unknown material the
//     stricter of metal and insulating, a filter not stated a fine filter, a second
//     phase not stated is present; an unknown input is a clause not shown met.
//  4. Brush from the liquid surface (Limits.BrushEnergy) only where a clause is
//     not met: a compliant fill is non-incendive for the liquid surface.
//  5. Spark: the vessel (or a conductive liquid in an insulating, lined or
//     unearthed vessel) follows the conductor recipe, charged by the streaming
//     current, with the measured or the vessel class's typical capacitance
//     (VesselCapacitance); a low-conductivity liquid in an insulating vessel is no
//     conductor.
//
// Bag: the type rule of IEC 61340-4-4 (BagTypeAllowed; gas or vapour present in
// a dust zone, a hybrid included, takes the gas column); types A and B give brush
// discharges (A also propagating brush), an unearthed type C bag sparks as an
// isolated conductor of estimated capacitance 300 pF, type D only corona; an
// unknown type is assessed as type A, the most restrictive case.
//
// Comparison: Evaluation.EffectiveEnergy is the largest energy of the possible
// discharges that can ignite the atmosphere kind (brush not for a pure dust cloud
// of MIE at or above 1 mJ). A gas, vapour, mist or hybrid atmosphere with no group
// is assessed as IIC (Environment.WithStrictGroup, AssumedGroupIIC). TransferredCharge is the largest charge of the possible discharges.
package model
