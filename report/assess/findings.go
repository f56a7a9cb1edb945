package assess

import (
	"fmt"
	"math"
	"strings"

	"github.com/sparkmargin/sparkmargin/model"
	"github.com/sparkmargin/sparkmargin/templates"
)

// HumidityResponds is the humidity slope (decades of surface resistivity per
// 10 %RH) from which raising humidity is worth recommending (paper falls about
// 0.8 decade per 10 %RH; hydrophobic plastics about 0) (a documented choice).
const HumidityResponds = 0.3

// dischargeWords names a discharge in a sentence.
func dischargeWords(t model.DischargeType) string {
	switch t {
	case model.Spark:
		return "spark"
	case model.Brush:
		return "brush discharge"
	case model.PropagatingBrush:
		return "propagating brush discharge"
	case model.Corona:
		return "corona discharge"
	case model.Cone:
		return "cone discharge"
	}
	return "discharge"
}

// brushDensity is the density the brush screen was applied to (a backed layer's
// air side), or the charge density where the model gave none.
func brushDensity(ev *model.Evaluation) float64 {
	if !math.IsNaN(ev.BrushDensity) {
		return ev.BrushDensity
	}
	return ev.ChargeDensity
}

// AssumedResistanceDominates reports whether a spark's energy is set by the
// assumption that an unmeasured resistance to earth leaks nothing: the audit
// then says "at least the MIE (assumed resistance dominates)" instead of quoting
// an estimate nobody would sign.
func AssumedResistanceDominates(ev *model.Evaluation, d model.DischargeType) bool {
	return d == model.Spark && ev.Flags&model.FlagAssumedResistance != 0
}

// AssumedCurrentDominates reports whether a spark's energy is set by the
// worst-case charging current taken for an unearthed conductor the row shows
// charged by motion but gives no current nor potential for
// (model.FlagAssumedCurrent): its size is the stricter case, not a figure.
func AssumedCurrentDominates(ev *model.Evaluation, d model.DischargeType) bool {
	return d == model.Spark && ev.Flags&model.FlagAssumedCurrent != 0
}

// AssumedInputDominates reports whether a spark's energy is set by an assumed
// input, the resistance to earth or the charging current: its ratio, at least
// 1, is shown as RatioAssumedText and the station's rank is noted as resting on it.
func AssumedInputDominates(ev *model.Evaluation, d model.DischargeType) bool {
	return AssumedResistanceDominates(ev, d) || AssumedCurrentDominates(ev, d)
}

// worstPotentialWords says how the potential of an assumed worst-case charging
// current came about: "V = I R = 100 kV, capped at the realistic plant maximum
// of 50 kV" (common practice, no source), or "V = I R = 1 kV".
func worstPotentialWords(ev *model.Evaluation) string {
	if ev.Flags&model.FlagCappedConductor != 0 && !math.IsNaN(ev.UncappedPotential) {
		return fmt.Sprintf("V = I R = %s, capped at the realistic plant maximum of %s", kV(ev.UncappedPotential), kV(ev.Potential))
	}
	if ev.Flags&model.FlagCappedCorona != 0 {
		return fmt.Sprintf("V = I R capped at the corona onset of %s", kV(ev.Potential))
	}
	return "V = I R = " + kV(ev.Potential)
}

// findings writes one Finding per failed check, in check order.
func (x *objectContext) findings(r *ObjectResult, c *Classification) []Finding {
	if c.Failed == 0 {
		return nil
	}
	var out []Finding
	for k := Check(0); k < NumChecks; k++ {
		if !c.Failed.Has(k) {
			continue
		}
		msg, mit := x.findingText(k, r, c)
		out = append(out, Finding{
			ObjectID:   r.Object.ID,
			StationID:  r.Station.ID,
			Check:      k.Name(),
			Severity:   k.Severity(),
			Message:    msg,
			Mitigation: mit,
			Basis:      k.BasisFor(c.Discharge),
		})
	}
	return out
}

// mitigationClass is the object class the energy mitigations are worded for.
func mitigationClass(in *model.Input, d model.DischargeType) string {
	switch {
	case in.Kind == model.Bag:
		return "bag"
	case d == model.Spark && in.Kind == model.Person:
		return "person"
	case d == model.Spark:
		return "conductor"
	case in.Kind == model.Liquid:
		return "liquid"
	case d == model.Cone || in.Kind == model.Powder:
		return "powder"
	}
	return "insulator"
}

// insulatorDischarge returns the brush or propagating brush discharge whose charge InsulatorCharge gives.
func insulatorDischarge(ev *model.Evaluation) model.DischargeType {
	pb := &ev.Discharges[model.PropagatingBrush]
	if pb.Possible && pb.Charge == InsulatorCharge(ev) {
		return model.PropagatingBrush
	}
	return model.Brush
}

// humiditySentence says whether raising humidity helps the object's material.
func humiditySentence(in *model.Input) string {
	m := in.Material
	if m.Conductive || m.Name == "" || math.IsNaN(m.HumiditySlope) {
		return ""
	}
	if m.HumiditySlope >= HumidityResponds {
		return " " + templates.Mitigation("humidity.responds")
	}
	return " " + templates.Mitigation("humidity.no-effect")
}

func zoneWords(z model.Zone) string {
	if z == model.ZoneNone {
		return "an unzoned area"
	}
	return "zone " + z.String()
}

// findingText returns the one-line message with the numbers and the mitigation of a failed check.
func (x *objectContext) findingText(k Check, r *ObjectResult, c *Classification) (msg, mit string) {
	in, env, ev, lim := &r.Input, &r.Environment, &r.Eval, x.lim
	mit = templates.Mitigation(k.Name())
	switch k {
	case CheckEnergyMIE:
		msg = fmt.Sprintf("%s of %s reaches the MIE of %s (ratio %s)", dischargeWords(c.Discharge), mJ(c.Energy), mJ(env.MIE), ratioText(c.Ratio))
		if AssumedResistanceDominates(ev, c.Discharge) {
			// The size of the estimate is an artefact of the unknown resistance: no kilojoules.
			msg = fmt.Sprintf("%s energy of at least the MIE of %s (assumed resistance dominates: the resistance to earth is not measured, so no leakage is assumed); measure the resistance to earth and the potential in operation", dischargeWords(c.Discharge), mJ(env.MIE))
		} else if AssumedCurrentDominates(ev, c.Discharge) {
			// Review 3 item 4: a moving conductor not earthed within the limit,
			// its charging unknown: the stricter case, said as such.
			msg = fmt.Sprintf("%s of up to %s at the assumed worst case reaches the MIE of %s (the ratio, %s, is no figure: at least 1 on this assumption): no charging current or potential on the row, so the worst-case industrial %s is taken through the resistance to earth of %s (%s; capacitance %s); measure the potential in operation (or the charging current), and earth the conductor", dischargeWords(c.Discharge), mJ(c.Energy), mJ(env.MIE), ratioText(c.Ratio), uA(ev.ChargingCurrent), ohm(in.Resistance), worstPotentialWords(ev), pF(ev.Capacitance))
		}
		if in.Kind == model.Liquid && c.Discharge == model.Spark {
			msg += " (" + model.CurrentCase(in, ev) + ")"
		}
	case CheckEnergyMargin:
		msg = fmt.Sprintf("%s of %s is below the MIE of %s but reaches MIE / %s = %s (ratio %s)", dischargeWords(c.Discharge), mJ(c.Energy), mJ(env.MIE), plain(x.margin), mJ(env.MIE/x.margin), ratioText(c.Ratio))
	case CheckTransferredCharge:
		q, grp := ChargeAgainstLimit(env, ev), env.Group.String()
		d := insulatorDischarge(ev)
		if env.Atmosphere == model.Dust {
			d, grp = model.PropagatingBrush, "Group III"
		}
		msg = fmt.Sprintf("charge transferred by one %s, %s, exceeds the %s limit of %s in %s", dischargeWords(d), nC(q), grp, nC(TransferredChargeLimit(env, lim)), zoneWords(env.Zone))
		if in.Kind == model.Bag {
			mit = templates.Mitigation("transferred-charge.bag")
		} else {
			mit += humiditySentence(in)
		}
	case CheckInsulatingArea:
		msg = fmt.Sprintf("insulating surface of %s exceeds the %s limit of %s for %s", cm2(ev.InsulatingArea), zoneWords(env.Zone), cm2(InsulatingAreaLimit(env, lim)), env.Group)
		if in.Material.Dissipative || ev.Dissipative {
			// Already a dissipative material: what is missing is its earthing.
			mit = templates.Mitigation("insulating-area.dissipative")
		}
		mit += humiditySentence(in)
	case CheckConductorEarthing:
		what := "resistance to earth"
		if in.Kind == model.Liquid {
			what = "resistance to earth of the receiving container and line"
		}
		if ev.IsolatedConductor && (in.Kind == model.Sheet || in.Kind == model.Belt || in.Kind == model.Roller) {
			what = "the surface conducts (conductive, of dissipative class, or below the 1e12 Ω per square dissipative bound at this humidity) so it is a conductor; its resistance to earth"
			mit = templates.Mitigation("conductor-earthing.surface")
		}
		if math.IsNaN(in.Resistance) {
			msg = fmt.Sprintf("%s not measured, so taken as not earthed (limit %s)", what, ohm(lim.ConductorEarthing))
		} else {
			msg = fmt.Sprintf("%s %s exceeds %s", what, ohm(in.Resistance), ohm(lim.ConductorEarthing))
		}
	case CheckPersonEarthing:
		mie := "an unknown MIE"
		if !math.IsNaN(env.MIE) {
			mie = "MIE " + mJ(env.MIE)
		}
		if math.IsNaN(in.Resistance) {
			msg = fmt.Sprintf("person-to-earth resistance not measured, so taken as not earthed; %s needs at most %s in %s with %s (≤ %s)", "the person", ohm(lim.PersonEarthing), zoneWords(env.Zone), mie, mJ(lim.PersonEarthingMIE))
		} else {
			msg = fmt.Sprintf("person-to-earth resistance %s exceeds %s required in %s with %s (≤ %s)", ohm(in.Resistance), ohm(lim.PersonEarthing), zoneWords(env.Zone), mie, mJ(lim.PersonEarthingMIE))
		}
	case CheckShockEnergy:
		e := ShockEnergy(in, ev)
		src := "stored energy"
		if d := ev.Discharges[model.PropagatingBrush]; d.Possible && d.Energy == e {
			src = "propagating brush discharge energy"
		}
		msg = fmt.Sprintf("%s %s exceeds the %s shock limit for people who touch it", src, mJ(e), mJ(lim.ShockEnergy))
		if src != "stored energy" {
			mit = templates.Mitigation("shock-energy." + mitigationClass(in, model.PropagatingBrush))
		}
		if !math.IsNaN(ev.Potential) && !math.IsNaN(ev.Capacitance) && src == "stored energy" {
			msg += fmt.Sprintf(" (%s at %s)", pF(ev.Capacitance), kV(ev.Potential))
			if ev.Flags&model.FlagAssumedResistance != 0 {
				// Review item 11: the size rests on no leakage being assumed.
				msg += "; this rests on an assumed resistance to earth (not measured, so no leakage assumed)"
				if ev.Flags&model.FlagCappedConductor != 0 {
					msg += fmt.Sprintf(" and the %s cap on an estimated potential", kV(lim.ConductorMaxPotential))
				}
				msg += ": measure the resistance to earth and the potential in operation"
			}
		}
	case CheckFillingVelocity, CheckVelocityCeiling, CheckSlowStart, CheckLowConductivity,
		CheckSplashFilling, CheckSecondPhase, CheckFilterResidence, CheckIsolatedLiquid:
		msg = liquidFindingText(k, in, ev, lim)
	case CheckBagType:
		t := AssessedBagType(in.BagType)
		where := env.Atmosphere.String() + " atmosphere"
		if g := GroupText(r.Atmosphere); g != "" {
			where += " " + g // as the Objects and Stations sheets show it (IIIB / gas IIC est.)
		} else if env.Group != model.GroupNone {
			where += " " + env.Group.String()
		}
		where += " in " + zoneWords(env.Zone)
		if env.Atmosphere == model.Dust || env.Atmosphere == model.Hybrid {
			where += ", product MIE " + mJ(env.MIE)
		}
		if in.BagType == model.BagUnknown {
			msg = fmt.Sprintf("bag type not given, so assessed as type A (the most restrictive case), which is not allowed in a %s", where)
			mit = templates.Mitigation("bag-type.unknown")
		} else {
			msg = fmt.Sprintf("type %s bag is not allowed in a %s (IEC 61340-4-4 usage table)", t, where)
			if why := strings.TrimSuffix(ev.BagCode.Text(math.NaN(), math.NaN()), "."); why != "" && ev.BagCode != model.ReasonNone {
				msg += ": " + lowerFirst(why)
			}
		}
	case CheckBagEarthing:
		if math.IsNaN(in.Resistance) {
			msg = fmt.Sprintf("type C bag: earthing tab to plant earth not measured, so taken as not earthed (limit %s); an unearthed type C bag is worse than type A or B", ohm(lim.BagTabToEarth))
		} else {
			msg = fmt.Sprintf("type C bag: earthing tab to plant earth %s exceeds %s", ohm(in.Resistance), ohm(lim.BagTabToEarth))
		}
	case CheckLayerBreakdown:
		if ev.BreakdownSource == model.BreakdownMeasured {
			msg = fmt.Sprintf("the layer holds %s by its reading, above its breakdown voltage of %s measured on the layer: the reading or the breakdown measurement is wrong; the reading's hazard is kept, the propagating brush included", kV(ev.LayerVoltage), kV(ev.LayerBreakdown))
		} else {
			msg = fmt.Sprintf("the layer holds %s by its reading, above the %s that any film of its thickness holds (thin-film upper strength about 600 kV/mm x thickness): the reading, its unit or the thickness is wrong; the reading's hazard is kept", kV(ev.LayerVoltage), kV(ev.LayerBreakdown))
		}
	case CheckConeAboveRange:
		msg = fmt.Sprintf("the silo diameter (%s) or particle size (%s) lies above the range of Glor's formula (D 0.5-3 m, d 0.1-3 mm): the formula is not valid there; the cone energy %s is the value at the edge of the range, a lower bound", sig(in.Diameter)+" m", sig(in.ParticleSize*1e3)+" mm", mJ(ev.Discharges[model.Cone].Energy))
	case CheckConeExtrapolated:
		msg = fmt.Sprintf("beyond its range Glor's formula, not valid there, gives %s, at or above the MIE of %s (the edge value %s is a lower bound): the cone discharge is taken as able to ignite", mJ(ev.ConeExtrapolated), mJ(env.MIE), mJ(ev.Discharges[model.Cone].Energy))
	case CheckReadingVsHumidity:
		msg = fmt.Sprintf("the reading gives %s, above the screen, although at %s the humidity model finds the surface dissipative (%s per square) and earthed: the reading is kept; check the material's surface resistivity and humidity slope, its earthing, and repeat the reading", uCm2(brushDensity(ev)), percent(env.RelativeHumidity), ohm(ev.SurfaceResistivity))
	case CheckBagQualification:
		i := BagChargingCurrent(in, ev)
		switch {
		case env.MIE < lim.BagMinMIE:
			msg = fmt.Sprintf("MIE %s is below the %s the type %s qualification assumes", mJ(env.MIE), mJ(lim.BagMinMIE), in.BagType)
		default:
			msg = fmt.Sprintf("charging current %s exceeds the %s the type %s qualification assumes", uA(i), uA(lim.BagMaxCurrent), in.BagType)
		}
	}
	if k == CheckReadingVsEarthing {
		worst := "the worst-case industrial charging current"
		if in.Kind == model.Person {
			worst = "a walking person's charging current"
		}
		msg = fmt.Sprintf("measured potential %s is far above the %s its measured resistance to earth (%s) allows under %s (I R): the earthing path does not work as measured (an insulating glove, a dirty sole, a broken bond) or the reading is wrong; the reading is kept (W = %s)", kV(ev.Potential), volts(ev.EarthingBound), ohm(in.Resistance), worst, mJ(ev.StoredEnergy))
	}
	if k == CheckReadingAboveBreakdown {
		what := "the reading"
		if !math.IsNaN(in.Field) {
			what = fmt.Sprintf("the field reading of %s at %s", sig(math.Abs(in.Field)/1e3)+" kV/m", sig(in.FieldDistance)+" m")
		} else if !math.IsNaN(in.SurfacePotential) {
			what = "the surface potential reading of " + kV(math.Abs(in.SurfacePotential))
		}
		msg = fmt.Sprintf("%s inverts to %s, more than air lets the surface hold (air breaks down at %s): a bad reading or unit, not a bigger hazard; check the meter's distance, unit and range and repeat it; the charge density used is capped at the breakdown limit, %s", what, uCm2(ev.ReadingDensity), sig(lim.AirBreakdown/1e3)+" kV/m", uCm2(ev.ChargeDensity))
	}
	if k == CheckMeasuredAboveMaximum {
		what := "plant conductor"
		if in.Kind == model.Person {
			what = "body"
		}
		msg = fmt.Sprintf("measured potential %s is above the realistic maximum of %s a %s holds before it goes into corona: a contradiction between reading and model, the reading to be checked (meter, range, unit); the spark is kept but its energy taken at the maximum (W = %s), so the verdict and ranking do not rest on an artefact (plant conductors go into corona from edges and bolts at tens of kV: common practice, no source)", kV(ev.UncappedPotential), kV(ev.Potential), what, mJ(ev.StoredEnergy))
	}
	if k == CheckEnergyMIE || k == CheckEnergyMargin {
		cls := mitigationClass(in, c.Discharge)
		mit = templates.Mitigation("energy." + cls)
		if cls == "powder" && env.Atmosphere.IgnitedByBrush() {
			// Powder into flammable gas or vapour: its own treatment (IEC TS
			// 60079-32-1; reference section 12), not the silo text.
			mit = templates.Mitigation("energy.powder.vapour")
		}
		if cls == "conductor" && AssumedResistanceDominates(ev, c.Discharge) {
			mit = templates.Mitigation("energy.conductor.assumed-resistance")
		}
		if cls == "insulator" {
			mit += humiditySentence(in)
		}
	}
	return msg, mit
}

// reason writes the one sentence that says why the object got its verdict.
func (x *objectContext) reason(r *ObjectResult, c *Classification, causeText string) string {
	switch r.Verdict {
	case NotAssessed:
		return "Not assessed: " + causeText + "."
	case Incendive, Marginal:
		var first *Finding
		for i := range r.Findings {
			if r.Findings[i].Severity == r.Verdict {
				first = &r.Findings[i]
				break
			}
		}
		s := capitalise(r.Verdict.String()) + ": " + first.Message
		if r.Atmosphere == nil {
			s = capitalise(r.Verdict.String()) + " with no flammable atmosphere at the station: " + first.Message
		}
		if n := len(r.Findings) - 1; n == 1 {
			s += "; 1 further finding"
		} else if n > 1 {
			s += fmt.Sprintf("; %d further findings", n)
		}
		switch {
		case c.Cause != CauseNone && causeText != "" && !math.IsNaN(c.Ratio):
			// The energy judged is a lower bound: the discharges evaluated already reach it.
			s += "; that energy is a lower bound, not every discharge could be evaluated (" + causeText + ")"
		case c.Cause != CauseNone && causeText != "":
			s += "; the discharge energy was not assessed (" + causeText + ")"
		}
		return s + "."
	}
	if r.Atmosphere == nil {
		s := "Non-incendive: no flammable atmosphere at the station, so it is judged on shock alone"
		if e := ShockEnergy(&r.Input, &r.Eval); e > 0 {
			s += fmt.Sprintf(", and its stored energy of %s stays below the %s shock limit", mJ(e), mJ(x.lim.ShockEnergy))
		}
		return s + "."
	}
	mie := r.Environment.MIE
	fill := ""
	if in := &r.Input; in.Kind == model.Liquid && r.Eval.Discharges[model.Brush].Code == model.ReasonBrushLiquidCompliant {
		fill = "the fill meets every applicable filling clause of IEC TS 60079-32-1 for " + withArticle(vesselWords(in)) + ", so the liquid surface gives no incendive brush; "
	}
	if !(c.Energy > 0) {
		return fmt.Sprintf("Non-incendive: %sno discharge is possible, and every requirement is met (MIE %s).", fill, mJ(mie))
	}
	return fmt.Sprintf("Non-incendive: %sthe largest possible discharge, a %s of %s, stays below MIE / %s = %s (ratio %s), and every requirement is met.",
		fill, dischargeWords(c.Discharge), mJ(c.Energy), plain(x.margin), mJ(mie/x.margin), ratioText(c.Ratio))
}

func lowerFirst(s string) string {
	if s == "" || s[0] < 'A' || s[0] > 'Z' {
		return s
	}
	return string(s[0]-'A'+'a') + s[1:]
}

func capitalise(s string) string {
	if s == "" || s[0] < 'a' || s[0] > 'z' {
		return s
	}
	return string(s[0]-'a'+'A') + s[1:]
}

// vesselWords names a liquid row's receiving vessel: "metal road tanker",
// "insulating IBC", "vessel of unknown class".
func vesselWords(in *model.Input) string {
	var w []string
	if in.VesselMaterial != model.VesselMaterialUnknown {
		w = append(w, in.VesselMaterial.String())
	}
	if in.VesselClass != model.VesselUnknown {
		w = append(w, in.VesselClass.String())
	} else {
		w = append(w, "vessel of unknown class (the strictest class taken)")
	}
	return strings.Join(w, " ")
}

// clauseCite returns the reference of the clause a liquid check judges, for the
// vessel class of the row, with its source mark: "IEC TS 60079-32-1:2013+A1:2017,
// clause 7 (liquids), road tankers (0.38 / 0.5 m²/s)".
func clauseCite(k Check, in *model.Input) string {
	cl, ok := LiquidClauseOf(k)
	if !ok {
		return ""
	}
	r, ok := cl.Rule(in.VesselClass)
	if !ok {
		return ""
	}
	s := r.Ref
	if r.FromMemory {
		s += " [from memory: confirm]"
	}
	return s
}

// liquidFindingText returns the message of a failed liquid filling check: what
// was found against which limit, ending with the clause it rests on.
func liquidFindingText(k Check, in *model.Input, ev *model.Evaluation, lim *model.Limits) string {
	var msg string
	// A conductivity not on the row (blank, or only a list's typical value) is
	// never quoted as if entered: it is unknown, taken as low for the filling
	// clauses and as conductive for the isolated liquid (principle 2).
	cond, condConductive := "conductivity not given, taken as low", "conductivity not given, taken as conductive"
	if in.ConductivityAssumed && in.Conductivity > lim.LowConductivity {
		cond = "conductivity not given, typical " + pSm(in.Conductivity)
	}
	if !math.IsNaN(in.Conductivity) && !in.ConductivityAssumed {
		cond = "conductivity " + pSm(in.Conductivity)
		condConductive = cond
	}
	speed := "not given"
	if !math.IsNaN(in.Speed) {
		speed = mps(in.Speed)
	}
	switch k {
	case CheckFillingVelocity:
		vd := ev.VelocityDiameter
		if math.IsNaN(vd) {
			msg = fmt.Sprintf("v·d not known (flow velocity %s, line diameter %s), so the %s limit for %s is not shown met", speed, optMM(in.Diameter), m2ps(ev.VDLimit), withArticle(vesselWords(in)))
		} else {
			rel := "≤"
			if in.Conductivity > lim.VDKappa {
				rel = ">"
			}
			msg = fmt.Sprintf("v·d of %s (%s in %s mm) exceeds the %s limit for %s with %s (%s %s)", m2ps(vd), mps(in.Speed), plain(in.Diameter*1e3), m2ps(ev.VDLimit), withArticle(vesselWords(in)), cond, rel, pSm(lim.VDKappa))
			if ev.VelocityLimit > 0 {
				msg += fmt.Sprintf("; at most %s in this line", mps(ev.VelocityLimit))
			}
		}
	case CheckVelocityCeiling:
		c := model.FillingCeiling(in.VesselClass, lim)
		if math.IsNaN(in.Speed) {
			msg = fmt.Sprintf("flow velocity not given, so the %s ceiling for %s is not shown met", mps(c), withArticle(vesselWords(in)))
		} else {
			msg = fmt.Sprintf("flow velocity %s exceeds the %s ceiling for %s", mps(in.Speed), mps(c), withArticle(vesselWords(in)))
		}
	case CheckSlowStart:
		how := "bottom filling"
		if in.Filling == model.FillDipPipe {
			how = "filling through a dip pipe"
		}
		if math.IsNaN(ev.InletVelocity) {
			msg = fmt.Sprintf("%s of a low-conductivity liquid: inlet velocity until the inlet is submerged not given, so the %s slow start is not shown met", how, mps(lim.SlowStartVelocity))
		} else {
			msg = fmt.Sprintf("%s of a low-conductivity liquid: inlet velocity %s until the inlet is submerged exceeds the %s slow start", how, mps(ev.InletVelocity), mps(lim.SlowStartVelocity))
		}
	case CheckSplashFilling:
		how := "top (splash) filling"
		if in.Filling == model.FillUnknown {
			how = "filling mode not given, so taken as top (splash) filling"
		}
		msg = fmt.Sprintf("%s of a liquid with %s: the free-falling jet splashes, makes mist and charges the surface, and the inlet is never submerged", how, cond)
	case CheckSecondPhase:
		what := fmt.Sprintf("a second phase (%s) is carried", in.SecondPhase)
		if in.SecondPhase == model.PhaseUnknown {
			what = "no second phase is stated, so one is taken as carried (write none when there is none)"
		}
		msg = fmt.Sprintf("%s, which makes a liquid below %s chargeable: flow velocity %s, limit %s", what, pSm(lim.SecondPhaseConductivity), speed, mps(lim.SecondPhaseVelocity))
	case CheckFilterResidence:
		res := "not given (taken as none)"
		if !math.IsNaN(in.FilterResidence) {
			res = seconds(in.FilterResidence)
		}
		need := fmt.Sprintf("%s, the fixed time (relaxation time unknown)", seconds(ev.FilterResidence))
		if ev.RelaxationTime > 0 {
			need = fmt.Sprintf("%s, the smaller of %s τ = %s and %s", seconds(ev.FilterResidence), plain(lim.FilterResidenceFactor), seconds(lim.FilterResidenceFactor*ev.RelaxationTime), seconds(lim.FilterResidenceMax))
		}
		filter := "the fine filter"
		if in.Filter == model.FilterUnknown {
			filter = "the filter (none stated, so a fine filter is taken: write none for a plain line)"
		}
		msg = fmt.Sprintf("residence time after %s %s is shorter than the %s needed for the charge the filter adds to relax", filter, res, need)
	case CheckLowConductivity:
		where := withArticle(vesselWords(in))
		if in.VesselMaterial == model.VesselMaterialUnknown {
			where = "a vessel of unknown material (taken as insulating)"
		}
		msg = fmt.Sprintf("a low-conductivity liquid (%s) filled into %s: the standard gives no safe filling limits for this, so brush discharges from the liquid surface are counted", cond, where)
	case CheckIsolatedLiquid:
		what := withArticle(vesselWords(in))
		if in.VesselMaterial == model.VesselMaterialUnknown {
			what = "a vessel of unknown material (taken as insulating)"
		}
		if math.IsNaN(in.Resistance) {
			msg = fmt.Sprintf("a conductive liquid (%s) in %s is an isolated conductor: its resistance to earth through an earthed dip pipe or rod is not measured (limit %s)", condConductive, what, ohm(lim.ConductorEarthing))
		} else {
			msg = fmt.Sprintf("a conductive liquid (%s) in %s is an isolated conductor: its resistance to earth %s exceeds %s", condConductive, what, ohm(in.Resistance), ohm(lim.ConductorEarthing))
		}
	}
	if c := clauseCite(k, in); c != "" {
		msg += " (" + c + ")"
	}
	return msg
}

// withArticle puts "a" or "an" before a noun phrase.
func withArticle(s string) string {
	if s != "" && strings.ContainsRune("aeiouAEIOU", rune(s[0])) {
		return "an " + s
	}
	return "a " + s
}

// optMM formats a length in mm, or "not given".
func optMM(v float64) string {
	if math.IsNaN(v) {
		return "not given"
	}
	return plain(v*1e3) + " mm"
}
