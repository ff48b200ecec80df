// Package plan composes the physics packages into the chain a lab plans
// with: a source waveform, calibrated to absolute field (package pulse), is
// carried through the optical train into the sample (package optics), drives
// a phonon mode there (package phononmode), and heats the spot (package
// thermal).
//
// The chain is one description: the driven mode can be an oscillator of the
// target layer's dielectric model (ModeFromTarget), so the screening of the
// field and the drive of the mode cannot disagree; the absorbed fraction and
// the absorption depth that feed the heating come from the same optics that
// gave the field. Each stage's cautions are kept with the stage's name.
package plan

import (
	"errors"
	"fmt"

	"thzdrive/caution"
	"thzdrive/optics"
	"thzdrive/phononmode"
	"thzdrive/pulse"
)

// Stage names, as they tag cautions.
const (
	StageSource  = "source"
	StageOptics  = "optics"
	StageMode    = "mode"
	StageHeating = "heating"
)

// Staged is a caution with the stage that raised it.
type Staged struct {
	Stage string
	caution.Caution
}

func staged(stage string, cs []caution.Caution) []Staged {
	out := make([]Staged, len(cs))
	for i, c := range cs {
		out[i] = Staged{Stage: stage, Caution: c}
	}
	return out
}

// Chain is the part of the plan from the incident field to the mode.
type Chain struct {
	// Train is the optical train with the sample and the target; nil means
	// the incident field is already the field inside the sample.
	Train *optics.Train
	// PadToSamples zero-pads the incident trace before propagation.
	PadToSamples int
	// Mode is the driven mode.
	Mode phononmode.Mode
	// ProbeDepthM > 0 asks for the probe-depth average of Q, weighted by
	// exp(-z/d) in the target medium (needs Train).
	ProbeDepthM float64
	// Options tune the mode's solution (Options.Depth is set from
	// ProbeDepthM).
	Options phononmode.Options
}

// Drive is the chain's answer.
type Drive struct {
	// Propagation is nil without a train.
	Propagation *optics.Propagation
	// Inside is the field that drives the mode, V/m.
	Inside pulse.Trace
	// Mode is the mode's response.
	Mode *phononmode.Result
	// Cautions of the optics and mode stages.
	Cautions []Staged
}

// TargetMedium returns the medium of the train's target layer (or of its
// exit half-space), with the name of that layer.
func TargetMedium(tr *optics.Train) (optics.Medium, error) {
	tg := tr.Target
	if tg.Layer == optics.ExitMedium {
		if tr.Sample.Exit == nil {
			return optics.Constant{N: 1}, nil
		}
		return tr.Sample.Exit, nil
	}
	if tg.Layer < 0 || tg.Layer >= len(tr.Sample.Layers) {
		return nil, fmt.Errorf("plan: target layer %d outside the %d layers", tg.Layer, len(tr.Sample.Layers))
	}
	return tr.Sample.Layers[tg.Layer].Medium, nil
}

// ModeFromTarget builds the driven mode from oscillator j of the target
// medium's dielectric model: its frequency, linewidth and strength are the
// oscillator's, with the cell volume the caller gives (Born–Huang links the
// strength to the effective charge through it).
func ModeFromTarget(tr *optics.Train, j int, cellVolumeM3 float64) (phononmode.Mode, error) {
	m, err := TargetMedium(tr)
	if err != nil {
		return phononmode.Mode{}, err
	}
	d, ok := optics.DielectricOf(m)
	if !ok {
		return phononmode.Mode{}, errors.New("the target medium is not a dielectric model, so it has no oscillator to drive")
	}
	if j < 0 || j >= len(d.Oscillators) {
		return phononmode.Mode{}, fmt.Errorf("no oscillator %d: the target medium's model has %d", j, len(d.Oscillators))
	}
	o := d.Oscillators[j]
	return phononmode.FromOscillatorStrength(o.DeltaEps, o.FreqHz, o.WidthHz, cellVolumeM3)
}

// DriveMode runs the chain for an absolute incident field.
func DriveMode(incident pulse.Trace, c Chain) (Drive, error) {
	if !incident.Absolute {
		return Drive{}, errors.New("the waveform must be an absolute field (kV/cm) to drive a mode: calibrate it first")
	}
	var out Drive
	out.Inside = incident
	opt := c.Options
	if c.Train != nil {
		ev, err := optics.NewEvaluator(*c.Train)
		if err != nil {
			return Drive{}, err
		}
		p, err := optics.Propagate(ev, incident, c.PadToSamples)
		if err != nil {
			return Drive{}, err
		}
		out.Propagation = &p
		out.Inside = p.Target
		out.Cautions = append(out.Cautions, staged(StageOptics, p.Cautions)...)
		if c.ProbeDepthM > 0 {
			m, err := TargetMedium(c.Train)
			if err != nil {
				return Drive{}, err
			}
			opt.Depth = &phononmode.Depth{ProbeDepthM: c.ProbeDepthM, Index: m.Index}
		}
	} else if c.ProbeDepthM > 0 {
		return Drive{}, errors.New("a probe depth needs a sample: the depth average uses the sample's index")
	}
	res, err := phononmode.Drive(c.Mode, phononmode.Field{StartS: out.Inside.StartS, StepS: out.Inside.StepS, VPerM: out.Inside.Field}, opt)
	if err != nil {
		return Drive{}, err
	}
	out.Mode = res
	out.Cautions = append(out.Cautions, staged(StageMode, res.Cautions)...)
	return out, nil
}

// BulkAbsorptionPerM returns the absorption coefficient that makes the
// surface energy density of a bulk target exact: the energy deposited at
// depth z is Σ_f F_in(f)·α(f)·e^{-α(f)z}, so at the surface it is
// F_in·α_eff with α_eff = Σ A(f)P(f)α(f) / Σ A(f)P(f), the absorbed-power-
// weighted mean of α = 2ωκ/c (P the incident power spectrum, A the fraction
// entering the half-space). Deeper, the single-exponential profile with
// α_eff is an approximation; the peak, which sets the heating, is exact.
func BulkAbsorptionPerM(p *optics.Propagation, m optics.Medium) float64 {
	var num, den float64
	for k := 1; k < len(p.FreqHz); k++ {
		w := p.Absorbed[k] * p.IncidentPower[k]
		if w == 0 {
			continue
		}
		num += w * optics.AbsorptionCoefficient(p.FreqHz[k], m.Index(p.FreqHz[k]))
		den += w
	}
	if den == 0 {
		return 0
	}
	return num / den
}
