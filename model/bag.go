package model

// BagTypeAllowed applies the usage table of IEC 61340-4-4:2018 (as quoted by trade
// summaries) to a bag type in an environment, for a product of minimum ignition
// energy productMIE (J; NaN: unknown, taken as the most sensitive band).
//
// Surroundings: non-flammable (no atmosphere or no zone), dust zones 21 and 22, or
// gas, vapour, mist or hybrid in zones 1 and 2 of groups IIA and IIB. Gas or
// vapour present in a dust zone (a hybrid atmosphere) takes the gas column. Never in IIC,
// zone 0 or zone 20. Product bands: at or below lim.BagDustLow (3 mJ), up to
// lim.BagDustHigh (1000 mJ), above. Types C and D are qualified only for MIE >=
// lim.BagMinMIE (0.14 mJ). BagUnknown is assessed as type A, the bag with no
// electrostatic protection: allowed only where type A would be. A type C bag is
// allowed only when earthed: the caller checks the earthing (Evaluate does).
func BagTypeAllowed(t BagType, env Environment, productMIE float64, lim Limits) (ok bool, code Reason) {
	if env.Group == IIC {
		return false, ReasonBagNeverIIC
	}
	if env.Zone == Zone0 || env.Zone == Zone20 {
		return false, ReasonBagNeverZone0or20
	}
	eff := t
	if t == BagUnknown {
		eff = BagA
	}
	// Gas or vapour present (a hybrid atmosphere included), in any zone, takes the
	// gas column: types A and B are not allowed (reference section 12).
	gas := env.Zone.Gas() || env.Atmosphere.IgnitedByBrush()
	dust := !gas && (env.Zone.Dust() || env.Atmosphere == Dust)
	if env.Atmosphere == NoAtmosphere && env.Zone == ZoneNone {
		gas, dust = false, false
	}
	// An atmosphere named without a zone is screened as the zone it implies (1 or 21).
	if gas || dust {
		if (eff == BagC || eff == BagD) && productMIE < lim.BagMinMIE {
			return false, ReasonBagBelowQualifiedMIE
		}
	}
	switch {
	case gas:
		if eff == BagC || eff == BagD {
			return true, bagOKCode(t)
		}
		if t == BagUnknown {
			return false, ReasonBagUnknownNotAllowed
		}
		return false, ReasonBagNotForGas
	case dust:
		if eff == BagA {
			return false, notAllowedCode(t)
		}
		if eff == BagB && !(productMIE > lim.BagDustLow) {
			return false, notAllowedCode(t)
		}
		return true, bagOKCode(t)
	}
	// Non-flammable surroundings: the product's own dust cloud decides.
	if (eff == BagC || eff == BagD) && productMIE < lim.BagMinMIE {
		return false, ReasonBagBelowQualifiedMIE
	}
	switch eff {
	case BagA:
		if productMIE > lim.BagDustHigh {
			return true, bagOKCode(t)
		}
		return false, notAllowedCode(t)
	case BagB:
		if productMIE > lim.BagDustLow {
			return true, bagOKCode(t)
		}
		return false, notAllowedCode(t)
	}
	return true, bagOKCode(t)
}

func bagOKCode(t BagType) Reason {
	switch t {
	case BagUnknown:
		return ReasonBagUnknownAllowed
	case BagC:
		return ReasonBagCAllowedIfEarthed
	}
	return ReasonBagAllowed
}

func notAllowedCode(t BagType) Reason {
	if t == BagUnknown {
		return ReasonBagUnknownNotAllowed
	}
	return ReasonBagNotForBand
}
