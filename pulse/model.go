package pulse

import (
	"fmt"
	"math"
	"math/cmplx"
)

// Shape selects a model waveform.
type Shape int

// The model waveforms of physics.md §2. Each is centred on t = 0.
const (
	// SingleCycle is the first derivative of a Gaussian,
	// E(t) = E0·sqrt(e)·(t/τ)·exp(-t²/(2τ²)), extrema ±E0 at t = ±τ; its
	// amplitude spectrum peaks at ω = 1/τ.
	SingleCycle Shape = iota + 1
	// CentralLobe is the second derivative of a Gaussian,
	// E(t) = E0·(1 - t²/τ²)·exp(-t²/(2τ²)): a central lobe E0 and side lobes
	// -2e^{-3/2}·E0 at t = ±sqrt(3)·τ; its amplitude spectrum peaks at
	// ω = sqrt(2)/τ.
	CentralLobe
	// Carrier is a Gaussian envelope on a carrier,
	// E(t) = E0·exp(-2 ln2·t²/T²)·cos(2π f0 t + φ), with T the FWHM of |E|².
	Carrier
)

func (s Shape) String() string {
	switch s {
	case SingleCycle:
		return "SingleCycle"
	case CentralLobe:
		return "CentralLobe"
	case Carrier:
		return "Carrier"
	}
	return fmt.Sprintf("Shape(%d)", int(s))
}

// Model is an analytic waveform (physics.md §2). Only the fields that its
// Shape uses are read.
type Model struct {
	Shape Shape
	// PeakFrequencyHz is, for SingleCycle and CentralLobe, the frequency at
	// which |E(f)| peaks. It fixes τ: 1/(2π f) for SingleCycle and
	// sqrt(2)/(2π f) for CentralLobe.
	PeakFrequencyHz float64
	// CarrierFrequencyHz is f0 of Carrier.
	CarrierFrequencyHz float64
	// EnvelopeFWHMS is T of Carrier: the full width at half maximum of the
	// envelope of |E|², s.
	EnvelopeFWHMS float64
	// CarrierPhaseRad is φ of Carrier: 0 puts a crest of the carrier at the
	// envelope's peak, π/2 a zero crossing.
	CarrierPhaseRad float64
	// PeakFieldVPerM is E0: the extremum of SingleCycle and CentralLobe, the
	// envelope's peak of Carrier (|E| reaches it only when φ is a multiple
	// of π).
	PeakFieldVPerM float64
}

// Validate reports whether the model can be evaluated: a known shape,
// positive finite frequencies and width, a finite phase, and
// 0 < E0 <= MaxAbsSample.
func (m Model) Validate() error {
	if !finite(m.PeakFieldVPerM) || m.PeakFieldVPerM <= 0 || m.PeakFieldVPerM > MaxAbsSample {
		return inputErr("Model.PeakFieldVPerM", "peak field %g V/m is not within (0, %g]", m.PeakFieldVPerM, MaxAbsSample)
	}
	switch m.Shape {
	case SingleCycle, CentralLobe:
		if !finite(m.PeakFrequencyHz) || m.PeakFrequencyHz <= 0 {
			return inputErr("Model.PeakFrequencyHz", "peak frequency %g Hz is not positive and finite", m.PeakFrequencyHz)
		}
	case Carrier:
		if !finite(m.CarrierFrequencyHz) || m.CarrierFrequencyHz <= 0 {
			return inputErr("Model.CarrierFrequencyHz", "carrier frequency %g Hz is not positive and finite", m.CarrierFrequencyHz)
		}
		if !finite(m.EnvelopeFWHMS) || m.EnvelopeFWHMS <= 0 {
			return inputErr("Model.EnvelopeFWHMS", "envelope FWHM %g s is not positive and finite", m.EnvelopeFWHMS)
		}
		if !finite(m.CarrierPhaseRad) {
			return inputErr("Model.CarrierPhaseRad", "carrier phase %g rad is not finite", m.CarrierPhaseRad)
		}
	default:
		return inputErr("Model.Shape", "unknown shape %d", int(m.Shape))
	}
	return nil
}

// TauS is the Gaussian time constant τ of SingleCycle (1/(2π f_peak)) and
// CentralLobe (sqrt(2)/(2π f_peak)), s; NaN for other shapes.
func (m Model) TauS() float64 {
	switch m.Shape {
	case SingleCycle:
		return 1 / (2 * math.Pi * m.PeakFrequencyHz)
	case CentralLobe:
		return math.Sqrt2 / (2 * math.Pi * m.PeakFrequencyHz)
	}
	return math.NaN()
}

// envelopeRate is a = 2 ln2/T², the Gaussian rate of the Carrier envelope
// exp(-a t²), 1/s².
func (m Model) envelopeRate() float64 {
	return 2 * math.Ln2 / (m.EnvelopeFWHMS * m.EnvelopeFWHMS)
}

// gauss returns exp(-x²/2). Beyond |x| = 38.6 it is 0 without calling Exp,
// which returns exactly 0 there (its argument is below -745.13, where
// float64 underflows): most samples of a long window lie there.
func gauss(x float64) float64 {
	if h := x * x / 2; h < 746 {
		return math.Exp(-h)
	}
	return 0
}

// At returns E(tS), V/m, for a model that passes Validate (NaN for an
// unknown shape).
func (m Model) At(tS float64) float64 { return m.at(tS, m.TauS()) }

// at is At with τ = TauS() given (Sample computes it once).
func (m Model) at(tS, tau float64) float64 {
	e0 := m.PeakFieldVPerM
	switch m.Shape {
	case SingleCycle:
		x := tS / tau
		return e0 * math.Sqrt(math.E) * x * gauss(x)
	case CentralLobe:
		x := tS / tau
		return e0 * (1 - x*x) * gauss(x)
	case Carrier:
		return e0 * math.Exp(-m.envelopeRate()*tS*tS) * math.Cos(2*math.Pi*m.CarrierFrequencyHz*tS+m.CarrierPhaseRad)
	}
	return math.NaN()
}

// Sample evaluates the model on a uniform grid of N = round(spanS/stepS)
// samples starting at StartS = -N·stepS/2 (which is -spanS/2 whenever the
// span is a whole number of steps), so that for even N a sample falls on
// t = 0. The trace is Absolute. The step and span must be positive and
// finite and N within [MinSamples, MaxSamples].
func (m Model) Sample(stepS, spanS float64) (Trace, error) {
	if err := m.Validate(); err != nil {
		return Trace{}, err
	}
	if !finite(stepS) || stepS < MinStepS || stepS > MaxStepS {
		return Trace{}, inputErr("stepS", "step %g s is not within [%g, %g] s", stepS, MinStepS, MaxStepS)
	}
	if !finite(spanS) || spanS <= 0 {
		return Trace{}, inputErr("spanS", "span %g s is not positive and finite", spanS)
	}
	nf := math.Round(spanS / stepS)
	if nf < MinSamples || nf > MaxSamples {
		return Trace{}, inputErr("spanS", "span %g s at step %g s gives %.0f samples; %d to %d are accepted", spanS, stepS, nf, MinSamples, MaxSamples)
	}
	n := int(nf)
	start := -float64(n) * stepS / 2
	if -start > MaxAbsStartS {
		return Trace{}, inputErr("spanS", "span %g s reaches beyond ±%g s", spanS, MaxAbsStartS)
	}
	tr := Trace{StartS: start, StepS: stepS, Field: make([]float64, n), Absolute: true}
	tau := m.TauS()
	for i := range tr.Field {
		tr.Field[i] = m.at(tr.TimeS(i), tau)
	}
	return tr, nil
}

// SquareIntegral returns ∫E(t)² dt over all time, V² s/m², from the closed
// forms (Gaussian integrals ∫x^{2k} e^{-x²} dx = Γ(k+1/2)):
//
//	SingleCycle:  E0²·e·sqrt(π)·τ/2                         (physics.md §2)
//	CentralLobe:  E0²·(3/4)·sqrt(π)·τ                       (derived: ∫(1-x²)² e^{-x²} dx = 3 sqrt(π)/4)
//	Carrier:      E0²/2·sqrt(π/(2a))·(1 + cos 2φ·e^{-ω0²/(2a)}),  a = 2 ln2/T²  (derived)
//
// The plane-wave fluence is this over Z0 (physics.md §3).
func (m Model) SquareIntegral() float64 {
	e0 := m.PeakFieldVPerM
	switch m.Shape {
	case SingleCycle:
		return e0 * e0 * math.E * math.SqrtPi * m.TauS() / 2
	case CentralLobe:
		return e0 * e0 * 0.75 * math.SqrtPi * m.TauS()
	case Carrier:
		a := m.envelopeRate()
		w0 := 2 * math.Pi * m.CarrierFrequencyHz
		return e0 * e0 / 2 * math.Sqrt(math.Pi/(2*a)) * (1 + math.Cos(2*m.CarrierPhaseRad)*math.Exp(-w0*w0/(2*a)))
	}
	return math.NaN()
}

// ComplexSpectrum returns the analytic E(ω) = ∫E(t) e^{+iωt} dt at ω = 2π
// freqHz, V/m·s, in the convention of Transform (physics.md §1):
//
//	SingleCycle:  i·E0·sqrt(2π e)·τ²·ω·exp(-ω²τ²/2)          (physics.md §2)
//	CentralLobe:  E0·sqrt(2π)·τ³·ω²·exp(-ω²τ²/2)              (derived: E = -E0 τ² g'' with g = exp(-t²/2τ²))
//	Carrier:      E0/2·sqrt(π/a)·(e^{iφ} e^{-(ω+ω0)²/4a} + e^{-iφ} e^{-(ω-ω0)²/4a})   (derived)
func (m Model) ComplexSpectrum(freqHz float64) complex128 {
	e0 := m.PeakFieldVPerM
	w := 2 * math.Pi * freqHz
	switch m.Shape {
	case SingleCycle:
		tau := m.TauS()
		return complex(0, e0*math.Sqrt(2*math.Pi*math.E)*tau*tau*w*math.Exp(-w*w*tau*tau/2))
	case CentralLobe:
		tau := m.TauS()
		return complex(e0*math.Sqrt(2*math.Pi)*tau*tau*tau*w*w*math.Exp(-w*w*tau*tau/2), 0)
	case Carrier:
		a := m.envelopeRate()
		w0 := 2 * math.Pi * m.CarrierFrequencyHz
		c := e0 / 2 * math.Sqrt(math.Pi/a)
		plus := c * math.Exp(-(w+w0)*(w+w0)/(4*a))
		minus := c * math.Exp(-(w-w0)*(w-w0)/(4*a))
		phase := cmplx.Rect(1, m.CarrierPhaseRad)
		return complex(plus, 0)*phase + complex(minus, 0)*cmplx.Conj(phase)
	}
	return cmplx.NaN()
}

// AmplitudeSpectrum returns |E(ω)| at ω = 2π freqHz, V/m·s (see
// ComplexSpectrum for the closed forms).
func (m Model) AmplitudeSpectrum(freqHz float64) float64 {
	return cmplx.Abs(m.ComplexSpectrum(freqHz))
}
