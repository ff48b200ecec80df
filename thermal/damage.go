package thermal

import (
	"fmt"

	"thzdrive/units"
)

// MaterialClass selects a femtosecond optical damage rule of thumb.
type MaterialClass int

const (
	// ClassUnspecified uses the lowest rule-of-thumb threshold, the metals'.
	ClassUnspecified MaterialClass = iota
	// Dielectric: wide-gap insulators and oxides.
	Dielectric
	// MetalOrSemiconductor: metals, semimetals and semiconductors.
	MetalOrSemiconductor
)

// Single-shot femtosecond optical damage thresholds, rules of thumb at the
// low end of the ranges physics.md §8 quotes from secondary sources (and from
// memory): dielectrics about 1–3 J/cm^2, metals and semiconductors about
// 0.1–0.3 J/cm^2. Many shots lower them further (incubation), so a pulse
// train below these numbers is not thereby safe. Values in J/m^2.
const (
	DielectricDamageJPerM2           = 1.0 * units.JPerCm2
	MetalOrSemiconductorDamageJPerM2 = 0.1 * units.JPerCm2
)

// DamageThresholdJPerM2 returns the rule-of-thumb threshold (J/m^2) for a
// material class.
func DamageThresholdJPerM2(class MaterialClass) (float64, error) {
	switch class {
	case Dielectric:
		return DielectricDamageJPerM2, nil
	case MetalOrSemiconductor, ClassUnspecified:
		return MetalOrSemiconductorDamageJPerM2, nil
	}
	return 0, fmt.Errorf("thermal: unknown material class %d", int(class))
}

func (c MaterialClass) String() string {
	switch c {
	case ClassUnspecified:
		return "unspecified (metal rule used)"
	case Dielectric:
		return "dielectric"
	case MetalOrSemiconductor:
		return "metal or semiconductor"
	}
	return fmt.Sprintf("MaterialClass(%d)", int(c))
}
