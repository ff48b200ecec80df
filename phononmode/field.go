package phononmode

import "math"

// Field is the macroscopic electric field inside the sample, the component
// along its polarisation (Mode.PolarAngleRad relates that direction to the
// mode's dipole): a uniformly sampled time trace, sample i at
// StartS + i·StepS seconds, in V/m. It is the field after every interface and after the
// screening by the sample's own dielectric response (the optics package's
// job); the mode's drive uses it as it is and never screens it again.
//
// Between samples the field is the band-limited (Whittaker–Shannon)
// interpolant of the zero-padded samples, the function whose spectrum is
// the discrete Fourier transform of the trace: the one representation the
// exact linear solution implies, used also by the time-domain integrator.
// It is faithful when the trace is sampled well above its highest frequency
// and has decayed at both ends of the window; a trace that stops abruptly
// rings (Gibbs) near its ends in both solutions alike.
type Field struct {
	StartS float64   // time of the first sample, s
	StepS  float64   // sample spacing, s, > 0
	VPerM  []float64 // samples, V/m, at least 2
}

// Validate reports the first problem with the trace as an *InputError.
func (f Field) Validate() error {
	switch {
	case len(f.VPerM) < 2:
		return inputErr("Field.VPerM", "%d samples: need at least 2", len(f.VPerM))
	case !finite(f.StartS):
		return inputErr("Field.StartS", "%g: must be finite", f.StartS)
	case !finite(f.StepS) || f.StepS <= 0 || !finite(1/f.StepS):
		return inputErr("Field.StepS", "%g: must be finite and > 0", f.StepS)
	case !finite(f.StartS + float64(len(f.VPerM))*f.StepS):
		return inputErr("Field.StepS", "the window end is not representable")
	}
	for i, v := range f.VPerM {
		if !finite(v) {
			return inputErr("Field.VPerM", "sample %d is %g", i, v)
		}
	}
	return nil
}

// TimeS is the time of sample i, s.
func (f Field) TimeS(i int) float64 { return f.StartS + float64(i)*f.StepS }

// NyquistHz is the highest frequency the sampling represents, 1/(2·StepS).
func (f Field) NyquistHz() float64 { return 0.5 / f.StepS }

// pulseEnd returns the index of the first sample by which the fraction frac
// of ∫E² dt has arrived, and ∫E² dt itself (V²·s/m²). A trace without
// field returns its last index.
func (f Field) pulseEnd(frac float64) (int, float64) {
	total := 0.0
	for _, v := range f.VPerM {
		total += v * v
	}
	if total == 0 || math.IsInf(total, 0) {
		return len(f.VPerM) - 1, total * f.StepS
	}
	acc := 0.0
	for i, v := range f.VPerM {
		acc += v * v
		if acc >= frac*total {
			return i, total * f.StepS
		}
	}
	return len(f.VPerM) - 1, total * f.StepS
}
