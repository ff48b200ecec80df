package pulse

import (
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/interp"
)

// Limits on the input this package accepts. They are wide on purpose: they
// exist so that no arithmetic inside the package can overflow to Inf or lose
// every digit to underflow, not to second-guess an experiment. The server
// applies its own, tighter, configurable limits on top.
const (
	// MinSamples is the fewest samples a trace may have: fewer leave too few
	// spectral bins for a peak, a width and a noise floor.
	MinSamples = 8
	// MaxSamples is the most samples a trace (after resampling or padding)
	// may have, 2^24.
	MaxSamples = 1 << 24
	// MinStepS and MaxStepS bound the sample step, s. Their product with the
	// sample limits keeps every frequency and phase finite.
	MinStepS = 1e-18
	MaxStepS = 1e3
	// MaxAbsStartS bounds |StartS|, s, so that the phase 2π f·StartS that
	// references a spectrum to t = 0 stays finite.
	MaxAbsStartS = 1e3
	// MaxAbsSample bounds the magnitude of any sample (V/m when absolute).
	// Squares and sums of squares of such samples over MaxSamples stay far
	// below the float64 limit of 1.8e308.
	MaxAbsSample = 1e100
	// MinPeakSample is the smallest max|sample| of a trace that is not
	// treated as all zero. Squares of such samples stay above the float64
	// underflow threshold.
	MinPeakSample = 1e-100
)

// InputError reports input that cannot be computed. Field names the offending
// input the way a caller wrote it ("Trace.StepS", "Trace.Field[12]",
// "energyJ"), so that a server can turn it into a field violation.
type InputError struct {
	Field  string
	Reason string
}

func (e *InputError) Error() string { return "pulse: " + e.Field + ": " + e.Reason }

func inputErr(field, format string, args ...any) error {
	return &InputError{Field: field, Reason: fmt.Sprintf(format, args...)}
}

// finite reports whether x is neither NaN nor ±Inf (for those x - x is NaN).
func finite(x float64) bool { return x-x == 0 }

// Trace is a uniformly sampled waveform: sample i is at time StartS + i·StepS.
// Field holds V/m when Absolute is true and arbitrary units otherwise (for
// example a lock-in signal before calibration).
type Trace struct {
	StartS   float64
	StepS    float64
	Field    []float64
	Absolute bool
}

// Len is the number of samples.
func (tr Trace) Len() int { return len(tr.Field) }

// TimeS is the time of sample i, s.
func (tr Trace) TimeS(i int) float64 { return tr.StartS + float64(i)*tr.StepS }

// Validate reports whether the trace can be computed with: at least
// MinSamples and at most MaxSamples samples, a finite step within
// [MinStepS, MaxStepS], a finite start within ±MaxAbsStartS, every sample
// finite and within ±MaxAbsSample, and not all (nearly) zero. The error is an
// *InputError naming the first offending field.
func (tr Trace) Validate() error {
	return tr.validate("Trace")
}

func (tr Trace) validate(name string) error {
	n := len(tr.Field)
	if n < MinSamples {
		return inputErr(name+".Field", "%d samples; at least %d are needed", n, MinSamples)
	}
	if n > MaxSamples {
		return inputErr(name+".Field", "%d samples; at most %d are accepted", n, MaxSamples)
	}
	if !finite(tr.StepS) || tr.StepS < MinStepS || tr.StepS > MaxStepS {
		return inputErr(name+".StepS", "step %g s is not within [%g, %g] s", tr.StepS, MinStepS, MaxStepS)
	}
	if !finite(tr.StartS) || math.Abs(tr.StartS) > MaxAbsStartS {
		return inputErr(name+".StartS", "start %g s is not finite or beyond ±%g s", tr.StartS, MaxAbsStartS)
	}
	peak := 0.0
	for i, x := range tr.Field {
		if !finite(x) {
			return inputErr(fmt.Sprintf("%s.Field[%d]", name, i), "sample is %g", x)
		}
		a := math.Abs(x)
		if a > MaxAbsSample {
			return inputErr(fmt.Sprintf("%s.Field[%d]", name, i), "|sample| %g exceeds %g", x, MaxAbsSample)
		}
		peak = max(peak, a)
	}
	if peak < MinPeakSample {
		return inputErr(name+".Field", "max |sample| is %g: the trace is (nearly) all zero", peak)
	}
	return nil
}

// Resample turns a waveform sampled at non-uniform, strictly increasing times
// into a uniform Trace.
//
// Method: the step is the median of the spacings (robust to a few long gaps
// or short repeats of a stage); the uniform grid starts at the first time and
// ends at the last grid point not after the last time; values come from a
// natural cubic spline through all the samples (gonum's interp.NaturalCubic,
// second derivative zero at both ends). A spline reproduces a smooth
// waveform with an interior error below (5/384)·h^4·max|d⁴E/dt⁴| for a largest
// spacing h (Hall & Meyer, J. Approx. Theory 16, 105 (1976)); the natural end
// condition adds an error near an end where the second derivative does not vanish, which is
// small for a trace that has decayed there.
//
// Times or fields that are NaN or Inf, times that are not strictly
// increasing (unsorted or duplicated), fewer than MinSamples samples, or a
// grid longer than MaxSamples are errors.
func Resample(timesS, field []float64, absolute bool) (Trace, error) {
	n := len(timesS)
	if len(field) != n {
		return Trace{}, inputErr("field", "%d values for %d times", len(field), n)
	}
	if n < MinSamples {
		return Trace{}, inputErr("timesS", "%d samples; at least %d are needed", n, MinSamples)
	}
	if n > MaxSamples {
		return Trace{}, inputErr("timesS", "%d samples; at most %d are accepted", n, MaxSamples)
	}
	for i, t := range timesS {
		if !finite(t) || math.Abs(t) > MaxAbsStartS {
			return Trace{}, inputErr(fmt.Sprintf("timesS[%d]", i), "time %g s is not finite or beyond ±%g s", t, MaxAbsStartS)
		}
		if i > 0 && !(t > timesS[i-1]) {
			return Trace{}, inputErr(fmt.Sprintf("timesS[%d]", i), "time %g s is not after the previous %g s: times must be strictly increasing", t, timesS[i-1])
		}
		if !finite(field[i]) || math.Abs(field[i]) > MaxAbsSample {
			return Trace{}, inputErr(fmt.Sprintf("field[%d]", i), "sample %g is not finite or exceeds %g", field[i], MaxAbsSample)
		}
	}
	gaps := make([]float64, n-1)
	for i := range gaps {
		gaps[i] = timesS[i+1] - timesS[i]
	}
	slices.Sort(gaps)
	step := gaps[len(gaps)/2]
	if len(gaps)%2 == 0 {
		step = 0.5 * (gaps[len(gaps)/2-1] + gaps[len(gaps)/2])
	}
	if step < MinStepS || step > MaxStepS {
		return Trace{}, inputErr("timesS", "median spacing %g s is not within [%g, %g] s", step, MinStepS, MaxStepS)
	}
	span := timesS[n-1] - timesS[0]
	// The small allowance keeps a grid point that round-off puts a hair
	// beyond the last time.
	m := int(math.Floor(span/step*(1+1e-12))) + 1
	if m > MaxSamples {
		return Trace{}, inputErr("timesS", "span %g s at median step %g s needs %d samples; at most %d are accepted", span, step, m, MaxSamples)
	}
	if m < MinSamples {
		return Trace{}, inputErr("timesS", "span %g s at median step %g s gives %d samples; at least %d are needed", span, step, m, MinSamples)
	}
	var spline interp.NaturalCubic
	if err := spline.Fit(timesS, field); err != nil {
		return Trace{}, inputErr("timesS", "spline fit failed: %v", err)
	}
	out := Trace{StartS: timesS[0], StepS: step, Field: make([]float64, m), Absolute: absolute}
	for i := range out.Field {
		t := min(out.TimeS(i), timesS[n-1])
		out.Field[i] = spline.Predict(t)
	}
	return out, nil
}

// PeakAbs returns max |E| over the samples (0 for an empty trace).
func (tr Trace) PeakAbs() float64 {
	peak := 0.0
	for _, x := range tr.Field {
		peak = math.Max(peak, math.Abs(x))
	}
	return peak
}

// Scaled returns a copy of tr with every sample multiplied by f; tr is not
// changed.
func (tr Trace) Scaled(f float64) Trace {
	out := tr
	out.Field = make([]float64, len(tr.Field))
	for i, x := range tr.Field {
		out.Field[i] = x * f
	}
	return out
}
