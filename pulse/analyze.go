package pulse

import (
	"fmt"
	"math"
	"sync"

	"thzdrive/caution"
	"thzdrive/units"
)

// Baseline selects how a constant or slowly drifting offset is removed from a
// trace before anything else is computed.
type Baseline int

const (
	// BaselineNone leaves the trace as it is.
	BaselineNone Baseline = iota
	// BaselinePrePulse subtracts the mean of the part of the trace before
	// the pulse. That part is found in two steps: the median of the trace
	// is a first estimate of the offset (robust while the pulse occupies
	// less than half the window); the pulse starts at the first sample whose
	// deviation from the median reaches PrePulseLevel of the largest
	// deviation. The samples before it are the pre-pulse part; fewer than
	// MinPrePulseSamples of them is an error.
	BaselinePrePulse
	// BaselineLinear subtracts the least-squares straight line through the
	// whole trace. It also removes the pulse's own first moment, so it
	// suits traces much longer than the pulse.
	BaselineLinear
)

func (b Baseline) String() string {
	switch b {
	case BaselineNone:
		return "BaselineNone"
	case BaselinePrePulse:
		return "BaselinePrePulse"
	case BaselineLinear:
		return "BaselineLinear"
	}
	return fmt.Sprintf("Baseline(%d)", int(b))
}

// Window selects the taper applied over the whole trace before the
// transform. All windows are the symmetric forms of Harris, Proc. IEEE 66,
// 51 (1978), with n = 0 … N-1:
//
//	Hann:     w_n = 0.5 - 0.5 cos(2πn/(N-1))
//	Blackman: w_n = 0.42 - 0.5 cos(2πn/(N-1)) + 0.08 cos(4πn/(N-1))
//	Tukey(α): 1 in the middle, a half Hann taper over α(N-1)/2 samples at each end
//
// which are the forms of scipy.signal.windows with sym=True.
type Window int

// The windows; WindowNone leaves the trace as it is.
const (
	WindowNone Window = iota
	WindowHann
	WindowTukey
	WindowBlackman
)

func (w Window) String() string {
	switch w {
	case WindowNone:
		return "WindowNone"
	case WindowHann:
		return "WindowHann"
	case WindowTukey:
		return "WindowTukey"
	case WindowBlackman:
		return "WindowBlackman"
	}
	return fmt.Sprintf("Window(%d)", int(w))
}

// Processing says how Analyze prepares a trace for the transform: baseline,
// then window, then zero-padding.
type Processing struct {
	Baseline Baseline
	Window   Window
	// TukeyAlpha is the tapered fraction of the Tukey window, 0 < α <= 1
	// (α = 1 is the Hann window); 0 selects DefaultTukeyAlpha.
	TukeyAlpha float64
	// PadToSamples zero-pads the trace to at least this many samples before
	// the transform; 0 (or a value not above the trace length) pads
	// nothing. A requested padding is rounded up to the next length whose
	// only prime factors are 2, 3 and 5 (NextFastLength), which the
	// transform handles fastest; the length used is
	// 1/(Metrics.ResolutionHz·StepS).
	PadToSamples int
}

// Thresholds and conventions of Analyze.
const (
	// DefaultTukeyAlpha is the Tukey window's tapered fraction when
	// Processing.TukeyAlpha is 0: half the window tapered (common practice).
	DefaultTukeyAlpha = 0.5
	// PrePulseLevel is the deviation from the median, as a fraction of the
	// largest deviation, that marks the start of the pulse for
	// BaselinePrePulse (common practice).
	PrePulseLevel = 0.05
	// MinPrePulseSamples is the fewest pre-pulse samples BaselinePrePulse
	// averages.
	MinPrePulseSamples = 4
	// EdgeFraction is the fraction of the samples at each end of the trace
	// (at least one sample) over which EdgeRatio looks for field that has
	// not decayed.
	EdgeFraction = 0.05
	// EdgeRatioLimit is the EdgeRatio above which Analyze cautions
	// NotDecayed (common practice).
	EdgeRatioLimit = 0.05
	// DCAreaRatioLimit is the DCAreaRatio above which Analyze cautions
	// DCOffset: a radiated pulse has zero area (common practice).
	DCAreaRatioLimit = 0.1
	// TailFraction is the fraction of the one-sided spectrum, just below
	// Nyquist, whose RMS amplitude is the noise floor of DynamicRangeDB.
	TailFraction = 0.1
	// LowDynamicRangeDB is the dynamic range below which Analyze cautions
	// LowDynamicRange: below it the -20 dB band of the metrics reaches the
	// noise floor (derived from the band's definition).
	LowDynamicRangeDB = 20
	// MaxDynamicRangeDB caps DynamicRangeDB at the float64 round-off floor,
	// 20·log10(1/ε) with ε = 2^-52.
	MaxDynamicRangeDB = 20 * 52 * math.Ln2 / math.Ln10
	// BandLevel is the level, relative to the peak of |E(f)|², that bounds
	// the band of Metrics (-20 dB).
	BandLevel = 0.01
	// UndersampledFraction is the fraction of Nyquist that the band's upper
	// edge may reach before Analyze cautions Undersampled (see package
	// caution).
	UndersampledFraction = 0.4
	// TableTopFieldVPerM is the peak field above which a caution says no
	// table-top source reaches it (physics.md §8, from memory or secondary
	// sources).
	TableTopFieldVPerM = 10 * units.MVPerCm
	// ImplausibleFieldVPerM is the peak field above which a caution asks the
	// caller to confirm (physics.md §8).
	ImplausibleFieldVPerM = 50 * units.MVPerCm
)

// Spectrum is a one-sided spectrum: bin k, 0 <= k < len(Values), is at
// frequency k·StepHz. Values are in the field's unit times seconds, in the
// convention of Transform, referenced to t = 0 of the trace's time axis
// (not to its first sample): E(ω) = ∫E(t) e^{+iωt} dt.
type Spectrum struct {
	StepHz float64
	Values []complex128
}

// Metrics describes a trace and its spectrum (physics.md §2).
//
// Time-domain metrics (peak, peak-to-peak, DC area ratio, fluence, edge
// ratio) come from the trace after baseline removal and before the window:
// the window is a device of spectral estimation and would change the field.
// Spectral metrics come from the windowed, padded spectrum.
type Metrics struct {
	// PeakFieldVPerM is max|E| over the samples, PeakTimeS its time (the
	// earliest, if several samples share the maximum) and PeakSign the sign
	// of E there (+1 or -1). Between samples the true extremum can be
	// higher by about (δ/τ)² relative, δ the offset from the nearest sample.
	PeakFieldVPerM float64
	PeakTimeS      float64
	PeakSign       int
	// PeakToPeakVPerM is max E - min E.
	PeakToPeakVPerM float64
	// SpectralPeakHz is where |E(f)| peaks, refined between bins by a
	// parabola through the largest bin and its neighbours.
	SpectralPeakHz float64
	// CentroidHz is Σ f|E(f)|² / Σ |E(f)|² over the one-sided bins.
	CentroidHz float64
	// BandwidthFWHMHz is the full width at half maximum of |E(f)|² around
	// its peak (edges interpolated linearly between bins; an edge that does
	// not fall before DC or Nyquist is taken there).
	BandwidthFWHMHz float64
	// BandLowHz and BandHighHz bound the contiguous band around the peak
	// where |E(f)|² is within 20 dB of its peak (edges as for the FWHM).
	BandLowHz, BandHighHz float64
	// DynamicRangeDB is 20·log10 of the peak |E(f)| over the noise floor,
	// the RMS |E(f)| of the top TailFraction of bins below Nyquist; capped
	// at MaxDynamicRangeDB.
	DynamicRangeDB float64
	// DCAreaRatio is |Σ E_n| / Σ |E_n|, that is |∫E dt| / ∫|E| dt.
	DCAreaRatio float64
	// FluenceJPerM2 is the plane-wave fluence (1/Z0)·∫E² dt (physics.md §3)
	// when the trace is absolute, else 0.
	FluenceJPerM2 float64
	// NyquistHz is 1/(2 dt); ResolutionHz is 1/(N_padded·dt).
	NyquistHz, ResolutionHz float64
	// EdgeRatio is max|E| over the first and last EdgeFraction of the
	// samples, over max|E|.
	EdgeRatio float64
}

// Analysis is what Analyze returns.
type Analysis struct {
	// Processed is the trace after baseline and window, before padding:
	// what the transform sees.
	Processed Trace
	Spectrum  Spectrum
	Metrics   Metrics
	Cautions  []caution.Caution
}

// Analyze removes the baseline, applies the window, zero-pads, transforms,
// and computes metrics and cautions (DCOffset, NotDecayed, LowDynamicRange,
// Undersampled, and for absolute traces FieldBeyondTableTop or
// FieldImplausible). Input that cannot be computed is an *InputError: a
// trace that fails Validate, unknown processing options, a pre-pulse part
// too short, or nothing left after baseline and window.
func Analyze(tr Trace, p Processing) (Analysis, error) {
	if err := tr.Validate(); err != nil {
		return Analysis{}, err
	}
	alpha, err := p.validate(tr.Len())
	if err != nil {
		return Analysis{}, err
	}
	n := tr.Len()
	out := Analysis{Processed: Trace{StartS: tr.StartS, StepS: tr.StepS, Field: make([]float64, n), Absolute: tr.Absolute}}
	x := out.Processed.Field
	inPeak, _ := absMax(tr.Field)
	if err := removeBaseline(x, tr.Field, p.Baseline); err != nil {
		return Analysis{}, err
	}
	m := &out.Metrics
	timeMetrics(m, out.Processed)
	// A baseline that leaves only round-off of the input means there was no
	// pulse (a constant or a straight line).
	if m.PeakFieldVPerM <= 1e-12*inPeak || m.PeakFieldVPerM < MinPeakSample {
		return Analysis{}, inputErr("Trace.Field", "nothing is left after removing the %v baseline: the trace has no pulse", p.Baseline)
	}
	applyWindow(x, p.Window, alpha)
	if wPeak, _ := absMax(x); wPeak <= 1e-12*m.PeakFieldVPerM || wPeak < MinPeakSample {
		return Analysis{}, inputErr("Processing.Window", "nothing is left after the %v window: the pulse sits at the very edge", p.Window)
	}
	out.Spectrum = spectrumOf(x, tr.StepS, tr.StartS, paddedLength(n, p.PadToSamples))
	spectralMetrics(m, out.Spectrum, tr.StepS)
	out.Cautions = traceCautions(nil, *m, tr.Absolute)
	return out, nil
}

func (p Processing) validate(n int) (alpha float64, err error) {
	switch p.Baseline {
	case BaselineNone, BaselinePrePulse, BaselineLinear:
	default:
		return 0, inputErr("Processing.Baseline", "unknown baseline %d", int(p.Baseline))
	}
	alpha = p.TukeyAlpha
	switch p.Window {
	case WindowNone, WindowHann, WindowBlackman:
	case WindowTukey:
		if alpha == 0 {
			alpha = DefaultTukeyAlpha
		}
		if !finite(alpha) || alpha <= 0 || alpha > 1 {
			return 0, inputErr("Processing.TukeyAlpha", "alpha %g is not within (0, 1]", p.TukeyAlpha)
		}
	default:
		return 0, inputErr("Processing.Window", "unknown window %d", int(p.Window))
	}
	if p.PadToSamples < 0 || p.PadToSamples > MaxSamples {
		return 0, inputErr("Processing.PadToSamples", "padding to %d samples is not within [0, %d]", p.PadToSamples, MaxSamples)
	}
	if p.PadToSamples > n && paddedLength(n, p.PadToSamples) > MaxSamples {
		return 0, inputErr("Processing.PadToSamples", "padding to %d samples rounds up beyond %d", p.PadToSamples, MaxSamples)
	}
	return alpha, nil
}

// paddedLength is the transform length for n samples padded to at least
// pad: n itself when pad <= n, else the next 5-smooth length >= pad.
func paddedLength(n, pad int) int {
	if pad <= n {
		return n
	}
	return NextFastLength(pad)
}

// NextFastLength returns the smallest m >= n (n >= 1) whose only prime
// factors are 2, 3 and 5: the lengths for which the transform's radix-2, 3,
// 4 and 5 passes do all the work.
func NextFastLength(n int) int {
	for m := max(n, 1); ; m++ {
		r := m
		for _, f := range [...]int{2, 3, 5} {
			for r%f == 0 {
				r /= f
			}
		}
		if r == 1 {
			return m
		}
	}
}

func absMax(x []float64) (peak float64, at int) {
	for i, v := range x {
		if a := math.Abs(v); a > peak {
			peak, at = a, i
		}
	}
	return peak, at
}

// removeBaseline writes src less its baseline into dst (same length).
func removeBaseline(dst, src []float64, b Baseline) error {
	n := len(src)
	switch b {
	case BaselineNone:
		copy(dst, src)
	case BaselinePrePulse:
		copy(dst, src)
		med := median(dst) // reorders dst, which is overwritten below
		dev := 0.0
		for _, v := range src {
			dev = max(dev, math.Abs(v-med))
		}
		if dev == 0 {
			return inputErr("Trace.Field", "the trace is constant: it has no pulse")
		}
		onset := n
		for i, v := range src {
			if math.Abs(v-med) >= PrePulseLevel*dev {
				onset = i
				break
			}
		}
		if onset < MinPrePulseSamples {
			return inputErr("Processing.Baseline", "only %d samples precede the pulse; BaselinePrePulse needs %d (use BaselineLinear or a longer pre-pulse window)", onset, MinPrePulseSamples)
		}
		sum := 0.0
		for _, v := range src[:onset] {
			sum += v
		}
		offset := sum / float64(onset)
		for i, v := range src {
			dst[i] = v - offset
		}
	case BaselineLinear:
		// Least squares a + b·(i - c) with c the mean index, which makes
		// the two normal equations independent.
		c := float64(n-1) / 2
		var sy, sxy, sxx float64
		for i, v := range src {
			d := float64(i) - c
			sy += v
			sxy += d * v
			sxx += d * d
		}
		a, slope := sy/float64(n), sxy/sxx
		for i, v := range src {
			dst[i] = v - a - slope*(float64(i)-c)
		}
	}
	return nil
}

// median returns the median of x, reordering x (Hoare's selection).
func median(x []float64) float64 {
	n := len(x)
	hi := selectKth(x, n/2)
	if n%2 == 1 {
		return hi
	}
	// After selection every element below n/2 is <= x[n/2].
	lo := x[0]
	for _, v := range x[1 : n/2] {
		lo = max(lo, v)
	}
	return 0.5 * (lo + hi)
}

// selectKth reorders x so that x[k] is the k-th smallest, smaller ones before
// it and larger ones after, and returns it.
func selectKth(x []float64, k int) float64 {
	lo, hi := 0, len(x)-1
	for lo < hi {
		// Median of three as the pivot keeps sorted input linear.
		mid := lo + (hi-lo)/2
		if x[mid] < x[lo] {
			x[mid], x[lo] = x[lo], x[mid]
		}
		if x[hi] < x[lo] {
			x[hi], x[lo] = x[lo], x[hi]
		}
		if x[hi] < x[mid] {
			x[hi], x[mid] = x[mid], x[hi]
		}
		pivot := x[mid]
		i, j := lo, hi
		for i <= j {
			for x[i] < pivot {
				i++
			}
			for x[j] > pivot {
				j--
			}
			if i <= j {
				x[i], x[j] = x[j], x[i]
				i++
				j--
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return x[k]
		}
	}
	return x[k]
}

// windowFill calls set(n, w_n) for the N weights of a window (N >= 2). The
// cosines advance by multiplying a unit phasor, recomputed exactly every 16
// samples, which keeps the weights within a few ε of the direct formulas at a
// fraction of the cost of one cosine per sample.
func windowFill(w Window, alpha float64, size int, set func(n int, weight float64)) {
	d := float64(size - 1)
	switch w {
	case WindowHann, WindowBlackman:
		s, c := math.Sincos(2 * math.Pi / d)
		step := complex(c, s)
		var z complex128
		for n := range size {
			if n%16 == 0 {
				s, c := math.Sincos(2 * math.Pi * float64(n) / d)
				z = complex(c, s)
			}
			c1 := real(z)
			if w == WindowHann {
				set(n, 0.5-0.5*c1)
			} else {
				set(n, 0.42-0.5*c1+0.08*(2*c1*c1-1)) // cos 2x = 2cos²x - 1
			}
			z *= step
		}
	case WindowTukey:
		// Taper width α(N-1)/2 samples at each end; only the tapers need a
		// cosine.
		width := alpha * d / 2
		for n := range size {
			k := float64(n)
			if k > d/2 {
				k = d - k
			}
			if k >= width {
				set(n, 1)
				continue
			}
			set(n, 0.5*(1+math.Cos(math.Pi*(k/width-1))))
		}
	default:
		for n := range size {
			set(n, 1)
		}
	}
}

// WindowWeights returns the N weights of a window (see Window); alpha is the
// Tukey fraction (0 for DefaultTukeyAlpha). It is what Analyze multiplies a
// trace by.
func WindowWeights(w Window, alpha float64, size int) ([]float64, error) {
	if size < 2 || size > MaxSamples {
		return nil, inputErr("size", "window of %d samples is not within [2, %d]", size, MaxSamples)
	}
	a, err := Processing{Window: w, TukeyAlpha: alpha}.validate(size)
	if err != nil {
		return nil, err
	}
	out := make([]float64, size)
	windowFill(w, a, size, func(n int, weight float64) { out[n] = weight })
	return out, nil
}

func applyWindow(x []float64, w Window, alpha float64) {
	if w == WindowNone {
		return
	}
	windowFill(w, alpha, len(x), func(n int, weight float64) { x[n] *= weight })
}

// timeMetrics fills the time-domain metrics of a (baseline-removed) trace.
func timeMetrics(m *Metrics, tr Trace) {
	x := tr.Field
	peak, at := absMax(x)
	m.PeakFieldVPerM = peak
	m.PeakTimeS = tr.TimeS(at)
	m.PeakSign = 1
	if x[at] < 0 {
		m.PeakSign = -1
	}
	lo, hi := x[0], x[0]
	var sum, sumAbs, sumSq float64
	for _, v := range x {
		lo, hi = min(lo, v), max(hi, v)
		sum += v
		sumAbs += math.Abs(v)
		sumSq += v * v
	}
	m.PeakToPeakVPerM = hi - lo
	if sumAbs > 0 {
		m.DCAreaRatio = math.Abs(sum) / sumAbs
	}
	if tr.Absolute {
		m.FluenceJPerM2 = sumSq * tr.StepS / units.VacuumImpedance
	}
	edge := max(1, int(math.Ceil(EdgeFraction*float64(len(x)))))
	head, _ := absMax(x[:edge])
	tail, _ := absMax(x[len(x)-edge:])
	if peak > 0 {
		m.EdgeRatio = max(head, tail) / peak
	}
}

var padPool = sync.Pool{New: func() any { return new([]float64) }}

// spectrumOf transforms x (sampled every stepS from startS), zero-padded to
// size samples, and references the phase to t = 0.
func spectrumOf(x []float64, stepS, startS float64, size int) Spectrum {
	t := Acquire(size)
	defer Release(t)
	sp := Spectrum{StepHz: 1 / (float64(size) * stepS), Values: make([]complex128, t.Bins())}
	in := x
	if size > len(x) {
		bp := padPool.Get().(*[]float64)
		if cap(*bp) < size {
			*bp = make([]float64, size)
		}
		buf := (*bp)[:size]
		copy(buf, x)
		clear(buf[len(x):])
		in = buf
		defer padPool.Put(bp)
	}
	t.Forward(sp.Values, in, stepS)
	shiftOrigin(sp.Values, sp.StepHz, startS)
	return sp
}

// shiftOrigin multiplies bin k by e^{+iωk·startS}: by the shift theorem the
// transform of samples counted from startS is e^{-iω startS} times the
// spectrum referenced to t = 0. The phasor is advanced by multiplication and
// recomputed exactly every 64 bins, which keeps its error near 64 ε.
func shiftOrigin(v []complex128, stepHz, startS float64) {
	if startS == 0 {
		return
	}
	dphi := 2 * math.Pi * stepHz * startS
	s, c := math.Sincos(dphi)
	step := complex(c, s)
	var z complex128
	for k := range v {
		if k%64 == 0 {
			s, c := math.Sincos(dphi * float64(k))
			z = complex(c, s)
		}
		v[k] *= z
		z *= step
	}
}

// spectralMetrics fills the spectral metrics from a one-sided spectrum.
func spectralMetrics(m *Metrics, sp Spectrum, stepS float64) {
	v := sp.Values
	nb := len(v)
	m.NyquistHz = 1 / (2 * stepS)
	m.ResolutionHz = sp.StepHz
	// Work with power relative to the peak so that no square under- or
	// overflows whatever the field's scale.
	// Squares cannot overflow within the input limits (|E_k| < 1e111).
	peakPow, pk := 0.0, 0
	for k, c := range v {
		if p := real(c)*real(c) + imag(c)*imag(c); p > peakPow {
			peakPow, pk = p, k
		}
	}
	if peakPow == 0 {
		return
	}
	peakAmp := math.Hypot(real(v[pk]), imag(v[pk]))
	inv := 1 / peakAmp
	rel := func(k int) float64 {
		re, im := real(v[k])*inv, imag(v[k])*inv
		return re*re + im*im
	}

	shift := 0.0
	if pk > 0 && pk < nb-1 {
		a := math.Sqrt(rel(pk - 1))
		c := math.Sqrt(rel(pk + 1))
		if den := a - 2 + c; den < 0 {
			shift = math.Max(-0.5, math.Min(0.5, 0.5*(a-c)/den))
		}
	}
	m.SpectralPeakHz = (float64(pk) + shift) * sp.StepHz

	var sw, swf float64
	for k := range v {
		p := rel(k)
		sw += p
		swf += p * float64(k)
	}
	m.CentroidHz = swf / sw * sp.StepHz

	lo, hi := crossings(rel, pk, nb, 0.5)
	m.BandwidthFWHMHz = (hi - lo) * sp.StepHz
	lo, hi = crossings(rel, pk, nb, BandLevel)
	m.BandLowHz, m.BandHighHz = lo*sp.StepHz, hi*sp.StepHz

	tail := max(1, int(math.Ceil(TailFraction*float64(nb))))
	floor := 0.0
	for k := nb - tail; k < nb; k++ {
		floor += rel(k)
	}
	floor = math.Sqrt(floor / float64(tail))
	m.DynamicRangeDB = math.Min(MaxDynamicRangeDB, -20*math.Log10(floor))
}

// crossings returns the fractional bins, below and above the peak bin pk,
// where the relative power first falls below level, interpolated linearly;
// 0 or nb-1 when it does not fall below before the end.
func crossings(rel func(int) float64, pk, nb int, level float64) (lo, hi float64) {
	lo, hi = 0, float64(nb-1)
	for k := pk; k > 0; k-- {
		if a, b := rel(k-1), rel(k); a < level {
			lo = float64(k) - (b-level)/(b-a)
			break
		}
	}
	for k := pk; k < nb-1; k++ {
		if a, b := rel(k), rel(k+1); b < level {
			hi = float64(k) + (a-level)/(a-b)
			break
		}
	}
	return lo, hi
}

// traceCautions appends the cautions that the metrics of a trace call for.
func traceCautions(cs []caution.Caution, m Metrics, absolute bool) []caution.Caution {
	cs = timeCautions(cs, m)
	cs = spectralCautions(cs, m)
	if absolute {
		cs = fieldCautions(cs, m.PeakFieldVPerM, "peak_field_kv_per_cm")
	}
	return cs
}

// timeCautions appends DCOffset and NotDecayed.
func timeCautions(cs []caution.Caution, m Metrics) []caution.Caution {
	if m.DCAreaRatio > DCAreaRatioLimit {
		cs = append(cs, caution.New(caution.DCOffset,
			fmt.Sprintf("The trace has a net area (|∫E dt|/∫|E| dt = %.3g, above %.3g): a radiated pulse has none, so an offset or a cut-off part of the pulse is likely; consider a baseline.", m.DCAreaRatio, DCAreaRatioLimit),
			caution.V("dc_area_ratio", m.DCAreaRatio), caution.V("dc_area_ratio_limit", DCAreaRatioLimit)))
	}
	if m.EdgeRatio > EdgeRatioLimit {
		cs = append(cs, caution.New(caution.NotDecayed,
			fmt.Sprintf("The field has not decayed at an edge of the time window (%.3g of the peak within the outer %.0f %%, above %.3g): the spectrum suffers from truncation.", m.EdgeRatio, 100*EdgeFraction, EdgeRatioLimit),
			caution.V("edge_ratio", m.EdgeRatio), caution.V("edge_ratio_limit", EdgeRatioLimit)))
	}
	return cs
}

// spectralCautions appends LowDynamicRange or Undersampled.
func spectralCautions(cs []caution.Caution, m Metrics) []caution.Caution {
	if m.DynamicRangeDB < LowDynamicRangeDB {
		cs = append(cs, caution.New(caution.LowDynamicRange,
			fmt.Sprintf("The spectral peak stands only %.1f dB above the high-frequency noise floor (less than %.0f dB): bandwidth and band edges are doubtful.", m.DynamicRangeDB, float64(LowDynamicRangeDB)),
			caution.V("dynamic_range_db", m.DynamicRangeDB), caution.V("dynamic_range_limit_db", LowDynamicRangeDB)))
	} else if m.BandHighHz > UndersampledFraction*m.NyquistHz {
		cs = append(cs, caution.New(caution.Undersampled,
			fmt.Sprintf("The -20 dB band reaches %.3g THz, above %.1f of the Nyquist frequency %.3g THz: sample more finely.", m.BandHighHz/units.THz, UndersampledFraction, m.NyquistHz/units.THz),
			caution.V("band_high_thz", m.BandHighHz/units.THz), caution.V("nyquist_thz", m.NyquistHz/units.THz)))
	}
	return cs
}

// fieldCautions appends FieldImplausible or FieldBeyondTableTop for a peak
// field, naming the number valueName.
func fieldCautions(cs []caution.Caution, peakVPerM float64, valueName string) []caution.Caution {
	kv := peakVPerM / units.KVPerCm
	switch {
	case peakVPerM > ImplausibleFieldVPerM:
		cs = append(cs, caution.New(caution.FieldImplausible,
			fmt.Sprintf("A peak field of %.4g MV/cm is above %.0f MV/cm, beyond any known THz source: please confirm the input.", peakVPerM/units.MVPerCm, ImplausibleFieldVPerM/units.MVPerCm),
			caution.V(valueName, kv), caution.V("limit_kv_per_cm", ImplausibleFieldVPerM/units.KVPerCm)))
	case peakVPerM > TableTopFieldVPerM:
		cs = append(cs, caution.New(caution.FieldBeyondTableTop,
			fmt.Sprintf("A peak field of %.4g MV/cm is above %.0f MV/cm, beyond table-top THz sources.", peakVPerM/units.MVPerCm, TableTopFieldVPerM/units.MVPerCm),
			caution.V(valueName, kv), caution.V("limit_kv_per_cm", TableTopFieldVPerM/units.KVPerCm)))
	}
	return cs
}
