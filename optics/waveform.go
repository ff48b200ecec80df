package optics

import (
	"fmt"
	"math"
	"sync"

	"thzdrive/caution"
	"thzdrive/pulse"
)

// CautionEnergyFraction is the share of the pulse energy a caution about
// the band may ignore: material ranges and reststrahlen bands are checked
// over the band that holds all but this fraction of the incident energy
// (half of it cut at each end). A catalogue entry valid to a few THz then
// raises no caution merely because the sampling reaches a Nyquist frequency
// of tens of THz, or because the spectrum's far tails carry a trace of
// energy there; it does when a percent of the pulse's energy meets
// extrapolated data (common practice: 1 % is below the uncertainty of most
// absolute THz calibrations).
const CautionEnergyFraction = 0.01

// Propagation is a waveform carried through an optical train to its target.
type Propagation struct {
	// FreqHz is the frequency grid, one-sided, of the padded transform.
	FreqHz []float64
	// Transfer is the field transmission to the target at each frequency.
	Transfer []complex128
	// Absorbed is the fraction of the incident power absorbed in the target
	// layer at each frequency.
	Absorbed []float64
	// Target is the waveform at the target, on the padded time grid that
	// starts where the incident trace starts. It has the incident trace's
	// unit (Absolute or not).
	Target pulse.Trace
	// IncidentPower is |E(f)|² of the incident pulse per bin, the weight of
	// the pulse's energy at each frequency (Parseval).
	IncidentPower []float64
	// IncidentPeakVPerM and TargetPeakVPerM are max|E| of the incident and
	// target waveforms (samples).
	IncidentPeakVPerM, TargetPeakVPerM float64
	// AbsorbedFraction is the fraction of the pulse energy absorbed in the
	// target layer: Absorbed weighted by the incident power spectrum,
	// Σ A(f)|E(f)|² / Σ |E(f)|² (Parseval: the spectral weights are the
	// energy per frequency bin).
	AbsorbedFraction float64
	// Cautions from the train (see Evaluator.Cautions), over the band that
	// holds all but CautionEnergyFraction of the incident energy.
	Cautions []caution.Caution
}

// specPool holds Propagate's spectrum buffers between calls.
var specPool = sync.Pool{New: func() any { return new([]complex128) }}

// Propagate carries the incident trace in through the train of ev: it zero-
// pads the trace to at least padTo samples (rounded up to a fast transform
// length; padding keeps the delays of windows and the ring of resonances
// from wrapping around the periodic transform), multiplies its spectrum by
// the train's transfer function and transforms back (package pulse's
// convention, so both directions agree).
func Propagate(ev *Evaluator, in pulse.Trace, padTo int) (Propagation, error) {
	if err := in.Validate(); err != nil {
		return Propagation{}, err
	}
	n := pulse.NextFastLength(max(in.Len(), padTo))
	t := pulse.Acquire(n)
	defer pulse.Release(t)
	samples := make([]float64, n)
	copy(samples, in.Field)
	sp := specPool.Get().(*[]complex128)
	defer specPool.Put(sp)
	if cap(*sp) < t.Bins() {
		*sp = make([]complex128, t.Bins())
	}
	spec := t.Forward((*sp)[:t.Bins()], samples, in.StepS)
	out := Propagation{
		FreqHz:   make([]float64, len(spec)),
		Transfer: make([]complex128, len(spec)),
		Absorbed: make([]float64, len(spec)),
	}
	for k := range out.FreqHz {
		out.FreqHz[k] = t.FrequencyHz(k, in.StepS)
	}
	if err := ev.Evaluate(out.FreqHz, out.Transfer, out.Absorbed); err != nil {
		return Propagation{}, err
	}
	// Energy per bin of the incident pulse (Parseval), the weights of the
	// absorbed fraction and of the caution band.
	power := make([]float64, len(spec))
	out.IncidentPower = power
	var num, den, peakPower float64
	for k, s := range spec {
		p := real(s)*real(s) + imag(s)*imag(s)
		power[k] = p
		num += out.Absorbed[k] * p
		den += p
		peakPower = max(peakPower, p)
		spec[k] = s * out.Transfer[k]
	}
	if den > 0 {
		out.AbsorbedFraction = num / den
	}
	out.Target = pulse.Trace{StartS: in.StartS, StepS: in.StepS, Field: t.Inverse(samples, spec, in.StepS), Absolute: in.Absolute}
	peakIdx := 0
	for i, x := range in.Field {
		if a := math.Abs(x); a > out.IncidentPeakVPerM {
			out.IncidentPeakVPerM, peakIdx = a, i
		}
	}
	for _, x := range out.Target.Field {
		out.TargetPeakVPerM = max(out.TargetPeakVPerM, math.Abs(x))
	}

	// The band that carries the pulse (all but CautionEnergyFraction of its
	// energy), and its power-weighted centre as the reference frequency of
	// the echo delays.
	lo, hi := -1, -1
	var centre float64
	if den > 0 {
		cut := CautionEnergyFraction / 2 * den
		var below float64
		for k := 1; k < len(power); k++ {
			below += power[k]
			if below > cut && lo < 0 {
				lo = k
			}
			centre += out.FreqHz[k] * power[k]
		}
		var above float64
		for k := len(power) - 1; k >= 1; k-- {
			above += power[k]
			if above > cut {
				hi = k
				break
			}
		}
	}
	if lo < 0 || hi < lo {
		return out, nil
	}
	weight := den - power[0]
	windowAfterS := in.StartS + float64(n)*in.StepS - in.TimeS(peakIdx)
	cs, err := ev.Cautions(out.FreqHz[lo:hi+1], centre/weight, windowAfterS)
	if err != nil {
		return Propagation{}, fmt.Errorf("optics: cautions: %w", err)
	}
	out.Cautions = cs
	return out, nil
}
