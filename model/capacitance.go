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
	}
	return "none"
}
