// Package model is the electrostatic screening model of sparkmargin: pure
// functions in SI units, each documented with its formula, validity range and
// source, and one entry point, Evaluate, that applies them to one surveyed object.
// It does no I/O and words no verdicts; the assessment compares its results with
// the limits (DefaultLimits, overridable by a survey; LimitSources names each
// source and edition). Every default applied is recorded in Evaluation.Assumed,
// everything noticed in Evaluation.Flags, every missing input in
// Evaluation.NotAssessed. The figures are screening estimates: they defer to
// local codes, the site's hazardous-area classification and a competent person.
//
// # Method, step by step
//
// Insulating surfaces (sheet, belt, and a roller that is not a conductor, see
// RollerIsConductor):
//
//  1. Surface resistivity at the station's RH from the material's 50 % value and
//     slope (SurfaceResistivityAt); dissipative if below Limits.DissipativeSurface.
//  2. Charge density sigma from the field-meter reading E at distance z: on an
//     earthed backing eps0 E (1 + epsr z/t); over earth at distance h
//     eps0 E (1 + z/h); otherwise the finite rectangle in free space (Length x
//     Width; unknown sides infinite). Or from a surface potential V: eps0 epsr V/t
//     backed, eps0 V/h over earth. A density above what air can hold is flagged as a
//     suspect reading, except on thin earthed-backed layers.
//  3. Surface field sigma/eps0 (backed or over earth) or sigma/(2 eps0) (free).
//  4. A dissipative surface that is earthed (backing, or resistance to earth
//     <= Limits.DissipativeEarthing) and decays faster than it travels to the
//     hazard keeps no charge: no brush, no propagating brush.
//  5. Brush: possible when sigma exceeds the group's screen; equivalent energy
//     Limits.BrushEnergy (4 mJ); charge sigma x Limits.BrushArea (100 cm^2).
//  6. Propagating brush: needs an earthed backing or double-layer charge, a layer
//     thinner than 8 mm whose breakdown voltage exceeds 4 kV, and sigma >=
//     2.5e-4 C/m^2; energy the stored field energy of the layer, at most 1 J.
//  7. Belts: charging current sigma v w. Decay of a strip earthed at its edges
//     tau = rho_s c w^2/pi^2.
//
// Conductors (conductive roller, container, part, person):
//
//  1. Capacitance: measured; else a container on an insulating layer as a
//     parallel plate; a container (or a powder row's receiving vessel) from the
//     vessel size table (VesselCapacitance: drum up to 200 L 100 pF, 250-500 L
//     300 pF, larger vessel, IBC or tanker 1000 pF; size unknown 1000 pF), never
//     the isolated sphere of a floor-standing vessel; a cylinder over earth when
//     Diameter, Length and Distance to earth are given; else the typical value of
//     the kind (person 200 pF, part 20 pF), or the sphere of the object's size if larger.
//  2. Resistance: measured; unknown is taken as not earthed with no leakage at all
//     (the stricter case for any measured resistance).
//  3. Charging current: measured; mass flow x charge-to-mass; a person walking
//     1 uA. No current is invented for any other conductor with no charging on its
//     row: earthed within Limits.ConductorEarthing it cannot reach the spark floor
//     even at the worst-case 100 uA (ReasonSparkEarthedBound); otherwise the spark
//     is not evaluated (MissingConductorCharging says what to measure) and only its
//     earthing is judged.
//  4. Potential: measured (never capped; above Limits.ConductorMaxPotential it is
//     flagged as a contradiction, FlagMeasuredAboveMaximum); else V(t) = I R
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
// Liquid: conductivity class; relaxation time eps0 epsr/kappa and the residence
// 3 tau; streaming current 3.75e-6 v^2 d^2 as the charging current of the
// receiving container (conductor recipe when its Resistance or Capacitance is on
// the row); filling velocity limit; a low or unknown conductivity liquid can give
// a brush from its surface (4 mJ).
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
