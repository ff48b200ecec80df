package pulse

import (
	"math"

	"thzdrive/caution"
	"thzdrive/units"
)

// Spot is a Gaussian focal spot by its 1/e² intensity radii along two
// principal axes, m; the radii are equal for a round spot.
type Spot struct{ RadiusXM, RadiusYM float64 }

// KnifeEdgeFactor is the 10–90 % knife-edge width of a Gaussian beam in units
// of its 1/e² radius w, 2·erfinv(0.8)/sqrt(2) ≈ 1.2816 (derived): the power
// passing a blade at x is (1 + erf(sqrt(2)·x/w))/2, which is 10 % and 90 % at
// x = ∓w·erfinv(0.8)/sqrt(2).
var KnifeEdgeFactor = math.Sqrt2 * math.Erfinv(0.8)

// RadiusFromFWHM returns the 1/e² intensity radius w of a Gaussian beam whose
// intensity profile has full width at half maximum fwhmM:
// w = d/sqrt(2 ln 2) (physics.md §3). NaN for a negative or non-finite width.
func RadiusFromFWHM(fwhmM float64) float64 {
	if !finite(fwhmM) || fwhmM < 0 {
		return math.NaN()
	}
	return fwhmM / math.Sqrt(2*math.Ln2)
}

// RadiusFromKnifeEdge returns the 1/e² intensity radius w of a Gaussian beam
// whose 10–90 % knife-edge width is width1090M: w = width/KnifeEdgeFactor.
// NaN for a negative or non-finite width.
func RadiusFromKnifeEdge(width1090M float64) float64 {
	if !finite(width1090M) || width1090M < 0 {
		return math.NaN()
	}
	return width1090M / KnifeEdgeFactor
}

// Validate reports whether both radii are positive and finite.
func (s Spot) Validate() error {
	if !finite(s.RadiusXM) || s.RadiusXM <= 0 {
		return inputErr("Spot.RadiusXM", "radius %g m is not positive and finite", s.RadiusXM)
	}
	if !finite(s.RadiusYM) || s.RadiusYM <= 0 {
		return inputErr("Spot.RadiusYM", "radius %g m is not positive and finite", s.RadiusYM)
	}
	return nil
}

// PeakFluence returns the on-axis fluence of a pulse of energy energyJ in
// this spot, F0 = 2W/(π wx wy), J/m² (physics.md §3): the peak of the
// Gaussian fluence profile F0·exp(-2x²/wx² - 2y²/wy²), whose integral is W.
func (s Spot) PeakFluence(energyJ float64) float64 {
	return 2 * energyJ / (math.Pi * s.RadiusXM * s.RadiusYM)
}

// FocusOption asks CalibrateByEnergy for the field at a diffraction-limited
// broadband focus as well. The spot radii given to it are those measured at
// ReferenceFrequencyHz; at other frequencies w(f) = w_ref·f_ref/f.
type FocusOption struct {
	Enabled              bool
	ReferenceFrequencyHz float64
}

// EnergyCalibration is the result of CalibrateByEnergy.
type EnergyCalibration struct {
	// PeakFieldVPerM is max|E| of Trace; PeakFluenceJPerM2 is the spot's
	// on-axis fluence F0.
	PeakFieldVPerM, PeakFluenceJPerM2 float64
	// Trace is the waveform scaled to absolute field (Absolute true).
	Trace Trace
	// FocusedPeakFieldVPerM and Focused are the on-axis peak field and
	// waveform at a diffraction-limited focus; zero and empty unless the
	// FocusOption was enabled.
	FocusedPeakFieldVPerM float64
	Focused               Trace
	Cautions              []caution.Caution
}

// CalibrateByEnergy scales a waveform to absolute field from the pulse
// energy and the spot (physics.md §3). A plane wave carries the fluence
// F = (1/Z0)∫E² dt; the spot's on-axis fluence is F0 = 2W/(π wx wy), so with
// g the waveform normalised to max|g| = 1
//
//	E_peak = sqrt(Z0·F0 / ∫g² dt),   E(t) = E_peak·g(t).
//
// The integral is the sum of the samples' squares times the step, which is
// the trapezoid rule for a trace that has decayed at its ends. The waveform is used as given: an
// offset or a truncated pulse inflates ∫g² and lowers E_peak, so DCOffset
// and NotDecayed are cautioned as in Analyze.
//
// Focus. Each frequency of a broadband beam focuses to its own
// diffraction-limited spot, w(f) = w_ref·f_ref/f. The energy per frequency,
// W(f) = W·|E(f)|²/∫|E(f)|² df, has the shape of the waveform's power
// spectrum, and the on-axis fluence spectral density is 2W(f)/(π w(f)²). With
// E the calibrated waveform (whose fluence is F0) this is
// (2/Z0)·|E(f)|²·(f/f_ref)² on the one-sided axis, so the on-axis focused
// field has |E_focus(f)| = |E(f)|·f/f_ref, and ∫(π w(f)²/2)·(fluence
// density) df = W: the energy is the same by construction, with no free
// normalisation left (derived). The phase follows from the same diffraction
// integral that gives w ∝ 1/f: the on-axis field in the focal plane of a
// lens is 1/(iλ f_L) times the integral of the aperture field
// (Fresnel–Kirchhoff diffraction and the Fourier-transforming property of a
// lens; Goodman, Introduction to Fourier Optics, from memory), a factor
// -iω/(2π c f_L) in the convention e^{-iωt}. So
//
//	E_focus(ω) = -i·(f/f_ref)·E(ω),   E_focus(t) = (1/ω_ref)·dE/dt,
//
// the time derivative of the collimated waveform (the Gouy phase of a
// focused single-cycle pulse). The DC part does not reach the focus. The
// derivative is taken spectrally over the trace's own length, which is exact
// for a trace that has decayed at both ends.
//
// Errors: a shape that fails Trace.Validate, energyJ not positive and
// finite, a spot that fails Validate, or an enabled focus without a positive
// finite reference frequency.
func CalibrateByEnergy(shape Trace, energyJ float64, spot Spot, focus FocusOption) (EnergyCalibration, error) {
	if err := shape.validate("shape"); err != nil {
		return EnergyCalibration{}, err
	}
	if !finite(energyJ) || energyJ <= 0 {
		return EnergyCalibration{}, inputErr("energyJ", "pulse energy %g J is not positive and finite", energyJ)
	}
	if err := spot.Validate(); err != nil {
		return EnergyCalibration{}, err
	}
	if focus.Enabled && (!finite(focus.ReferenceFrequencyHz) || focus.ReferenceFrequencyHz <= 0) {
		return EnergyCalibration{}, inputErr("FocusOption.ReferenceFrequencyHz", "reference frequency %g Hz is not positive and finite", focus.ReferenceFrequencyHz)
	}
	f0 := spot.PeakFluence(energyJ)
	if !finite(f0) || f0 <= 0 {
		return EnergyCalibration{}, inputErr("Spot", "peak fluence %g J/m² of %g J in this spot is not finite and positive", f0, energyJ)
	}
	gMax, _ := absMax(shape.Field)
	var sumG2 float64
	for _, v := range shape.Field {
		g := v / gMax
		sumG2 += g * g
	}
	ePeak := math.Sqrt(units.VacuumImpedance * f0 / (sumG2 * shape.StepS))
	if !finite(ePeak) || ePeak > MaxAbsSample {
		return EnergyCalibration{}, inputErr("energyJ", "the calibrated peak field %g V/m is beyond %g V/m", ePeak, MaxAbsSample)
	}
	cal := EnergyCalibration{
		PeakFieldVPerM:    ePeak,
		PeakFluenceJPerM2: f0,
		Trace:             Trace{StartS: shape.StartS, StepS: shape.StepS, Field: make([]float64, shape.Len()), Absolute: true},
	}
	scale := ePeak / gMax
	for i, v := range shape.Field {
		cal.Trace.Field[i] = v * scale
	}
	var m Metrics
	timeMetrics(&m, cal.Trace)
	cal.Cautions = timeCautions(cal.Cautions, m)
	cal.Cautions = fieldCautions(cal.Cautions, ePeak, "peak_field_kv_per_cm")
	if focus.Enabled {
		cal.Focused = focusTrace(cal.Trace, focus.ReferenceFrequencyHz)
		cal.FocusedPeakFieldVPerM, _ = absMax(cal.Focused.Field)
		cal.Cautions = fieldCautions(cal.Cautions, cal.FocusedPeakFieldVPerM, "focused_peak_field_kv_per_cm")
	}
	return cal, nil
}

// focusTrace returns the on-axis focused waveform E_focus(ω) = -i(f/f_ref)E(ω)
// (see CalibrateByEnergy).
func focusTrace(tr Trace, refHz float64) Trace {
	n := tr.Len()
	t := Acquire(n)
	defer Release(t)
	spec := t.Forward(nil, tr.Field, tr.StepS)
	stepHz := 1 / (float64(n) * tr.StepS)
	for k, c := range spec {
		r := float64(k) * stepHz / refHz
		spec[k] = complex(r*imag(c), -r*real(c)) // -i·r·c
	}
	out := Trace{StartS: tr.StartS, StepS: tr.StepS, Absolute: true}
	out.Field = t.Inverse(nil, spec, tr.StepS)
	return out
}
