package main

import (
	"flag"
	"fmt"
	"strings"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// scenarioHelp describes the scenario file; plan and sweep share it.
const scenarioHelp = `A scenario file is a PlanExperimentRequest written in YAML or JSON (the
proto JSON mapping: the file and the API are one format). Its parts:
  waveform     the source pulse: model {shape, peak_frequency_thz, ...} or trace
  calibration  pulse_energy_uj and spot_x {radius_um | fwhm_um} (else the
               waveform is absolute, in kV/cm)
  train        windows (slab), attenuators, field factors, gaps, in beam order
  sample       layers and exit_medium (a catalogue material or an inline
               dielectric model), incidence angle, polarization
  target       where in the sample the field is taken
  mode         the driven phonon mode (target_oscillator N of the sample's
               dielectric model, or frequency_thz, linewidth_thz, delta_eps),
               cell_volume_a3, effective_mass_amu, bond_length_a
  heating      heat_capacity, base and transition temperature, repetition
               rate, thermal conductivity
  label        free text for the record
Field names carry their units (thickness_um, pulse_energy_uj); enum values
are written in full (PULSE_SHAPE_SINGLE_CYCLE). An unknown field is an
error naming its path. 'thzdrive demo --show-scenario' prints a complete
example.
`

func runPlan(a *app, args []string) error {
	fs := flag.NewFlagSet("plan", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	csvPath := fs.String("csv", "", "write the time traces to FILE as CSV: time (ps), field inside (kV/cm), Q (Å·sqrt(amu)); '-' is standard output")
	transferPath := fs.String("transfer-csv", "", "write the transmission spectrum to FILE as CSV: frequency (THz), |t|, arg t (rad), absorbed fraction")
	plotDir := fs.String("plot", "", "also write figures (PNG and SVG) into DIR: the field incident and inside, their spectra with the mode marked, the transmission, and Q(t)")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive plan [flags] SCENARIO

The whole chain forward, in one call, for the experiment a scenario file
describes: the source (calibrated field, fluence), the optics (the field
inside the sample after the beam path and the sample's own screening), the
mode (amplitude, displacement, energy, overlap) and the heating (single
pulse, steady state, margin to the transition). Each stage's cautions are
shown under it. SCENARIO '-' reads standard input.

%s
Examples:
  thzdrive plan examples/demo-scenario.yaml
  thzdrive --json plan my-sample.yaml > plan.json

Flags:
`, scenarioHelp)
		fs.PrintDefaults()
	}
	pos, err := a.parseFlags(fs, args)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("plan needs one scenario file (got %d arguments); see 'thzdrive help plan'", len(pos))
	}
	req, err := loadScenario(pos[0])
	if err != nil {
		return err
	}
	return a.plan(req, *csvPath, *transferPath, *plotDir)
}

// plan runs PlanExperiment and prints its report; the demo uses it too.
func (a *app) plan(req *thzdrivev1.PlanExperimentRequest, csvPath, transferPath, plotDir string) error {
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	resp, err := c.PlanExperiment(ctx, req)
	if err != nil {
		return err
	}
	if csvPath != "" && resp.Mode != nil {
		if err := a.writeModeCSV(csvPath, resp.Mode); err != nil {
			return err
		}
	}
	if transferPath != "" {
		t := resp.GetOptics().GetTransfer()
		if err := a.writeColumns(transferPath, []string{"frequency (THz)", "|t|", "arg t (rad)", "absorbed fraction"},
			[][]float64{t.GetFrequencyThz(), t.GetAmplitude(), t.GetPhaseRad(), t.GetAbsorbedFraction()}); err != nil {
			return err
		}
	}
	if plotDir != "" {
		if err := a.plotPlan(plotDir, resp); err != nil {
			return err
		}
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	planReport(resp).print(a.reportWriter(csvPath, transferPath))
	return nil
}

// plotPlan asks the service for the spectra of the incident field and of
// the field inside, then writes the plan's figures.
func (a *app) plotPlan(dir string, resp *thzdrivev1.PlanExperimentResponse) error {
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	f := planFigures{plan: resp}
	for _, s := range []struct {
		tr  *thzdrivev1.SampledTrace
		dst **thzdrivev1.Spectrum
	}{{resp.GetSource().GetIncident(), &f.incident}, {resp.GetMode().GetFieldInside(), &f.insideS}} {
		if s.tr == nil {
			continue
		}
		an, err := c.AnalyzePulse(ctx, &thzdrivev1.AnalyzePulseRequest{
			Waveform:   &thzdrivev1.Waveform{Source: &thzdrivev1.Waveform_Trace{Trace: s.tr}},
			Processing: &thzdrivev1.Processing{Baseline: thzdrivev1.BaselineRemoval_BASELINE_REMOVAL_NONE},
		})
		if err != nil {
			return err
		}
		*s.dst = an.Spectrum
	}
	paths, err := writePlanPlots(dir, f)
	if err != nil {
		return err
	}
	fmt.Fprintf(a.stderr, "figures: %s\n", strings.Join(paths, ", "))
	return nil
}

// planReport lays out a plan stage by stage, each stage's cautions under it.
func planReport(resp *thzdrivev1.PlanExperimentResponse) *report {
	r := &report{title: "thzdrive: experiment plan", cautions: resp.Cautions}
	if l := resp.GetResolved().GetLabel(); l != "" {
		r.subtitle = "Scenario: " + l
	}
	res := resp.GetResolved()

	src := resp.GetSource()
	s := r.section("1. Source")
	s.stages = []string{"source"}
	if hasEnergy(res.GetCalibration()) {
		s.text("calibrated by", "pulse energy and focal spot")
	} else {
		s.text("field", "given absolute")
	}
	s.add("incident peak |E|", src.GetPeakFieldKvPerCm(), "kV/cm")
	s.add("peak fluence", src.GetPeakFluenceUjPerCm2(), "uJ/cm2")
	if src.GetPulseEnergyUj() > 0 {
		s.add("pulse energy", src.GetPulseEnergyUj(), "uJ")
	}
	s.add("spectral peak", src.GetSpectralPeakThz(), "THz")

	s = r.section("2. Optics")
	s.stages = []string{"optics", "train", "sample"}
	if o := resp.GetOptics(); o != nil {
		trainRows(s, res.GetTrain())
		s.text("sample", describeSample(res.GetSample()))
		s.add("peak |E| at the target", o.TargetPeakFieldKvPerCm, "kV/cm")
		s.add("target over incident", o.FieldRatio, "")
		s.add("absorbed in the target layer", o.AbsorbedFraction, "")
	} else {
		s.text("sample", "none: the source field is the field inside")
	}

	if d := resp.GetMode(); d != nil {
		modeSection(r, "3. Mode", d)
		r.sections[len(r.sections)-1].stages = []string{"mode"}
	}

	if b := resp.GetHeating(); b != nil {
		h := res.GetHeating()
		before := len(r.sections)
		heatingSections(r, b, h.GetTransitionTemperatureK(), h.GetRepetitionRateKhz())
		for i := before; i < len(r.sections); i++ {
			r.sections[i].title = "4. Heating: " + lowerFirst(r.sections[i].title)
		}
		r.sections[len(r.sections)-1].stages = []string{"heating"}
	} else {
		s = r.section("4. Heating")
		s.text("estimate", "none (the scenario has no heating conditions)")
		s.stages = []string{"heating"}
	}
	return r
}

func lowerFirst(s string) string {
	if s == "" {
		return s
	}
	return string(s[0]|0x20) + s[1:]
}
