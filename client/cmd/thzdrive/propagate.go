package main

import (
	"flag"
	"fmt"
	"strings"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

// chainHelp explains the chain flags; propagate, drive and size share it.
const chainHelp = `The chain from the source into the sample comes from a scenario file
(--scenario FILE: YAML or JSON, the same format as 'thzdrive plan'; see
examples/demo-scenario.yaml) or from simple flags for the common case. A
flag given on the command line replaces the matching part of the scenario:
waveform flags (--shape, --peak-frequency, --trace, ...) the waveform;
--energy and --spot-radius/--spot-fwhm the calibration; --window and
--attenuator the train; --sample the sample; --depth the target depth.

  --window MATERIAL:THICKNESS   a window or filter in the beam, e.g.
                                silicon-hr:1mm (repeatable, in beam order;
                                first pass only, add :coherent for the
                                etalon with its echoes)
  --sample MATERIAL             a bulk sample of a catalogue material: the
                                field is taken just inside its surface
                                ('thzdrive materials' lists the catalogue)

The waveform is absolute (--peak-field, or a trace in kV/cm) or is
calibrated by --energy and the spot.
`

func runPropagate(a *app, args []string) error {
	fs := flag.NewFlagSet("propagate", flag.ContinueOnError)
	fs.SetOutput(a.stderr)
	cf := addChainFlags(fs)
	csvPath := fs.String("csv", "", "write the field at the target to FILE as CSV: time (ps), field (kV/cm); '-' is standard output")
	transferPath := fs.String("transfer-csv", "", "write the transmission spectrum to FILE as CSV: frequency (THz), |t|, arg t (rad), absorbed fraction")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), `Usage: thzdrive propagate [flags]

The field inside the sample: carries the incident pulse through the windows,
filters and attenuators of the beam path and across the sample's surface
(Fresnel and transfer-matrix optics, the sample's own screening included),
and reports the peak field at the target, the field ratio and the fraction
of the pulse energy absorbed there.

%s
Examples:
  thzdrive propagate --peak-field "300 kV/cm" --peak-frequency "1 THz" \
      --window silicon-hr:2mm --sample znte
  thzdrive propagate --scenario examples/demo-scenario.yaml --csv field.csv

Flags:
`, chainHelp)
		fs.PrintDefaults()
	}
	if err := a.parseNoArgs(fs, args); err != nil {
		return err
	}
	req, err := cf.request()
	if err != nil {
		return err
	}
	c, err := a.connect()
	if err != nil {
		return err
	}
	ctx, cancel := a.context()
	defer cancel()
	w, cal, err := absoluteWaveform(ctx, c, req)
	if err != nil {
		return err
	}
	resp, err := c.Propagate(ctx, &thzdrivev1.PropagateRequest{
		Waveform: w, Train: req.Train, Sample: req.Sample, Target: req.Target, PadToSamples: req.PadToSamples,
	})
	if err != nil {
		return err
	}
	if *csvPath != "" {
		tr := resp.FieldAtTarget
		if err := a.writeColumns(*csvPath, []string{"time (ps)", "field at target (" + fieldUnitLabel(tr) + ")"},
			[][]float64{traceTimes(tr), tr.GetField()}); err != nil {
			return err
		}
	}
	if *transferPath != "" {
		t := resp.Transfer
		if err := a.writeColumns(*transferPath, []string{"frequency (THz)", "|t|", "arg t (rad)", "absorbed fraction"},
			[][]float64{t.GetFrequencyThz(), t.GetAmplitude(), t.GetPhaseRad(), t.GetAbsorbedFraction()}); err != nil {
			return err
		}
	}
	if a.asJSON {
		return a.printJSON(resp)
	}
	r := &report{title: "thzdrive: field in the sample", cautions: append(cal.GetCautions(), resp.Cautions...)}
	sourceSection(r, cal, req)
	unit := fieldUnitLabel(resp.FieldAtTarget)
	s := r.section("Optics")
	trainRows(s, resp.Resolved.GetTrain())
	s.text("sample", describeSample(resp.Resolved.GetSample()))
	s.add("incident peak |E|", resp.IncidentPeakFieldKvPerCm, unit)
	s.add("peak |E| at the target", resp.TargetPeakFieldKvPerCm, unit)
	if resp.IncidentPeakFieldKvPerCm > 0 {
		s.add("target over incident", resp.TargetPeakFieldKvPerCm/resp.IncidentPeakFieldKvPerCm, "")
	}
	s.add("absorbed in the target layer", resp.AbsorbedFraction, "")
	r.print(a.reportWriter(*csvPath, *transferPath))
	return nil
}

// fieldUnitLabel is the unit of a trace's numbers.
func fieldUnitLabel(tr *thzdrivev1.SampledTrace) string {
	if tr.GetFieldUnit() == thzdrivev1.FieldUnit_FIELD_UNIT_KV_PER_CM {
		return "kV/cm"
	}
	return "arb. u."
}

// trainRows lists the elements of a train in beam order, one row each.
func trainRows(s *section, train []*thzdrivev1.TrainElement) {
	if len(train) == 0 {
		s.text("beam path", "nothing between source and sample")
	}
	for i, e := range train {
		s.text(fmt.Sprintf("beam path %d", i+1), describeElement(e))
	}
}

func describeElement(e *thzdrivev1.TrainElement) string {
	switch k := e.Kind.(type) {
	case *thzdrivev1.TrainElement_Slab:
		d := fmt.Sprintf("%s %s µm", describeMedium(k.Slab.Medium), num(k.Slab.ThicknessUm))
		if e.Name != "" && !strings.HasPrefix(e.Name, describeMedium(k.Slab.Medium)) {
			d = e.Name + " (" + d + ")"
		}
		return d
	case *thzdrivev1.TrainElement_Attenuator:
		return fmt.Sprintf("wire-grid attenuator at %s°", num(k.Attenuator.AngleDeg))
	case *thzdrivev1.TrainElement_FieldFactor:
		return fmt.Sprintf("field factor %s", num(k.FieldFactor.Amplitude))
	case *thzdrivev1.TrainElement_Gap:
		return fmt.Sprintf("%s mm of air", num(k.Gap.LengthMm))
	}
	return "?"
}

func describeMedium(m *thzdrivev1.Medium) string {
	switch k := m.GetKind().(type) {
	case *thzdrivev1.Medium_Material:
		return k.Material
	case *thzdrivev1.Medium_Constant:
		return fmt.Sprintf("n = %s + %si", num(k.Constant.N), num(k.Constant.Kappa))
	case *thzdrivev1.Medium_Tabulated:
		return "tabulated medium"
	case *thzdrivev1.Medium_Dielectric:
		n := len(k.Dielectric.Oscillators)
		return fmt.Sprintf("dielectric model (eps_inf %s, %d oscillator%s)", num(k.Dielectric.EpsInf), n, map[bool]string{true: "", false: "s"}[n == 1])
	}
	return "vacuum"
}

// describeSample names the layers and the exit medium.
func describeSample(st *thzdrivev1.SampleStack) string {
	if st == nil {
		return "none (the field after the beam path, in air)"
	}
	var parts []string
	for i, l := range st.Layers {
		name := l.Name
		if name == "" {
			name = fmt.Sprintf("layer %d", i)
		}
		parts = append(parts, fmt.Sprintf("%s: %s µm of %s", name, num(l.ThicknessUm), describeMedium(l.Medium)))
	}
	if st.ExitMedium != nil {
		parts = append(parts, "bulk "+describeMedium(st.ExitMedium))
	}
	if len(parts) == 0 {
		return "vacuum"
	}
	return strings.Join(parts, " on ")
}
