package plan

import (
	"errors"
	"fmt"
	"math"

	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/thermal"
	"thzdrive/units"
)

// Source is the pump as the lab knows it: a waveform and, when it is not
// already absolute, the pulse energy and focal spot that calibrate it.
type Source struct {
	// Waveform is the shape (EnergyJ > 0) or the absolute field (EnergyJ = 0).
	Waveform pulse.Trace
	// EnergyJ > 0 calibrates Waveform by pulse energy and Spot.
	EnergyJ float64
	// Spot is the focal spot (1/e² radii). Needed with EnergyJ, and for the
	// pulse energy and steady-state heating of an absolute waveform.
	Spot pulse.Spot
}

// Experiment is a whole plan: source, chain, and optionally heating.
type Experiment struct {
	Source Source
	Chain  Chain
	// Heating, when not nil, holds the sample's thermal inputs: base and
	// transition temperature, heat capacity, conductivity, repetition rate,
	// scaling exponent, damage rule. The plan fills in the fluence, pulse
	// energy, spot, absorbed fraction and geometry from the other stages.
	Heating *thermal.Inputs
}

// Report is the plan's answer, stage by stage.
type Report struct {
	// Incident is the absolute incident field, V/m.
	Incident pulse.Trace
	// Calibration is nil when the waveform was given absolute.
	Calibration *pulse.EnergyCalibration
	// PeakFluenceJPerM2 is the incident on-axis peak fluence.
	PeakFluenceJPerM2 float64
	// PulseEnergyJ is the incident pulse energy (0 without a spot).
	PulseEnergyJ float64
	// IncidentMetrics are the metrics of the absolute incident waveform.
	IncidentMetrics pulse.Metrics
	// Drive is the optics and mode stages.
	Drive Drive
	// Heating is nil without Experiment.Heating.
	Heating *thermal.Budget
	// Cautions of every stage, in stage order.
	Cautions []Staged
}

// StageError says which stage refused the plan.
type StageError struct {
	Stage string
	Err   error
}

func (e *StageError) Error() string { return e.Stage + ": " + e.Err.Error() }
func (e *StageError) Unwrap() error { return e.Err }

// Run computes the plan.
func Run(e Experiment) (Report, error) {
	var r Report
	src := e.Source
	if src.EnergyJ > 0 {
		cal, err := pulse.CalibrateByEnergy(src.Waveform, src.EnergyJ, src.Spot, pulse.FocusOption{})
		if err != nil {
			return Report{}, &StageError{StageSource, err}
		}
		r.Calibration = &cal
		r.Incident = cal.Trace
		r.PeakFluenceJPerM2 = cal.PeakFluenceJPerM2
		r.PulseEnergyJ = src.EnergyJ
		r.Cautions = append(r.Cautions, staged(StageSource, cal.Cautions)...)
	} else {
		if !src.Waveform.Absolute {
			return Report{}, &StageError{StageSource, errors.New("give the pulse energy and spot, or an absolute waveform (kV/cm)")}
		}
		r.Incident = src.Waveform
	}
	an, err := pulse.Analyze(r.Incident, pulse.Processing{})
	if err != nil {
		return Report{}, &StageError{StageSource, err}
	}
	r.IncidentMetrics = an.Metrics
	if r.Calibration == nil {
		r.PeakFluenceJPerM2 = an.Metrics.FluenceJPerM2
		if src.Spot.RadiusXM > 0 {
			// Inverse of F0 = 2W/(π wx wy) (physics.md §3).
			r.PulseEnergyJ = r.PeakFluenceJPerM2 / src.Spot.PeakFluence(1)
		}
		r.Cautions = append(r.Cautions, staged(StageSource, an.Cautions)...)
	}

	d, err := DriveMode(r.Incident, e.Chain)
	if err != nil {
		stage := StageMode
		var ie *optics.InputError
		if errors.As(err, &ie) {
			stage = StageOptics
		}
		return Report{}, &StageError{stage, err}
	}
	r.Drive = d
	r.Cautions = append(r.Cautions, d.Cautions...)

	if e.Heating != nil {
		in, err := heatingInputs(*e.Heating, r, e.Chain)
		if err != nil {
			return Report{}, &StageError{StageHeating, err}
		}
		b, err := thermal.Estimate(in)
		if err != nil {
			return Report{}, &StageError{StageHeating, err}
		}
		r.Heating = &b
		r.Cautions = append(r.Cautions, staged(StageHeating, b.Cautions)...)
	}
	return r, nil
}

// heatingInputs completes the caller's thermal inputs from the other stages:
// the incident peak fluence and pulse energy from the source, the spot, and
// the absorbed fraction and geometry from the optics of the target: a layer
// of the stack is a film (uniform over its thickness), the exit half-space a
// bulk sample with the absorption coefficient of BulkAbsorptionPerM.
func heatingInputs(in thermal.Inputs, r Report, c Chain) (thermal.Inputs, error) {
	in.FluenceJPerM2 = r.PeakFluenceJPerM2
	in.PulseEnergyJ = r.PulseEnergyJ
	if in.SpotRadiusM == 0 && r.PulseEnergyJ > 0 {
		in.SpotRadiusM = spotRadiusForHeating(r)
	}
	p := r.Drive.Propagation
	if p == nil {
		if in.AbsorbedFraction == 0 && in.AbsorbedFluenceJPerM2 == 0 {
			return in, errors.New("without a sample stack the absorbed fraction must be given")
		}
		return in, nil
	}
	in.AbsorbedFraction = p.AbsorbedFraction
	in.AbsorbedFluenceJPerM2 = 0
	tg := c.Train.Target
	if tg.Layer == optics.ExitMedium {
		m, err := TargetMedium(c.Train)
		if err != nil {
			return in, err
		}
		in.Geometry = thermal.Bulk
		in.ThicknessM = 0
		in.AbsorptionDepthM = 0
		in.AbsorptionCoefficientPerM = BulkAbsorptionPerM(p, m)
		if in.AbsorptionCoefficientPerM <= 0 {
			return in, fmt.Errorf("the target medium absorbs nothing in the pulse's band (alpha = 0 at %.3g THz and around), so there is no heating to estimate; omit heating", p.FreqHz[len(p.FreqHz)/2]/units.THz)
		}
	} else {
		in.Geometry = thermal.Film
		in.AbsorptionCoefficientPerM, in.AbsorptionDepthM = 0, 0
		in.ThicknessM = c.Train.Sample.Layers[tg.Layer].ThicknessM
	}
	return in, nil
}

// spotRadiusForHeating returns the radius of a round spot with the same
// area π wx wy as the source's spot: the Lax rise is for a round Gaussian.
func spotRadiusForHeating(r Report) float64 {
	if r.PeakFluenceJPerM2 <= 0 {
		return 0
	}
	// F0 = 2W/(π w²)  =>  w = sqrt(2W/(π F0)).
	return math.Sqrt(2 * r.PulseEnergyJ / (math.Pi * r.PeakFluenceJPerM2))
}
