package tdsfit

import (
	"errors"
	"math"
	"math/cmplx"
	"strings"

	"thzdrive/caution"
	"thzdrive/pulse"
)

// Thresholds and conventions of NewTransmission.
const (
	// DefaultMarginDB is the margin, in dB of amplitude, by which both
	// spectra must exceed their noise floors for a frequency to belong to the
	// usable band when TransmissionOptions.MarginDB is 0. At 20 dB the
	// amplitude signal-to-noise ratio is at least 10 in each spectrum, so the
	// phase of T scatters by at most about 0.1 rad from bin to bin and phase
	// unwrapping, which fails only on a jump of π, is safe by a wide margin
	// (derived: σ_φ² = (1/SNR_ref² + 1/SNR_sam²)/2).
	DefaultMarginDB = 20
	// PhaseFitFraction is the fraction of the band, from its low edge, over
	// which a straight line is fitted to the unwrapped phase to find the
	// multiple of 2π that the phase at zero frequency must lose (at least
	// MinBandBins bins).
	PhaseFitFraction = 0.25
	// MinBandBins is the fewest frequency bins a usable band may have.
	MinBandBins = 3
	// StepRelTolerance is the relative difference of the two traces' sample
	// steps below which they count as equal.
	StepRelTolerance = 1e-9
)

// TransmissionOptions says how NewTransmission prepares the two traces.
type TransmissionOptions struct {
	// Processing is applied, identically, to the reference and the sample
	// trace: baseline, window and zero-padding (see pulse.Analyze). A
	// window or padding changes both spectra the same way, but a window
	// that does not reach 1 over both pulses (and, for Echoes other than
	// NoEchoes, over their echoes) makes their ratio differ from the
	// sample's transfer function.
	Processing pulse.Processing
	// MarginDB is the margin by which both spectra must exceed their noise
	// floors, in dB of amplitude; 0 selects DefaultMarginDB.
	MarginDB float64
}

// Band is a contiguous range of frequency bins, Lo to Hi inclusive, at
// LoHz to HiHz. It is empty when Hi < Lo.
type Band struct {
	Lo, Hi     int
	LoHz, HiHz float64
}

// Len is the number of bins in the band.
func (b Band) Len() int {
	if b.Hi < b.Lo {
		return 0
	}
	return b.Hi - b.Lo + 1
}

// Contains reports whether bin k lies in the band.
func (b Band) Contains(k int) bool { return k >= b.Lo && k <= b.Hi }

func bandOf(lo, hi int, stepHz float64) Band {
	return Band{Lo: lo, Hi: hi, LoHz: float64(lo) * stepHz, HiHz: float64(hi) * stepHz}
}

// Transmission is the complex transmission of a sample measured by
// terahertz time-domain spectroscopy: the ratio of the spectra of a trace
// through the sample and a reference trace without it.
type Transmission struct {
	// StepHz is the bin spacing; bin k is at FreqHz[k] = k·StepHz, k = 0 …
	// N/2 of the (padded) transform length N.
	StepHz float64
	FreqHz []float64
	// Reference and Sample are the spectra of the processed traces,
	// referenced to t = 0 of the time axis (pulse.Analyze), in the trace's
	// unit times seconds.
	Reference, Sample []complex128
	// T is Sample/Reference (0 where the reference spectrum is exactly 0).
	T []complex128
	// PhaseRad is the unwrapped phase of T, anchored so that its straight-line
	// extrapolation to zero frequency lies within π of 0 (see
	// NewTransmission). It is meaningful inside Band; bin 0 holds 0.
	PhaseRad []float64
	// SigmaLog is the one-standard-deviation noise of ln|T| and, equally, of
	// PhaseRad in each bin, from the noise floors:
	// σ² = (F_ref²/|E_ref|² + F_sam²/|E_sam|²)/2, capped at π (a phase that
	// is entirely unknown).
	SigmaLog []float64
	// NoiseFloorRef and NoiseFloorSam are the noise floors of the two
	// spectra: the RMS |E(f)| of the top pulse.TailFraction of the bins below
	// Nyquist, as pulse.Analyze takes it for its dynamic range.
	NoiseFloorRef, NoiseFloorSam float64
	// MarginDB is the margin used for Band.
	MarginDB float64
	// Band is the usable band: the longest contiguous run of bins (above
	// zero frequency; the lowest if several are as long) in which both
	// spectra exceed their noise floors by MarginDB.
	Band Band
	// PhaseOffsetRad is the multiple of 2π removed from the unwrapped phase.
	PhaseOffsetRad float64
	// StepS is the traces' sample step; ReferencePeakTimeS and
	// SamplePeakTimeS the times of max|E| of the two traces (after
	// baseline); WindowEndS the time of the sample trace's last sample.
	StepS                               float64
	ReferencePeakTimeS, SamplePeakTimeS float64
	WindowEndS                          float64
	// Cautions are those of pulse.Analyze for either trace, their messages
	// prefixed with the trace they concern.
	Cautions []caution.Caution
}

// NewTransmission computes T(f) = E_sam(f)/E_ref(f) from a reference trace
// (no sample) and a sample trace, recorded on the same uniform grid: equal
// steps (within StepRelTolerance) and equal lengths; the start times may
// differ, since each spectrum is referenced to t = 0 of its own time axis.
// Both traces are processed identically by pulse.Analyze (baseline, window,
// padding).
//
// Usable band. The noise floor F of each spectrum is the RMS |E(f)| of its
// top pulse.TailFraction of bins, where a THz spectrum holds only noise.
// A bin is usable when |E_ref| >= F_ref·10^(M/20) and |E_sam| >=
// F_sam·10^(M/20), M = MarginDB; Band is the longest contiguous run of usable
// bins. Fewer than MinBandBins usable bins is an error wrapping ErrNoBand.
//
// Phase. In the convention of package pulse a delay t0 multiplies a spectrum
// by e^{+iωt0}, so a sample that delays the pulse by (n-1)d/c has a phase
// that grows as +ω(n-1)d/c, and the phase of the transmission of any
// passive, causal sample tends to 0 at zero frequency. The measured phase is
// known only modulo 2π, and below the band it is noise. So the phase is
// unwrapped (each bin-to-bin step taken into (-π, π]) starting at the band's
// low edge, upwards and downwards, a straight line a + b·f is fitted by
// least squares to its first PhaseFitFraction of the band, and the multiple
// of 2π nearest to the intercept a is subtracted everywhere (PhaseOffsetRad).
// This is right when the line predicts the phase at zero frequency to within
// π: for a slab whose dispersion is weak over the fitted part of the band.
//
// Errors are *InputError: traces that fail pulse.Trace.Validate or
// pulse.Analyze, unequal steps or lengths, a negative or non-finite margin,
// or no usable band.
func NewTransmission(ref, sam pulse.Trace, o TransmissionOptions) (Transmission, error) {
	margin := o.MarginDB
	if margin == 0 {
		margin = DefaultMarginDB
	}
	if !finite(margin) || margin < 0 {
		return Transmission{}, inputErr("TransmissionOptions.MarginDB", "%g dB is not a non-negative finite margin", o.MarginDB)
	}
	if err := ref.Validate(); err != nil {
		return Transmission{}, traceErr("Reference", err)
	}
	if err := sam.Validate(); err != nil {
		return Transmission{}, traceErr("Sample", err)
	}
	if ref.Len() != sam.Len() {
		return Transmission{}, inputErr("Sample.Field", "%d samples; the reference has %d (record both on the same grid)", sam.Len(), ref.Len())
	}
	if math.Abs(ref.StepS-sam.StepS) > StepRelTolerance*ref.StepS {
		return Transmission{}, inputErr("Sample.StepS", "step %g s differs from the reference's %g s", sam.StepS, ref.StepS)
	}
	ar, err := pulse.Analyze(ref, o.Processing)
	if err != nil {
		return Transmission{}, traceErr("Reference", err)
	}
	as, err := pulse.Analyze(sam, o.Processing)
	if err != nil {
		return Transmission{}, traceErr("Sample", err)
	}
	R, S := ar.Spectrum.Values, as.Spectrum.Values
	nb := len(R)
	out := Transmission{
		StepHz:             ar.Spectrum.StepHz,
		FreqHz:             make([]float64, nb),
		Reference:          R,
		Sample:             S,
		T:                  make([]complex128, nb),
		PhaseRad:           make([]float64, nb),
		SigmaLog:           make([]float64, nb),
		NoiseFloorRef:      noiseFloor(R),
		NoiseFloorSam:      noiseFloor(S),
		MarginDB:           margin,
		StepS:              ref.StepS,
		ReferencePeakTimeS: ar.Metrics.PeakTimeS,
		SamplePeakTimeS:    as.Metrics.PeakTimeS,
		WindowEndS:         sam.TimeS(sam.Len() - 1),
	}
	for k := range out.FreqHz {
		out.FreqHz[k] = float64(k) * out.StepHz
	}
	level := math.Pow(10, margin/20)
	usable := func(k int) bool {
		r, s := cabs(R[k]), cabs(S[k])
		return r > 0 && s > 0 && r >= out.NoiseFloorRef*level && s >= out.NoiseFloorSam*level
	}
	lo, hi := longestRun(1, nb-1, usable)
	if hi-lo+1 < MinBandBins {
		return Transmission{}, wrapErr(ErrNoBand, "Sample", "fewer than %d bins where both spectra exceed their noise floors (reference %.3g, sample %.3g) by %g dB", MinBandBins, out.NoiseFloorRef, out.NoiseFloorSam, margin)
	}
	out.Band = bandOf(lo, hi, out.StepHz)
	for k := range R {
		if R[k] != 0 {
			out.T[k] = S[k] / R[k]
		}
		out.SigmaLog[k] = math.Pi
		if r, s := cabs(R[k]), cabs(S[k]); r > 0 && s > 0 {
			fr, fs := out.NoiseFloorRef/r, out.NoiseFloorSam/s
			out.SigmaLog[k] = math.Min(math.Pi, math.Sqrt((fr*fr+fs*fs)/2))
		}
	}
	out.PhaseOffsetRad = unwrapAnchored(out.PhaseRad, out.T, out.FreqHz, out.Band)
	for _, c := range ar.Cautions {
		c.Message = "reference trace: " + c.Message
		out.Cautions = append(out.Cautions, c)
	}
	for _, c := range as.Cautions {
		c.Message = "sample trace: " + c.Message
		out.Cautions = append(out.Cautions, c)
	}
	return out, nil
}

// traceErr renames a pulse.InputError about a trace ("Trace.StepS") after
// the argument it concerns ("Reference.StepS").
func traceErr(name string, err error) error {
	var pe *pulse.InputError
	if errors.As(err, &pe) {
		field := pe.Field
		if rest, ok := strings.CutPrefix(field, "Trace"); ok {
			field = name + rest
		}
		return &InputError{Field: field, Reason: pe.Reason, cause: err}
	}
	return &InputError{Field: name, Reason: err.Error(), cause: err}
}

// noiseFloor is the RMS |E(f)| of the top pulse.TailFraction of the bins,
// the floor of pulse.Metrics.DynamicRangeDB.
func noiseFloor(v []complex128) float64 {
	nb := len(v)
	tail := max(1, int(math.Ceil(pulse.TailFraction*float64(nb))))
	var s float64
	for _, z := range v[nb-tail:] {
		s += real(z)*real(z) + imag(z)*imag(z)
	}
	return math.Sqrt(s / float64(tail))
}

// longestRun returns the longest run of consecutive k in [from, to] with
// ok(k) (the first of equally long runs); hi < lo if there is none.
func longestRun(from, to int, ok func(int) bool) (lo, hi int) {
	lo, hi = from, from-1
	start := -1
	for k := from; k <= to+1; k++ {
		if k <= to && ok(k) {
			if start < 0 {
				start = k
			}
			continue
		}
		if start >= 0 && k-start > hi-lo+1 {
			lo, hi = start, k-1
		}
		start = -1
	}
	return lo, hi
}

// unwrapAnchored writes the unwrapped phase of t into phase (see
// NewTransmission) and returns the multiple of 2π it removed.
func unwrapAnchored(phase []float64, t []complex128, freqHz []float64, b Band) float64 {
	nb := len(t)
	phase[b.Lo] = cmplx.Phase(t[b.Lo])
	for k := b.Lo + 1; k < nb; k++ {
		phase[k] = phase[k-1] + wrapPhase(cmplx.Phase(t[k])-cmplx.Phase(t[k-1]))
	}
	for k := b.Lo - 1; k >= 1; k-- {
		phase[k] = phase[k+1] + wrapPhase(cmplx.Phase(t[k])-cmplx.Phase(t[k+1]))
	}
	// Least-squares line through the first part of the band, centred on
	// the mean frequency for conditioning.
	m := min(b.Len(), max(MinBandBins, int(math.Ceil(PhaseFitFraction*float64(b.Len())))))
	var fm, pm float64
	for k := b.Lo; k < b.Lo+m; k++ {
		fm += freqHz[k]
		pm += phase[k]
	}
	fm /= float64(m)
	pm /= float64(m)
	var sff, sfp float64
	for k := b.Lo; k < b.Lo+m; k++ {
		df := freqHz[k] - fm
		sff += df * df
		sfp += df * (phase[k] - pm)
	}
	intercept := pm - sfp/sff*fm
	offset := 2 * math.Pi * math.Round(intercept/(2*math.Pi))
	if !finite(offset) {
		offset = 0
	}
	phase[0] = 0
	for k := 1; k < nb; k++ {
		phase[k] -= offset
	}
	return offset
}
