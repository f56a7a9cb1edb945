// Package assess judges a read survey against ignition limits: for every
// accepted object it runs the model for its kind in its station's surroundings,
// applies the checks, gives a verdict with a one-sentence reason, findings with
// mitigations in words of the trade, and the defaults the result rests on; then
// it ranks the stations.
//
//	survey := inventory.ReadFile("line3.xlsx", inventory.ReadOptions{})
//	lim := assess.LimitsFromSite(survey.Site, model.DefaultLimits()) // the Site sheet's overrides, validated by inventory
//	audit := assess.Assess(survey, assess.Options{Limits: lim})
//	audit.Stations[0]   // the worst station: Rank 1, Verdict, WorstRatio
//	audit.Findings[0]   // e.g. {Check: "energy-vs-mie", Message: "spark of 5 mJ reaches the MIE of 0.24 mJ (ratio 20.8)", ...}
//
// # Checks
//
// Each check has a stable name (Check.Name) used in findings, JSON and the
// mitigation texts of package templates:
//
//	energy-vs-mie        effective energy >= MIE                                  incendive
//	energy-vs-margin     MIE / required margin <= energy < MIE                    marginal
//	transferred-charge   charge of one brush discharge > group limit (zone 0: x f;  incendive
//	                     dust: a propagating brush's > 200 nC)
//	insulating-area      insulating surface > EPL Ga (zone 0) / Gb (zones 1, 2)   marginal
//	conductor-earthing   conductor to earth > 1e6 ohm, or not measured (small      marginal
//	                     parts of measured C < 10 pF, 3 pF in IIC/zone 0, exempt)
//	person-earthing      person to earth > 1e8 ohm, zones 0/1/20/21, MIE <= 10 mJ  marginal
//	shock-energy         energy to a person touching it > 350 mJ                  marginal
//	filling-velocity     liquid v d > 0.5 (kappa > 10 pS/m) or 0.38 m^2/s         marginal
//	velocity-ceiling     liquid flow velocity > 7 m/s                             marginal
//	slow-start           bottom or dip-pipe fill > 1 m/s until the inlet is       marginal
//	                     submerged, or inlet velocity not given
//	low-conductivity     liquid <= 50 pS/m (or not given) into an insulating or   marginal
//	                     glass vessel (or material not given)
//	splash-filling       top (splash) filling of a low-conductivity liquid        marginal
//	second-phase-velocity  second phase (or not stated) and flow > 1 m/s          marginal
//	filter-residence     residence after a fine filter (or not stated) too short  marginal
//	isolated-liquid      conductive liquid in an insulating or unearthed vessel   marginal
//	                     not earthed through a dip pipe or rod
//	bag-type             bag type not allowed here (IEC 61340-4-4 usage table)     marginal
//	bag-earthing         type C bag tab to earth > 1e6 ohm, or not measured       marginal
//	bag-qualification    type C/D bag with MIE < 0.14 mJ or current > 3 uA        marginal
//	layer-breakdown-contradiction  layer holds more than its breakdown voltage    marginal
//	reading-vs-humidity  reading above the screen on a surface the humidity       marginal
//	                     model finds dissipative and earthed
//	measured-potential-above-maximum  measured potential > 50 kV: contradiction   marginal
//	reading-vs-earthing  measured potential >= 300 V and > 10 x the I R its       marginal
//	                     measured earthing allows (I: 1 uA for a person walking,
//	                     100 uA otherwise), where an earthing requirement applies
//	reading-above-breakdown  reading inverts to more than air holds (eps0 x 3     marginal
//	                     MV/m one-sided, twice that on a free sheet): the density
//	                     used is capped there
//	cone-above-range     silo D > 3 m or particle d > 3 mm: Glor's formula not    marginal
//	                     valid, the edge value used is a lower bound
//	cone-extrapolated-reaches-mie  above the range, the formula (not valid there) incendive
//	                     reaches the MIE: taken as able to ignite
//
// Each check's ground (standard, clause or table and edition, or a screening
// choice of this tool) is in the same table (Check.Basis); every Finding carries it.
//
// # Verdicts
//
// Classify, pure and allocation-free, gives the worst severity among the failed
// checks; with none failed, non-incendive, unless the energy could not be judged
// (the model lacked inputs, or the atmosphere's MIE is unknown), which is "not
// assessed". With inputs missing, the discharges the model could evaluate still
// give a lower bound on the energy: one reaching the MIE or the margin is a
// finding, never hidden behind "not assessed". An object at a station with no flammable atmosphere has no ratio and
// is judged on the shock check alone.
//
// # Choices where the standards are silent
//
//   - The earthing, person-to-earth, area, liquid and bag requirements are
//     explosion-protection requirements: they apply only where the station has an
//     atmosphere. The shock check applies everywhere.
//   - Touchable for the shock check: persons, parts, containers, conductive rollers,
//     the receiving containers of liquid and powder rows and conductive bags (their
//     stored energy C V^2 / 2), and any layer that can give a propagating brush
//     discharge (webs, belts, type A bags).
//   - Conductors to earth: parts, containers, rollers the model treats as
//     conductors, liquid rows (line and receiving container) and powder rows that
//     describe their receiving container (Resistance or Capacitance given).
//   - An atmosphere with no zone is assessed in the strictest zone (0, or 20 for
//     dust), recorded as a default; an explicit zone "none" is taken as written.
//     A gas, vapour, mist or hybrid atmosphere with no group is assessed as IIC
//     (brush screen, transferred charge, area limits, bag rules), recorded as a default.
//   - A blank site RH (an error for check) is assessed at DryDayHumidity, with a
//     warning on the terminal and the value used on the Summary sheet.
//   - The transferred-charge limits are applied to brush and propagating brush
//     discharges (insulating surfaces, for which IEC 60079-0 sets them); sparks
//     from conductors are judged by their energy (see InsulatorCharge).
//   - A failed requirement outranks "not assessed": the reason then says the
//     energy could not be judged.
//   - A bag row's Resistance to earth is its earthing tab to plant earth; the bag's
//     own point-to-tab resistance is a product property named in the mitigation.
//   - A bag with no type is assessed as type A; a liquid with no filling mode as
//     top filling. A liquid with no conductivity (or permittivity) takes the typical
//     value of the station atmosphere's built-in substance, else is assessed as
//     low-conductivity. Each is a default.
//   - Raising humidity is recommended only for materials whose surface
//     resistivity falls at least HumidityResponds decades per 10 %RH.
//   - Double-layer charge is never read from words in the Notes: the model judges
//     it from the Process column (pneumatic conveying) and the charging current
//     density (above about 1 mA/m^2, BG RCI FAQ 1.12).
//   - The insulating-area limit (IEC 60079-0, an equipment-construction limit)
//     applies to fixed equipment surfaces only; process material (a belt, a sheet
//     with a Speed, or Process "moving web" or "belt") is judged by its charge and
//     discharges (IEC TS 60079-32-1). The area is shown either way. A surface is
//     exempt only when dissipative at the RH and earthed, or as a coating on
//     earthed metal (CoatingExempt: thin, breakdown measured at most 4 kV).
//   - A conducting surface (conductive, dissipative, or of dissipative class) that
//     is not earthed is a conductor row: conductor-earthing applies and its spark
//     counts (model.Evaluation.IsolatedConductor).
//   - A reading that contradicts the humidity model, the layer's breakdown
//     voltage, the measured earthing or air breakdown keeps its hazard and adds a
//     marginal finding (reading-vs-humidity, layer-breakdown-contradiction,
//     reading-vs-earthing, reading-above-breakdown); a reading above air
//     breakdown is used at the breakdown limit, never above.
//
// # Uncertainty (Options.Samples > 0)
//
// Every measured input has a default uncertainty (DefaultUncertainties), each a
// documented choice of this tool, not a standard value; a cell's own "±x%"
// (inventory.Quantity.RelUncertainty, a relative standard uncertainty) wins over
// the table, and the Site sheet overrides a row (UncertaintiesFromSite):
//
//	input                              default         distribution        Site item
//	field reading                      ±10 %           normal, relative    Uncertainty field [%]
//	reading distance                   ±10 mm          normal, absolute    Uncertainty field distance [mm]
//	surface or body potential          ±10 %           normal, relative    Uncertainty surface potential [%]
//	resistance to earth                ±0.5 decade     log-normal          Uncertainty resistance [decades]
//	capacitance, measured              ±10 %           log-normal          Uncertainty measured capacitance [%]
//	capacitance, estimated             ×/÷ 3           log-normal          Uncertainty estimated capacitance [factor]
//	MIE, dust or hybrid                ×/÷ 2           log-normal          Uncertainty MIE dust [factor]
//	MIE, gas, vapour or mist           ±20 %           log-normal          Uncertainty MIE gas [%]
//	charging current                   ×/÷ 2           log-normal          Uncertainty charging current [factor]
//	mass flow                          ±10 %           normal, relative    Uncertainty mass flow [%]
//	charge-to-mass ratio               ×/÷ 3           log-normal          Uncertainty charge to mass [factor]
//	sizes (L, W, D, thickness,         ±5 %            normal, relative    Uncertainty size [%]
//	  distance to earth, particle size)
//	speed                              ±5 %            normal, relative    Uncertainty speed [%]
//	charging time                      ±10 %           normal, relative    Uncertainty charging time [%]
//	liquid conductivity                ×/÷ 2           log-normal          Uncertainty conductivity [factor]
//	relative humidity (when given)     ±5 %RH          normal, absolute    Uncertainty relative humidity [%RH]
//
// A log-normal row of ±x % has ln-standard deviation ln(1 + x/100); "decades"
// d gives d ln 10; "factor" f gives ln f. The Monte Carlo (montecarlo.go) draws
// each object's inputs N times from its own seeded stream, runs Evaluate and
// Classify per draw, and gives the probability of each verdict, the 5th, 50th
// and 95th percentiles of the effective energy, and per station the probability
// that any object is incendive (objects taken as independent: an upper bound).
package assess
