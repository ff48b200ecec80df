package pulse

import (
	"fmt"
	"math"

	"thzdrive/caution"
	"thzdrive/units"
)

// Crystal holds the electro-optic constants of a <110> zinc-blende detection
// crystal. Every value can be overridden by the caller.
type Crystal struct {
	Name string
	// NProbe is the refractive index n0 at the probe wavelength.
	NProbe float64
	// R41MPerV is the electro-optic coefficient r41, m/V.
	R41MPerV float64
	// NTHz is the THz refractive index, which sets the entrance
	// transmission t_THz = 2/(1 + n_THz).
	NTHz float64
	// TOPhononHz is the transverse-optical phonon frequency, above which
	// (and somewhat below which) the crystal does not respond faithfully.
	TOPhononHz float64
}

// The crystals of physics.md §3 at an 800 nm probe.
var (
	// ZnTe: n0 = 2.85, r41 = 4.0 pm/V, n_THz = 3.17 (physics.md §3, from
	// memory); TO phonon 5.3 THz (physics.md §3, from memory).
	ZnTe = Crystal{Name: "ZnTe", NProbe: 2.85, R41MPerV: 4.0 * units.PmPerV, NTHz: 3.17, TOPhononHz: 5.3 * units.THz}
	// GaP: r41 = 0.97 pm/V (Wu & Zhang, APL 70, 1784 (1997)); n0 = 3.18
	// (from memory); n_THz = 3.342 at 1 THz (Sellmeier fit, JOSA B 36, 3039
	// (2019)); TO phonon 11 THz (physics.md §3, from memory).
	GaP = Crystal{Name: "GaP", NProbe: 3.18, R41MPerV: 0.97 * units.PmPerV, NTHz: 3.342, TOPhononHz: 11 * units.THz}
)

// EOSetup is an electro-optic sampling detector: a crystal of thickness
// ThicknessM probed at ProbeWavelengthM, both polarisations at the optimal
// angles, balanced detection (Planken et al., JOSA B 18, 313 (2001)).
type EOSetup struct {
	Crystal                      Crystal
	ThicknessM, ProbeWavelengthM float64
}

// OverRotationLimit is the |dI/I| above which the linear (small-signal)
// reading is off by more than about 0.2 % (arcsin(0.1)/0.1 - 1 = 0.17 %) and
// CalibrateEO cautions EOOverRotation (physics.md §3).
const OverRotationLimit = 0.1

// DetectorBandFraction is the fraction of the crystal's TO phonon frequency
// that the -20 dB band of the calibrated field may reach before CalibrateEO
// cautions DetectorBandLimit (common practice: the response of the crystal
// falls well before the phonon itself).
const DetectorBandFraction = 0.8

// Validate reports whether every constant of the setup is positive and
// finite.
func (s EOSetup) Validate() error {
	for _, f := range []struct {
		name string
		v    float64
	}{
		{"EOSetup.Crystal.NProbe", s.Crystal.NProbe},
		{"EOSetup.Crystal.R41MPerV", s.Crystal.R41MPerV},
		{"EOSetup.Crystal.NTHz", s.Crystal.NTHz},
		{"EOSetup.Crystal.TOPhononHz", s.Crystal.TOPhononHz},
		{"EOSetup.ThicknessM", s.ThicknessM},
		{"EOSetup.ProbeWavelengthM", s.ProbeWavelengthM},
	} {
		if !finite(f.v) || f.v <= 0 {
			return inputErr(f.name, "%g is not positive and finite", f.v)
		}
	}
	if v := s.FieldPerModulation(); !finite(v) || v <= 0 || v > MaxAbsSample {
		return inputErr("EOSetup", "field per unit modulation %g V/m is out of range", v)
	}
	return nil
}

// FieldPerModulation returns the small-signal field outside the crystal per
// unit balanced modulation dI/I, V/m:
//
//	E/(dI/I) = λ/(2π n0³ r41 L t_THz),   t_THz = 2/(1 + n_THz)
//
// from the retardation Γ = (2π/λ)·n0³·r41·L·t_THz·E and dI/I = sin Γ
// (Planken et al., JOSA B 18, 313 (2001); physics.md §3). The entrance
// transmission t_THz makes it the field incident on the crystal; velocity
// mismatch and dispersion are neglected.
func (s EOSetup) FieldPerModulation() float64 {
	c := s.Crystal
	n3 := c.NProbe * c.NProbe * c.NProbe
	tTHz := 2 / (1 + c.NTHz)
	return s.ProbeWavelengthM / (2 * math.Pi * n3 * c.R41MPerV * s.ThicknessM * tTHz)
}

// HalfWaveField returns the field inside the crystal that retards the probe
// by Γ = π, λ/(2 n0³ r41 L), V/m (physics.md §3). It carries no entrance
// transmission: it is the crystal's own figure of merit.
func (s EOSetup) HalfWaveField() float64 {
	c := s.Crystal
	return s.ProbeWavelengthM / (2 * c.NProbe * c.NProbe * c.NProbe * c.R41MPerV * s.ThicknessM)
}

// FieldFromModulation returns the incident field, V/m, that produces the
// balanced modulation m = dI/I: arcsin(m)·FieldPerModulation. |m| >= 1
// cannot be produced (sin Γ <= 1) and is an error, as are NaN and an invalid
// setup.
func (s EOSetup) FieldFromModulation(m float64) (float64, error) {
	if err := s.Validate(); err != nil {
		return 0, err
	}
	if !finite(m) || math.Abs(m) >= 1 {
		return 0, inputErr("modulation", "dI/I = %g; a balanced signal has |dI/I| < 1", m)
	}
	return math.Asin(m) * s.FieldPerModulation(), nil
}

// EOCalibration is the result of CalibrateEO.
type EOCalibration struct {
	PeakFieldVPerM float64
	Trace          Trace
	Cautions       []caution.Caution
}

// CalibrateEO converts a trace of balanced modulation dI/I into the incident
// field, sample by sample through the arcsin form of FieldFromModulation.
// It cautions EOOverRotation when max|dI/I| exceeds OverRotationLimit and
// DetectorBandLimit when the -20 dB band of the field reaches
// DetectorBandFraction of the crystal's TO phonon, where the crystal's
// response (and velocity matching well before it) no longer follows the
// field. Any |dI/I| >= 1 is an error naming the sample.
func CalibrateEO(s EOSetup, modulation Trace) (EOCalibration, error) {
	if err := s.Validate(); err != nil {
		return EOCalibration{}, err
	}
	if err := modulation.validate("modulation"); err != nil {
		return EOCalibration{}, err
	}
	k := s.FieldPerModulation()
	cal := EOCalibration{Trace: Trace{StartS: modulation.StartS, StepS: modulation.StepS, Field: make([]float64, modulation.Len()), Absolute: true}}
	maxM := 0.0
	for i, m := range modulation.Field {
		if math.Abs(m) >= 1 {
			return EOCalibration{}, inputErr(fmt.Sprintf("modulation.Field[%d]", i), "dI/I = %g; a balanced signal has |dI/I| < 1", m)
		}
		maxM = max(maxM, math.Abs(m))
		cal.Trace.Field[i] = math.Asin(m) * k
	}
	cal.PeakFieldVPerM, _ = absMax(cal.Trace.Field)
	if maxM > OverRotationLimit {
		cal.Cautions = append(cal.Cautions, caution.New(caution.EOOverRotation,
			fmt.Sprintf("The modulation reaches |dI/I| = %.3g, above %.2g: the linear reading is off there, and the arcsin form used here assumes ideal optics.", maxM, OverRotationLimit),
			caution.V("max_modulation", maxM), caution.V("modulation_limit", OverRotationLimit)))
	}
	var m Metrics
	sp := spectrumOf(cal.Trace.Field, cal.Trace.StepS, cal.Trace.StartS, cal.Trace.Len())
	spectralMetrics(&m, sp, cal.Trace.StepS)
	if m.BandHighHz >= DetectorBandFraction*s.Crystal.TOPhononHz {
		cal.Cautions = append(cal.Cautions, caution.New(caution.DetectorBandLimit,
			fmt.Sprintf("The -20 dB band of the field reaches %.3g THz, near or above the %s TO phonon at %.3g THz: the crystal does not render the field faithfully there.", m.BandHighHz/units.THz, s.Crystal.Name, s.Crystal.TOPhononHz/units.THz),
			caution.V("band_high_thz", m.BandHighHz/units.THz), caution.V("to_phonon_thz", s.Crystal.TOPhononHz/units.THz)))
	}
	cal.Cautions = fieldCautions(cal.Cautions, cal.PeakFieldVPerM, "peak_field_kv_per_cm")
	return cal, nil
}
