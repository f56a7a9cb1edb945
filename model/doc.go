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
//     parallel plate; a cylinder over earth when Diameter, Length and Distance to
//     earth are given; else the typical value of the kind (person 200 pF, part
//     20 pF, container 100 pF), or the sphere of the object's size if larger.
//  2. Resistance: measured; unknown is taken as not earthed (Limits.NotEarthed, 1e13 ohm).
//  3. Charging current: measured; mass flow x charge-to-mass; a person walking
//     1 uA; a conductor with only a resistance given the worst-case 100 uA.
//  4. Potential: measured; else V(t) = I R (1 - exp(-t/RC)) (steady state I R
//     when no charging time). Capped at Peek's corona onset of the object's
//     radius (a person: at Limits.PersonMaxPotential). A person needs a surface
//     potential or a resistance to earth; other conductors a potential, a current
//     or a resistance.
//  5. Spark when V >= 300 V: W = C V^2/2, Q = C V. Decay tau = R C, time to 100 V.
//
// Powder: charging current mass flow x q/m; the receiving container follows the
// conductor recipe when its Resistance or Capacitance is on the row. Cone
// discharge screened out by bulk resistivity < 1e10 ohm m, q/m < 1 uC/kg, a
// container under 0.25 m^3 or a measured heap field <= 500 kV/m; otherwise its
// energy by Glor's formula, flagged when outside D 0.5-3 m, d 0.1-3 mm.
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
// Bag: the type rule of IEC 61340-4-4 (BagTypeAllowed); types A and B give brush
// discharges (A also propagating brush), an unearthed type C bag sparks as an
// isolated conductor of estimated capacitance 300 pF, type D only corona; an
// unknown type is assessed as type A, the most restrictive case.
//
// Comparison: Evaluation.EffectiveEnergy is the largest energy of the possible
// discharges that can ignite the atmosphere kind (brush never for a pure dust
// cloud). TransferredCharge is the largest charge of the possible discharges.
package model
