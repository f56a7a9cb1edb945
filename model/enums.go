package model

import (
	"fmt"
	"strings"
)

// String returns the contract spelling of the kind: sheet, belt, roller, container,
// part, person, powder, liquid, bag ("unknown" for KindUnknown).
func (k Kind) String() string {
	switch k {
	case Sheet:
		return "sheet"
	case Belt:
		return "belt"
	case Roller:
		return "roller"
	case Container:
		return "container"
	case Part:
		return "part"
	case Person:
		return "person"
	case Powder:
		return "powder"
	case Liquid:
		return "liquid"
	case Bag:
		return "bag"
	}
	return "unknown"
}

// ParseKind reads a survey Kind cell (case-insensitive, surrounding space ignored).
func ParseKind(s string) (Kind, error) {
	for k := Sheet; k <= Bag; k++ {
		if strings.EqualFold(strings.TrimSpace(s), k.String()) {
			return k, nil
		}
	}
	return KindUnknown, fmt.Errorf("model: unknown kind %q (want sheet, belt, roller, container, part, person, powder, liquid or bag)", s)
}

// String returns the group's spelling: IIA, IIB, IIC, IIIA, IIIB, IIIC ("none" for GroupNone).
func (g Group) String() string {
	switch g {
	case IIA:
		return "IIA"
	case IIB:
		return "IIB"
	case IIC:
		return "IIC"
	case IIIA:
		return "IIIA"
	case IIIB:
		return "IIIB"
	case IIIC:
		return "IIIC"
	}
	return "none"
}

// Dust reports whether the group is a dust group (IIIA, IIIB, IIIC).
func (g Group) Dust() bool { return g == IIIA || g == IIIB || g == IIIC }

// ParseGroup reads a gas or dust group; blank or "none" give GroupNone.
func ParseGroup(s string) (Group, error) {
	t := strings.TrimSpace(s)
	if t == "" || strings.EqualFold(t, "none") {
		return GroupNone, nil
	}
	for g := IIA; g <= IIIC; g++ {
		if strings.EqualFold(t, g.String()) {
			return g, nil
		}
	}
	return GroupNone, fmt.Errorf("model: unknown group %q (want IIA, IIB, IIC, IIIA, IIIB, IIIC or none)", s)
}

// String returns the zone's spelling: "0", "1", "2", "20", "21", "22" or "none".
func (z Zone) String() string {
	switch z {
	case Zone0:
		return "0"
	case Zone1:
		return "1"
	case Zone2:
		return "2"
	case Zone20:
		return "20"
	case Zone21:
		return "21"
	case Zone22:
		return "22"
	}
	return "none"
}

// ParseZone reads a zone: 0, 1, 2, 20, 21, 22 (an optional "zone " prefix is
// accepted); blank or "none" give ZoneNone.
func ParseZone(s string) (Zone, error) {
	t := strings.TrimSpace(s)
	if len(t) > 5 && strings.EqualFold(t[:5], "zone ") {
		t = strings.TrimSpace(t[5:])
	}
	if t == "" || strings.EqualFold(t, "none") {
		return ZoneNone, nil
	}
	for z := Zone0; z <= Zone22; z++ {
		if t == z.String() {
			return z, nil
		}
	}
	return ZoneNone, fmt.Errorf("model: unknown zone %q (want 0, 1, 2, 20, 21, 22 or none)", s)
}

// Gas reports whether the zone is a gas, vapour or mist zone (0, 1, 2).
func (z Zone) Gas() bool { return z == Zone0 || z == Zone1 || z == Zone2 }

// Dust reports whether the zone is a dust zone (20, 21, 22).
func (z Zone) Dust() bool { return z == Zone20 || z == Zone21 || z == Zone22 }

// String returns the atmosphere kind's spelling: gas, vapour, mist, dust, hybrid or none.
func (a AtmosphereKind) String() string {
	switch a {
	case Gas:
		return "gas"
	case Vapour:
		return "vapour"
	case Mist:
		return "mist"
	case Dust:
		return "dust"
	case Hybrid:
		return "hybrid"
	}
	return "none"
}

// ParseAtmosphereKind reads an atmosphere kind; "vapor" is accepted for vapour and
// blank or "none" give NoAtmosphere.
func ParseAtmosphereKind(s string) (AtmosphereKind, error) {
	t := strings.TrimSpace(s)
	if t == "" || strings.EqualFold(t, "none") {
		return NoAtmosphere, nil
	}
	if strings.EqualFold(t, "vapor") {
		return Vapour, nil
	}
	for a := Gas; a <= Hybrid; a++ {
		if strings.EqualFold(t, a.String()) {
			return a, nil
		}
	}
	return NoAtmosphere, fmt.Errorf("model: unknown atmosphere kind %q (want gas, vapour, mist, dust, hybrid or none)", s)
}

// IgnitedByBrush reports whether a brush discharge can ignite this kind of
// atmosphere: gases, vapours, mists and hybrid mixtures, never a pure dust cloud
// (CCPS glossary; CLC/TR 50404 summaries).
func (a AtmosphereKind) IgnitedByBrush() bool {
	return a == Gas || a == Vapour || a == Mist || a == Hybrid
}

// String returns the bag type's spelling: A, B, C, D or "unknown".
func (t BagType) String() string {
	switch t {
	case BagA:
		return "A"
	case BagB:
		return "B"
	case BagC:
		return "C"
	case BagD:
		return "D"
	}
	return "unknown"
}

// ParseBagType reads a bag type A-D (an optional "type " prefix is accepted);
// blank or "unknown" give BagUnknown.
func ParseBagType(s string) (BagType, error) {
	t := strings.TrimSpace(s)
	if len(t) > 5 && strings.EqualFold(t[:5], "type ") {
		t = strings.TrimSpace(t[5:])
	}
	if t == "" || strings.EqualFold(t, "unknown") {
		return BagUnknown, nil
	}
	for b := BagA; b <= BagD; b++ {
		if strings.EqualFold(t, b.String()) {
			return b, nil
		}
	}
	return BagUnknown, fmt.Errorf("model: unknown bag type %q (want A, B, C, D or blank)", s)
}

// String returns the filling's spelling: top, bottom, "dip pipe" or "unknown".
func (f Filling) String() string {
	switch f {
	case FillTop:
		return "top"
	case FillBottom:
		return "bottom"
	case FillDipPipe:
		return "dip pipe"
	}
	return "unknown"
}

// ParseFilling reads a filling mode: top, bottom or dip pipe ("dip-pipe" and
// "dippipe" accepted); blank or "unknown" give FillUnknown.
func ParseFilling(s string) (Filling, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	switch t {
	case "", "unknown":
		return FillUnknown, nil
	case "top":
		return FillTop, nil
	case "bottom":
		return FillBottom, nil
	case "dip pipe", "dip-pipe", "dippipe", "dip_pipe":
		return FillDipPipe, nil
	}
	return FillUnknown, fmt.Errorf("model: unknown filling %q (want top, bottom or dip pipe)", s)
}
