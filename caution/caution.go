// Package caution defines the structured warnings that every physics package
// returns beside its results: a stable code a program can branch on, a
// sentence for a person, and the numbers behind it.
//
// A caution never replaces an error. Input that cannot be computed is an
// error; input that can be computed but makes the result doubtful, or a plan
// that looks dangerous for the sample, is a caution.
package caution

import "fmt"

// Code identifies a kind of caution. The values are stable: they are mirrored
// one to one by the wire enum, so never renumber them.
type Code int

const (
	Unspecified Code = iota
	// Pulse and trace.
	DCOffset          // the trace has a net area: |∫E dt| / ∫|E| dt is large
	NotDecayed        // the field has not decayed at an edge of the time window
	EOOverRotation    // electro-optic modulation beyond the linear range
	DetectorBandLimit // spectrum reaches the EO crystal's phonon or mismatch band
	FieldBeyondTableTop
	FieldImplausible
	LowDynamicRange
	Undersampled // a frequency of interest lies above ~0.4 of Nyquist
	// Optics.
	EchoInWindow        // an echo of a thick layer falls inside the time window
	MaterialExtrapolate // material data used outside its validity range
	Reststrahlen        // the field inside is suppressed in a reststrahlen band
	// Phonon mode.
	LindemannWarning // ion displacement past 0.05 of the bond length
	LindemannDamage  // past 0.1 of the bond length: melting by the rule of thumb
	NonlinearRegime  // mode energy above ~0.1 quanta per cell, or anharmonic shift above the linewidth
	ModeOutsideBand  // the pulse carries little spectral weight at the mode
	TargetUnreachable
	SourceShortfall // the source cannot reach the requested amplitude
	// Heating and damage.
	CrossesTransition // the pump heats the spot across Tc
	SmallMargin       // the heated spot comes within a small margin of Tc
	OpticalDamage     // fluence past a damage rule of thumb
	HeatingLarge      // a large single-pulse or steady-state rise
	// Phonon mode, continued.
	ModeNotDecayed // the mode still rings where the exact solution's padding ends (wrap-around)
	// Spectroscopy (package tdsfit).
	ExtractionUnconverged // the optical constants could not be extracted at some frequencies of the band
	FitPoor               // a dielectric fit misses the data beyond their noise, or leaves a parameter undetermined
)

var names = map[Code]string{
	Unspecified:           "UNSPECIFIED",
	DCOffset:              "DC_OFFSET",
	NotDecayed:            "NOT_DECAYED",
	EOOverRotation:        "EO_OVER_ROTATION",
	DetectorBandLimit:     "DETECTOR_BAND_LIMIT",
	FieldBeyondTableTop:   "FIELD_BEYOND_TABLE_TOP",
	FieldImplausible:      "FIELD_IMPLAUSIBLE",
	LowDynamicRange:       "LOW_DYNAMIC_RANGE",
	Undersampled:          "UNDERSAMPLED",
	EchoInWindow:          "ECHO_IN_WINDOW",
	MaterialExtrapolate:   "MATERIAL_EXTRAPOLATED",
	Reststrahlen:          "RESTSTRAHLEN",
	LindemannWarning:      "LINDEMANN_WARNING",
	LindemannDamage:       "LINDEMANN_DAMAGE",
	NonlinearRegime:       "NONLINEAR_REGIME",
	ModeOutsideBand:       "MODE_OUTSIDE_BAND",
	TargetUnreachable:     "TARGET_UNREACHABLE",
	SourceShortfall:       "SOURCE_SHORTFALL",
	CrossesTransition:     "CROSSES_TRANSITION",
	SmallMargin:           "SMALL_MARGIN",
	OpticalDamage:         "OPTICAL_DAMAGE",
	HeatingLarge:          "HEATING_LARGE",
	ModeNotDecayed:        "MODE_NOT_DECAYED",
	ExtractionUnconverged: "EXTRACTION_UNCONVERGED",
	FitPoor:               "FIT_POOR",
}

// String returns the code's stable upper-case name.
func (c Code) String() string {
	if s, ok := names[c]; ok {
		return s
	}
	return fmt.Sprintf("Code(%d)", int(c))
}

// Value is one number behind a caution, with its unit in the name
// (for example "dc_area_ratio" or "peak_field_kv_per_cm").
type Value struct {
	Name   string
	Number float64
}

// Caution is one structured warning.
type Caution struct {
	Code    Code
	Message string
	Values  []Value
}

// New builds a caution; values are given as name, number pairs.
func New(code Code, message string, values ...Value) Caution {
	return Caution{Code: code, Message: message, Values: values}
}

// V is shorthand for a Value.
func V(name string, number float64) Value { return Value{Name: name, Number: number} }

// Codes lists every defined code, Unspecified included, in numeric order.
func Codes() []Code {
	out := make([]Code, 0, len(names))
	for c := Unspecified; ; c++ {
		if _, ok := names[c]; !ok {
			return out
		}
		out = append(out, c)
	}
}
