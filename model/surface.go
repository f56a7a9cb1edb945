package model

import (
	"fmt"
	"math"
	"strings"
)

// This file holds the insulating-surface rules added after the hand-worked
// checks of reference section 12: the process a surface belongs to, the
// cylinder and finite-sheet geometries, the validity of the over-earth split,
// and the capacitance of a conducting sheet that is not earthed.

// Process says what a surface row is in the plant, as the survey's Process
// column gives it. It decides two things: whether the row is process material
// (judged by its charge, IEC TS 60079-32-1) or a fixed equipment surface (held to
// the insulating-area limits of IEC 60079-0), and whether the charging process
// can build a propagating brush without a measured density (pneumatic conveying).
type Process uint8

// Processes; ProcessUnknown is judged from the kind and the speed (IsProcessMaterial).
const (
	ProcessUnknown   Process = iota
	ProcessWeb               // a moving web, film or sheet being processed
	ProcessBelt              // a conveyor or drive belt
	ProcessPneumatic         // product conveyed pneumatically through or over this insulating pipe, hose or liner
	ProcessEquipment         // a fixed equipment surface (housing, cover, guard, roller cover)
)

// String returns the survey spelling: "moving web", "belt", "pneumatic conveying",
// "fixed equipment" or "unknown".
func (p Process) String() string {
	switch p {
	case ProcessWeb:
		return "moving web"
	case ProcessBelt:
		return "belt"
	case ProcessPneumatic:
		return "pneumatic conveying"
	case ProcessEquipment:
		return "fixed equipment"
	}
	return "unknown"
}

// ParseProcess reads a Process cell (case-insensitive; "web", "film" and
// "equipment" accepted); blank or "unknown" give ProcessUnknown.
func ParseProcess(s string) (Process, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	switch t {
	case "", "unknown":
		return ProcessUnknown, nil
	case "moving web", "web", "film", "moving film":
		return ProcessWeb, nil
	case "belt", "conveyor belt", "drive belt":
		return ProcessBelt, nil
	case "pneumatic conveying", "pneumatic", "pneumatic transfer":
		return ProcessPneumatic, nil
	case "fixed equipment", "equipment":
		return ProcessEquipment, nil
	}
	return ProcessUnknown, fmt.Errorf("model: unknown process %q (want moving web, belt, pneumatic conveying or fixed equipment)", s)
}

// IsProcessMaterial reports whether an insulating-surface row is process
// material (a moving web, film or belt), which IEC TS 60079-32-1 judges by its
// charge and discharges rather than by the insulating-area limits that IEC
// 60079-0 sets for the construction of equipment. An explicit Process wins; a
// blank one counts as process material only when clearly so: a belt, or a sheet
// with a Speed above zero (a moving web). Anything else (a still sheet, a roller
// cover, pneumatic conveying through a pipe, which is equipment) is a fixed
// equipment surface: the stricter reading, with the area limit.
func IsProcessMaterial(in Input) bool {
	switch in.Process {
	case ProcessWeb, ProcessBelt:
		return true
	case ProcessEquipment, ProcessPneumatic:
		return false
	}
	return in.Kind == Belt || (in.Kind == Sheet && positive(in.Speed))
}

// PropagatingCurrentDensity is the charging current density (A/m^2) above which a
// propagating brush discharge becomes possible on an insulating layer, whatever a
// field meter reads: about 1 mA/m^2 (BG RCI FAQ 1.12, confirmed, reference section 3).
const PropagatingCurrentDensity = 1e-3

// ThinFilmStrength is the upper dielectric strength of thin insulating films and
// liners (0.02-0.2 mm): about 600 kV/mm (PET with self-healing electrodes; films
// hold 100-600 kV/mm). Source: reference section 12 [C, secondary]. Times the
// thickness it bounds what a layer can hold, so that only a reading above it, or
// above a measured breakdown, is a contradiction; a mm-thick plaque's bulk
// strength (PET ~60 kV/mm) does not apply to films and is never used.
const ThinFilmStrength = 600e6

// OverEarthValidity is the largest ratio of (h + z), the gaps to earth and to the
// meter, to the sheet's smaller side for which the parallel-plate split
// sigma = eps0 E (1 + z/h) is used: a fifth (a screening choice of this tool; the
// split needs both gaps small against the sheet, reference section 12).
const OverEarthValidity = 0.2

// OverEarthValid reports whether the parallel-plate split over earth may be used
// for a sheet of sides l and w (NaN or 0: unknown, taken as infinite) with the
// earth at h and the meter at z: h + z <= OverEarthValidity x min(l, w).
func OverEarthValid(h, z, l, w float64) bool {
	side := math.Inf(1)
	if positive(l) {
		side = l
	}
	if positive(w) && w < side {
		side = w
	}
	return h+z <= OverEarthValidity*side
}

// DensityCylinder returns the charge density of a uniformly charged insulating
// cylinder (roller, pipe) of radius R from a reading E at distance z from its
// surface: E(z) = sigma R / (eps0 (R + z)), so sigma = eps0 E (R + z) / R (Gauss's
// law, textbook; reference section 12). Valid for a cylinder long against R + z.
func DensityCylinder(e, r, z float64) float64 { return Eps0 * e * (r + z) / r }

// DensityFromPotentialCylinder returns the charge density of a cylinder of radius
// R at potential V with its axis at height h > R over an earthed plane:
// lambda = 2 pi eps0 V / arcosh(h/R), sigma = lambda / (2 pi R) =
// eps0 V / (R arcosh(h/R)) (textbook capacitance of a cylinder over a plane).
func DensityFromPotentialCylinder(v, r, h float64) float64 {
	return Eps0 * v / (r * math.Acosh(h/r))
}

// DiscCapacitance returns the capacitance of an isolated thin conducting disc of
// radius r far from earth: C = 8 eps0 r (textbook). A conducting sheet is taken as
// the disc of equal area.
func DiscCapacitance(r float64) float64 { return 8 * Eps0 * r }

// DensityFromPotentialFree returns the charge density of a conducting or
// uniformly charged plate of area A at potential V far from earth, as the disc of
// equal area: sigma = C V / A = 8 eps0 V / (pi r), r = sqrt(A/pi) (derived from
// DiscCapacitance).
func DensityFromPotentialFree(v, area float64) float64 {
	r := math.Sqrt(area / math.Pi)
	return DiscCapacitance(r) * v / area
}

// BackedLayerFields returns, for a layer of thickness t on an earthed backing read
// by an earthed field meter at distance z with field E, the field in the air gap
// (the reading itself in the parallel-plate split) and the field inside the layer,
// E z / t (the surface potential E z across the layer) (Gauss's law, textbook).
func BackedLayerFields(e, z, t float64) (air, layer float64) { return e, e * z / t }
