package model

import "math"

// SphereCapacitance returns the capacitance of an isolated sphere of radius r far
// from earth: C = 4 pi eps0 r, 111.3 pF per metre (textbook).
func SphereCapacitance(r float64) float64 { return 4 * math.Pi * Eps0 * r }

// CylinderOverPlaneCapacitance returns the capacitance of a cylinder of length L
// and radius r with its axis at height h > r over an earthed plane:
// C = 2 pi eps0 L / arcosh(h / r) (textbook; neglects end effects, L >> h).
func CylinderOverPlaneCapacitance(length, r, h float64) float64 {
	return 2 * math.Pi * Eps0 * length / math.Acosh(h/r)
}

// CoaxialCapacitance returns the capacitance of coaxial cylinders of radii a < b
// and length L with a dielectric epsr between: C = 2 pi eps0 epsr L / ln(b / a) (textbook).
func CoaxialCapacitance(length, a, b, epsr float64) float64 {
	return 2 * math.Pi * Eps0 * epsr * length / math.Log(b/a)
}

// ParallelPlateCapacitance returns C = eps0 epsr A / d, e.g. a container of base
// area A standing on an insulating layer of thickness d (textbook; fringing neglected,
// valid for d small against the plate size).
func ParallelPlateCapacitance(area, d, epsr float64) float64 { return Eps0 * epsr * area / d }

// Typical capacitances used only when nothing better is known.
const (
	// PersonCapacitance is the typical human body, 200 pF (range 100-300 pF, Saito 1963; default from memory).
	PersonCapacitance = 200e-12
	// SmallPartCapacitance is a small metal part (scoop, nozzle, flange, pulley): the
	// upper end of 10-20 pF (from memory).
	SmallPartCapacitance = 20e-12
	// DrumCapacitance is a 200 L steel drum on a pallet, about 100 pF (design value;
	// 70 pF measured on a dry wooden pallet, BG RCI FAQ 7.15).
	DrumCapacitance = 100e-12
	// BagCapacitance is a flexible bulk container treated as a 250-500 L container,
	// the upper end of 50-300 pF (from memory).
	BagCapacitance = 300e-12
)

// TypicalCapacitance returns the documented typical capacitance of a kind: person
// 200 pF, part and roller 20 pF, container and receiving vessels of powders and
// liquids 100 pF, bag 300 pF; NaN for kinds without one.
func TypicalCapacitance(k Kind) float64 {
	switch k {
	case Person:
		return PersonCapacitance
	case Part, Roller:
		return SmallPartCapacitance
	case Container, Powder, Liquid:
		return DrumCapacitance
	case Bag:
		return BagCapacitance
	}
	return math.NaN()
}

// Capacitance models, as recorded in Evaluation.CapacitanceModel.
const (
	CapNone           CapModel = iota // no capacitance (insulating surfaces)
	CapMeasured                       // given on the survey row
	CapSphere                         // isolated sphere of the object's size
	CapCylinderPlane                  // cylinder over an earthed plane
	CapParallelPlate                  // container standing on an insulating layer
	CapTypical                        // documented typical value for the kind
	CapDisc                           // isolated disc of the same area (conducting sheet)
	CapSheetOverEarth                 // plate over earth eps0 A / h (conducting sheet near a floor)
	CapSizeTable                      // vessel size table (VesselSizeCapacitance)
)

// String names the capacitance model.
func (m CapModel) String() string {
	switch m {
	case CapMeasured:
		return "measured"
	case CapSphere:
		return "isolated sphere of the same size (4 pi eps0 r)"
	case CapCylinderPlane:
		return "cylinder over an earthed plane (2 pi eps0 L / arcosh(h/r))"
	case CapParallelPlate:
		return "parallel plate on the insulating layer (eps0 epsr A / d)"
	case CapTypical:
		return "typical value for the kind"
	case CapDisc:
		return "isolated disc of the same area (8 eps0 r)"
	case CapSheetOverEarth:
		return "plate over earth (eps0 A / h)"
	case CapSizeTable:
		return "vessel size table (drum 100 pF, container up to 500 L 300 pF, larger vessel, IBC or tanker 1000 pF)"
	}
	return "none"
}

// VesselSize is one row of the vessel size table.
type VesselSize struct {
	Name        string
	MaxVolume   float64 // m^3, upper end of the class (Inf for the last)
	MaxDiameter float64 // m, upper end when only the diameter is known
	Capacitance float64 // F, the upper end of the class's published range
}

// VesselSizes returns the size table a conductive vessel's capacitance is
// estimated from when not measured, the upper end of each published range
// (reference sections 2 and 12, from memory): bucket, can and drum up to 200 L,
// 10-100 pF (a 200 L drum on a dry pallet measured 70 pF, BG RCI FAQ 7.15);
// containers of 250-500 L, 50-300 pF; reaction vessels (100-1000 pF), IBCs and
// road tankers (about 1000 pF): 1000 pF. The class edges by diameter (a 200 L drum
// is about 0.6 m across) are a screening choice of this tool.
func VesselSizes() []VesselSize {
	return []VesselSize{
		{"drum, can or bucket (up to 200 L)", 0.25, 0.65, 100e-12},
		{"container of 250-500 L", 0.5, 0.9, 300e-12},
		{"vessel, IBC or tanker (above 500 L)", math.Inf(1), math.Inf(1), 1000e-12},
	}
}

// VesselSizeCapacitance returns the estimated capacitance of a floor-standing
// conductive vessel of diameter d and height (Length) l from the size table
// VesselSizes: by volume pi d^2 l / 4 when both are known, by diameter when only
// it is; an unknown size takes the largest class (the stricter case). The
// isolated sphere of the vessel's size is taken when larger (very large tanks),
// as a lower bound. It returns the value and the class used.
func VesselSizeCapacitance(d, l float64) (float64, VesselSize) {
	classes := VesselSizes()
	cls := classes[len(classes)-1]
	switch {
	case positive(d) && positive(l):
		vol := math.Pi * d * d / 4 * l
		for _, c := range classes {
			if vol <= c.MaxVolume {
				cls = c
				break
			}
		}
	case positive(d):
		for _, c := range classes {
			if d <= c.MaxDiameter {
				cls = c
				break
			}
		}
	}
	c := cls.Capacitance
	if positive(d) {
		size := d
		if positive(l) && l > size {
			size = l
		}
		c = math.Max(c, SphereCapacitance(size/2))
	}
	return c, cls
}
