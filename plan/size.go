package plan

import (
	"errors"
	"fmt"
	"math"

	"thzdrive/caution"
	"thzdrive/phononmode"
	"thzdrive/pulse"
	"thzdrive/units"
)

// StageSizing tags the cautions of a sizing search.
const StageSizing = "sizing"

// Goal is what a sizing search aims at.
type Goal struct {
	// Quantity and Target: the mode amplitude wanted (SI: m·√kg, m, or
	// quanta).
	Quantity phononmode.Quantity
	Target   float64
	// MaxPeakFieldVPerM bounds the incident peak field searched.
	MaxPeakFieldVPerM float64
	// Spot is the focal spot that turns a field into a pulse energy.
	Spot pulse.Spot
	// SourceLimitJ > 0 is the most pulse energy the source gives.
	SourceLimitJ float64
}

// Sizing is the incident pulse that reaches a Goal.
type Sizing struct {
	Reachable bool
	// PeakFieldVPerM is the incident peak field (the maximum searched when
	// the target is unreachable).
	PeakFieldVPerM    float64
	PulseEnergyJ      float64
	PeakFluenceJPerM2 float64
	// Achieved is the target quantity at PeakFieldVPerM.
	Achieved float64
	// SourceMargin is SourceLimitJ / PulseEnergyJ (0 without a limit).
	SourceMargin float64
	// Drive is the chain at PeakFieldVPerM.
	Drive    Drive
	Cautions []Staged
}

// Size finds the incident peak field at which the chain drives the mode to
// the goal. shape is the incident waveform's shape (its scale is ignored).
// The chain is linear in the incident field for a linear mode, so one
// evaluation fixes the answer (phononmode.SizeLinear); otherwise the field is
// bracketed and found by Brent's method to 1e-6 relative in the quantity
// (phononmode.SizeNonlinear). The pulse energy follows from the calibration
// of physics.md §3 run backwards: E_peak ∝ sqrt(W) for a fixed shape and
// spot.
func Size(shape pulse.Trace, c Chain, g Goal) (Sizing, error) {
	unit, err := unitPeak(shape)
	if err != nil {
		return Sizing{}, &StageError{StageSource, err}
	}
	achieved := func(scaleVPerM float64) (float64, error) {
		d, err := DriveMode(scaledTrace(unit, scaleVPerM), c)
		if err != nil {
			return 0, err
		}
		return g.Quantity.Of(d.Mode), nil
	}
	var sz phononmode.Sizing
	if c.Mode.Linear() {
		sz, err = phononmode.SizeLinear(achieved, g.Target, g.Quantity.LinearPower(), g.MaxPeakFieldVPerM)
	} else {
		sz, err = phononmode.SizeNonlinear(achieved, g.Target, g.MaxPeakFieldVPerM, 1e-6)
	}
	out := Sizing{Reachable: true}
	switch {
	case errors.Is(err, phononmode.ErrUnreachable):
		out.Reachable = false
	case err != nil:
		return Sizing{}, &StageError{StageMode, err}
	}
	out.PeakFieldVPerM = sz.Scale
	d, err := DriveMode(scaledTrace(unit, sz.Scale), c)
	if err != nil {
		return Sizing{}, &StageError{StageMode, err}
	}
	out.Drive = d
	out.Achieved = g.Quantity.Of(d.Mode)
	out.Cautions = append(out.Cautions, d.Cautions...)

	// The energy for a 1 J pulse fixes the field per sqrt(energy).
	cal, err := pulse.CalibrateByEnergy(unit, 1, g.Spot, pulse.FocusOption{})
	if err != nil {
		return Sizing{}, &StageError{StageSource, err}
	}
	ratio := out.PeakFieldVPerM / cal.PeakFieldVPerM
	out.PulseEnergyJ = ratio * ratio
	out.PeakFluenceJPerM2 = g.Spot.PeakFluence(out.PulseEnergyJ)
	if !out.Reachable {
		out.Cautions = append(out.Cautions, Staged{StageSizing, caution.New(caution.TargetUnreachable,
			fmt.Sprintf("no incident field up to %.4g kV/cm reaches the target; the most it gives is %.4g of the %.4g asked", g.MaxPeakFieldVPerM/units.KVPerCm, out.Achieved, g.Target),
			caution.V("max_peak_field_kv_per_cm", g.MaxPeakFieldVPerM/units.KVPerCm), caution.V("achieved", out.Achieved), caution.V("target", g.Target))})
	}
	if g.SourceLimitJ > 0 && out.PulseEnergyJ > 0 {
		out.SourceMargin = g.SourceLimitJ / out.PulseEnergyJ
		if out.SourceMargin < 1 || !out.Reachable {
			out.Cautions = append(out.Cautions, Staged{StageSizing, caution.New(caution.SourceShortfall,
				fmt.Sprintf("the source gives %.4g uJ but the target needs %.4g uJ (margin %.3g)", g.SourceLimitJ/units.UJ, out.PulseEnergyJ/units.UJ, out.SourceMargin),
				caution.V("source_limit_uj", g.SourceLimitJ/units.UJ), caution.V("required_energy_uj", out.PulseEnergyJ/units.UJ), caution.V("margin", out.SourceMargin))})
		}
	}
	return out, nil
}

// unitPeak returns shape scaled to max|E| = 1 V/m, absolute.
func unitPeak(shape pulse.Trace) (pulse.Trace, error) {
	peak := shape.PeakAbs()
	if peak == 0 || math.IsInf(peak, 0) || math.IsNaN(peak) {
		return pulse.Trace{}, errors.New("the waveform is zero everywhere: it has no shape to scale")
	}
	return scaledTrace(shape, 1/peak), nil
}

// scaledTrace returns tr times f, marked absolute.
func scaledTrace(tr pulse.Trace, f float64) pulse.Trace {
	out := tr.Scaled(f)
	out.Absolute = true
	return out
}
